package kernel

import (
	_ "unsafe" // for go:linkname

	"github.com/go-python/gpython/py"
	"github.com/go-python/gpython/vm"
)

// The interpreter's int / int gives a float64, and int / rational would go
// through float64 before a rational could answer. In a notebook that checks
// formulas exactly that silently drops digits, so assay makes / between exact
// numbers (int, bool, rational) exact, and int ** negative int a rational.
// The interpreter has no hook for this; its opcode table is patched instead.
//
//go:linkname jumpTable github.com/go-python/gpython/vm.jumpTable
var jumpTable [256]func(*vm.Vm, int32) error

func init() {
	for _, op := range []vm.OpCode{vm.BINARY_TRUE_DIVIDE, vm.INPLACE_TRUE_DIVIDE} {
		jumpTable[op] = exactOpcode(jumpTable[op], exactQuotient)
	}
	for _, op := range []vm.OpCode{vm.BINARY_POWER, vm.INPLACE_POWER} {
		jumpTable[op] = exactOpcode(jumpTable[op], exactNegativePower)
	}
}

// exactOpcode wraps a binary opcode: when exact(a, b) answers, its result
// replaces the two operands; otherwise the original opcode runs.
func exactOpcode(original func(*vm.Vm, int32) error, exact func(a, b py.Object) (py.Object, bool, error)) func(*vm.Vm, int32) error {
	return func(v *vm.Vm, arg int32) error {
		res, ok, err := exact(v.SECOND(), v.TOP())
		if !ok {
			return original(v, arg)
		}
		if err != nil {
			return err
		}
		v.DROP()
		v.SET_TOP(res)
		return nil
	}
}

func exactQuotient(a, b py.Object) (py.Object, bool, error) {
	if floatMode {
		return nil, false, nil // float64 code divides as Python does
	}
	x, ok1 := exactOf(a)
	y, ok2 := exactOf(b)
	if ok1 && !ok2 {
		// int / polynomial would otherwise fail inside the int's own
		// division with a message about float conversion.
		if d, ok := b.(py.I__rtruediv__); ok && isAssayValue(b) {
			res, err := d.M__rtruediv__(a)
			return res, res != py.NotImplemented || err != nil, err
		}
	}
	if !ok1 || !ok2 {
		return nil, false, nil
	}
	q, err := ratQuo(x, y)
	if err != nil {
		return nil, true, err
	}
	return newRational(q), true, nil
}

func exactNegativePower(a, b py.Object) (py.Object, bool, error) {
	if floatMode {
		return nil, false, nil
	}
	if !isExactScalar(a) {
		return nil, false, nil
	}
	e, ok := exactOf(b)
	if !ok || e.Sign() >= 0 {
		return nil, false, nil
	}
	if _, isRational := a.(*Rational); isRational {
		return nil, false, nil // Rational.__pow__ answers already
	}
	res, err := exactPower(a, b)
	return res, true, err
}

// isAssayValue reports whether o is one of the kernel's own value types.
func isAssayValue(o py.Object) bool {
	switch o.(type) {
	case *Rational, *Polynomial, *Matrix, *Real:
		return true
	}
	return false
}

package values

import (
	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// Quotient answers a / b exactly for exact numbers, where the interpreter
// would make a float64 of int / int; in float64 code it leaves / to the
// interpreter, as ordinary code would divide. Env is the interp.Arithmetic
// of its session's sandbox.
func (e *Env) Quotient(a, b py.Object) (py.Object, bool, error) {
	if e.Float {
		switch b.(type) {
		case *Polynomial, *RationalFunction:
			// A number over a polynomial is a rational function, which
			// float64 code has no counterpart of: say so, rather than let
			// the number's division fail on a float conversion.
			return nil, true, NoCompanion("a rational function")
		}
		return nil, false, nil
	}
	if r, ok := a.(*Rational); ok && !e.Rounding {
		if w, ok := b.(py.Int); ok && w != 0 {
			// A rational over a machine integer (cayley_menger(t) / 288):
			// no rational is made of the divisor.
			q, err := exact.QuoInt(r.v, int64(w))
			if err != nil {
				return nil, true, err
			}
			return e.Rational(q), true, nil
		}
	}
	x, ok1 := ExactOf(a)
	y, ok2 := ExactOf(b)
	if ok1 && !ok2 {
		// int / polynomial would otherwise fail inside the int's own
		// division with a message about float conversion.
		if d, ok := b.(py.I__rtruediv__); ok && isNotebookValue(b) {
			res, err := d.M__rtruediv__(a)
			return res, res != py.NotImplemented || err != nil, err
		}
	}
	if !ok1 || !ok2 {
		return nil, false, nil
	}
	if e.Rounding {
		return e.roundingQuotient(a, b)
	}
	q, err := quotient(x, y)
	if err != nil {
		return nil, true, err
	}
	return e.Rational(q), true, nil
}

// Arithmetic is the exact / and ** of the rational's session, which the
// interpreter's patched opcodes use without looking up the running frame
// (interp.Operand).
func (r *Rational) Arithmetic() interp.Arithmetic { return r.env }

// Power answers int ** negative int with an exact rational.
func (e *Env) Power(a, b py.Object) (py.Object, bool, error) {
	if e.Float || !isExactScalar(a) {
		return nil, false, nil
	}
	k, ok := ExactOf(b)
	if !ok || k.Sign() >= 0 {
		return nil, false, nil
	}
	if _, isRational := a.(*Rational); isRational {
		return nil, false, nil // Rational.__pow__ answers already
	}
	res, err := e.power(a, b)
	if r, ok := res.(*Rational); ok && e.Rounding {
		// float64 code makes a float of int ** negative int: an input.
		return &Rational{v: roundRat(r.v), env: e, rounded: true}, true, nil
	}
	return res, true, err
}

// isNotebookValue reports whether o is one of the kernel's own value types.
func isNotebookValue(o py.Object) bool {
	switch o.(type) {
	case *Rational, *Polynomial, *RationalFunction, *Matrix, *Real, *Series:
		return true
	}
	return false
}

package kernel

import (
	"math"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/exact"
)

// Rational is an exact rational number in a cell. It is immutable.
type Rational struct{ v *big.Rat }

// RationalType is the Python type of Rational.
var RationalType = py.NewType("rational", "An exact rational number: frac(3, 4), frac(\"-1.0005\"), frac(0.1).")

// Type returns RationalType.
func (r *Rational) Type() *py.Type { return RationalType }

// Value returns the rational; callers must not modify it.
func (r *Rational) Value() *big.Rat { return r.v }

func newRational(v *big.Rat) *Rational { return &Rational{v: v} }

func init() {
	RationalType.Dict["num"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		return intObject(self.(*Rational).v.Num()), nil
	}, Doc: "numerator (in lowest terms)"}
	RationalType.Dict["den"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		return intObject(self.(*Rational).v.Denom()), nil
	}, Doc: "denominator (positive, in lowest terms)"}
	RationalType.Dict["float"] = py.MustNewMethod("float", func(self py.Object) (py.Object, error) {
		return self.(*Rational).M__float__()
	}, 0, "float() -> the nearest float64")
}

// intObject turns a big.Int into the interpreter's int, small or big.
func intObject(i *big.Int) py.Object {
	if i.IsInt64() {
		return py.Int(i.Int64())
	}
	return (*py.BigInt)(new(big.Int).Set(i))
}

// exactOf converts an exact scalar (int, bool or rational) to a big.Rat.
// The result may alias a Rational's value: do not modify it.
func exactOf(o py.Object) (*big.Rat, bool) {
	switch x := o.(type) {
	case *Rational:
		return x.v, true
	case py.Int:
		return new(big.Rat).SetInt64(int64(x)), true
	case *py.BigInt:
		return new(big.Rat).SetInt((*big.Int)(x)), true
	case py.Bool:
		if x {
			return big.NewRat(1, 1), true
		}
		return new(big.Rat), true
	}
	return nil, false
}

func isExactScalar(o py.Object) bool { _, ok := exactOf(o); return ok }

// ratOp applies an exact binary operation when both sides are exact scalars.
func ratOp(a, b py.Object, op func(x, y *big.Rat) (*big.Rat, error)) (py.Object, error) {
	x, ok1 := exactOf(a)
	y, ok2 := exactOf(b)
	if !ok1 || !ok2 {
		return py.NotImplemented, nil
	}
	z, err := op(x, y)
	if err != nil {
		return nil, err
	}
	return newRational(z), nil
}

func ratAdd(x, y *big.Rat) (*big.Rat, error) { return new(big.Rat).Add(x, y), nil }
func ratSub(x, y *big.Rat) (*big.Rat, error) { return new(big.Rat).Sub(x, y), nil }
func ratMul(x, y *big.Rat) (*big.Rat, error) { return new(big.Rat).Mul(x, y), nil }
func ratQuo(x, y *big.Rat) (*big.Rat, error) {
	if y.Sign() == 0 {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "division by zero: %s / 0", exact.FormatRat(x))
	}
	return new(big.Rat).Quo(x, y), nil
}

// floatOp falls back to float64 when the other side is a float, as Python's
// fractions do: exactness is lost, so claims reject such values later.
func floatOp(a, b py.Object, op func(x, y py.Object) (py.Object, error)) (py.Object, error) {
	_, fa := a.(py.Float)
	_, fb := b.(py.Float)
	if !fa && !fb {
		return py.NotImplemented, nil
	}
	return op(toFloatObject(a), toFloatObject(b))
}

func toFloatObject(o py.Object) py.Object {
	if r, ok := exactOf(o); ok {
		f, _ := r.Float64()
		return py.Float(f)
	}
	return o
}

func (r *Rational) binary(other py.Object, swap bool, op func(x, y *big.Rat) (*big.Rat, error), fop func(x, y py.Object) (py.Object, error)) (py.Object, error) {
	a, b := py.Object(r), other
	if swap {
		a, b = b, a
	}
	if floatMode && isExactScalar(a) && isExactScalar(b) {
		return fop(toFloatObject(a), toFloatObject(b))
	}
	res, err := ratOp(a, b, op)
	if err != nil || res != py.NotImplemented {
		return res, err
	}
	return floatOp(a, b, fop)
}

// M__add__ adds exactly.
func (r *Rational) M__add__(o py.Object) (py.Object, error) {
	return r.binary(o, false, ratAdd, py.Add)
}

// M__radd__ adds exactly.
func (r *Rational) M__radd__(o py.Object) (py.Object, error) {
	return r.binary(o, true, ratAdd, py.Add)
}

// M__sub__ subtracts exactly.
func (r *Rational) M__sub__(o py.Object) (py.Object, error) {
	return r.binary(o, false, ratSub, py.Sub)
}

// M__rsub__ subtracts exactly.
func (r *Rational) M__rsub__(o py.Object) (py.Object, error) {
	return r.binary(o, true, ratSub, py.Sub)
}

// M__mul__ multiplies exactly.
func (r *Rational) M__mul__(o py.Object) (py.Object, error) {
	return r.binary(o, false, ratMul, py.Mul)
}

// M__rmul__ multiplies exactly.
func (r *Rational) M__rmul__(o py.Object) (py.Object, error) {
	return r.binary(o, true, ratMul, py.Mul)
}

// M__truediv__ divides exactly.
func (r *Rational) M__truediv__(o py.Object) (py.Object, error) {
	return r.binary(o, false, ratQuo, py.TrueDiv)
}

// M__rtruediv__ divides exactly.
func (r *Rational) M__rtruediv__(o py.Object) (py.Object, error) {
	return r.binary(o, true, ratQuo, py.TrueDiv)
}

// M__pow__ raises to an integer power exactly.
func (r *Rational) M__pow__(o, mod py.Object) (py.Object, error) {
	if mod != py.None {
		return nil, py.ExceptionNewf(py.TypeError, "pow() with a modulus is not defined for rationals")
	}
	if floatMode {
		return py.Pow(toFloatObject(r), toFloatObject(o), py.None)
	}
	return exactPower(r, o)
}

// M__rpow__ handles int ** rational when the exponent is an integer.
func (r *Rational) M__rpow__(o py.Object) (py.Object, error) {
	if !isExactScalar(o) {
		return py.NotImplemented, nil
	}
	return exactPower(o, r)
}

// maxExponent bounds integer powers so a typo cannot swamp memory.
const maxExponent = 1 << 20

// exactPower computes base**e for an exact base and an integral exact e.
func exactPower(base, e py.Object) (py.Object, error) {
	x, ok := exactOf(base)
	if !ok {
		return py.NotImplemented, nil
	}
	ev, ok := exactOf(e)
	if !ok {
		if _, isFloat := e.(py.Float); isFloat {
			return py.Pow(toFloatObject(base), e, py.None)
		}
		return py.NotImplemented, nil
	}
	if !ev.IsInt() {
		return nil, py.ExceptionNewf(py.ValueError, "exact power needs an integer exponent, got %s (fractional powers are not rational in general)", exact.FormatRat(ev))
	}
	n := ev.Num()
	if n.CmpAbs(big.NewInt(maxExponent)) > 0 {
		return nil, py.ExceptionNewf(py.OverflowError, "exponent %s is too large for an exact power (limit %d)", n, maxExponent)
	}
	k := n.Int64()
	if k < 0 && x.Sign() == 0 {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "0 cannot be raised to a negative power")
	}
	abs := k
	if abs < 0 {
		abs = -abs
	}
	num := new(big.Int).Exp(x.Num(), big.NewInt(abs), nil)
	den := new(big.Int).Exp(x.Denom(), big.NewInt(abs), nil)
	if k < 0 {
		num, den = den, num
	}
	return newRational(new(big.Rat).SetFrac(num, den)), nil
}

// M__neg__ negates.
func (r *Rational) M__neg__() (py.Object, error) { return newRational(new(big.Rat).Neg(r.v)), nil }

// M__pos__ returns r.
func (r *Rational) M__pos__() (py.Object, error) { return r, nil }

// M__abs__ returns |r|.
func (r *Rational) M__abs__() (py.Object, error) { return newRational(new(big.Rat).Abs(r.v)), nil }

// M__bool__ is false only for zero.
func (r *Rational) M__bool__() (py.Object, error) { return py.NewBool(r.v.Sign() != 0), nil }

// M__float__ rounds to the nearest float64.
func (r *Rational) M__float__() (py.Object, error) {
	f, _ := r.v.Float64()
	return py.Float(f), nil
}

// M__int__ truncates toward zero, as int() of a fraction does in Python.
func (r *Rational) M__int__() (py.Object, error) {
	return intObject(new(big.Int).Quo(r.v.Num(), r.v.Denom())), nil
}

// M__index__ lets an integral rational serve as an index.
func (r *Rational) M__index__() (py.Int, error) {
	if !r.v.IsInt() || !r.v.Num().IsInt64() {
		return 0, py.ExceptionNewf(py.TypeError, "%s cannot be used as an index", exact.FormatRat(r.v))
	}
	return py.Int(r.v.Num().Int64()), nil
}

// M__str__ prints "3/4" or "-2".
func (r *Rational) M__str__() (py.Object, error) { return py.String(exact.FormatRat(r.v)), nil }

// M__repr__ prints the same as str, so lists of rationals read naturally.
func (r *Rational) M__repr__() (py.Object, error) { return r.M__str__() }

func (r *Rational) compare(o py.Object, test func(int) bool) (py.Object, error) {
	if y, ok := exactOf(o); ok {
		return py.NewBool(test(r.v.Cmp(y))), nil
	}
	if f, ok := o.(py.Float); ok {
		if math.IsNaN(float64(f)) {
			return py.False, nil
		}
		if math.IsInf(float64(f), 0) {
			return py.NewBool(test(-int(math.Copysign(1, float64(f))))), nil
		}
		y, _ := exact.RatFromFloat(float64(f))
		return py.NewBool(test(r.v.Cmp(y))), nil
	}
	return py.NotImplemented, nil
}

// M__eq__ compares exactly (a float compares by its exact binary value).
func (r *Rational) M__eq__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c == 0 })
}

// M__ne__ compares exactly.
func (r *Rational) M__ne__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c != 0 })
}

// M__lt__ compares exactly.
func (r *Rational) M__lt__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c < 0 })
}

// M__le__ compares exactly.
func (r *Rational) M__le__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c <= 0 })
}

// M__gt__ compares exactly.
func (r *Rational) M__gt__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c > 0 })
}

// M__ge__ compares exactly.
func (r *Rational) M__ge__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c >= 0 })
}

package values

import (
	"math"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// Rational is an exact rational number in a cell. It is immutable.
type Rational struct {
	v       *big.Rat
	env     *Env
	rounded bool // made by the input-rounding run (rounding.go)
}

// RationalType is the Python type of Rational.
var RationalType = py.NewType("rational", "An exact rational number: frac(3, 4), frac(\"-1.0005\"), frac(0.1).")

// Type returns RationalType.
func (r *Rational) Type() *py.Type { return RationalType }

// Value returns the rational; callers must not modify it.
func (r *Rational) Value() *big.Rat { return r.v }

// Rational makes a notebook rational of v, which it keeps.
func (e *Env) Rational(v *big.Rat) *Rational { return &Rational{v: v, env: e} }

func init() {
	RationalType.Dict["num"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		return IntObject(self.(*Rational).v.Num()), nil
	}, Doc: "numerator (in lowest terms)"}
	RationalType.Dict["den"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		return IntObject(self.(*Rational).v.Denom()), nil
	}, Doc: "denominator (positive, in lowest terms)"}
	setMethods(RationalType, []method[*Rational]{
		{"float", nil, "float() -> the nearest float64", func(r *Rational, _ interp.Args) (py.Object, error) { return r.M__float__() }},
	})
}

func (e *Env) rationalBuiltins(b py.StringDict) {
	setBuiltins(b, []builtin{
		{"frac", params("x", "denominator="), "frac(3, 4), frac(\"-3/4\"), frac(\"1.0005\"), frac(\"2e-7\"), frac(0.1) -> exact rational", e.frac},
	})
}

// frac makes an exact rational; in float64 code, its float.
func (e *Env) frac(a interp.Args) (py.Object, error) {
	res, err := e.exactFrac(a)
	switch {
	case err != nil:
		return nil, err
	case e.Float:
		return FloatValue(res)
	case e.Rounding:
		return e.RoundIn(res)
	}
	return res, nil
}

func (e *Env) exactFrac(a interp.Args) (py.Object, error) {
	x := a.Get("x")
	if a.Has("denominator") {
		p, ok1 := ExactOf(x)
		q, ok2 := ExactOf(a.Get("denominator"))
		if !ok1 || !ok2 {
			return nil, py.ExceptionNewf(py.TypeError, "frac(p, q) needs exact numbers, got %s and %s", interp.TypeName(x), interp.TypeName(a.Get("denominator")))
		}
		v, err := quotient(p, q)
		if err != nil {
			return nil, err
		}
		return e.Rational(v), nil
	}
	switch x := x.(type) {
	case py.String:
		v, err := exact.ParseRat(string(x))
		if err != nil {
			return nil, err
		}
		return e.Rational(v), nil
	case py.Float:
		v, err := exact.RatFromFloat(float64(x))
		if err != nil {
			return nil, py.ExceptionNewf(py.ValueError, "frac(%v): %v", float64(x), err)
		}
		return e.Rational(v), nil
	}
	if v, ok := ExactOf(x); ok {
		return e.Rational(new(big.Rat).Set(v)), nil
	}
	return nil, py.ExceptionNewf(py.TypeError, "frac() takes an int, a rational, a string or a float, got %s", interp.TypeName(x))
}

// IntObject turns a big.Int into the interpreter's int, small or big.
func IntObject(i *big.Int) py.Object {
	if i.IsInt64() {
		return py.Int(i.Int64())
	}
	return (*py.BigInt)(new(big.Int).Set(i))
}

// ExactOf converts an exact scalar (int, bool or rational) to a big.Rat.
// The result may alias a Rational's value: do not modify it.
func ExactOf(o py.Object) (*big.Rat, bool) {
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

func isExactScalar(o py.Object) bool { _, ok := ExactOf(o); return ok }

func ratAdd(x, y *big.Rat) (*big.Rat, error) { return new(big.Rat).Add(x, y), nil }
func ratSub(x, y *big.Rat) (*big.Rat, error) { return new(big.Rat).Sub(x, y), nil }
func ratMul(x, y *big.Rat) (*big.Rat, error) { return new(big.Rat).Mul(x, y), nil }

// quotient is x / y, refusing a zero divisor with the dividend named.
func quotient(x, y *big.Rat) (*big.Rat, error) {
	if y.Sign() == 0 {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "division by zero: %s / 0", exact.FormatRat(x))
	}
	return exact.Quo(x, y)
}

// toFloatObject turns an exact scalar into its float; anything else stays.
func toFloatObject(o py.Object) py.Object {
	if r, ok := ExactOf(o); ok {
		f, _ := r.Float64()
		return py.Float(f)
	}
	return o
}

// binary applies an exact operation when both sides are exact scalars;
// with a float on either side, or in float64 code, it computes in float64
// as Python's fractions do: exactness is lost, so claims refuse such
// values later.
func (r *Rational) binary(other py.Object, swap bool, op func(x, y *big.Rat) (*big.Rat, error), fop func(x, y py.Object) (py.Object, error)) (res py.Object, err error) {
	defer interp.Recover("rational arithmetic", &res, &err)
	a, b := py.Object(r), other
	if swap {
		a, b = b, a
	}
	x, ok1 := ExactOf(a)
	y, ok2 := ExactOf(b)
	switch {
	case ok1 && ok2 && r.env.Float:
		return fop(toFloatObject(a), toFloatObject(b))
	case ok1 && ok2 && r.env.Rounding:
		return r.env.rounding(func(xs []py.Object) (py.Object, error) {
			x, _ := ExactOf(xs[0])
			y, _ := ExactOf(xs[1])
			z, err := op(x, y)
			if err != nil {
				return nil, err
			}
			return r.env.Rational(z), nil
		}, a, b)
	case ok1 && ok2:
		z, err := op(x, y)
		if err != nil {
			return nil, err
		}
		return r.env.Rational(z), nil
	}
	_, fa := a.(py.Float)
	_, fb := b.(py.Float)
	if !fa && !fb {
		return py.NotImplemented, nil
	}
	return fop(toFloatObject(a), toFloatObject(b))
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
	return r.binary(o, false, quotient, py.TrueDiv)
}

// M__rtruediv__ divides exactly.
func (r *Rational) M__rtruediv__(o py.Object) (py.Object, error) {
	return r.binary(o, true, quotient, py.TrueDiv)
}

// M__pow__ raises to an integer power exactly.
func (r *Rational) M__pow__(o, mod py.Object) (res py.Object, err error) {
	defer interp.Recover("rational.__pow__", &res, &err)
	if mod != py.None {
		return nil, py.ExceptionNewf(py.TypeError, "pow() with a modulus is not defined for rationals")
	}
	if r.env.Float {
		return py.Pow(toFloatObject(r), toFloatObject(o), py.None)
	}
	if r.env.Rounding {
		return r.env.rounding(func(xs []py.Object) (py.Object, error) { return r.env.power(xs[0], xs[1]) }, r, o)
	}
	return r.env.power(r, o)
}

// M__rpow__ handles int ** rational when the exponent is an integer.
func (r *Rational) M__rpow__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("rational.__rpow__", &res, &err)
	if !isExactScalar(o) {
		return py.NotImplemented, nil
	}
	return r.env.power(o, r)
}

// MaxExponent bounds integer powers so a typo cannot swamp memory.
const MaxExponent = 1 << 20

// power computes base**e for an exact base and an integral exact e.
func (e *Env) power(base, exponent py.Object) (py.Object, error) {
	x, ok := ExactOf(base)
	if !ok {
		return py.NotImplemented, nil
	}
	ev, ok := ExactOf(exponent)
	if !ok {
		if _, isFloat := exponent.(py.Float); isFloat {
			return py.Pow(toFloatObject(base), exponent, py.None)
		}
		return py.NotImplemented, nil
	}
	if !ev.IsInt() {
		return nil, py.ExceptionNewf(py.ValueError, "exact power needs an integer exponent, got %s (fractional powers are not rational in general)", exact.FormatRat(ev))
	}
	n := ev.Num()
	if n.CmpAbs(big.NewInt(MaxExponent)) > 0 {
		return nil, py.ExceptionNewf(py.OverflowError, "exponent %s is too large for an exact power (limit %d)", n, MaxExponent)
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
	return e.Rational(new(big.Rat).SetFrac(num, den)), nil
}

// M__neg__ negates.
func (r *Rational) M__neg__() (res py.Object, err error) {
	defer interp.Recover("rational.__neg__", &res, &err)
	return &Rational{v: new(big.Rat).Neg(r.v), env: r.env, rounded: r.rounded}, nil
}

// M__pos__ returns r.
func (r *Rational) M__pos__() (res py.Object, err error) {
	defer interp.Recover("rational.__pos__", &res, &err)
	return r, nil
}

// M__abs__ returns |r|.
func (r *Rational) M__abs__() (res py.Object, err error) {
	defer interp.Recover("rational.__abs__", &res, &err)
	return &Rational{v: new(big.Rat).Abs(r.v), env: r.env, rounded: r.rounded}, nil
}

// M__bool__ is false only for zero.
func (r *Rational) M__bool__() (res py.Object, err error) {
	defer interp.Recover("rational.__bool__", &res, &err)
	return py.NewBool(r.v.Sign() != 0), nil
}

// M__float__ rounds to the nearest float64.
func (r *Rational) M__float__() (res py.Object, err error) {
	defer interp.Recover("rational.__float__", &res, &err)
	f, _ := r.v.Float64()
	return py.Float(f), nil
}

// M__int__ truncates toward zero, as int() of a fraction does in Python.
func (r *Rational) M__int__() (res py.Object, err error) {
	defer interp.Recover("rational.__int__", &res, &err)
	return IntObject(new(big.Int).Quo(r.v.Num(), r.v.Denom())), nil
}

// M__index__ lets an integral rational serve as an index.
func (r *Rational) M__index__() (py.Int, error) {
	if !r.v.IsInt() || !r.v.Num().IsInt64() {
		return 0, py.ExceptionNewf(py.TypeError, "%s cannot be used as an index", exact.FormatRat(r.v))
	}
	return py.Int(r.v.Num().Int64()), nil
}

// M__str__ prints "3/4" or "-2".
func (r *Rational) M__str__() (res py.Object, err error) {
	defer interp.Recover("rational.__str__", &res, &err)
	return py.String(exact.FormatRat(r.v)), nil
}

// M__repr__ prints the same as str, so lists of rationals read naturally.
func (r *Rational) M__repr__() (res py.Object, err error) {
	defer interp.Recover("rational.__repr__", &res, &err)
	return r.M__str__()
}

func (r *Rational) compare(o py.Object, test func(int) bool) (res py.Object, err error) {
	defer interp.Recover("rational comparison", &res, &err)
	if y, ok := ExactOf(o); ok {
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

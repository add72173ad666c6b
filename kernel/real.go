package kernel

import (
	"errors"
	"fmt"
	"math"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/exact"
)

// Real is a certified real number in a cell: exact, evaluated lazily to
// whatever precision a printout, comparison or claim asks for.
type Real struct {
	x   *exact.Real
	cap uint // precision cap in bits for refinements started from this value
}

// RealType is the Python type of Real.
var RealType = py.NewType("real", "A certified real: sqrt(2), exp(1), pi. Every printed digit is certified.")

// Type returns RealType.
func (r *Real) Type() *py.Type { return RealType }

// printedDigits is how many significant digits str() of a real shows.
const printedDigits = 20

// realOf lifts an exact number or a real; ok is false for anything else.
func realOf(o py.Object) (*exact.Real, bool) {
	switch x := o.(type) {
	case *Real:
		return x.x, true
	}
	if q, ok := exactOf(o); ok {
		return exact.RealFromRat(q), true
	}
	return nil, false
}

// realResult gives a real that is known to be rational as a Rational.
func realResult(x *exact.Real, cap uint) py.Object {
	if q, ok := x.Rat(); ok {
		return newRational(q)
	}
	return &Real{x: x, cap: cap}
}

// realErr turns an evaluation error into a Python exception.
func realErr(err error, cap uint) error {
	switch {
	case err == nil:
		return nil
	case errors.Is(err, exact.ErrDomain):
		return py.ExceptionNewf(py.ValueError, "%v", err)
	case errors.Is(err, exact.ErrDivisionByZero):
		return py.ExceptionNewf(py.ZeroDivisionError, "%v", err)
	case errors.Is(err, exact.ErrUndecided):
		return py.ExceptionNewf(py.ArithmeticError, "undecided at the precision cap of %d bits (raise it with --max-precision): %v", cap, err)
	}
	return py.ExceptionNewf(py.ValueError, "%v", err)
}

// check evaluates x once at a modest precision so that domain errors
// (sqrt of a certified negative, log of zero) surface at the call that
// caused them, with its line, rather than later at a printout.
func check(x *exact.Real, cap uint) error {
	if _, err := x.Approx(64, min(cap, 4096)); err != nil && !errors.Is(err, exact.ErrUndecided) {
		return realErr(err, cap)
	}
	return nil
}

func (s *Session) installReals(b py.StringDict) {
	cap := func() uint { return uint(s.settings.MaxPrecision) }
	unary := func(name, doc string, f func(*exact.Real) *exact.Real) {
		b[name] = builtin(name, doc, func(args py.Tuple, kw py.StringDict) (py.Object, error) {
			a, err := bind(name, args, kw, []string{"x"}, 1)
			if err != nil {
				return nil, err
			}
			if floatMode {
				f, err := floatArg(name, a[0])
				if err != nil {
					return nil, err
				}
				return py.Float(floatRealFunction[name](f)), nil
			}
			x, ok := realOf(a[0])
			if !ok {
				return nil, py.ExceptionNewf(py.TypeError, "%s() needs an exact number or a real, got %s%s", name, typeName(a[0]), floatHint(a[0]))
			}
			r := f(x)
			if err := check(r, cap()); err != nil {
				return nil, err
			}
			return realResult(r, cap()), nil
		})
	}
	unary("sqrt", "sqrt(x) -> the certified square root (a rational when x is a rational square)", exact.RealSqrt)
	unary("exp", "exp(x) -> the certified exponential", exact.RealExp)
	unary("log", "log(x) -> the certified natural logarithm", exact.RealLog)
	unary("sin", "sin(x) -> the certified sine", exact.RealSin)
	unary("cos", "cos(x) -> the certified cosine", exact.RealCos)
	unary("acos", "acos(x) -> the certified arc cosine, for -1 <= x <= 1", exact.RealAcos)
	b["root"] = builtin("root", "root(x, k) -> the certified k-th root (odd roots of negatives are negative)", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("root", args, kw, []string{"x", "k"}, 2)
		if err != nil {
			return nil, err
		}
		if floatMode {
			f, err1 := floatArg("root", a[0])
			k, err2 := floatArg("root", a[1])
			if err1 != nil || err2 != nil {
				return nil, py.ExceptionNewf(py.TypeError, "root(x, k) needs numbers")
			}
			return py.Float(math.Copysign(math.Pow(math.Abs(f), 1/k), f)), nil
		}
		x, ok := realOf(a[0])
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "root() needs an exact number or a real, got %s", typeName(a[0]))
		}
		k, err := intArg("root", "k", a[1], 0)
		if err != nil || k < 2 || k > maxExponent {
			return nil, py.ExceptionNewf(py.ValueError, "root(x, k) needs an integer k >= 2")
		}
		r := exact.RealRoot(x, int(k))
		if err := check(r, cap()); err != nil {
			return nil, err
		}
		return realResult(r, cap()), nil
	})
	b["atan2"] = builtin("atan2", "atan2(y, x) -> the certified angle of the point (x, y), in (-pi, pi]", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("atan2", args, kw, []string{"y", "x"}, 2)
		if err != nil {
			return nil, err
		}
		if floatMode {
			y, err1 := floatArg("atan2", a[0])
			x, err2 := floatArg("atan2", a[1])
			if err1 != nil || err2 != nil {
				return nil, py.ExceptionNewf(py.TypeError, "atan2(y, x) needs numbers")
			}
			return py.Float(math.Atan2(y, x)), nil
		}
		y, ok1 := realOf(a[0])
		x, ok2 := realOf(a[1])
		if !ok1 || !ok2 {
			return nil, py.ExceptionNewf(py.TypeError, "atan2() needs exact numbers or reals")
		}
		r := exact.RealAtan2(y, x)
		if err := check(r, cap()); err != nil {
			return nil, err
		}
		return realResult(r, cap()), nil
	})
	b["pi"] = &Real{x: exact.Pi(), cap: uint(s.settings.MaxPrecision)}
	b["digits"] = builtin("digits", "digits(x, n) -> n significant digits of x, every one certified", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("digits", args, kw, []string{"x", "n"}, 2)
		if err != nil {
			return nil, err
		}
		x, ok := realOf(a[0])
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "digits() needs an exact number or a real, got %s", typeName(a[0]))
		}
		n, err := intArg("digits", "n", a[1], 0)
		if err != nil || n < 1 || n > 1_000_000 {
			return nil, py.ExceptionNewf(py.ValueError, "digits(x, n) needs 1 <= n <= 1000000")
		}
		text, err := x.Digits(int(n), cap())
		if err != nil {
			return nil, realErr(err, cap())
		}
		return py.String(text), nil
	})
}

func init() {
	RealType.Dict["enclosure"] = py.MustNewMethod("enclosure", func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
		r := self.(*Real)
		a, err := bind("enclosure", args, kw, []string{"bits"}, 1)
		if err != nil {
			return nil, err
		}
		bits, err := intArg("enclosure", "bits", a[0], 0)
		if err != nil || bits < 1 || uint(bits) > r.cap {
			return nil, py.ExceptionNewf(py.ValueError, "enclosure(bits) needs 1 <= bits <= %d (the precision cap)", r.cap)
		}
		iv, err := r.x.Approx(uint(bits), r.cap)
		if err != nil {
			return nil, realErr(err, r.cap)
		}
		return py.Tuple{newRational(iv.Lo), newRational(iv.Hi)}, nil
	}, 0, "x.enclosure(bits) -> (lo, hi), rationals with lo <= x <= hi and hi - lo <= 2^-bits (relative for large x)")
}

// M__str__ prints certified digits. A value that sits on a digit boundary
// (an exact 4 computed as sqrt(2)*sqrt(8), say) has no certified digits
// beyond the boundary; it prints as a rounded value with a certified bound.
func (r *Real) M__str__() (py.Object, error) {
	text, err := r.x.Digits(printedDigits, min(r.cap, 4096))
	if err == nil {
		return py.String(text), nil
	}
	iv, err := r.x.Approx(4096, min(r.cap, 8192))
	if err != nil {
		return py.String(r.x.String()), nil
	}
	mid := new(big.Rat).Add(iv.Lo, iv.Hi)
	mid.Quo(mid, big.NewRat(2, 1))
	rad := new(big.Rat).Sub(iv.Hi, iv.Lo)
	exp := 0 // the bound 10^exp >= rad/2
	for ten := big.NewRat(1, 1); ten.Cmp(rad) >= 0 && exp > -100000; exp-- {
		ten.Quo(ten, big.NewRat(10, 1))
	}
	return py.String(fmt.Sprintf("%s (within 1e%d)", mid.FloatString(printedDigits-1), exp+1)), nil
}

// M__repr__ prints the same as str.
func (r *Real) M__repr__() (py.Object, error) { return r.M__str__() }

// M__float__ is the certified nearest float64.
func (r *Real) M__float__() (py.Object, error) {
	f, err := r.x.Float64(r.cap)
	if err != nil {
		return nil, realErr(err, r.cap)
	}
	return py.Float(f), nil
}

func (r *Real) binary(o py.Object, swap bool, op func(a, b *exact.Real) *exact.Real, fop func(a, b py.Object) (py.Object, error)) (py.Object, error) {
	if floatMode {
		return r.floatOperator(o, swap, fop)
	}
	y, ok := realOf(o)
	if !ok {
		if _, isFloat := o.(py.Float); isFloat {
			return nil, py.ExceptionNewf(py.TypeError, "a certified real cannot be mixed with a float64 (%s); use exact numbers", str(o))
		}
		return py.NotImplemented, nil
	}
	a, b := r.x, y
	if swap {
		a, b = b, a
	}
	res := op(a, b)
	if err := check(res, r.cap); err != nil {
		return nil, err
	}
	return realResult(res, r.cap), nil
}

// M__add__ adds.
func (r *Real) M__add__(o py.Object) (py.Object, error) {
	return r.binary(o, false, exact.RealAdd, py.Add)
}

// M__radd__ adds.
func (r *Real) M__radd__(o py.Object) (py.Object, error) {
	return r.binary(o, true, exact.RealAdd, py.Add)
}

// M__sub__ subtracts.
func (r *Real) M__sub__(o py.Object) (py.Object, error) {
	return r.binary(o, false, exact.RealSub, py.Sub)
}

// M__rsub__ subtracts.
func (r *Real) M__rsub__(o py.Object) (py.Object, error) {
	return r.binary(o, true, exact.RealSub, py.Sub)
}

// M__mul__ multiplies.
func (r *Real) M__mul__(o py.Object) (py.Object, error) {
	return r.binary(o, false, exact.RealMul, py.Mul)
}

// M__rmul__ multiplies.
func (r *Real) M__rmul__(o py.Object) (py.Object, error) {
	return r.binary(o, true, exact.RealMul, py.Mul)
}

// M__truediv__ divides, once the divisor is certified non-zero.
func (r *Real) M__truediv__(o py.Object) (py.Object, error) {
	if y, ok := realOf(o); ok && !floatMode {
		if err := nonZeroDivisor(y, r.cap); err != nil {
			return nil, err
		}
	}
	return r.binary(o, false, exact.RealQuo, py.TrueDiv)
}

// M__rtruediv__ divides by r, once r is certified non-zero.
func (r *Real) M__rtruediv__(o py.Object) (py.Object, error) {
	if floatMode {
		return r.floatOperator(o, true, py.TrueDiv)
	}
	if err := nonZeroDivisor(r.x, r.cap); err != nil {
		return nil, err
	}
	return r.binary(o, true, exact.RealQuo, py.TrueDiv)
}

// nonZeroDivisor refines a divisor until it is separated from zero.
func nonZeroDivisor(y *exact.Real, cap uint) error {
	sign, err := y.Sign(cap)
	switch {
	case errors.Is(err, exact.ErrUndecided):
		return py.ExceptionNewf(py.ZeroDivisionError, "the divisor cannot be separated from zero up to the precision cap of %d bits (it may be exactly zero; raise the cap with --max-precision)", cap)
	case err != nil:
		return realErr(err, cap)
	case sign == 0:
		return py.ExceptionNewf(py.ZeroDivisionError, "division by a real that is exactly zero")
	}
	return nil
}

// M__pow__ raises to an integer power; a rational exponent p/q is root(x, q)**p.
func (r *Real) M__pow__(o, mod py.Object) (py.Object, error) {
	if floatMode {
		return r.floatOperator(o, false, func(a, b py.Object) (py.Object, error) { return py.Pow(a, b, py.None) })
	}
	e, ok := exactOf(o)
	if !ok || mod != py.None {
		return nil, py.ExceptionNewf(py.TypeError, "a real power needs an exact exponent")
	}
	if e.Num().CmpAbs(big.NewInt(maxExponent)) > 0 || e.Denom().Cmp(big.NewInt(maxExponent)) > 0 {
		return nil, py.ExceptionNewf(py.OverflowError, "exponent %s is too large (limit %d)", exact.FormatRat(e), maxExponent)
	}
	x := r.x
	if !e.IsInt() {
		x = exact.RealRoot(x, int(e.Denom().Int64()))
	}
	res := exact.RealPowInt(x, int(e.Num().Int64()))
	if err := check(res, r.cap); err != nil {
		return nil, err
	}
	return realResult(res, r.cap), nil
}

// M__rpow__ handles number ** real only for exact integer exponents elsewhere.
func (r *Real) M__rpow__(o py.Object) (py.Object, error) {
	return nil, py.ExceptionNewf(py.TypeError, "a real exponent is not supported; write exp(y * log(x))")
}

// M__neg__ negates.
func (r *Real) M__neg__() (py.Object, error) { return &Real{x: exact.RealNeg(r.x), cap: r.cap}, nil }

// M__pos__ returns r.
func (r *Real) M__pos__() (py.Object, error) { return r, nil }

// M__abs__ is |r|, decided by refining the sign.
func (r *Real) M__abs__() (py.Object, error) {
	s, err := r.x.Sign(r.cap)
	if err != nil {
		return nil, realErr(err, r.cap)
	}
	if s < 0 {
		return r.M__neg__()
	}
	return r, nil
}

// compare decides the order by refining until the enclosures separate.
func (r *Real) compare(o py.Object, test func(int) bool, op string) (py.Object, error) {
	if floatMode {
		a, err1 := r.x.Float64(r.cap)
		b, err2 := floatArg(op, o)
		if err1 != nil || err2 != nil {
			return py.NotImplemented, nil
		}
		return py.NewBool(test(cmpFloat(a, b))), nil
	}
	y, ok := realOf(o)
	if !ok {
		return py.NotImplemented, nil
	}
	c, err := exact.RealCmp(r.x, y, r.cap)
	if err != nil {
		if errors.Is(err, exact.ErrUndecided) {
			return nil, py.ExceptionNewf(py.ArithmeticError, "cannot decide %s %s %s: the values agree to the precision cap of %d bits (raise it with --max-precision, or state the claim with identity())", str(r), op, str(o), r.cap)
		}
		return nil, realErr(err, r.cap)
	}
	return py.NewBool(test(c)), nil
}

// M__lt__ compares, refining as needed.
func (r *Real) M__lt__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c < 0 }, "<")
}

// M__le__ compares, refining as needed.
func (r *Real) M__le__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c <= 0 }, "<=")
}

// M__gt__ compares, refining as needed.
func (r *Real) M__gt__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c > 0 }, ">")
}

// M__ge__ compares, refining as needed.
func (r *Real) M__ge__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c >= 0 }, ">=")
}

// M__eq__ is decided only when the values separate or are known exactly.
func (r *Real) M__eq__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c == 0 }, "==")
}

// M__ne__ is the negation of M__eq__.
func (r *Real) M__ne__(o py.Object) (py.Object, error) {
	return r.compare(o, func(c int) bool { return c != 0 }, "!=")
}

// floatOperator applies an operator to the float64 values of r and o (float64 code).
func (r *Real) floatOperator(o py.Object, swap bool, op func(a, b py.Object) (py.Object, error)) (py.Object, error) {
	a, err := r.x.Float64(r.cap)
	if err != nil {
		return nil, realErr(err, r.cap)
	}
	b, err := floatArg("an operator", o)
	if err != nil {
		return py.NotImplemented, nil
	}
	if swap {
		return op(py.Float(b), py.Float(a))
	}
	return op(py.Float(a), py.Float(b))
}

// floatArg reads a number as a float64 (float64 code).
func floatArg(fn string, o py.Object) (float64, error) {
	if f, ok := floatOf(o); ok {
		return f, nil
	}
	if r, ok := o.(*Real); ok {
		f, err := r.x.Float64(r.cap)
		if err != nil {
			return 0, realErr(err, r.cap)
		}
		return f, nil
	}
	return 0, py.ExceptionNewf(py.TypeError, "%s needs a number, got %s", fn, typeName(o))
}

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

package values

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// Real is a certified real number in a cell: exact, evaluated lazily to
// whatever precision a printout, comparison or claim asks for.
type Real struct {
	x       *exact.Real
	env     *Env
	rounded bool // made by the input-rounding run (rounding.go)
}

// RealType is the Python type of Real.
var RealType = py.NewType("real", "A certified real: sqrt(2), exp(1), pi. Every printed digit is certified.")

// Type returns RealType.
func (r *Real) Type() *py.Type { return RealType }

// printedDigits is how many significant digits str() of a real shows.
const printedDigits = 20

// RealOf lifts an exact number or a real; ok is false for anything else.
func RealOf(o py.Object) (*exact.Real, bool) {
	if x, ok := o.(*Real); ok {
		return x.x, true
	}
	if q, ok := ExactOf(o); ok {
		return exact.RealFromRat(q), true
	}
	return nil, false
}

// Real gives x as a notebook value: a rational when it is known to be one.
func (e *Env) Real(x *exact.Real) py.Object {
	if q, ok := x.Rat(); ok {
		return e.Rational(q)
	}
	return &Real{x: x, env: e}
}

// checked evaluates x once at a modest precision so that domain errors
// (sqrt of a certified negative, log of zero) surface at the call that
// caused them, with its line, rather than later at a printout.
func (e *Env) checked(x *exact.Real) (py.Object, error) {
	if _, err := x.Approx(64, min(e.Cap, 4096)); err != nil && !errors.Is(err, exact.ErrUndecided) {
		return nil, err
	}
	return e.Real(x), nil
}

// floatFunctions are the float64 counterparts of the certified functions.
var floatFunctions = map[string]func(float64) float64{
	"sqrt": math.Sqrt, "exp": math.Exp, "log": math.Log, "sin": math.Sin, "cos": math.Cos, "acos": math.Acos,
}

func (e *Env) realBuiltins(b py.StringDict) {
	unary := func(name, doc string, f func(*exact.Real) *exact.Real) builtin {
		return builtin{name, params("x"), doc, func(a interp.Args) (py.Object, error) { return e.unary(name, f, a.Get("x")) }}
	}
	setBuiltins(b, []builtin{
		{"sqrt", params("x"), "sqrt(x) -> the certified square root (a rational when x is a rational square); of a polynomial that is a perfect square, its square root with a positive leading coefficient", func(a interp.Args) (py.Object, error) {
			if p, ok := a.Get("x").(*Polynomial); ok {
				if e.Float {
					return nil, NoCompanion("a polynomial")
				}
				return e.polySqrt(p.p)
			}
			return e.unary("sqrt", exact.RealSqrt, a.Get("x"))
		}},
		unary("exp", "exp(x) -> the certified exponential", exact.RealExp),
		unary("log", "log(x) -> the certified natural logarithm", exact.RealLog),
		unary("sin", "sin(x) -> the certified sine", exact.RealSin),
		unary("cos", "cos(x) -> the certified cosine", exact.RealCos),
		unary("acos", "acos(x) -> the certified arc cosine, for -1 <= x <= 1", exact.RealAcos),
		{"root", params("x", "k"), "root(x, k) -> the certified k-th root (odd roots of negatives are negative)", e.root},
		{"atan2", params("y", "x"), "atan2(y, x) -> the certified angle of the point (x, y), in (-pi, pi]", e.atan2},
		{"digits", params("x", "n"), "digits(x, n) -> n significant digits of x, every one certified", e.digits},
	})
	b["pi"] = &Real{x: exact.Pi(), env: e}
}

func (e *Env) unary(name string, f func(*exact.Real) *exact.Real, o py.Object) (py.Object, error) {
	if s, ok := o.(*Series); ok {
		return s.function(name, 0)
	}
	if e.Float {
		x, err := floatArg(name, o)
		if err != nil {
			return nil, err
		}
		return py.Float(floatFunctions[name](x)), nil
	}
	if e.Rounding {
		return e.rounding(func(xs []py.Object) (py.Object, error) { return e.unary(name, f, xs[0]) }, o)
	}
	x, ok := RealOf(o)
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "%s() needs an exact number or a real, got %s%s", name, interp.TypeName(o), FloatHint(o))
	}
	return e.checked(f(x))
}

func (e *Env) root(a interp.Args) (py.Object, error) {
	if s, ok := a.Get("x").(*Series); ok {
		k, err := a.Int("k", 0)
		if err != nil || k < 2 || k > MaxExponent {
			return nil, py.ExceptionNewf(py.ValueError, "root(x, k) needs an integer k from 2 to %d, got %s", MaxExponent, interp.Str(a.Get("k")))
		}
		return s.function("root", int(k))
	}
	if e.Float {
		f, err1 := floatArg("root", a.Get("x"))
		k, err2 := floatArg("root", a.Get("k"))
		if err1 != nil || err2 != nil {
			return nil, py.ExceptionNewf(py.TypeError, "root(x, k) needs numbers")
		}
		return py.Float(math.Copysign(math.Pow(math.Abs(f), 1/k), f)), nil
	}
	if e.Rounding {
		return e.roundingBuiltin(e.root, a)
	}
	x, ok := RealOf(a.Get("x"))
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "root() needs an exact number or a real, got %s", interp.TypeName(a.Get("x")))
	}
	k, err := a.Int("k", 0)
	if err != nil || k < 2 || k > MaxExponent {
		return nil, py.ExceptionNewf(py.ValueError, "root(x, k) needs an integer k from 2 to %d, got %s", MaxExponent, interp.Str(a.Get("k")))
	}
	return e.checked(exact.RealRoot(x, int(k)))
}

func (e *Env) atan2(a interp.Args) (py.Object, error) {
	if e.Float {
		y, err1 := floatArg("atan2", a.Get("y"))
		x, err2 := floatArg("atan2", a.Get("x"))
		if err1 != nil || err2 != nil {
			return nil, py.ExceptionNewf(py.TypeError, "atan2(y, x) needs numbers")
		}
		return py.Float(math.Atan2(y, x)), nil
	}
	if e.Rounding {
		return e.roundingBuiltin(e.atan2, a)
	}
	y, ok1 := RealOf(a.Get("y"))
	x, ok2 := RealOf(a.Get("x"))
	if !ok1 || !ok2 {
		return nil, py.ExceptionNewf(py.TypeError, "atan2() needs exact numbers or reals")
	}
	return e.checked(exact.RealAtan2(y, x))
}

func (e *Env) digits(a interp.Args) (py.Object, error) {
	x, ok := RealOf(a.Get("x"))
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "digits() needs an exact number or a real, got %s", interp.TypeName(a.Get("x")))
	}
	n, err := a.Int("n", 0)
	if err != nil || n < 1 || n > 1_000_000 {
		return nil, py.ExceptionNewf(py.ValueError, "digits(x, n) needs 1 <= n <= 1000000")
	}
	text, err := x.Digits(int(n), e.Cap)
	if err != nil {
		return nil, err
	}
	return py.String(text), nil
}

func init() {
	setMethods(RealType, []method[*Real]{
		{"enclosure", params("bits"), "x.enclosure(bits) -> (lo, hi), rationals with lo <= x <= hi and hi - lo <= 2^-bits (relative for large x)", (*Real).enclosure},
	})
}

func (r *Real) enclosure(a interp.Args) (py.Object, error) {
	bits, err := a.Int("bits", 0)
	if err != nil || bits < 1 || uint(bits) > r.env.Cap {
		return nil, py.ExceptionNewf(py.ValueError, "enclosure(bits) needs 1 <= bits <= %d (the precision cap)", r.env.Cap)
	}
	iv, err := r.x.Approx(uint(bits), r.env.Cap)
	if err != nil {
		return nil, err
	}
	return py.Tuple{r.env.Rational(iv.Lo), r.env.Rational(iv.Hi)}, nil
}

// M__str__ prints an algebraic real's closed form when it is short
// (exact.ClosedForm: exactly equal, sqrt(2)/2, (1 + sqrt(5))/2), and
// otherwise 20 significant digits, every one certified (exact.Text):
// a value that sits on a digit boundary (an exact 4 computed as
// sqrt(2)*sqrt(8), say) has no certified digits beyond the boundary, so it
// prints rounded, with a bound proved to cover the rounding and the
// enclosure. A value with no enclosure at the cap prints why, in angle
// brackets, rather than raising from inside a print.
func (r *Real) M__str__() (res py.Object, err error) {
	defer interp.Recover("real.__str__", &res, &err)
	text, err := r.x.Text(printedDigits, min(r.env.Cap, 8192))
	switch {
	case err == nil:
		// The enclosure exists, so every root argument and divisor in x
		// was valid: a closed form, when short, prints instead.
		if form, ok := r.closedForm(); ok {
			return py.String(form), nil
		}
		return py.String(text), nil
	case errors.Is(err, exact.ErrDomain):
		// Certified outside a domain only at this precision (the square
		// root of a value shown negative): there is no such real number.
		return py.String(fmt.Sprintf("<not a real number: %s>", err)), nil
	default:
		why := strings.TrimSuffix(err.Error(), ": "+exact.ErrUndecided.Error())
		return py.String(fmt.Sprintf("<real with no enclosure for printing: %s>", why)), nil
	}
}

// M__repr__ prints the same as str.
func (r *Real) M__repr__() (res py.Object, err error) {
	defer interp.Recover("real.__repr__", &res, &err)
	return r.M__str__()
}

// M__float__ is the certified nearest float64.
func (r *Real) M__float__() (res py.Object, err error) {
	defer interp.Recover("real.__float__", &res, &err)
	f, err := r.float64()
	if err != nil {
		return nil, err
	}
	return py.Float(f), nil
}

func (r *Real) float64() (float64, error) {
	f, err := r.x.Float64(r.env.Cap)
	return f, interp.Exception(err)
}

func (r *Real) binary(o py.Object, swap bool, op func(a, b *exact.Real) *exact.Real, fop func(a, b py.Object) (py.Object, error)) (res py.Object, err error) {
	defer interp.Recover("real arithmetic", &res, &err)
	if r.env.Float || r.env.Rounding {
		return r.floatOperator(o, swap, fop)
	}
	y, ok := RealOf(o)
	if !ok {
		if _, isFloat := o.(py.Float); isFloat {
			return nil, py.ExceptionNewf(py.TypeError, "a certified real cannot be mixed with a float64 (%s); use exact numbers", interp.Str(o))
		}
		return py.NotImplemented, nil
	}
	a, b := r.x, y
	if swap {
		a, b = b, a
	}
	return r.env.checked(op(a, b))
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
func (r *Real) M__truediv__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("real.__truediv__", &res, &err)
	if y, ok := RealOf(o); ok && !r.env.Float {
		if err := r.env.nonZeroDivisor(y); err != nil {
			return nil, err
		}
	}
	return r.binary(o, false, exact.RealQuo, py.TrueDiv)
}

// M__rtruediv__ divides by r, once r is certified non-zero.
func (r *Real) M__rtruediv__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("real.__rtruediv__", &res, &err)
	if r.env.Float {
		return r.floatOperator(o, true, py.TrueDiv)
	}
	if err := r.env.nonZeroDivisor(r.x); err != nil {
		return nil, err
	}
	return r.binary(o, true, exact.RealQuo, py.TrueDiv)
}

// nonZeroDivisor refines a divisor until it is separated from zero.
func (e *Env) nonZeroDivisor(y *exact.Real) error {
	sign, err := y.Sign(e.Cap)
	switch {
	case errors.Is(err, exact.ErrUndecided):
		return py.ExceptionNewf(py.ZeroDivisionError, "the divisor cannot be separated from zero up to the precision cap of %d bits (it may be exactly zero; raise the cap with --max-precision)", e.Cap)
	case err != nil:
		return err
	case sign == 0:
		return py.ExceptionNewf(py.ZeroDivisionError, "division by a real that is exactly zero")
	}
	return nil
}

// M__pow__ raises to an integer power; a rational exponent p/q is root(x, q)**p.
func (r *Real) M__pow__(o, mod py.Object) (res py.Object, err error) {
	defer interp.Recover("real.__pow__", &res, &err)
	if r.env.Float {
		return r.floatOperator(o, false, func(a, b py.Object) (py.Object, error) { return py.Pow(a, b, py.None) })
	}
	e, ok := ExactOf(o)
	if !ok || mod != py.None {
		return nil, py.ExceptionNewf(py.TypeError, "a real power needs an exact exponent")
	}
	if e.Num().CmpAbs(big.NewInt(MaxExponent)) > 0 || e.Denom().Cmp(big.NewInt(MaxExponent)) > 0 {
		return nil, py.ExceptionNewf(py.OverflowError, "exponent %s is too large (limit %d)", exact.FormatRat(e), MaxExponent)
	}
	x := r.x
	if !e.IsInt() {
		x = exact.RealRoot(x, int(e.Denom().Int64()))
	}
	return r.env.checked(exact.RealPowInt(x, int(e.Num().Int64())))
}

// M__rpow__ handles number ** real only for exact integer exponents elsewhere.
func (r *Real) M__rpow__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("real.__rpow__", &res, &err)
	return nil, py.ExceptionNewf(py.TypeError, "a real exponent is not supported; write exp(y * log(x))")
}

// M__neg__ negates.
func (r *Real) M__neg__() (res py.Object, err error) {
	defer interp.Recover("real.__neg__", &res, &err)
	return &Real{x: exact.RealNeg(r.x), env: r.env, rounded: r.rounded}, nil
}

// M__pos__ returns r.
func (r *Real) M__pos__() (res py.Object, err error) {
	defer interp.Recover("real.__pos__", &res, &err)
	return r, nil
}

// M__abs__ is |r|, decided by refining the sign.
func (r *Real) M__abs__() (res py.Object, err error) {
	defer interp.Recover("real.__abs__", &res, &err)
	s, err := r.x.Sign(r.env.Cap)
	if err != nil {
		return nil, interp.Exception(err)
	}
	if s < 0 {
		return r.M__neg__()
	}
	return r, nil
}

// compare decides the order by refining until the enclosures separate.
func (r *Real) compare(o py.Object, test func(int) bool, op string) (res py.Object, err error) {
	defer interp.Recover("real comparison", &res, &err)
	if r.env.Float {
		a, err1 := r.x.Float64(r.env.Cap)
		b, err2 := floatArg(op, o)
		if err1 != nil || err2 != nil {
			return py.NotImplemented, nil
		}
		return py.NewBool(test(cmpFloat(a, b))), nil
	}
	y, ok := RealOf(o)
	if !ok {
		return py.NotImplemented, nil
	}
	c, err := exact.RealCmp(r.x, y, r.env.Cap)
	if err != nil {
		if errors.Is(err, exact.ErrUndecided) {
			return nil, py.ExceptionNewf(py.ArithmeticError, "cannot decide %s %s %s: the values agree to the precision cap of %d bits (raise it with --max-precision, or state the claim with identity())", interp.Str(r), op, interp.Str(o), r.env.Cap)
		}
		return nil, interp.Exception(err)
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
// In the input-rounding run it applies the exact operator to the rounded
// values instead.
func (r *Real) floatOperator(o py.Object, swap bool, op func(a, b py.Object) (py.Object, error)) (py.Object, error) {
	if r.env.Rounding {
		return r.env.rounding(func(xs []py.Object) (py.Object, error) { return op(xs[0], xs[1]) }, swapped(r, o, swap)...)
	}
	a, err := r.float64()
	if err != nil {
		return nil, err
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
	if f, ok := FloatOf(o); ok {
		return f, nil
	}
	if r, ok := o.(*Real); ok {
		return r.float64()
	}
	return 0, py.ExceptionNewf(py.TypeError, "%s needs a number, got %s", fn, interp.TypeName(o))
}

// FloatList reads a list of numbers (ints, rationals, reals, floats) as float64.
func FloatList(o py.Object, what string) ([]float64, error) {
	items, err := Sequence(o, what)
	if err != nil {
		return nil, err
	}
	out := make([]float64, len(items))
	for i, it := range items {
		if out[i], err = floatArg(what, it); err != nil {
			return nil, py.ExceptionNewf(py.TypeError, "%s: entry %d is %s, not a number", what, i, interp.TypeName(it))
		}
	}
	return out, nil
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

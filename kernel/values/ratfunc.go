package values

import (
	"errors"
	"math/big"
	"slices"
	"strings"
	"sync"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// RationalFunction is a quotient of polynomials over Q in lowest terms,
// made by p / q when q does not divide p. It is immutable. Arithmetic whose
// result has denominator 1 gives a Polynomial again.
type RationalFunction struct {
	f   *exact.RatFunc
	env *Env
}

// RationalFunctionType is the Python type of RationalFunction.
var RationalFunctionType = py.NewType("rational_function", "A quotient of polynomials over Q in lowest terms: (1 - t**2) / (1 + t**2).")

// Type returns RationalFunctionType.
func (f *RationalFunction) Type() *py.Type { return RationalFunctionType }

// Value is the rational function.
func (f *RationalFunction) Value() *exact.RatFunc { return f.f }

// RatFuncResult gives f as a notebook value: a Polynomial when its
// denominator is 1 (marked as made by a division), else a
// RationalFunction.
func (e *Env) RatFuncResult(f *exact.RatFunc) py.Object {
	if f.IsPoly() {
		return &Polynomial{p: f.Num(), env: e, quotient: true}
	}
	return &RationalFunction{f: f, env: e}
}

// RatFuncValue gives f as a notebook value: a rational when it is a
// constant, a Polynomial when its denominator is 1, else a
// RationalFunction.
func (e *Env) RatFuncValue(f *exact.RatFunc) py.Object {
	if f.IsPoly() {
		return e.PolyResult(f.Num())
	}
	return e.RatFuncResult(f)
}

// RatFunc lifts an exact number, a polynomial or a rational function.
func (e *Env) RatFunc(o py.Object) (*exact.RatFunc, bool) {
	if f, ok := o.(*RationalFunction); ok {
		return f.f, true
	}
	if p, ok := e.Poly(o); ok {
		return exact.RatFuncOf(p), true
	}
	return nil, false
}

// refuseOnce guards refusePolynomialOnly.
var refuseOnce sync.Once

// refusePolynomialOnly gives rational functions, for every polynomial
// method they lack (degree, coefficient, terms, …), a refusal that points
// at the numerator and denominator. Env.Install runs it, once, when every
// init has filled the method tables, so a polynomial method added later
// is covered too.
func refusePolynomialOnly() {
	refuseOnce.Do(func() {
		var table []method[*RationalFunction]
		for name := range PolynomialType.Dict {
			if _, ok := RationalFunctionType.Dict[name]; ok || strings.HasPrefix(name, "__") {
				continue
			}
			table = append(table, method[*RationalFunction]{name, params("*args", "**kwargs"), name + "() is for polynomials: use f.numerator or f.denominator", func(f *RationalFunction, _ interp.Args) (py.Object, error) {
				return nil, py.ExceptionNewf(py.TypeError, "%s() is for polynomials, and %s is a rational function: apply it to f.numerator or f.denominator", name, clip(f.f.String(), 200))
			}})
		}
		setMethods(RationalFunctionType, table)
	})
}

func init() {
	RationalFunctionType.Dict["numerator"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		f := self.(*RationalFunction)
		return f.env.Polynomial(f.f.Num()), nil
	}, Doc: "the numerator, a polynomial (it carries the rational content)"}
	RationalFunctionType.Dict["denominator"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		f := self.(*RationalFunction)
		return f.env.Polynomial(f.f.Den()), nil
	}, Doc: "the denominator, a polynomial with coprime integer coefficients and a positive leading coefficient"}
	setMethods(RationalFunctionType, []method[*RationalFunction]{
		{"at", params("*values", "**values"), "f.at(t=2) -> f with those values put in (exact numbers, or certified reals for every variable); an error where the denominator vanishes", (*RationalFunction).at},
		{"substitute", params("*replacements", "**replacements"), "f.substitute(t=(1 - s)/(1 + s)) -> f with polynomials or rational functions put in for variables, all at once", (*RationalFunction).substitute},
		{"derivative", params("variable"), "f.derivative(\"t\") -> the partial derivative with respect to t (quotient rule), in lowest terms", (*RationalFunction).derivative},
		{"variables", nil, "f.variables() -> the names of the variables that occur in f", (*RationalFunction).variables},
	})
}

func (f *RationalFunction) at(a interp.Args) (py.Object, error) {
	if err := byName(a, "at() takes values by name: f.at(t=2)"); err != nil {
		return nil, err
	}
	e := f.env
	vals := map[int]*big.Rat{}
	reals := map[int]*exact.Real{}
	anyReal := false
	for name, v := range a.Keywords() {
		i, err := e.variableIndex("at", py.String(name))
		if err != nil {
			return nil, err
		}
		x, ok := RealOf(v)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "at(%s=…) needs an exact number or a certified real, got %s%s", name, interp.TypeName(v), FloatHint(v))
		}
		reals[i] = x
		if q, ok := ExactOf(v); ok {
			vals[i] = q
		} else {
			anyReal = true
		}
	}
	point := e.point(reals)
	if !anyReal {
		g, err := f.f.Eval(vals)
		if errors.Is(err, exact.ErrDivisionByZero) {
			return nil, py.ExceptionNewf(py.ZeroDivisionError, "%s is not defined at %s: its denominator %s vanishes there", clip(f.f.String(), 200), point, clip(f.f.Den().String(), 200))
		}
		if err != nil {
			return nil, err
		}
		return e.RatFuncValue(g), nil
	}
	num, den, err := f.f.EvalReal(reals)
	if errors.Is(err, exact.ErrShape) {
		return nil, py.ExceptionNewf(py.ValueError, "at() with a certified real value needs a value for every variable of %s: %v", clip(f.f.String(), 200), err)
	}
	if err != nil {
		return nil, err
	}
	sign, err := den.Sign(e.Cap)
	switch {
	case errors.Is(err, exact.ErrUndecided):
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "%s at %s: the denominator %s is not proved non-zero there (its enclosure still contains 0 at the precision cap of %d bits; it may be exactly zero — raise the cap with --max-precision)", clip(f.f.String(), 200), point, clip(f.f.Den().String(), 200), e.Cap)
	case err != nil:
		return nil, err
	case sign == 0:
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "%s is not defined at %s: its denominator %s is exactly zero there", clip(f.f.String(), 200), point, clip(f.f.Den().String(), 200))
	}
	return e.checked(exact.RealQuo(num, den))
}

// point prints values of variables for a message, in the ring's order.
func (e *Env) point(vals map[int]*exact.Real) string {
	names := e.Ring.Names()
	idx := make([]int, 0, len(vals))
	for i := range vals {
		idx = append(idx, i)
	}
	slices.Sort(idx)
	parts := make([]string, len(idx))
	for k, i := range idx {
		parts[k] = names[i] + " = " + interp.Str(e.Real(vals[i]))
	}
	return strings.Join(parts, ", ")
}

func (f *RationalFunction) substitute(a interp.Args) (py.Object, error) {
	if err := byName(a, "substitute() takes replacements by name: f.substitute(t=s + 1)"); err != nil {
		return nil, err
	}
	subs := map[int]*exact.RatFunc{}
	for name, v := range a.Keywords() {
		i, err := f.env.variableIndex("substitute", py.String(name))
		if err != nil {
			return nil, err
		}
		g, ok := f.env.RatFunc(v)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "substitute(%s=…) needs a polynomial, a rational function or an exact number, got %s%s", name, interp.TypeName(v), FloatHint(v))
		}
		subs[i] = g
	}
	g, err := f.f.Substitute(subs)
	if errors.Is(err, exact.ErrDivisionByZero) {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "substitute(): the denominator %s of %s becomes 0", clip(f.f.Den().String(), 200), clip(f.f.String(), 200))
	}
	if err != nil {
		return nil, err
	}
	return f.env.RatFuncResult(g), nil
}

func (f *RationalFunction) derivative(a interp.Args) (py.Object, error) {
	v, err := f.env.variableIndex("derivative", a.Get("variable"))
	if err != nil {
		return nil, err
	}
	g, err := f.f.Derivative(v)
	if err != nil {
		return nil, err
	}
	return f.env.RatFuncResult(g), nil
}

func (f *RationalFunction) variables(interp.Args) (py.Object, error) {
	names := f.env.Ring.Names()
	vs := append(f.f.Num().Vars(), f.f.Den().Vars()...)
	slices.Sort(vs)
	var out []string
	for _, v := range slices.Compact(vs) {
		out = append(out, names[v])
	}
	return py.NewListFromStrings(out), nil
}

// ratOperands lifts both sides of a binary operator; ok is false when the
// other side is none of an exact number, a polynomial, a rational function.
func (e *Env) ratOperands(self *exact.RatFunc, o py.Object, swap bool) (a, b *exact.RatFunc, ok bool, err error) {
	g, ok := e.RatFunc(o)
	if !ok {
		if _, isFloat := o.(py.Float); isFloat {
			return nil, nil, false, py.ExceptionNewf(py.TypeError, "a rational function cannot be mixed with a float64 (%s); use exact numbers, e.g. frac(\"%s\")", interp.Str(o), interp.Str(o))
		}
		return nil, nil, false, nil
	}
	if swap {
		return g, self, true, nil
	}
	return self, g, true, nil
}

// ratArith applies a rational-function operator to self and o (Polynomial
// uses it for p / q as well).
func (e *Env) ratArith(self *exact.RatFunc, o py.Object, swap bool, op func(a, b *exact.RatFunc) (*exact.RatFunc, error)) (res py.Object, err error) {
	defer interp.Recover("rational function arithmetic", &res, &err)
	a, b, ok, err := e.ratOperands(self, o, swap)
	if err != nil || !ok {
		if err == nil {
			return py.NotImplemented, nil
		}
		return nil, err
	}
	r, err := op(a, b)
	if errors.Is(err, exact.ErrDivisionByZero) {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "%s divided by zero", clip(a.String(), 200))
	}
	if err != nil {
		return nil, err
	}
	return e.RatFuncResult(r), nil
}

// M__add__ adds.
func (f *RationalFunction) M__add__(o py.Object) (py.Object, error) {
	return f.env.ratArith(f.f, o, false, (*exact.RatFunc).Add)
}

// M__radd__ adds.
func (f *RationalFunction) M__radd__(o py.Object) (py.Object, error) {
	return f.env.ratArith(f.f, o, true, (*exact.RatFunc).Add)
}

// M__sub__ subtracts.
func (f *RationalFunction) M__sub__(o py.Object) (py.Object, error) {
	return f.env.ratArith(f.f, o, false, (*exact.RatFunc).Sub)
}

// M__rsub__ subtracts.
func (f *RationalFunction) M__rsub__(o py.Object) (py.Object, error) {
	return f.env.ratArith(f.f, o, true, (*exact.RatFunc).Sub)
}

// M__mul__ multiplies.
func (f *RationalFunction) M__mul__(o py.Object) (py.Object, error) {
	return f.env.ratArith(f.f, o, false, (*exact.RatFunc).Mul)
}

// M__rmul__ multiplies.
func (f *RationalFunction) M__rmul__(o py.Object) (py.Object, error) {
	return f.env.ratArith(f.f, o, true, (*exact.RatFunc).Mul)
}

// M__truediv__ divides; ZeroDivisionError for a zero divisor.
func (f *RationalFunction) M__truediv__(o py.Object) (py.Object, error) {
	return f.env.ratArith(f.f, o, false, (*exact.RatFunc).Quo)
}

// M__rtruediv__ divides by f.
func (f *RationalFunction) M__rtruediv__(o py.Object) (py.Object, error) {
	return f.env.ratArith(f.f, o, true, (*exact.RatFunc).Quo)
}

// M__pow__ raises to an integer power, negative too.
func (f *RationalFunction) M__pow__(o, mod py.Object) (res py.Object, err error) {
	defer interp.Recover("rational_function.__pow__", &res, &err)
	return f.env.ratPow(f.f, o, mod)
}

// ratPow raises f to an integer power (|k| ≤ MaxExponent).
func (e *Env) ratPow(f *exact.RatFunc, o, mod py.Object) (py.Object, error) {
	k, ok := ExactOf(o)
	if !ok || mod != py.None || !k.IsInt() {
		return nil, py.ExceptionNewf(py.TypeError, "a power of a polynomial or rational function needs an integer exponent")
	}
	if new(big.Int).Abs(k.Num()).Cmp(big.NewInt(MaxExponent)) > 0 {
		return nil, py.ExceptionNewf(py.OverflowError, "exponent %s is too large (limit %d)", k.Num(), MaxExponent)
	}
	r, err := f.Pow(int(k.Num().Int64()))
	if errors.Is(err, exact.ErrDivisionByZero) {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "0 cannot be raised to a negative power (%s)", k.Num())
	}
	if err != nil {
		return nil, err
	}
	return e.RatFuncResult(r), nil
}

// M__neg__ negates.
func (f *RationalFunction) M__neg__() (res py.Object, err error) {
	defer interp.Recover("rational_function.__neg__", &res, &err)
	return f.env.RatFuncResult(f.f.Neg()), nil
}

// M__pos__ returns f.
func (f *RationalFunction) M__pos__() (py.Object, error) { return f, nil }

// M__bool__ is true: a rational function that is not a polynomial is not 0.
func (f *RationalFunction) M__bool__() (py.Object, error) { return py.True, nil }

// M__eq__ is equality as rational functions (lowest terms make it exact).
func (f *RationalFunction) M__eq__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("rational_function.__eq__", &res, &err)
	g, ok := f.env.RatFunc(o)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(f.f.Equal(g)), nil
}

// M__ne__ is the negation of M__eq__.
func (f *RationalFunction) M__ne__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("rational_function.__ne__", &res, &err)
	g, ok := f.env.RatFunc(o)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(!f.f.Equal(g)), nil
}

// M__str__ prints (numerator)/(denominator).
func (f *RationalFunction) M__str__() (res py.Object, err error) {
	defer interp.Recover("rational_function.__str__", &res, &err)
	return py.String(f.f.String()), nil
}

// M__repr__ prints the same as str.
func (f *RationalFunction) M__repr__() (py.Object, error) { return f.M__str__() }

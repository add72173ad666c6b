package kernel

import (
	"errors"
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/exact"
)

// Polynomial is a multivariate polynomial over Q in a cell. It is immutable.
type Polynomial struct{ p *exact.Poly }

// PolynomialType is the Python type of Polynomial.
var PolynomialType = py.NewType("polynomial", "A polynomial over Q: a, b = variables(\"a b\"); a**2 - 2*b.")

// Type returns PolynomialType.
func (p *Polynomial) Type() *py.Type { return PolynomialType }

func polyObject(p *exact.Poly) *Polynomial { return &Polynomial{p: p} }

// polyOf lifts an exact scalar or a polynomial into ring.
func polyOf(ring *exact.Ring, o py.Object) (*exact.Poly, bool) {
	if p, ok := o.(*Polynomial); ok {
		return p.p, true
	}
	if r, ok := exactOf(o); ok {
		return ring.Const(r), true
	}
	return nil, false
}

// polyErr turns an error from polynomial work into a Python exception.
func polyErr(err error) error {
	if err == nil {
		return nil
	}
	if errors.Is(err, exact.ErrTooManyTerms) {
		return py.ExceptionNewf(py.MemoryError, "%v", err)
	}
	return wrapErr(err)
}

// variableIndex reads a variable given by name ("a") or as the variable itself.
func variableIndex(ring *exact.Ring, fn string, o py.Object) (int, error) {
	switch x := o.(type) {
	case py.String:
		if i, ok := ring.Index(string(x)); ok {
			return i, nil
		}
		return 0, py.ExceptionNewf(py.ValueError, "%s(): there is no variable %q (make it with variables(\"%s\"))", fn, string(x), string(x))
	case *Polynomial:
		if vs := x.p.Vars(); len(vs) == 1 && x.p.Len() == 1 && x.p.Degree() == 1 && x.p.LeadingCoefficient().Cmp(big.NewRat(1, 1)) == 0 {
			return vs[0], nil
		}
		return 0, py.ExceptionNewf(py.ValueError, "%s(): %s is not a single variable", fn, x.p)
	}
	return 0, py.ExceptionNewf(py.TypeError, "%s(): name a variable by a string or give the variable itself, not %s", fn, typeName(o))
}

// keywordValues reads a=2, b=frac(1, 3) into variable values.
func keywordValues(ring *exact.Ring, fn string, kw py.StringDict) (map[int]*big.Rat, error) {
	vals := map[int]*big.Rat{}
	for name, v := range kw {
		i, err := variableIndex(ring, fn, py.String(name))
		if err != nil {
			return nil, err
		}
		r, ok := exactOf(v)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "%s(%s=…) needs an exact number, got %s%s", fn, name, typeName(v), floatHint(v))
		}
		vals[i] = r
	}
	return vals, nil
}

// resultObject gives a constant polynomial as a rational, otherwise the polynomial.
func resultObject(p *exact.Poly) py.Object {
	if c, ok := p.Constant(); ok {
		return newRational(c)
	}
	return polyObject(p)
}

func (s *Session) installPolynomials(b py.StringDict) {
	b["variables"] = builtin("variables", "variables(\"a b c\") -> the indeterminates a, b, c (one name gives one variable)", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("variables", args, kw, []string{"names"}, 1)
		if err != nil {
			return nil, err
		}
		text, err := stringArg("variables", "names", a[0])
		if err != nil {
			return nil, err
		}
		names := strings.FieldsFunc(text, func(r rune) bool { return r == ' ' || r == ',' || r == '\t' || r == '\n' })
		if len(names) == 0 {
			return nil, py.ExceptionNewf(py.ValueError, "variables() needs at least one name")
		}
		out := make(py.Tuple, len(names))
		for i, n := range names {
			v, err := s.ring.Var(n)
			if err != nil {
				return nil, py.ExceptionNewf(py.ValueError, "variables(): %v", err)
			}
			out[i] = polyObject(v)
		}
		if len(out) == 1 {
			return out[0], nil
		}
		return out, nil
	})
	b["polynomial"] = builtin("polynomial", "polynomial(\"2*a^2*b - c\") -> the polynomial the text denotes", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("polynomial", args, kw, []string{"text"}, 1)
		if err != nil {
			return nil, err
		}
		if p, ok := polyOf(s.ring, a[0]); ok {
			return polyObject(p), nil
		}
		text, err := stringArg("polynomial", "text", a[0])
		if err != nil {
			return nil, err
		}
		p, err := s.ring.Parse(text)
		if err != nil {
			return nil, py.ExceptionNewf(py.ValueError, "polynomial(%q): %v", text, err)
		}
		return polyObject(p), nil
	})
	b["gcd"] = builtin("gcd", "gcd(p, q) -> greatest common divisor over Q, leading coefficient 1", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("gcd", args, kw, []string{"p", "q"}, 2)
		if err != nil {
			return nil, err
		}
		ps, err := s.polys("gcd", a...)
		if err != nil {
			return nil, err
		}
		g, err := exact.GCD(ps[0], ps[1])
		if err != nil {
			return nil, polyErr(err)
		}
		return resultObject(g), nil
	})
	b["resultant"] = builtin("resultant", "resultant(p, q, \"x\") -> the resultant of p and q with respect to x", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("resultant", args, kw, []string{"p", "q", "variable"}, 3)
		if err != nil {
			return nil, err
		}
		ps, err := s.polys("resultant", a[0], a[1])
		if err != nil {
			return nil, err
		}
		v, err := variableIndex(s.ring, "resultant", a[2])
		if err != nil {
			return nil, err
		}
		r, err := exact.Resultant(ps[0], ps[1], v)
		if err != nil {
			return nil, polyErr(err)
		}
		return resultObject(r), nil
	})
	b["discriminant"] = builtin("discriminant", "discriminant(p, \"x\") -> the discriminant of p with respect to x", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("discriminant", args, kw, []string{"p", "variable"}, 2)
		if err != nil {
			return nil, err
		}
		ps, err := s.polys("discriminant", a[0])
		if err != nil {
			return nil, err
		}
		v, err := variableIndex(s.ring, "discriminant", a[1])
		if err != nil {
			return nil, err
		}
		d, err := exact.Discriminant(ps[0], v)
		if err != nil {
			return nil, polyErr(err)
		}
		return resultObject(d), nil
	})
}

// polys lifts arguments into the session's ring.
func (s *Session) polys(fn string, args ...py.Object) ([]*exact.Poly, error) {
	out := make([]*exact.Poly, len(args))
	for i, a := range args {
		p, ok := polyOf(s.ring, a)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "%s() needs polynomials or exact numbers, got %s%s", fn, typeName(a), floatHint(a))
		}
		out[i] = p
	}
	return out, nil
}

func init() {
	method := func(name, doc string, f func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error)) {
		PolynomialType.Dict[name] = py.MustNewMethod(name, func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
			return f(self.(*Polynomial).p, args, kw)
		}, 0, doc)
	}
	method("at", "p.at(a=2, b=frac(1, 3)) -> p with those values put in (a rational when no variable is left)", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if len(args) > 0 {
			return nil, py.ExceptionNewf(py.TypeError, "at() takes values by name: p.at(a=2, b=3)")
		}
		vals, err := keywordValues(p.Ring(), "at", kw)
		if err != nil {
			return nil, err
		}
		return resultObject(p.Eval(vals)), nil
	})
	method("substitute", "p.substitute(a=b+c) -> p with polynomials put in for variables, all at once", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if len(args) > 0 {
			return nil, py.ExceptionNewf(py.TypeError, "substitute() takes replacements by name: p.substitute(a=b+c)")
		}
		subs := map[int]*exact.Poly{}
		for name, v := range kw {
			i, err := variableIndex(p.Ring(), "substitute", py.String(name))
			if err != nil {
				return nil, err
			}
			q, ok := polyOf(p.Ring(), v)
			if !ok {
				return nil, py.ExceptionNewf(py.TypeError, "substitute(%s=…) needs a polynomial or an exact number, got %s%s", name, typeName(v), floatHint(v))
			}
			subs[i] = q
		}
		r, err := p.Substitute(subs)
		if err != nil {
			return nil, polyErr(err)
		}
		return resultObject(r), nil
	})
	method("derivative", "p.derivative(\"a\") -> the partial derivative with respect to a", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("derivative", args, kw, []string{"variable"}, 1)
		if err != nil {
			return nil, err
		}
		v, err := variableIndex(p.Ring(), "derivative", a[0])
		if err != nil {
			return nil, err
		}
		return polyObject(p.Derivative(v)), nil
	})
	method("degree", "p.degree() -> total degree; p.degree(\"a\") -> degree in a (-1 for the zero polynomial)", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("degree", args, kw, []string{"variable"}, 0)
		if err != nil {
			return nil, err
		}
		if a[0] == nil {
			return py.Int(p.Degree()), nil
		}
		v, err := variableIndex(p.Ring(), "degree", a[0])
		if err != nil {
			return nil, err
		}
		return py.Int(p.DegreeIn(v)), nil
	})
	method("terms", "p.terms() -> [(coefficient, {\"a\": 2, \"b\": 1}), ...] in canonical order", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if _, err := bind("terms", args, kw, nil, 0); err != nil {
			return nil, err
		}
		names := p.Ring().Names()
		var out []py.Object
		for _, t := range p.Terms() {
			mono := py.NewStringDict()
			for i, e := range t.Exps {
				if e != 0 {
					mono[names[i]] = py.Int(e)
				}
			}
			out = append(out, py.Tuple{newRational(t.Coef), mono})
		}
		return py.NewListFromItems(out), nil
	})
	method("coefficient", "p.coefficient(a=2, b=1) or p.coefficient(a**2*b) -> the coefficient of that monomial", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		exps := make([]int, len(p.Ring().Names()))
		switch {
		case len(args) == 1 && len(kw) == 0:
			m, ok := args[0].(*Polynomial)
			if !ok || m.p.Len() != 1 {
				return nil, py.ExceptionNewf(py.TypeError, "coefficient() takes a monomial such as a**2*b, or exponents by name: coefficient(a=2, b=1)")
			}
			t := m.p.Terms()[0]
			copy(exps, t.Exps)
		case len(args) == 0:
			for name, v := range kw {
				i, err := variableIndex(p.Ring(), "coefficient", py.String(name))
				if err != nil {
					return nil, err
				}
				e, err := intArg("coefficient", name, v, 0)
				if err != nil || e < 0 {
					return nil, py.ExceptionNewf(py.ValueError, "coefficient(%s=…) needs a non-negative integer exponent", name)
				}
				exps[i] = int(e)
			}
		default:
			return nil, py.ExceptionNewf(py.TypeError, "coefficient() takes a monomial or exponents by name, not both")
		}
		return newRational(p.Coefficient(exps)), nil
	})
	method("divide", "p.divide(q) -> the exact quotient p/q; an error showing the remainder when q does not divide p", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("divide", args, kw, []string{"q"}, 1)
		if err != nil {
			return nil, err
		}
		q, ok := polyOf(p.Ring(), a[0])
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "divide() needs a polynomial or an exact number, got %s", typeName(a[0]))
		}
		if q.IsZero() {
			return nil, py.ExceptionNewf(py.ZeroDivisionError, "division by the zero polynomial")
		}
		// DivExact is fast; the remainder, for the message, only when it fails.
		quo, exactly, err := p.DivExact(q)
		if err != nil {
			return nil, polyErr(err)
		}
		if exactly {
			return resultObject(quo), nil
		}
		quo, rem, err := p.Divide(q)
		if err != nil {
			return nil, polyErr(err)
		}
		if !rem.IsZero() {
			return nil, py.ExceptionNewf(py.ValueError, "%s does not divide %s: the remainder is %s", clip(q.String(), 200), clip(p.String(), 200), clip(rem.String(), 400))
		}
		return resultObject(quo), nil
	})
	method("content", "p.content() -> the rational c with p = c * p.primitive_part()", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if _, err := bind("content", args, kw, nil, 0); err != nil {
			return nil, err
		}
		return newRational(p.Content()), nil
	})
	method("primitive_part", "p.primitive_part() -> p divided by its content: coprime integer coefficients, positive leading one", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if _, err := bind("primitive_part", args, kw, nil, 0); err != nil {
			return nil, err
		}
		return polyObject(p.PrimitivePart()), nil
	})
	method("is_homogeneous", "p.is_homogeneous() -> True when every term has the same total degree", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if _, err := bind("is_homogeneous", args, kw, nil, 0); err != nil {
			return nil, err
		}
		_, ok := p.Homogeneous()
		return py.NewBool(ok), nil
	})
	method("variables", "p.variables() -> the names of the variables that occur in p", func(p *exact.Poly, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if _, err := bind("variables", args, kw, nil, 0); err != nil {
			return nil, err
		}
		names := p.Ring().Names()
		var out []string
		for _, v := range p.Vars() {
			out = append(out, names[v])
		}
		return py.NewListFromStrings(out), nil
	})
}

// M__len__ is the number of terms.
func (p *Polynomial) M__len__() (py.Object, error) { return py.Int(p.p.Len()), nil }

// M__str__ prints the canonical form, e.g. "2*a^2*b - c".
func (p *Polynomial) M__str__() (py.Object, error) { return py.String(p.p.String()), nil }

// M__repr__ prints the same as str.
func (p *Polynomial) M__repr__() (py.Object, error) { return p.M__str__() }

// M__bool__ is false only for the zero polynomial.
func (p *Polynomial) M__bool__() (py.Object, error) { return py.NewBool(!p.p.IsZero()), nil }

// operands lifts both sides of a binary operator into the ring; ok is false
// when the other side is not a polynomial or an exact number.
func (p *Polynomial) operands(o py.Object, swap bool) (a, b *exact.Poly, ok bool, err error) {
	q, ok := polyOf(p.p.Ring(), o)
	if !ok {
		if _, isFloat := o.(py.Float); isFloat {
			return nil, nil, false, py.ExceptionNewf(py.TypeError, "a polynomial cannot be mixed with a float64 (%s); use exact numbers, e.g. frac(\"%s\")", str(o), str(o))
		}
		return nil, nil, false, nil
	}
	if swap {
		return q, p.p, true, nil
	}
	return p.p, q, true, nil
}

func (p *Polynomial) arith(o py.Object, swap bool, op func(a, b *exact.Poly) (*exact.Poly, error)) (py.Object, error) {
	a, b, ok, err := p.operands(o, swap)
	if err != nil || !ok {
		if err == nil {
			return py.NotImplemented, nil
		}
		return nil, err
	}
	r, err := op(a, b)
	if err != nil {
		return nil, polyErr(err)
	}
	return polyObject(r), nil
}

func polyAdd(a, b *exact.Poly) (*exact.Poly, error) { return a.Add(b), nil }
func polySub(a, b *exact.Poly) (*exact.Poly, error) { return a.Sub(b), nil }
func polyMul(a, b *exact.Poly) (*exact.Poly, error) { return a.Mul(b) }

// M__add__ adds.
func (p *Polynomial) M__add__(o py.Object) (py.Object, error) { return p.arith(o, false, polyAdd) }

// M__radd__ adds.
func (p *Polynomial) M__radd__(o py.Object) (py.Object, error) { return p.arith(o, true, polyAdd) }

// M__sub__ subtracts.
func (p *Polynomial) M__sub__(o py.Object) (py.Object, error) { return p.arith(o, false, polySub) }

// M__rsub__ subtracts.
func (p *Polynomial) M__rsub__(o py.Object) (py.Object, error) { return p.arith(o, true, polySub) }

// M__mul__ multiplies.
func (p *Polynomial) M__mul__(o py.Object) (py.Object, error) { return p.arith(o, false, polyMul) }

// M__rmul__ multiplies.
func (p *Polynomial) M__rmul__(o py.Object) (py.Object, error) { return p.arith(o, true, polyMul) }

// M__truediv__ divides by an exact non-zero number; polynomial divisors go through divide().
func (p *Polynomial) M__truediv__(o py.Object) (py.Object, error) {
	if c, ok := exactOf(o); ok {
		r, err := p.p.QuoConst(c)
		if err != nil {
			return nil, py.ExceptionNewf(py.ZeroDivisionError, "polynomial divided by zero")
		}
		return polyObject(r), nil
	}
	if _, ok := o.(*Polynomial); ok {
		return nil, py.ExceptionNewf(py.TypeError, "p / q is defined for a number q only; for polynomials use p.divide(q), which checks that the division is exact")
	}
	return py.NotImplemented, nil
}

// M__rtruediv__ refuses number / polynomial, which is not a polynomial.
func (p *Polynomial) M__rtruediv__(o py.Object) (py.Object, error) {
	if isExactScalar(o) {
		return nil, py.ExceptionNewf(py.TypeError, "a number divided by a polynomial is not a polynomial")
	}
	return py.NotImplemented, nil
}

// M__pow__ raises to a non-negative integer power.
func (p *Polynomial) M__pow__(o, mod py.Object) (py.Object, error) {
	e, ok := exactOf(o)
	if !ok || mod != py.None || !e.IsInt() {
		return nil, py.ExceptionNewf(py.TypeError, "a polynomial power needs a non-negative integer exponent")
	}
	if e.Sign() < 0 {
		return nil, py.ExceptionNewf(py.ValueError, "a polynomial to a negative power (%s) is not a polynomial", exact.FormatRat(e))
	}
	if e.Num().Cmp(big.NewInt(maxExponent)) > 0 {
		return nil, py.ExceptionNewf(py.OverflowError, "exponent %s is too large (limit %d)", e.Num(), maxExponent)
	}
	r, err := p.p.Pow(int(e.Num().Int64()))
	if err != nil {
		return nil, polyErr(err)
	}
	return polyObject(r), nil
}

// M__neg__ negates.
func (p *Polynomial) M__neg__() (py.Object, error) { return polyObject(p.p.Neg()), nil }

// M__pos__ returns p.
func (p *Polynomial) M__pos__() (py.Object, error) { return p, nil }

// M__eq__ is equality as polynomials (an exact number equals a constant polynomial).
func (p *Polynomial) M__eq__(o py.Object) (py.Object, error) {
	q, ok := polyOf(p.p.Ring(), o)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(p.p.Equal(q)), nil
}

// M__ne__ is the negation of M__eq__.
func (p *Polynomial) M__ne__(o py.Object) (py.Object, error) {
	q, ok := polyOf(p.p.Ring(), o)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(!p.p.Equal(q)), nil
}

package values

import (
	"errors"
	"fmt"
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// Polynomial is a multivariate polynomial over Q in a cell. It is immutable.
type Polynomial struct {
	p   *exact.Poly
	env *Env
	// quotient: made by dividing by a polynomial (or from such a value by
	// + − × and powers), so an identity it enters holds only where those
	// divisors were non-zero, and claims say so (Quotient).
	quotient bool
	root     bool // made by sqrt() of a perfect square: SquareRootNote applies
}

// SquareRootNote is what a claim says about a side made by sqrt() of a
// polynomial.
const SquareRootNote = "sqrt() of a polynomial is its square root with a positive leading coefficient, which equals the function √p only where it is ≥ 0 (elsewhere it is −√p)"

// SquareRoot reports whether p was made by sqrt() of a perfect square.
func (p *Polynomial) SquareRoot() bool { return p.root }

// PolynomialType is the Python type of Polynomial.
var PolynomialType = py.NewType("polynomial", "A polynomial over Q: a, b = variables(\"a b\"); a**2 - 2*b.")

// Type returns PolynomialType.
func (p *Polynomial) Type() *py.Type { return PolynomialType }

// Value is the polynomial.
func (p *Polynomial) Value() *exact.Poly { return p.p }

// Polynomial makes a notebook polynomial.
func (e *Env) Polynomial(p *exact.Poly) *Polynomial { return &Polynomial{p: p, env: e} }

// Quotient reports whether p was made by dividing by a polynomial (see
// the field quotient).
func (p *Polynomial) Quotient() bool { return p.quotient }

// Poly lifts an exact scalar or a polynomial into the notebook's ring.
func (e *Env) Poly(o py.Object) (*exact.Poly, bool) {
	if p, ok := o.(*Polynomial); ok {
		return p.p, true
	}
	if r, ok := ExactOf(o); ok {
		return e.Ring.Const(r), true
	}
	return nil, false
}

// PolyResult gives a constant polynomial as a rational, otherwise the polynomial.
func (e *Env) PolyResult(p *exact.Poly) py.Object {
	if c, ok := p.Constant(); ok {
		return e.Rational(c)
	}
	return e.Polynomial(p)
}

// variableIndex reads a variable given by name ("a") or as the variable itself.
func (e *Env) variableIndex(fn string, o py.Object) (int, error) {
	switch x := o.(type) {
	case py.String:
		if i, ok := e.Ring.Index(string(x)); ok {
			return i, nil
		}
		return 0, py.ExceptionNewf(py.ValueError, "%s(): there is no variable %q (%s; make it with variables(\"%s\"))", fn, string(x), e.knownVariables(), string(x))
	case *Polynomial:
		if vs := x.p.Vars(); len(vs) == 1 && x.p.Len() == 1 && x.p.Degree() == 1 && x.p.LeadingCoefficient().Cmp(big.NewRat(1, 1)) == 0 {
			return vs[0], nil
		}
		return 0, py.ExceptionNewf(py.ValueError, "%s(): %s is not a single variable", fn, x.p)
	}
	return 0, py.ExceptionNewf(py.TypeError, "%s(): name a variable by a string or give the variable itself, not %s", fn, interp.TypeName(o))
}

// namedVariable reads the variable a result is to be written in: a name
// (made a variable if it is not one yet) or a variable itself.
func (e *Env) namedVariable(fn string, o py.Object) (*exact.Poly, error) {
	if name, ok := o.(py.String); ok {
		t, err := e.Ring.Var(string(name))
		if err != nil {
			return nil, py.ExceptionNewf(py.ValueError, "%s(): %v", fn, err)
		}
		return t, nil
	}
	i, err := e.variableIndex(fn, o)
	if err != nil {
		return nil, err
	}
	return e.Ring.Var(e.Ring.Names()[i])
}

// knownVariables lists the notebook's variables for a message, the first
// few when there are many.
func (e *Env) knownVariables() string {
	const most = 20
	names := e.Ring.Names()
	switch {
	case len(names) == 0:
		return "no variables have been made yet"
	case len(names) > most:
		return fmt.Sprintf("the variables are %s, … (%d in all)", strings.Join(names[:most], ", "), len(names))
	}
	return "the variables are " + strings.Join(names, ", ")
}

// keywordValues reads a=2, b=frac(1, 3) into variable values.
func (e *Env) keywordValues(fn string, kw py.StringDict) (map[int]*big.Rat, error) {
	vals := map[int]*big.Rat{}
	for name, v := range kw {
		i, err := e.variableIndex(fn, py.String(name))
		if err != nil {
			return nil, err
		}
		r, ok := ExactOf(v)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "%s(%s=…) needs an exact number, got %s%s", fn, name, interp.TypeName(v), FloatHint(v))
		}
		vals[i] = r
	}
	return vals, nil
}

// byName refuses positional arguments to a method that takes values by name.
func byName(a interp.Args, message string) error {
	if len(a.Rest()) > 0 {
		return py.ExceptionNewf(py.TypeError, "%s", message)
	}
	return nil
}

// polys lifts arguments into the notebook's ring.
func (e *Env) polys(fn string, args ...py.Object) ([]*exact.Poly, error) {
	out := make([]*exact.Poly, len(args))
	for i, a := range args {
		p, ok := e.Poly(a)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "%s() needs polynomials or exact numbers, got %s%s", fn, interp.TypeName(a), FloatHint(a))
		}
		out[i] = p
	}
	return out, nil
}

func (e *Env) polynomialBuiltins(b py.StringDict) {
	setBuiltins(b, []builtin{
		{"variables", params("names"), "variables(\"a b c\") -> the indeterminates a, b, c (one name gives one variable)", e.variables},
		{"polynomial", params("text", "new="), "polynomial(\"2*a^2*b - c\") -> the polynomial the text denotes, in variables made before; new=True makes the text's new names variables", e.polynomial},
		{"gcd", params("p", "q"), "gcd(p, q) -> greatest common divisor over Q, leading coefficient 1", e.gcd},
		{"resultant", params("p", "q", "variable"), "resultant(p, q, \"x\") -> the resultant of p and q with respect to x", e.resultant},
		{"discriminant", params("p", "variable"), "discriminant(p, \"x\") -> the discriminant of p with respect to x", e.discriminant},
		{"factor", params("p"), "factor(p) -> p = u * f1**k1 * ..., printed as that product and unpacked as (u, [(f1, k1), ...]); the fi irreducible over Q, primitive, positive leading coefficient, sorted by degree, leading monomial, coefficients; any number of variables", e.factor},
	})
}

func (e *Env) variables(a interp.Args) (py.Object, error) {
	text, err := a.String("names")
	if err != nil {
		return nil, err
	}
	names := strings.FieldsFunc(text, func(r rune) bool { return r == ' ' || r == ',' || r == '\t' || r == '\n' })
	if len(names) == 0 {
		return nil, py.ExceptionNewf(py.ValueError, "variables() needs at least one name")
	}
	out := make(py.Tuple, len(names))
	for i, n := range names {
		v, err := e.Ring.Var(n)
		if err != nil {
			return nil, py.ExceptionNewf(py.ValueError, "variables(): %v", err)
		}
		out[i] = e.Polynomial(v)
	}
	if len(out) == 1 {
		return out[0], nil
	}
	return out, nil
}

func (e *Env) polynomial(a interp.Args) (py.Object, error) {
	if p, ok := e.Poly(a.Get("text")); ok {
		return e.Polynomial(p), nil
	}
	text, err := a.String("text")
	if err != nil {
		return nil, err
	}
	grow, err := a.Bool("new", false)
	if err != nil {
		return nil, err
	}
	parse := e.Ring.ParseKnown
	if grow {
		parse = e.Ring.Parse
	}
	p, err := parse(text)
	if pe := (*exact.ParseError)(nil); errors.As(err, &pe) && pe.Name != "" {
		return nil, py.ExceptionNewf(py.ValueError, "polynomial(%q): %v; %s (make it with variables(\"%s\") first, or pass new=True)", clip(text, 200), err, e.knownVariables(), pe.Name)
	}
	if err != nil {
		return nil, py.ExceptionNewf(py.ValueError, "polynomial(%q): %v", clip(text, 200), err)
	}
	return e.Polynomial(p), nil
}

func (e *Env) gcd(a interp.Args) (py.Object, error) {
	ps, err := e.polys("gcd", a.Get("p"), a.Get("q"))
	if err != nil {
		return nil, err
	}
	g, err := exact.GCD(ps[0], ps[1])
	if err != nil {
		return nil, err
	}
	return e.PolyResult(g), nil
}

func (e *Env) resultant(a interp.Args) (py.Object, error) {
	ps, err := e.polys("resultant", a.Get("p"), a.Get("q"))
	if err != nil {
		return nil, err
	}
	v, err := e.variableIndex("resultant", a.Get("variable"))
	if err != nil {
		return nil, err
	}
	r, err := exact.Resultant(ps[0], ps[1], v)
	if err != nil {
		return nil, err
	}
	return e.PolyResult(r), nil
}

func (e *Env) discriminant(a interp.Args) (py.Object, error) {
	ps, err := e.polys("discriminant", a.Get("p"))
	if err != nil {
		return nil, err
	}
	v, err := e.variableIndex("discriminant", a.Get("variable"))
	if err != nil {
		return nil, err
	}
	d, err := exact.Discriminant(ps[0], v)
	if err != nil {
		return nil, err
	}
	return e.PolyResult(d), nil
}

func init() {
	setMethods(PolynomialType, []method[*Polynomial]{
		{"at", params("*values", "**values"), "p.at(a=2, b=frac(1, 3)) -> p with those values put in (a rational when no variable is left); p.at(a=sqrt(2), b=1) with certified reals gives a real (every variable needs a value)", (*Polynomial).at},
		{"substitute", params("*replacements", "**replacements"), "p.substitute(a=b+c) -> p with polynomials (or rational functions, giving a rational function) put in for variables, all at once", (*Polynomial).substitute},
		{"derivative", params("variable"), "p.derivative(\"a\") -> the partial derivative with respect to a", (*Polynomial).derivative},
		{"degree", params("variable="), "p.degree() -> total degree; p.degree(\"a\") -> degree in a (-1 for the zero polynomial)", (*Polynomial).degree},
		{"terms", nil, "p.terms() -> [(coefficient, {\"a\": 2, \"b\": 1}), ...] in canonical order", (*Polynomial).terms},
		{"coefficient", params("*monomial", "**exponents"), "p.coefficient(a=2) or p.coefficient(a**2) -> the coefficient of a^2, a polynomial in the variables not named (a number when none is left)", (*Polynomial).coefficient},
		{"collect", params("*variable"), "p.collect(\"a\") -> [(power, coefficient), ...]: p as a polynomial in a, increasing powers, zero coefficients left out", (*Polynomial).collect},
		{"divide", params("q"), "p.divide(q) -> the exact quotient p/q; an error showing the remainder when q does not divide p", (*Polynomial).divide},
		{"content", nil, "p.content() -> the rational c with p = c * p.primitive_part()", (*Polynomial).content},
		{"primitive_part", nil, "p.primitive_part() -> p divided by its content: coprime integer coefficients, positive leading one", (*Polynomial).primitivePart},
		{"squarefree", nil, "p.squarefree() -> [(s1, 1), (s2, 2), ...]: p = p.content() * s1 * s2**2 * ..., the si square-free and coprime (Yun; parts equal to 1 left out)", (*Polynomial).squarefree},
		{"is_irreducible", nil, "p.is_irreducible() -> True when p is irreducible over Q; False for constants", (*Polynomial).isIrreducible},
		{"is_homogeneous", nil, "p.is_homogeneous() -> True when every term has the same total degree", (*Polynomial).isHomogeneous},
		{"variables", nil, "p.variables() -> the names of the variables that occur in p", (*Polynomial).variables},
	})
}

func (p *Polynomial) at(a interp.Args) (py.Object, error) {
	if err := byName(a, "at() takes values by name: p.at(a=2, b=3)"); err != nil {
		return nil, err
	}
	exacts, reals := py.StringDict{}, map[string]*exact.Real{}
	for name, v := range a.Keywords() {
		switch x := v.(type) {
		case *Real:
			reals[name] = x.x
		case py.Float:
			if p.env.Float {
				return nil, NoCompanion("a polynomial")
			}
			exacts[name] = v
		default:
			exacts[name] = v
		}
	}
	vals, err := p.env.keywordValues("at", exacts)
	if err != nil {
		return nil, err
	}
	q := p.p.Eval(vals)
	if len(reals) == 0 {
		return p.env.PolyResult(q), nil
	}
	return p.env.atReals(q, reals)
}

// atReals evaluates q at certified reals: every variable left in q needs
// one, since a polynomial with a real coefficient is not a polynomial over
// Q. The value is algebraic when the reals are, so identities with it are
// proved by the zero bound.
func (e *Env) atReals(q *exact.Poly, reals map[string]*exact.Real) (py.Object, error) {
	vals := map[int]*exact.Real{}
	for name, x := range reals {
		i, err := e.variableIndex("at", py.String(name))
		if err != nil {
			return nil, err
		}
		vals[i] = x
	}
	var left []string
	for _, v := range q.Vars() {
		if vals[v] == nil {
			left = append(left, e.Ring.Names()[v])
		}
	}
	if len(left) > 0 {
		return nil, py.ExceptionNewf(py.ValueError, "at(): with a certified real among the values every variable needs one (%s left without): polynomials here have rational coefficients, so a polynomial in %s with real coefficients cannot be made; give %s a value too",
			strings.Join(left, ", "), strings.Join(left, ", "), strings.Join(left, ", "))
	}
	x, err := q.EvalReal(vals)
	if err != nil {
		return nil, err
	}
	return e.checked(x)
}

func (p *Polynomial) substitute(a interp.Args) (py.Object, error) {
	if err := byName(a, "substitute() takes replacements by name: p.substitute(a=b+c)"); err != nil {
		return nil, err
	}
	for _, v := range a.Keywords() {
		if _, ok := v.(*RationalFunction); ok {
			// Rational functions put in make a rational function.
			return (&RationalFunction{f: exact.RatFuncOf(p.p), env: p.env}).substitute(a)
		}
	}
	subs := map[int]*exact.Poly{}
	for name, v := range a.Keywords() {
		i, err := p.env.variableIndex("substitute", py.String(name))
		if err != nil {
			return nil, err
		}
		q, ok := p.env.Poly(v)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "substitute(%s=…) needs a polynomial or an exact number, got %s%s", name, interp.TypeName(v), FloatHint(v))
		}
		subs[i] = q
	}
	r, err := p.p.Substitute(subs)
	if err != nil {
		return nil, err
	}
	return p.env.PolyResult(r), nil
}

func (p *Polynomial) derivative(a interp.Args) (py.Object, error) {
	v, err := p.env.variableIndex("derivative", a.Get("variable"))
	if err != nil {
		return nil, err
	}
	return p.env.Polynomial(p.p.Derivative(v)), nil
}

func (p *Polynomial) degree(a interp.Args) (py.Object, error) {
	if !a.Has("variable") {
		return py.Int(p.p.Degree()), nil
	}
	v, err := p.env.variableIndex("degree", a.Get("variable"))
	if err != nil {
		return nil, err
	}
	return py.Int(p.p.DegreeIn(v)), nil
}

func (p *Polynomial) terms(interp.Args) (py.Object, error) {
	names := p.p.Ring().Names()
	var out []py.Object
	for _, t := range p.p.Terms() {
		mono := py.NewStringDict()
		for i, e := range t.Exps {
			if e != 0 {
				mono[names[i]] = py.Int(e)
			}
		}
		out = append(out, py.Tuple{p.env.Rational(t.Coef), mono})
	}
	return py.NewListFromItems(out), nil
}

// coefficient collects: the variables named get their exponents, the
// others stay in the answer, so coefficient(a=2) of 3*a^2*b + a is 3*b.
func (p *Polynomial) coefficient(a interp.Args) (py.Object, error) {
	exps := map[int]int{}
	switch {
	case len(a.Rest()) == 1 && len(a.Keywords()) == 0:
		m, ok := a.Rest()[0].(*Polynomial)
		if !ok || m.p.Len() != 1 || m.p.LeadingCoefficient().Cmp(big.NewRat(1, 1)) != 0 {
			return nil, py.ExceptionNewf(py.TypeError, "coefficient() takes a monomial with coefficient 1 such as a**2*b, or exponents by name: coefficient(a=2, b=1)")
		}
		t := m.p.Terms()[0]
		for _, v := range m.p.Vars() {
			exps[v] = t.Exps[v]
		}
		if len(exps) == 0 {
			return nil, py.ExceptionNewf(py.ValueError, "coefficient(1) names no variable; for the constant term give every exponent by name, e.g. coefficient(a=0, b=0)")
		}
	case len(a.Rest()) == 0 && len(a.Keywords()) > 0:
		for name, v := range a.Keywords() {
			i, err := p.env.variableIndex("coefficient", py.String(name))
			if err != nil {
				return nil, err
			}
			e, err := interp.Int("coefficient", name, v, 0)
			if err != nil || e < 0 {
				return nil, py.ExceptionNewf(py.ValueError, "coefficient(%s=…) needs a non-negative integer exponent", name)
			}
			exps[i] = int(e)
		}
	default:
		return nil, py.ExceptionNewf(py.TypeError, "coefficient() takes one monomial (a**2*b) or exponents by name (a=2, b=1), not both and not none")
	}
	return p.env.PolyResult(p.p.CoefficientIn(exps)), nil
}

func (p *Polynomial) collect(a interp.Args) (py.Object, error) {
	vars := a.Rest()
	if len(vars) == 0 {
		return nil, py.ExceptionNewf(py.TypeError, "collect() needs the variable to collect in: p.collect(\"a\")")
	}
	if len(vars) > 1 {
		names := make([]string, len(vars))
		for i, v := range vars {
			names[i] = interp.Str(v)
		}
		return nil, py.ExceptionNewf(py.ValueError, "collect() takes one variable, got %d (%s): collect in one at a time, or use coefficient(a=…, b=…) for the coefficient of a monomial in several", len(vars), strings.Join(names, ", "))
	}
	v, err := p.env.variableIndex("collect", vars[0])
	if err != nil {
		return nil, err
	}
	var out []py.Object
	for e, c := range p.p.Collect(v) {
		if c != nil {
			out = append(out, py.Tuple{py.Int(e), p.env.PolyResult(c)})
		}
	}
	return py.NewListFromItems(out), nil
}

func (p *Polynomial) divide(a interp.Args) (py.Object, error) {
	q, ok := p.env.Poly(a.Get("q"))
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "divide() needs a polynomial or an exact number, got %s", interp.TypeName(a.Get("q")))
	}
	if q.IsZero() {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "division by the zero polynomial")
	}
	// DivExact is fast; the remainder, for the message, only when it fails.
	quo, exactly, err := p.p.DivExact(q)
	if err != nil {
		return nil, err
	}
	if exactly {
		return p.env.PolyResult(quo), nil
	}
	quo, rem, err := p.p.Divide(q)
	if err != nil {
		return nil, err
	}
	if !rem.IsZero() {
		return nil, py.ExceptionNewf(py.ValueError, "%s does not divide %s: the remainder is %s", clip(q.String(), 200), clip(p.p.String(), 200), clip(rem.String(), 400))
	}
	return p.env.PolyResult(quo), nil
}

func (p *Polynomial) content(interp.Args) (py.Object, error) {
	return p.env.Rational(p.p.Content()), nil
}

func (p *Polynomial) primitivePart(interp.Args) (py.Object, error) {
	return p.env.Polynomial(p.p.PrimitivePart()), nil
}

func (p *Polynomial) isHomogeneous(interp.Args) (py.Object, error) {
	_, ok := p.p.Homogeneous()
	return py.NewBool(ok), nil
}

func (p *Polynomial) variables(interp.Args) (py.Object, error) {
	names := p.p.Ring().Names()
	var out []string
	for _, v := range p.p.Vars() {
		out = append(out, names[v])
	}
	return py.NewListFromStrings(out), nil
}

// clip shortens s to at most n runes.
func clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

// M__len__ is the number of terms.
func (p *Polynomial) M__len__() (res py.Object, err error) {
	defer interp.Recover("polynomial.__len__", &res, &err)
	return py.Int(p.p.Len()), nil
}

// M__str__ prints the canonical form, e.g. "2*a^2*b - c".
func (p *Polynomial) M__str__() (res py.Object, err error) {
	defer interp.Recover("polynomial.__str__", &res, &err)
	return py.String(p.p.String()), nil
}

// M__repr__ prints the same as str.
func (p *Polynomial) M__repr__() (res py.Object, err error) {
	defer interp.Recover("polynomial.__repr__", &res, &err)
	return p.M__str__()
}

// M__bool__ is false only for the zero polynomial.
func (p *Polynomial) M__bool__() (res py.Object, err error) {
	defer interp.Recover("polynomial.__bool__", &res, &err)
	return py.NewBool(!p.p.IsZero()), nil
}

// operands lifts both sides of a binary operator into the ring; ok is false
// when the other side is not a polynomial or an exact number.
func (p *Polynomial) operands(o py.Object, swap bool) (a, b *exact.Poly, ok bool, err error) {
	q, ok := p.env.Poly(o)
	if !ok {
		if _, isReal := o.(*Real); isReal {
			return nil, nil, false, polyRealRefusal(o)
		}
		if _, isFloat := o.(py.Float); isFloat {
			return nil, nil, false, py.ExceptionNewf(py.TypeError, "a polynomial cannot be mixed with a float64 (%s); use exact numbers, e.g. frac(\"%s\")", interp.Str(o), interp.Str(o))
		}
		return nil, nil, false, nil
	}
	if swap {
		return q, p.p, true, nil
	}
	return p.p, q, true, nil
}

func (p *Polynomial) arith(o py.Object, swap bool, op func(a, b *exact.Poly) (*exact.Poly, error)) (res py.Object, err error) {
	defer interp.Recover("polynomial arithmetic", &res, &err)
	a, b, ok, err := p.operands(o, swap)
	if err != nil || !ok {
		if err == nil {
			return py.NotImplemented, nil
		}
		return nil, err
	}
	r, err := op(a, b)
	if err != nil {
		return nil, err
	}
	q, _ := o.(*Polynomial)
	return &Polynomial{p: r, env: p.env, quotient: p.quotient || q != nil && q.quotient}, nil
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

// M__truediv__ divides by an exact non-zero number, or by a polynomial (a
// rational function in lowest terms, a polynomial when the division is exact).
func (p *Polynomial) M__truediv__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("polynomial.__truediv__", &res, &err)
	if c, ok := ExactOf(o); ok {
		r, err := p.p.QuoConst(c)
		if err != nil {
			return nil, py.ExceptionNewf(py.ZeroDivisionError, "polynomial divided by zero")
		}
		return p.env.Polynomial(r), nil
	}
	if _, ok := o.(*Polynomial); ok {
		// p / q in lowest terms: a polynomial when q divides p.
		return p.env.ratArith(exact.RatFuncOf(p.p), o, false, (*exact.RatFunc).Quo)
	}
	if _, ok := o.(*Real); ok {
		return nil, polyRealRefusal(o)
	}
	return py.NotImplemented, nil
}

// polyRealRefusal is the error for a polynomial combined with a certified
// real such as sqrt(2). Polynomials stay over Q (their arithmetic, gcd,
// factoring and claims are exact over Q); a root is brought in either
// after the algebra, by evaluating, or as a variable of its own whose
// defining equation is checked by division.
func polyRealRefusal(o py.Object) error {
	return py.ExceptionNewf(py.TypeError, "a polynomial cannot be combined with the certified real %s: polynomials have rational coefficients. "+
		"Put numbers in first with p.at(a=sqrt(2)), which gives an exact real, or let a variable stand for the root, s = variables(\"s\"), "+
		"and check an identity by dividing the difference of its sides by the root's equation: (lhs - rhs).divide(s**2 - 2) succeeds exactly when it holds at s = sqrt(2)",
		clip(interp.Str(o), 60))
}

// polySqrt is sqrt(p) of a polynomial: its square root with a positive
// leading coefficient (exact.Poly.Sqrt), or an error saying why p is no square.
func (e *Env) polySqrt(p *exact.Poly) (py.Object, error) {
	q, err := p.Sqrt()
	if ns := (*exact.NotSquareError)(nil); errors.As(err, &ns) {
		return nil, py.ExceptionNewf(py.ValueError, "sqrt(): %s is not the square of a polynomial over Q (%s), so its square root is no polynomial; square the other side instead and compare p with q**2",
			clip(p.String(), 200), ns.Reason)
	}
	if err != nil {
		return nil, err
	}
	if _, ok := q.Constant(); ok {
		return e.PolyResult(q), nil
	}
	return &Polynomial{p: q, env: e, root: true}, nil
}

// M__rtruediv__ divides a number by p: a rational function.
func (p *Polynomial) M__rtruediv__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("polynomial.__rtruediv__", &res, &err)
	if isExactScalar(o) {
		return p.env.ratArith(exact.RatFuncOf(p.p), o, true, (*exact.RatFunc).Quo)
	}
	return py.NotImplemented, nil
}

// M__pow__ raises to an integer power; a negative one gives a rational function.
func (p *Polynomial) M__pow__(o, mod py.Object) (res py.Object, err error) {
	defer interp.Recover("polynomial.__pow__", &res, &err)
	e, ok := ExactOf(o)
	if !ok || mod != py.None || !e.IsInt() {
		return nil, py.ExceptionNewf(py.TypeError, "a polynomial power needs an integer exponent")
	}
	if e.Sign() < 0 {
		return p.env.ratPow(exact.RatFuncOf(p.p), o, mod) // a rational function
	}
	if e.Num().Cmp(big.NewInt(MaxExponent)) > 0 {
		return nil, py.ExceptionNewf(py.OverflowError, "exponent %s is too large (limit %d)", e.Num(), MaxExponent)
	}
	r, err := p.p.Pow(int(e.Num().Int64()))
	if err != nil {
		return nil, err
	}
	return &Polynomial{p: r, env: p.env, quotient: p.quotient}, nil
}

// M__neg__ negates.
func (p *Polynomial) M__neg__() (res py.Object, err error) {
	defer interp.Recover("polynomial.__neg__", &res, &err)
	return &Polynomial{p: p.p.Neg(), env: p.env, quotient: p.quotient}, nil
}

// M__pos__ returns p.
func (p *Polynomial) M__pos__() (res py.Object, err error) {
	defer interp.Recover("polynomial.__pos__", &res, &err)
	return p, nil
}

// M__eq__ is equality as polynomials (an exact number equals a constant polynomial).
func (p *Polynomial) M__eq__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("polynomial.__eq__", &res, &err)
	q, ok := p.env.Poly(o)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(p.p.Equal(q)), nil
}

// M__ne__ is the negation of M__eq__.
func (p *Polynomial) M__ne__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("polynomial.__ne__", &res, &err)
	q, ok := p.env.Poly(o)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(!p.p.Equal(q)), nil
}

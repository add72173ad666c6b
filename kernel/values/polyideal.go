package values

// Ideals: groebner(polys, order=…), eliminate(polys, variables),
// ideal_member(p, polys), p.reduce(G, order=…).

import (
	"strings"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// GroebnerLimits are the limits of a Gröbner computation run now: the
// cell's deadline (Env.Deadline).
func (e *Env) GroebnerLimits() exact.GroebnerLimits {
	return exact.GroebnerLimits{Deadline: e.Deadline}
}

// PolyList reads a list or tuple of polynomials (exact numbers lifted to
// constants) for fn; what names the argument in messages.
func (e *Env) PolyList(fn, what string, o py.Object) ([]*exact.Poly, error) {
	items, err := Sequence(o, fn+": "+what)
	if err != nil {
		return nil, err
	}
	out := make([]*exact.Poly, len(items))
	for i, it := range items {
		if b, ok := it.(py.Bool); ok {
			// A comparison such as x**2 + y**2 == 1 gives a bool, which
			// would otherwise count as the number 0 or 1.
			return nil, py.ExceptionNewf(py.TypeError, "%s: item %d of %s is %s, not a polynomial (a comparison?): write h = 0 as the polynomial h, e.g. x**2 + y**2 - 1 for x² + y² = 1", fn, i+1, what, map[py.Bool]string{true: "True", false: "False"}[b])
		}
		p, ok := e.Poly(it)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "%s: item %d of %s is %s%s, not a polynomial", fn, i+1, what, interp.TypeName(it), FloatHint(it))
		}
		out[i] = p
	}
	return out, nil
}

// polysInOrder reads the list polys= and the term order: order=
// "grevlex", "lex" or "elim" (with first=, the variables ranked first).
func (e *Env) polysInOrder(fn string, a interp.Args) ([]*exact.Poly, exact.Order, error) {
	ps, err := e.PolyList(fn, "the polynomials", a.Get("polys"))
	if err != nil {
		return nil, exact.Order{}, err
	}
	name := a.Text("order", "grevlex")
	if (name == "elim") != a.Has("first") {
		return nil, exact.Order{}, py.ExceptionNewf(py.TypeError, "%s: order=\"elim\" and first=[variables] go together: the elimination order ranks every monomial with one of those variables above every monomial without", fn)
	}
	switch name {
	case "grevlex":
		return ps, exact.Grevlex, nil
	case "lex":
		return ps, exact.Lex, nil
	case "elim":
		vars, err := e.variableList(fn, a.Get("first"))
		return ps, exact.ElimOrder(vars), err
	default:
		return nil, exact.Order{}, py.ExceptionNewf(py.ValueError, "%s: order=%q: want \"grevlex\", \"lex\" or \"elim\"", fn, name)
	}
}

// variableList reads one variable, or a list of them, by name or as
// themselves.
func (e *Env) variableList(fn string, o py.Object) ([]int, error) {
	var items []py.Object
	switch o.(type) {
	case py.String, *Polynomial:
		items = []py.Object{o}
	default:
		var err error
		if items, err = Sequence(o, fn+": the variables"); err != nil {
			return nil, err
		}
	}
	vars := make([]int, len(items))
	for i, it := range items {
		var err error
		if vars[i], err = e.variableIndex(strings.TrimSuffix(fn, "()"), it); err != nil {
			return nil, err
		}
	}
	return vars, nil
}

func (e *Env) idealBuiltins(b py.StringDict) {
	setBuiltins(b, []builtin{
		{"groebner", params("polys", "order=", "first="), "groebner([f1, f2, ...], order=\"grevlex\") -> the reduced Gröbner basis over Q (monic, smallest leading monomial first); order=\"lex\" for lexicographic, order=\"elim\", first=[t, ...] for the block order ranking t, ... first", e.groebner},
		{"eliminate", params("polys", "variables"), "eliminate([f1, ...], \"t\") or eliminate([f1, ...], [t, u]) -> generators of the ideal's polynomials free of those variables", e.eliminate},
		{"ideal_member", params("p", "polys"), "ideal_member(p, [f1, f2, ...]) -> True when p = c1*f1 + c2*f2 + ... for some polynomials ci", e.idealMember},
	})
}

func (e *Env) groebner(a interp.Args) (py.Object, error) {
	ps, o, err := e.polysInOrder("groebner()", a)
	if err != nil {
		return nil, err
	}
	g, err := exact.Groebner(ps, o, e.GroebnerLimits())
	if err != nil {
		return nil, err
	}
	return e.polyListObject(g), nil
}

func (e *Env) polyListObject(ps []*exact.Poly) py.Object {
	out := make([]py.Object, len(ps))
	for i, p := range ps {
		out[i] = e.PolyResult(p)
	}
	return py.NewListFromItems(out)
}

func (e *Env) eliminate(a interp.Args) (py.Object, error) {
	ps, err := e.PolyList("eliminate()", "the polynomials", a.Get("polys"))
	if err != nil {
		return nil, err
	}
	vars, err := e.variableList("eliminate()", a.Get("variables"))
	if err != nil {
		return nil, err
	}
	g, err := exact.Eliminate(ps, vars, e.GroebnerLimits())
	if err != nil {
		return nil, err
	}
	return e.polyListObject(g), nil
}

func (e *Env) idealMember(a interp.Args) (py.Object, error) {
	p, ok := e.Poly(a.Get("p"))
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "ideal_member() needs a polynomial, got %s%s", interp.TypeName(a.Get("p")), FloatHint(a.Get("p")))
	}
	ps, err := e.PolyList("ideal_member()", "the polynomials", a.Get("polys"))
	if err != nil {
		return nil, err
	}
	in, err := exact.IdealMember(p, ps, e.GroebnerLimits())
	if err != nil {
		return nil, err
	}
	return py.NewBool(in), nil
}

func init() {
	setMethods(PolynomialType, []method[*Polynomial]{
		{"reduce", params("polys", "order=", "first="), "p.reduce([g1, g2, ...], order=\"grevlex\") -> the remainder of p divided by the gi in that order: the normal form when the gi are a Gröbner basis in it (0 exactly for members of the ideal)", (*Polynomial).reduce},
	})
}

func (p *Polynomial) reduce(a interp.Args) (py.Object, error) {
	ps, o, err := p.env.polysInOrder("reduce()", a)
	if err != nil {
		return nil, err
	}
	r, err := exact.Reduce(p.p, ps, o, p.env.GroebnerLimits())
	if err != nil {
		return nil, err
	}
	return p.env.PolyResult(r), nil
}

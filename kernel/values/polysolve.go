package values

// Real roots and polynomial systems: real_roots(p), solve(polys),
// solution_count(polys) (exact/real_isolate.go, exact/solve.go).

import (
	"strings"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

func (e *Env) solveBuiltins(b py.StringDict) {
	setBuiltins(b, []builtin{
		{"real_roots", params("p"), "real_roots(p) -> the distinct real roots of a polynomial in one variable, in increasing order, exactly: rationals, or reals that are roots of an irreducible factor in an isolating interval", e.realRoots},
		{"solve", params("polys"), "solve([f1, f2, ...]) -> the real solutions of f1 = f2 = ... = 0 as a list of tuples of exact values, one coordinate per variable of the system in the order variables() made them; the system must have finitely many complex solutions", e.solve},
		{"solution_count", params("polys"), "solution_count([f1, f2, ...]) -> (complex solutions counted with multiplicity, distinct complex solutions) of f1 = f2 = ... = 0", e.solutionCount},
	})
}

func (e *Env) realRoots(a interp.Args) (py.Object, error) {
	p, ok := e.Poly(a.Get("p"))
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "real_roots() needs a polynomial in one variable, got %s%s", interp.TypeName(a.Get("p")), FloatHint(a.Get("p")))
	}
	if p.IsZero() {
		return nil, py.ExceptionNewf(py.ValueError, "real_roots(): the polynomial is 0, which vanishes everywhere: there is no list of roots")
	}
	if vs := p.Vars(); len(vs) > 1 {
		names := make([]string, len(vs))
		for i, v := range vs {
			names[i] = e.Ring.Names()[v]
		}
		return nil, py.ExceptionNewf(py.ValueError, "real_roots(): the polynomial is in %d variables (%s), not one: use solve([...]) for systems", len(vs), strings.Join(names, ", "))
	}
	rs, err := exact.RealRoots(p, e.Cap)
	if err != nil {
		return nil, err
	}
	out := make([]py.Object, len(rs))
	for i, r := range rs {
		out[i] = e.Real(r)
	}
	return py.NewListFromItems(out), nil
}

func (e *Env) solveSystem(fn string, a interp.Args) (*exact.Solutions, error) {
	ps, err := e.PolyList(fn, "the polynomials", a.Get("polys"))
	if err != nil {
		return nil, err
	}
	return exact.Solve(ps, e.GroebnerLimits(), e.Cap)
}

func (e *Env) solve(a interp.Args) (py.Object, error) {
	s, err := e.solveSystem("solve()", a)
	if err != nil {
		return nil, err
	}
	out := make([]py.Object, len(s.Points))
	for i, pt := range s.Points {
		// Tuples, not dicts: a dict would print its keys in random order.
		tup := make(py.Tuple, len(pt))
		for j, x := range pt {
			tup[j] = e.Real(x)
		}
		out[i] = tup
	}
	return py.NewListFromItems(out), nil
}

func (e *Env) solutionCount(a interp.Args) (py.Object, error) {
	s, err := e.solveSystem("solution_count()", a)
	if err != nil {
		return nil, err
	}
	return py.Tuple{py.Int(s.Complex), py.Int(s.Distinct)}, nil
}

package values

// Factoring polynomials: factor(p), p.squarefree(), p.is_irreducible().

import (
	"strings"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// Factor factors a univariate (or constant) p over Q, refusing a
// polynomial in several variables with a message that names what works
// instead; fn is the builtin or method to name.
func (e *Env) Factor(fn string, p *exact.Poly) (*exact.Factorization, error) {
	if vs := p.Vars(); len(vs) > 1 {
		names := e.Ring.Names()
		var have []string
		for _, v := range vs {
			have = append(have, names[v])
		}
		return nil, py.ExceptionNewf(py.ValueError, "%s: %s is in %d variables (%s); factoring over Q is implemented for one variable only, multivariate factorization is a later feature. p.squarefree() works in any number of variables, and factorization(name, p, [f1, f2, ...]) checks factors you give", fn, clip(p.String(), 200), len(vs), strings.Join(have, ", "))
	}
	return p.Factor()
}

// factorPairs gives factors as the notebook list [(f1, k1), (f2, k2), ...].
func (e *Env) factorPairs(fs []exact.FactorPower) py.Object {
	out := make([]py.Object, len(fs))
	for i, f := range fs {
		out[i] = py.Tuple{e.Polynomial(f.Factor), py.Int(f.Mult)}
	}
	return py.NewListFromItems(out)
}

func (e *Env) factor(a interp.Args) (py.Object, error) {
	p, ok := e.Poly(a.Get("p"))
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "factor() needs a polynomial or an exact number, got %s%s", interp.TypeName(a.Get("p")), FloatHint(a.Get("p")))
	}
	f, err := e.Factor("factor()", p)
	if err != nil {
		return nil, err
	}
	return py.Tuple{e.Rational(f.Unit), e.factorPairs(f.Factors)}, nil
}

func (p *Polynomial) squarefree(interp.Args) (py.Object, error) {
	_, parts, err := p.p.SquareFree()
	if err != nil {
		return nil, err
	}
	return p.env.factorPairs(parts), nil
}

func (p *Polynomial) isIrreducible(interp.Args) (py.Object, error) {
	f, err := p.env.Factor("is_irreducible()", p.p)
	if err != nil {
		return nil, err
	}
	return py.NewBool(len(f.Factors) == 1 && f.Factors[0].Mult == 1), nil
}

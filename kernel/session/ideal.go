package session

import (
	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
	"assay/kernel/claim"
	"assay/kernel/interp"
)

// symbolicHypotheses reports whether given= is a list or tuple:
// polynomial hypotheses rather than a function of the sample.
func symbolicHypotheses(a interp.Args) bool {
	switch a.Get("given").(type) {
	case *py.List, py.Tuple:
		return true
	}
	return false
}

// identityUnder decides identity(name, lhs, rhs, given=[h1, ...],
// nonzero=[d1, ...]) by ideal membership with a certificate.
func (s *Session) identityUnder(c *cells.Claim, a interp.Args) error {
	for _, k := range []string{"over", "samples", "degree"} {
		if a.Has(k) {
			return py.ExceptionNewf(py.TypeError, "identity(): given=[h1, h2, ...] (polynomial hypotheses) proves the identity from them and takes no %s=; a sampled identity takes given= as a function of the sample", k)
		}
	}
	lhs, rhs := a.Get("lhs"), a.Get("rhs")
	if rhs == nil {
		if !interp.Callable(lhs) {
			return py.ExceptionNewf(py.TypeError, "identity(name, lhs, rhs, given=[...]) is missing rhs")
		}
		res, err := py.Call(lhs, nil, nil)
		if err != nil {
			return err
		}
		if lhs, rhs, err = pair(res, "the identity's function"); err != nil {
			return err
		}
	}
	var sides [2]*exact.Poly
	for i, o := range []py.Object{lhs, rhs} {
		p, ok := s.env.Poly(o)
		if !ok {
			return py.ExceptionNewf(py.TypeError, "identity() with polynomial hypotheses (given=[...]) compares polynomials or exact numbers; %s is %s", [2]string{"lhs", "rhs"}[i], interp.TypeName(o))
		}
		sides[i] = p
	}
	hyps, err := s.env.PolyList("identity()", "the hypotheses given=[...]", a.Get("given"))
	if err != nil {
		return err
	}
	if len(hyps) == 0 {
		return py.ExceptionNewf(py.ValueError, "identity(): given=[] lists no hypothesis; leave given= out for an identity that needs none")
	}
	var nonzero []*exact.Poly
	if a.Has("nonzero") {
		if nonzero, err = s.env.PolyList("identity()", "the conditions nonzero=[...]", a.Get("nonzero")); err != nil {
			return err
		}
		for i, d := range nonzero {
			if d.IsZero() {
				return py.ExceptionNewf(py.ValueError, "identity(): condition %d of nonzero= is the zero polynomial, which vanishes everywhere", i+1)
			}
		}
	}
	diff := sides[0].Sub(sides[1])
	found, err := exact.Certify(diff, hyps, nonzero, s.env.GroebnerLimits())
	if err != nil {
		return interp.Exception(err)
	}
	u := claim.Under{Diff: diff, Hypotheses: hyps, Nonzero: nonzero, Found: found}
	if err := u.Decide(c); err != nil {
		return py.ExceptionNewf(py.RuntimeError, "identity(%q): %v", c.Name, err)
	}
	return nil
}

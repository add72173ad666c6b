package session

import (
	"fmt"
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

const factorizationDoc = `factorization(name, p, [f1, f2, ...]) checks p == u * f1 * f2 * ... for
a rational unit u that the check finds; a factor may be given as (f, k) for f**k.
factorization(name, p) with no list factors p over Q (any number of variables) and states the result.`

func (s *Session) factorization(c *cells.Claim, t claim.Target, a interp.Args) error {
	p, ok := s.env.Poly(a.Get("p"))
	if !ok {
		return py.ExceptionNewf(py.TypeError, "factorization(): p must be a polynomial or an exact number, got %s%s", interp.TypeName(a.Get("p")), values.FloatHint(a.Get("p")))
	}
	if !a.Has("factors") {
		return s.foundFactorization(c, p)
	}
	items, err := values.Sequence(a.Get("factors"), "the factors")
	if err != nil {
		return err
	}
	var given []exact.FactorPower
	for i, it := range items {
		f, k := it, int64(1)
		if pair, ok := it.(py.Tuple); ok && len(pair) == 2 {
			f = pair[0]
			if k, err = interp.Int("factorization", "a factor's exponent", pair[1], 1); err != nil || k < 1 || k > values.MaxExponent {
				return py.ExceptionNewf(py.ValueError, "factor %d: the exponent in (f, k) must be a positive integer", i)
			}
		}
		fp, ok := s.env.Poly(f)
		if !ok {
			return py.ExceptionNewf(py.TypeError, "factor %d is %s, not a polynomial%s", i, interp.TypeName(f), values.FloatHint(f))
		}
		given = append(given, exact.FactorPower{Factor: fp, Mult: int(k)})
	}
	unit, diff, factors, err := s.checkFactors(p, given)
	if err != nil {
		return err
	}
	c.Method = claim.PolyMethod
	claim.OfPoly(diff).Record(c)
	if diff.IsZero() {
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("p = u · (product of the factors) with u = %s exactly (%s): a proof of the factorization", exact.FormatRat(unit), factors)
		c.Note += s.factorsFurther(given)
	} else {
		c.Verdict = cells.Fails
		c.Note = fmt.Sprintf("p − u · (product of the factors) is not zero for u = %s, the ratio of leading coefficients (%s)", exact.FormatRat(unit), factors)
	}
	return nil
}

// checkFactors multiplies the factors out and returns the unit u (the
// ratio of leading coefficients), p − u·product, and a description of the
// factors' degrees.
func (s *Session) checkFactors(p *exact.Poly, given []exact.FactorPower) (*big.Rat, *exact.Poly, string, error) {
	product := s.env.Ring.Const(big.NewRat(1, 1))
	var degrees []string
	for _, g := range given {
		fp, k := g.Factor, g.Mult
		if k > 1 {
			var err error
			if fp, err = fp.Pow(k); err != nil {
				return nil, nil, "", err
			}
			degrees = append(degrees, fmt.Sprintf("%d (to the power %d)", fp.Degree()/k, k))
		} else {
			degrees = append(degrees, fmt.Sprint(fp.Degree()))
		}
		var err error
		if product, err = product.Mul(fp); err != nil {
			return nil, nil, "", err
		}
	}
	unit := big.NewRat(1, 1)
	if !p.IsZero() && !product.IsZero() {
		unit = new(big.Rat).Quo(p.LeadingCoefficient(), product.LeadingCoefficient())
	}
	plural := "s"
	if len(given) == 1 {
		plural = ""
	}
	return unit, p.Sub(product.Scale(unit)), fmt.Sprintf("%d factor%s of degree %s", len(given), plural, strings.Join(degrees, ", ")), nil
}

// foundFactorization factors p over Q and states the result as a claim:
// the product is multiplied out and compared with p exactly, and the
// factors' irreducibility is what the method of exact.Factor established.
func (s *Session) foundFactorization(c *cells.Claim, p *exact.Poly) error {
	if p.IsZero() {
		return py.ExceptionNewf(py.ValueError, "factorization(): p is 0, which has no factorization into irreducibles; give a nonzero polynomial")
	}
	f, err := s.env.Factor(p)
	if err != nil {
		return err
	}
	unit, diff, factors, err := s.checkFactors(p, f.Factors)
	if err != nil {
		return err
	}
	c.Method = claim.PolyMethod
	claim.OfPoly(diff).Record(c)
	if !diff.IsZero() { // cannot happen: the factors are checked by exact division
		return fmt.Errorf("factorization(): internal error: the factors found do not multiply back to p")
	}
	c.Verdict = cells.Holds
	if len(f.Factors) == 0 {
		c.Note = fmt.Sprintf("p = %s is a constant: a unit with no irreducible factors", exact.FormatRat(unit))
		return nil
	}
	how := "factors modulo a prime, Hensel lifting, and an exhaustive search over products of the modular factors, Zassenhaus, or, for many modular factors, lattice reduction, van Hoeij"
	if len(p.Vars()) > 1 {
		how = "content in a main variable, then for the primitive part an evaluation point that keeps its degree and square-freeness, where an irreducible image proves a factor irreducible; the image's factors lifted by multivariate Hensel lifting, Wang, and subsets of them tried when a lift fails; univariate images by " + how
	}
	c.Note = fmt.Sprintf("p = u·f₁^k₁·… = %s, factors irreducible over Q (%s), with u = %s exactly; found by factoring, irreducibility established by the algorithm (%s)", claim.Clip(f.String(), 400), factors, exact.FormatRat(unit), how)
	return nil
}

// factorsFurther names the given factors that are not irreducible over
// Q, with their factorization; a factor whose factorization stops at a
// search cap is passed over.
func (s *Session) factorsFurther(given []exact.FactorPower) string {
	var out []string
	for _, g := range given {
		if g.Factor.Degree() < 2 {
			continue
		}
		f, err := s.env.Factor(g.Factor)
		if err != nil || len(f.Factors) == 1 && f.Factors[0].Mult == 1 {
			continue
		}
		out = append(out, fmt.Sprintf("%s = %s", claim.Clip(g.Factor.String(), 200), claim.Clip(f.String(), 200)))
	}
	if len(out) == 0 {
		return ""
	}
	return "; not every factor is irreducible over Q: " + strings.Join(out, ", ")
}

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
a rational unit u that the check finds; a factor may be given as (f, k) for f**k.`

func (s *Session) factorization(c *cells.Claim, t claim.Target, a interp.Args) error {
	p, ok := s.env.Poly(a.Get("p"))
	if !ok {
		return py.ExceptionNewf(py.TypeError, "factorization(): p must be a polynomial or an exact number, got %s%s", interp.TypeName(a.Get("p")), values.FloatHint(a.Get("p")))
	}
	items, err := values.Sequence(a.Get("factors"), "the factors")
	if err != nil {
		return err
	}
	product := s.env.Ring.Const(big.NewRat(1, 1))
	var degrees []string
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
		if k > 1 {
			if fp, err = fp.Pow(int(k)); err != nil {
				return err
			}
			degrees = append(degrees, fmt.Sprintf("%d (to the power %d)", fp.Degree()/int(k), k))
		} else {
			degrees = append(degrees, fmt.Sprint(fp.Degree()))
		}
		if product, err = product.Mul(fp); err != nil {
			return err
		}
	}
	c.Method = claim.PolyMethod
	unit := big.NewRat(1, 1)
	if !p.IsZero() && !product.IsZero() {
		unit = new(big.Rat).Quo(p.LeadingCoefficient(), product.LeadingCoefficient())
	}
	diff := p.Sub(product.Scale(unit))
	c.Residual = claim.Preview(diff)
	factors := fmt.Sprintf("%d factors of degree %s", len(items), strings.Join(degrees, ", "))
	if diff.IsZero() {
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("p = u · (product of the factors) with u = %s exactly (%s): a proof of the factorization", exact.FormatRat(unit), factors)
	} else {
		c.Verdict = cells.Fails
		c.Note = fmt.Sprintf("p − u · (product of the factors) is not zero for u = %s, the ratio of leading coefficients (%s)", exact.FormatRat(unit), factors)
	}
	return nil
}

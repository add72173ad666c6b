package session

import (
	"fmt"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

// limitSeriesOrder is the order f is first expanded to by limit() and
// asymptotic(); values.Expand raises it while the leading term is unknown.
const limitSeriesOrder = 6

// expandForClaim runs f on the series at the claim's point. It returns
// the expansion, or a reason (for the note) why the series route cannot
// decide the claim; errors from f on the series are reasons, not cell
// errors, since f may be fine on numbers.
func (s *Session) expandForClaim(f, toward py.Object) (claim.Expansion, bool, string) {
	a, inf, err := values.SeriesPointOf("limit", toward)
	if err != nil {
		return claim.Expansion{}, false, interp.Message(err)
	}
	run, err := s.env.Expand(f, a, inf, limitSeriesOrder)
	if err != nil {
		return claim.Expansion{}, false, "f raised on a series: " + interp.Message(err)
	}
	v := run.Value
	if what := v.Point().Inspected; what != "" {
		return claim.Expansion{}, false, "f asked for " + what + " of its argument, which tells a series from a number (a refusal caught inside f, or a look at the series itself), so the expansion may not be f's on numbers"
	}
	printed := v.String()
	if _, _, ok := v.Value().Leading(); !ok {
		return claim.Expansion{}, false, fmt.Sprintf("every term of the expansion cancelled up to its error term (%s, f run on t known to O(t^%d))", printed, run.Work)
	}
	return claim.Expansion{S: v.Value(), Printed: printed}, true, ""
}

// seriesLimit decides a limit claim by series expansion; ok is false (with
// the reason) when the claim must be estimated by extrapolation instead.
func (s *Session) seriesLimit(c *cells.Claim, t claim.Target, a interp.Args, expect *exact.Real, expectInf bool) (ok bool, why string, err error) {
	var order *big.Rat
	if a.Given("order") {
		order, _ = values.ExactOf(a.Get("order"))
	}
	x, ok, why := s.expandForClaim(a.Get("f"), a.Get("toward"))
	if !ok {
		return false, why, nil
	}
	c.Precision = int(t.Bits)
	return true, "", claim.SeriesLimit(c, x, expect, expectInf, order, t)
}

const asymptoticDoc = `asymptotic(name, f, toward=0, expect=(c, k))
claims f(t) ~ c·t^k as t -> toward (from above; toward=a: (t - a)^k;
toward=infinity: t^k with k < 0 for decay): the leading term of f's
Puiseux expansion is exactly c·t^k. c is exact or a certified real, k a
rational. Proved by series expansion, or undecided when f cannot be
expanded.`

var asymptoticParams = []string{"name", "f", "toward=", "expect", "digits="}

func (s *Session) asymptotic(c *cells.Claim, t claim.Target, a interp.Args) error {
	f := a.Get("f")
	if !interp.Callable(f) {
		return py.ExceptionNewf(py.TypeError, "asymptotic(name, f, …) needs a function of t")
	}
	items, err := values.Sequence(a.Get("expect"), "asymptotic(): expect")
	if err != nil || len(items) != 2 {
		return py.ExceptionNewf(py.TypeError, "asymptotic(): expect must be a pair (c, k) for f(t) ~ c·t^k, e.g. expect=(frac(1, 2), 2)")
	}
	coef, ok := values.RealOf(items[0])
	if !ok {
		return py.ExceptionNewf(py.TypeError, "asymptotic(): the coefficient c of expect=(c, k) must be an exact number or a real, got %s%s", interp.TypeName(items[0]), values.FloatHint(items[0]))
	}
	if q, ok := coef.Rat(); ok && q.Sign() == 0 {
		return py.ExceptionNewf(py.ValueError, "asymptotic(): the coefficient c of expect=(c, k) must be non-zero: f ~ 0·t^k says nothing (state a limit instead)")
	}
	k, ok := values.ExactOf(items[1])
	if !ok {
		return py.ExceptionNewf(py.TypeError, "asymptotic(): the exponent k of expect=(c, k) must be an exact rational, got %s%s", interp.TypeName(items[1]), values.FloatHint(items[1]))
	}
	_, inf, err := values.SeriesPointOf("asymptotic", a.Get("toward"))
	if err != nil {
		return err
	}
	c.Method, c.Precision = claim.SeriesMethod, int(t.Bits)
	x, ok, why := s.expandForClaim(f, a.Get("toward"))
	if !ok {
		// No sound route estimates a leading coefficient and exponent
		// together; limit(f(t)/t^k) can estimate the coefficient.
		c.Verdict, c.Residual, c.Why = cells.Undecided, "no expansion", cells.OtherReason
		c.Note = "not decided: " + why + "; assay has no extrapolation for a leading term (for an estimate, state limit(name, lambda t: f(t) / t**k, …))"
		return nil
	}
	return claim.SeriesAsymptotic(c, x, coef, k, inf, t)
}

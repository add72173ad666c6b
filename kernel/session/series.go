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
		return claim.Expansion{}, false, "f " + what + ", which may tell a series from a number, so the expansion may not be f's on numbers"
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
rational. Proved by series expansion; when f cannot be expanded, c is
estimated as the limit of f(t)/t^k by extrapolation (an estimate).`

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
	point, inf, err := values.SeriesPointOf("asymptotic", a.Get("toward"))
	if err != nil {
		return err
	}
	c.Method, c.Precision = claim.SeriesMethod, int(t.Bits)
	x, ok, why := s.expandForClaim(f, a.Get("toward"))
	if ok {
		return claim.SeriesAsymptotic(c, x, coef, k, inf, t)
	}
	// f ~ c·h^k means f/h^k → c ≠ 0 (h the distance to the point, or t
	// toward infinity): the limit's extrapolation estimates that, and
	// says so.
	scaled := interp.Func("f(t)/h^k", "f(t) divided by the stated power", func(args py.Tuple, _ py.StringDict) (py.Object, error) {
		v, err := py.Call(f, args, nil)
		if err != nil {
			return nil, err
		}
		h, _ := values.ExactOf(args[0])
		if !inf {
			h = new(big.Rat).Sub(h, point)
		}
		p, q := int(k.Num().Int64()), int(k.Denom().Int64())
		hk := exact.RealRoot(exact.RealPowInt(exact.RealFromRat(h), p), q)
		return py.TrueDiv(v, s.env.Real(hk))
	})
	kw := py.StringDict{"expect": items[0], "method": py.String("extrapolation")}
	if a.Given("toward") {
		kw["toward"] = a.Get("toward")
	}
	la, err := interp.Bind("limit", py.Tuple{a.Get("name"), scaled}, kw, limitParams...)
	if err != nil {
		return err
	}
	if err := s.limit(c, t, la); err != nil {
		return err
	}
	c.Note = "not proved by series expansion (" + why + "); the coefficient estimated instead as the limit of f(t)/h^" + exact.FormatRat(k) + " (h the distance to the point, t toward infinity): " + c.Note
	return nil
}

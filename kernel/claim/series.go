package claim

import (
	"fmt"
	"math/big"

	"assay/cells"
	"assay/exact"
)

// SeriesMethod is the method of a limit or asymptotic claim decided from
// f's Puiseux expansion.
const SeriesMethod = "series expansion"

// seriesProof is what a series verdict rests on, said once in every note.
const seriesProof = "f ran once on a Puiseux series in t with exact coefficients and a tracked error term, computing one expression of t (it neither compared t nor converted it to a number), so the leading term is that of f(t) for all t near the point"

// Expansion is f's expansion as a claim sees it: the series in the
// distance s to the point (s = t − a, or 1/t toward infinity) and its
// printout in t.
type Expansion struct {
	S       *exact.Series
	Printed string
}

// SeriesLimit decides a limit claim from f's expansion: the limit is 0,
// the constant term, or ±infinity by the leading exponent and
// coefficient. expect is nil for no expected value; expectInf claims a
// blow-up to +infinity. order, when not nil, is the stated p of the error
// h^p (or of the growth h^-p); h is the distance to the point. The
// expansion must have a known leading term.
func SeriesLimit(c *cells.Claim, f Expansion, expect *exact.Real, expectInf bool, order *big.Rat, t Target) error {
	lead, e, ok := f.S.Leading()
	if !ok {
		return fmt.Errorf("the expansion %s has no known term", f.Printed)
	}
	c.Method = SeriesMethod
	sign, err := lead.Sign(t.Cap)
	if err != nil {
		return err
	}
	what := "f(t) = " + f.Printed
	limit := exact.RealFromInt(0)
	if e.Sign() == 0 {
		limit = lead
	}
	var pow *big.Rat // the exponent of the error, or of the growth
	switch {
	case e.Sign() < 0:
		pow = new(big.Rat).Neg(e)
	case e.Sign() > 0:
		pow = e
	default:
		pow, ok = nextExponent(f.S)
	}
	switch {
	case e.Sign() < 0 && expectInf && sign > 0:
		c.Verdict, c.Residual = cells.Holds, "grows like h^−"+exact.FormatRat(pow)
		c.Note = fmt.Sprintf("%s: the leading term has a negative exponent and a positive coefficient, so f tends to infinity, growing like h^−%s (h the distance to the point) — a proof: %s", what, exact.FormatRat(pow), seriesProof)
	case e.Sign() < 0:
		c.Verdict, c.Residual = cells.Fails, "blows up like h^−"+exact.FormatRat(pow)
		c.Note = fmt.Sprintf("%s: f tends to %sinfinity, %s (h is the distance to the point); %s", what, map[bool]string{true: "", false: "−"}[sign > 0], map[bool]string{true: "not to a finite limit", false: "not to +infinity (state the limit of −f)"}[!expectInf], seriesProof)
	case expectInf:
		c.Verdict, c.Residual = cells.Fails, "limit "+realText(limit, t)
		c.Note = fmt.Sprintf("%s: f converges to %s, it does not blow up; %s", what, realText(limit, t), seriesProof)
	case expect == nil:
		c.Verdict, c.Residual = cells.Holds, "limit "+realText(limit, t)
		c.Note = fmt.Sprintf("%s: the limit exists and is %s — a proof: %s", what, realText(limit, t), seriesProof)
	default:
		r, err := OfReal(limit, expect, t)
		if err != nil {
			return err
		}
		r.Decide(c, 0)
		c.Method = SeriesMethod
		if r.Zero {
			c.Note = fmt.Sprintf("%s: the limit is %s, exactly the expected value — a proof: %s", what, realText(limit, t), seriesProof)
		} else {
			c.Note = fmt.Sprintf("%s: the limit is %s; against the expected value, %s; %s", what, realText(limit, t), c.Note, seriesProof)
		}
	}
	if order == nil || c.Verdict == cells.Fails {
		return nil
	}
	growth := e.Sign() < 0
	switch {
	case !ok:
		c.Verdict, c.Digits, c.Why = cells.Undecided, 0, cells.OtherReason
		c.Note += fmt.Sprintf("; the stated order %s of the error is not settled: after the constant term no coefficient is known to be non-zero before the error term (all cancel, or one is a transcendental number not told from 0)", exact.FormatRat(order))
	case pow.Cmp(order) == 0 && growth:
		c.Note += fmt.Sprintf("; h^−%s is the stated order, exactly", exact.FormatRat(pow))
	case pow.Cmp(order) == 0:
		c.Note += fmt.Sprintf("; the error is of order h^%s (h the distance to the point), the stated order, exactly", exact.FormatRat(pow))
	default:
		c.Verdict, c.Digits, c.Why = cells.Fails, 0, ""
		c.Note += fmt.Sprintf("; the stated order %s is false: the %s is of order h^%s%s exactly (h the distance to the point)", exact.FormatRat(order), map[bool]string{true: "growth", false: "error"}[growth], map[bool]string{true: "−", false: ""}[growth], exact.FormatRat(pow))
	}
	return nil
}

// nextExponent is the exponent of the first non-zero term after the
// constant one; ok is false when none is known before the error term, or
// whether a coefficient is zero is not settled (a transcendental zero).
func nextExponent(s *exact.Series) (*big.Rat, bool) {
	_, exps, err := s.Terms()
	if err != nil {
		return nil, false
	}
	for _, e := range exps {
		if e.Sign() > 0 {
			return e, true
		}
	}
	return nil, false
}

// SeriesAsymptotic decides f(t) ~ coef·t^k from f's expansion: the
// leading term must be exactly coef·t^k (k is in the printed variable:
// negated toward infinity, where s = 1/t).
func SeriesAsymptotic(c *cells.Claim, f Expansion, coef *exact.Real, k *big.Rat, flip bool, t Target) error {
	lead, e, ok := f.S.Leading()
	if !ok {
		return fmt.Errorf("the expansion %s has no known term", f.Printed)
	}
	if flip {
		e.Neg(e)
	}
	c.Method = SeriesMethod
	what := "f(t) = " + f.Printed
	actual := realText(lead, t) + "·t^" + exact.FormatRat(e)
	if e.Cmp(k) != 0 {
		c.Verdict, c.Residual = cells.Fails, "leading term "+actual
		c.Note = fmt.Sprintf("%s: the leading term is %s, of exponent %s, not %s; %s", what, actual, exact.FormatRat(e), exact.FormatRat(k), seriesProof)
		return nil
	}
	r, err := OfReal(lead, coef, t)
	if err != nil {
		return err
	}
	r.Decide(c, 0)
	c.Method = SeriesMethod
	if c.Verdict == cells.Fails {
		c.Residual, c.ResidualTeX = "leading term "+actual, ""
	}
	if r.Zero {
		c.Note = fmt.Sprintf("%s: the leading term is %s, exactly as stated — a proof: %s", what, actual, seriesProof)
	} else {
		c.Note = fmt.Sprintf("%s: the leading term is %s; its coefficient against the stated one: %s; %s", what, actual, c.Note, seriesProof)
	}
	return nil
}

// realText prints a real: exact, a closed form, or certified digits.
func realText(x *exact.Real, t Target) string {
	if q, ok := x.Rat(); ok {
		return exact.FormatRat(q)
	}
	if f, ok := x.ClosedForm(60); ok {
		return f
	}
	s, err := x.Text(12, t.Cap)
	if err != nil {
		return x.String()
	}
	return s
}

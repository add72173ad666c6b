package claim

import (
	"fmt"
	"math/big"

	"assay/cells"
	"assay/exact"
)

// Slack is greater − lesser for one instance of an inequality, decided.
type Slack struct {
	Value   *exact.Real
	Lo      *big.Rat // lower end of its enclosure (the exact value when exact)
	Exact   bool
	Verdict cells.Verdict
	Ratio   string // lesser / greater, printed
}

// MeasureSlack decides lesser <= greater: exactly when the slack is known
// to be rational, else by its enclosure at the target precision.
func MeasureSlack(lesser, greater *exact.Real, t Target) (Slack, error) {
	d := exact.RealSub(greater, lesser)
	sl := Slack{Value: d}
	if q, ok := d.Rat(); ok {
		sl.Lo, sl.Exact = q, true
		sl.Verdict = cells.Holds
		if q.Sign() < 0 {
			sl.Verdict = cells.Fails
		}
	} else {
		iv, err := d.Approx(t.Bits, t.Cap)
		switch {
		case err != nil:
			return Slack{}, err
		case iv.Lo.Sign() >= 0:
			sl.Lo, sl.Verdict = iv.Lo, cells.Holds
		case iv.Hi.Sign() < 0:
			sl.Lo, sl.Verdict = iv.Lo, cells.Fails
		default:
			sl.Lo, sl.Verdict = iv.Lo, cells.HoldsToDigits
		}
	}
	if r, err := exact.RealQuo(lesser, greater).Approx(40, t.Cap); err == nil {
		mid := new(big.Rat).Add(r.Lo, r.Hi)
		f, _ := mid.Quo(mid, big.NewRat(2, 1)).Float64()
		sl.Ratio = fmt.Sprintf("%.6g", f)
	}
	return sl, nil
}

// Text prints a slack: exactly when exact, else as certified digits.
func (sl Slack) Text() string {
	if sl.Exact {
		return exact.FormatRat(sl.Lo)
	}
	if d, err := sl.Value.Digits(12, 1<<12); err == nil {
		return d
	}
	return "≈ " + sl.Lo.FloatString(15)
}

// Record is the slack as a tally keeps it, at sample k.
func (sl Slack) Record(k int64) SampleSlack {
	return SampleSlack{K: k, Lo: sl.Lo.RatString(), Exact: sl.Exact, Verdict: sl.Verdict, Text: sl.Text(), Ratio: sl.Ratio}
}

// Add records one instance's slack; the printed forms are made only for
// the few smallest.
func (t *InequalityTally) Add(k int64, sl Slack) {
	switch sl.Verdict {
	case cells.Fails:
		t.Violations++
	case cells.HoldsToDigits:
		t.Loose++
	}
	cand := SampleSlack{K: k, Lo: sl.Lo.RatString(), Exact: sl.Exact, Verdict: sl.Verdict, Ratio: sl.Ratio}
	if len(t.Smallest) == keepSmallest && compareSlacks(cand, t.Smallest[len(t.Smallest)-1]) >= 0 {
		return
	}
	cand.Text = sl.Text()
	t.Smallest = mergeSmallest(t.Smallest, []SampleSlack{cand})
}

// JudgeInequality gives the verdict: any certified violation fails the
// claim (a sample or a point the search found); a sample f could not
// evaluate leaves it undecided; a slack not certified either way leaves
// it holding to digits. sample prints sample k for the report.
func JudgeInequality(c *cells.Claim, it *InequalityTally, found *SearchTally, samples int64, t Target, sample func(k int64) string) {
	c.Samples = int(samples)
	where := func(sl SampleSlack) string {
		if sl.Sample != "" {
			return sl.Sample
		}
		return fmt.Sprintf("sample %d: %s", sl.K, Clip(sample(sl.K), 200))
	}
	if len(it.Smallest) == 0 {
		c.Verdict, c.Residual, c.Why = cells.Undecided, "none: f raised on every sample", cells.SampleRaised
		c.Worst = where(SampleSlack{K: it.FirstRaise.K})
		c.Note = fmt.Sprintf("f raised on all %d samples (the first is shown): %s", samples, it.FirstRaise.Text)
		return
	}
	w := it.Smallest[0]
	searched := found != nil && found.Best != nil
	if searched && compareSlacks(*found.Best, w) < 0 {
		w = *found.Best
	}
	fromSearch := searched && w.Sample != ""
	c.Residual = "slack " + w.Text
	if !w.Exact {
		c.Method, c.Precision = RealMethod, int(t.Bits)
	}
	if samples > 0 && (w.Verdict != cells.Holds || it.Violations > 0 || fromSearch) {
		c.Worst = where(w)
	}
	ratio := ""
	if w.Ratio != "" {
		ratio = "; lesser/greater = " + w.Ratio + " there"
	}
	every := "for this instance"
	if samples > 0 {
		every = fmt.Sprintf("on all %d samples (evidence, not a proof, of the general statement)", samples)
	}
	switch {
	case w.Verdict == cells.Fails && fromSearch:
		c.Verdict = cells.Fails
		c.Note = fmt.Sprintf("violated at a point the counterexample search found, though all %d samples held: at the rational configuration shown the slack is ", samples)
		if w.Exact {
			c.Note += "exactly negative — an exact counterexample"
		} else {
			c.Note += "certified negative by interval arithmetic — a counterexample"
		}
		c.Note += ratio
	case it.Violations > 0:
		c.Verdict = cells.Fails
		n := max(samples, 1)
		c.Note = fmt.Sprintf("violated: the smallest slack is certified negative%s; %d of %d instances violate it", ratio, it.Violations, n)
		if w.Exact {
			c.Note += " — an exact counterexample"
		}
	case it.Raised > 0:
		c.Verdict, c.Why = cells.Undecided, cells.SampleRaised
		c.Worst = where(SampleSlack{K: it.FirstRaise.K})
		c.Note = fmt.Sprintf("f raised on %d of %d samples (the first is shown: %s); the sweep went on, and a claim with samples it could not evaluate cannot hold", it.Raised, samples, it.FirstRaise.Text)
	case it.Loose > 0 || w.Verdict == cells.HoldsToDigits:
		c.Verdict, c.Digits = cells.HoldsToDigits, t.Digits()
		c.Note = fmt.Sprintf("the smallest slack could not be certified non-negative: any violation is below 10^-%d%s; evidence, not a proof", t.Digits(), ratio)
	case fromSearch:
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("slack certified >= 0 %s and at the point the search reached, whose slack, the smallest, is shown%s", every, ratio)
	default:
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("slack certified >= 0 %s; the smallest slack is shown%s", every, ratio)
	}
	if searched || (found != nil && found.Skipped != "") {
		c.Note += "; " + found.describe(fromSearch && w.Verdict == cells.Fails, fromSearch)
	}
}

// describe says what the search did, for the claim's note: whether it
// found the violation, or else a smaller slack than any sample's.
func (st *SearchTally) describe(violated, smaller bool) string {
	if st.Skipped != "" {
		return "counterexample search skipped: " + st.Skipped
	}
	how := fmt.Sprintf("a counterexample search (Nelder–Mead from the %d samples with the smallest slack, %d evaluations of f)", st.Starts, st.Evaluations)
	switch {
	case violated:
		return how + fmt.Sprintf(" found the violation, starting from sample %d", st.Start)
	case smaller:
		return how + fmt.Sprintf(" found no violation; the point it reached from sample %d is a place to look, not a bound", st.Start)
	}
	return how + " found no violation and no smaller slack than the samples'"
}

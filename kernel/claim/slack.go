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
	Rel     *big.Rat // the relative slack, see relative
	Exact   bool
	Verdict cells.Verdict // Undecided: the slack could not be told from 0
	Ratio   string        // lesser / greater, printed
	// NearZero: for an undecided slack, neither side could be told from
	// 0 either, and both are below 10^-bound in absolute value; else the
	// sides agree to bound significant digits.
	NearZero bool
	// Algebraic: the sign was decided exactly by the slack's zero bound
	// (a slack proved zero is then Exact, with Lo = 0).
	Algebraic bool
	bound     int
}

// MeasureSlack decides lesser <= greater: exactly when the slack is known
// to be rational, else by its enclosure, refined as an identity's
// residual is (compareSides): "holds" when it is certified >= 0, "fails"
// when < 0, and undecided when the two sides agree to the target's digits
// (or are both that close to 0), since a slack that cannot be told from 0
// shows nothing about its sign. An algebraic slack has its sign decided
// exactly by its zero bound, as OfReal decides a residual: an inequality
// at equality then holds, the equality proved.
func MeasureSlack(lesser, greater *exact.Real, t Target) (Slack, error) {
	d := exact.RealSub(greater, lesser)
	sl := Slack{Value: d}
	sign, _, decided, err := algebraicSign(d, t)
	if err != nil {
		return Slack{}, err
	}
	if q, ok := d.Rat(); ok {
		sl.Lo, sl.Exact = q, true
		sl.Verdict = cells.Holds
		if q.Sign() < 0 {
			sl.Verdict = cells.Fails
		}
	} else if decided {
		sl.Algebraic, sl.Verdict = true, cells.Holds
		if sign < 0 {
			sl.Verdict = cells.Fails
		}
		if sign == 0 {
			sl.Lo, sl.Exact = new(big.Rat), true
		} else {
			iv, err := d.EncloseCoarse(t.Bits + 32)
			if err != nil {
				return Slack{}, err
			}
			sl.Lo = iv.Lo
		}
	} else {
		signed := func(iv exact.Interval) bool { return iv.Lo.Sign() >= 0 || iv.Hi.Sign() < 0 }
		iv, how, err := compareSides(greater, lesser, t, signed)
		switch {
		case err != nil:
			return Slack{}, err
		case how != settled:
			sl.Verdict, sl.NearZero = cells.Undecided, how == nearZero
			sl.bound = t.Digits()
		case iv.Lo.Sign() >= 0:
			sl.Verdict = cells.Holds
		default:
			sl.Verdict = cells.Fails
		}
		sl.Lo = iv.Lo
	}
	sl.Rel = relative(sl.Lo, lesser, greater, t)
	if r, err := exact.RealQuo(lesser, greater).Approx(40, t.Cap); err == nil {
		mid := new(big.Rat).Add(r.Lo, r.Hi)
		f, _ := mid.Quo(mid, big.NewRat(2, 1)).Float64()
		sl.Ratio = fmt.Sprintf("%.6g", f)
	}
	return sl, nil
}

// relative is the slack lo scaled by |greater| + |lesser|, so that the
// ranking of samples is blind to scale: exact when the sides are rational;
// otherwise the sides' sizes come from 64-bit enclosures, which is enough
// to rank by, while the sign stays that of lo. Sides that are both zero
// give 0.
func relative(lo *big.Rat, lesser, greater *exact.Real, t Target) *big.Rat {
	size := new(big.Rat)
	for _, side := range []*exact.Real{lesser, greater} {
		v, ok := side.Rat()
		if !ok {
			iv, err := side.Approx(64, t.Cap)
			if err != nil {
				return new(big.Rat).SetInt64(int64(lo.Sign()))
			}
			v = new(big.Rat).Add(iv.Lo, iv.Hi)
			v.Quo(v, big.NewRat(2, 1))
		}
		size.Add(size, new(big.Rat).Abs(v))
	}
	if size.Sign() == 0 {
		return new(big.Rat).SetInt64(int64(lo.Sign()))
	}
	return size.Quo(lo, size)
}

// Text prints a slack: exactly when exact, as the bound it was shown
// below when undecided, else as certified digits.
func (sl Slack) Text() string {
	switch {
	case sl.Exact:
		return exact.FormatRat(sl.Lo)
	case sl.Verdict == cells.Undecided && sl.NearZero:
		return fmt.Sprintf("|lesser|, |greater| < 1e-%d", sl.bound)
	case sl.Verdict == cells.Undecided:
		return fmt.Sprintf("|slack| < 1e-%d relative", sl.bound)
	}
	if d, err := sl.Value.Text(12, 1<<12); err == nil {
		return d
	}
	return "≈ " + sl.Lo.FloatString(15)
}

// Record is the slack as a tally keeps it, at sample k.
func (sl Slack) Record(k int64) SampleSlack {
	rec := sl.record(k)
	rec.Text = sl.Text()
	return rec
}

// record is the slack as a tally keeps it, without the printed form.
func (sl Slack) record(k int64) SampleSlack {
	return SampleSlack{K: k, Lo: sl.Lo.RatString(), Rel: sl.Rel.RatString(), Exact: sl.Exact, Verdict: sl.Verdict, NearZero: sl.NearZero, Ratio: sl.Ratio, Algebraic: sl.Algebraic}
}

// Add records one instance's slack; the printed forms are made only for
// the few smallest.
func (t *InequalityTally) Add(k int64, sl Slack) {
	switch sl.Verdict {
	case cells.Fails:
		t.Violations++
	case cells.Undecided:
		t.Loose++
	}
	cand := sl.record(k)
	if len(t.Smallest) == keepSmallest && compareSlacks(cand, t.Smallest[len(t.Smallest)-1], t.Absolute) >= 0 {
		return
	}
	cand.Text = sl.Text()
	t.Smallest = mergeSmallest(t.Smallest, []SampleSlack{cand}, t.Absolute)
}

// JudgeInequality gives the verdict: any certified violation fails the
// claim (a sample or a point the search found); a sample f could not
// evaluate leaves it undecided, and so does a slack that could not be
// separated from 0 (the sides equal to the target's digits): that the
// sides agree shows nothing about which is larger. samples is N, counted
// the samples that reached f (those that met the hypothesis, or all N). shown gives sample k as cell
// code (Claim.Sample) and as the report's line (Claim.Worst).
func JudgeInequality(c *cells.Claim, it *InequalityTally, found *SearchTally, samples, counted int64, t Target, shown func(k int64) (sample, worst string)) {
	c.Samples = int(samples)
	show := func(sl SampleSlack) {
		if sl.Sample != "" {
			c.Sample = sl.Sample
			c.Worst = "found by search: " + Clip(sl.Sample, 400)
			return
		}
		c.Sample, c.Worst = shown(sl.K)
	}
	if len(it.Smallest) == 0 {
		c.Verdict, c.Why, c.Residual = cells.Undecided, cells.SampleRaised, "none: f raised on every sample"
		show(SampleSlack{K: it.FirstRaise.K})
		c.Note = fmt.Sprintf("f raised on all %d samples it was given (the first is shown): %s", counted, it.FirstRaise.Text)
		return
	}
	w := it.Smallest[0]
	searched := found != nil && found.Best != nil
	if searched && compareSlacks(*found.Best, w, it.Absolute) < 0 {
		w = *found.Best
	}
	fromSearch := searched && w.Sample != ""
	c.Residual = "slack " + w.Text
	if q, ok := new(big.Rat).SetString(w.Lo); ok && w.Exact && exact.FormatRat(q) == w.Text {
		c.ResidualTeX = `\text{slack}\; ` + exact.LaTeXRat(q)
	}
	if w.Verdict == cells.Undecided {
		c.Residual, c.ResidualTeX = w.Text, "" // a bound, which names the slack itself
	}
	switch {
	case w.Algebraic && w.Exact:
		c.Method = AlgebraicMethod // a slack proved zero
	case !w.Exact:
		c.Method, c.Precision = RealMethod, int(t.Bits)
	}
	if samples > 0 && (w.Verdict != cells.Holds || it.Violations > 0 || fromSearch) {
		show(w)
	}
	ratio := ""
	if w.Ratio != "" {
		ratio = "; lesser/greater = " + w.Ratio + " there"
	}
	every := "for this instance"
	if samples > 0 {
		every = fmt.Sprintf("on all %d samples (evidence, not a proof, of the general statement)", counted)
	}
	switch {
	case w.Verdict == cells.Fails && fromSearch:
		c.Verdict = cells.Fails
		c.Note = fmt.Sprintf("violated at a point the counterexample search found, though all %d samples held: at the rational configuration shown the slack is ", counted)
		if w.Exact {
			c.Note += "exactly negative — an exact counterexample"
		} else {
			c.Note += "certified negative by interval arithmetic — a counterexample"
		}
		c.Note += ratio
	case it.Violations > 0:
		c.Verdict = cells.Fails
		c.Note = fmt.Sprintf("violated: the smallest slack is certified negative%s; %d of %d instances violate it", ratio, it.Violations, max(counted, 1))
		if w.Exact {
			c.Note += " — an exact counterexample"
		}
	case it.Raised > 0:
		c.Verdict, c.Why = cells.Undecided, cells.SampleRaised
		show(SampleSlack{K: it.FirstRaise.K})
		c.Note = fmt.Sprintf("f raised on %d of %d samples (the first is shown: %s); the sweep went on, and a claim with samples it could not evaluate cannot hold", it.Raised, counted, it.FirstRaise.Text)
	case it.Loose > 0 || w.Verdict == cells.Undecided:
		c.Verdict, c.Why = cells.Undecided, cells.EqualWithin
		where := "the slack could not be separated from 0"
		switch {
		case fromSearch:
			where += " at the point the search reached, which is shown"
		case samples > 0 && it.Loose == 1:
			where += fmt.Sprintf(" on 1 of %d samples, the one shown", counted)
		case samples > 0:
			where += fmt.Sprintf(" on %d of %d samples (one of them is shown)", it.Loose, counted)
		}
		equal := fmt.Sprintf("the two sides are equal to within 10^-%d of their size (%s)%s", t.Digits(), w.Text, ratio)
		if w.NearZero {
			equal = fmt.Sprintf("both sides are within 10^-%d of 0 (%s)", t.Digits(), w.Text)
		}
		c.Note = fmt.Sprintf("undecided: %s — %s; an inequality at equality needs the equality proved (exactly, or raise digits= if the sides may differ)", where, equal)
	case fromSearch:
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("slack certified >= 0 %s and at the point the search reached, which is shown%s", every, ratio)
	case w.Algebraic && w.Exact:
		c.Verdict = cells.Holds
		c.Note = "the slack is exactly zero: the sides are equal, proved by the slack's enclosure lying below its zero bound (BFMSS), which a non-zero algebraic number built as it is cannot go below"
		if samples > 0 {
			c.Note = fmt.Sprintf("slack certified >= 0 %s; the smallest is exactly zero, proved by its zero bound (BFMSS)", every)
		}
	default:
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("slack certified >= 0 %s%s", every, ratio)
	}
	// The relative slack of a slack not told from 0 is the lower end of
	// an enclosure around 0, which means nothing to a reader.
	if samples > 0 && c.Why != cells.SampleRaised && c.Why != cells.EqualWithin {
		c.Note += "; " + ranking(w, it.Absolute)
	}
	if searched || (found != nil && found.Skipped != "") {
		c.Note += "; " + found.describe(fromSearch && w.Verdict == cells.Fails, fromSearch)
	}
}

// ranking says how the shown slack was chosen, and gives the other
// measure of it.
func ranking(w SampleSlack, absolute bool) string {
	rel := ratOf(w.Rel)
	text := exact.FormatRat(rel)
	if !w.Exact || len(text) > 24 {
		f, _ := rel.Float64()
		text = fmt.Sprintf("≈ %.4g", f)
	}
	if absolute {
		return "shown: the smallest slack (rank=\"absolute\"), whose relative slack (greater − lesser)/(|greater| + |lesser|) is " + text
	}
	return "shown: the smallest relative slack (greater − lesser)/(|greater| + |lesser|), " + text + " here (rank=\"absolute\" ranks by the slack itself)"
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

package kernel

import (
	"fmt"
	"math/big"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
)

const inequalityDoc = `inequality(name, lesser, greater) checks lesser <= greater (exactly, or
certified for reals); inequality(name, f, over=g, samples=N) checks f(g(k)) =
(lesser, greater) for k = 0..N-1 and reports the smallest slack.`

// slack is greater − lesser for one instance, decided.
type slack struct {
	value   *exact.Real
	lo      *big.Rat // lower end of its enclosure (the exact value when exact)
	exact   bool
	verdict cells.Verdict
	ratio   string // lesser / greater, printed
}

// measureSlack decides lesser <= greater for exact numbers and reals.
func measureSlack(t target, lesser, greater py.Object) (slack, error) {
	a, ok1 := realOf(lesser)
	b, ok2 := realOf(greater)
	if !ok1 {
		return slack{}, sideError(lesser)
	}
	if !ok2 {
		return slack{}, sideError(greater)
	}
	d := exact.RealSub(b, a)
	sl := slack{value: d}
	if q, ok := d.Rat(); ok {
		sl.lo, sl.exact = q, true
		sl.verdict = cells.Holds
		if q.Sign() < 0 {
			sl.verdict = cells.Fails
		}
	} else {
		iv, err := d.Approx(t.bits, t.cap)
		switch {
		case err != nil:
			return slack{}, realErr(err, t.cap)
		case iv.Lo.Sign() >= 0:
			sl.lo, sl.verdict = iv.Lo, cells.Holds
		case iv.Hi.Sign() < 0:
			sl.lo, sl.verdict = iv.Lo, cells.Fails
		default:
			sl.lo, sl.verdict = iv.Lo, cells.HoldsToDigits
		}
	}
	if q, ok := realOf(greater); ok {
		if r, err := exact.RealQuo(a, q).Approx(40, t.cap); err == nil {
			mid := new(big.Rat).Add(r.Lo, r.Hi)
			f, _ := mid.Quo(mid, big.NewRat(2, 1)).Float64()
			sl.ratio = fmt.Sprintf("%.6g", f)
		}
	}
	return sl, nil
}

// text prints a slack: exactly when exact, else as certified digits.
func (sl slack) text() string {
	if sl.exact {
		return exact.FormatRat(sl.lo)
	}
	if d, err := sl.value.Digits(12, 1<<12); err == nil {
		return d
	}
	return "≈ " + sl.lo.FloatString(15)
}

func (s *Session) inequality(line int, args py.Tuple, kw py.StringDict) (py.Object, error) {
	start := time.Now()
	a, err := bind("inequality", args, kw, []string{"name", "lesser", "greater", "over", "samples", "digits", "search"}, 2)
	if err != nil {
		return nil, err
	}
	c, err := s.newClaim("inequality", a[0], line)
	if err != nil {
		return nil, err
	}
	t, err := s.claimTarget(a[5])
	if err != nil {
		return nil, err
	}
	search := a[6] == py.True
	if a[6] != nil && a[6] != py.True && a[6] != py.False {
		return nil, py.ExceptionNewf(py.TypeError, "inequality(): search must be True or False")
	}
	it := &InequalityTally{}
	var samples int64
	var found *SearchTally
	printed := ""
	if a[3] != nil {
		f, g := a[1], a[3]
		if a[2] != nil || !callable(f) || !callable(g) {
			return nil, py.ExceptionNewf(py.TypeError, "inequality(name, f, over=g, samples=N) needs functions f and g and no third argument")
		}
		if samples, err = sampleCount("inequality", a[4]); err != nil {
			return nil, err
		}
		ask := Ask{Claim: c.Name, Phase: phaseSweep, Line: c.Line, Samples: samples}
		tally, err := s.distribute(ask, func(sh Share) Tally {
			began := time.Now()
			part := &InequalityTally{}
			done, failed := s.sweep(ask, sh, f, g, func(k int64, msg string) {
				part.Raised++
				if part.FirstRaise == nil {
					part.FirstRaise = &SampleNote{K: k, Text: clip(msg, 160)}
				}
			}, func(k int64, _, l, gr py.Object) error {
				sl, err := measureSlack(t, l, gr)
				if err != nil {
					return py.ExceptionNewf(py.TypeError, "sample %d: %v", k, err)
				}
				part.add(k, sl)
				return nil
			})
			return Tally{Computed: done, Seconds: time.Since(began).Seconds(), Err: failed, Inequality: part, Printed: s.printed}
		})
		if err != nil {
			return nil, err
		}
		if tally.Err != nil {
			return nil, tally.Err.raise()
		}
		if tally.Inequality != nil {
			it = tally.Inequality
		}
		printed = printedNote(tally)
		if search && it.Violations == 0 && len(it.Smallest) > 0 {
			if found, err = s.search(c, t, f, g, it.Smallest); err != nil {
				return nil, err
			}
		}
	} else {
		if a[2] == nil || a[4] != nil || search {
			return nil, py.ExceptionNewf(py.TypeError, "inequality(name, lesser, greater), or inequality(name, f, over=g, samples=N, search=False)")
		}
		sl, err := measureSlack(t, a[1], a[2])
		if err != nil {
			return nil, err
		}
		it.add(0, sl)
	}
	judgeInequality(&c, it, found, samples, t, a[3])
	c.Note += printed
	return s.record(c, start), nil
}

// add records one instance's slack; the printed forms are made only for
// the few smallest.
func (t *InequalityTally) add(k int64, sl slack) {
	switch sl.verdict {
	case cells.Fails:
		t.Violations++
	case cells.HoldsToDigits:
		t.Loose++
	}
	cand := SampleSlack{K: k, Lo: sl.lo.RatString(), Exact: sl.exact, Verdict: sl.verdict, Ratio: sl.ratio}
	if len(t.Smallest) == keepSmallest && compareSlacks(cand, t.Smallest[len(t.Smallest)-1]) >= 0 {
		return
	}
	cand.Text = sl.text()
	t.Smallest = mergeSmallest(t.Smallest, []SampleSlack{cand})
}

// judgeInequality gives the verdict: any certified violation fails the
// claim (a sample or a point the search found); a sample f could not
// evaluate leaves it undecided; a slack not certified either way leaves it
// holding to digits.
func judgeInequality(c *cells.Claim, it *InequalityTally, found *SearchTally, samples int64, t target, g py.Object) {
	c.Samples = int(samples)
	where := func(sl SampleSlack) string {
		if sl.Sample != "" {
			return sl.Sample
		}
		return fmt.Sprintf("sample %d: %s", sl.K, clip(str(mustCall(g, sl.K)), 200))
	}
	if len(it.Smallest) == 0 {
		c.Verdict, c.Residual = cells.Undecided, "none: f raised on every sample"
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
		c.Method, c.Precision = realMethod, int(t.bits)
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
		c.Verdict = cells.Undecided
		c.Worst = where(SampleSlack{K: it.FirstRaise.K})
		c.Note = fmt.Sprintf("f raised on %d of %d samples (the first is shown: %s); the sweep went on, and a claim with samples it could not evaluate cannot hold", it.Raised, samples, it.FirstRaise.Text)
	case it.Loose > 0 || w.Verdict == cells.HoldsToDigits:
		c.Verdict, c.Digits = cells.HoldsToDigits, t.digits()
		c.Note = fmt.Sprintf("the smallest slack could not be certified non-negative: any violation is below 10^-%d%s; evidence, not a proof", t.digits(), ratio)
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

// mustCall rebuilds sample k for the report (g is deterministic); on an
// error it gives the message instead.
func mustCall(g py.Object, k int64) py.Object {
	v, err := py.Call(g, py.Tuple{py.Int(k)}, nil)
	if err != nil {
		_, msg := describe(err, 0)
		return py.String(msg)
	}
	return v
}

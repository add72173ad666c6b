package session

import (
	"fmt"
	"math"
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
	"assay/exact/limits"
	"assay/kernel/claim"
	"assay/kernel/figure"
	"assay/kernel/interp"
	"assay/kernel/values"
)

const limitDoc = `limit(name, f, toward=0, expect=None, steps=30, ratio=1/2, digits=None, order=None, method=None)
first runs f on a Puiseux series in t (method="series" alone): when f
computes one expression of t, the limit is proved from the leading terms.
Otherwise (or with method="extrapolation") it evaluates f(t) along t = toward + ratio^k (or ratio^-k toward infinity) and
along a second walk at an incommensurable ratio, extrapolates the limit and
its convergence order, and compares them with expect (a value, or infinity
for a blow-up) and order (the h^p of the error, or of the growth). The
result is an estimate, never a certified bound.`

var limitParams = []string{"name", "f", "toward=", "expect=", "steps=", "ratio=", "digits=", "order=", "method="}

// walkSpec is the parameter walk shared by limit() and sequence().
type walkSpec struct {
	toward limits.Toward
	value  *big.Rat
	ratio  *big.Rat
	steps  int
}

func walkArgs(fn string, a interp.Args) (walkSpec, error) {
	sp := walkSpec{toward: limits.ToZero, value: new(big.Rat), ratio: big.NewRat(1, 2), steps: 30}
	// One reading of toward= for the walks and the series route.
	switch v, inf, err := values.SeriesPointOf(fn, a.Get("toward")); {
	case err != nil:
		return sp, err
	case inf:
		sp.toward = limits.ToInfinity
	case v.Sign() != 0:
		sp.toward, sp.value = limits.ToValue, v
	}
	if a.Has("steps") {
		n, err := a.Int("steps", 30)
		if err != nil || n < 3 || n > 400 {
			return sp, py.ExceptionNewf(py.ValueError, "%s(): steps must be between 3 and 400", fn)
		}
		sp.steps = int(n)
	}
	if a.Has("ratio") {
		r, ok := values.ExactOf(a.Get("ratio"))
		if !ok || r.Sign() <= 0 || r.Cmp(big.NewRat(1, 1)) >= 0 {
			return sp, py.ExceptionNewf(py.ValueError, "%s(): ratio must be an exact number between 0 and 1, e.g. frac(1, 2)", fn)
		}
		sp.ratio = r
	}
	return sp, nil
}

// walk evaluates f along the grid; it stops at the first step that raises
// and returns what it had, with the error.
func (s *Session) walk(sp walkSpec, f py.Object) (ts, hs []*big.Rat, vals []py.Object, err error) {
	ts, hs, gerr := limits.Grid(sp.toward, sp.value, sp.ratio, sp.steps)
	if gerr != nil {
		return nil, nil, nil, py.ExceptionNewf(py.ValueError, "%v", gerr)
	}
	for k, t := range ts {
		v, err := py.Call(f, py.Tuple{s.env.Rational(t)}, nil)
		if err != nil {
			return ts[:k], hs[:k], vals, fmt.Errorf("f raised at step %d (t = %s): %s", k, exact.FormatRat(t), interp.Message(err))
		}
		vals = append(vals, v)
	}
	return ts, hs, vals, nil
}

// approximations turns values into big.Float midpoints at prec bits. A
// value that cannot be had (a domain error, the precision cap) ends the
// walk there: the values before it are returned with the reason.
func approximations(vals []py.Object, prec, cap uint) ([]*big.Float, error) {
	out := make([]*big.Float, 0, len(vals))
	for i, v := range vals {
		x, ok := values.RealOf(v)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "limit(): f returned %s at step %d, not an exact number or a real%s", interp.TypeName(v), i, values.FloatHint(v))
		}
		iv, err := x.Approx(prec, cap)
		if err != nil {
			return out, fmt.Errorf("the value at step %d could not be certified: %v", i, err)
		}
		out = append(out, midpoint(iv, prec))
	}
	return out, nil
}

// midpoint is the middle of an enclosure at prec bits.
func midpoint(iv exact.Interval, prec uint) *big.Float {
	mid := new(big.Rat).Add(iv.Lo, iv.Hi)
	mid.Quo(mid, big.NewRat(2, 1))
	return new(big.Float).SetPrec(prec).SetRat(mid)
}

func (s *Session) sequence(a interp.Args) (py.Object, error) {
	if !interp.Callable(a.Get("f")) {
		return nil, py.ExceptionNewf(py.TypeError, "sequence(f, …) needs a function of t")
	}
	sp, err := walkArgs("sequence", a)
	if err != nil {
		return nil, err
	}
	ts, _, vals, werr := s.walk(sp, a.Get("f"))
	if werr != nil {
		return nil, py.ExceptionNewf(py.ValueError, "sequence(): %v", werr)
	}
	out := make([]py.Object, len(ts))
	for i := range ts {
		out[i] = py.Tuple{s.env.Rational(ts[i]), vals[i]}
	}
	return py.NewListFromItems(out), nil
}

func (s *Session) limit(c *cells.Claim, t claim.Target, a interp.Args) error {
	f := a.Get("f")
	if !interp.Callable(f) {
		return py.ExceptionNewf(py.TypeError, "limit(name, f, …) needs a function of t")
	}
	sp, err := walkArgs("limit", a)
	if err != nil {
		return err
	}
	var expect *exact.Real
	expectInf := isInfinity(a.Get("expect"))
	if a.Given("expect") && !expectInf {
		var ok bool
		if expect, ok = values.RealOf(a.Get("expect")); !ok {
			return py.ExceptionNewf(py.TypeError, "limit(): expect must be an exact number, a real or infinity, got %s%s", interp.TypeName(a.Get("expect")), values.FloatHint(a.Get("expect")))
		}
	}
	order, hasOrder := 0.0, a.Given("order")
	if hasOrder {
		q, ok := values.ExactOf(a.Get("order"))
		if !ok || q.Sign() <= 0 {
			return py.ExceptionNewf(py.ValueError, "limit(): order must be a positive exact number (the h^p of the error, or of the growth with expect=infinity), e.g. 2 or frac(1, 2)")
		}
		order, _ = q.Float64()
	}
	how := ""
	if a.Given("method") {
		m, ok := a.Get("method").(py.String)
		if !ok || (m != "series" && m != "extrapolation") {
			return py.ExceptionNewf(py.ValueError, "limit(): method must be \"series\" or \"extrapolation\" (or left out: series first, extrapolation when f cannot be expanded), got %s", interp.Str(a.Get("method")))
		}
		how = string(m)
	}
	if how != "extrapolation" {
		ok, why, err := s.seriesLimit(c, t, a, expect, expectInf)
		if err != nil || ok {
			return err
		}
		if how == "series" {
			c.Method, c.Verdict, c.Residual, c.Why = claim.SeriesMethod, cells.Undecided, "no expansion", cells.OtherReason
			c.Note = "not decided by series expansion (method=\"series\"): " + why
			return nil
		}
		// The note of the extrapolation says why the proof was not had.
		defer func() {
			c.Note = "not proved by series expansion (" + why + "); estimated by extrapolation instead: " + c.Note
		}()
	}
	// Extrapolation cancels digits: evaluate f three times more precisely than the target.
	prec := min(3*t.Bits+64, t.Cap)
	c.Method, c.Precision = "extrapolation", int(prec)
	w1, err := s.limitWalk(sp, f, prec, t.Cap)
	if err != nil {
		return err
	}
	if len(w1.floats) < 3 {
		c.Verdict, c.Residual, c.Why = cells.Undecided, "too few values", cells.OtherReason
		c.Note = fmt.Sprintf("%v; fewer than 3 values, nothing to extrapolate", w1.stop)
		s.limitTable(c.Name, w1, "")
		return nil
	}
	if w1.est.Method != "" {
		c.Method = w1.est.Method
	}
	if w1.est.Limit == nil && !w1.est.Diverges {
		c.Verdict, c.Residual, c.Why = cells.Undecided, "no convergence seen", cells.NoConvergence
		c.Note = "no limit found: " + w1.est.Reason + w1.stopped()
		s.limitTable(c.Name, w1, "")
		return nil
	}
	// A walk sees only the scales ratio^k: a second walk at a ratio whose
	// logarithm is not a small rational multiple of the first's must agree.
	sp2 := sp
	sp2.ratio, sp2.steps = limits.SecondRatio(sp.ratio, sp.steps)
	w2, err := s.limitWalk(sp2, f, prec, t.Cap)
	if err != nil {
		return err
	}
	est, agree, why := limits.Agree(w1.est, w2.est)
	sign := w1.floats[len(w1.floats)-1].Sign()
	if agree && est.Diverges && w2.floats[len(w2.floats)-1].Sign() != sign {
		agree, why = false, "they blow up with opposite signs"
	}
	if !agree {
		c.Verdict, c.Residual, c.Why = cells.Undecided, "walks disagree", cells.WalksDisagree
		c.Note = fmt.Sprintf("the walks at ratios %s and %s disagree: %s; both tables are shown", exact.FormatRat(sp.ratio), exact.FormatRat(sp2.ratio), why) +
			w1.stopped() + w2.stopped()
		s.limitTable(c.Name, w1, "first walk")
		s.limitTable(c.Name, w2, "second walk")
		return nil
	}
	second := fmt.Sprintf("; a second walk at ratio %s over %d steps agrees", exact.FormatRat(sp2.ratio), len(w2.floats))
	switch {
	case est.Diverges && expectInf && sign > 0:
		c.Verdict, c.Residual = cells.Estimated, est.Reason
		c.Note = "the quantity blows up, as stated: " + est.Reason + " (h is the distance to the target)" + second +
			"; the growth rate is estimated from finitely many values — an estimate, not a proof"
	case est.Diverges && expectInf:
		c.Verdict, c.Residual = cells.Fails, est.Reason
		c.Note = "the quantity tends to −infinity, not infinity: " + est.Reason + second + "; an estimate, not a proof (state the limit of −f)"
	case est.Diverges:
		c.Verdict, c.Residual = cells.Fails, est.Reason
		c.Note = "the quantity blows up: " + est.Reason + " (h is the distance to the target); not a limit" + second
	case expectInf:
		c.Verdict, c.Residual = cells.Fails, "limit "+est.Limit.Text('g', 12)
		c.Note = fmt.Sprintf("converges, not a blow-up: estimated limit %s; ", est.Limit.Text('g', min(est.Digits+2, 40))) + limitCaveat(est) + second
	case expect != nil:
		iv, err := expect.Approx(prec, t.Cap)
		if err != nil {
			return err
		}
		e := midpoint(iv, prec)
		verdict, digits, gap := limits.Compare(est, e)
		c.Residual = "gap " + gap.Text('e', 3)
		if gap.Cmp(est.ErrorEst) <= 0 {
			// The estimate is only known to its error estimate: a gap
			// below it (9.7e-169 against 1.3e-93) would claim more
			// agreement than was shown.
			c.Residual = "gap ≲ " + est.ErrorEst.Text('e', 3) + " (the error estimate)"
		}
		switch verdict {
		case limits.VerdictEstimated:
			c.Verdict, c.Digits = cells.Estimated, min(digits, t.Digits())
		case limits.VerdictFails:
			c.Verdict = cells.Fails
		default:
			c.Verdict, c.Why = cells.Undecided, cells.OtherReason
		}
		c.Note = fmt.Sprintf("estimated limit %s (error estimate %s) against the expected %s; ", est.Limit.Text('g', min(est.Digits+2, 40)), est.ErrorEst.Text('e', 2), e.Text('g', 20)) + limitCaveat(est) + second
		if c.Verdict == cells.Undecided {
			c.Note += "; the gap is larger than the error estimate but not ten times larger: neither shown nor refuted"
		}
	default:
		c.Verdict, c.Digits = cells.Estimated, min(est.Digits, t.Digits())
		c.Residual = "error estimate " + est.ErrorEst.Text('e', 3)
		c.Note = fmt.Sprintf("converges; estimated limit %s; ", est.Limit.Text('g', min(est.Digits+2, 40))) + limitCaveat(est) + second
	}
	if hasOrder {
		checkOrder(c, order, w1.est, w2.est)
	}
	c.Note += w1.stopped() + w2.stopped()
	s.limitTable(c.Name, w1, "")
	return nil
}

// isInfinity says whether o is the builtin infinity or float("inf").
func isInfinity(o py.Object) bool { return values.IsInfinity(o) }

// checkOrder holds a limit claim to its stated order: the convergence
// order, or the growth rate of a blow-up, estimated by each walk. Both
// within 5% of the stated order keep the verdict; both beyond 25% fail the
// claim; anything else leaves it undecided. An order estimate is itself an
// estimate, and the note says so.
func checkOrder(c *cells.Claim, stated float64, ests ...limits.Estimate) {
	verdict := ""
	var got []string
	for _, e := range ests {
		o := e.Order
		if e.Diverges {
			o = e.Growth
		}
		v := limits.OrderCheck(o, stated, e.Diverges || e.Order > 0)
		if verdict == "" {
			verdict = v
		} else if v != verdict {
			verdict = limits.VerdictUndecided
		}
		if e.Diverges || e.Order > 0 {
			got = append(got, fmt.Sprintf("%.3g", o))
		} else {
			got = append(got, "not estimated")
		}
	}
	what := fmt.Sprintf("; the stated order %s against the walks' estimates %s", limits.FormatOrder(stated), strings.Join(got, " and "))
	switch {
	case verdict == limits.OrderConsistent:
		c.Note += what + ": consistent (an order estimate is itself an estimate)"
	case c.Verdict != cells.Estimated:
		c.Note += what
	case verdict == limits.VerdictFails:
		c.Verdict, c.Digits = cells.Fails, 0
		c.Note += what + fmt.Sprintf(": both differ by more than %.0f%%, so the stated order is false by the estimates — evidence, not a proof, since an order estimate is itself an estimate", 100*limits.OrderFailure)
	default:
		c.Verdict, c.Digits, c.Why = cells.Undecided, 0, cells.OtherReason
		c.Note += what + ": not close enough to confirm, nor far enough to refute (an order estimate is itself an estimate)"
	}
}

// limitRun is one walk of a limit claim: its steps, the values at them,
// the analysis, and why it stopped early (nil when it did not).
type limitRun struct {
	ratio  *big.Rat
	ts     []*big.Rat
	floats []*big.Float
	est    limits.Estimate
	stop   error
}

// limitWalk walks f along sp and analyses the values. Its error is for f
// returning something that is not a number; a step that raises or cannot
// be certified ends the walk, recorded in stop.
func (s *Session) limitWalk(sp walkSpec, f py.Object, prec, cap uint) (limitRun, error) {
	ts, hs, vals, werr := s.walk(sp, f)
	floats, aerr := approximations(vals, prec, cap)
	if floats == nil && aerr != nil {
		return limitRun{}, aerr // f returned something that is not a number
	}
	if aerr != nil {
		werr, ts, hs = aerr, ts[:len(floats)], hs[:len(floats)]
	}
	w := limitRun{ratio: sp.ratio, ts: ts, floats: floats, stop: werr}
	if len(floats) >= 3 {
		w.est = limits.Analyse(hs, floats)
	} else {
		w.est.Reason = "fewer than 3 values"
	}
	return w, nil
}

// stopped is the note's clause on a walk that stopped early.
func (w limitRun) stopped() string {
	if w.stop == nil {
		return ""
	}
	return fmt.Sprintf("; the walk at ratio %s stopped early: %v", exact.FormatRat(w.ratio), w.stop)
}

// limitCaveat says how the estimate was made and what it is worth.
func limitCaveat(est limits.Estimate) string {
	order := ""
	if est.Order > 0 {
		order = fmt.Sprintf(", convergence order ≈ %.2f", est.Order)
	}
	return fmt.Sprintf("%s over %d steps%s; the digits come from the agreement of successive extrapolants — an estimate, not a certified bound", est.Method, len(est.Differences)+1, order)
}

// limitTable puts a walk's table and figures in the report; label, when
// not empty, tells the walk apart from the other one.
func (s *Session) limitTable(name string, w limitRun, label string) {
	ts, vals, est := w.ts, w.floats, w.est
	var rows [][]string
	var xs, ys, errs []float64
	for k := range vals {
		row := []string{fmt.Sprint(k), exact.FormatRat(ts[k]), vals[k].Text('g', 20), "", ""}
		if k > 0 && k-1 < len(est.Differences) && est.Differences[k-1] != nil {
			row[3] = est.Differences[k-1].Text('e', 3)
		}
		if k < len(est.Extrapolants) && est.Extrapolants[k] != nil {
			row[4] = est.Extrapolants[k].Text('g', 20)
		}
		rows = append(rows, row)
		x, _ := ts[k].Float64()
		y, _ := vals[k].Float64()
		xs, ys = append(xs, x), append(ys, y)
		if est.Limit != nil {
			d, _ := new(big.Float).Sub(vals[k], est.Limit).Float64()
			errs = append(errs, math.Abs(d))
		}
	}
	extrapolant := "extrapolant"
	if est.Method != "" {
		extrapolant = est.Method + " extrapolant"
	}
	walk := "t (ratio " + exact.FormatRat(w.ratio) + ")"
	suffix := ""
	if label != "" {
		walk = "t (" + label + ", ratio " + exact.FormatRat(w.ratio) + ")"
		suffix = " (" + label + ")"
	}
	s.outcome.Tables = append(s.outcome.Tables, cells.Table{
		Header: []string{"k", walk, "f(t)", "difference", extrapolant},
		Rows:   rows,
	})
	alongWalk := figure.Spec{Title: "f(t) along the walk" + suffix, XLabel: "t", YLabel: "f(t)", LogX: true,
		Series: []figure.Series{{Label: "f(t)", X: xs, Y: ys, Lines: true, Points: true}}}
	if len(errs) > 0 {
		s.addFigure("limit “"+name+"”: distance to the estimated limit"+suffix, figure.Spec{
			Title: "distance to the estimated limit" + suffix, XLabel: "t", YLabel: "|f(t) − L|", LogX: true, LogY: true,
			Series: []figure.Series{{Label: "|f(t) − L|", X: xs, Y: errs, Lines: true, Points: true}}})
	}
	s.addFigure("limit “"+name+"”: f(t) along the walk"+suffix, alongWalk)
}

// addFigure draws spec into the cell's figures. A figure that cannot be
// drawn (every point off a logarithmic axis, say) is left out: the table
// beside it has the numbers.
func (s *Session) addFigure(name string, spec figure.Spec) {
	if svg, err := figure.SVG(spec); err == nil {
		s.outcome.Figures = append(s.outcome.Figures, cells.Figure{Name: name, SVG: svg})
	}
}

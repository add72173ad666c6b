package session

import (
	"fmt"
	"math"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
	"assay/exact/limits"
	"assay/kernel/claim"
	"assay/kernel/figure"
	"assay/kernel/interp"
	"assay/kernel/values"
)

const limitDoc = `limit(name, f, toward=0, expect=None, steps=30, ratio=1/2, digits=None)
evaluates f(t) along t = toward + ratio^k (or ratio^-k toward infinity),
extrapolates the limit and its convergence order, and compares it with expect.`

var limitParams = []string{"name", "f", "toward=", "expect=", "steps=", "ratio=", "digits="}

// walkSpec is the parameter walk shared by limit() and sequence().
type walkSpec struct {
	toward limits.Toward
	value  *big.Rat
	ratio  *big.Rat
	steps  int
}

func walkArgs(fn string, a interp.Args) (walkSpec, error) {
	sp := walkSpec{toward: limits.ToZero, value: new(big.Rat), ratio: big.NewRat(1, 2), steps: 30}
	switch toward := a.Get("toward"); {
	case toward == nil:
	case toward == py.Object(values.Infinity{}):
		sp.toward = limits.ToInfinity
	default:
		if f, ok := toward.(py.Float); ok && math.IsInf(float64(f), 1) {
			sp.toward = limits.ToInfinity
			break
		}
		v, ok := values.ExactOf(toward)
		if !ok {
			return sp, py.ExceptionNewf(py.TypeError, "%s(): toward must be an exact number or infinity, got %s", fn, interp.TypeName(toward))
		}
		if v.Sign() != 0 {
			sp.toward, sp.value = limits.ToValue, v
		}
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
	if a.Given("expect") {
		var ok bool
		if expect, ok = values.RealOf(a.Get("expect")); !ok {
			return py.ExceptionNewf(py.TypeError, "limit(): expect must be an exact number or a real, got %s%s", interp.TypeName(a.Get("expect")), values.FloatHint(a.Get("expect")))
		}
	}
	// Extrapolation cancels digits: evaluate f three times more precisely than the target.
	prec := min(3*t.Bits+64, t.Cap)
	c.Method, c.Precision = "extrapolation", int(prec)
	ts, hs, vals, werr := s.walk(sp, f)
	floats, aerr := approximations(vals, prec, t.Cap)
	if floats == nil && aerr != nil {
		return aerr // f returned something that is not a number
	}
	if aerr != nil {
		werr, ts, hs = aerr, ts[:len(floats)], hs[:len(floats)]
	}
	var est limits.Estimate
	if len(floats) >= 3 {
		est = limits.Analyse(hs, floats)
		c.Method = est.Method
	}
	switch {
	case len(floats) < 3:
		c.Verdict, c.Residual = cells.Undecided, "too few values"
		c.Note = fmt.Sprintf("%v; fewer than 3 values, nothing to extrapolate", werr)
	case est.Diverges:
		c.Verdict, c.Residual = cells.Fails, est.Reason
		c.Note = "the quantity blows up: " + est.Reason + " (h is the distance to the target); not a limit"
	case est.Limit == nil:
		c.Verdict, c.Residual = cells.Undecided, "no convergence seen"
		c.Note = "no limit found: " + est.Reason
	case expect != nil:
		iv, err := expect.Approx(prec, t.Cap)
		if err != nil {
			return err
		}
		e := midpoint(iv, prec)
		verdict, digits, gap := limits.Compare(est, e)
		c.Residual = "gap " + gap.Text('e', 3)
		switch verdict {
		case "holds-to-digits":
			c.Verdict, c.Digits = cells.HoldsToDigits, min(digits, t.Digits())
		case "fails":
			c.Verdict = cells.Fails
		default:
			c.Verdict = cells.Undecided
		}
		c.Note = fmt.Sprintf("estimated limit %s (error estimate %s) against the expected %s; ", est.Limit.Text('g', min(est.Digits+2, 40)), est.ErrorEst.Text('e', 2), e.Text('g', 20)) + limitCaveat(est)
	default:
		c.Verdict, c.Digits = cells.HoldsToDigits, min(est.Digits, t.Digits())
		c.Residual = "error estimate " + est.ErrorEst.Text('e', 3)
		c.Note = fmt.Sprintf("converges; estimated limit %s; ", est.Limit.Text('g', min(est.Digits+2, 40))) + limitCaveat(est)
	}
	if werr != nil && len(floats) >= 3 {
		c.Note += fmt.Sprintf("; the walk stopped early: %v", werr)
	}
	s.limitTable(c.Name, ts, floats, est)
	return nil
}

// limitCaveat says how the estimate was made and what it is worth.
func limitCaveat(est limits.Estimate) string {
	order := ""
	if est.Order > 0 {
		order = fmt.Sprintf(", convergence order ≈ %.2f", est.Order)
	}
	return fmt.Sprintf("%s over %d steps%s; the digits come from the agreement of successive extrapolants — an estimate, not a certified bound", est.Method, len(est.Differences)+1, order)
}

// limitTable puts the walk's table and figure in the report.
func (s *Session) limitTable(name string, ts []*big.Rat, vals []*big.Float, est limits.Estimate) {
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
	s.outcome.Tables = append(s.outcome.Tables, cells.Table{
		Header: []string{"k", "t", "f(t)", "difference", extrapolant},
		Rows:   rows,
	})
	alongWalk := figure.Spec{Title: "f(t) along the walk", XLabel: "t", YLabel: "f(t)", LogX: true,
		Series: []figure.Series{{Label: "f(t)", X: xs, Y: ys, Lines: true, Points: true}}}
	if len(errs) > 0 {
		s.addFigure("limit “"+name+"”: distance to the estimated limit", figure.Spec{
			Title: "distance to the estimated limit", XLabel: "t", YLabel: "|f(t) − L|", LogX: true, LogY: true,
			Series: []figure.Series{{Label: "|f(t) − L|", X: xs, Y: errs, Lines: true, Points: true}}})
	}
	s.addFigure("limit “"+name+"”: f(t) along the walk", alongWalk)
}

// addFigure draws spec into the cell's figures. A figure that cannot be
// drawn (every point off a logarithmic axis, say) is left out: the table
// beside it has the numbers.
func (s *Session) addFigure(name string, spec figure.Spec) {
	if svg, err := figure.SVG(spec); err == nil {
		s.outcome.Figures = append(s.outcome.Figures, cells.Figure{Name: name, SVG: svg})
	}
}

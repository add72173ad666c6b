package kernel

import (
	"fmt"
	"math"
	"math/big"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
	"assay/exact/limits"
	"assay/kernel/figure"
)

// infinityMarker is the value of the builtin name infinity: limit(…, toward=infinity).
type infinityMarker struct{}

var infinityType = py.NewType("infinity", "The target of a parameter that grows without bound: limit(name, f, toward=infinity).")

// Type returns the marker's type.
func (infinityMarker) Type() *py.Type { return infinityType }

// M__repr__ prints "infinity".
func (infinityMarker) M__repr__() (py.Object, error) { return py.String("infinity"), nil }

// M__str__ prints "infinity".
func (infinityMarker) M__str__() (py.Object, error) { return py.String("infinity"), nil }

const limitDoc = `limit(name, f, toward=0, expect=None, steps=30, ratio=1/2, digits=None)
evaluates f(t) along t = toward + ratio^k (or ratio^-k toward infinity),
extrapolates the limit and its convergence order, and compares it with expect.`

// sequenceSpec is the parameter walk shared by limit() and sequence().
type sequenceSpec struct {
	toward limits.Toward
	value  *big.Rat
	ratio  *big.Rat
	steps  int
}

func sequenceArgs(fn string, toward, steps, ratio py.Object) (sequenceSpec, error) {
	sp := sequenceSpec{toward: limits.ToZero, value: new(big.Rat), ratio: big.NewRat(1, 2), steps: 30}
	switch {
	case toward == nil:
	case toward == py.Object(infinityMarker{}):
		sp.toward = limits.ToInfinity
	default:
		if f, ok := toward.(py.Float); ok && math.IsInf(float64(f), 1) {
			sp.toward = limits.ToInfinity
			break
		}
		v, ok := exactOf(toward)
		if !ok {
			return sp, py.ExceptionNewf(py.TypeError, "%s(): toward must be an exact number or infinity, got %s", fn, typeName(toward))
		}
		if v.Sign() != 0 {
			sp.toward, sp.value = limits.ToValue, v
		}
	}
	if steps != nil {
		n, err := intArg(fn, "steps", steps, 30)
		if err != nil || n < 3 || n > 400 {
			return sp, py.ExceptionNewf(py.ValueError, "%s(): steps must be between 3 and 400", fn)
		}
		sp.steps = int(n)
	}
	if ratio != nil {
		r, ok := exactOf(ratio)
		if !ok || r.Sign() <= 0 || r.Cmp(big.NewRat(1, 1)) >= 0 {
			return sp, py.ExceptionNewf(py.ValueError, "%s(): ratio must be an exact number between 0 and 1, e.g. frac(1, 2)", fn)
		}
		sp.ratio = r
	}
	return sp, nil
}

// walk evaluates f along the grid; it stops at the first step that raises
// and returns what it had, with the error.
func walk(sp sequenceSpec, f py.Object) (ts, hs []*big.Rat, values []py.Object, err error) {
	ts, hs, gerr := limits.Grid(sp.toward, sp.value, sp.ratio, sp.steps)
	if gerr != nil {
		return nil, nil, nil, py.ExceptionNewf(py.ValueError, "%v", gerr)
	}
	for k, t := range ts {
		v, err := py.Call(f, py.Tuple{newRational(t)}, nil)
		if err != nil {
			_, msg := describe(err, 0)
			return ts[:k], hs[:k], values, fmt.Errorf("f raised at step %d (t = %s): %s", k, exact.FormatRat(t), msg)
		}
		values = append(values, v)
	}
	return ts, hs, values, nil
}

// approximations turns values into big.Float midpoints at prec bits. A
// value that cannot be had (a domain error, the precision cap) ends the
// walk there: the values before it are returned with the reason.
func approximations(values []py.Object, prec, cap uint) ([]*big.Float, error) {
	out := make([]*big.Float, 0, len(values))
	for i, v := range values {
		x, ok := realOf(v)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "limit(): f returned %s at step %d, not an exact number or a real%s", typeName(v), i, floatHint(v))
		}
		iv, err := x.Approx(prec, cap)
		if err != nil {
			return out, fmt.Errorf("the value at step %d could not be certified: %v", i, err)
		}
		mid := new(big.Rat).Add(iv.Lo, iv.Hi)
		mid.Quo(mid, big.NewRat(2, 1))
		out = append(out, new(big.Float).SetPrec(prec).SetRat(mid))
	}
	return out, nil
}

func (s *Session) installLimits(b py.StringDict) {
	b["infinity"] = infinityMarker{}
	b["sequence"] = builtin("sequence", "sequence(f, toward=0, steps=30, ratio=1/2) -> [(t, f(t)), ...] along the same walk limit() takes", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("sequence", args, kw, []string{"f", "toward", "steps", "ratio"}, 1)
		if err != nil {
			return nil, err
		}
		if !callable(a[0]) {
			return nil, py.ExceptionNewf(py.TypeError, "sequence(f, …) needs a function of t")
		}
		sp, err := sequenceArgs("sequence", a[1], a[2], a[3])
		if err != nil {
			return nil, err
		}
		ts, _, values, werr := walk(sp, a[0])
		if werr != nil {
			return nil, py.ExceptionNewf(py.ValueError, "sequence(): %v", werr)
		}
		out := make([]py.Object, len(ts))
		for i := range ts {
			out[i] = py.Tuple{newRational(ts[i]), values[i]}
		}
		return py.NewListFromItems(out), nil
	})
}

func (s *Session) limit(line int, args py.Tuple, kw py.StringDict) (py.Object, error) {
	start := time.Now()
	a, err := bind("limit", args, kw, []string{"name", "f", "toward", "expect", "steps", "ratio", "digits"}, 2)
	if err != nil {
		return nil, err
	}
	c, err := s.newClaim("limit", a[0], line)
	if err != nil {
		return nil, err
	}
	if !callable(a[1]) {
		return nil, py.ExceptionNewf(py.TypeError, "limit(name, f, …) needs a function of t")
	}
	sp, err := sequenceArgs("limit", a[2], a[4], a[5])
	if err != nil {
		return nil, err
	}
	t, err := s.claimTarget(a[6])
	if err != nil {
		return nil, err
	}
	var expect *exact.Real
	if a[3] != nil && a[3] != py.None {
		var ok bool
		if expect, ok = realOf(a[3]); !ok {
			return nil, py.ExceptionNewf(py.TypeError, "limit(): expect must be an exact number or a real, got %s%s", typeName(a[3]), floatHint(a[3]))
		}
	}
	// Extrapolation cancels digits: evaluate f three times more precisely than the target.
	prec := min(3*t.bits+64, t.cap)
	c.Method, c.Precision = "extrapolation", int(prec)
	ts, hs, values, werr := walk(sp, a[1])
	floats, aerr := approximations(values, prec, t.cap)
	if floats == nil && aerr != nil {
		return nil, aerr // f returned something that is not a number
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
		iv, err := expect.Approx(prec, t.cap)
		if err != nil {
			return nil, realErr(err, t.cap)
		}
		mid := new(big.Rat).Add(iv.Lo, iv.Hi)
		e := new(big.Float).SetPrec(prec).SetRat(mid.Quo(mid, big.NewRat(2, 1)))
		verdict, digits, gap := limits.Compare(est, e)
		c.Residual = "gap " + gap.Text('e', 3)
		switch verdict {
		case "holds-to-digits":
			c.Verdict, c.Digits = cells.HoldsToDigits, min(digits, t.digits())
		case "fails":
			c.Verdict = cells.Fails
		default:
			c.Verdict = cells.Undecided
		}
		c.Note = fmt.Sprintf("estimated limit %s (error estimate %s) against the expected %s; ", est.Limit.Text('g', min(est.Digits+2, 40)), est.ErrorEst.Text('e', 2), e.Text('g', 20)) + limitCaveat(est)
	default:
		c.Verdict, c.Digits = cells.HoldsToDigits, min(est.Digits, t.digits())
		c.Residual = "error estimate " + est.ErrorEst.Text('e', 3)
		c.Note = fmt.Sprintf("converges; estimated limit %s; ", est.Limit.Text('g', min(est.Digits+2, 40))) + limitCaveat(est)
	}
	if werr != nil && len(floats) >= 3 {
		c.Note += fmt.Sprintf("; the walk stopped early: %v", werr)
	}
	s.limitTable(c.Name, ts, floats, est)
	return s.record(c, start), nil
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
func (s *Session) limitTable(name string, ts []*big.Rat, values []*big.Float, est limits.Estimate) {
	var rows [][]string
	var xs, ys, errs []float64
	for k := range values {
		row := []string{fmt.Sprint(k), exact.FormatRat(ts[k]), values[k].Text('g', 20), "", ""}
		if k > 0 && k-1 < len(est.Differences) && est.Differences[k-1] != nil {
			row[3] = est.Differences[k-1].Text('e', 3)
		}
		if k < len(est.Extrapolants) && est.Extrapolants[k] != nil {
			row[4] = est.Extrapolants[k].Text('g', 20)
		}
		rows = append(rows, row)
		x, _ := ts[k].Float64()
		y, _ := values[k].Float64()
		xs, ys = append(xs, x), append(ys, y)
		if est.Limit != nil {
			d, _ := new(big.Float).Sub(values[k], est.Limit).Float64()
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

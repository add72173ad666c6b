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
	a, err := bind("inequality", args, kw, []string{"name", "lesser", "greater", "over", "samples", "digits"}, 2)
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
	var results []slack
	var samples int64
	if a[3] != nil {
		if a[2] != nil || !callable(a[1]) || !callable(a[3]) {
			return nil, py.ExceptionNewf(py.TypeError, "inequality(name, f, over=g, samples=N) needs functions f and g and no third argument")
		}
		if samples, err = sampleCount("inequality", a[4]); err != nil {
			return nil, err
		}
		err = sweep(a[1], a[3], samples, nil, func(k int64, _, l, g py.Object) error {
			sl, err := measureSlack(t, l, g)
			if err != nil {
				return py.ExceptionNewf(py.TypeError, "sample %d: %v", k, err)
			}
			results = append(results, sl)
			return nil
		})
		if err != nil {
			return nil, err
		}
	} else {
		if a[2] == nil || a[4] != nil {
			return nil, py.ExceptionNewf(py.TypeError, "inequality(name, lesser, greater), or inequality(name, f, over=g, samples=N)")
		}
		sl, err := measureSlack(t, a[1], a[2])
		if err != nil {
			return nil, err
		}
		results = append(results, sl)
	}
	// The smallest slack decides; a violation anywhere fails the claim.
	worst, violations, loose := 0, 0, 0
	for k, sl := range results {
		if sl.lo.Cmp(results[worst].lo) < 0 {
			worst = k
		}
		switch sl.verdict {
		case cells.Fails:
			violations++
		case cells.HoldsToDigits:
			loose++
		}
	}
	w := results[worst]
	c.Residual = "slack " + w.text()
	c.Samples = int(samples)
	if !w.exact {
		c.Method, c.Precision = realMethod, int(t.bits)
	}
	every := "for this instance"
	if samples > 0 {
		every = fmt.Sprintf("on all %d samples (evidence, not a proof, of the general statement)", samples)
		if w.verdict != cells.Holds || violations > 0 {
			c.Worst = fmt.Sprintf("sample %d: %s", worst, clip(str(mustCall(a[3], worst)), 200))
		}
	}
	ratio := ""
	if w.ratio != "" {
		ratio = "; lesser/greater = " + w.ratio + " there"
	}
	switch {
	case violations > 0:
		c.Verdict = cells.Fails
		c.Note = fmt.Sprintf("violated: the smallest slack is certified negative%s; %d of %d instances violate it", ratio, violations, len(results))
		if w.exact {
			c.Note += " — an exact counterexample"
		}
	case loose > 0:
		c.Verdict, c.Digits = cells.HoldsToDigits, t.digits()
		c.Note = fmt.Sprintf("the smallest slack could not be certified non-negative: any violation is below 10^-%d%s; evidence, not a proof", t.digits(), ratio)
	default:
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("slack certified >= 0 %s; the smallest slack is shown%s", every, ratio)
	}
	return s.record(c, start), nil
}

// mustCall rebuilds sample k for the report (g is deterministic); on an
// error it gives the message instead.
func mustCall(g py.Object, k int) py.Object {
	v, err := py.Call(g, py.Tuple{py.Int(k)}, nil)
	if err != nil {
		_, msg := describe(err, 0)
		return py.String(msg)
	}
	return v
}

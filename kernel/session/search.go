package session

import (
	"fmt"
	"math"
	"math/big"
	"slices"
	"strings"

	"github.com/go-python/gpython/py"
	"gonum.org/v1/gonum/optimize"

	"assay/cells"
	"assay/exact"
	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

// searchEvaluations bounds the evaluations of f from one starting sample.
const searchEvaluations = 400

// finestDenominator is the grid the search steers on; the points it
// accepts are on the box's own grid.
const finestDenominator = 1 << 24

// userFamily is why a search does not move the samples of a function g(k).
const userFamily = "over= is a function g(k), whose only parameter is k, so moving a sample's numbers could leave the family; use over=box(...) and build the configuration in f"

// search hunts for a counterexample to a sampled inequality over a box
// family, the one kind of family whose own parameters the search knows:
// the box point's coordinates. From each of the samples with the smallest
// slack it runs Nelder–Mead (gonum) over them, minimising the relative
// slack (greater − lesser)/(|greater| + |lesser|), which is blind to
// scale, and steering away from points that do not meet the hypothesis.
// The best point is then rounded to the simplest rationals of the box's
// grid that keep it violating; a point is accepted only when it is in the
// box, meets the hypothesis and its slack is decided exactly, so floats
// only steer. Starts are split among workers like samples; a violation is
// confirmed again here from the printed point before it is reported.
func (s *Session) search(name string, line int, t claim.Target, fam family, starts []claim.SampleSlack) (*claim.SearchTally, error) {
	b, ok := fam.g.(*values.Box)
	if !ok {
		return &claim.SearchTally{Skipped: userFamily}, nil
	}
	ask := claim.Ask{Claim: name, Phase: claim.PhaseSearch, Line: line, Samples: int64(len(starts))}
	tally, err := s.distribute(ask, func(sh claim.Share) claim.Tally {
		s.env.Sweeping = true
		defer func() { s.env.Sweeping = false }()
		st := &claim.SearchTally{}
		s.forShare(ask, sh, func(j int64) error {
			best, evals := s.descend(t, fam, b, starts[j].K)
			st.Starts++
			st.Evaluations += evals
			if best != nil {
				best.K = j
				st.Keep(best, starts[j].K)
			}
			return nil
		})
		return claim.Tally{Search: st}
	})
	if err != nil {
		return nil, err
	}
	st := tally.Search
	if st == nil {
		return nil, py.ExceptionNewf(py.RuntimeError, "claim %q: the search gave no tally", name)
	}
	if st.Best != nil && st.Best.Verdict == cells.Fails && st.Skipped == "" {
		if err := s.confirmPoint(t, fam, b, st.Best.Sample); err != nil {
			return nil, py.ExceptionNewf(py.RuntimeError, "claim %q: the counterexample the search printed, %s, does not confirm when evaluated again: %v", name, st.Best.Sample, err)
		}
	}
	return st, nil
}

// confirmPoint evaluates the claim again at a point printed as cell code
// ("[p1, p2, …]"): it must be a point of the box, meet the hypothesis and
// violate the inequality, all decided exactly.
func (s *Session) confirmPoint(t claim.Target, fam family, b *values.Box, printed string) error {
	body, ok := strings.CutPrefix(printed, "[")
	body, ok2 := strings.CutSuffix(body, "]")
	if !ok || !ok2 {
		return fmt.Errorf("not a list of numbers")
	}
	var q []*big.Rat
	for _, part := range strings.Split(body, ",") {
		v, err := exact.ParseRat(part)
		if err != nil {
			return err
		}
		q = append(q, v)
	}
	sl, _, ok := s.exactSlack(t, fam, b, q)
	if !ok || sl.Verdict != cells.Fails {
		return fmt.Errorf("it is not a violation in the box that meets the hypothesis")
	}
	return nil
}

// descend runs one local search from sample k and returns the most
// violating point it can confirm exactly (or, failing a violation, its
// smallest exact slack), with the evaluations it spent.
func (s *Session) descend(t claim.Target, fam family, b *values.Box, k int64) (*claim.SampleSlack, int64) {
	start, ok := coordinates(sampleAt(fam.g, k))
	if !ok || len(start) == 0 {
		return nil, 0
	}
	var evals int64
	scale := 0.0
	for _, v := range start {
		scale = max(scale, math.Abs(v))
	}
	objective := func(x []float64) float64 {
		evals++
		v, ok := s.relativeSlack(fam, b, round(b, x, finestDenominator))
		if !ok {
			return 2 // worse than any relative slack, which lies in [-1, 1]
		}
		return v
	}
	// An optimizer that stops early still leaves its best point; one that
	// fails leaves the start.
	res, _ := optimize.Minimize(optimize.Problem{Func: objective}, slices.Clone(start),
		&optimize.Settings{FuncEvaluations: searchEvaluations}, &optimize.NelderMead{SimplexSize: 0.05 * max(scale, 1)})
	best := start
	if res != nil && res.F < 2 {
		best = res.X
	}
	// The simplest grid points near the best point that still violate are
	// the counterexample; without a violation, the finest rounding.
	var kept *claim.SampleSlack
	for den := int64(1); ; den = min(2*den, b.Denom) {
		sl, text, ok := s.exactSlack(t, fam, b, round(b, best, den))
		if ok {
			sl.Sample = text
			kept = &sl
			if sl.Verdict == cells.Fails {
				break
			}
		}
		if den == b.Denom {
			break
		}
	}
	return kept, evals
}

// coordinates are a box point's numbers as floats, to steer by.
func coordinates(point py.Object) ([]float64, bool) {
	items, ok := interp.Items(point)
	if !ok {
		return nil, false
	}
	x := make([]float64, len(items))
	for i, it := range items {
		v, ok := values.ExactOf(it)
		if !ok {
			return nil, false
		}
		x[i], _ = v.Float64()
	}
	return x, true
}

// inBox reports whether the rationals q are in the box's range, dim of
// them, each in [lo, hi]; with grid, also with a denominator at most
// denom, so a point of the family. The search steers off the grid.
func inBox(b *values.Box, q []*big.Rat, grid bool) bool {
	if len(q) != b.Dim {
		return false
	}
	lo, hi := big.NewRat(b.Lo, 1), big.NewRat(b.Hi, 1)
	for _, v := range q {
		if v.Cmp(lo) < 0 || v.Cmp(hi) > 0 || grid && v.Denom().Cmp(big.NewInt(b.Denom)) > 0 {
			return false
		}
	}
	return true
}

// round clamps x to the box's range and rounds each number to the
// nearest multiple of 1/den: a point of the box when den <= its denom.
func round(b *values.Box, x []float64, den int64) []*big.Rat {
	q := make([]*big.Rat, len(x))
	for i, v := range x {
		v = math.Min(math.Max(v, float64(b.Lo)), float64(b.Hi))
		n := math.Round(v * float64(den))
		if math.IsNaN(n) || math.IsInf(n, 0) || math.Abs(n) > 1<<62 {
			n = 0
		}
		q[i] = big.NewRat(int64(n), den)
	}
	return q
}

// relativeSlack evaluates f at the numbers q, to steer the search.
func (s *Session) relativeSlack(fam family, box *values.Box, q []*big.Rat) (float64, bool) {
	_, l, g, ok := s.evaluate(fam, box, q, false)
	if !ok {
		return 0, false
	}
	a, ok1 := values.RealOf(l)
	b, ok2 := values.RealOf(g)
	if !ok1 || !ok2 {
		return 0, false
	}
	ea, err1 := a.Enclose(80)
	eb, err2 := b.Enclose(80)
	if err1 != nil || err2 != nil {
		return 0, false
	}
	fa, fb := center(ea), center(eb)
	if d := math.Abs(fa) + math.Abs(fb); d > 0 && !math.IsInf(d, 0) {
		return (fb - fa) / d, true
	}
	return 0, fa == 0 && fb == 0
}

// center is the middle of an enclosure as a float64.
func center(iv exact.Interval) float64 {
	lo, _ := iv.Lo.Float64()
	hi, _ := iv.Hi.Float64()
	return lo/2 + hi/2
}

// evaluate builds the point q and returns it with f's two sides there; ok
// is false where the point is not in the box (on its grid too, with grid),
// does not meet the hypothesis, or f cannot be evaluated.
func (s *Session) evaluate(fam family, b *values.Box, q []*big.Rat, grid bool) (sample, lesser, greater py.Object, ok bool) {
	if !inBox(b, q, grid) {
		return nil, nil, nil, false
	}
	point := make([]py.Object, len(q))
	for i, v := range q {
		point[i] = s.env.Rational(v)
	}
	sample = py.NewListFromItems(point)
	if fam.h != nil {
		if met, _ := meets(fam.h, sample); !met {
			return nil, nil, nil, false
		}
	}
	res, err := py.Call(fam.f, py.Tuple{sample}, nil)
	if err != nil {
		return nil, nil, nil, false
	}
	lesser, greater, err = pair(res, "f")
	return sample, lesser, greater, err == nil
}

// exactSlack decides the slack at the box point q as the sweep does, and
// prints the point as cell code.
func (s *Session) exactSlack(t claim.Target, fam family, b *values.Box, q []*big.Rat) (claim.SampleSlack, string, bool) {
	sample, l, g, ok := s.evaluate(fam, b, q, true)
	if !ok {
		return claim.SampleSlack{}, "", false
	}
	sl, err := slack(t, l, g)
	if err != nil {
		return claim.SampleSlack{}, "", false
	}
	text, _ := code(sample) // a box point: rationals, always code
	return sl.Record(0), text, true
}

package session

import (
	"fmt"
	"math"
	"math/big"

	"github.com/go-python/gpython/py"
	"gonum.org/v1/gonum/optimize"

	"assay/cells"
	"assay/exact"
	"assay/exact/geom"
	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

// searchEvaluations bounds the evaluations of f from one starting sample.
const searchEvaluations = 400

// search hunts for a counterexample to a sampled inequality. From each of
// the samples with the smallest slack it runs Nelder–Mead (gonum) over the
// sample's numbers — a box point's coordinates, a simplex's vertices —
// minimising the relative slack (greater − lesser)/(|greater| + |lesser|),
// which is blind to scale. The best point is then rounded to the simplest
// rationals that keep it violating and its slack is decided exactly, so a
// counterexample is always an exact rational configuration; floats only
// steer. Starts are split among workers like samples.
func (s *Session) search(name string, line int, t claim.Target, f, g py.Object, starts []claim.SampleSlack) (*claim.SearchTally, error) {
	// A sample the search cannot move is the notebook's error, found
	// before any work is split.
	if _, err := s.parametrize(sampleAt(g, starts[0].K), g); err != nil {
		return nil, err
	}
	ask := claim.Ask{Claim: name, Phase: claim.PhaseSearch, Line: line, Samples: int64(len(starts))}
	tally, err := s.distribute(ask, func(sh claim.Share) claim.Tally {
		s.env.Sweeping = true
		defer func() { s.env.Sweeping = false }()
		st := &claim.SearchTally{}
		s.forShare(ask, sh, func(j int64) error {
			best, evals := s.descend(t, f, g, starts[j].K)
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
	if tally.Search == nil {
		return nil, py.ExceptionNewf(py.RuntimeError, "claim %q: the search gave no tally", name)
	}
	return tally.Search, nil
}

// params are the numbers of a sample that a search may move, and how to
// make a sample from moved numbers.
type params struct {
	x      []float64
	lo, hi float64 // bounds on every number (±Inf when the family has none)
	den    int64   // the finest denominator a point may have
	build  func(q []*big.Rat) (py.Object, error)
}

// finestDenominator is the grid a search rounds to when the family sets none.
const finestDenominator = 1 << 24

// parametrize finds the numbers of a sample: exact numbers, lists and
// tuples of them, and simplices given by points.
func (s *Session) parametrize(sample, family py.Object) (params, error) {
	// Within a box family the search stays in the box and on its grid, so
	// a counterexample is a member of the family the claim is about.
	p := params{lo: math.Inf(-1), hi: math.Inf(1), den: finestDenominator}
	if b, ok := family.(*values.Box); ok {
		p.lo, p.hi, p.den = float64(b.Lo), float64(b.Hi), b.Denom
	}
	build, err := s.collect(sample, &p.x)
	if err != nil {
		return params{}, py.ExceptionNewf(py.TypeError, "search=True moves the numbers of a sample, so samples must be exact numbers, lists of them or simplices given by points; %s", err)
	}
	p.build = func(q []*big.Rat) (py.Object, error) { return build(&q) }
	return p, nil
}

// collect appends o's numbers to x and returns how to rebuild o from a
// list of numbers in the same order, consuming them.
func (s *Session) collect(o py.Object, x *[]float64) (func(q *[]*big.Rat) (py.Object, error), error) {
	if _, isBool := o.(py.Bool); !isBool {
		if v, ok := values.ExactOf(o); ok {
			f, _ := v.Float64()
			*x = append(*x, f)
			return func(q *[]*big.Rat) (py.Object, error) {
				v := (*q)[0]
				*q = (*q)[1:]
				return s.env.Rational(v), nil
			}, nil
		}
	}
	switch v := o.(type) {
	case *py.List, py.Tuple:
		items, _ := interp.Items(v)
		parts := make([]func(*[]*big.Rat) (py.Object, error), len(items))
		for i, it := range items {
			var err error
			if parts[i], err = s.collect(it, x); err != nil {
				return nil, err
			}
		}
		_, isTuple := v.(py.Tuple)
		return func(q *[]*big.Rat) (py.Object, error) {
			out := make([]py.Object, len(parts))
			for i, part := range parts {
				var err error
				if out[i], err = part(q); err != nil {
					return nil, err
				}
			}
			if isTuple {
				return py.Tuple(out), nil
			}
			return py.NewListFromItems(out), nil
		}, nil
	case *values.Simplex:
		pts, ok := v.Value().Points()
		if !ok {
			return nil, fmt.Errorf("a simplex given by squared distances has no coordinates to move")
		}
		dim := 0
		for _, pt := range pts {
			dim = len(pt)
			for _, c := range pt {
				f, _ := c.Float64()
				*x = append(*x, f)
			}
		}
		return func(q *[]*big.Rat) (py.Object, error) {
			moved := make([][]*big.Rat, len(pts))
			for i := range moved {
				moved[i] = (*q)[:dim]
				*q = (*q)[dim:]
			}
			g, err := geom.FromPoints(moved)
			if err != nil {
				return nil, err
			}
			return s.env.Simplex(g), nil
		}, nil
	}
	return nil, fmt.Errorf("this one holds %s", interp.TypeName(o))
}

// descend runs one local search from sample k and returns the most
// violating point it can confirm exactly (or, failing a violation, its
// smallest exact slack), with the evaluations it spent.
func (s *Session) descend(t claim.Target, f, g py.Object, k int64) (*claim.SampleSlack, int64) {
	p, err := s.parametrize(sampleAt(g, k), g)
	if err != nil || len(p.x) == 0 {
		return nil, 0
	}
	var evals int64
	scale := 0.0
	for _, v := range p.x {
		scale = max(scale, math.Abs(v))
	}
	objective := func(x []float64) float64 {
		evals++
		v, ok := s.relativeSlack(f, p, p.round(x, finestDenominator))
		if !ok {
			return 2 // worse than any relative slack, which lies in [-1, 1]
		}
		return v
	}
	start := append([]float64(nil), p.x...)
	// An optimizer that stops early still leaves its best point; one that
	// fails leaves the start.
	res, _ := optimize.Minimize(optimize.Problem{Func: objective}, start,
		&optimize.Settings{FuncEvaluations: searchEvaluations}, &optimize.NelderMead{SimplexSize: 0.05 * max(scale, 1)})
	best := start
	if res != nil && res.F < 2 {
		best = res.X
	}
	// The simplest rationals near the best point that still violate are
	// the counterexample; without a violation, the finest rounding.
	var kept *claim.SampleSlack
	for den := int64(1); ; den = min(2*den, p.den) {
		sl, text, ok := s.exactSlack(t, f, p, p.round(best, den))
		if ok {
			sl.Sample = "found by search: " + claim.Clip(text, 400)
			kept = &sl
			if sl.Verdict == cells.Fails {
				break
			}
		}
		if den == p.den {
			break
		}
	}
	return kept, evals
}

// round clamps x to the family's bounds and rounds each number to the
// nearest multiple of 1/den.
func (p params) round(x []float64, den int64) []*big.Rat {
	q := make([]*big.Rat, len(x))
	for i, v := range x {
		v = math.Min(math.Max(v, p.lo), p.hi)
		n := math.Round(v * float64(den))
		if math.IsNaN(n) || math.IsInf(n, 0) || math.Abs(n) > 1<<62 {
			n = 0
		}
		q[i] = big.NewRat(int64(n), den)
	}
	return q
}

// relativeSlack evaluates f at the numbers q, to steer the search.
func (s *Session) relativeSlack(f py.Object, p params, q []*big.Rat) (float64, bool) {
	_, l, g, ok := s.evaluate(f, p, q)
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

// evaluate builds the sample at the numbers q and returns it with f's two
// sides there; ok is false where the sample or f cannot be evaluated.
func (s *Session) evaluate(f py.Object, p params, q []*big.Rat) (sample, lesser, greater py.Object, ok bool) {
	sample, err := p.build(q)
	if err != nil {
		return nil, nil, nil, false
	}
	res, err := py.Call(f, py.Tuple{sample}, nil)
	if err != nil {
		return nil, nil, nil, false
	}
	lesser, greater, err = pair(res, "f")
	return sample, lesser, greater, err == nil
}

// exactSlack decides the slack at the numbers q as the sweep does, and
// prints the sample there.
func (s *Session) exactSlack(t claim.Target, f py.Object, p params, q []*big.Rat) (claim.SampleSlack, string, bool) {
	sample, l, g, ok := s.evaluate(f, p, q)
	if !ok {
		return claim.SampleSlack{}, "", false
	}
	sl, err := slack(t, l, g)
	if err != nil {
		return claim.SampleSlack{}, "", false
	}
	return sl.Record(0), interp.Str(sample), true
}

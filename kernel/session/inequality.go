package session

import (
	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

const inequalityDoc = `inequality(name, lesser, greater) checks lesser <= greater (exactly, or
certified for reals); inequality(name, f, over=g, samples=N) checks f(g(k)) =
(lesser, greater) for k = 0..N-1 and reports the smallest relative slack
(rank="absolute": the smallest slack); given=h counts only the samples where
h(sample) is True; search=True hunts for a counterexample in a box family.`

var inequalityParams = []string{"name", "lesser", "greater=", "over=", "samples=", "digits=", "search=", "given=", "rank="}

// absoluteRank reads rank=: "relative" (the default) or "absolute".
func absoluteRank(a interp.Args) (bool, error) {
	switch r := a.Get("rank"); {
	case r == nil || r == py.None:
		return false, nil
	case r == py.String("relative"):
		return false, nil
	case r == py.String("absolute"):
		return true, nil
	default:
		return false, py.ExceptionNewf(py.ValueError, "inequality(): rank must be \"relative\" or \"absolute\", got %s", interp.Str(r))
	}
}

// slack decides lesser <= greater for exact numbers and reals.
func slack(t claim.Target, lesser, greater py.Object) (claim.Slack, error) {
	a, ok1 := values.RealOf(lesser)
	b, ok2 := values.RealOf(greater)
	if !ok1 {
		return claim.Slack{}, sideError(lesser)
	}
	if !ok2 {
		return claim.Slack{}, sideError(greater)
	}
	sl, err := claim.MeasureSlack(a, b, t)
	return sl, interp.Exception(err)
}

func (s *Session) inequality(c *cells.Claim, t claim.Target, a interp.Args) error {
	search, err := a.Bool("search", false)
	if err != nil {
		return err
	}
	absolute, err := absoluteRank(a)
	if err != nil {
		return err
	}
	h, err := hypothesis("inequality", a)
	if err != nil {
		return err
	}
	it := &claim.InequalityTally{Absolute: absolute}
	var samples, counted int64
	var found *claim.SearchTally
	notes := ""
	if a.Has("over") {
		fam := family{f: a.Get("lesser"), g: a.Get("over"), h: h}
		if a.Has("greater") || !interp.Callable(fam.f) || !interp.Callable(fam.g) {
			return py.ExceptionNewf(py.TypeError, "inequality(name, f, over=g, samples=N) needs functions f and g and no third argument")
		}
		if samples, err = sampleCount("inequality", a.Get("samples")); err != nil {
			return err
		}
		ask := claim.Ask{Claim: c.Name, Phase: claim.PhaseSweep, Line: c.Line, Samples: samples}
		fresh := func() sampleTally {
			return &inequalitySweep{t: t, part: &claim.InequalityTally{Absolute: absolute}}
		}
		tally, err := s.sweepClaim(ask, fam, fresh)
		if err != nil {
			return err
		}
		if noneMet(c, tally, samples) {
			return nil
		}
		counted = met(tally, samples)
		if tally.Inequality != nil {
			it = tally.Inequality
		}
		if err := s.confirmShown(ask, fam, tally, it.Shown(), fresh, func(k int64, got claim.Tally) (string, string) {
			return got.Inequality.RecordAt(k, it), it.RecordAt(k, it)
		}); err != nil {
			return err
		}
		notes = givenNote(tally, samples) + printedNote(tally) + mergedNote(tally)
		if search && it.Violations == 0 && len(it.Smallest) > 0 {
			if found, err = s.search(c.Name, c.Line, t, fam, it.Smallest); err != nil {
				return err
			}
		}
	} else {
		if !a.Has("greater") || a.Has("samples") || search || a.Has("rank") {
			return py.ExceptionNewf(py.TypeError, "inequality(name, lesser, greater), or inequality(name, f, over=g, samples=N, search=False, rank=\"relative\")")
		}
		sl, err := slack(t, a.Get("lesser"), a.Get("greater"))
		if err != nil {
			return err
		}
		it.Add(0, sl)
	}
	g := a.Get("over")
	claim.JudgeInequality(c, it, found, samples, counted, t, func(k int64) (string, string) { return shownSample(g, k) })
	c.Note += notes
	return nil
}

// inequalitySweep fills the tally of one share of a sampled inequality.
type inequalitySweep struct {
	t    claim.Target
	part *claim.InequalityTally
}

func (w *inequalitySweep) raised(k int64, msg string) {
	w.part.Raised++
	if w.part.FirstRaise == nil {
		w.part.FirstRaise = &claim.SampleNote{K: k, Text: claim.Clip(msg, 160)}
	}
}

func (w *inequalitySweep) visit(k int64, _, lesser, greater py.Object) error {
	sl, err := slack(w.t, lesser, greater)
	if err != nil {
		return py.ExceptionNewf(py.TypeError, "sample %d: %v", k, err)
	}
	w.part.Add(k, sl)
	return nil
}

func (w *inequalitySweep) into(t *claim.Tally) { t.Inequality = w.part }

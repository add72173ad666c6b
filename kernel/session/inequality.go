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
(lesser, greater) for k = 0..N-1 and reports the smallest slack.`

var inequalityParams = []string{"name", "lesser", "greater=", "over=", "samples=", "digits=", "search="}

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
	it := &claim.InequalityTally{}
	var samples int64
	var found *claim.SearchTally
	printed := ""
	if a.Has("over") {
		f, g := a.Get("lesser"), a.Get("over")
		if a.Has("greater") || !interp.Callable(f) || !interp.Callable(g) {
			return py.ExceptionNewf(py.TypeError, "inequality(name, f, over=g, samples=N) needs functions f and g and no third argument")
		}
		if samples, err = sampleCount("inequality", a.Get("samples")); err != nil {
			return err
		}
		ask := claim.Ask{Claim: c.Name, Phase: claim.PhaseSweep, Line: c.Line, Samples: samples}
		fresh := func() sampleTally { return &inequalitySweep{t: t, part: &claim.InequalityTally{}} }
		tally, err := s.sweepClaim(ask, f, g, fresh)
		if err != nil {
			return err
		}
		if tally.Inequality != nil {
			it = tally.Inequality
		}
		if err := s.confirmShown(ask, f, g, tally, it.Shown(), fresh, func(k int64, got claim.Tally) (string, string) {
			return got.Inequality.RecordAt(k, it), it.RecordAt(k, it)
		}); err != nil {
			return err
		}
		printed = printedNote(tally) + mergedNote(tally)
		if search && it.Violations == 0 && len(it.Smallest) > 0 {
			if found, err = s.search(c.Name, c.Line, t, f, g, it.Smallest); err != nil {
				return err
			}
		}
	} else {
		if !a.Has("greater") || a.Has("samples") || search {
			return py.ExceptionNewf(py.TypeError, "inequality(name, lesser, greater), or inequality(name, f, over=g, samples=N, search=False)")
		}
		sl, err := slack(t, a.Get("lesser"), a.Get("greater"))
		if err != nil {
			return err
		}
		it.Add(0, sl)
	}
	g := a.Get("over")
	claim.JudgeInequality(c, it, found, samples, t, func(k int64) string { return sampleText(g, k) })
	c.Note += printed
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

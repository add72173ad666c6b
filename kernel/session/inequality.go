package session

import (
	"time"

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
		tally, err := s.distribute(ask, func(sh claim.Share) claim.Tally {
			began := time.Now()
			part := &claim.InequalityTally{}
			done, failed := s.sweep(ask, sh, f, g, func(k int64, msg string) {
				part.Raised++
				if part.FirstRaise == nil {
					part.FirstRaise = &claim.SampleNote{K: k, Text: claim.Clip(msg, 160)}
				}
			}, func(k int64, _, l, gr py.Object) error {
				sl, err := slack(t, l, gr)
				if err != nil {
					return py.ExceptionNewf(py.TypeError, "sample %d: %v", k, err)
				}
				part.Add(k, sl)
				return nil
			})
			return claim.Tally{Computed: done, Seconds: time.Since(began).Seconds(), Err: failed, Inequality: part, Printed: s.printed}
		})
		if err != nil {
			return err
		}
		if tally.Err != nil {
			return raise(tally.Err)
		}
		if tally.Inequality != nil {
			it = tally.Inequality
		}
		printed = printedNote(tally)
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

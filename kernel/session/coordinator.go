package session

import (
	"time"

	"github.com/go-python/gpython/py"

	"assay/kernel/claim"
)

// Coordinator is the session's side of its driver: it says which share of
// a sampled claim this session computes, and merges the shares.
type Coordinator interface {
	// Exchange sends an ask (no tally) or the tally of a share, and
	// returns the driver's answer.
	Exchange(e claim.Exchange) (claim.Answer, error)
	// Progress reports how far a sweep has got; it is not answered.
	Progress(p claim.Progress)
}

// solo is the coordinator of a session without a driver: it computes
// every sample itself.
type solo struct{}

func (solo) Exchange(e claim.Exchange) (claim.Answer, error) {
	if e.Tally == nil {
		return claim.Answer{Share: &claim.Share{Index: 0, Count: 1}}, nil
	}
	return claim.Answer{Result: e.Tally}, nil
}

func (solo) Progress(claim.Progress) {}

// distribute runs one exchange: the driver says which share to compute,
// or already holds the result (an earlier run, a merged part); compute
// makes the share's tally, and the driver merges the shares.
func (s *Session) distribute(a claim.Ask, compute func(claim.Share) claim.Tally) (claim.Tally, error) {
	ans, err := s.coord.Exchange(claim.Exchange{Ask: a})
	if err == nil && ans.Result != nil {
		// Computed elsewhere (merged parts): the claim's time includes it.
		s.elsewhere += ans.Result.Seconds
	}
	if err == nil && ans.Error == "" && ans.Result == nil {
		if ans.Share == nil || ans.Share.Count < 1 || ans.Share.Index < 0 {
			return claim.Tally{}, py.ExceptionNewf(py.RuntimeError, "the driver gave no valid share for claim %q", a.Claim)
		}
		t := compute(*ans.Share)
		ans, err = s.coord.Exchange(claim.Exchange{Ask: a, Tally: &t})
	}
	switch {
	case err != nil:
		return claim.Tally{}, py.ExceptionNewf(py.RuntimeError, "claim %q: %v", a.Claim, err)
	case ans.Error != "":
		return claim.Tally{}, py.ExceptionNewf(py.RuntimeError, "%s", ans.Error)
	case ans.Result == nil:
		return claim.Tally{}, py.ExceptionNewf(py.RuntimeError, "the driver gave no result for claim %q", a.Claim)
	}
	return *ans.Result, nil
}

// StageEvery is how often at most a long computation's stage is passed
// to the driver.
const StageEvery = 100 * time.Millisecond

// stage passes the stage of a long computation (values.Env.Stage) to the
// driver, at most every StageEvery: a computation reports each step, so
// the stage the driver holds is at most that much behind. "" (the
// computation returned) is passed at once when a stage was.
func (s *Session) stage(st string) {
	if st == s.stageSent || st != "" && time.Since(s.stageAt) < StageEvery {
		return
	}
	s.stageSent, s.stageAt = st, time.Now()
	s.coord.Progress(claim.Progress{Stage: st})
}

// ProgressEvery is how often a sweep reports how far it has got.
const ProgressEvery = 250 * time.Millisecond

// forShare calls do for each item of the share, in increasing order, and
// reports progress; it stops at the first error.
func (s *Session) forShare(a claim.Ask, sh claim.Share, do func(k int64) error) (done int64, err error) {
	total := sh.Items(a.Samples)
	last := time.Now()
	for k := sh.Index; k < a.Samples; k += sh.Count {
		if err := do(k); err != nil {
			return done, err
		}
		done++
		if a.Phase == claim.PhaseSweep && time.Since(last) > ProgressEvery {
			last = time.Now()
			s.coord.Progress(claim.Progress{Claim: a.Claim, Done: done, Total: total})
		}
	}
	return done, nil
}

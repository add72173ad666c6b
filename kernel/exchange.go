package kernel

import (
	"bufio"
	"encoding/json"
	"fmt"
	"time"

	"github.com/go-python/gpython/py"
)

// Ask names one exchange between a kernel and its driver: the sweep of a
// sampled claim, or the counterexample search after it.
type Ask struct {
	Claim   string `json:"claim"`
	Phase   string `json:"phase"` // phaseSweep or phaseSearch
	Line    int    `json:"line"`
	Samples int64  `json:"samples"` // items to split: samples, or search starts
}

// The phases of a sampled claim.
const (
	phaseSweep  = "sweep"
	phaseSearch = "search"
)

func (a Ask) key() string { return a.Claim + "\x00" + a.Phase }

// Share is the part of an exchange one kernel computes: the items k with
// k % Count == Index.
type Share struct {
	Index int64 `json:"index"`
	Count int64 `json:"count"`
}

// Exchange is a kernel's message to its driver in the middle of a cell:
// an ask (no tally yet) or the tally of the share it was given.
type Exchange struct {
	Ask
	Tally *Tally `json:"tally,omitempty"`
}

// Answer is the driver's reply to an Exchange: the share to compute, or
// the merged tally of all shares.
type Answer struct {
	Share  *Share `json:"share,omitempty"`
	Result *Tally `json:"result,omitempty"`
	Error  string `json:"error,omitempty"`
}

// Progress is a kernel's count of the samples it has done in a sweep.
type Progress struct {
	Claim string `json:"claim"`
	Done  int64  `json:"done"`
	Total int64  `json:"total"` // samples in this kernel's share
}

// coordinator is the session's side of its driver.
type coordinator interface {
	exchange(e Exchange) (Answer, error)
	progress(p Progress)
}

// solo is the coordinator of a session without a driver: it computes
// every sample itself.
type solo struct{}

func (solo) exchange(e Exchange) (Answer, error) {
	if e.Tally == nil {
		return Answer{Share: &Share{Index: 0, Count: 1}}, nil
	}
	return Answer{Result: e.Tally}, nil
}

func (solo) progress(Progress) {}

// wire is the coordinator of a kernel process: exchanges travel as reply
// lines, and the driver's answer comes back as the next request line.
type wire struct {
	sc   *bufio.Scanner
	send func(Reply) error
}

func (w wire) exchange(e Exchange) (Answer, error) {
	if err := w.send(Reply{Version: Version, Exchange: &e}); err != nil {
		return Answer{}, err
	}
	if !w.sc.Scan() {
		return Answer{}, fmt.Errorf("the driver went away during an exchange")
	}
	var req Request
	if err := json.Unmarshal(w.sc.Bytes(), &req); err != nil || req.Op != "answer" || req.Answer == nil {
		return Answer{}, fmt.Errorf("the driver sent %.80q where an answer to an exchange was due", w.sc.Text())
	}
	return *req.Answer, nil
}

func (w wire) progress(p Progress) { w.send(Reply{Version: Version, Progress: &p}) }

// distribute runs one exchange: the driver says which share to compute,
// or already holds the result (an earlier run, a merged part); compute
// makes the share's tally, and the driver merges the shares.
func (s *Session) distribute(a Ask, compute func(Share) Tally) (Tally, error) {
	ans, err := s.coord.exchange(Exchange{Ask: a})
	if err == nil && ans.Result != nil {
		// Computed elsewhere (merged parts): the claim's time includes it.
		s.elsewhere += ans.Result.Seconds
	}
	if err == nil && ans.Error == "" && ans.Result == nil {
		if ans.Share == nil || ans.Share.Count < 1 || ans.Share.Index < 0 {
			return Tally{}, py.ExceptionNewf(py.RuntimeError, "the driver gave no valid share for claim %q", a.Claim)
		}
		t := compute(*ans.Share)
		ans, err = s.coord.exchange(Exchange{Ask: a, Tally: &t})
	}
	switch {
	case err != nil:
		return Tally{}, py.ExceptionNewf(py.RuntimeError, "claim %q: %v", a.Claim, err)
	case ans.Error != "":
		return Tally{}, py.ExceptionNewf(py.RuntimeError, "%s", ans.Error)
	case ans.Result == nil:
		return Tally{}, py.ExceptionNewf(py.RuntimeError, "the driver gave no result for claim %q", a.Claim)
	}
	return *ans.Result, nil
}

// progressEvery is how often a sweep reports how far it has got.
const progressEvery = 250 * time.Millisecond

// forShare calls do for each item of the share, in increasing order, and
// reports progress; it stops at the first error.
func (s *Session) forShare(a Ask, sh Share, do func(k int64) error) (done int64, err error) {
	total := (a.Samples - sh.Index + sh.Count - 1) / sh.Count
	last := time.Now()
	for k := sh.Index; k < a.Samples; k += sh.Count {
		if err := do(k); err != nil {
			return done, err
		}
		done++
		if a.Phase == phaseSweep && time.Since(last) > progressEvery {
			last = time.Now()
			s.coord.progress(Progress{Claim: a.Claim, Done: done, Total: total})
		}
	}
	return done, nil
}

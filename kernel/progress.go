package kernel

import (
	"fmt"
	"io"
	"time"

	"assay/kernel/claim"
	"assay/kernel/session"
)

// progressLine shows how far a long sweep has got on a terminal: samples
// done, rate and time left, summed over workers, redrawn in place.
type progressLine struct {
	w     io.Writer // nil when only step is told
	step  func(Step)
	cell  func() (index, line, from int) // the cell running and the run's first, for step
	claim string
	began time.Time
	done  map[int]int64 // by worker
	total map[int]int64
	shown bool
}

func newProgressLine(w io.Writer) *progressLine {
	if w == nil {
		return nil
	}
	return &progressLine{w: w}
}

// update records a worker's count and redraws the line.
func (p *progressLine) update(worker int, pr claim.Progress) {
	if p == nil || pr.Claim == "" { // a stage, not a sweep's count
		return
	}
	if pr.Claim != p.claim {
		p.claim, p.began = pr.Claim, time.Now().Add(-session.ProgressEvery)
		p.done, p.total = map[int]int64{}, map[int]int64{}
	}
	p.done[worker], p.total[worker] = pr.Done, pr.Total
	var done, total int64
	for i, n := range p.done {
		done += n
		total += p.total[i]
	}
	if p.step != nil {
		i, l, f := p.cell()
		p.step(Step{Cell: i, Line: l, From: f, Claim: pr.Claim, Done: done, Total: total})
	}
	if p.w == nil {
		return
	}
	rate := float64(done) / time.Since(p.began).Seconds()
	left := ""
	if rate > 0 && total > done {
		secs := float64(total-done) / rate
		left = fmt.Sprintf(", about %.0f s left", secs)
		if secs < 1 {
			left = ", under a second left"
		}
	}
	fmt.Fprintf(p.w, "\r\033[K%s: %s of %s samples, %s a second%s", claim.Clip(p.claim, 48), grouped(done), grouped(total), grouped(int64(rate)), left)
	p.shown = true
}

// clear removes the line once its sweep is over.
func (p *progressLine) clear() {
	if p == nil || p.w == nil || !p.shown {
		return
	}
	fmt.Fprint(p.w, "\r\033[K")
	p.shown, p.claim = false, ""
}

// grouped prints n with thousands separated by commas.
func grouped(n int64) string {
	s := fmt.Sprint(n)
	for i := len(s) - 3; i > 0 && s[i-1] != '-'; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}

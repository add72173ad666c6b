package kernel

import (
	"errors"
	"sync"
	"time"

	"assay/cells"
	"assay/kernel/session"
)

// Prompt runs the inputs of an interactive session (assay repl) one at a
// time in one kernel, each input a cell, with the limits of a run.
//
// Interrupt stops the input being run: the kernel is killed (as a crossed
// time limit kills it) and, before the next input, a fresh one replays the
// notebook's cells and the inputs that ran cleanly, so the names defined
// so far are kept.
type Prompt struct {
	opt  Options
	d    *driver
	next int  // the index the next input runs as
	dead bool // the kernel was killed: revive replays into a new one

	mu   sync.Mutex
	stop chan struct{} // closed by Interrupt
}

// NewPrompt starts the kernel of an interactive session.
func NewPrompt(opt Options) (*Prompt, error) {
	p := &Prompt{opt: withDefaults(opt), next: 1, stop: make(chan struct{})}
	d, err := newDriver(p.opt)
	if err != nil {
		return nil, err
	}
	d.cancel = p.stop
	p.d = d
	return p, nil
}

// Notebook runs a notebook's cells first, so the inputs that follow see
// its names, and returns its report (with the options' KeepGoing and
// Until). A notebook whose cells failed leaves the names of the cells
// that ran.
func (p *Prompt) Notebook(nb *cells.Notebook) *cells.Report {
	began := time.Now()
	rep := newReport(nb, p.opt)
	list := nb.Cells()
	if len(list) > 0 {
		p.dead = !runCells(p.d, rep, list, 0, p.opt)
		p.next = list[len(list)-1].Index + 1
	}
	rep.Seconds = time.Since(began).Seconds()
	return rep
}

// Input runs one input as a cell whose first line is line 1, showing the
// value of its last statement when that is an expression. A crossed limit
// or an interrupt is the outcome's error; the next input then finds a
// fresh kernel that has replayed what came before.
func (p *Prompt) Input(src string) cells.Outcome {
	c := session.Cell{Index: p.next, Line: 1, Source: src, Echo: true}
	p.next++
	if err := p.revive(); err != nil {
		return cells.Outcome{Cell: c.Index, Status: cells.Failed, Error: &cells.Problem{Cell: c.Index, Line: 1, Message: err.Error()}}
	}
	began := time.Now()
	out, _, err := p.d.run(c, p.opt.Timeout)
	if err != nil {
		p.dead = true
		if errors.Is(err, errStopped) || p.d.stopped() {
			err = errInterrupted
		}
		out = cells.Outcome{Cell: c.Index, Status: cells.Failed, Seconds: time.Since(began).Seconds(),
			Error: &cells.Problem{Cell: c.Index, Line: 1, Message: err.Error()}}
	}
	return out
}

// errInterrupted is the error of an input stopped by Ctrl-C.
var errInterrupted = errors.New("interrupted; the session goes on with the names defined before this input")

// revive makes a new kernel, replaying the cells run cleanly so far, when
// the last one was killed (an interrupt, a crossed limit).
func (p *Prompt) revive() error {
	p.mu.Lock()
	if p.d.stopped() {
		p.stop = make(chan struct{})
		p.d.cancel = p.stop
	}
	p.mu.Unlock()
	if !p.dead {
		return nil
	}
	if err := p.d.restart(); err != nil {
		return err
	}
	p.dead = false
	return nil
}

// Interrupt stops the input being run, if any.
func (p *Prompt) Interrupt() {
	p.mu.Lock()
	defer p.mu.Unlock()
	select {
	case <-p.stop:
	default:
		close(p.stop)
	}
}

// Close ends the kernel.
func (p *Prompt) Close() { p.d.close() }

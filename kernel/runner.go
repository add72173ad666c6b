package kernel

import (
	"crypto/sha256"
	"encoding/hex"
	"time"

	"assay/cells"
	"assay/exact"
)

// Options control a notebook run.
type Options struct {
	Settings  Settings
	Timeout   time.Duration // per-cell default; a cell's timeout= option wins
	MaxMemory int64         // bytes; the kernel process is killed above it
	KeepGoing bool          // run later cells after a cell fails
	// Command starts a kernel process, e.g. ["/usr/bin/assay", "kernel"].
	// Empty runs cells in this process, without time or memory limits.
	Command []string
}

// DefaultMaxTerms is the default cap on the terms of a polynomial.
var DefaultMaxTerms = exact.DefaultMaxTerms

// Defaults for Options.
const (
	DefaultTimeout   = 60 * time.Second
	DefaultMaxMemory = 2 << 30
)

// executor runs cells: a child process, or a session in this process.
type executor interface {
	run(c Cell, timeout time.Duration) (cells.Outcome, Settings, error)
	close()
}

type processExecutor struct{ p *Process }

func (e processExecutor) run(c Cell, t time.Duration) (cells.Outcome, Settings, error) {
	return e.p.Run(c, t)
}
func (e processExecutor) close() { e.p.Close() }

type sessionExecutor struct{ s *Session }

func (e sessionExecutor) run(c Cell, _ time.Duration) (cells.Outcome, Settings, error) {
	o := e.s.Run(c)
	return o, e.s.Settings(), nil
}
func (e sessionExecutor) close() { e.s.Close() }

func start(opt Options) (executor, error) {
	if len(opt.Command) == 0 {
		s, err := NewSession(opt.Settings)
		if err != nil {
			return nil, err
		}
		return sessionExecutor{s}, nil
	}
	p, err := StartProcess(opt.Command, opt.Settings, opt.MaxMemory)
	if err != nil {
		return nil, err
	}
	return processExecutor{p}, nil
}

// Run runs every cell of a notebook top to bottom in one namespace and
// returns the report. It never fails: problems end up in the report.
func Run(nb *cells.Notebook, opt Options) *cells.Report {
	began := time.Now()
	if opt.Timeout <= 0 {
		opt.Timeout = DefaultTimeout
	}
	if opt.MaxMemory <= 0 {
		opt.MaxMemory = DefaultMaxMemory
	}
	if opt.Settings.Precision == 0 {
		opt.Settings.Precision = DefaultSettings.Precision
	}
	sum := sha256.Sum256(nb.Source)
	rep := &cells.Report{
		Notebook:  nb,
		SHA256:    hex.EncodeToString(sum[:]),
		Version:   Version,
		Seed:      opt.Settings.Seed,
		Precision: opt.Settings.Precision,
	}
	list := nb.Cells()
	for _, b := range list {
		rep.Outcomes = append(rep.Outcomes, cells.Outcome{Cell: b.Index, Status: cells.NotRun})
	}
	defer func() { rep.Seconds = time.Since(began).Seconds() }()
	if len(list) == 0 {
		return rep
	}
	exec, err := start(opt)
	if err != nil {
		rep.Problems = append(rep.Problems, cells.Problem{Message: err.Error()})
		return rep
	}
	defer func() { exec.close() }()
	var done []Cell // cells that ran cleanly, for a replay after a restart
	for i, b := range list {
		c := Cell{Index: b.Index, Line: b.Line, Source: b.Text, Options: b.Options}
		timeout := opt.Timeout
		if b.Options.Timeout > 0 {
			timeout = b.Options.Timeout
		}
		cellStart := time.Now()
		out, s, err := exec.run(c, timeout)
		if err != nil {
			out = cells.Outcome{Cell: b.Index, Status: cells.Failed, Seconds: time.Since(cellStart).Seconds(),
				Error: &cells.Problem{Cell: b.Index, Line: b.Line, Message: err.Error()}}
			rep.Outcomes[i] = out
			if !opt.KeepGoing {
				break
			}
			// The namespace died with the process: start afresh and replay
			// the cells that ran cleanly so later cells see their names.
			exec.close()
			if exec, err = start(opt); err != nil {
				rep.Problems = append(rep.Problems, cells.Problem{Message: err.Error()})
				return rep
			}
			for _, d := range done {
				if _, _, err := exec.run(d, opt.Timeout); err != nil {
					break
				}
			}
			continue
		}
		rep.Outcomes[i] = out
		rep.Seed, rep.Precision = s.Seed, s.Precision
		if out.Status == cells.Failed {
			if !opt.KeepGoing {
				break
			}
			continue
		}
		done = append(done, c)
	}
	return rep
}

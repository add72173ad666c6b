package kernel

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"time"

	"assay/cells"
	"assay/exact"
	"assay/kernel/claim"
	"assay/kernel/proto"
	"assay/kernel/session"
)

// Options control a notebook run.
type Options struct {
	Settings  session.Settings
	Timeout   time.Duration // per-cell default; a cell's timeout= option wins
	MaxMemory int64         // bytes; the kernel process is killed above it
	KeepGoing bool          // run later cells after a cell fails
	// MaxOutput caps what one cell may send back (bytes of its reply:
	// printed text, tables, figures, claims); over it the cell fails,
	// keeping the start of its printed text. It bounds what the driver
	// buffers per cell. Zero: DefaultMaxOutput.
	MaxOutput int64
	// Command starts a kernel process, e.g. ["/usr/bin/assay", "kernel"].
	// Empty runs cells in this process, without time or memory limits.
	Command []string
	// Workers is how many kernel processes share a large sampled claim
	// (with Command only); helpers start at the first such claim.
	Workers int
	// Shard makes this run one shard of several: it computes the samples
	// k with k % Shard.Count == Shard.Index. Zero: not sharded.
	Shard claim.Share
	// Progress, when set, shows the progress of long sweeps (a terminal).
	Progress io.Writer
	// Steps, when set, is told of each cell as it starts and of the
	// progress of long sweeps (a watch page shows them). It is called
	// from the goroutine running the notebook.
	Steps func(Step)
	// Until, when positive, is the index of the last cell to run (assay
	// run --until): later cells are left not run.
	Until int
}

// Step is what a run tells Options.Steps as it goes: a cell starting
// (Claim empty), or how far the sweep of a sampled claim has got.
type Step struct {
	Cell, Line  int    // the cell running, its index and first line
	From        int    // the first cell this run runs (a live run keeps the results before it)
	Claim       string // the sweep's claim; empty when the cell starts
	Done, Total int64  // samples done and to do, summed over workers
}

// DefaultMaxTerms is the default cap on the terms of a polynomial.
var DefaultMaxTerms = exact.DefaultMaxTerms

// DefaultMaxDegree is the default cap on the degree of the polynomials a
// minimal polynomial is computed through (--max-degree).
var DefaultMaxDegree = exact.DefaultMaxDegree

// Defaults for Options.
const (
	DefaultTimeout   = 60 * time.Second
	DefaultMaxMemory = 2 << 30
	DefaultMaxOutput = proto.DefaultMaxOutput
)

// Run runs every cell of a notebook top to bottom in one namespace and
// returns the report. It never fails: problems end up in the report.
func Run(nb *cells.Notebook, opt Options) *cells.Report {
	rep, _ := run(nb, opt, nil)
	return rep
}

// RunShard runs a notebook as shard opt.Shard of a sharded run and returns
// the part to merge, with the shard's report (whose sampled claims cover
// only the shard's samples).
func RunShard(nb *cells.Notebook, opt Options) (*cells.Report, *Part) {
	rep, d := run(nb, opt, nil)
	part := &Part{Format: PartFormat, Version: proto.Version, Notebook: nb.Path, SHA256: rep.SHA256, Source: string(nb.Source),
		Settings: opt.Settings, Shard: int(opt.Shard.Index) + 1, Shards: int(opt.Shard.Count), Claims: []PartClaim{}}
	if d != nil {
		part.Claims = append(part.Claims, d.collected...)
	}
	for _, o := range rep.Outcomes {
		if o.Error != nil {
			part.Errors = append(part.Errors, *o.Error)
		}
	}
	part.Errors = append(part.Errors, rep.Problems...)
	return rep, part
}

// Merge joins the parts of a sharded run (each named, for messages) into
// the report a single run gives: it replays the notebook they carry, and
// each sampled claim takes the merged tallies of the shards instead of
// sweeping again. The settings come from the parts.
func Merge(parts []*Part, names []string, opt Options) (*cells.Report, error) {
	set, err := checkParts(parts, names)
	if err != nil {
		return nil, err
	}
	first := set.parts[0]
	if first.Version != proto.Version {
		return nil, fmt.Errorf("the parts were written by assay %s; this is assay %s, whose results may differ: merge with the version that ran the shards", first.Version, proto.Version)
	}
	nb, err := cells.Parse(first.Notebook, []byte(first.Source))
	if err != nil {
		return nil, fmt.Errorf("the notebook in the parts no longer parses: %v", err)
	}
	opt.Settings, opt.Shard = first.Settings, claim.Share{}
	rep, _ := run(nb, opt, set)
	return rep, nil
}

func run(nb *cells.Notebook, opt Options, parts *partSet) (*cells.Report, *driver) {
	began := time.Now()
	opt = withDefaults(opt)
	rep := newReport(nb, opt)
	defer func() { rep.Seconds = time.Since(began).Seconds() }()
	list := nb.Cells()
	if len(list) == 0 {
		return rep, nil
	}
	var first *ran
	if opt.Until <= 0 || list[0].Index <= opt.Until {
		r := cellOf(list[0], opt)
		first = &r
	}
	d, err := startDriver(opt, first)
	if err != nil {
		rep.Problems = append(rep.Problems, cells.Problem{Message: err.Error()})
		return rep, nil
	}
	d.parts = parts
	defer d.release() // the report need not wait for the kernels to exit
	runCells(d, rep, list, 0, opt)
	return rep, d
}

// withDefaults fills in the options left zero.
func withDefaults(opt Options) Options {
	if opt.Timeout <= 0 {
		opt.Timeout = DefaultTimeout
	}
	if opt.MaxMemory <= 0 {
		opt.MaxMemory = DefaultMaxMemory
	}
	if opt.MaxOutput <= 0 {
		opt.MaxOutput = DefaultMaxOutput
	}
	if opt.Settings.Precision == 0 {
		opt.Settings.Precision = session.DefaultSettings.Precision
	}
	return opt
}

// newReport is the report of a notebook before any cell has run.
func newReport(nb *cells.Notebook, opt Options) *cells.Report {
	sum := sha256.Sum256(nb.Source)
	rep := &cells.Report{
		Notebook:  nb,
		SHA256:    hex.EncodeToString(sum[:]),
		Version:   proto.Version,
		Seed:      opt.Settings.Seed,
		Precision: opt.Settings.Precision,
		Until:     opt.Until,
	}
	for _, b := range nb.Cells() {
		rep.Outcomes = append(rep.Outcomes, cells.Outcome{Cell: b.Index, Status: cells.NotRun})
	}
	return rep
}

// cellOf is the cell a block runs as, with its time limit.
func cellOf(b *cells.Block, opt Options) ran {
	timeout := opt.Timeout
	if b.Options.Timeout > 0 {
		timeout = b.Options.Timeout
	}
	c := session.Cell{Index: b.Index, Line: b.Line, Source: b.Text, Options: b.Options}
	c.Options.Timeout = timeout // the session's own deadline for long computations
	return ran{cell: c, timeout: timeout}
}

// runCells runs list[from:] in d, whose kernel has run list[:from], and
// files their outcomes in rep. It says whether d's kernel is still alive.
func runCells(d *driver, rep *cells.Report, list []*cells.Block, from int, opt Options) (alive bool) {
	if from < len(list) {
		d.from = list[from].Index
	}
	for i := from; i < len(list); i++ {
		b := list[i]
		if opt.Until > 0 && b.Index > opt.Until {
			break
		}
		r := cellOf(b, opt)
		if opt.Steps != nil {
			opt.Steps(Step{Cell: b.Index, Line: b.Line, From: d.from})
		}
		cellStart := time.Now()
		out, s, err := d.run(r.cell, r.timeout)
		if err != nil {
			out = cells.Outcome{Cell: b.Index, Status: cells.Failed, Seconds: time.Since(cellStart).Seconds(),
				Error: &cells.Problem{Cell: b.Index, Line: b.Line, Message: err.Error()}}
			rep.Outcomes[i] = out
			if !opt.KeepGoing || d.stopped() {
				return false
			}
			// The namespace died with the process: start afresh and replay
			// the cells that ran cleanly so later cells see their names.
			if err := d.restart(); err != nil {
				p := cells.Problem{Message: err.Error()}
				var re *replayError
				if errors.As(err, &re) {
					p.Cell, p.Line = re.cell.Index, re.cell.Line
				}
				rep.Problems = append(rep.Problems, p)
				return false
			}
			continue
		}
		rep.Outcomes[i] = out
		rep.Seed, rep.Precision = s.Seed, s.Precision
		if out.Status == cells.Failed && !opt.KeepGoing {
			break
		}
	}
	return true
}

package kernel

import (
	"sync"
	"time"

	"assay/cells"
)

// Live runs one notebook again and again as it is edited (assay watch),
// keeping kernels between runs so that the cells before the first changed
// one are not run again.
//
// A kernel's namespace cannot be taken back: once it has run a cell, an
// edit of that cell needs a kernel that has run only the cells before it.
// So besides the kernel of the last run, Live keeps a spare that replays,
// in the background, the cells before the one that failed or, failing
// that, the one edited last (on the first run, all but the last cell): the next edit there finds its namespace
// ready and runs only from the edited cell on. An edit further up takes
// whichever kernel has run the longest unchanged start, or a fresh one,
// and replays the unchanged cells it lacks.
type Live struct {
	opt  Options
	quit chan struct{} // closed by Close: calls off a run and the replays
	once sync.Once

	// stop is closed to call off the run in progress (Interrupt, Close);
	// a new one for each run.
	stopMu sync.Mutex
	stop   chan struct{}

	mu    sync.Mutex // one run at a time
	ran   bool       // a run has been made
	last  []ran      // the cells of the last run
	outs  []cells.Outcome
	seed  int64 // the settings after the last run's cells
	prec  int
	main  *driver // the last run's kernel: it has run last[:len(main.history)]
	spare *spare
	// background counts the spares being ended without waiting for them.
	background sync.WaitGroup
}

// NewLive prepares live runs with opt (Options.Command must start kernel
// processes for a run to be called off in the middle of a cell).
func NewLive(opt Options) *Live {
	return &Live{opt: withDefaults(opt), quit: make(chan struct{})}
}

// Run runs a version of the notebook and returns its report: outcomes of
// the unchanged cells before the first change are the last run's, the
// rest are run. A cell is unchanged when its index, line, source and
// options are.
func (l *Live) Run(nb *cells.Notebook) *cells.Report {
	l.mu.Lock()
	defer l.mu.Unlock()
	began := time.Now()
	rep := newReport(nb, l.opt)
	defer func() { rep.Seconds = time.Since(began).Seconds() }()
	list := nb.Cells()
	cs := make([]ran, len(list))
	for i, b := range list {
		cs[i] = cellOf(b, l.opt)
	}
	j := 0
	for j < len(cs) && j < len(l.last) && sameCell(cs[j], l.last[j]) && l.outs[j].Status == cells.Ran {
		j++
	}
	first := !l.ran
	l.ran = true
	stop := l.newStop()
	d, from := l.pick(cs, j)
	copy(rep.Outcomes[:from], l.outs[:from])
	if from > 0 {
		rep.Seed, rep.Precision = l.seed, l.prec
	}
	if d == nil && from < len(cs) && !l.stopped() {
		var err error
		if d, err = newDriver(l.opt); err != nil {
			rep.Problems = append(rep.Problems, cells.Problem{Message: err.Error()})
		}
	}
	if d != nil {
		d.cancel = stop
		d.tell(l.opt)
		if !runCells(d, rep, list, from, l.opt) {
			d.close()
			d = nil
		}
	}
	l.main, l.last, l.outs, l.seed, l.prec = d, cs, rep.Outcomes, rep.Seed, rep.Precision
	// The next edit is likely at a cell that failed, else where this one
	// was; on the first run, or after an edit of the first cell (where a
	// spare saves nothing), at the last cell.
	t := j
	if first || j == 0 {
		t = len(cs) - 1
	}
	t = min(t, len(cs)-1)
	for i, o := range rep.Outcomes {
		if o.Status != cells.Ran {
			t = i
			break
		}
	}
	if !l.stopped() {
		l.spare = l.startSpare(cs[:max(t, 0)])
	}
	return rep
}

// pick chooses the kernel to run cs from: of the last run's and the
// spare, the one that has run the longest start of cs[:j], and from, the
// number of cells it has run. The other is closed. nil: neither fits.
func (l *Live) pick(cs []ran, j int) (d *driver, from int) {
	fits := func(d *driver) int {
		if d == nil || len(d.history) > j {
			return -1
		}
		for i, h := range d.history {
			if h.failed || !sameCell(h, cs[i]) {
				return -1
			}
		}
		return len(d.history)
	}
	m := fits(l.main)
	var sd *driver
	if l.spare != nil {
		k := 0
		for k < j && k < len(l.spare.want) && sameCell(l.spare.want[k], cs[k]) {
			k++
		}
		if k > m {
			sd = l.spare.take(k)
		} else {
			// It cannot do better than the last run's kernel: end it
			// without waiting for it.
			sp := l.spare
			l.background.Add(1)
			go func() {
				defer l.background.Done()
				if d := sp.take(0); d != nil {
					d.close()
				}
			}()
		}
		l.spare = nil
	}
	s := fits(sd)
	if m < s {
		l.main, sd, m = sd, l.main, s
	}
	if sd != nil {
		sd.close()
	}
	if m < 0 {
		if l.main != nil {
			l.main.close()
		}
		l.main = nil
		return nil, 0
	}
	d, l.main = l.main, nil
	return d, m
}

// sameCell says two cells run alike: same place, source, options and limit.
func sameCell(a, b ran) bool {
	x, y := a.cell, b.cell
	sameSeed := (x.Options.Seed == nil) == (y.Options.Seed == nil) && (x.Options.Seed == nil || *x.Options.Seed == *y.Options.Seed)
	return x.Index == y.Index && x.Line == y.Line && x.Source == y.Source && a.timeout == b.timeout &&
		x.Options.Timeout == y.Options.Timeout && x.Options.Precision == y.Options.Precision && x.Options.ID == y.Options.ID && sameSeed
}

// Ready waits until the spare kernel has replayed its cells (tests and
// benchmarks use it to measure an edit that finds the spare ready).
func (l *Live) Ready() {
	l.mu.Lock()
	s := l.spare
	l.mu.Unlock()
	if s != nil {
		<-s.done
	}
}

// Close calls off a run in progress and ends every kernel. Run must not
// be called after it.
func (l *Live) Close() {
	l.once.Do(func() { close(l.quit) })
	l.Interrupt()
	l.mu.Lock()
	defer l.mu.Unlock()
	if l.spare != nil {
		if d := l.spare.take(0); d != nil {
			d.close()
		}
		l.spare = nil
	}
	if l.main != nil {
		l.main.close()
		l.main = nil
	}
	l.background.Wait()
}

// newStop makes the channel that calls off this run, already closed
// after Close.
func (l *Live) newStop() chan struct{} {
	l.stopMu.Lock()
	defer l.stopMu.Unlock()
	l.stop = make(chan struct{})
	if l.stopped() {
		close(l.stop)
	}
	return l.stop
}

// Interrupt calls off the run in progress, if any: its cell stops with an
// error and its kernel ends (a newer version of the notebook is waiting).
func (l *Live) Interrupt() {
	l.stopMu.Lock()
	defer l.stopMu.Unlock()
	if l.stop != nil {
		select {
		case <-l.stop:
		default:
			close(l.stop)
		}
	}
}

// stopped says Close was called.
func (l *Live) stopped() bool {
	select {
	case <-l.quit:
		return true
	default:
		return false
	}
}

// spare is a kernel replaying cells in the background.
type spare struct {
	want   []ran
	cancel chan struct{} // closed to stop the replay in the middle of a cell
	done   chan struct{} // closed when the replay has ended
	d      *driver       // once done: the kernel, nil if a replay failed

	mu        sync.Mutex
	limit     int // replay want[:limit]
	at        int // the cell being replayed, -1 when none
	cancelled bool
}

// startSpare starts a kernel that replays want, telling no one of it.
func (l *Live) startSpare(want []ran) *spare {
	s := &spare{want: want, cancel: make(chan struct{}), done: make(chan struct{}), limit: len(want), at: -1}
	opt := l.opt
	opt.Steps, opt.Progress = nil, nil
	go func() {
		defer close(s.done)
		d, err := newDriver(opt)
		if err != nil {
			return
		}
		d.cancel = s.cancel
		for i, r := range want {
			s.mu.Lock()
			if i >= s.limit || s.cancelled {
				s.mu.Unlock()
				break
			}
			s.at = i
			s.mu.Unlock()
			if o, _, err := d.run(r.cell, r.timeout); err != nil || o.Status != cells.Ran {
				d.close()
				return
			}
		}
		s.mu.Lock()
		s.at = -1
		s.mu.Unlock()
		s.d = d
	}()
	return s
}

// take stops the replay once want[:k] has run (at once, when it is past
// that) and returns the kernel.
func (s *spare) take(k int) *driver {
	s.mu.Lock()
	s.limit = min(s.limit, k)
	if s.at >= s.limit && !s.cancelled {
		s.cancelled = true
		close(s.cancel)
	}
	s.mu.Unlock()
	<-s.done
	return s.d
}

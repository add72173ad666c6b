package kernel

import (
	"errors"
	"fmt"
	"reflect"
	"runtime"
	"strings"
	"time"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/proto"
	"assay/kernel/session"
)

// helperThreshold is the smallest sweep for which a driver starts its
// helper workers: below it, starting processes costs more than it saves.
const helperThreshold = 256

// driver runs a notebook's cells in a kernel — a child process, or a
// session in this process — and answers its exchanges: it splits sampled
// claims among workers (helper processes that replay the notebook in step
// with the main one), among shards, or fills them in from merged parts,
// and merges the tallies.
type driver struct {
	opt   Options
	shard claim.Share // this run's shard; {0, 1} when not sharded

	sess *session.Session // in-process mode

	workers []*worker // process mode; workers[0] is the main kernel
	inbox   chan proto.Message
	history []ran // cells the main kernel has run, for helpers to replay
	current ran   // the cell being run, with its time limit
	tried   bool  // helpers were started (or could not be)
	peak    int   // most workers at once, for tests

	settled   map[string]settledTally
	open      map[string]*opening
	parts     *partSet    // merge mode
	collected []PartClaim // shard mode: this shard's tallies, in order
	progress  *progressLine
	// cancel, when closed, stops the cell being run and ends the kernels
	// (a watch that stops, or a replay no longer wanted); nil never does.
	cancel <-chan struct{}
	from   int // the first cell of the run, for Options.Steps
}

type ran struct {
	cell    session.Cell
	timeout time.Duration // its time limit, which a replay keeps
	failed  bool
}

// worker is one kernel process and what it is doing.
type worker struct {
	p        *proto.Process
	index    int
	starting bool         // its session is not open yet
	queue    []ran        // cells to run: a helper's replay, then the current cell
	running  *ran         // the cell it runs, nil when idle
	ahead    *ran         // the cell sent with the start request, until the run of it
	asking   string       // the exchange it waits on, "" when not waiting
	final    *proto.Reply // its reply for the current cell
	// catching is a helper started during the current cell, until it
	// reaches the main kernel's place in it: its start and replays are
	// not the cell's work, so the cell's clock stops meanwhile, and each
	// step has a limit of its own, due at due.
	catching bool
	due      time.Time
	late     func() error // the error when due passes
	stage    string       // the stage of a long computation in its cell, "" when none
}

type settledTally struct {
	ask   claim.Ask
	tally claim.Tally
}

// opening is an exchange in progress: the workers that asked, then their tallies.
type opening struct {
	ask      claim.Ask
	askers   []*worker
	tallies  []claim.Tally
	assigned bool
}

func newDriver(opt Options) (*driver, error) { return startDriver(opt, nil) }

// startDriver is newDriver with the cell first, when not nil, sent right
// behind the start request (see start); the driver's first run must be
// of that cell.
func startDriver(opt Options, first *ran) (*driver, error) {
	d := &driver{opt: opt, shard: claim.Share{Index: 0, Count: 1}, settled: map[string]settledTally{}, open: map[string]*opening{}}
	if opt.Shard.Count > 0 {
		d.shard = opt.Shard
	}
	d.tell(opt)
	return d, d.start(first)
}

// tell sets where the driver shows progress: opt.Progress and opt.Steps
// (a spare kernel that replayed quietly speaks up once it runs).
func (d *driver) tell(opt Options) {
	d.progress = newProgressLine(opt.Progress)
	if opt.Steps != nil {
		d.progress = &progressLine{w: opt.Progress, step: opt.Steps, cell: func() (int, int, int) { return d.current.cell.Index, d.current.cell.Line, d.from }}
	}
}

// start opens the main kernel. A first cell, when not nil, is sent right
// behind the start request, so that the kernel runs it as soon as its
// session is open rather than a reply and a request later (~1 ms of a
// one-cell run); the first run finds it running.
func (d *driver) start(first *ran) error {
	if len(d.opt.Command) == 0 {
		s, err := session.New(d.opt.Settings)
		if err != nil {
			return err
		}
		s.SetCoordinator(local{d})
		d.sess = s
		return nil
	}
	d.inbox = make(chan proto.Message, 16)
	p, err := d.spawn()
	if err != nil {
		return err
	}
	if first != nil {
		if err := p.Send(proto.Request{Op: "run", Cell: &first.cell}); err != nil {
			return err
		}
	}
	limit := time.NewTimer(d.opt.Timeout)
	defer limit.Stop()
	var m proto.Message
	select {
	case m = <-d.inbox:
	case <-limit.C:
		p.Kill()
		return proto.SlowStart(d.opt.Timeout)
	}
	switch {
	case m.Dead:
		return p.Death()
	case m.Reply.Error != "":
		p.Close()
		return errors.New("kernel process: " + m.Reply.Error)
	}
	d.workers = []*worker{{p: p, ahead: first}}
	d.tried = d.opt.Workers <= 1
	return nil
}

// spawn starts one kernel process, main or helper.
func (d *driver) spawn() (*proto.Process, error) {
	s := d.opt.Settings
	s.Driven = true
	return proto.Start(d.opt.Command, s, proto.Limits{MaxMemory: d.opt.MaxMemory, MaxOutput: d.opt.MaxOutput, Procs: d.procs()}, d.inbox)
}

// procs shares the cores among the workers.
func (d *driver) procs() int {
	if d.opt.Workers <= 1 {
		return 0
	}
	return max(1, runtime.NumCPU()/d.opt.Workers)
}

// close ends every kernel and waits for each to exit; settled tallies
// are kept for a restart.
func (d *driver) close() { d.end((*proto.Process).Close) }

// release ends every kernel without waiting for them to exit, for a
// driver whose run is over (see proto.Process.Release).
func (d *driver) release() {
	d.end(func(p *proto.Process) error { p.Release(); return nil })
}

// end ends the session and every kernel process with stop.
func (d *driver) end(stop func(*proto.Process) error) {
	if d.sess != nil {
		d.sess.Close()
		d.sess = nil
	}
	for _, w := range d.workers {
		stop(w.p)
	}
	d.workers, d.history, d.open = nil, nil, map[string]*opening{}
	d.progress.clear()
}

// restart replaces a dead kernel with a fresh one and replays the cells
// that ran cleanly, so later cells see their names; each replay has the
// time limit its cell had.
func (d *driver) restart() error {
	clean := d.history
	d.close()
	if err := d.start(nil); err != nil {
		return err
	}
	for _, r := range clean {
		if r.failed {
			continue
		}
		if _, _, err := d.run(r.cell, r.timeout); err != nil {
			return &replayError{cell: r.cell, err: err}
		}
	}
	return nil
}

// replayError is a cell that failed when replayed after a restart.
type replayError struct {
	cell session.Cell
	err  error
}

func (e *replayError) Error() string {
	return fmt.Sprintf("replay of cell %d (line %d), to run the cells after a failed one: %v", e.cell.Index, e.cell.Line, e.err)
}

// timeLimit is the error of a cell or replay stopped by its time limit,
// naming the stage of the long computation it was in, if one was reported.
func timeLimit(what string, timeout time.Duration, stage string) error {
	if stage != "" {
		stage = ", while factoring: " + stage
	}
	return &proto.LimitError{Message: fmt.Sprintf("%sstopped after %s, its time limit%s; raise it with the cell option timeout=… or the flag --timeout", what, timeout, stage)}
}

// cellClock measures the current cell's time. It stops while helpers
// catch up, so the cell's limit and verdict do not depend on how many
// workers there are.
type cellClock struct {
	spent time.Duration
	since time.Time // when it last started; zero while stopped
}

// set starts or stops the clock.
func (c *cellClock) set(on bool, now time.Time) {
	switch {
	case on && c.since.IsZero():
		c.since = now
	case !on && !c.since.IsZero():
		c.spent += now.Sub(c.since)
		c.since = time.Time{}
	}
}

// left is the time the cell has left of limit; ok false while stopped.
func (c *cellClock) left(limit time.Duration, now time.Time) (time.Duration, bool) {
	if c.since.IsZero() {
		return 0, false
	}
	return limit - c.spent - now.Sub(c.since), true
}

// run runs one cell in every worker and returns the main kernel's outcome.
// A crossed limit or a dead process is a *LimitError; the kernels are then
// unusable until restart.
func (d *driver) run(c session.Cell, timeout time.Duration) (cells.Outcome, session.Settings, error) {
	d.current = ran{cell: c, timeout: timeout}
	if d.sess != nil {
		o := d.sess.Run(c)
		d.history = append(d.history, ran{cell: c, timeout: timeout, failed: o.Status == cells.Failed})
		return o, d.sess.Settings(), nil
	}
	for _, w := range d.workers {
		w.final, w.stage = nil, ""
		if w.ahead != nil && w.ahead.cell.Index == c.Index {
			w.running, w.ahead = w.ahead, nil // sent already
			continue
		}
		w.queue = append(w.queue, d.current)
		if err := d.next(w); err != nil {
			return d.abort(err)
		}
	}
	var clock cellClock
	timer := time.NewTimer(timeout)
	defer timer.Stop()
	for !d.finished() {
		if err := d.stuck(); err != nil {
			return d.abort(err)
		}
		// The nearest limit: the cell's, while its clock runs, or that of
		// a helper's step in catching up.
		now := time.Now()
		late := func() error { return timeLimit("", timeout, d.workers[0].stage) }
		clock.set(!d.catchingUp(), now)
		wait, running := clock.left(timeout, now)
		for _, w := range d.workers {
			if w.catching && !w.due.IsZero() && (!running || w.due.Sub(now) < wait) {
				wait, running, late = w.due.Sub(now), true, w.late
			}
		}
		if !running {
			wait = timeout // no limit is running: a safeguard, not reached
		}
		timer.Reset(max(wait, 0))
		select {
		case m := <-d.inbox:
			if err := d.receive(m); err != nil {
				return d.abort(err)
			}
		case <-timer.C:
			return d.abort(late())
		case <-d.cancel:
			return d.abort(errStopped)
		}
	}
	d.progress.clear()
	main := d.workers[0].final
	out := *main.Outcome
	for _, w := range d.workers[1:] {
		if why := disagreement(out, *w.final.Outcome); why != "" && out.Error == nil {
			out.Status = cells.Failed
			out.Error = &cells.Problem{Cell: c.Index, Line: c.Line, Message: fmt.Sprintf("worker %d disagrees with the main kernel: %s; the notebook is not deterministic (does a result depend on something other than the seed?)", w.index, why)}
		}
	}
	d.history = append(d.history, ran{cell: c, timeout: timeout, failed: out.Status == cells.Failed})
	return out, main.Settings, nil
}

// errStopped is the error of a cell stopped because its run was called off.
var errStopped = errors.New("stopped: the run was called off")

// stopped says the driver's run was called off.
func (d *driver) stopped() bool {
	select {
	case <-d.cancel:
		return d.cancel != nil
	default:
		return false
	}
}

// catchingUp says a helper is still catching up with the main kernel.
func (d *driver) catchingUp() bool {
	for _, w := range d.workers {
		if w.catching {
			return true
		}
	}
	return false
}

// abort ends every kernel after an error in the middle of a cell.
func (d *driver) abort(err error) (cells.Outcome, session.Settings, error) {
	for _, w := range d.workers {
		w.p.Kill()
	}
	var le *proto.LimitError
	if !errors.As(err, &le) {
		err = &proto.LimitError{Message: err.Error()}
	}
	return cells.Outcome{}, session.Settings{}, err
}

// finished says every worker has replied for the current cell.
func (d *driver) finished() bool {
	for _, w := range d.workers {
		if w.final == nil {
			return false
		}
	}
	return true
}

// next sends an idle worker the next cell of its queue.
func (d *driver) next(w *worker) error {
	if w.starting || w.running != nil || len(w.queue) == 0 {
		return nil
	}
	r := w.queue[0]
	w.queue = w.queue[1:]
	w.running = &r
	if w.catching {
		// Each replayed cell keeps its own limit; so does the helper's
		// run of the current cell up to where the main kernel waits.
		w.due = time.Now().Add(r.timeout)
		w.late = func() error {
			return d.named(w, timeLimit(fmt.Sprintf("replay of cell %d (line %d): ", r.cell.Index, r.cell.Line), r.timeout, w.stage))
		}
	}
	return d.named(w, w.p.Send(proto.Request{Op: "run", Cell: &r.cell}))
}

// caughtUp ends a helper's catching up: from here on it runs in step, and
// the cell's clock runs.
func (w *worker) caughtUp() {
	w.catching, w.due, w.late = false, time.Time{}, nil
}

// named prefixes a helper's error with its number.
func (d *driver) named(w *worker, err error) error {
	if err == nil || w.index == 0 {
		return err
	}
	return &proto.LimitError{Message: fmt.Sprintf("worker %d: %v", w.index, err)}
}

// receive handles one message from a worker.
func (d *driver) receive(m proto.Message) error {
	var w *worker
	for _, x := range d.workers {
		if x.p == m.From {
			w = x
		}
	}
	if w == nil {
		return nil // from a process already closed
	}
	if m.Dead {
		return d.named(w, m.From.Death())
	}
	r := m.Reply
	switch {
	case r.Progress != nil:
		if r.Progress.Claim == "" {
			w.stage = r.Progress.Stage
		}
		d.progress.update(w.index, *r.Progress)
		return nil
	case r.Exchange != nil:
		return d.named(w, d.onExchange(w, *r.Exchange))
	case r.Error != "":
		return d.named(w, &proto.LimitError{Message: "kernel process refused the cell: " + r.Error})
	case w.starting:
		w.starting = false
		return d.next(w)
	case w.running == nil || r.Outcome == nil:
		return d.named(w, &proto.LimitError{Message: "kernel process sent a reply nobody asked for"})
	}
	done := *w.running
	w.running = nil
	failed := r.Outcome.Status == cells.Failed
	if done.cell.Index == d.current.cell.Index && len(w.queue) == 0 {
		w.final = &r
		w.caughtUp()
	} else if failed != done.failed {
		return d.named(w, &proto.LimitError{Message: fmt.Sprintf("replay of cell %d (line %d) gave another result than the main kernel did; the notebook is not deterministic", done.cell.Index, done.cell.Line)})
	}
	return d.next(w)
}

// stuck reports workers that wait on exchanges no one else will join:
// they ran different code, so their results cannot be merged.
func (d *driver) stuck() error {
	var waiting []string
	for _, w := range d.workers {
		switch {
		case w.starting || (w.running != nil && w.asking == ""):
			return nil // still working
		case w.asking != "":
			a := strings.SplitN(w.asking, "\x00", 2)[0]
			waiting = append(waiting, fmt.Sprintf("worker %d waits at claim %q", w.index, a))
		default:
			waiting = append(waiting, fmt.Sprintf("worker %d finished the cell", w.index))
		}
	}
	for _, w := range d.workers {
		if w.asking != "" {
			return &proto.LimitError{Message: "the workers ran different code (" + strings.Join(waiting, ", ") + "); a sampled claim's f or g, or the code before it, depends on something other than the sample index and the seed"}
		}
	}
	return nil
}

// onExchange handles an ask or a tally from a worker.
func (d *driver) onExchange(w *worker, e claim.Exchange) error {
	a := e.Ask
	if e.Tally == nil {
		if t, err := d.known(a); err != nil || t != nil {
			return d.answer(w, t, err)
		}
		o := d.open[a.Key()]
		if o == nil {
			o = &opening{ask: a}
			d.open[a.Key()] = o
		}
		if o.ask != a || o.assigned {
			return d.answer(w, nil, fmt.Errorf("the workers disagree about claim %q (line %d): the notebook is not deterministic", a.Claim, a.Line))
		}
		o.askers = append(o.askers, w)
		w.asking = a.Key()
		w.caughtUp() // a helper that joins an open exchange is where the main kernel waits
		if w.index == 0 && !d.tried && a.Phase == claim.PhaseSweep && a.Samples >= helperThreshold {
			d.startHelpers()
		}
		if len(o.askers) < len(d.workers) {
			return nil
		}
		o.assigned = true
		n := int64(len(o.askers))
		for _, x := range o.askers {
			sh := claim.Share{Index: d.shard.Index + d.shard.Count*int64(x.index), Count: d.shard.Count * n}
			if a.Phase == claim.PhaseSearch {
				sh = claim.Share{Index: int64(x.index), Count: n}
			}
			x.asking = ""
			if err := d.named(x, x.p.Send(proto.Request{Op: "answer", Answer: &claim.Answer{Share: &sh}})); err != nil {
				return err
			}
		}
		return nil
	}
	o := d.open[a.Key()]
	if o == nil || !o.assigned || o.ask != a {
		return d.answer(w, nil, fmt.Errorf("claim %q: a tally came for an exchange that was not open", a.Claim))
	}
	w.asking = a.Key()
	o.tallies = append(o.tallies, *e.Tally)
	if len(o.tallies) < len(o.askers) {
		return nil
	}
	delete(d.open, a.Key())
	t := d.settle(a, o.tallies)
	for _, x := range o.askers {
		if err := d.answer(x, &t, nil); err != nil {
			return err
		}
	}
	return nil
}

// answer sends a worker the result of an exchange, or an error that its
// cell will raise.
func (d *driver) answer(w *worker, t *claim.Tally, err error) error {
	w.asking = ""
	ans := claim.Answer{Result: t}
	if err != nil {
		ans = claim.Answer{Error: err.Error()}
	}
	return d.named(w, w.p.Send(proto.Request{Op: "answer", Answer: &ans}))
}

// startHelpers starts the helper workers; each replays the cells the main
// kernel has run, then joins it in the current cell. A helper that cannot
// start is left out: the run is slower, not different. Until a helper
// has caught up, the current cell's clock stops, and the helper's start
// and each cell it replays have limits of their own.
func (d *driver) startHelpers() {
	d.tried = true
	for i := 1; i < d.opt.Workers; i++ {
		p, err := d.spawn()
		if err != nil {
			return
		}
		queue := append(append([]ran(nil), d.history...), d.current)
		w := &worker{p: p, index: i, starting: true, queue: queue, catching: true, due: time.Now().Add(d.opt.Timeout)}
		w.late = func() error { return d.named(w, proto.SlowStart(d.opt.Timeout)) }
		d.workers = append(d.workers, w)
		d.peak = max(d.peak, len(d.workers))
	}
}

// known gives the merged tally of an exchange the driver already holds:
// settled earlier (a replay), or joined from the parts being merged. A
// shard run skips the counterexample search: it runs at the merge, over
// the worst samples of all shards.
func (d *driver) known(a claim.Ask) (*claim.Tally, error) {
	if s, ok := d.settled[a.Key()]; ok {
		if s.ask != a {
			return nil, fmt.Errorf("claim %q was asked for twice, differently (line %d, %d samples, then line %d, %d samples)", a.Claim, s.ask.Line, s.ask.Samples, a.Line, a.Samples)
		}
		return &s.tally, nil
	}
	if a.Phase == claim.PhaseSearch && d.shard.Count > 1 {
		return &claim.Tally{Search: &claim.SearchTally{Skipped: "this is one shard; the search runs when the parts are merged"}}, nil
	}
	if d.parts != nil && a.Phase == claim.PhaseSweep {
		t, err := d.parts.tally(a)
		if t != nil {
			d.settled[a.Key()] = settledTally{ask: a, tally: *t}
		}
		return t, err
	}
	return nil, nil
}

// settle merges the tallies of an exchange's shares and keeps the result.
func (d *driver) settle(a claim.Ask, shares []claim.Tally) claim.Tally {
	var t claim.Tally
	for _, s := range shares {
		t.Merge(s)
	}
	d.settled[a.Key()] = settledTally{ask: a, tally: t}
	if d.shard.Count > 1 && a.Phase == claim.PhaseSweep {
		d.collected = append(d.collected, PartClaim{Ask: a, Tally: t})
	}
	d.progress.clear()
	return t
}

// local is the coordinator of a session the driver runs in this process.
type local struct{ d *driver }

// Exchange answers from the driver's own state.
func (l local) Exchange(e claim.Exchange) (claim.Answer, error) {
	t, err := l.d.known(e.Ask)
	switch {
	case err != nil:
		return claim.Answer{Error: err.Error()}, nil
	case t != nil:
		return claim.Answer{Result: t}, nil
	case e.Tally == nil:
		sh := l.d.shard
		if e.Phase == claim.PhaseSearch {
			sh = claim.Share{Index: 0, Count: 1}
		}
		return claim.Answer{Share: &sh}, nil
	}
	m := l.d.settle(e.Ask, []claim.Tally{*e.Tally})
	return claim.Answer{Result: &m}, nil
}

// Progress shows the sweep's progress.
func (l local) Progress(p claim.Progress) { l.d.progress.update(0, p) }

// disagreement compares what two workers said about the same cell.
func disagreement(a, b cells.Outcome) string {
	if a.Status != b.Status {
		return fmt.Sprintf("the cell %s in one and %s in the other", a.Status, b.Status)
	}
	if len(a.Claims) != len(b.Claims) {
		return fmt.Sprintf("%d claims against %d", len(a.Claims), len(b.Claims))
	}
	for i := range a.Claims {
		x, y := a.Claims[i], b.Claims[i]
		x.Seconds, y.Seconds = 0, 0
		if !reflect.DeepEqual(x, y) {
			return fmt.Sprintf("claim %q reads %s %q in one and %s %q in the other", x.Name, x.Verdict, x.Residual, y.Verdict, y.Residual)
		}
	}
	return ""
}

package proto

import (
	"bufio"
	"bytes"
	"crypto/rand"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"runtime"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"assay/kernel/session"
	"assay/kernel/spawn"
)

// LimitError is a cell stopped by a limit, or a kernel process that died.
type LimitError struct {
	Message string
}

func (e *LimitError) Error() string { return e.Message }

// Limits are the bounds a driver puts on a kernel process; Start sends
// them in the start request.
type Limits struct {
	// MaxMemory caps the child's resident memory (bytes); the child is
	// killed when it crosses the cap, and sets it as its soft Go memory
	// limit.
	MaxMemory int64 `json:"max_memory,omitempty"`
	// MaxOutput caps one reply (bytes of JSON; DefaultMaxOutput when not
	// positive): the child keeps a cell's reply within it, and the driver
	// reads no line longer than MaxOutput+ReplySlack.
	MaxOutput int64 `json:"max_output,omitempty"`
	// Procs, when positive, is the number of threads the child may run Go
	// code on (GOMAXPROCS): workers that share the cores should not each
	// think they own all of them. Start leaves it out when the user set
	// GOMAXPROCS, which the child inherits.
	Procs int `json:"procs,omitempty"`
}

// Process is a kernel child process driven over JSON lines on a channel
// of its own. Its replies go to the inbox its driver gave it.
type Process struct {
	child    *spawn.Child
	state    *os.ProcessState // how it ended, once exited is closed
	requests *os.File         // the write end of the request channel
	exited   chan struct{}    // closed when the process has ended
	gone     chan struct{}    // closed when the driver stops listening
	stderr   *head
	limits   Limits
	overMem  atomic.Bool
	nonce    string // the run's secret, echoed in every reply

	mu        sync.Mutex
	want      []outstanding // the requests replies must answer, in order
	violation string        // why the process was killed for a bad reply
}

// outstanding is a request whose reply is due: op "start" or "run"
// (with the cell's index); its zero value stands for none.
type outstanding struct {
	op   string
	cell int
}

// Message is one reply from a process, or the news that it died.
type Message struct {
	From  *Process
	Reply Reply
	Dead  bool
}

// Start starts command (e.g. ["/path/assay", "kernel"]) and asks it
// to open a session with the given settings and limits; that reply, like
// every later one, arrives in inbox. The protocol runs on a channel of its
// own (see ChannelEnv), never on the child's standard output, which
// notebook code can reach through the interpreter; the child's standard
// error is kept (its start) to explain a death. The child is killed when
// this process dies (Linux), and ends when its request channel does. A
// child of the same command started early (spawn.Early) is taken instead
// of a new one: the limits travel in the start request, so it needs
// nothing at its start that was not known then.
func Start(command []string, s session.Settings, lim Limits, inbox chan<- Message) (*Process, error) {
	if lim.MaxOutput <= 0 {
		lim.MaxOutput = DefaultMaxOutput
	}
	env := os.Environ()
	switch _, set := os.LookupEnv(ThreadsEnv); {
	case set:
		lim.Procs = 0 // the user's setting, which the child inherits
	case lim.Procs <= 0:
		lim.Procs = runtime.GOMAXPROCS(0) // what the child would take by itself
	default:
		env = append(env, ThreadsEnv+"="+strconv.Itoa(lim.Procs))
	}
	child := spawn.Take(command)
	if child == nil {
		var err error
		if child, err = spawn.Start(command, env); err != nil {
			return nil, fmt.Errorf("cannot start the kernel process: %w", err)
		}
	}
	var secret [16]byte
	rand.Read(secret[:])
	p := &Process{child: child, requests: child.Requests, exited: make(chan struct{}), gone: make(chan struct{}), stderr: &head{max: 16 << 10},
		limits: lim, nonce: hex.EncodeToString(secret[:])}
	copied := make(chan struct{})
	go func() {
		io.Copy(p.stderr, child.Stderr)
		child.Stderr.Close()
		close(copied)
	}()
	deliver := func(m Message) {
		select {
		case inbox <- m:
		case <-p.gone:
		}
	}
	go func() {
		r := bufio.NewReaderSize(child.Replies, 64<<10)
		for {
			line, err := readLine(r, int(lim.MaxOutput+ReplySlack))
			if err == errLongLine {
				p.refuse(fmt.Sprintf("a reply longer than the output cap of %s allows; raise it with --max-output", FormatBytes(lim.MaxOutput)))
				break
			}
			if err != nil {
				break
			}
			spawn.Mark("reply")
			var reply Reply
			if err := json.Unmarshal(line, &reply); err != nil {
				p.refuse(fmt.Sprintf("%.60q, which is not a reply", line))
				break
			}
			if why := p.check(reply); why != "" {
				p.refuse(why)
				break
			}
			deliver(Message{From: p, Reply: reply})
		}
		child.Replies.Close()
		p.state, _ = child.Process.Wait()
		spawn.Mark("kernel exited")
		<-copied
		close(p.exited)
		deliver(Message{From: p, Dead: true})
	}()
	if lim.MaxMemory > 0 {
		go p.watchMemory()
	}
	if err := p.Send(Request{Op: "start", Settings: &s, Limits: &lim, Nonce: p.nonce}); err != nil {
		p.Close()
		return nil, err
	}
	go warmReplies.Do(warmReply)
	return p, nil
}

// warmReplies decodes a reply once per process, while the first kernel
// starts: a process's first json.Unmarshal of a Reply took ~1 ms (the
// decoder's code and types paged in), which delayed the first cell.
var warmReplies sync.Once

func warmReply() {
	var r Reply
	json.Unmarshal([]byte(`{"version":"","nonce":"","settings":{},"outcome":{"status":"ran","claims":[{}]}}`), &r)
}

// Send writes one request line; a dead process is a *LimitError.
func (p *Process) Send(req Request) error {
	line, err := json.Marshal(req)
	if err != nil {
		return err
	}
	if req.Op == "start" || req.Op == "run" {
		p.mu.Lock()
		w := outstanding{op: req.Op}
		if req.Cell != nil {
			w.cell = req.Cell.Index
		}
		p.want = append(p.want, w)
		p.mu.Unlock()
	}
	if _, err := p.requests.Write(append(line, '\n')); err != nil {
		return p.Death()
	}
	spawn.Mark("sent", req.Op)
	return nil
}

// check says why a reply does not answer the oldest request outstanding,
// or "". The kernel answers its requests in order (a driver may send a
// cell right behind the start request). Exchanges and progress belong to
// the cell being run; any other reply ends the request.
func (p *Process) check(r Reply) string {
	p.mu.Lock()
	defer p.mu.Unlock()
	var want outstanding
	if len(p.want) > 0 {
		want = p.want[0]
	}
	during := r.Exchange != nil || r.Progress != nil
	switch {
	case r.Nonce != p.nonce:
		return "a reply without this run's nonce"
	case want.op == "":
		return "a reply when no request was outstanding"
	case r.Cell != want.cell:
		return fmt.Sprintf("a reply about cell %d while cell %d was running", r.Cell, want.cell)
	case r.Exchange != nil && r.Progress != nil, during && r.Outcome != nil:
		return "a reply of two kinds at once"
	case during && want.op != "run":
		return "an exchange while no cell was running"
	case r.Outcome != nil && (want.op != "run" || r.Outcome.Cell != want.cell):
		return fmt.Sprintf("the outcome of cell %d in answer to %q", r.Outcome.Cell, want.op)
	case want.op == "run" && !during && r.Outcome == nil && r.Error == "":
		return "a reply to a cell without its outcome"
	}
	if !during {
		p.want = p.want[1:]
	}
	return ""
}

// refuse kills the process for a reply that does not answer the request.
func (p *Process) refuse(what string) {
	p.mu.Lock()
	p.violation = "the kernel sent a reply that does not answer the request: " + what
	p.mu.Unlock()
	p.child.Process.Kill()
}

// Death waits for the process to end and explains why it did: a reply
// that did not answer the request, the memory cap, a stack overflow, or
// the first line the Go runtime printed.
func (p *Process) Death() error {
	<-p.exited
	p.mu.Lock()
	violation := p.violation
	p.mu.Unlock()
	if violation != "" {
		return &LimitError{Message: violation}
	}
	text := p.stderr.String()
	if p.overMem.Load() || strings.Contains(text, "out of memory") || strings.Contains(text, "cannot allocate memory") {
		return &LimitError{Message: fmt.Sprintf("stopped: the cell needed more than the memory cap of %s; raise it with --max-memory", FormatBytes(p.limits.MaxMemory))}
	}
	if strings.Contains(text, "stack exceeds") || strings.Contains(text, "goroutine stack exceeds") {
		return &LimitError{Message: "stopped: recursion too deep (the interpreter's stack overflowed)"}
	}
	first := strings.SplitN(strings.TrimSpace(text), "\n", 2)[0]
	if first == "" {
		first = fmt.Sprint(p.state)
	}
	return &LimitError{Message: "the kernel process died: " + first}
}

// SlowStart is the error of a kernel that did not open its session
// within limit, the per-cell time limit.
func SlowStart(limit time.Duration) *LimitError {
	return &LimitError{Message: fmt.Sprintf("the kernel process did not start within %s; the per-cell time limit bounds a kernel's start too: raise it with the flag --timeout", limit)}
}

// Kill ends the process at once.
func (p *Process) Kill() {
	p.Unheard()
	p.child.Process.Kill()
	<-p.exited
}

// watchMemory polls the child's resident set size (Linux /proc) and kills
// it when it crosses the cap. The child also sets a soft Go memory limit.
func (p *Process) watchMemory() {
	path := fmt.Sprintf("/proc/%d/statm", p.child.Process.Pid)
	page := int64(os.Getpagesize())
	tick := time.NewTicker(20 * time.Millisecond)
	defer tick.Stop()
	for {
		select {
		case <-p.exited:
			return
		case <-tick.C:
			data, err := os.ReadFile(path)
			if err != nil {
				return
			}
			fields := strings.Fields(string(data))
			if len(fields) < 2 {
				return
			}
			pages, _ := strconv.ParseInt(fields[1], 10, 64)
			if pages*page > p.limits.MaxMemory {
				p.overMem.Store(true)
				p.child.Process.Kill()
				return
			}
		}
	}
}

// Unheard tells the process's reader that no one listens any more, so it
// never blocks on the inbox. The driver calls it from one goroutine only.
func (p *Process) Unheard() {
	select {
	case <-p.gone:
	default:
		close(p.gone)
	}
}

// Close ends the process and waits until it has exited.
func (p *Process) Close() error {
	p.Release()
	<-p.exited
	return nil
}

// Release ends the process without waiting for it: a kernel exits when
// its request channel ends, and one still there 2 s later is killed.
// Exiting takes a process of this binary ~3 ms (its pages unmapped), which
// a driver that is done with its kernel need not wait for.
func (p *Process) Release() {
	p.Unheard()
	p.requests.Close()
	go func() {
		select {
		case <-p.exited:
		case <-time.After(2 * time.Second):
			p.Kill()
		}
	}()
}

// head keeps the first max bytes written to it: a Go runtime crash states
// its cause first and then dumps every goroutine.
type head struct {
	mu  sync.Mutex
	buf bytes.Buffer
	max int
}

func (h *head) Write(b []byte) (int, error) {
	h.mu.Lock()
	defer h.mu.Unlock()
	if room := h.max - h.buf.Len(); room > 0 {
		h.buf.Write(b[:min(len(b), room)])
	}
	return len(b), nil
}

func (h *head) String() string {
	h.mu.Lock()
	defer h.mu.Unlock()
	return h.buf.String()
}

// FormatBytes prints a byte count in binary units, e.g. "2 GiB".
func FormatBytes(n int64) string {
	units := []string{"B", "KiB", "MiB", "GiB", "TiB"}
	f := float64(n)
	i := 0
	for f >= 1024 && i < len(units)-1 {
		f /= 1024
		i++
	}
	return strconv.FormatFloat(f, 'g', 4, 64) + " " + units[i]
}

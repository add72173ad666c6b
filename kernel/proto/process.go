package proto

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"os/exec"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"assay/kernel/session"
)

// LimitError is a cell stopped by a limit, or a kernel process that died.
type LimitError struct {
	Message string
}

func (e *LimitError) Error() string { return e.Message }

// Process is a kernel child process driven over JSON lines. Its replies
// go to the inbox its driver gave it.
type Process struct {
	cmd     *exec.Cmd
	stdin   io.WriteCloser
	exited  chan struct{} // closed when the process has ended
	gone    chan struct{} // closed when the driver stops listening
	stderr  *head
	maxMem  int64
	overMem atomic.Bool
}

// Message is one reply from a process, or the news that it died.
type Message struct {
	From  *Process
	Reply Reply
	Dead  bool
}

// Start starts command (e.g. ["/path/assay", "kernel"]) and asks it
// to open a session with the given settings; that reply, like every later
// one, arrives in inbox. maxMemory (bytes) caps the child's resident
// memory; the child is killed when it crosses the cap.
// procs, when positive, is the number of threads the child may run Go
// code on (GOMAXPROCS): workers that share the cores should not each
// think they own all of them.
func Start(command []string, s session.Settings, maxMemory int64, procs int, inbox chan<- Message) (*Process, error) {
	cmd := exec.Command(command[0], command[1:]...)
	cmd.Env = append(os.Environ(), MemoryEnv+"="+strconv.FormatInt(maxMemory, 10))
	if _, set := os.LookupEnv(ThreadsEnv); procs > 0 && !set {
		cmd.Env = append(cmd.Env, ThreadsEnv+"="+strconv.Itoa(procs))
	}
	stdin, err := cmd.StdinPipe()
	if err != nil {
		return nil, err
	}
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		return nil, err
	}
	p := &Process{cmd: cmd, stdin: stdin, exited: make(chan struct{}), gone: make(chan struct{}), stderr: &head{max: 16 << 10}, maxMem: maxMemory}
	cmd.Stderr = p.stderr
	if err := cmd.Start(); err != nil {
		return nil, fmt.Errorf("cannot start the kernel process: %w", err)
	}
	deliver := func(m Message) {
		select {
		case inbox <- m:
		case <-p.gone:
		}
	}
	go func() {
		dec := json.NewDecoder(stdout)
		for {
			var r Reply
			if err := dec.Decode(&r); err != nil {
				break
			}
			deliver(Message{From: p, Reply: r})
		}
		cmd.Wait()
		close(p.exited)
		deliver(Message{From: p, Dead: true})
	}()
	if maxMemory > 0 {
		go p.watchMemory()
	}
	if err := p.Send(Request{Op: "start", Settings: &s}); err != nil {
		p.Close()
		return nil, err
	}
	return p, nil
}

// Send writes one request line; a dead process is a *LimitError.
func (p *Process) Send(req Request) error {
	line, err := json.Marshal(req)
	if err != nil {
		return err
	}
	if _, err := p.stdin.Write(append(line, '\n')); err != nil {
		return p.Death()
	}
	return nil
}

// Death waits for the process to end and explains why it did: the memory
// cap, a stack overflow, or the first line the Go runtime printed.
func (p *Process) Death() error {
	<-p.exited
	text := p.stderr.String()
	if p.overMem.Load() || strings.Contains(text, "out of memory") || strings.Contains(text, "cannot allocate memory") {
		return &LimitError{Message: fmt.Sprintf("stopped: the cell needed more than the memory cap of %s; raise it with --max-memory", FormatBytes(p.maxMem))}
	}
	if strings.Contains(text, "stack exceeds") || strings.Contains(text, "goroutine stack exceeds") {
		return &LimitError{Message: "stopped: recursion too deep (the interpreter's stack overflowed)"}
	}
	first := strings.SplitN(strings.TrimSpace(text), "\n", 2)[0]
	if first == "" {
		first = fmt.Sprint(p.cmd.ProcessState)
	}
	return &LimitError{Message: "the kernel process died: " + first}
}

// Kill ends the process at once.
func (p *Process) Kill() {
	p.Unheard()
	if p.cmd.Process != nil {
		p.cmd.Process.Kill()
	}
	<-p.exited
}

// watchMemory polls the child's resident set size (Linux /proc) and kills
// it when it crosses the cap. The child also sets a soft Go memory limit.
func (p *Process) watchMemory() {
	path := fmt.Sprintf("/proc/%d/statm", p.cmd.Process.Pid)
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
			if pages*page > p.maxMem {
				p.overMem.Store(true)
				p.cmd.Process.Kill()
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

// Close ends the process.
func (p *Process) Close() error {
	p.Unheard()
	p.stdin.Close()
	select {
	case <-p.exited:
	case <-time.After(2 * time.Second):
		p.Kill()
	}
	return nil
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

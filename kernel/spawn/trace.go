package spawn

import (
	"os"
	"sync"
	"time"
)

// TraceEnv, set to a file name, makes every assay process append a line
// to that file at each step of its start-up and of a run (Mark): the
// wall-clock time in nanoseconds, the process id, the command and the
// step. Driver and kernel share the clock, so the lines of one run sorted
// by time are its timeline (DEVELOPERS.md, "Start-up"). Unset, Mark costs
// a comparison.
const TraceEnv = "ASSAY_TRACE"

// trace is the file of TraceEnv, opened by the package initialiser (one
// of the process's first: see package early), nil when tracing is off.
var trace struct {
	sync.Mutex
	f      *os.File
	prefix string // " pid command"
}

func init() {
	name := os.Getenv(TraceEnv)
	if name == "" {
		return
	}
	f, err := os.OpenFile(name, os.O_WRONLY|os.O_APPEND|os.O_CREATE, 0o644)
	if err != nil {
		return
	}
	cmd := "-"
	if len(os.Args) > 1 {
		cmd = os.Args[1]
	}
	trace.f, trace.prefix = f, " "+string(decimal(nil, int64(os.Getpid())))+" "+cmd
	Mark("init") // the first package initialiser of assay's own
}

// Mark records that this process reached a step (its words joined by
// spaces) now, when tracing is on.
func Mark(step ...string) {
	if trace.f == nil {
		return
	}
	now := time.Now().UnixNano()
	trace.Lock()
	defer trace.Unlock()
	line := append(decimal(nil, now), trace.prefix...)
	for _, w := range step {
		line = append(append(line, ' '), w...)
	}
	// One write per line: the processes append to one file.
	trace.f.Write(append(line, '\n'))
}

// decimal appends n ≥ 0 in decimal to b. (Package strconv would put this
// package's initialiser later in the process's start: see package early.)
func decimal(b []byte, n int64) []byte {
	var d [20]byte
	i := len(d)
	for {
		i--
		d[i] = byte('0' + n%10)
		if n /= 10; n == 0 {
			return append(b, d[i:]...)
		}
	}
}

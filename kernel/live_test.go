package kernel

import (
	"os"
	"strings"
	"sync"
	"testing"
	"time"

	"assay/cells"
	"assay/kernel/session"
)

// liveChild prepares live runs in kernel processes (this test binary),
// recording the cells that start.
func liveChild(t *testing.T) (*Live, func() []int) {
	t.Helper()
	t.Setenv("ASSAY_TEST_KERNEL", "1")
	var mu sync.Mutex
	var started []int
	l := NewLive(Options{Settings: session.DefaultSettings, Command: []string{os.Args[0]}, Workers: 1, Timeout: time.Minute,
		Steps: func(s Step) {
			if s.Claim == "" {
				mu.Lock()
				started = append(started, s.Cell)
				mu.Unlock()
			}
		}})
	t.Cleanup(l.Close)
	return l, func() []int {
		mu.Lock()
		defer mu.Unlock()
		out := started
		started = nil
		return out
	}
}

// outputs lists each cell's printed text, or its error.
func outputs(rep *cells.Report) []string {
	var out []string
	for _, o := range rep.Outcomes {
		switch {
		case o.Error != nil:
			out = append(out, "error: "+o.Error.Message)
		case o.Status == cells.NotRun:
			out = append(out, "not run")
		default:
			out = append(out, o.Output)
		}
	}
	return out
}

// A live run after an edit runs only from the first changed cell, in a
// namespace that has run exactly the cells before it: its outputs are
// those of a fresh run of the edited notebook (the reference here), which
// a kernel that had also run the old cell would not give.
func TestLiveRunsFromTheFirstChange(t *testing.T) {
	l, started := liveChild(t)
	steps := []struct {
		srcs []string
		runs []int // the cells that must start
	}{
		{[]string{"x = 1", "x = x + 1\ny = 5", "print(x, y)"}, []int{1, 2, 3}},
		{[]string{"x = 1", "x = x + 1\ny = 5", "print(x * 10, y)"}, []int{3}},                  // x is 2, not 3
		{[]string{"x = 1", "x = x + 10", "print(x * 10, y)"}, []int{1, 2, 3}},                  // y is gone: NameError
		{[]string{"x = 1", "x = x + 10", "print(x * 10)"}, []int{3}},                           // after an error, from the cell that failed
		{[]string{"x = 1", "x = x + 10", "print(x * 10)", "print(x)"}, []int{4}},               // a cell added at the end
		{[]string{"x = 3", "x = x + 10", "print(x * 10)", "print(x)"}, []int{1, 2, 3, 4}},      // the first cell
		{[]string{"x = 3", "x = x + 10", "print(x * 10)", "print(x)\nprint(1)"}, []int{4}},     // the last again
		{[]string{"x = 3", "x = x + 10", "print(x * 10)", "print(x)\nprint(1)"}, []int(nil)},   // nothing changed
		{[]string{"x = 3", "x = x + 10", "print(x * 10)", "print(x)\nprint(1 / 0)"}, []int{4}}, // an error
		{[]string{"x = 3", "x = x + 10", "print(x * 10)", "print(x)\nprint(2)"}, []int{4}},     // and its repair
	}
	for i, s := range steps {
		nb := notebook(t, s.srcs...)
		got := outputs(l.Run(nb))
		want := outputs(Run(nb, Options{Settings: session.DefaultSettings}))
		for k := range got {
			if strings.HasPrefix(got[k], "error: ") && strings.HasPrefix(want[k], "error: ") {
				continue // the messages name the same error; their Go wording is the session's
			}
			if got[k] != want[k] {
				t.Errorf("step %d, cell %d: live %q, fresh run %q", i, k+1, got[k], want[k])
			}
		}
		if runs := started(); !equalInts(runs, s.runs) {
			t.Errorf("step %d: cells %v started, want %v", i, runs, s.runs)
		}
		l.Ready() // the spare's replay, so each step finds it in place
	}
}

func equalInts(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// Close calls off a cell in the middle and ends the kernels.
func TestLiveCloseStopsARun(t *testing.T) {
	l, started := liveChild(t)
	done := make(chan *cells.Report, 1)
	go func() { done <- l.Run(notebook(t, "x = 1", "while True:\n    pass")) }()
	for seen := []int(nil); len(seen) < 2; seen = append(seen, started()...) {
		time.Sleep(20 * time.Millisecond)
	}
	time.Sleep(100 * time.Millisecond)
	l.Close()
	select {
	case rep := <-done:
		if e := rep.Outcomes[1].Error; e == nil || !strings.Contains(e.Message, "called off") {
			t.Errorf("the stopped cell: %+v", rep.Outcomes[1])
		}
	case <-time.After(10 * time.Second):
		t.Fatal("Close did not stop the run")
	}
}

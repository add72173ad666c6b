package kernel

import (
	"os"
	"os/exec"
	"strings"
	"testing"
	"time"

	"assay/cells"
	"assay/kernel/session"
)

// slowCell takes a tenth of a second or so: longer than the limits these
// tests give its replays.
const slowCell = "n = 0\nfor i in range(1000000):\n    n = n + 1"

// childDriver opens a driver whose kernels are this test binary.
func childDriver(t *testing.T, workers int) *driver {
	t.Helper()
	t.Setenv("ASSAY_TEST_KERNEL", "1")
	d, err := newDriver(Options{Settings: session.DefaultSettings, Command: []string{os.Args[0]}, Workers: workers, Timeout: time.Minute, MaxMemory: DefaultMaxMemory})
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(d.close)
	return d
}

// A replay after a restart keeps its cell's own limit, and a replay that
// crosses it says which cell it was replaying.
func TestKeepGoingReplayNamesTheCell(t *testing.T) {
	d := childDriver(t, 1)
	c := session.Cell{Index: 1, Line: 3, Source: slowCell}
	if _, _, err := d.run(c, time.Minute); err != nil {
		t.Fatal(err)
	}
	d.history[0].timeout = 10 * time.Millisecond // as if the cell had said timeout=10ms
	err := d.restart()
	if err == nil || !strings.Contains(err.Error(), "replay of cell 1 (line 3)") || !strings.Contains(err.Error(), "stopped after 10ms, its time limit") {
		t.Fatalf("restart: %v", err)
	}
}

// A helper's replay of an earlier cell has that cell's limit, not the
// current cell's, and the message says it was a replay.
func TestHelperReplayKeepsItsLimit(t *testing.T) {
	d := childDriver(t, 2)
	if _, _, err := d.run(session.Cell{Index: 1, Line: 3, Source: slowCell}, time.Minute); err != nil {
		t.Fatal(err)
	}
	d.history[0].timeout = 10 * time.Millisecond
	sweep := session.Cell{Index: 2, Line: 8, Source: `identity("k + k = 2k", lambda k: (k + k, 2 * k), over=lambda k: k, samples=300)`}
	_, _, err := d.run(sweep, time.Minute)
	if err == nil || !strings.Contains(err.Error(), "worker 1: replay of cell 1 (line 3): stopped after 10ms, its time limit") {
		t.Fatalf("sweep: %v", err)
	}
}

// A kernel that never opens its session is stopped by the start-up
// limit (the per-cell --timeout), and the report is still made.
func TestKernelStartHasALimit(t *testing.T) {
	sleep, err := exec.LookPath("sleep")
	if err != nil {
		t.Skip("no sleep command")
	}
	done := make(chan *cells.Report, 1)
	go func() {
		done <- Run(notebook(t, "x = 1"), Options{Settings: session.DefaultSettings, Command: []string{sleep, "60"}, Timeout: 300 * time.Millisecond})
	}()
	select {
	case rep := <-done:
		if len(rep.Problems) != 1 || !strings.Contains(rep.Problems[0].Message, "did not start within 300ms") || !strings.Contains(rep.Problems[0].Message, "--timeout") {
			t.Errorf("problems %+v", rep.Problems)
		}
	case <-time.After(10 * time.Second):
		t.Fatal("the run still waits for a kernel that never starts")
	}
}

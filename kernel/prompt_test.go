package kernel

import (
	"os"
	"strings"
	"testing"
	"time"

	"assay/cells"
	"assay/kernel/session"
)

func newTestPrompt(t testing.TB, timeout time.Duration) *Prompt {
	t.Helper()
	t.Setenv("ASSAY_TEST_KERNEL", "1")
	p, err := NewPrompt(Options{Settings: session.DefaultSettings, Command: []string{os.Args[0]}, Workers: 1, Timeout: timeout})
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(p.Close)
	return p
}

// An input that crosses its time limit, or is interrupted, fails with a
// message that says so; the next input finds the names defined before it
// (replayed in a fresh kernel), and not those of the stopped input.
// 3·(1/3) = 1 (arithmetic).
func TestPromptReplayKeepsNames(t *testing.T) {
	p := newTestPrompt(t, 2*time.Second)
	if o := p.Input("x = frac(1, 3)"); o.Status != cells.Ran {
		t.Fatalf("%+v", o.Error)
	}
	o := p.Input("y = 5\nwhile True:\n    pass")
	if o.Error == nil || !strings.Contains(o.Error.Message, "stopped after 2s") {
		t.Fatalf("time limit: %+v", o.Error)
	}
	if o := p.Input("3 * x"); o.Output != "1\n" {
		t.Errorf("after the time limit: output %q, error %+v", o.Output, o.Error)
	}
	if o := p.Input("y"); o.Error == nil || !strings.Contains(o.Error.Message, "name 'y' is not defined") {
		t.Errorf("a name of the stopped input survived: %+v", o)
	}
	go func() {
		time.Sleep(300 * time.Millisecond) // the input is running by then, or soon after
		p.Interrupt()
	}()
	o = p.Input("while True:\n    pass")
	if o.Error == nil || !strings.Contains(o.Error.Message, "interrupted") {
		t.Fatalf("interrupt: %+v", o.Error)
	}
	if o := p.Input("3 * x"); o.Output != "1\n" {
		t.Errorf("after the interrupt: output %q, error %+v", o.Output, o.Error)
	}
}

// BenchmarkPromptInput measures one input's round trip through the kernel
// process: det [[1,2],[3,4]] = -2 (common practice).
func BenchmarkPromptInput(b *testing.B) {
	p := newTestPrompt(b, time.Minute)
	for b.Loop() {
		if o := p.Input("det(matrix([[1, 2], [3, 4]]))"); o.Output != "-2\n" {
			b.Fatalf("output %q, error %+v", o.Output, o.Error)
		}
	}
}

package cputime

import (
	"os/exec"
	"testing"
	"time"
)

// Busy work must show as processor time, and a waited-for child's work
// under Children (getrusage(2): RUSAGE_CHILDREN counts terminated,
// waited-for children).
func TestUsage(t *testing.T) {
	before, ok := Self()
	if !ok {
		t.Skip("no processor time on this system")
	}
	x, start := 1.0, time.Now()
	for time.Since(start) < 50*time.Millisecond {
		x = x*1.0000001 + 1e-9
	}
	after, _ := Self()
	if after-before < 10*time.Millisecond {
		t.Errorf("50 ms of busy work took %v of processor time (x=%g)", after-before, x)
	}
	c0, _ := Children()
	if err := exec.Command("sh", "-c", "i=0; while [ $i -lt 20000 ]; do i=$((i+1)); done").Run(); err != nil {
		t.Skip("no shell:", err)
	}
	if c1, _ := Children(); c1 <= c0 {
		t.Errorf("a busy child added no processor time: %v then %v", c0, c1)
	}
}

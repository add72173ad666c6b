package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
	"time"
)

// builtAssay builds the assay binary, whose `check` and `run` start their
// kernel from a package initialiser (package early), unlike the test
// binary.
func builtAssay(t *testing.T) string {
	t.Helper()
	bin := filepath.Join(t.TempDir(), "assay")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("build: %v\n%s", err, out)
	}
	return bin
}

// The kernel started early is the one the run uses (one child, not an
// idle one beside a second), the limits reach it in its start request
// though it started before the flags were read, and it dies with its
// parent like any kernel (it was started from the main thread, which lives
// as long as the process).
func TestEarlyKernel(t *testing.T) {
	if runtime.GOOS != "linux" {
		t.Skip("finds the kernel through /proc")
	}
	bin := builtAssay(t)
	flood := copyNotebook(t, "../../testdata/bad/process-output-flood.md")
	out, err := exec.Command(bin, "check", "--max-output", "1MiB", flood).CombinedOutput()
	if err == nil || !strings.Contains(string(out), "more than 1 MiB, the output cap") {
		t.Errorf("a 1 MiB cap with a kernel started early: %v, want exit 2 and the cap named\n%s", err, out)
	}
	if out, err := exec.Command(bin, "check", "--max-output", "32MiB", flood).CombinedOutput(); err != nil {
		t.Errorf("a 32 MiB cap with a kernel started early: %v\n%s", err, out)
	}

	parent := exec.Command(bin, "run", copyNotebook(t, "../../testdata/bad/process-parent-killed.md"))
	if err := parent.Start(); err != nil {
		t.Fatal(err)
	}
	defer parent.Wait()
	defer parent.Process.Kill()
	var kernels []int
	for deadline := time.Now().Add(20 * time.Second); time.Now().Before(deadline); time.Sleep(50 * time.Millisecond) {
		if kernels = childrenOf(parent.Process.Pid); len(kernels) > 0 {
			time.Sleep(500 * time.Millisecond) // into the endless cell, and time for a second child to show
			kernels = childrenOf(parent.Process.Pid)
			break
		}
	}
	if len(kernels) != 1 {
		t.Fatalf("the run has %d kernel processes (%v), want the one started early", len(kernels), kernels)
	}
	parent.Process.Kill()
	for deadline := time.Now().Add(5 * time.Second); alive(kernels[0]); time.Sleep(20 * time.Millisecond) {
		if time.Now().After(deadline) {
			if p, err := os.FindProcess(kernels[0]); err == nil {
				p.Kill()
			}
			t.Fatalf("the kernel started early (pid %d) outlived its parent by 5 s", kernels[0])
		}
	}
}

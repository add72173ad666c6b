package main

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"assay/kernel/spawn"
)

// builtAssay builds the assay binary, whose `check` and `run` start their
// kernel from a package initialiser (package early), unlike the test
// binary; once for all the tests, removed by TestMain.
func builtAssay(t *testing.T) string {
	t.Helper()
	built.once.Do(func() {
		if built.dir, built.err = os.MkdirTemp("", "assay-bin-"); built.err != nil {
			return
		}
		bin := filepath.Join(built.dir, "assay")
		if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
			built.err = fmt.Errorf("build: %v\n%s", err, out)
			return
		}
		built.bin = bin
	})
	if built.err != nil {
		t.Fatal(built.err)
	}
	return built.bin
}

var built struct {
	once     sync.Once
	dir, bin string
	err      error
}

// A run traced with ASSAY_TRACE (spawn.TraceEnv) writes the steps of both
// its processes to one file, each in order and on one clock: the kernel
// starts from the driver's initialiser, the driver sends the first cell
// right behind the start request, and the kernel answers each request
// after it was sent and before the driver reads the reply.
func TestStartTrace(t *testing.T) {
	bin := builtAssay(t)
	dir := t.TempDir()
	nb := filepath.Join(dir, "one.md")
	if err := os.WriteFile(nb, []byte("# one claim\n\n```cell\nidentity(\"two\", 1 + 1, 2)\n```\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(dir, "trace")
	cmd := exec.Command(bin, "check", nb)
	cmd.Env = append(os.Environ(), spawn.TraceEnv+"="+file)
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("check: %v\n%s", err, out)
	}
	data, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	at := map[string][]int64{} // "command step" -> times, in the file's order
	var cmds []string          // the command of each process, in order of first line
	pids := map[string]string{}
	for _, line := range strings.Split(strings.TrimSpace(string(data)), "\n") {
		f := strings.SplitN(line, " ", 4)
		if len(f) != 4 {
			t.Fatalf("trace line %q: want time, pid, command, step", line)
		}
		ns, err := strconv.ParseInt(f[0], 10, 64)
		if err != nil {
			t.Fatalf("trace line %q: %v", line, err)
		}
		if pid, seen := pids[f[2]]; !seen {
			pids[f[2]] = f[1]
			cmds = append(cmds, f[2])
		} else if pid != f[1] {
			t.Fatalf("two %s processes traced (%s, %s)", f[2], pid, f[1])
		}
		key := f[2] + " " + f[3]
		at[key] = append(at[key], ns)
	}
	if !slices.Equal(cmds, []string{"check", "kernel"}) {
		t.Fatalf("traced processes %v, want check then kernel\n%s", cmds, data)
	}
	// Each process's steps, in the order they must come.
	for _, steps := range [][]string{
		// the first cell goes right behind the start request
		{"check init", "check spawn", "check spawned", "check main", "check sent start", "check sent run", "check reply", "check run done", "check exit"},
		{"kernel init", "kernel main", "kernel serving", "kernel request", "kernel handled start", "kernel replied", "kernel handled run"},
		// across the processes
		{"check spawn", "kernel init", "check exit"},
		{"check sent start", "kernel handled start", "check reply"},
		{"check sent run", "kernel handled run", "check exit"},
	} {
		var last int64
		for _, s := range steps {
			if len(at[s]) == 0 {
				t.Fatalf("no step %q in the trace\n%s", s, data)
			}
			if at[s][0] < last {
				t.Errorf("%q before the step ahead of it in %v\n%s", s, steps, data)
			}
			last = at[s][0]
		}
	}
	if n := len(at["kernel handled run"]); n != 1 {
		t.Errorf("the kernel ran %d cells, want 1\n%s", n, data)
	}
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

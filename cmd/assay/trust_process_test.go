package main

import (
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"
)

// report reads the Markdown and HTML reports a run wrote beside nb.
func reports(t *testing.T, nb string) (md, html string) {
	t.Helper()
	base := strings.TrimSuffix(nb, ".md")
	m, err := os.ReadFile(base + ".report.md")
	if err != nil {
		t.Fatalf("no report written: %v", err)
	}
	h, err := os.ReadFile(base + ".report.html")
	if err != nil {
		t.Fatalf("no HTML report written: %v", err)
	}
	return string(m), string(h)
}

// A cell that writes a well-formed reply line every way it can reach —
// the interpreter's "single"-mode repr, its debug line, print, sys.stdout
// and sys.stderr — cannot forge its verdict: the false identity fails in
// every report, and the forged figure is nowhere.
func TestForgedReplyFails(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/process-forged-reply.md")
	code, stdout, stderr := assay(t, "run", nb)
	if code != 1 || !strings.Contains(stdout, "fails  one equals two") || !strings.Contains(stdout, ".md:28") {
		t.Errorf("exit %d, want 1 and the claim failing at line 28\n%s%s", code, stdout, stderr)
	}
	md, html := reports(t, nb)
	if !strings.Contains(md, "| one equals two | identity | exact rational arithmetic | `-1` | ✘ fails | cell 1, line 28 |") || strings.Contains(md, "1 holds") {
		t.Errorf("the Markdown report does not say the identity fails:\n%s", md)
	}
	if !strings.Contains(html, "one equals two): exact non-zero residual") || strings.Contains(html, "<script") {
		t.Errorf("the HTML report does not say the identity fails, or carries a script")
	}
	if figs, _ := filepath.Glob(filepath.Join(filepath.Dir(nb), "*.svg")); len(figs) > 0 {
		t.Errorf("a forged figure was written: %v", figs)
	}
	code, out, _ := assay(t, "check", "--json", nb)
	var doc struct {
		Claims []struct{ Name, Verdict string } `json:"claims"`
		Exit   int                              `json:"exit"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	if code != 1 || doc.Exit != 1 || len(doc.Claims) != 1 || doc.Claims[0].Verdict != "fails" {
		t.Errorf("JSON report: exit %d, %+v", code, doc)
	}
}

// The interpreter's debug line on type(name, bases, dict) goes nowhere,
// and the cell runs on at once instead of waiting for its time limit.
func TestTypeDebugLineDoesNotHang(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/process-type-debug-line.md")
	began := time.Now()
	code, stdout, stderr := assay(t, "check", nb)
	if code != 0 || !strings.Contains(stdout, "holds  one plus one") {
		t.Errorf("exit %d\n%s%s", code, stdout, stderr)
	}
	if time.Since(began) > 5*time.Second {
		t.Errorf("the cell took %s", time.Since(began))
	}
}

// A helper kernel's replay of a slow cell does not count against the
// sampled claim's short limit: one worker and two write the same report.
func TestReplayIsNotTheCellsTime(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/process-replay-slow-cell.md")
	dir := filepath.Dir(nb)
	for _, w := range []string{"1", "2"} {
		code, stdout, stderr := assay(t, "run", "--workers", w, "-o", filepath.Join(dir, "w"+w+".md"), nb)
		if code != 0 || !strings.Contains(stdout, "holds  k + k = 2k") {
			t.Errorf("--workers %s: exit %d\n%s%s", w, code, stdout, stderr)
		}
	}
	one, _ := os.ReadFile(filepath.Join(dir, "w1.md"))
	two, _ := os.ReadFile(filepath.Join(dir, "w2.md"))
	if normalizeTimes(one) != normalizeTimes(two) {
		t.Errorf("two workers wrote another report than one:\n%s\n---\n%s", one, two)
	}
}

// With --keep-going, the replay of a cell after a restart keeps that
// cell's own timeout= rather than the --timeout flag's.
func TestKeepGoingReplayKeepsCellTimeout(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/process-keep-going-replay.md")
	code, stdout, stderr := assay(t, "run", "--keep-going", "--timeout", "1s", nb)
	if code != 2 || !strings.Contains(stdout, ".md:14: stopped after 1s, its time limit") {
		t.Errorf("exit %d, want 2 for the endless cell at line 14\n%s%s", code, stdout, stderr)
	}
	if strings.Contains(stdout, "replay of cell") {
		t.Errorf("the replay was stopped:\n%s", stdout)
	}
	if md, _ := reports(t, nb); !strings.Contains(md, "n is 10000000") {
		t.Errorf("the third cell did not run after the replay:\n%s", md)
	}
}

// A cell printing more than the output cap fails with a message naming
// its line and the flag, the report is still written, and the run does
// not buffer what the cell printed.
func TestOutputCap(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/process-output-flood.md")
	var before, after runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&before)
	code, stdout, stderr := assay(t, "run", nb)
	runtime.ReadMemStats(&after)
	want := "more than 16 MiB, the output cap"
	if code != 2 || !strings.Contains(stdout, ".md:6: ") || !strings.Contains(stdout, want) || !strings.Contains(stdout, "--max-output") {
		t.Errorf("exit %d, want 2 and %q at line 6\n%s%s", code, want, stdout, stderr)
	}
	md, _ := reports(t, nb)
	if !strings.Contains(md, want) || !strings.Contains(md, "line 6") || len(md) > 1<<20 {
		t.Errorf("the report lacks the message or holds the whole output (%d bytes)", len(md))
	}
	// The cell printed 24 MB; the run keeps 64 KiB of it.
	if grew := after.TotalAlloc - before.TotalAlloc; grew > 16<<20 {
		t.Errorf("the run allocated %d MiB for a cell over the output cap", grew>>20)
	}
}

// --max-output moves the cap both ways: the 24 MB cell runs under a
// 32 MiB cap and fails under a 1 MiB one, which the message names.
func TestOutputCapFlag(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/process-output-flood.md")
	if code, stdout, stderr := assay(t, "check", "--max-output", "32MiB", nb); code != 0 {
		t.Errorf("exit %d under a 32 MiB cap, want 0\n%s%s", code, stdout, stderr)
	}
	code, stdout, stderr := assay(t, "check", "--max-output", "1MiB", nb)
	if code != 2 || !strings.Contains(stdout, "more than 1 MiB, the output cap") {
		t.Errorf("exit %d under a 1 MiB cap, want 2 and the cap named\n%s%s", code, stdout, stderr)
	}
	if code, _, stderr := assay(t, "check", "--max-output", "lots", nb); code != 2 || !strings.Contains(stderr, "max-output") {
		t.Errorf("exit %d for --max-output lots, want 2 and the flag named\n%s", code, stderr)
	}
}

// The kernel dies with the run that started it, even in the middle of a
// cell that never ends: whether the run is killed outright or asked to
// terminate.
func TestKernelDiesWithItsParent(t *testing.T) {
	if runtime.GOOS != "linux" {
		t.Skip("finds the kernel through /proc")
	}
	for _, sig := range []syscall.Signal{syscall.SIGKILL, syscall.SIGTERM} {
		t.Run(sig.String(), func(t *testing.T) {
			nb := copyNotebook(t, "../../testdata/bad/process-parent-killed.md")
			parent := exec.Command(os.Args[0], "-test.run=^TestParentOfAKernel$")
			parent.Env = append(os.Environ(), "ASSAY_TEST_PARENT_OF="+nb)
			if err := parent.Start(); err != nil {
				t.Fatal(err)
			}
			kernel := 0
			for deadline := time.Now().Add(20 * time.Second); kernel == 0 && time.Now().Before(deadline); time.Sleep(20 * time.Millisecond) {
				kernel = childOf(parent.Process.Pid)
			}
			if kernel == 0 {
				parent.Process.Kill()
				parent.Wait()
				t.Fatal("the run started no kernel")
			}
			time.Sleep(500 * time.Millisecond) // into the endless cell
			parent.Process.Signal(sig)
			parent.Wait()
			for deadline := time.Now().Add(5 * time.Second); alive(kernel); time.Sleep(20 * time.Millisecond) {
				if time.Now().After(deadline) {
					if p, err := os.FindProcess(kernel); err == nil {
						p.Kill()
					}
					t.Fatalf("the kernel (pid %d) outlived its parent by 5 s", kernel)
				}
			}
		})
	}
}

// TestParentOfAKernel is the run TestKernelDiesWithItsParent kills.
func TestParentOfAKernel(t *testing.T) {
	nb := os.Getenv("ASSAY_TEST_PARENT_OF")
	if nb == "" {
		t.Skip("the parent process of TestKernelDiesWithItsParent")
	}
	assay(t, "run", "--workers", "1", nb)
}

// childOf finds a child process of pid (Linux /proc), or 0.
func childOf(pid int) int {
	if c := childrenOf(pid); len(c) > 0 {
		return c[0]
	}
	return 0
}

// childrenOf lists the child processes of pid that have not ended (Linux
// /proc).
func childrenOf(pid int) []int {
	var out []int
	stats, _ := filepath.Glob("/proc/[0-9]*/stat")
	for _, f := range stats {
		if ppid, _ := statField(f, 1); ppid == strconv.Itoa(pid) {
			if n, _ := strconv.Atoi(filepath.Base(filepath.Dir(f))); alive(n) {
				out = append(out, n)
			}
		}
	}
	return out
}

// alive says pid is a process that has not ended (a zombie has).
func alive(pid int) bool {
	state, ok := statField("/proc/"+strconv.Itoa(pid)+"/stat", 0)
	return ok && state != "Z" && state != "X"
}

// statField reads field i after the command name of a /proc stat file:
// 0 is the state, 1 the parent's pid.
func statField(path string, i int) (string, bool) {
	data, err := os.ReadFile(path)
	if err != nil {
		return "", false
	}
	end := bytes.LastIndexByte(data, ')')
	if end < 0 {
		return "", false
	}
	fields := strings.Fields(string(data[end+1:]))
	if i >= len(fields) {
		return "", false
	}
	return fields[i], true
}

package main

import (
	"bufio"
	"bytes"
	"io"
	"net/http"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"
)

// children lists the processes whose parent is pid (Linux /proc).
func children(pid int) []int {
	var out []int
	stats, _ := filepath.Glob("/proc/[0-9]*/stat")
	for _, f := range stats {
		data, err := os.ReadFile(f)
		if err != nil {
			continue
		}
		// pid (comm) state ppid …; comm may hold spaces, so cut at the last ')'.
		i := strings.LastIndexByte(string(data), ')')
		if fields := strings.Fields(string(data[i+1:])); i > 0 && len(fields) > 1 && fields[1] == strconv.Itoa(pid) {
			c, _ := strconv.Atoi(filepath.Base(filepath.Dir(f)))
			out = append(out, c)
		}
	}
	return out
}

// assay watch prints its address first, serves the report, and on Ctrl-C
// or SIGTERM stops with status 0, leaving no kernel process behind.
func TestWatchStopsCleanly(t *testing.T) {
	if _, err := os.Stat("/proc/self/stat"); err != nil {
		t.Skip("needs Linux /proc to find child processes")
	}
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
		t.Run(sig.String(), func(t *testing.T) {
			nb := copyNotebook(t, "../../testdata/bad/until-unknown-id.md")
			cmd := exec.Command(os.Args[0], "watch", nb)
			cmd.Env = append(os.Environ(), "ASSAY_TEST_MAIN=1")
			out, err := cmd.StdoutPipe()
			if err != nil {
				t.Fatal(err)
			}
			if err := cmd.Start(); err != nil {
				t.Fatal(err)
			}
			defer cmd.Process.Kill()
			first, err := bufio.NewReader(out).ReadString('\n')
			if err != nil || !regexp.MustCompile(`^http://127\.0\.0\.1:[0-9]+/\n$`).MatchString(first) {
				t.Fatalf("first line %q (%v)", first, err)
			}
			url := strings.TrimSpace(first)
			for began := time.Now(); ; time.Sleep(50 * time.Millisecond) {
				resp, err := http.Get(url)
				if err == nil {
					body, _ := io.ReadAll(resp.Body)
					resp.Body.Close()
					if strings.Contains(string(body), `class="ok"`) {
						break
					}
				}
				if time.Since(began) > 20*time.Second {
					t.Fatal("the first run did not show")
				}
			}
			kids := children(cmd.Process.Pid)
			if len(kids) == 0 {
				t.Fatal("no kernel process found while watching")
			}
			cmd.Process.Signal(sig)
			done := make(chan error, 1)
			go func() { done <- cmd.Wait() }()
			select {
			case err := <-done:
				if err != nil {
					t.Errorf("assay watch after %s: %v", sig, err)
				}
			case <-time.After(10 * time.Second):
				t.Fatalf("assay watch still runs 10 s after %s", sig)
			}
			for _, k := range kids {
				if _, err := os.Stat("/proc/" + strconv.Itoa(k)); err == nil {
					t.Errorf("kernel process %d is left after %s", k, sig)
				}
			}
		})
	}
}

func TestWatchBadArguments(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"watch", "--addr", "0.0.0.0:0", "../../testdata/bad/until-unknown-id.md"}, "loopback address only"},
		{[]string{"watch", "no-such-notebook.md"}, "cannot read notebook no-such-notebook.md"},
		{[]string{"watch"}, "give exactly one notebook"},
	} {
		code, _, stderr := assay(t, c.args...)
		if code != 2 || !strings.Contains(stderr, c.want) {
			t.Errorf("%v: exit %d, stderr %q", c.args, code, stderr)
		}
	}
}

// run --until runs the cells up to the one with that id: the cells after
// it are not run, and say why; an unknown id is refused, naming the ids
// there are with their lines. 3·(1/3) = 1, ≠ 2: arithmetic.
func TestRunUntil(t *testing.T) {
	dir := t.TempDir()
	nb := filepath.Join(dir, "nb.md")
	text := "# Until\n\n```cell id=a\nx = frac(1, 3)\n```\n\n```cell id=b\nidentity(\"three thirds\", 3 * x, 1)\n```\n\n```cell id=c\nidentity(\"not two\", 3 * x, 2)\n```\n"
	if err := os.WriteFile(nb, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	code, stdout, stderr := assay(t, "run", "--until", "b", nb)
	if code != 0 || !strings.Contains(stdout, "three thirds") || strings.Contains(stdout, "not two") {
		t.Fatalf("--until b: exit %d\n%s%s", code, stdout, stderr)
	}
	report, err := os.ReadFile(filepath.Join(dir, "nb.report.md"))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(report), "Cell 3 (c) was not run: the run stopped after cell 2, as --until asked.") {
		t.Errorf("the report does not say why cell 3 did not run:\n%s", report)
	}
	if code, _, _ := assay(t, "run", "--until", "c", nb); code != 1 {
		t.Errorf("--until c: exit %d, want 1 (a claim fails)", code)
	}
	// An unknown id is a mistake on the command line: one message naming
	// the notebook and its ids with their lines, before anything runs;
	// exit 2, and the report of an earlier run is left as it was.
	bad := copyNotebook(t, "../../testdata/bad/until-unknown-id.md")
	if code, _, stderr := assay(t, "run", bad); code != 0 {
		t.Fatalf("the notebook itself: exit %d, %s", code, stderr)
	}
	earlier, err := os.ReadFile(strings.TrimSuffix(bad, ".md") + ".report.md")
	if err != nil {
		t.Fatal(err)
	}
	code, stdout, stderr = assay(t, "run", "--until", "volumes", bad)
	want := "assay run: --until volumes: no cell of " + bad + " has id=volumes; the ids are setup (line 6), thirds (line 10); nothing was run and no report was written\n"
	if code != 2 || stderr != want || stdout != "" {
		t.Errorf("unknown id: exit %d, stdout %q, stderr %q; want %q", code, stdout, stderr, want)
	}
	if now, _ := os.ReadFile(strings.TrimSuffix(bad, ".md") + ".report.md"); !bytes.Equal(now, earlier) {
		t.Error("a refused --until changed the earlier report")
	}
	if code, _, stderr = assay(t, "run", "--until", "b", "--in-place", nb); code != 2 || !strings.Contains(stderr, "--until") {
		t.Errorf("--until with --in-place: exit %d, %q", code, stderr)
	}
}

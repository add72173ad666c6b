package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/creack/pty"

	"assay/kernel/repl"
)

// replPiped runs the test binary as `assay repl ARGS` with stdin from a
// pipe.
func replPiped(t *testing.T, stdin string, args ...string) (code int, stdout, stderr string) {
	t.Helper()
	cmd := exec.Command(os.Args[0], append([]string{"repl", "--max-memory", "300MiB"}, args...)...)
	cmd.Env = append(os.Environ(), "ASSAY_TEST_MAIN=1")
	cmd.Stdin = strings.NewReader(stdin)
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	err := cmd.Run()
	code = cmd.ProcessState.ExitCode()
	if err != nil && code < 0 {
		t.Fatal(err)
	}
	return code, out.String(), errb.String()
}

// From a pipe: no prompts, values shown, a multi-line def ended by a blank
// line, an error that does not end the session, a claim's verdict line.
// det [[1,2],[3,4]] = 1·4 − 2·3 = −2 (a 2×2 determinant, common practice);
// 12² = 144 and 2² = 4 (arithmetic).
func TestReplFromPipe(t *testing.T) {
	code, out, errs := replPiped(t, "det(matrix([[1, 2], [3, 4]]))\n")
	if code != 0 || out != "-2\n" {
		t.Fatalf("exit %d, stdout %q, stderr %q; want -2", code, out, errs)
	}
	in := "def sq(x):\n    return x * x\n\nsq(12)\nnot_defined\nx = sq(2); x\nidentity(\"two squared\", sq(2), 4)\nNone\n"
	code, out, errs = replPiped(t, in)
	want := []string{"144\n", "input 3:1: NameError: name 'not_defined' is not defined\n", "4\n", "✔ holds  two squared  0  input 5:1\n"}
	at := 0
	for _, w := range want {
		i := strings.Index(out[at:], w)
		if i < 0 {
			t.Fatalf("stdout lacks %q after byte %d:\n%s\nstderr: %s", w, at, out, errs)
		}
		at += i + len(w)
	}
	if code != 0 || strings.Contains(out, repl.Prompt) || strings.Contains(out, "None") || strings.Contains(out, "True") {
		t.Errorf("exit %d; prompts or None in stdout:\n%s", code, out)
	}
}

// Starting from a notebook: its summary, then inputs that see its names.
// x = 1/3 in the notebook, so 3·x = 1 (arithmetic).
func TestReplFromNotebook(t *testing.T) {
	dir := t.TempDir()
	nb := filepath.Join(dir, "nb.md")
	text := "# Start\n\n```cell\nx = frac(1, 3)\nidentity(\"three thirds\", 3 * x, 1)\n```\n"
	if err := os.WriteFile(nb, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, errs := replPiped(t, "3 * x\n", nb)
	if code != 0 || !strings.Contains(out, "✔ holds  three thirds") || !strings.Contains(out, "1 claim — 1 holds") || !strings.HasSuffix(out, "\n1\n") {
		t.Errorf("exit %d\nstdout:\n%s\nstderr: %s", code, out, errs)
	}
	if _, err := os.Stat(filepath.Join(dir, "nb.report.md")); err == nil {
		t.Errorf("repl wrote a report")
	}
}

// Bad input: a notebook that does not parse closes the session with its
// line; a cell that fails is reported with its line and the session
// opens with the names of the cells before it; an unknown flag.
func TestReplBadInput(t *testing.T) {
	code, out, errs := replPiped(t, "1\n", "../../testdata/bad/unclosed-fence.md")
	if code != 2 || out != "" || !strings.Contains(errs, "unclosed-fence.md:3: ") || !strings.Contains(errs, "never closed") {
		t.Errorf("unparsable notebook: exit %d, stdout %q, stderr %q", code, out, errs)
	}
	code, out, errs = replPiped(t, "y\nz\n", "../../testdata/bad/repl-cell-error.md")
	if code != 0 || !strings.Contains(out, "repl-cell-error.md:9: NameError: name 'undefined_radius' is not defined") || !strings.Contains(out, "\n7\n") ||
		!strings.Contains(out, "input 2:1: NameError: name 'z' is not defined") {
		t.Errorf("failing notebook: exit %d\nstdout:\n%s\nstderr: %s", code, out, errs)
	}
	code, out, errs = replPiped(t, "1\n", "--colour")
	if code != 2 || out != "" || !strings.Contains(errs, "flag provided but not defined: -colour") {
		t.Errorf("unknown flag: exit %d, stdout %q, stderr %q", code, out, errs)
	}
}

// terminal is a session in a pseudo-terminal, with what it has printed.
type terminal struct {
	t    *testing.T
	pty  *os.File
	cmd  *exec.Cmd
	mu   sync.Mutex
	out  bytes.Buffer
	seen int // expect looks after this offset
}

func (term *terminal) send(s string) {
	if _, err := term.pty.WriteString(s); err != nil {
		term.t.Fatal(err)
	}
}

// expect waits (generously) for want to appear after what was expected last.
func (term *terminal) expect(want string) {
	term.t.Helper()
	if term.within(want, 30*time.Second) {
		return
	}
	term.mu.Lock()
	defer term.mu.Unlock()
	term.t.Fatalf("no %q after byte %d in:\n%q", want, term.seen, term.out.String())
}

// within waits up to d for want to appear after what was expected last.
func (term *terminal) within(want string, d time.Duration) bool {
	for began := time.Now(); time.Since(began) < d; time.Sleep(20 * time.Millisecond) {
		term.mu.Lock()
		i := strings.Index(term.out.String()[term.seen:], want)
		if i >= 0 {
			term.seen += i + len(want)
		}
		term.mu.Unlock()
		if i >= 0 {
			return true
		}
	}
	return false
}

// In a pseudo-terminal: prompts, a multi-line def, an error that does not
// end the session, history recall with the up arrow, Ctrl-C stopping a
// running input with the names kept, Ctrl-D ending the session with no
// kernel process left. 12² = 144, 5² = 25, 7² = 49 (arithmetic).
func TestReplInTerminal(t *testing.T) {
	cmd := exec.Command(os.Args[0], "repl", "--max-memory", "300MiB")
	cmd.Env = append(os.Environ(), "ASSAY_TEST_MAIN=1", "XDG_CACHE_HOME="+t.TempDir(), "TERM=dumb")
	f, err := pty.StartWithSize(cmd, &pty.Winsize{Rows: 40, Cols: 120})
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	defer cmd.Process.Kill()
	term := &terminal{t: t, pty: f, cmd: cmd}
	go func() {
		buf := make([]byte, 4096)
		for {
			n, err := f.Read(buf)
			term.mu.Lock()
			term.out.Write(buf[:n])
			term.mu.Unlock()
			if err != nil {
				return
			}
		}
	}()
	term.expect("Ctrl-D ends the session")
	term.expect(repl.Prompt)
	term.send("def sq(x):\r")
	term.expect("     | ")
	term.send("    return x * x\r")
	term.expect("     | ")
	term.send("\r")
	term.expect(repl.Prompt)
	term.send("sq(12)\r")
	term.expect("144")
	term.send("not_defined\r")
	term.expect("NameError: name 'not_defined' is not defined")
	term.send("sq(5)\r")
	term.expect("25")
	term.expect(repl.Prompt)
	term.send("\x1b[A") // up arrow: sq(5) again
	term.expect("sq(5)")
	term.send("\r")
	term.expect("25")
	term.expect(repl.Prompt)
	term.send("while True:\r")
	term.send("    pass\r")
	term.send("\r")
	// A Ctrl-C that comes before the input runs is a key at the prompt, or
	// one pressed between inputs: press it again until the input stops.
	for tries := 0; ; tries++ {
		if tries == 30 {
			term.mu.Lock()
			t.Fatalf("Ctrl-C did not stop the input:\n%q", term.out.String())
		}
		term.send("\x03")
		if term.within("interrupted", time.Second) {
			break
		}
	}
	term.expect(repl.Prompt)
	term.send("sq(7)\r")
	term.expect("49")
	term.expect(repl.Prompt)
	kids := children(cmd.Process.Pid)
	if len(kids) == 0 {
		t.Fatal("no kernel process found in the session")
	}
	term.send("\x04") // Ctrl-D
	done := make(chan error, 1)
	go func() { done <- cmd.Wait() }()
	select {
	case err := <-done:
		if err != nil {
			t.Errorf("assay repl after Ctrl-D: %v", err)
		}
	case <-time.After(30 * time.Second):
		t.Fatal("assay repl still runs 30 s after Ctrl-D")
	}
	for _, k := range kids {
		if _, err := os.Stat("/proc/" + strconv.Itoa(k)); err == nil {
			t.Errorf("kernel process %d is left after Ctrl-D", k)
		}
	}
}

package watch

import (
	"bufio"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"net"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"assay/kernel"
	"assay/kernel/proto"
	"assay/kernel/session"
)

// TestMain lets the test binary stand in for `assay kernel` when the
// server starts it as a child process.
func TestMain(m *testing.M) {
	proto.ServeTestKernel()
	os.Exit(m.Run())
}

// started is a server running on a temporary notebook.
type started struct {
	*Server
	path string // the notebook
	url  string
	host string
}

// start writes the notebook text and serves it until the test ends.
func start(t testing.TB, text string) started {
	t.Helper()
	os.Setenv("ASSAY_TEST_KERNEL", "1")
	path := filepath.Join(t.TempDir(), "nb.md")
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	ln, err := Listen("127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	opt := kernel.Options{Settings: session.DefaultSettings, Command: []string{os.Args[0]}, Workers: 1, Timeout: time.Minute}
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan error, 1)
	srv := New(path, opt, nil)
	go func() { done <- srv.Serve(ctx, ln) }()
	t.Cleanup(func() {
		cancel()
		if err := <-done; err != nil {
			t.Errorf("serve: %v", err)
		}
		os.Unsetenv("ASSAY_TEST_KERNEL")
	})
	return started{Server: srv, path: path, url: URL(ln), host: ln.Addr().String()}
}

// save writes a new version of the notebook, as an editor saves it.
func (s started) save(t testing.TB, text string) {
	t.Helper()
	tmp := s.path + ".tmp"
	if err := os.WriteFile(tmp, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Rename(tmp, s.path); err != nil {
		t.Fatal(err)
	}
}

// stream reads the page's events.
type stream struct {
	r    *bufio.Reader
	body io.Closer
}

func (s started) events(t testing.TB) *stream {
	t.Helper()
	resp, err := http.Get(s.url + "events")
	if err != nil {
		t.Fatal(err)
	}
	if ct := resp.Header.Get("Content-Type"); ct != "text/event-stream" {
		t.Fatalf("events: Content-Type %q", ct)
	}
	t.Cleanup(func() { resp.Body.Close() })
	return &stream{r: bufio.NewReader(resp.Body), body: resp.Body}
}

// next reads one event: its name and data.
func (s *stream) next(t testing.TB) (string, string) {
	t.Helper()
	var name, data string
	for {
		line, err := s.r.ReadString('\n')
		if err != nil {
			t.Fatalf("event stream: %v", err)
		}
		line = strings.TrimRight(line, "\n")
		switch {
		case line == "" && name != "":
			return name, data
		case strings.HasPrefix(line, "event: "):
			name = strings.TrimPrefix(line, "event: ")
		case strings.HasPrefix(line, "data: "):
			data = strings.TrimPrefix(line, "data: ")
		}
	}
}

// until reads events until a state of the phase, and returns it with the
// last report's HTML seen on the way.
func (s *stream) until(t testing.TB, phase string) (State, string) {
	t.Helper()
	var html string
	for {
		name, data := s.next(t)
		switch name {
		case "report":
			var m map[string]string
			if err := json.Unmarshal([]byte(data), &m); err != nil {
				t.Fatal(err)
			}
			html = m["html"]
		case "state":
			var st State
			if err := json.Unmarshal([]byte(data), &st); err != nil {
				t.Fatal(err)
			}
			if st.Phase == phase {
				return st, html
			}
		}
	}
}

const thirds = "# Thirds\n\n```cell\nx = frac(1, 3)\n```\n\n```cell\nidentity(\"three thirds\", 3 * x, %s)\n```\n"

func thirdsWith(rhs string) string { return strings.Replace(thirds, "%s", rhs, 1) }

// A save runs the notebook again and the stream carries the new verdict;
// an error keeps the last good report, marked stale, and says where.
// 3·(1/3) = 1 and ≠ 2: arithmetic.
func TestEventsFollowTheFile(t *testing.T) {
	s := start(t, thirdsWith("1"))
	ev := s.events(t)
	st, html := ev.until(t, "ok")
	if !strings.Contains(html, "v-holds") || !strings.Contains(st.Text, "1 holds") {
		t.Fatalf("first run: %+v\n%s", st, html)
	}
	s.save(t, thirdsWith("2"))
	st, html = ev.until(t, "ok")
	if !strings.Contains(html, "v-fails") || !strings.Contains(st.Text, "1 fails") {
		t.Fatalf("after the edit: %+v\n%s", st, html)
	}
	s.save(t, thirdsWith("y"))
	st, html = ev.until(t, "error")
	if !st.Stale || !strings.Contains(st.Text, "line 8: NameError") || html != "" {
		t.Fatalf("after the error: %+v, report sent again: %v", st, html != "")
	}
	page := get(t, s.url, s.host)
	if !strings.Contains(page, `<main class="stale">`) || !strings.Contains(page, "v-fails") || !strings.Contains(page, "line 8: NameError") {
		t.Errorf("the page after the error keeps the last report, marked stale:\n%s", page)
	}
	s.save(t, "# Thirds\n\n```cell\nx = 1\n")
	if st, _ = ev.until(t, "error"); !strings.Contains(st.Text, "line 3") || !strings.Contains(st.Text, "never closed") {
		t.Errorf("a parse error: %+v", st)
	}
	s.save(t, thirdsWith("1"))
	if st, html = ev.until(t, "ok"); st.Stale || !strings.Contains(html, "v-holds") {
		t.Errorf("after the repair: %+v", st)
	}
}

// get fetches a path with the given Host header and returns the body of
// a 200 answer.
func get(t *testing.T, url, host string) string {
	t.Helper()
	code, body := fetch(t, url, host)
	if code != http.StatusOK {
		t.Fatalf("GET %s (Host %s): %d %s", url, host, code, body)
	}
	return body
}

func fetch(t *testing.T, url, host string) (int, string) {
	t.Helper()
	req, err := http.NewRequest("GET", url, nil)
	if err != nil {
		t.Fatal(err)
	}
	req.Host = host
	resp, err := http.DefaultClient.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	b, _ := io.ReadAll(resp.Body)
	return resp.StatusCode, string(b)
}

// A request naming another host is refused, as a DNS-rebinding page
// would send it (common practice: the Host check against rebinding).
func TestOtherHostsRefused(t *testing.T) {
	s := start(t, thirdsWith("1"))
	_, port, _ := net.SplitHostPort(s.host)
	for _, host := range []string{"evil.example:" + port, "evil.example", "127.0.0.1", "127.0.0.1:1", "localhost", "[::1]:" + port, "127.0.0.2:" + port} {
		if code, _ := fetch(t, s.url, host); code != http.StatusForbidden {
			t.Errorf("Host %q: status %d, want 403", host, code)
		}
	}
	for _, host := range []string{s.host, "localhost:" + port} {
		if code, _ := fetch(t, s.url, host); code != http.StatusOK {
			t.Errorf("Host %q: status %d, want 200", host, code)
		}
	}
}

// Nothing but the page and its events is served: not the notebook, not
// files beside it or elsewhere, whatever the spelling of the path.
func TestOnlyThePageIsServed(t *testing.T) {
	s := start(t, thirdsWith("1"))
	base := strings.TrimSuffix(s.url, "/")
	for _, p := range []string{"/nb.md", "/index.html", "/../nb.md", "/%2e%2e/etc/passwd", "/..%2f..%2fetc%2fpasswd", "//etc/passwd", "/events/x", "/report.html", "/nb.report.html", "/favicon.ico"} {
		conn, err := net.Dial("tcp", s.host)
		if err != nil {
			t.Fatal(err)
		}
		// Written raw, so no client cleans the path first.
		io.WriteString(conn, "GET "+p+" HTTP/1.1\r\nHost: "+s.host+"\r\nConnection: close\r\n\r\n")
		resp, err := http.ReadResponse(bufio.NewReader(conn), nil)
		if err != nil {
			t.Fatal(err)
		}
		body, _ := io.ReadAll(resp.Body)
		conn.Close()
		if resp.StatusCode == http.StatusOK || strings.Contains(string(body), "three thirds") || strings.Contains(string(body), "root:") {
			t.Errorf("GET %s: status %d, body %.80q", p, resp.StatusCode, body)
		}
	}
	if code, _ := fetch(t, base+"/", s.host); code != http.StatusOK {
		t.Errorf("the page itself: %d", code)
	}
	req, _ := http.NewRequest("POST", s.url, strings.NewReader("x"))
	if resp, err := http.DefaultClient.Do(req); err != nil || resp.StatusCode != http.StatusMethodNotAllowed {
		t.Errorf("POST: %v %v", resp, err)
	}
}

// Only loopback addresses are served on.
func TestListenLoopbackOnly(t *testing.T) {
	for _, addr := range []string{"0.0.0.0:0", ":0", "[::]:0", "192.0.2.1:0", "localhost:0", "example.com:80", "127.0.0.1"} {
		if ln, err := Listen(addr); err == nil {
			ln.Close()
			t.Errorf("Listen(%q) accepted", addr)
		}
	}
	ln, err := Listen("127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	ln.Close()
}

// A save in the middle of a run calls it off and runs the new version.
func TestSaveCallsOffARun(t *testing.T) {
	s := start(t, "# Loop\n\n```cell\nx = 1\n```\n\n```cell\nwhile True:\n    pass\n```\n")
	ev := s.events(t)
	for {
		if st, _ := ev.until(t, "running"); strings.HasPrefix(st.Text, "running cell 2") {
			break
		}
	}
	began := time.Now()
	s.save(t, "# Loop\n\n```cell\nx = 1\n```\n\n```cell\nidentity(\"one\", x, 1)\n```\n")
	st, html := ev.until(t, "ok")
	if !strings.Contains(html, "v-holds") || !strings.Contains(st.Text, "1 holds") {
		t.Fatalf("after the save: %+v", st)
	}
	if d := time.Since(began); d > 10*time.Second {
		t.Errorf("the new version showed %s after the save", d)
	}
}

// states reads events until an "ok" state, and returns the status texts
// on the way.
func (s *stream) states(t *testing.T) []string {
	t.Helper()
	var texts []string
	for {
		name, data := s.next(t)
		if name != "state" {
			continue
		}
		var st State
		if err := json.Unmarshal([]byte(data), &st); err != nil {
			t.Fatal(err)
		}
		texts = append(texts, st.Text)
		if st.Phase != "running" {
			return texts
		}
	}
}

// The status line says which cells are kept and which run, and how far a
// long sweep has got.
func TestStatusSaysWhatRuns(t *testing.T) {
	const nb = "# Status\n\n```cell\nx = 1\n```\n\n```cell\ny = 2\n```\n\n```cell\n%s\n```\n"
	sweep := `identity("sums", lambda k: (sum(range(3000)), 4498500), over=lambda k: k, samples=%d)`
	s := start(t, strings.Replace(nb, "%s", "z = 3", 1))
	ev := s.events(t)
	ev.states(t)
	s.save(t, strings.Replace(nb, "%s", fmt.Sprintf(sweep, 4000), 1))
	texts := strings.Join(ev.states(t), "\n")
	// 0 + 1 + … + 2999 = 2999·3000/2 = 4498500 (Gauss's sum).
	if !strings.Contains(texts, "cells 1–2 unchanged, kept; running cell 3 (line 12)") ||
		!strings.Contains(texts, `running cell 3 (line 12): sums, `) || !strings.Contains(texts, " of 4000 samples") ||
		strings.Contains(texts, "running cell 1") || strings.Contains(texts, "running cell 2") || !strings.Contains(texts, "1 holds") {
		t.Errorf("status lines:\n%s", texts)
	}
}

// Before the first run ends the page says there is no report yet, rather
// than show an empty one that reads as a finished run (no claims, seed 0,
// 0 bits), and keeps its status line and update script.
func TestPageBeforeTheFirstRun(t *testing.T) {
	s := New("nb.md", kernel.Options{}, nil)
	s.mu.Lock()
	page := s.page()
	s.mu.Unlock()
	if !strings.Contains(page, "<main>\n<p>No report yet: the first run has not finished for nb.md.</p>\n</main>") ||
		strings.Contains(page, "seed: 0") || strings.Contains(page, "claims: 0") ||
		!strings.Contains(page, `role="status">starting the first run</div>`) || !strings.Contains(page, "<script>"+updateScript+"</script>") {
		t.Errorf("page before the first run:\n%s", page)
	}
}

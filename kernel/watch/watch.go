// Package watch serves the live report of a notebook being edited (assay
// watch): it runs the notebook again when the file is saved, through a
// kernel.Live, which runs only from the first changed cell, and pushes
// the new report to the open page by server-sent events.
//
// The page is the HTML report with one script added, the update script,
// which the page's Content-Security-Policy allows by its hash; otherwise
// the policy is the report's. The server listens on loopback only,
// refuses requests for any other host (DNS rebinding), and serves the
// page and its event stream, nothing else: figures are inline in the page.
package watch

import (
	"context"
	"crypto/sha256"
	"encoding/base64"
	"encoding/json"
	"errors"
	"fmt"
	"html"
	"io"
	"net"
	"net/http"
	"os"
	"strings"
	"sync"
	"time"

	"assay/cells"
	"assay/kernel"
	"assay/kernel/claim"
)

// Poll is how often the notebook file is read to see whether it changed.
const Poll = 50 * time.Millisecond

// Server serves the live report of one notebook.
type Server struct {
	path string
	opt  kernel.Options
	live *kernel.Live
	log  io.Writer

	mu    sync.Mutex
	host  string      // the listener's address, which the Host header must name
	shown string      // the full HTML report on the page
	good  bool        // shown is the report of a run without errors
	state State       // what the status line says
	subs  []chan bool // one per open event stream; true: the report changed
	done  chan struct{}
}

// State is what the page's status line says.
type State struct {
	Phase string `json:"phase"` // "running", "ok" or "error"
	Text  string `json:"text"`
	// Stale says the report on the page is from an earlier run: the last
	// one failed, and Text says why.
	Stale bool `json:"stale"`
}

// New prepares a server for the notebook at path; opt are the run's
// options (its Steps are the server's own). Log, when not nil, gets a
// line per run.
func New(path string, opt kernel.Options, log io.Writer) *Server {
	s := &Server{path: path, log: log, done: make(chan struct{}),
		state: State{Phase: "running", Text: "starting the first run"}}
	opt.Progress = nil
	opt.Steps = s.step
	s.opt = opt
	s.live = kernel.NewLive(opt)
	return s
}

// Listen opens a listener on addr, which must be a loopback address with
// a port (0 for a free one), such as 127.0.0.1:0.
func Listen(addr string) (net.Listener, error) {
	host, _, err := net.SplitHostPort(addr)
	if err != nil {
		return nil, fmt.Errorf("--addr %s: want a loopback address and a port, such as 127.0.0.1:8080", addr)
	}
	if ip := net.ParseIP(host); ip == nil || !ip.IsLoopback() {
		return nil, fmt.Errorf("--addr %s: the watch page is served on a loopback address only (127.0.0.1 or ::1), so that no other machine can reach it", addr)
	}
	return net.Listen("tcp", addr)
}

// URL is the page's address on a listener.
func URL(ln net.Listener) string { return "http://" + ln.Addr().String() + "/" }

// Serve serves the page on ln and runs the notebook whenever its file
// changes, until ctx ends; then it calls off a run in progress, ends the
// kernels and returns.
func (s *Server) Serve(ctx context.Context, ln net.Listener) error {
	ctx, cancel := context.WithCancel(ctx) // also ends the watching when serving fails
	defer cancel()
	s.mu.Lock()
	s.host = ln.Addr().String()
	s.mu.Unlock()
	srv := &http.Server{Handler: s, ReadHeaderTimeout: 10 * time.Second}
	served := make(chan error, 1)
	go func() { served <- srv.Serve(ln) }()
	watched := make(chan struct{})
	go func() {
		defer close(watched)
		s.watch(ctx)
	}()
	var err error
	select {
	case <-ctx.Done():
	case err = <-served:
	}
	cancel()
	s.live.Close() // calls off the run in progress
	<-watched
	close(s.done) // ends the event streams
	shut, stop := context.WithTimeout(context.Background(), 5*time.Second)
	defer stop()
	srv.Shutdown(shut)
	if errors.Is(err, http.ErrServerClosed) {
		err = nil
	}
	return err
}

// watch runs the notebook at the start and after each change of its file.
// A change in the middle of a run calls that run off, and its report is
// not shown: the new version runs at once.
func (s *Server) watch(ctx context.Context) {
	changed := make(chan struct{}, 1)
	changed <- struct{}{}
	go func() {
		tick := time.NewTicker(Poll)
		defer tick.Stop()
		last := fileSum(s.path)
		for {
			select {
			case <-ctx.Done():
				return
			case <-tick.C:
			}
			if sum := fileSum(s.path); sum != last {
				last = sum
				s.live.Interrupt()
				select {
				case changed <- struct{}{}:
				default:
				}
			}
		}
	}()
	for {
		select {
		case <-ctx.Done():
			return
		case <-changed:
		}
		src, err := os.ReadFile(s.path)
		s.runOnce(src, err, func() bool { return len(changed) > 0 })
	}
}

// fileSum is the SHA-256 of a file's contents, or of why it cannot be read.
func fileSum(path string) [sha256.Size]byte {
	src, err := os.ReadFile(path)
	if err != nil {
		return sha256.Sum256([]byte("unreadable: " + err.Error()))
	}
	return sha256.Sum256(src)
}

// runOnce runs one version of the notebook and shows its report, or,
// when it could not be read, parsed or run cleanly, says why and keeps
// the last good report on the page, marked stale. A run that newer says
// was overtaken by a newer version is not shown.
func (s *Server) runOnce(src []byte, readErr error, newer func() bool) {
	if readErr != nil {
		s.fail(fmt.Sprintf("cannot read %s: %v", s.path, readErr), nil)
		return
	}
	nb, err := cells.Parse(s.path, src)
	if err != nil {
		var ce *cells.Error
		msg := err.Error()
		if errors.As(err, &ce) {
			msg = fmt.Sprintf("line %d: %s", ce.Line, ce.Msg)
		}
		s.fail(msg, nil)
		return
	}
	s.mu.Lock()
	stale := s.state.Stale
	s.mu.Unlock()
	s.setState(State{Phase: "running", Text: "running…", Stale: stale})
	rep := s.live.Run(nb)
	if newer() {
		return
	}
	var errs []string
	for _, p := range rep.Problems {
		errs = append(errs, lineMessage(p))
	}
	for _, o := range rep.Outcomes {
		if o.Error != nil {
			errs = append(errs, lineMessage(*o.Error))
		}
	}
	if len(errs) > 0 {
		s.fail(strings.Join(errs, "; "), rep)
		return
	}
	c := cells.Counts(rep)
	var counts []string
	for _, v := range []cells.Verdict{cells.Holds, cells.HoldsToDigits, cells.Estimated, cells.Fails, cells.Undecided} {
		if c[v] > 0 {
			counts = append(counts, fmt.Sprintf("%d %s", c[v], v))
		}
	}
	if len(counts) == 0 {
		counts = []string{"no claims"}
	}
	text := fmt.Sprintf("ran at %s in %.2f s: %s", time.Now().Format("15:04:05"), rep.Seconds, strings.Join(counts, ", "))
	s.show(cells.RenderHTML(rep), true, State{Phase: "ok", Text: text})
}

// lineMessage is a problem as the status line gives it.
func lineMessage(p cells.Problem) string {
	if p.Line > 0 {
		return fmt.Sprintf("line %d: %s", p.Line, p.Message)
	}
	return p.Message
}

// fail says why a run went wrong. The page keeps the last good report,
// marked stale; with none yet, it shows this run's report, if any.
func (s *Server) fail(why string, rep *cells.Report) {
	s.mu.Lock()
	keep := s.good
	s.mu.Unlock()
	st := State{Phase: "error", Text: why, Stale: keep}
	if keep {
		st.Text = why + " — the report below is from the last run without errors"
		s.setState(st)
		return
	}
	if rep == nil {
		s.setState(st)
		return
	}
	s.show(cells.RenderHTML(rep), false, st)
}

// show puts a report on the page.
func (s *Server) show(page []byte, good bool, st State) {
	s.mu.Lock()
	s.shown, s.good = string(page), good
	s.state = st
	s.notify(true)
	s.mu.Unlock()
	if s.log != nil {
		fmt.Fprintln(s.log, st.Text)
	}
}

// setState changes the status line.
func (s *Server) setState(st State) {
	s.mu.Lock()
	s.state = st
	s.notify(false)
	s.mu.Unlock()
	if s.log != nil && st.Phase == "error" {
		fmt.Fprintln(s.log, "error:", st.Text)
	}
}

// step shows a cell starting, or a sweep's progress, on the status line.
func (s *Server) step(st kernel.Step) {
	text := ""
	if st.From > 1 {
		text = fmt.Sprintf("cells 1–%d unchanged, kept; ", st.From-1)
		if st.From == 2 {
			text = "cell 1 unchanged, kept; "
		}
	}
	text += fmt.Sprintf("running cell %d (line %d)", st.Cell, st.Line)
	if st.Claim != "" {
		text += fmt.Sprintf(": %s, %d of %d samples", claim.Clip(st.Claim, 48), st.Done, st.Total)
	}
	s.mu.Lock()
	s.state = State{Phase: "running", Text: text, Stale: s.state.Stale}
	s.notify(false)
	s.mu.Unlock()
}

// notify tells every event stream that the state, and perhaps the
// report, changed. A stream that has not caught up keeps the larger news.
func (s *Server) notify(report bool) {
	for _, c := range s.subs {
		select {
		case c <- report:
		default:
			if report { // make room for the larger news
				select {
				case <-c:
				default:
				}
				c <- true
			}
		}
	}
}

// ServeHTTP serves the page at / and its event stream at /events, to
// requests for this server's host only.
func (s *Server) ServeHTTP(w http.ResponseWriter, r *http.Request) {
	s.mu.Lock()
	host := s.host
	s.mu.Unlock()
	_, port, _ := net.SplitHostPort(host)
	if r.Host != host && r.Host != "localhost:"+port {
		http.Error(w, "assay watch serves "+host+" only", http.StatusForbidden)
		return
	}
	if r.Method != http.MethodGet && r.Method != http.MethodHead {
		http.Error(w, "method not allowed", http.StatusMethodNotAllowed)
		return
	}
	h := w.Header()
	h.Set("Cache-Control", "no-store")
	h.Set("X-Content-Type-Options", "nosniff")
	h.Set("Referrer-Policy", "no-referrer")
	h.Set("X-Frame-Options", "DENY")
	switch r.URL.Path {
	case "/":
		s.mu.Lock()
		page := s.page()
		s.mu.Unlock()
		h.Set("Content-Security-Policy", pagePolicy)
		h.Set("Content-Type", "text/html; charset=utf-8")
		io.WriteString(w, page)
	case "/events":
		s.events(w, r)
	default:
		http.NotFound(w, r)
	}
}

// events streams the state and report as server-sent events: "report"
// with the report's title and the inside of its <main>, "state" with the
// status line.
func (s *Server) events(w http.ResponseWriter, r *http.Request) {
	fl, ok := w.(http.Flusher)
	if !ok {
		http.Error(w, "streaming unsupported", http.StatusInternalServerError)
		return
	}
	w.Header().Set("Content-Type", "text/event-stream")
	c := make(chan bool, 1)
	c <- true
	s.mu.Lock()
	s.subs = append(s.subs, c)
	s.mu.Unlock()
	defer func() {
		s.mu.Lock()
		for i, x := range s.subs {
			if x == c {
				s.subs = append(s.subs[:i], s.subs[i+1:]...)
				break
			}
		}
		s.mu.Unlock()
	}()
	alive := time.NewTicker(15 * time.Second)
	defer alive.Stop()
	for {
		select {
		case report := <-c:
			s.mu.Lock()
			shown, st := s.shown, s.state
			s.mu.Unlock()
			if report && shown != "" {
				title, main := parts(shown)
				writeEvent(w, "report", map[string]string{"title": title, "html": main})
			}
			writeEvent(w, "state", st)
		case <-alive.C:
			io.WriteString(w, ": still here\n\n")
		case <-r.Context().Done():
			return
		case <-s.done:
			return
		}
		fl.Flush()
	}
}

// writeEvent writes one server-sent event; JSON has no line breaks, so
// the data is one line.
func writeEvent(w io.Writer, name string, v any) {
	data, _ := json.Marshal(v)
	fmt.Fprintf(w, "event: %s\ndata: %s\n\n", name, data)
}

// parts are a rendered report's title (as text) and the inside of its
// <main>.
func parts(page string) (title, main string) {
	if _, b, ok := strings.Cut(page, "<title>"); ok {
		title, _, _ = strings.Cut(b, "</title>")
	}
	if _, b, ok := strings.Cut(page, "<main>\n"); ok {
		main, _, _ = strings.Cut(b, "</main>\n</body>")
	}
	return html.UnescapeString(title), main
}

// updateScript is the one script of the page: it follows the event stream
// and puts each new report and status into the page. It sets text as
// text and only the report's own HTML, which has no script, as HTML.
const updateScript = `(function () {
  var main = document.querySelector("main"), bar = document.getElementById("assay-watch");
  var events = new EventSource("/events");
  events.addEventListener("report", function (e) {
    var m = JSON.parse(e.data);
    document.title = m.title;
    main.innerHTML = m.html;
  });
  events.addEventListener("state", function (e) {
    var m = JSON.parse(e.data);
    bar.textContent = m.text;
    bar.className = m.phase;
    main.className = m.stale ? "stale" : "";
  });
  events.onerror = function () {
    bar.textContent = "lost the connection to assay watch; retrying";
    bar.className = "error";
  };
})();`

// pagePolicy is the report's Content-Security-Policy with the update
// script allowed by its hash, and its event stream by connect-src.
var pagePolicy = cells.ContentSecurityPolicy + "; script-src 'sha256-" + scriptHash() + "'; connect-src 'self'"

func scriptHash() string {
	sum := sha256.Sum256([]byte(updateScript))
	return base64.StdEncoding.EncodeToString(sum[:])
}

// reportPolicyMeta is the policy line of a rendered report.
const reportPolicyMeta = `<meta http-equiv="Content-Security-Policy" content="` + cells.ContentSecurityPolicy + `">`

const watchCSS = `#assay-watch { position: sticky; top: 0; z-index: 1; margin: 0; padding: 0.4rem 1.25rem; font: 0.9rem/1.4 system-ui, sans-serif; border-bottom: 1px solid #d3d3da; background: #f0f0f3; }
#assay-watch.running { background: #eaf1fb; color: #1d4e89; }
#assay-watch.ok { background: #e6f4e8; color: #145a20; }
#assay-watch.error { background: #fbe9e9; color: #8f1d1d; font-weight: 600; }
main.stale { opacity: 0.55; }
main.stale::before { content: "stale: from the last run without errors"; display: block; font-weight: 600; color: #8f1d1d; }
`

// noReportYet begins what the page shows before the first run ends.
const noReportYet = "No report yet: the first run has not finished for "

// page is the page as served now: the report shown, with the status line,
// its style and the update script, under the page's policy. Called with
// s.mu held.
func (s *Server) page() string {
	p := s.shown
	if p == "" {
		// Before the first run ends there is no report: an empty one would
		// read as a finished run with no claims, seed 0 and 0 bits.
		p = string(cells.RenderHTML(&cells.Report{Notebook: &cells.Notebook{Path: s.path, Title: s.path}}))
		_, inside := parts(p)
		p = strings.Replace(p, "<main>\n"+inside, "<main>\n<p>"+html.EscapeString(noReportYet+s.path)+".</p>\n", 1)
	}
	mainTag := "<main>"
	if s.state.Stale {
		mainTag = `<main class="stale">`
	}
	bar := `<div id="assay-watch" class="` + html.EscapeString(s.state.Phase) + `" role="status">` + html.EscapeString(s.state.Text) + "</div>\n"
	r := strings.NewReplacer(
		reportPolicyMeta, `<meta http-equiv="Content-Security-Policy" content="`+pagePolicy+`">`,
		"</head>\n<body>\n<main>", "<style>\n"+watchCSS+"</style>\n</head>\n<body>\n"+bar+mainTag,
		"</main>\n</body>", "</main>\n<script>"+updateScript+"</script>\n</body>",
	)
	return r.Replace(p)
}

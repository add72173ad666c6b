package watch

import (
	"context"
	"os/exec"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"assay/cells"
)

// browser opens a headless Chromium (Debian's chromium package; .ci/run
// installs it) driven over the DevTools protocol, or skips the test.
func browser(t *testing.T) context.Context {
	t.Helper()
	var path string
	for _, name := range []string{"chromium", "chromium-browser", "google-chrome"} {
		if p, err := exec.LookPath(name); err == nil {
			path = p
			break
		}
	}
	if path == "" {
		t.Skip("no chromium on PATH: install Debian's chromium package (apt-get install -y chromium) to run the browser tests; CI does")
	}
	opts := append(slices.Clone(chromedp.DefaultExecAllocatorOptions[:]), chromedp.ExecPath(path), chromedp.NoSandbox, chromedp.DisableGPU)
	actx, cancelAlloc := chromedp.NewExecAllocator(context.Background(), opts...)
	ctx, cancel := chromedp.NewContext(actx)
	t.Cleanup(func() { cancel(); cancelAlloc() })
	if err := chromedp.Do(ctx); err != nil { // starts the browser, which lives as long as ctx
		t.Fatalf("starting %s: %v", path, err)
	}
	return ctx
}

// eval evaluates a JavaScript expression in the page (the DevTools
// protocol's evaluation is not bound by the page's policy).
func eval[T any](t *testing.T, ctx context.Context, expr string) T {
	t.Helper()
	ctx, cancel := context.WithTimeout(ctx, 10*time.Second)
	defer cancel()
	v, err := chromedp.Run(ctx, chromedp.Evaluate[T](expr))
	if err != nil {
		t.Fatalf("%s: %v", expr, err)
	}
	return v
}

// waitFor polls a JavaScript condition until it holds or limit passes,
// and returns how long it took.
func waitFor(t *testing.T, ctx context.Context, cond string, limit time.Duration) time.Duration {
	t.Helper()
	began := time.Now()
	for time.Since(began) < limit {
		if eval[bool](t, ctx, cond) {
			return time.Since(began)
		}
		time.Sleep(20 * time.Millisecond)
	}
	t.Fatalf("after %s, still not %s; status line: %q", limit, cond, eval[string](t, ctx, `document.getElementById("assay-watch").textContent`))
	return 0
}

// The open page shows a new verdict within 2 s of the save, without a
// reload; an error shows on the status line while the previous results
// stay, marked stale; a repair clears it. 3·(1/3) = 1, ≠ 2: arithmetic.
func TestBrowserFollowsEdits(t *testing.T) {
	ctx := browser(t)
	s := start(t, thirdsWith("1"))
	if err := chromedp.Do(ctx, chromedp.Navigate(s.url)); err != nil {
		t.Fatal(err)
	}
	waitFor(t, ctx, `document.querySelector("td.v-holds") !== null && document.getElementById("assay-watch").className === "ok"`, 10*time.Second)
	eval[int](t, ctx, `window.assayTestMark = 7`) // a reload would lose it

	saved := time.Now()
	s.save(t, thirdsWith("2"))
	waitFor(t, ctx, `document.querySelector("td.v-fails") !== null && document.querySelector("td.v-holds") === null`, 2*time.Second)
	t.Logf("save to page: %s", time.Since(saved).Round(time.Millisecond))

	s.save(t, thirdsWith("y"))
	waitFor(t, ctx, `document.getElementById("assay-watch").className === "error"`, 2*time.Second)
	if text := eval[string](t, ctx, `document.getElementById("assay-watch").textContent`); !strings.Contains(text, "line 8: NameError") {
		t.Errorf("status line after the error: %q", text)
	}
	if !eval[bool](t, ctx, `document.querySelector("main").className === "stale" && document.querySelector("td.v-fails") !== null`) {
		t.Error("the previous results are not kept, marked stale")
	}
	if stale := eval[string](t, ctx, `getComputedStyle(document.querySelector("main"), "::before").content`); !strings.Contains(stale, "stale") {
		t.Errorf("the stale mark shows %q", stale)
	}

	s.save(t, thirdsWith("frac(3, 3)"))
	waitFor(t, ctx, `document.querySelector("td.v-holds") !== null && document.querySelector("main").className === ""`, 2*time.Second)
	if mark := eval[int](t, ctx, `window.assayTestMark || 0`); mark != 7 {
		t.Error("the page was reloaded")
	}
}

// The page runs no script but the update script, even when the notebook
// writes script into its text and output, and its policy is the report's
// with only that script and its event stream allowed.
func TestBrowserPageHasOnlyTheUpdateScript(t *testing.T) {
	ctx := browser(t)
	hostile := "# Hostile\n\n<script>window.assayPwned = 1</script>\n\n<img src=x onerror=\"window.assayPwned = 2\">\n\n" +
		"```cell\nprint(\"<script>window.assayPwned = 3</script><img src=x onerror=window.assayPwned=4>\")\n```\n"
	s := start(t, hostile)
	resp, err := chromedp.Run(ctx, chromedp.NavigateResponse(s.url))
	if err != nil {
		t.Fatal(err)
	}
	if h := resp.Headers["Content-Security-Policy"]; h != pagePolicy {
		t.Errorf("the policy header %q", h)
	}
	waitFor(t, ctx, `document.getElementById("assay-watch").className === "ok"`, 10*time.Second)
	s.save(t, hostile+"\n```cell\nprint(\"<script>window.assayPwned = 5</script>\")\n```\n")
	waitFor(t, ctx, `document.querySelectorAll("pre > code.language-output").length === 2`, 2*time.Second)
	if n := eval[int](t, ctx, `document.scripts.length`); n != 1 {
		t.Errorf("%d scripts in the page", n)
	}
	if text := eval[string](t, ctx, `document.scripts[0].textContent`); text != updateScript {
		t.Errorf("the one script is not the update script: %.80q", text)
	}
	if pwned := eval[int](t, ctx, `window.assayPwned || 0`); pwned != 0 {
		t.Errorf("notebook script ran (%d)", pwned)
	}
	policy := eval[string](t, ctx, `document.querySelector('meta[http-equiv="Content-Security-Policy"]').content`)
	if policy != pagePolicy {
		t.Fatalf("policy %q", policy)
	}
	// The report's directives, and the two the script needs, nothing more.
	var extra []string
	for _, d := range strings.Split(policy, "; ") {
		if !slices.Contains(strings.Split(cells.ContentSecurityPolicy, "; "), d) {
			extra = append(extra, d)
		}
	}
	if len(extra) != 2 || !strings.HasPrefix(extra[0], "script-src 'sha256-") || extra[1] != "connect-src 'self'" {
		t.Errorf("the page's policy adds %q to the report's", extra)
	}
	if n := eval[int](t, ctx, `document.querySelectorAll('meta[http-equiv="Content-Security-Policy"]').length`); n != 1 {
		t.Errorf("%d policies in the page", n)
	}
}

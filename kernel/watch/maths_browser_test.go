package watch

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/chromedp/chromedp"

	"assay/cells"
)

// Prose maths renders in Chromium from the report file as it is written
// (its Content-Security-Policy in force, no script): a fraction's
// numerator box lies above its denominator box (a layout check through
// getBoundingClientRect, no image comparison), a root draws wider than
// its radicand, no "$" is left in the text, and hostile maths adds no
// element of its own.
func TestBrowserTypesetsProseMaths(t *testing.T) {
	ctx := browser(t)
	src := "# Maths\n\nThe half $\\frac{1}{2}$ and $$\\sum_{i=1}^{n} i = \\frac{n(n+1)}{2}$$ with $\\sqrt{x^{2}+1}$.\n\n" +
		"Hostile $\\text{</math><img src=x onerror=window.assayPwned=1>}$ and $<b id=bold>x</b>$.\n\n```cell\nx = 1\n```\n"
	nb, err := cells.Parse("maths.md", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "maths.report.html")
	if err := os.WriteFile(path, cells.RenderHTML(&cells.Report{Notebook: nb}), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := chromedp.Do(ctx, chromedp.Navigate("file://"+path)); err != nil {
		t.Fatal(err)
	}
	if n := eval[int](t, ctx, `document.querySelectorAll("math").length`); n != 5 {
		t.Errorf("%d math elements, want 5", n)
	}
	// MathML Core §3.3.2: the numerator is drawn above the fraction bar,
	// the denominator below it.
	above := eval[bool](t, ctx, `(() => { const f = document.querySelector("mfrac");
		const n = f.children[0].getBoundingClientRect(), d = f.children[1].getBoundingClientRect();
		return n.height > 0 && d.height > 0 && n.bottom <= d.top + 0.5; })()`)
	if !above {
		t.Error("the numerator of \\frac{1}{2} is not drawn above its denominator")
	}
	wider := eval[bool](t, ctx, `(() => { const r = document.querySelector("msqrt");
		return r.getBoundingClientRect().width > r.children[0].getBoundingClientRect().width; })()`)
	if !wider {
		t.Error("\\sqrt draws no radical sign")
	}
	if eval[bool](t, ctx, `document.querySelector("main").textContent.includes("$")`) {
		t.Error("a $ is left in the page's text")
	}
	if eval[bool](t, ctx, `document.querySelector("img, b, script") !== null || (window.assayPwned || 0) !== 0`) {
		t.Error("hostile maths made an element of its own")
	}
}

// A residual typeset in a claims table lays out as a fraction too: a
// rational-function identity's residual −2/(x + 1) has its numerator above
// its denominator (MathML Core §3.3.2), inside the table cell, and a Greek
// variable is an identifier Chromium draws with the math-auto transform
// (MathML Core §3.1.1: a one-letter <mi> is italic), not an upright word.
// Each formula stays inside its cell: Chromium counts a break opportunity
// in an <mtext> label toward the column's least width though it never
// breaks there, so the cells must not wrap (td.math).
func TestBrowserTypesetsResiduals(t *testing.T) {
	ctx := browser(t)
	nb, err := cells.Parse("residuals.md", []byte("# Residuals\n\n```cell\nx = 1\n```\n"))
	if err != nil {
		t.Fatal(err)
	}
	rep := &cells.Report{Notebook: nb, Outcomes: []cells.Outcome{{Cell: 1, Status: cells.Ran, Claims: []cells.Claim{
		{Name: "fraction", Kind: "identity", Verdict: cells.Fails, Residual: "-2/(x + 1)", ResidualTeX: `-\frac{2}{x + 1}`, Cell: 1, Line: 4},
		{Name: "greek", Kind: "identity", Verdict: cells.Fails, Residual: "-theta", ResidualTeX: `-\theta`, Cell: 1, Line: 4},
		{Name: "entry", Kind: "identity", Verdict: cells.Fails, Residual: "entry [0, 1] of the difference: -2/(x^2 - 1)",
			ResidualTeX: `\text{entry [0, 1] of the difference:}\; {-\frac{2}{x^{2} - 1}}`, Cell: 1, Line: 4},
	}}}}
	path := filepath.Join(t.TempDir(), "residuals.report.html")
	if err := os.WriteFile(path, cells.RenderHTML(rep), 0o644); err != nil {
		t.Fatal(err)
	}
	// A narrow window, so the table is as wide as the page and its columns
	// are squeezed to their least widths.
	if err := chromedp.Do(ctx, chromedp.EmulateViewport(480, 900)); err != nil {
		t.Fatal(err)
	}
	if err := chromedp.Do(ctx, chromedp.Navigate("file://"+path)); err != nil {
		t.Fatal(err)
	}
	if n := eval[int](t, ctx, `document.querySelectorAll("td.math mfrac").length`); n != 4 {
		t.Fatalf("%d fractions in residual cells, want 4 (two claims, in the index and their cell)", n)
	}
	above := eval[bool](t, ctx, `[...document.querySelectorAll("td.math mfrac")].every(f => {
		const n = f.children[0].getBoundingClientRect(), d = f.children[1].getBoundingClientRect(), c = f.closest("td").getBoundingClientRect();
		return n.height > 0 && d.height > 0 && n.bottom <= d.top + 0.5 && n.top >= c.top && d.bottom <= c.bottom; })`)
	if !above {
		t.Error("a residual's fraction is not laid out as a fraction inside its cell")
	}
	// The math element's own box may be narrower than what it draws, so
	// every element drawn in the cell is measured.
	inside := eval[bool](t, ctx, `[...document.querySelectorAll("td.math")].every(td => {
		const c = td.getBoundingClientRect();
		return [...td.querySelectorAll("*")].every(e => { const r = e.getBoundingClientRect(); return r.left >= c.left && r.right <= c.right + 0.5; }); })`)
	if !inside {
		t.Error("a typeset residual spills out of its table cell")
	}
	if got := eval[string](t, ctx, `getComputedStyle([...document.querySelectorAll("td.math mi")].find(m => m.textContent === "θ")).textTransform`); got != "math-auto" {
		t.Errorf("θ has text-transform %q, want math-auto (an italic identifier)", got)
	}
}

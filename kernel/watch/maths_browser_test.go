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

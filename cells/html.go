package cells

import (
	"crypto/rand"
	"encoding/base64"
	"encoding/hex"
	"html"
	"io"
	"regexp"
	"strconv"
	"strings"

	"github.com/gomarkdown/markdown"
	"github.com/gomarkdown/markdown/ast"
	mdhtml "github.com/gomarkdown/markdown/html"
	mdparser "github.com/gomarkdown/markdown/parser"
)

// htmlMarks are the placeholders RenderHTML puts in the Markdown it
// converts, for what Markdown cannot say: region boxes and inline SVG. The
// random nonce keeps a notebook from forging them.
type htmlMarks struct {
	nonce   string
	figures []Figure
	maths   []string // typeset residuals, as MathML
}

func (m *htmlMarks) token(kind string) string { return "assay" + m.nonce + kind }

// verdict is the token that marks a verdict cell of the given class.
func (m *htmlMarks) verdict(class string) string {
	return m.token("verdict" + strings.TrimPrefix(class, "v-"))
}

// verdictClass is the CSS class of each verdict's table cell.
var verdictClass = map[Verdict]string{Holds: "v-holds", HoldsWhere: "v-holds", HoldsToDigits: "v-digits", Estimated: "v-estimated", Fails: "v-fails", Undecided: "v-undecided"}

// RenderHTML returns the report as a self-contained HTML5 page: the Markdown
// report (with header) converted by gomarkdown, raw HTML in the notebook
// dropped, figures' SVG inline, inline CSS, and nothing loaded from outside.
//
// Each stretch of the report is converted on its own: the notebook's text
// (its HTML blocks, as CommonMark bounds them, left out), each cell, each
// output, each generated region. So the notebook's text cannot swallow a
// cell or show one that Parse does not run, a code block in it is never
// styled as a cell or as output, and only the verdicts assay computed are
// styled as verdicts.
func RenderHTML(r *Report) []byte {
	var nonce [12]byte
	_, _ = rand.Read(nonce[:])
	marks := &htmlMarks{nonce: hex.EncodeToString(nonce[:])}
	w := renderMarkdown(r, true, marks)
	md := w.b.String()

	para := func(kind string) string { return "<p>" + marks.token(kind) + "</p>" }
	repl := []string{
		para("header"), `<section class="generated summary">`,
		para("cell"), `<section class="generated">`,
		para("end"), `</section>`,
	}
	for _, class := range verdictClass {
		repl = append(repl, "<td>"+marks.verdict(class)+" ", `<td class="verdict `+class+`">`)
	}
	for i, f := range marks.figures {
		repl = append(repl, para("figure"+strconv.Itoa(i)), figureHTML(f))
	}
	for i, m := range marks.maths {
		repl = append(repl, "<td>"+marks.token("math"+strconv.Itoa(i))+"</td>", `<td class="math">`+m+"</td>")
	}
	tokens := strings.NewReplacer(repl...)

	var body strings.Builder
	for i, c := range w.cuts {
		end := len(md)
		if i+1 < len(w.cuts) {
			end = w.cuts[i+1].at
		}
		var part string
		switch c.kind {
		case segProse:
			part = notebookCode().ReplaceAllString(proseHTML(withoutHTMLBlocks(md[c.at:end])), "<pre><code>")
			part = tableCode().ReplaceAllStringFunc(part, typeset)
		case segRegion:
			part = tableCode().ReplaceAllStringFunc(tokens.Replace(toHTML(md[c.at:end])), typeset)
			if strings.Contains(part, "assay"+marks.nonce) {
				// A placeholder did not come out as its own paragraph (it
				// cannot in the Markdown we write); drop them all rather
				// than leave stray tags.
				part = regexp.MustCompile(`<section class="generated[^"]*">|</section>|<td class="verdict [^"]*">|(<p>)?assay`+marks.nonce+`\w+(</p>)?`).ReplaceAllString(part, "")
			}
		default:
			part = toHTML(md[c.at:end])
		}
		if part == "" {
			continue
		}
		if body.Len() > 0 {
			body.WriteString("\n") // the blank line gomarkdown puts between blocks
		}
		body.WriteString(part)
	}

	var b strings.Builder
	title := "assay report"
	if r.Notebook != nil && r.Notebook.Title != "" {
		title = visible(r.Notebook.Title) + " — assay report"
	}
	b.WriteString("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
	b.WriteString("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
	b.WriteString("<meta http-equiv=\"Content-Security-Policy\" content=\"" + ContentSecurityPolicy + "\">\n")
	if id := runText(r.Run); id != "" {
		b.WriteString("<meta name=\"assay-run\" content=\"" + id + "\">\n")
	}
	b.WriteString("<title>" + html.EscapeString(title) + "</title>\n<style>\n" + pageCSS + "</style>\n</head>\n<body>\n<main>\n")
	b.WriteString(body.String())
	b.WriteString("</main>\n</body>\n</html>\n")
	return []byte(b.String())
}

// ContentSecurityPolicy is the policy the HTML report states: no script,
// nothing loaded from anywhere, inline styles and data: images only.
const ContentSecurityPolicy = "default-src 'none'; style-src 'unsafe-inline'; img-src data:"

// toHTML converts one stretch of the Markdown report.
func toHTML(md string) string { return convert(md, false) }

// mdExtensions are the Markdown extensions of the HTML report.
const mdExtensions = mdparser.Tables | mdparser.FencedCode | mdparser.NoIntraEmphasis | mdparser.Autolink | mdparser.Strikethrough

// proseHTML converts a stretch of the notebook's text, its maths typeset.
func proseHTML(md string) string { return convert(md, true) }

func convert(md string, maths bool) string {
	p := mdparser.NewWithExtensions(mdExtensions)
	if maths {
		p = mathParser()
	}
	rd := mdhtml.NewRenderer(mdhtml.RendererOptions{
		Flags:          mdhtml.SkipHTML | mdhtml.Safelink | mdhtml.NofollowLinks | mdhtml.NoreferrerLinks,
		RenderNodeHook: lineBreakHook,
	})
	return string(markdown.ToHTML([]byte(md), p, rd))
}

// notebookCode is a code block of the notebook's text whose info string
// would style it as a cell or as a cell's output: it is shown as plain
// code, since Parse reads it as neither.
var notebookCode = lazyRegexp(`<pre><code class="language-(cell|output)">`)

// withoutHTMLBlocks blanks the lines of the HTML blocks that CommonMark
// finds at the top level of the notebook's text (the HTML report drops raw
// HTML anyway): gomarkdown bounds HTML blocks otherwise, and must not show
// as code what a CommonMark reader sees as HTML, nor the reverse.
func withoutHTMLBlocks(text string) string {
	ls := splitLines(text)
	var sc scanner
	var b strings.Builder
	for _, l := range ls {
		r := sc.next(l.num, l.text)
		if r.top && (r.kind == lineHTML || r.kind == lineHTMLBody) {
			b.WriteString("\n")
			continue
		}
		b.WriteString(l.raw)
	}
	return b.String()
}

// lineBreakHook lets through the one raw HTML tag our Markdown writes, the
// <br> that stands for a line break inside a table cell, and writes the
// prose's maths (mathHTML).
func lineBreakHook(w io.Writer, node ast.Node, entering bool) (ast.WalkStatus, bool) {
	switch m := node.(type) {
	case *ast.Math:
		io.WriteString(w, mathHTML(string(m.Literal), false))
		return ast.GoToNext, true
	case *ast.MathBlock:
		if entering {
			io.WriteString(w, mathHTML(string(m.Literal), true))
		}
		return ast.SkipChildren, true
	}
	if s, ok := node.(*ast.HTMLSpan); ok && string(s.Literal) == "<br>" {
		io.WriteString(w, "<br>")
		return ast.GoToNext, true
	}
	return ast.GoToNext, false
}

var (
	tableCode = lazyRegexp(`<td><code>[^<]*</code></td>`)
	power     = lazyRegexp(`\^([-−]?[0-9]+(?:/[0-9]+)?)`) // x^2, h^−2, t^1/2 as printed
)

// typeset sets a formula in a table cell as mathematics is printed:
// exponents raised, products as a centred dot. Only digits are moved into
// markup, so the escaping of the text is kept.
func typeset(cell string) string {
	cell = power().ReplaceAllString(cell, "<sup>$1</sup>")
	return strings.ReplaceAll(cell, "*", "·")
}

var (
	xmlProlog = lazyRegexp(`^(?s)\s*(<\?xml.*?\?>\s*)?(<!DOCTYPE[^>]*>\s*)?`)
	svgUnsafe = lazyRegexp(`(?i)<script|<foreignobject|<iframe|<object|<embed|javascript:|@import|` +
		`\bon[a-z]+\s*=|(href|src)\s*=\s*["']?\s*(https?:|//)|url\(\s*["']?\s*(https?:|//)`)
)

// figureHTML shows a figure: its SVG inline when it is plain drawing, else
// (scripts, event handlers, outside links) as an image, where SVG cannot run
// anything.
func figureHTML(f Figure) string {
	svg := xmlProlog().ReplaceAllString(f.SVG, "")
	var img string
	if strings.HasPrefix(svg, "<svg") && !svgUnsafe().MatchString(svg) {
		img = svg
	} else {
		img = `<img alt="` + html.EscapeString(f.Name) + `" src="data:image/svg+xml;base64,` +
			base64.StdEncoding.EncodeToString([]byte(f.SVG)) + `">`
	}
	return "<figure>\n" + img + "\n<figcaption>Figure: " + html.EscapeString(f.Name) + "</figcaption>\n</figure>"
}

// pageCSS is the report's style. Maths asks for a font with an OpenType
// MATH table by name first: without one, Chromium does not stretch fences.
// A typeset residual's cell does not wrap: Chromium sizes the column as if
// an <mtext> label could break, which it never does, and the formula
// would spill into the next cell.
const pageCSS = `body { margin: 0; background: #fff; color: #1d1d1f; font: 16px/1.55 system-ui, -apple-system, "Segoe UI", sans-serif; }
main { max-width: 64rem; margin: 0 auto; padding: 1.5rem 1.25rem 4rem; }
h1, h2, h3 { line-height: 1.25; }
a { color: #1f5fa8; }
code { font: 0.9em/1.4 ui-monospace, "SF Mono", Menlo, Consolas, monospace; background: #f2f2f4; padding: 0.05em 0.3em; border-radius: 3px; }
pre { margin: 0.75rem 0; }
pre > code { display: block; overflow-x: auto; padding: 0.6rem 0.8rem; border-radius: 4px; background: #f6f6f8; border: 1px solid #e2e2e6; }
pre > code.language-cell { background: #eef4fc; border: 1px solid #b9cfea; border-left: 4px solid #2f6db5; }
pre > code.language-output { background: #fff; border: 1px dashed #a0a0a8; border-left: 4px solid #8a8a94; }
pre > code.language-cell::before, pre > code.language-output::before { display: block; font: 600 0.7rem/1.6 system-ui, sans-serif; text-transform: uppercase; letter-spacing: 0.06em; }
pre > code.language-cell::before { content: "cell"; color: #2f6db5; }
pre > code.language-output::before { content: "output"; color: #6a6a74; }
pre:has(> code.language-output:empty) { display: none; }
section.generated { margin: 0.5rem 0 1.75rem; padding: 0.1rem 0 0.1rem 1rem; border-left: 3px solid #d0d0d6; font-size: 0.95em; }
section.summary { padding: 0.5rem 1rem; background: #fafafb; border: 1px solid #dcdce2; border-left: 4px solid #555; border-radius: 4px; }
table { border-collapse: collapse; margin: 0.75rem 0; display: block; overflow-x: auto; }
th, td { border: 1px solid #d3d3da; padding: 0.3rem 0.6rem; text-align: left; vertical-align: top; }
th { background: #f0f0f3; }
td code { overflow-wrap: anywhere; }
code.tex { border-bottom: 1px dashed #b3261e; }
td.math { white-space: nowrap; }
math { font-family: "STIX Two Math", "Latin Modern Math", "DejaVu Math TeX Gyre", "Cambria Math", math; }
td.verdict { font-weight: 600; white-space: nowrap; }
td.v-holds { background: #e6f4e8; color: #145a20; }
td.v-digits { background: #eaf1fb; color: #1d4e89; }
td.v-estimated { background: #f1ecf8; color: #4f2f7a; font-style: italic; }
td.v-fails { background: #fbe9e9; color: #8f1d1d; }
td.v-undecided { background: #fbf4e2; color: #6d5210; }
figure { margin: 1rem 0; }
figure svg, figure img { max-width: 100%; height: auto; }
figcaption { font-size: 0.9em; color: #555; }
`

package cells

import (
	"regexp"
	"strings"
	"testing"
)

// The expected markup is written by hand from the W3C's MathML Core
// (Recommendation candidate, 2023): §3.1 token elements (mi, mn, mo, mtext;
// a letter is an <mi>, a number an <mn>, an operator an <mo>), §3.3 mfrac,
// msqrt and mroot (radicand first, index second), §3.4 msub, msup,
// msubsup, munder, mover, munderover (base, then script(s), sub before
// sup), §3.5 mtable/mtr/mtd, and §3.2.3 <math display="block">.
func TestMathMLFormulas(t *testing.T) {
	cases := []struct {
		tex     string
		display bool
		want    string
	}{
		{`\frac{a}{b}`, false, `<math><mfrac><mi>a</mi><mi>b</mi></mfrac></math>`},
		{`x^{2}`, false, `<math><msup><mi>x</mi><mn>2</mn></msup></math>`},
		{`x^23`, false, `<math><mrow><msup><mi>x</mi><mn>2</mn></msup><mn>3</mn></mrow></math>`}, // TeXbook ch. 16: one token
		{`a_{i}^{2}`, false, `<math><msubsup><mi>a</mi><mi>i</mi><mn>2</mn></msubsup></math>`},
		{`x_{i+1}`, false, `<math><msub><mi>x</mi><mrow><mi>i</mi><mo>+</mo><mn>1</mn></mrow></msub></math>`},
		{`\sqrt{2}`, false, `<math><msqrt><mn>2</mn></msqrt></math>`},
		{`\sqrt[3]{x}`, false, `<math><mroot><mi>x</mi><mn>3</mn></mroot></math>`},
		{`\alpha + \Gamma`, false, `<math><mrow><mi>α</mi><mo>+</mo><mi mathvariant="normal">Γ</mi></mrow></math>`},
		{`a \cdot b \times c \le d \ge e \ne f \pm g`, false,
			`<math><mrow><mi>a</mi><mo>⋅</mo><mi>b</mi><mo>×</mo><mi>c</mi><mo>≤</mo><mi>d</mi><mo>≥</mo><mi>e</mi><mo>≠</mo><mi>f</mi><mo>±</mo><mi>g</mi></mrow></math>`},
		{`\sum_{i=1}^{n} i`, true,
			`<math display="block"><mrow><munderover><mo>∑</mo><mrow><mi>i</mi><mo>=</mo><mn>1</mn></mrow><mi>n</mi></munderover><mi>i</mi></mrow></math>`},
		{`\prod_{k} a_k`, false, `<math><mrow><munder><mo>∏</mo><mi>k</mi></munder><msub><mi>a</mi><mi>k</mi></msub></mrow></math>`},
		{`\begin{pmatrix} 1 & 2 \\ 3 & 4 \end{pmatrix}`, false,
			`<math><mrow><mo fence="true" stretchy="true">(</mo><mtable><mtr><mtd><mn>1</mn></mtd><mtd><mn>2</mn></mtd></mtr><mtr><mtd><mn>3</mn></mtd><mtd><mn>4</mn></mtd></mtr></mtable><mo fence="true" stretchy="true">)</mo></mrow></math>`},
		{`\begin{bmatrix} a \\ b \\ \end{bmatrix}`, false,
			`<math><mrow><mo fence="true" stretchy="true">[</mo><mtable><mtr><mtd><mi>a</mi></mtd></mtr><mtr><mtd><mi>b</mi></mtd></mtr></mtable><mo fence="true" stretchy="true">]</mo></mrow></math>`},
		{`\left( \frac{1}{2} \right)`, false,
			`<math><mrow><mo fence="true" stretchy="true">(</mo><mfrac><mn>1</mn><mn>2</mn></mfrac><mo fence="true" stretchy="true">)</mo></mrow></math>`},
		{`\text{if } x-1`, false, `<math><mrow><mtext>if </mtext><mi>x</mi><mo>−</mo><mn>1</mn></mrow></math>`},
		{`\mathrm{vol}(S)`, false, `<math><mrow><mi mathvariant="normal">vol</mi><mo>(</mo><mi>S</mi><mo>)</mo></mrow></math>`},
		{`3.25`, false, `<math><mn>3.25</mn></math>`},
	}
	for _, c := range cases {
		got, err := MathML(c.tex, c.display)
		if err != nil || got != c.want {
			t.Errorf("MathML(%q) =\n%s, %v\nwant\n%s", c.tex, got, err, c.want)
		}
	}
}

// Formulas outside the subset are errors that name what is wrong.
func TestMathMLRefuses(t *testing.T) {
	for tex, want := range map[string]string{
		`\foo`:                          `unknown command \foo`,
		`{x`:                            "missing closing }",
		`x}`:                            "unmatched }",
		`x^2^3`:                         "double superscript",
		`\frac{1}`:                      "missing argument",
		`\left( x`:                      `missing closing \right`,
		`\begin{cases}x\end{cases}`:     `unknown environment "cases"`,
		`\begin{pmatrix}x\end{bmatrix}`: `ended by \end{bmatrix}`,
		strings.Repeat("{", 100) + strings.Repeat("}", 100): "nested deeper",
		strings.Repeat("x", 5000):                           "longer than",
	} {
		if got, err := MathML(tex, false); err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("MathML(%.40q) = %q, %v; want an error with %q", tex, got, err, want)
		}
	}
}

// The rule for "$" in prose (the one pandoc's tex_math_dollars documents,
// from memory): a price stays prose, code spans and "\$" are untouched.
func TestProseMathDelimiters(t *testing.T) {
	for md, want := range map[string]string{
		"It costs $5 and $6.":             "<p>It costs $5 and $6.</p>\n",
		"From $a$ to $b$.":                "<p>From <math><mi>a</mi></math> to <math><mi>b</mi></math>.</p>\n",
		"Code `$x$` stays.":               "<p>Code <code>$x$</code> stays.</p>\n",
		"An escaped \\$x$ stays.":         "<p>An escaped $x$ stays.</p>\n",
		"Spaced $ x$ and $x $ stay.":      "<p>Spaced $ x$ and $x $ stay.</p>\n",
		"Then $x$5 stays.":                "<p>Then $x$5 stays.</p>\n",
		"Display $$x$$ here.":             "<p>Display <math display=\"block\"><mi>x</mi></math> here.</p>\n",
		"$$\n\\frac{1}{2}\n$$":            "<p><math display=\"block\"><mfrac><mn>1</mn><mn>2</mn></mfrac></math></p>\n",
		"```\n$x$\n```":                   "<pre><code>$x$\n</code></pre>\n",
		"Open $x\n\ny$ no.":               "<p>Open $x</p>\n\n<p>y$ no.</p>\n",
		"Unknown $\\foo$.":                "<p>Unknown <code class=\"tex\" title=\"not typeset: unknown command \\foo\">$\\foo$</code>.</p>\n",
		"Escaped \\\\$x$ is maths again.": "<p>Escaped \\<math><mi>x</mi></math> is maths again.</p>\n",
	} {
		if got := proseHTML(md); got != want {
			t.Errorf("proseHTML(%q) =\n%q\nwant\n%q", md, got, want)
		}
	}
}

// A notebook is hostile: nothing in its maths may become markup of its own.
func TestProseMathInjection(t *testing.T) {
	for _, md := range []string{
		"$<script>alert(1)</script>$",
		`$\text{</math><script>alert(1)</script>}$`,
		`$\mathrm{"><img src=x onerror=alert(1)>}$`,
		`$\foo{"><img src=x onerror=alert(1)>}$`,
		`$$\begin{pmatrix}<b>&"'\end{pmatrix}$$`,
		`$\left< x \right>$`,
		"$a\x00b$",
	} {
		got := proseHTML(md)
		for _, tag := range anyTag.FindAllStringSubmatch(got, -1) {
			if !mathTags[tag[1]] || !safeAttrs.MatchString(tag[2]) {
				t.Errorf("proseHTML(%q) = %q: has the tag %s", md, got, tag[0])
			}
		}
	}
}

var (
	anyTag    = regexp.MustCompile(`</?([a-zA-Z][a-zA-Z0-9]*)([^>]*)>`)
	safeAttrs = regexp.MustCompile(`^( (display|mathvariant|fence|stretchy|width|class|title)="[^"<>]*")*$`)
	mathTags  = map[string]bool{}
)

func init() {
	for _, n := range strings.Fields("p code math mi mn mo mtext mrow mfrac msqrt mroot msub msup msubsup munder mover munderover mtable mtr mtd mspace") {
		mathTags[n] = true
	}
}

// A formula outside the subset is a warning naming its notebook line.
func TestProseMathWarnings(t *testing.T) {
	src := "# m\n\nFine $x^2$.\n\nThe `$\\bad$` code is not maths,\nbut $\\frac{1}{2}$ and\n$\\foo{x}$ is.\n\n```cell\nx = 1\n```\n\n$$\n\\begin{cases}x\\end{cases}\n$$\n"
	nb, err := Parse("m.md", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	want := []Problem{
		{Line: 7, Message: `maths not typeset, shown as its source in the HTML report: unknown command \foo`},
		{Line: 13, Message: `maths not typeset, shown as its source in the HTML report: unknown environment "cases"`},
	}
	if len(nb.Warnings) != len(want) || nb.Warnings[0] != want[0] || nb.Warnings[1] != want[1] {
		t.Errorf("warnings %+v, want %+v", nb.Warnings, want)
	}
}

// No formula makes the converter panic or write a tag or attribute outside
// the MathML it knows.
func FuzzProseMath(f *testing.F) {
	for _, s := range []string{`$\frac{1}{2}$`, `$$\begin{pmatrix}1&2\\3&4\end{pmatrix}$$`, `$\sqrt[3]{x}$`,
		`$\left( x \right)$`, `$\text{</math>}$`, `$x^{2}_{i}$`, `$\sum_{i=1}^{n}$`, "$a\\$b$"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, md string) {
		got := proseHTML(md)
		for _, tag := range anyTag.FindAllStringSubmatch(got, -1) {
			if mathTags[tag[1]] && !safeAttrs.MatchString(tag[2]) || !mathTags[tag[1]] && !markdownTags[tag[1]] {
				t.Errorf("proseHTML(%q) = %q: has the tag %s", md, got, tag[0])
			}
		}
	})
}

// markdownTags are the tags Markdown itself writes for the fuzzer's text.
var markdownTags = map[string]bool{}

func init() {
	for _, n := range strings.Fields("p em strong del h1 h2 h3 h4 h5 h6 ul ol li blockquote pre hr br table thead tbody tfoot tr th td a img tt sup sub dl dt dd div span input") {
		markdownTags[n] = true
	}
}

// BenchmarkProseMath converts a paragraph with ten formulas, as RenderHTML
// does for the notebook's text.
func BenchmarkProseMath(b *testing.B) {
	md := strings.Repeat(`The sum $\sum_{i=1}^{n} i^{2} = \frac{n(n+1)(2n+1)}{6}$ and $\begin{pmatrix} a & b \\ c & d \end{pmatrix}$. `, 5)
	for b.Loop() {
		proseHTML(md)
	}
}

// Residuals reach the report with their LaTeX (written by the kernel from
// exact values, exact/latex.go) and are typeset in the tables of the HTML
// report. The expected markup is written by hand from the W3C's MathML
// Core (2023): §3.1 tokens (a lower-case Greek letter is an <mi> of one
// character, drawn italic by the math-auto transform of §3.1.1, like any
// single-letter identifier; a word of text an <mtext>), §3.3.2 mfrac
// (numerator, then denominator), §3.4 msup, §3.5 mtable, and §3.2.5 mspace
// for \; (5/18 em, TeXbook ch. 18). − is U+2212 MINUS SIGN. The Markdown
// report keeps the plain text.
func TestResidualsTypeset(t *testing.T) {
	cases := []struct{ text, tex, want string }{
		// A rational function: lhs − rhs in lowest terms, one fraction.
		{"-2/(x + 1)", `-\frac{2}{x + 1}`,
			`<math><mrow><mo>−</mo><mfrac><mn>2</mn><mrow><mi>x</mi><mo>+</mo><mn>1</mn></mrow></mfrac></mrow></math>`},
		// Greek names as Greek letters, not upright words.
		{"alpha^2 - theta", `\alpha^{2} - \theta`,
			`<math><mrow><msup><mi>α</mi><mn>2</mn></msup><mo>−</mo><mi>θ</mi></mrow></math>`},
		// A matrix difference, labelled.
		{"difference [[0, 0], [0, -1]]", `\text{difference}\; \begin{pmatrix} 0 & 0 \\ 0 & -1 \end{pmatrix}`,
			`<math><mrow><mtext>difference</mtext><mspace width="0.2778em"></mspace><mrow><mo fence="true" stretchy="true">(</mo>` +
				`<mtable><mtr><mtd><mn>0</mn></mtd><mtd><mn>0</mn></mtd></mtr><mtr><mtd><mn>0</mn></mtd><mtd><mrow><mo>−</mo><mn>1</mn></mrow></mtd></mtr></mtable>` +
				`<mo fence="true" stretchy="true">)</mo></mrow></mrow></math>`},
		// An entry of a difference of rational-function matrices.
		{"entry [0, 1] of the difference: 2/(x^2 - 1)", `\text{entry [0, 1] of the difference:}\; \frac{2}{x^{2} - 1}`,
			`<math><mrow><mtext>entry [0, 1] of the difference:</mtext><mspace width="0.2778em"></mspace>` +
				`<mfrac><mn>2</mn><mrow><msup><mi>x</mi><mn>2</mn></msup><mo>−</mo><mn>1</mn></mrow></mfrac></mrow></math>`},
		// A long polynomial's preview.
		{"x^9 + … (10 terms in all)", `x^{9} + \cdots\; \text{(10 terms in all)}`,
			`<math><mrow><msup><mi>x</mi><mn>9</mn></msup><mo>+</mo><mo>⋯</mo><mspace width="0.2778em"></mspace><mtext>(10 terms in all)</mtext></mrow></math>`},
	}
	for _, c := range cases {
		nb, _ := Parse("p.md", []byte("# p\n\n```cell\nx\n```\n"))
		r := &Report{Notebook: nb, Outcomes: []Outcome{{Cell: 1, Status: Ran, Claims: []Claim{
			{Name: "r", Kind: "identity", Verdict: Fails, Residual: c.text, ResidualTeX: c.tex, Cell: 1, Line: 4},
		}}}}
		page := string(RenderHTML(r))
		if n := strings.Count(page, `<td class="math">`+c.want+"</td>"); n != 2 {
			t.Errorf("%q typeset %d times (want 2: index and cell), page:\n%s", c.tex, n, page)
		}
		if !strings.Contains(string(RenderMarkdown(r, true)), "`"+c.text+"`") {
			t.Errorf("%q: the Markdown report must keep the plain text", c.text)
		}
	}
}

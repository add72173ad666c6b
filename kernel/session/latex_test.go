package session

import (
	"strings"
	"testing"

	"assay/cells"
)

// latex(x) of each value kind against LaTeX written by hand (the markup of
// Lamport, "LaTeX: A Document Preparation System", 2nd ed.: \frac{}{},
// \sqrt{}, \sqrt[n]{}, x^{2}, x_{1}, pmatrix from amsmath), for values
// with known closed forms: the golden ratio (1 + √5)/2, cos(π/4) = √2/2,
// ∛2 (from memory), Sophie Germain's x⁴ + 4 = (x² − 2x + 2)(x² + 2x + 2)
// and x⁶ − 1 = Φ₁Φ₂Φ₃Φ₆ (OEIS A013595).
func TestLaTeXFromNotebook(t *testing.T) {
	cases := []printCase{
		{"print(latex(frac(-3, 4)), latex(7), latex(frac(10, 5)))", `-\frac{3}{4} 7 2`},
		{"print(latex((1 + sqrt(5))/2))", `\frac{1 + \sqrt{5}}{2}`},
		{"print(latex(sqrt(2)/2), latex(root(2, 3)), latex(-2*root(3, 3)))", `\frac{\sqrt{2}}{2} \sqrt[3]{2} -2 \sqrt[3]{3}`},
		{"print(latex(sqrt(frac(1, 3))))", `\frac{\sqrt{3}}{3}`},
		{"x, y = variables(\"x y\")\nprint(latex(x**2 - 2*x*y + frac(3, 4)*y - 1))", `x^{2} - 2 x y + \frac{3}{4} y - 1`},
		{"x1, x2, alpha, area = variables(\"x1 x2 alpha area\")\nprint(latex(x1**2*x2 - alpha*area))", `x_{1}^{2} x_{2} - \alpha \mathrm{area}`},
		{"x, y = variables(\"x y\")\nprint(latex((x + 1)/(x - y)))", `\frac{x + 1}{x - y}`},
		{"x = variables(\"x\")\nprint(latex(factor(x**4 + 4)))", `\left(x^{2} - 2 x + 2\right) \left(x^{2} + 2 x + 2\right)`},
		{"x = variables(\"x\")\nprint(latex(factor(-2*(x - 1)**2*(x + 1)*x**3)))", `-2 \left(x - 1\right)^{2} x^{3} \left(x + 1\right)`},
		{"x = variables(\"x\")\nprint(latex(factor(1 - x**2)))", `-\left(x - 1\right) \left(x + 1\right)`},
		{"print(latex(matrix([[1, frac(1, 2)], [-3, 0]])))", `\begin{pmatrix} 1 & \frac{1}{2} \\ -3 & 0 \end{pmatrix}`},
		{"x = variables(\"x\")\nprint(latex(matrix([[x, 1], [0, x**2]])))", `\begin{pmatrix} x & 1 \\ 0 & x^{2} \end{pmatrix}`},
		{"x = variables(\"x\")\nshow(x**2 + 1, latex=True)", `x^{2} + 1`},
		{"show(frac(1, 3), label=\"a\", latex=True)", `a = \frac{1}{3}`},
	}
	expectPrints(t, cases)
}

// Every LaTeX latex() writes is in the subset the HTML report typesets,
// so a formula pasted from a cell into the prose renders.
func TestLaTeXIsTypeset(t *testing.T) {
	rep := runHere(t, "x, y = variables(\"x y\")\n"+
		"for v in [frac(-3, 4), (1 + sqrt(5))/2, root(2, 3), x**2*y - frac(1, 2), (x + 1)/(x - y), factor(x**6 - 1), matrix([[x, 1], [0, frac(1, 2)]])]:\n"+
		"    print(latex(v))")
	for _, l := range strings.Split(strings.TrimSpace(output(t, rep, 1)), "\n") {
		if _, err := cells.MathML(l, false); err != nil {
			t.Errorf("%q is not typeset: %v", l, err)
		}
	}
}

// A certified-digits real (no short closed form: π, e) is written with
// its truncated digits marked by \ldots, in latex() and in show(latex=True)
// alike (π: OEIS A000796, e: A001113, from memory), and bad arguments.
func TestLaTeXDigitsAndRefusals(t *testing.T) {
	expectPrints(t, []printCase{
		{"print(latex(pi))", `3.1415926535897932384\ldots`},
		{"show(exp(1), latex=True)", `2.7182818284590452353\ldots`},
		{"show(-exp(-20), label=\"t\", latex=True)", `t = -2.0611536224385578279\ldots \cdot 10^{-9}`},
	})
	expectErrors(t, []errorCase{
		{"latex(1.5)", "latex() takes an exact value"},
		{"latex([1, 2])", "not list"},
		{"latex(True)", "not bool"},
	})
}

// Residuals carry their LaTeX, written by exact's one naming rule, to the
// HTML report, where they are typeset: a rational-function identity's
// residual as the difference in lowest terms, one fraction (1/(x − 1) −
// 1/(x + 1) = 2/(x² − 1), by hand), Greek variable names as Greek letters
// (α² − θ − α·α = −θ), entries of matrix differences with their label,
// a factorization's remainder (x² − 1 − (x − 1)(x + 2) = −x + 1, by
// hand), and an inequality's exact slack (1/2 − 1/4 = 1/4). The expected MathML is written by hand from the W3C's MathML
// Core (2023): §3.1 tokens (a Greek letter is a one-character <mi>, drawn
// italic by math-auto), §3.3.2 mfrac, §3.4 msup, §3.5 mtable.
func TestResidualsTypesetFromNotebook(t *testing.T) {
	rep := runHere(t, "x, alpha, theta = variables(\"x alpha theta\")\n"+
		"identity(\"fraction\", 1 / (x - 1), 1 / (x + 1))\n"+
		"identity(\"greek\", alpha**2 - theta, alpha * alpha)\n"+
		"identity(\"entry\", matrix([[x, 1 / (x - 1)]]), matrix([[x, 1 / (x + 1)]]))\n"+
		"identity(\"rationals\", matrix([[1, 2], [3, 4]]), matrix([[1, 2], [3, frac(9, 2)]]))\n"+
		"factorization(\"factors\", x**2 - 1, [x - 1, x + 2])\n"+
		"inequality(\"slack\", frac(1, 4), frac(1, 2))")
	page := string(cells.RenderHTML(rep))
	frac := `<mfrac><mn>2</mn><mrow><msup><mi>x</mi><mn>2</mn></msup><mo>−</mo><mn>1</mn></mrow></mfrac>`
	for _, want := range []string{
		`<td class="math"><math>` + frac + `</math></td>`,
		`<td class="math"><math><mrow><mo>−</mo><mi>θ</mi></mrow></math></td>`,
		`<td class="math"><math><mrow><mtext>entry [0, 1] of the difference:</mtext><mspace width="0.2778em"></mspace>` + frac + `</mrow></math></td>`,
		`<mtd><mrow><mo>−</mo><mfrac><mn>1</mn><mn>2</mn></mfrac></mrow></mtd>`,
		`<td class="math"><math><mrow><mo>−</mo><mi>x</mi><mo>+</mo><mn>1</mn></mrow></math></td>`,
		`<td class="math"><math><mrow><mtext>slack</mtext><mspace width="0.2778em"></mspace><mfrac><mn>1</mn><mn>4</mn></mfrac></mrow></math></td>`,
	} {
		if !strings.Contains(page, want) {
			t.Errorf("the report lacks %s", want)
		}
	}
	if strings.Contains(page, ">theta<") || strings.Contains(page, ">alpha<") {
		t.Error("a Greek name is typeset as a word")
	}
}

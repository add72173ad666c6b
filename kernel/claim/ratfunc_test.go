package claim

import (
	"encoding/json"
	"math/big"
	"strings"
	"testing"

	"assay/cells"
	"assay/exact"
)

// Cross-multiplication decides identities between rational functions: the
// partial fractions 1/(x(x+1)) = 1/x − 1/(x+1) (textbook) hold with the
// proviso about denominators; 1/x + 1/(x+1) = (2x + 1)/(x² + x) differs
// from 1/(x(x+1)): the cross product 1·(x² + x) − (2x + 1)(x² + x) =
// −2x³ − 2x² is not zero, and the residual shown is the difference in
// lowest terms, −2x/(x(x + 1)) = −2/(x + 1), in LaTeX a \frac with the
// sign outside (Lamport); and a sampled tally keeps the mark and the LaTeX
// through its wire form, so a claim split among workers says the same.
func TestCrossMultipliedResiduals(t *testing.T) {
	r := exact.NewRing()
	parse := func(s string) *exact.Poly {
		p, err := r.Parse(s)
		if err != nil {
			t.Fatal(err)
		}
		return p
	}
	frac := func(n, d string) *exact.RatFunc {
		f, err := exact.NewRatFunc(parse(n), parse(d))
		if err != nil {
			t.Fatal(err)
		}
		return f
	}
	lhs := frac("1", "x*(x + 1)")
	for _, c := range []struct {
		rhs      *exact.RatFunc
		verdict  cells.Verdict
		residual string
		tex      string
	}{
		{frac("1", "x*(x + 1)"), cells.Holds, "0", "0"},
		{frac("2*x + 1", "x^2 + x"), cells.Fails, "-2/(x + 1)", `-\frac{2}{x + 1}`},
	} {
		res, err := OfRatFuncs(lhs, c.rhs)
		if err != nil {
			t.Fatal(err)
		}
		var cl cells.Claim
		res.Decide(&cl, 0)
		if cl.Verdict != c.verdict || cl.Residual != c.residual || cl.ResidualTeX != c.tex || cl.Method != CrossMethod || !strings.Contains(cl.Note, "lhs.num·rhs.den − rhs.num·lhs.den") {
			t.Errorf("%s: %s %q %q %q", c.rhs, cl.Verdict, cl.Residual, cl.Method, cl.Note)
		}
		var tally IdentityTally
		tally.Add(3, res)
		wire, err := json.Marshal(tally)
		if err != nil {
			t.Fatal(err)
		}
		var back IdentityTally
		if err := json.Unmarshal(wire, &back); err != nil {
			t.Fatal(err)
		}
		if got := back.Worst.Residual(); !got.Cross || got.Text != c.residual || got.TeX != c.tex {
			t.Errorf("%s: the tally's residual lost its mark: %+v", c.rhs, got)
		}
	}
}

// A long polynomial residual is previewed alike in text and in LaTeX: its
// first six terms, then the count. (x + 1)^9 has the ten coefficients of
// row 9 of Pascal's triangle, 1, 9, 36, 84, 126, 126, 84, 36, 9, 1. Matrix
// and list residuals label the entry, and the LaTeX braces what follows
// the label, so a leading minus is a sign.
func TestResidualLaTeXForms(t *testing.T) {
	r := exact.NewRing()
	p, err := r.Parse("(x + 1)^9")
	if err != nil {
		t.Fatal(err)
	}
	res := OfPoly(p)
	if want := "x^9 + 9*x^8 + 36*x^7 + 84*x^6 + 126*x^5 + 126*x^4 + … (10 terms in all)"; res.Text != want {
		t.Errorf("text %q, want %q", res.Text, want)
	}
	if want := `x^{9} + 9 x^{8} + 36 x^{7} + 84 x^{6} + 126 x^{5} + 126 x^{4} + \cdots\; \text{(10 terms in all)}`; res.TeX != want {
		t.Errorf("LaTeX %q, want %q", res.TeX, want)
	}
	a, err := exact.NewMatrix([][]*big.Rat{{big.NewRat(1, 1), big.NewRat(0, 1)}})
	if err != nil {
		t.Fatal(err)
	}
	b, err := exact.NewMatrix([][]*big.Rat{{big.NewRat(1, 1), big.NewRat(1, 2)}})
	if err != nil {
		t.Fatal(err)
	}
	m, err := OfMatrices(a, b)
	if err != nil {
		t.Fatal(err)
	}
	if m.Text != "difference [[0, -1/2]]" || m.TeX != `\text{difference}\; \begin{pmatrix} 0 & -\frac{1}{2} \end{pmatrix}` {
		t.Errorf("matrix residual %q, %q", m.Text, m.TeX)
	}
	l := Entries([]Residual{Zero(), Exact(big.NewRat(-3, 4))})
	if l.Text != "entry 1: -3/4" || l.TeX != `\text{entry 1:}\; {-\frac{3}{4}}` {
		t.Errorf("list residual %q, %q", l.Text, l.TeX)
	}
}

// When the difference in lowest terms cannot be made (here its
// denominator, the product of two 5-term sums, passes a cap of 20 terms
// that the cross product, 10 terms, stays under), the claim still fails,
// and the residual shown is the cross product, named as such.
func TestCrossResidualWhenTheDifferenceIsCapped(t *testing.T) {
	r := exact.NewRing()
	r.SetMaxTerms(20)
	sum := func(s string) *exact.Poly {
		p, err := r.Parse(s)
		if err != nil {
			t.Fatal(err)
		}
		return p
	}
	lhs, err := exact.NewRatFunc(sum("1"), sum("a + b + c + d + e"))
	if err != nil {
		t.Fatal(err)
	}
	rhs, err := exact.NewRatFunc(sum("1"), sum("f + g + h + i + j"))
	if err != nil {
		t.Fatal(err)
	}
	res, err := OfRatFuncs(lhs, rhs)
	if err != nil {
		t.Fatal(err)
	}
	var c cells.Claim
	res.Decide(&c, 0)
	if c.Verdict != cells.Fails || !strings.HasPrefix(c.Residual, "lhs.num·rhs.den − rhs.num·lhs.den = ") ||
		!strings.HasPrefix(c.ResidualTeX, `\text{lhs.num·rhs.den − rhs.num·lhs.den} = `) || strings.Contains(c.Note, "lowest terms, and") {
		t.Errorf("%s %q %q, note %q", c.Verdict, c.Residual, c.ResidualTeX, c.Note)
	}
}

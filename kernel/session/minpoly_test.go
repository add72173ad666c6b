package session

import (
	"strings"
	"testing"

	"assay/cells"
)

// Minimal polynomials and degrees from a notebook, against standard
// tables: √2 + √3 has t⁴ − 10t² + 1, the golden ratio t² − t − 1 (from
// memory); ∛2 + √3 has t⁶ − 9t⁴ − 4t³ + 27t² − 36t − 23 (by hand: (x − √3)³
// = 2 gives x³ + 9x − 2 = √3(3x² + 3), then square).
func TestMinimalPolynomialFromNotebook(t *testing.T) {
	expectPrints(t, []printCase{
		{`print((sqrt(2) + sqrt(3)).minimal_polynomial("t"), (sqrt(2) + sqrt(3)).degree())`, "t^4 - 10*t^2 + 1 4"},
		{`t = variables("t")
phi = (1 + sqrt(5)) / 2
print(phi.minimal_polynomial(t), phi.degree())`, "t^2 - t - 1 2"},
		{`print((root(2, 3) + sqrt(3)).minimal_polynomial("x"))`, "x^6 - 9*x^4 - 4*x^3 + 27*x^2 - 36*x - 23"},
		// The minimal polynomial is a notebook polynomial: factor() finds
		// it irreducible, and it vanishes at the value, proved.
		{`x = sqrt(2) + root(3, 3)
p = x.minimal_polynomial("u")
print(factor(p)[1][0][1], p.is_irreducible(), identity("p(x) = 0", sum(c * x**k for k, c in p.collect("u")), 0))`, "1 True True"},
		// Rationals are reals too, of degree 1.
		{`print((sqrt(2) * sqrt(2)).degree(), (sqrt(2) * sqrt(3) - sqrt(6)).minimal_polynomial("t"))`, "1 t"},
	})
	expectErrors(t, []errorCase{
		{`print((2 * cos(2 * pi / 7)).minimal_polynomial("t"))`, "involves a transcendental function or pi"},
		{`print(sqrt(2).minimal_polynomial("2t"))`, "minimal_polynomial(): variable name"},
	})
}

// show() gives the closed form and 20 certified digits: the golden ratio
// is 1.6180339887498948482… (OEIS A001622, from memory).
func TestShowClosedForm(t *testing.T) {
	expectPrints(t, []printCase{
		{`show((1 + sqrt(5)) / 2, label="phi")`, "phi = (1 + sqrt(5))/2 ≈ 1.6180339887498948482"},
		{`show(sqrt(2) * sqrt(2)); show(pi)`, "2\n3.1415926535897932384"},
	})
}

// --max-degree caps the degree on the way, and crossing it names the flag
// and the line: five square roots of primes have degree 32 (Besicovitch).
func TestMaxDegree(t *testing.T) {
	src := "s = sqrt(2) + sqrt(3) + sqrt(5) + sqrt(7) + sqrt(11)\nprint(s.degree())"
	if got := strings.TrimSpace(output(t, runHere(t, src), 1)); got != "32" {
		t.Errorf("degree %q, want 32", got)
	}
	s := DefaultSettings
	s.MaxDegree = 16
	o := runWith(t, s, src).Outcomes[0]
	if o.Error == nil || !strings.Contains(o.Error.Message, "--max-degree") || !strings.Contains(o.Error.Message, "degree cap of 16") || o.Error.Line != 5 {
		t.Errorf("error %+v", o.Error)
	}
}

// Two algebraic numbers that agree to 149 significant digits:
// √(10^74 + 1) and 10^37 + 1/(2·10^37), both about 10^37, differ by
// −1.25·10^-112 + 6.25·10^-187 − … (binomial series of √(10^74 + 1)). The
// claim fails with those digits at the default working precision.
func TestNearMissAt149Digits(t *testing.T) {
	o := runHere(t, `identity("near miss", sqrt(10**74 + 1), 10**37 + 1 / (2 * 10**37))`).Outcomes[0]
	if o.Error != nil || len(o.Claims) != 1 {
		t.Fatalf("%+v", o)
	}
	c := o.Claims[0]
	if c.Verdict != cells.Fails || !strings.HasPrefix(c.Residual, "-1.2499999999") || !strings.Contains(c.Residual, "e-112") {
		t.Errorf("%s, residual %q", c.Verdict, c.Residual)
	}
}

// A closed form is cell code for exactly the value: evaluated again by the
// notebook's own interpreter, it compares equal (== on algebraic reals is
// decided exactly). Expected forms: the examples and textbook
// rationalizations (1/(√2 + √3 + √5) = (3√2 + 2√3 − √30)/12, from
// multiplying by conjugates by hand; (∛2 − 1)³ = 1 + 3∛2 − 3∛4).
func TestClosedFormEvaluatesBack(t *testing.T) {
	src := `xs = [sqrt(frac(128999, 144)), (1 + sqrt(5)) / 2, 2 * root(3, 3), 1 / (sqrt(2) + sqrt(3) + sqrt(5)),
      sqrt(2 + sqrt(3)) ** -3, -root(frac(-16, 27), 3) / 7, (root(2, 3) - 1) ** 3, sqrt(root(5, 3) - root(4, 3))]
for x in xs:
    print(x, eval(str(x)) == x)`
	want := `sqrt(128999)/12 True
(1 + sqrt(5))/2 True
2*root(3, 3) True
(3*sqrt(2) + 2*sqrt(3) - sqrt(30))/12 True
sqrt(2 + sqrt(3))**(-3) True
2*root(2, 3)/21 True
1 + 3*root(2, 3) - 3*root(4, 3) True
sqrt(root(5, 3) - root(4, 3)) True`
	if got := strings.TrimSpace(output(t, runHere(t, src), 1)); got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
}

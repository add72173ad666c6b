package session

import (
	"fmt"
	"strings"
	"testing"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/values"
)

func TestRationalFunctions(t *testing.T) {
	const tx = "t, x, y = variables(\"t x y\")\n"
	expectPrints(t, []printCase{
		{tx + "print((1 - t**2) / (1 + t**2))", "(-t^2 + 1)/(t^2 + 1)"},
		// A polynomial, with its methods, when the division is exact.
		{tx + "q = (x**2 - 1) / (x - 1)\nprint(q, q.degree())", "x + 1 1"},
		{tx + "print(1 / x, x ** -2, 2 / (4*x + 6))", "1/x 1/(x^2) 1/(2*x + 3)"},
		{tx + "f = (2*x + 2) / (4*x - 4)\nprint(f.numerator, f.denominator, f.variables())", "1/2*x + 1/2 x - 1 ['x']"},
		// The circle's point at t = 1/2 is (3/5, 4/5), the 3-4-5 triangle.
		{tx + "print(((1 - t**2) / (1 + t**2)).at(t=frac(1, 2)), (2*t / (1 + t**2)).at(t=frac(1, 2)))", "3/5 4/5"},
		{tx + "print((x / (x + y)).at(y=0), (x / (x + y)).at(x=1))", "1 1/(y + 1)"},
		// Möbius maps compose as their matrices multiply (textbook):
		// [[2, 1], [1, 3]]·[[1, -1], [4, 2]] = [[6, 0], [13, 5]].
		{tx + "f = (2*x + 1) / (x + 3)\nprint(f.substitute(x=(x - 1) / (4*x + 2)))", "(6*x)/(13*x + 5)"},
		// Quotient rule by hand: (x/(x² + 1))' = (1 − x²)/(x² + 1)².
		{tx + "print((x / (x**2 + 1)).derivative(\"x\"))", "(-x^2 + 1)/(x^4 + 2*x^2 + 1)"},
		// A polynomial with rational functions put in: the circle again.
		{tx + "print((x**2 + y**2).substitute(x=(1 - t**2) / (1 + t**2), y=2*t / (1 + t**2)), (x*y).substitute(x=1/y))", "1 1"},
		{tx + "f = x / (x + y)\nprint(f == x / (x + y), f != 1 / (x + y), f * (x + y), f + y / (x + y))", "True True x 1"},
		// The 2x2 inverse by the adjugate formula (textbook).
		{tx + "M = matrix([[x, y], [1, x]])\nprint(M.inverse()[0, 0], M.inverse()[0, 1], det(M.inverse()))", "x/(x^2 - y) (-y)/(x^2 - y) 1/(x^2 - y)"},
		{tx + "M = matrix([[1 / x, 1], [1, x]])\nprint(M.rank if False else det(M), M.transpose()[0, 1])", "0 1"},
		{tx + "M = matrix([[x, 1], [1, y]])\nprint(M.solve([1, 0]), M * M.inverse() == unit_matrix(2), (M ** -1) * M == unit_matrix(2))", "[y/(x*y - 1), (-1)/(x*y - 1)] True True"},
	})
}

// Identities between rational functions are proved by cross-multiplication.
func TestRationalFunctionClaims(t *testing.T) {
	rep := runHere(t, "t, x = variables(\"t x\")\n"+
		// the rational parametrisation of the unit circle (standard, from memory)
		"identity(\"circle\", ((1 - t**2) / (1 + t**2))**2 + (2*t / (1 + t**2))**2, 1)\n"+
		// partial fractions (textbook)
		"identity(\"partial fractions\", 1 / (x * (x + 1)), 1 / x - 1 / (x + 1))\n"+
		"identity(\"a wrong decomposition\", 1 / (x * (x + 1)), 1 / x + 1 / (x + 1))\n"+
		// a polynomial made by a division keeps the proviso
		"identity(\"removable\", (x**2 - 1) / (x - 1), x + 1)\n"+
		"identity(\"a pair\", [1 / x, x], [x / x**2, x])\n"+
		"identity(\"at a point\", lambda s: ((1 / (x - s)).at(x=0), -1 / s), over=lambda k: k + 1, samples=5)")
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("cell failed: %s", o.Error.Message)
	}
	want := []struct {
		verdict          cells.Verdict
		method, residual string
	}{
		{cells.Holds, claim.CrossMethod, "0"},
		{cells.Holds, claim.CrossMethod, "0"},
		// 1/x + 1/(x + 1) = (2x + 1)/(x² + x); cross-multiplied,
		// 1·(x² + x) − (2x + 1)·(x² + x) = −2x³ − 2x² ≠ 0; the residual
		// shown is the difference, −2x/(x² + x) = −2/(x + 1)
		{cells.Fails, claim.CrossMethod, "-2/(x + 1)"},
		{cells.Holds, claim.CrossMethod, "0"},
		{cells.Holds, claim.CrossMethod, "0"},
		// at values the sides are rationals
		{cells.Holds, claim.ExactMethod, "0"},
	}
	if len(o.Claims) != len(want) {
		t.Fatalf("got %d claims", len(o.Claims))
	}
	for i, w := range want {
		c := o.Claims[i]
		if c.Verdict != w.verdict || c.Method != w.method || c.Residual != w.residual {
			t.Errorf("claim %q: %s, method %q, residual %q", c.Name, c.Verdict, c.Method, c.Residual)
		}
		if w.method == claim.CrossMethod && !strings.Contains(c.Note, "lhs.num·rhs.den − rhs.num·lhs.den") {
			t.Errorf("claim %q: note %q", c.Name, c.Note)
		}
	}
	if !strings.Contains(o.Claims[0].Note, "where the denominators are non-zero") {
		t.Errorf("circle note: %q", o.Claims[0].Note)
	}
	// float64 code has no rational functions: the audit says so.
	if c := o.Claims[5]; c.Float != nil || !strings.Contains(c.Note, "no float64 companion for a rational function") {
		t.Errorf("audit of the sampled claim: %+v, note %q", c.Float, c.Note)
	}
}

// The Cauchy determinant (classical, from memory):
// det[1/(x_i + y_j)] = ∏_{i<j} (x_j − x_i)(y_j − y_i) / ∏_{i,j} (x_i + y_j);
// Cramer's rule for the solution of a system with rational-function
// entries; and M·M⁻¹ = I.
func TestRationalFunctionMatrices(t *testing.T) {
	rep := runHere(t, `xs = variables("x0 x1 x2")
ys = variables("y0 y1 y2")
n = 3
C = matrix([[1 / (xs[i] + ys[j]) for j in range(n)] for i in range(n)])
num = 1
den = 1
for i in range(n):
    for j in range(n):
        den = den * (xs[i] + ys[j])
        if i < j:
            num = num * (xs[j] - xs[i]) * (ys[j] - ys[i])
identity("Cauchy determinant, n = 3", det(C), num / den)
identity("C C^-1 = I", C * C.inverse(), unit_matrix(n))
b = [1, xs[0], 1 / ys[1]]
x = C.solve(b)
for i in range(n):
    Ci = matrix([[b[r] if c == i else C[r, c] for c in range(n)] for r in range(n)])
    identity("Cramer's rule, x_%d" % i, x[i], det(Ci) / det(C))`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("cell failed: %s", o.Error.Message)
	}
	if len(o.Claims) != 5 {
		t.Fatalf("got %d claims", len(o.Claims))
	}
	for i, c := range o.Claims {
		// C·C⁻¹ simplifies to the rational unit matrix.
		if c.Verdict != cells.Holds || c.Method != claim.CrossMethod && i != 1 {
			t.Errorf("claim %q: %s, method %q, residual %q", c.Name, c.Verdict, c.Method, c.Residual)
		}
	}
}

func TestRationalFunctionErrors(t *testing.T) {
	const x = "x, y = variables(\"x y\")\n"
	expectErrors(t, []errorCase{
		{x + "(1 / x) / (x - x)", "ZeroDivisionError"},
		{x + "x / (x - x)", "ZeroDivisionError"},
		{x + "1 / (x - x)", "ZeroDivisionError"},
		{x + "(x - x) ** -1", "negative power"},
		{x + "(1 / (x - 1)).at(x=1)", "not defined at x = 1: its denominator x - 1 vanishes there"},
		{x + "(1 / (x - y)).at(x=2, y=2)", "x = 2, y = 2"},
		{x + "(1 / (x**2 - 2)).at(x=sqrt(2))", "exactly zero"},
		{x + "(1 / (x - 1)).at(x=exp(1) - exp(1) + 1)", "not proved non-zero"},
		{x + "(1 / (x - y)).at(x=sqrt(2))", "every variable"},
		{x + "(1 / x).degree()", "degree() is for polynomials"},
		{x + "(1 / x).coefficient(x=1)", "f.numerator"},
		{x + "factor(1 / x)", ".numerator"},
		{x + "(1 / x) + 0.5", "float64"},
		{x + "(1 / x).substitute(x=y - y)", "becomes 0"},
		{x + "matrix([[1 / x, 1], [1, x]]).inverse()", "singular"},
		{x + "matrix([[1 / x, 1], [1, y]]).rank()", "rational-function entries"},
	})
}

// Every polynomial method works on a rational function or is refused by
// name, pointing at the numerator and denominator (the refusals are
// installed with the first session).
func TestRationalFunctionMethods(t *testing.T) {
	runHere(t, "pass")
	for name := range values.PolynomialType.Dict {
		if strings.HasPrefix(name, "__") {
			continue
		}
		if _, ok := values.RationalFunctionType.Dict[name]; !ok {
			t.Errorf("the polynomial method %s is neither implemented nor refused for rational functions", name)
		}
	}
}

// A sample that is a rational function is shown as cell code that
// rebuilds it.
func TestRationalFunctionSampleIsCellCode(t *testing.T) {
	const family = "x, y = variables(\"x y\")\nfam = lambda k: (x + k) / (y - k)\n"
	o := runHere(t, family+`identity("f = f + 1", lambda f: (f, f + 1), over=fam, samples=3)`).Outcomes[0]
	if o.Error != nil {
		t.Fatal(o.Error.Message)
	}
	c := o.Claims[0]
	var k int
	if _, err := fmt.Sscanf(c.Worst, "sample %d:", &k); err != nil || c.Verdict != cells.Fails || !strings.Contains(c.Sample, ") / polynomial(") {
		t.Fatalf("%s: sample %q worst %q", c.Verdict, c.Sample, c.Worst)
	}
	again := runHere(t, family+"s = "+c.Sample+fmt.Sprintf("\nprint(s == fam(%d))", k))
	if got := output(t, again, 1); got != "True\n" {
		t.Errorf("%s does not rebuild sample %d (%q)", c.Sample, k, got)
	}
}

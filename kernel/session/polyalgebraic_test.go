package session

import (
	"strings"
	"testing"

	"assay/kernel/claim"
)

// Polynomials meet algebraic numbers: evaluation at certified reals is
// exact, so identities with the value are proved; a perfect square has a
// polynomial square root.
func TestPolynomialsAtAlgebraicValues(t *testing.T) {
	src := `x, y = variables("x y")
T = [polynomial(1), x]
for n in range(2, 13):
    T.append(2 * x * T[n - 1] - T[n - 2])
c = sqrt(2) / 2
cycle = [1, c, 0, -c, -1, -c, 0, c]
for n in range(13):
    identity("T_%d(cos(pi/4))" % n, T[n].at(x=c), cycle[n % 8])
identity("two variables", ((x + y)**2).at(x=sqrt(2), y=sqrt(3)), 5 + 2 * sqrt(6))
identity("mixed values", (x**2 * y).at(x=sqrt(3), y=frac(1, 3)), 1)
U = [polynomial(1), 2 * x]
for n in range(2, 12):
    U.append(2 * x * U[n - 1] - U[n - 2])
for n in range(1, 12):
    identity("Pell %d" % n, sqrt((T[n]**2 - 1).divide(x**2 - 1)), U[n - 1])
identity("sign convention", sqrt((y - x)**2 * 4), 2 * x - 2 * y)
print(sqrt(9 * (x - 2*y)**4))`
	// Sources: T_n(cos θ) = cos nθ (DLMF 18.5.1, from memory) at θ = π/4,
	// cos(nπ/4) = 1, √2/2, 0, −√2/2, −1, …; the recurrences of T_n and U_n
	// (DLMF 18.9.1) and the Pell equation T_n² − (x² − 1)U_{n−1}² = 1 (from
	// memory); (√2 + √3)² = 5 + 2√6 and (√3)²/3 = 1 (arithmetic).
	o := allHold(t, src)
	if len(o.Claims) != 13+2+11+1 {
		t.Fatalf("%d claims", len(o.Claims))
	}
	for _, c := range o.Claims {
		if c.Name[0] == 'T' && c.Name != "T_0(cos(pi/4))" && c.Name != "T_1(cos(pi/4))" && c.Method != claim.AlgebraicMethod {
			t.Errorf("%s: method %q", c.Name, c.Method)
		}
		if isRoot := c.Name == "sign convention" || strings.HasPrefix(c.Name, "Pell") && c.Name != "Pell 1"; isRoot != strings.Contains(c.Note, "only where it is ≥ 0") {
			t.Errorf("%s: note %q", c.Name, c.Note)
		}
	}
	if got := o.Output; got != "3*x^2 - 12*x*y + 12*y^2\n" {
		t.Errorf("printed %q", got)
	}
}

func TestPolynomialRealRefusals(t *testing.T) {
	expectErrors(t, []errorCase{
		{"a = variables(\"a\")\nprint(a + sqrt(2))", "p.at(a=sqrt(2))"},
		{"a = variables(\"a\")\nprint(sqrt(3) * a)", "divide(s**2 - 2)"},
		{"a = variables(\"a\")\nprint(a / sqrt(2))", "rational coefficients"},
		{"a, b = variables(\"a b\")\nprint((a * b).at(a=sqrt(2)))", "b left without"},
		{"a, b = variables(\"a b\")\nprint(sqrt(a**2 + b**2))", "not the square of a polynomial"},
		{"a = variables(\"a\")\nprint(sqrt(-a**2))", "square the other side"},
		{"a = variables(\"a\")\nprint(sqrt(2 * a**2))", "2 is not the square of a rational"},
	})
}

package session

import (
	"math/big"
	"strings"
	"testing"
)

// ratOf is a decimal read with math/big, independent of assay's parser.
func ratOf(t *testing.T, s string) *big.Rat {
	t.Helper()
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		t.Fatalf("%q is not a decimal", s)
	}
	return r
}

// A real on a digit boundary has no 20 certified digits; str() prints it
// rounded to 20 significant digits with a bound, and the bound must hold:
// |value − printed| < bound, checked with math/big against the exact
// value. The exact values are classical (from memory): sin(π/6) = 1/2,
// √2·√8 = 4, √2·√2 = 2.
func TestRealPrintsOnDigitBoundary(t *testing.T) {
	for _, c := range []struct{ src, value, printed string }{
		{"print(sin(pi/6) / 10**25)", "5e-26", "5.0000000000000000000e-26"},
		{"print(sqrt(2)*sqrt(8)/4 * frac(5, 10**20))", "5e-20", "5.0000000000000000000e-20"},
		// √2·√8 itself prints its closed form, 4; past 12 digits of
		// an integer it has none, and prints digits.
		{"print(sqrt(2) * sqrt(8) * 10**15)", "4e15", "4000000000000000.0000"},
		{"print(-sin(pi/6))", "-0.5", "-0.50000000000000000000"},
		{"print(-(sqrt(2) * sqrt(2)) * 10**300)", "-2e300", "-2.0000000000000000000e+300"},
		{"print(sqrt(2) * sqrt(2) * frac(1, 10**300))", "2e-300", "2.0000000000000000000e-300"},
		// 10^2000 from a denominator known to about 2466 digits: the
		// bound is large in absolute terms, and must say so.
		{"print(1 / (sqrt(2) * sqrt(2) - 2 + frac(1, 10**2000)))", "1e2000", "1.0000000000000000000e+2000"},
		{"print(sqrt(2) * sqrt(2) - 2 + frac(1, 10**2000))", "1e-2000", "1.0000000000000000000e-2000"},
		// A zero that is not known to be one (e is transcendental, so no
		// zero bound applies): its sign is never settled.
		{"print(exp(1) - exp(1))", "0", "0"},
	} {
		out := strings.TrimSpace(output(t, runHere(t, c.src), 1))
		printed, bound, ok := strings.Cut(out, " (within ")
		if !ok || printed != c.printed || !strings.HasSuffix(bound, ")") {
			t.Errorf("%s printed %q, want %q with a bound", c.src, out, c.printed)
			continue
		}
		dev := new(big.Rat).Sub(ratOf(t, c.value), ratOf(t, printed))
		if dev.Abs(dev).Cmp(ratOf(t, strings.TrimSuffix(bound, ")"))) >= 0 {
			t.Errorf("%s printed %q: the bound does not hold for %s", c.src, out, c.value)
		}
	}
}

// Off the boundary the same values print certified digits in the same
// format, with no bound: sin(π/6 + 10^-30) = 1/2 + (√3/2)·10^-30 + …
// (Taylor, from memory), √2 = 1.41421356237309504880… (OEIS A002193, from
// memory).
func TestRealPrintsCertifiedDigits(t *testing.T) {
	expectPrints(t, []printCase{
		{"print(sin(pi/6 + frac(1, 10**30)) / 10**25)", "5.0000000000000000000e-26"},
		{"print(sqrt(2)*sqrt(8)/4 * frac(5, 10**20) + frac(1, 10**45))", "5.0000000000000000000e-20"},
		{"print(sqrt(2) / 10**25, -sqrt(2) * 10**30)", "1.4142135623730950488e-25 -1.4142135623730950488e+30"},
		// A real certified to lie outside sqrt's domain only at the
		// printing precision is no real number, and says so.
		{"print(sqrt(sqrt(2) * sqrt(2) - 2 - frac(1, 10**2000)))", "<not a real number: root of degree 2 of a negative number: argument outside the domain>"},
	})
}

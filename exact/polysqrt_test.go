package exact

import (
	"errors"
	"math/big"
	"strings"
	"testing"
)

// chebyshevU returns U_0..U_n in x by U_0 = 1, U_1 = 2x, U_{k+1} = 2x·U_k −
// U_{k−1} (DLMF 18.9.1 and table 18.3.1; from memory).
func chebyshevU(t *testing.T, x *Poly, n int) []*Poly {
	return chebyshevFrom(t, x, x.Scale(big.NewRat(2, 1)), n)
}

func TestPolySqrtChebyshevPell(t *testing.T) {
	// The Pell equation of the Chebyshev polynomials, T_n² − (x² − 1)·U_{n−1}²
	// = 1 (a standard identity; from memory): (T_n² − 1)/(x² − 1) is the
	// square of U_{n−1}, whose leading coefficient 2^(n−1) is positive.
	r, v := testRing(t, "x")
	x := v[0]
	T, U := chebyshev(t, x, 12), chebyshevU(t, x, 12)
	den := mustMulP(t, x, x).Sub(r.Const(big.NewRat(1, 1)))
	for n := 1; n <= 12; n++ {
		num := mustPow(t, T[n], 2).Sub(r.Const(big.NewRat(1, 1)))
		sq, exactly, err := num.DivExact(den)
		if err != nil || !exactly {
			t.Fatal(err)
		}
		got, err := sq.Sqrt()
		if err != nil {
			t.Fatalf("n = %d: %v", n, err)
		}
		if !got.Equal(U[n-1]) {
			t.Errorf("n = %d: sqrt = %v, want U_%d = %v", n, got, n-1, U[n-1])
		}
		// T_n² − 1 itself is (x² − 1)·U², x² − 1 = (x−1)(x+1) square-free: no square.
		if _, err := num.Sqrt(); !errors.Is(err, ErrDomain) || !strings.Contains(err.Error(), "odd power") {
			t.Errorf("n = %d: T_n² − 1 taken for a square: %v", n, err)
		}
	}
}

func TestPolySqrtRefusals(t *testing.T) {
	r, _ := testRing(t, "a", "b")
	for _, c := range []struct{ p, why string }{
		{"a^2 + b^2", "odd power"}, // irreducible over Q (a sum of two squares)
		{"-a^2", "negative"},       // −1 is no square of a rational
		{"2*a^2*b^2", "not the square of a rational"},
		{"a^3", "odd power"},
		{"(a + b)^2*(a - b)", "odd power"},
	} {
		_, err := mustParse(t, r, c.p).Sqrt()
		if !errors.Is(err, ErrDomain) || !strings.Contains(err.Error(), c.why) {
			t.Errorf("sqrt(%s): %v, want %q", c.p, err, c.why)
		}
	}
	// Squares in two variables with a rational unit: (3/2)²·(a − b)²·(a + 2b)⁴,
	// and the sign convention (positive leading coefficient: b − a becomes a − b).
	p := mustParse(t, r, "9/4*(b - a)^2*(a + 2*b)^4")
	got, err := p.Sqrt()
	if want := mustParse(t, r, "3/2*(a - b)*(a + 2*b)^2"); err != nil || !got.Equal(want) {
		t.Errorf("sqrt(%v) = %v, %v, want %v", p, got, err, want)
	}
	if z, err := r.zero().Sqrt(); err != nil || !z.IsZero() {
		t.Errorf("sqrt(0) = %v, %v", z, err)
	}
}

func TestEvalRealChebyshevAtCosPiOver4(t *testing.T) {
	// T_n(cos θ) = cos nθ (the defining property of the Chebyshev
	// polynomials, DLMF 18.5.1; from memory), at θ = π/4: cos(π/4) = √2/2,
	// and cos(nπ/4) runs through 1, √2/2, 0, −√2/2, −1, −√2/2, 0, √2/2.
	_, v := testRing(t, "x")
	T := chebyshev(t, v[0], 16)
	h := RealQuo(RealSqrt(rtR("2")), rtR("2"))
	cycle := []*Real{rtR("1"), h, rtR("0"), RealNeg(h), rtR("-1"), RealNeg(h), rtR("0"), h}
	for n, p := range T {
		got, err := p.EvalReal(map[int]*Real{0: h})
		if err != nil {
			t.Fatal(err)
		}
		if s, err := RealCmp(got, cycle[n%8], DefaultMaxPrecision); err != nil || s != 0 {
			t.Errorf("T_%d(√2/2): compared with cos(%dπ/4): %d, %v", n, n, s, err)
		}
		// And against the transcendental cos(nπ/4) to 40 digits, an independent route.
		want := RealCos(RealMul(rtR(big.NewInt(int64(n)).String()), RealQuo(Pi(), rtR("4"))))
		iv, err := RealSub(got, want).Approx(200, DefaultMaxPrecision)
		tiny := q("1/10000000000000000000000000000000000000000")
		if err != nil || iv.Hi.Cmp(tiny) > 0 || iv.Lo.Cmp(new(big.Rat).Neg(tiny)) < 0 {
			t.Errorf("T_%d(√2/2) − cos(%dπ/4) in %v, %v", n, n, iv, err)
		}
	}
}

func TestEvalRealSeveralVariables(t *testing.T) {
	// (a + b)² at a = √2, b = √3 is 5 + 2√6 (expand; the denesting example of
	// the issue), and a value is needed for every variable.
	r, v := testRing(t, "a", "b", "c")
	p := mustParse(t, r, "(a + b)^2 + 0*c")
	got, err := p.EvalReal(map[int]*Real{0: rtSqrt("2"), 1: rtSqrt("3")})
	want := RealAdd(rtR("5"), RealMul(rtR("2"), rtSqrt("6")))
	if err != nil {
		t.Fatal(err)
	}
	if s, err := RealCmp(got, want, DefaultMaxPrecision); err != nil || s != 0 {
		t.Errorf("(√2+√3)² vs 5 + 2√6: %d, %v", s, err)
	}
	if _, err := v[2].EvalReal(map[int]*Real{0: rtSqrt("2")}); !errors.Is(err, ErrShape) || !strings.Contains(err.Error(), "c") {
		t.Errorf("missing value: %v", err)
	}
	// Gaps in the powers: (∛2)^7 + 1 = 4∛2 + 1.
	x7 := mustParse(t, r, "a^7 + 1")
	got, _ = x7.EvalReal(map[int]*Real{0: rtRoot("2", 3)})
	if s, err := RealCmp(got, RealAdd(RealMul(rtR("4"), rtRoot("2", 3)), rtR("1")), DefaultMaxPrecision); err != nil || s != 0 {
		t.Errorf("(∛2)^7 + 1 vs 4∛2 + 1: %d, %v", s, err)
	}
}

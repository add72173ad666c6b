package exact

import (
	"math/big"
	"strings"
	"testing"
)

func mustRoots(t *testing.T, s string) []*Real {
	t.Helper()
	r := NewRing()
	p, err := r.Parse(s)
	if err != nil {
		t.Fatal(err)
	}
	rs, err := RealRoots(p, DefaultMaxPrecision)
	if err != nil {
		t.Fatal(err)
	}
	return rs
}

// The cubic t³ + t² − 2t − 1 has the roots 2cos(2πk/7), k = 1, 2, 3
// (standard tables: the minimal polynomial of 2cos(2π/7)); in increasing
// order 2cos(6π/7) ≈ −1.80, 2cos(4π/7) ≈ −0.445, 2cos(2π/7) ≈ 1.247.
func TestRealRootsHeptagonCubic(t *testing.T) {
	rs := mustRoots(t, "t^3 + t^2 - 2*t - 1")
	if len(rs) != 3 {
		t.Fatalf("%d roots, want 3", len(rs))
	}
	for i, k := range []int64{3, 2, 1} {
		// 2cos(2πk/7) by the transcendental route, against the root.
		c := RealMul(RealFromInt(2), RealCos(RealQuo(RealMul(RealFromInt(2*k), Pi()), RealFromInt(7))))
		d, err := RealSub(rs[i], c).Enclose(400)
		if err != nil {
			t.Fatal(err)
		}
		tol := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(100), nil))
		if d.Lo.Cmp(new(big.Rat).Neg(tol)) < 0 || d.Hi.Cmp(tol) > 0 {
			t.Errorf("root %d differs from 2cos(%dπ/7) by up to %s", i, 2*k, d)
		}
		mp, err := rs[i].MinimalPolynomial(DefaultMaxDegree, DefaultMaxPrecision)
		if err != nil {
			t.Fatal(err)
		}
		if !sameInts(mp, ints(-1, -2, 1, 1)) {
			t.Errorf("minimal polynomial of root %d: %v", i, mp)
		}
	}
	// Vieta: the roots sum to −1, exactly (zero bound).
	sum := RealAdd(RealAdd(RealAdd(rs[0], rs[1]), rs[2]), RealFromInt(1))
	if s, err := sum.Sign(DefaultMaxPrecision); err != nil || s != 0 {
		t.Errorf("sum of the roots + 1: sign %d, %v; want proved 0", s, err)
	}
	// Chebyshev: (2cos θ)² − 2 = 2cos 2θ (from memory; cos 2θ = 2cos²θ − 1),
	// so r² − 2 is the middle root for r = 2cos(2π/7), the largest.
	che := RealSub(RealSub(RealMul(rs[2], rs[2]), RealFromInt(2)), rs[1])
	if s, err := che.Sign(DefaultMaxPrecision); err != nil || s != 0 {
		t.Errorf("r² − 2 − middle root: sign %d, %v; want proved 0", s, err)
	}
	// and not equal to the smallest one: a certified non-zero.
	if s, err := RealSub(RealSub(RealMul(rs[2], rs[2]), RealFromInt(2)), rs[0]).Sign(DefaultMaxPrecision); err != nil || s != 1 {
		t.Errorf("r² − 2 − smallest root: sign %d, %v; want 1", s, err)
	}
	f, ok := rs[2].ClosedForm(200)
	if !ok || !strings.HasPrefix(f, "[root of t^3 + t^2 - 2t - 1 in (") {
		t.Errorf("closed form %q, %v", f, ok)
	}
}

// √2 to 30 digits: 1.41421356237309504880168872420 (OEIS A002193).
func TestRealRootsSqrt2(t *testing.T) {
	rs := mustRoots(t, "x^2 - 2")
	if len(rs) != 2 {
		t.Fatalf("%d roots", len(rs))
	}
	d, err := rs[1].Digits(30, DefaultMaxPrecision)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(d, "1.4142135623730950488016887242") {
		t.Errorf("√2 = %s", d)
	}
	if s, _ := RealAdd(rs[0], rs[1]).Sign(DefaultMaxPrecision); s != 0 {
		t.Error("−√2 + √2 not proved 0")
	}
	if s, _ := RealSub(rs[1], RealSqrt(RealFromInt(2))).Sign(DefaultMaxPrecision); s != 0 {
		t.Error("root of x² − 2 against sqrt(2) not proved equal")
	}
}

// Rational roots come out exact, with multiplicities dropped:
// (x − 1/2)²(x + 3)(x² + 1) has the real roots −3 and 1/2 (by construction).
func TestRealRootsRational(t *testing.T) {
	rs := mustRoots(t, "(x - 1/2)^2*(x + 3)*(x^2 + 1)")
	want := []*big.Rat{big.NewRat(-3, 1), big.NewRat(1, 2)}
	if len(rs) != len(want) {
		t.Fatalf("%d roots, want 2", len(rs))
	}
	for i, w := range want {
		if r, ok := rs[i].Rat(); !ok || r.Cmp(w) != 0 {
			t.Errorf("root %d: %v, want %s exactly", i, rs[i], w)
		}
	}
}

// The isolation alone, on ∏_{k=−6}^{6} (x − k/3) without factoring (roots
// by construction): every root exact or alone in its interval, in order.
func TestIsolateRealRootsProduct(t *testing.T) {
	p := ints(1)
	for k := -6; k <= 6; k++ {
		// multiply by (3x − k)
		q := make([]*big.Int, len(p)+1)
		for i := range q {
			q[i] = new(big.Int)
		}
		for i, c := range p {
			q[i+1].Add(q[i+1], new(big.Int).Mul(c, big.NewInt(3)))
			q[i].Sub(q[i], new(big.Int).Mul(c, big.NewInt(int64(k))))
		}
		p = q
	}
	iso := isolateRealRoots(p)
	if len(iso) != 13 {
		t.Fatalf("%d roots, want 13", len(iso))
	}
	for i, r := range iso {
		want := big.NewRat(int64(i-6), 3)
		if r.exact && r.lo.Cmp(want) != 0 || !r.exact && (r.lo.Cmp(want) >= 0 || r.hi.Cmp(want) <= 0) {
			t.Errorf("root %d: %s..%s (exact %v), want %s", i, r.lo, r.hi, r.exact, want)
		}
		if i > 0 && iso[i-1].hi.Cmp(r.lo) > 0 {
			t.Errorf("intervals %d and %d overlap", i-1, i)
		}
	}
}

func TestRealRootsBad(t *testing.T) {
	r := NewRing()
	for _, s := range []string{"0", "x*y - 1"} {
		p, _ := r.Parse(s)
		if _, err := RealRoots(p, DefaultMaxPrecision); err == nil {
			t.Errorf("%s: no error", s)
		}
	}
	p, _ := r.Parse("5")
	if rs, err := RealRoots(p, DefaultMaxPrecision); err != nil || len(rs) != 0 {
		t.Errorf("constant: %v, %v", rs, err)
	}
}

package exact

import (
	"errors"
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

// ints makes coefficient lists, constant term first.
func ints(cs ...int64) []*big.Int {
	out := make([]*big.Int, len(cs))
	for i, c := range cs {
		out[i] = big.NewInt(c)
	}
	return out
}

func sameInts(a, b []*big.Int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i].Cmp(b[i]) != 0 {
			return false
		}
	}
	return true
}

func TestMinimalPolynomialPublished(t *testing.T) {
	two, three, five := rtSqrt("2"), rtSqrt("3"), rtSqrt("5")
	phi := RealQuo(RealAdd(rtR("1"), five), rtR("2"))
	for _, c := range []struct {
		name string
		x    *Real
		want []*big.Int
	}{
		// √2 + √3: t⁴ − 10t² + 1 (standard tables; the primitive element
		// of Q(√2, √3) in any algebra text).
		{"√2+√3", RealAdd(two, three), ints(1, 0, -10, 0, 1)},
		// The golden ratio: t² − t − 1 (its defining equation, from memory).
		{"φ", phi, ints(-1, -1, 1)},
		// 1/φ = φ − 1: t² + t − 1 (from t² − t − 1 reversed).
		{"1/φ", RealPowInt(phi, -1), ints(-1, 1, 1)},
		// ∛2 + √3, by hand: (x − √3)³ = 2 gives x³ + 9x − 2 = √3(3x² + 3);
		// squaring, x⁶ − 9x⁴ − 4x³ + 27x² − 36x − 23 = 0, of degree
		// [Q(∛2, √3):Q] = 6, so irreducible.
		{"∛2+√3", RealAdd(rtRoot("2", 3), three), ints(-23, -36, 27, -4, -9, 0, 1)},
		// (√2)^5 = 4√2 and (√2)^1001 = 2^500·√2: t² − 32, t² − 2^1001.
		{"√2^5", RealPowInt(two, 5), ints(-32, 0, 1)},
		{"√2^1001", RealPowInt(two, 1001), []*big.Int{new(big.Int).Neg(new(big.Int).Lsh(big.NewInt(1), 1001)), big.NewInt(0), big.NewInt(1)}},
		// √2·√3 − √6 is 0: t.
		{"√2·√3−√6", RealSub(RealMul(two, three), rtSqrt("6")), ints(0, 1)},
		// −√2/√3 = −√(2/3): 3t² − 2.
		{"−√2/√3", RealNeg(RealQuo(two, three)), ints(-2, 0, 3)},
		// A rational: b·t − a.
		{"−7/3", rtR("-7/3"), ints(7, 3)},
		// The real cube root of −2: t³ + 2.
		{"∛−2", rtRoot("-2", 3), ints(2, 0, 0, 1)},
	} {
		got, err := c.x.MinimalPolynomial(0, DefaultMaxPrecision)
		if err != nil || !sameInts(got, c.want) {
			t.Errorf("%s: got %v, %v; want %v", c.name, got, err, c.want)
		}
	}
}

// 2cos(2π/7) has minimal polynomial t³ + t² − 2t − 1 (standard tables; the
// real subfield of the 7th cyclotomic field). It is not built from
// radicals of reals: the cubic is irreducible over Q with three real roots
// (2cos(2πk/7), k = 1, 2, 3), the casus irreducibilis, where every
// expression of a root by radicals passes through non-real numbers
// (Hölder 1891). So assay's only route to it is through cos and π, which
// MinimalPolynomial refuses; the check is that the value satisfies the
// polynomial to 1000 bits and that the polynomial is irreducible.
func TestMinimalPolynomialSevenfoldCosine(t *testing.T) {
	x := RealMul(rtR("2"), RealCos(RealQuo(RealMul(rtR("2"), Pi()), rtR("7"))))
	p := ints(-1, -2, 1, 1)
	iv, err := hornerReal(p, x).Approx(1000, DefaultMaxPrecision)
	if err != nil {
		t.Fatal(err)
	}
	lim := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), 990))
	if iv.Hi.Cmp(lim) > 0 || new(big.Rat).Neg(iv.Lo).Cmp(lim) > 0 {
		t.Errorf("p(2cos(2π/7)) in %v, not below 2^-990", iv)
	}
	r := NewRing()
	tv, _ := r.Var("t")
	if ok, err := fromDense(r, 0, p).IsIrreducible(); err != nil || !ok {
		t.Errorf("t³ + t² − 2t − 1 irreducible: %v, %v (%v)", ok, err, tv)
	}
	if _, err := x.MinimalPolynomial(0, DefaultMaxPrecision); !errors.Is(err, ErrNotAlgebraic) {
		t.Errorf("2cos(2π/7): %v, want ErrNotAlgebraic", err)
	}
}

// Ramanujan's denesting √(∛5 − ∛4) = (∛2 + ∛20 − ∛25)/3 (from memory): two
// different expressions of one number must give one minimal polynomial,
// and it must vanish there, proved by the zero bound (a second route).
func TestMinimalPolynomialRamanujan(t *testing.T) {
	lhs := RealSqrt(RealSub(rtRoot("5", 3), rtRoot("4", 3)))
	rhs := RealQuo(RealSub(RealAdd(rtRoot("2", 3), rtRoot("20", 3)), rtRoot("25", 3)), rtR("3"))
	p, err1 := lhs.MinimalPolynomial(0, DefaultMaxPrecision)
	q, err2 := rhs.MinimalPolynomial(0, DefaultMaxPrecision)
	if err1 != nil || err2 != nil || !sameInts(p, q) {
		t.Fatalf("%v, %v; %v, %v", p, err1, q, err2)
	}
	if s, err := hornerReal(p, rhs).Sign(DefaultMaxPrecision); s != 0 || err != nil {
		t.Errorf("p(rhs): sign %d, %v", s, err)
	}
}

// The minimal polynomial of a random algebraic expression is checked by
// routes other than its construction: it vanishes at the value, proved by
// the BFMSS zero bound; it is irreducible, primitive, with a positive
// leading coefficient; its degree is at most the degree bound
// D of the expression (the product of the root indices).
func TestMinimalPolynomialRandom(t *testing.T) {
	rng := rand.New(rand.NewSource(15))
	r := NewRing()
	checked, high := 0, 0
	for i := 0; i < 60; i++ {
		x := randomAlgebraic(rng, 3)
		p, err := x.MinimalPolynomial(0, DefaultMaxPrecision)
		if err != nil {
			t.Errorf("%v: %v", closedOrDigits(x), err)
			continue
		}
		if s, err := hornerReal(p, x).Sign(DefaultMaxPrecision); s != 0 || err != nil {
			t.Errorf("%v: p(x) sign %d, %v", closedOrDigits(x), s, err)
		}
		poly := fromDense(r, 0, p)
		if ok, err := poly.IsIrreducible(); !ok || err != nil {
			t.Errorf("%v: %v not irreducible", closedOrDigits(x), poly)
		}
		if !poly.PrimitivePart().Equal(poly) || p[len(p)-1].Sign() <= 0 {
			t.Errorf("%v: %v not primitive with a positive leading coefficient", closedOrDigits(x), poly)
		}
		if int64(len(p)-1) > x.degreeBound() {
			t.Errorf("%v: degree %d above the bound %d", closedOrDigits(x), len(p)-1, x.degreeBound())
		}
		checked++
		if len(p) > 4 {
			high++
		}
	}
	if checked < 50 || high < 10 {
		t.Errorf("only %d expressions checked, %d of degree 4 or more", checked, high)
	}
}

func closedOrDigits(x *Real) string {
	if s, ok := x.ClosedForm(1000); ok {
		return s
	}
	s, _ := x.Digits(20, DefaultMaxPrecision)
	return s
}

// randomAlgebraic builds a random expression from small rationals by
// + − × ÷, small powers, square and cube roots, avoiding division by zero
// and even roots of negatives (signs decided exactly by the zero bound).
func randomAlgebraic(rng *rand.Rand, depth int) *Real {
	if depth == 0 || rng.Intn(4) == 0 {
		return RealFromRat(big.NewRat(int64(rng.Intn(19)-9), int64(1+rng.Intn(5))))
	}
	a := randomAlgebraic(rng, depth-1)
	switch rng.Intn(8) {
	case 0, 1:
		if s, err := a.Sign(DefaultMaxPrecision); err == nil && s < 0 {
			a = RealNeg(a)
		}
		return RealSqrt(a)
	case 2:
		return RealRoot(a, 3)
	case 3:
		return RealAdd(a, randomAlgebraic(rng, depth-1))
	case 4:
		return RealSub(a, randomAlgebraic(rng, depth-1))
	case 5:
		return RealMul(a, randomAlgebraic(rng, depth-1))
	case 6:
		b := randomAlgebraic(rng, depth-1)
		if s, err := b.Sign(DefaultMaxPrecision); err != nil || s == 0 {
			return a
		}
		return RealQuo(a, b)
	}
	n := []int{2, 3, -1, -2}[rng.Intn(4)]
	if s, err := a.Sign(DefaultMaxPrecision); n < 0 && (err != nil || s == 0) {
		n = -n
	}
	return RealPowInt(a, n)
}

func TestMinimalPolynomialErrors(t *testing.T) {
	// Five square roots of primes give degree 32 (Besicovitch): over a
	// cap of 16 it stops, naming the flag.
	s := rtSqrt("2")
	for _, p := range []string{"3", "5", "7", "11"} {
		s = RealAdd(s, rtSqrt(p))
	}
	_, err := s.MinimalPolynomial(16, DefaultMaxPrecision)
	if !errors.Is(err, ErrDegreeCap) || !strings.Contains(err.Error(), "--max-degree") {
		t.Errorf("degree cap: %v", err)
	}
	if p, err := s.MinimalPolynomial(32, DefaultMaxPrecision); err != nil || len(p) != 33 {
		t.Errorf("degree 32 under a cap of 32: %d coefficients, %v", len(p), err)
	}
	zero := RealSub(RealMul(rtSqrt("2"), rtSqrt("3")), rtSqrt("6"))
	if _, err := RealQuo(rtR("1"), zero).MinimalPolynomial(0, DefaultMaxPrecision); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("1/0: %v", err)
	}
	if _, err := RealAdd(Pi(), rtR("1")).MinimalPolynomial(0, DefaultMaxPrecision); !errors.Is(err, ErrNotAlgebraic) {
		t.Errorf("π + 1: %v", err)
	}
}

// BenchmarkMinimalPolynomial: moderately nested expressions, fresh nodes
// each time. Ramanujan's √(∛5 − ∛4) has degree 9, √2 + √3 + √5 + √7
// degree 16, √(2 + √(3 + √(5 + ∛7))) degree 24.
func BenchmarkMinimalPolynomial(b *testing.B) {
	for _, c := range []struct {
		name string
		make func() *Real
	}{
		{"ramanujan", func() *Real { return RealSqrt(RealSub(rtRoot("5", 3), rtRoot("4", 3))) }},
		{"four-square-roots", func() *Real {
			return RealAdd(RealAdd(rtSqrt("2"), rtSqrt("3")), RealAdd(rtSqrt("5"), rtSqrt("7")))
		}},
		{"nested", func() *Real {
			return RealSqrt(RealAdd(rtR("2"), RealSqrt(RealAdd(rtR("3"), RealSqrt(RealAdd(rtR("5"), rtRoot("7", 3)))))))
		}},
	} {
		b.Run(c.name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := c.make().MinimalPolynomial(0, DefaultMaxPrecision); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

package exact

import (
	"errors"
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

func rtRoot(s string, k int) *Real { return RealRoot(rtR(s), k) }

// rtPow10R is 10^n as a Real.
func rtPow10R(n int) *Real { return RealFromRat(new(big.Rat).SetInt(rtPow10(n))) }

func TestAlgebraicIdentitiesProved(t *testing.T) {
	two, three, five := rtSqrt("2"), rtSqrt("3"), rtSqrt("5")
	phi := RealQuo(RealAdd(rtR("1"), five), rtR("2"))
	for _, c := range []struct {
		name     string
		lhs, rhs *Real
	}{
		// √2·√2 = 2 and √2·√3 = √6: the product rule of square roots.
		{"√2·√2 = 2", RealMul(two, rtSqrt("2")), rtR("2")},
		{"√2·√3 = √6", RealMul(two, three), rtSqrt("6")},
		// The golden ratio φ = (1+√5)/2 satisfies φ² = φ + 1 (its defining
		// equation; from memory).
		{"φ² = φ + 1", RealPowInt(phi, 2), RealAdd(phi, rtR("1"))},
		// Classical denesting √(3 + 2√2) = 1 + √2 (since (1+√2)² = 3 + 2√2).
		{"√(3+2√2) = 1+√2", RealSqrt(RealAdd(rtR("3"), RealMul(rtR("2"), two))), RealAdd(rtR("1"), two)},
		// (√2+√3)² = 5 + 2√6, so √2 + √3 = √(5 + 2√6) (common practice).
		{"√2+√3 = √(5+2√6)", RealAdd(two, three), RealSqrt(RealAdd(rtR("5"), RealMul(rtR("2"), rtSqrt("6"))))},
		// Ramanujan's denesting √(∛5 − ∛4) = (∛2 + ∛20 − ∛25)/3 (from
		// memory; the issue quotes it).
		{"Ramanujan", RealSqrt(RealSub(rtRoot("5", 3), rtRoot("4", 3))),
			RealQuo(RealSub(RealAdd(rtRoot("2", 3), rtRoot("20", 3)), rtRoot("25", 3)), rtR("3"))},
		// ∛(2 + √5) + ∛(2 − √5) = 1 (Cardano's formula for t³ + 3t − 4 = 0,
		// whose real root is 1; from memory).
		{"Cardano", RealAdd(RealRoot(RealAdd(rtR("2"), five), 3), RealRoot(RealSub(rtR("2"), five), 3)), rtR("1")},
	} {
		d := RealSub(c.lhs, c.rhs)
		b, ok := d.ZeroBound()
		if !ok {
			t.Errorf("%s: not recognised as algebraic", c.name)
			continue
		}
		if s, err := d.Sign(DefaultMaxPrecision); err != nil || s != 0 {
			t.Errorf("%s: sign %d, %v (zero bound 2^-%d)", c.name, s, err, b)
		}
		if s, err := RealCmp(c.lhs, c.rhs, DefaultMaxPrecision); err != nil || s != 0 {
			t.Errorf("%s: RealCmp %d, %v", c.name, s, err)
		}
	}
}

func TestAlgebraicNearMissesFail(t *testing.T) {
	for _, c := range []struct {
		name     string
		d        *Real
		sign     int
		exponent int // the decimal exponent of the first digit
	}{
		// √(10^80 + 1) = 10^40 + 1/(2·10^40) − 1/(8·10^120) + 1/(16·10^200)
		// − … (binomial series): the residual is −1.25·10^-121 +
		// 6.25·10^-202 − …, whose first three digits, truncated, are −1.24.
		{"10^40", RealSub(RealSqrt(RealAdd(rtPow10R(80), rtR("1"))), RealAdd(rtPow10R(40), RealQuo(rtR("1"), RealMul(rtR("2"), rtPow10R(40))))), -1, -121},
		// The same series at 10^300: the sides agree to about 450 digits,
		// the residual is −1.25·10^-451 + 6.25·10^-752 − ….
		{"10^150", RealSub(RealSqrt(RealAdd(rtPow10R(300), rtR("1"))), RealAdd(rtPow10R(150), RealQuo(rtR("1"), RealMul(rtR("2"), rtPow10R(150))))), -1, -451},
	} {
		s, err := c.d.Sign(DefaultMaxPrecision)
		if err != nil || s != c.sign {
			t.Errorf("%s: sign %d, %v", c.name, s, err)
		}
		digits, err := c.d.Digits(3, DefaultMaxPrecision)
		want := "-1.24e" + big.NewInt(int64(c.exponent)).String()
		if err != nil || digits != want {
			t.Errorf("%s: digits %q, %v, want %q", c.name, digits, err, want)
		}
	}
}

func TestAlgebraicZeroDivisorAndRoot(t *testing.T) {
	zero := RealSub(RealMul(rtSqrt("2"), rtSqrt("3")), rtSqrt("6"))
	// Division by an algebraic zero is certain, not undecided.
	if _, err := RealQuo(rtR("1"), zero).Enclose(4096); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("1/(√2√3 − √6): %v", err)
	}
	if _, err := RealPowInt(zero, -2).Enclose(4096); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("(√2√3 − √6)^-2: %v", err)
	}
	// √0 = 0: the root of an algebraic zero is proved zero too.
	if s, err := RealSqrt(zero).Sign(DefaultMaxPrecision); err != nil || s != 0 {
		t.Errorf("√(√2√3 − √6): %d %v", s, err)
	}
}

func TestTranscendentalStaysUndecided(t *testing.T) {
	// cos(2π/5) = (√5 − 1)/4 (a standard value of the regular pentagon;
	// from memory): π makes it non-algebraic, so no zero bound applies.
	d := RealSub(RealCos(RealQuo(RealMul(rtR("2"), Pi()), rtR("5"))), RealQuo(RealSub(rtSqrt("5"), rtR("1")), rtR("4")))
	if _, ok := d.ZeroBound(); ok {
		t.Error("cos(2π/5) − (√5 − 1)/4 taken for algebraic")
	}
	if _, err := d.Sign(512); !errors.Is(err, ErrUndecided) {
		t.Errorf("cos(2π/5) − (√5 − 1)/4: %v", err)
	}
	if iv, err := d.Approx(300, 4096); err != nil || iv.Lo.Sign() > 0 || iv.Hi.Sign() < 0 {
		t.Errorf("cos(2π/5) − (√5 − 1)/4 not within 2^-300 of 0: %v %v", iv, err)
	}
}

func TestZeroBoundBeyondCap(t *testing.T) {
	// Twelve nested square roots: D = 2^12 makes the bound far larger
	// than a small cap; the message says so.
	x := rtR("2")
	for i := 0; i < 12; i++ {
		x = RealSqrt(RealAdd(x, rtR("3")))
	}
	z := RealSub(RealMul(x, x), RealPowInt(x, 2))
	b, ok := z.ZeroBound()
	if !ok || b <= 4096 {
		t.Fatalf("bound %d %v", b, ok)
	}
	_, err := z.Sign(4096)
	if !errors.Is(err, ErrUndecided) {
		t.Fatalf("sign at a cap below the bound: %v", err)
	}
	if want := "BFMSS zero bound"; !strings.Contains(err.Error(), want) {
		t.Errorf("message %q lacks %q", err.Error(), want)
	}
}

func BenchmarkAlgebraicDenesting(b *testing.B) {
	for i := 0; i < b.N; i++ {
		// Fresh nodes each time: nothing cached between iterations.
		lhs := RealAdd(rtSqrt("2"), rtSqrt("3"))
		rhs := RealSqrt(RealAdd(rtR("5"), RealMul(rtR("2"), rtSqrt("6"))))
		if s, err := RealCmp(lhs, rhs, DefaultMaxPrecision); err != nil || s != 0 {
			b.Fatal(s, err)
		}
	}
}

// Random sums of square roots √a + √b − √c − √d against math/big's own
// Float.Sqrt at 3000 bits (an independent route: the kernel's roots come
// from integer roots): the sign must agree, and an exact zero must be
// proved — a third of the cases are equal by construction. The reference
// takes a difference below 2^-2900 for zero (common practice for a
// numerical oracle); the kernel's own bound for these expressions is
// about 2^-90, so a non-zero value the kernel called zero would show in
// the reference as a difference thousands of bits above that threshold.
func TestAlgebraicSignsAgainstBigFloat(t *testing.T) {
	rng := rand.New(rand.NewSource(15))
	ref := func(n int64) *big.Float {
		return new(big.Float).SetPrec(3000).Sqrt(new(big.Float).SetPrec(3000).SetInt64(n))
	}
	zeros := 0
	for i := 0; i < 300; i++ {
		a, b, c, d := rng.Int63n(60)+1, rng.Int63n(60)+1, rng.Int63n(60)+1, rng.Int63n(60)+1
		if i%3 == 0 {
			// Equal by construction: a permutation, or √(k²b) = k√b
			// written as √b + √b (k = 2) against √(4b).
			switch rng.Intn(2) {
			case 0:
				c, d = b, a
			default:
				a, c, d = b, 4*b, 0
			}
		}
		x := RealSub(RealAdd(RealSqrt(RealFromInt(a)), RealSqrt(RealFromInt(b))), RealAdd(RealSqrt(RealFromInt(c)), RealSqrt(RealFromInt(d))))
		f := new(big.Float).SetPrec(3000).Add(ref(a), ref(b))
		f.Sub(f, new(big.Float).SetPrec(3000).Add(ref(c), ref(d)))
		want := f.Sign()
		if f.Sign() != 0 && f.MantExp(nil) < -2900 {
			want = 0
		}
		got, err := x.Sign(DefaultMaxPrecision)
		if err != nil || got != want {
			t.Errorf("√%d + √%d − √%d − √%d: sign %d %v, want %d", a, b, c, d, got, err, want)
		}
		if want == 0 {
			zeros++
		}
	}
	if zeros < 20 {
		t.Errorf("only %d zero cases: the test does not exercise the bound", zeros)
	}
}

// √8 = 2√2 and √(1/2) = √2/2 (from memory) lie in the field of √2, so they
// do not raise the degree bound; √3 does. The smaller bound still decides.
func TestDegreeBoundSharesFields(t *testing.T) {
	same := RealAdd(RealSub(rtSqrt("8"), RealMul(rtR("2"), rtSqrt("2"))), RealSub(rtSqrt("1/2"), RealQuo(rtSqrt("2"), rtR("2"))))
	if d := same.degreeBound(); d != 2 {
		t.Errorf("√8, √2, √(1/2): degree bound %d, want 2", d)
	}
	if d := RealAdd(rtSqrt("8"), rtSqrt("3")).degreeBound(); d != 4 {
		t.Errorf("√8, √3: degree bound %d, want 4", d)
	}
	// Cube roots: ∛(−16) = −2·∛2.
	if d := RealAdd(rtRoot("-16", 3), rtRoot("2", 3)).degreeBound(); d != 3 {
		t.Errorf("∛−16, ∛2: degree bound %d, want 3", d)
	}
	if s, err := same.Sign(DefaultMaxPrecision); err != nil || s != 0 {
		t.Errorf("√8 − 2√2 + √(1/2) − √2/2: %d %v", s, err)
	}
}

// Directed subtraction from an exact zero: 0 − x must enclose −x at every
// precision (big.Float.Sub rounds 0 − y the wrong way under directed
// modes; real_interval.go's sub avoids it). The reference is the exact
// negation, whose enclosure is the mirror image of x's.
func TestSubtractionFromZeroEncloses(t *testing.T) {
	for _, s := range []string{"3", "2", "5", "7/3"} {
		x := RealQuo(rtSqrt(s), rtR("2"))
		if _, err := x.Approx(64, 4096); err != nil { // a cached enclosure finer than the next ones
			t.Fatal(err)
		}
		for _, p := range []uint{24, 48, 53, 96, 200} {
			got, err1 := RealSub(rtR("0"), x).Enclose(p)
			ref, err2 := RealNeg(x).Enclose(400)
			if err1 != nil || err2 != nil || got.Lo.Cmp(ref.Lo) > 0 || got.Hi.Cmp(ref.Hi) < 0 {
				t.Errorf("0 − √%s/2 at %d bits: %v does not contain %v (%v, %v)", s, p, got, ref, err1, err2)
			}
			w, err := RealSub(x, x).Enclose(p)
			if err != nil || w.Lo.Sign() > 0 || w.Hi.Sign() < 0 {
				t.Errorf("x − x at %d bits: %v", p, w)
			}
		}
	}
}

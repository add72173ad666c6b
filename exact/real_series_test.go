package exact

// Checks of the binary-splitting series (real_const.go, real_ball.go)
// against independent routes: the interval routes they replace for
// rational arguments (sinCosPoint, expRange, logPoint, atanSmall), the
// exact-rational series of real_ref_test.go, other formulas for the same
// constant, identities, and published digits.

import (
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

// rtOverlapNarrow fails unless got and ref overlap (both claim to contain
// the value) and got is at most 2^-(p−4)·max(1, |got|) wide (the series
// routes promise about p bits).
func rtOverlapNarrow(t *testing.T, what string, got, ref ival, p uint) {
	t.Helper()
	if _, ok := ivIntersect(got, ref); !ok {
		t.Errorf("%s at %d bits: %v and the independent %v are disjoint", what, p, got, ref)
		return
	}
	mag := fMax(new(big.Float).Abs(got.lo), new(big.Float).Abs(got.hi))
	if mag.Cmp(fOne) < 0 {
		mag = fOne
	}
	if lim := new(big.Float).SetMantExp(mag, 4-int(p)); ivWidth(got).Cmp(lim) > 0 {
		t.Errorf("%s at %d bits: width %s exceeds 2^-%d relative", what, p, ivWidth(got).Text('g', 5), p-4)
	}
}

// rtRandRat returns a random rational with numerator below num and
// denominator below den in magnitude, not zero.
func rtRandRat(rng *rand.Rand, num, den int64) *big.Rat {
	for {
		a := rng.Int63n(2*num+1) - num
		b := rng.Int63n(den) + 1
		if a != 0 {
			return big.NewRat(a, b)
		}
	}
}

// TestLn2MachinIdentity multiplies out the identity behind ln2Machin:
// 18·atanh(1/26) − 2·atanh(1/4801) + 8·atanh(1/8749) is
// log((27/25)^9·(2400/2401)·(4375/4374)^4) since atanh(1/n) =
// ½·log((n+1)/(n−1)), and the product must be exactly 2. The second formula
// (144·atanh(1/251) + 54·atanh(1/449) − 38·atanh(1/4801) +
// 62·atanh(1/8749), from memory of the same family) is checked the same
// way and used below as an independent route.
func TestLn2MachinIdentity(t *testing.T) {
	prod := func(terms [][2]int64) *big.Rat {
		r := big.NewRat(1, 1)
		for _, c := range terms { // coefficient c[0] of atanh(1/c[1])
			n, k := c[1], c[0]
			q := big.NewRat(n+1, n-1) // exp(2·atanh(1/n))
			e := k
			if e < 0 {
				q.Inv(q)
				e = -e
			}
			if e%2 != 0 {
				t.Fatalf("odd coefficient %d", k)
			}
			for i := int64(0); i < e/2; i++ {
				r.Mul(r, q)
			}
		}
		return r
	}
	if got := prod([][2]int64{{18, 26}, {-2, 4801}, {8, 8749}}); got.Cmp(big.NewRat(2, 1)) != 0 {
		t.Errorf("18·atanh(1/26) − 2·atanh(1/4801) + 8·atanh(1/8749) = log %s, want log 2", got)
	}
	if got := prod([][2]int64{{144, 251}, {54, 449}, {-38, 4801}, {62, 8749}}); got.Cmp(big.NewRat(2, 1)) != 0 {
		t.Errorf("second formula = log %s, want log 2", got)
	}
}

// TestLn2Routes compares ln2Zuniga (what ln2Fixed uses) with ln2Machin,
// and ln2Machin with two other routes at several precisions: the
// four-term formula above summed by the same atanh series (a different set
// of arguments), and 2·atanh(1/3) summed in exact rationals (rtAtanhSum).
func TestLn2Routes(t *testing.T) {
	for _, w := range []int{30, 64, 200, 1000, 5003, 20000} {
		got := ln2Machin(w)
		p := uint(w)
		v := w + 8
		alt := ballMulInt(atanRatBall(big.NewInt(1), big.NewInt(251), v, true), 144)
		alt = ballAdd(alt, ballMulInt(atanRatBall(big.NewInt(1), big.NewInt(449), v, true), 54))
		alt = ballAdd(alt, ballMulInt(atanRatBall(big.NewInt(1), big.NewInt(4801), v, true), -38))
		alt = ballAdd(alt, ballMulInt(atanRatBall(big.NewInt(1), big.NewInt(8749), v, true), 62))
		rtOverlapNarrow(t, "ln 2, Machin vs four-term formula", got.ival(p+8), alt.ival(p+8), p)
		rtOverlapNarrow(t, "ln 2, Zuniga's series vs Machin", ln2Zuniga(w).ival(p+8), got.ival(p+8), p)
		if w <= 5003 {
			lo, hi := rtAtanhSum(big.NewRat(1, 3), w+4)
			ref := ivScale(ival{fDown(p + 8).SetRat(lo), fUp(p + 8).SetRat(hi)}, 1)
			rtOverlapNarrow(t, "ln 2, Machin vs 2·atanh(1/3)", got.ival(p+8), ref, p)
		}
	}
}

// TestPiRoutes compares the Chudnovsky route with Machin's formula
// π = 16·atan(1/5) − 4·atan(1/239), the arctangents from atanRatBall, at
// precisions around the term-count steps; and checks the Feynman point
// (six 9s at decimal places 762–767, a well-known feature of the published
// expansion, from memory) in the certified digits.
func TestPiRoutes(t *testing.T) {
	for _, p := range []uint{24, 47, 94, 141, 500, 1001, 4096, 33333} {
		got := piChudnovsky(p)
		w := int(p) + 8
		m := ballAdd(ballMulInt(atanRatBall(big.NewInt(1), big.NewInt(5), w, false), 16),
			ballMulInt(atanRatBall(big.NewInt(1), big.NewInt(239), w, false), -4))
		rtOverlapNarrow(t, "π, Chudnovsky vs Machin", got, m.ival(p+8), p)
	}
	s, err := Pi().Digits(800, DefaultMaxPrecision)
	if err != nil {
		t.Fatal(err)
	}
	// s is "3." then the decimals: place k is s[k+1].
	if got := s[763:769]; got != "999999" {
		t.Errorf("π decimals 762–767 = %s, want 999999", got)
	}
}

// TestSeriesRoutesAgainstIntervals compares the series at random rational
// arguments and precisions with the interval routes kept for irrational
// arguments, and with the exact-rational references.
func TestSeriesRoutesAgainstIntervals(t *testing.T) {
	rng := rand.New(rand.NewSource(20))
	for i := 0; i < 60; i++ {
		r := rtRandRat(rng, 60, 9) // |r| ≤ 60
		if i%5 == 0 {
			r = rtRandRat(rng, 1, 1<<40) // tiny arguments
		}
		p := uint(24 + rng.Intn(1500))
		pt := ivFromRat(r, p+64) // the interval routes take r's enclosure
		if ratSeriesOK(r, 8) {
			for _, cos := range []bool{false, true} {
				got := sinCosRatIval(r, p, cos)
				s, c, err := ivSinCos(pt, p+32)
				if err != nil {
					t.Fatal(err)
				}
				ref := s
				if cos {
					ref = c
				}
				rtOverlapNarrow(t, "sin/cos("+r.String()+")", got, ref, p)
			}
			// sin² + cos² = 1.
			s, c := sinCosRatIval(r, p, false), sinCosRatIval(r, p, true)
			if one := ivAdd(ivSqr(s, p+8), ivSqr(c, p+8), p+8); one.lo.Cmp(fOne) > 0 || one.hi.Cmp(fOne) < 0 {
				t.Errorf("sin² + cos² of %s at %d bits: %v misses 1", r, p, one)
			}
		}
		if expRatSmall(r) {
			got := expRatIval(r, p)
			ref, err := expRange(pt.lo, pt.hi, p+32)
			if err != nil {
				t.Fatal(err)
			}
			rtOverlapNarrow(t, "exp("+r.String()+")", got, ref, p)
			lo, hi := rtExpRef(r, int(p)+8+int(2*r.Num().BitLen()))
			rtOverlapNarrow(t, "exp("+r.String()+") vs exact series", got, ival{fDown(p + 64).SetRat(lo), fUp(p + 64).SetRat(hi)}, p)
		}
		if ar := new(big.Rat).Abs(r); ar.Cmp(big.NewRat(1, 1)) != 0 {
			got := logRatIval(ar, p)
			apt := ivFromRat(ar, p+64)
			ref := ivLog(apt, p+32)
			rtOverlapNarrow(t, "log("+ar.String()+")", got, ref, p)
			lo, hi := rtLogRef(ar, int(p)+8+40)
			rtOverlapNarrow(t, "log("+ar.String()+") vs exact series", got, ival{fDown(p + 64).SetRat(lo), fUp(p + 64).SetRat(hi)}, p)
		}
		if atanRatOK(r) {
			got := atanRatIval(r, p)
			ref := ivAtan(pt, p+32)
			rtOverlapNarrow(t, "atan("+r.String()+")", got, ref, p)
		}
	}
}

// TestExpThirdCubed checks exp(1/3)³ against e, both by the series route
// but with different arguments and term counts.
func TestExpThirdCubed(t *testing.T) {
	for _, p := range []uint{53, 300, 2000, 12000} {
		third := expRatIval(big.NewRat(1, 3), p+16)
		cube := ivMul(ivSqr(third, p+16), third, p+16)
		rtOverlapNarrow(t, "exp(1/3)³ vs e", ivRound(cube, p), expRatIval(big.NewRat(1, 1), p), p-4)
	}
}

// TestSeriesDigitsFromMemory checks leading digits of sin 1, cos 1, e^(1/3)
// and atan(1/2), typed from memory of the published values (OEIS A049469
// for sin 1, A049470 for cos 1), and 2,000 digits of sin 1 against the old
// interval route.
func TestSeriesDigitsFromMemory(t *testing.T) {
	for _, c := range []struct {
		name string
		x    *Real
		want string
	}{
		{"sin 1", RealSin(RealFromInt(1)), "0.841470984807896506652502321630"},
		{"cos 1", RealCos(RealFromInt(1)), "0.540302305868139717400936607442"},
		{"exp(1/3)", RealExp(RealFromRat(big.NewRat(1, 3))), "1.39561242508608952862"},
	} {
		n := strings.Count(c.want, "") - 3 // significant digits: all but "0." / "1."
		if !strings.HasPrefix(c.want, "0.") {
			n++
		}
		got, err := c.x.Digits(n, DefaultMaxPrecision)
		if err != nil {
			t.Fatal(err)
		}
		if got != c.want {
			t.Errorf("%s: got %s, want %s", c.name, got, c.want)
		}
	}
	got, err := RealSin(RealFromInt(1)).Digits(2000, DefaultMaxPrecision)
	if err != nil {
		t.Fatal(err)
	}
	old, err := RealSin(rtNotRational(RealFromInt(1))).Digits(2000, DefaultMaxPrecision)
	if err != nil {
		t.Fatal(err)
	}
	if got != old {
		t.Errorf("sin 1 to 2,000 digits: series and interval routes disagree")
	}
}

// rtNotRational returns x as a node that is not known to be rational (x·1
// through a square root of 1 that evaluation does not simplify), so the
// functions of it take the interval routes.
func rtNotRational(x *Real) *Real {
	return &Real{op: opMul, x: x, y: &Real{op: opRoot, x: RealFromInt(1), k: 2}}
}

// ln2Machin returns a ball at unit 2^-(w+5) containing
//
//	ln 2 = 18·atanh(1/26) − 2·atanh(1/4801) + 8·atanh(1/8749),
//
// a Machin-type formula (listed among the series for ln 2, e.g. in the
// "Natural logarithm of 2" entry of Wikipedia). It is exact: with
// atanh(1/n) = ½·log((n+1)/(n−1)) the right side is
// log((27/25)^9·(2400/2401)·(4375/4374)^4), and that product is 2
// (TestLn2MachinIdentity multiplies it out). The three series gain 9.4,
// 24.5 and 26.2 bits a term, against 3.2 for ln 2 = 2·atanh(1/3).
func ln2Machin(w int) ball {
	v := w + 5
	s := ballMulInt(atanRatBall(big.NewInt(1), big.NewInt(26), v, true), 18)
	s = ballAdd(s, ballMulInt(atanRatBall(big.NewInt(1), big.NewInt(4801), v, true), -2))
	return ballAdd(s, ballMulInt(atanRatBall(big.NewInt(1), big.NewInt(8749), v, true), 8))
}

package exact

import (
	"math/big"
	"math/rand"
	"testing"
)

// intRoot for k = 2 against big.Int.Sqrt (math/big's integer square root,
// documented to return ⌊√n⌋: an independent route), on perfect squares,
// their neighbours and random numbers, lengths from one word to past 10^5
// bits and around the switch from big.Int.Sqrt; the exactness flag against
// r² = n.
func TestIntRootSquareAgainstBigSqrt(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	for _, bits := range []int{1, 2, 63, 64, 65, 200, 2047, 2048, 2049, 2050, 3000, 4100, 9000, 40000, 131072, 200003} {
		for trial := 0; trial < 4; trial++ {
			n := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(bits)))
			n.SetBit(n, bits-1, 1)
			r := new(big.Int).Rsh(n, uint(bits/2))
			sq := new(big.Int).Mul(r, r)
			for _, m := range []*big.Int{n, sq, new(big.Int).Sub(sq, bigOne), new(big.Int).Add(sq, bigOne), new(big.Int).Add(sq, new(big.Int).Lsh(r, 1))} {
				got, exact := intRoot(m, 2)
				want := new(big.Int).Sqrt(m)
				if got.Cmp(want) != 0 {
					t.Fatalf("intRoot(n, 2) of a %d-bit number: off by %v", m.BitLen(), new(big.Int).Sub(got, want))
				}
				if e := new(big.Int).Mul(want, want).Cmp(m) == 0; e != exact {
					t.Fatalf("intRoot(n, 2) of a %d-bit number: exact = %v, want %v", m.BitLen(), exact, e)
				}
			}
		}
	}
}

// intRoot for k ≥ 3 against its definition, r^k ≤ n < (r+1)^k with the
// powers from big.Int.Exp (math/big), on k-th powers and their neighbours
// and random numbers, including degrees past maxNewtonDegree (the division
// route) and roots of a single bit.
func TestIntRootDegrees(t *testing.T) {
	rng := rand.New(rand.NewSource(12))
	for _, k := range []int{3, 4, 5, 7, 12, 33, 100, maxNewtonDegree, maxNewtonDegree + 1} {
		for _, bits := range []int{1, 30, 100, 500, 3000, 20000} {
			if bits > 3000 && k > 12 {
				continue
			}
			n := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(bits)))
			n.SetBit(n, bits-1, 1)
			r0, _ := intRootNewton(n, k) // only to build powers near n
			pk := new(big.Int).Exp(r0, big.NewInt(int64(k)), nil)
			for _, m := range []*big.Int{n, pk, new(big.Int).Sub(pk, bigOne), new(big.Int).Add(pk, bigOne)} {
				if m.Sign() <= 0 {
					continue
				}
				r, exact := intRoot(m, k)
				lo := new(big.Int).Exp(r, big.NewInt(int64(k)), nil)
				hi := new(big.Int).Exp(new(big.Int).Add(r, bigOne), big.NewInt(int64(k)), nil)
				if lo.Cmp(m) > 0 || hi.Cmp(m) <= 0 {
					t.Fatalf("intRoot(%d-bit n, %d) = %v: not ⌊n^(1/k)⌋", m.BitLen(), k, r)
				}
				if exact != (lo.Cmp(m) == 0) {
					t.Fatalf("intRoot(%d-bit n, %d): exact = %v", m.BitLen(), k, exact)
				}
			}
		}
	}
}

// rootApprox lands within a unit or two of the root: the exact check then
// takes a step or two, never the slow fallback (which would hide a broken
// iteration behind correct but slow answers).
func TestRootApproxClose(t *testing.T) {
	rng := rand.New(rand.NewSource(13))
	for _, bits := range []int{75, 100, 200, 500, 1000, 3000, 10000, 40000, 100003} {
		for k := 2; k <= 7; k++ {
			for trial := 0; trial < 8; trial++ {
				n := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(bits)))
				if trial%2 == 0 {
					n.SetBit(n, bits, 1)
				}
				if n.Sign() == 0 {
					continue
				}
				x := rootApprox(n, k)
				r, _ := intRootNewton(n, k)
				if d := new(big.Int).Sub(x, r); d.CmpAbs(big.NewInt(2)) > 0 {
					t.Fatalf("rootApprox(%d-bit n, %d) off by %v", n.BitLen(), k, d)
				}
			}
		}
	}
}

// ivSqrt and ivRootNonneg enclose exactly: lo^k ≤ a.lo and a.hi ≤ hi^k in
// rationals (big.Rat, exact), with the width near 2^-p relative, for points
// and intervals (narrow ones take the tangent, wide ones a second root),
// perfect squares (a point enclosure), and exponents far from 1.
func TestRootEnclosures(t *testing.T) {
	rng := rand.New(rand.NewSource(14))
	pow := func(f *big.Float, k int) *big.Rat {
		r, _ := f.Rat(nil)
		out := big.NewRat(1, 1)
		for range k {
			out.Mul(out, r)
		}
		return out
	}
	rat := func(f *big.Float) *big.Rat { r, _ := f.Rat(nil); return r }
	for i := 0; i < 300; i++ {
		k := 2
		if i%3 == 2 {
			k = 3 + rng.Intn(3)
		}
		p := []uint{30, 64, 200, 1000, 5000, 20000}[rng.Intn(6)]
		mant := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(1+rng.Intn(int(2*p)))))
		mant.Add(mant, bigOne)
		exp := []int{0, 7, -7, 100000, -100000, 3000}[rng.Intn(6)]
		if i%5 == 0 { // a perfect power
			mant.Exp(mant, big.NewInt(int64(k)), nil)
			exp -= exp % k
		}
		lo := new(big.Float).SetInt(mant)
		lo.SetMantExp(lo, exp)
		a := ival{lo, lo}
		switch i % 4 {
		case 1: // narrow: width about 2^-(p+5) relative
			a.hi = fUp(lo.Prec()+p+8).Add(lo, new(big.Float).SetMantExp(lo, -int(p)-5))
		case 2: // wide
			a.hi = fUp(lo.Prec()+8).Mul(lo, big.NewFloat(1.75))
		}
		v := ivRootNonneg(a, k, p)
		if pow(v.lo, k).Cmp(rat(a.lo)) > 0 || pow(v.hi, k).Cmp(rat(a.hi)) < 0 {
			t.Fatalf("root %d at %d bits of [%s, %s]: [%s, %s] does not enclose", k, p,
				a.lo.Text('g', 10), a.hi.Text('g', 10), v.lo.Text('g', 20), v.hi.Text('g', 20))
		}
		// Width: the roots' own spread plus a few units of 2^-p (the ends are
		// rounded to p bits, and the division form of the upper end
		// doubles the error of the lower).
		spread := new(big.Rat).Sub(rat(a.hi), rat(a.lo))
		spread.Quo(spread, rat(a.lo))
		w := new(big.Rat).Sub(rat(v.hi), rat(v.lo))
		w.Quo(w, rat(v.lo))
		lim := new(big.Rat).Add(spread, new(big.Rat).SetFrac(big.NewInt(8), new(big.Int).Lsh(bigOne, p)))
		if w.Cmp(lim) > 0 {
			t.Fatalf("root %d at %d bits of [%s, %s]: relative width %s above %s", k, p, a.lo.Text('g', 10), a.hi.Text('g', 10), w.FloatString(8), lim.FloatString(8))
		}
		if i%5 == 0 && a.isPoint() && v.lo.Cmp(v.hi) != 0 && mant.BitLen() < int(p) {
			t.Fatalf("root %d of a perfect power at %d bits: not a point", k, p)
		}
	}
}

// 100,000 digits of √2 against ⌊√2·10^99999⌋ from big.Int.Sqrt (the
// independent route of real_ref_test.go), to the last digit; the first
// digits also match the value every table gives (1.41421356237309504880…,
// common knowledge).
func TestSqrt2HundredThousandDigits(t *testing.T) {
	if testing.Short() {
		t.Skip("100,000 digits")
	}
	const n = 100000
	got, err := RealSqrt(RealFromInt(2)).Digits(n, 1<<20)
	if err != nil {
		t.Fatal(err)
	}
	if got[:22] != "1.41421356237309504880" {
		t.Fatalf("√2 begins %s", got[:22])
	}
	if rtDigitsOf(t, got).Cmp(rtSqrt2Scaled(n-1)) != 0 {
		t.Fatal("100,000 digits of √2 differ from the big.Int.Sqrt route")
	}
}

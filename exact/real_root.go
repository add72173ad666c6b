package exact

// Roots and integer powers of intervals, from exact integer roots and
// one-directional rounding.
//
// Measured (BenchmarkRealDigitsSqrt2_100000: 100,000 certified digits of √2,
// alternating in one run with /tmp/peer-bin/digits sqrt2 100000, arb's
// arb_sqrt_ui and arb_get_str; best of 6–15 rounds each, in three runs, on
// the 2-core machine under a load of 8–20, December 2026):
//
//	before (main: isqrt, one division per doubling, a division
//	        for the upper end, two decimal conversions)   28–40 ms
//	after  (intRoot below: one root for both ends; one
//	        conversion, floatTruncPair in real_digits.go)  14–16 ms
//	arb, same runs                                        8.5–15 ms
//	        (9 ms on a quieter machine, issue 20)
//
// so 1.6–1.9× arb in the calmer runs (15.4 ms against 9.2 ms, before
// 29.3 ms: 3.2×; the 223 ms predates isqrt).
// Of the 14 ms about 5 are the root (Newton and the exact check's square),
// 2 the scaling by 5^k and 6–7 big.Int.String, now the largest part. At
// 10,000 digits (BenchmarkRealDigitsSqrt2_10000) 0.45–0.72 ms against
// 0.78–1.0 ms before; at 256 bits (BenchmarkRealSqrtSum256, big.Int.Sqrt
// under both) unchanged within the noise.

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"

	"assay/exact/bigmul"
)

// ceilDiv is ⌈a/b⌉ for b > 0.
func ceilDiv(a, b int) int {
	q := a / b
	if a%b != 0 && a > 0 {
		q++
	}
	return q
}

// realIntRoot returns ⌊n^(1/k)⌋ for n ≥ 0, k ≥ 2 (intRoot without the
// exactness flag).
func realIntRoot(n *big.Int, k int) *big.Int {
	r, _ := intRoot(n, k)
	return r
}

// intRoot returns r = ⌊n^(1/k)⌋ for n ≥ 0, k ≥ 2, and whether r^k = n.
//
// One routine serves every integer root in the package (the square roots
// of certified reals, of their zero-bound checks, of rationals): Newton's
// iteration for the inverse root, division-free with precision doubling
// (rootApprox), then an exact check in integers, r^k ≤ n < (r+1)^k, which
// also corrects the last units. The answer is therefore proved, not
// assumed; should the approximation ever be far off (it is not, by the
// analysis in rootApprox, and the tests hunt for it), the check falls back
// to the slow exact routes (big.Int.Sqrt, documented to return ⌊√n⌋, and
// intRootNewton) instead of answering wrong.
func intRoot(n *big.Int, k int) (*big.Int, bool) {
	if n.Sign() == 0 {
		return new(big.Int), true
	}
	if k == 2 && n.BitLen() <= isqrtSmall {
		r := new(big.Int).Sqrt(n)
		// r² = n needs r² ≡ n modulo the word first: one word product
		// rejects nearly every inexact root without squaring r.
		if low(r)*low(r) != low(n) {
			return r, false
		}
		return r, bigmul.Sqr(new(big.Int), r).Cmp(n) == 0
	}
	if k > maxNewtonDegree {
		return intRootNewton(n, k)
	}
	x := rootApprox(n, k)
	if k == 2 {
		// d = n − x², kept exact while x moves by ±1: (x±1)² = x² ± 2x + 1.
		d := new(big.Int).Sub(n, bigmul.Sqr(new(big.Int), x))
		t := new(big.Int)
		for steps := 0; ; steps++ {
			if steps > 8 {
				r := new(big.Int).Sqrt(n)
				return r, new(big.Int).Mul(r, r).Cmp(n) == 0
			}
			switch {
			case d.Sign() < 0:
				x.Sub(x, bigOne)
				d.Add(d, t.Lsh(x, 1)).Add(d, bigOne)
			case d.Cmp(t.Lsh(x, 1)) > 0: // n ≥ (x+1)² = x² + 2x + 1
				d.Sub(d, t).Sub(d, bigOne)
				x.Add(x, bigOne)
			default:
				return x, d.Sign() == 0
			}
		}
	}
	for steps := 0; ; steps++ {
		if steps > 8 {
			return intRootNewton(n, k)
		}
		c := intPow(x, k).Cmp(n)
		if c > 0 {
			x.Sub(x, bigOne)
			continue
		}
		x1 := new(big.Int).Add(x, bigOne)
		if intPow(x1, k).Cmp(n) <= 0 {
			x = x1
			continue
		}
		return x, c == 0
	}
}

// low is the lowest word of x ≥ 0 (x mod 2^64 on 64-bit machines).
func low(x *big.Int) big.Word {
	if w := x.Bits(); len(w) > 0 {
		return w[0]
	}
	return 0
}

// isqrtSmall is the size (bits) up to which square roots use big.Int.Sqrt.
const isqrtSmall = 2048

// maxNewtonDegree bounds the root degrees rootApprox takes: its starting
// value and guard bits assume log2 k well below the 36 bits of the start.
const maxNewtonDegree = 1 << 10

// intPow is x^k by repeated squaring through bigmul.
func intPow(x *big.Int, k int) *big.Int {
	r := big.NewInt(1)
	b := new(big.Int).Set(x)
	for ; k > 0; k >>= 1 {
		if k&1 == 1 {
			bigmul.Mul(r, r, b)
		}
		if k > 1 {
			bigmul.Sqr(b, b)
		}
	}
	return r
}

// shiftTo returns x·2^s (s of either sign; a negative s floors).
func shiftTo(x *big.Int, s int) *big.Int {
	if s >= 0 {
		return new(big.Int).Lsh(x, uint(s))
	}
	return new(big.Int).Rsh(x, uint(-s))
}

// rootGuard is the number of guard bits carried by rootApprox's steps.
const rootGuard = 8

// rootApprox returns x within a few units of n^(1/k), for n > 0 and
// 2 ≤ k ≤ maxNewtonDegree, without a division.
//
// Write n = a·2^(k·t) with 1 ≤ a < 2^k, so n^(1/k) = a^(1/k)·2^t. Newton's
// iteration for y = a^(-1/k), the zero of y^-k − a,
//
//	y' = y + y·(1 − a·y^k)/k,
//
// needs only products, and it converges quadratically: an error ε becomes
// about (k+1)/2·a^(1/k)·ε² ≤ (k+1)·ε², so each step may double the
// precision, and each runs at the precision it delivers (the top bits of
// a suffice), which makes the whole iteration cost a few products of the
// final length. The last step (Karp and Markstein, "High-precision division
// and square root", ACM TOMS 23, 1997) turns y at half precision into the
// root itself: x₀ = a·y^(k−1) at half precision, then
//
//	x = x₀ + y^(k−1)·(a − x₀^k)/k,
//
// whose error is second order in that of x₀. The guard bits keep the
// rounding of each truncated product below the unit in the last place.
// The caller checks the result exactly; nothing here is trusted.
func rootApprox(n *big.Int, k int) *big.Int {
	t := (n.BitLen() - 1) / k
	// scaled(m) = ⌊a·2^m⌋.
	scaled := func(m int) *big.Int { return shiftTo(n, m-k*t) }
	if t <= rootStart {
		return rootFloat(n, k, t)
	}
	const g = rootGuard
	h := (t+1)/2 + g // t ≥ 2h − 2g − 1: x₀ at h bits carries the root to t
	y := invRootApprox(n, k, t, h)
	// w = y^(k−1) at scale 2^(h+g).
	w := shiftTo(intPow(y, k-1), h+g-(k-1)*h)
	// x₀ = a·w at scale 2^h.
	x0 := shiftTo(bigmul.Mul(new(big.Int), scaled(h+g), w), -(h + 2*g))
	// r = a − x₀^k at scale 2^(k·h); only about its top h+g bits count.
	r := new(big.Int).Sub(scaled(k*h), intPow(x0, k))
	drop := max(0, k*h-t-g) // r's bits below what w·r/k at scale 2^t needs
	r = shiftTo(r, -drop)
	corr := shiftTo(bigmul.Mul(new(big.Int), w, r), drop-(h+g+k*h-t))
	if k > 2 {
		corr.Quo(corr, big.NewInt(int64(k)))
	} else {
		corr.Rsh(corr, 1)
	}
	return corr.Add(corr, shiftTo(x0, t-h))
}

// rootStart is the precision (bits) taken from float64 arithmetic to start
// the Newton iteration; float64 carries 53, and the logarithms below lose
// a few more for large k.
const rootStart = 36

// rootFloat returns an approximation of n^(1/k) = a^(1/k)·2^t when t ≤
// rootStart, from log2 a, a number below k: its float64 error stays near
// 2^-50·k.
func rootFloat(n *big.Int, k, t int) *big.Int {
	l2a := log2Shifted(n, k*t)
	r := math.Exp2(l2a/float64(k) + float64(t))
	return new(big.Int).SetUint64(uint64(math.Round(r)))
}

// log2Shifted is log2(n/2^s) for n > 0, from the top 64 bits of n, with
// the integer part of the shift taken exactly (log2Int would round
// log2 n first, losing bits when n is long).
func log2Shifted(n *big.Int, s int) float64 {
	sh := max(0, n.BitLen()-64)
	top := new(big.Int).Rsh(n, uint(sh)).Uint64()
	return math.Log2(float64(top)) + float64(sh-s)
}

// invRootApprox returns y ≈ a^(-1/k)·2^h (a = n/2^(k·t), h > 0), with an
// error of a few units, by the precision-doubling Newton iteration of
// rootApprox.
func invRootApprox(n *big.Int, k, t, h int) *big.Int {
	if h <= rootStart {
		l2a := log2Shifted(n, k*t)
		y := math.Exp2(float64(h) - l2a/float64(k))
		return new(big.Int).SetUint64(uint64(math.Round(y)))
	}
	// The error ε ≤ 2^-(hp−2) of the previous step becomes at most
	// (k+1)·ε² ≤ 2^-(h+4), with hp chosen so.
	hp := (h+1)/2 + 4 + bits.Len(uint(k))
	y := invRootApprox(n, k, t, hp)
	const g = rootGuard
	// a·y^k at scale 2^(2h+2g), from y^k at scale 2^(h+g) and a at h+g bits.
	yk := shiftTo(intPow(y, k), h+g-k*hp)
	ayk := bigmul.Mul(new(big.Int), shiftTo(n, h+g-k*t), yk)
	// e = 1 − a·y^k at scale 2^h (it is about 2^-hp, so hp bits of it).
	e := new(big.Int).Lsh(bigOne, uint(2*h+2*g))
	e = shiftTo(e.Sub(e, ayk), -(h + 2*g))
	// y' = y + y·e/k at scale 2^h.
	corr := shiftTo(bigmul.Mul(e, y, e), -hp)
	if k > 2 {
		corr.Quo(corr, big.NewInt(int64(k)))
	} else {
		corr.Rsh(corr, 1)
	}
	return corr.Add(corr, shiftTo(y, h-hp))
}

// intRootNewton is ⌊n^(1/k)⌋ by Newton's iteration from above with a
// division per step, checked (r^k ≤ n < (r+1)^k) and corrected: the slow
// route for degrees beyond maxNewtonDegree and the fallback of intRoot.
func intRootNewton(n *big.Int, k int) (*big.Int, bool) {
	// Initial guess from the top 64 bits in float64.
	L := n.BitLen()
	shift := L - 64
	if shift < 0 {
		shift = 0
	}
	top, _ := new(big.Float).SetInt(new(big.Int).Rsh(n, uint(shift))).Float64()
	lg := (math.Log2(top) + float64(shift)) / float64(k)
	e := math.Floor(lg)
	g := new(big.Float).SetFloat64(math.Exp2(lg - e))
	g.SetMantExp(g, int(e))
	x, _ := g.Int(nil)
	x.Add(x, big.NewInt(1))
	bk := big.NewInt(int64(k))
	bk1 := big.NewInt(int64(k - 1))
	ek1 := big.NewInt(int64(k - 1))
	step := func(x *big.Int) *big.Int {
		t := new(big.Int).Exp(x, ek1, nil)
		t.Quo(n, t)
		t.Add(t, new(big.Int).Mul(bk1, x))
		return t.Quo(t, bk)
	}
	// One step lands at or above ⌊n^(1/k)⌋ (AM-GM); then it decreases.
	x = step(x)
	if x.Sign() == 0 {
		x.SetInt64(1)
	}
	for {
		y := step(x)
		if y.Cmp(x) >= 0 {
			break
		}
		x = y
	}
	ek := big.NewInt(int64(k))
	for new(big.Int).Exp(x, ek, nil).Cmp(n) > 0 {
		x.Sub(x, bigOne)
	}
	for {
		x1 := new(big.Int).Add(x, bigOne)
		if new(big.Int).Exp(x1, ek, nil).Cmp(n) > 0 {
			break
		}
		x = x1
	}
	return x, new(big.Int).Exp(x, ek, nil).Cmp(n) == 0
}

// rootBounds returns p-bit lower and upper bounds of a^(1/k) for a ≥ 0,
// k ≥ 2, about 2^-(p+1) apart relative, from one exact integer root: with
// t = a·2^(k·s) (s chosen so that t has about k·(p+2) integer bits) and
// n = ⌊t⌋, r = ⌊n^(1/k)⌋ satisfies r^k ≤ n ≤ t < n + 1 ≤ (r+1)^k, so
// r·2^-s ≤ a^(1/k) < (r+1)·2^-s, and both are a^(1/k) when t = r^k. No
// floating-point root is trusted.
func rootBounds(a *big.Float, k int, p uint) (lo, hi *big.Float) {
	if a.Sign() == 0 {
		return new(big.Float), new(big.Float)
	}
	e := a.MantExp(nil)
	s := ceilDiv(k*(int(p)+2)-e, k)
	t := new(big.Float).SetMantExp(a, k*s)
	n, acc := t.Int(nil) // t > 0: truncation is the floor
	r, exact := intRoot(n, k)
	lo = fDown(p).SetInt(r)
	if !exact || acc != big.Exact {
		r.Add(r, bigOne)
	}
	hi = fUp(p).SetInt(r)
	return lo.SetMantExp(lo, -s), hi.SetMantExp(hi, -s)
}

// rootBound is the lower (upper == false) or upper bound of rootBounds.
func rootBound(a *big.Float, k int, p uint, upper bool) *big.Float {
	lo, hi := rootBounds(a, k, p)
	if upper {
		return hi
	}
	return lo
}

// ivRootNonneg is a^(1/k) for a ≥ 0: both ends from one integer root when
// a is a point.
//
// Otherwise, when lo > 0 and the interval is narrow, the upper end comes
// from the root of lo by a tangent instead of a second integer root:
// x^(1/k) is concave, so hi^(1/k) ≤ lo^(1/k) + (hi − lo)·lo^(1/k)/(k·lo) ≤
// u + (hi − lo)·u/(k·lo) with u ≥ lo^(1/k), and the correction is small
// enough to compute at 64 bits, rounded up. The tangent overshoots by
// about (hi − lo)²/(8·lo²) relative, below 2^-p when hi − lo < lo·2^-(p/2+1);
// wider intervals take the second root.
func ivRootNonneg(a ival, k int, p uint) ival {
	lo, u := rootBounds(a.lo, k, p)
	if a.isPoint() {
		return ival{lo, u}
	}
	if a.lo.Sign() > 0 {
		w := sub(fUp(64), a.hi, a.lo)
		if a.lo.MantExp(nil)-w.MantExp(nil) > int(p/2)+1 {
			if k == 2 && p < tangentPrec {
				// √hi ≤ √lo + (hi − lo)/(2√lo) ≤ (lo + hi)/(2l) for
				// l ≤ √lo: at this size one division costs less than
				// the tangent's roundings.
				sum := fUp(p+2).Add(a.lo, a.hi)
				return ival{lo, quoUp(p, sum, new(big.Float).SetMantExp(lo, 1))}
			}
			kl := mulDown(64, a.lo, new(big.Float).SetInt64(int64(k)))
			c := quoUp(64, mulUp(64, w, u), kl)
			return ival{lo, fUp(p).Add(u, c)}
		}
	}
	_, hi := rootBounds(a.hi, k, p)
	return ival{lo, hi}
}

// tangentPrec is the precision from which ivRootNonneg's tangent beats the
// full division for square roots (BenchmarkRealSqrtSum256 at 256 bits was
// 15% slower with the tangent).
const tangentPrec = 4096

func ivSqrt(a ival, p uint) ival { return ivRootNonneg(a, 2, p) }

// powBound is a^k for a ≥ 0, k ≥ 1, by repeated squaring with every
// rounding in one direction (all intermediates are ≥ 0, so rounding each
// factor down gives a lower bound, up an upper bound). The guard bits cover
// the growth of the relative error, about k·2^-p.
func powBound(a *big.Float, k uint64, p uint, upper bool) *big.Float {
	w := p + uint(bits.Len64(k)) + 4
	mk := fDown
	if upper {
		mk = fUp
	}
	result := mk(w).SetInt64(1)
	base := mk(w).Set(a)
	for k > 0 {
		if k&1 == 1 {
			result = mk(w).Mul(result, base)
		}
		k >>= 1
		if k > 0 {
			base = mk(w).Mul(base, base)
		}
	}
	return mk(p).Set(result)
}

// ivPow is a^k for k ≥ 1. It fails with ErrOverflow when the result's
// exponent could leave the range where big.Float cannot round outward.
func ivPow(a ival, k uint64, p uint) (ival, error) {
	for _, f := range []*big.Float{a.lo, a.hi} {
		if f.Sign() != 0 {
			// log2|f|·k bounds the exponent of every partial product.
			m := new(big.Float)
			e := f.MantExp(m)
			mf, _ := m.Float64()
			l := float64(e) + math.Log2(math.Abs(mf))
			if math.Abs(l)*float64(k) > ivMaxExp-4 {
				return ival{}, fmt.Errorf("power %d of a number of magnitude 2^%d out of range: %w", k, e, ErrOverflow)
			}
		}
	}
	odd := k&1 == 1
	abs := func(f *big.Float) *big.Float { return new(big.Float).Abs(f) }
	switch {
	case a.nonneg():
		return ival{powBound(a.lo, k, p, false), powBound(a.hi, k, p, true)}, nil
	case a.hi.Sign() <= 0:
		m := ival{powBound(abs(a.hi), k, p, false), powBound(abs(a.lo), k, p, true)}
		if odd {
			return ivNeg(m), nil
		}
		return m, nil
	default:
		if odd {
			return ival{
				new(big.Float).Neg(powBound(abs(a.lo), k, p, true)),
				powBound(a.hi, k, p, true),
			}, nil
		}
		m := fMax(abs(a.lo), a.hi)
		return ival{new(big.Float), powBound(m, k, p, true)}, nil
	}
}

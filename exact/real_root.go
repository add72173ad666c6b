package exact

// Roots and integer powers of intervals, from exact integer roots and
// one-directional rounding.

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"
)

// ceilDiv is ⌈a/b⌉ for b > 0.
func ceilDiv(a, b int) int {
	q := a / b
	if a%b != 0 && a > 0 {
		q++
	}
	return q
}

// realIntRoot returns ⌊n^(1/k)⌋ for n ≥ 0, k ≥ 2. For k = 2 it is
// isqrt; otherwise Newton's iteration from above, and the answer is
// checked (r^k ≤ n < (r+1)^k) and corrected, so it is exact by
// construction.
func realIntRoot(n *big.Int, k int) *big.Int {
	if n.Sign() == 0 {
		return new(big.Int)
	}
	if k == 2 {
		return isqrt(n)
	}
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
	one := big.NewInt(1)
	for new(big.Int).Exp(x, ek, nil).Cmp(n) > 0 {
		x.Sub(x, one)
	}
	for {
		x1 := new(big.Int).Add(x, one)
		if new(big.Int).Exp(x1, ek, nil).Cmp(n) > 0 {
			break
		}
		x = x1
	}
	return x
}

// isqrtSmall is the size (bits) below which isqrt uses big.Int.Sqrt.
const isqrtSmall = 2048

// isqrt returns ⌊√n⌋ for n ≥ 0 by Newton's method with precision doubling:
// the root of the top half of n's bits, shifted, is within about 2^h of
// √n (h a quarter of n's length), one Newton step x ↦ ⌊(x + ⌊n/x⌋)/2⌋ then
// lands at or above ⌊√n⌋ (the arithmetic–geometric mean inequality) and
// within a few units of it, and the answer is corrected down and checked
// (r² ≤ n < (r+1)²), falling back to big.Int.Sqrt if the check ever
// failed. big.Int.Sqrt runs its Newton iteration at full length from a
// power of two, about log2 of the length in full divisions; this takes
// about two, which made square roots at 10^5–10^6 bits (the zero bounds of
// nested radicals) about ten times faster.
func isqrt(n *big.Int) *big.Int {
	L := n.BitLen()
	if L <= isqrtSmall {
		return new(big.Int).Sqrt(n)
	}
	h := uint(L / 4)
	x := isqrt(new(big.Int).Rsh(n, 2*h))
	x.Add(x, big.NewInt(1)) // ⌊√(n/4^h)⌋ + 1 > √(n/4^h)
	x.Lsh(x, h)
	q := new(big.Int).Quo(n, x)
	x.Add(x, q).Rsh(x, 1)
	sq := new(big.Int).Mul(x, x)
	t := new(big.Int)
	for steps := 0; sq.Cmp(n) > 0; steps++ {
		if steps > 64 {
			return new(big.Int).Sqrt(n)
		}
		// (x−1)² = x² − 2x + 1
		sq.Sub(sq, t.Lsh(x, 1))
		sq.Add(sq, big.NewInt(1))
		x.Sub(x, big.NewInt(1))
	}
	// (x+1)² = x² + 2x + 1 must exceed n.
	sq.Add(sq, t.Lsh(x, 1))
	if sq.Add(sq, big.NewInt(1)).Cmp(n) <= 0 {
		return new(big.Int).Sqrt(n)
	}
	return x
}

// rootBound returns a p-bit lower (upper == false) or upper bound of
// a^(1/k) for a ≥ 0, k ≥ 2, correct to about p+1 bits. It scales a by
// 2^(k·s) so that the integer part has about k·(p+2) bits, takes the exact
// integer root of its floor (or ceiling), and scales back: no floating
// point root is trusted.
func rootBound(a *big.Float, k int, p uint, upper bool) *big.Float {
	if a.Sign() == 0 {
		return new(big.Float)
	}
	e := a.MantExp(nil)
	s := ceilDiv(k*(int(p)+2)-e, k)
	t := new(big.Float).SetMantExp(a, k*s)
	n, acc := t.Int(nil) // t > 0: truncation is the floor
	var r *big.Int
	if !upper {
		r = realIntRoot(n, k)
	} else {
		if acc != big.Exact {
			n.Add(n, big.NewInt(1))
		}
		r = realIntRoot(n, k)
		if new(big.Int).Exp(r, big.NewInt(int64(k)), nil).Cmp(n) != 0 {
			r.Add(r, big.NewInt(1))
		}
	}
	var z *big.Float
	if upper {
		z = fUp(p).SetInt(r)
	} else {
		z = fDown(p).SetInt(r)
	}
	return z.SetMantExp(z, -s)
}

// ivRootNonneg is a^(1/k) for a ≥ 0.
//
// For square roots with lo > 0 the upper end comes from the lower root l
// by one division instead of a second integer root: √ is concave, so
// √hi ≤ √lo + (hi − lo)/(2√lo), and l ≤ √lo gives √lo ≤ lo/l, hence
// √hi ≤ (lo + hi)/(2l). At 10^5–10^6 bits a division costs about half an
// integer square root.
func ivRootNonneg(a ival, k int, p uint) ival {
	lo := rootBound(a.lo, k, p, false)
	if a.isPoint() && a.lo.Sign() == 0 {
		return ival{lo, lo}
	}
	if k == 2 && lo.Sign() > 0 {
		sum := fUp(p+2).Add(a.lo, a.hi)
		return ival{lo, quoUp(p, sum, new(big.Float).SetMantExp(lo, 1))}
	}
	return ival{lo, rootBound(a.hi, k, p, true)}
}

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

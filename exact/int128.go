package exact

// Machine-word integer arithmetic for coefficients: int64 with overflow
// checks, and signed 128-bit integers as (hi, lo) word pairs.

import (
	"math/big"
	"math/bits"
)

// absU64 returns |x|, which always fits a uint64.
func absU64(x int64) uint64 {
	if x < 0 {
		return uint64(-x) // also right for math.MinInt64
	}
	return uint64(x)
}

// set128 sets z to the signed 128-bit integer hi:lo.
func set128(z *big.Int, hi, lo uint64) *big.Int {
	neg := int64(hi) < 0
	if neg {
		hi, lo = neg128(hi, lo)
	}
	z.SetUint64(hi)
	z.Lsh(z, 64)
	z.Or(z, new(big.Int).SetUint64(lo))
	if neg {
		z.Neg(z)
	}
	return z
}

// words128 returns the two's complement words of x, |x| < 2^127.
func words128(x *big.Int) (hi, lo uint64) {
	var a, t big.Int
	a.Abs(x)
	lo = t.And(&a, new(big.Int).SetUint64(^uint64(0))).Uint64()
	hi = t.Rsh(&a, 64).Uint64()
	if x.Sign() < 0 {
		hi, lo = neg128(hi, lo)
	}
	return hi, lo
}

// neg128 returns -(hi:lo) modulo 2^128.
func neg128(hi, lo uint64) (uint64, uint64) {
	hi, lo = ^hi, -lo
	if lo == 0 {
		hi++
	}
	return hi, lo
}

// mul128 returns the signed 128-bit product a*b.
func mul128(a, b int64) (hi, lo uint64) {
	hi, lo = bits.Mul64(uint64(a), uint64(b))
	hi -= uint64(a>>63) & uint64(b)
	hi -= uint64(b>>63) & uint64(a)
	return
}

// addOv returns a+b and whether it overflowed.
func addOv(a, b int64) (int64, bool) {
	s := a + b
	return s, (a >= 0) == (b >= 0) && (s >= 0) != (a >= 0)
}

// mulOv returns a*b and whether it overflowed.
func mulOv(a, b int64) (int64, bool) {
	hi, lo := mul128(a, b)
	return int64(lo), hi != uint64(int64(lo)>>63)
}

// accum is a signed 128-bit accumulator that moves to math/big on
// overflow.
type accum struct {
	hi, lo uint64
	isBig  bool
	z, t   big.Int
	u      big.Int
}

func (a *accum) reset() { a.hi, a.lo, a.isBig = 0, 0, false }

func (a *accum) isZero() bool {
	if a.isBig {
		return a.z.Sign() == 0
	}
	return a.hi|a.lo == 0
}

func (a *accum) toBig() {
	if !a.isBig {
		set128(&a.z, a.hi, a.lo)
		a.isBig = true
	}
}

// add128 adds the signed 128-bit value ph:pl.
func (a *accum) add128(ph, pl uint64) {
	if a.isBig {
		a.z.Add(&a.z, set128(&a.t, ph, pl))
		return
	}
	lo, c := bits.Add64(a.lo, pl, 0)
	hi := a.hi + ph + c
	if int64(a.hi^ph) >= 0 && int64(hi^a.hi) < 0 {
		a.toBig()
		a.z.Add(&a.z, set128(&a.t, ph, pl))
		return
	}
	a.hi, a.lo = hi, lo
}

// sub128 subtracts the signed 128-bit value ph:pl.
func (a *accum) sub128(ph, pl uint64) {
	if a.isBig {
		a.z.Sub(&a.z, set128(&a.t, ph, pl))
		return
	}
	lo, c := bits.Sub64(a.lo, pl, 0)
	hi := a.hi - ph - c
	if int64(a.hi^ph) < 0 && int64(hi^a.hi) < 0 {
		a.toBig()
		a.z.Sub(&a.z, set128(&a.t, ph, pl))
		return
	}
	a.hi, a.lo = hi, lo
}

// addBig adds x.
func (a *accum) addBig(x *big.Int) {
	a.toBig()
	a.z.Add(&a.z, x)
}

// addMul adds (or with neg subtracts) numerator i of p times numerator j
// of q.
func (a *accum) addMul(p *Poly, i int, q *Poly, j int, neg bool) {
	if p.small(i) && q.small(j) {
		ph, pl := mul128(p.num[i], q.num[j])
		if neg {
			a.sub128(ph, pl)
		} else {
			a.add128(ph, pl)
		}
		return
	}
	a.toBig()
	a.t.Mul(p.numAt(i, &a.t), q.numAt(j, &a.u))
	if neg {
		a.z.Sub(&a.z, &a.t)
	} else {
		a.z.Add(&a.z, &a.t)
	}
}

// int64Value returns the value and true when it fits an int64.
func (a *accum) int64Value() (int64, bool) {
	if a.isBig {
		return a.z.Int64(), a.z.IsInt64()
	}
	return int64(a.lo), a.hi == uint64(int64(a.lo)>>63)
}

// bigValue sets z to the value and returns it.
func (a *accum) bigValue(z *big.Int) *big.Int {
	if a.isBig {
		return z.Set(&a.z)
	}
	return set128(z, a.hi, a.lo)
}

package exact

// Midpoint–radius balls for the binary-splitting series (real_const.go):
// one exact big integer and a small radius instead of two big endpoints, so
// a series sum costs one full-length division rather than two, and the
// error terms (truncations, tails) add up in a 64-bit radius.
//
// Every radius is a big.Float of 64 bits rounded toward +∞ (fUp), so each
// bound below is an upper bound by math/big's documented rounding; the
// midpoints are exact integers.

import (
	"math/big"

	"assay/exact/bigmul"
)

// ball is the set of reals within r·2^e of m·2^e: m exact, r ≥ 0 an upper
// bound in the same unit.
type ball struct {
	m *big.Int
	e int
	r *big.Float
}

// mulInt sets z = x·y and returns z. Every large product of the series
// code goes through it: bigmul.Mul, which hands products below its
// measured threshold to big.Int.Mul.
func mulInt(z, x, y *big.Int) *big.Int { return bigmul.Mul(z, x, y) }

// radUp returns a 64-bit upper bound of |n|.
func radUp(n *big.Int) *big.Float { return fUp(64).SetInt(new(big.Int).Abs(n)) }

// radDown returns a 64-bit lower bound of |n|.
func radDown(n *big.Int) *big.Float { return fDown(64).SetInt(new(big.Int).Abs(n)) }

// addRad returns b with its radius increased by d (in b's unit).
func (b ball) addRad(d *big.Float) ball {
	return ball{b.m, b.e, fUp(64).Add(b.r, d)}
}

// addRadAbs returns b with its radius increased by an absolute amount d
// (a bound of an error in the value itself, not in units of 2^e).
func (b ball) addRadAbs(d *big.Float) ball {
	s := new(big.Float).SetMantExp(d, -b.e) // exact scaling
	return b.addRad(s)
}

// ballAdd returns x + y, exactly in the midpoint (the one with the larger
// unit is shifted to the smaller).
func ballAdd(x, y ball) ball {
	if x.e < y.e {
		x, y = y, x
	}
	d := x.e - y.e
	m := new(big.Int).Lsh(x.m, uint(d))
	m.Add(m, y.m)
	r := fUp(64).Add(new(big.Float).SetMantExp(x.r, d), y.r)
	return ball{m, y.e, r}
}

// ballMulInt returns x·k for an integer k, exactly in the midpoint.
func ballMulInt(x ball, k int64) ball {
	kb := big.NewInt(k)
	return ball{new(big.Int).Mul(x.m, kb), x.e, fUp(64).Mul(x.r, radUp(kb))}
}

// ballMul returns x·y: the exact product of the midpoints, and the radius
// |X|·RY + |Y|·RX + RX·RY.
func ballMul(x, y ball) ball {
	r := fUp(64).Mul(radUp(x.m), y.r)
	r = fUp(64).Add(r, fUp(64).Mul(radUp(y.m), x.r))
	r = fUp(64).Add(r, fUp(64).Mul(x.r, y.r))
	return ball{mulInt(new(big.Int), x.m, y.m), x.e + y.e, r}
}

// ballTrunc returns x with its midpoint cut to about bits bits: with
// m′ = ⌊m/2^s⌋, m − m′·2^s lies in [0, 2^s), so the radius in the new
// unit 2^(e+s) grows by one.
func ballTrunc(x ball, bits int) ball {
	s := x.m.BitLen() - bits
	if s <= 0 {
		return x
	}
	r := fUp(64).Add(new(big.Float).SetMantExp(x.r, -s), fOne)
	return ball{new(big.Int).Rsh(x.m, uint(s)), x.e + s, r}
}

// ballQuo returns a ball at unit 2^-w containing every quotient of a value
// of x by a value of y; ok is false when y's ball may contain 0.
//
// With X, Y the midpoints and RX, RY the radii (units aside),
// |(X+a)/(Y+b) − X/Y| = |aY − bX|/|Y(Y+b)| ≤ (RX + |X/Y|·RY)/(|Y| − RY) for
// |a| ≤ RX, |b| ≤ RY < |Y|; the midpoint is fixedQuo's, within 2 units of
// X/Y.
func ballQuo(x, y ball, w int) (z ball, ok bool) {
	if y.m.Sign() == 0 || radDown(y.m).Cmp(y.r) <= 0 {
		return ball{}, false
	}
	// Quotient unit: 2^(x.e − y.e); wanted 2^-w.
	sh := x.e - y.e + w
	num, den := x.m, y.m
	if sh >= 0 {
		num = new(big.Int).Lsh(num, uint(sh))
	} else {
		den = new(big.Int).Lsh(den, uint(-sh))
	}
	if den.Sign() < 0 {
		num, den = new(big.Int).Neg(num), new(big.Int).Neg(den)
	}
	m := fixedQuo(num, den)
	r := big.NewFloat(2)
	if x.r.Sign() != 0 || y.r.Sign() != 0 {
		ratio := fUp(64).Quo(radUp(x.m), radDown(y.m))
		n := fUp(64).Add(x.r, fUp(64).Mul(ratio, y.r))
		d := sub(fDown(64), radDown(y.m), y.r)
		e := fUp(64).Quo(n, d)
		r = fUp(64).Add(r, e.SetMantExp(e, sh)) // e in units of 2^-w
	}
	return ball{m, -w, r}, true
}

// fixedQuo returns Z with |N/D − Z| < 2 for D > 0, dividing truncations of
// N and D when D is much longer than the quotient.
//
// Proof. With q = max(bitlen N − bitlen D, 0) and s = bitlen D − q − 8 > 0
// (else nothing is truncated and Z = ⌊N/D⌋), let N′ = ⌊N/2^s⌋,
// D′ = ⌊D/2^s⌋, so N/2^s = N′ + δ, D/2^s = D′ + ε with δ, ε in [0, 1).
// Then |N/D − N′/D′| = |δD′ − εN′|/(D′(D′+ε)) ≤ (1 + |N′/D′|)/D′. Here
// D′ ≥ 2^(q+7) and |N′| < 2^(bitlen N − s + 1), so |N′/D′| < 2^(q+2) and
// the bound is below 2^(q+3)/2^(q+7) = 1/16. Z = ⌊N′/D′⌋ (Euclidean
// division, D′ > 0) adds less than 1.
func fixedQuo(n, d *big.Int) *big.Int {
	q := n.BitLen() - d.BitLen()
	if q < 0 {
		q = 0
	}
	if s := d.BitLen() - q - 8; s > 0 {
		n = new(big.Int).Rsh(n, uint(s)) // arithmetic shift: the floor
		d = new(big.Int).Rsh(d, uint(s))
	}
	return new(big.Int).Div(n, d)
}

// ends returns integers lo < hi with the ball inside [lo, hi]·2^e:
// m ∓ (⌊r⌋ + 1), the truncation of r ≥ 0 plus one being above r.
func (b ball) ends() (lo, hi *big.Int) {
	r, _ := b.r.Int(nil)
	r.Add(r, bigOne)
	return new(big.Int).Sub(b.m, r), new(big.Int).Add(b.m, r)
}

// ival returns the ball as an interval rounded outward to precision p.
func (b ball) ival(p uint) ival {
	lo, hi := b.ends()
	return fixedIval(lo, hi, b.e, p)
}

package exact

import (
	"fmt"
	"math/big"
)

// Deciding whether an algebraic real is rational, from the same BFMSS
// bookkeeping as the zero bound (real_algebraic.go).
//
// If x = U/L with U, L algebraic integers of a number field K of degree d,
// |σ(L)| ≤ l for every embedding σ, and x = p/q in lowest terms, then
// N(U) = x^d·N(L) is an integer, so q^d divides the non-zero integer N(L),
// whose size is at most l^d: the denominator q is at most l. Two distinct
// fractions with denominators at most l differ by at least 1/l², so an
// enclosure of x narrower than 1/(2l²) has at most one of them near it,
// the fraction of denominator ≤ l closest to its midpoint; x equals that
// fraction (a zero test the zero bound decides) or x is irrational.

// RationalValue decides whether the algebraic real x is rational: it
// returns its value and true, or nil and false when x is proved
// irrational. x must be algebraic (built from rationals by + − × ÷,
// integer powers and roots); otherwise, or when the enclosure or the zero
// test needs more than maxPrec bits, the error wraps ErrUndecided.
func (x *Real) RationalValue(maxPrec uint) (*big.Rat, bool, error) {
	if x.exact != nil {
		return new(big.Rat).Set(x.exact), true, nil
	}
	a := x.algebraic()
	if !a.ok {
		return nil, false, fmt.Errorf("rational or not: the value involves a transcendental function or π, so it cannot be decided: %w", ErrUndecided)
	}
	if a.ll >= int64(maxPrec) {
		return nil, false, capError{fmt.Sprintf("rational or not: the denominator bound 2^%d asks for more than the precision cap of %d bits", a.ll, maxPrec)}
	}
	// Absolute width below 2^-(2·ll + 2) < 1/(2l²): Approx is relative above
	// 1, so add the magnitude's bits.
	coarse, err := x.Approx(16, maxPrec)
	if err != nil {
		return nil, false, err
	}
	mag := new(big.Rat).Abs(coarse.Hi)
	if lo := new(big.Rat).Abs(coarse.Lo); lo.Cmp(mag) > 0 {
		mag = lo
	}
	magBits := new(big.Int).Quo(mag.Num(), mag.Denom()).BitLen()
	iv, err := x.Approx(uint(2*a.ll+2+int64(magBits)), maxPrec)
	if err != nil {
		return nil, false, err
	}
	mid := new(big.Rat).Add(iv.Lo, iv.Hi)
	mid.Quo(mid, big.NewRat(2, 1))
	cand := closestFraction(mid, new(big.Int).Lsh(big.NewInt(1), uint(a.ll)))
	s, err := RealSub(x, RealFromRat(cand)).Sign(maxPrec)
	if err != nil {
		return nil, false, err
	}
	if s != 0 {
		return nil, false, nil
	}
	return cand, true, nil
}

// closestFraction returns a fraction with denominator at most n (n ≥ 1)
// closest to m: the last continued-fraction convergent of m whose
// denominator stays within n, or the semiconvergent between it and the
// one before, whichever is nearer (the best approximations of the first
// kind are among these; Khinchin, "Continued Fractions", §6).
func closestFraction(m *big.Rat, n *big.Int) *big.Rat {
	if m.Denom().Cmp(n) <= 0 {
		return new(big.Rat).Set(m)
	}
	p0, q0, p1, q1 := big.NewInt(0), big.NewInt(1), big.NewInt(1), big.NewInt(0)
	num, den := new(big.Int).Set(m.Num()), new(big.Int).Set(m.Denom())
	a, r, t := new(big.Int), new(big.Int), new(big.Int)
	for den.Sign() != 0 {
		a.DivMod(num, den, r) // floor, den > 0
		q2 := new(big.Int).Add(q0, t.Mul(a, q1))
		if q2.Cmp(n) > 0 {
			break
		}
		p2 := new(big.Int).Add(p0, t.Mul(a, p1))
		p0, q0, p1, q1 = p1, q1, p2, q2
		num, den = den, new(big.Int).Set(r)
	}
	// The semiconvergent (p0 + j·p1)/(q0 + j·q1) with the largest j keeping
	// the denominator within n, against the convergent p1/q1.
	j := new(big.Int).Sub(n, q0)
	j.Quo(j, q1)
	semi := new(big.Rat).SetFrac(new(big.Int).Add(p0, t.Mul(j, p1)), new(big.Int).Add(q0, new(big.Int).Mul(j, q1)))
	conv := new(big.Rat).SetFrac(p1, q1)
	d1 := new(big.Rat).Abs(new(big.Rat).Sub(semi, m))
	d2 := new(big.Rat).Abs(new(big.Rat).Sub(conv, m))
	if d1.Cmp(d2) < 0 {
		return semi
	}
	return conv
}

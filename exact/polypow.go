package exact

// Powers of polynomials.

import (
	"fmt"
	"math/big"
)

// Pow returns p^k for k >= 0 (p^0 = 1, also for p = 0). It fails with
// ErrExponentRange if k < 0 or if an exponent of the result would exceed
// MaxExponent (or a constant's power would need more than maxPowBits bits),
// and with ErrTooManyTerms when the result, or a power p^i (i < k) formed
// on the way, would exceed the ring's term cap.
func (p *Poly) Pow(k int) (*Poly, error) {
	switch {
	case k < 0:
		return nil, fmt.Errorf("pow: negative exponent %d: %w", k, ErrExponentRange)
	case k == 0:
		return p.ring.one(), nil
	case k == 1 || p.IsZero() || p.isOne():
		return p, nil
	}
	for v, d := range p.degrees() {
		if d > 0 && k > MaxExponent/d {
			return nil, fmt.Errorf("pow: the exponent of %s would be %d*%d, above %d: %w", p.ring.name(v), d, k, MaxExponent, ErrExponentRange)
		}
	}
	limit := p.ring.MaxTerms()
	switch p.n() {
	case 1:
		b := maxNumBits(p)
		if p.den != nil {
			b = max(b, p.den.BitLen())
		}
		if b > 1 && k > maxPowBits/(b-1) {
			return nil, fmt.Errorf("pow: a coefficient of %d bits to the power %d is too large: %w", b, k, ErrExponentRange)
		}
		m := make([]uint64, p.w)
		for x, y := range p.monoAt(0) {
			m[x] = y * uint64(k)
		}
		kk := big.NewInt(int64(k))
		c := new(big.Int).Exp(p.numAt(0, new(big.Int)), kk, nil)
		bld := newBuilder(p.w)
		bld.pushBigOwned(m, c)
		var den *big.Int
		if p.den != nil {
			den = new(big.Int).Exp(p.den, kk, nil)
		}
		return bld.poly(p.ring, den), nil
	case 2:
		if k+1 > limit {
			return nil, tooManyTerms("pow", limit)
		}
		return p.powBinomial(k), nil
	}
	r := p
	for i := 2; i <= k; i++ {
		var err error
		if r, err = mulPoly(r, p, "pow"); err != nil {
			return nil, err
		}
	}
	return r, nil
}

// maxPowBits bounds the size of a power of a single term.
const maxPowBits = 1 << 26

// powBinomial returns p^k for a binomial p = a*m1 + b*m2 by the binomial
// theorem; the terms a^i b^(k-i) m1^i m2^(k-i) are distinct and decrease
// with i.
func (p *Poly) powBinomial(k int) *Poly {
	w := p.w
	m1, m2 := p.monoAt(0), p.monoAt(1)
	a, b := p.numAt(0, new(big.Int)), p.numAt(1, new(big.Int))
	// pa[i] = a^i
	pa := make([]*big.Int, k+1)
	pa[0] = big.NewInt(1)
	for i := 1; i <= k; i++ {
		pa[i] = new(big.Int).Mul(pa[i-1], a)
	}
	bld := newBuilder(w)
	bld.grow(k + 1)
	m := make([]uint64, w)
	bp := big.NewInt(1) // b^(k-i)
	binom := big.NewInt(1)
	coefs := make([]*big.Int, k+1)
	for i := 0; i <= k; i++ { // i = power of m2's coefficient b
		coefs[k-i] = new(big.Int).Mul(binom, bp)
		coefs[k-i].Mul(coefs[k-i], pa[k-i])
		bp.Mul(bp, b)
		binom.Mul(binom, big.NewInt(int64(k-i)))
		binom.Quo(binom, big.NewInt(int64(i+1)))
	}
	for i := k; i >= 0; i-- {
		for x := range m {
			m[x] = m1[x]*uint64(i) + m2[x]*uint64(k-i)
		}
		bld.pushBigOwned(m, coefs[i])
	}
	var den *big.Int
	if p.den != nil {
		den = new(big.Int).Exp(p.den, big.NewInt(int64(k)), nil)
	}
	return bld.poly(p.ring, den)
}

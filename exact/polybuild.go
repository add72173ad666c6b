package exact

// Building polynomials term by term, and keeping new ones in lowest terms.

import (
	"math"
	"math/big"
	"math/bits"
)

var bigOne = big.NewInt(1)

// orOne returns d, or 1 for nil (a polynomial's denominator).
func orOne(d *big.Int) *big.Int {
	if d == nil {
		return bigOne
	}
	return d
}

// polyBuilder collects terms in decreasing order.
type polyBuilder struct {
	w    int
	mono []uint64
	num  []int64
	bnum []*big.Int
	// ints and words are slabs for the 128-bit coefficients of push128:
	// a dense product's big coefficients cost no allocation each.
	ints  []big.Int
	words []big.Word
}

func newBuilder(w int) *polyBuilder { return &polyBuilder{w: w} }

func (b *polyBuilder) grow(n int) {
	b.mono = make([]uint64, 0, n*b.w)
	b.num = make([]int64, 0, n)
}

func (b *polyBuilder) len() int { return len(b.num) }

// pushSmall appends a term with a nonzero coefficient c.
func (b *polyBuilder) pushSmall(m []uint64, c int64) {
	b.mono = append(b.mono, m...)
	b.num = append(b.num, c)
	if b.bnum != nil {
		b.bnum = append(b.bnum, nil)
	}
}

// pushBig appends a term with a nonzero coefficient c, copying c.
func (b *polyBuilder) pushBig(m []uint64, c *big.Int) {
	if c.IsInt64() {
		b.pushSmall(m, c.Int64())
		return
	}
	b.pushBigOwned(m, new(big.Int).Set(c))
}

// pushTerm appends term i of p with the monomial m in its place.
func (b *polyBuilder) pushTerm(m []uint64, p *Poly, i int) {
	if p.small(i) {
		b.pushSmall(m, p.num[i])
	} else {
		b.pushBig(m, p.bnum[i])
	}
}

// pushBigOwned appends a term whose coefficient c does not fit an int64
// and is not used elsewhere.
func (b *polyBuilder) pushBigOwned(m []uint64, c *big.Int) {
	if c.IsInt64() {
		b.pushSmall(m, c.Int64())
		return
	}
	if b.bnum == nil {
		b.bnum = make([]*big.Int, len(b.num), cap(b.num))
	}
	b.mono = append(b.mono, m...)
	b.num = append(b.num, 0)
	b.bnum = append(b.bnum, c)
}

// push128 appends a term with the nonzero signed 128-bit coefficient hi:lo.
func (b *polyBuilder) push128(m []uint64, hi, lo uint64) {
	if hi == uint64(int64(lo)>>63) {
		b.pushSmall(m, int64(lo))
		return
	}
	b.pushBigOwned(m, b.newInt128(hi, lo))
}

// int128Slab is the number of big.Ints polyBuilder allocates at a time.
const int128Slab = 1024

// newInt128 returns a new big.Int of value hi:lo (signed), from the slabs.
func (b *polyBuilder) newInt128(hi, lo uint64) *big.Int {
	if bits.UintSize != 64 {
		return set128(new(big.Int), hi, lo)
	}
	neg := int64(hi) < 0
	if neg {
		hi, lo = neg128(hi, lo)
	}
	if len(b.ints) == 0 {
		b.ints, b.words = make([]big.Int, int128Slab), make([]big.Word, 2*int128Slab)
	}
	z, w := &b.ints[0], b.words[:2:2]
	b.ints, b.words = b.ints[1:], b.words[2:]
	w[0], w[1] = big.Word(lo), big.Word(hi)
	z.SetBits(w)
	if neg {
		z.Neg(z)
	}
	return z
}

// poly returns the polynomial of the collected terms over the denominator
// den (nil or positive; it is not retained), in lowest terms.
func (b *polyBuilder) poly(r *Ring, den *big.Int) *Poly {
	p := &Poly{ring: r, w: b.w, mono: b.mono, num: b.num, bnum: b.bnum}
	if len(p.num) == 0 {
		p.mono, p.num, p.bnum = nil, nil, nil
		return p
	}
	if den != nil && !(den.IsInt64() && den.Int64() == 1) {
		p.den = new(big.Int).Set(den)
		p.reduce()
	}
	return p
}

// reduce divides the numerators and the denominator of a new polynomial by
// their gcd.
func (p *Poly) reduce() {
	if p.den == nil {
		return
	}
	var g *big.Int
	if p.den.IsUint64() {
		gs := p.den.Uint64()
		t, m := new(big.Int), new(big.Int)
		for i := 0; i < p.n() && gs != 1; i++ {
			if p.small(i) {
				gs = GCDWord(gs, absU64(p.num[i]))
			} else {
				m.SetUint64(gs)
				gs = GCDWord(gs, t.Mod(t.Abs(p.bnum[i]), m).Uint64())
			}
		}
		if gs == 1 {
			return
		}
		g = new(big.Int).SetUint64(gs)
	} else {
		g = new(big.Int).Set(p.den)
		t := new(big.Int)
		for i := 0; i < p.n() && !(g.IsInt64() && g.Int64() == 1); i++ {
			g.GCD(nil, nil, g, p.numAt(i, t))
		}
		if g.IsInt64() && g.Int64() == 1 {
			return
		}
	}
	p.setNumsQuo(p, g)
	p.den.Quo(p.den, g)
	if p.den.IsInt64() && p.den.Int64() == 1 {
		p.den = nil
	}
}

// trimBig drops bnum when no numerator needs it.
func (p *Poly) trimBig() {
	for _, b := range p.bnum {
		if b != nil {
			return
		}
	}
	p.bnum = nil
}

// setBig stores numerator i of a new polynomial, as an int64 if it fits.
func (p *Poly) setBig(i int, z *big.Int) {
	if z.IsInt64() {
		p.num[i] = z.Int64()
		if p.bnum != nil {
			p.bnum[i] = nil
		}
		return
	}
	if p.bnum == nil {
		p.bnum = make([]*big.Int, p.n())
	}
	p.bnum[i] = z
}

// numsQuo returns the integer polynomial whose numerators are those of p
// divided exactly by g (nonzero); p's denominator is dropped.
func (p *Poly) numsQuo(g *big.Int) *Poly {
	out := &Poly{ring: p.ring, w: p.w, mono: p.mono, num: make([]int64, p.n())}
	out.setNumsQuo(p, g)
	return out
}

// setNumsQuo sets the numerators of p, a new polynomial, to those of src
// divided exactly by g (nonzero). p may be src: each numerator is read
// before it is replaced.
func (p *Poly) setNumsQuo(src *Poly, g *big.Int) {
	gs, gSmall := g.Int64(), g.IsInt64()
	t := new(big.Int)
	for i := range src.num {
		if src.small(i) && gSmall && !(gs == -1 && src.num[i] == math.MinInt64) {
			p.num[i] = src.num[i] / gs
			continue
		}
		p.setBig(i, new(big.Int).Quo(src.numAt(i, t), g))
	}
	p.trimBig()
}

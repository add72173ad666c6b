package exact

// Sums, negation and scaling of polynomials.

import (
	"fmt"
	"math"
	"math/big"
)

// Add returns p + q. It panics if q belongs to another ring.
func (p *Poly) Add(q *Poly) *Poly {
	p.mustSameRing(q, "add")
	return addSub(p, q, false)
}

// Sub returns p - q. It panics if q belongs to another ring.
func (p *Poly) Sub(q *Poly) *Poly {
	p.mustSameRing(q, "sub")
	return addSub(p, q, true)
}

func addSub(p, q *Poly, sub bool) *Poly {
	if q.IsZero() {
		return p
	}
	if p.IsZero() {
		if sub {
			return q.Neg()
		}
		return q
	}
	w := max(p.w, q.w)
	pm, qm := p.monoW(w), q.monoW(w)
	// Common denominator L = fp*dp = fq*dq; fp, fq nil for 1.
	var den, fp, fq *big.Int
	switch {
	case p.den == nil && q.den == nil:
	case p.den != nil && q.den != nil && p.den.Cmp(q.den) == 0:
		den = p.den
	default:
		dp, dq := p.denOr1(), q.denOr1()
		g := new(big.Int).GCD(nil, nil, dp, dq)
		fp = new(big.Int).Quo(dq, g)
		fq = new(big.Int).Quo(dp, g)
		den = new(big.Int).Mul(fp, dp)
		if fp.Cmp(bigOne) == 0 {
			fp = nil
		}
		if fq.Cmp(bigOne) == 0 {
			fq = nil
		}
	}
	b := newBuilder(w)
	b.grow(p.n() + q.n())
	var x, y big.Int
	// coef sets z to the scaled numerator and returns it, or reports
	// through ok=false that it is small and returned in s.
	scaled := func(src *Poly, i int, f *big.Int, neg bool, z *big.Int) (s int64, ok bool) {
		if f == nil && src.small(i) {
			s = src.num[i]
			if !neg {
				return s, true
			}
			if s != math.MinInt64 {
				return -s, true
			}
		} else if f != nil && f.IsInt64() && src.small(i) {
			var ov bool
			s, ov = mulOv(src.num[i], f.Int64())
			if !ov && !(neg && s == math.MinInt64) {
				if neg {
					s = -s
				}
				return s, true
			}
		}
		src.numAt(i, z)
		if f != nil {
			z.Mul(z, f)
		}
		if neg {
			z.Neg(z)
		}
		return 0, false
	}
	i, j := 0, 0
	np, nq := p.n(), q.n()
	for i < np && j < nq {
		mi, mj := pm[i*w:(i+1)*w], qm[j*w:(j+1)*w]
		switch monoCmp(mi, mj) {
		case 1:
			if s, ok := scaled(p, i, fp, false, &x); ok {
				b.pushSmall(mi, s)
			} else {
				b.pushBig(mi, &x)
			}
			i++
		case -1:
			if s, ok := scaled(q, j, fq, sub, &y); ok {
				b.pushSmall(mj, s)
			} else {
				b.pushBig(mj, &y)
			}
			j++
		default:
			s1, ok1 := scaled(p, i, fp, false, &x)
			s2, ok2 := scaled(q, j, fq, sub, &y)
			if ok1 && ok2 {
				if s, ov := addOv(s1, s2); !ov {
					if s != 0 {
						b.pushSmall(mi, s)
					}
					i++
					j++
					continue
				}
			}
			if ok1 {
				x.SetInt64(s1)
			}
			if ok2 {
				y.SetInt64(s2)
			}
			x.Add(&x, &y)
			if x.Sign() != 0 {
				b.pushBig(mi, &x)
			}
			i++
			j++
		}
	}
	for ; i < np; i++ {
		mi := pm[i*w : (i+1)*w]
		if s, ok := scaled(p, i, fp, false, &x); ok {
			b.pushSmall(mi, s)
		} else {
			b.pushBig(mi, &x)
		}
	}
	for ; j < nq; j++ {
		mj := qm[j*w : (j+1)*w]
		if s, ok := scaled(q, j, fq, sub, &y); ok {
			b.pushSmall(mj, s)
		} else {
			b.pushBig(mj, &y)
		}
	}
	return b.poly(p.ring, den)
}

// Neg returns -p.
func (p *Poly) Neg() *Poly {
	out := &Poly{ring: p.ring, w: p.w, mono: p.mono, num: make([]int64, p.n()), den: p.den}
	for i, c := range p.num {
		if !p.small(i) {
			out.setBig(i, new(big.Int).Neg(p.bnum[i]))
		} else if c == math.MinInt64 {
			out.setBig(i, new(big.Int).Neg(big.NewInt(c)))
		} else {
			out.num[i] = -c
		}
	}
	return out
}

// Scale returns c*p; a nil c is read as 0.
func (p *Poly) Scale(c *big.Rat) *Poly {
	if c == nil || c.Sign() == 0 || p.IsZero() {
		return p.ring.zero()
	}
	if c.IsInt() && c.Num().IsInt64() && c.Num().Int64() == 1 {
		return p
	}
	return p.scaleFrac(c.Num(), c.Denom())
}

// scaleFrac returns p*n/d for integers n != 0 and d > 0.
func (p *Poly) scaleFrac(n, d *big.Int) *Poly {
	out := &Poly{ring: p.ring, w: p.w, mono: p.mono, num: make([]int64, p.n())}
	z := new(big.Int)
	ns, nSmall := n.Int64(), n.IsInt64()
	for i := range p.num {
		if nSmall && p.small(i) {
			if s, ov := mulOv(p.num[i], ns); !ov {
				out.num[i] = s
				continue
			}
		}
		out.setBig(i, new(big.Int).Mul(p.numAt(i, z), n))
	}
	den := new(big.Int).Mul(p.denOr1(), d)
	if den.Cmp(bigOne) != 0 {
		out.den = den
		out.reduce()
	}
	return out
}

// QuoConst returns p/c, or ErrDivisionByZero if c is zero (or nil).
func (p *Poly) QuoConst(c *big.Rat) (*Poly, error) {
	if c == nil || c.Sign() == 0 {
		return nil, fmt.Errorf("divide polynomial by 0: %w", ErrDivisionByZero)
	}
	n, d := new(big.Int).Set(c.Denom()), new(big.Int).Set(c.Num())
	if d.Sign() < 0 {
		n.Neg(n)
		d.Neg(d)
	}
	if p.IsZero() {
		return p, nil
	}
	return p.scaleFrac(n, d), nil
}

// mulMono returns p times the monomial m (width <= p.w or widened) with
// coefficient c/d (c != 0, d > 0 or nil). The caller has checked the
// exponent range. The order of terms is preserved.
func (p *Poly) mulMono(m []uint64, c *big.Int, d *big.Int) *Poly {
	w := max(p.w, len(m))
	pm := p.monoW(w)
	mono := make([]uint64, len(pm))
	copy(mono, pm)
	for i := 0; i < p.n(); i++ {
		t := mono[i*w : (i+1)*w]
		for k, x := range m {
			t[k] += x
		}
	}
	out := &Poly{ring: p.ring, w: w, mono: mono, num: p.num, bnum: p.bnum, den: p.den}
	if c.IsInt64() && c.Int64() == 1 && d == nil {
		return out
	}
	if d == nil {
		d = bigOne
	}
	return out.scaleFrac(c, d)
}

// sumPolys adds the polynomials pairwise (a balanced tree), failing when a
// partial sum exceeds limit terms.
func sumPolys(ps []*Poly, limit int, op string) (*Poly, error) {
	switch len(ps) {
	case 0:
		panic("exact: sumPolys of nothing")
	case 1:
		return ps[0], nil
	}
	for len(ps) > 1 {
		next := ps[:0:0]
		for i := 0; i+1 < len(ps); i += 2 {
			s := addSub(ps[i], ps[i+1], false)
			if s.n() > limit {
				return nil, tooManyTerms(op, limit)
			}
			next = append(next, s)
		}
		if len(ps)%2 == 1 {
			next = append(next, ps[len(ps)-1])
		}
		ps = next
	}
	return ps[0], nil
}

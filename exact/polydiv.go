package exact

import (
	"fmt"
	"math/big"
	"math/bits"
)

// Division of polynomials.

// monoDivides reports whether the monomial d divides m (d no wider than m
// or with zero extra words).
func monoDivides(m, d []uint64) bool {
	for k := 1; k < len(d); k++ {
		x := d[k]
		if x == 0 {
			continue
		}
		if k >= len(m) {
			return false
		}
		y := m[k]
		for f := 0; f < perWord; f++ {
			sh := topShift - expBits*f
			if x>>sh&expMask > y>>sh&expMask {
				return false
			}
		}
	}
	return true
}

// monoQuo returns m/d (d divides m) with width max(len(m), len(d)).
func monoQuo(m, d []uint64) []uint64 {
	out := make([]uint64, max(len(m), len(d)))
	copy(out, m)
	for k, x := range d {
		out[k] -= x
	}
	return out
}

// DivExact returns p/q and true when q divides p in Q[vars], and nil,
// false when it does not. A zero q gives ErrDivisionByZero, a q of another
// ring ErrRingMismatch. The quotient is found by Johnson's heap division
// on Kronecker keys over the integers (Gauss's lemma: dividing by the
// primitive part of q keeps the quotient integral), giving up at the first
// leading term that cannot be divided.
func (p *Poly) DivExact(q *Poly) (*Poly, bool, error) {
	if err := p.sameRing(q, "divide"); err != nil {
		return nil, false, err
	}
	if q.IsZero() {
		return nil, false, fmt.Errorf("divide polynomial by 0: %w", ErrDivisionByZero)
	}
	if p.IsZero() {
		return p, true, nil
	}
	if c, ok := q.Constant(); ok {
		r, err := p.QuoConst(c)
		return r, err == nil, err
	}
	dp, dq := p.degrees(), q.degrees()
	for v, d := range dq {
		if d > at(dp, v) {
			return nil, false, nil
		}
	}
	if q.Degree() > p.Degree() || !monoDivides(p.monoAt(0), q.monoAt(0)) ||
		!monoDivides(p.monoAt(p.n()-1), q.monoAt(q.n()-1)) {
		return nil, false, nil
	}
	if q.n() == 1 {
		return p.divMono(q), true, nil
	}
	var vars []int
	for v, d := range dp {
		if d > 0 {
			vars = append(vars, v)
		}
	}
	sp, sq := p.stats(vars), q.stats(vars)
	if sq.minT > sp.minT || sq.maxT-sq.minT > sp.maxT-sp.minT {
		return nil, false, nil
	}
	for d := range vars {
		if sq.minE[d] > sp.minE[d] || sq.maxE[d]-sq.minE[d] > sp.maxE[d]-sp.minE[d] {
			return nil, false, nil
		}
	}
	radix := make([]uint64, len(vars))
	radix[0] = uint64(sp.maxT - sp.minT + 1)
	for d := 1; d < len(vars); d++ {
		radix[d] = uint64(sp.maxE[d-1] - sp.minE[d-1] + 1)
	}
	k, ok := newKron(vars, radix)
	if !ok {
		quo, rem, err := p.Divide(q)
		if err != nil || !rem.IsZero() {
			return nil, false, err
		}
		return quo, true, nil
	}
	// q = cq * qp / dq with qp primitive, positive leading coefficient.
	cq := q.numContent()
	qp := q
	if !(cq.IsInt64() && cq.Int64() == 1) || q.den != nil {
		qp = &Poly{ring: q.ring, w: q.w, mono: q.mono, num: make([]int64, q.n())}
		qp.divNumsFrom(q, cq)
	}
	var s *Poly
	var err error
	done := false
	if divAlgo != algoHeap && (divAlgo == algoDense || k.size <= 32*uint64(p.n())) {
		s, ok, done, err = divDense(p, qp, k, sp, sq)
		if err != nil {
			return nil, false, err
		}
	}
	if !done {
		if s, ok, err = divHeap(p, qp, k, sp, sq); err != nil {
			return nil, false, err
		}
	}
	if !ok {
		return nil, false, nil
	}
	// s = (P/qp)/dp, so p/q = (P/dp) / (cq*qp/dq) = s * dq / cq.
	n := new(big.Int).Set(q.denOr1())
	d := new(big.Int).Set(cq)
	if d.Sign() < 0 {
		d.Neg(d)
		n.Neg(n)
	}
	if n.Cmp(bigOne) == 0 && d.Cmp(bigOne) == 0 {
		return s, true, nil
	}
	return s.scaleFrac(n, d), true, nil
}

// numContent returns the gcd of the numerators, with the sign of the
// leading one.
func (p *Poly) numContent() *big.Int {
	g := new(big.Int)
	if p.bnum == nil {
		var gs uint64
		for _, x := range p.num {
			if gs = gcdU64(gs, absU64(x)); gs == 1 {
				break
			}
		}
		g.SetUint64(gs)
	} else {
		t := new(big.Int)
		for i := 0; i < p.n(); i++ {
			if g.GCD(nil, nil, g, p.numAt(i, t).Abs(t)); g.Cmp(bigOne) == 0 {
				break
			}
		}
	}
	if p.numSign(0) < 0 {
		g.Neg(g)
	}
	return g
}

// divNumsFrom sets the numerators of the new polynomial p to those of src
// divided exactly by g (nonzero).
func (p *Poly) divNumsFrom(src *Poly, g *big.Int) {
	gs, gSmall := g.Int64(), g.IsInt64()
	t := new(big.Int)
	for i := range src.num {
		if src.small(i) && gSmall && !(gs == -1 && src.num[i] == -1<<63) {
			p.num[i] = src.num[i] / gs
			continue
		}
		p.setBig(i, new(big.Int).Quo(src.numAt(i, t), g))
	}
	p.trimBig()
}

// divMono divides p by the single term q, which divides it.
func (p *Poly) divMono(q *Poly) *Poly {
	d := q.monoAt(0)
	w := max(p.w, q.w)
	mono := make([]uint64, 0, p.n()*w)
	for i := 0; i < p.n(); i++ {
		mono = append(mono, monoQuo(p.monoAt(i), d)...)
	}
	out := &Poly{ring: p.ring, w: w, mono: mono, num: p.num, bnum: p.bnum, den: p.den}
	c := q.coefAt(0)
	c.Inv(c)
	return out.Scale(c)
}

// divAlgo forces the exact division strategy (tests and benchmarks):
// algoDense or algoHeap; algoAuto chooses by the size of the key box.
var divAlgo = algoAuto

// divLayout holds what both exact division strategies need to check a new
// quotient term and to decode the quotient.
type divLayout struct {
	k        *kron
	sp, sq   monoStats
	lq, room []int
	digits   []int
	limit    int
	p, q     *Poly
	kp, kq   []uint64
	lc       *big.Int
	lcOne    bool
}

func newDivLayout(p, q *Poly, k *kron, sp, sq monoStats) *divLayout {
	nv := len(k.vars)
	d := &divLayout{k: k, sp: sp, sq: sq, lq: make([]int, nv+1), room: make([]int, nv+1),
		digits: make([]int, nv+1), limit: p.ring.MaxTerms(), p: p, q: q,
		kp: k.encode(p, sp), kq: k.encode(q, sq), lc: q.numAt(0, new(big.Int))}
	d.lcOne = d.lc.Cmp(bigOne) == 0
	// Relative digits of q's leading monomial; the range left for the
	// quotient in each digit (total degree, then every variable).
	d.lq[0] = int(q.mono[0]) - sq.minT
	d.room[0] = (sp.maxT - sp.minT) - (sq.maxT - sq.minT)
	for i, v := range k.vars {
		d.lq[i+1] = monoExp(q.monoAt(0), v) - sq.minE[i]
		d.room[i+1] = (sp.maxE[i] - sp.minE[i]) - (sq.maxE[i] - sq.minE[i])
	}
	return d
}

// fits reports whether key (relative to p's minima) divided by q's leading
// monomial gives a monomial that can occur in an exact quotient.
func (d *divLayout) fits(key uint64) bool {
	k, nv := d.k, len(d.k.vars)
	t := key / k.stride[0]
	key -= t * k.stride[0]
	d.digits[0] = int(t)
	rest := int(t) + d.sp.minT
	for i := 1; i < len(k.stride); i++ {
		e := key / k.stride[i]
		key -= e * k.stride[i]
		d.digits[i] = int(e)
		rest -= int(e) + d.sp.minE[i-1]
	}
	d.digits[nv] = rest - d.sp.minE[nv-1]
	for i, x := range d.digits {
		if x -= d.lq[i]; x < 0 || x > d.room[i] {
			return false
		}
	}
	return true
}

// quotient decodes the quotient's keys (offsets p's minima minus q's) into
// s, which holds its coefficients, and gives it p's denominator.
func (d *divLayout) quotient(s *Poly, ks []uint64) *Poly {
	offE := make([]int, len(d.k.vars))
	for i := range offE {
		offE[i] = d.sp.minE[i] - d.sq.minE[i]
	}
	w := max(d.p.w, d.q.w)
	s.w = w
	s.mono = make([]uint64, len(ks)*w)
	for i, key := range ks {
		d.k.decode(key, d.sp.minT-d.sq.minT, offE, s.mono[i*w:(i+1)*w])
	}
	s.trimBig()
	if d.p.den != nil {
		s.den = new(big.Int).Set(d.p.den)
		s.reduce()
	}
	return s
}

// divDense is exact division by long division in key space, chunk by
// chunk from the top like mulDense128: quotient terms become rows as they
// are found, and each row adds its products with q's terms (all but the
// leading one) to the chunks below. It works with signed 128-bit
// accumulators and int64 quotient coefficients, and returns done = false
// (the caller then uses divHeap) as soon as a value might not fit: p's
// numerators must fit 125 bits, q's int64, and every quotient coefficient
// s must keep |p| + m*|s|*max|q| below 2^127.
func divDense(p, q *Poly, k *kron, sp, sq monoStats) (s *Poly, ok, done bool, err error) {
	if q.bnum != nil {
		return nil, false, false, nil
	}
	d := newDivLayout(p, q, k, sp, sq)
	kp, kq := d.kp, d.kq
	m := len(kq)
	// Budget for quotient coefficients.
	pBits := maxNumBits(p)
	if pBits > 125 {
		return nil, false, false, nil
	}
	sBudget := 126 - maxBits(q.num) - bits.Len(uint(m))
	lc := q.num[0]
	s = &Poly{ring: p.ring}
	var ks []uint64
	var start []int
	chunk := min(denseChunk, kp[0]-kp[len(kp)-1]+1)
	acc := make([]uint64, 2*chunk)
	pi, iLo := 0, 0
	var z, r big.Int
	for hi := kp[0]; ; {
		bottom := kp[len(kp)-1]
		if len(ks) > 0 {
			bottom = min(bottom, ks[len(ks)-1]+kq[m-1])
		}
		lo := bottom
		if hi-bottom >= chunk {
			lo = hi - (chunk - 1)
		}
		// p's terms in [lo, hi].
		for ; pi < len(kp) && kp[pi] >= lo; pi++ {
			x := 2 * (kp[pi] - lo)
			if p.small(pi) {
				acc[x], acc[x+1] = uint64(p.num[pi]), uint64(p.num[pi]>>63)
			} else {
				acc[x+1], acc[x] = words128(p.bnum[pi])
			}
		}
		// Rows found in earlier chunks.
		for iLo < len(ks) && start[iLo] == m {
			iLo++
		}
		for i := iLo; i < len(ks); i++ {
			if m < 2 || ks[i]+kq[1] < lo {
				break
			}
			start[i] = subRow(acc, lo, ks[i], s.num[i], kq, q.num, start[i])
		}
		// Keys of this chunk from the top: each nonzero value starts a row.
		for x := int(hi - lo); x >= 0; x-- {
			l, h := acc[2*x], acc[2*x+1]
			if l|h == 0 {
				continue
			}
			acc[2*x], acc[2*x+1] = 0, 0
			key := lo + uint64(x)
			if !d.fits(key) {
				return nil, false, true, nil
			}
			if len(ks) >= d.limit {
				return nil, false, true, tooManyTerms("divide", d.limit)
			}
			var c int64
			if h == uint64(int64(l)>>63) {
				v := int64(l)
				if v%lc != 0 {
					return nil, false, true, nil
				}
				if v == -1<<63 && lc == -1 {
					return nil, false, false, nil
				}
				c = v / lc
			} else {
				z.QuoRem(set128(&z, h, l), big.NewInt(lc), &r)
				if r.Sign() != 0 {
					return nil, false, true, nil
				}
				if !z.IsInt64() {
					return nil, false, false, nil
				}
				c = z.Int64()
			}
			if bits.Len64(absU64(c)) > sBudget {
				return nil, false, false, nil
			}
			ks = append(ks, key-kq[0])
			s.num = append(s.num, c)
			start = append(start, 1)
			if m > 1 && ks[len(ks)-1]+kq[1] >= lo {
				start[len(ks)-1] = subRow(acc, lo, ks[len(ks)-1], c, kq, q.num, 1)
			}
		}
		if lo == bottom {
			// Everything below has been added: recompute the bottom with
			// the rows found in this chunk, and stop if nothing is left.
			nb := kp[len(kp)-1]
			if len(ks) > 0 {
				nb = min(nb, ks[len(ks)-1]+kq[m-1])
			}
			if nb >= lo || lo == 0 {
				return d.quotient(s, ks), true, true, nil
			}
		}
		hi = lo - 1
	}
}

// subRow subtracts c*q_j at key kr+kq[j] - lo from the chunk acc for
// j = from, from+1, ... while the key is in the chunk, and returns the
// first j left for lower chunks.
func subRow(acc []uint64, lo, kr uint64, c int64, kq []uint64, qn []int64, from int) int {
	uc, sc := uint64(c), uint64(c>>63)
	base := int64(kr) - int64(lo)
	j := from
	for ; j < len(kq); j++ {
		idx := base + int64(kq[j])
		if idx < 0 {
			break
		}
		b := qn[j]
		ph, pl := bits.Mul64(uc, uint64(b))
		ph -= sc&uint64(b) + uint64(b>>63)&uc
		s := acc[2*idx : 2*idx+2 : 2*idx+2]
		var borrow uint64
		s[0], borrow = bits.Sub64(s[0], pl, 0)
		s[1] -= ph + borrow
	}
	return j
}

// words128 returns the two's complement words of x, |x| < 2^127.
func words128(x *big.Int) (hi, lo uint64) {
	var a, t big.Int
	a.Abs(x)
	lo = t.And(&a, new(big.Int).SetUint64(^uint64(0))).Uint64()
	hi = t.Rsh(&a, 64).Uint64()
	if x.Sign() < 0 {
		lo = -lo
		hi = ^hi
		if lo == 0 {
			hi++
		}
	}
	return hi, lo
}

// divHeap divides the integer numerators of p by the integer polynomial q
// (primitive, positive leading coefficient) by Johnson's heap division,
// and returns the quotient with p's denominator, or false when q does not
// divide them over Z.
func divHeap(p, q *Poly, k *kron, sp, sq monoStats) (*Poly, bool, error) {
	d := newDivLayout(p, q, k, sp, sq)
	kp, kq := d.kp, d.kq
	s := &Poly{ring: p.ring}
	var ks []uint64
	m := q.n()
	h := make(keyHeap, 0, 16)
	var a accum
	var z, r big.Int
	pi := 0
	for pi < p.n() || len(h) > 0 {
		var key uint64
		switch {
		case len(h) == 0:
			key = kp[pi]
		case pi == p.n():
			key = h[0].key
		default:
			key = max(kp[pi], h[0].key)
		}
		a.reset()
		for len(h) > 0 && h[0].key == key {
			e := h.pop()
			i, j := int(e.i), int(e.j)
			a.addMul(s, i, q, j, true)
			if j+1 < m {
				h.push(heapEnt{key: ks[i] + kq[j+1], i: e.i, j: e.j + 1})
			}
		}
		if pi < p.n() && kp[pi] == key {
			if p.small(pi) {
				a.add128(uint64(p.num[pi]>>63), uint64(p.num[pi]))
			} else {
				a.addBig(p.bnum[pi])
			}
			pi++
		}
		if a.isZero() {
			continue
		}
		if !d.fits(key) {
			return nil, false, nil
		}
		if s.n() >= d.limit {
			return nil, false, tooManyTerms("divide", d.limit)
		}
		// The quotient coefficient a/lc must be an integer.
		if v, ok := a.int64Value(); ok && (d.lcOne || d.lc.IsInt64()) && !(v == -1<<63 && d.lc.Int64() == -1) {
			if !d.lcOne {
				l := d.lc.Int64()
				if v%l != 0 {
					return nil, false, nil
				}
				v /= l
			}
			s.num = append(s.num, v)
			if s.bnum != nil {
				s.bnum = append(s.bnum, nil)
			}
		} else {
			z.QuoRem(a.bigValue(&z), d.lc, &r)
			if r.Sign() != 0 {
				return nil, false, nil
			}
			if s.bnum == nil {
				s.bnum = make([]*big.Int, len(s.num), cap(s.num))
			}
			s.num = append(s.num, 0)
			s.bnum = append(s.bnum, nil)
			s.setBig(s.n()-1, new(big.Int).Set(&z))
		}
		ks = append(ks, key-kq[0])
		if m > 1 {
			h.push(heapEnt{key: ks[len(ks)-1] + kq[1], i: int32(len(ks) - 1), j: 1})
		}
	}
	return d.quotient(s, ks), true, nil
}

// Divide divides p by q with remainder: p = quo*q + rem where no term of
// rem is divisible by the leading monomial of q (in the canonical graded
// lexicographic order). This is the multivariate division algorithm with
// the single divisor q; since {q} is a Gröbner basis of the ideal (q), rem
// is the normal form of p modulo q, and rem == 0 exactly when q divides p.
// For univariate polynomials it is the usual Euclidean division. A zero q
// gives ErrDivisionByZero. The algorithm subtracts multiples of q term by
// term (quadratic in the number of terms); DivExact is faster when only
// exact quotients matter.
func (p *Poly) Divide(q *Poly) (quo, rem *Poly, err error) {
	if err := p.sameRing(q, "divide"); err != nil {
		return nil, nil, err
	}
	if q.IsZero() {
		return nil, nil, fmt.Errorf("divide polynomial by 0: %w", ErrDivisionByZero)
	}
	if c, ok := q.Constant(); ok {
		quo, err := p.QuoConst(c)
		return quo, p.ring.zero(), err
	}
	limit := p.ring.MaxTerms()
	lm := q.monoAt(0)
	lc := q.coefAt(0)
	w := max(p.w, q.w)
	var qt, rt ratTerms
	r := p
	for !r.IsZero() {
		m := r.monoAt(0)
		c := r.coefAt(0)
		if monoDivides(m, lm) {
			t := monoQuo(m, lm)
			c.Quo(c, lc)
			qt.push(t, c)
			r = addSub(r, q.mulMono(t, c.Num(), c.Denom()), true)
		} else {
			rt.push(m, c)
			r = r.rest()
		}
		if qt.len()+r.n() > 2*limit+q.n() || rt.len() > limit {
			return nil, nil, tooManyTerms("divide", limit)
		}
	}
	return qt.poly(p.ring, w), rt.poly(p.ring, w), nil
}

// rest returns p without its first term (for internal use: the result may
// not be in lowest terms).
func (p *Poly) rest() *Poly {
	out := &Poly{ring: p.ring, w: p.w, mono: p.mono[p.w:], num: p.num[1:], den: p.den}
	if p.bnum != nil {
		out.bnum = p.bnum[1:]
	}
	return out
}

// ratTerms collects terms with rational coefficients in decreasing order.
type ratTerms struct {
	mono [][]uint64
	coef []*big.Rat
}

func (t *ratTerms) len() int { return len(t.coef) }

func (t *ratTerms) push(m []uint64, c *big.Rat) {
	t.mono = append(t.mono, append([]uint64(nil), m...))
	t.coef = append(t.coef, c)
}

// poly builds the polynomial of the (nonzero, decreasing) terms with at
// least w words per monomial.
func (t *ratTerms) poly(r *Ring, w int) *Poly {
	for _, m := range t.mono {
		w = max(w, len(m))
	}
	den := big.NewInt(1)
	g := new(big.Int)
	for _, c := range t.coef {
		if !c.IsInt() {
			g.GCD(nil, nil, den, c.Denom())
			den.Mul(den, g.Quo(c.Denom(), g))
		}
	}
	b := newBuilder(w)
	b.grow(len(t.coef))
	m := make([]uint64, w)
	z := new(big.Int)
	for i, c := range t.coef {
		clear(m)
		copy(m, t.mono[i])
		z.Quo(den, c.Denom())
		z.Mul(z, c.Num())
		b.pushBig(m, z)
	}
	return b.poly(r, den)
}

package exact

// Exact division: DivExact by long division on Kronecker keys, dense
// chunk by chunk or with a heap.

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"
)

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
		qp = q.numsQuo(cq)
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
// chunk from the top like mulDense: quotient terms become rows as they
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
			start[i] = addRow128(acc, lo, ks[i], -s.num[i], kq, q.num, start[i])
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
			// The rows are subtracted as rows of -c, which must fit too.
			if bits.Len64(absU64(c)) > sBudget || c == math.MinInt64 {
				return nil, false, false, nil
			}
			ks = append(ks, key-kq[0])
			s.num = append(s.num, c)
			start = append(start, 1)
			if m > 1 && ks[len(ks)-1]+kq[1] >= lo {
				start[len(ks)-1] = addRow128(acc, lo, ks[len(ks)-1], -c, kq, q.num, 1)
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
		h.popKey(key, &a, s, ks, q, kq, false, true)
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

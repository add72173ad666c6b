package exact

// Kronecker keys: monomials re-encoded as single uint64 keys that add when
// monomials multiply and whose order is the term order (see polymul.go),
// the decoding of product keys into a builder, and the max-heap of keys
// that the heap product and the heap division merge with.

import "math/bits"

// monoStats holds the range of the total degree and of the exponents of
// some variables over the terms of a polynomial.
type monoStats struct {
	minT, maxT int
	minE, maxE []int
}

// stats returns the ranges of p's total degree and of its exponents of vars.
func (p *Poly) stats(vars []int) monoStats {
	s := monoStats{minT: int(p.mono[(p.n()-1)*p.w]), maxT: int(p.mono[0]),
		minE: make([]int, len(vars)), maxE: make([]int, len(vars))}
	for d := range vars {
		s.minE[d] = MaxExponent + 1
	}
	for i := 0; i < p.n(); i++ {
		m := p.monoAt(i)
		for d, v := range vars {
			e := monoExp(m, v)
			s.minE[d] = min(s.minE[d], e)
			s.maxE[d] = max(s.maxE[d], e)
		}
	}
	return s
}

// kron is a graded Kronecker layout: digit 0 is the total degree, digit
// d >= 1 the exponent of vars[d-1]; the last variable is implied.
type kron struct {
	vars   []int
	stride []uint64
	size   uint64
}

const maxKronSize = 1 << 62

func newKron(vars []int, radix []uint64) (*kron, bool) {
	stride := make([]uint64, len(radix))
	s := uint64(1)
	for d := len(radix) - 1; d >= 0; d-- {
		stride[d] = s
		hi, lo := bits.Mul64(s, radix[d])
		if hi != 0 || lo > maxKronSize {
			return nil, false
		}
		s = lo
	}
	return &kron{vars: vars, stride: stride, size: s}, true
}

// encode returns the keys of p's monomials relative to the minima in s.
func (k *kron) encode(p *Poly, s monoStats) []uint64 {
	keys := make([]uint64, p.n())
	for i := range keys {
		m := p.monoAt(i)
		key := (m[0] - uint64(s.minT)) * k.stride[0]
		for d := 1; d < len(k.stride); d++ {
			key += uint64(monoExp(m, k.vars[d-1])-s.minE[d-1]) * k.stride[d]
		}
		keys[i] = key
	}
	return keys
}

// decode writes the monomial of key (offsets offT, offE) into m.
func (k *kron) decode(key uint64, offT int, offE []int, m []uint64) {
	clear(m)
	t := key / k.stride[0]
	key -= t * k.stride[0]
	tot := int(t) + offT
	m[0] = uint64(tot)
	rest := tot
	for d := 1; d < len(k.stride); d++ {
		e := key / k.stride[d]
		key -= e * k.stride[d]
		ev := int(e) + offE[d-1]
		rest -= ev
		v := k.vars[d-1]
		m[1+v/perWord] |= uint64(ev) << (topShift - expBits*(v%perWord))
	}
	v := k.vars[len(k.vars)-1]
	m[1+v/perWord] |= uint64(rest) << (topShift - expBits*(v%perWord))
}

// kronOut decodes product terms, in decreasing key order, into a builder,
// enforcing the term cap.
type kronOut struct {
	k     *kron
	offT  int
	offE  []int
	b     *polyBuilder
	m     []uint64
	limit int
	op    string
}

func (o *kronOut) full() error {
	if o.b.len() >= o.limit {
		return tooManyTerms(o.op, o.limit)
	}
	return nil
}

func (o *kronOut) small(key uint64, c int64) error {
	if err := o.full(); err != nil {
		return err
	}
	o.k.decode(key, o.offT, o.offE, o.m)
	o.b.pushSmall(o.m, c)
	return nil
}

func (o *kronOut) wide(key uint64, hi, lo uint64) error {
	if err := o.full(); err != nil {
		return err
	}
	o.k.decode(key, o.offT, o.offE, o.m)
	o.b.push128(o.m, hi, lo)
	return nil
}

func (o *kronOut) acc(key uint64, a *accum) error {
	if err := o.full(); err != nil {
		return err
	}
	o.k.decode(key, o.offT, o.offE, o.m)
	if a.isBig {
		o.b.pushBig(o.m, &a.z)
	} else {
		o.b.push128(o.m, a.hi, a.lo)
	}
	return nil
}

// heapEnt is the product of term i of one operand and term j of the other,
// at key.
type heapEnt struct {
	key  uint64
	i, j int32
}

// keyHeap is a max-heap of entries by key.
type keyHeap []heapEnt

// push adds e.
func (h *keyHeap) push(e heapEnt) {
	s := append(*h, e)
	k := len(s) - 1
	for k > 0 {
		p := (k - 1) / 2
		if s[p].key >= e.key {
			break
		}
		s[k] = s[p]
		k = p
	}
	s[k] = e
	*h = s
}

// pop removes and returns the entry with the largest key.
func (h *keyHeap) pop() heapEnt {
	s := *h
	top := s[0]
	s[0] = s[len(s)-1]
	s = s[:len(s)-1]
	s.siftDown(0)
	*h = s
	return top
}

// siftDown moves entry k down to its place (after its key decreased).
func (h keyHeap) siftDown(k int) {
	n := len(h)
	if k >= n {
		return
	}
	e := h[k]
	for {
		c := 2*k + 1
		if c >= n {
			break
		}
		if c+1 < n && h[c+1].key > h[c].key {
			c++
		}
		if e.key >= h[c].key {
			break
		}
		h[k] = h[c]
		k = c
	}
	h[k] = e
}

// popKey pops the entries with the given key, which must be the top one,
// and adds to a the products they stand for: entry (i, j) is numerator i
// of rows times numerator j of cols, subtracted with neg. Each entry is
// replaced by the next in its row, at key kr[i]+kc[j+1]; with chain, the
// first entry of a row also starts the next row, so that rows enter the
// heap only when they can reach its top (Monagan and Pearce).
func (h *keyHeap) popKey(key uint64, a *accum, rows *Poly, kr []uint64, cols *Poly, kc []uint64, chain, neg bool) {
	for len(*h) > 0 && (*h)[0].key == key {
		e := h.pop()
		i, j := int(e.i), int(e.j)
		a.addMul(rows, i, cols, j, neg)
		if j+1 < len(kc) {
			h.push(heapEnt{key: kr[i] + kc[j+1], i: e.i, j: e.j + 1})
		}
		if chain && j == 0 && i+1 < len(kr) {
			h.push(heapEnt{key: kr[i+1] + kc[0], i: e.i + 1})
		}
	}
}

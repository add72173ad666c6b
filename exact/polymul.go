package exact

import (
	"fmt"
	"math/big"
	"math/bits"
	"slices"
)

// Polynomial multiplication.
//
// Monomials of both factors are re-encoded as single uint64 keys by a graded
// Kronecker substitution: the digits of a key are, from the most
// significant, the total degree and the exponents of the occurring variables
// except the last (which the total degree determines), each shifted by its
// minimum over the factor and with a radix large enough for the product.
// Keys add when monomials multiply, and key order is the canonical order.
// When the product's box does not fit in 62 bits, mulSplit multiplies term
// by term and merges (slow but general).
//
// The coefficients are multiplied with int64 accumulators when
// bits(max|a|) + bits(max|b|) + bits(min(n, m)) <= 62, with signed 128-bit
// accumulators when that sum is <= 126, and otherwise with math/big.
//
// Accumulation strategy, chosen by mulAlgorithm; see BenchmarkMulAlgorithms.

// mulAlgo forces an accumulation strategy (tests and benchmarks).
var mulAlgo = algoAuto

const (
	algoAuto = iota
	algoDense
	algoHash
	algoHeap
	algoSplit
)

// Mul returns p*q. It fails with ErrTooManyTerms if the product would have
// more terms than the ring's cap (or if forming it meets more than twice
// that many distinct monomials), with ErrExponentRange if an exponent
// would exceed MaxExponent, and with ErrRingMismatch if q belongs to
// another ring.
func (p *Poly) Mul(q *Poly) (*Poly, error) {
	if err := p.sameRing(q, "mul"); err != nil {
		return nil, err
	}
	return mulPoly(p, q, "mul")
}

func mulPoly(p, q *Poly, op string) (*Poly, error) {
	if p.IsZero() || q.IsZero() {
		return p.ring.zero(), nil
	}
	if p.n() < q.n() {
		p, q = q, p
	}
	limit := p.ring.MaxTerms()
	dp, dq := p.degrees(), q.degrees()
	nv := max(len(dp), len(dq))
	var vars []int
	for v := 0; v < nv; v++ {
		a, b := at(dp, v), at(dq, v)
		if a+b > MaxExponent {
			return nil, fmt.Errorf("%s: the exponent of %s would be %d, above %d: %w", op, p.ring.name(v), a+b, MaxExponent, ErrExponentRange)
		}
		if a+b > 0 {
			vars = append(vars, v)
		}
	}
	if q.n() == 1 {
		if p.n() > limit {
			return nil, tooManyTerms(op, limit)
		}
		return p.mulMono(q.monoAt(0), q.numAt(0, new(big.Int)), q.den), nil
	}
	var den *big.Int
	if p.den != nil || q.den != nil {
		den = new(big.Int).Mul(p.denOr1(), q.denOr1())
	}
	w := max(p.w, q.w)
	sp, sq := p.stats(vars), q.stats(vars)
	radix := make([]uint64, len(vars))
	radix[0] = uint64(sp.maxT + sq.maxT - sp.minT - sq.minT + 1)
	for d := 1; d < len(vars); d++ {
		radix[d] = uint64(sp.maxE[d-1] + sq.maxE[d-1] - sp.minE[d-1] - sq.minE[d-1] + 1)
	}
	k, ok := newKron(vars, radix)
	algo := mulAlgo
	if !ok || algo == algoSplit {
		return mulSplit(p, q, limit, op)
	}
	kp, kq := k.encode(p, sp), k.encode(q, sq)
	out := &kronOut{k: k, offT: sp.minT + sq.minT, offE: make([]int, len(vars)), b: newBuilder(w),
		m: make([]uint64, w), limit: limit, op: op}
	for d := range vars {
		out.offE[d] = sp.minE[d] + sq.minE[d]
	}
	mode := coefMode(p, q)
	if algo == algoAuto {
		algo = mulAlgorithm(kp, kq, k.size, mode)
	}
	if mode == modeBig && (algo == algoDense || algo == algoHash) {
		algo = algoHeap
	}
	var err error
	switch algo {
	case algoSplit:
		return mulSplit(p, q, limit, op)
	case algoDense:
		if mode == mode64 {
			err = mulDense64(kp, p.num, kq, q.num, out)
		} else {
			err = mulDense128(kp, p.num, kq, q.num, out)
		}
	case algoHash:
		if mode == mode64 {
			err = mulHash64(kp, p.num, kq, q.num, out)
		} else {
			err = mulHash128(kp, p.num, kq, q.num, out)
		}
	default:
		err = mulHeap(kp, p, kq, q, out)
	}
	if err != nil {
		return nil, err
	}
	return out.b.poly(p.ring, den), nil
}

// mulAlgorithm picks the accumulation for the product of the keys kp and
// kq (len(kp) >= len(kq)) into a box of the given size: dense chunks when
// the box is at most twice the number of term products; else merging
// shifted copies when the shorter factor has at most splitMax terms; else
// a hash table when a sample of rows shows that products collapse onto
// fewer monomials (at least 1.5 products per monomial); else the heap.
// Big coefficients never use dense chunks or the hash table.
func mulAlgorithm(kp, kq []uint64, size uint64, mode int) int {
	n, m := uint64(len(kp)), uint64(len(kq))
	hi, work := bits.Mul64(n, m)
	switch {
	case mode != modeBig && hi == 0 && size <= 2*work:
		return algoDense
	case m <= splitMax:
		return algoSplit
	case mode == modeBig || hi == 0 && work <= 1<<12:
		return algoHeap
	}
	const rows = 64
	s := min(n, rows)
	seen := make(map[uint64]struct{}, int(s*m))
	for r := uint64(0); r < s; r++ {
		ki := kp[r*n/s]
		for _, kj := range kq {
			seen[ki+kj] = struct{}{}
		}
	}
	if 2*s*m >= 3*uint64(len(seen)) {
		return algoHash
	}
	return algoHeap
}

func at(d []int, v int) int {
	if v < len(d) {
		return d[v]
	}
	return 0
}

// monoStats holds the range of the total degree and of the exponents of
// some variables over the terms of a polynomial.
type monoStats struct {
	minT, maxT int
	minE, maxE []int
}

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

const (
	mode64 = iota
	mode128
	modeBig
)

// coefMode chooses the accumulator width for p*q (see the top of the file).
func coefMode(p, q *Poly) int {
	if p.bnum != nil || q.bnum != nil {
		return modeBig
	}
	b := maxBits(p.num) + maxBits(q.num) + bits.Len(uint(min(p.n(), q.n())))
	switch {
	case b <= 62:
		return mode64
	case b <= 126:
		return mode128
	}
	return modeBig
}

func maxBits(xs []int64) int {
	var or uint64
	for _, x := range xs {
		or |= absU64(x)
	}
	return bits.Len64(or)
}

const denseChunk = 1 << 15

// splitMax is the largest shorter factor for which mulSplit beats the
// heap (BenchmarkMulAlgorithms: cm20000xquadratic, 120 terms, 224 ms
// against 291 ms; sparse6, 462 terms, 20 ms against 12 ms).
const splitMax = 128

// mulDense64 accumulates the products chunk by chunk of the key range in a
// dense array, from the top; start[i] is the first column of row i not yet
// added. Keys are in decreasing order.
func mulDense64(kp []uint64, cp []int64, kq []uint64, cq []int64, out *kronOut) error {
	n, m := len(kp), len(kq)
	kmax, kmin := kp[0]+kq[0], kp[n-1]+kq[m-1]
	acc := make([]int64, min(denseChunk, kmax-kmin+1))
	start := make([]int, n)
	iLo := 0
	for hi := kmax; ; {
		lo := kmin
		if hi-kmin >= denseChunk {
			lo = hi - (denseChunk - 1)
		}
		for iLo < n && start[iLo] == m {
			iLo++
		}
		for i := iLo; i < n; i++ {
			if kp[i]+kq[0] < lo {
				break
			}
			a := cp[i]
			base := int64(kp[i]) - int64(lo)
			j := start[i]
			for ; j < m; j++ {
				idx := base + int64(kq[j])
				if idx < 0 {
					break
				}
				acc[idx] += a * cq[j]
			}
			start[i] = j
		}
		for idx := int(hi - lo); idx >= 0; idx-- {
			if c := acc[idx]; c != 0 {
				acc[idx] = 0
				if err := out.small(lo+uint64(idx), c); err != nil {
					return err
				}
			}
		}
		if lo == kmin {
			return nil
		}
		hi = lo - 1
	}
}

// mulDense128 is mulDense64 with signed 128-bit accumulators (lo, hi
// interleaved).
func mulDense128(kp []uint64, cp []int64, kq []uint64, cq []int64, out *kronOut) error {
	n, m := len(kp), len(kq)
	kmax, kmin := kp[0]+kq[0], kp[n-1]+kq[m-1]
	acc := make([]uint64, 2*min(denseChunk, kmax-kmin+1))
	start := make([]int, n)
	iLo := 0
	for hi := kmax; ; {
		lo := kmin
		if hi-kmin >= denseChunk {
			lo = hi - (denseChunk - 1)
		}
		for iLo < n && start[iLo] == m {
			iLo++
		}
		for i := iLo; i < n; i++ {
			if kp[i]+kq[0] < lo {
				break
			}
			a := cp[i]
			ua, sa := uint64(a), uint64(a>>63)
			base := int64(kp[i]) - int64(lo)
			j := start[i]
			for ; j < m; j++ {
				idx := base + int64(kq[j])
				if idx < 0 {
					break
				}
				b := cq[j]
				ph, pl := bits.Mul64(ua, uint64(b))
				ph -= sa&uint64(b) + uint64(b>>63)&ua
				s := acc[2*idx : 2*idx+2 : 2*idx+2]
				var c uint64
				s[0], c = bits.Add64(s[0], pl, 0)
				s[1] += ph + c
			}
			start[i] = j
		}
		for idx := int(hi - lo); idx >= 0; idx-- {
			if l, h := acc[2*idx], acc[2*idx+1]; l|h != 0 {
				acc[2*idx], acc[2*idx+1] = 0, 0
				if err := out.wide(lo+uint64(idx), h, l); err != nil {
					return err
				}
			}
		}
		if lo == kmin {
			return nil
		}
		hi = lo - 1
	}
}

const fibHash = 0x9E3779B97F4A7C15

// hashSlot is a slot of the product hash tables: the int64 and the 128-bit
// accumulators differ only in what they add, which the hot loops spell out;
// growing the table and reading it out in order are shared.
type hashSlot interface {
	slotKey() uint64 // key+1; 0 for an empty slot
	isZero() bool    // the accumulated coefficient cancelled
}

func (s slot64) slotKey() uint64  { return s.key }
func (s slot64) isZero() bool     { return s.v == 0 }
func (s slot128) slotKey() uint64 { return s.key }
func (s slot128) isZero() bool    { return s.lo|s.hi == 0 }

// hashGrow rehashes the occupied slots of old into a table of 2^logSize.
func hashGrow[S hashSlot](old []S, logSize int) []S {
	t := make([]S, 1<<logSize)
	mask := uint64(len(t) - 1)
	for _, s := range old {
		if k := s.slotKey(); k != 0 {
			h := k * fibHash >> (64 - logSize)
			for t[h].slotKey() != 0 {
				h = (h + 1) & mask
			}
			t[h] = s
		}
	}
	return t
}

// hashDescending lists the positions of the slots holding a non-zero
// coefficient, largest key (the canonical order's first term) first. It
// sorts the bare keys and finds each slot again by probing: measured faster
// than sorting positions by an indirect key.
func hashDescending[S hashSlot](t []S, count, logSize int) []int {
	keys := make([]uint64, 0, count)
	for _, s := range t {
		if s.slotKey() != 0 && !s.isZero() {
			keys = append(keys, s.slotKey())
		}
	}
	slices.Sort(keys)
	mask := uint64(len(t) - 1)
	pos := make([]int, len(keys))
	for x, key := range keys {
		h := key * fibHash >> (64 - logSize)
		for t[h].slotKey() != key {
			h = (h + 1) & mask
		}
		pos[len(keys)-1-x] = int(h)
	}
	return pos
}

type slot64 struct {
	key uint64 // key+1; 0 for an empty slot
	v   int64
}

// mulHash64 accumulates the products in an open-addressing hash table,
// then sorts the keys.
func mulHash64(kp []uint64, cp []int64, kq []uint64, cq []int64, out *kronOut) error {
	logSize := bits.Len(uint(2*max(len(kp), len(kq)))) + 1
	t := make([]slot64, 1<<logSize)
	count := 0
	for i, ki := range kp {
		a := cp[i]
		for j, kj := range kq {
			key := ki + kj + 1
			mask := uint64(len(t) - 1)
			h := key * fibHash >> (64 - logSize)
			for {
				s := &t[h]
				if s.key == key {
					s.v += a * cq[j]
					break
				}
				if s.key == 0 {
					s.key, s.v = key, a*cq[j]
					count++
					break
				}
				h = (h + 1) & mask
			}
			if 2*count > len(t) {
				if count > 2*out.limit {
					return tooManyTerms(out.op, out.limit)
				}
				logSize++
				t = hashGrow(t, logSize)
			}
		}
	}
	for _, h := range hashDescending(t, count, logSize) {
		if err := out.small(t[h].key-1, t[h].v); err != nil {
			return err
		}
	}
	return nil
}

type slot128 struct {
	key, lo, hi uint64
}

// mulHash128 is mulHash64 with signed 128-bit accumulators.
func mulHash128(kp []uint64, cp []int64, kq []uint64, cq []int64, out *kronOut) error {
	logSize := bits.Len(uint(2*max(len(kp), len(kq)))) + 1
	t := make([]slot128, 1<<logSize)
	count := 0
	for i, ki := range kp {
		a := cp[i]
		ua, sa := uint64(a), uint64(a>>63)
		for j, kj := range kq {
			b := cq[j]
			ph, pl := bits.Mul64(ua, uint64(b))
			ph -= sa&uint64(b) + uint64(b>>63)&ua
			key := ki + kj + 1
			mask := uint64(len(t) - 1)
			h := key * fibHash >> (64 - logSize)
			for {
				s := &t[h]
				if s.key == key {
					var c uint64
					s.lo, c = bits.Add64(s.lo, pl, 0)
					s.hi += ph + c
					break
				}
				if s.key == 0 {
					s.key, s.lo, s.hi = key, pl, ph
					count++
					break
				}
				h = (h + 1) & mask
			}
			if 2*count > len(t) {
				if count > 2*out.limit {
					return tooManyTerms(out.op, out.limit)
				}
				logSize++
				t = hashGrow(t, logSize)
			}
		}
	}
	for _, h := range hashDescending(t, count, logSize) {
		if err := out.wide(t[h].key-1, t[h].hi, t[h].lo); err != nil {
			return err
		}
	}
	return nil
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

// keyHeap is a max-heap of (key, i, j).
type heapEnt struct {
	key  uint64
	i, j int32
}

type keyHeap []heapEnt

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

func (h *keyHeap) pop() heapEnt {
	s := *h
	top := s[0]
	last := s[len(s)-1]
	s = s[:len(s)-1]
	n := len(s)
	k := 0
	for {
		c := 2*k + 1
		if c >= n {
			break
		}
		if c+1 < n && s[c+1].key > s[c].key {
			c++
		}
		if last.key >= s[c].key {
			break
		}
		s[k] = s[c]
		k = c
	}
	if n > 0 {
		s[k] = last
	}
	*h = s
	return top
}

// mulHeap merges the rows q_i*p with a heap holding one entry per started
// row (Johnson; Monagan and Pearce start row i+1 when row i starts).
func mulHeap(kp []uint64, p *Poly, kq []uint64, q *Poly, out *kronOut) error {
	// Rows over the shorter factor keep the heap small.
	if len(kp) < len(kq) {
		kp, kq, p, q = kq, kp, q, p
	}
	n, m := len(kq), len(kp) // n rows (q), m columns (p)
	h := make(keyHeap, 0, n)
	h.push(heapEnt{key: kq[0] + kp[0]})
	var a accum
	for len(h) > 0 {
		key := h[0].key
		a.reset()
		for len(h) > 0 && h[0].key == key {
			e := h.pop()
			i, j := int(e.i), int(e.j)
			a.addMul(q, i, p, j, false)
			if j+1 < m {
				h.push(heapEnt{key: kq[i] + kp[j+1], i: e.i, j: e.j + 1})
			}
			if j == 0 && i+1 < n {
				h.push(heapEnt{key: kq[i+1] + kp[0], i: e.i + 1})
			}
		}
		if !a.isZero() {
			if err := out.acc(key, &a); err != nil {
				return err
			}
		}
	}
	return nil
}

// mulSplit multiplies p by each term of q and adds the products in a
// balanced tree. It needs no key layout.
func mulSplit(p, q *Poly, limit int, op string) (*Poly, error) {
	var rec func(lo, hi int) (*Poly, error)
	rec = func(lo, hi int) (*Poly, error) {
		if hi-lo == 1 {
			return p.mulMono(q.monoAt(lo), q.numAt(lo, new(big.Int)), q.den), nil
		}
		mid := (lo + hi) / 2
		a, err := rec(lo, mid)
		if err != nil {
			return nil, err
		}
		b, err := rec(mid, hi)
		if err != nil {
			return nil, err
		}
		s := addSub(a, b, false)
		if s.n() > limit {
			return nil, tooManyTerms(op, limit)
		}
		return s, nil
	}
	return rec(0, q.n())
}

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

func maxNumBits(p *Poly) int {
	b := maxBits(p.num)
	for _, x := range p.bnum {
		if x != nil {
			b = max(b, x.BitLen())
		}
	}
	return b
}

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

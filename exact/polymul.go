package exact

// Polynomial multiplication.
//
// Monomials of both factors are re-encoded as single uint64 keys by a graded
// Kronecker substitution (polykron.go): the digits of a key are, from the most
// significant, the total degree and the exponents of the occurring variables
// except the last (which the total degree determines), each shifted by its
// minimum over the factor and with a radix large enough for the product.
// Keys add when monomials multiply, and key order is the canonical order.
// When the product's box does not fit in 62 bits, mulSplit multiplies term
// by term and merges (slow but general).
//
// The dense accumulations multiply coefficients with int64 accumulators when
// bits(max|a|) + bits(max|b|) + bits(min(n, m)) <= 62, with signed 128-bit
// accumulators when that sum is <= 126, and otherwise with math/big (the
// heap); the hash table always has 128-bit slots (one table's worth of
// code; measured no slower than int64 slots on the shapes of
// BenchmarkMulAlgorithms).
//
// Accumulation strategy, chosen by mulAlgorithm; see BenchmarkMulAlgorithms.

import (
	"fmt"
	"math/big"
	"math/bits"
	"slices"
)

// mulAlgo forces an accumulation strategy (tests and benchmarks).
var mulAlgo = algoAuto

// Accumulation strategies.
const (
	algoAuto = iota
	algoDense
	algoHash
	algoHeap
	algoSplit
	algoPlanes // dense by planes (polymul_planes.go), else algoDense
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
		if algo == algoDense {
			algo = algoPlanes
		}
	}
	if mode == modeBig && (algo == algoDense || algo == algoHash || algo == algoPlanes) {
		algo = algoHeap
	}
	var err error
	switch algo {
	case algoSplit:
		return mulSplit(p, q, limit, op)
	case algoPlanes:
		var done bool
		if done, err = mulPlanes(kp, p.num, kq, q.num, out, mode == mode128); !done {
			err = mulDense(kp, p.num, kq, q.num, out, mode == mode128)
		}
	case algoDense:
		err = mulDense(kp, p.num, kq, q.num, out, mode == mode128)
	case algoHash:
		err = mulHashRanges(kp, p.num, kq, q.num, out)
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

// Accumulator widths, chosen by coefMode.
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

// maxBits returns the bit length of the largest |x|.
func maxBits(xs []int64) int {
	var or uint64
	for _, x := range xs {
		or |= absU64(x)
	}
	return bits.Len64(or)
}

// maxNumBits returns the bit length of the largest numerator of p.
func maxNumBits(p *Poly) int {
	b := maxBits(p.num)
	for _, x := range p.bnum {
		if x != nil {
			b = max(b, x.BitLen())
		}
	}
	return b
}

// denseChunk is the number of keys the dense accumulations hold at a time.
const denseChunk = 1 << 15

// splitMax is the largest shorter factor for which mulSplit beats the
// heap (BenchmarkMulAlgorithms: cm20000xquadratic, 120 terms, 224 ms
// against 291 ms; sparse6, 462 terms, 20 ms against 12 ms).
const splitMax = 128

// denseChunks walks the key range of a product p*q from the top, denseChunk
// keys at a time, for the dense accumulations. Row i is the products of
// p's term i with q's terms; start[i] is the first column of row i not yet
// added. Keys are in decreasing order.
type denseChunks struct {
	kp, kq   []uint64
	start    []int
	hi, lo   uint64 // the current chunk, lo <= hi
	kmin     uint64 // the lowest key of the product
	iLo, iHi int    // the rows that reach into the chunk and are not done
	begun    bool
}

func newDenseChunks(kp, kq []uint64) *denseChunks {
	return &denseChunks{kp: kp, kq: kq, start: make([]int, len(kp)),
		hi: kp[0] + kq[0], kmin: kp[len(kp)-1] + kq[len(kq)-1]}
}

// size is the number of keys of the largest chunk.
func (c *denseChunks) size() uint64 { return min(denseChunk, c.hi-c.kmin+1) }

// next moves to the next chunk, and reports false after the last one.
func (c *denseChunks) next() bool {
	if c.begun {
		if c.lo == c.kmin {
			return false
		}
		c.hi = c.lo - 1
	}
	c.begun = true
	c.lo = c.kmin
	if c.hi-c.kmin >= denseChunk {
		c.lo = c.hi - (denseChunk - 1)
	}
	n, m := len(c.kp), len(c.kq)
	for c.iLo < n && c.start[c.iLo] == m {
		c.iLo++
	}
	// kp decreases, so the rows that reach down to lo are a prefix.
	c.iHi = max(c.iHi, c.iLo)
	for c.iHi < n && c.kp[c.iHi]+c.kq[0] >= c.lo {
		c.iHi++
	}
	return true
}

// mulDense accumulates the products in a dense array over one chunk of the
// key range at a time, from the top, in int64 accumulators, or with wide
// in signed 128-bit ones (lo and hi words interleaved).
func mulDense(kp []uint64, cp []int64, kq []uint64, cq []int64, out *kronOut, wide bool) error {
	c := newDenseChunks(kp, kq)
	var acc64 []int64
	var acc128 []uint64
	if wide {
		acc128 = make([]uint64, 2*c.size())
	} else {
		acc64 = make([]int64, c.size())
	}
	for c.next() {
		lo, start := c.lo, c.start
		for i, end := c.iLo, c.iHi; i < end; i++ {
			if wide {
				start[i] = addRow128(acc128, lo, kp[i], cp[i], kq, cq, start[i])
			} else {
				start[i] = addRow64(acc64, lo, kp[i], cp[i], kq, cq, start[i])
			}
		}
		// The chunk is complete: emit its nonzero sums from the top.
		k := int(c.hi-lo) + 1
		var err error
		if wide {
			err = emitPlane(out, lo, nil, acc128[:2*k])
		} else {
			err = emitPlane(out, lo, acc64[:k], nil)
		}
		if err != nil {
			return err
		}
	}
	return nil
}

// addRow64 adds a*cq[j] to acc at key kr+kq[j] (relative to lo) for
// j = from, from+1, ... while the key is at least lo, and returns the
// first j left for lower chunks.
func addRow64(acc []int64, lo, kr uint64, a int64, kq []uint64, cq []int64, from int) int {
	base := int64(kr) - int64(lo)
	j := from
	for ; j < len(kq); j++ {
		idx := base + int64(kq[j])
		if idx < 0 {
			break
		}
		acc[idx] += a * cq[j]
	}
	return j
}

// addRow128 is addRow64 for signed 128-bit accumulators, lo and hi words
// interleaved in acc. Exact division (divDense) subtracts its rows with it
// by passing -a.
func addRow128(acc []uint64, lo, kr uint64, a int64, kq []uint64, cq []int64, from int) int {
	base := int64(kr) - int64(lo)
	j := from
	for ; j < len(kq); j++ {
		idx := base + int64(kq[j])
		if idx < 0 {
			break
		}
		ph, pl := mul128(a, cq[j])
		s := acc[2*idx : 2*idx+2 : 2*idx+2]
		var c uint64
		s[0], c = bits.Add64(s[0], pl, 0)
		s[1] += ph + c
	}
	return j
}

// fibHash is the multiplier of the product hash tables' Fibonacci hashing.
const fibHash = 0x9E3779B97F4A7C15

// hashGrow rehashes the occupied slots of old into a table of 2^logSize.
func hashGrow(old []slot128, logSize int) []slot128 {
	t := make([]slot128, 1<<logSize)
	mask := uint64(len(t) - 1)
	for _, s := range old {
		if k := s.key; k != 0 {
			h := k * fibHash >> (64 - logSize)
			for t[h].key != 0 {
				h = (h + 1) & mask
			}
			t[h] = s
		}
	}
	return t
}

// hashMaybeGrow doubles the table t of 2^logSize slots when count of them
// are taken and that is more than half, failing when the distinct
// monomials pass twice the term cap.
func hashMaybeGrow(t []slot128, count, logSize int, out *kronOut) ([]slot128, int, error) {
	if 2*count <= len(t) {
		return t, logSize, nil
	}
	if count > 2*out.limit {
		return nil, 0, tooManyTerms(out.op, out.limit)
	}
	return hashGrow(t, logSize+1), logSize + 1, nil
}

// hashDescending lists the positions of the slots holding a non-zero
// coefficient, largest key (the canonical order's first term) first. It
// sorts the bare keys and finds each slot again by probing: measured faster
// than sorting positions by an indirect key.
func hashDescending(t []slot128, count, logSize int) []int {
	keys := make([]uint64, 0, count)
	for _, s := range t {
		if s.key != 0 && s.lo|s.hi != 0 {
			keys = append(keys, s.key)
		}
	}
	slices.Sort(keys)
	mask := uint64(len(t) - 1)
	pos := make([]int, len(keys))
	for x, key := range keys {
		h := key * fibHash >> (64 - logSize)
		for t[h].key != key {
			h = (h + 1) & mask
		}
		pos[len(keys)-1-x] = int(h)
	}
	return pos
}

// slot128 is a slot of mulHashRanges's table.
type slot128 struct {
	key, lo, hi uint64
}

// hashRangeWork is the number of term products per range, and the work
// from which Mul's hash accumulation goes by ranges.
var hashRangeWork = 1 << 20

// mulHashRanges is the hash accumulation in signed 128-bit slots, by key
// ranges: the product's key range is cut into ranges of about
// hashRangeWork term products, so that the table holds one range's
// monomials and stays in cache (one table for the whole of the reference
// program's sparse product, 118755 monomials, is 6 MB and misses at every
// product). Row i keeps its next column, as in the dense chunks; range
// bounds are quantiles of a sample of products. Small products make one
// range.
func mulHashRanges(kp []uint64, cp []int64, kq []uint64, cq []int64, out *kronOut) error {
	n, m := len(kp), len(kq)
	ranges := n*m/hashRangeWork + 1
	// Bounds: every 64th of a sorted sample of products (a fixed linear
	// congruential sequence picks them; any choice is correct, only the
	// balance depends on it).
	const per = 64
	sample := make([]uint64, ranges*per)
	x := uint64(1)
	for s := range sample {
		x = x*6364136223846793005 + 1442695040888963407
		sample[s] = kp[(x>>33)%uint64(n)] + kq[(x>>13)%uint64(m)]
	}
	slices.Sort(sample)
	start := make([]int, n)
	logSize := 12
	t := make([]slot128, 1<<logSize)
	iLo := 0
	for r := 1; r <= ranges; r++ {
		lo := uint64(0) // the last range takes everything left
		if r < ranges {
			lo = sample[len(sample)-r*per]
		}
		count := 0
		for iLo < n && start[iLo] == m {
			iLo++
		}
		for i := iLo; i < n; i++ {
			ki := kp[i]
			if ki+kq[0] < lo {
				break // kp decreases: no later row reaches the range
			}
			j := start[i]
			for ; j < m && ki+kq[j] >= lo; j++ {
				ph, pl := mul128(cp[i], cq[j])
				key := ki + kq[j] + 1
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
				var err error
				if t, logSize, err = hashMaybeGrow(t, count, logSize, out); err != nil {
					return err
				}
			}
			start[i] = j
		}
		for _, h := range hashDescending(t, count, logSize) {
			if err := out.wide(t[h].key-1, t[h].hi, t[h].lo); err != nil {
				return err
			}
		}
		clear(t)
	}
	return nil
}

// mulHeap merges the rows q_i*p with a heap holding one entry per started
// row (Johnson; Monagan and Pearce start row i+1 when row i starts).
func mulHeap(kp []uint64, p *Poly, kq []uint64, q *Poly, out *kronOut) error {
	// Rows over the shorter factor keep the heap small.
	if len(kp) < len(kq) {
		kp, kq, p, q = kq, kp, q, p
	}
	h := make(keyHeap, 0, len(kq)) // rows are q's terms, columns p's
	h.push(heapEnt{key: kq[0] + kp[0]})
	var a accum
	for len(h) > 0 {
		key := h[0].key
		a.reset()
		h.popKey(key, &a, q, kq, p, kp, true, false)
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

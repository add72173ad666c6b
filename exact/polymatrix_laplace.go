package exact

// The memoised Laplace expansion on one-word monomials: detLaplace's fast
// path for integer entries whose determinant's exponents fit a uint64.
//
// Why it is separate from the *Poly arithmetic. Every term of a minor on
// rows r..n-1 is a product of entries from distinct rows and distinct
// columns, so its exponent of a variable v is at most
// min(Σ_rows max deg_v, Σ_cols max deg_v) and its total degree likewise;
// these bounds give each occurring variable a bit field just wide enough,
// below a field for the total degree (pkLayout). For the Cayley–Menger
// matrix of the 7-simplex (28 variables, each of exponent <= 2, degree 8)
// that is 60 bits: one word a monomial instead of the Poly's eight.
// Comparing keys is the graded lexicographic order, and adding keys
// multiplies monomials, as no field can carry.
//
// Likewise every coefficient met on the way (a minor's, a product of an
// entry's coefficient and a minor's, a partial sum) is at most the product
// over rows (or columns) of max(1, Σ|coefficients| of the row), the bound
// of a permanent; when that is below 2^62 plain int64 arithmetic is exact,
// with no overflow checks. Otherwise, or for rational entries, Det uses
// the *Poly expansion (detLaplace).
//
// A minor is Σ_j ±c·x^a·minor(S \ j) over the terms c·x^a of the row's
// entries, each term a sorted stream of the minor below with its keys
// shifted by a: one k-way merge (a binary heap of stream heads) writes it,
// with no intermediate products. Minors live as (key, coefficient) word
// pairs in per-worker arenas reused every other level, so a determinant
// allocates its arenas (about twice the largest level) and its result, and
// two cores share a level with no shared writes and little garbage.
// Figures, against FLINT's fmpz_mpoly, are at the top of
// polymatrix_det.go.

import (
	"math/big"
	"math/bits"
	"sync"
)

// pkLayout is a packing of the monomials of a determinant into one word:
// the total degree at degShift, the exponent of vars[k] at shift[k].
type pkLayout struct {
	degShift uint
	degMask  uint64
	vars     []int
	shift    []uint
	mask     []uint64
	w        int // words a monomial of the result has as a Poly
	// words[k] turns the key's bits of the variables of Poly word k+1
	// (contiguous, at most pkTableBits of them) into that word, by a table;
	// nil when some word has more bits, which decode then reads variable
	// by variable.
	words []pkWord
}

// pkWord is the table that decodes one Poly word: word = table[key>>shift&mask].
type pkWord struct {
	shift uint
	mask  uint64
	table []uint64
}

// pkTableBits bounds the bits a decoding table is indexed by (a table of
// 2^10 words is 8 KB).
const pkTableBits = 10

// pkTerm is one term of an entry: its packed monomial and coefficient.
type pkTerm struct {
	key uint64
	c   int64
}

// packedLayout returns the packing for the determinant of m (square), and
// false when some entry is not an integer polynomial, when the permanent
// bound on coefficients reaches 2^62, when an exponent bound exceeds
// MaxExponent, or when the fields need more than 64 bits.
func (m *PolyMatrix) packedLayout() (*pkLayout, bool) {
	n := m.rows
	w, nv := 1, 0
	for _, e := range m.e {
		if e.den != nil || e.bnum != nil {
			return nil, false
		}
		w = max(w, e.w)
		nv = max(nv, e.nvars())
	}
	// Degree and norm of each entry; bounds along rows and along columns.
	deg := make([][]int, len(m.e))
	for k, e := range m.e {
		deg[k] = e.degrees()
	}
	rowVar, colVar := make([]int, nv), make([]int, nv)
	rowT, colT := 0, 0
	rowNorm, colNorm := big.NewInt(1), big.NewInt(1)
	var t big.Int
	for pass := 0; pass < 2; pass++ {
		bound, tot, norm := rowVar, &rowT, rowNorm
		if pass == 1 {
			bound, tot, norm = colVar, &colT, colNorm
		}
		for i := 0; i < n; i++ {
			mx := make([]int, nv)
			mt := 0
			var l1 uint64
			for j := 0; j < n; j++ {
				k := i*n + j
				if pass == 1 {
					k = j*n + i
				}
				for v, d := range deg[k] {
					mx[v] = max(mx[v], d)
				}
				mt = max(mt, m.e[k].Degree())
				for _, c := range m.e[k].num {
					var carry uint64
					l1, carry = bits.Add64(l1, absU64(c), 0)
					if carry != 0 {
						return nil, false
					}
				}
			}
			for v := range bound {
				bound[v] += mx[v]
			}
			*tot += mt
			norm.Mul(norm, t.SetUint64(max(l1, 1)))
		}
	}
	if min(rowNorm.BitLen(), colNorm.BitLen()) > 62 {
		return nil, false
	}
	l := &pkLayout{w: w}
	used := uint(bits.Len(uint(min(rowT, colT))))
	l.degShift, l.degMask = 64-used, 1<<used-1
	for v := 0; v < nv; v++ {
		e := min(rowVar[v], colVar[v])
		if e > MaxExponent {
			return nil, false // the *Poly expansion reports it, if reached
		}
		b := uint(bits.Len(uint(e)))
		if b == 0 {
			continue
		}
		if used+b > 64 {
			return nil, false
		}
		used += b
		l.vars = append(l.vars, v)
		l.shift = append(l.shift, 64-used)
		l.mask = append(l.mask, 1<<b-1)
	}
	l.words = l.tables()
	return l, true
}

// tables returns the decoding tables of l's Poly words, or nil if a word
// needs more than pkTableBits bits.
func (l *pkLayout) tables() []pkWord {
	out := make([]pkWord, l.w-1)
	for wd := range out {
		var ks []int // the variables of word wd+1, as indices into l.vars
		for k, v := range l.vars {
			if v/perWord == wd {
				ks = append(ks, k)
			}
		}
		if len(ks) == 0 {
			out[wd].table = []uint64{0}
			continue
		}
		lo := l.shift[ks[len(ks)-1]]
		width := l.shift[ks[0]] + uint(bits.Len64(l.mask[ks[0]])) - lo
		if width > pkTableBits {
			return nil
		}
		t := make([]uint64, 1<<width)
		for x := range t {
			for _, k := range ks {
				e := uint64(x) >> (l.shift[k] - lo) & l.mask[k]
				t[x] |= e << (topShift - expBits*(l.vars[k]%perWord))
			}
		}
		out[wd] = pkWord{shift: lo, mask: 1<<width - 1, table: t}
	}
	return out
}

// encode returns the terms of p with packed monomials.
func (l *pkLayout) encode(p *Poly) []pkTerm {
	out := make([]pkTerm, p.n())
	for i := range out {
		mono := p.monoAt(i)
		key := mono[0] << l.degShift
		for k, v := range l.vars {
			key |= uint64(monoExp(mono, v)) << l.shift[k]
		}
		out[i] = pkTerm{key, p.num[i]}
	}
	return out
}

// decode returns the polynomial of the (key, coefficient) pairs in d.
func (l *pkLayout) decode(r *Ring, d []uint64) *Poly {
	n := len(d) / 2
	if n == 0 {
		return r.zero()
	}
	p := &Poly{ring: r, w: l.w, mono: make([]uint64, n*l.w), num: make([]int64, n)}
	for i := 0; i < n; i++ {
		key := d[2*i]
		mono := p.mono[i*l.w : (i+1)*l.w]
		mono[0] = key >> l.degShift & l.degMask
		p.num[i] = int64(d[2*i+1])
		if l.words != nil {
			for wd, t := range l.words {
				mono[wd+1] = t.table[key>>t.shift&t.mask]
			}
			continue
		}
		for k, v := range l.vars {
			mono[1+v/perWord] |= (key >> l.shift[k] & l.mask[k]) << (topShift - expBits*(v%perWord))
		}
	}
	return p
}

// pkArena hands out space for minors from blocks that are kept and reused
// once the level they held is no longer read.
type pkArena struct {
	blocks [][]uint64
	cur    int // the block in use
	used   int // words used of blocks[cur]
}

// pkMinBlock is the smallest arena block, in words.
const pkMinBlock = 1 << 14

func (a *pkArena) reset() { a.cur, a.used = 0, 0 }

// space returns room for n words; commit then keeps k <= n of them.
func (a *pkArena) space(n int) []uint64 {
	for a.cur < len(a.blocks) {
		if b := a.blocks[a.cur]; len(b)-a.used >= n {
			return b[a.used : a.used+n]
		}
		a.cur++
		a.used = 0
	}
	size := max(n, pkMinBlock)
	for _, b := range a.blocks {
		size = max(size, len(b))
	}
	a.blocks = append(a.blocks, make([]uint64, 2*size))
	a.used = 0
	return a.blocks[a.cur][:n]
}

func (a *pkArena) commit(k int) { a.used += k }

// pkStream is a minor below, as (key, coefficient) pairs, times the term
// c·x^add of an entry.
type pkStream struct {
	d   []uint64
	add uint64
	c   int64
}

// pkWorker is one goroutine's scratch space.
type pkWorker struct {
	arena   [2]pkArena // by the parity of the level
	streams []pkStream
	heap    keyHeap // stream s's next key, as heapEnt{key, i: s}
}

// pkWorkers keeps workers, and so their arenas, from one determinant to
// the next: the arenas are the garbage that made two cores slower than
// one (see the top of polymatrix_det.go).
var pkWorkers = sync.Pool{New: func() any { return new(pkWorker) }}

// merge writes Σ c_s·x^add_s·stream_s into out (room for every input
// term) as (key, coefficient) pairs in decreasing key order, and returns
// the words written.
func (w *pkWorker) merge(out []uint64) int {
	ss := w.streams
	if len(ss) == 1 {
		s := ss[0]
		for i := 0; i < len(s.d); i += 2 {
			out[i] = s.d[i] + s.add
			out[i+1] = uint64(s.c * int64(s.d[i+1]))
		}
		return len(s.d)
	}
	h := w.heap[:0]
	for s := range ss {
		h = append(h, heapEnt{key: ss[s].d[0] + ss[s].add, i: int32(s)})
	}
	for k := len(h)/2 - 1; k >= 0; k-- {
		h.siftDown(k)
	}
	o := 0
	for len(h) > 0 {
		key := h[0].key
		var acc int64
		for len(h) > 0 && h[0].key == key {
			s := &ss[h[0].i]
			acc += s.c * int64(s.d[1])
			s.d = s.d[2:]
			if len(s.d) > 0 {
				h[0].key = s.d[0] + s.add
			} else {
				h[0] = h[len(h)-1]
				h = h[:len(h)-1]
			}
			h.siftDown(0)
		}
		if acc != 0 {
			out[o], out[o+1] = key, uint64(acc)
			o += 2
		}
	}
	w.heap = h
	return o
}

// detLaplacePacked is detLaplace on packed monomials (see the top of the
// file), for the layout l and the column sets need (pmNeededMinors).
func (m *PolyMatrix) detLaplacePacked(l *pkLayout, need [][]uint64) (*Poly, error) {
	n := m.rows
	lim := m.r.MaxTerms()
	ent := make([][]pkTerm, len(m.e))
	for k, e := range m.e {
		ent[k] = l.encode(e)
	}
	workers := make([]*pkWorker, pmWorkers())
	for i := range workers {
		workers[i] = pkWorkers.Get().(*pkWorker)
	}
	defer func() {
		for _, w := range workers {
			pkWorkers.Put(w)
		}
	}()
	// The 0x0 minor below the last row is 1.
	prev := map[uint64][]uint64{0: {0, 1}}
	for r := n - 1; r >= 0; r-- {
		masks := need[r]
		out := make([][]uint64, len(masks))
		work := 0
		for _, d := range prev {
			work += len(d) / 2
		}
		for _, w := range workers {
			w.arena[r%2].reset()
		}
		err := pmParallel(len(masks), work*len(masks) >= pmParallelWork, func(id int) func(k int) error {
			w := workers[id]
			return func(k int) error {
				s := masks[k]
				w.streams = w.streams[:0]
				size, pos := 0, 0
				for j := 0; j < n; j++ {
					if s&(1<<j) == 0 {
						continue
					}
					sign := int64(1 - 2*(pos&1))
					pos++
					sub := prev[s&^(1<<j)]
					if len(sub) == 0 {
						continue
					}
					for _, t := range ent[r*n+j] {
						w.streams = append(w.streams, pkStream{sub, t.key, sign * t.c})
						size += len(sub)
					}
				}
				if size == 0 {
					return nil
				}
				a := &w.arena[r%2]
				dst := a.space(size)
				k2 := w.merge(dst)
				if k2/2 > lim {
					return pmTooManyTerms(k2/2, lim)
				}
				a.commit(k2)
				out[k] = dst[:k2:k2]
				return nil
			}
		})
		if err != nil {
			return nil, err
		}
		prev = make(map[uint64][]uint64, len(masks))
		for k, s := range masks {
			prev[s] = out[k]
		}
	}
	return l.decode(m.r, prev[1<<n-1]), nil
}

package exact

// A private sparse-polynomial representation for determinants: exponent
// vectors packed into one to eight machine words, integer coefficients in
// int64. Terms are kept sorted in the canonical order (graded
// lexicographic, largest first), and the packing is chosen so that this
// order is the lexicographic order of the words and multiplying monomials
// is adding words. That makes the product of a monomial and a polynomial a
// pass that keeps the order, and a sum a linear merge.
//
// Field widths come from degree bounds of the whole determinant (see
// newPMPacking), so no field of any minor can overflow into its neighbour.
// Coefficients cannot overflow either: detPacked declines matrices whose
// coefficient bound reaches 2^63, and every merge checks that the largest
// possible coefficient fits before it starts, reporting errPMOverflow if
// it might not; the caller then falls back to the *Poly code.

import (
	"errors"
	"math"
	"math/big"
	"math/bits"
	"slices"
)

// errPMOverflow says the packed representation cannot hold the
// computation (too many fields for eight words, or an int64 coefficient
// bound exceeded). It never leaves the package.
var errPMOverflow = errors.New("packed polynomial overflow")

// pmKey is a packed exponent vector.
type pmKey interface {
	[1]uint64 | [2]uint64 | [4]uint64 | [8]uint64
}

// pmPacking says where each field lives: field 0 is the total degree, field
// 1+k the exponent of variable vars[k].
type pmPacking struct {
	words int
	vars  []int // ring indices of the variables that occur, increasing
	word  []int
	shift []uint
	mask  []uint64
}

// newPMPacking packs the total degree (at most deg) and the exponent of
// vars[k] (at most bound[k]) into as few words as possible, fields in
// order from the most significant bit of word 0 down. It returns false if
// more than eight words would be needed.
func newPMPacking(vars []int, deg int, bound []int) (*pmPacking, bool) {
	nf := 1 + len(vars)
	pk := &pmPacking{vars: vars, word: make([]int, nf), shift: make([]uint, nf), mask: make([]uint64, nf)}
	w, left := 0, uint(64)
	for f := 0; f < nf; f++ {
		b := deg
		if f > 0 {
			b = bound[f-1]
		}
		width := uint(bits.Len(uint(max(b, 1))))
		if width > left {
			w, left = w+1, 64
		}
		left -= width
		pk.word[f], pk.shift[f], pk.mask[f] = w, left, 1<<width-1
	}
	pk.words = w + 1
	return pk, pk.words <= 8
}

// pmEncode packs exps (indexed by ring variable; missing entries are 0).
func pmEncode[K pmKey](pk *pmPacking, exps []int) K {
	var k K
	d := 0
	for f, v := range pk.vars {
		if v < len(exps) && exps[v] > 0 {
			e := exps[v]
			d += e
			k[pk.word[f+1]] |= uint64(e) << pk.shift[f+1]
		}
	}
	k[pk.word[0]] |= uint64(d) << pk.shift[0]
	return k
}

// pmDecode returns the exponents of k indexed by ring variable, nv long.
func pmDecode[K pmKey](pk *pmPacking, k K, nv int) []int {
	exps := make([]int, nv)
	for f, v := range pk.vars {
		exps[v] = int(k[pk.word[f+1]] >> pk.shift[f+1] & pk.mask[f+1])
	}
	return exps
}

func pmKeyAdd[K pmKey](a, b K) K {
	for i := 0; i < len(a); i++ {
		a[i] += b[i]
	}
	return a
}

// pmKeyCmp compares in the canonical order: 1 if a comes first (is larger).
func pmKeyCmp[K pmKey](a, b K) int {
	for i := 0; i < len(a); i++ {
		if a[i] != b[i] {
			if a[i] > b[i] {
				return 1
			}
			return -1
		}
	}
	return 0
}

// pmPoly is a packed polynomial: keys strictly decreasing, coefficients
// nonzero with absolute value at most max <= math.MaxInt64.
type pmPoly[K pmKey] struct {
	keys  []K
	coefs []int64
	max   uint64
}

func (p *pmPoly[K]) len() int { return len(p.keys) }

// pmView stands for c * x^shift * p without computing it.
type pmView[K pmKey] struct {
	p     *pmPoly[K]
	shift K
	c     int64
}

func pmAbs(c int64) uint64 {
	if c < 0 {
		return uint64(-c)
	}
	return uint64(c)
}

// bound returns the largest absolute coefficient of v, and false if it
// might exceed math.MaxInt64.
func (v pmView[K]) bound() (uint64, bool) {
	hi, lo := bits.Mul64(pmAbs(v.c), v.p.max)
	return lo, hi == 0 && lo <= math.MaxInt64
}

// pmMerge returns a + b.
func pmMerge[K pmKey](a, b pmView[K]) (*pmPoly[K], error) {
	ba, ok1 := a.bound()
	bb, ok2 := b.bound()
	if !ok1 || !ok2 || ba+bb > math.MaxInt64 {
		return nil, errPMOverflow
	}
	ak, ac, bk, bc := a.p.keys, a.p.coefs, b.p.keys, b.p.coefs
	n := len(ak) + len(bk)
	keys := make([]K, n)
	coefs := make([]int64, n)
	var mx uint64
	i, j, o := 0, 0, 0
	for i < len(ak) && j < len(bk) {
		ka, kb := pmKeyAdd(ak[i], a.shift), pmKeyAdd(bk[j], b.shift)
		var c int64
		switch pmKeyCmp(ka, kb) {
		case 1:
			keys[o], c = ka, a.c*ac[i]
			i++
		case -1:
			keys[o], c = kb, b.c*bc[j]
			j++
		default:
			c = a.c*ac[i] + b.c*bc[j]
			i, j = i+1, j+1
			if c == 0 {
				continue
			}
			keys[o] = ka
		}
		coefs[o] = c
		mx = max(mx, pmAbs(c))
		o++
	}
	for ; i < len(ak); i++ {
		keys[o], coefs[o] = pmKeyAdd(ak[i], a.shift), a.c*ac[i]
		mx = max(mx, pmAbs(coefs[o]))
		o++
	}
	for ; j < len(bk); j++ {
		keys[o], coefs[o] = pmKeyAdd(bk[j], b.shift), b.c*bc[j]
		mx = max(mx, pmAbs(coefs[o]))
		o++
	}
	return &pmPoly[K]{keys: keys[:o:o], coefs: coefs[:o:o], max: mx}, nil
}

// pmMaterialize returns the polynomial a view stands for.
func pmMaterialize[K pmKey](v pmView[K]) (*pmPoly[K], error) {
	if v.c == 1 && v.shift == *new(K) {
		return v.p, nil
	}
	mx, ok := v.bound()
	if !ok {
		return nil, errPMOverflow
	}
	n := v.p.len()
	out := &pmPoly[K]{keys: make([]K, n), coefs: make([]int64, n), max: mx}
	for i := range v.p.keys {
		out.keys[i] = pmKeyAdd(v.p.keys[i], v.shift)
		out.coefs[i] = v.c * v.p.coefs[i]
	}
	return out, nil
}

// pmSumViews returns the sum of the views, merging in pairs.
func pmSumViews[K pmKey](vs []pmView[K]) (*pmPoly[K], error) {
	if len(vs) == 0 {
		return &pmPoly[K]{}, nil
	}
	for len(vs) > 1 {
		next := vs[:0]
		for k := 0; k < len(vs); k += 2 {
			if k+1 == len(vs) {
				next = append(next, vs[k])
				break
			}
			s, err := pmMerge(vs[k], vs[k+1])
			if err != nil {
				return nil, err
			}
			next = append(next, pmView[K]{p: s, c: 1})
		}
		vs = next
	}
	return pmMaterialize(vs[0])
}

// pmLaplace returns the determinant of the n x n matrix ent (row-major)
// by expansion along the rows, top row outermost, with the minors of the
// bottom rows memoised by their column set. need[r] lists the column sets
// of size n-r that the expansion reaches (see pmNeededMinors). A minor with
// more than maxTerms terms gives ErrTooManyTerms.
func pmLaplace[K pmKey](n int, ent []*pmPoly[K], need [][]uint64, maxTerms int) (*pmPoly[K], error) {
	var prev map[uint64]*pmPoly[K]
	for r := n - 1; r >= 0; r-- {
		masks := need[r]
		out := make([]*pmPoly[K], len(masks))
		work := 0
		for _, p := range prev {
			work += p.len()
		}
		err := pmParallel(len(masks), work*len(masks) >= pmParallelWork, func() func(k int) error {
			var vs []pmView[K]
			return func(k int) error {
				s := masks[k]
				vs = vs[:0]
				pos := 0
				for j := 0; j < n; j++ {
					if s&(1<<j) == 0 {
						continue
					}
					a := ent[r*n+j]
					sign := int64(1 - 2*(pos&1))
					pos++
					if a.len() == 0 {
						continue
					}
					if r == n-1 {
						vs = append(vs, pmView[K]{p: a, c: sign})
						continue
					}
					sub := prev[s&^(1<<j)]
					if sub.len() == 0 {
						continue
					}
					for t, key := range a.keys {
						vs = append(vs, pmView[K]{p: sub, shift: key, c: sign * a.coefs[t]})
					}
				}
				p, err := pmSumViews(vs)
				if err == nil && p.len() > maxTerms {
					err = pmTooManyTerms(p.len(), maxTerms)
				}
				out[k] = p
				return err
			}
		})
		if err != nil {
			return nil, err
		}
		prev = make(map[uint64]*pmPoly[K], len(masks))
		for k, s := range masks {
			prev[s] = out[k]
		}
	}
	return prev[1<<n-1], nil
}

// pmParallelWork is the product of the number of minors of a level and
// the terms of the level below from which the Laplace expansions spread a
// level over several goroutines.
var pmParallelWork = 1 << 16

// pmNeededMinors lists, for each row r, the column sets (bit masks, sorted)
// of the minors on rows r..n-1 that Laplace expansion along the rows
// reaches from the whole matrix, skipping zero entries. It gives up,
// returning false, once more than limit sets have been found.
func pmNeededMinors(n int, zero func(i, j int) bool, limit int) ([][]uint64, bool) {
	need := make([][]uint64, n)
	need[0] = []uint64{1<<n - 1}
	total := 1
	for r := 0; r+1 < n; r++ {
		seen := make(map[uint64]bool)
		for _, s := range need[r] {
			for j := 0; j < n; j++ {
				if s&(1<<j) == 0 || zero(r, j) {
					continue
				}
				t := s &^ (1 << j)
				if !seen[t] {
					seen[t] = true
					need[r+1] = append(need[r+1], t)
				}
			}
		}
		total += len(need[r+1])
		if total > limit {
			return nil, false
		}
		slices.Sort(need[r+1])
	}
	return need, true
}

// pmTerm is one term of an entry: exponents by ring variable, and the
// coefficient times the row's common denominator.
type pmTerm struct {
	exps []int
	coef int64
}

// pmDetK converts the entries, runs pmLaplace and converts back.
func pmDetK[K pmKey](r *Ring, n int, pk *pmPacking, ent [][]pmTerm, need [][]uint64, den *big.Int, nv int) (*Poly, error) {
	pe := make([]*pmPoly[K], len(ent))
	for k, ts := range ent {
		p := &pmPoly[K]{keys: make([]K, len(ts)), coefs: make([]int64, len(ts))}
		for t, term := range ts {
			p.keys[t] = pmEncode[K](pk, term.exps)
			p.coefs[t] = term.coef
			p.max = max(p.max, pmAbs(term.coef))
		}
		// Terms() gives the canonical order already; sort in case.
		pmSort(p)
		pe[k] = p
	}
	d, err := pmLaplace(n, pe, need, r.MaxTerms())
	if err != nil {
		return nil, err
	}
	if d == nil {
		return r.Const(new(big.Rat)), nil
	}
	terms := make([]Term, d.len())
	for t, key := range d.keys {
		c := new(big.Rat).SetFrac(big.NewInt(d.coefs[t]), den)
		terms[t] = Term{Coef: c, Exps: pmDecode(pk, key, nv)}
	}
	return pmFromTerms(r, terms)
}

// pmSort sorts the terms of p into the canonical order (no two keys
// may be equal).
func pmSort[K pmKey](p *pmPoly[K]) {
	sorted := true
	for i := 1; i < len(p.keys); i++ {
		if pmKeyCmp(p.keys[i-1], p.keys[i]) <= 0 {
			sorted = false
			break
		}
	}
	if sorted {
		return
	}
	idx := make([]int, len(p.keys))
	for i := range idx {
		idx[i] = i
	}
	slices.SortFunc(idx, func(a, b int) int { return pmKeyCmp(p.keys[b], p.keys[a]) })
	keys, coefs := make([]K, len(idx)), make([]int64, len(idx))
	for i, k := range idx {
		keys[i], coefs[i] = p.keys[k], p.coefs[k]
	}
	p.keys, p.coefs = keys, coefs
}

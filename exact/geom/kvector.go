package geom

import (
	"fmt"
	"math/big"
	"math/bits"
	"sort"
	"strings"

	"assay/exact"
)

// MaxAmbient is the largest ambient dimension of a KVector (basis blades
// are kept as 64-bit sets of indices).
const MaxAmbient = 64

// MaxComponents bounds the number of non-zero components a KVector
// computation may produce; beyond it the operation fails with
// exact.ErrTooManyTerms rather than exhausting memory (C(n, k) grows fast).
// Set it before use, not while KVector operations run.
var MaxComponents = 1 << 20

// KVector is a k-vector of the exterior algebra of R^n (0 <= k <= n <=
// MaxAmbient): a linear combination of the basis blades
// e_{i1}∧…∧e_{ik}, i1 < … < ik, with rational coefficients. Indices are
// 0-based in the API (Blade.Index) and 1-based in String ("e1" is the
// first basis vector, index 0). A KVector is immutable.
type KVector struct {
	n, k  int
	terms []term // non-zero coefficients, in lexicographic blade order
}

type term struct {
	mask uint64 // the set of indices of the blade
	c    *big.Rat
}

// Blade is one component of a KVector: the coefficient of
// e_{Index[0]}∧…∧e_{Index[k−1]}, Index strictly increasing and 0-based.
type Blade struct {
	Index []int
	Coef  *big.Rat
}

// lexLess orders blades of equal grade lexicographically by their sorted
// index lists: the first differing index decides, and the smaller one is
// in the lesser blade, which is the lowest differing bit.
func lexLess(a, b uint64) bool {
	x := a ^ b
	return x != 0 && a&(x&-x) != 0
}

// swapSign returns the sign (+1 or −1) of e_A ∧ e_B = sign · e_{A∪B} for
// disjoint A and B: (−1)^#{(x, y): x ∈ A, y ∈ B, x > y}.
func swapSign(a, b uint64) int {
	inv := 0
	for b != 0 {
		y := bits.TrailingZeros64(b)
		b &= b - 1
		inv += bits.OnesCount64(a >> uint(y) >> 1)
	}
	if inv%2 == 1 {
		return -1
	}
	return 1
}

// fromMap builds a KVector from accumulated coefficients, dropping zeros.
func fromMap(n, k int, acc map[uint64]*big.Rat) *KVector {
	w := &KVector{n: n, k: k, terms: make([]term, 0, len(acc))}
	for m, c := range acc {
		if c.Sign() != 0 {
			w.terms = append(w.terms, term{m, c})
		}
	}
	sort.Slice(w.terms, func(i, j int) bool { return lexLess(w.terms[i].mask, w.terms[j].mask) })
	return w
}

func tooMany(op string) error {
	return fmt.Errorf("%s: more than %d non-zero components: %w", op, MaxComponents, exact.ErrTooManyTerms)
}

// Wedge returns v_1 ∧ … ∧ v_k for k vectors of one length n, with
// 1 <= k <= n <= MaxAmbient (exact.ErrShape otherwise); nil entries are
// read as 0. Its component on e_I is the k x k minor of the n x k matrix
// [v_1 … v_k] on the rows I, so NormSq is the Gram determinant
// det(v_i·v_j) (Cauchy–Binet). More than MaxComponents non-zero
// components give exact.ErrTooManyTerms.
func Wedge(vs ...[]*big.Rat) (*KVector, error) {
	k := len(vs)
	if k == 0 {
		return nil, fmt.Errorf("wedge: no vectors: %w", exact.ErrShape)
	}
	n := len(vs[0])
	for i, v := range vs {
		if len(v) != n {
			return nil, fmt.Errorf("wedge: vector %d has length %d, vector 0 has length %d: %w", i, len(v), n, exact.ErrShape)
		}
	}
	if k > n {
		return nil, fmt.Errorf("wedge: %d vectors of R^%d (at most %d): %w", k, n, n, exact.ErrShape)
	}
	if n > MaxAmbient {
		return nil, fmt.Errorf("wedge: ambient dimension %d exceeds %d: %w", n, MaxAmbient, exact.ErrShape)
	}
	cur := map[uint64]*big.Rat{0: big.NewRat(1, 1)}
	var t big.Rat
	for _, v := range vs {
		next := make(map[uint64]*big.Rat, len(cur)*2)
		for m, c := range cur {
			for i, x := range v {
				if x == nil || x.Sign() == 0 || m&(1<<uint(i)) != 0 {
					continue
				}
				// e_m ∧ e_i: e_i passes the indices of m above i.
				t.Mul(c, x)
				if bits.OnesCount64(m>>uint(i)>>1)%2 == 1 {
					t.Neg(&t)
				}
				nm := m | 1<<uint(i)
				if z, ok := next[nm]; ok {
					z.Add(z, &t)
				} else {
					next[nm] = new(big.Rat).Set(&t)
					if len(next) > MaxComponents {
						return nil, tooMany("wedge")
					}
				}
			}
		}
		for m, c := range next {
			if c.Sign() == 0 {
				delete(next, m)
			}
		}
		cur = next
	}
	return fromMap(n, k, cur), nil
}

// NewKVector returns the k-vector of R^n with the given components
// (0 <= k <= n <= MaxAmbient). Each blade's Index must have k strictly
// increasing entries in [0, n) (exact.ErrShape otherwise); repeated blades
// add up and a nil Coef is 0. A grade-0 KVector is a scalar: its blade has
// an empty Index.
func NewKVector(n, k int, blades ...Blade) (*KVector, error) {
	if n < 0 || n > MaxAmbient || k < 0 || k > n {
		return nil, fmt.Errorf("new k-vector: grade %d in R^%d (need 0 <= k <= n <= %d): %w", k, n, MaxAmbient, exact.ErrShape)
	}
	acc := make(map[uint64]*big.Rat, len(blades))
	for b, bl := range blades {
		if len(bl.Index) != k {
			return nil, fmt.Errorf("new k-vector: blade %d has %d indices, the grade is %d: %w", b, len(bl.Index), k, exact.ErrShape)
		}
		var m uint64
		for a, i := range bl.Index {
			if i < 0 || i >= n {
				return nil, fmt.Errorf("new k-vector: blade %d: index %d out of range [0, %d): %w", b, i, n, exact.ErrShape)
			}
			if a > 0 && i <= bl.Index[a-1] {
				return nil, fmt.Errorf("new k-vector: blade %d: indices %v are not strictly increasing: %w", b, bl.Index, exact.ErrShape)
			}
			m |= 1 << uint(i)
		}
		if bl.Coef == nil {
			continue
		}
		if z, ok := acc[m]; ok {
			z.Add(z, bl.Coef)
		} else {
			acc[m] = new(big.Rat).Set(bl.Coef)
		}
	}
	return fromMap(n, k, acc), nil
}

// Grade returns k.
func (w *KVector) Grade() int { return w.k }

// Ambient returns n, the dimension of the underlying space.
func (w *KVector) Ambient() int { return w.n }

func (w *KVector) same(op string, o *KVector) error {
	if w.n != o.n || w.k != o.k {
		return fmt.Errorf("%s: a %d-vector of R^%d and a %d-vector of R^%d: %w", op, w.k, w.n, o.k, o.n, exact.ErrShape)
	}
	return nil
}

// combine returns w + sign·o (same n and k), merging the sorted terms.
func (w *KVector) combine(o *KVector, neg bool) *KVector {
	out := &KVector{n: w.n, k: w.k, terms: make([]term, 0, len(w.terms)+len(o.terms))}
	i, j := 0, 0
	for i < len(w.terms) || j < len(o.terms) {
		switch {
		case j == len(o.terms) || (i < len(w.terms) && lexLess(w.terms[i].mask, o.terms[j].mask)):
			out.terms = append(out.terms, term{w.terms[i].mask, new(big.Rat).Set(w.terms[i].c)})
			i++
		case i == len(w.terms) || lexLess(o.terms[j].mask, w.terms[i].mask):
			c := new(big.Rat).Set(o.terms[j].c)
			if neg {
				c.Neg(c)
			}
			out.terms = append(out.terms, term{o.terms[j].mask, c})
			j++
		default:
			c := new(big.Rat)
			if neg {
				c.Sub(w.terms[i].c, o.terms[j].c)
			} else {
				c.Add(w.terms[i].c, o.terms[j].c)
			}
			if c.Sign() != 0 {
				out.terms = append(out.terms, term{w.terms[i].mask, c})
			}
			i++
			j++
		}
	}
	return out
}

// Add returns w + o; they must have the same ambient dimension and grade
// (exact.ErrShape).
func (w *KVector) Add(o *KVector) (*KVector, error) {
	if err := w.same("add", o); err != nil {
		return nil, err
	}
	return w.combine(o, false), nil
}

// Sub returns w − o; they must have the same ambient dimension and grade
// (exact.ErrShape).
func (w *KVector) Sub(o *KVector) (*KVector, error) {
	if err := w.same("sub", o); err != nil {
		return nil, err
	}
	return w.combine(o, true), nil
}

// Scale returns c·w; a nil c is read as 0.
func (w *KVector) Scale(c *big.Rat) *KVector {
	out := &KVector{n: w.n, k: w.k}
	if c == nil || c.Sign() == 0 {
		return out
	}
	out.terms = make([]term, len(w.terms))
	for i, t := range w.terms {
		out.terms[i] = term{t.mask, new(big.Rat).Mul(t.c, c)}
	}
	return out
}

// Neg returns −w.
func (w *KVector) Neg() *KVector { return w.Scale(big.NewRat(-1, 1)) }

// Dot returns the inner product Σ_I w_I o_I of two k-vectors of R^n (the
// one for which the basis blades are orthonormal); exact.ErrShape if the
// grades or dimensions differ.
func (w *KVector) Dot(o *KVector) (*big.Rat, error) {
	if err := w.same("dot", o); err != nil {
		return nil, err
	}
	z := new(big.Rat)
	var t big.Rat
	i, j := 0, 0
	for i < len(w.terms) && j < len(o.terms) {
		a, b := w.terms[i].mask, o.terms[j].mask
		switch {
		case a == b:
			z.Add(z, t.Mul(w.terms[i].c, o.terms[j].c))
			i++
			j++
		case lexLess(a, b):
			i++
		default:
			j++
		}
	}
	return z, nil
}

// NormSq returns Σ_I w_I², the squared norm. For w = v_1∧…∧v_k it is
// det(v_i·v_j), the squared k-volume of the parallelotope spanned by the
// v_i (Lagrange's identity; Cauchy–Binet).
func (w *KVector) NormSq() *big.Rat {
	z := new(big.Rat)
	var t big.Rat
	for _, x := range w.terms {
		z.Add(z, t.Mul(x.c, x.c))
	}
	return z
}

// Components returns the non-zero components, in lexicographic order of
// their index lists (copies).
func (w *KVector) Components() []Blade {
	out := make([]Blade, len(w.terms))
	for i, t := range w.terms {
		out[i] = Blade{Index: maskIndex(t.mask), Coef: new(big.Rat).Set(t.c)}
	}
	return out
}

// Coefficient returns the coefficient of e_{idx[0]}∧…∧e_{idx[k−1]}; idx
// must have k distinct indices in [0, n) (exact.ErrShape), in any order:
// an odd permutation of the sorted order flips the sign.
func (w *KVector) Coefficient(idx []int) (*big.Rat, error) {
	if len(idx) != w.k {
		return nil, fmt.Errorf("coefficient: %d indices for a %d-vector: %w", len(idx), w.k, exact.ErrShape)
	}
	var m uint64
	neg := false
	for a, i := range idx {
		if i < 0 || i >= w.n {
			return nil, fmt.Errorf("coefficient: index %d out of range [0, %d): %w", i, w.n, exact.ErrShape)
		}
		if m&(1<<uint(i)) != 0 {
			return nil, fmt.Errorf("coefficient: index %d repeated: %w", i, exact.ErrShape)
		}
		for _, j := range idx[:a] {
			if j > i {
				neg = !neg
			}
		}
		m |= 1 << uint(i)
	}
	for _, t := range w.terms {
		if t.mask == m {
			z := new(big.Rat).Set(t.c)
			if neg {
				z.Neg(z)
			}
			return z, nil
		}
	}
	return new(big.Rat), nil
}

func maskIndex(m uint64) []int {
	idx := make([]int, 0, bits.OnesCount64(m))
	for m != 0 {
		idx = append(idx, bits.TrailingZeros64(m))
		m &= m - 1
	}
	return idx
}

// IsZero reports whether every component is 0.
func (w *KVector) IsZero() bool { return len(w.terms) == 0 }

// Equal reports whether w and o have the same ambient dimension, grade and
// components.
func (w *KVector) Equal(o *KVector) bool {
	if w.n != o.n || w.k != o.k || len(w.terms) != len(o.terms) {
		return false
	}
	for i := range w.terms {
		if w.terms[i].mask != o.terms[i].mask || w.terms[i].c.Cmp(o.terms[i].c) != 0 {
			return false
		}
	}
	return true
}

// Wedge returns the exterior product w ∧ o, of grade w.Grade()+o.Grade();
// they must share the ambient dimension and the grades must add up to at
// most n (exact.ErrShape).
func (w *KVector) Wedge(o *KVector) (*KVector, error) {
	if w.n != o.n {
		return nil, fmt.Errorf("wedge: k-vectors of R^%d and R^%d: %w", w.n, o.n, exact.ErrShape)
	}
	if w.k+o.k > w.n {
		return nil, fmt.Errorf("wedge: grades %d + %d exceed the dimension %d: %w", w.k, o.k, w.n, exact.ErrShape)
	}
	acc := make(map[uint64]*big.Rat)
	var t big.Rat
	for _, a := range w.terms {
		for _, b := range o.terms {
			if a.mask&b.mask != 0 {
				continue
			}
			t.Mul(a.c, b.c)
			if swapSign(a.mask, b.mask) < 0 {
				t.Neg(&t)
			}
			m := a.mask | b.mask
			if z, ok := acc[m]; ok {
				z.Add(z, &t)
			} else {
				acc[m] = new(big.Rat).Set(&t)
				if len(acc) > MaxComponents {
					return nil, tooMany("wedge")
				}
			}
		}
	}
	return fromMap(w.n, w.k+o.k, acc), nil
}

// Hodge returns the Hodge star ⋆w, the (n−k)-vector with
// ⋆e_I = σ(I, I^c) e_{I^c}, σ the sign of the permutation (I, I^c) of
// (0, …, n−1); so that a ∧ ⋆b = (a·b) e_1∧…∧e_n. In R^3, ⋆(e1∧e2) = e3
// and ⋆e1 = e2∧e3; the cross product is u × v = ⋆(u ∧ v).
func (w *KVector) Hodge() *KVector {
	full := uint64(1)<<uint(w.n) - 1
	if w.n == 64 {
		full = ^uint64(0)
	}
	acc := make(map[uint64]*big.Rat, len(w.terms))
	for _, t := range w.terms {
		c := new(big.Rat).Set(t.c)
		if swapSign(t.mask, full&^t.mask) < 0 {
			c.Neg(c)
		}
		acc[full&^t.mask] = c
	}
	return fromMap(w.n, w.n-w.k, acc)
}

// Vector returns the components of a 1-vector as a vector of R^n, and
// exact.ErrShape for another grade.
func (w *KVector) Vector() ([]*big.Rat, error) {
	if w.k != 1 {
		return nil, fmt.Errorf("vector: a %d-vector is not a vector: %w", w.k, exact.ErrShape)
	}
	v := make([]*big.Rat, w.n)
	for i := range v {
		v[i] = new(big.Rat)
	}
	for _, t := range w.terms {
		v[bits.TrailingZeros64(t.mask)].Set(t.c)
	}
	return v, nil
}

// String formats w with 1-based basis names, e.g. "3*e1^e2 - e1^e3" or
// "1/2*e2 + e3"; the zero k-vector is "0" and a scalar (grade 0) is its
// value.
func (w *KVector) String() string {
	if len(w.terms) == 0 {
		return "0"
	}
	var b strings.Builder
	for i, t := range w.terms {
		c := new(big.Rat).Set(t.c)
		neg := c.Sign() < 0
		if neg {
			c.Neg(c)
		}
		switch {
		case i == 0 && neg:
			b.WriteByte('-')
		case i > 0 && neg:
			b.WriteString(" - ")
		case i > 0:
			b.WriteString(" + ")
		}
		blade := bladeName(t.mask)
		switch {
		case blade == "":
			b.WriteString(exact.FormatRat(c))
		case c.IsInt() && c.Num().IsInt64() && c.Num().Int64() == 1:
			b.WriteString(blade)
		default:
			b.WriteString(exact.FormatRat(c))
			b.WriteByte('*')
			b.WriteString(blade)
		}
	}
	return b.String()
}

func bladeName(m uint64) string {
	var parts []string
	for _, i := range maskIndex(m) {
		parts = append(parts, fmt.Sprintf("e%d", i+1))
	}
	return strings.Join(parts, "^")
}

// FacetAreaVectors returns, for a k-simplex (k >= 1) built from points of
// R^n (n <= MaxAmbient), the oriented (k−1)-vector of each facet, facet i
// opposite vertex i:
//
//	A_i = σ · (−1)^i · (w_1 − w_0)∧…∧(w_{k−1} − w_0) / (k−1)!
//
// where w_0, …, w_{k−1} are the facet's vertices in increasing order, so
// that NormSq(A_i) = FacetContentsSq()[i]. The signs (−1)^i are those of
// the boundary ∂[v_0 … v_k], hence Σ_i A_i = 0 for every simplex (the
// vector area of a closed surface vanishes). For a full-dimensional
// simplex (k = n) σ = sign det(v_1 − v_0, …, v_k − v_0) (+1 if degenerate)
// orients every facet outward: with n_i the outward unit normal,
// n_i ∧ A_i = +F_i e_1∧…∧e_n, i.e. the outward normal is
// (−1)^(k−1) ⋆A_i, and Σ_i A_i = 0 is Minkowski's relation
// Σ_i F_i n_i = 0. For k < n, σ = +1 (the orientation of the vertex
// order). For a segment the facets are points and A_i = σ(−1)^i is a
// scalar (grade 0). A point (k = 0) has no facets: the result is empty.
// Simplices built from distances give an error wrapping exact.ErrShape.
func (s *Simplex) FacetAreaVectors() ([]*KVector, error) {
	if s.d != nil {
		return nil, errNoPoints("facet area vectors")
	}
	if s.n > MaxAmbient {
		return nil, fmt.Errorf("facet area vectors: ambient dimension %d exceeds %d: %w", s.n, MaxAmbient, exact.ErrShape)
	}
	k := s.k
	if k == 0 {
		return []*KVector{}, nil
	}
	pts := s.points()
	sigma := 1
	if k == s.n {
		e := exact.Zeros(k, k)
		for i := 0; i < k; i++ {
			for c := 0; c < k; c++ {
				e.Set(i, c, new(big.Rat).Sub(pts[i+1][c], pts[0][c]))
			}
		}
		if det, err := e.Det(); err == nil && det.Sign() < 0 {
			sigma = -1
		}
	}
	out := make([]*KVector, k+1)
	scale := new(big.Rat).SetFrac(big.NewInt(1), factorial(k-1))
	for i := 0; i <= k; i++ {
		sign := sigma
		if i%2 == 1 {
			sign = -sign
		}
		c := new(big.Rat).Mul(scale, big.NewRat(int64(sign), 1))
		if k == 1 {
			w, _ := NewKVector(s.n, 0, Blade{Coef: c})
			out[i] = w
			continue
		}
		vs := others(k, i)
		edges := make([][]*big.Rat, 0, k-1)
		for _, v := range vs[1:] {
			e := make([]*big.Rat, s.n)
			for x := range e {
				e[x] = new(big.Rat).Sub(pts[v][x], pts[vs[0]][x])
			}
			edges = append(edges, e)
		}
		w, err := Wedge(edges...)
		if err != nil {
			return nil, fmt.Errorf("facet area vectors: facet %d: %w", i, err)
		}
		out[i] = w.Scale(c)
	}
	return out, nil
}

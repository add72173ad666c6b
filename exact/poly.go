package exact

// Sparse multivariate polynomials over Q.
//
// Representation, and why. Figures are from the benchmarks in
// poly_bench_test.go (go test -bench . -run XXX ./exact/ with
// GOMAXPROCS=1, one AMD EPYC core).
//
//   - A Poly is an immutable sorted slice of terms in the canonical order,
//     graded lexicographic with the ring's variable order (higher total
//     degree first, ties broken by the exponent of the first variable, then
//     the second, ..., larger first).
//   - Monomials are packed: word 0 of a monomial is its total degree, then
//     four 16-bit exponents per uint64 word (variable 4k+i in bits
//     48-16i..63-16i of word k+1). Comparing monomials word by word as
//     unsigned integers is exactly the graded lexicographic order, and
//     multiplying monomials is word-wise addition (exponents are kept in
//     0..65535, checked before every product). A polynomial stores w words
//     per monomial, enough for the variables the ring had when it was made;
//     missing trailing words read as zero exponents. Sums are linear merges;
//     multiplying by a monomial keeps the order, so p*x is one pass
//     (20000 terms in 15 variables: 0.35 ms).
//   - Coefficients are integer numerators over one common positive
//     denominator (nil for 1), in lowest terms: gcd(den, all numerators) = 1.
//     A numerator is an int64 unless it does not fit, in which case it is a
//     *big.Int (bnum[i] != nil); bnum is nil when every numerator fits.
//     Integer polynomials with word-sized coefficients, the usual case,
//     cost 8 bytes of coefficient per term and take machine arithmetic with
//     overflow checks; every fast path falls back to math/big exactly.
//
// The alternative measured against this representation, one big.Rat per
// term with exponent vectors as map keys (naiveMul in the tests), needs
// 1.39 s for Fateman's product at degree 10 (1001 x 1001 terms); the
// packed form needs 1.2 ms.
//
// Products (polymul.go) re-encode both factors' monomials as single uint64
// keys by a graded Kronecker substitution (digits: total degree, then the
// exponents of the occurring variables but the last, each shifted by its
// minimum), whose key order is the canonical order and which adds when
// monomials multiply; boxes of more than 2^62 keys take the term-by-term
// merge. Coefficients accumulate in int64 when the bit sizes guarantee no
// overflow, else in signed 128-bit words (math/bits), else in math/big.
// Four accumulations were measured (ms; the product's terms in brackets):
//
//	product                              dense    hash    heap   merge   auto
//	Fateman d=10, 1001x1001 [10626]        1.3     7.0      35      33    1.2
//	Fateman d=20, 10626x10626 [135751]     222     748    5039       -    218
//	sparse6, 463x463 [106954]               74      31      12      20     12
//	random 8 vars, 2000x2000 [3996754]   26900    1619     439     654    549
//	(1+a+..+h)^4 squared, 495^2 [12870]     12     2.9      10      11    3.3
//	(1+a+..+h)^6 squared, 3003^2 [125970]  267      80     384     422     85
//	20000 terms x linear form [314947]   51000     126      36      20     19
//	20000 terms x quadratic [2518706]   678000    1064     291     224    281
//
// "dense" adds into a dense array over the key range, 2^15 keys at a time
// from the top (rows of the product advance a cursor each); "hash" is open
// addressing on the keys followed by a sort (now by key ranges of about
// 2^20 products, in 128-bit slots: mulHashRanges); "heap" is Johnson's merge
// with one heap entry per started row (Monagan and Pearce); "merge" (mulSplit)
// adds the shifted copies p*q_j in a balanced tree. So Mul uses dense when
// the key box is at most twice the number of term products, the merge when
// the shorter factor has at most 128 terms, the hash table when a sample
// of 64 rows shows at least 1.5 products per distinct monomial, and the
// heap otherwise (always the heap or the merge for big coefficients).
// Fateman's benchmark, f = (1+x+y+z+t)^20, f*(f+1), ran in about 0.22 s so;
// dense products now accumulate by planes instead (polymul_planes.go, with
// its figures against FLINT; "dense" above is the chunked mulDense, kept
// for the division's layout and as a fallback).
//
// Exact division (polydiv.go) uses the same keys: a dense long division
// chunk by chunk when the dividend's box is small (Fateman's product
// divided by f+1: 0.20 s), else Johnson's heap division (5.2 s on that
// product, fine for sparse ones: 11 ms for sparse6's product).
//
// The code by concern: ring.go (variables, term cap), monomial.go (packed
// monomials), polybuild.go (collecting terms, lowest terms), int128.go
// (word arithmetic for coefficients), polyarith.go (sums and scaling),
// polykron.go (Kronecker keys, the key heap), polymul.go and
// polymul_planes.go (dense products by planes), polypow.go,
// polydiv.go (exact division), polyrem.go (division with remainder),
// polygcd.go, polyresultant.go, polyeval.go (evaluation, substitution,
// derivatives, contents), polyparse.go and polyformat.go; factoring is in
// factor_sqfree.go (square-free parts), factor_modp.go, factor_hensel.go
// and factor.go (univariate factorization over Q), factor_multi.go and
// factor_lift.go (several variables: evaluation and Hensel lifting); Gröbner
// bases in groebner*.go, on monomials of their own (groebner_order.go).

import (
	"fmt"
	"math/big"
)

// Poly is a polynomial with rational coefficients in the variables of a
// Ring. It is immutable: methods return new polynomials (or share the
// receiver when the result is equal to it) and never modify their operands.
// The zero value is not valid; polynomials are made by a Ring (Var, Const,
// Parse) and by operations on other polynomials. A Poly may be used from
// several goroutines at once.
//
// Binary operations need operands of the same ring; Add and Sub panic
// otherwise, the operations returning an error report ErrRingMismatch.
type Poly struct {
	ring *Ring
	w    int        // words per monomial, >= 1
	mono []uint64   // len(num)*w words, terms in strictly decreasing order
	num  []int64    // numerators, never 0; used where bnum is nil or bnum[i] is nil
	bnum []*big.Int // nil, or one entry per term: the numerators that do not fit an int64
	den  *big.Int   // common denominator > 1, or nil for 1
}

// Term is one term of a polynomial: Coef times the product of the ring's
// variables raised to Exps.
type Term struct {
	// Coef is the coefficient, never zero.
	Coef *big.Rat
	// Exps holds the exponent of each ring variable, in ring order.
	Exps []int
}

func (p *Poly) n() int                { return len(p.num) }
func (p *Poly) monoAt(i int) []uint64 { return p.mono[i*p.w : (i+1)*p.w] }
func (p *Poly) nvars() int            { return (p.w - 1) * perWord }
func (p *Poly) small(i int) bool      { return p.bnum == nil || p.bnum[i] == nil }
func (p *Poly) denOr1() *big.Int      { return orOne(p.den) }

// numAt sets z to numerator i and returns z.
func (p *Poly) numAt(i int, z *big.Int) *big.Int {
	if !p.small(i) {
		return z.Set(p.bnum[i])
	}
	return z.SetInt64(p.num[i])
}

// numSign returns the sign of numerator i.
func (p *Poly) numSign(i int) int {
	if !p.small(i) {
		return p.bnum[i].Sign()
	}
	switch {
	case p.num[i] > 0:
		return 1
	case p.num[i] < 0:
		return -1
	}
	return 0
}

// coefAt returns coefficient i as a new rational.
func (p *Poly) coefAt(i int) *big.Rat {
	r := new(big.Rat).SetInt(p.numAt(i, new(big.Int)))
	if p.den != nil {
		r.SetFrac(r.Num(), p.den)
	}
	return r
}

// monoW returns the monomials of p widened to w >= p.w words each.
func (p *Poly) monoW(w int) []uint64 {
	if w == p.w {
		return p.mono
	}
	out := make([]uint64, p.n()*w)
	for i := 0; i < p.n(); i++ {
		copy(out[i*w:], p.monoAt(i))
	}
	return out
}

// Ring returns the ring of p.
func (p *Poly) Ring() *Ring { return p.ring }

func (p *Poly) mustSameRing(q *Poly, op string) {
	if p.ring != q.ring {
		panic(fmt.Sprintf("exact: %s of polynomials from different rings", op))
	}
}

func (p *Poly) sameRing(q *Poly, op string) error {
	if p.ring != q.ring {
		return fmt.Errorf("%s: %w", op, ErrRingMismatch)
	}
	return nil
}

// IsZero reports whether p is the zero polynomial.
func (p *Poly) IsZero() bool { return len(p.num) == 0 }

// Constant returns the value of p and true when p is a constant (0 for the
// zero polynomial), and nil, false otherwise.
func (p *Poly) Constant() (*big.Rat, bool) {
	switch {
	case p.IsZero():
		return new(big.Rat), true
	case p.n() == 1 && p.mono[0] == 0:
		return p.coefAt(0), true
	}
	return nil, false
}

// isOne reports whether p is the constant 1.
func (p *Poly) isOne() bool {
	return p.n() == 1 && p.mono[0] == 0 && p.den == nil && p.small(0) && p.num[0] == 1
}

// isConst reports whether p is a nonzero constant.
func (p *Poly) isConst() bool { return p.n() == 1 && p.mono[0] == 0 }

// Equal reports whether p and q are the same polynomial of the same ring.
func (p *Poly) Equal(q *Poly) bool {
	if p.ring != q.ring || p.n() != q.n() {
		return false
	}
	if (p.den == nil) != (q.den == nil) || p.den != nil && p.den.Cmp(q.den) != 0 {
		return false
	}
	w := min(p.w, q.w)
	for i := 0; i < p.n(); i++ {
		a, b := p.monoAt(i), q.monoAt(i)
		if monoCmp(a[:w], b[:w]) != 0 || !zeroWords(a[w:]) || !zeroWords(b[w:]) {
			return false
		}
		switch ps, qs := p.small(i), q.small(i); {
		case ps != qs:
			return false
		case ps:
			if p.num[i] != q.num[i] {
				return false
			}
		default:
			if p.bnum[i].Cmp(q.bnum[i]) != 0 {
				return false
			}
		}
	}
	return true
}

// Len returns the number of terms of p (0 for the zero polynomial).
func (p *Poly) Len() int { return p.n() }

// Degree returns the total degree of p, or -1 for the zero polynomial.
func (p *Poly) Degree() int {
	if p.IsZero() {
		return -1
	}
	return int(p.mono[0])
}

// DegreeIn returns the degree of p in variable v (0 if v does not occur),
// or -1 for the zero polynomial. It panics if v < 0.
func (p *Poly) DegreeIn(v int) int {
	checkVar(v)
	if p.IsZero() {
		return -1
	}
	d := 0
	for i := 0; i < p.n(); i++ {
		d = max(d, monoExp(p.monoAt(i), v))
	}
	return d
}

func checkVar(v int) {
	if v < 0 {
		panic(fmt.Sprintf("exact: negative variable index %d", v))
	}
}

// degrees returns the degree of p in each of its p.nvars() variables.
func (p *Poly) degrees() []int {
	d := make([]int, p.nvars())
	for i := 0; i < p.n(); i++ {
		m := p.monoAt(i)
		for k := 1; k < p.w; k++ {
			x := m[k]
			if x == 0 {
				continue
			}
			for f := 0; f < perWord; f++ {
				e := int(x >> (topShift - expBits*f) & expMask)
				if v := (k-1)*perWord + f; e > d[v] {
					d[v] = e
				}
			}
		}
	}
	return d
}

// at returns the degree d[v], or 0 past the end of d.
func at(d []int, v int) int {
	if v < len(d) {
		return d[v]
	}
	return 0
}

// Vars returns the indices of the variables that occur in p, ascending.
func (p *Poly) Vars() []int {
	var vs []int
	for v, d := range p.degrees() {
		if d > 0 {
			vs = append(vs, v)
		}
	}
	return vs
}

// Terms returns the terms of p in the canonical order (graded
// lexicographic: higher total degree first, then larger exponent of the
// first variable, of the second, ...). Each Exps has one entry per variable
// of the ring at the time of the call. The values are copies.
func (p *Poly) Terms() []Term {
	nv := max(p.ring.numVars(), p.nvars())
	out := make([]Term, p.n())
	for i := range out {
		m := p.monoAt(i)
		e := make([]int, nv)
		for v := range e {
			e[v] = monoExp(m, v)
		}
		out[i] = Term{Coef: p.coefAt(i), Exps: e}
	}
	return out
}

// find returns the index of the term with monomial m (width p.w), or -1.
func (p *Poly) find(m []uint64) int {
	lo, hi := 0, p.n()
	for lo < hi {
		mid := (lo + hi) / 2
		switch monoCmp(p.monoAt(mid), m) {
		case 0:
			return mid
		case 1:
			lo = mid + 1
		default:
			hi = mid
		}
	}
	return -1
}

// Coefficient returns the coefficient of the monomial with the given
// exponents (one per variable in ring order; missing trailing entries are
// 0). Monomials that do not occur, including ones with negative exponents,
// give 0. CoefficientIn gives the coefficient of a monomial in some of the
// variables, a polynomial in the others.
func (p *Poly) Coefficient(exps []int) *big.Rat {
	m, ok := packExps(exps, p.w)
	if !ok {
		return new(big.Rat)
	}
	if i := p.find(m); i >= 0 {
		return p.coefAt(i)
	}
	return new(big.Rat)
}

// LeadingCoefficient returns the coefficient of the first term in the
// canonical order, or 0 for the zero polynomial.
func (p *Poly) LeadingCoefficient() *big.Rat {
	if p.IsZero() {
		return new(big.Rat)
	}
	return p.coefAt(0)
}

// Homogeneous reports whether all terms of p have the same total degree,
// and that degree. The zero polynomial gives (-1, true).
func (p *Poly) Homogeneous() (deg int, ok bool) {
	if p.IsZero() {
		return -1, true
	}
	for i := 1; i < p.n(); i++ {
		if p.mono[i*p.w] != p.mono[0] {
			return int(p.mono[0]), false
		}
	}
	return int(p.mono[0]), true
}

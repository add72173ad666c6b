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
// addressing on the keys followed by a sort; "heap" is Johnson's merge
// with one heap entry per started row (Monagan and Pearce); "merge" (mulSplit)
// adds the shifted copies p*q_j in a balanced tree. So Mul uses dense when
// the key box is at most twice the number of term products, the merge when
// the shorter factor has at most 128 terms, the hash table when a sample
// of 64 rows shows at least 1.5 products per distinct monomial, and the
// heap otherwise (always the heap or the merge for big coefficients).
// Fateman's benchmark, f = (1+x+y+z+t)^20, f*(f+1), runs in about 0.22 s.
//
// Exact division (polydiv.go) uses the same keys: a dense long division
// chunk by chunk when the dividend's box is small (Fateman's product
// divided by f+1: 0.20 s), else Johnson's heap division (5.2 s on that
// product, fine for sparse ones: 11 ms for sparse6's product).

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"
	"sync"
)

// DefaultMaxTerms is the term cap of a Ring on which SetMaxTerms was not
// called (or was called with 0).
var DefaultMaxTerms = 4_000_000

// MaxExponent is the largest exponent of a single variable in a
// polynomial. Operations whose result would need a larger one fail with
// ErrExponentRange.
const MaxExponent = 65535

const (
	expBits  = 16
	expMask  = 1<<expBits - 1
	perWord  = 64 / expBits
	topShift = 64 - expBits
)

// Ring is an ordered, growable set of variable names. Polynomials made in
// the same ring combine; the variable order is the order of creation and
// fixes the canonical term order. A Ring also holds the term cap. A Ring is
// safe for concurrent use.
type Ring struct {
	mu       sync.RWMutex
	names    []string
	index    map[string]int
	maxTerms int
}

// NewRing returns a ring without variables and with the default term cap.
func NewRing() *Ring {
	return &Ring{index: map[string]int{}}
}

// Var returns the variable called name, adding it to the ring if it is new.
// Names follow identifier syntax, [A-Za-z_][A-Za-z0-9_]*; anything else
// gives ErrSyntax.
func (r *Ring) Var(name string) (*Poly, error) {
	if !isIdent(name) {
		return nil, fmt.Errorf("variable name %q: want a letter or _ followed by letters, digits or _: %w", name, ErrSyntax)
	}
	return r.varPoly(r.addVar(name)), nil
}

func (r *Ring) addVar(name string) int {
	r.mu.Lock()
	defer r.mu.Unlock()
	if i, ok := r.index[name]; ok {
		return i
	}
	r.names = append(r.names, name)
	r.index[name] = len(r.names) - 1
	return len(r.names) - 1
}

func (r *Ring) varPoly(v int) *Poly {
	w := wordsFor(v + 1)
	m := make([]uint64, w)
	m[0] = 1
	m[1+v/perWord] = 1 << (topShift - expBits*(v%perWord))
	return &Poly{ring: r, w: w, mono: m, num: []int64{1}}
}

func isIdent(s string) bool {
	if s == "" {
		return false
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '_', 'a' <= c && c <= 'z', 'A' <= c && c <= 'Z':
		case '0' <= c && c <= '9' && i > 0:
		default:
			return false
		}
	}
	return true
}

// Names returns the variable names in ring order.
func (r *Ring) Names() []string {
	r.mu.RLock()
	defer r.mu.RUnlock()
	return append([]string(nil), r.names...)
}

// Index returns the index of the variable called name, and whether the ring
// has it.
func (r *Ring) Index(name string) (int, bool) {
	r.mu.RLock()
	defer r.mu.RUnlock()
	i, ok := r.index[name]
	return i, ok
}

func (r *Ring) numVars() int {
	r.mu.RLock()
	defer r.mu.RUnlock()
	return len(r.names)
}

func (r *Ring) name(v int) string {
	r.mu.RLock()
	defer r.mu.RUnlock()
	if v < len(r.names) {
		return r.names[v]
	}
	return fmt.Sprintf("x%d", v)
}

// SetMaxTerms sets the term cap: operations that can blow up (Mul, Pow,
// Substitute, and what is built on them) fail with ErrTooManyTerms instead
// of producing a polynomial with more than n terms. n <= 0 restores
// DefaultMaxTerms.
func (r *Ring) SetMaxTerms(n int) {
	r.mu.Lock()
	defer r.mu.Unlock()
	if n < 0 {
		n = 0
	}
	r.maxTerms = n
}

// MaxTerms returns the term cap.
func (r *Ring) MaxTerms() int {
	r.mu.RLock()
	defer r.mu.RUnlock()
	if r.maxTerms == 0 {
		return DefaultMaxTerms
	}
	return r.maxTerms
}

func tooManyTerms(op string, limit int) error {
	return fmt.Errorf("%s: the result would have more than %d terms, the term cap (raise it with the flag --max-terms): %w", op, limit, ErrTooManyTerms)
}

// Const returns the constant polynomial c (a copy); nil gives 0.
func (r *Ring) Const(c *big.Rat) *Poly {
	if c == nil || c.Sign() == 0 {
		return r.zero()
	}
	b := newBuilder(1)
	b.pushBig(constMono[:], c.Num())
	return b.poly(r, c.Denom())
}

var constMono = [1]uint64{0}

func (r *Ring) zero() *Poly { return &Poly{ring: r, w: 1} }

func (r *Ring) one() *Poly { return &Poly{ring: r, w: 1, mono: []uint64{0}, num: []int64{1}} }

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

func wordsFor(nv int) int { return 1 + (nv+perWord-1)/perWord }

// monoExp returns the exponent of variable v in the packed monomial m.
func monoExp(m []uint64, v int) int {
	k := 1 + v/perWord
	if k >= len(m) {
		return 0
	}
	return int(m[k] >> (topShift - expBits*(v%perWord)) & expMask)
}

func monoSetExp(m []uint64, v, e int) {
	k := 1 + v/perWord
	sh := topShift - expBits*(v%perWord)
	m[k] = m[k]&^(expMask<<sh) | uint64(e)<<sh
}

// monoCmp compares two monomials of the same width in the canonical order.
func monoCmp(a, b []uint64) int {
	for k := range a {
		if a[k] != b[k] {
			if a[k] > b[k] {
				return 1
			}
			return -1
		}
	}
	return 0
}

func (p *Poly) n() int                { return len(p.num) }
func (p *Poly) monoAt(i int) []uint64 { return p.mono[i*p.w : (i+1)*p.w] }
func (p *Poly) nvars() int            { return (p.w - 1) * perWord }
func (p *Poly) small(i int) bool      { return p.bnum == nil || p.bnum[i] == nil }
func (p *Poly) denOr1() *big.Int      { return orOne(p.den) }

var bigOne = big.NewInt(1)

func orOne(d *big.Int) *big.Int {
	if d == nil {
		return bigOne
	}
	return d
}

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

// polyBuilder collects terms in decreasing order.
type polyBuilder struct {
	w    int
	mono []uint64
	num  []int64
	bnum []*big.Int
}

func newBuilder(w int) *polyBuilder { return &polyBuilder{w: w} }

func (b *polyBuilder) grow(n int) {
	b.mono = make([]uint64, 0, n*b.w)
	b.num = make([]int64, 0, n)
}

func (b *polyBuilder) len() int { return len(b.num) }

// pushSmall appends a term with a nonzero coefficient c.
func (b *polyBuilder) pushSmall(m []uint64, c int64) {
	b.mono = append(b.mono, m...)
	b.num = append(b.num, c)
	if b.bnum != nil {
		b.bnum = append(b.bnum, nil)
	}
}

// pushBig appends a term with a nonzero coefficient c, copying c.
func (b *polyBuilder) pushBig(m []uint64, c *big.Int) {
	if c.IsInt64() {
		b.pushSmall(m, c.Int64())
		return
	}
	b.pushBigOwned(m, new(big.Int).Set(c))
}

// pushBigOwned appends a term whose coefficient c does not fit an int64
// and is not used elsewhere.
func (b *polyBuilder) pushBigOwned(m []uint64, c *big.Int) {
	if c.IsInt64() {
		b.pushSmall(m, c.Int64())
		return
	}
	if b.bnum == nil {
		b.bnum = make([]*big.Int, len(b.num), cap(b.num))
	}
	b.mono = append(b.mono, m...)
	b.num = append(b.num, 0)
	b.bnum = append(b.bnum, c)
}

// push128 appends a term with the nonzero signed 128-bit coefficient hi:lo.
func (b *polyBuilder) push128(m []uint64, hi, lo uint64) {
	if hi == uint64(int64(lo)>>63) {
		b.pushSmall(m, int64(lo))
		return
	}
	b.pushBigOwned(m, set128(new(big.Int), hi, lo))
}

// poly returns the polynomial of the collected terms over the denominator
// den (nil or positive; it is not retained), in lowest terms.
func (b *polyBuilder) poly(r *Ring, den *big.Int) *Poly {
	p := &Poly{ring: r, w: b.w, mono: b.mono, num: b.num, bnum: b.bnum}
	if len(p.num) == 0 {
		p.mono, p.num, p.bnum = nil, nil, nil
		return p
	}
	if den != nil && !(den.IsInt64() && den.Int64() == 1) {
		p.den = new(big.Int).Set(den)
		p.reduce()
	}
	return p
}

// reduce divides the numerators and the denominator of a new polynomial by
// their gcd.
func (p *Poly) reduce() {
	if p.den == nil {
		return
	}
	var g *big.Int
	if p.den.IsUint64() {
		gs := p.den.Uint64()
		t, m := new(big.Int), new(big.Int)
		for i := 0; i < p.n() && gs != 1; i++ {
			if p.small(i) {
				gs = gcdU64(gs, absU64(p.num[i]))
			} else {
				m.SetUint64(gs)
				gs = gcdU64(gs, t.Mod(t.Abs(p.bnum[i]), m).Uint64())
			}
		}
		if gs == 1 {
			return
		}
		g = new(big.Int).SetUint64(gs)
	} else {
		g = new(big.Int).Set(p.den)
		t := new(big.Int)
		for i := 0; i < p.n() && !(g.IsInt64() && g.Int64() == 1); i++ {
			g.GCD(nil, nil, g, p.numAt(i, t))
		}
		if g.IsInt64() && g.Int64() == 1 {
			return
		}
	}
	p.divNums(g)
	p.den.Quo(p.den, g)
	if p.den.IsInt64() && p.den.Int64() == 1 {
		p.den = nil
	}
}

// divNums divides every numerator of a new polynomial exactly by g > 0.
func (p *Poly) divNums(g *big.Int) {
	gs, gSmall := g.Int64(), g.IsInt64()
	t := new(big.Int)
	for i := range p.num {
		if p.small(i) && gSmall {
			p.num[i] /= gs
			continue
		}
		p.setBig(i, new(big.Int).Quo(p.numAt(i, t), g))
	}
	p.trimBig()
}

// trimBig drops bnum when no numerator needs it.
func (p *Poly) trimBig() {
	for _, b := range p.bnum {
		if b != nil {
			return
		}
	}
	p.bnum = nil
}

func gcdU64(a, b uint64) uint64 {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

func absU64(x int64) uint64 {
	if x < 0 {
		return uint64(-x) // also right for math.MinInt64
	}
	return uint64(x)
}

// set128 sets z to the signed 128-bit integer hi:lo.
func set128(z *big.Int, hi, lo uint64) *big.Int {
	neg := int64(hi) < 0
	if neg {
		lo = -lo
		hi = ^hi
		if lo == 0 {
			hi++
		}
	}
	z.SetUint64(hi)
	z.Lsh(z, 64)
	z.Or(z, new(big.Int).SetUint64(lo))
	if neg {
		z.Neg(z)
	}
	return z
}

// mul128 returns the signed 128-bit product a*b.
func mul128(a, b int64) (hi, lo uint64) {
	hi, lo = bits.Mul64(uint64(a), uint64(b))
	hi -= uint64(a>>63) & uint64(b)
	hi -= uint64(b>>63) & uint64(a)
	return
}

// addOv returns a+b and whether it overflowed.
func addOv(a, b int64) (int64, bool) {
	s := a + b
	return s, (a >= 0) == (b >= 0) && (s >= 0) != (a >= 0)
}

// mulOv returns a*b and whether it overflowed.
func mulOv(a, b int64) (int64, bool) {
	hi, lo := mul128(a, b)
	return int64(lo), hi != uint64(int64(lo)>>63)
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

// setBig stores numerator i of a new polynomial, as an int64 if it fits.
func (p *Poly) setBig(i int, z *big.Int) {
	if z.IsInt64() {
		p.num[i] = z.Int64()
		if p.bnum != nil {
			p.bnum[i] = nil
		}
		return
	}
	if p.bnum == nil {
		p.bnum = make([]*big.Int, p.n())
	}
	p.bnum[i] = z
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

func zeroWords(ws []uint64) bool {
	for _, x := range ws {
		if x != 0 {
			return false
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

// packExps packs an exponent vector into a monomial of width w; it
// returns false if an exponent is negative or above MaxExponent, or if a
// nonzero exponent does not fit in w words.
func packExps(exps []int, w int) ([]uint64, bool) {
	m := make([]uint64, w)
	for v, e := range exps {
		if e == 0 {
			continue
		}
		if e < 0 || e > MaxExponent || 1+v/perWord >= w {
			return nil, false
		}
		monoSetExp(m, v, e)
		m[0] += uint64(e)
	}
	return m, true
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
// give 0.
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

// mulTerm returns p times the monomial m (width <= p.w or widened) with
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

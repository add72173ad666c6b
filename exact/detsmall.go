package exact

// Determinants of order at most 3 whose entries pass a word (up to three
// words), in fixed arrays of words on the stack: cofactor expansion along
// the first row, each product schoolbook in math/bits. The reduced
// Cayley–Menger matrix of a random tetrahedron (geom.Simplex.CayleyMenger,
// 3x3, entries of 64–130 bits) took Bareiss in big.Int on copies of the
// 5x5 bordered matrix before. Figures in exact/geom/cayley.go, which owns
// the Cayley–Menger route.

import (
	"math/big"
	"math/bits"
)

// Wide is a signed integer of 256 bits in two's complement, least
// significant word first: the entries of DetWide. Add and Sub wrap modulo
// 2^256; DetWide takes entries below 2^192 in magnitude.
type Wide [4]uint64

// wideMaxWords is the magnitude, in words, of DetWide's entries.
const wideMaxWords = 3

// SetInt sets z to x and reports whether |x| < 2^255 (z is unchanged
// otherwise).
func (z *Wide) SetInt(x *big.Int) bool {
	ws := x.Bits()
	if len(ws) > len(z) || len(ws) == len(z) && ws[len(z)-1]>>63 != 0 || bits.UintSize != 64 {
		return false
	}
	*z = Wide{}
	for i, w := range ws {
		z[i] = uint64(w)
	}
	if x.Sign() < 0 {
		z.neg()
	}
	return true
}

// Add sets z to x + y modulo 2^256 and returns z.
func (z *Wide) Add(x, y *Wide) *Wide {
	var c uint64
	for i := range z {
		z[i], c = bits.Add64(x[i], y[i], c)
	}
	return z
}

// Sub sets z to x − y modulo 2^256 and returns z.
func (z *Wide) Sub(x, y *Wide) *Wide {
	var b uint64
	for i := range z {
		z[i], b = bits.Sub64(x[i], y[i], b)
	}
	return z
}

func (z *Wide) neg() {
	var b uint64
	for i := range z {
		z[i], b = bits.Sub64(0, z[i], b)
	}
}

// mag returns |z| as words (len trimmed, none if z = 0) in buf and
// whether z < 0; ok is false if |z| >= 2^192.
func (z *Wide) mag(buf *[wideMaxWords]uint64) (m []uint64, neg, ok bool) {
	x := *z
	if neg = int64(x[3]) < 0; neg {
		x.neg()
	}
	if x[3] != 0 {
		return nil, neg, false
	}
	n := wideMaxWords
	for n > 0 && x[n-1] == 0 {
		n--
	}
	copy(buf[:], x[:wideMaxWords])
	return buf[:n], neg, true
}

// detAcc is a signed accumulator of detAccWords words in two's
// complement: room for a determinant of order 3 of entries below 2^192
// (|det| <= 6·2^576).
type detAcc [detAccWords]uint64

const detAccWords = 3*wideMaxWords + 1

// mulAdd adds x·y (magnitudes, len(x) <= wideMaxWords, len(x)+len(y) <=
// detAccWords), or subtracts it if sub, modulo 2^(64 detAccWords).
func (a *detAcc) mulAdd(x, y []uint64, sub bool) {
	if len(x) == 0 || len(y) == 0 {
		return
	}
	var p detAcc
	n := len(x) + len(y)
	for i, xi := range x {
		var c uint64
		pi := p[i:n]
		for j, yj := range y {
			hi, lo := bits.Mul64(xi, yj)
			var c1, c2 uint64
			lo, c1 = bits.Add64(lo, c, 0)
			pi[j], c2 = bits.Add64(pi[j], lo, 0)
			c = hi + c1 + c2 // xi·yj + c + pi[j] < 2^128
		}
		pi[len(y)] = c
	}
	var c uint64
	if sub {
		for i, v := range p[:n] {
			a[i], c = bits.Sub64(a[i], v, c)
		}
		for i := n; i < len(a) && c != 0; i++ {
			a[i], c = bits.Sub64(a[i], 0, c)
		}
		return
	}
	for i, v := range p[:n] {
		a[i], c = bits.Add64(a[i], v, c)
	}
	for i := n; i < len(a) && c != 0; i++ {
		a[i], c = bits.Add64(a[i], 0, c)
	}
}

// mag returns |a| (len trimmed) and whether a < 0, overwriting a.
func (a *detAcc) mag() (m []uint64, neg bool) {
	if neg = int64(a[len(a)-1]) < 0; neg {
		var b uint64
		for i := range a {
			a[i], b = bits.Sub64(0, a[i], b)
		}
	}
	return trimWords(a[:]), neg
}

// detWideMag returns |det a| (len trimmed, in acc) and its sign for the
// n x n matrix a (row-major, n <= 3) by cofactor expansion along the
// first row (Laplace); ok is false if n > 3 or an entry is 2^192 or more
// in magnitude.
func detWideMag(n int, a []Wide, acc *detAcc) (m []uint64, neg, ok bool) {
	if n > 3 || len(a) != n*n {
		return nil, false, false
	}
	var buf [9][wideMaxWords]uint64
	var mags [9][]uint64
	var sign [9]bool
	for i := range a {
		if mags[i], sign[i], ok = a[i].mag(&buf[i]); !ok {
			return nil, false, false
		}
	}
	*acc = detAcc{}
	switch n {
	case 0:
		acc[0] = 1
	case 1:
		acc.mulAdd(mags[0], []uint64{1}, sign[0])
	case 2:
		acc.mulAdd(mags[0], mags[3], sign[0] != sign[3])
		acc.mulAdd(mags[1], mags[2], sign[1] == sign[2])
	case 3:
		// det = Σ_j (−1)^j a_0j M_j, M_j the minor of rows 1, 2 without
		// column j: columns (c1, c2) = (1, 2), (0, 2), (0, 1).
		for j, c := range [3][2]int{{1, 2}, {0, 2}, {0, 1}} {
			x, y := 3+c[0], 6+c[1]
			u, v := 3+c[1], 6+c[0]
			var minor detAcc
			minor.mulAdd(mags[x], mags[y], sign[x] != sign[y])
			minor.mulAdd(mags[u], mags[v], sign[u] == sign[v])
			mm, mneg := minor.mag()
			acc.mulAdd(mags[j], mm, (sign[j] != mneg) != (j == 1))
		}
	}
	m, neg = acc.mag()
	return m, neg, true
}

// DetWide returns the determinant of the n x n matrix a (row-major, n <=
// 3, entries below 2^192 in magnitude) exactly; ok is false otherwise.
func DetWide(n int, a []Wide) (_ *big.Int, ok bool) {
	var acc detAcc
	m, neg, ok := detWideMag(n, a, &acc)
	if !ok {
		return nil, false
	}
	ws := make([]big.Word, len(m))
	for i, w := range m {
		ws[i] = big.Word(w)
	}
	z := new(big.Int).SetBits(ws)
	if neg {
		z.Neg(z)
	}
	return z, true
}

// detIntsWide is DetWide on the square matrix a given by rows; ok is
// false where DetWide's is.
func detIntsWide(a [][]*big.Int) (_ *big.Int, ok bool) {
	n := len(a)
	if n > 3 {
		return nil, false
	}
	var w [9]Wide
	for i, r := range a {
		for j, x := range r {
			if !w[i*n+j].SetInt(x) {
				return nil, false
			}
		}
	}
	return DetWide(n, w[:n*n])
}

// DetWideOver returns det(a)/f^k in lowest terms for the n x n matrix a as
// DetWide takes it and a word f > 0; ok is false where DetWide's is.
//
// No gcd of long integers: with N = |det a| and t_0 = f, step i takes
// t_i = gcd(N, f) = gcd(N mod t_(i−1), t_(i−1)) in words and sets N to
// N/t_i, the denominator gaining the factor f/t_i; k steps, the gcds
// skipped once t_i = 1. Why it is right: with t = gcd(N, f), N/t is
// coprime to f/t (a prime p of f/t has v_p(t) = v_p(N) < v_p(f)), and
// stays so as it is divided further; so the final N is coprime to every
// factor of the denominator, hence to their product. And gcd(N/t, f)
// divides t (the primes of f/t are gone from N/t; the others have v_p(f)
// = v_p(t)), so gcd(N/t, f) = gcd(N/t, t): each gcd is of words.
func DetWideOver(n int, a []Wide, f uint64, k int) (_ *big.Rat, ok bool) {
	if f == 0 || k < 0 {
		return nil, false
	}
	var acc detAcc
	num, neg, ok := detWideMag(n, a, &acc)
	if !ok {
		return nil, false
	}
	if len(num) == 0 {
		return new(big.Rat), true
	}
	// The result, its numerator's and denominator's words in one block
	// (the denominator grows by at most a word per factor).
	blk := new(ratWords)
	ws := blk.w[:]
	if len(num)+k+1 > len(ws) {
		ws = make([]big.Word, len(num)+k+1)
	}
	den := append(ws[len(num):len(num)], 1)
	var q detAcc
	t := f
	for i := 0; i < k; i++ {
		if t != 1 {
			// N/t_(i−1) if it is exact (then t_i = t_(i−1)), else the
			// gcd of the remainder and N/t_i.
			if r := quoRemWords(q[:len(num)], num, t); r == 0 {
				num = trimWords(append(num[:0], q[:len(num)]...))
			} else if t = gcdStein(r, t); t != 1 {
				quoRemWords(num, num, t)
				num = trimWords(num)
			}
		}
		den = mulWord(den, f/t)
	}
	for i, w := range num {
		ws[i] = big.Word(w)
	}
	r := blk.r.SetInt64(1) // the Denom of a zero Rat is no reference
	r.Num().SetBits(ws[:len(num):len(num)])
	if neg {
		r.Num().Neg(r.Num())
	}
	r.Denom().SetBits(den)
	return r, true
}

// ratWords is a big.Rat with room for its words: one allocation.
type ratWords struct {
	r big.Rat
	w [detAccWords + 6]big.Word
}

// gcdStein returns gcd(a, b) for b > 0 by Stein's binary algorithm
// (Knuth, TAOCP vol. 2, 4.5.2, Algorithm B): shifts and subtractions, no
// division.
func gcdStein(a, b uint64) uint64 {
	if a == 0 {
		return b
	}
	sh := bits.TrailingZeros64(a | b)
	a >>= bits.TrailingZeros64(a)
	for b != 0 {
		b >>= bits.TrailingZeros64(b)
		if a > b {
			a, b = b, a
		}
		b -= a
	}
	return a << sh
}

// quoRemWords sets q to x/d and returns x mod d (x little-endian words,
// len(q) = len(x), q may be x; d > 0).
func quoRemWords(q, x []uint64, d uint64) uint64 {
	var r uint64
	for i := len(x) - 1; i >= 0; i-- {
		q[i], r = bits.Div64(r, x[i], d)
	}
	return r
}

// trimWords drops x's leading zero words.
func trimWords(x []uint64) []uint64 {
	for len(x) > 0 && x[len(x)-1] == 0 {
		x = x[:len(x)-1]
	}
	return x
}

// mulWord sets z to z·m (m > 0; z non-zero, trimmed, with room for a
// word more) and returns it trimmed.
func mulWord(z []big.Word, m uint64) []big.Word {
	if m == 1 {
		return z
	}
	var c uint64
	for i, w := range z {
		hi, lo := bits.Mul64(uint64(w), m)
		var cc uint64
		lo, cc = bits.Add64(lo, c, 0)
		z[i], c = big.Word(lo), hi+cc
	}
	if c != 0 {
		z = append(z, big.Word(c))
	}
	return z
}

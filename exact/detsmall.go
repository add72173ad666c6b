package exact

// Determinants of order at most 3 whose entries pass a word (up to three
// words), in fixed arrays of words on the stack: cofactor expansion along
// the first row, each product schoolbook in math/bits. The reduced
// Cayley–Menger matrix of a random tetrahedron (geom.Simplex.CayleyMenger,
// 3x3, entries of 64–130 bits) took Bareiss in big.Int on copies of the
// 5x5 bordered matrix before. Figures for that route in
// exact/geom/cayley.go. Here (2 cores shared, load 3–4, three alternating
// runs): DetInts on 3x3 matrices of 64–128-bit entries, either sign,
// 1,058–1,376 ns/op before (big.Int Bareiss on pooled copies), 393–479
// after; BenchmarkDetWide3 (the elimination alone) 201–214 ns;
// BenchmarkFracWordPow 317–328 ns against math/big's SetFrac 1,372–1,645.

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

// Int sets dst to z and returns dst, in dst's words where they have room.
func (z *Wide) Int(dst *big.Int) *big.Int {
	m := *z
	neg := int64(m[3]) < 0
	if neg {
		m.neg()
	}
	w := trimWords(m[:])
	if bits.UintSize != 64 { // big.Word is 32 bits
		dst.SetInt64(0)
		for i := len(w) - 1; i >= 0; i-- {
			dst.Lsh(dst, 64).Or(dst, new(big.Int).SetUint64(w[i]))
		}
	} else {
		ws := dst.Bits()
		if cap(ws) < len(w) {
			ws = make([]big.Word, len(w))
		}
		dst.SetBits(putWords(ws[:cap(ws)], w))
	}
	if neg {
		dst.Neg(dst)
	}
	return dst
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

func (z *Wide) neg() { negWords(z[:]) }

// mag sets z to |z| and returns its words (len trimmed, none if z = 0)
// and whether z was negative; ok is false if |z| >= 2^192.
func (z *Wide) mag() (m []uint64, neg, ok bool) {
	if neg = int64(z[3]) < 0; neg {
		z.neg()
	}
	if z[3] != 0 {
		return nil, neg, false
	}
	return trimWords(z[:wideMaxWords]), neg, true
}

// detAccWords is the width of a determinant of order 3 of entries below
// 2^192 (|det| <= 6·2^576), with its sign, in two's complement.
const detAccWords = 3*wideMaxWords + 1

// mulAdd adds x·y to a, or subtracts it if sub (x and y magnitudes,
// len(x)+len(y) <= len(a)), modulo 2^(64 len(a)): row by row straight
// into a, the carry or borrow carried up only as far as it goes.
func mulAdd(a, x, y []uint64, sub bool) {
	for i, xi := range x {
		ai := a[i:]
		var c uint64 // what the next word gains (or loses)
		for j, yj := range y {
			hi, lo := bits.Mul64(xi, yj)
			var c1, c2 uint64
			lo, c1 = bits.Add64(lo, c, 0)
			if sub {
				ai[j], c2 = bits.Sub64(ai[j], lo, 0)
			} else {
				ai[j], c2 = bits.Add64(ai[j], lo, 0)
			}
			c = hi + c1 + c2 // xi·yj + c + 1 < 2^128
		}
		for j := len(y); j < len(ai) && c != 0; j++ {
			if sub {
				ai[j], c = bits.Sub64(ai[j], c, 0)
			} else {
				ai[j], c = bits.Add64(ai[j], c, 0)
			}
		}
	}
}

// magWords sets a to |a| (two's complement) and returns its words, len
// trimmed, and whether a was negative.
func magWords(a []uint64) (m []uint64, neg bool) {
	if neg = int64(a[len(a)-1]) < 0; neg {
		negWords(a)
	}
	return trimWords(a), neg
}

// detWideMag returns |det a| (len trimmed, in acc) and its sign for the
// n x n matrix a (row-major, n <= 3) by cofactor expansion along the
// first row (Laplace); ok is false if n > 3 or an entry is 2^192 or more
// in magnitude.
func detWideMag(n int, a []Wide, acc *[detAccWords]uint64) (m []uint64, neg, ok bool) {
	if n > 3 || len(a) != n*n || bits.UintSize != 64 { // results in 64-bit big.Words
		return nil, false, false
	}
	var abs [9]Wide
	var mags [9][]uint64
	var sign [9]bool
	for i := range a {
		abs[i] = a[i]
		if mags[i], sign[i], ok = abs[i].mag(); !ok {
			return nil, false, false
		}
	}
	*acc = [detAccWords]uint64{}
	switch n {
	case 0:
		acc[0] = 1
	case 1:
		mulAdd(acc[:], mags[0], []uint64{1}, sign[0])
	case 2:
		mulAdd(acc[:], mags[0], mags[3], sign[0] != sign[3])
		mulAdd(acc[:], mags[1], mags[2], sign[1] == sign[2])
	case 3:
		// det = Σ_j (−1)^j a_0j M_j, M_j the minor of rows 1, 2 without
		// column j: columns (c1, c2) = (1, 2), (0, 2), (0, 1).
		for j, c := range [3][2]int{{1, 2}, {0, 2}, {0, 1}} {
			x, y := 3+c[0], 6+c[1]
			u, v := 3+c[1], 6+c[0]
			var minor [2*wideMaxWords + 1]uint64
			mulAdd(minor[:], mags[x], mags[y], sign[x] != sign[y])
			mulAdd(minor[:], mags[u], mags[v], sign[u] == sign[v])
			mm, mneg := magWords(minor[:])
			mulAdd(acc[:], mags[j], mm, (sign[j] != mneg) != (j == 1))
		}
	}
	m, neg = magWords(acc[:])
	return m, neg, true
}

// DetWide returns the determinant of the n x n matrix a (row-major, n <=
// 3, entries below 2^192 in magnitude) exactly; ok is false otherwise.
func DetWide(n int, a []Wide) (_ *big.Int, ok bool) {
	var acc [detAccWords]uint64
	m, neg, ok := detWideMag(n, a, &acc)
	if !ok {
		return nil, false
	}
	return newIntWords(m, neg), true
}

// newIntWords returns −m if neg, else m, as a new big.Int, for the
// magnitude m in 64-bit words (leading zeros allowed; big.Word of 64 bits).
func newIntWords(m []uint64, neg bool) *big.Int {
	z := new(big.Int).SetBits(putWords(make([]big.Word, len(m)), m))
	if neg {
		z.Neg(z)
	}
	return z
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
// DetWide takes it and a word f > 0 (fracWordPow); ok is false where
// DetWide's is.
func DetWideOver(n int, a []Wide, f uint64, k int) (_ *big.Rat, ok bool) {
	if f == 0 || k < 0 {
		return nil, false
	}
	var acc [detAccWords]uint64
	num, neg, ok := detWideMag(n, a, &acc)
	if !ok {
		return nil, false
	}
	return fracWordPow(num, neg, f, k), true
}

// FracWordPow returns x/f^k in lowest terms for a word f > 0 and k >= 0,
// as fracWordPow, without a gcd of long integers: what ratFrac(x, s^k)
// does for s = f or s = f² (then 2k factors), in a fraction of the time
// when x is a few words. ok is false if f = 0, k < 0 or big.Word is not
// 64 bits.
func FracWordPow(x *big.Int, f uint64, k int) (_ *big.Rat, ok bool) {
	if f == 0 || k < 0 || bits.UintSize != 64 {
		return nil, false
	}
	var buf [16]uint64
	num := buf[:0]
	if len(x.Bits()) > len(buf) {
		num = make([]uint64, 0, len(x.Bits()))
	}
	for _, w := range x.Bits() {
		num = append(num, uint64(w))
	}
	return fracWordPow(num, x.Sign() < 0, f, k), true
}

// fracWordPow returns ±num/f^k in lowest terms (num trimmed, overwritten;
// − if neg), f > 0.
//
// With N = num and t_0 = f, step i takes t_i = gcd(N, f) = gcd(N,
// t_(i−1)) in words (divGCD) and sets N to N/t_i, the denominator gaining
// the factor f/t_i; k steps, the gcds skipped once t_i = 1. Why it is
// right: with t = gcd(N, f), N/t is coprime to f/t (a prime p of f/t has
// v_p(t) = v_p(N) < v_p(f)), and stays so as it is divided further; so
// the final N is coprime to every factor of the denominator, hence to
// their product. And gcd(N/t, f) divides t (the primes of f/t are gone
// from N/t; the others have v_p(f) = v_p(t)), so gcd(N/t, f) = gcd(N/t,
// t): each gcd is of words.
func fracWordPow(num []uint64, neg bool, f uint64, k int) *big.Rat {
	if len(num) == 0 {
		return new(big.Rat)
	}
	var dbuf [16]uint64 // the denominator grows by at most a word per factor
	den := dbuf[:0]
	if k+1 > len(dbuf) {
		den = make([]uint64, 0, k+1)
	}
	num, den = ReduceWordPow(num, den, f, k, 1)
	// The words of both in one block: the one SetInt64 makes for the
	// denominator where it has room (the Denom of a zero Rat is no
	// reference), each Int's capacity cut at its length so that neither
	// grows into the other.
	r := new(big.Rat).SetInt64(1)
	d := r.Denom()
	ws := d.Bits()[:cap(d.Bits())]
	if len(ws) < len(num)+len(den) {
		ws = make([]big.Word, len(num)+len(den))
	}
	d.SetBits(putWords(ws, den))
	r.Num().SetBits(putWords(ws[len(den):], num))
	if neg {
		r.Num().Neg(r.Num())
	}
	return r
}

// ReduceWordPow reduces num/(f^k·c) to lowest terms for words f, c > 0
// and k >= 0 by fracWordPow's chain of word gcds (c a last factor, one
// gcd): num is a non-zero magnitude (words, lowest first, trimmed),
// divided in place; the denominator is built in den's storage (room for
// k+1 words saves allocating). It returns the two, trimmed. For callers
// that want the words themselves (geom squares them).
func ReduceWordPow(num, den []uint64, f uint64, k int, c uint64) ([]uint64, []uint64) {
	den = append(den[:0], 1)
	var qbuf [16]uint64
	q := qbuf[:]
	if len(num) > len(q) {
		q = make([]uint64, len(num))
	}
	var inv oddInverse
	t := f
	for i := 0; i < k; i++ {
		if t != 1 {
			num, t = divGCD(num, t, q[:len(num)], &inv)
		}
		den = mulWord(den, f/t)
	}
	if c != 1 {
		num, t = divGCD(num, c, q[:len(num)], &inv)
		den = mulWord(den, c/t)
	}
	return num, den
}

// putWords copies x into z (room for it) and returns z[:len(x):len(x)].
func putWords(z []big.Word, x []uint64) []big.Word {
	z = z[:len(x):len(x)]
	for i, w := range x {
		z[i] = big.Word(w)
	}
	return z
}

// gcdStein returns gcd(a, b) for b > 0 by Stein's binary algorithm
// (Stein 1967; Knuth, TAOCP vol. 2, 4.5.2, Algorithm B): shifts and
// subtractions, no division; the loop takes the smaller and the
// difference with min and max, so it has no branch on their order (2–3
// times faster than Euclid's divisions on 50-bit and on small operands, a
// microbenchmark, December 2026).
func gcdStein(a, b uint64) uint64 {
	if a == 0 {
		return b
	}
	k := bits.TrailingZeros64(a | b) // the common power of two
	a >>= bits.TrailingZeros64(a)
	for b != 0 { // a odd
		b >>= bits.TrailingZeros64(b)
		a, b = min(a, b), max(a, b)-min(a, b)
	}
	return a << k
}

// GCDWord returns gcd(a, b) of two words (GCDWord(0, 0) = 0): one Euclid
// step, which brings operands of unequal size (an lcm against a small
// denominator) together, then Stein's binary algorithm (gcdStein).
func GCDWord(a, b uint64) uint64 {
	if a < b {
		a, b = b, a
	}
	if b == 0 {
		return a
	}
	if a %= b; a == 0 {
		return b
	}
	return gcdStein(a, b)
}

// divGCD divides x (non-zero, trimmed) by g = gcd(x, t), t > 0, and
// returns x/g, trimmed, and g; q is scratch of len(x) words. No division
// instruction: with t = 2^a·u, u odd, the power of two is a shift, and
// the odd part one pass of quoOdd, which finds u's share of g from its
// carry when u does not divide x (then a second pass divides by it).
func divGCD(x []uint64, t uint64, q []uint64, inv *oddInverse) ([]uint64, uint64) {
	a := uint(bits.TrailingZeros64(t))
	u := t >> a
	g := uint64(1)
	if u > 1 {
		if c := quoOdd(q, x, u, inv.of(u)); c == 0 {
			copy(x, q)
			g = u
		} else if g = gcdStein(c, u); g > 1 {
			quoOdd(x, x, g, inv.of(g))
		}
	}
	e := a // min(a, the trailing zero bits of x)
	if x[0] != 0 {
		e = min(a, uint(bits.TrailingZeros64(x[0])))
	}
	if e > 0 {
		for i := range x {
			x[i] >>= e
			if i+1 < len(x) {
				x[i] |= x[i+1] << (64 - e)
			}
		}
	}
	return trimWords(x), g << e
}

// oddInverse keeps the last inverse modulo 2^64 it computed: DetWideOver
// divides by the same factor again and again.
type oddInverse struct{ u, inv uint64 }

// of returns the inverse of the odd word u modulo 2^64.
func (c *oddInverse) of(u uint64) uint64 {
	if c.u != u {
		c.u, c.inv = u, inv64(u)
	}
	return c.inv
}

// quoOdd sets q (len(x) words, may be x) to x/u modulo 2^(64 len(x)),
// for an odd word u, from the least significant word up (Jebelean 1993,
// "An algorithm for exact division"), and returns the carry c out of the
// top word: x − q·u = −c·2^(64 len(x)), 0 <= c <= u. So u divides x if
// and only if c = 0 (then q = x/u, the only multiple of u below 2^(64
// len(x)) that is x modulo it), and gcd(x, u) = gcd(c, u), 2 being a unit
// modulo u.
// inv is u's inverse modulo 2^64.
func quoOdd(q, x []uint64, u, inv uint64) (c uint64) {
	for i, xi := range x {
		v, b := bits.Sub64(xi, c, 0)
		qi := v * inv // qi·u = v modulo 2^64
		hi, _ := bits.Mul64(qi, u)
		q[i], c = qi, hi+b // x_i − c = qi·u − (hi + b)·2^64
	}
	return c
}

// trimWords drops x's leading zero words.
func trimWords(x []uint64) []uint64 {
	for len(x) > 0 && x[len(x)-1] == 0 {
		x = x[:len(x)-1]
	}
	return x
}

// mulWord sets z to z·m (m > 0; z non-zero, trimmed) and returns it
// trimmed.
func mulWord(z []uint64, m uint64) []uint64 {
	if m == 1 {
		return z
	}
	var c uint64
	for i, w := range z {
		hi, lo := bits.Mul64(w, m)
		var cc uint64
		lo, cc = bits.Add64(lo, c, 0)
		z[i], c = lo, hi+cc
	}
	if c != 0 {
		z = append(z, c)
	}
	return z
}

package exact

// Determinants of matrices whose entries (after clearing each row's
// denominators) fit machine words. Measured with BenchmarkDet{4,8,16}/int
// (go test -bench 'Det(4|8|16)$' -run XXX ./exact/), 2 cores shared with
// other sessions (load 4–15), best-ns/op of three alternating runs of
// the old build, this one and the reference, FLINT's fmpq_mat_det
// (/tmp/peer-bin/det /tmp/peer-data/int_N.txt 3000, entries in
// [-100, 100], its best time):
//
//	n   before (big.Int Bareiss; big modular)   after          reference       after/reference
//	4   1.65–1.77 µs                              0.22–0.24 µs   0.22 µs         1.0–1.1
//	8   5.6 µs                                    0.98–1.00 µs   1.73–1.76 µs    0.56–0.58
//	16  25.8–28.5 µs                              11.9–12.2 µs   11.8 µs         1.0–1.03
//
// At 16 the modular route's three primes take 12 µs of which the
// elimination (combine) is most; Bareiss in words gives up there after
// 4 µs, which the Hadamard test below now skips.
//
// The two routes, chosen per matrix rather than per n: Bareiss's
// fraction-free elimination in int64, every product formed in 128 bits
// and every exact quotient checked to fit a word (math/bits), which ends
// the elimination at the first overflow; then the multi-modular method
// on the same words (primes below 2^62, Montgomery products, CRT by
// Garner), with as many primes as Hadamard's bound computed from the
// exact row norms needs. Bareiss in words wins whenever every minor fits
// a word (small n, or small entries); where one does not, its quotient
// check fails within the first few steps, so trying it first costs
// little.

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"
	"sync"
)

// DetInts returns the determinant of the square integer matrix a, given by
// its rows (not modified; entries may be shared), exactly; the determinant
// of the 0x0 matrix is 1. It returns ErrNotSquare if a row's length
// differs from the number of rows.
func DetInts(a [][]*big.Int) (*big.Int, error) {
	n := len(a)
	for i, r := range a {
		if len(r) != n {
			return nil, fmt.Errorf("det needs a square matrix, row %d has length %d, there are %d rows: %w", i+1, len(r), n, ErrNotSquare)
		}
	}
	if n == 0 {
		return big.NewInt(1), nil
	}
	w := make([]int64, n*n)
	for i, r := range a {
		for j, x := range r {
			if !x.IsInt64() {
				return detIntsBig(a), nil
			}
			w[i*n+j] = x.Int64()
		}
	}
	d, z := detWords(n, w)
	if z == nil {
		z = big.NewInt(d)
	}
	return z, nil
}

// detIntsBig is DetInts for entries beyond a word: up to order 3 with
// entries below 2^192, cofactors in words (DetWide); up to order 6,
// Bareiss in fixed widths of words where Hadamard's bound allows
// (detIntsFixed); else Bareiss on copies below modularMinSize, as Det
// does (bareissPooled), else Det on the same matrix.
func detIntsBig(a [][]*big.Int) *big.Int {
	n := len(a)
	if d, ok := detIntsSmall(a); ok {
		return d
	}
	if n < modularMinSize {
		return bareissPooled(a)
	}
	m := Zeros(n, n)
	for i, r := range a {
		for j, x := range r {
			m.at(i, j).SetInt(x)
		}
	}
	return m.detModular(clearAuto).Num() // an integer matrix has an integer determinant
}

// detIntsSmall is det(a) for the square integer matrix a (not modified)
// by DetWide's cofactors (n <= 3, entries below 2^192) or Bareiss in fixed
// widths of words (n <= fixedMaxN, minors not too wide); ok is false where
// neither applies.
func detIntsSmall(a [][]*big.Int) (_ *big.Int, ok bool) {
	if d, ok := detIntsWide(a); ok {
		return d, true
	}
	return detIntsFixed(a)
}

// bareissPooled is bareissDet on copies of a in one pooled block.
func bareissPooled(a [][]*big.Int) *big.Int {
	n := len(a)
	width := 0
	for _, r := range a {
		for _, x := range r {
			width = max(width, len(x.Bits()))
		}
	}
	room := n*width + 1
	b := bareissPool.Get().(*bareissBlock)
	defer bareissPool.Put(b)
	words := grow(&b.words, n*n*room)
	ints := grow(&b.ints, n*n)
	ptrs := grow(&b.ptrs, n*n)
	rows := grow(&b.rows, n)
	for i, r := range a {
		rows[i] = ptrs[i*n : (i+1)*n]
		for j, x := range r {
			k := i*n + j
			z := ints[k].SetBits(words[k*room : k*room : (k+1)*room])
			rows[i][j] = z.Set(x)
		}
	}
	return new(big.Int).Set(bareissDet(rows)) // out of the pooled block
}

// bareissBlock is the storage of detIntsBig's copies, pooled: allocating
// it afresh (a few kilobytes of words at n = 5) was a third of the
// Cayley–Menger determinant of a random tetrahedron (BenchmarkExactSampledIdentity).
type bareissBlock struct {
	words []big.Word
	ints  []big.Int
	ptrs  []*big.Int
	rows  [][]*big.Int
}

var bareissPool = sync.Pool{New: func() any { return new(bareissBlock) }}

// grow returns (*s)[:n], reallocating *s when it is too short; the
// elements are whatever the last use left.
func grow[T any](s *[]T, n int) []T {
	if cap(*s) < n {
		*s = make([]T, n)
	}
	return (*s)[:n]
}

// wordRows appends to a the rows of m, each multiplied by the least
// common multiple of its denominators, as int64 words (row-major), and
// returns them with the product of the multipliers (nil when it is 1):
// det(m) = det(a) / scale. ok is false if a denominator, a multiplier or an
// entry does not fit a word.
func (m *Matrix) wordRows(a []int64) (_ []int64, scale *big.Int, ok bool) {
	n := m.cols
	for i := 0; i < m.rows; i++ {
		row := m.e[i*n : (i+1)*n]
		l := uint64(1)
		for _, v := range row {
			if v.IsInt() { // before Denom, which allocates for integers
				continue
			}
			d := v.Denom()
			if !d.IsUint64() {
				return nil, nil, false
			}
			if dw := d.Uint64(); dw != l {
				hi, lo := bits.Mul64(l/GCDWord(l, dw), dw)
				if hi != 0 || lo > math.MaxInt64 {
					return nil, nil, false
				}
				l = lo
			}
		}
		for _, v := range row {
			if !v.Num().IsInt64() {
				return nil, nil, false
			}
			x := v.Num().Int64()
			if l != 1 {
				var over bool
				if x, over = mulOv(x, int64(l/v.Denom().Uint64())); over {
					return nil, nil, false
				}
			}
			a = append(a, x)
		}
		if l != 1 {
			if scale == nil {
				scale = big.NewInt(1)
			}
			scale.Mul(scale, new(big.Int).SetUint64(l))
		}
	}
	return a, scale, true
}

// detWords returns the determinant of the n x n matrix a of words
// (row-major, not modified), as a word if ok, else as big: Bareiss in
// words if no minor overflows, else the multi-modular method.
func detWords(n int, a []int64) (word int64, big *big.Int) {
	hb, nonzero := hadamardBits(n, a)
	if !nonzero {
		return 0, nil
	}
	// A random matrix's determinant lies some n/2 log2(n) − log2(n!)/2
	// bits below Hadamard's bound (10–18 bits at n = 8..16); from n bits
	// over a word, Bareiss in words would stop at an overflow, after
	// a third of the work of one prime at n = 16 (measured).
	if hb/2 < 63+n {
		var buf [64]int64
		w := buf[:0]
		if n*n > len(buf) {
			w = make([]int64, 0, n*n)
		}
		w = append(w, a...)
		if d, ok := bareissWords(n, w); ok {
			return d, nil
		}
	}
	return 0, detModWords(n, a, hb)
}

// bareissWords returns det(w) by Bareiss's fraction-free elimination
// (see fractionFree) in int64, overwriting w; ok is false as soon as an
// entry would leave the int64 range. Every entry of step k is a minor of
// order k+1, so the products are formed in 128 bits. The exact quotient
// by the previous pivot is found without a division instruction: shift
// out the pivot's power of two, multiply by the inverse of its odd part
// modulo 2^64, and keep the quotient only if quotient × pivot gives the
// 128-bit dividend back, which proves it exact and in range (Jebelean
// 1993, "An algorithm for exact division", uses the same inverse).
func bareissWords(n int, w []int64) (det int64, ok bool) {
	neg := false
	var d exactDivisor
	d.set(1)
	for k := 0; k < n; k++ {
		switch pivotRow(w, n, k) {
		case n:
			return 0, true
		case k:
		default:
			neg = !neg
		}
		piv := w[k*n+k]
		rk := w[k*n+k+1 : (k+1)*n]
		for i := k + 1; i < n; i++ {
			f := w[i*n+k]
			ri := w[i*n+k+1 : (i+1)*n]
			for j, x := range rk {
				h1, l1 := mul128(ri[j], piv)
				h2, l2 := mul128(f, x)
				lo, b := bits.Sub64(l1, l2, 0)
				q, fits := d.quo(h1-h2-b, lo)
				if !fits {
					return 0, false
				}
				ri[j] = q
			}
		}
		d.set(piv)
	}
	det = w[n*n-1]
	if neg {
		det = -det // quo never returns math.MinInt64
	}
	return det, true
}

// pivotRow finds the first row p >= k of the n x n matrix a (row-major)
// with a non-zero entry in column k and swaps it into row k (columns k
// on; those before are zero in both); it returns p, n if there is none.
func pivotRow[T int64 | uint64](a []T, n, k int) int {
	p := k
	for p < n && a[p*n+k] == 0 {
		p++
	}
	if p != k && p != n {
		rp, rk := a[p*n+k:(p+1)*n], a[k*n+k:(k+1)*n]
		for j := range rk {
			rp[j], rk[j] = rk[j], rp[j]
		}
	}
	return p
}

// exactDivisor divides 128-bit integers exactly by a non-zero word d.
type exactDivisor struct {
	d     int64
	shift uint   // trailing zero bits of d
	inv   uint64 // inverse of d >> shift modulo 2^64
}

func (e *exactDivisor) set(d int64) {
	e.d, e.shift = d, uint(bits.TrailingZeros64(uint64(d)))
	e.inv = inv64(uint64(d >> e.shift))
}

// inv64 returns the inverse of the odd word u modulo 2^64.
func inv64(u uint64) uint64 {
	inv := u // u*u = 1 mod 8 for odd u: 3 bits; each Newton step doubles them
	for i := 0; i < 5; i++ {
		inv *= 2 - u*inv
	}
	return inv
}

// quo returns hi:lo / d if d divides the signed 128-bit hi:lo and the
// quotient lies in (-2^63, 2^63); ok is false otherwise.
func (e *exactDivisor) quo(hi, lo uint64) (int64, bool) {
	s := lo >> e.shift
	if e.shift > 0 {
		s |= hi << (64 - e.shift)
	}
	q := int64(s * e.inv)
	ph, pl := mul128(q, e.d)
	return q, ph == hi && pl == lo && q != math.MinInt64
}

// hadamardBits returns b with |det(a)| <= 2^(b/2) by Hadamard's
// inequality |det a| <= prod_i ||row i||: b is the sum over the rows of the
// bit length of the exact squared norm (summed in three words). ok is false
// if a row is zero (then det(a) = 0).
func hadamardBits(n int, a []int64) (b int, ok bool) {
	for i := 0; i < n; i++ {
		var w2, w1, w0 uint64
		for _, x := range a[i*n : (i+1)*n] {
			hi, lo := bits.Mul64(absU64(x), absU64(x))
			var c uint64
			w0, c = bits.Add64(w0, lo, 0)
			w1, c = bits.Add64(w1, hi, c)
			w2 += c
		}
		switch {
		case w2 != 0:
			b += 128 + bits.Len64(w2)
		case w1 != 0:
			b += 64 + bits.Len64(w1)
		case w0 != 0:
			b += bits.Len64(w0)
		default:
			return 0, false
		}
	}
	return b, true
}

// detModWords returns the determinant of the n x n matrix a of words
// (row-major) modulo enough primes below 2^62 to pass twice Hadamard's
// bound, rebuilt by the Chinese remainder theorem; hb is hadamardBits.
func detModWords(n int, a []int64, hb int) *big.Int {
	// Need prod p > 2 |det|, with |det| <= 2^(hb/2) and each p > 2^61.
	ms := moduli(max(1, (hb/2+1+primeBits)/primeBits))
	res := make([]uint64, len(ms))
	w := make([]uint64, n*n)
	for k, md := range ms {
		for i, x := range a {
			r := md.small(absU64(x))
			if x < 0 {
				r = md.sub(0, r)
			}
			w[i] = r
		}
		// The residues read as Montgomery forms stand for x/R, so the
		// elimination yields the Montgomery form of det(a)/R^n; times R^n.
		if det, div := md.eliminate(n, w); det != 0 {
			res[k] = md.mul(md.mul(det, md.inv(div)), md.pow(md.r[2], n-1))
		}
	}
	return crt(ms, res)
}

// eliminate returns det and div, Montgomery forms with det(a) = det/div,
// for the n x n matrix a of Montgomery forms (row-major, overwritten);
// det is 0 if a is singular modulo p. Division-free elimination: row i
// becomes piv*(row i) − f*(row k), which multiplies the determinant by
// piv; those factors collect in div, for the caller to divide out once.
func (md *modulus) eliminate(n int, a []uint64) (det, div uint64) {
	det, div = md.one, md.one
	for k := 0; k < n; k++ {
		switch pivotRow(a, n, k) {
		case n:
			return 0, div
		case k:
		default:
			det = md.sub(0, det)
		}
		piv := a[k*n+k]
		det = md.mul(det, piv)
		rk := a[k*n+k+1 : (k+1)*n]
		for i := k + 1; i < n; i++ {
			if f := a[i*n+k]; f != 0 {
				combine(a[i*n+k+1:(i+1)*n], rk, piv, md.p-f, md.p, md.negInv)
				div = md.mul(div, piv)
			}
		}
	}
	return det, div
}

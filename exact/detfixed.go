package exact

// Bareiss's fraction-free elimination in fixed-width signed integers of a
// few 64-bit words, for small matrices whose entries pass a word: the
// scaled Cayley–Menger matrix of a tetrahedron (5x5, a border of ones,
// entries of 64–130 bits for the kernel's random tetrahedra), which went
// through big.Int Bareiss on pooled copies (bareissPooled), ~15–18% of
// BenchmarkExactSampledIdentity by its profile. Measured on the shared
// 2-core machine (load 1.6–4), old and new test binaries alternating:
//
//	BenchmarkDetIntsFixed (5x5 of that shape, 90-bit entries):
//	  big.Int Bareiss 1.84–2.74 µs, this 1.53–2.03 µs (0.65–0.89 of it, same runs)
//	BenchmarkExactSampledIdentity -cpu 1, cpu-ms/op (10,000 samples),
//	five series of 3–5 alternating rounds:
//	  main at 04116fa 138–218, this 146–211; new/old in the same round
//	  0.83–1.01 in four series (median ~0.92), 1.11–1.16 in the first
//	  (old 138–144, new 160): within the machine's noise, not proven;
//	  profile share of the determinant (20 runs each) 14.8% -> 10.7%
//	  reference /tmp/peer-bin/tet: 104–157 ms (10.4–15.7 µs a sample)
//	BenchmarkDet4/int, BenchmarkDet8/int (word route, untouched):
//	  231–239 and 1001–1048 best-ns/op, old and new alike
//
// Left: the two products per entry (mulSubSigned, ~70% of this code's
// time) in Go's math/bits, against math/big's assembly inner loops; the
// sample's 8 µs target is not reached by this alone.
//
// Since then the Cayley–Menger determinant of a points simplex takes
// out the border first and, for k <= 3, goes to DetWide (detsmall.go);
// this route serves orders 4 to 6, and 1 to 3 past DetWide's 2^192.

import (
	"math"
	"math/big"
	"math/bits"
)

const (
	fixedMaxN     = 6  // largest order taken
	fixedMaxWords = 16 // widest minor, in words
)

// fixedInt is a signed two's-complement integer of up to fixedMaxWords
// words, least significant first; its width is the caller's to keep.
type fixedInt [fixedMaxWords]uint64

// detIntsFixed returns det(a) for the square integer matrix a (not
// modified) with n <= fixedMaxN, by Bareiss's fraction-free elimination
// (Bareiss 1968, "Sylvester's identity and multistep integer-preserving
// Gaussian elimination") in fixed-width words; ok is false if a is
// larger or a minor's bound needs more than fixedMaxWords words.
//
// Widths: after step k the entry (i, j) is the minor on the pivot rows
// of steps 0..k and row i, columns 0..k and j (Sylvester's identity), and
// by Hadamard's inequality it is at most the product of those rows'
// norms (restricting a row to some columns does not raise its norm); so
// the width of every entry, and of every pivot, is known as soon as the
// step's pivot row is: a row of small entries (the Cayley–Menger border
// of ones) keeps every minor through it narrow. Each entry is
// (piv·a_ij − a_ik·a_kj) / prev, an exact quotient that fits its width
// (it is such a minor), so it is determined by the dividend modulo
// 2^(64 w) times prev's power of two: only those low words of the
// products are formed, and the quotient is found from the least
// significant word up, as in bareissWords (Jebelean 1993, "An algorithm
// for exact division"). Nothing overflows unnoticed because nothing
// can: every value is within its bound by the two theorems, not by a
// check (TestDetIntsFixed meets the bound with Hadamard matrices).
func detIntsFixed(a [][]*big.Int) (_ *big.Int, ok bool) {
	n := len(a)
	if n == 0 || n > fixedMaxN || bits.UintSize != 64 {
		return nil, false
	}
	// rb[i]: ||row i||² < 2^rb[i], from the widest entry and the count.
	var rb [fixedMaxN]int
	sum := 0
	for i, r := range a {
		wide, cnt := 0, 0
		for _, x := range r {
			if l := x.BitLen(); l > 0 {
				wide, cnt = max(wide, l), cnt+1
			}
		}
		if cnt == 0 {
			return new(big.Int), true // a zero row
		}
		rb[i] = 2*wide + bits.Len(uint(cnt))
		sum += rb[i]
	}
	if fixedWidth(sum) > fixedMaxWords {
		return nil, false
	}

	var e [fixedMaxN * fixedMaxN]fixedInt
	var row [fixedMaxN]int // row[i]: where row i of the elimination is stored
	for i := range a {
		row[i] = i
	}
	widest := func(from int) int { // the largest rb of rows from on
		m := 0
		for _, r := range row[from:n] {
			m = max(m, rb[r])
		}
		return m
	}
	wp := fixedWidth(widest(0))
	for i, r := range a {
		for j, x := range r {
			z := &e[i*n+j]
			for k, v := range x.Bits() {
				z[k] = uint64(v)
			}
			if x.Sign() < 0 {
				negWords(z[:wp])
			}
		}
	}

	neg := false
	var div oddDivisor
	var shift uint
	var d [2 * fixedMaxWords]uint64
	pivots := 0 // sum of rb over the pivot rows so far
	for k := 0; k < n; k++ {
		pr := k
		for pr < n && zeroWords(e[row[pr]*n+k][:wp]) {
			pr++
		}
		switch pr {
		case n:
			return new(big.Int), true
		case k:
		default:
			row[pr], row[k] = row[k], row[pr]
			neg = !neg
		}
		if k == n-1 {
			break
		}
		pivots += rb[row[k]]
		wq := fixedWidth(pivots + widest(k+1))
		piv := e[row[k]*n+k][:wp]
		rk := e[row[k]*n:]
		// The dividend modulo 2^(64 wd) is all the quotient needs: its
		// words from shift on, wq of them (it fits 2 wp words exactly).
		wd := min(2*wp, wq+int(shift/64)+1)
		if k == 0 {
			wd = min(2*wp, wq)
		}
		for i := k + 1; i < n; i++ {
			ri := e[row[i]*n:]
			f := ri[k][:wp]
			for j := k + 1; j < n; j++ {
				mulSubSigned(d[:wd], piv, ri[j][:wp], f, rk[j][:wp])
				q := ri[j][:wq]
				if k == 0 { // prev = 1
					shiftRight(q, d[:wd], 0)
				} else {
					shiftRight(q, d[:wd], shift)
					div.quo(q)
				}
			}
		}
		if k+1 < n-1 { // the next divisor
			shift = div.set(piv)
		}
		wp = wq
	}
	det := e[row[n-1]*n+n-1][:wp]
	negative := int64(det[len(det)-1]) < 0
	if negative {
		negWords(det)
	}
	return newIntWords(det, negative != neg), true
}

// oddDivisor divides exactly by the odd part u of a non-zero integer,
// from the least significant word up (Jebelean 1993, "An algorithm for
// exact division"): each quotient word is the remainder's lowest word
// times the inverse of u modulo 2^64, and u times it is taken off.
type oddDivisor struct {
	u   fixedInt // |odd part|, len(u) significant words
	w   int
	neg bool
	inv uint64 // u[0]^−1 modulo 2^64
}

// set makes e divide by the odd part of x (non-zero, two's complement)
// and returns the shift of x's power of two.
func (e *oddDivisor) set(x []uint64) uint {
	var sh uint
	for _, v := range x {
		if v != 0 {
			sh += uint(bits.TrailingZeros64(v))
			break
		}
		sh += 64
	}
	u := e.u[:len(x)]
	shiftRight(u, x, sh)
	if e.neg = int64(u[len(u)-1]) < 0; e.neg {
		negWords(u)
	}
	e.w = len(u)
	for e.w > 1 && u[e.w-1] == 0 {
		e.w--
	}
	e.inv = inv64(u[0])
	return sh
}

// quo sets r to r/u modulo 2^(64 len(r)) (r a multiple of u: then the
// exact quotient where it fits len(r) words).
func (e *oddDivisor) quo(r []uint64) {
	u := e.u[:e.w]
	for i := range r {
		qi := r[i] * e.inv
		rr := r[i:]
		var c, b uint64
		for j, uj := range u[:min(len(u), len(rr))] {
			hi, lo := bits.Mul64(qi, uj)
			var cc uint64
			lo, cc = bits.Add64(lo, c, 0)
			c = hi + cc
			rr[j], b = bits.Sub64(rr[j], lo, b)
		}
		for j := len(u); j < len(rr) && (c|b) != 0; j++ {
			rr[j], b = bits.Sub64(rr[j], c, b)
			c = 0
		}
		r[i] = qi // rr[0] is now 0; the quotient word takes its place
	}
	if e.neg {
		negWords(r)
	}
}

// fixedWidth returns the words w for integers below 2^(b/2) in
// magnitude: |x| < 2^(64 w − 1).
func fixedWidth(b int) int {
	return ((b+1)/2 + 1 + 63) / 64
}

// mulSubSigned sets z to x·y − f·g modulo 2^(64 len(z)), for signed
// x, y, f, g of one width w, len(z) <= 2w.
func mulSubSigned(z, x, y, f, g []uint64) {
	l, w := len(z), len(x)
	clear(z)
	for i := 0; i < min(w, l); i++ {
		zi := z[i:]
		n := min(w, l-i)
		xi, fi := x[i], f[i]
		var c, cf, b uint64
		yy, gg, zz := y[:n], g[:n], zi[:n]
		for j, yj := range yy {
			hi, lo := bits.Mul64(xi, yj)
			var cc uint64
			lo, cc = bits.Add64(lo, c, 0)
			c = hi + cc
			v, cc := bits.Add64(zz[j], lo, 0)
			c += cc
			hi, lo = bits.Mul64(fi, gg[j])
			lo, cc = bits.Add64(lo, cf, 0)
			cf = hi + cc
			zz[j], b = bits.Sub64(v, lo, b)
		}
		if n < len(zi) { // the row's top word, c − cf − b, may be negative
			t, b1 := bits.Sub64(c, cf, b)
			v, c1 := bits.Add64(zi[n], t, 0)
			zi[n] = v
			for k := n + 1; k < len(zi) && c1 != b1; k++ {
				if c1 != 0 {
					zi[k]++
					c1 = b2u(zi[k] == 0)
				} else {
					zi[k]--
					b1 = b2u(zi[k] == math.MaxUint64)
				}
			}
		}
	}
	// The unsigned products of two's complements, corrected: a negative x
	// stands for x + 2^(64 w), so take y·2^(64 w) off, and so on.
	if w < l {
		if int64(x[w-1]) < 0 {
			addWords(z[w:], y, true)
		}
		if int64(y[w-1]) < 0 {
			addWords(z[w:], x, true)
		}
		if int64(f[w-1]) < 0 {
			addWords(z[w:], g, false)
		}
		if int64(g[w-1]) < 0 {
			addWords(z[w:], f, false)
		}
	}
}

// addWords sets z to z + y, or z − y if sub, modulo 2^(64 len(z));
// len(y) <= len(z), y zero-extended.
func addWords(z, y []uint64, sub bool) {
	var c uint64
	for i := range z {
		var yi uint64
		if i < len(y) {
			yi = y[i]
		}
		if sub {
			z[i], c = bits.Sub64(z[i], yi, c)
		} else {
			z[i], c = bits.Add64(z[i], yi, c)
		}
	}
}

// negWords sets z to −z modulo 2^(64 len(z)).
func negWords(z []uint64) {
	var b uint64
	for i := range z {
		z[i], b = bits.Sub64(0, z[i], b)
	}
}

// signWord is 0 for non-negative x, all ones for negative.
func signWord(x []uint64) uint64 {
	return uint64(int64(x[len(x)-1]) >> 63)
}

// shiftRight sets z to the low len(z) words of x >> sh (arithmetic: x
// sign-extended).
func shiftRight(z, x []uint64, sh uint) {
	sw, sb := int(sh/64), sh%64
	s := signWord(x)
	at := func(i int) uint64 {
		if i < len(x) {
			return x[i]
		}
		return s
	}
	for i := range z {
		v := at(i + sw)
		if sb != 0 {
			v = v>>sb | at(i+sw+1)<<(64-sb)
		}
		z[i] = v
	}
}

func b2u(b bool) uint64 {
	if b {
		return 1
	}
	return 0
}

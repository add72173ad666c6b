package geom

import (
	"math/big"
	"math/bits"

	"assay/exact"
)

// Integer helpers: common denominators and fraction-free determinants.

var bigOne = big.NewInt(1)

// lcmAcc accumulates the least common multiple of denominators, in a
// word while it stays small.
type lcmAcc struct {
	small uint64 // the lcm while big is nil (0 means 1)
	big   *big.Int
	g, q  big.Int
}

// add takes in the denominator of x (nil counts as 0, denominator 1).
func (a *lcmAcc) add(x *big.Rat) {
	if x == nil || x.IsInt() {
		return
	}
	d := x.Denom()
	if a.big == nil {
		if a.small == 0 {
			a.small = 1
		}
		if d.IsUint64() {
			du := d.Uint64()
			if hi, lo := bits.Mul64(a.small/exact.GCDWord(a.small, du), du); hi == 0 {
				a.small = lo
				return
			}
		}
		a.big = new(big.Int).SetUint64(a.small)
	}
	a.g.GCD(nil, nil, a.big, d)
	if a.g.Cmp(d) != 0 {
		a.q.Quo(d, &a.g)
		a.big.Mul(a.big, &a.q)
	}
}

// word returns the lcm and true while it fits a word.
func (a *lcmAcc) word() (uint64, bool) {
	if a.big != nil {
		return 0, false
	}
	return max(a.small, 1), true
}

// value returns the lcm (a new Int).
func (a *lcmAcc) value() *big.Int {
	if a.big != nil {
		return new(big.Int).Set(a.big)
	}
	if a.small == 0 {
		return big.NewInt(1)
	}
	return new(big.Int).SetUint64(a.small)
}

// lcmDenoms returns the least common multiple of the denominators of the
// given rationals (1 for none); nil entries count as 0.
func lcmDenoms(xs []*big.Rat) *big.Int {
	var a lcmAcc
	for _, x := range xs {
		a.add(x)
	}
	return a.value()
}

// scaleToInt returns x·l as an integer; l must be a multiple of x's
// denominator. A nil x gives 0.
func scaleToInt(x *big.Rat, l *big.Int) *big.Int {
	return setScaled(new(big.Int), x, l)
}

// setScaled sets z to x·l and returns z; l must be a multiple of x's
// denominator. A nil x gives 0.
func setScaled(z *big.Int, x *big.Rat, l *big.Int) *big.Int {
	if x == nil || x.Sign() == 0 {
		return z.SetInt64(0)
	}
	if x.IsInt() {
		return z.Mul(x.Num(), l)
	}
	z.Quo(l, x.Denom())
	return z.Mul(z, x.Num())
}

// bareiss returns the determinant of the square integer matrix a (rows of
// equal length), destroying a. Fraction-free elimination (Bareiss 1968)
// with row swaps for zero pivots; every division is exact.
func bareiss(a [][]*big.Int) *big.Int {
	n := len(a)
	switch n {
	case 0:
		return big.NewInt(1)
	case 1:
		return new(big.Int).Set(a[0][0])
	case 2:
		z := new(big.Int).Mul(a[0][0], a[1][1])
		return z.Sub(z, new(big.Int).Mul(a[0][1], a[1][0]))
	}
	neg := false
	prev := bigOne
	var t big.Int
	for p := 0; p < n-1; p++ {
		if a[p][p].Sign() == 0 {
			r := p + 1
			for r < n && a[r][p].Sign() == 0 {
				r++
			}
			if r == n {
				return new(big.Int)
			}
			a[p], a[r] = a[r], a[p]
			neg = !neg
		}
		piv := a[p][p]
		for i := p + 1; i < n; i++ {
			ai := a[i]
			aip := ai[p]
			for j := p + 1; j < n; j++ {
				x := ai[j]
				x.Mul(x, piv)
				t.Mul(aip, a[p][j])
				x.Sub(x, &t)
				if prev != bigOne {
					x.Quo(x, prev)
				}
			}
		}
		prev = piv
	}
	z := new(big.Int).Set(a[n-1][n-1])
	if neg {
		z.Neg(z)
	}
	return z
}

// factorial returns m! as a big.Int.
func factorial(m int) *big.Int {
	z := big.NewInt(1)
	for i := 2; i <= m; i++ {
		z.Mul(z, big.NewInt(int64(i)))
	}
	return z
}

// ratFrac returns num/den as a new big.Rat (den != 0), in lowest terms.
// Reducing is most of the cost of the shape methods (see divGCD).
func ratFrac(num, den *big.Int) *big.Rat {
	if den.Sign() == 0 {
		panic("geom: ratFrac: zero denominator")
	}
	// Divide straight into the result's numerator and denominator
	// (references once the Rat is set, per the big.Rat docs).
	r := new(big.Rat).SetInt64(1)
	n, d := r.Num(), r.Denom()
	divGCD(n, d, num, den)
	return positiveDenom(r)
}

// ratProd returns num/(d_1·d_2·…) as a new big.Rat in lowest terms (no
// d_i = 0), with one gcd per factor, of what is left of num against that
// factor alone: after n ← n/g, g = gcd(n, d), n is coprime to d/g, and
// dividing n further keeps it so; so n ends coprime to every reduced
// factor, hence to their product. For products past four words, whose
// factors are within gcdOdd's reach.
func ratProd(num *big.Int, dens ...*big.Int) *big.Rat {
	r := new(big.Rat).SetInt64(1)
	n, d := r.Num(), r.Denom() // references, as in ratFrac
	n.Set(num)
	var t big.Int
	for _, f := range dens {
		if f.Sign() == 0 {
			panic("geom: ratProd: zero denominator")
		}
		divGCD(n, &t, n, f)
		d.Mul(d, &t)
	}
	return positiveDenom(r)
}

// positiveDenom moves the sign of r's denominator (set through
// references) to its numerator.
func positiveDenom(r *big.Rat) *big.Rat {
	if n, d := r.Num(), r.Denom(); d.Sign() < 0 {
		n.Neg(n)
		d.Neg(d)
	}
	return r
}

// divGCD sets a = x/g and b = y/g for g = gcd(x, y) != 0; a may be x.
// The gcd comes from gcdOdd and both divisions are exact (divExact) when
// the operands allow, else from big.Int.GCD and Quo.
func divGCD(a, b, x, y *big.Int) {
	if g, k, ok := gcdOdd(x, y); ok {
		divExact(b, y, g, k) // first: a may be x, never y
		divExact(a, x, g, k)
		return
	}
	var g big.Int
	g.GCD(nil, nil, x, y)
	b.Quo(y, &g)
	a.Quo(x, &g)
}

// gcdOdd returns gcd(|x|, |y|) = g·2^k, g odd, not both 0, when the
// shorter operand has at most four 64-bit words (ok false otherwise, or
// on a 32-bit platform). Most reductions of the shape methods are of
// that size; they go through Stein's binary algorithm on machine words
// (J. Stein, "Computational problems associated with Racah algebra",
// J. Comput. Phys. 1 (1967) 397–405): subtractions and shifts, no
// division and no allocation, 3–7 times faster there than big.Int.GCD's
// Lehmer algorithm (a microbenchmark at 150–250 bits, December 2026). The longer operand is
// first reduced modulo the shorter (one Euclid step): the binary
// algorithm is slow on operands of unequal length.
func gcdOdd(x, y *big.Int) (g u256, k uint, ok bool) {
	xw, yw := x.Bits(), y.Bits()
	if len(xw) < len(yw) {
		x, y, xw, yw = y, x, yw, xw
	}
	if bits.UintSize != 64 || len(yw) > 4 || len(yw) == 0 && (len(xw) > 4 || len(xw) == 0) {
		return g, 0, false
	}
	if len(yw) == 0 {
		yw, xw = xw, nil
	} else if len(yw) == 1 && len(xw) > 1 {
		var r uint64 // from the top word down, without math/big's allocation
		for i := len(xw) - 1; i >= 0; i-- {
			_, r = bits.Div64(r, uint64(xw[i]), uint64(yw[0]))
		}
		xw = nil
		if r != 0 {
			xw = []big.Word{big.Word(r)}
		}
	} else if len(xw) > len(yw) {
		var r big.Int
		xw = r.Rem(x, y).Bits()
	}
	b := u256Of(yw)
	k = b.trailingZeros()
	if len(xw) == 0 {
		return b.odd(), k, true
	}
	a := u256Of(xw)
	k = min(k, a.trailingZeros())
	return binaryGCD(a.odd(), b.odd()), k, true
}

// divExact sets z to x/(g·2^k) for g odd and x a multiple of g·2^k, by
// Hensel (right-to-left) exact division (T. Jebelean, "An algorithm for
// exact division", J. Symbolic Comput. 15 (1993) 169–180): each quotient
// word is the remainder's lowest word times g⁻¹ mod 2^64, with no trial
// quotients and no allocation beyond z.
func divExact(z, x *big.Int, g u256, k uint) *big.Int {
	z.Rsh(x, k) // exact, so no rounding for negative x
	if g == (u256{w0: 1}) {
		return z
	}
	neg := z.Sign() < 0
	w := z.Bits() // z's own words: worked in place
	gw := [4]uint64{g.w0, g.w1, g.w2, g.w3}
	inv := g.w0 // g·g ≡ 1 mod 8, so 3 bits right; each Newton step doubles them
	for range 5 {
		inv *= 2 - g.w0*inv
	}
	n := len(w)
	for i := range n {
		// The remainder x − g·(quotient so far) stays in [0, x], so
		// arithmetic mod 2^(64n) is exact.
		q := uint64(w[i]) * inv
		var carry, borrow uint64
		for j := 0; i+j < n; j++ {
			var gj uint64
			if j < 4 {
				gj = gw[j]
			} else if carry == 0 && borrow == 0 {
				break
			}
			hi, lo := bits.Mul64(q, gj)
			lo, c := bits.Add64(lo, carry, 0)
			carry = hi + c
			var d uint64
			d, borrow = bits.Sub64(uint64(w[i+j]), lo, borrow)
			w[i+j] = big.Word(d)
		}
		w[i] = big.Word(q)
	}
	z.SetBits(w)
	if neg {
		z.Neg(z)
	}
	return z
}

// u256 is an unsigned 256-bit integer, w0 the lowest word.
type u256 struct{ w0, w1, w2, w3 uint64 }

// u256Of reads at most four words (64-bit platforms only).
func u256Of(w []big.Word) u256 {
	var a [4]uint64
	for i, x := range w {
		a[i] = uint64(x)
	}
	return u256{a[0], a[1], a[2], a[3]}
}

func (x u256) less(y u256) bool {
	if x.w3 != y.w3 {
		return x.w3 < y.w3
	}
	if x.w2 != y.w2 {
		return x.w2 < y.w2
	}
	if x.w1 != y.w1 {
		return x.w1 < y.w1
	}
	return x.w0 < y.w0
}

// sub returns x − y for x >= y.
func (x u256) sub(y u256) u256 {
	var b uint64
	x.w0, b = bits.Sub64(x.w0, y.w0, 0)
	x.w1, b = bits.Sub64(x.w1, y.w1, b)
	x.w2, b = bits.Sub64(x.w2, y.w2, b)
	x.w3, _ = bits.Sub64(x.w3, y.w3, b)
	return x
}

// trailingZeros counts the trailing zero bits of x != 0.
func (x u256) trailingZeros() uint {
	switch {
	case x.w0 != 0:
		return uint(bits.TrailingZeros64(x.w0))
	case x.w1 != 0:
		return 64 + uint(bits.TrailingZeros64(x.w1))
	case x.w2 != 0:
		return 128 + uint(bits.TrailingZeros64(x.w2))
	}
	return 192 + uint(bits.TrailingZeros64(x.w3))
}

// odd returns x != 0 shifted right past its trailing zeros (a shift by
// 64 gives 0 in Go, so k = 0 needs no case).
func (x u256) odd() u256 {
	for x.w0 == 0 {
		x = u256{x.w1, x.w2, x.w3, 0}
	}
	k := uint(bits.TrailingZeros64(x.w0))
	return u256{x.w0>>k | x.w1<<(64-k), x.w1>>k | x.w2<<(64-k), x.w2>>k | x.w3<<(64-k), x.w3 >> k}
}

// binaryGCD returns gcd(a, b) for odd a and b: the larger is replaced by
// the difference, even, shifted until odd, which keeps the gcd as the
// other is odd; it ends when they are equal. Once both fit in two words,
// then in one, the loop goes on in those.
func binaryGCD(a, b u256) u256 {
	for a.w3|a.w2|b.w3|b.w2 != 0 {
		if a == b {
			return a
		}
		if a.less(b) {
			a, b = b, a
		}
		a = a.sub(b).odd()
	}
	x1, x0, y1, y0 := a.w1, a.w0, b.w1, b.w0
	for x1|y1 != 0 {
		if x1 == y1 && x0 == y0 {
			return u256{w0: x0, w1: x1}
		}
		if x1 < y1 || x1 == y1 && x0 < y0 {
			x1, x0, y1, y0 = y1, y0, x1, x0
		}
		var br uint64
		x0, br = bits.Sub64(x0, y0, 0)
		x1, _ = bits.Sub64(x1, y1, br)
		if x0 == 0 {
			x0, x1 = x1, 0
		}
		k := uint(bits.TrailingZeros64(x0))
		x0, x1 = x0>>k|x1<<(64-k), x1>>k
	}
	for x0 != y0 {
		if x0 < y0 {
			x0, y0 = y0, x0
		}
		x0 -= y0
		x0 >>= uint(bits.TrailingZeros64(x0))
	}
	return u256{w0: x0}
}

// setSigned sets z to the 192-bit two's complement v (v[0] the lowest
// word), its magnitude in w, which must have the capacity for it, and
// returns z.
func setSigned(z *big.Int, w []big.Word, v [3]uint64) *big.Int {
	neg := int64(v[2]) < 0
	if neg {
		v = neg192(v)
	}
	w = w[:cap(w)]
	for i := range w {
		w[i] = big.Word(v[i])
	}
	z.SetBits(w) // drops leading zero words
	if neg {
		z.Neg(z)
	}
	return z
}

// neg192 returns −v in 192-bit two's complement.
func neg192(v [3]uint64) [3]uint64 {
	var b uint64
	v[0], b = bits.Sub64(0, v[0], 0)
	v[1], b = bits.Sub64(0, v[1], b)
	v[2], _ = bits.Sub64(0, v[2], b)
	return v
}

// detWords returns the determinant of the k x k matrix a (row-major,
// 1 <= k <= 3, entries below 2^62 in size) as a 192-bit two's
// complement: the 2x2 minors of the last two rows in 128 bits (products
// below 2^124, differences below 2^125), then the expansion along the
// first row (terms below 2^187, their sum below 2^189).
func detWords(a []int64, k int) [3]uint64 {
	minor := func(w, x, y, z int64) (hi, lo uint64) { // wx − yz
		h1, l1 := mulSigned(w, x)
		h2, l2 := mulSigned(y, z)
		var b uint64
		lo, b = bits.Sub64(l1, l2, 0)
		hi, _ = bits.Sub64(h1, h2, b)
		return hi, lo
	}
	switch k {
	case 1:
		return [3]uint64{uint64(a[0]), uint64(a[0] >> 63), uint64(a[0] >> 63)}
	case 2:
		hi, lo := minor(a[0], a[3], a[1], a[2])
		return [3]uint64{lo, hi, uint64(int64(hi) >> 63)}
	}
	var d [3]uint64
	for j, m := range [3][4]int{{4, 8, 5, 7}, {5, 6, 3, 8}, {3, 7, 4, 6}} {
		hi, lo := minor(a[m[0]], a[m[1]], a[m[2]], a[m[3]])
		t := mulWide(a[j], hi, lo)
		var c uint64
		d[0], c = bits.Add64(d[0], t[0], 0)
		d[1], c = bits.Add64(d[1], t[1], c)
		d[2], _ = bits.Add64(d[2], t[2], c)
	}
	return d
}

// mulWide returns a·(hi, lo), a 128-bit two's complement times a word,
// as a 192-bit two's complement; the product must fit.
func mulWide(a int64, hi, lo uint64) [3]uint64 {
	neg := (a < 0) != (int64(hi) < 0)
	if int64(hi) < 0 {
		var b uint64
		lo, b = bits.Sub64(0, lo, 0)
		hi, _ = bits.Sub64(0, hi, b)
	}
	u := uint64(max(a, -a))
	h0, l0 := bits.Mul64(u, lo)
	h1, l1 := bits.Mul64(u, hi)
	var p [3]uint64
	var c uint64
	p[0] = l0
	p[1], c = bits.Add64(h0, l1, 0)
	p[2] = h1 + c
	if neg {
		p = neg192(p)
	}
	return p
}

// ratWordPow returns num/(l^m·c) as a new big.Rat in lowest terms, for
// words l, c >= 1 and m >= 0, by exact.ReduceWordPow: the Rat and its
// words in one allocation when they are few. On the Cayley–Menger
// determinant of a random tetrahedron over s³ (four words over three) it
// takes about half the time of ratFrac (a microbenchmark, December 2026).
func ratWordPow(num *big.Int, l uint64, m int, c uint64) *big.Rat {
	if num.Sign() == 0 {
		return new(big.Rat)
	}
	var nb, db [16]uint64
	n, d := nb[:0], db[:0]
	if len(num.Bits()) > len(nb) {
		n = make([]uint64, 0, len(num.Bits()))
	}
	if m+1 > len(db) {
		d = make([]uint64, 0, m+1)
	}
	n, d = exact.ReduceWordPow(wordsOf(n, num.Bits()), d, l, m, c)
	need := len(n) + len(d)
	var r *big.Rat
	var w []big.Word
	if need <= 16 {
		b := new(struct {
			r big.Rat
			w [16]big.Word
		})
		r, w = &b.r, b.w[:need]
	} else {
		r, w = new(big.Rat), make([]big.Word, need)
	}
	r.SetInt64(1) // so that Denom is a reference
	r.Num().SetBits(bigWords(w[:len(n):len(n)], n))
	if num.Sign() < 0 {
		r.Num().Neg(r.Num())
	}
	r.Denom().SetBits(bigWords(w[len(n):], d))
	return r
}

// wordsOf appends the words of x to z.
func wordsOf(z []uint64, x []big.Word) []uint64 {
	for _, w := range x {
		z = append(z, uint64(w))
	}
	return z
}

// bigWords copies x into z (room for it) and returns z[:len(x)].
func bigWords(z []big.Word, x []uint64) []big.Word {
	z = z[:len(x)]
	for i, w := range x {
		z[i] = big.Word(w)
	}
	return z
}

// factorialWord returns m! for 0 <= m <= 20 (the largest in a word).
func factorialWord(m int) uint64 {
	f := uint64(1)
	for i := 2; i <= m; i++ {
		f *= uint64(i)
	}
	return f
}

// mulWords sets z (len(x)+len(y) words) to the product of the magnitudes
// x and y by schoolbook multiplication and returns it without leading zero
// words; for a few words, where big.Int.Mul would also make its operands
// escape to the heap.
func mulWords(z []big.Word, x, y []uint64) []big.Word {
	clear(z)
	for i, a := range x {
		var carry uint64
		for j, b := range y {
			hi, lo := bits.Mul64(a, b)
			var c uint64
			lo, c = bits.Add64(lo, uint64(z[i+j]), 0)
			hi += c
			lo, c = bits.Add64(lo, carry, 0)
			z[i+j], carry = big.Word(lo), hi+c
		}
		z[i+len(y)] = big.Word(carry)
	}
	for len(z) > 0 && z[len(z)-1] == 0 {
		z = z[:len(z)-1]
	}
	return z
}

package bigmul

// The three-prime number-theoretic transform.
//
// A product of integers is the convolution of their digit sequences
// followed by carry propagation. Here a digit is one 64-bit word, the
// convolution is computed exactly modulo three primes p < 2^62 by a
// number-theoretic transform (the discrete Fourier transform over Z/pZ,
// which has 2^k-th roots of unity when 2^k divides p − 1), and each
// coefficient is rebuilt from its three residues by the Chinese remainder
// theorem in Garner's form. A coefficient of the convolution of two
// sequences of length ≤ N of words is below N·2^128, and p1·p2·p3 > 2^185,
// so the residues determine it for every N < 2^57 — far beyond memory. The
// method is the classical one of Pollard ("The fast Fourier transform in a
// finite field", Math. Comp. 25, 1971); the arithmetic follows common
// practice for word-sized primes:
//
//   - Montgomery multiplication (Montgomery, "Modular multiplication without
//     trial division", Math. Comp. 44, 1985): REDC(T) = T·2^-64 mod p from
//     one full and two half 64-bit products, no division.
//   - Lazy reduction in the butterflies (Harvey, "Faster arithmetic for
//     number-theoretic transforms", J. Symbolic Comput. 60, 2014): values
//     stay in [0, 2p) and are reduced fully only at the end; p < 2^62 keeps
//     every intermediate below 2^64.
//   - Forward transform by decimation in frequency (Gentleman–Sande), which
//     leaves its output in bit-reversed order, and inverse by decimation in
//     time (Cooley–Tukey), which takes bit-reversed input; the pointwise
//     product does not care about the order, so no permutation is done.
//   - The outer stages of a large transform run depth first (each half is
//     finished before the other starts) so that the inner stages work in
//     cache.

import (
	"math/big"
	"math/bits"
	"sync"
)

// The primes are c·2^k + 1 below 2^62 with k = 40, 39, 38: the largest such
// primes for those k (found by a search with big.Int.ProbablyPrime, which is
// exact below 2^64; TestPrimes checks them again). 2^38 bounds the
// transform length.
var primes = [3]uint64{
	4194177<<40 + 1,
	8388501<<39 + 1,
	16777167<<38 + 1,
}

// field is the arithmetic modulo one prime, with its twiddle tables.
type field struct {
	p, p2 uint64 // p and 2p
	pinv  uint64 // p^-1 mod 2^64
	r2    uint64 // 2^128 mod p: mont(a, r2) puts a in Montgomery form
	root  uint64 // a generator of (Z/pZ)*

	mu sync.Mutex
	// fwd[m+j] = ω_{2m}^j and inv[m+j] = ω_{2m}^-j in Montgomery form for
	// every stage m (a power of two below the table's length) and j < m:
	// stage m reads fwd[m:2m]. The table for a length is a prefix of the
	// table for any larger one, so one table per field serves every
	// length up to its own.
	fwd, inv []uint64
}

var fields [3]*field
var fieldsOnce sync.Once

func getFields() [3]*field {
	fieldsOnce.Do(func() {
		for i, p := range primes {
			fields[i] = newField(p)
		}
	})
	return fields
}

func newField(p uint64) *field {
	f := &field{p: p, p2: 2 * p}
	inv := p // Newton's iteration for p^-1 mod 2^64: each step doubles the correct bits
	for range 6 {
		inv *= 2 - p*inv
	}
	f.pinv = inv
	bp := new(big.Int).SetUint64(p)
	r2 := new(big.Int).Lsh(big.NewInt(1), 128)
	f.r2 = r2.Mod(r2, bp).Uint64()
	f.root = generator(p)
	return f
}

// generator returns the least generator of (Z/pZ)*: g with g^((p−1)/q) ≠ 1
// for every prime q dividing p − 1 (p − 1 = c·2^k with c small enough to
// factor by trial division).
func generator(p uint64) uint64 {
	var qs []uint64
	n := p - 1
	for q := uint64(2); q*q <= n; q++ {
		if n%q == 0 {
			qs = append(qs, q)
			for n%q == 0 {
				n /= q
			}
		}
	}
	if n > 1 {
		qs = append(qs, n)
	}
	bp := new(big.Int).SetUint64(p)
	for g := int64(2); ; g++ {
		ok := true
		for _, q := range qs {
			e := new(big.Int).SetUint64((p - 1) / q)
			if new(big.Int).Exp(big.NewInt(g), e, bp).Cmp(big.NewInt(1)) == 0 {
				ok = false
				break
			}
		}
		if ok {
			return uint64(g)
		}
	}
}

// mont is REDC(a·b) = a·b·2^-64 mod p in (0, 2p), for a·b < p·2^64 (a < 4p
// and b < p, or both < 2p).
func (f *field) mont(a, b uint64) uint64 {
	hi, lo := bits.Mul64(a, b)
	m := lo * f.pinv
	mh, _ := bits.Mul64(m, f.p)
	return hi + f.p - mh
}

// reduce maps [0, 2p) to [0, p).
func (f *field) reduce(a uint64) uint64 {
	if a >= f.p {
		a -= f.p
	}
	return a
}

// toMont is a·2^64 mod p for a < 2p.
func (f *field) toMont(a uint64) uint64 { return f.reduce(f.mont(a, f.r2)) }

// powMont is the Montgomery form of b^e (b < p, ordinary).
func (f *field) powMont(b, e uint64) uint64 {
	r := f.toMont(1)
	b = f.toMont(b)
	for ; e > 0; e >>= 1 {
		if e&1 == 1 {
			r = f.reduce(f.mont(r, b))
		}
		b = f.reduce(f.mont(b, b))
	}
	return r
}

// maxCached is the largest table kept between calls (entries per
// direction per prime, 8 bytes each): 3·2·2 MB. Longer transforms build
// their own for the call.
const maxCached = 1 << 18

// tables returns twiddle tables good for transforms of length n.
func (f *field) tables(n int) (fwd, inv []uint64) {
	if n <= maxCached {
		f.mu.Lock()
		defer f.mu.Unlock()
		if len(f.fwd) < n {
			f.fwd, f.inv = f.buildTables(n)
		}
		return f.fwd, f.inv
	}
	return f.buildTables(n)
}

func (f *field) buildTables(n int) (fwd, inv []uint64) {
	fwd, inv = make([]uint64, n), make([]uint64, n)
	if n < 2 {
		return
	}
	w := f.powMont(f.root, (f.p-1)/uint64(n)) // primitive n-th root
	wi := f.powMont(f.root, (f.p-1)/uint64(n)*uint64(n-1))
	h := n / 2
	fwd[h], inv[h] = f.toMont(1), f.toMont(1)
	for j := 1; j < h; j++ {
		fwd[h+j] = f.reduce(f.mont(fwd[h+j-1], w))
		inv[h+j] = f.reduce(f.mont(inv[h+j-1], wi))
	}
	// ω_{2m}^j = ω_{4m}^{2j}
	for m := h / 2; m >= 1; m /= 2 {
		for j := range m {
			fwd[m+j] = fwd[2*m+2*j]
			inv[m+j] = inv[2*m+2*j]
		}
	}
	return
}

// cacheBlock is the length below which a transform runs its stages
// breadth first (its data then fits in a core's cache).
const cacheBlock = 1 << 12

// forward is the decimation-in-frequency transform of a (length a power of
// two, at least 4; entries in [0, 2p)); the output, in bit-reversed order,
// is in [0, 2p).
func (f *field) forward(a, tw []uint64) {
	n := len(a)
	if n > cacheBlock {
		f.stage(a, n/2, tw, false)
		f.forward(a[:n/2], tw)
		f.forward(a[n/2:], tw)
		return
	}
	for m := n / 2; m >= 4; m /= 2 {
		f.stage(a, m, tw, false)
	}
	f.difLast(a, tw[3])
}

// difLast does the stages m = 2 and m = 1 together on blocks of four: the
// loops over one or two butterflies would cost more than the arithmetic.
// w4 is ω_4 in Montgomery form.
func (f *field) difLast(a []uint64, w4 uint64) {
	p2 := f.p2
	for k := 0; k+3 < len(a); k += 4 {
		b := a[k : k+4 : k+4]
		s0, d0 := f.addSub(b[0], b[2])
		s1 := b[1] + b[3]
		if s1 >= p2 {
			s1 -= p2
		}
		d1 := f.mont(b[1]+p2-b[3], w4)
		b[0], b[1] = f.addSub(s0, s1)
		b[2], b[3] = f.addSub(d0, d1)
	}
}

// addSub returns u + v and u − v in [0, 2p) for u, v in [0, 2p).
func (f *field) addSub(u, v uint64) (uint64, uint64) {
	p2 := f.p2
	s, d := u+v, u+p2-v
	if s >= p2 {
		s -= p2
	}
	if d >= p2 {
		d -= p2
	}
	return s, d
}

// stage does the butterflies of half-length m over all of a: those of the
// forward transform, or with inverse those of the inverse transform.
func (f *field) stage(a []uint64, m int, tw []uint64, inverse bool) {
	w := tw[m : 2*m]
	for k := 0; k < len(a); k += 2 * m {
		if inverse {
			f.dit(a[k:k+m], a[k+m:k+2*m], w)
		} else {
			f.dif(a[k:k+m], a[k+m:k+2*m], w)
		}
	}
}

// dif is the Gentleman–Sande butterfly on x[j], y[j] with twiddle w[j]:
// (u, v) ↦ (u + v, (u − v)·w), inputs and outputs in [0, 2p).
func (f *field) dif(x, y, w []uint64) {
	p, p2, pinv := f.p, f.p2, f.pinv
	y, w = y[:len(x)], w[:len(x)]
	for j := range x {
		u, v := x[j], y[j]
		s := u + v
		if s >= p2 {
			s -= p2
		}
		x[j] = s
		hi, lo := bits.Mul64(u+p2-v, w[j])
		mh, _ := bits.Mul64(lo*pinv, p)
		y[j] = hi + p - mh
	}
}

// inverse is the decimation-in-time transform with the inverse roots,
// taking bit-reversed input in [0, 2p) to natural order in [0, 2p),
// without the factor 1/n.
func (f *field) inverse(a, tw []uint64) {
	n := len(a)
	if n > cacheBlock {
		f.inverse(a[:n/2], tw)
		f.inverse(a[n/2:], tw)
		f.stage(a, n/2, tw, true)
		return
	}
	f.ditFirst(a, tw[3])
	for m := 4; m < n; m *= 2 {
		f.stage(a, m, tw, true)
	}
}

// ditFirst is difLast's inverse: stages m = 1 and m = 2 on blocks of four,
// wi4 = ω_4^-1 in Montgomery form.
func (f *field) ditFirst(a []uint64, wi4 uint64) {
	for k := 0; k+3 < len(a); k += 4 {
		b := a[k : k+4 : k+4]
		s0, d0 := f.addSub(b[0], b[1])
		s1, d1 := f.addSub(b[2], b[3])
		b[0], b[2] = f.addSub(s0, s1)
		b[1], b[3] = f.addSub(d0, f.mont(d1, wi4))
	}
}

// dit is the Cooley–Tukey butterfly: (u, v) ↦ (u + v·w, u − v·w).
func (f *field) dit(x, y, w []uint64) {
	p, p2, pinv := f.p, f.p2, f.pinv
	y, w = y[:len(x)], w[:len(x)]
	for j := range x {
		hi, lo := bits.Mul64(y[j], w[j])
		mh, _ := bits.Mul64(lo*pinv, p)
		t := hi + p - mh
		u := x[j]
		s := u + t
		if s >= p2 {
			s -= p2
		}
		d := u + p2 - t
		if d >= p2 {
			d -= p2
		}
		x[j], y[j] = s, d
	}
}

// load writes the words of x into a (zero beyond), each reduced to [0, 2p).
func (f *field) load(a []uint64, x []big.Word) {
	p2 := f.p2
	for i, w := range x {
		v := uint64(w)
		// 2^64 < 6p: two subtractions of 2p at most.
		if v >= p2 {
			v -= p2
		}
		if v >= p2 {
			v -= p2
		}
		a[i] = v
	}
	clear(a[len(x):])
}

// cyclic computes, in a, the cyclic convolution of x and y (y == nil: of x
// with itself) of length len(a) modulo p, each entry in [0, p). b is
// scratch of the same length (unused when squaring).
func (f *field) cyclic(a, b []uint64, x, y []big.Word) {
	n := len(a)
	var r3 *radix3
	l := n
	if n&(n-1) != 0 {
		l = n / 3
		r3 = f.newRadix3(n)
	}
	fwd, inv := f.tables(l)
	transform := func(a []uint64) {
		if r3 != nil {
			r3.forward(a)
			f.forward(a[:l], fwd)
			f.forward(a[l:2*l], fwd)
			f.forward(a[2*l:], fwd)
			return
		}
		f.forward(a, fwd)
	}
	f.load(a, x)
	transform(a)
	if y != nil {
		f.load(b, y)
		transform(b)
	} else {
		b = a
	}
	// REDC divides each product by 2^64; scaling by 2^128/n in Montgomery
	// form restores it and applies the 1/n of the inverse transform.
	scale := f.mont(f.r2, f.inverseOf(uint64(n)))
	scale = f.toMont(f.reduce(scale))
	b = b[:len(a)]
	for i := range a {
		v := f.mont(a[i], b[i])
		a[i] = f.mont(v, scale)
	}
	if r3 != nil {
		f.inverse(a[:l], inv)
		f.inverse(a[l:2*l], inv)
		f.inverse(a[2*l:], inv)
		r3.inverse(a)
	} else {
		f.inverse(a, inv)
	}
	for i := range a {
		a[i] = f.reduce(a[i])
	}
}

// radix3 is the first (forward) or last (inverse) stage of a transform of
// length n = 3·l: for each j < l, a 3-point transform of a[j], a[j+l],
// a[j+2l] and twiddles ω_n^(r·j) on row r, after which each row is a
// transform of length l (the usual mixed-radix splitting; every prime here
// has 3 dividing p − 1, TestPrimes). The twiddles depend on n and are built
// for the call: 4·l products, small beside the transform.
type radix3 struct {
	f                *field
	w1, w2, v1, v2   []uint64 // ω^j, ω^2j, ω^-j, ω^-2j (Montgomery)
	c1, c2, ci1, ci2 uint64   // ω_3, ω_3², ω_3^-1, ω_3^-2 (Montgomery)
}

func (f *field) newRadix3(n int) *radix3 {
	l := n / 3
	r := &radix3{f: f}
	w := f.powMont(f.root, (f.p-1)/uint64(n))
	wi := f.powMont(f.root, (f.p-1)/uint64(n)*uint64(n-1))
	r.w1, r.w2 = make([]uint64, l), make([]uint64, l)
	r.v1, r.v2 = make([]uint64, l), make([]uint64, l)
	w2, wi2 := f.reduce(f.mont(w, w)), f.reduce(f.mont(wi, wi))
	one := f.toMont(1)
	r.w1[0], r.w2[0], r.v1[0], r.v2[0] = one, one, one, one
	for j := 1; j < l; j++ {
		r.w1[j] = f.reduce(f.mont(r.w1[j-1], w))
		r.w2[j] = f.reduce(f.mont(r.w2[j-1], w2))
		r.v1[j] = f.reduce(f.mont(r.v1[j-1], wi))
		r.v2[j] = f.reduce(f.mont(r.v2[j-1], wi2))
	}
	r.c1 = f.powMont(f.root, (f.p-1)/3)
	r.c2 = f.reduce(f.mont(r.c1, r.c1))
	r.ci1, r.ci2 = r.c2, r.c1
	return r
}

// sum3 is u + v + w in [0, 2p) for u, v, w in [0, 2p) (6p would overflow
// 64 bits, so it reduces after each addition).
func (f *field) sum3(u, v, w uint64) uint64 {
	s := u + v
	if s >= f.p2 {
		s -= f.p2
	}
	s += w
	if s >= f.p2 {
		s -= f.p2
	}
	return s
}

// forward: row r becomes ω^(rj)·Σ_s ω_3^(rs)·a[j+s·l].
func (r *radix3) forward(a []uint64) {
	f := r.f
	l := len(r.w1)
	a0, a1, a2 := a[:l], a[l:2*l], a[2*l:3*l]
	for j := range a0 {
		u, v, w := a0[j], a1[j], a2[j]
		a0[j] = f.sum3(u, v, w)
		b1 := f.sum3(u, f.mont(v, r.c1), f.mont(w, r.c2))
		b2 := f.sum3(u, f.mont(v, r.c2), f.mont(w, r.c1))
		a1[j] = f.mont(b1, r.w1[j])
		a2[j] = f.mont(b2, r.w2[j])
	}
}

// inverse undoes forward, times 3.
func (r *radix3) inverse(a []uint64) {
	f := r.f
	l := len(r.w1)
	a0, a1, a2 := a[:l], a[l:2*l], a[2*l:3*l]
	for j := range a0 {
		u := a0[j]
		v := f.mont(a1[j], r.v1[j])
		w := f.mont(a2[j], r.v2[j])
		a0[j] = f.sum3(u, v, w)
		a1[j] = f.sum3(u, f.mont(v, r.ci1), f.mont(w, r.ci2))
		a2[j] = f.sum3(u, f.mont(v, r.ci2), f.mont(w, r.ci1))
	}
}

// inverseOf is n^-1 mod p (ordinary form).
func (f *field) inverseOf(n uint64) uint64 {
	r := f.powMont(n%f.p, f.p-2) // Fermat
	return f.reduce(f.mont(r, 1))
}

// crt is Garner's reconstruction of the convolution from its residues
// modulo the three primes, with carry propagation into z (len(z) ≥ the
// convolution's length; the top words of z receive the last carries).
func crt(z []big.Word, r [3][]uint64, fs [3]*field) {
	f1, f2, f3 := fs[0], fs[1], fs[2]
	p1, p2 := f1.p, f2.p
	// Montgomery forms of p1^-1 mod p2, p1 mod p3 and (p1·p2)^-1 mod p3.
	c12 := f2.toMont(f2.inverseOf(p1 % p2))
	p1m3 := f3.toMont(p1 % f3.p)
	p12lo := p1 * p2
	p12hi, _ := bits.Mul64(p1, p2)
	p12mod3 := new(big.Int).Mul(new(big.Int).SetUint64(p1), new(big.Int).SetUint64(p2))
	p12mod3.Mod(p12mod3, new(big.Int).SetUint64(f3.p))
	c123 := f3.toMont(f3.inverseOf(p12mod3.Uint64()))
	var c0, c1, c2 uint64 // carry, three words
	n := len(r[0])
	for i := range z {
		var x0, x1, x2 uint64
		if i < n {
			v1, r2, r3 := r[0][i], r[1][i], r[2][i]
			// v2 = (r2 − v1)·p1^-1 mod p2; v1 < p1 < 2·p2.
			v2 := f2.reduce(f2.mont(r2+p2-f2.reduce(v1), c12))
			// v3 = (r3 − v1 − v2·p1)·(p1·p2)^-1 mod p3.
			t := r3 + f3.p - f3.reduce(v1)
			t = t + f3.p - f3.reduce(f3.mont(v2, p1m3))
			v3 := f3.reduce(f3.mont(f3.reduce(f3.reduce(t)), c123))
			// x = v1 + v2·p1 + v3·p1·p2, three words.
			h, l := bits.Mul64(v2, p1)
			var cc uint64
			x0, cc = bits.Add64(l, v1, 0)
			x1 = h + cc
			h0, l0 := bits.Mul64(v3, p12lo)
			h1, l1 := bits.Mul64(v3, p12hi)
			x0, cc = bits.Add64(x0, l0, 0)
			x1, cc = bits.Add64(x1, h0, cc)
			x2 = h1 + cc
			x1, cc = bits.Add64(x1, l1, 0)
			x2 += cc
		}
		var cc uint64
		x0, cc = bits.Add64(x0, c0, 0)
		x1, cc = bits.Add64(x1, c1, cc)
		x2, _ = bits.Add64(x2, c2, cc)
		z[i] = big.Word(x0)
		c0, c1, c2 = x1, x2, 0
	}
}

// transformLength is the least length 2^k or 3·2^k (at least 4, and a
// multiple of 4 per row) not below m.
func transformLength(m int) int {
	n := 4
	for n < m {
		n *= 2
	}
	if t := n / 4 * 3; t >= m && t >= 12 {
		return t
	}
	return n
}

// nttMul returns the words of x·y (y == nil: x²), len(x)+len(y) of them.
// It holds four transform-length arrays of uint64 (three when squaring):
// about 32 bytes per word of the product.
func nttMul(x, y []big.Word) []big.Word {
	ny := len(y)
	sq := y == nil
	if sq {
		ny = len(x)
	}
	m := len(x) + ny
	n := transformLength(m - 1)
	fs := getFields()
	var r [3][]uint64
	var scratch []uint64
	if !sq {
		scratch = make([]uint64, n)
	}
	for i, f := range fs {
		r[i] = make([]uint64, n)
		f.cyclic(r[i], scratch, x, y)
	}
	z := make([]big.Word, m)
	crt(z, r, fs)
	return z
}

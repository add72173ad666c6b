package exact

import (
	"math/big"
	"math/bits"
	"sync"
)

// Arithmetic modulo word-sized primes, for the multi-modular determinant.

// modulus does Montgomery arithmetic modulo an odd prime p < 2^62, with
// R = 2^64. Values in Montgomery form are x*R mod p, kept in [0, p).
type modulus struct {
	p      uint64
	negInv uint64    // -p^-1 mod 2^64
	one    uint64    // R mod p, the Montgomery form of 1
	r      [6]uint64 // r[k] = R^k mod p
}

func newModulus(p uint64) *modulus {
	one := bits.Rem64(1, 0, p)
	hi, lo := bits.Mul64(one, one)
	m := &modulus{p: p, negInv: -inv64(p), one: one}
	m.r[0], m.r[1], m.r[2] = 1, one, bits.Rem64(hi, lo, p)
	for k := 3; k < len(m.r); k++ {
		m.r[k] = m.mul(m.r[k-1], m.r[2])
	}
	return m
}

// mul returns a*b/R mod p (Montgomery reduction). It needs a*b < p*R, which
// holds for b < p and any 64-bit a.
func (m *modulus) mul(a, b uint64) uint64 {
	hi, lo := bits.Mul64(a, b)
	q := lo * m.negInv
	qh, ql := bits.Mul64(q, m.p)
	_, c := bits.Add64(lo, ql, 0)
	t := hi + qh + c // < 2p < 2^63
	if t >= m.p {
		t -= m.p
	}
	return t
}

func (m *modulus) add(a, b uint64) uint64 {
	t := a + b
	if t >= m.p {
		t -= m.p
	}
	return t
}

func (m *modulus) sub(a, b uint64) uint64 {
	d, borrow := bits.Sub64(a, b, 0)
	return d + m.p&-borrow
}

// combine sets r[j] = a r[j] + b s[j] for all j (Montgomery forms, a, b < p),
// with a single Montgomery reduction per entry: a r + b s < 2p^2 < pR.
func combine(r, s []uint64, a, b, p, negInv uint64) {
	s = s[:len(r)]
	for j, x := range s {
		h1, l1 := bits.Mul64(a, r[j])
		h2, l2 := bits.Mul64(b, x)
		lo, c := bits.Add64(l1, l2, 0)
		hi := h1 + h2 + c
		qh, ql := bits.Mul64(lo*negInv, p)
		_, c = bits.Add64(lo, ql, 0)
		t := hi + qh + c // < 2p
		if t >= p {
			t -= p
		}
		r[j] = t
	}
}

// toMont returns the Montgomery form of x mod p, for any 64-bit x.
func (m *modulus) toMont(x uint64) uint64 { return m.mul(x, m.r[2]) }

// fromMont returns the ordinary residue of the Montgomery form x.
func (m *modulus) fromMont(x uint64) uint64 { return m.mul(x, 1) }

// inv returns the inverse of x (both in Montgomery form), x != 0.
func (m *modulus) inv(x uint64) uint64 {
	// (xR)^-1 by the extended Euclidean algorithm, times R^3, divided by R.
	return m.mul(invMod(x, m.p), m.r[3])
}

// invMod returns the inverse of a modulo p, for 0 < a < p < 2^63, by the
// extended Euclidean algorithm (three times faster here than Fermat's
// a^(p-2) with Montgomery products: 77 ns against 239 ns).
func invMod(a, p uint64) uint64 {
	var t0, t1 int64 = 0, 1 // |t| <= p
	r0, r1 := p, a
	for r1 != 0 {
		q := r0 / r1
		r0, r1 = r1, r0-q*r1
		t0, t1 = t1, t0-int64(q)*t1
	}
	if t0 < 0 {
		return uint64(t0 + int64(p))
	}
	return uint64(t0)
}

// pow returns x^e (Montgomery forms), e >= 0.
func (m *modulus) pow(x uint64, e int) uint64 {
	r := m.one
	for ; e > 0; e >>= 1 {
		if e&1 == 1 {
			r = m.mul(r, x)
		}
		x = m.mul(x, x)
	}
	return r
}

// small returns w mod p for any 64-bit w (w < 8p as p > 2^61).
func (m *modulus) small(w uint64) uint64 {
	if w >= 4*m.p {
		w -= 4 * m.p
	}
	if w >= 2*m.p {
		w -= 2 * m.p
	}
	if w >= m.p {
		w -= m.p
	}
	return w
}

// residue returns the ordinary residue mod p of the non-negative integer
// with the given little-endian 64-bit words: Horner's rule in base 2^256,
// with four independent products per step (R = 2^64).
func (m *modulus) residue(w []uint64) uint64 {
	acc, i := uint64(0), len(w)
	for i%4 != 0 {
		i--
		acc = m.add(m.mul(acc, m.r[2]), m.small(w[i])) // acc R + w[i]
	}
	for i > 0 {
		i -= 4
		// acc R^4 + w[i+3] R^3 + w[i+2] R^2 + w[i+1] R + w[i]
		t := m.add(m.mul(acc, m.r[5]), m.mul(w[i+3], m.r[4]))
		u := m.add(m.mul(w[i+2], m.r[3]), m.mul(w[i+1], m.r[2]))
		acc = m.add(m.add(t, u), m.small(w[i]))
	}
	return acc
}

// words64 returns |x| as little-endian 64-bit words (at least one).
func words64(x *big.Int) []uint64 {
	b := x.Bits()
	if len(b) == 0 {
		return []uint64{0}
	}
	if bits.UintSize == 64 {
		out := make([]uint64, len(b))
		for i, w := range b {
			out[i] = uint64(w)
		}
		return out
	}
	out := make([]uint64, (len(b)+1)/2)
	for i, w := range b {
		out[i/2] |= uint64(w) << (32 * (i % 2))
	}
	return out
}

// primeBits is the size of the moduli: every prime lies in (2^61, 2^62).
const primeBits = 61

// primeCache holds the primes below 2^62 in decreasing order, as far as
// they have been needed.
var primeCache struct {
	sync.Mutex
	list []*modulus
}

// moduli returns the first k primes below 2^62 (decreasing), with their
// Montgomery constants. The result is shared: do not modify it.
func moduli(k int) []*modulus {
	primeCache.Lock()
	defer primeCache.Unlock()
	c := uint64(1)<<62 - 1
	if n := len(primeCache.list); n > 0 {
		c = primeCache.list[n-1].p - 2
	}
	x := new(big.Int)
	for len(primeCache.list) < k {
		// ProbablyPrime(0) is the Baillie–PSW test, exact below 2^64.
		if !hasSmallFactor(c) && x.SetUint64(c).ProbablyPrime(0) {
			primeCache.list = append(primeCache.list, newModulus(c))
		}
		c -= 2
	}
	return primeCache.list[:k:k]
}

// hasSmallFactor reports whether the odd c has an odd prime factor below
// 100: a cheap filter before the primality test.
func hasSmallFactor(c uint64) bool {
	for _, p := range [...]uint64{3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53, 59, 61, 67, 71, 73, 79, 83, 89, 97} {
		if c%p == 0 {
			return true
		}
	}
	return false
}

// crt returns the integer x with |x| < prod(ps)/2 and x = rs[i] mod ps[i]
// (Garner's mixed-radix algorithm, then Horner in big integers).
func crt(ms []*modulus, rs []uint64) *big.Int {
	k := len(ms)
	v := make([]uint64, k) // mixed-radix digits
	for i, m := range ms {
		t := uint64(0) // v[0] + v[1]p0 + ... mod p_i, ordinary residue
		q := m.one     // p0 p1 ... p_{i-1} mod p_i, Montgomery form
		for j := 0; j < i; j++ {
			t = m.add(t, m.mul(v[j], q))
			q = m.mul(q, m.toMont(ms[j].p))
		}
		v[i] = m.mul(m.sub(rs[i]%m.p, t), m.inv(q))
	}
	x, mod, w := new(big.Int), big.NewInt(1), new(big.Int)
	for i := k - 1; i >= 0; i-- {
		w.SetUint64(ms[i].p)
		x.Mul(x, w)
		x.Add(x, w.SetUint64(v[i]))
		mod.Mul(mod, w.SetUint64(ms[i].p))
	}
	if w.Rsh(mod, 1).Cmp(x) < 0 {
		x.Sub(x, mod)
	}
	return x
}

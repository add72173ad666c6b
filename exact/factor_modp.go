package exact

// Factoring univariate polynomials modulo a small odd prime p, by
// Cantor–Zassenhaus: distinct-degree factorization, then equal-degree
// splitting with random elements (D. G. Cantor and H. Zassenhaus, "A new
// algorithm for factoring polynomials over finite fields", Math. Comp. 36,
// 1981; von zur Gathen and Gerhard, Modern Computer Algebra, ch. 14).
//
// A polynomial mod p is a []uint64 of coefficients, lowest degree first,
// each in [0, p), trimmed (no zero leading coefficient; zero is empty).
// p < 2^31, so a product of two residues fits a uint64.

import (
	"math/big"
	"math/rand"
)

// fp is arithmetic of polynomials modulo the prime p.
type fp struct{ p uint64 }

func (f fp) trim(a []uint64) []uint64 {
	for len(a) > 0 && a[len(a)-1] == 0 {
		a = a[:len(a)-1]
	}
	return a
}

func (f fp) inv(x uint64) uint64 { return invMod(x%f.p, f.p) }

// fromZ reduces an integer polynomial mod p.
func (f fp) fromZ(a []*big.Int) []uint64 {
	out := make([]uint64, len(a))
	P := new(big.Int).SetUint64(f.p)
	r := new(big.Int)
	for i, c := range a {
		out[i] = r.Mod(c, P).Uint64()
	}
	return f.trim(out)
}

func (f fp) sub(a, b []uint64) []uint64 {
	out := make([]uint64, max(len(a), len(b)))
	copy(out, a)
	for i, c := range b {
		out[i] = (out[i] + f.p - c) % f.p
	}
	return f.trim(out)
}

func (f fp) mul(a, b []uint64) []uint64 {
	if len(a) == 0 || len(b) == 0 {
		return nil
	}
	out := make([]uint64, len(a)+len(b)-1)
	for i, x := range a {
		if x == 0 {
			continue
		}
		for j, y := range b {
			out[i+j] = (out[i+j] + x*y) % f.p
		}
	}
	return f.trim(out)
}

// scale returns c·a.
func (f fp) scale(a []uint64, c uint64) []uint64 {
	out := make([]uint64, len(a))
	for i, x := range a {
		out[i] = x * c % f.p
	}
	return f.trim(out)
}

func (f fp) monic(a []uint64) []uint64 {
	if len(a) == 0 || a[len(a)-1] == 1 {
		return a
	}
	return f.scale(a, f.inv(a[len(a)-1]))
}

// divmod returns the quotient and remainder of a by a nonzero b.
func (f fp) divmod(a, b []uint64) (q, r []uint64) {
	r = append([]uint64(nil), a...)
	if len(r) < len(b) {
		return nil, r
	}
	q = make([]uint64, len(r)-len(b)+1)
	li := f.inv(b[len(b)-1])
	for k := len(r) - len(b); k >= 0; k-- {
		c := r[k+len(b)-1] * li % f.p
		q[k] = c
		if c == 0 {
			continue
		}
		for j, y := range b {
			r[k+j] = (r[k+j] + f.p - c*y%f.p) % f.p
		}
	}
	return f.trim(q), f.trim(r[:len(b)-1])
}

func (f fp) rem(a, b []uint64) []uint64 { _, r := f.divmod(a, b); return r }

func (f fp) quo(a, b []uint64) []uint64 { q, _ := f.divmod(a, b); return q }

// gcd returns the monic gcd (empty for gcd(0, 0)).
func (f fp) gcd(a, b []uint64) []uint64 {
	for len(b) > 0 {
		a, b = b, f.rem(a, b)
	}
	return f.monic(a)
}

// xgcd returns s, t with s·a + t·b = 1 for coprime a, b (not both
// constant zero); deg s < deg b and deg t < deg a when both have positive
// degree.
func (f fp) xgcd(a, b []uint64) (s, t []uint64) {
	r0, r1 := a, b
	s0, s1 := []uint64{1}, []uint64(nil)
	t0, t1 := []uint64(nil), []uint64{1}
	for len(r1) > 0 {
		q, r := f.divmod(r0, r1)
		r0, r1 = r1, r
		s0, s1 = s1, f.sub(s0, f.mul(q, s1))
		t0, t1 = t1, f.sub(t0, f.mul(q, t1))
	}
	c := f.inv(r0[0]) // r0 is a nonzero constant for coprime inputs
	return f.scale(s0, c), f.scale(t0, c)
}

func (f fp) deriv(a []uint64) []uint64 {
	if len(a) <= 1 {
		return nil
	}
	out := make([]uint64, len(a)-1)
	for i := 1; i < len(a); i++ {
		out[i-1] = a[i] * (uint64(i) % f.p) % f.p
	}
	return f.trim(out)
}

// powmod returns a^e mod m.
func (f fp) powmod(a []uint64, e *big.Int, m []uint64) []uint64 {
	out := []uint64{1}
	a = f.rem(a, m)
	for i := e.BitLen() - 1; i >= 0; i-- {
		out = f.rem(f.mul(out, out), m)
		if e.Bit(i) == 1 {
			out = f.rem(f.mul(out, a), m)
		}
	}
	return f.rem(out, m)
}

// squareFree reports whether a is square-free mod p and keeps its degree
// (p does not divide the leading coefficient of the integer polynomial).
func (f fp) squareFree(a []uint64, deg int) bool {
	return len(a) == deg+1 && len(f.gcd(a, f.deriv(a))) == 1
}

// ddfPart is the product of all monic irreducible factors of degree deg.
type ddfPart struct {
	poly []uint64
	deg  int
}

// ddf splits a monic square-free polynomial into the products of its
// irreducible factors of each degree: gcd(a, x^(p^i) − x) collects the
// factors whose degree divides i, those of smaller degree already gone.
func (f fp) ddf(a []uint64) []ddfPart {
	var out []ddfPart
	x := []uint64{0, 1}
	h := x
	P := new(big.Int).SetUint64(f.p)
	for i := 1; 2*i <= len(a)-1; i++ {
		h = f.powmod(h, P, a)
		if g := f.gcd(a, f.sub(h, x)); len(g) > 1 {
			out = append(out, ddfPart{g, i})
			a = f.quo(a, g)
			h = f.rem(h, a)
		}
	}
	if len(a) > 1 {
		out = append(out, ddfPart{a, len(a) - 1})
	}
	return out
}

// countFactors returns the number of irreducible factors of the ddf parts.
func countFactors(parts []ddfPart) int {
	n := 0
	for _, d := range parts {
		n += (len(d.poly) - 1) / d.deg
	}
	return n
}

// edf splits a monic square-free polynomial whose irreducible factors all
// have degree d: for a random b, gcd(a, b^((p^d−1)/2) − 1) is a proper
// factor with probability about 1/2.
func (f fp) edf(a []uint64, d int, rng *rand.Rand) [][]uint64 {
	n := len(a) - 1
	if n == d {
		return [][]uint64{a}
	}
	e := new(big.Int).Exp(new(big.Int).SetUint64(f.p), big.NewInt(int64(d)), nil)
	e.Rsh(e.Sub(e, bigOne), 1)
	for {
		b := make([]uint64, n)
		for i := range b {
			b[i] = uint64(rng.Int63n(int64(f.p)))
		}
		b = f.trim(b)
		if len(b) <= 1 {
			continue
		}
		g := f.gcd(a, f.sub(f.powmod(b, e, a), []uint64{1}))
		if len(g) > 1 && len(g) < len(a) {
			return append(f.edf(g, d, rng), f.edf(f.quo(a, g), d, rng)...)
		}
	}
}

// factorSquareFree returns the monic irreducible factors of a monic
// square-free polynomial mod p, from its ddf parts.
func (f fp) factorSquareFree(parts []ddfPart) [][]uint64 {
	// A fixed seed: the same input gives the same factors, run after run.
	rng := rand.New(rand.NewSource(1))
	var out [][]uint64
	for _, d := range parts {
		out = append(out, f.edf(d.poly, d.deg, rng)...)
	}
	return out
}

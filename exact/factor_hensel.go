package exact

// Hensel lifting of a factorization modulo p to one modulo p^(2^k), by
// quadratic steps (von zur Gathen and Gerhard, Modern Computer Algebra,
// Algorithm 15.10, the Hensel step, and 15.17, multifactor lifting by a
// factor tree). Integer polynomials are []*big.Int, lowest degree first,
// trimmed.

import "math/big"

// zTrim drops zero leading coefficients.
func zTrim(a []*big.Int) []*big.Int {
	for len(a) > 0 && a[len(a)-1].Sign() == 0 {
		a = a[:len(a)-1]
	}
	return a
}

// zMod reduces a into [0, m), in place, and trims.
func zMod(a []*big.Int, m *big.Int) []*big.Int {
	for _, c := range a {
		c.Mod(c, m)
	}
	return zTrim(a)
}

// zSym reduces a into the symmetric range (−m/2, m/2], in place.
func zSym(a []*big.Int, m *big.Int) []*big.Int {
	half := new(big.Int).Rsh(m, 1)
	for _, c := range a {
		if c.Mod(c, m).Cmp(half) > 0 {
			c.Sub(c, m)
		}
	}
	return zTrim(a)
}

func zAdd(a, b []*big.Int, sign int) []*big.Int {
	out := make([]*big.Int, max(len(a), len(b)))
	for i := range out {
		out[i] = new(big.Int)
		if i < len(a) {
			out[i].Set(a[i])
		}
		if i < len(b) {
			if sign < 0 {
				out[i].Sub(out[i], b[i])
			} else {
				out[i].Add(out[i], b[i])
			}
		}
	}
	return zTrim(out)
}

func zMul(a, b []*big.Int) []*big.Int {
	if len(a) == 0 || len(b) == 0 {
		return nil
	}
	out := make([]*big.Int, len(a)+len(b)-1)
	for i := range out {
		out[i] = new(big.Int)
	}
	t := new(big.Int)
	for i, x := range a {
		if x.Sign() == 0 {
			continue
		}
		for j, y := range b {
			out[i+j].Add(out[i+j], t.Mul(x, y))
		}
	}
	return zTrim(out)
}

func zScale(a []*big.Int, c *big.Int) []*big.Int {
	out := make([]*big.Int, len(a))
	for i, x := range a {
		out[i] = new(big.Int).Mul(x, c)
	}
	return zTrim(out)
}

// zFromP lifts residues mod p to integers.
func zFromP(a []uint64) []*big.Int {
	out := make([]*big.Int, len(a))
	for i, c := range a {
		out[i] = new(big.Int).SetUint64(c)
	}
	return out
}

// zDivModMonic divides a by b, monic modulo m, returning the quotient
// and remainder reduced mod m.
func zDivModMonic(a, b []*big.Int, m *big.Int) (q, r []*big.Int) {
	r = zMod(zAdd(a, nil, 1), m)
	if len(r) < len(b) {
		return nil, r
	}
	q = make([]*big.Int, len(r)-len(b)+1)
	t := new(big.Int)
	for k := len(r) - len(b); k >= 0; k-- {
		c := new(big.Int).Mod(r[k+len(b)-1], m)
		q[k] = c
		for j, y := range b {
			r[k+j].Mod(r[k+j].Sub(r[k+j], t.Mul(c, y)), m)
		}
	}
	return zTrim(q), zTrim(r[:len(b)-1])
}

// henselStep takes f ≡ g·h and s·g + t·h ≡ 1 modulo m, h monic, to the
// same modulo m² (Modern Computer Algebra, Algorithm 15.10).
func henselStep(f, g, h, s, t []*big.Int, m *big.Int) (g2, h2, s2, t2 []*big.Int) {
	m2 := new(big.Int).Mul(m, m)
	e := zMod(zAdd(f, zMul(g, h), -1), m2)
	q, r := zDivModMonic(zMul(s, e), h, m2)
	g2 = zMod(zAdd(g, zAdd(zMul(t, e), zMul(q, g), 1), 1), m2)
	h2 = zMod(zAdd(h, r, 1), m2)
	b := zMod(zAdd(zAdd(zMul(s, g2), zMul(t, h2), 1), []*big.Int{big.NewInt(1)}, -1), m2)
	c, d := zDivModMonic(zMul(s, b), h2, m2)
	s2 = zMod(zAdd(s, d, -1), m2)
	t2 = zMod(zAdd(t, zAdd(zMul(t, b), zMul(c, g2), 1), -1), m2)
	return g2, h2, s2, t2
}

// henselLift lifts f ≡ lc(f)·∏ facs (mod p), the facs monic, distinct and
// irreducible mod p, p not dividing lc(f), to monic factors modulo
// p^(2^steps), splitting the list in halves (a factor tree).
func henselLift(f []*big.Int, facs [][]uint64, p uint64, steps int) [][]*big.Int {
	M := new(big.Int).SetUint64(p)
	for i := 0; i < steps; i++ {
		M.Mul(M, M)
	}
	if len(facs) == 1 {
		inv := new(big.Int).ModInverse(f[len(f)-1], M)
		return [][]*big.Int{zMod(zScale(f, inv), M)}
	}
	F := fp{p}
	k := len(facs) / 2
	g0 := F.fromZ([]*big.Int{f[len(f)-1]})
	for _, a := range facs[:k] {
		g0 = F.mul(g0, a)
	}
	h0 := []uint64{1}
	for _, a := range facs[k:] {
		h0 = F.mul(h0, a)
	}
	s0, t0 := F.xgcd(g0, h0)
	g, h, s, t := zFromP(g0), zFromP(h0), zFromP(s0), zFromP(t0)
	m := new(big.Int).SetUint64(p)
	for i := 0; i < steps; i++ {
		g, h, s, t = henselStep(f, g, h, s, t, m)
		m.Mul(m, m)
	}
	return append(henselLift(g, facs[:k], p, steps), henselLift(h, facs[k:], p, steps)...)
}

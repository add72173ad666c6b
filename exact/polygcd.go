package exact

// Greatest common divisors. Resultants and discriminants are in
// polyresultant.go; both use the pseudo-remainder prem (polyrem.go).
//
// GCD works in Z[x_1, ..., x_n] on primitive parts, recursively: after
// taking out monomial and integer contents, a variable that occurs in only
// one operand reduces the problem to the content of that operand in that
// variable (gcd(a, b) = gcd(cont_v(a), b) when b is free of v); otherwise
// both are made primitive in a main variable v and the primitive
// polynomial remainder sequence (Collins; Knuth, TAOCP vol. 2, 4.6.1)
// gives the primitive part of the gcd. Before the remainder sequence, the
// heuristic gcd of Char, Geddes and Gonnet (gcdHeuristic) is tried: it is
// much faster when it works, and it only returns a candidate that passes
// trial division under the bound that makes such a candidate provably the
// gcd. So every result is the gcd; the remainder sequence is slow on large
// inputs but is only the fallback.

import (
	"fmt"
	"math"
	"math/big"
)

// GCD returns the greatest common divisor of p and q over Q, normalised to
// leading coefficient 1 in the canonical order. GCD(p, 0) is p
// normalised, GCD(0, 0) = 0, and the gcd of nonzero constants is 1.
func GCD(p, q *Poly) (*Poly, error) {
	if err := p.sameRing(q, "gcd"); err != nil {
		return nil, err
	}
	switch {
	case p.IsZero():
		return q.monic(), nil
	case q.IsZero():
		return p.monic(), nil
	}
	g, err := gcdPrim(p.PrimitivePart(), q.PrimitivePart())
	if err != nil {
		return nil, err
	}
	return g.monic(), nil
}

// gcdZ returns the gcd in Z[vars] of nonzero integer polynomials, with a
// positive leading coefficient.
func gcdZ(a, b *Poly) (*Poly, error) {
	ca, cb := a.numContent(), b.numContent()
	c := new(big.Int).GCD(nil, nil, new(big.Int).Abs(ca), new(big.Int).Abs(cb))
	g, err := gcdPrim(a.PrimitivePart(), b.PrimitivePart())
	if err != nil || c.Cmp(bigOne) == 0 {
		return g, err
	}
	return g.scaleFrac(c, bigOne), nil
}

// gcdPrim returns the gcd of primitive integer polynomials with positive
// leading coefficients; the result is of the same kind.
func gcdPrim(a, b *Poly) (*Poly, error) {
	if a.isConst() || b.isConst() {
		return a.ring.one(), nil
	}
	if a.Equal(b) {
		return a, nil
	}
	// Monomial content: the lowest exponent of each variable.
	la, lb := a.lowMono(), b.lowMono()
	w := max(len(la), len(lb))
	lg := make([]uint64, w)
	for v := 0; v < (w-1)*perWord; v++ {
		if e := min(monoExp(la, v), monoExp(lb, v)); e > 0 {
			monoSetExp(lg, v, e)
			lg[0] += uint64(e)
		}
	}
	if la[0] > 0 {
		a = a.shiftDown(la)
	}
	if lb[0] > 0 {
		b = b.shiftDown(lb)
	}
	g, err := gcdNoMono(a, b)
	if err != nil {
		return nil, err
	}
	if lg[0] > 0 {
		g = g.mulMono(lg, bigOne, nil)
	}
	return g, nil
}

// lowMono returns the monomial of the lowest exponent of each variable.
func (p *Poly) lowMono() []uint64 {
	m := make([]uint64, p.w)
	for v := 0; v < p.nvars(); v++ {
		e := MaxExponent
		for i := 0; i < p.n() && e > 0; i++ {
			e = min(e, monoExp(p.monoAt(i), v))
		}
		if e > 0 {
			monoSetExp(m, v, e)
			m[0] += uint64(e)
		}
	}
	return m
}

// shiftDown divides every term by the monomial d, which divides them all.
func (p *Poly) shiftDown(d []uint64) *Poly {
	mono := make([]uint64, len(p.mono))
	copy(mono, p.mono)
	for i := 0; i < p.n(); i++ {
		for k, x := range d {
			mono[i*p.w+k] -= x
		}
	}
	return &Poly{ring: p.ring, w: p.w, mono: mono, num: p.num, bnum: p.bnum, den: p.den}
}

// gcdNoMono is gcdPrim for operands without monomial content.
func gcdNoMono(a, b *Poly) (*Poly, error) {
	if a.isConst() || b.isConst() {
		return a.ring.one(), nil
	}
	da, db := a.degrees(), b.degrees()
	main, best := -1, 0
	for v := 0; v < max(len(da), len(db)); v++ {
		x, y := at(da, v), at(db, v)
		switch {
		case x > 0 && y == 0:
			// gcd(a, b) = gcd(cont_v(a), b) when b is free of v.
			return gcdContent(a, v, b)
		case y > 0 && x == 0:
			return gcdContent(b, v, a)
		case x > 0 && (main < 0 || x+y < best):
			main, best = v, x+y
		}
	}
	// Quick exact checks: one operand dividing the other.
	if ok, err := divides(b, a); err != nil {
		return nil, err
	} else if ok {
		return b, nil
	}
	if ok, err := divides(a, b); err != nil {
		return nil, err
	} else if ok {
		return a, nil
	}
	if !gcdPRSOnly {
		if g, ok, err := gcdHeuristic(a, b, main); err != nil || ok {
			return g, err
		}
	}
	ca, A, err := splitContentIn(a, main)
	if err != nil {
		return nil, err
	}
	cb, B, err := splitContentIn(b, main)
	if err != nil {
		return nil, err
	}
	c, err := gcdZ(ca, cb)
	if err != nil {
		return nil, err
	}
	G, err := primitivePRS(A, B, main)
	if err != nil {
		return nil, err
	}
	g, err := mulPoly(c, G, "gcd")
	if err != nil {
		return nil, err
	}
	return g.PrimitivePart(), nil
}

// gcdPRSOnly turns the heuristic off (tests compare the two methods).
var gcdPRSOnly = false

// heuristicTries bounds the evaluation points gcdHeuristic tries.
const heuristicTries = 6

// gcdHeuristic is the heuristic gcd GCDHEU of Char, Geddes and Gonnet
// (B. W. Char, K. O. Geddes, G. H. Gonnet, "GCDHEU: Heuristic polynomial
// GCD algorithm based on integer GCD computation", EUROSAM 84, and J.
// Symbolic Computation 7 (1989) 31-48; also Geddes, Czapor and Labahn,
// Algorithms for Computer Algebra (GCL), 7.7) for primitive integer
// polynomials a and b: evaluate v at an integer xi, take the gcd h of the
// images (recursively, in one variable fewer), rebuild a polynomial in v
// from the xi-adic digits of h (symmetric residues), and keep its
// primitive part G if G divides both a and b. With xi > 1 + 2*min(|a|, |b|)
// (max norms), a G that divides both is the gcd (GCL, Theorem 7.7 and its
// multivariate form), so a result is always right; ok = false means the
// heuristic gave up and the caller falls back to the remainder sequence.
func gcdHeuristic(a, b *Poly, v int) (*Poly, bool, error) {
	na, nb := a.maxNorm(), b.maxNorm()
	xi := na
	if nb.Cmp(na) < 0 {
		xi = nb
	}
	xi = new(big.Int).Lsh(xi, 1)
	xi.Add(xi, big.NewInt(29))
	for try := 0; try < heuristicTries; try++ {
		ea, eb := a.evalInt(v, xi), b.evalInt(v, xi)
		if !ea.IsZero() && !eb.IsZero() {
			h, err := gcdZ(ea, eb)
			if err != nil {
				return nil, false, err
			}
			if g, ok := h.interpolate(v, xi); ok && !g.IsZero() {
				g = g.PrimitivePart()
				if g.isConst() {
					return g, true, nil
				}
				ok, err := divides(g, a)
				if err == nil && ok {
					ok, err = divides(g, b)
				}
				if err != nil {
					return nil, false, err
				}
				if ok {
					return g, true, nil
				}
			}
		}
		// Next point: xi * xi^(1/4) * 73794/27011 (a ratio near 1 + √3), so
		// that successive points grow fast and are not simply related.
		r := new(big.Int).Sqrt(new(big.Int).Sqrt(xi))
		xi.Mul(xi, r)
		xi.Mul(xi, big.NewInt(73794))
		xi.Quo(xi, big.NewInt(27011))
	}
	return nil, false, nil
}

// maxNorm returns the largest absolute value of a numerator.
func (p *Poly) maxNorm() *big.Int {
	m := new(big.Int)
	t := new(big.Int)
	for i := 0; i < p.n(); i++ {
		if p.numAt(i, t).Abs(t).Cmp(m) > 0 {
			m.Set(t)
		}
	}
	return m
}

// evalInt returns the integer polynomial p with the integer x put for
// variable v (Horner's rule on the coefficients in v).
func (p *Poly) evalInt(v int, x *big.Int) *Poly {
	parts := p.Collect(v)
	acc := p.ring.zero()
	for e := len(parts) - 1; e >= 0; e-- {
		if !acc.IsZero() {
			acc = acc.scaleFrac(x, bigOne)
		}
		if parts[e] != nil {
			acc = acc.Add(parts[e])
		}
	}
	return acc
}

// interpolate rebuilds sum_e c_e v^e from h = sum_e c_e xi^e, taking each
// c_e coefficientwise as the symmetric residue of what is left modulo xi
// (h is an integer polynomial free of v). It reports false if the degree
// in v would exceed MaxExponent.
func (h *Poly) interpolate(v int, xi *big.Int) (*Poly, bool) {
	half := new(big.Int).Rsh(xi, 1)
	var parts []*Poly
	z, t := new(big.Int), new(big.Int)
	for e := 0; !h.IsZero(); e++ {
		if e > MaxExponent {
			return nil, false
		}
		b := newBuilder(h.w)
		for i := 0; i < h.n(); i++ {
			h.numAt(i, z)
			t.Mod(z, xi) // in [0, xi)
			if t.Cmp(half) > 0 {
				t.Sub(t, xi)
			}
			if t.Sign() != 0 {
				b.pushBig(h.monoAt(i), t)
			}
		}
		c := b.poly(h.ring, nil)
		if !c.IsZero() {
			parts = append(parts, c.mulVarPow(v, e))
			h = h.Sub(c)
		}
		if !h.IsZero() {
			h = h.numsQuo(xi)
		}
	}
	if len(parts) == 0 {
		return h.ring.zero(), true
	}
	g, err := sumPolys(parts, math.MaxInt, "gcd")
	return g, err == nil
}

// gcdContent returns gcd(cont_v(a), b) for b free of v.
func gcdContent(a *Poly, v int, b *Poly) (*Poly, error) {
	g := b
	for _, c := range a.Collect(v) {
		if c == nil {
			continue
		}
		var err error
		if g, err = gcdZ(c, g); err != nil {
			return nil, err
		}
		if g.isConst() {
			return a.ring.one(), nil
		}
	}
	return g.PrimitivePart(), nil
}

// contentIn returns the content of the integer polynomial a as a
// polynomial in v: the gcd in Z[other variables] of its coefficients,
// with the sign that makes a/content have a positive leading coefficient.
func contentIn(a *Poly, v int) (*Poly, error) {
	parts := a.Collect(v)
	var g *Poly
	for e := len(parts) - 1; e >= 0; e-- {
		c := parts[e]
		if c == nil {
			continue
		}
		if g == nil {
			if g = c; c.numSign(0) < 0 {
				g = c.Neg()
			}
			continue
		}
		var err error
		if g, err = gcdZ(g, c); err != nil {
			return nil, err
		}
		if g.isOne() {
			break
		}
	}
	if a.numSign(0) < 0 {
		g = g.Neg()
	}
	return g, nil
}

// exactQuo returns a/b, which the caller knows to be exact.
func exactQuo(a, b *Poly) (*Poly, error) {
	if b.isOne() {
		return a, nil
	}
	q, ok, err := a.DivExact(b)
	if err != nil {
		return nil, err
	}
	if !ok {
		return nil, fmt.Errorf("exact: internal error: (%v) / (%v) is not exact", a, b)
	}
	return q, nil
}

// splitContentIn returns the content of a as a polynomial in v
// (contentIn) and the primitive part a/content, which has a positive
// leading coefficient.
func splitContentIn(a *Poly, v int) (content, pp *Poly, err error) {
	if content, err = contentIn(a, v); err != nil {
		return nil, nil, err
	}
	if pp, err = exactQuo(a, content); err != nil {
		return nil, nil, err
	}
	return content, pp, nil
}

// divides reports whether d divides p exactly.
func divides(d, p *Poly) (bool, error) {
	_, ok, err := p.DivExact(d)
	return ok, err
}

// primitivePRS returns the gcd of A and B, primitive as polynomials in v
// of positive degree, by the primitive polynomial remainder sequence.
func primitivePRS(A, B *Poly, v int) (*Poly, error) {
	if A.DegreeIn(v) < B.DegreeIn(v) {
		A, B = B, A
	}
	for {
		R, err := prem(A, B, v, false)
		if err != nil {
			return nil, err
		}
		if R.IsZero() {
			return B, nil
		}
		if R.DegreeIn(v) == 0 {
			return A.ring.one(), nil
		}
		A = B
		if _, B, err = splitContentIn(R, v); err != nil {
			return nil, err
		}
	}
}

package exact

// The Gröbner engine's polynomials: terms in a monoOrder, primitive
// integer coefficients, a sugar degree, and optionally the cofactors that
// express the polynomial in the engine's inputs.

import (
	"math/big"
	"slices"
)

// gpoly is a polynomial of the engine: terms in decreasing order of the
// engine's monoOrder, integer coefficients (never zero). With cofactor
// tracking on, cof[j] are polynomials of the user's ring with
// p = Σ cof[j]·input[j].
type gpoly struct {
	mono  []uint64
	coef  []*big.Int
	sugar int
	deg   int    // a bound on the total degree of its terms
	sev   uint64 // short exponent vector of the leading monomial
	cof   []*Poly
}

func (f *gpoly) n() int { return len(f.coef) }

// lm returns the leading monomial.
func (f *gpoly) lm(w int) []uint64 { return f.mono[:w] }

// fromPoly converts p (a polynomial of the ring, nring variables) into the
// engine's monomials, with the numerators as coefficients (the common
// denominator dropped: a constant multiple generates the same ideal).
func (e *engine) fromPoly(p *Poly) *gpoly {
	nt := p.n()
	type term struct {
		m []uint64
		c *big.Int
	}
	ts := make([]term, nt)
	exps := make([]int, e.mo.n)
	f := &gpoly{}
	for i := 0; i < nt; i++ {
		pm := p.monoAt(i)
		d := 0
		for v := 0; v < e.nring; v++ {
			exps[v] = monoExp(pm, v)
			d += exps[v]
		}
		m := make([]uint64, e.mo.w)
		e.mo.pack(exps, m)
		ts[i] = term{m, p.numAt(i, new(big.Int))}
		f.deg = max(f.deg, d)
	}
	slices.SortFunc(ts, func(a, b term) int { return -e.mo.cmp(a.m, b.m) })
	f.mono = make([]uint64, 0, nt*e.mo.w)
	f.coef = make([]*big.Int, nt)
	for i, t := range ts {
		f.mono = append(f.mono, t.m...)
		f.coef[i] = t.c
	}
	f.sugar = f.deg
	e.finish(f)
	return f
}

// isConst reports whether f is a nonzero constant (deg is only a bound).
func (e *engine) isConst(f *gpoly) bool { return f.n() == 1 && zeroWords(f.mono[:e.mo.w]) }

// finish sets the derived fields of a new polynomial.
func (e *engine) finish(f *gpoly) {
	if f.n() > 0 {
		f.sev = e.mo.sev(f.lm(e.mo.w))
	}
}

// toPoly converts f back to the user's ring, divided by its leading
// coefficient when monic is set (the reduced basis over Q is monic), and
// by div otherwise (nil for 1).
func (e *engine) toPoly(f *gpoly, monic bool, div *big.Rat) *Poly {
	w := wordsFor(e.nring)
	type term struct {
		m []uint64
		c *big.Rat
	}
	ts := make([]term, f.n())
	for i := range ts {
		m, _ := packExps(e.mo.exps(f.mono[i*e.mo.w : (i+1)*e.mo.w])[:e.nring], w)
		c := new(big.Rat).SetInt(f.coef[i])
		switch {
		case monic:
			c.Quo(c, new(big.Rat).SetInt(f.coef[0]))
		case div != nil:
			c.Quo(c, div)
		}
		ts[i] = term{m, c}
	}
	slices.SortFunc(ts, func(a, b term) int { return -monoCmp(a.m, b.m) })
	var rt ratTerms
	for _, t := range ts {
		rt.push(t.m, t.c)
	}
	if rt.len() == 0 {
		return e.ring.zero()
	}
	return rt.poly(e.ring, w)
}

// content returns the gcd of the coefficients (positive). It starts from
// the gcd of the two shortest, usually already small, and reduces every
// other coefficient modulo the gcd so far before a gcd is needed: one
// division of a long number by a short one each, instead of a gcd of two
// long numbers (Lehmer's gcd on long coefficients took two thirds of the
// time of Cyclic-6 before).
func content(cs []*big.Int) *big.Int {
	if len(cs) == 0 {
		return new(big.Int)
	}
	a, b := 0, -1
	for i, c := range cs {
		if c.BitLen() < cs[a].BitLen() {
			a, b = i, a
		} else if i != a && (b < 0 || c.BitLen() < cs[b].BitLen()) {
			b = i
		}
	}
	g := new(big.Int).Abs(cs[a])
	if b >= 0 {
		g.GCD(nil, nil, g, new(big.Int).Abs(cs[b]))
	}
	r := new(big.Int)
	for _, c := range cs {
		if g.IsInt64() && g.Int64() == 1 {
			break
		}
		if r.Rem(c, g).Sign() != 0 {
			g.GCD(nil, nil, g, r.Abs(r))
		}
	}
	return g
}

// primitive divides f by the content of its coefficients, with a positive
// leading coefficient.
func primitive(f *gpoly) {
	if f.n() == 0 {
		return
	}
	g := content(f.coef)
	if f.coef[0].Sign() < 0 {
		g.Neg(g)
	}
	if g.IsInt64() && g.Int64() == 1 {
		return
	}
	inv := new(big.Rat).SetFrac(bigOne, g)
	for _, c := range f.coef {
		c.Quo(c, g)
	}
	for j, c := range f.cof {
		f.cof[j] = c.Scale(inv)
	}
}

// combine returns cf·mf·f + cg·mg·g without the leading terms of f and g,
// which the caller has chosen to cancel (mf, mg nil for 1). Sugar and
// cofactors follow the combination.
func (e *engine) combine(f *gpoly, cf *big.Int, mf []uint64, g *gpoly, cg *big.Int, mg []uint64) *gpoly {
	w := e.mo.w
	nf, ng := f.n(), g.n()
	out := &gpoly{mono: make([]uint64, 0, (nf+ng)*w), coef: make([]*big.Int, 0, nf+ng)}
	a := make([]uint64, w)
	b := make([]uint64, w)
	at := func(p *gpoly, m []uint64, i int, dst []uint64) {
		src := p.mono[i*w : (i+1)*w]
		if m == nil {
			copy(dst, src)
			return
		}
		for k := range dst {
			dst[k] = src[k] + m[k]
		}
	}
	i, j := 1, 1
	if i < nf {
		at(f, mf, i, a)
	}
	if j < ng {
		at(g, mg, j, b)
	}
	for i < nf || j < ng {
		var c int
		switch {
		case i >= nf:
			c = -1
		case j >= ng:
			c = 1
		default:
			c = e.mo.cmp(a, b)
		}
		switch {
		case c > 0:
			out.mono = append(out.mono, a...)
			out.coef = append(out.coef, new(big.Int).Mul(f.coef[i], cf))
			i++
			if i < nf {
				at(f, mf, i, a)
			}
		case c < 0:
			out.mono = append(out.mono, b...)
			out.coef = append(out.coef, new(big.Int).Mul(g.coef[j], cg))
			j++
			if j < ng {
				at(g, mg, j, b)
			}
		default:
			x := new(big.Int).Mul(f.coef[i], cf)
			y := new(big.Int).Mul(g.coef[j], cg)
			if x.Add(x, y).Sign() != 0 {
				out.mono = append(out.mono, a...)
				out.coef = append(out.coef, x)
			}
			i++
			j++
			if i < nf {
				at(f, mf, i, a)
			}
			if j < ng {
				at(g, mg, j, b)
			}
		}
	}
	df, dg := 0, 0
	if mf != nil {
		df = e.mo.deg(mf)
	}
	if mg != nil {
		dg = e.mo.deg(mg)
	}
	out.sugar = max(f.sugar+df, g.sugar+dg)
	out.deg = max(f.deg+df, g.deg+dg)
	if f.cof != nil {
		out.cof = make([]*Poly, len(f.cof))
		for k := range f.cof {
			out.cof[k] = e.cofTimes(f.cof[k], cf, mf).Add(e.cofTimes(g.cof[k], cg, mg))
		}
	}
	e.finish(out)
	return out
}

// cofTimes returns c·m·p for a cofactor p.
func (e *engine) cofTimes(p *Poly, c *big.Int, m []uint64) *Poly {
	if p.IsZero() {
		return p
	}
	var pm []uint64
	if m != nil {
		pm, _ = packExps(e.mo.exps(m)[:e.nring], wordsFor(e.nring))
	} else {
		pm = make([]uint64, 1)
	}
	return p.mulMono(pm, c, nil)
}

// leadCancel returns the multipliers that cancel the leading terms of f and g:
// cf·lc(f) + cg·lc(g) = 0 with cf > 0 as small as possible.
func leadCancel(f, g *gpoly) (cf, cg *big.Int) {
	a, b := f.coef[0], g.coef[0]
	d := new(big.Int).GCD(nil, nil, new(big.Int).Abs(a), new(big.Int).Abs(b))
	cf = new(big.Int).Quo(b, d)
	cg = new(big.Int).Quo(a, d)
	cg.Neg(cg)
	if cf.Sign() < 0 {
		cf.Neg(cf)
		cg.Neg(cg)
	}
	return cf, cg
}

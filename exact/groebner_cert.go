package exact

// Ideal membership with certificates, saturation and radical membership:
// what an identity under polynomial hypotheses needs.

import (
	"errors"
	"math/big"
)

// MembershipKind says what Certify found.
type MembershipKind int

// What Certify can find about a target t, hypotheses h_i (the ideal I)
// and non-degeneracy conditions with product d (1 when there are none).
const (
	// InIdeal: t = Σ c_i·h_i.
	InIdeal MembershipKind = iota
	// InSaturation: d^j·t = Σ c_i·h_i for the j in Power: t vanishes
	// wherever the hypotheses hold and d does not vanish.
	InSaturation
	// InRadical: (d·t)^k = Σ c_i·h_i for the k in Power: t vanishes
	// wherever the hypotheses hold and d does not vanish (over C).
	InRadical
	// RadicalUnlifted: some power (d·t)^k lies in I (Rabinowitsch's test
	// said so), but none up to MaxCertifyPower, so no certificate.
	RadicalUnlifted
	// NotInRadical: no power of d·t lies in I: some complex point where
	// every hypothesis holds and d does not vanish has t ≠ 0.
	NotInRadical
	// Inconsistent: 1 lies in I; the hypotheses have no common complex
	// zero, and any identity would follow from them.
	Inconsistent
	// Degenerate: d vanishes wherever the hypotheses hold (some power of d
	// lies in I), so the non-degeneracy conditions exclude every point.
	Degenerate
	// Unsettled: t is not in I, and the saturation or radical test
	// stopped at a limit (Membership.Unsettled says which).
	Unsettled
)

// MaxCertifyPower bounds the powers j and k Certify tries.
const MaxCertifyPower = 32

// Membership is the outcome of Certify.
type Membership struct {
	Kind MembershipKind
	// Power is j for InSaturation, k for InRadical, 1 for InIdeal and
	// Inconsistent.
	Power int
	// Multiple is the polynomial shown to lie in the ideal: t, d^j·t,
	// (d·t)^k, or 1 when Inconsistent.
	Multiple *Poly
	// Cofactors c_i, one per hypothesis, with Multiple = Σ c_i·h_i
	// (InIdeal, InSaturation, InRadical, Inconsistent).
	Cofactors []*Poly
	// Remainder is the normal form of t by the grevlex Gröbner basis of
	// the hypotheses (0 for InIdeal).
	Remainder *Poly
	// BasisSize is the size of that basis.
	BasisSize int
	// Unsettled is the message of the limit that stopped the saturation
	// or radical test.
	Unsettled string
}

// Certify decides whether the target t vanishes where the hypotheses
// vanish (and the polynomials in nonzero do not), and returns a
// certificate: cofactors expressing t, d^j·t or (d·t)^k in the
// hypotheses. The cofactors come from tracking, through Buchberger's
// algorithm, how each basis polynomial is made from the hypotheses; the
// caller should re-check Multiple = Σ c_i·h_i by expanding it.
//
// Radical membership uses Rabinowitsch's trick (t·d lies in the radical
// of I exactly when 1 lies in I + (1 − y·d·t), y a new variable), and
// saturation the same with 1 − y·d (I : d^∞ is the contraction of
// I + (1 − y·d)), before the powers are searched for a certificate (Cox,
// Little, O'Shea, "Ideals, Varieties, and Algorithms", ch. 4 §2 and §4).
func Certify(t *Poly, hyps, nonzero []*Poly, lim GroebnerLimits) (*Membership, error) {
	r := t.ring
	if err := degreesFit(append(append([]*Poly{t}, hyps...), nonzero...)...); err != nil {
		return nil, err
	}
	e, err := newEngine(r, Grevlex, 0, lim)
	if err != nil {
		return nil, err
	}
	e.track, e.task = true, "Gröbner basis of the hypotheses"
	in, err := e.inputs(hyps)
	if err != nil {
		return nil, err
	}
	if err := e.run(in); err != nil {
		return nil, err
	}
	m := &Membership{BasisSize: e.size()}
	if unit := e.constant(); unit != nil {
		m.Kind, m.Power, m.Multiple = Inconsistent, 1, r.one()
		m.Cofactors, m.Remainder = e.cofOf(unit, unit.coef[0]), r.zero()
		return m, nil
	}
	e.stage = "reducing lhs − rhs"
	lift := func(p *Poly) ([]*Poly, *Poly, error) {
		if err := degreesFit(p); err != nil {
			return nil, nil, err
		}
		f := e.fromPoly(p)
		f.cof = make([]*Poly, len(hyps))
		for k := range f.cof {
			f.cof[k] = r.zero()
		}
		rem, s, err := e.fullReduce(f, 0)
		if err != nil {
			return nil, nil, err
		}
		// rem = s·den·p + Σ cof_i h_i (see fullReduce), so if rem is 0,
		// p = Σ (−cof_i/(s·den)) h_i.
		s.Mul(s, new(big.Rat).SetInt(p.denOr1()))
		if rem.n() > 0 {
			return nil, e.toPoly(rem, false, s), nil
		}
		neg := new(big.Rat).Neg(new(big.Rat).Inv(s))
		out := make([]*Poly, len(rem.cof))
		for k, c := range rem.cof {
			out[k] = c.Scale(neg)
		}
		return out, r.zero(), nil
	}
	cofs, rem, err := lift(t)
	if err != nil {
		return nil, err
	}
	m.Remainder = rem
	if cofs != nil {
		m.Kind, m.Power, m.Multiple, m.Cofactors = InIdeal, 1, t, cofs
		return m, nil
	}
	d := r.one()
	for _, q := range nonzero {
		if d, err = d.Mul(q); err != nil {
			return nil, err
		}
	}
	// powers finds the least power j <= MaxCertifyPower with base^j·t (or
	// base^j when t is nil) in I, with its cofactors.
	powers := func(base, t *Poly) (int, *Poly, []*Poly, error) {
		p := r.one()
		for j := 1; j <= MaxCertifyPower; j++ {
			var err error
			if p, err = p.Mul(base); err != nil {
				return 0, nil, nil, err
			}
			q := p
			if t != nil {
				if q, err = p.Mul(t); err != nil {
					return 0, nil, nil, err
				}
			}
			cofs, _, err := lift(q)
			if err != nil {
				return 0, nil, nil, err
			}
			if cofs != nil {
				return j, q, cofs, nil
			}
		}
		return 0, nil, nil, nil
	}
	e.stage = "searching for a power with a certificate"
	basis := make([]*Poly, 0, m.BasisSize)
	for _, g := range e.basis() {
		basis = append(basis, e.toPoly(g, true, nil))
	}
	if err := beyondIdeal(m, t, d, basis, lim, powers); err != nil {
		if !errors.Is(err, ErrDeadline) && !errors.Is(err, ErrTooManyTerms) {
			return nil, err
		}
		// lhs − rhs is known not to be in the ideal; what a power does is
		// left open, and the caller says why.
		m.Kind, m.Unsettled = Unsettled, err.Error()
	}
	return m, nil
}

// beyondIdeal settles, for t not in I, whether d^j·t (saturation) or
// (d·t)^k (radical) is in I, filling in m; basis is a minimal grevlex
// Gröbner basis of I, and powers searches the least power with a
// certificate.
func beyondIdeal(m *Membership, t, d *Poly, basis []*Poly, lim GroebnerLimits, powers func(base, t *Poly) (int, *Poly, []*Poly, error)) error {
	if !d.isConst() {
		e, err := inverse(basis, d, "Gröbner basis for the saturation by nonzero= (Rabinowitsch's trick)", lim)
		if err != nil {
			return err
		}
		if e.constant() != nil {
			m.Kind = Degenerate
			return nil
		}
		// t is in I : d^∞, the ideal of I + ⟨1 − y·d⟩ without y, exactly
		// when it reduces to 0 by that basis (t has no y).
		rem, _, err := e.fullReduce(e.fromPoly(t), 0)
		if err != nil {
			return err
		}
		if rem.n() == 0 {
			j, q, cofs, err := powers(d, t)
			if err != nil {
				return err
			}
			if cofs != nil {
				m.Kind, m.Power, m.Multiple, m.Cofactors = InSaturation, j, q, cofs
				return nil
			}
		}
	}
	g, err := d.Mul(t)
	if err != nil {
		return err
	}
	e, err := inverse(basis, g, "Gröbner basis for the radical membership test (Rabinowitsch's trick)", lim)
	if err != nil {
		return err
	}
	if e.constant() == nil {
		m.Kind = NotInRadical
		return nil
	}
	k, q, cofs, err := powers(g, nil)
	if err != nil {
		return err
	}
	if cofs == nil {
		m.Kind = RadicalUnlifted
		return nil
	}
	m.Kind, m.Power, m.Multiple, m.Cofactors = InRadical, k, q, cofs
	return nil
}

// constant returns a basis polynomial that is a nonzero constant, or nil.
func (e *engine) constant() *gpoly {
	for k, p := range e.polys {
		if e.live[k] && e.isConst(p) {
			return p
		}
	}
	return nil
}

// cofOf returns the cofactors of f divided by c.
func (e *engine) cofOf(f *gpoly, c *big.Int) []*Poly {
	inv := new(big.Rat).SetFrac(bigOne, c)
	out := make([]*Poly, len(f.cof))
	for k, p := range f.cof {
		out[k] = p.Scale(inv)
	}
	return out
}

// inverse returns the engine after computing a Gröbner basis of
// ⟨G⟩ + ⟨1 − y·g⟩, y a new variable, where G is a minimal grevlex Gröbner
// basis of the hypotheses; it holds 1 exactly when g vanishes wherever
// the hypotheses do. G seeds the basis without pairs among its
// polynomials (they all reduce to 0 already: grevlex with y last orders
// the monomials without y as before), so only the pairs with 1 − y·g
// and what follows are new.
func inverse(basis []*Poly, g *Poly, task string, lim GroebnerLimits) (*engine, error) {
	e, in, err := withInverse(basis, g, Grevlex, lim)
	if err != nil {
		return nil, err
	}
	e.task = task
	for _, b := range in[:len(in)-1] {
		e.polys = append(e.polys, b)
		e.live = append(e.live, true)
	}
	return e, e.run(in[len(in)-1:])
}

// withInverse returns an engine with one variable y past the ring's and
// its inputs: the hypotheses and 1 − y·c·g (c the denominator of g, which
// does not change the ideal's zeros or the test).
func withInverse(hyps []*Poly, g *Poly, o Order, lim GroebnerLimits) (*engine, []*gpoly, error) {
	if err := degreesFit(g); err != nil {
		return nil, nil, err
	}
	e, err := newEngine(g.ring, o, 1, lim)
	if err != nil {
		return nil, nil, err
	}
	in, err := e.inputs(hyps)
	if err != nil {
		return nil, nil, err
	}
	f := e.fromPoly(g)
	y := make([]uint64, e.mo.w)
	ey := make([]int, e.mo.n)
	ey[e.nring] = 1
	e.mo.pack(ey, y)
	w := e.mo.w
	for i := 0; i < f.n(); i++ {
		for k := range y {
			f.mono[i*w+k] += y[k]
		}
		f.coef[i].Neg(f.coef[i])
	}
	f.mono = append(f.mono, make([]uint64, w)...)
	f.coef = append(f.coef, big.NewInt(1))
	f.deg++
	f.sugar = f.deg
	e.finish(f)
	primitive(f)
	return e, append(in, f), nil
}

package exact

// Ideal membership with certificates, saturation and radical membership:
// what an identity under polynomial hypotheses needs.

import (
	"errors"
	"fmt"
	"math/big"
	"slices"
	"strings"
	"time"
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
	// Witness, for NotInRadical, names the values put in for some
	// variables where a point with t ≠ 0 was shown to exist ("" when the
	// test ran on the whole system).
	Witness string
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
	if w, err := refuteAtValues(basis, g, lim); err != nil || w != "" {
		if w != "" {
			m.Kind, m.Witness = NotInRadical, w
		}
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

// refuteAtValues tries to show cheaply that g is not in the radical of I
// (basis: its minimal grevlex Gröbner basis): it puts values in for a
// maximal set of variables independent modulo I (no leading monomial of
// the basis is a monomial in them alone, so I has no polynomial in them
// alone, and the remaining system is usually zero-dimensional and small),
// and runs Rabinowitsch's test on what is left. That is sound: a point of
// the smaller system where g ≠ 0 is a point of V(I), with those values,
// where g ≠ 0. It returns the values ("r1 = 2, r2 = 3") when it succeeds,
// "" when it cannot tell (then the full test decides). Two independent
// sets are tried, chosen greedily from the first variable and from the
// last, each within a small share of the time (refuteBudget): which one
// is easy depends on the problem. Descartes' circle theorem with 3 for 2
// (8 variables) is refuted in 0.2 s with the radii r1, r2, r3 given
// values, in 2–10 s (load permitting) with r2, x3, y4, the set picked
// from the first variable, in minutes with y4, x4, y3 (from the last),
// and not in 200 s without values.
func refuteAtValues(basis []*Poly, g *Poly, lim GroebnerLimits) (string, error) {
	r := g.ring
	e, err := newEngine(r, Grevlex, 0, lim)
	if err != nil {
		return "", err
	}
	var leads [][]int // the variables of each leading monomial
	var vars []int    // the variables that occur, in ring order
	occurs := map[int]bool{}
	for _, b := range basis {
		exps := e.mo.exps(e.fromPoly(b).lm(e.mo.w))
		var vs []int
		for v, x := range exps {
			if x > 0 {
				vs = append(vs, v)
			}
		}
		leads = append(leads, vs)
		for _, v := range b.Vars() {
			occurs[v] = true
		}
	}
	for _, v := range g.Vars() {
		occurs[v] = true
	}
	for v := 0; v < r.numVars(); v++ {
		if occurs[v] {
			vars = append(vars, v)
		}
	}
	reversed := slices.Clone(vars)
	slices.Reverse(reversed)
	tried := map[string]bool{}
	for _, order := range [][]int{vars, reversed} {
		chosen := independent(order, leads)
		key := fmt.Sprint(chosen)
		if len(chosen) == 0 || tried[key] {
			continue
		}
		tried[key] = true
		w, err := refuteWith(basis, g, chosen, refuteBudget(lim))
		if errors.Is(err, ErrDeadline) || errors.Is(err, ErrTooManyTerms) {
			continue // too hard with these values: try the next set
		}
		if err != nil || w != "" {
			return w, err
		}
	}
	return "", nil
}

// independent picks greedily, in the order given, variables no leading
// monomial lies in alone.
func independent(order []int, leads [][]int) []int {
	chosen := map[int]bool{}
	for _, v := range order {
		chosen[v] = true
		for _, vs := range leads {
			inside := true
			for _, u := range vs {
				inside = inside && chosen[u]
			}
			if inside {
				delete(chosen, v)
				break
			}
		}
	}
	out := make([]int, 0, len(chosen))
	for v := range chosen {
		out = append(out, v)
	}
	slices.Sort(out)
	return out
}

// refuteBudget is the time one try of refuteAtValues may take: a quarter
// of what is left before the deadline (so the full test keeps at least
// 9/16 of it after two tries), or 20 s without one.
func refuteBudget(lim GroebnerLimits) GroebnerLimits {
	if lim.Deadline.IsZero() {
		return GroebnerLimits{Deadline: time.Now().Add(20 * time.Second)}
	}
	return GroebnerLimits{Deadline: time.Now().Add(time.Until(lim.Deadline) / 4)}
}

// refuteWith runs Rabinowitsch's test on the basis and g with small
// primes put in for the chosen variables; it returns the values when g
// is shown not to vanish on what is left.
func refuteWith(basis []*Poly, g *Poly, chosen []int, lim GroebnerLimits) (string, error) {
	r := g.ring
	primes := []int64{2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47}
	vals := map[int]*big.Rat{}
	var names []string
	for i, v := range chosen {
		vals[v] = big.NewRat(primes[i%len(primes)]+int64(i/len(primes))*53, 1)
		names = append(names, fmt.Sprintf("%s = %s", r.name(v), vals[v].RatString()))
	}
	gs := g.Eval(vals)
	if gs.IsZero() {
		return "", nil
	}
	spec := make([]*Poly, len(basis))
	for i, b := range basis {
		spec[i] = b.Eval(vals)
	}
	e, in, err := withInverse(spec, gs, Grevlex, lim)
	if err != nil {
		return "", err
	}
	e.task = "Gröbner basis for the radical membership test at chosen values (Rabinowitsch's trick)"
	if err := e.run(in); err != nil {
		return "", err
	}
	if e.constant() != nil {
		return "", nil
	}
	return strings.Join(names, ", "), nil
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

package exact

// Gröbner bases over Q: Buchberger's algorithm with the Gebauer–Möller
// criteria and the sugar strategy, on primitive integer polynomials.
//
//   - B. Buchberger, "Ein Algorithmus zum Auffinden der Basiselemente des
//     Restklassenringes nach einem nulldimensionalen Polynomideal", 1965.
//   - R. Gebauer, H. M. Möller, "On an installation of Buchberger's
//     algorithm", J. Symbolic Comput. 6 (1988) 275–286: the update of the
//     pair set when a polynomial joins the basis (procedure UPDATE as in
//     Becker–Weispfenning, "Gröbner Bases", 1993, p. 230).
//   - A. Giovini, T. Mora, G. Niesi, L. Robbiano, C. Traverso, "One sugar
//     cube, please, or selection strategies in the Buchberger algorithm",
//     ISSAC 1991: the pair of least sugar first.
//
// What was chosen, and why. Coefficients stay integers: a reduction step
// multiplies the polynomial by lc(g)/gcd and subtracts lc(f)/gcd times a
// multiple of g (one linear merge of two sorted term lists,
// groebner_poly.go), so nothing is a fraction; the content is divided out
// whenever the leading coefficient has doubled in length since the last
// time (after every step, Lehmer gcds took two thirds of Cyclic-6's time).
// An S-polynomial is reduced until its leading term is irreducible, then
// its tail is reduced before it joins the basis: that keeps the basis
// polynomials short and their coefficients small (Cyclic-6 went from 143 s
// to 16 s with it). The measurements are in DEVELOPERS.md ("Gröbner bases")
// and groebner_bench_test.go: Cyclic-5, Katsura-5 and Cyclic-6 (about 7 s)
// come well under their targets this way, so neither a modular
// computation with rational reconstruction (whose basis would need its
// own check over Q) nor F4-style matrix reduction was tried.
//
// Certificates: with cofactor tracking on, every polynomial carries the
// cofactors that express it in the inputs, updated by every combination,
// so the basis and then the normal form of a target come with
// target = Σ c_i·h_i when the normal form is 0 (groebner_cert.go).

import (
	"errors"
	"fmt"
	"math/big"
	"slices"
	"time"
)

// GroebnerLimits bounds a Gröbner computation: past the deadline (zero for
// none) it stops with ErrDeadline; a polynomial of more terms than the
// ring's cap stops it with ErrTooManyTerms. Either message names the
// stage and the basis size so far.
type GroebnerLimits struct {
	Deadline time.Time
}

// ErrDeadline reports a computation stopped at its deadline.
var ErrDeadline = errors.New("time limit reached")

// engine is one Gröbner computation.
type engine struct {
	ring  *Ring
	nring int // the ring's variables; the engine may add more after them
	mo    *monoOrder
	lim   GroebnerLimits
	cap   int
	task  string // what the basis is for, as messages name it
	stage string
	polys []*gpoly // every polynomial that joined the basis
	live  []bool   // still in the (minimal) basis
	pairs []gpair
	track bool
}

// gpair is a critical pair of basis indices with its lcm and sugar.
type gpair struct {
	i, j  int
	lcm   []uint64
	sugar int
}

func newEngine(r *Ring, o Order, extra int, lim GroebnerLimits) (*engine, error) {
	n := r.numVars()
	mo, err := newMonoOrder(o, n+extra)
	if err != nil {
		return nil, err
	}
	return &engine{ring: r, nring: n, mo: mo, lim: lim, cap: r.MaxTerms(), task: "Gröbner basis", stage: "reading the input"}, nil
}

// check stops the computation at the deadline or past the term cap.
func (e *engine) check(f *gpoly) error {
	if f != nil && f.n() > e.cap {
		return fmt.Errorf("%s, %s (%d polynomials in the basis so far): a polynomial of more than %d terms, the term cap (raise it with the flag --max-terms): %w",
			e.task, e.stage, e.size(), e.cap, ErrTooManyTerms)
	}
	if f != nil && f.deg > MaxExponent {
		return fmt.Errorf("%s, %s: total degree above %d: %w", e.task, e.stage, MaxExponent, ErrExponentRange)
	}
	if !e.lim.Deadline.IsZero() && time.Now().After(e.lim.Deadline) {
		return fmt.Errorf("%s, %s (%d polynomials in the basis so far, %d pairs left): stopped at the cell's time limit (raise it with timeout= on the cell or the flag --timeout): %w",
			e.task, e.stage, e.size(), len(e.pairs), ErrDeadline)
	}
	return nil
}

// size counts the polynomials in the basis now.
func (e *engine) size() int {
	n := 0
	for _, l := range e.live {
		if l {
			n++
		}
	}
	return n
}

// divisor returns a basis polynomial whose leading monomial divides m
// (short exponent vector s), or nil.
func (e *engine) divisor(m []uint64, s uint64) *gpoly {
	w := e.mo.w
	for k, g := range e.polys {
		if e.live[k] && g.sev&^s == 0 && e.mo.divides(g.lm(w), m) {
			return g
		}
	}
	return nil
}

// topReduce reduces f until its leading monomial is not divisible by a
// basis leading monomial, or f is 0.
func (e *engine) topReduce(f *gpoly) (*gpoly, error) {
	w := e.mo.w
	q := make([]uint64, w)
	clean := 64
	for f.n() > 0 {
		g := e.divisor(f.lm(w), f.sev)
		if g == nil {
			break
		}
		e.mo.quo(f.lm(w), g.lm(w), q)
		cf, cg := leadCancel(f, g)
		f = e.combine(f, cf, nil, g, cg, q)
		if f.n() > 0 && f.coef[0].BitLen() > 2*clean {
			// The content is worth taking out only once the coefficients
			// have grown: doing it after every step cost two thirds of
			// Cyclic-6's time.
			primitive(f)
			clean = max(64, f.coef[0].BitLen())
		}
		if err := e.check(f); err != nil {
			return nil, err
		}
	}
	primitive(f)
	return f, nil
}

// fullReduce returns the normal form of f with respect to the basis, and
// the factor s with normal form = s·f − Σ q_k g_k (so the true remainder of
// f is the result divided by s). Terms from position from on are reduced;
// the ones before are kept.
func (e *engine) fullReduce(f *gpoly, from int) (*gpoly, *big.Rat, error) {
	w := e.mo.w
	s := big.NewRat(1, 1)
	r := &gpoly{sugar: f.sugar, deg: f.deg, cof: f.cof}
	r.mono = append(r.mono, f.mono[:from*w]...)
	for i := 0; i < from; i++ {
		r.coef = append(r.coef, new(big.Int).Set(f.coef[i]))
	}
	f = &gpoly{mono: f.mono[from*w:], coef: f.coef[from:], sugar: f.sugar, deg: f.deg, cof: f.cof}
	e.finish(f)
	q := make([]uint64, w)
	clean := 64
	for f.n() > 0 {
		g := e.divisor(f.lm(w), f.sev)
		if g == nil {
			r.mono = append(r.mono, f.lm(w)...)
			r.coef = append(r.coef, new(big.Int).Set(f.coef[0]))
			f = &gpoly{mono: f.mono[w:], coef: f.coef[1:], sugar: f.sugar, deg: f.deg, cof: f.cof}
			e.finish(f)
			continue
		}
		e.mo.quo(f.lm(w), g.lm(w), q)
		cf, cg := leadCancel(f, g)
		f = e.combine(f, cf, nil, g, cg, q)
		if !(cf.IsInt64() && cf.Int64() == 1) {
			for _, c := range r.coef {
				c.Mul(c, cf)
			}
			s.Mul(s, new(big.Rat).SetInt(cf))
		}
		if f.n() > 0 && f.coef[0].BitLen() > 2*clean {
			// Divide f and the remainder so far by their common content,
			// once the coefficients have grown (as in topReduce).
			g := content(append(slices.Clip(r.coef), f.coef...))
			if !(g.IsInt64() && g.Int64() == 1) && g.Sign() != 0 {
				for _, c := range r.coef {
					c.Quo(c, g)
				}
				for _, c := range f.coef {
					c.Quo(c, g)
				}
				inv := new(big.Rat).SetFrac(bigOne, g)
				for j, c := range f.cof {
					f.cof[j] = c.Scale(inv)
				}
				s.Quo(s, new(big.Rat).SetInt(g))
			}
			clean = max(64, f.coef[0].BitLen())
		}
		if err := e.check(f); err != nil {
			return nil, nil, err
		}
	}
	r.cof = f.cof
	e.finish(r)
	return r, s, nil
}

// add puts h (nonzero, primitive, top-reduced) into the basis with the
// Gebauer–Möller update of the pairs and of the basis.
func (e *engine) add(h *gpoly) {
	w := e.mo.w
	hi := len(e.polys)
	e.polys = append(e.polys, h)
	e.live = append(e.live, false)
	hm := h.lm(w)
	hdeg := e.mo.deg(hm)
	type cand struct {
		g       int
		lcm     []uint64
		coprime bool
	}
	var C []cand
	for g, p := range e.polys[:hi] {
		if !e.live[g] {
			continue
		}
		l := make([]uint64, w)
		e.mo.lcm(hm, p.lm(w), l)
		C = append(C, cand{g, l, e.mo.coprime(hm, p.lm(w))})
	}
	// Criterion M and F: keep a pair (h, g) unless another pair (h, g')
	// has an lcm dividing its lcm (among ties, the last one stays).
	var D []cand
	for k, c := range C {
		drop := false
		if !c.coprime {
			for _, c2 := range C[k+1:] {
				if e.mo.divides(c2.lcm, c.lcm) {
					drop = true
					break
				}
			}
			for _, d := range D {
				if !drop && e.mo.divides(d.lcm, c.lcm) {
					drop = true
				}
			}
		}
		if !drop {
			D = append(D, c)
		}
	}
	// Criterion B: an old pair whose lcm hm divides strictly (the lcms with
	// h differ from it on both sides) is superfluous.
	l1 := make([]uint64, w)
	l2 := make([]uint64, w)
	kept := e.pairs[:0]
	for _, p := range e.pairs {
		if e.mo.divides(hm, p.lcm) {
			e.mo.lcm(e.polys[p.i].lm(w), hm, l1)
			e.mo.lcm(e.polys[p.j].lm(w), hm, l2)
			if monoCmp(l1, p.lcm) != 0 && monoCmp(l2, p.lcm) != 0 {
				continue
			}
		}
		kept = append(kept, p)
	}
	e.pairs = kept
	// Buchberger's first criterion: coprime leading monomials need no pair.
	for _, d := range D {
		if d.coprime {
			continue
		}
		g := e.polys[d.g]
		ld := e.mo.deg(d.lcm)
		sugar := max(h.sugar+ld-hdeg, g.sugar+ld-e.mo.deg(g.lm(w)))
		e.pairs = append(e.pairs, gpair{i: d.g, j: hi, lcm: d.lcm, sugar: sugar})
	}
	for g, p := range e.polys[:hi] {
		if e.live[g] && e.mo.divides(hm, p.lm(w)) {
			e.live[g] = false
		}
	}
	e.live[hi] = true
}

// next removes and returns the pair of least sugar, ties to the smaller
// lcm.
func (e *engine) next() gpair {
	best := 0
	for k := 1; k < len(e.pairs); k++ {
		p, b := e.pairs[k], e.pairs[best]
		if p.sugar < b.sugar || p.sugar == b.sugar && e.mo.cmp(p.lcm, b.lcm) < 0 {
			best = k
		}
	}
	p := e.pairs[best]
	e.pairs[best] = e.pairs[len(e.pairs)-1]
	e.pairs = e.pairs[:len(e.pairs)-1]
	return p
}

// run computes a Gröbner basis of the inputs (not yet reduced): the live
// polynomials afterwards. It stops early at a nonzero constant.
func (e *engine) run(in []*gpoly) error {
	w := e.mo.w
	e.stage = "reducing the input"
	for _, f := range in {
		f, err := e.topReduce(f)
		if err != nil {
			return err
		}
		if f.n() == 0 {
			continue
		}
		e.add(f)
		if e.isConst(f) {
			return nil
		}
	}
	e.stage = "reducing S-polynomials"
	q1 := make([]uint64, w)
	q2 := make([]uint64, w)
	for len(e.pairs) > 0 {
		p := e.next()
		f, g := e.polys[p.i], e.polys[p.j]
		e.mo.quo(p.lcm, f.lm(w), q1)
		e.mo.quo(p.lcm, g.lm(w), q2)
		cf, cg := leadCancel(f, g)
		s := e.combine(f, cf, q1, g, cg, q2)
		if err := e.check(s); err != nil {
			return err
		}
		h, err := e.topReduce(s)
		if err != nil {
			return err
		}
		if h.n() == 0 {
			continue
		}
		if h, _, err = e.fullReduce(h, 1); err != nil {
			return err
		}
		primitive(h)
		e.add(h)
		if e.isConst(h) {
			return nil
		}
	}
	return nil
}

// basis returns the live polynomials sorted by leading monomial, smallest
// first.
func (e *engine) basis() []*gpoly {
	var out []*gpoly
	for k, p := range e.polys {
		if e.live[k] {
			out = append(out, p)
		}
	}
	w := e.mo.w
	slices.SortFunc(out, func(a, b *gpoly) int { return e.mo.cmp(a.lm(w), b.lm(w)) })
	return out
}

// reduced makes the live basis reduced: every tail reduced by the others
// (the leading monomials are already minimal), positive leading
// coefficients, primitive.
func (e *engine) reduced() ([]*gpoly, error) {
	e.stage = "reducing the basis"
	b := e.basis()
	for k, g := range b {
		// Reduce g's tail by the others: g itself cannot divide a smaller
		// monomial of its own tail.
		r, _, err := e.fullReduce(g, 1)
		if err != nil {
			return nil, err
		}
		primitive(r)
		b[k] = r
		e.replace(g, r)
	}
	return b, nil
}

// replace puts r in the place of g among the engine's polynomials.
func (e *engine) replace(g, r *gpoly) {
	for k, p := range e.polys {
		if p == g {
			e.polys[k] = r
		}
	}
}

// inputs converts the polynomials (of the engine's ring) for the engine,
// with cofactors e_j when tracking.
func (e *engine) inputs(ps []*Poly) ([]*gpoly, error) {
	var in []*gpoly
	for j, p := range ps {
		if p.ring != e.ring {
			return nil, fmt.Errorf("Gröbner basis: %w", ErrRingMismatch)
		}
		f := e.fromPoly(p)
		if e.track {
			f.cof = make([]*Poly, len(ps))
			for k := range ps {
				f.cof[k] = e.ring.zero()
			}
			f.cof[j] = e.ring.one()
			// fromPoly dropped the denominator: f = den·p.
			f.cof[j] = f.cof[j].Scale(new(big.Rat).SetInt(p.denOr1()))
		}
		if f.n() == 0 {
			continue
		}
		primitive(f)
		in = append(in, f)
	}
	return in, nil
}

// degreesFit checks that every total degree leaves room in the engine's
// 16-bit fields, one more for the variable Rabinowitsch's trick adds.
func degreesFit(ps ...*Poly) error {
	for _, p := range ps {
		if d := p.Degree(); d >= MaxExponent {
			return fmt.Errorf("Gröbner basis: a polynomial of total degree %d, above %d: %w", d, MaxExponent-1, ErrExponentRange)
		}
	}
	return nil
}

// Groebner returns the reduced Gröbner basis over Q of the ideal the
// polynomials generate, in the term order o: monic, sorted by leading
// monomial (smallest first). The zero ideal has the empty basis; the unit
// ideal has the basis [1].
func Groebner(ps []*Poly, o Order, lim GroebnerLimits) ([]*Poly, error) {
	if len(ps) == 0 {
		return nil, nil
	}
	if err := degreesFit(ps...); err != nil {
		return nil, err
	}
	e, err := newEngine(ps[0].ring, o, 0, lim)
	if err != nil {
		return nil, err
	}
	b, err := e.compute(ps)
	if err != nil {
		return nil, err
	}
	out := make([]*Poly, len(b))
	for k, g := range b {
		out[k] = e.toPoly(g, true, nil)
	}
	return out, nil
}

// compute runs Buchberger's algorithm on ps and returns the reduced basis.
func (e *engine) compute(ps []*Poly) ([]*gpoly, error) {
	in, err := e.inputs(ps)
	if err != nil {
		return nil, err
	}
	if err := e.run(in); err != nil {
		return nil, err
	}
	return e.reduced()
}

// Reduce returns the normal form of p with respect to the polynomials by,
// in the term order o: the remainder of the division of p by them, each
// step cancelling the largest term divisible by a leading monomial (the
// first polynomial in by whose leading monomial divides it). When by is a
// Gröbner basis in o, the result does not depend on the order of by, and
// it is 0 exactly when p lies in the ideal.
func Reduce(p *Poly, by []*Poly, o Order, lim GroebnerLimits) (*Poly, error) {
	if err := degreesFit(append([]*Poly{p}, by...)...); err != nil {
		return nil, err
	}
	e, err := newEngine(p.ring, o, 0, lim)
	if err != nil {
		return nil, err
	}
	gs, err := e.inputs(by)
	if err != nil {
		return nil, err
	}
	for _, g := range gs {
		e.polys = append(e.polys, g)
		e.live = append(e.live, true)
	}
	e.stage = "reducing"
	f := e.fromPoly(p)
	r, s, err := e.fullReduce(f, 0)
	if err != nil {
		return nil, err
	}
	// fromPoly dropped p's denominator, and the reduction multiplied by s.
	s.Mul(s, new(big.Rat).SetInt(p.denOr1()))
	return e.toPoly(r, false, s), nil
}

// IdealMember reports whether p lies in the ideal generated by ps.
func IdealMember(p *Poly, ps []*Poly, lim GroebnerLimits) (bool, error) {
	if p.IsZero() {
		return true, nil
	}
	g, err := Groebner(ps, Grevlex, lim)
	if err != nil {
		return false, err
	}
	r, err := Reduce(p, g, Grevlex, lim)
	if err != nil {
		return false, err
	}
	return r.IsZero(), nil
}

// Eliminate returns generators of the elimination ideal I ∩ Q[others]:
// the polynomials of the reduced Gröbner basis of I in the block order
// that eliminates vars which contain none of vars (Cox, Little, O'Shea,
// "Ideals, Varieties, and Algorithms", ch. 3 §1, the Elimination Theorem).
func Eliminate(ps []*Poly, vars []int, lim GroebnerLimits) ([]*Poly, error) {
	g, err := Groebner(ps, ElimOrder(vars), lim)
	if err != nil {
		return nil, err
	}
	var out []*Poly
	for _, p := range g {
		free := true
		for _, v := range vars {
			if p.DegreeIn(v) > 0 {
				free = false
			}
		}
		if free {
			out = append(out, p)
		}
	}
	return out, nil
}

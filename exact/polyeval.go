package exact

import (
	"fmt"
	"math"
	"math/big"
	"slices"
)

// Evaluation (exact and in float64), substitution, derivatives and
// contents.

// Eval substitutes the given values for variables (by index) and returns
// the resulting polynomial in the other variables; when every variable of
// p gets a value the result is a constant polynomial. Indices of variables
// that do not occur in p are ignored; a nil value panics.
func (p *Poly) Eval(vals map[int]*big.Rat) *Poly {
	nv := p.nvars()
	var used []int
	for v, x := range vals {
		checkVar(v)
		if x == nil {
			panic(fmt.Sprintf("exact: Eval: nil value for variable %d", v))
		}
		if v < nv {
			used = append(used, v)
		}
	}
	slices.Sort(used)
	if len(used) == 0 || p.IsZero() {
		return p
	}
	// powers[k][e] = vals[used[k]]^e, filled on demand.
	powers := make([][]*big.Rat, len(used))
	pow := func(k, e int) *big.Rat {
		ps := powers[k]
		if len(ps) == 0 {
			ps = append(ps, big.NewRat(1, 1))
		}
		for len(ps) <= e {
			ps = append(ps, new(big.Rat).Mul(ps[len(ps)-1], vals[used[k]]))
		}
		powers[k] = ps
		return ps[e]
	}
	type term struct {
		m []uint64
		c *big.Rat
	}
	terms := make([]term, 0, p.n())
	for i := 0; i < p.n(); i++ {
		m := append([]uint64(nil), p.monoAt(i)...)
		c := p.coefAt(i)
		for k, v := range used {
			if e := monoExp(m, v); e > 0 {
				c.Mul(c, pow(k, e))
				monoSetExp(m, v, 0)
				m[0] -= uint64(e)
			}
		}
		if c.Sign() != 0 {
			terms = append(terms, term{m, c})
		}
	}
	slices.SortStableFunc(terms, func(a, b term) int { return monoCmp(b.m, a.m) })
	var rt ratTerms
	for i := 0; i < len(terms); {
		j := i + 1
		c := terms[i].c
		for j < len(terms) && monoCmp(terms[j].m, terms[i].m) == 0 {
			c.Add(c, terms[j].c)
			j++
		}
		if c.Sign() != 0 {
			rt.push(terms[i].m, c)
		}
		i = j
	}
	return rt.poly(p.ring, p.w)
}

// Float evaluates p in float64 arithmetic at vals, indexed by variable,
// term by term: each coefficient is rounded to float64, multiplied by the
// powers of the values and the products are summed in the canonical order.
// It is a quick numerical companion of Eval, not an exact value. vals must
// have an entry for every variable that occurs in p; Float panics
// otherwise.
func (p *Poly) Float(vals []float64) float64 {
	sum := 0.0
	for i := 0; i < p.n(); i++ {
		m := p.monoAt(i)
		t := p.coefFloat(i)
		for v := 0; v < p.nvars(); v++ {
			if e := monoExp(m, v); e > 0 {
				if v >= len(vals) {
					panic(fmt.Sprintf("exact: Float needs a value for variable %d, got %d values", v, len(vals)))
				}
				t *= math.Pow(vals[v], float64(e))
			}
		}
		sum += t
	}
	return sum
}

// coefFloat returns coefficient i rounded to float64.
func (p *Poly) coefFloat(i int) float64 {
	if p.small(i) && p.den == nil {
		return float64(p.num[i])
	}
	f, _ := p.coefAt(i).Float64()
	return f
}

// Substitute replaces the variables given by index, all at once, by
// polynomials of the same ring (composition): Substitute({x: y, y: x})
// swaps x and y. Indices of variables that do not occur in p are ignored.
// It fails with ErrRingMismatch, ErrTooManyTerms (results and the powers
// and partial sums formed on the way are held to the ring's term cap) or
// ErrExponentRange.
func (p *Poly) Substitute(subs map[int]*Poly) (*Poly, error) {
	nv := p.nvars()
	var vars []int
	for v, s := range subs {
		checkVar(v)
		if s == nil {
			return nil, fmt.Errorf("substitute: nil polynomial for variable %d: %w", v, ErrShape)
		}
		if err := p.sameRing(s, "substitute"); err != nil {
			return nil, err
		}
		if v < nv && p.DegreeIn(v) > 0 {
			vars = append(vars, v)
		}
	}
	slices.Sort(vars)
	st := &substState{subs: subs, powers: map[int]map[int]*Poly{}, limit: p.ring.MaxTerms()}
	return st.subst(p, vars)
}

type substState struct {
	subs   map[int]*Poly
	powers map[int]map[int]*Poly
	limit  int
}

// subst writes p = sum_e v^e p_e for the first variable v of vars and
// returns sum_e subs[v]^e subst(p_e, vars[1:]); the p_e are free of v, so
// no variable is substituted twice.
func (st *substState) subst(p *Poly, vars []int) (*Poly, error) {
	if len(vars) == 0 || p.IsZero() {
		return p, nil
	}
	v := vars[0]
	parts := p.Collect(v)
	var sums []*Poly
	for e, part := range parts {
		if part == nil {
			continue
		}
		h, err := st.subst(part, vars[1:])
		if err != nil {
			return nil, err
		}
		if e > 0 {
			pw, err := st.power(v, e)
			if err != nil {
				return nil, err
			}
			if h, err = mulPoly(h, pw, "substitute"); err != nil {
				return nil, err
			}
		}
		sums = append(sums, h)
	}
	return sumPolys(sums, st.limit, "substitute")
}

// power returns subs[v]^e, remembering the powers made.
func (st *substState) power(v, e int) (*Poly, error) {
	m := st.powers[v]
	if m == nil {
		m = map[int]*Poly{}
		st.powers[v] = m
	}
	if pw, ok := m[e]; ok {
		return pw, nil
	}
	// Build from the largest known power below e.
	best := 0
	for k := range m {
		if k < e && k > best {
			best = k
		}
	}
	var pw *Poly
	var err error
	if best == 0 {
		pw, err = st.subs[v].Pow(e)
	} else {
		var d *Poly
		if d, err = st.subs[v].Pow(e - best); err == nil {
			pw, err = mulPoly(m[best], d, "substitute")
		}
	}
	if err != nil {
		return nil, err
	}
	m[e] = pw
	return pw, nil
}

// Collect returns the coefficients of p as a polynomial in variable v:
// out[e] is the coefficient of v^e, a polynomial free of v, or nil when it
// is zero; len(out) is the degree of p in v plus one (nil for the zero
// polynomial). One pass over the terms: dividing the terms with the same
// exponent of v by v^e keeps their order. It panics if v < 0.
func (p *Poly) Collect(v int) []*Poly {
	d := p.DegreeIn(v)
	if d < 0 {
		return nil
	}
	bs := make([]*polyBuilder, d+1)
	m := make([]uint64, p.w)
	for i := 0; i < p.n(); i++ {
		copy(m, p.monoAt(i))
		e := monoExp(m, v)
		if e > 0 {
			monoSetExp(m, v, 0)
			m[0] -= uint64(e)
		}
		if bs[e] == nil {
			bs[e] = newBuilder(p.w)
		}
		bs[e].pushTerm(m, p, i)
	}
	out := make([]*Poly, d+1)
	for e, b := range bs {
		if b != nil {
			out[e] = b.poly(p.ring, p.den)
		}
	}
	return out
}

// CoefficientIn returns the coefficient of the monomial that has the
// exponent exps[v] in each variable v named in exps, as a polynomial in the
// variables not named: the terms of p with exactly those exponents, the
// named variables divided out. Variables not named are collected, not
// required to be absent: the coefficient of a^2 in 3*a^2*b + a^2 + a is
// 3*b + 1. Naming every variable of p gives a constant, as Coefficient
// does. A negative exponent, or one above MaxExponent, gives 0. It panics
// if a variable index is negative.
func (p *Poly) CoefficientIn(exps map[int]int) *Poly {
	sel := newMonoSelect(p.w)
	for v, e := range exps {
		if !sel.require(v, e) {
			return p.ring.zero()
		}
	}
	return p.selectTerms(sel)
}

// coeffIn returns the coefficient of v^e in p, as a polynomial free of v.
func (p *Poly) coeffIn(v, e int) *Poly { return p.CoefficientIn(map[int]int{v: e}) }

// monoSelect picks the monomials with given exponents in some variables:
// m matches when m[k]&mask[k] == want[k] for every exponent word k.
type monoSelect struct{ mask, want []uint64 }

func newMonoSelect(w int) monoSelect {
	return monoSelect{mask: make([]uint64, w), want: make([]uint64, w)}
}

// require adds the condition "the exponent of v is e"; it returns false
// when no monomial of this width can meet it.
func (s monoSelect) require(v, e int) bool {
	checkVar(v)
	switch {
	case e < 0 || e > MaxExponent:
		return false
	case 1+v/perWord >= len(s.mask):
		return e == 0 // v is past the width: its exponent reads as 0
	}
	monoSetExp(s.mask, v, expMask)
	monoSetExp(s.want, v, e)
	s.want[0] += uint64(e)
	return true
}

func (s monoSelect) matches(m []uint64) bool {
	for k := 1; k < len(m); k++ {
		if m[k]&s.mask[k] != s.want[k] {
			return false
		}
	}
	return true
}

// selectTerms returns the terms of p that match sel, with the selected
// exponents subtracted. The matching terms share those exponents, so
// subtracting them keeps the terms' order.
func (p *Poly) selectTerms(sel monoSelect) *Poly {
	b := newBuilder(p.w)
	m := make([]uint64, p.w)
	for i := 0; i < p.n(); i++ {
		mi := p.monoAt(i)
		if !sel.matches(mi) {
			continue
		}
		for k := range m {
			m[k] = mi[k] - sel.want[k]
		}
		b.pushTerm(m, p, i)
	}
	return b.poly(p.ring, p.den)
}

// lcIn returns the leading coefficient of p as a polynomial in v.
func (p *Poly) lcIn(v int) *Poly { return p.coeffIn(v, p.DegreeIn(v)) }

// mulVarPow returns p * v^e (the caller keeps exponents in range).
func (p *Poly) mulVarPow(v, e int) *Poly {
	if e == 0 {
		return p
	}
	return p.mulMono(varPow(v, e), bigOne, nil)
}

// Derivative returns the partial derivative of p with respect to variable
// v (zero if v does not occur). It panics if v < 0.
func (p *Poly) Derivative(v int) *Poly {
	checkVar(v)
	b := newBuilder(p.w)
	m := make([]uint64, p.w)
	z := new(big.Int)
	for i := 0; i < p.n(); i++ {
		e := monoExp(p.monoAt(i), v)
		if e == 0 {
			continue
		}
		copy(m, p.monoAt(i))
		monoSetExp(m, v, e-1)
		m[0]--
		if p.small(i) {
			if c, ov := mulOv(p.num[i], int64(e)); !ov {
				b.pushSmall(m, c)
				continue
			}
		}
		p.numAt(i, z)
		b.pushBig(m, z.Mul(z, big.NewInt(int64(e))))
	}
	return b.poly(p.ring, p.den)
}

// Content returns the rational content of p: the rational c, with the sign
// of the leading coefficient, such that p/c has coprime integer
// coefficients and a positive leading coefficient. Content of the zero
// polynomial is 0.
func (p *Poly) Content() *big.Rat {
	if p.IsZero() {
		return new(big.Rat)
	}
	return new(big.Rat).SetFrac(p.numContent(), p.denOr1())
}

// PrimitivePart returns p/Content(p): coprime integer coefficients and a
// positive leading coefficient (zero for the zero polynomial).
func (p *Poly) PrimitivePart() *Poly {
	if p.IsZero() {
		return p
	}
	g := p.numContent()
	if g.Cmp(bigOne) == 0 && p.den == nil {
		return p
	}
	return p.numsQuo(g)
}

// monic returns p divided by its leading coefficient (zero stays zero).
func (p *Poly) monic() *Poly {
	if p.IsZero() || (p.den == nil && p.small(0) && p.num[0] == 1) {
		return p
	}
	c := p.coefAt(0)
	return p.Scale(c.Inv(c))
}

// numContent returns the gcd of the numerators, with the sign of the
// leading one.
func (p *Poly) numContent() *big.Int {
	g := new(big.Int)
	if p.bnum == nil {
		var gs uint64
		for _, x := range p.num {
			if gs = GCDWord(gs, absU64(x)); gs == 1 {
				break
			}
		}
		g.SetUint64(gs)
	} else {
		t := new(big.Int)
		for i := 0; i < p.n(); i++ {
			if g.GCD(nil, nil, g, p.numAt(i, t).Abs(t)); g.Cmp(bigOne) == 0 {
				break
			}
		}
	}
	if p.numSign(0) < 0 {
		g.Neg(g)
	}
	return g
}

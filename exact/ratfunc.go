package exact

// Rational functions over Q: quotients of polynomials of one Ring, kept in
// lowest terms through GCD (polygcd.go).
//
// Sums and products follow Henrici (P. Henrici, "A subroutine for
// computations with rational numbers", J. ACM 3 (1956) 6–9), whose
// argument holds in any gcd domain, so for polynomials too: for a/b and
// c/d in lowest terms,
//
//	a/b · c/d = (a/g1)(c/g2) / ((b/g2)(d/g1)),  g1 = gcd(a, d), g2 = gcd(c, b),
//	a/b + c/d = (t/h) / ((b/g)(d/h)),  g = gcd(b, d), t = a(d/g) + c(b/g), h = gcd(t, g),
//
// and both results are already in lowest terms. The gcds are of the
// operands' parts, and of t with g, never of the whole products, which
// would be larger; when g = 1 (coprime denominators, the usual case) the
// sum needs no gcd beyond the first.

import (
	"fmt"
	"math/big"
	"slices"
	"strings"
	"unicode"
)

// RatFunc is a rational function over Q, num/den, in lowest terms and in
// one normal form: gcd(num, den) = 1, and den is primitive (coprime
// integer coefficients) with a positive leading coefficient in the ring's
// canonical order, so the rational content lives in num. Equal rational
// functions therefore have equal parts; a polynomial p is p/1, and 0 is
// 0/1. A RatFunc is immutable; make one with NewRatFunc or RatFuncOf.
type RatFunc struct {
	num, den *Poly
}

// NewRatFunc returns num/den in lowest terms. It returns ErrDivisionByZero
// when den is the zero polynomial, ErrRingMismatch when the two belong to
// different rings, and the errors of GCD.
func NewRatFunc(num, den *Poly) (*RatFunc, error) {
	if err := num.sameRing(den, "rational function"); err != nil {
		return nil, err
	}
	if den.IsZero() {
		return nil, fmt.Errorf("rational function with denominator 0: %w", ErrDivisionByZero)
	}
	return reduced(num, den)
}

// RatFuncOf returns the polynomial p as the rational function p/1.
func RatFuncOf(p *Poly) *RatFunc { return &RatFunc{num: p, den: p.ring.one()} }

// Num returns the numerator (the rational content is here).
func (f *RatFunc) Num() *Poly { return f.num }

// Den returns the denominator: primitive, positive leading coefficient.
func (f *RatFunc) Den() *Poly { return f.den }

// Ring returns the ring of the numerator and denominator.
func (f *RatFunc) Ring() *Ring { return f.num.ring }

// IsPoly reports whether f is a polynomial (its denominator is 1).
func (f *RatFunc) IsPoly() bool { return f.den.isOne() }

// IsZero reports whether f is 0.
func (f *RatFunc) IsZero() bool { return f.num.IsZero() }

// Equal reports whether f and g are the same rational function; by the
// normal form, whether their parts are equal.
func (f *RatFunc) Equal(g *RatFunc) bool { return f.num.Equal(g.num) && f.den.Equal(g.den) }

// reduced divides num and den by their gcd and normalises the result.
func reduced(num, den *Poly) (*RatFunc, error) {
	if num.IsZero() {
		return &RatFunc{num: num, den: num.ring.one()}, nil
	}
	if !den.isConst() {
		g, err := GCD(num, den)
		if err != nil {
			return nil, err
		}
		if !g.isOne() {
			if num, err = quoExact(num, g); err != nil {
				return nil, err
			}
			if den, err = quoExact(den, g); err != nil {
				return nil, err
			}
		}
	}
	return normal(num, den), nil
}

// normal moves the content of den, with the sign of its leading
// coefficient, into num; num and den must be coprime.
func normal(num, den *Poly) *RatFunc {
	if num.IsZero() {
		return &RatFunc{num: num, den: num.ring.one()}
	}
	c := den.Content()
	if c.Cmp(big.NewRat(1, 1)) == 0 {
		return &RatFunc{num: num, den: den}
	}
	c.Inv(c)
	return &RatFunc{num: num.Scale(c), den: den.Scale(c)}
}

// quoExact returns p/q where q is known to divide p.
func quoExact(p, q *Poly) (*Poly, error) {
	r, ok, err := p.DivExact(q)
	if err != nil {
		return nil, err
	}
	if !ok {
		return nil, fmt.Errorf("rational function: %s does not divide %s although it was found to (a bug): %w", q, p, ErrShape)
	}
	return r, nil
}

// Neg returns −f.
func (f *RatFunc) Neg() *RatFunc { return &RatFunc{num: f.num.Neg(), den: f.den} }

// Add returns f + g (Henrici's sum, see the top of this file).
func (f *RatFunc) Add(g *RatFunc) (*RatFunc, error) { return f.addSub(g, false) }

// Sub returns f − g.
func (f *RatFunc) Sub(g *RatFunc) (*RatFunc, error) { return f.addSub(g, true) }

func (f *RatFunc) addSub(g *RatFunc, sub bool) (*RatFunc, error) {
	if err := f.num.sameRing(g.num, "rational function sum"); err != nil {
		return nil, err
	}
	combine := (*Poly).Add
	if sub {
		combine = (*Poly).Sub
	}
	if f.den.Equal(g.den) {
		// One denominator: only the new numerator's gcd with it remains.
		return reduced(combine(f.num, g.num), f.den)
	}
	gd, err := GCD(f.den, g.den)
	if err != nil {
		return nil, err
	}
	b, d := f.den, g.den
	if !gd.isOne() {
		if b, err = quoExact(b, gd); err != nil {
			return nil, err
		}
		if d, err = quoExact(d, gd); err != nil {
			return nil, err
		}
	}
	x, err := f.num.Mul(d)
	if err != nil {
		return nil, err
	}
	y, err := g.num.Mul(b)
	if err != nil {
		return nil, err
	}
	// gcd(t, b·d·gd) = gcd(t, gd) (Henrici): only gd can share a factor
	// with t; with gd = 1, cancel returns at once.
	t, gh, err := cancel(combine(x, y), gd)
	if err != nil {
		return nil, err
	}
	den, err := mulAll(b.ring, []*Poly{b, d, gh})
	if err != nil {
		return nil, err
	}
	return normal(t, den), nil
}

// Mul returns f·g (Henrici's product, see the top of this file).
func (f *RatFunc) Mul(g *RatFunc) (*RatFunc, error) {
	if err := f.num.sameRing(g.num, "rational function product"); err != nil {
		return nil, err
	}
	if f.IsZero() || g.IsZero() {
		return RatFuncOf(f.Ring().zero()), nil
	}
	a, b, err := cancel(f.num, g.den)
	if err != nil {
		return nil, err
	}
	c, d, err := cancel(g.num, f.den)
	if err != nil {
		return nil, err
	}
	num, err := a.Mul(c)
	if err != nil {
		return nil, err
	}
	den, err := d.Mul(b)
	if err != nil {
		return nil, err
	}
	return normal(num, den), nil
}

// cancel divides p and q by their gcd; a constant q has nothing to cancel.
func cancel(p, q *Poly) (*Poly, *Poly, error) {
	if q.isConst() || p.isConst() {
		return p, q, nil
	}
	g, err := GCD(p, q)
	if err != nil || g.isOne() {
		return p, q, err
	}
	if p, err = quoExact(p, g); err != nil {
		return nil, nil, err
	}
	q, err = quoExact(q, g)
	return p, q, err
}

// Inv returns 1/f, or ErrDivisionByZero when f is 0.
func (f *RatFunc) Inv() (*RatFunc, error) {
	if f.IsZero() {
		return nil, fmt.Errorf("invert the rational function 0: %w", ErrDivisionByZero)
	}
	return normal(f.den, f.num), nil
}

// Quo returns f/g, or ErrDivisionByZero when g is 0.
func (f *RatFunc) Quo(g *RatFunc) (*RatFunc, error) {
	h, err := g.Inv()
	if err != nil {
		return nil, err
	}
	return f.Mul(h)
}

// Pow returns f^k for any integer k (ErrDivisionByZero for 0 to a
// negative power). Powers of coprime parts stay coprime, and of a
// primitive denominator stay primitive (Gauss), so no gcd is needed.
func (f *RatFunc) Pow(k int) (*RatFunc, error) {
	if k < 0 {
		inv, err := f.Inv()
		if err != nil {
			return nil, err
		}
		return inv.Pow(-k)
	}
	num, err := f.num.Pow(k)
	if err != nil {
		return nil, err
	}
	den, err := f.den.Pow(k)
	if err != nil {
		return nil, err
	}
	return normal(num, den), nil
}

// Eval puts rational values in for variables (by index), as Poly.Eval
// does, and returns the rational function of the variables left (a
// constant when none is left). It returns ErrDivisionByZero when the
// denominator vanishes there: as a polynomial in the variables left, or
// as a number.
func (f *RatFunc) Eval(vals map[int]*big.Rat) (*RatFunc, error) {
	den := f.den.Eval(vals)
	if den.IsZero() {
		return nil, fmt.Errorf("the denominator %s vanishes there: %w", f.den, ErrDivisionByZero)
	}
	return reduced(f.num.Eval(vals), den)
}

// Derivative returns the partial derivative with respect to variable v by
// the quotient rule, (num'·den − num·den')/den², in lowest terms.
func (f *RatFunc) Derivative(v int) (*RatFunc, error) {
	dn := f.num.Derivative(v)
	if f.IsPoly() {
		return RatFuncOf(dn), nil
	}
	x, err := dn.Mul(f.den)
	if err != nil {
		return nil, err
	}
	y, err := f.num.Mul(f.den.Derivative(v))
	if err != nil {
		return nil, err
	}
	den, err := f.den.Mul(f.den)
	if err != nil {
		return nil, err
	}
	return reduced(x.Sub(y), den)
}

// Substitute replaces the variables given by index, all at once, by
// rational functions of the same ring. Polynomial replacements go through
// Poly.Substitute; otherwise each part p becomes P/∏ b_v^deg_v(p), where
// a_v/b_v replaces v and P = Σ c·∏ a_v^e_v·b_v^(deg_v(p)−e_v) (p made
// homogeneous in each pair a_v, b_v), and the powers of the b_v left over
// from the two parts are put on the side that needs them. It returns
// ErrDivisionByZero when the denominator becomes 0.
func (f *RatFunc) Substitute(subs map[int]*RatFunc) (*RatFunc, error) {
	polys := map[int]*Poly{}
	for v, s := range subs {
		checkVar(v)
		if s == nil {
			return nil, fmt.Errorf("substitute: nil rational function for variable %d: %w", v, ErrShape)
		}
		if err := f.num.sameRing(s.num, "substitute"); err != nil {
			return nil, err
		}
		if s.IsPoly() {
			polys[v] = s.num
		}
	}
	var num, den *Poly
	var err error
	if len(polys) == len(subs) {
		if num, err = f.num.Substitute(polys); err != nil {
			return nil, err
		}
		if den, err = f.den.Substitute(polys); err != nil {
			return nil, err
		}
	} else {
		var dn, dd map[int]int
		if num, dn, err = homSubstitute(f.num, subs); err != nil {
			return nil, err
		}
		if den, dd, err = homSubstitute(f.den, subs); err != nil {
			return nil, err
		}
		for v, s := range subs {
			k := dd[v] - dn[v]
			if k == 0 || s.IsPoly() {
				continue
			}
			side := &num
			if k < 0 {
				side, k = &den, -k
			}
			bk, err := s.den.Pow(k)
			if err != nil {
				return nil, err
			}
			if *side, err = (*side).Mul(bk); err != nil {
				return nil, err
			}
		}
	}
	if den.IsZero() {
		return nil, fmt.Errorf("substitute: the denominator %s becomes 0: %w", f.den, ErrDivisionByZero)
	}
	return reduced(num, den)
}

// homSubstitute returns P and the degrees deg_v(p) of Substitute's
// comment for one polynomial p.
func homSubstitute(p *Poly, subs map[int]*RatFunc) (*Poly, map[int]int, error) {
	deg := map[int]int{}
	var vars []int
	for v := range subs {
		if v < p.nvars() {
			if d := p.DegreeIn(v); d > 0 {
				deg[v] = d
				vars = append(vars, v)
			}
		}
	}
	slices.Sort(vars)
	h := &homState{subs: subs, deg: deg, vars: vars, pow: map[[3]int]*Poly{}}
	out, err := h.subst(p, 0)
	return out, deg, err
}

type homState struct {
	subs map[int]*RatFunc
	deg  map[int]int
	vars []int
	pow  map[[3]int]*Poly // {v, e, 0 numerator or 1 denominator} -> power
}

// power returns a_v^e (part 0) or b_v^e (part 1), kept for reuse.
func (h *homState) power(v, e, part int) (*Poly, error) {
	key := [3]int{v, e, part}
	if p, ok := h.pow[key]; ok {
		return p, nil
	}
	base := h.subs[v].num
	if part == 1 {
		base = h.subs[v].den
	}
	p, err := base.Pow(e)
	if err == nil {
		h.pow[key] = p
	}
	return p, err
}

// subst writes p = Σ_e v^e p_e for v = vars[i] and returns
// Σ_e subst(p_e, i+1)·a_v^e·b_v^(deg_v − e); the p_e are free of v.
func (h *homState) subst(p *Poly, i int) (*Poly, error) {
	if i == len(h.vars) || p.IsZero() {
		return p, nil
	}
	v := h.vars[i]
	var terms []*Poly
	for e, c := range p.Collect(v) {
		if c == nil {
			continue
		}
		c, err := h.subst(c, i+1)
		if err != nil {
			return nil, err
		}
		a, err := h.power(v, e, 0)
		if err != nil {
			return nil, err
		}
		b, err := h.power(v, h.deg[v]-e, 1)
		if err != nil {
			return nil, err
		}
		t, err := mulAll(c.ring, []*Poly{c, a, b})
		if err != nil {
			return nil, err
		}
		terms = append(terms, t)
	}
	if len(terms) == 0 {
		return p.ring.zero(), nil
	}
	return sumPolys(terms, p.ring.MaxTerms(), "substitute")
}

// EvalReal puts certified real values in for every variable of f and
// returns the numerator and the denominator there; the caller decides
// whether the denominator is non-zero before dividing. A variable of f
// without a value gives ErrShape.
func (f *RatFunc) EvalReal(vals map[int]*Real) (num, den *Real, err error) {
	if num, err = f.num.EvalReal(vals); err != nil {
		return nil, nil, err
	}
	if den, err = f.den.EvalReal(vals); err != nil {
		return nil, nil, err
	}
	return num, den, nil
}

// String prints num/den, each part in parentheses unless it is a single
// variable or a non-negative integer; a polynomial prints as itself.
func (f *RatFunc) String() string {
	if f.IsPoly() {
		return f.num.String()
	}
	return ratPart(f.num) + "/" + ratPart(f.den)
}

func ratPart(p *Poly) string {
	s := p.String()
	if strings.IndexFunc(s, func(r rune) bool { return !(unicode.IsLetter(r) || unicode.IsDigit(r) || r == '_') }) < 0 {
		return s
	}
	return "(" + s + ")"
}

package exact

// Minimal polynomials of algebraic reals, by resultants over the
// expression and factorization over Q.
//
// # The method
//
// Walking the expression from the leaves, every node ξ gets its minimal
// polynomial P_ξ (irreducible over Z, primitive, positive leading
// coefficient). A rational a/b has b·t − a. For the operations, a
// polynomial vanishing at the result comes from a resultant in an
// auxiliary variable y (the classical construction: R. Loos, "Computing in
// algebraic extensions", in Computer Algebra, Springer 1982; H. Cohen, A
// Course in Computational Algebraic Number Theory, §3.6.2), whose roots in
// t are the results of the operation on every pair of conjugates:
//
//	−ξ          P_ξ(−t)
//	ξ ± η       Res_y(P_ξ(t ∓ y), P_η(y))              roots ξ_i ± η_j
//	ξ · η       Res_y(y^m·P_ξ(t/y), P_η(y))            roots ξ_i·η_j
//	ξ / η       Res_y(P_ξ(t·y), P_η(y)), η ≠ 0          roots ξ_i/η_j
//	ξ^n         Res_y(P_ξ(y), t − g(y)), g = y^n mod P_ξ, roots ξ_i^n
//	ξ^(1/k)     P_ξ(t^k)                                roots all k-th roots
//
// (m = deg P_ξ; ξ^-n is (1/ξ)^n, 1/ξ having the reversed polynomial; the
// resultant is ±lc^m·∏_j A(t, η_j), which holds whenever the degree of A in y
// is its formal degree, true above since ξ, η ≠ 0 where it matters.) The
// product is then factored over Q (Poly.Factor: square-free parts,
// Zassenhaus), and the one irreducible factor that vanishes at the node's
// value is kept. Choosing it is a proof, not a guess: the product vanishes
// at ξ, so at least one factor does, and distinct irreducible factors
// have no common root, so exactly one does. Each factor is evaluated at an
// enclosure of ξ, with the precision doubled until every factor but one
// is certified non-zero there; the one left is the one that vanishes (the
// others are non-zero at ξ, so this ends once the enclosures are narrow
// enough, or at the precision cap with ErrUndecided). Keeping the minimal
// polynomial at every node keeps the degrees from multiplying needlessly
// (√2 + √2 gives t² − 8, not a degree-4 product).
//
// # Cost, and the degree cap
//
// A node of degrees m and n costs a subresultant PRS (Resultant) on
// polynomials of degree m in t and n in y, whose result has degree m·n in t
// and coefficients of about n·|P_ξ| + m·|P_η| bits, then a factorization of
// that degree. The factorization dominates: Zassenhaus's recombination is
// exponential in the number of modular factors, and numbers such as
// √2 + √3 + √5 + … (whose minimal polynomials split into factors of degree
// ≤ 2 modulo every prime) are the worst case. Degree 16 (four square
// roots) takes 3–6 ms, almost all of it in the factorization (Hensel
// lifting and the modular factors; the resultants take a few per cent, the
// choice of factor less: CPU profile of BenchmarkMinimalPolynomial);
// degree 32 about 0.13 s; degree 64 (six square roots) about 0.5 s, by
// the lattice recombination (factor_vanhoeij.go), while degree-64
// numbers of other kinds take 30–650 ms (⁸√2 + ⁸√3, ∜2 + ∜3 + ∜5). So a
// degree cap, checked before each resultant: a polynomial whose degree
// would pass it stops with ErrDegreeCap, naming the flag --max-degree. Its
// default, DefaultMaxDegree = 64, keeps every step within a few seconds,
// far under the default cell time limit of 60 s (measured December 2026 on
// the 2-core machine).

import (
	"errors"
	"fmt"
	"math/big"
)

// DefaultMaxDegree is the default degree cap of MinimalPolynomial: the
// largest degree of a polynomial built on the way (see the top of this
// file for the measurements behind it).
const DefaultMaxDegree = 64

// minpoly is the state of one MinimalPolynomial computation.
type minpoly struct {
	maxDeg  int
	maxPrec uint
	ring    *Ring
	t, y    *Poly
	memo    map[*Real]*Poly // node → its minimal polynomial in t
}

// MinimalPolynomial returns the minimal polynomial over Q of an algebraic
// x (built from rationals by + − × ÷, integer powers and roots): the
// irreducible integer polynomial with coprime coefficients and a positive
// leading coefficient that vanishes at x, as its coefficients from the
// constant term up. The method and its cost are at the top of
// real_minpoly.go. Errors: ErrNotAlgebraic for an expression with a
// transcendental function or π; ErrDegreeCap when a polynomial on the way
// would have degree above maxDegree (≤ 0: DefaultMaxDegree);
// ErrFactorLimit from the factorization; ErrUndecided when the precision
// cap maxPrec did not separate the factors; and the errors of evaluating x
// itself (ErrDomain, ErrDivisionByZero).
func (x *Real) MinimalPolynomial(maxDegree int, maxPrec uint) ([]*big.Int, error) {
	if !x.algebraic().ok {
		return nil, fmt.Errorf("minimal polynomial: the value involves a transcendental function or pi (it may still be algebraic, as cos(2*pi/5) is, but the expression does not show it): %w", ErrNotAlgebraic)
	}
	if maxDegree <= 0 {
		maxDegree = DefaultMaxDegree
	}
	if _, err := x.Enclose(64); err != nil && !errors.Is(err, ErrUndecided) {
		return nil, err
	}
	r := NewRing()
	t, _ := r.Var("t")
	y, _ := r.Var("y")
	m := &minpoly{maxDeg: maxDegree, maxPrec: maxPrec, ring: r, t: t, y: y, memo: map[*Real]*Poly{}}
	p, err := m.of(x)
	if err != nil {
		return nil, err
	}
	return toDense(p, 0), nil
}

// of returns the minimal polynomial of node x, in t.
func (m *minpoly) of(x *Real) (*Poly, error) {
	if p, ok := m.memo[x]; ok {
		return p, nil
	}
	p, err := m.compute(x)
	if err != nil {
		return nil, err
	}
	m.memo[x] = p
	return p, nil
}

func (m *minpoly) compute(x *Real) (*Poly, error) {
	if x.exact != nil {
		// b·t − a
		return fromDense(m.ring, 0, []*big.Int{new(big.Int).Neg(x.exact.Num()), new(big.Int).Set(x.exact.Denom())}), nil
	}
	switch x.op {
	case opFail:
		return nil, x.fail
	case opAlgRoot:
		// p vanishes at x; pick keeps its irreducible factor that does.
		if err := m.check(len(x.ar.p) - 1); err != nil {
			return nil, err
		}
		return m.pick(x, x.ar.p)
	case opNeg:
		p, err := m.of(x.x)
		if err != nil {
			return nil, err
		}
		return m.pick(x, negateVar(toDense(p, 0)))
	case opRoot:
		p, err := m.of(x.x)
		if err != nil {
			return nil, err
		}
		if err := m.check(p.Degree() * x.k); err != nil {
			return nil, err
		}
		a := toDense(p, 0)
		b := make([]*big.Int, (len(a)-1)*x.k+1)
		for i := range b {
			b[i] = new(big.Int)
		}
		for i, c := range a {
			b[i*x.k].Set(c)
		}
		return m.pick(x, b)
	case opPow:
		return m.power(x)
	case opAdd, opSub, opMul, opQuo:
		return m.binary(x)
	}
	return nil, fmt.Errorf("minimal polynomial: %w", ErrNotAlgebraic)
}

// check refuses a polynomial of degree d beyond the cap.
func (m *minpoly) check(d int) error {
	if d > m.maxDeg {
		return fmt.Errorf("the minimal polynomial needs a polynomial of degree %d on the way, beyond the degree cap of %d (raise it with the flag --max-degree): %w", d, m.maxDeg, ErrDegreeCap)
	}
	return nil
}

// binary handles ξ ± η, ξ·η and ξ/η by a resultant in y.
func (m *minpoly) binary(x *Real) (*Poly, error) {
	p, err := m.of(x.x)
	if err != nil {
		return nil, err
	}
	q, err := m.of(x.y)
	if err != nil {
		return nil, err
	}
	if err := m.check(p.Degree() * q.Degree()); err != nil {
		return nil, err
	}
	if x.op == opQuo && q.Degree() == 1 && toDense(q, 0)[0].Sign() == 0 {
		return nil, fmt.Errorf("minimal polynomial of a quotient: the divisor is exactly zero: %w", ErrDivisionByZero)
	}
	a := toDense(p, 0)
	var A *Poly
	switch x.op {
	case opAdd, opSub:
		s := m.t.Sub(m.y) // roots of P_ξ(t − y): t = ξ_i + y
		if x.op == opSub {
			s = m.t.Add(m.y)
		}
		if A, err = m.fromDense(a).Substitute(map[int]*Poly{0: s}); err != nil {
			return nil, err
		}
	case opMul, opQuo:
		// Σ a_i t^i y^(m−i) for the product, Σ a_i t^i y^i for the quotient.
		A = m.ring.zero()
		deg := len(a) - 1
		for i, c := range a {
			if c.Sign() == 0 {
				continue
			}
			ey := deg - i
			if x.op == opQuo {
				ey = i
			}
			term, err := m.monomial(c, i, ey)
			if err != nil {
				return nil, err
			}
			A = A.Add(term)
		}
	}
	B, err := q.Substitute(map[int]*Poly{0: m.y})
	if err != nil {
		return nil, err
	}
	return m.eliminate(x, A, B)
}

// eliminate returns the factor of Res_y(A, B) that vanishes at x.
func (m *minpoly) eliminate(x *Real, A, B *Poly) (*Poly, error) {
	res, err := Resultant(A, B, 1)
	if err != nil {
		return nil, err
	}
	return m.pick(x, toDense(res.PrimitivePart(), 0))
}

// power handles ξ^n: y^|n| is first reduced modulo P_ξ (or its reversal,
// for 1/ξ), so the resultant has degree deg P_ξ in y whatever n is.
func (m *minpoly) power(x *Real) (*Poly, error) {
	p, err := m.of(x.x)
	if err != nil {
		return nil, err
	}
	a := toDense(p, 0)
	n := x.k
	if n < 0 {
		if len(a) == 2 && a[0].Sign() == 0 {
			return nil, fmt.Errorf("minimal polynomial of a negative power of zero: %w", ErrDivisionByZero)
		}
		n = -n
		for i, j := 0, len(a)-1; i < j; i, j = i+1, j-1 {
			a[i], a[j] = a[j], a[i]
		}
	}
	g := powMod(a, n)
	B := m.t
	for i, c := range g {
		if c.Sign() != 0 {
			mono, err := m.y.Pow(i)
			if err != nil {
				return nil, err
			}
			B = B.Sub(mono.Scale(c))
		}
	}
	A, err := m.fromDense(a).Substitute(map[int]*Poly{0: m.y})
	if err != nil {
		return nil, err
	}
	return m.eliminate(x, A, B)
}

// monomial returns c·t^i·y^j.
func (m *minpoly) monomial(c *big.Int, i, j int) (*Poly, error) {
	ti, err := m.t.Pow(i)
	if err != nil {
		return nil, err
	}
	yj, err := m.y.Pow(j)
	if err != nil {
		return nil, err
	}
	tm, err := ti.Mul(yj)
	if err != nil {
		return nil, err
	}
	return tm.Scale(new(big.Rat).SetInt(c)), nil
}

// fromDense is the polynomial in t with coefficients a (lowest first).
func (m *minpoly) fromDense(a []*big.Int) *Poly { return fromDense(m.ring, 0, a) }

// pick factors the integer polynomial a, which vanishes at x, and returns
// the irreducible factor that does (see the top of this file).
func (m *minpoly) pick(x *Real, a []*big.Int) (*Poly, error) {
	f, err := m.fromDense(a).Factor()
	if err != nil {
		return nil, fmt.Errorf("minimal polynomial: %w", err)
	}
	cands := make([]*Poly, len(f.Factors))
	for i, fp := range f.Factors {
		cands[i] = fp.Factor
	}
	switch len(cands) {
	case 0:
		return nil, fmt.Errorf("minimal polynomial: a constant polynomial on the way (a fault in assay)")
	case 1:
		return cands[0], nil
	}
	at := make([]*Real, len(cands))
	for i, c := range cands {
		at[i] = hornerReal(toDense(c, 0), x)
	}
	for prec := uint(64); ; prec *= 2 {
		prec = min(prec, clampPrec(m.maxPrec))
		var left []int
		for i := range at {
			if at[i] == nil {
				continue
			}
			iv, err := at[i].Enclose(prec)
			switch {
			case err == nil && (iv.Lo.Sign() > 0 || iv.Hi.Sign() < 0):
				at[i] = nil // certified non-zero at x
				continue
			case err != nil && !errors.Is(err, ErrUndecided):
				return nil, err
			}
			left = append(left, i)
		}
		if len(left) == 1 {
			return cands[left[0]], nil
		}
		if len(left) == 0 {
			return nil, fmt.Errorf("minimal polynomial: no factor vanishes at the value (a fault in assay)")
		}
		if prec >= clampPrec(m.maxPrec) {
			return nil, capError{fmt.Sprintf("minimal polynomial: %d candidate factors of degree up to %d still not told apart at the value within the precision cap of %d bits", len(left), cands[left[len(left)-1]].Degree(), m.maxPrec)}
		}
	}
}

// hornerReal is the Real c_0 + x·(c_1 + x·(…)).
func hornerReal(c []*big.Int, x *Real) *Real {
	v := RealFromRat(new(big.Rat).SetInt(c[len(c)-1]))
	for i := len(c) - 2; i >= 0; i-- {
		v = RealAdd(RealMul(v, x), RealFromRat(new(big.Rat).SetInt(c[i])))
	}
	return v
}

// negateVar returns the coefficients of a(−t).
func negateVar(a []*big.Int) []*big.Int {
	out := make([]*big.Int, len(a))
	for i, c := range a {
		out[i] = new(big.Int).Set(c)
		if i%2 == 1 {
			out[i].Neg(out[i])
		}
	}
	return out
}

// powMod returns y^n mod a(y) over Q (a of degree ≥ 1), by repeated
// squaring, as coefficients from the constant term up.
func powMod(a []*big.Int, n int) []*big.Rat {
	mod := func(b []*big.Rat) []*big.Rat {
		d := len(a) - 1
		lc := new(big.Rat).SetInt(a[d])
		for i := len(b) - 1; i >= d; i-- {
			if b[i].Sign() == 0 {
				continue
			}
			q := new(big.Rat).Quo(b[i], lc)
			for j := 0; j <= d; j++ {
				b[i-d+j].Sub(b[i-d+j], new(big.Rat).Mul(q, new(big.Rat).SetInt(a[j])))
			}
		}
		if len(b) > d {
			b = b[:d]
		}
		return b
	}
	mul := func(u, v []*big.Rat) []*big.Rat {
		out := make([]*big.Rat, len(u)+len(v)-1)
		for i := range out {
			out[i] = new(big.Rat)
		}
		for i, c := range u {
			for j, e := range v {
				out[i+j].Add(out[i+j], new(big.Rat).Mul(c, e))
			}
		}
		return mod(out)
	}
	result := mod([]*big.Rat{big.NewRat(1, 1)})
	base := mod([]*big.Rat{new(big.Rat), big.NewRat(1, 1)})
	for ; n > 0; n >>= 1 {
		if n&1 == 1 {
			result = mul(result, base)
		}
		if n > 1 {
			base = mul(base, base)
		}
	}
	return result
}

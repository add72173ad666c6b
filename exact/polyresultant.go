package exact

// Resultants and discriminants.

import (
	"fmt"
	"math/big"
)

// Resultant returns the resultant of p and q with respect to variable v:
// the determinant of their Sylvester matrix built from the coefficients
// of p and q as polynomials in v, of degrees m = deg_v p and n = deg_v q.
// Conventions for the degenerate cases: if p or q is zero the resultant is
// 0; if m = n = 0 it is 1 (the empty determinant); if only m = 0 it is
// p^n, if only n = 0 it is q^m. Res(q, p) = (-1)^(mn) Res(p, q). The
// computation is the subresultant polynomial remainder sequence (Collins;
// Brown and Traub; H. Cohen, A Course in Computational Algebraic Number
// Theory, Algorithm 3.3.7) over Z[other variables], with exact divisions.
func Resultant(p, q *Poly, v int) (*Poly, error) {
	if err := p.sameRing(q, "resultant"); err != nil {
		return nil, err
	}
	checkVar(v)
	if p.IsZero() || q.IsZero() {
		return p.ring.zero(), nil
	}
	m, n := p.DegreeIn(v), q.DegreeIn(v)
	switch {
	case m == 0 && n == 0:
		return p.ring.one(), nil
	case m == 0:
		return p.Pow(n)
	case n == 0:
		return q.Pow(m)
	}
	// Res(P/dp, Q/dq) = Res(P, Q) / (dp^n dq^m).
	P, Q := p.clearDen(), q.clearDen()
	r, err := subresultant(P, Q, v)
	if err != nil {
		return nil, err
	}
	if p.den == nil && q.den == nil {
		return r, nil
	}
	d := new(big.Int).Exp(p.denOr1(), big.NewInt(int64(n)), nil)
	d.Mul(d, new(big.Int).Exp(q.denOr1(), big.NewInt(int64(m)), nil))
	return r.scaleFrac(bigOne, d), nil
}

// clearDen returns the integer polynomial den*p.
func (p *Poly) clearDen() *Poly {
	if p.den == nil {
		return p
	}
	return &Poly{ring: p.ring, w: p.w, mono: p.mono, num: p.num, bnum: p.bnum}
}

// subresultant computes Res_v(A, B) for integer polynomials of positive
// degree in v (Cohen, Algorithm 3.3.7).
func subresultant(A, B *Poly, v int) (*Poly, error) {
	r := A.ring
	// Integer contents: Res(aA', bB') = a^deg(B) b^deg(A) Res(A', B').
	a, b := A.numContent(), B.numContent()
	t := new(big.Int).Exp(a, big.NewInt(int64(B.DegreeIn(v))), nil)
	t.Mul(t, new(big.Int).Exp(b, big.NewInt(int64(A.DegreeIn(v))), nil))
	A, B = A.scaleFrac(bigOne, absInt(a)), B.scaleFrac(bigOne, absInt(b))
	if a.Sign() < 0 {
		A = A.Neg()
	}
	if b.Sign() < 0 {
		B = B.Neg()
	}
	g, h := r.one(), r.one()
	s := 1
	if A.DegreeIn(v) < B.DegreeIn(v) {
		A, B = B, A
		if A.DegreeIn(v)%2 == 1 && B.DegreeIn(v)%2 == 1 {
			s = -1
		}
	}
	for {
		dA, dB := A.DegreeIn(v), B.DegreeIn(v)
		delta := dA - dB
		if dA%2 == 1 && dB%2 == 1 {
			s = -s
		}
		R, err := prem(A, B, v, true)
		if err != nil {
			return nil, err
		}
		A = B
		hd, err := h.Pow(delta)
		if err != nil {
			return nil, err
		}
		gh, err := mulPoly(g, hd, "resultant")
		if err != nil {
			return nil, err
		}
		if B, err = exactQuo(R, gh); err != nil {
			return nil, err
		}
		g = A.lcIn(v)
		switch {
		case delta == 1:
			h = g
		case delta > 1:
			gd, err := g.Pow(delta)
			if err != nil {
				return nil, err
			}
			hd1, err := h.Pow(delta - 1)
			if err != nil {
				return nil, err
			}
			if h, err = exactQuo(gd, hd1); err != nil {
				return nil, err
			}
		}
		if B.IsZero() {
			return r.zero(), nil
		}
		if B.DegreeIn(v) == 0 {
			break
		}
	}
	dA := A.DegreeIn(v)
	lb, err := B.Pow(dA)
	if err != nil {
		return nil, err
	}
	hd, err := h.Pow(dA - 1)
	if err != nil {
		return nil, err
	}
	res, err := exactQuo(lb, hd)
	if err != nil {
		return nil, err
	}
	if s < 0 {
		t.Neg(t)
	}
	return res.scaleFrac(t, bigOne), nil
}

func absInt(x *big.Int) *big.Int { return new(big.Int).Abs(x) }

// Discriminant returns the discriminant of p with respect to variable v,
// (-1)^(n(n-1)/2) / lc_v(p) * Res_v(p, dp/dv) with n = deg_v p, so that
// the discriminant of a x^2 + b x + c is b^2 - 4ac and that of a
// polynomial of degree 1 is 1. A p of degree 0 in v (including zero)
// gives ErrDegree.
func Discriminant(p *Poly, v int) (*Poly, error) {
	checkVar(v)
	n := p.DegreeIn(v)
	if n < 1 {
		return nil, fmt.Errorf("discriminant of %v with respect to %s: degree %d, need at least 1: %w", p, p.ring.name(v), n, ErrDegree)
	}
	r, err := Resultant(p, p.Derivative(v), v)
	if err != nil {
		return nil, err
	}
	d, ok, err := r.DivExact(p.lcIn(v))
	if err != nil {
		return nil, err
	}
	if !ok {
		return nil, fmt.Errorf("exact: internal error: the leading coefficient does not divide the resultant")
	}
	if (n*(n-1)/2)%2 == 1 {
		d = d.Neg()
	}
	return d, nil
}

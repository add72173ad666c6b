package exact

// Square-free decomposition (Yun), for polynomials in any number of
// variables over Q.
//
// A polynomial is split into its content and primitive part with respect
// to a main variable v (the first that occurs). The primitive part is
// decomposed by Yun's algorithm with the partial derivative in v (D. Y. Y.
// Yun, "On square-free decomposition algorithms", SYMSAC 1976): in
// characteristic 0, gcd(A, ∂A/∂v) of a polynomial primitive in v holds
// exactly the repeated factors, and the existing multivariate GCD does the
// work. The content, a polynomial in fewer variables, is decomposed
// recursively, and parts of equal multiplicity are multiplied together
// (content and primitive part are coprime, so the product stays square-free).

import "math/big"

// FactorPower is a factor and its multiplicity in a decomposition.
type FactorPower struct {
	// Factor is primitive over Z with a positive leading coefficient in
	// the ring's term order, and not constant.
	Factor *Poly
	// Mult is the multiplicity, at least 1.
	Mult int
}

// SquareFree returns the square-free decomposition of p: a rational unit
// u and parts (s_1, 1), (s_2, 2), … with p = u·∏ s_i^i, each s_i
// square-free, primitive with a positive leading coefficient, and the s_i
// pairwise coprime. Parts equal to 1 are left out, so the list is sorted
// by multiplicity with gaps. A constant p gives (p, nil); zero gives
// (0, nil).
func (p *Poly) SquareFree() (*big.Rat, []FactorPower, error) {
	if c, ok := p.Constant(); ok {
		return c, nil, nil
	}
	parts, err := squareFreePrim(p.PrimitivePart())
	if err != nil {
		return nil, nil, err
	}
	return unitOf(p, parts), parts, nil
}

// unitOf returns the rational u with p = u·∏ f_i^k_i, from the leading
// coefficients (the leading term of a product is the product of the
// leading terms in a monomial order).
func unitOf(p *Poly, parts []FactorPower) *big.Rat {
	u := p.LeadingCoefficient()
	for _, fp := range parts {
		lc := fp.Factor.LeadingCoefficient()
		for k := 0; k < fp.Mult; k++ {
			u.Quo(u, lc)
		}
	}
	return u
}

// squareFreePrim decomposes a primitive integer polynomial with a
// positive leading coefficient.
func squareFreePrim(p *Poly) ([]FactorPower, error) {
	if p.isConst() {
		return nil, nil
	}
	v := p.Vars()[0]
	content, pp, err := splitContentIn(p, v)
	if err != nil {
		return nil, err
	}
	parts, err := yun(pp, v)
	if err != nil {
		return nil, err
	}
	rest, err := squareFreePrim(content)
	if err != nil {
		return nil, err
	}
	return mergeByMult(parts, rest)
}

// yun decomposes A, primitive in v of positive degree in v.
func yun(A *Poly, v int) ([]FactorPower, error) {
	B := A.Derivative(v)
	C, err := GCD(A, B)
	if err != nil {
		return nil, err
	}
	W, err := exactQuo(A, C)
	if err != nil {
		return nil, err
	}
	Y, err := exactQuo(B, C)
	if err != nil {
		return nil, err
	}
	var out []FactorPower
	for i := 1; !W.isConst(); i++ {
		Z := Y.Sub(W.Derivative(v))
		G, err := GCD(W, Z)
		if err != nil {
			return nil, err
		}
		if !G.isConst() {
			out = append(out, FactorPower{G.PrimitivePart(), i})
		}
		if W, err = exactQuo(W, G); err != nil {
			return nil, err
		}
		if Y, err = exactQuo(Z, G); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// mergeByMult joins two decompositions of coprime polynomials,
// multiplying parts of equal multiplicity.
func mergeByMult(a, b []FactorPower) ([]FactorPower, error) {
	var out []FactorPower
	i, j := 0, 0
	for i < len(a) || j < len(b) {
		switch {
		case j == len(b) || i < len(a) && a[i].Mult < b[j].Mult:
			out = append(out, a[i])
			i++
		case i == len(a) || b[j].Mult < a[i].Mult:
			out = append(out, b[j])
			j++
		default:
			f, err := a[i].Factor.Mul(b[j].Factor)
			if err != nil {
				return nil, err
			}
			out = append(out, FactorPower{f, a[i].Mult})
			i, j = i+1, j+1
		}
	}
	return out, nil
}

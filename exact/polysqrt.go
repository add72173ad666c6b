package exact

import "fmt"

// Square roots of polynomials, and polynomials evaluated at certified
// reals.

// Sqrt returns the polynomial q with q² = p and a positive leading
// coefficient in the ring's term order (so q is one of the two square
// roots ±q; as a function it is |q| only where q ≥ 0). When p is not the
// square of a polynomial over Q the error is a *NotSquareError (wrapping
// ErrDomain) that says what stands in the way: a negative leading coefficient, a unit that is not a
// rational square, or a square-free part of odd multiplicity. The zero
// polynomial has the square root 0.
//
// The test is the square-free decomposition p = u·∏ s_i^i (Yun, in
// factor_sqfree.go): p is a square exactly when u is the square of a
// rational and every s_i with odd i is absent, and then q = √u·∏ s_i^(i/2),
// whose leading coefficient √u·∏ lc(s_i)^(i/2) is positive since each s_i
// has a positive one. The leading coefficient's sign is checked first, as
// it refuses half of all non-squares without a gcd.
func (p *Poly) Sqrt() (*Poly, error) {
	if p.IsZero() {
		return p, nil
	}
	if lc := p.LeadingCoefficient(); lc.Sign() < 0 {
		return nil, &NotSquareError{p, "its leading coefficient " + FormatRat(lc) + " is negative"}
	}
	u, parts, err := p.SquareFree()
	if err != nil {
		return nil, err
	}
	su, ok := ratRoot(u, 2)
	if !ok {
		return nil, &NotSquareError{p, "it is " + FormatRat(u) + " times a square at most, and " + FormatRat(u) + " is not the square of a rational"}
	}
	q := p.ring.Const(su)
	for _, fp := range parts {
		if fp.Mult%2 == 1 {
			return nil, &NotSquareError{p, fmt.Sprintf("its square-free factor %s occurs to the odd power %d", clipText(fp.Factor.String()), fp.Mult)}
		}
		f, err := fp.Factor.Pow(fp.Mult / 2)
		if err != nil {
			return nil, err
		}
		if q, err = q.Mul(f); err != nil {
			return nil, err
		}
	}
	return q, nil
}

// NotSquareError reports a polynomial that is not the square of a
// polynomial over Q, and what stands in the way. It wraps ErrDomain.
type NotSquareError struct {
	P      *Poly
	Reason string
}

func (e *NotSquareError) Error() string {
	return "square root: " + clipText(e.P.String()) + " is not the square of a polynomial over Q: " + e.Reason
}

// Unwrap returns ErrDomain.
func (e *NotSquareError) Unwrap() error { return ErrDomain }

// clipText shortens a long polynomial for a message.
func clipText(s string) string {
	const most = 200
	if len(s) <= most {
		return s
	}
	return s[:most] + "…"
}

// EvalReal returns the value of p with vals[v] put in for every variable
// v, a certified real; every variable that occurs in p needs a value
// (else the error wraps ErrShape and names it). The value is built by
// Horner's rule in one variable at a time (p = Σ c_e(rest)·x^e, gaps
// bridged by powers), so each value enters the expression once per
// coefficient instead of once per term; for algebraic values the result
// is algebraic, and the zero bound decides identities with it.
func (p *Poly) EvalReal(vals map[int]*Real) (*Real, error) {
	for _, v := range p.Vars() {
		if vals[v] == nil {
			return nil, fmt.Errorf("evaluate: no value for %s: %w", p.ring.name(v), ErrShape)
		}
	}
	return p.hornerReal(p.Vars(), vals), nil
}

// hornerReal evaluates p, whose variables are among vars, by Horner's rule
// in vars[0] with coefficients evaluated recursively.
func (p *Poly) hornerReal(vars []int, vals map[int]*Real) *Real {
	if c, ok := p.Constant(); ok {
		return RealFromRat(c)
	}
	for len(vars) > 0 && p.DegreeIn(vars[0]) <= 0 {
		vars = vars[1:]
	}
	x := vals[vars[0]]
	coefs := p.Collect(vars[0])
	var acc *Real
	gap := 0 // powers of x owed to acc since its last coefficient
	for e := len(coefs) - 1; e >= 0; e-- {
		if acc != nil {
			gap++
		}
		if coefs[e] == nil {
			continue
		}
		c := coefs[e].hornerReal(vars[1:], vals)
		if acc == nil {
			acc = c
		} else {
			acc = RealAdd(RealMul(acc, RealPowInt(x, gap)), c)
		}
		gap = 0
	}
	if gap > 0 {
		acc = RealMul(acc, RealPowInt(x, gap))
	}
	return acc
}

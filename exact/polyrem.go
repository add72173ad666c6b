package exact

// Division with remainder, and the pseudo-remainder of the gcd and
// resultant remainder sequences.

import (
	"fmt"
	"math/big"
)

// Divide divides p by q with remainder: p = quo*q + rem where no term of
// rem is divisible by the leading monomial of q (in the canonical graded
// lexicographic order). This is the multivariate division algorithm with
// the single divisor q; since {q} is a Gröbner basis of the ideal (q), rem
// is the normal form of p modulo q, and rem == 0 exactly when q divides p.
// For univariate polynomials it is the usual Euclidean division. A zero q
// gives ErrDivisionByZero. The algorithm subtracts multiples of q term by
// term (quadratic in the number of terms); DivExact is faster when only
// exact quotients matter.
func (p *Poly) Divide(q *Poly) (quo, rem *Poly, err error) {
	if err := p.sameRing(q, "divide"); err != nil {
		return nil, nil, err
	}
	if q.IsZero() {
		return nil, nil, fmt.Errorf("divide polynomial by 0: %w", ErrDivisionByZero)
	}
	if c, ok := q.Constant(); ok {
		quo, err := p.QuoConst(c)
		return quo, p.ring.zero(), err
	}
	limit := p.ring.MaxTerms()
	lm := q.monoAt(0)
	lc := q.coefAt(0)
	w := max(p.w, q.w)
	var qt, rt ratTerms
	r := p
	for !r.IsZero() {
		m := r.monoAt(0)
		c := r.coefAt(0)
		if monoDivides(m, lm) {
			t := monoQuo(m, lm)
			c.Quo(c, lc)
			qt.push(t, c)
			r = addSub(r, q.mulMono(t, c.Num(), c.Denom()), true)
		} else {
			rt.push(m, c)
			r = r.rest()
		}
		if qt.len()+r.n() > 2*limit+q.n() || rt.len() > limit {
			return nil, nil, tooManyTerms("divide", limit)
		}
	}
	return qt.poly(p.ring, w), rt.poly(p.ring, w), nil
}

// rest returns p without its first term (for internal use: the result may
// not be in lowest terms).
func (p *Poly) rest() *Poly {
	out := &Poly{ring: p.ring, w: p.w, mono: p.mono[p.w:], num: p.num[1:], den: p.den}
	if p.bnum != nil {
		out.bnum = p.bnum[1:]
	}
	return out
}

// ratTerms collects terms with rational coefficients in decreasing order.
type ratTerms struct {
	mono [][]uint64
	coef []*big.Rat
}

func (t *ratTerms) len() int { return len(t.coef) }

func (t *ratTerms) push(m []uint64, c *big.Rat) {
	t.mono = append(t.mono, append([]uint64(nil), m...))
	t.coef = append(t.coef, c)
}

// poly builds the polynomial of the (nonzero, decreasing) terms with at
// least w words per monomial.
func (t *ratTerms) poly(r *Ring, w int) *Poly {
	for _, m := range t.mono {
		w = max(w, len(m))
	}
	den := big.NewInt(1)
	g := new(big.Int)
	for _, c := range t.coef {
		if !c.IsInt() {
			g.GCD(nil, nil, den, c.Denom())
			den.Mul(den, g.Quo(c.Denom(), g))
		}
	}
	b := newBuilder(w)
	b.grow(len(t.coef))
	m := make([]uint64, w)
	z := new(big.Int)
	for i, c := range t.coef {
		clear(m)
		copy(m, t.mono[i])
		z.Quo(den, c.Denom())
		z.Mul(z, c.Num())
		b.pushBig(m, z)
	}
	return b.poly(r, den)
}

// prem returns the pseudo-remainder of A by B in v: with exact, the
// remainder R of lc_v(B)^(deg A - deg B + 1) * A by B; without, the
// remainder of lc_v(B)^k * A for the k reduction steps taken, a multiple
// of R by a power of lc_v(B) (enough for gcds).
func prem(A, B *Poly, v int, exact bool) (*Poly, error) {
	dB := B.DegreeIn(v)
	lB := B.lcIn(v)
	R := A
	e := A.DegreeIn(v) - dB + 1
	for !R.IsZero() {
		dR := R.DegreeIn(v)
		if dR < dB {
			break
		}
		lR := R.lcIn(v)
		T, err := mulPoly(lR, B.mulVarPow(v, dR-dB), "pseudo-remainder")
		if err != nil {
			return nil, err
		}
		if R, err = mulPoly(lB, R, "pseudo-remainder"); err != nil {
			return nil, err
		}
		R = R.Sub(T)
		e--
	}
	if exact && e > 0 && !R.IsZero() {
		f, err := lB.Pow(e)
		if err != nil {
			return nil, err
		}
		return mulPoly(f, R, "pseudo-remainder")
	}
	return R, nil
}

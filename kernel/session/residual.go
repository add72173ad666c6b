package session

import (
	"fmt"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

// target is the precision for a claim: the notebook's, or digits=N.
func (s *Session) target(fn string, a interp.Args) (claim.Target, error) {
	t := claim.Target{Bits: uint(s.precision), Cap: uint(s.settings.MaxPrecision)}
	if a.Given("digits") {
		n, err := a.Int("digits", 0)
		if err != nil || n < 1 {
			return claim.Target{}, py.ExceptionNewf(py.ValueError, "%s(): digits must be a positive integer", fn)
		}
		t.Bits = claim.BitsForDigits(n)
	}
	if t.Bits > t.Cap {
		return claim.Target{}, py.ExceptionNewf(py.ValueError, "the claim asks for %d bits, above the precision cap of %d bits (raise it with --max-precision)", t.Bits, t.Cap)
	}
	return t, nil
}

// measure computes the residual of two sides: numbers, reals, polynomials,
// matrices, k-vectors, or lists and tuples of them. Floats are refused:
// they would make "holds" a statement about rounding.
func (s *Session) measure(t claim.Target, lhs, rhs py.Object) (claim.Residual, error) {
	// A factorization compares as its pair (unit, [(f1, k1), ...]).
	if f, ok := lhs.(*values.Factored); ok {
		lhs = f.Pair()
	}
	if f, ok := rhs.(*values.Factored); ok {
		rhs = f.Pair()
	}
	_, lp := lhs.(*values.Polynomial)
	_, rp := rhs.(*values.Polynomial)
	_, lr := lhs.(*values.Real)
	_, rr := rhs.(*values.Real)
	switch {
	case fraction(lhs) || fraction(rhs):
		a, ok1 := s.env.RatFunc(lhs)
		b, ok2 := s.env.RatFunc(rhs)
		if !ok1 {
			return claim.Residual{}, sideError(lhs)
		}
		if !ok2 {
			return claim.Residual{}, sideError(rhs)
		}
		r, err := claim.OfRatFuncs(a, b)
		return r, interp.Exception(err)
	case lr || rr:
		a, ok1 := values.RealOf(lhs)
		b, ok2 := values.RealOf(rhs)
		if !ok1 {
			return claim.Residual{}, sideError(lhs)
		}
		if !ok2 {
			return claim.Residual{}, sideError(rhs)
		}
		r, err := claim.OfReal(a, b, t)
		return r, interp.Exception(err)
	case lp || rp:
		a, ok1 := s.env.Poly(lhs)
		b, ok2 := s.env.Poly(rhs)
		if !ok1 {
			return claim.Residual{}, sideError(lhs)
		}
		if !ok2 {
			return claim.Residual{}, sideError(rhs)
		}
		return claim.OfPoly(a.Sub(b)), nil
	}
	if x, ok := values.ExactOf(lhs); ok {
		y, ok := values.ExactOf(rhs)
		if !ok {
			return claim.Residual{}, sideError(rhs)
		}
		if x.Num().Cmp(y.Num()) == 0 && x.Denom().Cmp(y.Denom()) == 0 {
			// The same numerator and denominator: equal, whether or
			// not in lowest terms, with no product formed (unequal
			// forms of one value go through Sub below).
			return claim.Zero(), nil
		}
		return claim.Exact(new(big.Rat).Sub(x, y)), nil
	}
	if a, ok := lhs.(*values.KVector); ok {
		b, ok := rhs.(*values.KVector)
		if !ok {
			return claim.Residual{}, py.ExceptionNewf(py.TypeError, "one side is a k-vector and the other is %s", interp.TypeName(rhs))
		}
		d, err := a.Value().Sub(b.Value())
		if err != nil {
			return claim.Residual{}, py.ExceptionNewf(py.ValueError, "identity: %v", err)
		}
		return claim.OfKVector(d), nil
	}
	if a, ok := lhs.(*values.Matrix); ok {
		b, ok := rhs.(*values.Matrix)
		if !ok {
			return claim.Residual{}, py.ExceptionNewf(py.TypeError, "one side is a matrix and the other is %s", interp.TypeName(rhs))
		}
		var r claim.Residual
		var err error
		qa, ok1 := a.Rational()
		qb, ok2 := b.Rational()
		switch {
		case ok1 && ok2:
			r, err = claim.OfMatrices(qa, qb)
		case a.HasRatFuncs() || b.HasRatFuncs():
			r, err = claim.OfRatFuncMatrices(a.RatLifted(), b.RatLifted())
		default:
			r, err = claim.OfPolyMatrices(a.Lifted(), b.Lifted())
		}
		return r, interp.Exception(err)
	}
	ls, lok := interp.Items(lhs)
	rs, rok := interp.Items(rhs)
	if !lok || !rok {
		return claim.Residual{}, sideError(lhs)
	}
	if len(ls) != len(rs) {
		return claim.Residual{}, py.ExceptionNewf(py.ValueError, "the sides have different lengths: %d and %d", len(ls), len(rs))
	}
	entries := make([]claim.Residual, len(ls))
	for i := range ls {
		var err error
		if entries[i], err = s.measure(t, ls[i], rs[i]); err != nil {
			return claim.Residual{}, err
		}
	}
	return claim.Entries(entries), nil
}

// fraction reports whether a side is a rational function, or a
// polynomial made by a division: an identity about it holds only where
// the denominators are non-zero, and is compared by cross-multiplication.
func fraction(o py.Object) bool {
	switch x := o.(type) {
	case *values.RationalFunction:
		return true
	case *values.Polynomial:
		return x.Quotient()
	}
	return false
}

func sideError(o py.Object) error {
	if _, ok := o.(py.Float); ok {
		return py.ExceptionNewf(py.TypeError, "a side of the identity is a float64 (%s), which cannot be checked exactly; build it from ints and frac(...) instead (int / int is already exact in assay)", interp.Str(o))
	}
	return py.ExceptionNewf(py.TypeError, "a side of the identity is %s; claims compare exact numbers, polynomials, rational functions, matrices, or lists and tuples of them", interp.TypeName(o))
}

// pair unpacks the (lhs, rhs) returned by a claim's function.
func pair(o py.Object, what string) (py.Object, py.Object, error) {
	t, ok := interp.Items(o)
	if !ok || len(t) != 2 {
		return nil, nil, py.ExceptionNewf(py.TypeError, "%s must return a pair (lhs, rhs), got %s", what, interp.TypeName(o))
	}
	return t[0], t[1], nil
}

// samplePair is pair for f(sample k), the name formatted only for the
// error (formatting it for every sample was 2% of a cheap sweep).
func samplePair(o py.Object, k int64) (py.Object, py.Object, error) {
	if t, ok := interp.Items(o); ok && len(t) == 2 {
		return t[0], t[1], nil
	}
	return pair(o, fmt.Sprintf("f(sample %d)", k))
}

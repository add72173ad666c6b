package exact

// Outward-rounded interval arithmetic on big.Float endpoints: the engine
// under Real.
//
// Every function here returns an interval that contains every value the
// operation takes on its argument intervals. The basis is math/big's
// documented rounding: Float.Add, Sub, Mul, Quo, SetRat, SetInt and Set
// round their exact result to the receiver's precision in the receiver's
// rounding mode, so a lower endpoint computed with ToNegativeInf is at most
// the exact value and an upper endpoint computed with ToPositiveInf at least.
// Scaling by a power of two (SetMantExp) and negation are exact. Square and
// k-th roots are not taken from Float.Sqrt: they come from integer roots
// (real_root.go: intRoot, which proves its answer by the exact check
// r^k ≤ n < (r+1)^k), so they need no accuracy assumption at all.
//
// Endpoints never overflow or underflow silently: node results are checked
// by ivCheckRange (exponents within ±ivMaxExp), which keeps every single
// operation far from big.Float's exponent limits, where results would
// become ±Inf or 0 regardless of the rounding mode.

import (
	"fmt"
	"math/big"
)

// ival is a closed interval [lo, hi] with lo ≤ hi, both finite. The Floats
// are never modified once an ival holds them, so ivals may share them.
type ival struct{ lo, hi *big.Float }

// ivMaxExp bounds the binary exponent of every nonzero endpoint of a node's
// enclosure; see ivCheckRange.
const ivMaxExp = 1 << 28

// sub sets z = x − y rounded in z's mode and returns z. Directed
// subtraction must go through it: big.Float.Sub computes 0 − y by rounding
// y in z's mode and then negating it, which rounds the wrong way under
// ToNegativeInf and ToPositiveInf (Go 1.26: 0 − 0.8660254037844386… at 48
// bits toward −∞ came out as −0.8660254037844374…, above the value);
// adding the exactly negated y rounds as asked in every case.
func sub(z, x, y *big.Float) *big.Float { return z.Add(x, new(big.Float).Neg(y)) }

func fDown(p uint) *big.Float { return new(big.Float).SetPrec(p).SetMode(big.ToNegativeInf) }
func fUp(p uint) *big.Float   { return new(big.Float).SetPrec(p).SetMode(big.ToPositiveInf) }

var (
	fOne = big.NewFloat(1)
	fTwo = big.NewFloat(2)
)

func ivPoint(f *big.Float) ival { return ival{f, f} }

func ivExact(f float64) ival { return ivPoint(big.NewFloat(f)) }

// ivFromRat encloses r at precision p.
func ivFromRat(r *big.Rat, p uint) ival {
	return ival{fDown(p).SetRat(r), fUp(p).SetRat(r)}
}

// ivRound rounds an interval outward to precision p.
func ivRound(a ival, p uint) ival {
	lo, hi := a.lo, a.hi
	if lo.Prec() > p {
		lo = fDown(p).Set(lo)
	}
	if hi.Prec() > p {
		hi = fUp(p).Set(hi)
	}
	return ival{lo, hi}
}

func (a ival) isZero() bool       { return a.lo.Sign() == 0 && a.hi.Sign() == 0 }
func (a ival) isPoint() bool      { return a.lo == a.hi || a.lo.Cmp(a.hi) == 0 }
func (a ival) positive() bool     { return a.lo.Sign() > 0 }
func (a ival) negative() bool     { return a.hi.Sign() < 0 }
func (a ival) nonneg() bool       { return a.lo.Sign() >= 0 }
func (a ival) containsZero() bool { return a.lo.Sign() <= 0 && a.hi.Sign() >= 0 }

// String formats the endpoints to 20 significant digits, for messages.
func (a ival) String() string {
	return fmt.Sprintf("[%s, %s]", a.lo.Text('g', 20), a.hi.Text('g', 20))
}

// ivCheckRange reports ErrOverflow when an endpoint is infinite or has a
// binary exponent beyond ±ivMaxExp.
func ivCheckRange(a ival) error {
	for _, f := range []*big.Float{a.lo, a.hi} {
		if f.IsInf() {
			return fmt.Errorf("real number out of range: %w", ErrOverflow)
		}
		if f.Sign() != 0 {
			if e := f.MantExp(nil); e > ivMaxExp || e < -ivMaxExp {
				return fmt.Errorf("real number of magnitude 2^%d out of range: %w", e, ErrOverflow)
			}
		}
	}
	return nil
}

func ivAdd(a, b ival, p uint) ival {
	return ival{fDown(p).Add(a.lo, b.lo), fUp(p).Add(a.hi, b.hi)}
}

func ivSub(a, b ival, p uint) ival {
	return ival{sub(fDown(p), a.lo, b.hi), sub(fUp(p), a.hi, b.lo)}
}

func ivNeg(a ival) ival {
	return ival{new(big.Float).Neg(a.hi), new(big.Float).Neg(a.lo)}
}

// ivScale multiplies by 2^k, exactly.
func ivScale(a ival, k int) ival {
	return ival{new(big.Float).SetMantExp(a.lo, k), new(big.Float).SetMantExp(a.hi, k)}
}

func mulDown(p uint, x, y *big.Float) *big.Float { return fDown(p).Mul(x, y) }
func mulUp(p uint, x, y *big.Float) *big.Float   { return fUp(p).Mul(x, y) }

func fMin(x, y *big.Float) *big.Float {
	if x.Cmp(y) <= 0 {
		return x
	}
	return y
}

func fMax(x, y *big.Float) *big.Float {
	if x.Cmp(y) >= 0 {
		return x
	}
	return y
}

// ivMul is the product by the usual sign table.
func ivMul(a, b ival, p uint) ival {
	switch {
	case a.nonneg():
		switch {
		case b.nonneg():
			return ival{mulDown(p, a.lo, b.lo), mulUp(p, a.hi, b.hi)}
		case b.hi.Sign() <= 0:
			return ival{mulDown(p, a.hi, b.lo), mulUp(p, a.lo, b.hi)}
		default:
			return ival{mulDown(p, a.hi, b.lo), mulUp(p, a.hi, b.hi)}
		}
	case a.hi.Sign() <= 0:
		switch {
		case b.nonneg():
			return ival{mulDown(p, a.lo, b.hi), mulUp(p, a.hi, b.lo)}
		case b.hi.Sign() <= 0:
			return ival{mulDown(p, a.hi, b.hi), mulUp(p, a.lo, b.lo)}
		default:
			return ival{mulDown(p, a.lo, b.hi), mulUp(p, a.lo, b.lo)}
		}
	default:
		switch {
		case b.nonneg():
			return ival{mulDown(p, a.lo, b.hi), mulUp(p, a.hi, b.hi)}
		case b.hi.Sign() <= 0:
			return ival{mulDown(p, a.hi, b.lo), mulUp(p, a.lo, b.lo)}
		default:
			return ival{
				fMin(mulDown(p, a.lo, b.hi), mulDown(p, a.hi, b.lo)),
				fMax(mulUp(p, a.lo, b.lo), mulUp(p, a.hi, b.hi)),
			}
		}
	}
}

// ivSqr is a², tighter than ivMul(a, a) when a contains 0.
func ivSqr(a ival, p uint) ival {
	switch {
	case a.nonneg():
		return ival{mulDown(p, a.lo, a.lo), mulUp(p, a.hi, a.hi)}
	case a.hi.Sign() <= 0:
		return ival{mulDown(p, a.hi, a.hi), mulUp(p, a.lo, a.lo)}
	default:
		m := fMax(new(big.Float).Neg(a.lo), a.hi)
		return ival{new(big.Float), mulUp(p, m, m)}
	}
}

func quoDown(p uint, x, y *big.Float) *big.Float { return fDown(p).Quo(x, y) }
func quoUp(p uint, x, y *big.Float) *big.Float   { return fUp(p).Quo(x, y) }

// ivQuo is a/b for b not containing 0 (the caller checks).
func ivQuo(a, b ival, p uint) ival {
	if b.positive() {
		switch {
		case a.nonneg():
			return ival{quoDown(p, a.lo, b.hi), quoUp(p, a.hi, b.lo)}
		case a.hi.Sign() <= 0:
			return ival{quoDown(p, a.lo, b.lo), quoUp(p, a.hi, b.hi)}
		default:
			return ival{quoDown(p, a.lo, b.lo), quoUp(p, a.hi, b.lo)}
		}
	}
	switch {
	case a.nonneg():
		return ival{quoDown(p, a.hi, b.hi), quoUp(p, a.lo, b.lo)}
	case a.hi.Sign() <= 0:
		return ival{quoDown(p, a.hi, b.lo), quoUp(p, a.lo, b.hi)}
	default:
		return ival{quoDown(p, a.hi, b.hi), quoUp(p, a.lo, b.hi)}
	}
}

// ivQuoInt is a/n for an integer n > 0.
func ivQuoInt(a ival, n int64, p uint) ival {
	d := new(big.Float).SetInt64(n)
	return ivQuo(a, ivPoint(d), p)
}

// ivIntersect returns a ∩ b and whether it is non-empty.
func ivIntersect(a, b ival) (ival, bool) {
	r := ival{fMax(a.lo, b.lo), fMin(a.hi, b.hi)}
	return r, r.lo.Cmp(r.hi) <= 0
}

// ivWidth is an upper bound of hi − lo.
func ivWidth(a ival) *big.Float {
	p := a.lo.Prec()
	if a.hi.Prec() > p {
		p = a.hi.Prec()
	}
	return sub(fUp(p), a.hi, a.lo)
}

// ivMagLower is a lower bound of min |x| over a (0 if a contains 0).
func ivMagLower(a ival) *big.Float {
	switch {
	case a.positive():
		return a.lo
	case a.negative():
		return new(big.Float).Neg(a.hi)
	}
	return new(big.Float)
}

// ivMid returns a point of [lo, hi] (near the middle) and a radius r with
// |x − mid| ≤ r for every x in the interval.
func ivMid(a ival, p uint) (mid, rad *big.Float) {
	if a.isPoint() {
		return a.lo, new(big.Float)
	}
	sum := new(big.Float).SetPrec(p+1).Add(a.lo, a.hi)
	mid = sum.SetMantExp(sum, -1)
	r1 := sub(fUp(p), mid, a.lo)
	r2 := sub(fUp(p), a.hi, mid)
	return mid, fMax(r1, r2)
}

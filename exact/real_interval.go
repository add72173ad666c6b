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
// (big.Int.Sqrt, documented to return ⌊√x⌋, and ivIntRoot, which checks
// its own answer), so they need no accuracy assumption at all.
//
// Endpoints never overflow or underflow silently: node results are checked
// by ivCheckRange (exponents within ±ivMaxExp), which keeps every single
// operation far from big.Float's exponent limits, where results would
// become ±Inf or 0 regardless of the rounding mode.

import (
	"fmt"
	"math"
	"math/big"
)

// ival is a closed interval [lo, hi] with lo ≤ hi, both finite. The Floats
// are never modified once an ival holds them, so ivals may share them.
type ival struct{ lo, hi *big.Float }

// ivMaxExp bounds the binary exponent of every nonzero endpoint of a node's
// enclosure; see ivCheckRange.
const ivMaxExp = 1 << 28

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
	return ival{fDown(p).Sub(a.lo, b.hi), fUp(p).Sub(a.hi, b.lo)}
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
	return fUp(p).Sub(a.hi, a.lo)
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
	r1 := fUp(p).Sub(mid, a.lo)
	r2 := fUp(p).Sub(a.hi, mid)
	return mid, fMax(r1, r2)
}

// ---- roots ----

// ceilDiv is ⌈a/b⌉ for b > 0.
func ceilDiv(a, b int) int {
	q := a / b
	if a%b != 0 && a > 0 {
		q++
	}
	return q
}

// realIntRoot returns ⌊n^(1/k)⌋ for n ≥ 0, k ≥ 2. For k = 2 it is
// big.Int.Sqrt; otherwise Newton's iteration from above, and the answer is
// checked (r^k ≤ n < (r+1)^k) and corrected, so it is exact by
// construction.
func realIntRoot(n *big.Int, k int) *big.Int {
	if n.Sign() == 0 {
		return new(big.Int)
	}
	if k == 2 {
		return new(big.Int).Sqrt(n)
	}
	// Initial guess from the top 64 bits in float64.
	L := n.BitLen()
	shift := L - 64
	if shift < 0 {
		shift = 0
	}
	top, _ := new(big.Float).SetInt(new(big.Int).Rsh(n, uint(shift))).Float64()
	lg := (math.Log2(top) + float64(shift)) / float64(k)
	e := math.Floor(lg)
	g := new(big.Float).SetFloat64(math.Exp2(lg - e))
	g.SetMantExp(g, int(e))
	x, _ := g.Int(nil)
	x.Add(x, big.NewInt(1))
	bk := big.NewInt(int64(k))
	bk1 := big.NewInt(int64(k - 1))
	ek1 := big.NewInt(int64(k - 1))
	step := func(x *big.Int) *big.Int {
		t := new(big.Int).Exp(x, ek1, nil)
		t.Quo(n, t)
		t.Add(t, new(big.Int).Mul(bk1, x))
		return t.Quo(t, bk)
	}
	// One step lands at or above ⌊n^(1/k)⌋ (AM-GM); then it decreases.
	x = step(x)
	if x.Sign() == 0 {
		x.SetInt64(1)
	}
	for {
		y := step(x)
		if y.Cmp(x) >= 0 {
			break
		}
		x = y
	}
	ek := big.NewInt(int64(k))
	one := big.NewInt(1)
	for new(big.Int).Exp(x, ek, nil).Cmp(n) > 0 {
		x.Sub(x, one)
	}
	for {
		x1 := new(big.Int).Add(x, one)
		if new(big.Int).Exp(x1, ek, nil).Cmp(n) > 0 {
			break
		}
		x = x1
	}
	return x
}

// rootBound returns a p-bit lower (upper == false) or upper bound of
// a^(1/k) for a ≥ 0, k ≥ 2, correct to about p+1 bits. It scales a by
// 2^(k·s) so that the integer part has about k·(p+2) bits, takes the exact
// integer root of its floor (or ceiling), and scales back: no floating
// point root is trusted.
func rootBound(a *big.Float, k int, p uint, upper bool) *big.Float {
	if a.Sign() == 0 {
		return new(big.Float)
	}
	e := a.MantExp(nil)
	s := ceilDiv(k*(int(p)+2)-e, k)
	t := new(big.Float).SetMantExp(a, k*s)
	n, acc := t.Int(nil) // t > 0: truncation is the floor
	var r *big.Int
	if !upper {
		r = realIntRoot(n, k)
	} else {
		if acc != big.Exact {
			n.Add(n, big.NewInt(1))
		}
		r = realIntRoot(n, k)
		if new(big.Int).Exp(r, big.NewInt(int64(k)), nil).Cmp(n) != 0 {
			r.Add(r, big.NewInt(1))
		}
	}
	var z *big.Float
	if upper {
		z = fUp(p).SetInt(r)
	} else {
		z = fDown(p).SetInt(r)
	}
	return z.SetMantExp(z, -s)
}

// ivRootNonneg is a^(1/k) for a ≥ 0.
func ivRootNonneg(a ival, k int, p uint) ival {
	lo := rootBound(a.lo, k, p, false)
	if a.isPoint() && a.lo.Sign() == 0 {
		return ival{lo, lo}
	}
	return ival{lo, rootBound(a.hi, k, p, true)}
}

func ivSqrt(a ival, p uint) ival { return ivRootNonneg(a, 2, p) }

// ---- integer powers ----

// powBound is a^k for a ≥ 0, k ≥ 1, by repeated squaring with every
// rounding in one direction (all intermediates are ≥ 0, so rounding each
// factor down gives a lower bound, up an upper bound). The guard bits cover
// the growth of the relative error, about k·2^-p.
func powBound(a *big.Float, k uint64, p uint, upper bool) *big.Float {
	w := p + uint(bitLen64(k)) + 4
	mk := fDown
	if upper {
		mk = fUp
	}
	result := mk(w).SetInt64(1)
	base := mk(w).Set(a)
	for k > 0 {
		if k&1 == 1 {
			result = mk(w).Mul(result, base)
		}
		k >>= 1
		if k > 0 {
			base = mk(w).Mul(base, base)
		}
	}
	return mk(p).Set(result)
}

func bitLen64(k uint64) int {
	n := 0
	for k > 0 {
		n++
		k >>= 1
	}
	return n
}

// ivPow is a^k for k ≥ 1. It fails with ErrOverflow when the result's
// exponent could leave the range where big.Float cannot round outward.
func ivPow(a ival, k uint64, p uint) (ival, error) {
	for _, f := range []*big.Float{a.lo, a.hi} {
		if f.Sign() != 0 {
			// log2|f|·k bounds the exponent of every partial product.
			m := new(big.Float)
			e := f.MantExp(m)
			mf, _ := m.Float64()
			l := float64(e) + math.Log2(math.Abs(mf))
			if math.Abs(l)*float64(k) > ivMaxExp-4 {
				return ival{}, fmt.Errorf("power %d of a number of magnitude 2^%d out of range: %w", k, e, ErrOverflow)
			}
		}
	}
	odd := k&1 == 1
	abs := func(f *big.Float) *big.Float { return new(big.Float).Abs(f) }
	switch {
	case a.nonneg():
		return ival{powBound(a.lo, k, p, false), powBound(a.hi, k, p, true)}, nil
	case a.hi.Sign() <= 0:
		m := ival{powBound(abs(a.hi), k, p, false), powBound(abs(a.lo), k, p, true)}
		if odd {
			return ivNeg(m), nil
		}
		return m, nil
	default:
		if odd {
			return ival{
				new(big.Float).Neg(powBound(abs(a.lo), k, p, true)),
				powBound(a.hi, k, p, true),
			}, nil
		}
		m := fMax(abs(a.lo), a.hi)
		return ival{new(big.Float), powBound(m, k, p, true)}, nil
	}
}

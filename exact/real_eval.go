package exact

// Evaluating a Real: enclosures at a working precision, and the queries
// that raise the precision until they are settled.

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strings"
)

// DefaultMaxPrecision is a reasonable precision cap, in bits, for Approx,
// Sign, RealCmp, Digits and Float64.
const DefaultMaxPrecision = 1 << 16

// minPrecision and maxPrecision clamp every working precision.
const (
	minPrecision = 24
	maxPrecision = 1 << 26
)

// undecidedAt is the error of an evaluation that precision p did not settle.
func undecidedAt(why string, p uint) error {
	return fmt.Errorf("%s at %d bits: %w", why, p, ErrUndecided)
}

func clampPrec(p uint) uint {
	if p < minPrecision {
		return minPrecision
	}
	if p > maxPrecision {
		return maxPrecision
	}
	return p
}

// eval returns an enclosure of x at working precision p (or better).
func (x *Real) eval(p uint) (ival, error) {
	if x.op == opFail {
		return ival{}, x.fail
	}
	x.mu.Lock()
	defer x.mu.Unlock()
	if x.err != nil {
		return ival{}, x.err
	}
	if x.prec >= p {
		return x.enc, nil
	}
	v, err := x.compute(p)
	if err == nil {
		err = ivCheckRange(v)
	}
	if err != nil {
		if !errors.Is(err, ErrUndecided) {
			x.err = err
		}
		return ival{}, err
	}
	if x.prec > 0 {
		in, ok := ivIntersect(x.enc, v)
		if !ok {
			return ival{}, fmt.Errorf("exact: internal error: enclosures %v and %v of one real are disjoint", x.enc, v)
		}
		v = in
	}
	x.enc, x.prec = v, p
	return v, nil
}

func (x *Real) compute(p uint) (ival, error) {
	if x.exact != nil {
		if e := x.exact.Num().BitLen() - x.exact.Denom().BitLen(); x.exact.Sign() != 0 && (e > ivMaxExp-2 || e < 2-ivMaxExp) {
			return ival{}, fmt.Errorf("rational of magnitude 2^%d: %w", e, ErrOverflow)
		}
		return ivFromRat(x.exact, p), nil
	}
	switch x.op {
	case opPi:
		return piIval(p), nil
	case opAlgRoot:
		return x.ar.refine(p), nil
	}
	a, err := x.x.eval(p)
	if err != nil {
		return ival{}, err
	}
	switch x.op {
	case opNeg:
		return ivNeg(a), nil
	case opAdd, opSub, opMul, opQuo, opAtan2:
		b, err := x.y.eval(p)
		if err != nil {
			return ival{}, err
		}
		switch x.op {
		case opAdd:
			return ivAdd(a, b, p), nil
		case opSub:
			return ivSub(a, b, p), nil
		case opMul:
			return ivMul(a, b, p), nil
		case opAtan2:
			return ivAtan2(a, b, p)
		}
		switch {
		case b.isZero() || b.containsZero() && x.y.provedZero(b):
			return ival{}, fmt.Errorf("real division by a certified zero: %w", ErrDivisionByZero)
		case b.containsZero():
			return ival{}, undecidedAt("division: divisor not separated from 0", p)
		}
		return ivQuo(a, b, p), nil
	case opPow:
		k := x.k
		if k < 0 {
			k = -k
		}
		v, err := ivPow(a, uint64(k), p+8)
		if err != nil {
			return ival{}, err
		}
		if x.k > 0 {
			return ivRound(v, p), nil
		}
		switch {
		case v.isZero() || a.containsZero() && x.x.provedZero(a):
			return ival{}, fmt.Errorf("negative power of a certified zero: %w", ErrDivisionByZero)
		case v.containsZero():
			return ival{}, undecidedAt("negative power: base not separated from 0", p)
		}
		return ivQuo(ivExact(1), v, p), nil
	case opRoot:
		switch {
		case a.nonneg():
			return ivRootNonneg(a, x.k, p), nil
		case x.k%2 == 1 && a.negative():
			return ivNeg(ivRootNonneg(ivNeg(a), x.k, p)), nil
		case x.k%2 == 1:
			neg := rootBound(new(big.Float).Neg(a.lo), x.k, p, true)
			return ival{neg.Neg(neg), rootBound(a.hi, x.k, p, true)}, nil
		case a.negative():
			return ival{}, fmt.Errorf("root of degree %d of a negative number: %w", x.k, ErrDomain)
		case x.x.provedZero(a):
			// An algebraic argument proved zero by its zero bound.
			return ivExact(0), nil
		}
		return ival{}, undecidedAt(fmt.Sprintf("root of degree %d: argument not separated from 0", x.k), p)
	case opExp:
		if r := x.x.exact; r != nil && expRatSmall(r) {
			return expRatIval(r, p), nil
		}
		return ivExp(a, p)
	case opLog:
		if r := x.x.exact; r != nil && r.Sign() > 0 && ratSeriesOK(r, math.Inf(1)) {
			return logRatIval(r, p), nil
		}
		switch {
		case a.hi.Sign() <= 0:
			return ival{}, fmt.Errorf("log of a non-positive number: %w", ErrDomain)
		case a.lo.Sign() <= 0:
			return ival{}, undecidedAt("log: argument not separated from 0", p)
		}
		return ivLog(a, p), nil
	case opSin, opCos:
		if r := x.x.exact; r != nil && r.Sign() != 0 && ratSeriesOK(r, 8) {
			return sinCosRatIval(r, p, x.op == opCos), nil
		}
		s, c, err := ivSinCos(a, p)
		if x.op == opSin {
			return s, err
		}
		return c, err
	case opAtan:
		if r := x.x.exact; r != nil && r.Sign() != 0 && atanRatOK(r) {
			return atanRatIval(r, p), nil
		}
		return ivRound(ivAtan(a, p+8), p), nil
	case opAcos:
		m1 := big.NewFloat(-1)
		switch {
		case a.lo.Cmp(fOne) > 0 || a.hi.Cmp(m1) < 0:
			return ival{}, fmt.Errorf("acos of a number outside [-1, 1]: %w", ErrDomain)
		case a.lo.Cmp(m1) < 0 || a.hi.Cmp(fOne) > 0:
			return ival{}, undecidedAt("acos: argument not separated from ±1", p)
		}
		return ivAcos(a, p), nil
	}
	return ival{}, fmt.Errorf("exact: internal error: unknown real operation %d", x.op)
}

// Enclose returns an interval containing x, computed at working precision
// prec bits (clamped to [24, 2^26]): for well-conditioned expressions its
// width is about 2^-prec relative to |x|, and it shrinks to 0 as prec grows.
// An x known to be rational gives the point interval. Errors: ErrDomain,
// ErrDivisionByZero and ErrOverflow are certain; ErrUndecided means prec did
// not suffice to separate an argument from a domain boundary or a divisor
// from 0.
func (x *Real) Enclose(prec uint) (Interval, error) {
	if x.exact != nil {
		return Interval{new(big.Rat).Set(x.exact), new(big.Rat).Set(x.exact)}, nil
	}
	v, err := x.eval(clampPrec(prec))
	if err != nil {
		return Interval{}, err
	}
	return ivToInterval(v), nil
}

// EncloseCoarse is Enclose with the endpoints rounded outward to 64 bits:
// a looser enclosure at the same cost of evaluation, whose rational
// endpoints are cheap to make and to compute with — enough where only a
// magnitude is wanted.
func (x *Real) EncloseCoarse(prec uint) (Interval, error) {
	if x.exact != nil {
		return x.Enclose(0)
	}
	v, err := x.eval(clampPrec(prec))
	if err != nil {
		return Interval{}, err
	}
	return ivToInterval(ival{fDown(64).Set(v.lo), fUp(64).Set(v.hi)}), nil
}

// refine evaluates x at precisions start, 2·start, … up to maxPrec (at
// least once, at min(start, maxPrec)) until done accepts an enclosure.
// Precision shortfalls (ErrUndecided) move on to the next precision; other
// errors end the search. At the cap it returns ErrUndecided naming what.
func (x *Real) refine(start, maxPrec uint, what string, done func(ival, uint) bool) error {
	return x.refineJump(start, maxPrec, what, done, nil)
}

// refineJump is refine with a say in the next precision: when next is not
// nil and returns more than twice the precision just tried, refinement
// goes there directly (capped at maxPrec) instead of doubling.
func (x *Real) refineJump(start, maxPrec uint, what string, done func(ival, uint) bool, next func(ival, uint) uint) error {
	maxPrec = clampPrec(maxPrec)
	p := clampPrec(start)
	if p > maxPrec {
		p = maxPrec
	}
	var last error
	for {
		v, err := x.eval(p)
		jump := uint(0)
		switch {
		case err == nil:
			if done(v, p) {
				return nil
			}
			last = nil
			if next != nil {
				jump = next(v, p)
			}
		case errors.Is(err, ErrUndecided):
			last = err
		default:
			return err
		}
		if p >= maxPrec {
			msg := fmt.Sprintf("%s not settled within the precision cap of %d bits", what, maxPrec)
			if last != nil {
				msg += " (" + strings.TrimSuffix(last.Error(), ": "+ErrUndecided.Error()) + ")"
			}
			return capError{msg}
		}
		p = max(2*p, jump)
		if p > maxPrec {
			p = maxPrec
		}
	}
}

// Approx returns an enclosure of width at most 2^-bits·max(1, |x|): bits
// bits after the point for |x| < 1, bits significant bits otherwise. It
// raises the working precision from bits+32 by doubling; reaching maxPrec
// first gives ErrUndecided (wrapped, naming the cap).
func (x *Real) Approx(bits, maxPrec uint) (Interval, error) {
	if x.exact != nil {
		return x.Enclose(0)
	}
	var got ival
	err := x.refine(bits+32, maxPrec, fmt.Sprintf("approximation to %d bits", bits), func(v ival, p uint) bool {
		mag := ivMagLower(v)
		if mag.Cmp(fOne) < 0 {
			mag = fOne
		}
		target := new(big.Float).SetMantExp(mag, -int(bits))
		if ivWidth(v).Cmp(target) <= 0 {
			got = v
			return true
		}
		return false
	})
	if err != nil {
		return Interval{}, err
	}
	return ivToInterval(got), nil
}

// Sign returns −1, 0 or +1 for x < 0, x = 0, x > 0, refining (from 64
// bits, doubling) until an enclosure excludes 0. It returns 0 only when x
// is proved zero: a rational zero, an enclosure [0, 0], or an algebraic x
// (no transcendental function or π in it) whose enclosure lies below its
// zero bound (ZeroBound), as sqrt(2)·sqrt(3) − sqrt(6) does. A zero that
// is not algebraic (sin π) gives ErrUndecided at the cap, as does a zero
// whose bound asks for more than maxPrec bits, or a nonzero x too small
// for maxPrec bits.
func (x *Real) Sign(maxPrec uint) (int, error) {
	return x.sign(64, maxPrec)
}

// sign is Sign refining from start bits.
func (x *Real) sign(start, maxPrec uint) (int, error) {
	if x.exact != nil {
		return x.exact.Sign(), nil
	}
	bound, alg := x.ZeroBound()
	sign := 0
	// An algebraic value whose enclosure straddles 0 is refined straight to
	// the precision at which the enclosure should fit within its zero
	// bound: the width scales as 2^-p, so from width 2^e at precision p,
	// p + e + B + 8 bits should do. Doubling instead would overshoot the
	// bound by up to a factor two in precision, and the cost grows faster
	// than the precision (Kahan's tetrahedron volume against Cayley–Menger,
	// B ≈ 700,000: 2.6–4.5 s doubling, about 1 s jumping).
	var next func(ival, uint) uint
	if alg && bound < algCap {
		next = func(v ival, p uint) uint {
			w := ivWidth(v)
			if w.Sign() == 0 {
				return 0
			}
			want := int64(p) + int64(w.MantExp(nil)) + bound + 8
			if want <= 0 || want > int64(^uint32(0)) {
				return 0
			}
			return uint(want)
		}
	}
	err := x.refineJump(start, maxPrec, "sign", func(v ival, p uint) bool {
		switch {
		case v.positive():
			sign = 1
		case v.negative():
			sign = -1
		case v.isZero():
			sign = 0
		case alg && belowBound(v, bound):
			sign = 0
		default:
			return false
		}
		return true
	}, next)
	if alg && errors.Is(err, ErrUndecided) {
		if note := zeroBoundNote(bound, clampPrec(maxPrec)); note != "" {
			err = capError{err.Error() + note}
		}
	}
	return sign, err
}

// SignFrom is Sign with the refinement starting at start bits, for a
// caller that knows the precision a first look needs.
func (x *Real) SignFrom(start, maxPrec uint) (int, error) { return x.sign(start, maxPrec) }

// RealCmp compares x and y: −1 if x < y, 0 if x = y (known exactly: both
// rational, the very same *Real, or an algebraic difference proved zero
// by its zero bound, as Sign does), +1 if x > y; ErrUndecided when the
// difference is not settled within maxPrec bits.
func RealCmp(x, y *Real, maxPrec uint) (int, error) {
	if x == y && x.exact == nil {
		// The same node: equal as soon as it is certified to be defined,
		// which any successful enclosure proves (domains are checked
		// strictly).
		if _, err := x.eval(64); err == nil {
			return 0, nil
		} else if !errors.Is(err, ErrUndecided) {
			return 0, err
		}
	}
	if x.exact != nil && y.exact != nil {
		return x.exact.Cmp(y.exact), nil
	}
	return RealSub(x, y).Sign(maxPrec)
}

// Float64 returns the float64 nearest to x (ties to even), certified: it
// refines until both ends of the enclosure round to the same float64. A
// value on a rounding boundary that is not known exactly gives ErrUndecided
// at the cap; |x| beyond the float64 range gives ErrNotFinite.
func (x *Real) Float64(maxPrec uint) (float64, error) {
	if x.exact != nil {
		f, _ := x.exact.Float64()
		if math.IsInf(f, 0) {
			return f, fmt.Errorf("real %s as float64: %w", FormatRat(x.exact), ErrNotFinite)
		}
		return f, nil
	}
	var f float64
	err := x.refine(64, maxPrec, "float64 rounding", func(v ival, p uint) bool {
		f1, _ := v.lo.Float64()
		f2, _ := v.hi.Float64()
		if f1 != f2 {
			return false
		}
		f = f1
		if f == 0 && math.Signbit(f1) != math.Signbit(f2) {
			f = 0
		}
		return true
	})
	if err != nil {
		return 0, err
	}
	if math.IsInf(f, 0) {
		return f, fmt.Errorf("real as float64: %w", ErrNotFinite)
	}
	return f, nil
}

// String returns a short form: the exact rational when x is known to be
// rational, else 20 certified significant digits followed by "…" (or a
// note of why they could not be had within 4096 bits).
func (x *Real) String() string {
	if x.exact != nil {
		return FormatRat(x.exact)
	}
	s, err := x.Digits(20, 4096)
	if err != nil {
		return "<real: " + err.Error() + ">"
	}
	return s + "…"
}

func ivToInterval(v ival) Interval {
	lo, _ := v.lo.Rat(nil)
	hi, _ := v.hi.Rat(nil)
	return Interval{lo, hi}
}

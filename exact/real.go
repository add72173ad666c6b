package exact

// Certified real numbers: lazily evaluated expression DAGs over the
// rationals, enclosed in outward-rounded intervals at a requested working
// precision and refined on demand.
//
// # How bounds are kept
//
// Enclose(p) evaluates the DAG bottom-up at working precision p: each node
// takes its operands' enclosures and computes an interval containing every
// value of the operation on them, rounding every lower endpoint toward −∞
// and every upper endpoint toward +∞ (real_interval.go). Roots come from
// exact integer roots; π and exp of a rational from binary-split series
// with exact tail bounds (real_const.go); sin, cos, atan, acos and atan2
// from Taylor series in interval arithmetic with alternating-series tail
// bounds (real_func.go). Only log, and exp of anything but a rational of
// modest size, rest on a library's accuracy (github.com/ALTree/bigfloat):
// its results at 64 guard bits are trusted to 32 of them, and tests check
// that against exact-rational series.
//
// Each node caches the narrowest enclosure it has found (intersecting the
// new one with the old) together with the precision it was computed at, so
// a DAG with shared subexpressions is evaluated once per precision, and
// refinement by doubling costs about twice the last step. Certified
// failures (ErrDomain, ErrDivisionByZero, ErrOverflow) are cached too;
// failures for lack of precision (ErrUndecided) are not.
//
// Domains are checked strictly: the square root of an argument whose
// enclosure straddles 0, or a division by one, is undecided at that
// precision rather than guessed, so an enclosure is never returned for an
// expression that might be undefined.
//
// Values that are known to be rational are carried exactly (Rat): rational
// leaves and operations on them, square and k-th roots of perfect powers,
// and the trivial values exp(0), log(1), sin(0), cos(0), acos(1), atan(0),
// atan2(0, x > 0).

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"sync"
)

// DefaultMaxPrecision is a reasonable precision cap, in bits, for Approx,
// Sign, RealCmp, Digits and Float64.
const DefaultMaxPrecision = 1 << 16

// minPrecision and maxPrecision clamp every working precision.
const (
	minPrecision = 24
	maxPrecision = 1 << 26
)

type realOp uint8

const (
	opRat realOp = iota // exact rational leaf (or exactly known value)
	opAdd
	opSub
	opMul
	opQuo
	opNeg
	opPow
	opRoot
	opExp
	opLog
	opSin
	opCos
	opAtan
	opAtan2
	opAcos
	opPi
	opFail // certified failure known at construction
)

// Real is a certified real number: an immutable expression over rationals
// whose value can be enclosed in intervals of any width. Build Reals with
// RealFromRat, Pi and the Real* operations; a Real is safe for concurrent
// use.
type Real struct {
	op    realOp
	x, y  *Real
	k     int
	exact *big.Rat // the exact value, when known to be rational
	fail  error    // for opFail

	mu   sync.Mutex
	enc  ival  // best enclosure so far
	prec uint  // precision enc was computed at; 0: none yet
	err  error // certified evaluation failure
}

// Interval is a closed interval with exact rational endpoints, Lo ≤ Hi.
type Interval struct{ Lo, Hi *big.Rat }

// Contains reports whether r lies in the interval.
func (iv Interval) Contains(r *big.Rat) bool {
	return iv.Lo.Cmp(r) <= 0 && r.Cmp(iv.Hi) <= 0
}

// Width returns Hi − Lo.
func (iv Interval) Width() *big.Rat { return new(big.Rat).Sub(iv.Hi, iv.Lo) }

// String formats the interval as "[lo, hi]" with exact rational endpoints.
func (iv Interval) String() string {
	return "[" + FormatRat(iv.Lo) + ", " + FormatRat(iv.Hi) + "]"
}

// RealFromRat returns the exact real r (copied; nil is 0).
func RealFromRat(r *big.Rat) *Real {
	v := new(big.Rat)
	if r != nil {
		v.Set(r)
	}
	return &Real{op: opRat, exact: v}
}

// RealFromInt returns the exact real n.
func RealFromInt(n int64) *Real { return &Real{op: opRat, exact: new(big.Rat).SetInt64(n)} }

func realFail(err error) *Real { return &Real{op: opFail, fail: err} }

// Rat returns the exact value when x is known to be rational: a rational
// leaf, an arithmetic combination of those, a root of a perfect power, or
// a trivial value such as exp(0). A Real may be rational without Rat
// knowing it (sqrt(2)·sqrt(2)); then Rat returns nil, false.
func (x *Real) Rat() (*big.Rat, bool) {
	if x.exact == nil {
		return nil, false
	}
	return new(big.Rat).Set(x.exact), true
}

// RealAdd returns x + y.
func RealAdd(x, y *Real) *Real {
	if x.exact != nil && y.exact != nil {
		return &Real{op: opRat, exact: new(big.Rat).Add(x.exact, y.exact)}
	}
	return &Real{op: opAdd, x: x, y: y}
}

// RealSub returns x − y.
func RealSub(x, y *Real) *Real {
	if x.exact != nil && y.exact != nil {
		return &Real{op: opRat, exact: new(big.Rat).Sub(x.exact, y.exact)}
	}
	return &Real{op: opSub, x: x, y: y}
}

// RealMul returns x·y.
func RealMul(x, y *Real) *Real {
	if x.exact != nil && y.exact != nil {
		return &Real{op: opRat, exact: new(big.Rat).Mul(x.exact, y.exact)}
	}
	return &Real{op: opMul, x: x, y: y}
}

// RealQuo returns x/y. A divisor that is exactly zero (known rational 0, or
// an enclosure [0, 0]) makes evaluation fail with ErrDivisionByZero; one
// whose enclosures keep straddling 0 fails with ErrUndecided at the cap.
func RealQuo(x, y *Real) *Real {
	if y.exact != nil && y.exact.Sign() == 0 {
		return realFail(fmt.Errorf("real division by exact zero: %w", ErrDivisionByZero))
	}
	if x.exact != nil && y.exact != nil {
		return &Real{op: opRat, exact: new(big.Rat).Quo(x.exact, y.exact)}
	}
	return &Real{op: opQuo, x: x, y: y}
}

// RealNeg returns −x.
func RealNeg(x *Real) *Real {
	if x.exact != nil {
		return &Real{op: opRat, exact: new(big.Rat).Neg(x.exact)}
	}
	return &Real{op: opNeg, x: x}
}

// maxExactPowBits bounds the size of exact rational powers computed
// eagerly; larger ones are evaluated by intervals.
const maxExactPowBits = 1 << 20

// RealPowInt returns x^k; k may be negative (then x must not be zero:
// ErrDivisionByZero when it is exactly, ErrUndecided when it is not
// separated from 0). x^0 is 1 for every x.
func RealPowInt(x *Real, k int) *Real {
	switch k {
	case 0:
		return RealFromInt(1)
	case 1:
		return x
	case math.MinInt:
		return realFail(fmt.Errorf("power %d: %w", k, ErrOverflow))
	}
	if x.exact != nil {
		if x.exact.Sign() == 0 {
			if k < 0 {
				return realFail(fmt.Errorf("0^%d: %w", k, ErrDivisionByZero))
			}
			return RealFromInt(0)
		}
		ak := k
		if ak < 0 {
			ak = -ak
		}
		size := float64(x.exact.Num().BitLen()+x.exact.Denom().BitLen()) * float64(ak)
		if size <= maxExactPowBits {
			e := big.NewInt(int64(ak))
			n := new(big.Int).Exp(x.exact.Num(), e, nil)
			d := new(big.Int).Exp(x.exact.Denom(), e, nil)
			if k < 0 {
				n, d = d, n
			}
			return &Real{op: opRat, exact: new(big.Rat).SetFrac(n, d)}
		}
	}
	return &Real{op: opPow, x: x, k: k}
}

// RealSqrt returns √x. The square root of a rational square is that
// rational, exactly (Rat reports it). A certified negative x makes
// evaluation fail with ErrDomain; an x whose enclosures straddle 0 (such as
// an exact zero that is not known to be rational) with ErrUndecided.
func RealSqrt(x *Real) *Real { return RealRoot(x, 2) }

// RealRoot returns the real k-th root of x, k ≥ 2: odd roots of negative
// numbers are negative; even roots of certified negatives fail with
// ErrDomain. The root of a rational that is a perfect k-th power is exact.
// k < 2 gives ErrDomain at evaluation (except k = 1, which returns x).
func RealRoot(x *Real, k int) *Real {
	if k == 1 {
		return x
	}
	if k < 1 {
		return realFail(fmt.Errorf("root of degree %d: %w", k, ErrDomain))
	}
	if x.exact != nil {
		r := x.exact
		if r.Sign() < 0 && k%2 == 0 {
			return realFail(fmt.Errorf("root of degree %d of %s: %w", k, FormatRat(r), ErrDomain))
		}
		if v, ok := ratRoot(r, k); ok {
			return &Real{op: opRat, exact: v}
		}
	}
	return &Real{op: opRoot, x: x, k: k}
}

// ratRoot returns r^(1/k) when it is rational.
func ratRoot(r *big.Rat, k int) (*big.Rat, bool) {
	if r.Sign() == 0 {
		return new(big.Rat), true
	}
	n := new(big.Int).Abs(r.Num())
	d := r.Denom()
	if (n.BitLen()+d.BitLen())/k > maxExactPowBits {
		return nil, false
	}
	ek := big.NewInt(int64(k))
	rn := realIntRoot(n, k)
	if new(big.Int).Exp(rn, ek, nil).Cmp(n) != 0 {
		return nil, false
	}
	rd := realIntRoot(d, k)
	if new(big.Int).Exp(rd, ek, nil).Cmp(d) != 0 {
		return nil, false
	}
	if r.Sign() < 0 {
		rn.Neg(rn)
	}
	return new(big.Rat).SetFrac(rn, rd), true
}

// RealExp returns e^x (exp(0) = 1 exactly). Arguments of magnitude 2^27
// or more fail with ErrOverflow.
func RealExp(x *Real) *Real {
	if x.exact != nil && x.exact.Sign() == 0 {
		return RealFromInt(1)
	}
	return &Real{op: opExp, x: x}
}

// RealLog returns the natural logarithm of x (log(1) = 0 exactly). A
// certified non-positive x fails with ErrDomain.
func RealLog(x *Real) *Real {
	if x.exact != nil {
		if x.exact.Sign() <= 0 {
			return realFail(fmt.Errorf("log of %s: %w", FormatRat(x.exact), ErrDomain))
		}
		if x.exact.Cmp(big.NewRat(1, 1)) == 0 {
			return RealFromInt(0)
		}
	}
	return &Real{op: opLog, x: x}
}

// RealSin returns sin x (sin(0) = 0 exactly).
func RealSin(x *Real) *Real {
	if x.exact != nil && x.exact.Sign() == 0 {
		return RealFromInt(0)
	}
	return &Real{op: opSin, x: x}
}

// RealCos returns cos x (cos(0) = 1 exactly).
func RealCos(x *Real) *Real {
	if x.exact != nil && x.exact.Sign() == 0 {
		return RealFromInt(1)
	}
	return &Real{op: opCos, x: x}
}

// RealAtan returns atan x in (−π/2, π/2) (atan(0) = 0 exactly).
func RealAtan(x *Real) *Real {
	if x.exact != nil && x.exact.Sign() == 0 {
		return RealFromInt(0)
	}
	return &Real{op: opAtan, x: x}
}

// RealAtan2 returns the angle of the point (x, y) in (−π, π]: atan2(0, x)
// is π for x < 0. (0, 0) fails with ErrDomain when both are certified zero;
// arguments not separated from the negative x-axis or the origin fail with
// ErrUndecided.
func RealAtan2(y, x *Real) *Real {
	if y.exact != nil && x.exact != nil && y.exact.Sign() == 0 {
		switch x.exact.Sign() {
		case 0:
			return realFail(fmt.Errorf("atan2(0, 0): %w", ErrDomain))
		case 1:
			return RealFromInt(0)
		}
	}
	return &Real{op: opAtan2, x: y, y: x}
}

// RealAcos returns acos x in [0, π] (acos(1) = 0 exactly). x certified
// outside [−1, 1] fails with ErrDomain; x whose enclosures straddle ±1
// without being certified inside fails with ErrUndecided.
func RealAcos(x *Real) *Real {
	if x.exact != nil {
		if x.exact.Cmp(big.NewRat(1, 1)) > 0 || x.exact.Cmp(big.NewRat(-1, 1)) < 0 {
			return realFail(fmt.Errorf("acos of %s: %w", FormatRat(x.exact), ErrDomain))
		}
		if x.exact.Cmp(big.NewRat(1, 1)) == 0 {
			return RealFromInt(0)
		}
	}
	return &Real{op: opAcos, x: x}
}

var piNode = &Real{op: opPi}

// Pi returns π. It is computed by the Chudnovsky series with binary
// splitting and an explicit tail bound, and cached for the process.
func Pi() *Real { return piNode }

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
		case b.isZero():
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
		case v.isZero():
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
		}
		return ival{}, undecidedAt(fmt.Sprintf("root of degree %d: argument not separated from 0", x.k), p)
	case opExp:
		if r := x.x.exact; r != nil && expRatSmall(r) {
			return expRatIval(r, p), nil
		}
		return ivExp(a, p)
	case opLog:
		switch {
		case a.hi.Sign() <= 0:
			return ival{}, fmt.Errorf("log of a non-positive number: %w", ErrDomain)
		case a.lo.Sign() <= 0:
			return ival{}, undecidedAt("log: argument not separated from 0", p)
		}
		return ivLog(a, p), nil
	case opSin, opCos:
		s, c, err := ivSinCos(a, p)
		if x.op == opSin {
			return s, err
		}
		return c, err
	case opAtan:
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

// refine evaluates x at precisions start, 2·start, … up to maxPrec (at
// least once, at min(start, maxPrec)) until done accepts an enclosure.
// Precision shortfalls (ErrUndecided) move on to the next precision; other
// errors end the search. At the cap it returns ErrUndecided naming what.
func (x *Real) refine(start, maxPrec uint, what string, done func(ival, uint) bool) error {
	maxPrec = clampPrec(maxPrec)
	p := clampPrec(start)
	if p > maxPrec {
		p = maxPrec
	}
	var last error
	for {
		v, err := x.eval(p)
		switch {
		case err == nil:
			if done(v, p) {
				return nil
			}
			last = nil
		case errors.Is(err, ErrUndecided):
			last = err
		default:
			return err
		}
		if p >= maxPrec {
			if last != nil {
				return fmt.Errorf("%s: not settled within the cap of %d bits (%v): %w", what, maxPrec, last, ErrUndecided)
			}
			return fmt.Errorf("%s: not settled within the cap of %d bits: %w", what, maxPrec, ErrUndecided)
		}
		p *= 2
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
// is known exactly to be zero (a rational zero, or an enclosure [0, 0]);
// an x that is zero but not known to be (sqrt(2)−sqrt(2)) gives
// ErrUndecided at the cap, as does a nonzero x too small for maxPrec bits.
func (x *Real) Sign(maxPrec uint) (int, error) {
	if x.exact != nil {
		return x.exact.Sign(), nil
	}
	sign := 0
	err := x.refine(64, maxPrec, "sign", func(v ival, p uint) bool {
		switch {
		case v.positive():
			sign = 1
		case v.negative():
			sign = -1
		case v.isZero():
			sign = 0
		default:
			return false
		}
		return true
	})
	return sign, err
}

// RealCmp compares x and y: −1 if x < y, 0 if x = y (known exactly: both
// rational, or the very same *Real), +1 if x > y; ErrUndecided when the
// difference is not separated from 0 within maxPrec bits.
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

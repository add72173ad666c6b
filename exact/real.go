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
// exact integer roots (real_root.go); π, ln 2, and exp, log, sin, cos and
// atan of short rationals from binary-split series with exact tail bounds,
// as midpoint–radius balls (real_const.go, real_ball.go); sin, cos, atan,
// acos and atan2 otherwise from Taylor series in interval arithmetic with
// alternating-series tail bounds (real_trig.go); exp and log in general
// from series in exact fixed-point integer arithmetic with proved bounds:
// ln 2 by binary splitting, exp by reduction modulo ln 2, halving and
// squaring, log by a Newton guess that an atanh series then verifies
// (real_explog.go). No bound rests on an outside library's accuracy:
// math/big's integer arithmetic is exact and its Float rounding is
// documented. The float64 functions used (math.Log2, math.Log10, math.Sqrt,
// math.Lgamma, math.Log1p, math.Exp2) only pick term counts, precisions
// and starting guesses that exact code then checks or corrects, or estimate
// magnitudes for the range checks; none of them bounds an error.
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
	"fmt"
	"math"
	"math/big"
	"sync"
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
	opFail    // certified failure known at construction
	opAlgRoot // the root of an integer polynomial in an isolating interval (real_isolate.go)
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
	ar    *algRoot // for opAlgRoot

	algOnce sync.Once // guards alg
	alg     algInfo   // zero-bound bookkeeping (real_algebraic.go)

	mu   sync.Mutex
	enc  ival  // best enclosure so far
	prec uint  // precision enc was computed at; 0: none yet
	err  error // certified evaluation failure
}

// Interval is a closed interval with exact rational endpoints.
type Interval struct {
	Lo, Hi *big.Rat // Lo ≤ Hi
}

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
func RealAdd(x, y *Real) *Real { return realArith(opAdd, x, y, (*big.Rat).Add) }

// RealSub returns x − y.
func RealSub(x, y *Real) *Real { return realArith(opSub, x, y, (*big.Rat).Sub) }

// RealMul returns x·y.
func RealMul(x, y *Real) *Real { return realArith(opMul, x, y, (*big.Rat).Mul) }

// realArith returns the node x op y, or its exact value f(z, x, y) when
// both operands are rational.
func realArith(op realOp, x, y *Real, f func(z, a, b *big.Rat) *big.Rat) *Real {
	if x.exact != nil && y.exact != nil {
		return &Real{op: opRat, exact: f(new(big.Rat), x.exact, y.exact)}
	}
	return &Real{op: op, x: x, y: y}
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
	rn, ok := intRoot(n, k)
	if !ok {
		return nil, false
	}
	rd, ok := intRoot(d, k)
	if !ok {
		return nil, false
	}
	if r.Sign() < 0 {
		rn.Neg(rn)
	}
	return new(big.Rat).SetFrac(rn, rd), true
}

// RealExp returns e^x (exp(0) = 1 exactly). Arguments of magnitude 2^27
// or more fail with ErrOverflow.
func RealExp(x *Real) *Real { return realFunc(opExp, x, 1) }

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
func RealSin(x *Real) *Real { return realFunc(opSin, x, 0) }

// RealCos returns cos x (cos(0) = 1 exactly).
func RealCos(x *Real) *Real { return realFunc(opCos, x, 1) }

// RealAtan returns atan x in (−π/2, π/2) (atan(0) = 0 exactly).
func RealAtan(x *Real) *Real { return realFunc(opAtan, x, 0) }

// realFunc returns the node op(x) of a function defined everywhere, or its
// integer value at0 when x is exactly 0.
func realFunc(op realOp, x *Real, at0 int64) *Real {
	if x.exact != nil && x.exact.Sign() == 0 {
		return RealFromInt(at0)
	}
	return &Real{op: op, x: x}
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

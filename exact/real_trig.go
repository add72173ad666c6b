package exact

// sin, cos, atan, acos and atan2 on intervals: series in outward-rounded
// interval arithmetic with explicit remainder bounds, which need no
// accuracy assumption.

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"
)

// maxTrigExp bounds the binary exponent of a sine or cosine argument: the
// reduction modulo π/2 needs π to that many extra bits.
const maxTrigExp = 1 << 20

// sinCosPoint encloses sin x and cos x at precision q.
//
// Method: r = x − k·π/2 with k = round(x/(π/2)), in interval arithmetic with
// π from piIval at q + e + 32 bits (e the exponent of x), so |r| ≲ π/4;
// a = r/2^m; v = 1 − cos a by its Taylor series
// a²/2! − a⁴/4! + …, whose terms decrease for |a| ≤ 1 so the tail is at
// most the first omitted term; then m doublings v ← 2v(2 − v)
// (1 − cos 2a = 2 sin²a = 2v(2 − v)), which is increasing for v ≤ 1 and
// does not amplify relative error; finally cos r = 1 − v,
// |sin r| = √(v(2 − v)) with the sign of r, and the quadrant k mod 4.
func sinCosPoint(x *big.Float, q uint) (s, c ival, err error) {
	if x.Sign() == 0 {
		return ivExact(0), ivExact(1), nil
	}
	e := x.MantExp(nil)
	if e > maxTrigExp {
		return ival{}, ival{}, fmt.Errorf("sin/cos of a number of magnitude 2^%d: %w", e, ErrOverflow)
	}
	r := ivPoint(x)
	quad := 0
	if e > 0 {
		w := q + uint(e) + 32
		hp := halfPiIval(w)
		kf := new(big.Float).SetPrec(uint(e)+16).Quo(x, hp.lo)
		k := roundToInt(kf)
		kF := new(big.Float).SetInt(k)
		prod := ivMul(hp, ivPoint(kF), w)
		r = ival{sub(fDown(w), x, prod.hi), sub(fUp(w), x, prod.lo)}
		quad = int(new(big.Int).And(k, big.NewInt(3)).Int64())
	}
	// Halve r to a = r/2^m with |a| ≤ 2^-mt.
	mt := int(math.Sqrt(float64(q)) / 2)
	er := fMax(new(big.Float).Abs(r.lo), new(big.Float).Abs(r.hi)).MantExp(nil)
	m := mt + er
	if m < 0 {
		m = 0
	}
	w := q + 24 + uint(bits.Len64(uint64(m)))
	a := ivScale(r, -m)
	a2 := ivSqr(a, w)
	t := ivScale(a2, -1) // a²/2
	v := alternatingSum(t, w, func(j int64) ival {
		t = ivQuoInt(ivMul(t, a2, w), (2*j+1)*(2*j+2), w)
		return t
	})
	if v.lo.Sign() < 0 {
		v.lo = new(big.Float)
	}
	f := func(x *big.Float, mk func(uint) *big.Float) *big.Float { // 2x(2−x)
		d := mk(w).Sub(fTwo, x)
		d = mk(w).Mul(d, x)
		return d.SetMantExp(d, 1)
	}
	for i := 0; i < m; i++ {
		if v.hi.Cmp(fOne) > 0 { // cannot happen for |r| ≤ π/2; stay valid anyway
			v = ival{new(big.Float), big.NewFloat(2)}
			continue
		}
		v = ival{f(v.lo, fDown), f(v.hi, fUp)}
	}
	if v.hi.Cmp(big.NewFloat(2)) > 0 {
		v.hi = big.NewFloat(2)
	}
	cr := ival{sub(fDown(w), fOne, v.hi), sub(fUp(w), fOne, v.lo)}
	// sin²r = v(2 − v), increasing for v ≤ 1; at most 1.
	g := func(x *big.Float, mk func(uint) *big.Float) *big.Float {
		d := mk(w).Sub(fTwo, x)
		return mk(w).Mul(d, x)
	}
	s2 := ival{g(v.lo, fDown), fOne}
	if v.hi.Cmp(fOne) < 0 {
		s2.hi = g(v.hi, fUp)
	}
	if v.hi.Cmp(fOne) > 0 { // v(2 − v) is not monotone past 1
		s2.lo = new(big.Float)
	}
	sa := ivSqrt(s2, w)
	if sa.hi.Cmp(fOne) > 0 {
		sa.hi = fOne
	}
	var sr ival
	switch {
	case r.nonneg():
		sr = sa
	case r.hi.Sign() <= 0:
		sr = ivNeg(sa)
	default:
		sr = ival{new(big.Float).Neg(sa.hi), sa.hi}
	}
	switch quad {
	case 0:
		s, c = sr, cr
	case 1:
		s, c = cr, ivNeg(sr)
	case 2:
		s, c = ivNeg(sr), ivNeg(cr)
	case 3:
		s, c = ivNeg(cr), sr
	}
	return ivRound(s, q), ivRound(c, q), nil
}

// alternatingSum encloses t_0 − t_1 + t_2 − … at precision w for terms
// t_j ≥ 0 that decrease, with t_0 = first and t_j = next(j). It stops at
// the first term at most 2^-(w+4) times the first and widens the sum by
// that term, which bounds the tail of such a series.
func alternatingSum(first ival, w uint, next func(j int64) ival) ival {
	s := ivRound(first, w)
	thresh := new(big.Float).SetMantExp(first.hi, -int(w+4))
	for j := int64(1); ; j++ {
		t := next(j)
		if t.hi.Cmp(thresh) <= 0 {
			return ival{sub(fDown(w), s.lo, t.hi), fUp(w).Add(s.hi, t.hi)}
		}
		if j&1 == 1 {
			s = ivSub(s, t, w)
		} else {
			s = ivAdd(s, t, w)
		}
	}
}

// roundToInt rounds f to a nearest integer.
func roundToInt(f *big.Float) *big.Int {
	g := new(big.Float).SetPrec(f.Prec() + 2)
	if f.Sign() >= 0 {
		g.Add(f, big.NewFloat(0.5))
	} else {
		g.Sub(f, big.NewFloat(0.5))
	}
	k, _ := g.Int(nil) // truncation toward zero
	return k
}

// ivSinCos encloses sin and cos on an interval: both are 1-Lipschitz, so
// the values on [mid − rad, mid + rad] lie within rad of those at mid; the
// results are also clipped to [-1, 1].
func ivSinCos(a ival, p uint) (s, c ival, err error) {
	q := p + 16
	mid, rad := ivMid(a, q)
	s, c, err = sinCosPoint(mid, q)
	if err != nil {
		return
	}
	widen := func(v ival) ival {
		if rad.Sign() != 0 {
			v = ival{sub(fDown(p), v.lo, rad), fUp(p).Add(v.hi, rad)}
		}
		if v.lo.Cmp(big.NewFloat(-1)) < 0 {
			v.lo = big.NewFloat(-1)
		}
		if v.hi.Cmp(fOne) > 0 {
			v.hi = fOne
		}
		return ivRound(v, p)
	}
	return widen(s), widen(c), nil
}

// atanSmall encloses atan on u ⊂ [0, 1] at precision q.
//
// Method: m halvings u ← u/(1 + √(1 + u²)) (atan u = 2·atan of the result;
// the map has relative condition ≤ 1), then the series
// atan u = u − u³/3 + u⁵/5 − …, alternating with decreasing terms for
// 0 ≤ u ≤ 1, so the tail is at most the first omitted term; all in
// outward-rounded interval arithmetic; finally multiply by 2^m.
func atanSmall(u ival, q uint) ival {
	if u.hi.Sign() == 0 {
		return ivExact(0)
	}
	m := int(math.Sqrt(float64(q)) / 3)
	if e := u.hi.MantExp(nil); e < 0 {
		m += e // already small
	}
	if m < 0 {
		m = 0
	}
	w := q + 16 + uint(bits.Len64(uint64(m)))
	one := ivExact(1)
	for i := 0; i < m; i++ {
		d := ivAdd(one, ivSqr(u, w), w)
		d = ivAdd(one, ivSqrt(d, w), w)
		u = ivQuo(u, d, w)
	}
	u2 := ivSqr(u, w)
	pw := u
	sum := alternatingSum(u, w, func(j int64) ival {
		pw = ivMul(pw, u2, w)
		return ivQuoInt(pw, 2*j+1, w)
	})
	if sum.lo.Sign() < 0 {
		sum.lo = new(big.Float) // atan ≥ 0 on u ≥ 0
	}
	return ivRound(ivScale(sum, m), q)
}

// atanNonneg encloses atan on u ⊂ [0, ∞) at precision q, using
// atan u = π/2 − atan(1/u) for u ≥ 1.
func atanNonneg(u ival, q uint) ival {
	switch {
	case u.hi.Cmp(fOne) <= 0:
		return atanSmall(u, q)
	case u.lo.Cmp(fOne) >= 0:
		w := q + 8
		inv := ival{quoDown(w, fOne, u.hi), quoUp(w, fOne, u.lo)}
		return ivRound(ivSub(halfPiIval(w), atanSmall(inv, w), w), q)
	}
	lo := atanNonneg(ivPoint(u.lo), q)
	hi := atanNonneg(ivPoint(u.hi), q)
	return ival{lo.lo, hi.hi}
}

// ivAtan encloses atan on an interval at precision q (atan is odd and
// increasing).
func ivAtan(u ival, q uint) ival {
	switch {
	case u.nonneg():
		return atanNonneg(u, q)
	case u.hi.Sign() <= 0:
		return ivNeg(atanNonneg(ivNeg(u), q))
	}
	lo := atanNonneg(ivPoint(new(big.Float).Neg(u.lo)), q)
	hi := atanNonneg(ivPoint(u.hi), q)
	return ival{new(big.Float).Neg(lo.hi), hi.hi}
}

// acosPoint encloses acos t at precision q for -1 ≤ t ≤ 1, as
// 2·atan(√((1 − t)/(1 + t))).
func acosPoint(t *big.Float, q uint) ival {
	switch {
	case t.Cmp(fOne) == 0:
		return ivExact(0)
	case t.Cmp(big.NewFloat(-1)) == 0:
		return piIval(q)
	case t.Sign() == 0:
		return halfPiIval(q)
	}
	w := q + 16
	num := ival{sub(fDown(w), fOne, t), sub(fUp(w), fOne, t)}
	den := ival{fDown(w).Add(fOne, t), fUp(w).Add(fOne, t)}
	r := ivSqrt(ivQuo(num, den, w), w)
	return ivRound(ivScale(atanNonneg(r, w), 1), q)
}

// ivAcos encloses acos on a ⊂ [-1, 1] (acos is decreasing). Away from -1
// it evaluates 2·atan(√((1 − a)/(1 + a))) on the whole interval at once:
// the quotient of [1 − hi, 1 − lo] by [1 + lo, 1 + hi] is exactly the
// monotone image [(1−hi)/(1+hi), (1−lo)/(1+lo)], so nothing is lost to
// dependency.
func ivAcos(a ival, p uint) ival {
	q := p + 8
	if !a.isPoint() && a.lo.Cmp(big.NewFloat(-1)) > 0 {
		w := q + 16
		num := ival{sub(fDown(w), fOne, a.hi), sub(fUp(w), fOne, a.lo)}
		den := ival{fDown(w).Add(fOne, a.lo), fUp(w).Add(fOne, a.hi)}
		r := ivSqrt(ivQuo(num, den, w), w)
		return ivRound(ivScale(atanNonneg(r, w), 1), p)
	}
	lo := acosPoint(a.hi, q)
	hi := lo
	if !a.isPoint() {
		hi = acosPoint(a.lo, q)
	}
	return ivRound(ival{lo.lo, hi.hi}, p)
}

// ivAtan2 encloses atan2(y, x) at precision p. It needs one of: x > 0,
// y > 0, y < 0 (certified), or y exactly 0 with x < 0 (π). Both exactly 0
// is ErrDomain; anything else is undecided at this precision (the value
// may sit on the branch cut).
func ivAtan2(y, x ival, p uint) (ival, error) {
	w := p + 16
	useX := x.positive()
	if useX && (y.positive() || y.negative()) {
		// Both ways work: divide by the larger magnitude.
		useX = ivMagLower(x).Cmp(ivMagLower(y)) >= 0
	}
	switch {
	case useX:
		return ivRound(ivAtan(ivQuo(y, x, w), w), p), nil
	case y.positive():
		return ivRound(ivSub(halfPiIval(w), ivAtan(ivQuo(x, y, w), w), w), p), nil
	case y.negative():
		return ivRound(ivSub(ivNeg(halfPiIval(w)), ivAtan(ivQuo(x, y, w), w), w), p), nil
	case y.isZero() && x.negative():
		return piIval(p), nil
	case y.isZero() && x.isZero():
		return ival{}, fmt.Errorf("atan2(0, 0): %w", ErrDomain)
	}
	return ival{}, undecidedAt("atan2: arguments not clear of the branch cut or the origin", p)
}

package exact

// exp and log on intervals, from series whose error bounds are proved in
// the comments below; no outside numeric routine is relied on for accuracy.
//
// The kernels work in fixed point: an integer V stands for V/2^w. Integer
// arithmetic is exact and every shift or division below says which way it
// rounds, so each bound is a statement about integers.
//
//   - ln 2 by Zuniga's series, summed exactly by binary splitting with a
//     tail bound (ln2Fixed, real_const.go).
//   - exp x = 2^k·exp r with k = round(x/ln 2), |r| ≤ ln2/2 + ε, and
//     exp r = exp(r/2^s)^(2^s), exp(r/2^s) by its Taylor series with a
//     bound on the truncations and the tail (expFixed). The factor 2^k is
//     applied last, exactly (big.Float.SetMantExp), so nothing underflows
//     or overflows on the way however small or large exp x is.
//   - log x = e·ln 2 + log m with m = x/2^e in [1/√2, √2), and
//     log m = y + log(m·e^-y) = y + 2·atanh((c−1)/(c+1)), c = m·e^-y, for
//     any y: y is a Newton guess, the atanh series has a tail bound, and
//     the guess changes only how many terms are summed, never the bound
//     (logNear1).

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"
)

// fixedIval returns [lo·2^e, hi·2^e] rounded outward to precision p.
func fixedIval(lo, hi *big.Int, e int, p uint) ival {
	a, b := fDown(p).SetInt(lo), fUp(p).SetInt(hi)
	return ival{a.SetMantExp(a, e), b.SetMantExp(b, e)}
}

// fixedFloor returns ⌊f·2^w⌋ and fixedCeil ⌈f·2^w⌉ for a finite f.
func fixedFloor(f *big.Float, w uint) *big.Int {
	i, acc := new(big.Float).SetMantExp(f, int(w)).Int(nil) // scaling is exact
	if acc == big.Above {                                   // truncated a negative value upward
		i.Sub(i, big.NewInt(1))
	}
	return i
}

func fixedCeil(f *big.Float, w uint) *big.Int {
	i, acc := new(big.Float).SetMantExp(f, int(w)).Int(nil)
	if acc == big.Below {
		i.Add(i, big.NewInt(1))
	}
	return i
}

// expHalvings is s₀, the number of halvings of a reduced argument of
// magnitude about 1/2 before the Taylor series, at precision q. About
// √q/2 balances the ~q/s₀ series terms against the s₀ squarings; the
// choice affects speed only (math.Sqrt picks a count, not a bound).
func expHalvings(q uint) int { return int(math.Sqrt(float64(q))/2) + 2 }

// expFixed returns lo, hi with lo ≤ exp(R/2^w)·2^w ≤ hi, for |R| < 2^(w−1)
// and w ≥ 24, halving the argument s = max(0, s₀ + e) times where
// |R/2^w| < 2^e.
//
// Proof of the bound. Let a = R/2^(w+s); |a| < 2^(e−s) ≤ 2^-s₀ when s > 0,
// and |a| = |R/2^w| < 1/2 when s = 0, so |a| < 1/2 either way. Let
// T_n = 2^w·|a|^n/n!. The loop computes t_0 = 2^w and
// t_n = ⌊t_(n−1)·|R|/(n·2^(w+s))⌋ (a shift and a division, both floors of
// non-negative numbers, which compose to one floor). Then e_n = T_n − t_n
// satisfies e_0 = 0 and 0 ≤ e_n < e_(n−1)·|a|/n + 1, so e_n < 2 for every n
// by induction. The loop stops at the first N with t_N = 0, so T_N < 2,
// and the omitted tail Σ_{n≥N} T_n is at most 2·T_N < 4 since successive
// terms shrink by |a|/(n+1) ≤ 1/2. With S = Σ_{n<N} ±t_n (the signs of
// a^n), |exp(a)·2^w − S| < 2N + 4 = D, and exp(a)·2^w ≥ S when a ≥ 0 (all
// errors then have one sign). Finally s squarings lo ← ⌊lo²/2^w⌋,
// hi ← ⌈hi²/2^w⌉ keep lo ≤ exp(2^i·a)·2^w ≤ hi, since lo > 0 (S − D >
// 2^w·e^-½ − 4w − 8 > 0 for w ≥ 24; N ≤ w as t_n ≤ 2^w/n!) and squaring is
// increasing on positive numbers.
//
// The relative width is about 2^s·(2D + 2)·2^-w, so the caller adds
// s₀ + log₂(4w) bits of guard.
func expFixed(r *big.Int, w uint, s0 int) (lo, hi *big.Int) {
	ar := new(big.Int).Abs(r)
	s := s0 + ar.BitLen() - int(w)
	if s < 0 {
		s = 0
	}
	t := new(big.Int).Lsh(big.NewInt(1), w)
	sum := new(big.Int).Set(t)
	neg := r.Sign() < 0
	n := int64(1)
	for ; ; n++ {
		t.Mul(t, ar)
		t.Rsh(t, w+uint(s))
		t.Quo(t, big.NewInt(n))
		if t.Sign() == 0 {
			break
		}
		if neg && n&1 == 1 {
			sum.Sub(sum, t)
		} else {
			sum.Add(sum, t)
		}
	}
	d := big.NewInt(2*n + 4)
	lo, hi = new(big.Int).Set(sum), new(big.Int).Add(sum, d)
	if neg {
		lo.Sub(lo, d)
	}
	round := new(big.Int).Lsh(big.NewInt(1), w)
	round.Sub(round, big.NewInt(1)) // 2^w − 1: adding it before the shift rounds up
	for i := 0; i < s; i++ {
		lo.Mul(lo, lo)
		lo.Rsh(lo, w)
		hi.Mul(hi, hi)
		hi.Add(hi, round)
		hi.Rsh(hi, w)
	}
	return lo, hi
}

// maxExpArgExp bounds the binary exponent of an argument of exp: |x| < 2^27
// keeps exp x within ±2^(2^28), the range of enclosures (ivMaxExp).
const maxExpArgExp = 27

// expRange encloses exp on [lo, hi] at precision q (exp is increasing).
//
// Method: with ln2·2^w ∈ [L, L + 2] (ln2Fixed), X = ⌊lo·2^w⌋ and
// k = round(X/L) (exact integer division, so |X − k·L| ≤ L/2),
// r = x − k·ln 2 satisfies R₁ ≤ r·2^w ≤ R₂ for every x in [lo, hi], where
// R₁ = X − k·L − 2·max(k, 0) and R₂ = ⌈hi·2^w⌉ − k·L − 2·min(k, 0);
// |R₁| ≤ L/2 + 2|k| < 2^(w−1). exp x = 2^k·exp r ≤ 2^k·exp(R₁/2^w)·e^δ with
// δ = (R₂ − R₁)/2^w, and e^δ ≤ 1 + δ + δ² for 0 ≤ δ ≤ 1
// (e^δ − 1 − δ = δ²·Σ_{n≥2} δ^(n−2)/n! ≤ δ²·(e − 2)). So with
// [A, B] = expFixed(R₁), exp on [lo, hi] lies in
// 2^(k−w)·[A, B + ⌈B·δ·(1 + δ)⌉]. An interval with δ > 1/16 is split into
// its endpoints instead, to stay tight.
func expRange(lo, hi *big.Float, q uint) (ival, error) {
	ex := 0
	for _, f := range []*big.Float{lo, hi} {
		if e := f.MantExp(nil); e > maxExpArgExp {
			return ival{}, fmt.Errorf("exp of a number of magnitude 2^%d: %w", e, ErrOverflow)
		} else if e > ex {
			ex = e
		}
	}
	s0 := expHalvings(q)
	// Guard bits: the halvings, log₂ of the series' error count, |k|'s
	// share of ln 2's error (|k| < 2^(ex+1)), and a margin.
	w := q + uint(s0+ex+bits.Len(q)) + 16
	l := ln2Fixed(w)
	x1 := fixedFloor(lo, w)
	k := new(big.Int).Lsh(x1, 1)
	k.Add(k, l)
	k.Div(k, new(big.Int).Lsh(l, 1)) // ⌊(2X + L)/(2L)⌋: Euclidean, L > 0
	kl := new(big.Int).Mul(k, l)
	r1 := new(big.Int).Sub(x1, kl)
	r2 := new(big.Int).Sub(fixedCeil(hi, w), kl)
	twoK := new(big.Int).Lsh(k, 1)
	if k.Sign() > 0 {
		r1.Sub(r1, twoK)
	} else {
		r2.Sub(r2, twoK)
	}
	d := new(big.Int).Sub(r2, r1)
	if d.BitLen() > int(w)-4 && lo.Cmp(hi) != 0 { // δ > 1/16
		a, err := expRange(lo, lo, q)
		if err != nil {
			return ival{}, err
		}
		b, err := expRange(hi, hi, q)
		return ival{a.lo, b.hi}, err
	}
	a, b := expFixed(r1, w, s0)
	// b·δ·(1 + δ)·2^w = b·d·(2^w + d)/2^w, rounded up.
	one := new(big.Int).Lsh(big.NewInt(1), w)
	wid := new(big.Int).Add(one, d)
	wid.Mul(wid, d)
	wid.Mul(wid, b)
	den := new(big.Int).Lsh(one, w)
	wid.Add(wid, den)
	wid.Sub(wid, big.NewInt(1))
	wid.Quo(wid, den)
	b.Add(b, wid)
	return fixedIval(a, b, int(k.Int64())-int(w), q), nil
}

// logInvSqrt2 is a threshold just below 1/√2 ≈ 0.70711: mantissas are
// moved into [logInvSqrt2, 2·logInvSqrt2).
var logInvSqrt2 = big.NewFloat(0.7071)

// logMaxGuess bounds |y|, the Newton guess for log m with m in
// [0.7071, 1.4142): then c = m·e^-y lies in [0.70·e^-0.35, 1.42·e^0.35] ⊂
// [0.49, 2.01] and |(c−1)/(c+1)| ≤ 0.34 < 1/2, where atanhSeries applies,
// whatever the guess.
var logMaxGuess = big.NewFloat(0.35)

// logPoint encloses log x at precision q for x > 0: x = m·2^e with m in
// [0.7071, 1.4142), log x = e·ln 2 + log m (logNear1).
func logPoint(x *big.Float, q uint) ival {
	m := new(big.Float)
	e := x.MantExp(m) // exact: m in [1/2, 1)
	if m.Cmp(logInvSqrt2) < 0 {
		m.SetMantExp(m, 1)
		e--
	}
	d := new(big.Float).SetPrec(m.Prec()+2).Sub(m, fOne) // exact at that precision
	if d.Sign() == 0 && e == 0 {
		return ivExact(0)
	}
	// log m is about d; when e = 0 it is the whole answer, so it is needed
	// to q bits relative: that many more bits absolute.
	wa := q + 8
	if e == 0 && d.MantExp(nil) < 0 {
		wa += uint(-d.MantExp(nil))
	}
	lm := ivExact(0)
	if d.Sign() != 0 {
		lm = logNear1(m, d, wa)
	}
	if e == 0 {
		return ivRound(lm, q)
	}
	w := wa + uint(bits.Len(uint(abs(e))))
	le := ivMul(ln2Ival(w), ivPoint(new(big.Float).SetInt64(int64(e))), w)
	return ivRound(ivAdd(le, lm, w), q)
}

// logNear1 encloses log m for m in [0.7071, 1.4142) with d = m − 1, to
// about 2^-wa absolute.
//
// Each step at precision w encloses log m = y + 2·atanh(u), u = (c−1)/(c+1),
// c = m/exp(y), with exp(y) from expRange and atanh from its series: an
// enclosure for any y with |y| ≤ logMaxGuess. Its midpoint is the next y.
// The first y is log1p(d) in float64 (or d when d is below float64's
// range): only a starting guess. A guess good to b bits leaves |u| ≈ 2^-b,
// so the series needs about w/(2b) terms; the precisions rise by factors of
// about 3 so each step needs only two or three.
func logNear1(m, d *big.Float, wa uint) ival {
	var y *big.Float
	if df, _ := d.Float64(); df != 0 && !math.IsInf(df, 0) {
		y = big.NewFloat(math.Log1p(df))
	} else {
		y = new(big.Float).Set(d)
	}
	steps := []uint{wa}
	for p := wa; p > 150; {
		p = p/3 + 16
		steps = append(steps, p)
	}
	var enc ival
	for i := len(steps) - 1; i >= 0; i-- {
		w := steps[i]
		if y.Cmp(logMaxGuess) > 0 {
			y = logMaxGuess
		} else if new(big.Float).Neg(y).Cmp(logMaxGuess) > 0 {
			y = new(big.Float).Neg(logMaxGuess)
		}
		enc = logStep(m, y, w)
		y, _ = ivMid(enc, w+16)
	}
	return enc
}

// logStep encloses log m = y + 2·atanh((c−1)/(c+1)), c = m/exp(y), at
// precision w, for |y| ≤ logMaxGuess.
func logStep(m, y *big.Float, w uint) ival {
	one := ivExact(1)
	e, err := expRange(y, y, w+8)
	if err != nil { // |y| ≤ 0.35 is far inside exp's range
		panic("exact: internal error: " + err.Error())
	}
	c := ivQuo(ivPoint(m), e, w+8)
	u := ivQuo(ivSub(c, one, w+8), ivAdd(c, one, w+8), w+8)
	a := atanhSeries(u, w+8)
	return ivAdd(ivPoint(y), ivScale(a, 1), w+4)
}

// atanhSeries encloses atanh on u ⊂ [−1/2, 1/2] at precision w:
// atanh u = Σ_{j≥0} u^(2j+1)/(2j+1), in outward-rounded interval
// arithmetic. It stops at the first term t_J with |t_J| ≤ 2^-(w+4) and
// widens the sum by 2·|t_J|, which bounds the tail:
// |Σ_{j≥J} u^(2j+1)/(2j+1)| ≤ |t_J|·Σ_{i≥0} u^(2i) = |t_J|/(1 − u²) ≤
// (4/3)·|t_J|.
func atanhSeries(u ival, w uint) ival {
	half := big.NewFloat(0.5)
	if u.hi.Cmp(half) > 0 || new(big.Float).Neg(u.lo).Cmp(half) > 0 {
		// logMaxGuess rules this out; the series would not apply.
		panic(fmt.Sprintf("exact: internal error: atanh series at %v", u))
	}
	thresh := new(big.Float).SetMantExp(fOne, -int(w+4))
	u2 := ivSqr(u, w)
	pw, sum := u, u
	for j := int64(1); ; j++ {
		pw = ivMul(pw, u2, w)
		t := ivQuoInt(pw, 2*j+1, w)
		mag := fMax(new(big.Float).Abs(t.lo), new(big.Float).Abs(t.hi))
		if mag.Cmp(thresh) <= 0 {
			tail := fUp(w).SetMantExp(mag, 1)
			return ival{sub(fDown(w), sum.lo, tail), fUp(w).Add(sum.hi, tail)}
		}
		sum = ivAdd(sum, t, w)
	}
}

// ivExp is exp on an interval: exp is increasing.
func ivExp(a ival, p uint) (ival, error) {
	v, err := expRange(a.lo, a.hi, p+8)
	if err != nil {
		return ival{}, err
	}
	return ivRound(v, p), nil
}

// ivLog is log on an interval with a.lo > 0: log is increasing, and
// log(hi) − log(lo) = log(1 + δ) ≤ δ for δ = (hi − lo)/lo, so a narrow
// interval needs one evaluation.
func ivLog(a ival, p uint) ival {
	q := p + 8
	lo := logPoint(a.lo, q)
	hi := lo
	if !a.isPoint() {
		delta := quoUp(q, sub(fUp(q), a.hi, a.lo), a.lo)
		if delta.MantExp(nil) <= -8 {
			hi = ival{lo.lo, fUp(q).Add(lo.hi, delta)}
		} else {
			hi = logPoint(a.hi, q)
		}
	}
	return ivRound(ival{lo.lo, hi.hi}, p)
}

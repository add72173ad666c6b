package exact

// Checks of exp and log (real_explog.go) against routes that share none of
// its code: the Taylor and atanh series summed in exact rationals with
// their remainder bounds (rtExpRef, rtLogRef in real_ref_test.go), Go's
// math.Exp and math.Log in float64, the general-purpose library
// github.com/ALTree/bigfloat where it is sound, and classical identities
// (exp(a)·exp(−a) = 1, exp(a+b) = exp(a)·exp(b), log(exp a) = a,
// exp(k·log 2) = 2^k), over arguments from −10^6 to 10^6 and every float64
// edge: the subnormal range around −745, the overflow threshold near
// 709.78, multiples of log 2, tiny and huge arguments.

import (
	"fmt"
	"math"
	"math/big"
	"math/rand"
	"strings"
	"testing"

	"github.com/ALTree/bigfloat"
)

// rtPow2 returns 2^-w as a rational.
func rtPow2(w uint) *big.Rat {
	return new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), w))
}

// rtCheckEnc checks an enclosure v of a value that the reference interval
// [lo, hi] also encloses: both hold the value, so they must meet; and v
// must be at most 2^-(q−4) wide relative to the value.
func rtCheckEnc(t *testing.T, name string, v ival, lo, hi *big.Rat, q uint) {
	t.Helper()
	iv := ivToInterval(v)
	if iv.Hi.Cmp(lo) < 0 || iv.Lo.Cmp(hi) > 0 {
		t.Errorf("%s at %d bits: enclosure %v misses the reference [%s, %s]", name, q, v, lo.FloatString(30), hi.FloatString(30))
		return
	}
	mag := new(big.Rat).Abs(lo)
	if a := new(big.Rat).Abs(hi); a.Cmp(mag) > 0 {
		mag = a
	}
	if w := iv.Width(); w.Cmp(new(big.Rat).Mul(mag, rtPow2(q-4))) > 0 {
		t.Errorf("%s at %d bits: width %s too large for %s", name, q, w.FloatString(20), v)
	}
}

// rtDyadic returns z as a Float, failing when it is not exact.
func rtDyadic(t *testing.T, z *big.Rat) *big.Float {
	t.Helper()
	f := new(big.Float).SetPrec(4096).SetRat(z)
	if f.Acc() != big.Exact {
		t.Fatalf("%s is not dyadic", z)
	}
	return f
}

// Arguments of exp: the float64 subnormal range (−745.13… is where
// math.Exp underflows to 0, −708.39… where it leaves the normal range),
// the overflow threshold (709.78…), −1490 (twice the underflow point), and
// tiny, moderate and large ones.
var rtExpArgs = []string{
	"-5961/8", "-745", "-2981/4", "-744", "-1489", "-1490", "-726", "-709", "-708", "-2833/4",
	"2839/4", "709", "710", "1/1152921504606846976", "-1/1152921504606846976",
	"1", "-1", "1/2", "3/1024", "-7/4", "10", "-37/2", "100", "-700", "1/1099511627776",
	"-3000", "2000", "123456789/1048576",
}

// TestExpAgainstExactSeries compares expRange at 53 to 2048 bits with the
// Taylor series of exp summed in exact rationals with its remainder bound.
func TestExpAgainstExactSeries(t *testing.T) {
	for _, s := range rtExpArgs {
		z := q(s)
		lo, hi := rtExpRef(z, 2048+64)
		zf := rtDyadic(t, z)
		for _, p := range []uint{53, 256, 1024, 2048} {
			v, err := expRange(zf, zf, p)
			if err != nil {
				t.Fatal(err)
			}
			rtCheckEnc(t, "exp("+s+")", v, lo, hi, p)
		}
	}
}

// TestLogAgainstExactSeries compares logPoint with log z = j·log 2 +
// 2·atanh((m−1)/(m+1)), summed in exact rationals with its remainder bound,
// on dyadic arguments: near 1, powers of 2, the float64 extremes
// (2^-1074 and the largest double) and 2^-1000000.
func TestLogAgainstExactSeries(t *testing.T) {
	args := []string{"2", "3", "1/2", "3/4", "10", "1000001/1048576", "1048575/1048576",
		"1267650600228229401496703205376", "3/1267650600228229401496703205376",
		"1099511627777/1099511627776", "314159/131072", "7/8",
		"1152921504606846977/1152921504606846976", "1152921504606846975/1152921504606846976",
		"1/" + new(big.Int).Lsh(big.NewInt(1), 1074).String(),
		new(big.Int).Lsh(big.NewInt(1<<53-1), 971).String(),
	}
	for _, s := range args {
		z := q(s)
		lo, hi := rtLogRef(z, 2048+160)
		zf := rtDyadic(t, z)
		for _, p := range []uint{53, 256, 1024, 2048} {
			rtCheckEnc(t, "log("+s+")", logPoint(zf, p), lo, hi, p)
		}
	}
	// log 2^-1000000 = −1000000·log 2, with log 2 = 2·atanh(1/3) summed
	// exactly.
	l2lo, l2hi := rtAtanhSum(big.NewRat(1, 3), 400)
	n := big.NewRat(-2000000, 1)
	x := new(big.Float).SetMantExp(big.NewFloat(1), -1000000)
	rtCheckEnc(t, "log(2^-1000000)", logPoint(x, 256), new(big.Rat).Mul(n, l2hi), new(big.Rat).Mul(n, l2lo), 256)
}

// rtRelClose reports whether the float64 f is within rel of both ends of v.
func rtRelClose(v ival, f, rel float64) bool {
	for _, e := range []*big.Float{v.lo, v.hi} {
		g, _ := e.Float64()
		if math.Abs(g-f) > rel*math.Abs(f) {
			return false
		}
	}
	return true
}

// TestExpAgainstMathExp compares expRange with Go's math.Exp (IEEE 754
// double; its source documents an error below 1 ulp) to 1e-15 relative,
// over the whole range where math.Exp's result is a normal double.
func TestExpAgainstMathExp(t *testing.T) {
	rng := rand.New(rand.NewSource(14))
	const lo, hi = -708.3964185322641, 709.782712893384 // log of the smallest normal and the largest double
	xs := []float64{lo, hi, -708, 709, 0.5, -0.5, 1e-300, -1e-300, 0x1p-60, -0x1p-60, math.Ln2, 1022 * math.Ln2, -1022 * math.Ln2}
	for i := 0; i < 2000; i++ {
		xs = append(xs, lo+(hi-lo)*rng.Float64())
	}
	for i := 0; i < 200; i++ { // small magnitudes, log-uniform
		xs = append(xs, math.Ldexp(rng.Float64()-0.5, -rng.Intn(200)))
	}
	for _, x := range xs {
		xf := big.NewFloat(x)
		v, err := expRange(xf, xf, 64)
		if err != nil {
			t.Fatal(err)
		}
		if f := math.Exp(x); !rtRelClose(v, f, 1e-15) {
			t.Errorf("exp(%v): enclosure %v, math.Exp %v", x, v, f)
		}
	}
}

// TestLogAgainstMathLog compares logPoint with Go's math.Log (IEEE 754
// double; error below 1 ulp by its source) to 1e-15 relative, on positive
// normal doubles of every exponent. Not on subnormals: there math.Log on
// amd64 is wrong (it gave −709.09 for log(5e-324) = −744.44 here), and
// TestLogAgainstExactSeries covers 2^-1074 instead.
func TestLogAgainstMathLog(t *testing.T) {
	rng := rand.New(rand.NewSource(15))
	xs := []float64{math.MaxFloat64, 0x1p-1022, 1 + 0x1p-52, 1 - 0x1p-53, 2, 0.5, 3}
	for i := 0; i < 2000; i++ {
		xs = append(xs, math.Float64frombits(rng.Uint64()>>1)) // sign bit clear
	}
	for _, x := range xs {
		if x < 0x1p-1022 || math.IsInf(x, 0) || math.IsNaN(x) {
			continue
		}
		if f := math.Log(x); !rtRelClose(logPoint(big.NewFloat(x), 64), f, 1e-15) {
			t.Errorf("log(%v): enclosure %v, math.Log %v", x, logPoint(big.NewFloat(x), 64), f)
		}
	}
}

// TestExpLogAgainstBigfloat compares with github.com/ALTree/bigfloat at
// 64 more bits, for exp above −700 (below, its float64 starting guess is
// subnormal and it is not reliable: issue 14) and for log everywhere, to
// 2^-(p−8) relative.
func TestExpLogAgainstBigfloat(t *testing.T) {
	rng := rand.New(rand.NewSource(16))
	for i := 0; i < 120; i++ {
		p := []uint{64, 256, 1024, 2048}[i%4]
		x := new(big.Float).SetPrec(p).SetFloat64(-700 + 10700*rng.Float64())
		if i%3 == 0 {
			x.SetMantExp(x, -rng.Intn(80)) // small arguments too
		}
		v, err := expRange(x, x, p)
		if err != nil {
			t.Fatal(err)
		}
		y := bigfloat.Exp(new(big.Float).SetPrec(p + 64).Set(x))
		tol := new(big.Float).SetMantExp(y, -int(p-8))
		yr, _ := y.Rat(nil)
		tr, _ := tol.Rat(nil)
		rtCheckEnc(t, "exp("+x.Text('g', 20)+") vs bigfloat", v, new(big.Rat).Sub(yr, tr), new(big.Rat).Add(yr, tr), p)

		z := new(big.Float).SetPrec(p).SetMantExp(big.NewFloat(rng.Float64()+0.25), rng.Intn(4000)-2000)
		l := bigfloat.Log(new(big.Float).SetPrec(p + 64).Set(z))
		tol = new(big.Float).SetMantExp(l, -int(p-8))
		tol.Abs(tol)
		lr, _ := l.Rat(nil)
		tr, _ = tol.Rat(nil)
		rtCheckEnc(t, "log("+z.Text('g', 20)+") vs bigfloat", logPoint(z, p), new(big.Rat).Sub(lr, tr), new(big.Rat).Add(lr, tr), p)
	}
}

// rtOffset returns the irrational real r + √2/1000: it takes exp's general
// route, as the arguments of the issue did.
func rtOffset(r *big.Rat) *Real {
	return RealAdd(RealFromRat(r), RealQuo(RealSqrt(RealFromInt(2)), RealFromInt(1000)))
}

// rtZeroAt checks that x encloses 0 at p bits with width at most
// 2^-(p−24)·scale.
func rtZeroAt(t *testing.T, name string, x *Real, p uint, scale *big.Rat) {
	t.Helper()
	iv, err := x.Enclose(p)
	if err != nil {
		t.Errorf("%s: %v", name, err)
		return
	}
	if !iv.Contains(new(big.Rat)) {
		t.Errorf("%s: enclosure %v does not contain 0", name, iv)
	}
	if iv.Width().Cmp(new(big.Rat).Mul(scale, rtPow2(p-24))) > 0 {
		t.Errorf("%s: enclosure %v too wide", name, iv)
	}
}

// TestExpLogIdentitiesWideRange checks exp(a)·exp(−a) = 1,
// exp(a+b) = exp(a)·exp(b) and log(exp a) = a for arguments from −10^6 to
// 10^6 and at the float64 edges, and exp(k·log 2) = 2^k (and
// exp((k+½)·log 2) = 2^k·√2, halfway between two reductions) around the
// subnormal range, 2^±1024 and 2^±10^6.
func TestExpLogIdentitiesWideRange(t *testing.T) {
	rng := rand.New(rand.NewSource(17))
	args := []*big.Rat{}
	for _, s := range []string{"-745.1", "-745.13321910194122", "-744.44", "-708.3964185322641",
		"709.782712893384", "-726", "-1490", "1000000", "-1000000", "1/1152921504606846976", "-1/1152921504606846976"} {
		args = append(args, q(s))
	}
	for i := 0; i < 60; i++ { // log-uniform magnitudes up to 10^6, both signs
		a := new(big.Rat).SetFloat64(math.Pow(10, 6*rng.Float64()) * float64(1-2*rng.Intn(2)))
		args = append(args, a)
	}
	for i := 0; i < 80; i++ { // the issue's 80 random identities: a in [−1500, 700]
		args = append(args, new(big.Rat).SetFrac64(rng.Int63n(2200000)-1500000, 1000))
	}
	const p = 128
	one := RealFromInt(1)
	for i, r := range args {
		a := rtOffset(r)
		name := fmt.Sprintf("a = %s + √2/1000", r.FloatString(6))
		rtZeroAt(t, "exp(a)·exp(−a) − 1, "+name, RealSub(RealMul(RealExp(a), RealExp(RealNeg(a))), one), p, big.NewRat(1, 1))
		b := rtOffset(args[(i+1)%len(args)])
		if r2, _ := new(big.Rat).Add(r, args[(i+1)%len(args)]).Float64(); math.Abs(r2) < 1e6 {
			rtZeroAt(t, "exp(a+b)/(exp(a)·exp(b)) − 1, "+name, RealSub(RealQuo(RealExp(RealAdd(a, b)), RealMul(RealExp(a), RealExp(b))), one), p, big.NewRat(1, 1))
		}
		mag := new(big.Rat).Abs(r)
		if mag.Cmp(big.NewRat(1, 1)) < 0 {
			mag.SetInt64(1)
		}
		rtZeroAt(t, "log(exp a) − a, "+name, RealSub(RealLog(RealExp(a)), a), p, mag)
	}
	log2 := RealLog(RealFromInt(2))
	for _, k := range []int{-1000000, -1075, -1074, -1073, -1022, -1, 1, 1023, 1024, 1000000} {
		pk := RealPowInt(RealFromInt(2), k)
		rtZeroAt(t, fmt.Sprintf("exp(%d·log 2)/2^%d − 1", k, k), RealSub(RealQuo(RealExp(RealMul(RealFromInt(int64(k)), log2)), pk), one), p, big.NewRat(1, 1))
		half := RealMul(RealAdd(RealFromInt(int64(k)), RealFromRat(big.NewRat(1, 2))), log2)
		rtZeroAt(t, fmt.Sprintf("exp((%d+½)·log 2)/(2^%d·√2) − 1", k, k), RealSub(RealQuo(RealExp(half), RealMul(pk, RealSqrt(RealFromInt(2)))), one), p, big.NewRat(1, 1))
	}
}

// TestExpLogNesting checks, for random arguments and precisions, that the
// enclosure at the higher precision lies inside the one at the lower: both
// contain the value, and each has slack well beyond the other's width
// unless the value sits within 2^-p2 of an endpoint. Then it refines exp
// of 114 arguments in [−1500, 700] through one node from 64 to 4096 bits,
// where intersecting disjoint enclosures is an internal error (issue 14
// saw it on 13 of 114).
func TestExpLogNesting(t *testing.T) {
	rng := rand.New(rand.NewSource(18))
	precs := []uint{24, 53, 100, 256, 1000, 3000}
	inside := func(a, b ival) bool { return a.lo.Cmp(b.lo) <= 0 && b.hi.Cmp(a.hi) <= 0 }
	for i := 0; i < 150; i++ {
		x := new(big.Float).SetPrec(200).SetFloat64(rng.NormFloat64())
		x.SetMantExp(x, rng.Intn(50)-25) // magnitudes 2^-25 … 2^25
		y := new(big.Float).Abs(x)
		i1 := rng.Intn(len(precs) - 1)
		p1, p2 := precs[i1], precs[i1+1+rng.Intn(len(precs)-1-i1)]
		e1, err1 := expRange(x, x, p1)
		e2, err2 := expRange(x, x, p2)
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		if !inside(e1, e2) {
			t.Errorf("exp(%s): %v at %d bits not inside %v at %d bits", x.Text('g', 20), e2, p2, e1, p1)
		}
		if l1, l2 := logPoint(y, p1), logPoint(y, p2); !inside(l1, l2) {
			t.Errorf("log(%s): %v at %d bits not inside %v at %d bits", y.Text('g', 20), l2, p2, l1, p1)
		}
	}
	for i := 0; i < 114; i++ {
		r := new(big.Rat).SetFrac64(rng.Int63n(2200000)-1500000, 1000)
		x := RealExp(rtOffset(r))
		for p := uint(64); p <= 4096; p *= 2 {
			if _, err := x.Enclose(p); err != nil {
				t.Errorf("exp(%s + √2/1000) at %d bits: %v", r.FloatString(3), p, err)
			}
		}
	}
}

// TestLn2 checks ln2Fixed against ln 2 = Σ_{k≥1} 1/(k·2^k) summed in exact
// rationals (tail after N terms below 1/((N+1)·2^N)), a different series
// from the one it uses, and its first 50 digits against the published
// value (OEIS A002162, from memory).
func TestLn2(t *testing.T) {
	const w = 3000
	sum := new(big.Rat)
	n := int64(w + 8)
	for k := int64(1); k <= n; k++ {
		sum.Add(sum, new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(k), uint(k))))
	}
	tail := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(n+1), uint(n)))
	scale := new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), w))
	for _, ww := range []uint{w, 1000, 100, 30} {
		l := ln2Fixed(ww) // claims l ≤ ln2·2^ww < l + 2
		s := new(big.Rat).Quo(scale, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), w-ww)))
		lo := new(big.Rat).Mul(sum, s)
		hi := new(big.Rat).Mul(new(big.Rat).Add(sum, tail), s)
		if new(big.Rat).SetInt(l).Cmp(hi) > 0 || new(big.Rat).SetInt(new(big.Int).Add(l, big.NewInt(2))).Cmp(lo) <= 0 {
			t.Errorf("ln2Fixed(%d) = %s disagrees with Σ 1/(k·2^k)", ww, l)
		}
	}
	got := ln2Ival(200)
	want := "0.69314718055994530941723212145817656807550013436025"
	if s := got.lo.Text('f', 60)[:len(want)]; s != want {
		t.Errorf("ln 2 lower end %s, want %s…", s, want)
	}
}

// rtDigitsWithin checks a Digits string s (n significant digits, truncated
// toward zero, of a positive value) against a reference interval
// [lo, hi]: the reference must lie in [D, D + one unit of the last digit).
func rtDigitsWithin(t *testing.T, name, s string, lo, hi *big.Rat) {
	t.Helper()
	d, ok := new(big.Rat).SetString(s)
	if !ok {
		t.Fatalf("%s: %q is not a number", name, s)
	}
	mant := s
	exp := 0
	if i := strings.IndexByte(s, 'e'); i >= 0 {
		mant = s[:i]
		fmt.Sscan(s[i+1:], &exp)
	}
	intDigits := len(strings.SplitN(mant, ".", 2)[0])
	fracDigits := len(mant) - intDigits - 1
	if fracDigits < 0 {
		fracDigits = 0
	}
	// One unit of the last digit is 10^(exp − fracDigits).
	unit := new(big.Rat).SetInt(rtPow10(abs(exp - fracDigits)))
	if exp-fracDigits < 0 {
		unit.Inv(unit)
	}
	top := new(big.Rat).Add(d, unit)
	if lo.Cmp(d) < 0 || hi.Cmp(top) >= 0 {
		t.Errorf("%s: digits %s do not hold the reference [%s, %s]", name, s, lo.FloatString(10), hi.FloatString(10))
	}
}

// TestExpIssue14Cases is section 1 of issue 14, each case with its
// reference value.
func TestExpIssue14Cases(t *testing.T) {
	sqrt2 := RealSqrt(RealFromInt(2))
	// Issue report, mpmath/decimal at 60 digits: 2.818362144811…e-324.
	x := RealSub(RealFromInt(-745), RealQuo(sqrt2, RealFromInt(1000)))
	if s, err := RealExp(x).Digits(10, DefaultMaxPrecision); err != nil || s != "2.818362144e-324" {
		t.Errorf("digits(exp(-745 - sqrt(2)/1000), 10) = %q, %v; want 2.818362144e-324", s, err)
	}
	// And 40 digits against an independent route: exp(−745)·exp(−√2/1000)
	// with √2 between ⌊√2·10^60⌋/10^60 and that plus 10^-60 (integer square
	// root), each exp from the exact-rational series; exp is increasing.
	r2 := rtSqrt2Scaled(60)
	den := new(big.Int).Mul(rtPow10(60), big.NewInt(1000))
	sLo := new(big.Rat).SetFrac(r2, den)
	sHi := new(big.Rat).SetFrac(new(big.Int).Add(r2, big.NewInt(1)), den)
	a, b := rtExpRef(big.NewRat(-745, 1), 300)
	c, _ := rtExpRef(new(big.Rat).Neg(sHi), 300)
	_, d := rtExpRef(new(big.Rat).Neg(sLo), 300)
	if s, err := RealExp(x).Digits(40, DefaultMaxPrecision); err != nil {
		t.Error(err)
	} else {
		rtDigitsWithin(t, "exp(-745 - sqrt(2)/1000)", s, new(big.Rat).Mul(a, c), new(big.Rat).Mul(b, d))
	}

	// Issue report (mpmath): exp(−740 − √2) = 1.0183527610316438025e-322,
	// so it is not below 101835276103164375·10^-339.
	x = RealSub(RealFromInt(-740), sqrt2)
	bound := RealFromRat(new(big.Rat).SetFrac(big.NewInt(101835276103164375), rtPow10(339)))
	if c, err := RealCmp(RealExp(x), bound, DefaultMaxPrecision); err != nil || c != 1 {
		t.Errorf("exp(-740 - sqrt(2)) vs 101835276103164375e-339: %d, %v; want +1", c, err)
	}
	if s, err := RealExp(x).Digits(19, DefaultMaxPrecision); err != nil || s != "1.018352761031643802e-322" {
		t.Errorf("exp(-740 - sqrt(2)) to 19 digits: %q, %v; want 1.018352761031643802e-322", s, err)
	}

	// exp(y)·exp(−y) = 1 for y = −1490 − √2/1000 and for x = −740 − √2:
	// the residual encloses 0, narrowly (identity: exp(a)·exp(−a) = 1).
	y := RealSub(RealFromInt(-1490), RealQuo(sqrt2, RealFromInt(1000)))
	for _, v := range []*Real{y, x} {
		rtZeroAt(t, "exp(v)·exp(−v) − 1", RealSub(RealMul(RealExp(v), RealExp(RealNeg(v))), RealFromInt(1)), 256, big.NewRat(1, 1))
	}

	// exp(−742 − 7·10^-160) = exp(−742)·exp(−u), u = 7·10^-160, with
	// 1 − u ≤ exp(−u) ≤ 1 − u + u²/2 (alternating series); the issue saw it
	// wrong from the 12th digit.
	n := new(big.Int).Mul(big.NewInt(-742), rtPow10(160))
	n.Sub(n, big.NewInt(7))
	e := RealExp(RealFromRat(new(big.Rat).SetFrac(n, rtPow10(160))))
	u := new(big.Rat).SetFrac(big.NewInt(7), rtPow10(160))
	a, b = rtExpRef(big.NewRat(-742, 1), 300)
	one := big.NewRat(1, 1)
	fLo := new(big.Rat).Sub(one, u)
	fHi := new(big.Rat).Add(fLo, new(big.Rat).Mul(new(big.Rat).Mul(u, u), big.NewRat(1, 2)))
	if s, err := e.Digits(50, DefaultMaxPrecision); err != nil {
		t.Error(err)
	} else {
		rtDigitsWithin(t, "exp(-742 - 7e-160)", s, new(big.Rat).Mul(a, fLo), new(big.Rat).Mul(b, fHi))
	}

	// digits(exp(−5950), 120), wrong from the 89th digit in the issue,
	// against the exact-rational series.
	if s, err := RealExp(RealFromInt(-5950)).Digits(120, DefaultMaxPrecision); err != nil {
		t.Error(err)
	} else {
		lo, hi := rtExpRef(big.NewRat(-5950, 1), 64)
		rtDigitsWithin(t, "exp(-5950)", s, lo, hi)
	}
}

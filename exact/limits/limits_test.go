package limits

import (
	"errors"
	"math"
	"math/big"
	"strings"
	"testing"

	"assay/exact"
)

// one returns 1 at testBits.
func one() *big.Float { return new(big.Float).SetPrec(testBits).SetInt64(1) }

// checkClassical checks an estimate of a limit known to be want, reached
// with order wantOrder: the reported order rounds to it, the extrapolated
// value has at least three times as many correct digits as the last raw
// value (and at least minDigits), the error estimate covers the actual
// error, and Compare says the claim holds.
func checkClassical(t *testing.T, e Estimate, vals []*big.Float, want *big.Float, wantOrder float64, minDigits int) {
	t.Helper()
	if e.Limit == nil {
		t.Fatalf("no limit: %s", e.Reason)
	}
	if math.Round(e.Order) != wantOrder {
		t.Errorf("order %.12g, want %g", e.Order, wantOrder)
	}
	raw := errDigits(vals[len(vals)-1], want)
	got := errDigits(e.Limit, want)
	if got < 3*raw || got < minDigits {
		t.Errorf("extrapolated limit right to %d digits, the last term to %d: want at least %d", got, raw, max(3*raw, minDigits))
	}
	actual := new(big.Float).Sub(e.Limit, want)
	if actual.Abs(actual).Cmp(e.ErrorEst) > 0 {
		t.Errorf("actual error %s exceeds the error estimate %s", actual.Text('e', 3), e.ErrorEst.Text('e', 3))
	}
	if e.Digits < 3*raw {
		t.Errorf("Digits %d, want at least %d", e.Digits, 3*raw)
	}
	if v, d, _ := Compare(e, want); v != VerdictEstimated || d != e.Digits {
		t.Errorf("Compare with the true limit: %s to %d digits, want %s to %d", v, d, VerdictEstimated, e.Digits)
	}
	n := len(vals)
	if len(e.Differences) != n-1 || len(e.Extrapolants) != n || e.Extrapolants[n-1].Cmp(e.Limit) != 0 {
		t.Errorf("%d differences and %d extrapolants for %d values, or the last extrapolant is not the limit", len(e.Differences), len(e.Extrapolants), n)
	}
	if e.Diverges || e.Reason != "" {
		t.Errorf("diverges %v, reason %q", e.Diverges, e.Reason)
	}
}

// sin(t)/t → 1 with order 2: sin t/t = 1 − t²/6 + t⁴/120 − … (Taylor
// series; any calculus text).
func TestSinOverT(t *testing.T) {
	_, hs, vals := walkReal(t, ToZero, nil, 40, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealQuo(exact.RealSin(x), x)
	})
	e := Analyse(hs, vals)
	checkClassical(t, e, vals, one(), 2, 150)
	if e.Method != MethodRichardson {
		t.Errorf("method %q, want %q", e.Method, MethodRichardson)
	}
}

// (1+t)^(1/t) → e with order 1: (1+t)^(1/t) = e·(1 − t/2 + 11t²/24 − …)
// (the standard expansion, e.g. Graham, Knuth & Patashnik, Concrete
// Mathematics, §9.6).
func TestOnePlusTToTheOneOverT(t *testing.T) {
	_, hs, vals := walkReal(t, ToZero, nil, 40, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealExp(exact.RealQuo(exact.RealLog(exact.RealAdd(exact.RealFromInt(1), x)), x))
	})
	e := Analyse(hs, vals)
	want := approx(t, exact.RealExp(exact.RealFromInt(1)), testBits)
	checkClassical(t, e, vals, want, 1, 100)
}

// (e^t − 1)/t → 1 with order 1: (e^t − 1)/t = 1 + t/2 + t²/6 + … (the
// exponential series).
func TestExpMinusOneOverT(t *testing.T) {
	_, hs, vals := walkReal(t, ToZero, nil, 40, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealQuo(exact.RealSub(exact.RealExp(x), exact.RealFromInt(1)), x)
	})
	checkClassical(t, Analyse(hs, vals), vals, one(), 1, 100)
}

// Archimedes (Measurement of a Circle): the semi-perimeters of the regular
// n-gons circumscribed about and inscribed in the unit circle, n·tan(π/n)
// = π + π³/(3n²) + … and n·sin(π/n) = π − π³/(6n²) + …, tend to π with
// order 2 in h = 1/n. They are computed by the doubling recurrences
// (harmonic, then geometric mean; G. M. Phillips, "Archimedes the
// numerical analyst", Amer. Math. Monthly 88 (1981) 165–169, who also
// extrapolates them) from the hexagon, without using π; n = 6·2^k is
// 3·t_k for the walk toward infinity, whose distances h_k ∝ 1/n.
func TestArchimedesPolygons(t *testing.T) {
	ts, hs, err := Grid(ToInfinity, nil, big.NewRat(1, 2), 36)
	if err != nil {
		t.Fatal(err)
	}
	if ts[0].Cmp(big.NewRat(2, 1)) != 0 || ts[35].Cmp(new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), 36))) != 0 {
		t.Fatalf("walk toward infinity: t_0 = %s, t_35 = %s", ts[0], ts[35])
	}
	circ, insc := archimedes(36, testBits)
	pi := approx(t, exact.Pi(), testBits)
	for _, c := range []struct {
		name string
		vals []*big.Float
	}{{"circumscribed", circ}, {"inscribed", insc}} {
		t.Run(c.name, func(t *testing.T) {
			checkClassical(t, Analyse(hs, c.vals), c.vals, pi, 2, 150)
		})
	}
}

// The derivative of √t at 1 is 1/2: (√t − 1)/(t − 1) = 1/(√t + 1) → 1/2
// as t → 1, with order 1. A walk toward a value.
func TestDerivativeOfSqrtAtOne(t *testing.T) {
	ts, hs, vals := walkReal(t, ToValue, big.NewRat(1, 1), 30, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealQuo(exact.RealSub(exact.RealSqrt(x), exact.RealFromInt(1)), exact.RealSub(x, exact.RealFromInt(1)))
	})
	if ts[0].Cmp(big.NewRat(3, 2)) != 0 {
		t.Fatalf("t_0 = %s, want 3/2", ts[0])
	}
	checkClassical(t, Analyse(hs, vals), vals, new(big.Float).SetFloat64(0.5), 1, 100)
}

// 1/t² blows up with growth rate 2 (and so does 1/t² + 1/t + 5, whose
// leading term is the same).
func TestBlowUp(t *testing.T) {
	for _, c := range []struct {
		name string
		f    func(x *exact.Real) *exact.Real
	}{
		{"1/t^2", func(x *exact.Real) *exact.Real { return exact.RealQuo(exact.RealFromInt(1), exact.RealMul(x, x)) }},
		{"1/t^2 + 1/t + 5", func(x *exact.Real) *exact.Real {
			inv := exact.RealQuo(exact.RealFromInt(1), x)
			return exact.RealAdd(exact.RealAdd(exact.RealMul(inv, inv), inv), exact.RealFromInt(5))
		}},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, hs, vals := walkReal(t, ToZero, nil, 30, testBits, c.f)
			e := Analyse(hs, vals)
			if !e.Diverges || e.Limit != nil || math.Abs(e.Growth-2) > 1e-6 {
				t.Fatalf("diverges %v, growth %.12g, limit %v; want growth 2 and no limit", e.Diverges, e.Growth, e.Limit)
			}
			if e.Reason != "grows like h^−2" {
				t.Errorf("reason %q", e.Reason)
			}
			if v, _, gap := Compare(e, one()); v != VerdictFails || !gap.IsInf() {
				t.Errorf("Compare with 1: %s, gap %s; want fails, +Inf", v, gap)
			}
		})
	}
}

// exp(1/t) grows faster than any power of 1/t.
func TestFasterThanAnyPower(t *testing.T) {
	_, hs, vals := walkReal(t, ToZero, nil, 10, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealExp(exact.RealQuo(exact.RealFromInt(1), x))
	})
	e := Analyse(hs, vals)
	if !e.Diverges || !strings.Contains(e.Reason, "faster than any power") {
		t.Errorf("diverges %v, reason %q", e.Diverges, e.Reason)
	}
}

// log(1/t) grows without bound, slower than any power.
func TestLogarithmicGrowth(t *testing.T) {
	_, hs, vals := walkReal(t, ToZero, nil, 30, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealNeg(exact.RealLog(x))
	})
	e := Analyse(hs, vals)
	if !e.Diverges || e.Growth != 0 || e.Limit != nil || !strings.Contains(e.Reason, "log(1/h)") {
		t.Errorf("diverges %v, growth %g, limit %v, reason %q", e.Diverges, e.Growth, e.Limit, e.Reason)
	}
}

// sin(1/t) oscillates between −1 and 1 and has no limit at 0.
func TestOscillation(t *testing.T) {
	_, hs, vals := walkReal(t, ToZero, nil, 40, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealSin(exact.RealQuo(exact.RealFromInt(1), x))
	})
	e := Analyse(hs, vals)
	if e.Limit != nil || e.Diverges || !strings.Contains(e.Reason, "oscillate") {
		t.Fatalf("limit %v, diverges %v, reason %q; want no limit because of oscillation", e.Limit, e.Diverges, e.Reason)
	}
	if e.Method != "" || e.Extrapolants != nil || len(e.Differences) != 39 {
		t.Errorf("method %q, %d extrapolants, %d differences", e.Method, len(e.Extrapolants), len(e.Differences))
	}
	if v, _, _ := Compare(e, new(big.Float)); v != VerdictUndecided {
		t.Errorf("Compare: %s, want undecided", v)
	}
}

// 1/log(1/t) → 0, but logarithmically: no power-law extrapolation is
// trustworthy, so no limit is claimed.
func TestLogarithmicConvergence(t *testing.T) {
	_, hs, vals := walkReal(t, ToZero, nil, 30, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealQuo(exact.RealFromInt(-1), exact.RealLog(x))
	})
	e := Analyse(hs, vals)
	if e.Limit != nil || !strings.Contains(e.Reason, "logarithmic") {
		t.Errorf("limit %v, reason %q", e.Limit, e.Reason)
	}
}

// t·sin(1/t) → 0 (|t·sin(1/t)| ≤ t), irregularly: only the last term is
// usable, with an error estimate from the last differences.
func TestIrregularConvergence(t *testing.T) {
	_, hs, vals := walkReal(t, ToZero, nil, 40, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealMul(x, exact.RealSin(exact.RealQuo(exact.RealFromInt(1), x)))
	})
	e := Analyse(hs, vals)
	if e.Limit == nil || e.Method != MethodLastTerm {
		t.Fatalf("limit %v, method %q, reason %q", e.Limit, e.Method, e.Reason)
	}
	if v, _, _ := Compare(e, new(big.Float)); v == VerdictFails {
		t.Errorf("Compare with the true limit 0: %s", v)
	}
}

// A constant has itself as its limit, to the values' precision.
func TestConstant(t *testing.T) {
	_, hs, _ := Grid(ToZero, nil, big.NewRat(1, 3), 5)
	vals := make([]*big.Float, 5)
	for k := range vals {
		vals[k] = new(big.Float).SetPrec(100).SetInt64(7)
	}
	e := Analyse(hs, vals)
	if e.Limit == nil || e.Limit.Cmp(big.NewFloat(7)) != 0 || e.Method != MethodLastTerm || e.Digits < 25 {
		t.Errorf("limit %v, method %q, digits %d, reason %q", e.Limit, e.Method, e.Digits, e.Reason)
	}
}

// Compare: the true limit holds to the estimated digits; a value off by
// 10^−30 fails with that gap; a value just outside the error estimate is
// undecided.
func TestCompare(t *testing.T) {
	_, hs, vals := walkReal(t, ToZero, nil, 40, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealExp(exact.RealQuo(exact.RealLog(exact.RealAdd(exact.RealFromInt(1), x)), x))
	})
	e := Analyse(hs, vals)
	eul := approx(t, exact.RealExp(exact.RealFromInt(1)), testBits)
	v, d, gap := Compare(e, eul)
	if v != VerdictEstimated || d != e.Digits || d < 100 || gap.Cmp(e.ErrorEst) > 0 {
		t.Errorf("true value: %s to %d digits, gap %s (estimate %s)", v, d, gap.Text('e', 3), e.ErrorEst.Text('e', 3))
	}

	off := new(big.Float).SetPrec(testBits).SetFloat64(1e-30)
	wrong := new(big.Float).SetPrec(testBits).Add(eul, off)
	v, d, gap = Compare(e, wrong)
	rel := new(big.Float).Quo(new(big.Float).Sub(gap, off), off)
	if v != VerdictFails || d != 30 || math.Abs(must(rel.Float64())) > 1e-6 {
		t.Errorf("value off by 1e-30: %s, %d agreeing digits, gap %s; want fails, 30, 1e-30", v, d, gap.Text('e', 6))
	}

	near := new(big.Float).SetPrec(testBits).Mul(e.ErrorEst, big.NewFloat(3))
	near.Add(near, e.Limit)
	if v, _, _ := Compare(e, near); v != VerdictUndecided {
		t.Errorf("value 3 error estimates away: %s, want undecided", v)
	}

	// sin(t)/t against 101/100 (the kernel's own test).
	_, hs, vals = walkReal(t, ToZero, nil, 30, testBits, func(x *exact.Real) *exact.Real {
		return exact.RealQuo(exact.RealSin(x), x)
	})
	e = Analyse(hs, vals)
	if v, d, gap := Compare(e, big.NewFloat(1.01)); v != VerdictFails || d != 2 || math.Abs(must(gap.Float64())-0.01) > 1e-15 {
		t.Errorf("sin t/t against 1.01: %s, %d digits, gap %s", v, d, gap)
	}
	if v, _, gap := Compare(Estimate{}, one()); v != VerdictUndecided || !gap.IsInf() {
		t.Errorf("empty estimate: %s, gap %s", v, gap)
	}
}

func must(x float64, _ big.Accuracy) float64 { return x }

// Grid: the three targets, and the arguments it refuses.
func TestGrid(t *testing.T) {
	r := big.NewRat(1, 2)
	check := func(toward Toward, value *big.Rat, t0, t2 *big.Rat) {
		t.Helper()
		ts, hs, err := Grid(toward, value, r, 3)
		if err != nil {
			t.Fatalf("%v: %v", toward, err)
		}
		if len(ts) != 3 || len(hs) != 3 {
			t.Fatalf("%v: %d parameters, %d distances", toward, len(ts), len(hs))
		}
		if ts[0].Cmp(t0) != 0 || ts[2].Cmp(t2) != 0 {
			t.Errorf("%v: t = %s, %s, %s; want t_0 = %s, t_2 = %s", toward, ts[0], ts[1], ts[2], t0, t2)
		}
		for k, h := range hs {
			if want := new(big.Rat).SetFrac64(1, 1<<(k+1)); h.Cmp(want) != 0 {
				t.Errorf("%v: h_%d = %s, want %s", toward, k, h, want)
			}
		}
	}
	check(ToZero, nil, big.NewRat(1, 2), big.NewRat(1, 8))
	check(ToValue, big.NewRat(2, 1), big.NewRat(5, 2), big.NewRat(17, 8))
	check(ToInfinity, nil, big.NewRat(2, 1), big.NewRat(8, 1))

	ts, _, _ := Grid(ToZero, nil, big.NewRat(2, 3), 400)
	if want := new(big.Rat).SetFrac(new(big.Int).Exp(big.NewInt(2), big.NewInt(400), nil), new(big.Int).Exp(big.NewInt(3), big.NewInt(400), nil)); ts[399].Cmp(want) != 0 {
		t.Errorf("t_399 for ratio 2/3 is not (2/3)^400")
	}

	bad := []struct {
		toward Toward
		value  *big.Rat
		ratio  *big.Rat
		steps  int
	}{
		{ToZero, nil, big.NewRat(0, 1), 10},
		{ToZero, nil, big.NewRat(1, 1), 10},
		{ToZero, nil, big.NewRat(3, 2), 10},
		{ToZero, nil, big.NewRat(-1, 2), 10},
		{ToZero, nil, nil, 10},
		{ToZero, nil, r, 2},
		{ToZero, nil, r, 401},
		{ToValue, nil, r, 10},
		{Toward(7), nil, r, 10},
	}
	for _, b := range bad {
		if _, _, err := Grid(b.toward, b.value, b.ratio, b.steps); !errors.Is(err, ErrGrid) {
			t.Errorf("Grid(%v, %v, %v, %d): error %v, want ErrGrid", b.toward, b.value, b.ratio, b.steps, err)
		}
	}
	if ToZero.String() != "0" || ToInfinity.String() != "infinity" || ToValue.String() != "value" {
		t.Errorf("Toward names: %s %s %s", ToZero, ToValue, ToInfinity)
	}
}

// Analyse refuses what it cannot read, saying why.
func TestAnalyseRejects(t *testing.T) {
	_, hs, _ := Grid(ToZero, nil, big.NewRat(1, 2), 5)
	vals := make([]*big.Float, 5)
	for k := range vals {
		vals[k] = big.NewFloat(float64(k))
	}
	notGeometric := append([]*big.Rat{}, hs...)
	notGeometric[3] = big.NewRat(1, 15)
	infinite := append([]*big.Float{}, vals...)
	infinite[2] = new(big.Float).SetInf(false)
	missing := append([]*big.Float{}, vals...)
	missing[1] = nil
	for _, c := range []struct {
		hs     []*big.Rat
		vals   []*big.Float
		reason string
	}{
		{hs[:2], vals[:2], "too few steps"},
		{hs, vals[:4], "5 distances but 4 values"},
		{notGeometric, vals, "not a geometric sequence"},
		{[]*big.Rat{big.NewRat(1, 4), big.NewRat(1, 2), big.NewRat(1, 1)}, vals[:3], "do not decrease"},
		{hs, infinite, "value 2 is infinite"},
		{hs, missing, "value 1 is missing"},
	} {
		e := Analyse(c.hs, c.vals)
		if e.Limit != nil || !strings.Contains(e.Reason, c.reason) {
			t.Errorf("reason %q, want one containing %q", e.Reason, c.reason)
		}
	}
}

// Claims that hold must never be called false. Hard cases (logarithmic
// terms, fractional orders, oscillating corrections, few steps, a ratio
// near 1, low precision) against their true limits: the verdict may be
// undecided, never "fails", and the digits claimed are right.
func TestNoFalseFailures(t *testing.T) {
	if testing.Short() {
		t.Skip("many walks")
	}
	I := exact.RealFromInt
	cases := []struct {
		name string
		f    func(x *exact.Real) *exact.Real
		want *exact.Real
	}{
		// t^t = exp(t log t) → 1: terms (t log t)^k/k!.
		{"t^t", func(x *exact.Real) *exact.Real { return exact.RealExp(exact.RealMul(x, exact.RealLog(x))) }, I(1)},
		// √t·log t → 0.
		{"sqrt(t) log t", func(x *exact.Real) *exact.Real { return exact.RealMul(exact.RealSqrt(x), exact.RealLog(x)) }, I(0)},
		// 2 + t^(1/3): a fractional order.
		{"2 + t^(1/3)", func(x *exact.Real) *exact.Real { return exact.RealAdd(I(2), exact.RealRoot(x, 3)) }, I(2)},
		// t² sin(1/t) → 0, irregularly.
		{"t^2 sin(1/t)", func(x *exact.Real) *exact.Real {
			return exact.RealMul(exact.RealMul(x, x), exact.RealSin(exact.RealQuo(I(1), x)))
		}, I(0)},
		// (1 − cos t)/t² → 1/2.
		{"(1 - cos t)/t^2", func(x *exact.Real) *exact.Real {
			return exact.RealQuo(exact.RealSub(I(1), exact.RealCos(x)), exact.RealMul(x, x))
		}, exact.RealFromRat(big.NewRat(1, 2))},
	}
	for _, c := range cases {
		for _, bits := range []uint{64, 200} {
			want := approx(t, c.want, bits+64)
			for _, r := range []*big.Rat{big.NewRat(1, 2), big.NewRat(3, 4)} {
				for _, steps := range []int{8, 20, 40} {
					_, hs, _ := Grid(ToZero, nil, r, steps)
					vals := make([]*big.Float, steps)
					for k, h := range hs {
						vals[k] = approx(t, c.f(exact.RealFromRat(h)), bits)
					}
					e := Analyse(hs, vals)
					v, d, gap := Compare(e, want)
					if v == VerdictFails {
						t.Errorf("%s (%d bits, ratio %s, %d steps): fails, gap %s, error estimate %s (%s)", c.name, bits, r.RatString(), steps, gap.Text('e', 3), e.ErrorEst.Text('e', 3), e.Method)
					}
					if v == VerdictEstimated && errDigits(e.Limit, want)+1 < d {
						t.Errorf("%s (%d bits, ratio %s, %d steps): claims %d digits, has %d", c.name, bits, r.RatString(), steps, d, errDigits(e.Limit, want))
					}
				}
			}
		}
	}
}

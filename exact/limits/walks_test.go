package limits

import (
	"math"
	"math/big"
	"testing"

	"assay/exact"
)

// The second ratio keeps its logarithm away from small rational multiples
// of the first's (checked with math.Log, independently of ratLog), has a
// numerator of at least 2, and its walk reaches about as close to the
// target as the first.
func TestSecondRatio(t *testing.T) {
	for _, r := range []*big.Rat{big.NewRat(1, 2), big.NewRat(1, 3), big.NewRat(1, 10), big.NewRat(2, 3), big.NewRat(9, 10), big.NewRat(3, 7)} {
		r2, n := SecondRatio(r, 30)
		f1, _ := r.Float64()
		f2, _ := r2.Float64()
		x := math.Log(f2) / math.Log(f1)
		for a := 1; a <= 6; a++ {
			if d := math.Abs(float64(a)*x - math.Round(float64(a)*x)); d < 0.03 {
				t.Errorf("ratio %s: second ratio %s, %d·log r2/log r1 = %.4f is within %.3f of an integer", r.RatString(), r2.RatString(), a, float64(a)*x, d)
			}
		}
		if r2.Num().Int64() < 2 || f2 <= 0 || f2 >= f1 {
			t.Errorf("ratio %s: second ratio %s", r.RatString(), r2.RatString())
		}
		// r1^30 against r2^n: within one step of the second walk.
		if reach := float64(n) * math.Log(f2) / (30 * math.Log(f1)); reach < 1-1/float64(n)-1e-9 || reach > 1+1/float64(n)+1e-9 {
			t.Errorf("ratio %s: %d steps at %s reach %.3f of the first walk's depth", r.RatString(), n, r2.RatString(), reach)
		}
	}
}

// walkAt evaluates f along Grid(ToZero, nil, ratio, steps) at testBits.
func walkAt(tb testing.TB, ratio *big.Rat, steps int, f func(t *exact.Real) *exact.Real) Estimate {
	tb.Helper()
	ts, hs, err := Grid(ToZero, nil, ratio, steps)
	if err != nil {
		tb.Fatal(err)
	}
	vals := make([]*big.Float, steps)
	for k, t := range ts {
		vals[k] = approx(tb, f(exact.RealFromRat(t)), testBits)
	}
	return Analyse(hs, vals)
}

// Two walks agree on sin t/t → 1 (Taylor series, any calculus text) and
// on the blow-up 1/t² (order 2, common practice), and disagree on
// sin(π/t), which is 0 at every t = 3^-k but has no limit at 0 (from
// memory).
func TestAgree(t *testing.T) {
	r1 := big.NewRat(1, 3)
	r2, n2 := SecondRatio(r1, 30)
	sinc := func(x *exact.Real) *exact.Real { return exact.RealQuo(exact.RealSin(x), x) }
	e, ok, why := Agree(walkAt(t, r1, 30, sinc), walkAt(t, r2, n2, sinc))
	if !ok || e.Limit == nil || errDigits(e.Limit, one()) < 50 {
		t.Errorf("sin t/t: agree %v (%s), limit %v", ok, why, e.Limit)
	}
	inv2 := func(x *exact.Real) *exact.Real { return exact.RealQuo(exact.RealFromInt(1), exact.RealMul(x, x)) }
	e, ok, why = Agree(walkAt(t, r1, 30, inv2), walkAt(t, r2, n2, inv2))
	if !ok || !e.Diverges || OrderCheck(e.Growth, 2, true) != OrderConsistent {
		t.Errorf("1/t²: agree %v (%s), diverges %v, growth %g", ok, why, e.Diverges, e.Growth)
	}
	alias := func(x *exact.Real) *exact.Real { return exact.RealSin(exact.RealQuo(exact.Pi(), x)) }
	a := walkAt(t, r1, 30, alias)
	if a.Limit == nil {
		t.Fatalf("the walk at 1/3 should be fooled (that is the point): %s", a.Reason)
	}
	if _, ok, why = Agree(a, walkAt(t, r2, n2, alias)); ok || why == "" {
		t.Errorf("sin(π/t): the walks agree")
	}
}

// OrderCheck: within 5% holds, beyond 25% fails, in between or without an
// estimate undecided.
func TestOrderCheck(t *testing.T) {
	for _, tc := range []struct {
		got, stated float64
		estimated   bool
		want        string
	}{
		{2.01, 2, true, OrderConsistent}, {1.0, 2, true, VerdictFails}, {2.3, 2, true, VerdictUndecided},
		{0, 2, false, VerdictUndecided}, {0.52, 0.5, true, OrderConsistent}, {0.7, 0.5, true, VerdictUndecided}, {0.9, 0.5, true, VerdictFails},
	} {
		if got := OrderCheck(tc.got, tc.stated, tc.estimated); got != tc.want {
			t.Errorf("OrderCheck(%g, %g, %v) = %s, want %s", tc.got, tc.stated, tc.estimated, got, tc.want)
		}
	}
}

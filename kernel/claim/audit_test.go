package claim

import (
	"math"
	"math/big"
	"testing"
)

// A float64 carries 53 bits, log10(2^53) = 15.95 decimal digits (IEEE 754,
// common practice): an error of 1e-8 costs 7.95 of them, one of 2^-53 (a
// half ulp at 1) none, a NaN all.
func TestLossOf(t *testing.T) {
	if d := math.Log10(math.Exp2(53)); math.Abs(d-Float64Digits) > 0.005 {
		t.Fatalf("log10(2^53) = %.3f, Float64Digits = %g", d, Float64Digits)
	}
	for _, c := range []struct {
		err   float64
		text  string
		digit float64
	}{
		{1e-8, "1.00e-08", 8.0},
		{math.Exp2(-53), "1.11e-16", 0},
		{0, "0.00e+00", 0},
		{math.Inf(1), "+Inf", 16.0},
	} {
		if l := LossOf(c.err); l.Error != c.text || l.DigitsLost != c.digit {
			t.Errorf("LossOf(%g) = %+v, want %s, %.1f", c.err, l, c.text, c.digit)
		}
	}
}

// The audit's errors are measured in big floats against one scale, the
// exact value: 1 + 2^-60 against 1 is an error of 2^-60, which float64
// arithmetic could not see (1 + 2^-60 rounds to 1); where the exact value
// is 0 the error is absolute; a NaN is an infinite error.
func TestRelativeError(t *testing.T) {
	one := big.NewFloat(1).SetPrec(128)
	near := new(big.Float).SetPrec(128).Add(one, big.NewFloat(math.Exp2(-60)))
	if got := RelativeError([]*big.Float{one}, []*big.Float{one}, []*big.Float{near}); got != math.Exp2(-60) {
		t.Errorf("relative error %g, want 2^-60", got)
	}
	two := big.NewFloat(2)
	if got := RelativeError([]*big.Float{two}, []*big.Float{one}, []*big.Float{near}); got != math.Exp2(-61) {
		t.Errorf("scaled by the exact value 2: %g, want 2^-61", got)
	}
	zero := new(big.Float)
	if got := FloatError([]*big.Float{zero}, []*big.Float{zero}, []float64{1e-20}); got != 1e-20 {
		t.Errorf("absolute where exact is 0: %g", got)
	}
	if got := FloatError([]*big.Float{one}, []*big.Float{one}, []float64{math.NaN()}); !math.IsInf(got, 1) {
		t.Errorf("NaN: %g", got)
	}
}

package claim

import (
	"fmt"
	"math"
	"math/big"

	"assay/cells"
)

// Float64Digits is the number of decimal digits a float64 carries.
const Float64Digits = 15.95

// RelativeError is the worst distance between the entries got and want,
// relative to the exact entries (absolute where an exact entry is 0),
// measured in big floats so that errors far below float64's own are
// still seen. One scale, the exact value, serves every error of the
// audit, so an input error and a formula error add up to at least the
// total.
func RelativeError(exact, want, got []*big.Float) float64 {
	worst := 0.0
	for i, e := range exact {
		d := new(big.Float).SetPrec(max(e.Prec(), want[i].Prec())).Sub(got[i], want[i])
		if e.Sign() != 0 {
			d.Quo(d, e)
		}
		f, _ := d.Abs(d).Float64()
		worst = math.Max(worst, f)
	}
	return worst
}

// FloatError is RelativeError for float64 entries; a NaN or infinity is
// an infinite error.
func FloatError(exact, want []*big.Float, got []float64) float64 {
	conv := make([]*big.Float, len(got))
	for i, f := range got {
		if math.IsNaN(f) || math.IsInf(f, 0) {
			return math.Inf(1)
		}
		conv[i] = new(big.Float).SetFloat64(f)
	}
	return RelativeError(exact, want, conv)
}

// LossOf is a relative error as the report prints it, with the decimal
// digits of a float64 it costs (to one decimal).
func LossOf(err float64) cells.Loss {
	correct := Float64Digits
	if err > 0 {
		correct = math.Min(Float64Digits, -math.Log10(err))
	}
	lost := math.Max(0, Float64Digits-math.Max(0, correct))
	return cells.Loss{Error: fmt.Sprintf("%.2e", err), DigitsLost: math.Round(lost*10) / 10}
}

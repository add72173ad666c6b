package claim

import (
	"math"
	"math/big"
)

// Float64Digits is the number of decimal digits a float64 carries.
const Float64Digits = 15.95

// AuditError is the worst relative error of float64 entries against exact
// ones (absolute where the exact entry is 0) and the decimal digits it costs.
func AuditError(exactSide []*big.Float, floatSide []float64) (worst float64, lost float64) {
	for i, e := range exactSide {
		v, _ := e.Float64()
		err := math.Abs(floatSide[i] - v)
		if math.IsNaN(floatSide[i]) || math.IsInf(floatSide[i], 0) {
			err = math.Inf(1)
		}
		if v != 0 {
			err /= math.Abs(v)
		}
		worst = math.Max(worst, err)
	}
	correct := Float64Digits
	if worst > 0 {
		correct = math.Min(Float64Digits, -math.Log10(worst))
	}
	return worst, math.Max(0, Float64Digits-math.Max(0, correct))
}

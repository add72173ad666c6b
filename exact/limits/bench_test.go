package limits

import (
	"math/big"
	"testing"

	"assay/exact"
)

// benchBits is about 1,000 decimal digits.
const benchBits = 3400

// BenchmarkAnalyse1000Digits: a 40-step analysis at 1,000 decimal digits
// (3,400 bits), on a sequence Richardson extrapolation settles (Archimedes'
// inscribed polygons), one Wynn's ε algorithm settles (t^t, with
// logarithmic terms), and one that is rejected (sin(1/t)). The design's
// target is under 1 s per analysis.
func BenchmarkAnalyse1000Digits(b *testing.B) {
	_, hs, err := Grid(ToInfinity, nil, big.NewRat(1, 2), 40)
	if err != nil {
		b.Fatal(err)
	}
	_, insc := archimedes(40, benchBits)
	_, _, tt := walkReal(b, ToZero, nil, 40, benchBits, func(x *exact.Real) *exact.Real {
		return exact.RealExp(exact.RealMul(x, exact.RealLog(x)))
	})
	_, _, osc := walkReal(b, ToZero, nil, 40, benchBits, func(x *exact.Real) *exact.Real {
		return exact.RealSin(exact.RealQuo(exact.RealFromInt(1), x))
	})
	for _, c := range []struct {
		name string
		vals []*big.Float
	}{{"archimedes", insc}, {"t^t", tt}, {"sin(1/t)", osc}} {
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				Analyse(hs, c.vals)
			}
		})
	}
}

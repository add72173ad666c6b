package limits

import (
	"math/big"
	"testing"

	"assay/exact"
)

// testBits is the precision of the test values.
const testBits = 600

// approx returns the midpoint of a certified enclosure of x to testBits bits.
func approx(tb testing.TB, x *exact.Real, bits uint) *big.Float {
	tb.Helper()
	iv, err := x.Approx(bits, exact.DefaultMaxPrecision)
	if err != nil {
		tb.Fatalf("approx: %v", err)
	}
	mid := new(big.Rat).Add(iv.Lo, iv.Hi)
	mid.Quo(mid, big.NewRat(2, 1))
	return new(big.Float).SetPrec(bits).SetRat(mid)
}

// walkReal evaluates f along Grid(toward, value, 1/2, steps) at bits bits.
func walkReal(tb testing.TB, toward Toward, value *big.Rat, steps int, bits uint, f func(t *exact.Real) *exact.Real) (ts, hs []*big.Rat, vals []*big.Float) {
	tb.Helper()
	ts, hs, err := Grid(toward, value, big.NewRat(1, 2), steps)
	if err != nil {
		tb.Fatal(err)
	}
	vals = make([]*big.Float, steps)
	for k, t := range ts {
		vals[k] = approx(tb, f(exact.RealFromRat(t)), bits)
	}
	return ts, hs, vals
}

// archimedes returns the semi-perimeters of the circumscribed (a) and
// inscribed (b) regular 6·2^k-gons of the unit circle, k = 0 … steps−1,
// from Archimedes' doubling recurrences a' = 2ab/(a+b), b' = sqrt(a'·b),
// starting at the hexagon (a = 2√3, b = 3); π is never used.
func archimedes(steps int, bits uint) (a, b []*big.Float) {
	wp := bits + 32
	x := new(big.Float).SetPrec(wp).SetInt64(12)
	x.Sqrt(x) // 2√3
	y := new(big.Float).SetPrec(wp).SetInt64(3)
	for range steps {
		a = append(a, new(big.Float).SetPrec(bits).Set(x))
		b = append(b, new(big.Float).SetPrec(bits).Set(y))
		num := new(big.Float).SetPrec(wp).Mul(x, y)
		num.Mul(num, new(big.Float).SetInt64(2))
		den := new(big.Float).SetPrec(wp).Add(x, y)
		x = num.Quo(num, den)
		y = new(big.Float).SetPrec(wp).Mul(x, y)
		y.Sqrt(y)
	}
	return a, b
}

// errDigits returns floor(−log10|x − want|) (capped at 1000).
func errDigits(x, want *big.Float) int {
	d := new(big.Float).SetPrec(2000).Sub(x, want)
	if d.Sign() == 0 {
		return 1000
	}
	l := -log2Abs(d) * 0.30102999566398120
	if l < 0 {
		return 0
	}
	return int(l)
}

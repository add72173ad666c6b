package exact

import (
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// quoWord agrees with math/big's Rat.Quo (the reference) on numerators of
// one to five words, both signs, and one-word divisors up to MinInt64;
// it declines divisors that are not one-word integers.
func TestQuoWordMatchesBig(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	divs := []int64{1, -1, 2, 288, -288, 1 << 40, math.MaxInt64, math.MinInt64}
	for range 200 {
		divs = append(divs, int64(rng.Uint64()>>uint(rng.Intn(64))))
	}
	for rep := range 400 {
		num := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(1+rng.Intn(320))))
		if rep%2 == 1 {
			num.Neg(num)
		}
		den := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(1+rng.Intn(200))))
		den.Add(den, big.NewInt(1))
		x := new(big.Rat).SetFrac(num, den)
		for _, d := range divs {
			if d == 0 {
				continue
			}
			y := new(big.Rat).SetInt64(d)
			got, want := quoWord(x, y), new(big.Rat).Quo(x, y)
			if got == nil || got.Cmp(want) != 0 || got.Denom().Cmp(want.Denom()) != 0 {
				t.Fatalf("%s / %d = %v, want %s", x.RatString(), d, got, want.RatString())
			}
		}
	}
	for _, y := range []*big.Rat{big.NewRat(1, 2), new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), 64))} {
		if quoWord(big.NewRat(3, 5), y) != nil {
			t.Errorf("quoWord took %s", y.RatString())
		}
	}
}

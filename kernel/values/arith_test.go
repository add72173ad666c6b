package values

import (
	"math"
	"math/big"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/go-python/gpython/py"
)

// A rational over a machine integer (the route of cayley_menger(t) / 288)
// gives math/big's Rat.Quo (the reference) in lowest terms, for both
// signs, zero, integers and the ends of int64; over 0 it raises
// ZeroDivisionError naming the dividend, as the general route does; in
// the float64 audit it leaves / to the interpreter.
func TestRationalOverInt(t *testing.T) {
	e := NewEnv(1000, 0)
	rng := rand.New(rand.NewPCG(5, 9))
	xs := []*big.Rat{new(big.Rat), big.NewRat(-1, 1), big.NewRat(288, 1), big.NewRat(-576, 35),
		new(big.Rat).SetInt64(math.MinInt64), new(big.Rat).SetFrac(new(big.Int).Lsh(big.NewInt(-5), 200), big.NewInt(288))}
	for range 60 {
		num := new(big.Int).Lsh(big.NewInt(rng.Int64()), uint(rng.IntN(130)))
		xs = append(xs, new(big.Rat).SetFrac(num, big.NewInt(1+rng.Int64N(1<<40))))
	}
	ws := []int64{1, -1, 2, 288, -288, 1 << 62, math.MaxInt64, math.MinInt64, -math.MaxInt64}
	for _, x := range xs {
		for _, w := range ws {
			res, ok, err := e.Quotient(e.Rational(x), py.Int(w))
			got, isRat := res.(*Rational)
			want := new(big.Rat).Quo(x, new(big.Rat).SetInt64(w))
			if !ok || err != nil || !isRat || got.v.Cmp(want) != 0 || got.v.Denom().Cmp(want.Denom()) != 0 {
				t.Fatalf("%s / %d = %v (%v, %v), want %s", x.RatString(), w, res, ok, err, want.RatString())
			}
		}
	}
	_, ok, err := e.Quotient(e.Rational(big.NewRat(3, 4)), py.Int(0))
	if !ok || !py.IsException(py.ZeroDivisionError, err) || !strings.Contains(err.Error(), "3/4 / 0") {
		t.Errorf("3/4 / 0 gave %v, %v", ok, err)
	}
	e.Float = true
	if res, ok, err := e.Quotient(e.Rational(big.NewRat(3, 4)), py.Int(2)); ok || err != nil || res != nil {
		t.Errorf("in float64 code, 3/4 / 2 was answered: %v, %v, %v", res, ok, err)
	}
}

package exact

import (
	"errors"
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// quoWord, through Quo and QuoInt, agrees with math/big's Rat.Quo (the
// reference) on numerators of one to five words, both signs, integers
// among them, zero, and one-word divisors up to MinInt64, each result in
// lowest terms with a positive denominator; Quo takes math/big's route
// for divisors that are not one-word integers.
func TestQuoWordMatchesBig(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	divs := []int64{1, -1, 2, 288, -288, 1 << 40, math.MaxInt64, math.MinInt64}
	for range 200 {
		divs = append(divs, int64(rng.Uint64()>>uint(rng.Intn(64))))
	}
	xs := []*big.Rat{new(big.Rat), big.NewRat(1, 1), big.NewRat(-288, 1), big.NewRat(576, 7),
		new(big.Rat).SetInt64(math.MinInt64), new(big.Rat).SetFrac(new(big.Int).Lsh(big.NewInt(3), 130), big.NewInt(5))}
	for rep := range 400 {
		num := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(1+rng.Intn(320))))
		if rep%2 == 1 {
			num.Neg(num)
		}
		den := big.NewInt(1) // every fourth an integer
		if rep%4 > 1 {
			den.Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(1+rng.Intn(200))))
			den.Add(den, big.NewInt(1))
		}
		xs = append(xs, new(big.Rat).SetFrac(num, den))
	}
	for _, x := range xs {
		before := new(big.Rat).Set(x)
		for _, d := range divs {
			if d == 0 {
				continue
			}
			y := new(big.Rat).SetInt64(d)
			want := new(big.Rat).Quo(x, y)
			for route, got := range []*big.Rat{must(Quo(x, y)), must(QuoInt(x, d))} {
				if got.Cmp(want) != 0 || got.Denom().Cmp(want.Denom()) != 0 || got.Denom().Sign() <= 0 {
					t.Fatalf("route %d: %s / %d = %s, want %s", route, x.RatString(), d, got.RatString(), want.RatString())
				}
			}
		}
		if x.Cmp(before) != 0 {
			t.Fatalf("the division changed its dividend %s to %s", before.RatString(), x.RatString())
		}
	}
	for _, y := range []*big.Rat{big.NewRat(1, 2), new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), 64))} {
		if got := must(Quo(big.NewRat(3, 5), y)); got.Cmp(new(big.Rat).Quo(big.NewRat(3, 5), y)) != 0 {
			t.Errorf("3/5 / %s = %s", y.RatString(), got.RatString())
		}
	}
	if _, err := QuoInt(big.NewRat(3, 5), 0); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("QuoInt(3/5, 0) error = %v, want ErrDivisionByZero", err)
	}
}

// MulWord against math/big's product (the reference), on random
// magnitudes of 0–5 words and words at the edges (0, 1, 2^64 − 1), into
// fresh storage and in place.
func TestMulWordMatchesBig(t *testing.T) {
	rng := rand.New(rand.NewSource(21))
	for trial := 0; trial < 3000; trial++ {
		x := randomMagnitude(rng)
		m := rng.Uint64()
		if trial%3 == 0 {
			m = wordEdges[rng.Intn(len(wordEdges))]
		}
		want := new(big.Int).Mul(new(big.Int).SetBits(append([]big.Word(nil), x...)), new(big.Int).SetUint64(m))
		got := new(big.Int).SetBits(MulWord(make([]big.Word, 0, len(x)+1), x, m))
		in := append(make([]big.Word, 0, len(x)+1), x...)
		same := new(big.Int).SetBits(MulWord(in, in, m))
		if got.Cmp(want) != 0 || same.Cmp(want) != 0 {
			t.Fatalf("%v × %d: %v and in place %v, want %v", x, m, got, same, want)
		}
	}
}

// ModWord and DivWord against math/big's QuoRem (the reference), on random
// magnitudes of 0–5 words and words at the edges, into fresh storage and
// in place; DivWord's result has no leading zero word.
func TestModDivWordMatchBig(t *testing.T) {
	rng := rand.New(rand.NewSource(22))
	for trial := 0; trial < 3000; trial++ {
		x := randomMagnitude(rng)
		m := rng.Uint64() >> uint(rng.Intn(64))
		if trial%3 == 0 {
			m = wordEdges[1+rng.Intn(len(wordEdges)-1)]
		}
		if m == 0 {
			m = 1
		}
		xi := new(big.Int).SetBits(append([]big.Word(nil), x...))
		q, r := new(big.Int).QuoRem(xi, new(big.Int).SetUint64(m), new(big.Int))
		if got := ModWord(x, m); got != r.Uint64() {
			t.Fatalf("%v mod %d = %d, want %v", x, m, got, r)
		}
		got := DivWord(make([]big.Word, len(x)), x, m)
		in := append([]big.Word(nil), x...)
		same := DivWord(in, in, m)
		for _, z := range [][]big.Word{got, same} {
			if len(z) > 0 && z[len(z)-1] == 0 || new(big.Int).SetBits(z).Cmp(q) != 0 {
				t.Fatalf("%v / %d = %v, want %v", x, m, z, q)
			}
		}
	}
}

// wordEdges are the words at the edges of a word's arithmetic.
var wordEdges = []uint64{0, 1, 2, 1<<63 - 1, 1 << 63, ^uint64(0)}

// randomMagnitude returns a magnitude of 0–5 random words, about a
// quarter of them taken from wordEdges.
func randomMagnitude(rng *rand.Rand) []big.Word {
	x := make([]big.Word, rng.Intn(6))
	for i := range x {
		x[i] = big.Word(rng.Uint64())
		if rng.Intn(4) == 0 {
			x[i] = big.Word(wordEdges[rng.Intn(len(wordEdges))])
		}
	}
	return x
}

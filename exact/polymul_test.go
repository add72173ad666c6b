package exact

import (
	"errors"
	"math/rand"
	"testing"
	"time"
)

// withAlgo runs f with the multiplication strategy forced to algo.
func withAlgo(algo int, f func()) {
	old := mulAlgo
	mulAlgo = algo
	defer func() { mulAlgo = old }()
	f()
}

// TestMulStrategiesAgree multiplies random polynomials with every
// accumulation strategy and compares them with a naive big.Rat product.
func TestMulStrategiesAgree(t *testing.T) {
	rng := rand.New(rand.NewSource(1))
	r, _ := testRing(t, "a", "b", "c", "d", "e", "f")
	for trial := 0; trial < 300; trial++ {
		nv := 1 + rng.Intn(6)
		kind := rng.Intn(4)
		p := randPoly(rng, r, nv, 1+rng.Intn(15), rng.Intn(6), kind)
		q := randPoly(rng, r, 1+rng.Intn(6), 1+rng.Intn(15), rng.Intn(6), rng.Intn(4))
		if trial%7 == 0 {
			q = q.Neg().Add(p) // cancellations
		}
		want := naiveMul(r, p, q)
		for _, algo := range []int{algoAuto, algoDense, algoPlanes, algoHash, algoHeap, algoSplit} {
			withAlgo(algo, func() {
				got := mustMulP(t, p, q)
				checkCanonical(t, got)
				if !got.Equal(want) {
					t.Fatalf("algo %d: (%v) * (%v)\n got %v\nwant %v", algo, p, q, got, want)
				}
			})
		}
	}
}

// TestMulCoefficientModes checks the int64, 128-bit and big accumulators
// near their limits.
func TestMulCoefficientModes(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	for _, s := range []string{
		"9223372036854775807*x + 9223372036854775807*y + 9223372036854775807",
		"-9223372036854775808*x - 9223372036854775808*y + 9223372036854775807",
		"3037000499*x + 3037000499*y - 3037000499",
		"4611686018427387904*x^2 + 4611686018427387904*x*y - 4611686018427387904*y^2 + 1",
		"123456789012345678901234567890*x - 1/7*y + 2",
	} {
		p := mustParse(t, r, s)
		for _, algo := range []int{algoAuto, algoDense, algoPlanes, algoHash, algoHeap, algoSplit} {
			withAlgo(algo, func() {
				for _, q := range []*Poly{p, p.Neg(), mustParse(t, r, "x+y+1")} {
					got := mustMulP(t, p, q)
					checkCanonical(t, got)
					if want := naiveMul(r, p, q); !got.Equal(want) {
						t.Fatalf("algo %d: (%v)*(%v): got %v want %v", algo, p, q, got, want)
					}
				}
			})
		}
	}
}

// TestTermCap: (1+x+y+z)^60 with a cap of 1000 fails quickly.
func TestTermCap(t *testing.T) {
	r, _ := testRing(t, "x", "y", "z")
	r.SetMaxTerms(1000)
	p := mustParse(t, r, "1+x+y+z")
	start := time.Now()
	_, err := p.Pow(60)
	if !errors.Is(err, ErrTooManyTerms) {
		t.Fatalf("got %v, want ErrTooManyTerms", err)
	}
	if d := time.Since(start); d > time.Second {
		t.Errorf("took %v", d)
	}
	t.Log(err)
	_, err = r.Parse("(1+x+y+z)^60")
	if !errors.Is(err, ErrTooManyTerms) {
		t.Fatalf("parse: got %v, want ErrTooManyTerms", err)
	}
	// C(13+3, 3) = 560 terms fit; C(20+3,3) = 1771 do not.
	if q, err := p.Pow(13); err != nil || q.Len() != 560 {
		t.Fatalf("(1+x+y+z)^13: %v terms, %v", q.Len(), err)
	}
	for _, algo := range []int{algoDense, algoHash, algoHeap, algoSplit} {
		withAlgo(algo, func() {
			a := mustPow(t, p, 10)
			if _, err := a.Mul(a); !errors.Is(err, ErrTooManyTerms) {
				t.Errorf("algo %d: got %v, want ErrTooManyTerms", algo, err)
			}
		})
	}
	r.SetMaxTerms(0)
	if r.MaxTerms() != DefaultMaxTerms {
		t.Errorf("MaxTerms after reset = %d", r.MaxTerms())
	}
}

// TestMulHashRanges forces the hash accumulation to cut tiny products into
// many key ranges (down to ranges of a few products, some empty) and
// compares with the naive big.Rat product.
func TestMulHashRanges(t *testing.T) {
	saved := hashRangeWork
	defer func() { hashRangeWork = saved }()
	rng := rand.New(rand.NewSource(11))
	r, _ := testRing(t, "a", "b", "c", "d")
	for trial := 0; trial < 200; trial++ {
		hashRangeWork = 1 + rng.Intn(40)
		p := randPoly(rng, r, 1+rng.Intn(4), 1+rng.Intn(20), rng.Intn(5), rng.Intn(4))
		q := randPoly(rng, r, 1+rng.Intn(4), 1+rng.Intn(20), rng.Intn(5), rng.Intn(4))
		if trial%5 == 0 {
			q = q.Neg().Add(p) // cancellations
		}
		want := naiveMul(r, p, q)
		withAlgo(algoHash, func() {
			got := mustMulP(t, p, q)
			checkCanonical(t, got)
			if !got.Equal(want) {
				t.Fatalf("ranges of %d products: (%v) * (%v)\n got %v\nwant %v", hashRangeWork, p, q, got, want)
			}
		})
	}
}

package exact

import (
	"math"
	"math/big"
	"math/rand"
	"runtime"
	"testing"
)

// TestMulPlanes checks the dense product by planes against the naive
// big.Rat product and the heap product, with int64 and 128-bit
// accumulators, both signs, and several runs of planes joined in order.
func TestMulPlanes(t *testing.T) {
	saved, procs := planeParallelWork, runtime.GOMAXPROCS(2)
	defer func() { planeParallelWork = saved; runtime.GOMAXPROCS(procs) }()
	r, _ := testRing(t, "x", "y", "z", "t")
	f := mustPow(t, mustParse(t, r, "1+x+y+z+t"), 5) // 126 terms, planes of 11*11 keys
	rng := rand.New(rand.NewSource(7))
	for _, bitsize := range []int{3, 30, 55} {
		// Random nonzero signed coefficients below 2^bitsize on f's monomials.
		p := &Poly{ring: r, w: f.w, mono: f.mono, num: make([]int64, f.n())}
		for i := range p.num {
			p.num[i] = 1 + rng.Int63n(1<<bitsize-1)
			if rng.Intn(2) == 0 {
				p.num[i] = -p.num[i]
			}
		}
		for _, q := range []*Poly{f, p, f.Add(r.one()).Neg()} {
			want := naiveMul(r, p, q)
			for _, parallel := range []int{math.MaxInt, 1} {
				planeParallelWork = parallel
				before := planesDone.Load()
				withAlgo(algoPlanes, func() {
					got := mustMulP(t, p, q)
					checkCanonical(t, got)
					if !got.Equal(want) {
						t.Fatalf("%d bits, parallel from %d: planes product differs from the naive one", bitsize, parallel)
					}
				})
				if planesDone.Load() == before {
					t.Fatalf("%d bits: the product did not take the plane path", bitsize)
				}
			}
		}
	}
}

// TestPlaneRow128 compares the assembly kernel (on amd64) with the Go one
// on random rows, coefficients up to the int64 limits.
func TestPlaneRow128(t *testing.T) {
	rng := rand.New(rand.NewSource(8))
	for trial := 0; trial < 200; trial++ {
		const size = 64
		n := rng.Intn(40)
		lq, c := make([]uint32, n), make([]int64, n)
		var maxLq uint32
		for j := range lq {
			lq[j] = uint32(rng.Intn(size / 2))
			maxLq = max(maxLq, lq[j])
			switch rng.Intn(4) {
			case 0:
				c[j] = math.MinInt64
			case 1:
				c[j] = math.MaxInt64
			default:
				c[j] = rng.Int63() - rng.Int63()
			}
		}
		a := []int64{math.MinInt64, math.MaxInt64, -1, 1, rng.Int63() - rng.Int63()}[rng.Intn(5)]
		lp := uint32(rng.Intn(size / 2))
		got, want := make([]uint64, 2*size), make([]uint64, 2*size)
		for k := range got {
			got[k] = rng.Uint64() >> 2 // room for a few products either way
			want[k] = got[k]
		}
		planeRow128(got, lp, a, lq, c, maxLq)
		planeRow128Go(want, lp, a, lq, c)
		for k := range got {
			if got[k] != want[k] {
				t.Fatalf("trial %d: word %d: %x, want %x", trial, k, got[k], want[k])
			}
		}
	}
}

// Fateman's product f*(f+1), f = (1+x+y+z+t)^20, by planes on two cores:
// equal to the product by mulDense's chunks, and its value at random
// points modulo the prime 2^61-1 is f(a)*(f(a)+1) there (evaluation as an
// independent check, common practice).
func TestMulPlanesFateman(t *testing.T) {
	if testing.Short() {
		t.Skip("Fateman's product takes a few hundred ms")
	}
	procs := runtime.GOMAXPROCS(2)
	defer runtime.GOMAXPROCS(procs)
	f, g := fateman(t, 20)
	before := planesDone.Load()
	h := mustMulP(t, f, g)
	if planesDone.Load() == before {
		t.Fatal("Fateman's product did not take the plane path")
	}
	if h.Len() != 135751 {
		t.Fatalf("%d terms, want 135751 = C(44, 4)", h.Len())
	}
	var dense *Poly
	withAlgo(algoDense, func() { dense = mustMulP(t, f, g) })
	if !h.Equal(dense) {
		t.Fatal("planes and dense chunks disagree")
	}
	const prime = 1<<61 - 1
	rng := rand.New(rand.NewSource(9))
	for trial := 0; trial < 3; trial++ {
		pt := make([]uint64, 4)
		for i := range pt {
			pt[i] = rng.Uint64() % prime
		}
		fv := evalModPrime(f, pt, prime)
		want := new(big.Int).Mul(fv, new(big.Int).Add(fv, big.NewInt(1)))
		want.Mod(want, big.NewInt(prime))
		if got := evalModPrime(h, pt, prime); got.Cmp(want) != 0 {
			t.Fatalf("h(a) = %v, f(a)(f(a)+1) = %v mod 2^61-1", got, want)
		}
	}
}

// evalModPrime returns p(pt) mod prime for an integer polynomial p.
func evalModPrime(p *Poly, pt []uint64, prime uint64) *big.Int {
	m := new(big.Int).SetUint64(prime)
	sum, term, c := new(big.Int), new(big.Int), new(big.Int)
	for i := 0; i < p.n(); i++ {
		term.Mod(p.numAt(i, c), m)
		for v, x := range pt {
			e := big.NewInt(int64(monoExp(p.monoAt(i), v)))
			term.Mul(term, new(big.Int).Exp(new(big.Int).SetUint64(x), e, m))
		}
		sum.Add(sum, term).Mod(sum, m)
	}
	return sum
}

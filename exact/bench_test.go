package exact

import (
	"fmt"
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// randomRatMatrix returns an n x n matrix of rationals num/den with num a
// random int64 and den a random positive int64, from a fixed seed.
func randomRatMatrix(n int, seed int64) *Matrix {
	r := rand.New(rand.NewSource(seed))
	m := Zeros(n, n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			num := int64(r.Uint64())
			den := r.Int63n(math.MaxInt64) + 1
			m.Set(i, j, big.NewRat(num, den))
		}
	}
	return m
}

// randomIntMatrix returns an n x n matrix of random integers in [-k, k].
func randomIntMatrix(n int, seed, k int64) *Matrix {
	r := rand.New(rand.NewSource(seed))
	m := Zeros(n, n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			m.Set(i, j, big.NewRat(r.Int63n(2*k+1)-k, 1))
		}
	}
	return m
}

func benchDet(b *testing.B, n int) {
	m := randomRatMatrix(n, 1)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := m.Det(); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDet4(b *testing.B)  { benchDet(b, 4) }
func BenchmarkDet8(b *testing.B)  { benchDet(b, 8) }
func BenchmarkDet16(b *testing.B) { benchDet(b, 16) }

// BenchmarkDetMethods compares the candidate algorithms behind Det; the
// figures are recorded at the top of det.go.
func BenchmarkDetMethods(b *testing.B) {
	methods := []struct {
		name string
		f    func(*Matrix) *big.Rat
	}{
		{"bareiss", (*Matrix).detBareiss},
		{"modular", func(m *Matrix) *big.Rat { return m.detModular(clearAuto) }},
		{"gaussrat", (*Matrix).detGaussRat},
	}
	for _, n := range []int{3, 4, 5, 6, 7, 8, 12, 16, 24} {
		m := randomRatMatrix(n, 1)
		for _, meth := range methods {
			b.Run(fmt.Sprintf("n=%d/%s", n, meth.name), func(b *testing.B) {
				for i := 0; i < b.N; i++ {
					meth.f(m)
				}
			})
		}
	}
	// Small integers, the common case in notebooks.
	for _, n := range []int{3, 4, 6, 8, 12, 16, 24} {
		m := randomIntMatrix(n, 1, 100)
		for _, meth := range methods {
			b.Run(fmt.Sprintf("int/n=%d/%s", n, meth.name), func(b *testing.B) {
				for i := 0; i < b.N; i++ {
					meth.f(m)
				}
			})
		}
	}
}

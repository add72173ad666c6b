package exact

import (
	"math/big"
	"math/rand"
	"testing"
)

// q parses an exact rational or panics (test helper).
func q(s string) *big.Rat {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		panic("bad rational " + s)
	}
	return r
}

// mustMatrix builds a matrix from rows of rational literals.
func mustMatrix(t testing.TB, rows ...[]string) *Matrix {
	t.Helper()
	rs := make([][]*big.Rat, len(rows))
	for i, row := range rows {
		for _, s := range row {
			rs[i] = append(rs[i], q(s))
		}
	}
	m, err := NewMatrix(rs)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// hilbert returns H_n, entries 1/(i+j-1) with 1-based i, j.
func hilbert(n int) *Matrix {
	m := Zeros(n, n)
	for i := 1; i <= n; i++ {
		for j := 1; j <= n; j++ {
			m.Set(i-1, j-1, big.NewRat(1, int64(i+j-1)))
		}
	}
	return m
}

// randomSmallRat returns a random rational with numerator in [-k, k] and
// denominator in [1, k].
func randomSmallRat(r *rand.Rand, k int64) *big.Rat {
	return big.NewRat(r.Int63n(2*k+1)-k, r.Int63n(k)+1)
}

// randomMatrix returns an r x c matrix of randomSmallRat entries.
func randomMatrix(rng *rand.Rand, r, c int, k int64) *Matrix {
	m := Zeros(r, c)
	for i := 0; i < r; i++ {
		for j := 0; j < c; j++ {
			m.Set(i, j, randomSmallRat(rng, k))
		}
	}
	return m
}

func mustMul(t testing.TB, a, b *Matrix) *Matrix {
	t.Helper()
	p, err := a.Mul(b)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

func mustDet(t testing.TB, m *Matrix) *big.Rat {
	t.Helper()
	d, err := m.Det()
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// binom returns C(n, k) (0 when k < 0 or k > n).
func binom(n, k int64) *big.Int {
	if k < 0 || k > n {
		return new(big.Int)
	}
	return new(big.Int).Binomial(n, k)
}

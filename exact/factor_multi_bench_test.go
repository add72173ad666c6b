package exact

import (
	"fmt"
	"math/big"
	"math/rand"
	"strings"
	"testing"
	"time"
)

// denseFactor returns a random polynomial in the first nv variables of r
// with every monomial of total degree up to deg, coefficients in
// [−9, 9] (nonzero).
func denseFactor(r *Ring, rng *rand.Rand, nv, deg int) *Poly {
	p := r.zero()
	var rec func(v, left int, e []int)
	rec = func(v, left int, e []int) {
		if v == nv {
			c := rng.Int63n(18) - 9
			if c >= 0 {
				c++
			}
			p = p.Add(monomialOf(r, e, big.NewRat(c, 1)))
			return
		}
		for k := 0; k <= left; k++ {
			e[v] = k
			rec(v+1, left-k, e)
		}
		e[v] = 0
	}
	rec(0, deg, make([]int, r.numVars()))
	return p
}

// fiveDenseTrivariate is the product of five random dense trivariate
// factors of total degree 6, expanded.
func fiveDenseTrivariate(tb testing.TB) (*Poly, []*Poly) {
	r, _ := testRing(tb, "x", "y", "z")
	rng := rand.New(rand.NewSource(16))
	p := r.one()
	var fs []*Poly
	for i := 0; i < 5; i++ {
		f := denseFactor(r, rng, 3, 6)
		fs = append(fs, f)
		p = mustMulP(tb, p, f)
	}
	return p, fs
}

// BenchmarkFactorFiveDenseTrivariate factors a product of five random
// dense trivariate factors of total degree 6 (5456 terms).
func BenchmarkFactorFiveDenseTrivariate(b *testing.B) {
	p, _ := fiveDenseTrivariate(b)
	for i := 0; i < b.N; i++ {
		f, err := p.Factor()
		if err != nil || len(f.Factors) != 5 {
			b.Fatal(f, err)
		}
	}
}

// BenchmarkFactorClassical factors Heron's 16·Area² in the three sides
// (four linear factors), the 5×5 Vandermonde determinant (ten) and the
// 4×4 circulant determinant (three factors).
func BenchmarkFactorClassical(b *testing.B) {
	r, v := testRing(b, "a", "b", "c", "d", "e")
	for _, c := range []struct {
		name string
		p    *Poly
		n    int
	}{
		{"heron", heron(b, r), 4},
		{"vandermonde5", mustPolyDet(b, vandermonde(b, r, v)), 10},
		{"circulant4", mustPolyDet(b, circulant(b, r, v[:4])), 3},
	} {
		b.Run(c.name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				f, err := c.p.Factor()
				if err != nil || len(f.Factors) != c.n {
					b.Fatal(f, err)
				}
			}
		})
	}
}

// BenchmarkFactorStagesFiveDense reports the time spent in each stage of
// factoring the five dense trivariate factors' product, as ms/op per
// stage (the stage names of FactorStages, without their step counts).
func BenchmarkFactorStagesFiveDense(b *testing.B) {
	p, _ := fiveDenseTrivariate(b)
	spent := map[string]time.Duration{}
	for i := 0; i < b.N; i++ {
		cur, since := "", time.Now()
		_, err := p.FactorStages(func(s string) {
			if k := strings.Index(s, " ("); k >= 0 {
				s = s[:k]
			}
			if s == cur {
				return
			}
			now := time.Now()
			spent[cur] += now.Sub(since)
			cur, since = s, now
		})
		if err != nil {
			b.Fatal(err)
		}
	}
	for s, d := range spent {
		if s != "" {
			b.ReportMetric(float64(d.Microseconds())/1000/float64(b.N), strings.ReplaceAll(s, " ", "_")+"_ms/op")
		}
	}
}

// BenchmarkFactorDenseLeadingCoefficients factors products of two to
// five random dense trivariate factors of total degree 6 without the pure
// powers x⁶, y⁶, z⁶, so that no variable has a constant leading
// coefficient: the price of imposing L on every factor (L^(r−1)·P is
// lifted) instead of Wang's predetermination.
func BenchmarkFactorDenseLeadingCoefficients(b *testing.B) {
	r, _ := testRing(b, "x", "y", "z")
	rng := rand.New(rand.NewSource(3))
	p := r.one()
	for n := 1; n <= 5; n++ {
		f := denseFactor(r, rng, 3, 6)
		for v := 0; v < 3; v++ {
			f = f.Sub(f.coeffIn(v, 6).mulVarPow(v, 6))
		}
		p = mustMulP(b, p, f)
		if n < 2 {
			continue
		}
		b.Run(fmt.Sprint(n, "factors"), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				f, err := p.Factor()
				if err != nil || len(f.Factors) != n {
					b.Fatal(f, err)
				}
			}
		})
	}
}

package exact

import (
	"fmt"
	"math/big"
	"strings"
	"testing"
)

// telescoping returns Σ_{k=1}^{n} 1/((x + k)(x + k + 1)) summed term by
// term, each sum sharing the factor x + k with the partial sum before it.
func telescoping(tb testing.TB, n int) (*Ring, *RatFunc) {
	r, _ := testRing(tb, "x")
	s := RatFuncOf(r.zero())
	for k := 1; k <= n; k++ {
		f, err := NewRatFunc(r.one(), mustParse(tb, r, fmt.Sprintf("(x + %d)*(x + %d)", k, k+1)))
		if err != nil {
			tb.Fatal(err)
		}
		if s, err = s.Add(f); err != nil {
			tb.Fatal(err)
		}
	}
	return r, s
}

// The telescoping sum (textbook): 1/((x+k)(x+k+1)) = 1/(x+k) − 1/(x+k+1),
// so the sum for k = 1..n is 1/(x+1) − 1/(x+n+1) = n/((x+1)(x+n+1)).
func TestRatFuncTelescoping(t *testing.T) {
	for _, n := range []int{1, 7, 40} {
		r, s := telescoping(t, n)
		want := rf(t, r, fmt.Sprint(n), fmt.Sprintf("(x + 1)*(x + %d)", n+1))
		if !s.Equal(want) {
			t.Errorf("n = %d: sum = %s, want %s", n, s, want)
		}
	}
}

// BenchmarkRatFuncSum: sums of many terms. "telescoping" shares a factor
// with every partial sum (Henrici's second gcd at work); "harmonic" adds
// 1/(x + k) with coprime denominators, so the denominator grows to degree
// n; "bivariate" adds 1/(x + k·y) in two variables.
func BenchmarkRatFuncSum(b *testing.B) {
	b.Run("telescoping-200", func(b *testing.B) {
		for b.Loop() {
			telescoping(b, 200)
		}
	})
	for _, c := range []struct {
		name, vars, term string
		n                int
	}{{"harmonic-40", "x", "x + %d", 40}, {"bivariate-20", "x y", "x + %d*y", 20}} {
		b.Run(c.name, func(b *testing.B) {
			r := NewRing()
			var terms []*RatFunc
			for _, v := range strings.Fields(c.vars) {
				r.Var(v)
			}
			for k := 1; k <= c.n; k++ {
				f, err := NewRatFunc(r.Const(big.NewRat(1, 1)), mustParse(b, r, fmt.Sprintf(c.term, k)))
				if err != nil {
					b.Fatal(err)
				}
				terms = append(terms, f)
			}
			for b.Loop() {
				s := RatFuncOf(r.zero())
				for _, f := range terms {
					var err error
					if s, err = s.Add(f); err != nil {
						b.Fatal(err)
					}
				}
			}
		})
	}
}

// BenchmarkRatFuncCauchyDet: det[1/(x_i + y_j)] for n = 3, 4, in lowest terms.
func BenchmarkRatFuncCauchyDet(b *testing.B) {
	for _, n := range []int{3, 4} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			_, m := cauchyMatrix(b, n)
			for b.Loop() {
				if _, err := m.Det(); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkRatFuncInverse: the inverse of the 3x3 Cauchy matrix.
func BenchmarkRatFuncInverse(b *testing.B) {
	_, m := cauchyMatrix(b, 3)
	for b.Loop() {
		if _, err := m.Inverse(); err != nil {
			b.Fatal(err)
		}
	}
}

package exact

import (
	"math/big"
	"testing"
)

// BenchmarkRealRootsChebyshev50 isolates the 50 real roots of the
// Chebyshev polynomial T_50, cos((2k−1)π/100) (standard), through
// factorization, isolation and ordering.
func BenchmarkRealRootsChebyshev50(b *testing.B) {
	t1 := chebyshevT(50)
	for b.Loop() {
		rs, err := RealRoots(t1, DefaultMaxPrecision)
		if err != nil || len(rs) != 50 {
			b.Fatalf("%d roots, %v", len(rs), err)
		}
	}
}

// BenchmarkSolveTwoConics solves x² + 4y² = 4, 4x² + y² = 4 (four real
// points, needing the change of coordinates).
func BenchmarkSolveTwoConics(b *testing.B) {
	r := NewRing()
	r.Var("x")
	r.Var("y")
	p, _ := r.Parse("x^2 + 4*y^2 - 4")
	q, _ := r.Parse("4*x^2 + y^2 - 4")
	for b.Loop() {
		s, err := Solve([]*Poly{p, q}, GroebnerLimits{}, DefaultMaxPrecision)
		if err != nil || len(s.Points) != 4 {
			b.Fatal(err)
		}
	}
}

// The roots of T_10 are cos((2k−1)π/20), k = 10 … 1 in increasing order
// (standard: T_n(cos θ) = cos nθ).
func TestRealRootsChebyshev10(t *testing.T) {
	t1 := chebyshevT(10)
	rs, err := RealRoots(t1, DefaultMaxPrecision)
	if err != nil || len(rs) != 10 {
		t.Fatalf("%d roots, %v", len(rs), err)
	}
	tol := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(40), nil))
	for i, k := 0, 10; k >= 1; i, k = i+1, k-1 {
		c := RealCos(RealQuo(RealMul(RealFromInt(int64(2*k-1)), Pi()), RealFromInt(20)))
		d, err := RealSub(rs[i], c).Enclose(200)
		if err != nil || d.Lo.Cmp(new(big.Rat).Neg(tol)) < 0 || d.Hi.Cmp(tol) > 0 {
			t.Errorf("root %d against cos(%dπ/20): %v, %v", i, 2*k-1, d, err)
		}
	}
}

// chebyshevT returns T_n by T_{k+1} = 2x·T_k − T_{k−1}.
func chebyshevT(n int) *Poly {
	r := NewRing()
	x, _ := r.Var("x")
	t0, t1 := r.Const(big.NewRat(1, 1)), x
	for range n - 1 {
		m, _ := x.Mul(t1)
		t0, t1 = t1, m.Scale(big.NewRat(2, 1)).Sub(t0)
	}
	return t1
}

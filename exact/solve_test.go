package exact

import (
	"errors"
	"fmt"
	"math/big"
	"strings"
	"testing"
)

func solveStrings(t *testing.T, vars string, eqs ...string) (*Ring, *Solutions, error) {
	t.Helper()
	r := NewRing()
	for _, v := range strings.Fields(vars) {
		if _, err := r.Var(v); err != nil {
			t.Fatal(err)
		}
	}
	var ps []*Poly
	for _, e := range eqs {
		p, err := r.Parse(e)
		if err != nil {
			t.Fatal(err)
		}
		ps = append(ps, p)
	}
	s, err := Solve(ps, GroebnerLimits{}, DefaultMaxPrecision)
	return r, s, err
}

// provedEqual reports whether x = y is proved by the zero bound.
func provedEqual(x, y *Real) bool {
	s, err := RealSub(x, y).Sign(DefaultMaxPrecision)
	return err == nil && s == 0
}

func TestSolveCircleLine(t *testing.T) {
	// x² + y² = 1, y = x: (±√2/2, ±√2/2), same signs (by hand).
	_, s, err := solveStrings(t, "x y", "x^2 + y^2 - 1", "y - x")
	if err != nil {
		t.Fatal(err)
	}
	h := RealQuo(RealSqrt(RealFromInt(2)), RealFromInt(2))
	want := [][]*Real{{RealNeg(h), RealNeg(h)}, {h, h}}
	if s.Complex != 2 || s.Distinct != 2 || len(s.Points) != 2 {
		t.Fatalf("count %d/%d, %d points", s.Complex, s.Distinct, len(s.Points))
	}
	for i, w := range want {
		for j := range w {
			if !provedEqual(s.Points[i][j], w[j]) {
				t.Errorf("point %d coordinate %d: %v", i, j, s.Points[i][j])
			}
		}
	}
}

func TestSolveTwoConics(t *testing.T) {
	// x² + 4y² = 4 and 4x² + y² = 4 meet where 5x² = 4 = 5y²:
	// (±2/√5, ±2/√5), all four sign choices (by hand). Neither x nor y
	// separates the points, so this needs the change of coordinates.
	_, s, err := solveStrings(t, "x y", "x^2 + 4*y^2 - 4", "4*x^2 + y^2 - 4")
	if err != nil {
		t.Fatal(err)
	}
	if s.Complex != 4 || s.Distinct != 4 || len(s.Points) != 4 {
		t.Fatalf("count %d/%d, %d points", s.Complex, s.Distinct, len(s.Points))
	}
	c := RealQuo(RealFromInt(2), RealSqrt(RealFromInt(5)))
	seen := map[string]bool{}
	for _, p := range s.Points {
		key := ""
		for _, x := range p {
			switch {
			case provedEqual(x, c):
				key += "+"
			case provedEqual(x, RealNeg(c)):
				key += "-"
			default:
				t.Errorf("coordinate %v is not ±2/√5", x)
			}
		}
		seen[key] = true
	}
	if len(seen) != 4 {
		t.Errorf("sign patterns %v", seen)
	}
}

func TestSolveDoubleRoot(t *testing.T) {
	// y = x², y = 0: the origin, a tangency, of multiplicity 2 (by hand:
	// Q[x, y]/⟨y, x²⟩ has the basis 1, x).
	_, s, err := solveStrings(t, "x y", "y - x^2", "y")
	if err != nil {
		t.Fatal(err)
	}
	if s.Complex != 2 || s.Distinct != 1 || len(s.Points) != 1 {
		t.Fatalf("count %d/%d, %d points", s.Complex, s.Distinct, len(s.Points))
	}
	for _, x := range s.Points[0] {
		if q, ok := x.Rat(); !ok || q.Sign() != 0 {
			t.Errorf("coordinate %v, want 0", x)
		}
	}
	// x² = 2 with y² = 2y − 1 (y = 1 twice): (±√2, 1), 4 with multiplicity.
	_, s, err = solveStrings(t, "x y", "x^2 - 2", "y^2 - 2*y + 1")
	if err != nil {
		t.Fatal(err)
	}
	if s.Complex != 4 || s.Distinct != 2 || len(s.Points) != 2 {
		t.Fatalf("count %d/%d, %d points", s.Complex, s.Distinct, len(s.Points))
	}
	if !provedEqual(s.Points[1][0], RealSqrt(RealFromInt(2))) || !provedEqual(s.Points[1][1], RealFromInt(1)) {
		t.Errorf("point %v", s.Points[1])
	}
}

// Cyclic-5 has 70 complex solutions, counted with multiplicity (Björck and
// Fröberg, "A faster way to count the solutions of inhomogeneous systems of
// algebraic equations", J. Symbolic Comput. 12, 1991).
func TestSolveCyclic5Count(t *testing.T) {
	r := NewRing()
	ps := cyclicSystem(t, r, 5)
	g, err := Groebner(ps, Grevlex, GroebnerLimits{})
	if err != nil {
		t.Fatal(err)
	}
	leads, err := leadVarExps(g, Grevlex)
	if err != nil {
		t.Fatal(err)
	}
	n, err := countStandard(leads, len(leads[0]))
	if err != nil || n != 70 {
		t.Errorf("cyclic-5: %d standard monomials, %v; want 70", n, err)
	}
}

func cyclicSystem(t testing.TB, r *Ring, n int) []*Poly {
	x := make([]*Poly, n)
	for i := range x {
		x[i], _ = r.Var(fmt.Sprintf("x%d", i))
	}
	var ps []*Poly
	for k := 1; k <= n; k++ {
		s := r.Const(nil)
		for i := 0; i < n; i++ {
			m := r.Const(big.NewRat(1, 1))
			for j := 0; j < k; j++ {
				var err error
				if m, err = m.Mul(x[(i+j)%n]); err != nil {
					t.Fatal(err)
				}
			}
			s = s.Add(m)
		}
		if k == n {
			s = s.Sub(r.Const(big.NewRat(1, 1)))
		}
		ps = append(ps, s)
	}
	return ps
}

func TestSolveDegenerate(t *testing.T) {
	// A circle alone: dimension 1.
	_, _, err := solveStrings(t, "x y", "x^2 + y^2 - 1")
	if !errors.Is(err, ErrPositiveDimension) || !strings.Contains(err.Error(), "dimension 1") {
		t.Errorf("circle: %v", err)
	}
	// Two disjoint circles' equations made inconsistent: x = 0 and x = 1.
	_, s, err := solveStrings(t, "x y", "x", "x - 1", "y")
	if err != nil || len(s.Points) != 0 || s.Complex != 0 {
		t.Errorf("inconsistent: %v, %v", s, err)
	}
	// x² + 1 = 0, y = 1: two complex solutions, no real one.
	_, s, err = solveStrings(t, "x y", "x^2 + 1", "y - 1")
	if err != nil || len(s.Points) != 0 || s.Complex != 2 {
		t.Errorf("complex only: %v, %v", s, err)
	}
}

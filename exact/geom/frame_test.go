package geom

import (
	"math/big"
	"testing"

	"assay/exact"
)

// The canonical frame reproduces the Gram matrix exactly, is lower
// triangular, and its pivots multiply to det G (the squared volume times
// (k!)²), for random simplices and degenerate ones.
func TestFrameFactorsGram(t *testing.T) {
	cases := []*Simplex{Random(3, 7, 10, 3), Random(5, 11, 10, 1), Random(1, 3, 10, 1)}
	// Degenerate tetrahedra: the fourth vertex in the plane of the others,
	// and three collinear vertices first (a zero pivot before the last).
	cases = append(cases, mustPoints(t, vec(0, 0, 0), vec(1, 0, 0), vec(0, 1, 0), vec(2, 3, 0)),
		mustPoints(t, vec(0, 0, 0), vec(1, 0, 0), vec(2, 0, 0), vec(0, 1, 0)))
	for n, s := range cases {
		rows, d := s.Frame()
		k := s.Dim()
		g := s.Gram()
		prod := big.NewRat(1, 1)
		for j := range d {
			prod.Mul(prod, d[j])
			if d[j].Sign() < 0 {
				t.Errorf("case %d: pivot %d = %v < 0", n, j, d[j])
			}
		}
		f := new(big.Rat).SetInt(factorial(k))
		want := new(big.Rat).Mul(s.VolumeSq(), f)
		if want.Mul(want, f); prod.Cmp(want) != 0 {
			t.Errorf("case %d: pivots multiply to %v, want det G = %v", n, prod, want)
		}
		for i := 0; i < k; i++ {
			for j := 0; j < k; j++ {
				if j > i && rows[i][j].Sign() != 0 {
					t.Errorf("case %d: L[%d][%d] = %v above the diagonal", n, i, j, rows[i][j])
				}
				x := new(big.Rat)
				for m := 0; m < k; m++ {
					x.Add(x, new(big.Rat).Mul(new(big.Rat).Mul(rows[i][m], rows[j][m]), d[m]))
				}
				if x.Cmp(g.At(i, j)) != 0 {
					t.Errorf("case %d: (L D Lᵀ)[%d][%d] = %v, Gram %v", n, i, j, x, g.At(i, j))
				}
			}
		}
	}
}

// The regular simplex of unit edge: pivots d_j = (j+2)/(2(j+1)), the
// squared heights of the regular j+1-simplices (h_n² = (n+1)/(2n), a
// standard formula; from memory), so vertex 1 is at (1, 0, …) and vertex 2
// at (1/2, √3/2, 0, …).
func TestFrameRegularSimplex(t *testing.T) {
	const k = 6
	d := exact.Zeros(k+1, k+1)
	for i := 0; i <= k; i++ {
		for j := 0; j <= k; j++ {
			if i != j {
				d.Set(i, j, big.NewRat(1, 1))
			}
		}
	}
	s, err := FromSquaredDistances(d)
	if err != nil {
		t.Fatal(err)
	}
	rows, scales := s.Frame()
	for j, x := range scales {
		if want := big.NewRat(int64(j+2), int64(2*(j+1))); x.Cmp(want) != 0 {
			t.Errorf("d_%d = %v, want %v", j, x, want)
		}
	}
	if rows[1][0].Cmp(big.NewRat(1, 2)) != 0 {
		t.Errorf("vertex 2's first coordinate %v, want 1/2", rows[1][0])
	}
}

// The feet of the perpendiculars from the vertices: the altitude foot from
// the right angle of the 3-4-5 triangle lies on the hypotenuse at
// (36/25, 48/25) (the altitude to the hypotenuse, length 12/5; common
// practice), and every foot is on its facet (barycentric coordinate 0) at
// the facet's height (h_i² = k²V²/F_i²).
func TestFootRatios(t *testing.T) {
	s := mustPoints(t, vec(0, 0), vec(4, 0), vec(0, 3))
	c, err := s.FootRatios(0)
	if err != nil {
		t.Fatal(err)
	}
	// Foot from vertex 0: λ(v0) = (1, 0, 0), so weights (1 − c_0, −c_1, −c_2).
	w := []*big.Rat{new(big.Rat).Sub(qi(1), c[0]), new(big.Rat).Neg(c[1]), new(big.Rat).Neg(c[2])}
	foot := s.combine(w)
	if foot[0].Cmp(q("36/25")) != 0 || foot[1].Cmp(q("48/25")) != 0 {
		t.Errorf("foot of the altitude at %v, want (36/25, 48/25)", fmtVec(foot))
	}
	r := Random(4, 9, 10, 1)
	F := r.FacetContentsSq()
	V := r.VolumeSq()
	for i := 0; i <= 4; i++ {
		c, err := r.FootRatios(i)
		if err != nil {
			t.Fatal(err)
		}
		sum := new(big.Rat)
		for _, x := range c {
			sum.Add(sum, x)
		}
		n := r.combine(c) // Σ c_m v_m: the normal of length h_i
		h2 := new(big.Rat)
		for _, x := range n {
			h2.Add(h2, new(big.Rat).Mul(x, x))
		}
		want := new(big.Rat).Quo(new(big.Rat).Mul(qi(16), V), F[i])
		if sum.Sign() != 0 || h2.Cmp(want) != 0 || c[i].Cmp(qi(1)) != 0 {
			t.Errorf("facet %d: coefficients sum to %v, |n|² = %v, want h² = %v", i, sum, h2, want)
		}
	}
}

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

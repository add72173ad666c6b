package geom

import (
	"fmt"
	"math/big"

	"assay/exact"
)

// Frame gives the canonical embedding of the simplex, the one a simplex
// from squared distances is given coordinates by: vertex 0 at the origin,
// vertex 1 on the first axis, vertex 2 in the plane of the first two, and
// so on, each new vertex on the positive side of the new axis. It is the
// LDLᵀ factorisation of the Gram matrix G = L·diag(d)·Lᵀ, L unit lower
// triangular, the rational form of Cholesky's G = C·Cᵀ with C = L·diag(√d):
// vertex i (1..k) has coordinate L_ij·√d_j on axis j (0-based j < i,
// L_ii = 1, zero beyond). rows[i-1][j] is L_ij and scales[j] is d_j ≥ 0,
// the ratio of the squared volumes det G_(j+1)/det G_j of consecutive
// leading Gram minors — rationals, so every coordinate is a rational times
// the square root of a rational, the same root on each axis.
//
// Why this form and not coordinates as general certified reals: every
// metric quantity (volumes, facet contents, radii, dihedral angles, the
// barycentric coordinates of the circumcentre) is rational or the square
// root of a rational computed from G alone, as before; the coordinates are
// needed only to place points, and a point made from them is a sum of at
// most k + 1 distinct square roots of rationals per coordinate, whose zero
// bound stays small (degree at most 2^k on an axis set), so equalities
// between such points are proved quickly.
//
// A zero pivot d_j (a degenerate simplex) leaves axis j unused: in a
// positive semidefinite G the rest of column j is then zero too, so the
// factorisation goes on (L_ij = 0 below it).
func (s *Simplex) Frame() (rows [][]*big.Rat, scales []*big.Rat) {
	k := s.k
	g := s.Gram()
	rows = make([][]*big.Rat, k)
	scales = make([]*big.Rat, k)
	for i := range rows {
		rows[i] = make([]*big.Rat, k)
		for j := range rows[i] {
			rows[i][j] = new(big.Rat)
		}
		rows[i][i].SetInt64(1)
	}
	var t big.Rat
	for j := 0; j < k; j++ {
		// d_j = G_jj − Σ_{m<j} L_jm² d_m
		d := g.At(j, j)
		for m := 0; m < j; m++ {
			t.Mul(rows[j][m], rows[j][m])
			d.Sub(d, t.Mul(&t, scales[m]))
		}
		scales[j] = d
		if d.Sign() == 0 {
			continue
		}
		for i := j + 1; i < k; i++ {
			// L_ij = (G_ij − Σ_{m<j} L_im L_jm d_m) / d_j
			x := g.At(i, j)
			for m := 0; m < j; m++ {
				t.Mul(rows[i][m], rows[j][m])
				x.Sub(x, t.Mul(&t, scales[m]))
			}
			rows[i][j] = x.Quo(x, d)
		}
	}
	return rows, scales
}

// FootRatios returns, for the facet opposite vertex i, the coefficients
// c_m = Q_im/Q_ii (m = 0..k), where Q_ij = ∇λ_i·∇λ_j for the barycentric
// coordinate functions λ (see DihedralCosSq). Since ∇λ_i = Σ_m Q_im v_m,
// the vector Σ_m c_m v_m is ∇λ_i/|∇λ_i|², the inward normal of the facet
// whose length is the height h_i over it (|∇λ_i| = 1/h_i), and its
// coefficients sum to 0. The foot of the perpendicular from a point X with
// barycentric coordinates λ_m(X) to the facet's hyperplane is therefore the
// point with barycentric coordinates λ_m(X) − λ_i(X)·c_m: all rational when
// X's are. It needs a non-degenerate simplex with k >= 1 (ErrDegenerate,
// exact.ErrShape).
func (s *Simplex) FootRatios(i int) ([]*big.Rat, error) {
	if s.k < 1 {
		return nil, fmt.Errorf("foot of a perpendicular: a point has no facets: %w", exact.ErrShape)
	}
	if err := s.checkVertex("foot of a perpendicular", i); err != nil {
		return nil, err
	}
	c := s.core()
	if c.det.Sign() == 0 {
		return nil, fmt.Errorf("foot of a perpendicular: %w (squared volume 0)", ErrDegenerate)
	}
	q := s.gradients()
	out := make([]*big.Rat, s.k+1)
	for m := range out {
		if m == i {
			out[m] = big.NewRat(1, 1)
			continue
		}
		out[m] = ratFrac(q[i][m], q[i][i])
	}
	return out, nil
}

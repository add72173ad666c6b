package geom

import (
	"errors"
	"fmt"
	"math/big"

	"assay/exact"
)

// This file holds the rest of a simplex's elementary geometry, exactly:
// centroid, containment, altitudes and facet normals, angles at a vertex,
// the ingredients of the solid angle, and the rational parts of the
// standard mesh-quality measures. Quantities that need a square root are
// returned as rational squares (with a sign where one is needed), as in
// measure.go; the kernel composes certified reals from them.

// Centroid returns (1/(k+1)) Σ v_i. It needs a simplex built from points
// (else exact.ErrShape).
func (s *Simplex) Centroid() ([]*big.Rat, error) {
	if s.pts == nil {
		return nil, errNoPoints("centroid")
	}
	w := make([]*big.Rat, s.k+1)
	for i := range w {
		w[i] = big.NewRat(1, int64(s.k+1))
	}
	return s.combine(w), nil
}

// Contains reports whether p lies in the closed simplex: in its affine
// hull with every barycentric coordinate >= 0, so the boundary counts as
// inside. A point outside the affine hull of a simplex that is not
// full-dimensional is not contained (false, no error). It needs what
// Barycentric needs: a simplex from points, not degenerate, and p of the
// points' length.
func (s *Simplex) Contains(p []*big.Rat) (bool, error) {
	lam, err := s.Barycentric(p)
	if errors.Is(err, ErrNotInAffineHull) {
		return false, nil
	}
	if err != nil {
		return false, err
	}
	for _, l := range lam {
		if l.Sign() < 0 {
			return false, nil
		}
	}
	return true, nil
}

// AltitudeSq returns the squared height of vertex i over the hyperplane of
// the facet opposite it (within the affine hull): h_i² = k²V²/F_i², from
// V = F_i·h_i/k. It needs k >= 1 and i in range (exact.ErrShape) and a
// facet of non-zero content (ErrDegenerate); a degenerate simplex with a
// non-degenerate facet has altitude 0 there.
func (s *Simplex) AltitudeSq(i int) (*big.Rat, error) {
	if s.k < 1 {
		return nil, fmt.Errorf("altitude: a point has no facets: %w", exact.ErrShape)
	}
	if err := s.checkVertex("altitude", i); err != nil {
		return nil, err
	}
	f := s.FacetContentsSq()[i]
	if f.Sign() == 0 {
		return nil, fmt.Errorf("altitude: %w (the facet opposite vertex %d has content 0)", ErrDegenerate, i)
	}
	h := new(big.Rat).Mul(s.VolumeSq(), big.NewRat(int64(s.k*s.k), 1))
	return h.Quo(h, f), nil
}

// FacetNormal returns the outward normal of the facet opposite vertex i,
// unnormalised, and its squared length: the vector from vertex i to the
// foot of its altitude, foot_i − v_i = −Σ_m c_m v_m with c from
// FootRatios, whose squared length is AltitudeSq(i). It lies in the
// affine hull's direction space, is orthogonal to the facet and points
// away from vertex i. It needs a simplex from points (exact.ErrShape),
// k >= 1 and a non-degenerate simplex (ErrDegenerate).
func (s *Simplex) FacetNormal(i int) (normal []*big.Rat, lengthSq *big.Rat, err error) {
	if s.pts == nil {
		return nil, nil, errNoPoints("facet normal")
	}
	c, err := s.FootRatios(i)
	if err != nil {
		return nil, nil, err
	}
	for _, x := range c {
		x.Neg(x)
	}
	h, err := s.AltitudeSq(i)
	if err != nil {
		return nil, nil, err
	}
	return s.combine(c), h, nil
}

// VertexCosSq returns the square and the sign (−1, 0, +1) of the cosine of
// the angle at vertex i between the edges to vertices j and m:
// cos = e_j·e_m/(|e_j| |e_m|) with e_j·e_m = (d_ij + d_im − d_jm)/2 from
// the squared distances. The three indices must be in range and distinct
// (exact.ErrShape), and neither edge may have length 0 (ErrDegenerate).
func (s *Simplex) VertexCosSq(i, j, m int) (cos2 *big.Rat, sign int, err error) {
	for _, v := range []int{i, j, m} {
		if err := s.checkVertex("vertex angle", v); err != nil {
			return nil, 0, err
		}
	}
	if i == j || i == m || j == m {
		return nil, 0, fmt.Errorf("vertex angle: the vertices must differ, got (%d, %d, %d): %w", i, j, m, exact.ErrShape)
	}
	dj, dm := s.SqEdge(i, j), s.SqEdge(i, m)
	if dj.Sign() == 0 || dm.Sign() == 0 {
		return nil, 0, fmt.Errorf("vertex angle: %w (vertex %d coincides with vertex %d or %d)", ErrDegenerate, i, j, m)
	}
	dot := s.edgeDot(i, j, m)
	cos2 = new(big.Rat).Mul(dot, dot)
	cos2.Quo(cos2, dj)
	return cos2.Quo(cos2, dm), dot.Sign(), nil
}

// edgeDot returns (v_j − v_i)·(v_m − v_i) = (d_ij + d_im − d_jm)/2.
func (s *Simplex) edgeDot(i, j, m int) *big.Rat {
	z := new(big.Rat).Add(s.SqEdge(i, j), s.SqEdge(i, m))
	z.Sub(z, s.SqEdge(j, m))
	return z.Quo(z, big.NewRat(2, 1))
}

// SolidAngleTerms returns the rational ingredients of the solid angle Ω at
// vertex i of a tetrahedron, for the formula of van Oosterom and Strackee
// (A. van Oosterom, J. Strackee, "The solid angle of a plane triangle",
// IEEE Trans. Biomed. Eng. 30 (1983) 125–126): with a, b, c the edge
// vectors from vertex i to the other three vertices in increasing order,
//
//	tan(Ω/2) = |a·(b×c)| / (|a||b||c| + (a·b)|c| + (a·c)|b| + (b·c)|a|),
//
// tripleSq = (a·(b×c))² = 36V², sq = (|a|², |b|², |c|²) and
// dots = (a·b, a·c, b·c). Ω = 2·atan2(numerator, denominator) takes the
// branch in (0, 2π) when the denominator is negative. It needs a
// 3-simplex (exact.ErrShape), i in range and a non-degenerate tetrahedron
// (ErrDegenerate).
func (s *Simplex) SolidAngleTerms(i int) (tripleSq *big.Rat, sq, dots [3]*big.Rat, err error) {
	if s.k != 3 {
		return nil, sq, dots, fmt.Errorf("solid angle: defined here for tetrahedra, this is a %d-simplex: %w", s.k, exact.ErrShape)
	}
	if err := s.checkVertex("solid angle", i); err != nil {
		return nil, sq, dots, err
	}
	if s.IsDegenerate() {
		return nil, sq, dots, fmt.Errorf("solid angle: %w (squared volume 0)", ErrDegenerate)
	}
	o := others(3, i)
	for a := range 3 {
		sq[a] = s.SqEdge(i, o[a])
	}
	dots[0], dots[1], dots[2] = s.edgeDot(i, o[0], o[1]), s.edgeDot(i, o[0], o[2]), s.edgeDot(i, o[1], o[2])
	return new(big.Rat).Mul(s.VolumeSq(), big.NewRat(36, 1)), sq, dots, nil
}

// MaxSqEdge returns the largest squared edge length (0 for a point).
func (s *Simplex) MaxSqEdge() *big.Rat {
	m := new(big.Rat)
	for _, d := range s.SqEdges() {
		if d.Cmp(m) > 0 {
			m.Set(d)
		}
	}
	return m
}

// VolumeLengthRatioSq returns the square of the volume–length ratio
// V / V_reg(ℓ_rms), the volume over that of the regular k-simplex whose
// edge is the root mean square ℓ_rms of the edges; V_reg(ℓ) =
// ℓ^k √(k+1)/(k!·2^(k/2)), so the square is V²(k!)²2^k/((k+1)ℓ_rms^(2k)),
// rational. For k = 3 the ratio is 6√2·V/ℓ_rms³ (the volume–length
// measure of the mesh-quality literature, e.g. Shewchuk 2002); it is 1
// for the regular simplex and 0 for a degenerate one. It needs k >= 1 and
// an edge of non-zero length (ErrDegenerate).
func (s *Simplex) VolumeLengthRatioSq() (*big.Rat, error) {
	if s.k < 1 {
		return nil, fmt.Errorf("volume-length ratio: a point has no edges: %w", exact.ErrShape)
	}
	mean := new(big.Rat)
	edges := s.SqEdges()
	for _, d := range edges {
		mean.Add(mean, d)
	}
	if mean.Sign() == 0 {
		return nil, fmt.Errorf("volume-length ratio: %w (every edge has length 0)", ErrDegenerate)
	}
	mean.Quo(mean, big.NewRat(int64(len(edges)), 1))
	f := new(big.Rat).SetInt(factorial(s.k))
	num := new(big.Rat).Mul(s.VolumeSq(), f)
	num.Mul(num, f)
	num.Mul(num, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(s.k))))
	den := new(big.Rat).SetInt64(int64(s.k + 1))
	for range s.k {
		den.Mul(den, mean)
	}
	return num.Quo(num, den), nil
}

// DihedralPair is a pair of facets, named by their opposite vertices
// I < J, with the cosine of their interior dihedral angle as
// DihedralCosSq gives it.
type DihedralPair struct {
	I, J int
	Cos2 *big.Rat
	Sign int
}

// DihedralExtremes returns the pairs of facets with the smallest and the
// largest interior dihedral angle (the first such pair in the order
// (0,1), (0,2), …, on ties), compared exactly: the angle decreases as
// sign·cos² increases. It needs what DihedralCosSq needs (k >= 2, not
// degenerate).
func (s *Simplex) DihedralExtremes() (smallest, largest DihedralPair, err error) {
	first := true
	for i := 0; i <= s.k; i++ {
		for j := i + 1; j <= s.k; j++ {
			c2, sg, err := s.DihedralCosSq(i, j)
			if err != nil {
				return smallest, largest, err
			}
			p := DihedralPair{i, j, c2, sg}
			if first || cosKey(p).Cmp(cosKey(smallest)) > 0 {
				smallest = p
			}
			if first || cosKey(p).Cmp(cosKey(largest)) < 0 {
				largest = p
			}
			first = false
		}
	}
	if first { // k < 2: let DihedralCosSq say why
		_, _, err = s.DihedralCosSq(0, 1)
	}
	return smallest, largest, err
}

// cosKey is sign·cos², increasing with the cosine.
func cosKey(p DihedralPair) *big.Rat {
	k := new(big.Rat).Set(p.Cos2)
	if p.Sign < 0 {
		k.Neg(k)
	}
	return k
}

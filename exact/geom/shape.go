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
//
// Speed (issue 18: the exact parts on 10,000 random tetrahedra in < 1 s,
// BenchmarkTetrahedraShape10000). Results come out of the integer Gram
// matrix, its adjugate and l·v_i (core.go) with one reduction to lowest
// terms each, and reducing was half the time, most of it in
// big.Int.GCD (Lehmer's algorithm, a hardware division per quotient)
// and big.Int.Quo. ratFrac (intmath.go) now takes the gcd by the binary
// algorithm on machine words when the shorter operand has at most four
// words (most reductions here), after one Euclid step for operands of
// unequal length, and divides by it exactly (Hensel division, no trial
// quotients); ratProd reduces against a product one factor at a time
// where the product would pass four words (altitudes, facet normals,
// dihedral cosines, the volume–length ratio). The values and their
// lowest terms are as before (TestShapeAgainstPlainRationals,
// TestRatFracLowestTerms). Measured on the shared 2-core machine under
// load 14–21 (December 2026), where wall times were 3–6 times the quiet
// ones and jumped by 2x between runs:
//   - the previous geom package and this one in one test binary,
//     alternating on chunks of 250 tetrahedra, best of 5 per chunk,
//     summed over the 10,000: new/old time 0.60–0.75 (four runs);
//   - benchmark binaries built from main and from this change, run
//     alternately: CPU per op (3-op runs minus 1-op runs) 0.93 s before,
//     0.65 s after; process CPU of eleven 1-op runs each 1.56–1.74 s
//     before, 1.30–1.46 s after; best wall per op 3.52 s before, 2.78 s
//     after; allocations per op 10.3 million (489 MB) before, 7.6
//     million (334 MB) after. Quiet runs of main measured 0.88–1.03 s per
//     op; by the ratios the op now takes some 0.55–0.75 s;
//   - from a notebook (kernel BenchmarkSimplexShapeSampled, 1,000
//     tetrahedra × 45 results; its geometry's exact part is a small
//     share), nine 1-op runs each alternated: process CPU 1.17–1.56 s
//     before, 1.04–1.42 s after; best wall 2.59 s before, 2.01 s after.

// Centroid returns (1/(k+1)) Σ v_i. It needs a simplex built from points
// (else exact.ErrShape).
func (s *Simplex) Centroid() ([]*big.Rat, error) {
	if s.d != nil {
		return nil, errNoPoints("centroid")
	}
	// Σ_i l·v_i is integral (l = √s, a multiple of every denominator):
	// one reduction per coordinate instead of a rational sum.
	l, lp := s.scaledPoints()
	den := new(big.Int).Mul(l, big.NewInt(int64(s.k+1)))
	out := make([]*big.Rat, s.n)
	var sum big.Int
	for c := range out {
		sum.SetInt64(0)
		for _, p := range lp {
			sum.Add(&sum, p[c])
		}
		out[c] = ratFrac(&sum, den)
	}
	return out, nil
}

// Contains reports whether p lies in the closed simplex: in its affine
// hull with every barycentric coordinate >= 0, so the boundary counts as
// inside. A point outside the affine hull of a simplex that is not
// full-dimensional is not contained (false, no error). It needs what
// Barycentric needs: a simplex from points, not degenerate, and p of the
// points' length.
func (s *Simplex) Contains(p []*big.Rat) (bool, error) {
	if s.d == nil && len(p) == s.n && s.k == s.n && s.k > 0 {
		if c := s.core(); c.det.Sign() != 0 {
			// Only the signs matter: λ_a = nums[a]/den, no reduction.
			nums, den := s.barycentricInts(c, p)
			for _, x := range nums {
				if x.Sign() != 0 && x.Sign() != den.Sign() {
					return false, nil
				}
			}
			return true, nil
		}
	}
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
	c := s.core()
	if c.adj == nil { // k > 3 and degenerate: contents from the facets' own Gram matrices
		if s.FacetContentsSq()[i].Sign() == 0 {
			return nil, errFlatFacet(i)
		}
		return new(big.Rat), nil
	}
	// h_i² = k²V²/F_i² = det g/(s·A_i), A_i the facet's numerator (core.go):
	// the factorials and powers of s cancel.
	a := facetNumerator(c, s.k, i)
	if a.Sign() == 0 {
		return nil, errFlatFacet(i)
	}
	return ratProd(c.det, s.s, a), nil
}

func errFlatFacet(i int) error {
	return fmt.Errorf("altitude: %w (the facet opposite vertex %d has content 0)", ErrDegenerate, i)
}

// facetNumerator is A_ii for i >= 1 and Σ_ab A_ab for i = 0 (core.go).
func facetNumerator(c *core, k, i int) *big.Int {
	if i > 0 {
		return c.adj[(i-1)*k+i-1]
	}
	sum := new(big.Int)
	for _, x := range c.adj {
		sum.Add(sum, x)
	}
	return sum
}

// FacetNormal returns the outward normal of the facet opposite vertex i,
// unnormalised, and its squared length: the vector from vertex i to the
// foot of its altitude, foot_i − v_i = −Σ_m c_m v_m with c from
// FootRatios, whose squared length is AltitudeSq(i). It lies in the
// affine hull's direction space, is orthogonal to the facet and points
// away from vertex i. It needs a simplex from points (exact.ErrShape),
// k >= 1 and a non-degenerate simplex (ErrDegenerate).
func (s *Simplex) FacetNormal(i int) (normal []*big.Rat, lengthSq *big.Rat, err error) {
	if s.d != nil {
		return nil, nil, errNoPoints("facet normal")
	}
	if s.k < 1 {
		return nil, nil, fmt.Errorf("facet normal: a point has no facets: %w", exact.ErrShape)
	}
	if err := s.checkVertex("facet normal", i); err != nil {
		return nil, nil, err
	}
	if s.IsDegenerate() {
		return nil, nil, fmt.Errorf("facet normal: %w (squared volume 0)", ErrDegenerate)
	}
	h, err := s.AltitudeSq(i)
	if err != nil {
		return nil, nil, err
	}
	// foot_i − v_i = −Σ_{m>=1} c_m (v_m − v_0) (the c_m sum to 0), computed
	// on the integral edge vectors l·(v_m − v_0), s = l², over l·q_ii.
	q := s.gradients()
	l, lp := s.scaledPoints()
	sum := make([]big.Int, s.n)
	var e, t big.Int
	for m := 1; m <= s.k; m++ {
		if q[i][m].Sign() == 0 {
			continue
		}
		for c, x := range lp[m] {
			e.Sub(x, lp[0][c])
			sum[c].Sub(&sum[c], t.Mul(q[i][m], &e))
		}
	}
	normal = make([]*big.Rat, s.n)
	for c := range normal {
		normal[c] = ratProd(&sum[c], l, q[i][i])
	}
	return normal, h, nil
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
	d := s.scaledEdges()
	dj, dm := d[i][j], d[i][m]
	if dj.Sign() == 0 || dm.Sign() == 0 {
		return nil, 0, fmt.Errorf("vertex angle: %w (vertex %d coincides with vertex %d or %d)", ErrDegenerate, i, j, m)
	}
	dot := s.dotScaled(i, j, m)
	num := new(big.Int).Mul(dot, dot)
	den := new(big.Int).Mul(dj, dm)
	return ratFrac(num, den), dot.Sign(), nil
}

// dotScaled returns s·(v_j − v_i)·(v_m − v_i) = g_jm − g_ij − g_im + g_ii
// (g the scaled Gram matrix from vertex 0), an integer.
func (s *Simplex) dotScaled(i, j, m int) *big.Int {
	return s.dotScaledInto(new(big.Int), i, j, m)
}

// dotScaledInto sets z to dotScaled(i, j, m) and returns it.
func (s *Simplex) dotScaledInto(z *big.Int, i, j, m int) *big.Int {
	z.Sub(s.gi(j, m), s.gi(i, j))
	z.Sub(z, s.gi(i, m))
	return z.Add(z, s.gi(i, i))
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
// dots = (a·b, a·c, b·c), all multiplied by one positive factor per
// squared length (so tripleSq by its cube): the formula is homogeneous
// of degree 0, and the integers need no reduction. Ω = 2·atan2(numerator, denominator) takes the
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
	// With Gram = g/s: 36V² = det Gram = det g/s³, and s·d_ij, s·(a·b)
	// are integers.
	// Integers are written straight into the numerators of zero Rats
	// (references, denominator 1), one allocation each.
	o := others(3, i)
	d := s.scaledEdges()
	for a := range 3 {
		sq[a] = new(big.Rat)
		sq[a].Num().Set(d[i][o[a]])
	}
	for x, jm := range [3][2]int{{0, 1}, {0, 2}, {1, 2}} {
		dots[x] = new(big.Rat)
		s.dotScaledInto(dots[x].Num(), i, o[jm[0]], o[jm[1]])
	}
	tripleSq = new(big.Rat)
	tripleSq.Num().Set(s.core().det)
	return tripleSq, sq, dots, nil
}

// MaxSqEdge returns the largest squared edge length (0 for a point).
func (s *Simplex) MaxSqEdge() *big.Rat {
	m := new(big.Int)
	e := s.scaledEdges()
	for i := 0; i <= s.k; i++ {
		for j := i + 1; j <= s.k; j++ {
			if d := e[i][j]; d.Cmp(m) > 0 {
				m = d
			}
		}
	}
	return ratFrac(m, s.s)
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
	// With V² = det g/(s^k (k!)²) and ℓ_rms² = M/(s·E), M the sum of the
	// scaled squared edges and E their number, the square is
	// det g·2^k·E^k/((k+1)·M^k): s and the factorials cancel.
	M := new(big.Int)
	e := s.scaledEdges()
	for i := 0; i <= s.k; i++ {
		for j := i + 1; j <= s.k; j++ {
			M.Add(M, e[i][j])
		}
	}
	if M.Sign() == 0 {
		return nil, fmt.Errorf("volume-length ratio: %w (every edge has length 0)", ErrDegenerate)
	}
	kk := big.NewInt(int64(s.k))
	E := big.NewInt(int64(s.k * (s.k + 1) / 2))
	num := new(big.Int).Exp(E, kk, nil)
	num.Mul(num, s.core().det)
	num.Lsh(num, uint(s.k))
	dens := []*big.Int{big.NewInt(int64(s.k + 1))}
	for range s.k {
		dens = append(dens, M) // M^k a factor at a time (ratProd)
	}
	return ratProd(num, dens...), nil
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
	if err := s.checkDihedral(0, 1); err != nil {
		return smallest, largest, err
	}
	// cos θ_ij = −q_ij/√(q_ii q_jj) (see DihedralCosSq); compare the keys
	// sign·cos² = −sign(q_ij)·q_ij²/(q_ii q_jj) by cross-multiplying.
	q := s.gradients()
	type key struct{ num, den *big.Int }
	keyOf := func(i, j int) key {
		n := new(big.Int).Mul(q[i][j], q[i][j])
		if q[i][j].Sign() > 0 {
			n.Neg(n)
		}
		return key{n, new(big.Int).Mul(q[i][i], q[j][j])}
	}
	var x, y big.Int // scratch: the keys' denominators are positive
	cmp := func(a, b key) int {
		return x.Mul(a.num, b.den).Cmp(y.Mul(b.num, a.den))
	}
	lo, hi := [2]int{0, 1}, [2]int{0, 1}
	kLo := keyOf(0, 1)
	kHi := kLo // keys are not modified
	for i := 0; i <= s.k; i++ {
		for j := i + 1; j <= s.k; j++ {
			if i == 0 && j == 1 {
				continue
			}
			kij := keyOf(i, j)
			if cmp(kij, kLo) > 0 {
				lo, kLo = [2]int{i, j}, kij
			}
			if cmp(kij, kHi) < 0 {
				hi, kHi = [2]int{i, j}, kij
			}
		}
	}
	pair := func(ij [2]int) DihedralPair {
		c2, sign := dihedralCos(q, ij[0], ij[1])
		return DihedralPair{ij[0], ij[1], c2, sign}
	}
	return pair(lo), pair(hi), nil
}

// dihedralCos returns cos² θ_ij = q_ij²/(q_ii q_jj) and the sign of
// cos θ_ij, −sign(q_ij) (see DihedralCosSq), q from gradients.
func dihedralCos(q [][]*big.Int, i, j int) (*big.Rat, int) {
	qij := q[i][j]
	return ratProd(new(big.Int).Mul(qij, qij), q[i][i], q[j][j]), -qij.Sign()
}

// gradients returns the cached matrix core.qInts (shared: read only).
func (s *Simplex) gradients() [][]*big.Int {
	c := s.core()
	c.qOnce.Do(func() { c.q = c.qInts(s.k) })
	return c.q
}

// barycentricFull is Barycentric for a full-dimensional, non-degenerate
// simplex, in integers: with e_b = l·(v_b − v_0) integral (s = l²) and
// P = L·l·(p − v_0), L the lcm of p's denominators, Gram⁻¹ = s·adj(g)/det g
// gives λ_a = Σ_b adj_ab (e_b·P) / (L·det g) for a >= 1.
func (s *Simplex) barycentricFull(c *core, p []*big.Rat) []*big.Rat {
	nums, den := s.barycentricInts(c, p)
	out := make([]*big.Rat, len(nums))
	for a, x := range nums {
		out[a] = ratFrac(x, den)
	}
	return out
}

// barycentricInts returns the numerators of barycentricFull's λ_0..λ_k
// and their common denominator L·det g, unreduced; a nil p[c] reads as 0.
func (s *Simplex) barycentricInts(c *core, p []*big.Rat) (nums []*big.Int, den *big.Int) {
	k := s.k
	l, lp := s.scaledPoints()
	var lc lcmAcc
	for _, x := range p {
		lc.add(x)
	}
	L := lc.value()
	ll := new(big.Int).Mul(L, l)
	P := make([]big.Int, s.n)
	var t big.Int
	for c2, x := range lp[0] {
		setScaled(&P[c2], p[c2], ll)
		P[c2].Sub(&P[c2], t.Mul(L, x))
	}
	y := make([]big.Int, k)
	var e big.Int
	for b := 1; b <= k; b++ {
		for c2, x := range lp[b] {
			e.Sub(x, lp[0][c2])
			y[b-1].Add(&y[b-1], t.Mul(&e, &P[c2]))
		}
	}
	den = new(big.Int).Mul(L, c.det)
	nums = make([]*big.Int, k+1)
	nums[0] = new(big.Int).Set(den)
	for a := 1; a <= k; a++ {
		num := new(big.Int)
		for b := 0; b < k; b++ {
			num.Add(num, t.Mul(c.adj[(a-1)*k+b], &y[b]))
		}
		nums[0].Sub(nums[0], num)
		nums[a] = num
	}
	return nums, den
}

package geom

import (
	"errors"
	"math/big"
	"testing"

	"assay/exact"
)

// corner is the trirectangular tetrahedron with unit legs.
func corner(t testing.TB) *Simplex {
	return mustPoints(t, vec(0, 0, 0), vec(1, 0, 0), vec(0, 1, 0), vec(0, 0, 1))
}

// regularTet is the regular tetrahedron of unit edge, from distances.
func regularTet(t testing.TB) *Simplex {
	return mustDist(t, matrixOf(
		[]string{"0", "1", "1", "1"}, []string{"1", "0", "1", "1"},
		[]string{"1", "1", "0", "1"}, []string{"1", "1", "1", "0"}))
}

func eqRat(t *testing.T, what string, got *big.Rat, want string) {
	t.Helper()
	if got == nil || got.Cmp(q(want)) != 0 {
		t.Errorf("%s = %v, want %s", what, got, want)
	}
}

// The centroid of (0,0), (3,0), (0,6) is the mean of the vertices, (1, 2)
// (textbook definition).
func TestCentroidAndContains(t *testing.T) {
	tri := mustPoints(t, vec(0, 0), vec(3, 0), vec(0, 6))
	c, err := tri.Centroid()
	if err != nil || c[0].Cmp(qi(1)) != 0 || c[1].Cmp(qi(2)) != 0 {
		t.Fatalf("centroid %v %v", c, err)
	}
	for _, tc := range []struct {
		p    []*big.Rat
		want bool
	}{
		{c, true}, {vec(0, 0), true}, {[]*big.Rat{q("3/2"), qi(3)}, true}, // vertex and the midpoint of an edge: boundary counts
		{vec(2, 3), false}, {vec(-1, 1), false}, {[]*big.Rat{q("3/2"), q("301/100")}, false},
	} {
		got, err := tri.Contains(tc.p)
		if err != nil || got != tc.want {
			t.Errorf("contains %s = %v %v, want %v", fmtVec(tc.p), got, err, tc.want)
		}
	}
	// A segment in the plane: a point off its line is not contained.
	seg := mustPoints(t, vec(0, 0), vec(2, 2))
	if got, err := seg.Contains(vec(1, 0)); got || err != nil {
		t.Errorf("off the line: %v %v", got, err)
	}
	if _, err := tri.Contains(vec(1, 1, 1)); !errors.Is(err, exact.ErrShape) {
		t.Errorf("wrong length: %v", err)
	}
	flat := mustPoints(t, vec(0, 0), vec(1, 1), vec(2, 2))
	if _, err := flat.Contains(vec(1, 1)); !errors.Is(err, ErrDegenerate) {
		t.Errorf("degenerate: %v", err)
	}
}

// Altitudes: in the right triangle with legs 3, 4 the altitude to the
// hypotenuse is 3·4/5 = 12/5, the others are the legs 4 and 3 (textbook); in the
// unit corner the origin is at distance 1/√3 from the plane x + y + z = 1
// (point-plane distance formula).
func TestAltitudeAndFacetNormal(t *testing.T) {
	tri := mustPoints(t, vec(0, 0), vec(4, 0), vec(0, 3))
	for i, want := range []string{"144/25", "16", "9"} {
		h, err := tri.AltitudeSq(i)
		if err != nil {
			t.Fatal(err)
		}
		eqRat(t, "altitude² of 3-4-5", h, want)
	}
	c := corner(t)
	n, l2, err := c.FacetNormal(0)
	if err != nil {
		t.Fatal(err)
	}
	eqRat(t, "corner normal length²", l2, "1/3")
	for _, x := range n {
		eqRat(t, "corner normal 0", x, "1/3") // the plane's normal (1, 1, 1), away from the origin
	}
	n, l2, _ = c.FacetNormal(1) // the plane x = 0, away from (1, 0, 0)
	eqRat(t, "corner normal 1 length²", l2, "1")
	eqRat(t, "corner normal 1 x", n[0], "-1")
	eqRat(t, "corner normal 1 y", n[1], "0")
	// On a random simplex with fractions: the normal is orthogonal to the
	// facet, has the altitude's length and points away from vertex i.
	r := Random(3, 4, 20, 7)
	pts, _ := r.Points()
	for i := range 4 {
		n, l2, err := r.FacetNormal(i)
		if err != nil {
			t.Fatal(err)
		}
		dot := func(a, b []*big.Rat) *big.Rat {
			z := new(big.Rat)
			for c := range a {
				z.Add(z, new(big.Rat).Mul(a[c], new(big.Rat).Sub(b[c], pts[(i+1)%4][c])))
			}
			return z
		}
		for _, j := range others(3, i) {
			eqRat(t, "normal · facet edge", dot(n, pts[j]), "0")
		}
		if dot(n, pts[i]).Sign() >= 0 {
			t.Errorf("normal %d points toward its vertex", i)
		}
		nn := new(big.Rat)
		for _, x := range n {
			nn.Add(nn, new(big.Rat).Mul(x, x))
		}
		if nn.Cmp(l2) != 0 {
			t.Errorf("normal %d: |n|² = %v, altitude² %v", i, nn, l2)
		}
	}
	if _, _, err := regularTet(t).FacetNormal(0); !errors.Is(err, exact.ErrShape) {
		t.Errorf("from distances: %v", err)
	}
	if _, err := mustPoints(t, vec(0, 0), vec(0, 0), vec(1, 0)).AltitudeSq(2); !errors.Is(err, ErrDegenerate) {
		t.Errorf("degenerate facet: %v", err)
	}
	if h, err := mustPoints(t, vec(0, 0), vec(1, 0), vec(2, 0)).AltitudeSq(1); err != nil || h.Sign() != 0 {
		t.Errorf("flat triangle's altitude is 0: %v %v", h, err)
	}
}

// Angles: the regular tetrahedron's face angles are 60° (cos 1/2); the
// 3-4-5 triangle has cos = 4/5 at the vertex opposite the side 3, and a
// right angle between the legs (textbook).
func TestVertexCos(t *testing.T) {
	c2, sg, err := regularTet(t).VertexCosSq(0, 1, 2)
	if err != nil || sg != 1 {
		t.Fatal(err, sg)
	}
	eqRat(t, "regular face angle cos²", c2, "1/4")
	tri := mustPoints(t, vec(0, 0), vec(4, 0), vec(0, 3))
	c2, sg, _ = tri.VertexCosSq(1, 0, 2)
	eqRat(t, "3-4-5 cos²", c2, "16/25")
	if _, sg0, _ := tri.VertexCosSq(0, 1, 2); sg0 != 0 || sg != 1 {
		t.Errorf("signs %d %d", sg0, sg)
	}
	obtuse := mustPoints(t, vec(0, 0), vec(-1, 1), vec(1, 0)) // 135° at the origin
	c2, sg, _ = obtuse.VertexCosSq(0, 1, 2)
	if sg != -1 {
		t.Errorf("obtuse sign %d", sg)
	}
	eqRat(t, "135° cos²", c2, "1/2")
	if _, _, err := tri.VertexCosSq(0, 0, 1); !errors.Is(err, exact.ErrShape) {
		t.Errorf("repeated: %v", err)
	}
	if _, _, err := mustPoints(t, vec(0, 0), vec(0, 0), vec(1, 0)).VertexCosSq(0, 1, 2); !errors.Is(err, ErrDegenerate) {
		t.Errorf("coincident: %v", err)
	}
}

// Mesh-quality ingredients on the unit corner, derived by hand: V = 1/6,
// edges 1, 1, 1, √2, √2, √2 so ℓ_rms² = 3/2 and (6√2·V/ℓ_rms³)² = 16/27;
// its dihedral angles are 90° between coordinate planes and arccos(1/√3)
// between a coordinate plane and x + y + z = 1. The regular tetrahedron
// has ratio 1 and all dihedral cosines 1/3 (handbook).
func TestQualityIngredients(t *testing.T) {
	r, err := corner(t).VolumeLengthRatioSq()
	if err != nil {
		t.Fatal(err)
	}
	eqRat(t, "corner volume-length²", r, "16/27")
	r, _ = regularTet(t).VolumeLengthRatioSq()
	eqRat(t, "regular volume-length²", r, "1")
	tri, _ := mustPoints(t, vec(0, 0), vec(2, 0), vec(1, 1)).VolumeLengthRatioSq()
	// area 1, ℓ_rms² = (4 + 2 + 2)/3 = 8/3, (4A/(√3 ℓ_rms²))² = 16/(3·64/9) = 3/4
	eqRat(t, "right isosceles volume-length²", tri, "3/4")
	lo, hi, err := corner(t).DihedralExtremes()
	if err != nil {
		t.Fatal(err)
	}
	if lo.I != 0 || lo.Sign != 1 || hi.Sign != 0 {
		t.Errorf("extremes %+v %+v", lo, hi)
	}
	eqRat(t, "corner smallest dihedral cos²", lo.Cos2, "1/3")
	eqRat(t, "corner max edge²", corner(t).MaxSqEdge(), "2")
	if _, _, err := mustPoints(t, vec(0), vec(1)).DihedralExtremes(); !errors.Is(err, exact.ErrShape) {
		t.Errorf("segment: %v", err)
	}
}

// At a right corner the edges are orthogonal: the triple product² is the
// product of the squared lengths (the volume of a box), the dots are 0.
// The terms share a scale, so compare ratios. On the regular tetrahedron
// a·b = |a|²/2 (60° angles) and 36V² = 1/2 of the cube of an edge²
// (V = 1/(6√2); handbook).
func TestSolidAngleTerms(t *testing.T) {
	c := mustPoints(t, vec(0, 0, 0), []*big.Rat{q("1/2"), qi(0), qi(0)}, vec(0, 3, 0), []*big.Rat{qi(0), qi(0), q("5/3")})
	tr, sq, dots, err := c.SolidAngleTerms(0)
	if err != nil {
		t.Fatal(err)
	}
	box := new(big.Rat).Mul(sq[0], sq[1])
	eqRat(t, "triple² / box", box.Quo(tr, box.Mul(box, sq[2])), "1")
	for a := range 3 {
		eqRat(t, "dot", dots[a], "0")
	}
	tr, sq, dots, _ = regularTet(t).SolidAngleTerms(2)
	for a := range 3 {
		eqRat(t, "regular dot / length²", new(big.Rat).Quo(dots[a], sq[a]), "1/2")
	}
	cube := new(big.Rat).Mul(sq[0], sq[1])
	eqRat(t, "regular triple² / edge⁶", cube.Quo(tr, cube.Mul(cube, sq[2])), "1/2")
	if _, _, _, err := mustPoints(t, vec(0, 0), vec(1, 0), vec(0, 1)).SolidAngleTerms(0); !errors.Is(err, exact.ErrShape) {
		t.Errorf("triangle: %v", err)
	}
	if _, _, _, err := mustPoints(t, vec(0, 0, 0), vec(1, 0, 0), vec(0, 1, 0), vec(1, 1, 0)).SolidAngleTerms(0); !errors.Is(err, ErrDegenerate) {
		t.Errorf("flat: %v", err)
	}
}

// Barycentric coordinates by definition: p = Σ λ_i v_i with Σ λ_i = 1, on
// random full-dimensional simplices with fractions (the integer route)
// and in a plane of R^3 (the Gram solve).
func TestBarycentricByDefinition(t *testing.T) {
	for seed := range uint64(20) {
		dim := 2 + int(seed%3)
		s := Random(dim, seed, 30, 9)
		p := make([]*big.Rat, dim)
		for c := range p {
			p[c] = big.NewRat(int64(seed)*7-int64(c)*13, int64(c)+3)
		}
		lam, err := s.Barycentric(p)
		if err != nil {
			t.Fatal(err)
		}
		back := s.combine(lam)
		sum := new(big.Rat)
		for _, l := range lam {
			sum.Add(sum, l)
		}
		for c := range p {
			if back[c].Cmp(p[c]) != 0 || sum.Cmp(qi(1)) != 0 {
				t.Fatalf("seed %d: Σλv = %s, p = %s, Σλ = %v", seed, fmtVec(back), fmtVec(p), sum)
			}
		}
	}
	plane := mustPoints(t, vec(1, 0, 0), vec(0, 1, 0), vec(0, 0, 1))
	lam, err := plane.Barycentric([]*big.Rat{q("1/2"), q("1/3"), q("1/6")})
	if err != nil || lam[0].Cmp(q("1/2")) != 0 || lam[2].Cmp(q("1/6")) != 0 {
		t.Errorf("plane: %v %v", lam, err)
	}
}

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

// At the right corner the edges are orthonormal: triple product² 1, dots 0.
func TestSolidAngleTerms(t *testing.T) {
	tr, sq, dots, err := corner(t).SolidAngleTerms(0)
	if err != nil {
		t.Fatal(err)
	}
	eqRat(t, "triple²", tr, "1")
	for a := range 3 {
		eqRat(t, "length²", sq[a], "1")
		eqRat(t, "dot", dots[a], "0")
	}
	if _, _, _, err := mustPoints(t, vec(0, 0), vec(1, 0), vec(0, 1)).SolidAngleTerms(0); !errors.Is(err, exact.ErrShape) {
		t.Errorf("triangle: %v", err)
	}
	if _, _, _, err := mustPoints(t, vec(0, 0, 0), vec(1, 0, 0), vec(0, 1, 0), vec(1, 1, 0)).SolidAngleTerms(0); !errors.Is(err, ErrDegenerate) {
		t.Errorf("flat: %v", err)
	}
}

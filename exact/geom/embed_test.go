package geom

import (
	"errors"
	"math/big"
	"strings"
	"testing"

	"assay/exact"
)

// nonEmbeddableTet: an equilateral base of side 1 and an apex at squared
// distance 3/10 from every base vertex. Every face is a valid triangle
// (sides 1, √0.3, √0.3 and √0.3 + √0.3 ≈ 1.095 > 1), but a point equidistant
// from the base vertices is at least the circumradius 1/√3 (squared 1/3 >
// 3/10) away from them: no such tetrahedron exists, and the Cayley–Menger
// determinant has the wrong sign.
func nonEmbeddableTet() *exact.Matrix {
	return matrixOf(
		[]string{"0", "1", "1", "3/10"},
		[]string{"1", "0", "1", "3/10"},
		[]string{"1", "1", "0", "3/10"},
		[]string{"3/10", "3/10", "3/10", "0"})
}

// Schoenberg's criterion (I. J. Schoenberg, "Remarks to Maurice Fréchet's
// article …", Ann. of Math. 36 (1935)): squared distances come from points
// of R^k iff the Gram matrix from one point is PSD of rank <= k.
func TestEmbeddable(t *testing.T) {
	for k := 1; k <= 5; k++ {
		for seed := uint64(0); seed < 4; seed++ {
			// k+1 random points in R^k, and 2k points in R^k.
			s := Random(k, seed, 20, 5)
			d := s.SqDistances()
			if ok, reason, err := Embeddable(d, k); !ok || err != nil {
				t.Errorf("k=%d: %v %q %v", k, ok, reason, err)
			}
			ok, reason, err := Embeddable(d, k-1)
			if ok || err != nil || !strings.Contains(reason, "needs dimension") {
				t.Errorf("k=%d in R^(k-1): %v %q %v", k, ok, reason, err)
			}
			many := append(Random(k, seed+100, 20, 5).points(), s.points()...)
			bd := distOfPoints(many)
			if ok, reason, _ := Embeddable(bd, k); !ok {
				t.Errorf("2k points of R^%d: %q", k, reason)
			}
			if ok, reason, _ := Embeddable(bd, k-1); ok || !strings.Contains(reason, "needs dimension") {
				t.Errorf("2k points of R^%d in R^%d: %q", k, k-1, reason)
			}
		}
	}
	// Violated triangle inequality (sides 1, 1, 3).
	d := matrixOf(
		[]string{"0", "1", "1", "4"},
		[]string{"1", "0", "9", "1"},
		[]string{"1", "9", "0", "1"},
		[]string{"4", "1", "1", "0"})
	ok, reason, err := Embeddable(d, 3)
	if ok || err != nil || !strings.HasPrefix(reason, "the triangle 0,1,2 violates the triangle inequality") {
		t.Errorf("triangle: %v %q %v", ok, reason, err)
	}
	// Valid faces, wrong Cayley–Menger sign.
	ok, reason, err = Embeddable(nonEmbeddableTet(), 3)
	if ok || err != nil || !strings.Contains(reason, "not positive semidefinite") || !strings.Contains(reason, "principal minor on {1, 2, 3}") {
		t.Errorf("apex too close: %v %q %v", ok, reason, err)
	}
	cm, _ := CayleyMengerDet(nonEmbeddableTet())
	if cm.Sign() >= 0 { // a real tetrahedron has CM = 288 V² >= 0
		t.Errorf("CM of the impossible tetrahedron = %v, want < 0", cm)
	}
	// Four points, all distances 1 except one pair at √3: the rhombus of
	// two equilateral triangles, flat: embeddable in R^2, not R^1. With
	// the pair at √(7/2) the faces are still triangles (1+1 > 1.87) but no
	// points realise it.
	rh := regularDistances(4, qi(1))
	rh.Set(2, 3, qi(3))
	rh.Set(3, 2, qi(3))
	if ok, reason, _ := Embeddable(rh, 2); !ok {
		t.Errorf("rhombus in R^2: %q", reason)
	}
	if ok, reason, _ := Embeddable(rh, 1); ok || !strings.Contains(reason, "needs dimension 2, asked for 1") {
		t.Errorf("rhombus in R^1: %q", reason)
	}
	s := mustDist(t, rh)
	if !s.IsDegenerate() {
		t.Error("rhombus tetrahedron not degenerate")
	}
	rh.Set(2, 3, q("7/2"))
	rh.Set(3, 2, q("7/2"))
	if ok, reason, _ := Embeddable(rh, 3); ok || !strings.Contains(reason, "principal minor") {
		t.Errorf("stretched rhombus: %q", reason)
	}
	if _, err := FromSquaredDistances(rh); !errors.Is(err, ErrNotEmbeddable) {
		t.Errorf("stretched rhombus built: %v", err)
	}
	// Malformed input: errors, not reasons.
	if _, _, err := Embeddable(exact.Zeros(2, 3), 2); !errors.Is(err, exact.ErrShape) {
		t.Errorf("non-square: %v", err)
	}
	if _, _, err := Embeddable(exact.Zeros(2, 2), -1); !errors.Is(err, exact.ErrShape) {
		t.Errorf("k < 0: %v", err)
	}
	if _, _, err := Embeddable(nil, 1); !errors.Is(err, exact.ErrShape) {
		t.Errorf("nil: %v", err)
	}
	ok, reason, err = Embeddable(matrixOf([]string{"0", "1"}, []string{"2", "0"}), 1)
	if ok || err != nil || !strings.Contains(reason, "(0, 1) = 1 and (1, 0) = 2") {
		t.Errorf("asymmetric: %v %q %v", ok, reason, err)
	}
	// One point: embeddable in R^0.
	if ok, _, _ := Embeddable(exact.Zeros(1, 1), 0); !ok {
		t.Error("one point")
	}
	// Coincident points: rank 0.
	if ok, reason, _ := Embeddable(exact.Zeros(3, 3), 0); !ok {
		t.Errorf("three coincident points: %q", reason)
	}
}

// The witness minor reported is the Gram principal minor, checked directly.
func TestEmbeddableWitness(t *testing.T) {
	d := nonEmbeddableTet()
	s := fromDistances(d)
	m, err := s.Gram().Minor([]int{0, 1, 2}, []int{0, 1, 2})
	if err != nil {
		t.Fatal(err)
	}
	_, reason, _ := Embeddable(d, 3)
	if !strings.Contains(reason, "is "+exact.FormatRat(m)+" < 0") {
		t.Errorf("reason %q does not quote the minor %s", reason, exact.FormatRat(m))
	}
	// A zero diagonal with a non-zero off-diagonal: points 1 and 2 both at
	// distance 0 from point 0 but 1 apart.
	z := matrixOf([]string{"0", "0", "0"}, []string{"0", "0", "1"}, []string{"0", "1", "0"})
	ok, reason, _ := Embeddable(z, 2)
	if ok || !strings.Contains(reason, "triangle 0,1,2") {
		t.Errorf("zero-diagonal witness: %q", reason)
	}
	a := [][]*big.Rat{{qi(0), qi(1)}, {qi(1), qi(0)}}
	if _, w, minor := psd(a); len(w) != 2 || minor.Cmp(qi(-1)) != 0 {
		t.Errorf("psd off-diagonal witness %v %v", w, minor)
	}
}

// distOfPoints returns the squared-distance matrix of any points.
func distOfPoints(pts [][]*big.Rat) *exact.Matrix {
	m := exact.Zeros(len(pts), len(pts))
	for i := range pts {
		for j := range pts {
			e := sub(pts[i], pts[j])
			m.Set(i, j, dot(e, e))
		}
	}
	return m
}

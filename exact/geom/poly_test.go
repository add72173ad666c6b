package geom

import (
	"errors"
	"math/big"
	"testing"

	"assay/exact"
)

// Symbolic Cayley–Menger: for a triangle of squared sides a, b, c the
// squared area is Heron's (2ab + 2bc + 2ca − a² − b² − c²)/16; for a
// tetrahedron the polynomial evaluated at a simplex's squared edges is its
// VolumeSq.
func TestVolumeSqPoly(t *testing.T) {
	r := exact.NewRing()
	a, _ := r.Var("a")
	b, _ := r.Var("b")
	c, _ := r.Var("c")
	zero := r.Const(nil)
	d, _ := exact.NewPolyMatrix(r, [][]*exact.Poly{{zero, c, b}, {c, zero, a}, {b, a, zero}})
	v, err := VolumeSqPoly(d)
	if err != nil {
		t.Fatal(err)
	}
	want, _ := r.Parse("(2*a*b + 2*b*c + 2*c*a - a^2 - b^2 - c^2)/16")
	if !v.Equal(want) {
		t.Errorf("triangle V² = %v, want %v", v, want)
	}

	names := []string{"d01", "d02", "d03", "d12", "d13", "d23"}
	vars := make([]*exact.Poly, 6)
	for i, n := range names {
		vars[i], _ = r.Var(n)
	}
	rows := [][]*exact.Poly{
		{zero, vars[0], vars[1], vars[2]},
		{vars[0], zero, vars[3], vars[4]},
		{vars[1], vars[3], zero, vars[5]},
		{vars[2], vars[4], vars[5], zero},
	}
	dm, _ := exact.NewPolyMatrix(r, rows)
	vol, err := VolumeSqPoly(dm)
	if err != nil {
		t.Fatal(err)
	}
	cm, _ := CayleyMengerPoly(dm)
	for seed := uint64(0); seed < 5; seed++ {
		s := Random(3, seed, 50, 9)
		vals := map[int]*big.Rat{}
		for i, e := range s.SqEdges() {
			idx, _ := r.Index(names[i])
			vals[idx] = e
		}
		got, ok := vol.Eval(vals).Constant()
		if !ok {
			t.Fatal("not constant")
		}
		ratEq(t, "V² polynomial at the edges", got, s.VolumeSq())
		gcm, _ := cm.Eval(vals).Constant()
		ratEq(t, "CM polynomial", gcm, s.CayleyMenger())
	}

	_, err = CayleyMengerPoly(exact.PolyMatrixFrom(r, exact.Zeros(2, 3)))
	if !errors.Is(err, exact.ErrShape) || !errors.Is(err, exact.ErrNotSquare) {
		t.Errorf("non-square: %v", err)
	}
	asym, _ := exact.NewPolyMatrix(r, [][]*exact.Poly{{zero, a}, {b, zero}})
	if _, err := VolumeSqPoly(asym); !errors.Is(err, ErrNotEmbeddable) {
		t.Errorf("asymmetric: %v", err)
	}
	diag, _ := exact.NewPolyMatrix(r, [][]*exact.Poly{{a, a}, {a, zero}})
	if _, err := CayleyMengerPoly(diag); !errors.Is(err, ErrNotEmbeddable) {
		t.Errorf("diagonal: %v", err)
	}
	if _, err := CayleyMengerPoly(nil); !errors.Is(err, exact.ErrShape) {
		t.Errorf("nil: %v", err)
	}
}

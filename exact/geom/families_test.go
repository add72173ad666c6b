package geom

import (
	"math"
	"math/big"
	"testing"
)

// The mesh-quality families against the LaGriT documentation's table
// (lagrit.lanl.gov/docs/QUALITY_sliver_cap_needle_wedge.html): at t = 1/10
// our tetrahedra are its examples, with min/max edge ratio and min and max
// dihedral angles (degrees) as printed there.
func TestFamiliesLaGriT(t *testing.T) {
	for _, c := range []struct {
		name            string
		f               func(*big.Rat) *Simplex
		ratio, min, max float64
	}{
		{"sliver", Sliver, 0.714143, 15.9424, 157.380},
		{"cap", Cap, 0.259808, 15.7932, 149.550},
		{"needle", Needle, 0.198030, 53.3585, 87.4394},
		{"wedge", WedgeTetrahedron, 0.1, 11.4212, 90.0},
	} {
		s := c.f(q("1/10"))
		lo, hi := math.Inf(1), 0.0
		for _, e := range s.SqEdges() {
			f, _ := e.Float64()
			lo, hi = math.Min(lo, f), math.Max(hi, f)
		}
		if r := math.Sqrt(lo / hi); math.Abs(r-c.ratio) > 1e-5 {
			t.Errorf("%s: edge ratio %.6f, LaGriT %.6f", c.name, r, c.ratio)
		}
		amin, amax := 180.0, 0.0
		for i := 0; i < 4; i++ {
			for j := i + 1; j < 4; j++ {
				cos2, sign, err := s.DihedralCosSq(i, j)
				if err != nil {
					t.Fatal(err)
				}
				a := angleDeg(cos2, sign)
				amin, amax = math.Min(amin, a), math.Max(amax, a)
			}
		}
		if math.Abs(amin-c.min) > 1e-3 || math.Abs(amax-c.max) > 1e-3 {
			t.Errorf("%s: dihedral angles %.4f..%.4f, LaGriT %.4f..%.4f", c.name, amin, amax, c.min, c.max)
		}
	}
}

// As t → 0 each family degenerates with the behaviour its doc comment
// promises: exact volumes, and which edges shrink.
func TestFamiliesDegenerate(t *testing.T) {
	for _, ts := range []string{"1/10", "1/100", "1/1000", "1/1000000"} {
		tt := q(ts)
		sq := func(x *big.Rat) *big.Rat { return new(big.Rat).Mul(x, x) }
		mul := func(a string, x *big.Rat) *big.Rat { return new(big.Rat).Mul(q(a), x) }
		t2 := sq(tt)

		s := Sliver(tt)
		ratEq(t, "sliver V²", s.VolumeSq(), sq(mul("4/3", tt)))
		for _, e := range s.SqEdges() {
			if e.Cmp(qi(2)) < 0 || e.Cmp(qi(4)) > 0 {
				t.Errorf("sliver edge² %v outside [2, 4]", e)
			}
		}

		c := Cap(tt)
		ratEq(t, "cap V²", c.VolumeSq(), sq(mul("1/6", tt)))
		for _, e := range c.SqEdges() {
			if e.Cmp(q("1/8")) < 0 {
				t.Errorf("cap edge² %v < 1/8", e)
			}
		}
		base, _ := c.Facet(3)
		pts, _ := c.Points()
		foot := []*big.Rat{pts[3][0], pts[3][1], new(big.Rat)}
		lam, err := base.Barycentric(foot)
		if err != nil {
			t.Fatal(err)
		}
		for _, l := range lam {
			if l.Sign() <= 0 {
				t.Errorf("cap apex does not project inside the base: %v", lam)
			}
		}

		n := Needle(tt)
		ratEq(t, "needle V²", n.VolumeSq(), sq(mul("2/3", t2)))
		short := []*big.Rat{n.SqEdge(0, 1), n.SqEdge(0, 2), n.SqEdge(1, 2)}
		ratEq(t, "needle short edge", short[0], mul("4", t2))
		ratEq(t, "needle short edge", short[1], mul("5", t2))
		ratEq(t, "needle short edge", short[2], mul("5", t2))
		for i := 0; i < 3; i++ {
			if n.SqEdge(i, 3).Cmp(qi(1)) < 0 || n.SqEdge(i, 3).Cmp(qi(2)) > 0 {
				t.Errorf("needle long edge² %v", n.SqEdge(i, 3))
			}
		}

		w := WedgeTetrahedron(tt)
		ratEq(t, "wedge V²", w.VolumeSq(), sq(mul("2/3", tt)))
		ratEq(t, "wedge short edge", w.SqEdge(2, 3), mul("4", t2))
		for i, e := range w.SqEdges() {
			if i != 5 && e.Cmp(qi(2)) < 0 {
				t.Errorf("wedge edge² %v < 2", e)
			}
		}
	}
	if !Sliver(new(big.Rat)).IsDegenerate() || !Needle(new(big.Rat)).IsDegenerate() ||
		!Cap(new(big.Rat)).IsDegenerate() || !WedgeTetrahedron(new(big.Rat)).IsDegenerate() {
		t.Error("t = 0 is not degenerate")
	}
}

func TestRandomReproducible(t *testing.T) {
	a, b := Random(3, 42, 1000, 100), Random(3, 42, 1000, 100)
	if !a.SqDistances().Equal(b.SqDistances()) {
		t.Error("same seed, different simplices")
	}
	if c := Random(3, 43, 1000, 100); c.SqDistances().Equal(a.SqDistances()) {
		t.Error("different seeds, same simplex")
	}
	pts, _ := a.Points()
	for _, p := range pts {
		for _, x := range p {
			if x.Denom().Int64() > 100 || new(big.Int).Abs(x.Num()).Int64() > 1000 {
				t.Errorf("coordinate %v out of range", x)
			}
		}
	}
	// Tiny ranges force retries but still end non-degenerate.
	for seed := uint64(0); seed < 20; seed++ {
		if s := Random(4, seed, 1, 1); s.IsDegenerate() {
			t.Error("degenerate Random")
		}
	}
	if Random(0, 1, 5, 5).VolumeSq().Cmp(qi(1)) != 0 {
		t.Error("Random(0)")
	}
}

// setFrac64 against math/big's own reduction (big.NewRat), signs and
// zero included.
func TestSetFrac64(t *testing.T) {
	for p := int64(-60); p <= 60; p++ {
		for q := int64(1); q <= 60; q++ {
			var z big.Rat
			if got, want := setFrac64(&z, p, q), big.NewRat(p, q); got.Cmp(want) != 0 || got.Denom().Cmp(want.Denom()) != 0 {
				t.Fatalf("setFrac64(%d, %d) = %s, want %s", p, q, got.RatString(), want.RatString())
			}
		}
	}
}

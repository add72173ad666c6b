package geom

import (
	"math/big"
	"testing"

	"assay/exact"
)

// The methods of shape.go compute on the scaled integer Gram matrix, its
// adjugate and l·v_i, and reduce each result once (ratFrac, or ratProd a
// factor at a time, on the binary gcd and exact division of intmath.go). This test checks them
// against the textbook vector formulas evaluated directly in big.Rat
// (cross products, dot products, orthogonal projection; from memory) on
// a few hundred random tetrahedra, some with coordinates far beyond a
// machine word. Results must agree as values and be in lowest terms.

// plainCross is a×b in R³.
func plainCross(a, b []*big.Rat) []*big.Rat {
	m := func(x, y, z, w *big.Rat) *big.Rat {
		return new(big.Rat).Sub(new(big.Rat).Mul(x, y), new(big.Rat).Mul(z, w))
	}
	return []*big.Rat{m(a[1], b[2], a[2], b[1]), m(a[2], b[0], a[0], b[2]), m(a[0], b[1], a[1], b[0])}
}

func plainScale(c *big.Rat, a []*big.Rat) []*big.Rat {
	out := make([]*big.Rat, len(a))
	for i := range a {
		out[i] = new(big.Rat).Mul(c, a[i])
	}
	return out
}

// sameRat fails unless got equals want and is stored in lowest terms
// with a positive denominator.
func sameRat(t *testing.T, what string, got, want *big.Rat) {
	t.Helper()
	g := new(big.Int).GCD(nil, nil, got.Num(), got.Denom())
	if got.Cmp(want) != 0 || got.Denom().Sign() <= 0 || (got.Sign() != 0 && g.Cmp(big.NewInt(1)) != 0) ||
		(got.Sign() == 0 && got.Denom().Cmp(big.NewInt(1)) != 0) {
		t.Fatalf("%s = %s, want %s", what, got.RatString(), want.RatString())
	}
}

// plainNormal is the outward normal of the facet opposite vertex i: the
// vector from v_i to its orthogonal projection on the facet's plane.
func plainNormal(v [][]*big.Rat, i int) []*big.Rat {
	o := others(3, i)
	a := v[o[0]]
	n := plainCross(sub(v[o[1]], a), sub(v[o[2]], a))
	c := new(big.Rat).Quo(dot(sub(v[i], a), n), dot(n, n))
	return plainScale(c.Neg(c), n)
}

// plainInside solves Σ λ_i v_i = p, Σ λ_i = 1 by exact elimination.
func plainInside(t *testing.T, v [][]*big.Rat, p []*big.Rat) bool {
	m, b := exact.Zeros(4, 4), exact.Zeros(4, 1)
	for r := range 3 {
		for c := range 4 {
			m.Set(r, c, v[c][r])
		}
		b.Set(r, 0, p[r])
	}
	for c := range 4 {
		m.Set(3, c, big.NewRat(1, 1))
	}
	b.Set(3, 0, big.NewRat(1, 1))
	x, err := m.Solve(b)
	if err != nil {
		t.Fatal(err)
	}
	for c := range 4 {
		if x.At(c, 0).Sign() < 0 {
			return false
		}
	}
	return true
}

func TestShapeAgainstPlainRationals(t *testing.T) {
	var tets []*Simplex
	for seed := range uint64(150) {
		tets = append(tets, Random(3, seed, 1000, 100))
	}
	for seed := range uint64(150) { // coordinates and denominators past 2^64 in products
		tets = append(tets, Random(3, seed, 1<<62, 1<<40))
	}
	for _, s := range tets {
		v, _ := s.Points()
		// Centroid and containment.
		cen := make([]*big.Rat, 3)
		for c := range cen {
			cen[c] = new(big.Rat)
			for _, p := range v {
				cen[c].Add(cen[c], p[c])
			}
			cen[c].Quo(cen[c], big.NewRat(4, 1))
		}
		got, err := s.Centroid()
		if err != nil {
			t.Fatal(err)
		}
		for c := range cen {
			sameRat(t, "centroid", got[c], cen[c])
		}
		out := sub(plainScale(big.NewRat(2, 1), v[0]), cen) // 2v_0 − centroid
		for _, p := range [][]*big.Rat{cen, v[1], out} {
			in, err := s.Contains(p)
			if err != nil || in != plainInside(t, v, p) {
				t.Fatalf("Contains(%v) = %v, %v", p, in, err)
			}
		}
		// Facet normals, altitudes and foot ratios.
		normals := make([][]*big.Rat, 4)
		for i := range 4 {
			n := plainNormal(v, i)
			normals[i] = n
			gn, h, err := s.FacetNormal(i)
			if err != nil {
				t.Fatal(err)
			}
			for c := range n {
				sameRat(t, "facet normal", gn[c], n[c])
			}
			sameRat(t, "altitude²", h, dot(n, n))
			ah, _ := s.AltitudeSq(i)
			sameRat(t, "AltitudeSq", ah, dot(n, n))
			// Σ_m c_m v_m = v_i − foot_i = −normal, c_i = 1, Σ c_m = 0 fix c.
			fr, err := s.FootRatios(i)
			if err != nil {
				t.Fatal(err)
			}
			sum, tot := []*big.Rat{new(big.Rat), new(big.Rat), new(big.Rat)}, new(big.Rat)
			for m, cm := range fr {
				sameRat(t, "foot ratio", cm, cm) // lowest terms
				tot.Add(tot, cm)
				for c := range sum {
					sum[c].Add(sum[c], new(big.Rat).Mul(cm, v[m][c]))
				}
			}
			sameRat(t, "foot ratio c_i", fr[i], big.NewRat(1, 1))
			sameRat(t, "Σ foot ratios", tot, new(big.Rat))
			for c := range sum {
				sameRat(t, "Σ c_m v_m", sum[c], new(big.Rat).Neg(n[c]))
			}
			// Face angles and solid-angle terms.
			o := others(3, i)
			e := [3][]*big.Rat{sub(v[o[0]], v[i]), sub(v[o[1]], v[i]), sub(v[o[2]], v[i])}
			for a := range 3 {
				for b := a + 1; b < 3; b++ {
					d := dot(e[a], e[b])
					want := new(big.Rat).Quo(new(big.Rat).Mul(d, d), new(big.Rat).Mul(dot(e[a], e[a]), dot(e[b], e[b])))
					c2, sign, err := s.VertexCosSq(i, o[a], o[b])
					if err != nil || sign != d.Sign() {
						t.Fatalf("VertexCosSq sign %d, want %d (%v)", sign, d.Sign(), err)
					}
					sameRat(t, "vertex cos²", c2, want)
				}
			}
			trip, sq, dots, err := s.SolidAngleTerms(i)
			if err != nil {
				t.Fatal(err)
			}
			// All terms carry one positive factor f per squared length.
			f := new(big.Rat).Quo(sq[0], dot(e[0], e[0]))
			if f.Sign() <= 0 {
				t.Fatal("solid angle: non-positive factor")
			}
			for a := range 3 {
				sameRat(t, "solid angle |e|²", sq[a], new(big.Rat).Mul(f, dot(e[a], e[a])))
			}
			for x, ab := range [3][2]int{{0, 1}, {0, 2}, {1, 2}} {
				sameRat(t, "solid angle dot", dots[x], new(big.Rat).Mul(f, dot(e[ab[0]], e[ab[1]])))
			}
			tr := dot(e[0], plainCross(e[1], e[2]))
			want := new(big.Rat).Mul(tr, tr)
			want.Mul(want, new(big.Rat).Mul(f, new(big.Rat).Mul(f, f)))
			sameRat(t, "solid angle triple²", trip, want)
		}
		// Volume–length ratio², longest edge, dihedral extremes.
		sumSq, maxSq := new(big.Rat), new(big.Rat)
		for i := range 4 {
			for j := i + 1; j < 4; j++ {
				d := dot(sub(v[i], v[j]), sub(v[i], v[j]))
				sumSq.Add(sumSq, d)
				if d.Cmp(maxSq) > 0 {
					maxSq = d
				}
			}
		}
		sameRat(t, "MaxSqEdge", s.MaxSqEdge(), maxSq)
		tr := dot(sub(v[1], v[0]), plainCross(sub(v[2], v[0]), sub(v[3], v[0])))
		v2 := new(big.Rat).Quo(new(big.Rat).Mul(tr, tr), big.NewRat(36, 1))
		rms2 := new(big.Rat).Quo(sumSq, big.NewRat(6, 1))
		rms6 := new(big.Rat).Mul(rms2, new(big.Rat).Mul(rms2, rms2))
		vlr := new(big.Rat).Quo(new(big.Rat).Mul(v2, big.NewRat(36*8, 4)), rms6) // V²(3!)²2³/(4ℓ⁶)
		gv, err := s.VolumeLengthRatioSq()
		if err != nil {
			t.Fatal(err)
		}
		sameRat(t, "volume-length ratio²", gv, vlr)
		// The measures of measure.go reduce through the same ratFrac:
		// V² = (triple product)²/36, F_i² = |cross|²/4, and R² from the
		// circumcentre x solving 2(v_m − v_0)·x = |v_m|² − |v_0|².
		sameRat(t, "VolumeSq", s.VolumeSq(), v2)
		for i, f := range s.FacetContentsSq() {
			o := others(3, i)
			n := plainCross(sub(v[o[1]], v[o[0]]), sub(v[o[2]], v[o[0]]))
			sameRat(t, "FacetContentsSq", f, new(big.Rat).Quo(dot(n, n), big.NewRat(4, 1)))
		}
		m, rhs := exact.Zeros(3, 3), exact.Zeros(3, 1)
		for r := range 3 {
			for c := range 3 {
				m.Set(r, c, new(big.Rat).Mul(big.NewRat(2, 1), new(big.Rat).Sub(v[r+1][c], v[0][c])))
			}
			rhs.Set(r, 0, new(big.Rat).Sub(dot(v[r+1], v[r+1]), dot(v[0], v[0])))
		}
		x, err := m.Solve(rhs)
		if err != nil {
			t.Fatal(err)
		}
		cc := []*big.Rat{x.At(0, 0), x.At(1, 0), x.At(2, 0)}
		r2, err := s.CircumradiusSq()
		if err != nil {
			t.Fatal(err)
		}
		sameRat(t, "CircumradiusSq", r2, dot(sub(cc, v[0]), sub(cc, v[0])))
		type pk struct {
			i, j int
			c2   *big.Rat
			sign int
			key  *big.Rat // sign·cos², decreasing in the angle
		}
		var lo, hi *pk
		for i := range 4 {
			for j := i + 1; j < 4; j++ {
				d := dot(normals[i], normals[j]) // cos θ = −u_i·u_j/(|u_i||u_j|)
				c2 := new(big.Rat).Quo(new(big.Rat).Mul(d, d), new(big.Rat).Mul(dot(normals[i], normals[i]), dot(normals[j], normals[j])))
				p := &pk{i, j, c2, -d.Sign(), new(big.Rat).Mul(c2, big.NewRat(int64(-d.Sign()), 1))}
				gc2, gsign, err := s.DihedralCosSq(i, j)
				if err != nil || gsign != p.sign {
					t.Fatalf("DihedralCosSq(%d, %d) sign %d, want %d (%v)", i, j, gsign, p.sign, err)
				}
				sameRat(t, "DihedralCosSq", gc2, c2)
				if lo == nil || p.key.Cmp(lo.key) > 0 {
					lo = p
				}
				if hi == nil || p.key.Cmp(hi.key) < 0 {
					hi = p
				}
			}
		}
		small, large, err := s.DihedralExtremes()
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range []struct {
			got  DihedralPair
			want *pk
		}{{small, lo}, {large, hi}} {
			if c.got.I != c.want.i || c.got.J != c.want.j || c.got.Sign != c.want.sign {
				t.Fatalf("dihedral extreme (%d,%d,%d), want (%d,%d,%d)", c.got.I, c.got.J, c.got.Sign, c.want.i, c.want.j, c.want.sign)
			}
			sameRat(t, "dihedral cos²", c.got.Cos2, c.want.c2)
		}
	}
}

// TestShapeConcurrent uses one simplex from several goroutines: the
// per-simplex caches are built once and only read after (run with -race
// to check; without it, the results must still agree with a fresh copy).
func TestShapeConcurrent(t *testing.T) {
	s := Random(3, 7, 1000, 100)
	pts, _ := s.Points()
	fresh, err := FromPoints(pts)
	if err != nil {
		t.Fatal(err)
	}
	want, _, _ := fresh.FacetNormal(2)
	done := make(chan []*big.Rat)
	for range 4 {
		go func() {
			s.Centroid()
			s.MaxSqEdge()
			s.VertexCosSq(0, 1, 2)
			n, _, _ := s.FacetNormal(2)
			done <- n
		}()
	}
	for range 4 {
		n := <-done
		for c := range n {
			sameRat(t, "concurrent facet normal", n[c], want[c])
		}
	}
}

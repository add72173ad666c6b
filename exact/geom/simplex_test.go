package geom

import (
	"errors"
	"math/big"
	"math/rand/v2"
	"strings"
	"testing"

	"assay/exact"
)

// Regular simplex with unit edge: V_n² = (n+1)/(2^n (n!)²), the handbook
// closed form V = √(n+1)/(n!·√(2^n)) (e.g. CRC Standard Mathematical Tables,
// regular simplex; Wikipedia "Simplex", volume). Built from distances (all
// 1) and from the standard simplex e_0, …, e_n of R^{n+1} (edges √2, so
// V² is 2^n times larger); both routes (Gram and Cayley–Menger) agree.
func TestRegularSimplexVolume(t *testing.T) {
	for n := 1; n <= 7; n++ {
		f := factorial(n)
		den := new(big.Int).Mul(f, f)
		den.Lsh(den, uint(n))
		want := new(big.Rat).SetFrac(big.NewInt(int64(n+1)), den)

		s := mustDist(t, regularDistances(n+1, qi(1)))
		ratEq(t, "regular V² from distances", s.VolumeSq(), want)
		checkCMRoute(t, s)

		pts := make([][]*big.Rat, n+1)
		for i := range pts {
			pts[i] = make([]*big.Rat, n+1)
			for j := range pts[i] {
				pts[i][j] = new(big.Rat)
			}
			pts[i][i].SetInt64(1)
		}
		p := mustPoints(t, pts...)
		ratEq(t, "standard simplex V²", p.VolumeSq(), new(big.Rat).Mul(want, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(n)))))
		checkCMRoute(t, p)
		if p.Dim() != n || p.Vertices() != n+1 || p.Ambient() != n+1 {
			t.Errorf("dims %d %d %d", p.Dim(), p.Vertices(), p.Ambient())
		}
	}
}

// checkCMRoute checks VolumeSq = (−1)^(k+1) CM / (2^k (k!)²) with CM the
// determinant of the bordered matrix, as CayleyMenger computes it (from
// the scaled integer matrix for points) and as exact.Matrix.Det does on
// the rational matrix.
func checkCMRoute(t *testing.T, s *Simplex) {
	t.Helper()
	cm := s.CayleyMenger()
	if byDet, err := s.CayleyMengerMatrix().Det(); err != nil || byDet.Cmp(cm) != 0 {
		t.Errorf("CayleyMenger %s, det of CayleyMengerMatrix %v (%v)", cm.RatString(), byDet, err)
	}
	got := new(big.Rat).Mul(cm, cmFactor(s.Dim()))
	ratEq(t, "CM route V²", got, s.VolumeSq())
	g, err := s.Gram().Det()
	if err != nil {
		t.Fatal(err)
	}
	f := new(big.Rat).SetInt(factorial(s.Dim()))
	g.Quo(g, f)
	g.Quo(g, f)
	ratEq(t, "det(Gram)/(k!)²", g, s.VolumeSq())
}

func TestVolumeRoutesRandom(t *testing.T) {
	for k := 0; k <= 6; k++ {
		for seed := uint64(0); seed < 5; seed++ {
			s := Random(k, seed, 50, 7)
			checkCMRoute(t, s)
			d := mustDist(t, s.SqDistances())
			ratEq(t, "V² points vs distances", d.VolumeSq(), s.VolumeSq())
			checkCMRoute(t, d)
			fs, fd := s.FacetContentsSq(), d.FacetContentsSq()
			for i := range fs {
				ratEq(t, "facet", fd[i], fs[i])
				f, err := s.Facet(i)
				if err != nil {
					t.Fatal(err)
				}
				ratEq(t, "facet via Facet()", f.VolumeSq(), fs[i])
			}
		}
	}
	// A simplex of points in a larger space (triangle in R^5).
	rng := rand.New(rand.NewPCG(1, 2))
	s := mustPoints(t, randVec(rng, 5, 9, 5), randVec(rng, 5, 9, 5), randVec(rng, 5, 9, 5))
	checkCMRoute(t, s)
}

// The Gram matrix from points is the matrix of dot products of the edge
// vectors from vertex 0.
func TestGramFromPoints(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	pts := [][]*big.Rat{randVec(rng, 4, 20, 9), randVec(rng, 4, 20, 9), randVec(rng, 4, 20, 9), randVec(rng, 4, 20, 9)}
	s := mustPoints(t, pts...)
	g := s.Gram()
	for i := 1; i <= 3; i++ {
		for j := 1; j <= 3; j++ {
			ratEq(t, "Gram", g.At(i-1, j-1), dot(sub(pts[i], pts[0]), sub(pts[j], pts[0])))
		}
	}
	edges := s.SqEdges()
	pos := 0
	for i := 0; i <= 3; i++ {
		for j := i + 1; j <= 3; j++ {
			e := sub(pts[i], pts[j])
			ratEq(t, "SqEdge", s.SqEdge(i, j), dot(e, e))
			ratEq(t, "SqEdges order", edges[pos], dot(e, e))
			pos++
		}
	}
	got, ok := s.Points()
	if !ok || got[2][1].Cmp(pts[2][1]) != 0 {
		t.Errorf("Points() = %v, %v", got, ok)
	}
	got[2][1].SetInt64(12345) // a copy: the simplex is unchanged
	if s.SqEdge(1, 2).Cmp(dot(sub(pts[1], pts[2]), sub(pts[1], pts[2]))) != 0 {
		t.Error("Points() shares storage")
	}
	if _, ok := mustDist(t, s.SqDistances()).Points(); ok {
		t.Error("distance simplex has points")
	}
}

// Heron's formula: 3-4-5 (area 6) and 13-14-15 (area 84) from handbooks;
// the Heronian triangles 5-5-6 (12), 5-5-8 (12), 9-10-17 (36), 7-15-20 (42)
// from the list of Heronian triangles (Wikipedia "Heronian triangle",
// OEIS A055593), checked by hand from s(s−a)(s−b)(s−c).
func TestHeronianTriangles(t *testing.T) {
	for _, c := range []struct{ a, b, c, area int64 }{
		{3, 4, 5, 6}, {13, 14, 15, 84}, {5, 5, 6, 12}, {5, 5, 8, 12}, {9, 10, 17, 36}, {7, 15, 20, 42},
	} {
		a2, b2, c2 := qi(c.a*c.a), qi(c.b*c.b), qi(c.c*c.c)
		want := qi(c.area * c.area)
		got, err := TriangleAreaSq(a2, b2, c2)
		if err != nil {
			t.Fatal(err)
		}
		ratEq(t, "TriangleAreaSq", got, want)
		// Vertices 0, 1, 2 with |v1 v2| = a, |v0 v2| = b, |v0 v1| = c.
		d := matrixOf(
			[]string{"0", c2.RatString(), b2.RatString()},
			[]string{c2.RatString(), "0", a2.RatString()},
			[]string{b2.RatString(), a2.RatString(), "0"})
		s := mustDist(t, d)
		ratEq(t, "VolumeSq of triangle", s.VolumeSq(), want)
		checkCMRoute(t, s)
		// Facets are the sides: facet i is the side opposite vertex i.
		f := s.FacetContentsSq()
		ratEq(t, "facet 0", f[0], a2)
		ratEq(t, "facet 1", f[1], b2)
		ratEq(t, "facet 2", f[2], c2)
	}
	s := mustPoints(t, vec(0, 0), vec(3, 0), vec(0, 4))
	ratEq(t, "3-4-5 from points", s.VolumeSq(), qi(36))
	// The inradius of 3-4-5 is 1 (area/semiperimeter = 6/6).
	r2 := inradiusSq(s)
	if d, _ := new(big.Float).Sub(r2, big.NewFloat(1)).Float64(); d > 1e-60 || d < -1e-60 {
		t.Errorf("inradius² of 3-4-5 = %v", r2)
	}
}

func TestTangentLengths(t *testing.T) {
	for _, c := range []struct{ a, b, c, x, y, z int64 }{
		{3, 4, 5, 3, 2, 1}, {13, 14, 15, 8, 7, 6}, {1, 2, 3, 2, 1, 0},
	} {
		got, err := TangentLengths(qi(c.a), qi(c.b), qi(c.c))
		if err != nil {
			t.Fatal(err)
		}
		for i, w := range []int64{c.x, c.y, c.z} {
			ratEq(t, "tangent length", got[i], qi(w))
		}
	}
	if _, err := TangentLengths(qi(1), qi(2), qi(5)); !errors.Is(err, ErrNotEmbeddable) || !strings.Contains(err.Error(), "side c = 5") {
		t.Errorf("1,2,5: %v", err)
	}
	if _, err := TangentLengths(qi(-1), qi(2), qi(2)); !errors.Is(err, ErrNotEmbeddable) {
		t.Errorf("negative side: %v", err)
	}
	if _, err := TriangleAreaSq(qi(1), qi(4), qi(16)); !errors.Is(err, ErrNotEmbeddable) || !strings.Contains(err.Error(), "triangle inequality") {
		t.Errorf("sides 1,2,4: %v", err)
	}
	if _, err := TriangleAreaSq(qi(1), qi(-4), qi(1)); !errors.Is(err, ErrNotEmbeddable) || !strings.Contains(err.Error(), "b2 = -4") {
		t.Errorf("negative squared side: %v", err)
	}
	if got, err := TriangleAreaSq(qi(1), qi(4), qi(9)); err != nil || got.Sign() != 0 {
		t.Errorf("degenerate 1,2,3: %v %v", got, err)
	}
}

// Trirectangular tetrahedron with legs a, b, c at the right corner O:
// V = abc/6, and De Gua's theorem (J. P. de Gua de Malves, 1783; e.g.
// Wikipedia "De Gua's theorem"): the squared area of the face opposite O
// is the sum of the squared areas of the three right-angled faces. The
// dihedral angles between the coordinate faces are 90 degrees.
func TestTrirectangular(t *testing.T) {
	for _, legs := range [][3]string{{"1", "2", "3"}, {"3/2", "5/7", "4"}, {"1", "1", "1"}} {
		a, b, c := q(legs[0]), q(legs[1]), q(legs[2])
		z := new(big.Rat)
		s := mustPoints(t, []*big.Rat{z, z, z}, []*big.Rat{a, z, z}, []*big.Rat{z, b, z}, []*big.Rat{z, z, c})
		v := new(big.Rat).Mul(a, b)
		v.Mul(v, c)
		v.Quo(v, qi(6))
		ratEq(t, "V²", s.VolumeSq(), new(big.Rat).Mul(v, v))
		f := s.FacetContentsSq()
		sum := new(big.Rat).Add(f[1], f[2])
		sum.Add(sum, f[3])
		ratEq(t, "De Gua", f[0], sum)
		half := func(x, y *big.Rat) *big.Rat { // (xy/2)²
			p := new(big.Rat).Mul(x, y)
			p.Quo(p, qi(2))
			return p.Mul(p, p)
		}
		ratEq(t, "face OBC", f[1], half(b, c))
		ratEq(t, "face OAC", f[2], half(a, c))
		ratEq(t, "face OAB", f[3], half(a, b))
		for _, ij := range [][2]int{{1, 2}, {1, 3}, {2, 3}} {
			cos2, sign, err := s.DihedralCosSq(ij[0], ij[1])
			if err != nil || cos2.Sign() != 0 || sign != 0 {
				t.Errorf("dihedral %v = %v, %d, %v; want 90 degrees", ij, cos2, sign, err)
			}
		}
	}
}

// Circumradius: Thales (the hypotenuse is a diameter), the regular
// tetrahedron of edge 1 has R² = 3/8 and the regular k-simplex of unit
// edge R² = k/(2(k+1)) (handbook); points and distances agree with the
// formula −(1/2) det(D)/det(CM); the circumcentre is equidistant.
func TestCircumradius(t *testing.T) {
	s := mustPoints(t, vec(0, 0), vec(3, 0), vec(0, 4))
	r2, err := s.CircumradiusSq()
	if err != nil {
		t.Fatal(err)
	}
	ratEq(t, "3-4-5 R²", r2, q("25/4"))
	c, err := s.Circumcenter()
	if err != nil {
		t.Fatal(err)
	}
	ratEq(t, "centre x", c[0], q("3/2"))
	ratEq(t, "centre y", c[1], qi(2))

	tet := mustDist(t, regularDistances(4, qi(1)))
	r2, _ = tet.CircumradiusSq()
	ratEq(t, "regular tetrahedron R²", r2, q("3/8"))
	for k := 1; k <= 8; k++ {
		s := mustDist(t, regularDistances(k+1, qi(1)))
		r2, _ := s.CircumradiusSq()
		ratEq(t, "regular R²", r2, big.NewRat(int64(k), int64(2*(k+1))))
	}

	for k := 1; k <= 6; k++ {
		for seed := uint64(10); seed < 14; seed++ {
			s := Random(k, seed, 30, 9)
			checkCircum(t, s)
		}
	}
	// Not full-dimensional: a triangle and a tetrahedron in R^5.
	rng := rand.New(rand.NewPCG(7, 8))
	checkCircum(t, mustPoints(t, randVec(rng, 5, 9, 4), randVec(rng, 5, 9, 4), randVec(rng, 5, 9, 4)))
	checkCircum(t, mustPoints(t, randVec(rng, 5, 9, 4), randVec(rng, 5, 9, 4), randVec(rng, 5, 9, 4), randVec(rng, 5, 9, 4)))

	// A point has radius 0 and is its own centre.
	p := mustPoints(t, vec(1, 2))
	if r2, err := p.CircumradiusSq(); err != nil || r2.Sign() != 0 {
		t.Errorf("point R² = %v, %v", r2, err)
	}
}

func checkCircum(t *testing.T, s *Simplex) {
	t.Helper()
	r2, err := s.CircumradiusSq()
	if err != nil {
		t.Fatal(err)
	}
	d := mustDist(t, s.SqDistances())
	r2d, err := d.CircumradiusSq()
	if err != nil {
		t.Fatal(err)
	}
	ratEq(t, "R² points vs distances", r2d, r2)
	detD, _ := s.SqDistances().Det()
	cm := s.CayleyMenger()
	alt := new(big.Rat).Quo(detD, cm)
	alt.Quo(alt, qi(-2))
	ratEq(t, "R² = −det(D)/(2 det CM)", alt, r2)

	c, err := s.Circumcenter()
	if err != nil {
		t.Fatal(err)
	}
	pts, _ := s.Points()
	for i, p := range pts {
		e := sub(c, p)
		ratEq(t, "|c − v_"+string(rune('0'+i))+"|²", dot(e, e), r2)
	}
	// In the affine hull: barycentric coordinates reproduce c.
	lam, err := s.Barycentric(c)
	if err != nil {
		t.Fatalf("circumcentre not in the affine hull: %v", err)
	}
	lamD, _ := d.CircumcenterBarycentric()
	for i := range lam {
		ratEq(t, "circumcentre barycentric", lamD[i], lam[i])
	}
}

// Dihedral angles: the regular tetrahedron has cos θ = 1/3, the regular
// k-simplex cos θ = 1/k (handbook: arccos(1/k)); for triangles the angle
// between the sides opposite i and j is the angle at the third vertex
// (law of cosines); for random tetrahedra, compare with the angle between
// the half-planes at the common edge computed from coordinates.
func TestDihedral(t *testing.T) {
	for k := 2; k <= 7; k++ {
		s := mustDist(t, regularDistances(k+1, qi(1)))
		for i := 0; i <= k; i++ {
			for j := 0; j <= k; j++ {
				if i == j {
					continue
				}
				cos2, sign, err := s.DihedralCosSq(i, j)
				if err != nil {
					t.Fatal(err)
				}
				ratEq(t, "regular cos²", cos2, big.NewRat(1, int64(k*k)))
				if sign != 1 {
					t.Errorf("regular sign %d", sign)
				}
			}
		}
	}
	// Triangles: law of cosines.
	for seed := uint64(0); seed < 20; seed++ {
		s := Random(2, seed, 20, 5)
		for i := 0; i < 3; i++ {
			for j := 0; j < 3; j++ {
				if i == j {
					continue
				}
				c := 3 - i - j // the vertex between the two sides
				a2, b2, o2 := s.SqEdge(c, i), s.SqEdge(c, j), s.SqEdge(i, j)
				num := new(big.Rat).Add(a2, b2)
				num.Sub(num, o2)
				want := new(big.Rat).Mul(num, num)
				want.Quo(want, new(big.Rat).Mul(qi(4), new(big.Rat).Mul(a2, b2)))
				cos2, sign, err := s.DihedralCosSq(i, j)
				if err != nil {
					t.Fatal(err)
				}
				ratEq(t, "triangle angle cos²", cos2, want)
				if sign != num.Sign() {
					t.Errorf("triangle angle sign %d, want %d", sign, num.Sign())
				}
			}
		}
	}
	// Tetrahedra, from coordinates and from distances.
	for seed := uint64(0); seed < 20; seed++ {
		s := Random(3, seed, 20, 5)
		d := mustDist(t, s.SqDistances())
		pts, _ := s.Points()
		for i := 0; i < 4; i++ {
			for j := i + 1; j < 4; j++ {
				rest := []int{}
				for v := 0; v < 4; v++ {
					if v != i && v != j {
						rest = append(rest, v)
					}
				}
				a, b := rest[0], rest[1]
				u := sub(pts[b], pts[a])
				perp := func(p []*big.Rat) []*big.Rat {
					w := sub(p, pts[a])
					f := new(big.Rat).Quo(dot(w, u), dot(u, u))
					for c := range w {
						w[c].Sub(w[c], new(big.Rat).Mul(f, u[c]))
					}
					return w
				}
				pj, pi := perp(pts[j]), perp(pts[i]) // facet i contains j
				pq := dot(pi, pj)
				want := new(big.Rat).Mul(pq, pq)
				want.Quo(want, new(big.Rat).Mul(dot(pi, pi), dot(pj, pj)))
				for _, x := range []*Simplex{s, d} {
					cos2, sign, err := x.DihedralCosSq(i, j)
					if err != nil {
						t.Fatal(err)
					}
					ratEq(t, "tetrahedron cos²", cos2, want)
					if sign != pq.Sign() {
						t.Errorf("tetrahedron sign %d, want %d", sign, pq.Sign())
					}
					c2, s2, _ := x.DihedralCosSq(j, i)
					if c2.Cmp(cos2) != 0 || s2 != sign {
						t.Error("dihedral not symmetric")
					}
				}
			}
		}
	}
}

// The matrix Q of barycentric gradients is −2 times the lower right block
// of the inverse Cayley–Menger matrix (checked, since the doc says so).
func TestGradientGramIsInverseCM(t *testing.T) {
	for k := 1; k <= 5; k++ {
		s := Random(k, 99, 10, 3)
		inv, err := s.CayleyMengerMatrix().Inverse()
		if err != nil {
			t.Fatal(err)
		}
		c := s.core()
		qm := c.qInts(k) // det(g)/s times Q
		f := new(big.Rat).SetFrac(s.s, c.det)
		for i := 0; i <= k; i++ {
			for j := 0; j <= k; j++ {
				want := new(big.Rat).Mul(inv.At(i+1, j+1), qi(-2))
				got := new(big.Rat).Mul(new(big.Rat).SetInt(qm[i][j]), f)
				ratEq(t, "Q vs CM⁻¹", got, want)
			}
		}
	}
}

// The facet contents from the adjugate (core.go) agree with the direct
// Gram determinants of the facets, for degenerate simplices too.
func TestFacetContentsRoutes(t *testing.T) {
	check := func(s *Simplex) {
		t.Helper()
		a, b := s.FacetContentsSq(), s.facetContentsDirect()
		for i := range a {
			ratEq(t, "facet adjugate vs direct", a[i], b[i])
		}
	}
	rng := rand.New(rand.NewPCG(21, 22))
	for k := 1; k <= 7; k++ {
		check(Random(k, 5, 20, 6))
		// Degenerate: the last vertex is an affine combination of others.
		pts, _ := Random(k, 6, 20, 6).Points()
		last := make([]*big.Rat, k)
		w := randVec(rng, 1, 5, 3)[0]
		for c := range last { // w·v_0 + (1 − w)·v_(k−1)
			last[c] = new(big.Rat).Mul(w, pts[0][c])
			last[c].Add(last[c], new(big.Rat).Mul(new(big.Rat).Sub(qi(1), w), pts[k-1][c]))
		}
		pts[k] = last
		d := mustPoints(t, pts...)
		if !d.IsDegenerate() {
			t.Fatalf("k=%d: not degenerate", k)
		}
		check(d)
		check(mustDist(t, d.SqDistances()))
	}
}

// Affine maps: the k-volume scales by |det A| for square A (and by
// sqrt(det AᵀA) for A: R^k → R^m), and translations keep all distances.
func TestAffine(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for k := 1; k <= 4; k++ {
		s := Random(k, uint64(k), 20, 6)
		rows := make([][]*big.Rat, k)
		for i := range rows {
			rows[i] = randVec(rng, k, 5, 3)
		}
		a, _ := exact.NewMatrix(rows)
		det, _ := a.Det()
		img, err := s.Affine(a, randVec(rng, k, 5, 3))
		if err != nil {
			t.Fatal(err)
		}
		ratEq(t, "V²(A·S + t)", img.VolumeSq(), new(big.Rat).Mul(s.VolumeSq(), new(big.Rat).Mul(det, det)))

		tr, err := s.Affine(exact.Identity(k), randVec(rng, k, 5, 3))
		if err != nil {
			t.Fatal(err)
		}
		if !tr.SqDistances().Equal(s.SqDistances()) {
			t.Error("translation changed distances")
		}
		// Into a bigger space: m = k + 2.
		rows = make([][]*big.Rat, k+2)
		for i := range rows {
			rows[i] = randVec(rng, k, 5, 3)
		}
		b, _ := exact.NewMatrix(rows)
		btb, _ := b.Transpose().Mul(b)
		gdet, _ := btb.Det()
		img, err = s.Affine(b, nil)
		if err != nil {
			t.Fatal(err)
		}
		ratEq(t, "V²(B·S)", img.VolumeSq(), new(big.Rat).Mul(s.VolumeSq(), gdet))
	}
}

func TestFaces(t *testing.T) {
	s := Random(4, 3, 10, 4)
	d := mustDist(t, s.SqDistances())
	for _, x := range []*Simplex{s, d} {
		f, err := x.Face([]int{3, 1, 4})
		if err != nil {
			t.Fatal(err)
		}
		if f.Dim() != 2 {
			t.Errorf("face dim %d", f.Dim())
		}
		ratEq(t, "face edge (0,1)", f.SqEdge(0, 1), x.SqEdge(3, 1))
		ratEq(t, "face edge (1,2)", f.SqEdge(1, 2), x.SqEdge(1, 4))
		ratEq(t, "face edge (0,2)", f.SqEdge(2, 0), x.SqEdge(4, 3))
		v, _ := x.Face([]int{2})
		if v.Dim() != 0 || v.VolumeSq().Cmp(qi(1)) != 0 || len(v.FacetContentsSq()) != 0 {
			t.Error("vertex face")
		}
		seg, _ := x.Face([]int{0, 2})
		ratEq(t, "segment V²", seg.VolumeSq(), x.SqEdge(0, 2))
		fc := seg.FacetContentsSq()
		if len(fc) != 2 || fc[0].Cmp(qi(1)) != 0 {
			t.Error("segment facets")
		}
	}
	pts, _ := s.Points()
	f, _ := s.Facet(2)
	fp, _ := f.Points()
	if fp[2][0].Cmp(pts[3][0]) != 0 {
		t.Error("Facet(2) vertex order")
	}
}

func TestBarycentric(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 9))
	for k := 1; k <= 5; k++ {
		s := Random(k, 7, 10, 4)
		p := randVec(rng, k, 10, 4)
		lam, err := s.Barycentric(p)
		if err != nil {
			t.Fatal(err)
		}
		sum := new(big.Rat)
		for _, l := range lam {
			sum.Add(sum, l)
		}
		ratEq(t, "Σλ", sum, qi(1))
		back := s.combine(lam)
		for c := range p {
			ratEq(t, "Σλv", back[c], p[c])
		}
	}
	// A triangle in R^3: points of its plane work, others do not.
	s := mustPoints(t, vec(0, 0, 0), vec(2, 0, 0), vec(0, 2, 0))
	lam, err := s.Barycentric(vec(1, 1, 0))
	if err != nil {
		t.Fatal(err)
	}
	ratEq(t, "λ0", lam[0], qi(0))
	ratEq(t, "λ1", lam[1], q("1/2"))
	if _, err := s.Barycentric(vec(1, 1, 1)); !errors.Is(err, ErrNotInAffineHull) {
		t.Errorf("off-plane point: %v", err)
	}
}

// Euler's inequality R >= k·r for k-simplices, with equality exactly for
// the regular simplex (Euler 1765 for triangles; for n-simplices e.g.
// Klamkin & Tsintsifas, "The circumradius-inradius inequality for a
// simplex", Math. Mag. 52 (1979)). Random simplices: R² (exact) against
// k²r² in 256-bit floats, demanding a gap far above the rounding error.
// Regular simplices: R² = k² r² exactly, with r² = k²V²/((k+1)² F²).
func TestEulerInequality(t *testing.T) {
	for k := 2; k <= 5; k++ {
		for seed := uint64(0); seed < 10; seed++ {
			s := Random(k, seed, 100, 10)
			r2exact, _ := s.CircumradiusSq()
			R2 := new(big.Float).SetPrec(prec).SetRat(r2exact)
			kr2 := inradiusSq(s)
			kr2.Mul(kr2, new(big.Float).SetInt64(int64(k*k)))
			gap := new(big.Float).Sub(R2, kr2)
			margin := new(big.Float).Mul(R2, new(big.Float).SetMantExp(big.NewFloat(1), -200))
			if gap.Cmp(margin) <= 0 {
				t.Errorf("k=%d seed=%d: R² − k²r² = %v not certified positive", k, seed, gap)
			}
		}
	}
	for k := 1; k <= 8; k++ {
		s := mustDist(t, regularDistances(k+1, q("7/3")))
		fc := s.FacetContentsSq()
		for _, f := range fc {
			ratEq(t, "regular facets equal", f, fc[0])
		}
		r2 := new(big.Rat).Mul(s.VolumeSq(), qi(int64(k*k)))
		r2.Quo(r2, new(big.Rat).Mul(fc[0], qi(int64((k+1)*(k+1)))))
		R2, _ := s.CircumradiusSq()
		ratEq(t, "regular R² = k² r²", R2, new(big.Rat).Mul(r2, qi(int64(k*k))))
	}
}

func TestErrors(t *testing.T) {
	if _, err := FromPoints(nil); !errors.Is(err, exact.ErrShape) {
		t.Errorf("no points: %v", err)
	}
	_, err := FromPoints([][]*big.Rat{vec(1, 2), vec(1, 2), vec(3)})
	if !errors.Is(err, exact.ErrShape) || !strings.Contains(err.Error(), "point 2 has length 1, point 0 has length 2") {
		t.Errorf("ragged: %v", err)
	}
	_, err = FromPoints([][]*big.Rat{vec(1), vec(2), vec(3)})
	if !errors.Is(err, exact.ErrShape) || !strings.Contains(err.Error(), "3 points span a 2-simplex") {
		t.Errorf("too few coordinates: %v", err)
	}
	_, err = FromSquaredDistances(exact.Zeros(2, 3))
	if !errors.Is(err, exact.ErrShape) || !errors.Is(err, exact.ErrNotSquare) {
		t.Errorf("not square: %v", err)
	}
	for _, c := range []struct {
		m    *exact.Matrix
		want string
	}{
		{matrixOf([]string{"0", "1"}, []string{"2", "0"}), "entries (0, 1) = 1 and (1, 0) = 2 differ"},
		{matrixOf([]string{"0", "1"}, []string{"1", "3"}), "diagonal entry (1, 1) is 3"},
		{matrixOf([]string{"0", "-1"}, []string{"-1", "0"}), "entry (0, 1) is -1, negative"},
		{matrixOf([]string{"0", "1", "16"}, []string{"1", "0", "1"}, []string{"16", "1", "0"}), "triangle 0,1,2 violates the triangle inequality"},
		{nonEmbeddableTet(), "principal minor on {1, 2, 3}"},
	} {
		_, err := FromSquaredDistances(c.m)
		if !errors.Is(err, ErrNotEmbeddable) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%v: got %v, want %q", c.m, err, c.want)
		}
	}
	s := mustPoints(t, vec(0, 0), vec(1, 1), vec(2, 2)) // collinear
	if !s.IsDegenerate() {
		t.Error("collinear not degenerate")
	}
	if _, err := s.CircumradiusSq(); !errors.Is(err, ErrDegenerate) {
		t.Errorf("degenerate circumradius: %v", err)
	}
	if _, err := s.Circumcenter(); !errors.Is(err, ErrDegenerate) {
		t.Errorf("degenerate circumcentre: %v", err)
	}
	if _, _, err := s.DihedralCosSq(0, 1); !errors.Is(err, ErrDegenerate) {
		t.Errorf("degenerate dihedral: %v", err)
	}
	if _, err := s.Barycentric(vec(0, 0)); !errors.Is(err, ErrDegenerate) {
		t.Errorf("degenerate barycentric: %v", err)
	}
	ok := Random(2, 1, 10, 3)
	if _, _, err := ok.DihedralCosSq(1, 1); !errors.Is(err, exact.ErrShape) {
		t.Errorf("i == j: %v", err)
	}
	if _, _, err := ok.DihedralCosSq(0, 3); !errors.Is(err, exact.ErrShape) {
		t.Errorf("j out of range: %v", err)
	}
	if _, _, err := Random(1, 1, 10, 3).DihedralCosSq(0, 1); !errors.Is(err, exact.ErrShape) {
		t.Errorf("segment dihedral: %v", err)
	}
	if _, err := ok.Barycentric(vec(1)); !errors.Is(err, exact.ErrShape) {
		t.Errorf("barycentric length: %v", err)
	}
	d := mustDist(t, ok.SqDistances())
	if _, err := d.Circumcenter(); !errors.Is(err, exact.ErrShape) || !strings.Contains(err.Error(), "squared distances") {
		t.Errorf("circumcentre from distances: %v", err)
	}
	if _, err := d.Affine(exact.Identity(2), nil); !errors.Is(err, exact.ErrShape) {
		t.Errorf("affine from distances: %v", err)
	}
	if _, err := d.FacetAreaVectors(); !errors.Is(err, exact.ErrShape) {
		t.Errorf("area vectors from distances: %v", err)
	}
	if _, err := ok.Affine(exact.Identity(3), nil); !errors.Is(err, exact.ErrShape) {
		t.Errorf("affine 3x3 on R^2: %v", err)
	}
	if _, err := ok.Affine(exact.Identity(2), vec(1)); !errors.Is(err, exact.ErrShape) {
		t.Errorf("affine translation length: %v", err)
	}
	if _, err := ok.Affine(exact.Zeros(1, 2), nil); !errors.Is(err, exact.ErrShape) {
		t.Errorf("affine into R^1: %v", err)
	}
	for _, idx := range [][]int{nil, {0, 0}, {3}, {-1}} {
		if _, err := ok.Face(idx); !errors.Is(err, exact.ErrShape) {
			t.Errorf("Face(%v): %v", idx, err)
		}
	}
	if _, err := mustPoints(t, vec(1)).Facet(0); !errors.Is(err, exact.ErrShape) {
		t.Errorf("facet of a point: %v", err)
	}
	if _, err := ok.Facet(5); !errors.Is(err, exact.ErrShape) {
		t.Errorf("Facet(5): %v", err)
	}
	if _, err := CayleyMengerDet(exact.Zeros(1, 2)); !errors.Is(err, exact.ErrShape) {
		t.Errorf("CayleyMengerDet shape: %v", err)
	}
	func() {
		defer func() {
			if recover() == nil {
				t.Error("SqEdge out of range did not panic")
			}
		}()
		ok.SqEdge(0, 3)
	}()
	func() {
		defer func() {
			if recover() == nil {
				t.Error("Random(bound 0) did not panic")
			}
		}()
		Random(2, 1, 0, 1)
	}()
}

func TestString(t *testing.T) {
	s := mustPoints(t, vec(0, 0), vec(3, 0), []*big.Rat{q("0"), q("1/2")})
	if got := s.String(); got != "2-simplex with vertices [[0, 0], [3, 0], [0, 1/2]]" {
		t.Error(got)
	}
	d := mustDist(t, matrixOf([]string{"0", "2"}, []string{"2", "0"}))
	if got := d.String(); got != "1-simplex with squared distances [[0, 2], [2, 0]]" {
		t.Error(got)
	}
}

// The Gram matrix in machine words (gramWords) and in math/big agree with
// dot products of the edge vectors formed in big.Rat, on both sides of the
// word path's limits: edge coordinates near 2^61 once scaled, negative
// ones, denominators whose lcm passes a word, and nine coordinates.
func TestGramWordsAtLimits(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	cases := []struct {
		n           int
		bound, den  int64
		wantWordRun bool // whether gramWords takes the whole set
	}{
		{3, 1000, 100, true},
		{3, 1 << 59, 1, true},     // scaled coordinates < 2^59: every edge fits
		{3, 1 << 61, 1, false},    // coordinates up to 2^61: mostly the big path
		{8, 1 << 58, 1, true},     // eight products near 2^120
		{9, 20, 9, false},         // nine coordinates
		{4, 1000, 1 << 40, false}, // the lcm passes a word
	}
	for _, c := range cases {
		for rep := 0; rep < 20; rep++ {
			pts := make([][]*big.Rat, 4)
			for i := range pts {
				pts[i] = randVec(rng, c.n, c.bound, c.den)
			}
			s := mustPoints(t, pts...)
			g := s.Gram()
			for i := 1; i <= 3; i++ {
				for j := 1; j <= 3; j++ {
					ratEq(t, "Gram", g.At(i-1, j-1), dot(sub(pts[i], pts[0]), sub(pts[j], pts[0])))
				}
			}
			var lc lcmAcc
			for _, p := range pts {
				for _, x := range p {
					lc.add(x)
				}
			}
			l, ok := lc.word()
			took := ok && (&Simplex{k: 3, n: c.n, pts: pts}).gramWords(l)
			if c.wantWordRun && !took || c.n > 8 && took {
				t.Errorf("n=%d bound=%d den=%d: word path taken = %v", c.n, c.bound, c.den, took)
			}
		}
	}
}

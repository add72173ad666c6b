package geom

import (
	"errors"
	"math/big"
	"math/rand/v2"
	"testing"

	"assay/exact"
)

// Lagrange's identity / Cauchy–Binet: |v_1∧…∧v_k|² = det(v_i·v_j), and
// each component is the k x k minor of [v_1 … v_k] on its rows.
func TestLagrangeIdentity(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for n := 1; n <= 7; n++ {
		for k := 1; k <= n; k++ {
			vs := make([][]*big.Rat, k)
			for i := range vs {
				vs[i] = randVec(rng, n, 9, 4)
			}
			w, err := Wedge(vs...)
			if err != nil {
				t.Fatal(err)
			}
			if w.Grade() != k || w.Ambient() != n {
				t.Errorf("grade %d ambient %d", w.Grade(), w.Ambient())
			}
			g := exact.Zeros(k, k)
			for i := range vs {
				for j := range vs {
					g.Set(i, j, dot(vs[i], vs[j]))
				}
			}
			det, _ := g.Det()
			ratEq(t, "NormSq = Gram det", w.NormSq(), det)
			cols := make([][]*big.Rat, n) // n x k matrix [v_1 … v_k]
			for r := range cols {
				cols[r] = make([]*big.Rat, k)
				for c := range cols[r] {
					cols[r][c] = vs[c][r]
				}
			}
			m, _ := exact.NewMatrix(cols)
			all := make([]int, k)
			for i := range all {
				all[i] = i
			}
			for _, b := range w.Components() {
				minor, _ := m.Minor(b.Index, all)
				ratEq(t, "component = minor", b.Coef, minor)
			}
		}
	}
}

func TestWedgeAlgebra(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	u, v, x := randVec(rng, 4, 5, 3), randVec(rng, 4, 5, 3), randVec(rng, 4, 5, 3)
	uv, _ := Wedge(u, v)
	vu, _ := Wedge(v, u)
	if !uv.Equal(vu.Neg()) {
		t.Error("u∧v != −v∧u")
	}
	if uu, _ := Wedge(u, u); !uu.IsZero() {
		t.Error("u∧u != 0")
	}
	sum, _ := uv.Add(vu)
	if !sum.IsZero() {
		t.Error("u∧v + v∧u != 0")
	}
	diff, _ := uv.Sub(vu)
	if !diff.Equal(uv.Scale(qi(2))) {
		t.Error("u∧v − v∧u != 2 u∧v")
	}
	uvx, _ := Wedge(u, v, x)
	w1, _ := Wedge(u)
	vx, _ := Wedge(v, x)
	assoc, _ := w1.Wedge(vx)
	if !uvx.Equal(assoc) {
		t.Errorf("u∧(v∧x) = %v, want %v", assoc, uvx)
	}
	assoc2, _ := uv.Wedge(mustWedge(t, x))
	if !uvx.Equal(assoc2) {
		t.Error("(u∧v)∧x")
	}
	// Multilinearity: (u + x)∧v = u∧v + x∧v.
	ux := make([]*big.Rat, 4)
	for i := range ux {
		ux[i] = new(big.Rat).Add(u[i], x[i])
	}
	lhs, _ := Wedge(ux, v)
	xv, _ := Wedge(x, v)
	rhs, _ := uv.Add(xv)
	if !lhs.Equal(rhs) {
		t.Error("not linear")
	}
	// Coefficient in any order.
	c01, _ := uv.Coefficient([]int{0, 1})
	c10, _ := uv.Coefficient([]int{1, 0})
	ratEq(t, "e2^e1 coefficient", c10, new(big.Rat).Neg(c01))
	// Dot and NormSq.
	d, _ := uv.Dot(uv)
	ratEq(t, "Dot(w, w)", d, uv.NormSq())
	if s := uv.Scale(nil); !s.IsZero() {
		t.Error("Scale(nil)")
	}
}

func mustWedge(t *testing.T, vs ...[]*big.Rat) *KVector {
	t.Helper()
	w, err := Wedge(vs...)
	if err != nil {
		t.Fatal(err)
	}
	return w
}

// The Hodge star in R^3 turns u∧v into the cross product, and
// a∧⋆b = (a·b) e1∧…∧en.
func TestHodge(t *testing.T) {
	u, v := vec(1, 2, 3), vec(-4, 5, 1)
	cross := vec(2*1-3*5, 3*(-4)-1*1, 1*5-2*(-4))
	star := mustWedge(t, u, v).Hodge()
	got, err := star.Vector()
	if err != nil {
		t.Fatal(err)
	}
	for i := range cross {
		ratEq(t, "⋆(u∧v)", got[i], cross[i])
	}
	rng := rand.New(rand.NewPCG(15, 16))
	for n := 2; n <= 6; n++ {
		for k := 1; k < n; k++ {
			a := mustWedge(t, randVecs(rng, k, n)...)
			b := mustWedge(t, randVecs(rng, k, n)...)
			top, err := a.Wedge(b.Hodge())
			if err != nil {
				t.Fatal(err)
			}
			ab, _ := a.Dot(b)
			all := make([]int, n)
			for i := range all {
				all[i] = i
			}
			c, _ := top.Coefficient(all)
			ratEq(t, "a∧⋆b", c, ab)
			if !a.Hodge().Hodge().Equal(a.Scale(big.NewRat(int64(1-2*((k*(n-k))%2)), 1))) {
				t.Error("⋆⋆ != (−1)^(k(n−k))")
			}
		}
	}
}

func randVecs(rng *rand.Rand, k, n int) [][]*big.Rat {
	vs := make([][]*big.Rat, k)
	for i := range vs {
		vs[i] = randVec(rng, n, 7, 3)
	}
	return vs
}

func TestKVectorString(t *testing.T) {
	w, err := NewKVector(3, 2, Blade{[]int{0, 2}, qi(-1)}, Blade{[]int{0, 1}, qi(3)})
	if err != nil {
		t.Fatal(err)
	}
	if got := w.String(); got != "3*e1^e2 - e1^e3" {
		t.Errorf("String = %q", got)
	}
	w2 := mustWedge(t, []*big.Rat{q("1/2"), qi(0), qi(0)}, vec(0, 1, 1))
	if got := w2.String(); got != "1/2*e1^e2 + 1/2*e1^e3" {
		t.Errorf("String = %q", got)
	}
	if got := w2.Neg().String(); got != "-1/2*e1^e2 - 1/2*e1^e3" {
		t.Errorf("String = %q", got)
	}
	if got := mustWedge(t, vec(0, 0, 1)).String(); got != "e3" {
		t.Errorf("String = %q", got)
	}
	z, _ := NewKVector(2, 1)
	if z.String() != "0" || !z.IsZero() {
		t.Errorf("zero = %q", z.String())
	}
	s, _ := NewKVector(2, 0, Blade{nil, q("-5/2")})
	if s.String() != "-5/2" {
		t.Errorf("scalar = %q", s.String())
	}
	comps := w.Components()
	if len(comps) != 2 || comps[0].Index[1] != 1 || comps[1].Index[1] != 2 {
		t.Errorf("components %v", comps)
	}
	// Repeated blades add up; cancelling ones disappear.
	r, _ := NewKVector(3, 1, Blade{[]int{1}, qi(2)}, Blade{[]int{1}, qi(-2)}, Blade{[]int{0}, nil})
	if !r.IsZero() {
		t.Errorf("cancelled = %v", r)
	}
}

func TestKVectorErrors(t *testing.T) {
	shape := func(what string, err error) {
		t.Helper()
		if !errors.Is(err, exact.ErrShape) {
			t.Errorf("%s: %v", what, err)
		}
	}
	_, err := Wedge()
	shape("no vectors", err)
	_, err = Wedge(vec(1, 2), vec(1))
	shape("ragged", err)
	_, err = Wedge(vec(1), vec(2))
	shape("k > n", err)
	_, err = Wedge(make([]*big.Rat, 65))
	shape("n > 64", err)
	a := mustWedge(t, vec(1, 2, 3))
	b := mustWedge(t, vec(1, 2, 3), vec(0, 1, 0))
	_, err = a.Add(b)
	shape("add grades", err)
	_, err = a.Sub(mustWedge(t, vec(1, 2)))
	shape("sub dims", err)
	_, err = a.Dot(b)
	shape("dot", err)
	_, err = b.Wedge(b)
	shape("grade overflow", err)
	_, err = b.Vector()
	shape("vector of a 2-vector", err)
	_, err = a.Coefficient([]int{0, 1})
	shape("coefficient arity", err)
	_, err = b.Coefficient([]int{1, 1})
	shape("coefficient repeat", err)
	_, err = NewKVector(3, 4)
	shape("k > n", err)
	_, err = NewKVector(3, 2, Blade{[]int{2, 1}, qi(1)})
	shape("unsorted blade", err)
	_, err = NewKVector(3, 2, Blade{[]int{0, 3}, qi(1)})
	shape("index range", err)
	old := MaxComponents
	MaxComponents = 10
	defer func() { MaxComponents = old }()
	vs := make([][]*big.Rat, 3)
	for i := range vs {
		vs[i] = vec(1, 2, 3, 4, 5, 6, 7)
	}
	vs[1][0].SetInt64(9)
	vs[2][3].SetInt64(-8)
	if _, err := Wedge(vs...); !errors.Is(err, exact.ErrTooManyTerms) {
		t.Errorf("component cap: %v", err)
	}
}

// Minkowski's theorem for polytopes (H. Minkowski, 1897; e.g. Schneider,
// "Convex Bodies", §8.2): Σ F_i n_i = 0 over the facets of a polytope, with
// n_i the outward unit normals and F_i the facet contents. As (k−1)-vectors:
// Σ A_i = 0; each |A_i|² is the facet's squared content, and
// (−1)^(k−1) ⋆A_i points away from the opposite vertex.
func TestMinkowski(t *testing.T) {
	for k := 2; k <= 5; k++ {
		for seed := uint64(0); seed < 6; seed++ {
			s := Random(k, seed, 20, 5)
			checkAreaVectors(t, s, true)
		}
	}
	// Negatively oriented: swap two vertices.
	s := Random(3, 1, 20, 5)
	pts, _ := s.Points()
	pts[0], pts[1] = pts[1], pts[0]
	checkAreaVectors(t, mustPoints(t, pts...), true)
	// Lower-dimensional simplices in R^5 still close up.
	rng := rand.New(rand.NewPCG(17, 18))
	for k := 1; k <= 4; k++ {
		checkAreaVectors(t, mustPoints(t, randVecs(rng, k+1, 5)...), false)
	}
	// Segments on a line: A_0 = +1 at the right end when v0 < v1.
	seg := mustPoints(t, vec(1), vec(4))
	av, _ := seg.FacetAreaVectors()
	if av[0].String() != "1" || av[1].String() != "-1" {
		t.Errorf("segment area vectors %v %v", av[0], av[1])
	}
	if av, err := mustPoints(t, vec(2)).FacetAreaVectors(); err != nil || len(av) != 0 {
		t.Errorf("point: %v %v", av, err)
	}
}

func checkAreaVectors(t *testing.T, s *Simplex, outward bool) {
	t.Helper()
	av, err := s.FacetAreaVectors()
	if err != nil {
		t.Fatal(err)
	}
	fc := s.FacetContentsSq()
	sum := av[0]
	for i, a := range av {
		ratEq(t, "|A_i|²", a.NormSq(), fc[i])
		if i > 0 {
			sum, _ = sum.Add(a)
		}
	}
	if !sum.IsZero() {
		t.Errorf("k=%d: Σ A_i = %v", s.Dim(), sum)
	}
	if !outward {
		return
	}
	k := s.Dim()
	pts, _ := s.Points()
	for i, a := range av {
		nv, err := a.Hodge().Vector()
		if err != nil {
			t.Fatal(err)
		}
		if k%2 == 0 { // (−1)^(k−1) = −1
			for c := range nv {
				nv[c].Neg(nv[c])
			}
		}
		w0 := pts[others(k, i)[0]]
		if dot(sub(pts[i], w0), nv).Sign() >= 0 {
			t.Errorf("k=%d: normal of facet %d does not point outward", k, i)
		}
	}
}

package geom

import (
	"math/big"
	"sync"

	"assay/exact"
)

// core holds what most measurements need, computed once per simplex: the
// determinant and the adjugate of the scaled Gram matrix g (k x k, g =
// s·Gram). From them, with A = adj(g) and h = diag(g):
//
//	det Gram           = det g / s^k
//	facet i >= 1       F_i² = A_ii / (s^(k−1) ((k−1)!)²)   (A_ii is the principal minor without i)
//	facet 0            F_0² = Σ_ab A_ab / (s^(k−1) ((k−1)!)²)
//	circumradius       R² = hᵀ A h / (4 s det g)
//	circumcentre       x = A h / (2 det g),  c = v_0 + Σ x_i (v_i − v_0)
//	gradients          ∇λ_i·∇λ_j ∝ A_ij (i, j >= 1), −Σ_a A_aj (i = 0), Σ_ab A_ab (i = j = 0)
//
// The facet-0 formula: F_0 is the content of the facet with height h_0 =
// 1/|∇λ_0| over it, so F_0² = k² V² |∇λ_0|² = k² V² s Σ A_ab / det g; both
// sides are polynomials in g, so it holds for degenerate simplices too.
type core struct {
	det *big.Int
	adj []*big.Int // k*k, symmetric; nil when k > 3 and det == 0

	qOnce sync.Once    // computes q
	q     [][]*big.Int // qInts, cached by Simplex.gradients

}

// core returns the cached core, computing it on first use.
func (s *Simplex) core() *core {
	s.once.Do(func() { s.c = s.computeCore() })
	return s.c
}

func (s *Simplex) computeCore() *core {
	k, g := s.k, s.g
	switch k {
	case 0:
		return &core{det: big.NewInt(1), adj: []*big.Int{}}
	case 1:
		return &core{det: new(big.Int).Set(g[0]), adj: []*big.Int{big.NewInt(1)}}
	case 2:
		a, b, c := g[0], g[1], g[3]
		det := new(big.Int).Mul(a, c)
		det.Sub(det, new(big.Int).Mul(b, b))
		nb := new(big.Int).Neg(b)
		return &core{det: det, adj: []*big.Int{new(big.Int).Set(c), nb, nb, new(big.Int).Set(a)}}
	case 3:
		a, b, c, d, e, f := g[0], g[1], g[2], g[4], g[5], g[8]
		// The six minors, det and a temporary in one block of Ints and
		// one of words, each with room for det (three entries' width):
		// math/big then allocates nothing more.
		width := 0
		for _, x := range g {
			width = max(width, len(x.Bits()))
		}
		room := 3*width + 2
		words := make([]big.Word, 8*room)
		ints := make([]big.Int, 8)
		for i := range ints {
			ints[i].SetBits(words[i*room : i*room : (i+1)*room])
		}
		t := &ints[7]
		ints = ints[:7]
		m2 := func(w, x, y, z *big.Int) *big.Int { // wx − yz
			r := &ints[0]
			ints = ints[1:]
			r.Mul(w, x)
			return r.Sub(r, t.Mul(y, z))
		}
		a00, a11, a22 := m2(d, f, e, e), m2(a, f, c, c), m2(a, d, b, b)
		a01, a02, a12 := m2(c, e, b, f), m2(b, e, c, d), m2(b, c, a, e)
		det := ints[0].Mul(a, a00)
		det.Add(det, t.Mul(b, a01))
		det.Add(det, t.Mul(c, a02))
		return &core{det: det, adj: []*big.Int{a00, a01, a02, a01, a11, a12, a02, a12, a22}}
	}
	det := bareiss(s.gramInts())
	if det.Sign() == 0 {
		return &core{det: det}
	}
	m := exact.Zeros(k, k)
	for i := range g {
		m.Set(i/k, i%k, new(big.Rat).SetInt(g[i]))
	}
	inv, err := m.Inverse()
	if err != nil {
		panic("geom: non-zero determinant but singular: " + err.Error())
	}
	detR := new(big.Rat).SetInt(det)
	adj := make([]*big.Int, k*k)
	for i := range adj {
		x := inv.At(i/k, i%k)
		x.Mul(x, detR)
		if !x.IsInt() {
			panic("geom: adjugate entry not an integer")
		}
		adj[i] = new(big.Int).Set(x.Num())
	}
	return &core{det: det, adj: adj}
}

// qInts returns the (k+1) x (k+1) matrix Q' = det(g)·s⁻¹·Q, a positive
// multiple (for a non-degenerate simplex) of Q_ij = ∇λ_i·∇λ_j, from the
// adjugate; nil when the adjugate is unavailable.
func (c *core) qInts(k int) [][]*big.Int {
	if c.adj == nil {
		return nil
	}
	q := make([][]*big.Int, k+1)
	for i := range q {
		q[i] = make([]*big.Int, k+1)
		for j := range q[i] {
			q[i][j] = new(big.Int)
		}
	}
	for i := 1; i <= k; i++ {
		for j := 1; j <= k; j++ {
			x := c.adj[(i-1)*k+j-1]
			q[i][j].Set(x)
			q[0][j].Sub(q[0][j], x)
			q[i][0].Sub(q[i][0], x)
			q[0][0].Add(q[0][0], x)
		}
	}
	return q
}

// scaledPoints returns l = √s and the integral points l·v_i, computed
// once per simplex (shared: read only). It needs a simplex from points.
func (s *Simplex) scaledPoints() (l *big.Int, lp [][]*big.Int) {
	c := &s.cache
	c.ptsOnce.Do(func() {
		c.l = new(big.Int).Sqrt(s.s)
		pts := s.points()
		c.lp = make([][]*big.Int, len(pts))
		for i, p := range pts {
			c.lp[i] = make([]*big.Int, len(p))
			for j, x := range p {
				c.lp[i][j] = scaleToInt(x, c.l)
			}
		}
	})
	return c.l, c.lp
}

// scaledEdges returns the (k+1) x (k+1) matrix of sqEdgeScaled, computed
// once per simplex (shared: read only).
func (s *Simplex) scaledEdges() [][]*big.Int {
	c := &s.cache
	c.edgeOnce.Do(func() {
		// One block each for the rows, the k(k+1)/2 entries off the
		// diagonal and their words (room for g_ii + g_jj − 2 g_ij), the
		// diagonal the shared zero: the Cayley–Menger determinant of a
		// random tetrahedron spent 7% here allocating entry by entry.
		N := s.k + 1
		var ew [4][4]exact.Wide // in words where they fit (edgesWide)
		wide := s.edgesWide(&ew)
		width := 0
		for _, x := range s.g {
			width = max(width, len(x.Bits()))
		}
		room := width + 1
		ints := make([]big.Int, N*(N-1)/2)
		words := make([]big.Word, len(ints)*room)
		ptrs := make([]*big.Int, N*N)
		c.edges = make([][]*big.Int, N)
		pos := 0
		for i := range c.edges {
			c.edges[i] = ptrs[i*N : (i+1)*N]
			c.edges[i][i] = zeroInt
			for j := range i {
				z := ints[pos].SetBits(words[pos*room : pos*room : (pos+1)*room])
				pos++
				if wide {
					ew[j][i].Int(z)
				} else {
					s.setSqEdgeScaled(z, j, i)
				}
				c.edges[i][j], c.edges[j][i] = z, z
			}
		}
	})
	return c.edges
}

// shapeCache holds integers several methods of shape.go share, each
// computed once per simplex behind its own sync.Once (read only after).
type shapeCache struct {
	edgeOnce sync.Once    // computes edges
	edges    [][]*big.Int // s·|v_i − v_j|², by Simplex.scaledEdges

	ptsOnce sync.Once    // computes l and lp
	l       *big.Int     // √s, a multiple of every coordinate's denominator
	lp      [][]*big.Int // l·v_i, integral, by Simplex.scaledPoints
}

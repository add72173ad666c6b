package geom

import (
	"fmt"
	"math/big"

	"assay/exact"
)

// VolumeSq returns the squared k-volume det(Gram)/(k!)², equal to
// (−1)^(k+1) CayleyMenger()/(2^k (k!)²). A point (k = 0) has squared
// volume 1.
//
// From points with a word l = √s (gramWords), it is computed from edet
// when k = n <= 3 (volumeSqWords), else reduced against l a factor at a
// time in words (ratWordPow) while (k!)² is a word.
func (s *Simplex) VolumeSq() *big.Rat {
	if s.edet != nil {
		return s.volumeSqWords()
	}
	det := s.core().det
	if det.Sign() == 0 {
		return new(big.Rat)
	}
	if s.l != 0 && s.k <= 12 { // 12!² < 2^64 < 13!²
		f := factorialWord(s.k)
		return ratWordPow(det, s.l, 2*s.k, f*f)
	}
	f := factorial(s.k)
	den := new(big.Int).Exp(s.s, big.NewInt(int64(s.k)), nil)
	den.Mul(den, f)
	den.Mul(den, f)
	return ratFrac(det, den)
}

// volumeSqWords returns VolumeSq from edet (k <= 3): V = |edet|/(l^k k!),
// reduced in words and squared (squares of coprime integers are
// coprime).
func (s *Simplex) volumeSqWords() *big.Rat {
	if s.edet.Sign() == 0 {
		return new(big.Rat)
	}
	var nb [3]uint64 // |edet| < 2^189
	var db [4]uint64 // l^k k!/g: k+1 words at most
	n, d := exact.ReduceWordPow(wordsOf(nb[:0], s.edet.Bits()), db[:0], s.l, s.k, factorialWord(s.k))
	b := new(struct {
		r big.Rat
		w [2 * (len(nb) + len(db))]big.Word
	}) // the result and its words in one allocation
	r := b.r.SetInt64(1) // so that Denom is a reference
	r.Num().SetBits(mulWords(b.w[:2*len(n):2*len(n)], n, n))
	r.Denom().SetBits(mulWords(b.w[2*len(n):2*(len(n)+len(d))], d, d))
	return r
}

// IsDegenerate reports whether the squared volume is 0, that is whether
// the vertices are affinely dependent.
func (s *Simplex) IsDegenerate() bool {
	if s.edet != nil {
		return s.edet.Sign() == 0
	}
	return s.core().det.Sign() == 0
}

// facetDen returns s^(k−1) ((k−1)!)², the denominator of the facet
// contents (k >= 1).
func (s *Simplex) facetDen() *big.Int {
	f := factorial(s.k - 1)
	den := new(big.Int).Exp(s.s, big.NewInt(int64(s.k-1)), nil)
	den.Mul(den, f)
	return den.Mul(den, f)
}

// FacetContentsSq returns the squared (k−1)-volumes of the k+1 facets,
// facet i opposite vertex i; the facets of a segment are points, of
// content 1. A point (k = 0) has no facets: the result is empty.
//
// With A the adjugate of the Gram matrix, facet i >= 1 (which contains
// vertex 0) has squared content A_ii/((k−1)!)², A_ii being the principal
// minor of the Gram matrix without row and column i, and facet 0 has
// Σ_ab A_ab/((k−1)!)² (see core.go).
func (s *Simplex) FacetContentsSq() []*big.Rat {
	k := s.k
	if k == 0 {
		return []*big.Rat{}
	}
	c := s.core()
	if c.adj == nil {
		return s.facetContentsDirect()
	}
	den := s.facetDen()
	out := make([]*big.Rat, k+1)
	sum := new(big.Int)
	for _, x := range c.adj {
		sum.Add(sum, x)
	}
	out[0] = ratFrac(sum, den)
	for i := 1; i <= k; i++ {
		out[i] = ratFrac(c.adj[(i-1)*k+i-1], den)
	}
	return out
}

// facetContentsDirect computes the facet contents from their own Gram
// matrices: facet i >= 1 from the principal submatrix without i, facet 0
// from the Gram matrix of the edge vectors from vertex 1.
func (s *Simplex) facetContentsDirect() []*big.Rat {
	k := s.k
	out := make([]*big.Rat, k+1)
	den := s.facetDen()
	a := make([][]*big.Int, k-1)
	for x := 2; x <= k; x++ {
		a[x-2] = make([]*big.Int, k-1)
		for y := 2; y <= k; y++ {
			z := new(big.Int).Sub(s.gi(x, y), s.gi(x, 1))
			z.Sub(z, s.gi(1, y))
			a[x-2][y-2] = z.Add(z, s.gi(1, 1))
		}
	}
	out[0] = ratFrac(bareiss(a), den)
	for i := 1; i <= k; i++ {
		a := make([][]*big.Int, 0, k-1)
		for x := 1; x <= k; x++ {
			if x == i {
				continue
			}
			row := make([]*big.Int, 0, k-1)
			for y := 1; y <= k; y++ {
				if y != i {
					row = append(row, new(big.Int).Set(s.gi(x, y)))
				}
			}
			a = append(a, row)
		}
		out[i] = ratFrac(bareiss(a), den)
	}
	return out
}

// CircumradiusSq returns the squared circumradius R², the squared radius
// of the (k−1)-sphere through the vertices within their affine hull.
// With x the solution of Gram·x = diag(Gram)/2 the circumcentre is
// v_0 + Σ x_i (v_i − v_0) and R² = x·diag(Gram)/2; computed as
//
//	R² = hᵀ adj(G) h / (4 det G) = −det [[G, h], [hᵀ, 0]] / (4 det G),   h = diag(G),
//
// which equals −(1/2) det(D)/det(CM) with D the squared-distance matrix
// and CM the Cayley–Menger matrix. A degenerate simplex gives
// ErrDegenerate; a point has R² = 0.
func (s *Simplex) CircumradiusSq() (*big.Rat, error) {
	k := s.k
	if k == 0 {
		return new(big.Rat), nil
	}
	c := s.core()
	if c.det.Sign() == 0 {
		return nil, fmt.Errorf("circumradius: %w (squared volume 0)", ErrDegenerate)
	}
	num := new(big.Int)
	var t big.Int
	for i := 0; i < k; i++ {
		hi := s.g[i*k+i]
		row := new(big.Int)
		for j := 0; j < k; j++ {
			row.Add(row, t.Mul(c.adj[i*k+j], s.g[j*k+j]))
		}
		num.Add(num, t.Mul(row, hi))
	}
	den := new(big.Int).Mul(c.det, s.s)
	den.Lsh(den, 2)
	return ratFrac(num, den), nil
}

// CircumcenterBarycentric returns the barycentric coordinates
// (λ_0, …, λ_k), summing to 1, of the circumcentre: the point of the
// affine hull equidistant from all vertices. It works for simplices built
// from squared distances too. A degenerate simplex gives ErrDegenerate.
func (s *Simplex) CircumcenterBarycentric() ([]*big.Rat, error) {
	k := s.k
	if k == 0 {
		return []*big.Rat{big.NewRat(1, 1)}, nil
	}
	c := s.core()
	if c.det.Sign() == 0 {
		return nil, fmt.Errorf("circumcentre: %w (squared volume 0)", ErrDegenerate)
	}
	den := new(big.Int).Lsh(c.det, 1)
	out := make([]*big.Rat, k+1)
	out[0] = big.NewRat(1, 1)
	var t big.Int
	for i := 1; i <= k; i++ {
		z := new(big.Int)
		for j := 0; j < k; j++ {
			z.Add(z, t.Mul(c.adj[(i-1)*k+j], s.g[j*k+j]))
		}
		out[i] = ratFrac(z, den)
		out[0].Sub(out[0], out[i])
	}
	return out, nil
}

// errNoPoints is the error for operations that need coordinates.
func errNoPoints(op string) error {
	return fmt.Errorf("%s: the simplex was built from squared distances and has no coordinates: %w", op, exact.ErrShape)
}

// Circumcenter returns the circumcentre, the point of the affine hull of
// the vertices equidistant from all of them. It needs a simplex built
// from points (else an error wrapping exact.ErrShape) that is not
// degenerate (ErrDegenerate).
func (s *Simplex) Circumcenter() ([]*big.Rat, error) {
	if s.d != nil {
		return nil, errNoPoints("circumcentre")
	}
	lam, err := s.CircumcenterBarycentric()
	if err != nil {
		return nil, err
	}
	return s.combine(lam), nil
}

// combine returns Σ lam_i v_i.
func (s *Simplex) combine(lam []*big.Rat) []*big.Rat {
	pts := s.points()
	out := make([]*big.Rat, s.n)
	var t big.Rat
	for c := range out {
		out[c] = new(big.Rat)
		for i, l := range lam {
			if l.Sign() != 0 {
				out[c].Add(out[c], t.Mul(l, pts[i][c]))
			}
		}
	}
	return out
}

// Barycentric returns the barycentric coordinates (λ_0, …, λ_k) of p,
// summing to 1, with p = Σ λ_i v_i. It needs a simplex built from points
// (else exact.ErrShape) that is not degenerate (ErrDegenerate), and p of
// the points' length (exact.ErrShape). When the simplex is not
// full-dimensional (k < n), p must lie in the affine hull of the vertices,
// else the error wraps ErrNotInAffineHull.
func (s *Simplex) Barycentric(p []*big.Rat) ([]*big.Rat, error) {
	if s.d != nil {
		return nil, errNoPoints("barycentric")
	}
	if len(p) != s.n {
		return nil, fmt.Errorf("barycentric: point has %d coordinates, the simplex lives in R^%d: %w", len(p), s.n, exact.ErrShape)
	}
	k, pts := s.k, s.points()
	q := make([]*big.Rat, s.n)
	for c := range q {
		q[c] = new(big.Rat)
		if p[c] != nil {
			q[c].Set(p[c])
		}
	}
	if k == 0 {
		for c := range q {
			if q[c].Cmp(pts[0][c]) != 0 {
				return nil, fmt.Errorf("barycentric: %w (the simplex is the point %s)", ErrNotInAffineHull, fmtVec(pts[0]))
			}
		}
		return []*big.Rat{big.NewRat(1, 1)}, nil
	}
	if k == s.n {
		if c := s.core(); c.det.Sign() != 0 {
			return s.barycentricFull(c, q), nil
		}
	}
	// Solve Gram·x = Eᵀ(p − v_0) with E the edge vectors.
	e := make([][]*big.Rat, k)
	for i := range e {
		e[i] = make([]*big.Rat, s.n)
		for c := range e[i] {
			e[i][c] = new(big.Rat).Sub(pts[i+1][c], pts[0][c])
		}
	}
	rhs := exact.Zeros(k, 1)
	var t big.Rat
	for i := range e {
		z := new(big.Rat)
		for c := range e[i] {
			z.Add(z, t.Mul(e[i][c], t.Sub(q[c], pts[0][c])))
		}
		rhs.Set(i, 0, z)
	}
	x, err := s.Gram().Solve(rhs)
	if err != nil {
		return nil, fmt.Errorf("barycentric: %w (squared volume 0)", ErrDegenerate)
	}
	out := make([]*big.Rat, k+1)
	out[0] = big.NewRat(1, 1)
	for i := 1; i <= k; i++ {
		out[i] = x.At(i-1, 0)
		out[0].Sub(out[0], out[i])
	}
	if k < s.n {
		back := s.combine(out)
		for c := range back {
			if back[c].Cmp(q[c]) != 0 {
				return nil, fmt.Errorf("barycentric: %w: %s is not in the affine hull of the %d-simplex in R^%d", ErrNotInAffineHull, fmtVec(q), k, s.n)
			}
		}
	}
	return out, nil
}

func fmtVec(v []*big.Rat) string {
	b := []byte{'['}
	for i, x := range v {
		if i > 0 {
			b = append(b, ", "...)
		}
		b = append(b, exact.FormatRat(x)...)
	}
	return string(append(b, ']'))
}

// DihedralCosSq returns the square of cos θ_ij and the sign of cos θ_ij
// (−1, 0 or +1), where θ_ij is the interior dihedral angle between the
// facets opposite vertices i and j (i != j), measured inside the affine
// hull of the simplex. For a triangle it is the angle at the third vertex.
//
// Formula: let λ_0, …, λ_k be the barycentric coordinate functions on the
// affine hull; ∇λ_i is the inward normal of facet i, of length
// 1/height_i. With Q_ij = ∇λ_i·∇λ_j, read off the inverse Gram matrix
// (Q_ij = (G⁻¹)_ij for i, j >= 1, Q_0j = −Σ_a (G⁻¹)_aj,
// Q_00 = Σ_ab (G⁻¹)_ab; computed from the adjugate, a positive multiple),
//
//	cos θ_ij = −Q_ij / sqrt(Q_ii Q_jj),
//
// so cos² = Q_ij²/(Q_ii Q_jj) and sign = −sign(Q_ij). (Q is, up to the
// factor −1/2, the lower right block of the inverse Cayley–Menger matrix.)
// It needs k >= 2 and valid distinct indices (exact.ErrShape) and a
// non-degenerate simplex (ErrDegenerate).
func (s *Simplex) DihedralCosSq(i, j int) (cos2 *big.Rat, sign int, err error) {
	if err := s.checkDihedral(i, j); err != nil {
		return nil, 0, err
	}
	cos2, sign = dihedralCos(s.gradients(), i, j)
	return cos2, sign, nil
}

// checkDihedral returns DihedralCosSq's error for facets i, j, if any.
func (s *Simplex) checkDihedral(i, j int) error {
	if s.k < 2 {
		return fmt.Errorf("dihedral angle: a %d-simplex has no dihedral angles (k >= 2 needed): %w", s.k, exact.ErrShape)
	}
	if err := s.checkVertex("dihedral angle", i); err != nil {
		return err
	}
	if err := s.checkVertex("dihedral angle", j); err != nil {
		return err
	}
	if i == j {
		return fmt.Errorf("dihedral angle: the facets must differ, got i = j = %d: %w", i, exact.ErrShape)
	}
	c := s.core()
	if c.det.Sign() == 0 {
		return fmt.Errorf("dihedral angle: %w (squared volume 0)", ErrDegenerate)
	}
	return nil
}

// Affine returns the image of the simplex under x ↦ A x + t, applied to
// every vertex. It needs a simplex built from points (exact.ErrShape
// otherwise); A must be m x n for points of length n, t of length m (nil
// for no translation), and m >= k (exact.ErrShape).
func (s *Simplex) Affine(a *exact.Matrix, t []*big.Rat) (*Simplex, error) {
	if s.d != nil {
		return nil, errNoPoints("affine")
	}
	if a == nil {
		return nil, fmt.Errorf("affine: nil matrix: %w", exact.ErrShape)
	}
	if a.Cols() != s.n {
		return nil, fmt.Errorf("affine: a %dx%d matrix cannot act on points of R^%d: %w", a.Rows(), a.Cols(), s.n, exact.ErrShape)
	}
	m := a.Rows()
	if t != nil && len(t) != m {
		return nil, fmt.Errorf("affine: translation has length %d, the %dx%d matrix maps into R^%d: %w", len(t), m, a.Cols(), m, exact.ErrShape)
	}
	if m < s.k {
		return nil, fmt.Errorf("affine: a %d-simplex cannot be mapped into R^%d (%dx%d matrix): %w", s.k, m, m, a.Cols(), exact.ErrShape)
	}
	rows := make([][]*big.Rat, m)
	for r := range rows {
		rows[r] = a.Row(r)
	}
	pts := make([][]*big.Rat, s.k+1)
	var tmp big.Rat
	for i, p := range s.points() {
		q := make([]*big.Rat, m)
		for r := range q {
			z := new(big.Rat)
			if t != nil && t[r] != nil {
				z.Set(t[r])
			}
			for c, x := range rows[r] {
				if x.Sign() != 0 && p[c].Sign() != 0 {
					z.Add(z, tmp.Mul(x, p[c]))
				}
			}
			q[r] = z
		}
		pts[i] = q
	}
	return fromOwnedPoints(pts), nil
}

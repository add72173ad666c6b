package geom

// The rest of a series simplex's geometry: every measure that is
// algebraic in the coordinates (rational operations and square roots),
// from one Gram matrix G of the edges from vertex 0 and its adjugate, as
// for rational simplices (core.go, shape.go, frame.go): circumcentre,
// incentre, touch points, exspheres, tangent lengths, centroid,
// barycentric coordinates, facet normals and altitudes, the cosines of
// vertex and dihedral angles, and the mesh-quality measures that are
// algebraic (radius ratio, volume–length ratio, aspect ratio).
//
// Divisions are taken last, by series whose leading coefficient is
// proved non-zero (exact.SeriesQuo refuses one it cannot find within the
// order, and the caller raises the order). Square roots take the branch
// of exact.SeriesPow — the positive root of a positive leading
// coefficient — which is the root the rational methods take: every
// quantity rooted here (squared contents, squared lengths) is positive
// near the expansion point when the simplex is not degenerate there.
//
// Angles are transcendental and are not here (the kernel takes
// exact.SeriesAcos of the cosines); neither is a decision such as
// containment, whose answer may change with t at no order a truncated
// series reaches.
//
// Measured (go test -bench Series ./exact/geom, 2 cores shared by up to
// 8 sessions, load average 15, December 2026): the squeezed tetrahedron
// (0,0,0), (4,0,t), (1,3,2t), (3,2,−t) on t + O(t^7): inradius 0.8–1.9 ms
// (0.5–2.3 ms before this file, same runs: the adjugate is made only for
// the measures that need it), circumcentre and touch points together
// 3.6–13 ms (BenchmarkSeriesShape; its CPU profile: 2.2 ms of CPU per op,
// half of it allocation); 6.7–19 ms on a tetrahedron whose
// facet contents expand with algebraic coefficients. From a notebook
// (kernel's BenchmarkSeriesCircumcenter) 9.6–27 ms; the target
// for the inradius is 50 ms.

import (
	"fmt"
	"math/big"
	"sync"

	"assay/exact"
)

// ops applies series operations with a sticky error, so that a formula
// reads as a formula: after the first error every operation returns nil
// and err keeps the first.
type ops struct{ err error }

func (o *ops) do(f func() (*exact.Series, error)) *exact.Series {
	if o.err != nil {
		return nil
	}
	x, err := f()
	o.err = err
	return x
}

func (o *ops) add(a, b *exact.Series) *exact.Series {
	return o.do(func() (*exact.Series, error) { return exact.SeriesAdd(a, b) })
}

func (o *ops) sub(a, b *exact.Series) *exact.Series {
	return o.do(func() (*exact.Series, error) { return exact.SeriesSub(a, b) })
}

func (o *ops) mul(a, b *exact.Series) *exact.Series {
	return o.do(func() (*exact.Series, error) { return exact.SeriesMul(a, b) })
}

func (o *ops) quo(a, b *exact.Series) *exact.Series {
	return o.do(func() (*exact.Series, error) { return exact.SeriesQuo(a, b) })
}

func (o *ops) sqrt(a *exact.Series) *exact.Series {
	return o.do(func() (*exact.Series, error) { return exact.SeriesPow(a, 1, 2) })
}

// sum is Σ xs (0 for none).
func (o *ops) sum(xs ...*exact.Series) *exact.Series {
	out := sconst(0)
	for _, x := range xs {
		out = o.add(out, x)
	}
	return out
}

// sconst is the exact constant n.
func sconst(n int64) *exact.Series { return exact.SeriesConst(exact.RealFromInt(n), 0) }

// isZero reports whether x is the exact constant 0.
func isZero(x *exact.Series) bool {
	_, _, known := x.Leading()
	return x.Exact() && !known
}

// SeriesShape is a series simplex with what its measures share: the
// edges e_a = v_a − v_0, the Gram matrix G, det G and, made on first use,
// adj G. Make it with
// SeriesPoints.Shape; it is read only, and safe for concurrent use.
type SeriesShape struct {
	p     SeriesPoints
	k     int
	edges [][]*exact.Series
	gram  [][]*exact.Series
	det   *exact.Series

	adjOnce sync.Once
	adj     [][]*exact.Series // adj G, symmetric
	q       [][]*exact.Series // Q̃ = det G · (∇λ_i·∇λ_j), (k+1)×(k+1)
	adjErr  error

	contentsOnce sync.Once
	contents     []*exact.Series // facet contents F_m
	total        *exact.Series   // Σ F_m
	contentsErr  error
}

// Shape computes the Gram matrix and its determinant (no division, so no
// precision is lost yet); the adjugate follows on first use.
func (p SeriesPoints) Shape() (*SeriesShape, error) {
	if err := p.check(); err != nil {
		return nil, err
	}
	k := len(p) - 1
	s := &SeriesShape{p: p, k: k}
	var o ops
	s.edges, s.gram = gramOf(&o, p)
	if o.err != nil {
		return nil, o.err
	}
	var err error
	if s.det, err = exact.SeriesDet(s.gram); err != nil {
		return nil, err
	}
	return s, nil
}

// gradients makes adj G and Q̃ once (the measures that need no
// perpendiculars skip them).
func (s *SeriesShape) gradients(op string) error {
	s.adjOnce.Do(func() {
		if s.adj, s.adjErr = adjugate(s.gram); s.adjErr != nil {
			return
		}
		var o ops
		s.q = gradientMatrix(&o, s.adj)
		s.adjErr = o.err
	})
	return wrap(op, s.adjErr)
}

// dot is a·b.
func (o *ops) dot(a, b []*exact.Series) *exact.Series {
	out := sconst(0)
	for c := range a {
		out = o.add(out, o.mul(a[c], b[c]))
	}
	return out
}

// adjugate is adj(m) of a symmetric matrix: the cofactors C_ab = C_ba.
func adjugate(m [][]*exact.Series) ([][]*exact.Series, error) {
	k := len(m)
	out := make([][]*exact.Series, k)
	for a := range out {
		out[a] = make([]*exact.Series, k)
	}
	for a := range k {
		for b := a; b < k; b++ {
			minor := make([][]*exact.Series, 0, k-1)
			for r := range k {
				if r == a {
					continue
				}
				row := make([]*exact.Series, 0, k-1)
				for c := range k {
					if c != b {
						row = append(row, m[r][c])
					}
				}
				minor = append(minor, row)
			}
			d, err := exact.SeriesDet(minor)
			if err != nil {
				return nil, err
			}
			if (a+b)%2 == 1 {
				d = exact.SeriesNeg(d)
			}
			out[a][b], out[b][a] = d, d
		}
	}
	return out, nil
}

// gradientMatrix is Q̃ = B·adj·Bᵀ, B the (k+1)×k matrix with row 0 all −1
// and row a the a-th unit vector: det G times Q_ij = ∇λ_i·∇λ_j (see
// Simplex.DihedralCosSq). Its rows sum to 0.
func gradientMatrix(o *ops, adj [][]*exact.Series) [][]*exact.Series {
	k := len(adj)
	q := make([][]*exact.Series, k+1)
	for i := range q {
		q[i] = make([]*exact.Series, k+1)
	}
	total := sconst(0)
	for a := range k {
		col := o.sum(adj[a]...)
		q[0][a+1], q[a+1][0] = exact.SeriesNeg(col), exact.SeriesNeg(col)
		total = o.add(total, col)
		for b := range k {
			q[a+1][b+1] = adj[a][b]
		}
	}
	q[0][0] = total
	return q
}

// Dim is k.
func (s *SeriesShape) Dim() int { return s.k }

// solid refuses a simplex of dimension below minDim (exact.ErrShape) and
// one whose squared volume is the exact constant 0, degenerate for every t
// (ErrDegenerate); a volume that is O(t^N) with no known term is left to
// the division, which reports it undetermined (raise the order).
func (s *SeriesShape) solid(op string, minDim int) error {
	if s.k < minDim {
		return fmt.Errorf("%s: needs a simplex of dimension at least %d, this is a %d-simplex: %w", op, minDim, s.k, exact.ErrShape)
	}
	if isZero(s.det) {
		return fmt.Errorf("%s: %w (squared volume 0 for every t)", op, ErrDegenerate)
	}
	return nil
}

// vertex refuses an index out of range (exact.ErrShape).
func (s *SeriesShape) vertex(op string, i int) error {
	if i < 0 || i > s.k {
		return fmt.Errorf("%s: vertex %d out of range 0..%d: %w", op, i, s.k, exact.ErrShape)
	}
	return nil
}

// VolumeSq is det G/(k!)².
func (s *SeriesShape) VolumeSq() (*exact.Series, error) {
	var o ops
	v := o.quo(s.det, sfactorial(s.k, true))
	return v, o.err
}

// sfactorial returns k!, or (k!)² when sq, as an exact series constant:
// in a big.Int, as an int64 would wrap from (13!)² on.
func sfactorial(k int, sq bool) *exact.Series {
	f := factorial(k)
	if sq {
		f.Mul(f, f)
	}
	return exact.SeriesConst(exact.RealFromRat(new(big.Rat).SetInt(f)), 0)
}

// Contents returns the facet contents F_m (facet m opposite vertex m) and
// their sum, computed once.
func (s *SeriesShape) Contents() ([]*exact.Series, *exact.Series, error) {
	s.contentsOnce.Do(func() {
		sq, err := s.p.FacetContentsSq()
		if err != nil {
			s.contentsErr = err
			return
		}
		var o ops
		s.contents = make([]*exact.Series, len(sq))
		for m, f2 := range sq {
			s.contents[m] = o.sqrt(f2)
		}
		s.total = o.sum(s.contents...)
		if o.err != nil {
			s.contentsErr = fmt.Errorf("a facet's content: %w", o.err)
		}
	})
	return s.contents, s.total, s.contentsErr
}

// Inradius is k·V/ΣF.
func (s *SeriesShape) Inradius() (*exact.Series, error) {
	if err := s.solid("inradius", 1); err != nil {
		return nil, err
	}
	_, total, err := s.Contents()
	if err != nil {
		return nil, fmt.Errorf("inradius: %w", err)
	}
	var o ops
	r := o.quo(o.mul(sconst(int64(s.k)), s.volume(&o)), total)
	return r, wrap("inradius", o.err)
}

// volume is √(det G)/k!.
func (s *SeriesShape) volume(o *ops) *exact.Series {
	return o.quo(o.sqrt(s.det), sfactorial(s.k, false))
}

func wrap(op string, err error) error {
	if err == nil {
		return nil
	}
	return fmt.Errorf("%s: %w", op, err)
}

// combine is Σ_m w_m v_m / total for weights summing to total, computed
// coordinate by coordinate as v_0 + Σ_{m≥1} w_m e_m / total (w_0 is not
// read), which keeps v_0 out of the division.
func (s *SeriesShape) combine(o *ops, w []*exact.Series, total *exact.Series) []*exact.Series {
	out := make([]*exact.Series, len(s.p[0]))
	for c := range out {
		num := sconst(0)
		for m := 1; m <= s.k; m++ {
			num = o.add(num, o.mul(w[m], s.edges[m-1][c]))
		}
		out[c] = o.add(s.p[0][c], o.quo(num, total))
	}
	return out
}

// Circumcenter is v_0 + Σ μ_a e_a with G·μ = diag(G)/2, so
// μ = adj(G)·diag(G)/(2 det G) (measure.go).
func (s *SeriesShape) Circumcenter() ([]*exact.Series, error) {
	if s.k == 0 {
		return s.p[0], nil
	}
	if err := s.solid("circumcenter", 1); err != nil {
		return nil, err
	}
	if err := s.gradients("circumcenter"); err != nil {
		return nil, err
	}
	var o ops
	w := make([]*exact.Series, s.k+1)
	w[0] = sconst(0) // not read by combine
	for a := 1; a <= s.k; a++ {
		z := sconst(0)
		for b := range s.k {
			z = o.add(z, o.mul(s.adj[a-1][b], s.gram[b][b]))
		}
		w[a] = z
	}
	return s.combine(&o, w, o.mul(sconst(2), s.det)), wrap("circumcenter", o.err)
}

// Centroid is the mean of the vertices.
func (s *SeriesShape) Centroid() ([]*exact.Series, error) {
	var o ops
	w := make([]*exact.Series, s.k+1)
	for m := range w {
		w[m] = sconst(1)
	}
	return s.combine(&o, w, sconst(int64(s.k+1))), o.err
}

// Incenter is Σ F_m v_m / ΣF.
func (s *SeriesShape) Incenter() ([]*exact.Series, error) {
	if s.k == 0 {
		return s.p[0], nil
	}
	if err := s.solid("incenter", 1); err != nil {
		return nil, err
	}
	F, total, err := s.Contents()
	if err != nil {
		return nil, wrap("incenter", err)
	}
	var o ops
	return s.combine(&o, F, total), wrap("incenter", o.err)
}

// exWeights are the exsphere opposite vertex i as weights
// (F_0, …, −F_i, …, F_k) and their sum ΣF − 2F_i.
func (s *SeriesShape) exWeights(op string, i int) ([]*exact.Series, *exact.Series, error) {
	if err := s.vertex(op, i); err != nil {
		return nil, nil, err
	}
	if err := s.solid(op, 2); err != nil {
		return nil, nil, err
	}
	F, total, err := s.Contents()
	if err != nil {
		return nil, nil, wrap(op, err)
	}
	var o ops
	w := append([]*exact.Series(nil), F...)
	w[i] = exact.SeriesNeg(F[i])
	den := o.sub(total, o.mul(sconst(2), F[i]))
	return w, den, wrap(op, o.err)
}

// Exradius is k·V/(ΣF − 2F_i) (V = r_i(ΣF − 2F_i)/k).
func (s *SeriesShape) Exradius(i int) (*exact.Series, error) {
	_, den, err := s.exWeights("exradius", i)
	if err != nil {
		return nil, err
	}
	var o ops
	r := o.quo(o.mul(sconst(int64(s.k)), s.volume(&o)), den)
	return r, wrap("exradius", o.err)
}

// Excenter is Σ w_m v_m/(ΣF − 2F_i), w the exsphere's weights.
func (s *SeriesShape) Excenter(i int) ([]*exact.Series, error) {
	w, den, err := s.exWeights("excenter", i)
	if err != nil {
		return nil, err
	}
	var o ops
	return s.combine(&o, w, den), wrap("excenter", o.err)
}

// feet returns, for X = Σ w_m v_m/total, the foot of the perpendicular
// from X to each facet's hyperplane, the i-th on facet i: its weights are
// w_m − w_i·Q̃_im/Q̃_ii (Simplex.FootRatios).
func (s *SeriesShape) feet(op string, w []*exact.Series, total *exact.Series) ([][]*exact.Series, error) {
	if err := s.gradients(op); err != nil {
		return nil, err
	}
	var o ops
	out := make([][]*exact.Series, s.k+1)
	for i := range out {
		wi := make([]*exact.Series, s.k+1)
		for m := range wi {
			if m == i {
				wi[m] = sconst(0)
				continue
			}
			wi[m] = o.sub(w[m], o.quo(o.mul(w[i], s.q[i][m]), s.q[i][i]))
		}
		out[i] = s.combine(&o, wi, total)
	}
	return out, wrap(op, o.err)
}

// TouchPoints are the insphere's points of contact, the i-th on facet i.
func (s *SeriesShape) TouchPoints() ([][]*exact.Series, error) {
	if err := s.solid("touch points", 1); err != nil {
		return nil, err
	}
	F, total, err := s.Contents()
	if err != nil {
		return nil, wrap("touch points", err)
	}
	return s.feet("touch points", F, total)
}

// ExsphereTouchPoints are where the exsphere opposite vertex i touches
// each facet's hyperplane, the m-th on facet m.
func (s *SeriesShape) ExsphereTouchPoints(i int) ([][]*exact.Series, error) {
	w, den, err := s.exWeights("exsphere touch points", i)
	if err != nil {
		return nil, err
	}
	return s.feet("exsphere touch points", w, den)
}

// TangentLengths are, per vertex j, √(|v_j − I|² − r²): the length of
// every tangent segment from v_j to the insphere.
func (s *SeriesShape) TangentLengths() ([]*exact.Series, error) {
	in, err := s.Incenter()
	if err != nil {
		return nil, wrap("tangent lengths", err)
	}
	r, err := s.Inradius()
	if err != nil {
		return nil, wrap("tangent lengths", err)
	}
	var o ops
	r2 := o.mul(r, r)
	out := make([]*exact.Series, s.k+1)
	for j := range out {
		d := make([]*exact.Series, len(in))
		for c := range in {
			d[c] = o.sub(s.p[j][c], in[c])
		}
		out[j] = o.sqrt(o.sub(o.dot(d, d), r2))
	}
	return out, wrap("tangent lengths", o.err)
}

// AltitudeSq is h_i² = det G/Q̃_ii (|∇λ_i| = 1/h_i).
func (s *SeriesShape) AltitudeSq(i int) (*exact.Series, error) {
	if err := s.vertex("altitude", i); err != nil {
		return nil, err
	}
	if err := s.solid("altitude", 1); err != nil {
		return nil, err
	}
	if err := s.gradients("altitude"); err != nil {
		return nil, err
	}
	var o ops
	h := o.quo(s.det, s.q[i][i])
	return h, wrap("altitude", o.err)
}

// FacetNormal is the outward normal of facet i from vertex i to the foot
// of its altitude, −Σ_{m≥1} (Q̃_im/Q̃_ii) e_m, and its squared length h_i².
func (s *SeriesShape) FacetNormal(i int) (normal []*exact.Series, lengthSq *exact.Series, err error) {
	if lengthSq, err = s.AltitudeSq(i); err != nil {
		return nil, nil, wrap("facet normal", err)
	}
	var o ops
	normal = make([]*exact.Series, len(s.p[0]))
	for c := range normal {
		num := sconst(0)
		for m := 1; m <= s.k; m++ {
			num = o.add(num, o.mul(s.q[i][m], s.edges[m-1][c]))
		}
		normal[c] = exact.SeriesNeg(o.quo(num, s.q[i][i]))
	}
	return normal, lengthSq, wrap("facet normal", o.err)
}

// Barycentric returns λ_0..λ_k of p: λ_a = Σ_b adj_ab e_b·(p − v_0)/det G
// for a ≥ 1 and λ_0 = 1 − Σ λ_a. The simplex must be full-dimensional
// (k equal to the number of coordinates): whether p lies in the affine
// hull of a smaller one is an equality no truncated series can prove.
func (s *SeriesShape) Barycentric(p []*exact.Series) ([]*exact.Series, error) {
	if len(p) != len(s.p[0]) {
		return nil, fmt.Errorf("barycentric: p has %d coordinates, the simplex's points have %d: %w", len(p), len(s.p[0]), exact.ErrShape)
	}
	if s.k != len(p) {
		return nil, fmt.Errorf("barycentric: a %d-simplex in %d dimensions: whether p lies in its affine hull is an exact equality that a truncated series cannot settle (series coordinates need a simplex of full dimension here): %w", s.k, len(p), exact.ErrShape)
	}
	if err := s.solid("barycentric", 0); err != nil {
		return nil, err
	}
	if err := s.gradients("barycentric"); err != nil {
		return nil, err
	}
	var o ops
	x := make([]*exact.Series, len(p))
	for c := range p {
		x[c] = o.sub(p[c], s.p[0][c])
	}
	y := make([]*exact.Series, s.k)
	for b := range y {
		y[b] = o.dot(s.edges[b], x)
	}
	lam := make([]*exact.Series, s.k+1)
	lam[0] = sconst(1)
	for a := 1; a <= s.k; a++ {
		lam[a] = o.quo(o.dot(s.adj[a-1], y), s.det)
		lam[0] = o.sub(lam[0], lam[a])
	}
	return lam, wrap("barycentric", o.err)
}

// VertexCos is the cosine of the angle at vertex i between the edges to
// j and m: (v_j − v_i)·(v_m − v_i)/√(|v_j − v_i|²·|v_m − v_i|²).
func (s *SeriesShape) VertexCos(i, j, m int) (*exact.Series, error) {
	for _, v := range []int{i, j, m} {
		if err := s.vertex("vertex angle", v); err != nil {
			return nil, err
		}
	}
	if i == j || i == m || j == m {
		return nil, fmt.Errorf("vertex angle: the vertices must differ, got (%d, %d, %d): %w", i, j, m, exact.ErrShape)
	}
	var o ops
	a := make([]*exact.Series, len(s.p[0]))
	b := make([]*exact.Series, len(a))
	for c := range a {
		a[c] = o.sub(s.p[j][c], s.p[i][c])
		b[c] = o.sub(s.p[m][c], s.p[i][c])
	}
	cos := o.quo(o.dot(a, b), o.sqrt(o.mul(o.dot(a, a), o.dot(b, b))))
	return cos, wrap("vertex angle", o.err)
}

// DihedralCos is the cosine of the interior dihedral angle between the
// facets opposite i and j, −Q̃_ij/√(Q̃_ii·Q̃_jj) (Simplex.DihedralCosSq).
func (s *SeriesShape) DihedralCos(i, j int) (*exact.Series, error) {
	if err := s.vertex("dihedral angle", i); err != nil {
		return nil, err
	}
	if err := s.vertex("dihedral angle", j); err != nil {
		return nil, err
	}
	if i == j {
		return nil, fmt.Errorf("dihedral angle: the facets must differ, got i = j = %d: %w", i, exact.ErrShape)
	}
	if err := s.solid("dihedral angle", 2); err != nil {
		return nil, err
	}
	if err := s.gradients("dihedral angle"); err != nil {
		return nil, err
	}
	var o ops
	cos := exact.SeriesNeg(o.quo(s.q[i][j], o.sqrt(o.mul(s.q[i][i], s.q[j][j]))))
	return cos, wrap("dihedral angle", o.err)
}

// CircumradiusSq is μᵀ·diag(G)/2 with μ as in Circumcenter:
// hᵀ adj(G) h/(4 det G), h = diag(G).
func (s *SeriesShape) CircumradiusSq() (*exact.Series, error) {
	if s.k == 0 {
		return sconst(0), nil
	}
	if err := s.solid("circumradius", 1); err != nil {
		return nil, err
	}
	if err := s.gradients("circumradius"); err != nil {
		return nil, err
	}
	var o ops
	num := sconst(0)
	for a := range s.k {
		for b := range s.k {
			num = o.add(num, o.mul(o.mul(s.gram[a][a], s.adj[a][b]), s.gram[b][b]))
		}
	}
	r2 := o.quo(num, o.mul(sconst(4), s.det))
	return r2, wrap("circumradius", o.err)
}

// RadiusRatio is k·r/R (1 for the regular simplex).
func (s *SeriesShape) RadiusRatio() (*exact.Series, error) {
	r, err := s.Inradius()
	if err != nil {
		return nil, wrap("radius ratio", err)
	}
	R2, err := s.CircumradiusSq()
	if err != nil {
		return nil, wrap("radius ratio", err)
	}
	var o ops
	x := o.quo(o.mul(sconst(int64(s.k)), r), o.sqrt(R2))
	return x, wrap("radius ratio", o.err)
}

// sqEdges lists |v_i − v_j|² for i < j.
func (s *SeriesShape) sqEdges(o *ops) []*exact.Series {
	var out []*exact.Series
	for i := 0; i <= s.k; i++ {
		for j := i + 1; j <= s.k; j++ {
			d := make([]*exact.Series, len(s.p[0]))
			for c := range d {
				d[c] = o.sub(s.p[i][c], s.p[j][c])
			}
			out = append(out, o.dot(d, d))
		}
	}
	return out
}

// VolumeLengthRatio is V over the regular simplex's volume at the root
// mean square edge ℓ_rms: √(det G·2^k·E^k/((k+1)·M^k)), M the sum of the
// squared edges and E their number (Simplex.VolumeLengthRatioSq).
func (s *SeriesShape) VolumeLengthRatio() (*exact.Series, error) {
	if s.k < 1 {
		return nil, fmt.Errorf("volume-length ratio: a point has no edges: %w", exact.ErrShape)
	}
	var o ops
	M := o.sum(s.sqEdges(&o)...)
	num := o.mul(s.det, sconst(int64(1)<<s.k))
	den := sconst(int64(s.k + 1))
	E := sconst(int64(s.k * (s.k + 1) / 2))
	for range s.k {
		num = o.mul(num, E)
		den = o.mul(den, M)
	}
	x := o.sqrt(o.quo(num, den))
	return x, wrap("volume-length ratio", o.err)
}

// MaxSqEdge is the largest squared edge near the expansion point: of two
// series the larger is the one whose difference from the other has a
// positive leading coefficient; when the difference has no known term
// they agree to the order both are known to, and either is the maximum
// to that order (|max(a, b) − a| ≤ |a − b|).
func (s *SeriesShape) MaxSqEdge() (*exact.Series, error) {
	var o ops
	edges := s.sqEdges(&o)
	if o.err != nil {
		return nil, o.err
	}
	if len(edges) == 0 {
		return sconst(0), nil
	}
	best := edges[0]
	for _, e := range edges[1:] {
		d := o.sub(e, best)
		if o.err != nil {
			return nil, o.err
		}
		sign, _, err := d.LeadingSign()
		if err != nil {
			return nil, fmt.Errorf("longest edge: %w", err)
		}
		if sign > 0 {
			best = e
		}
	}
	return best, nil
}

// AspectRatio is ℓ_max/(√(2k(k+1))·r), 1 for the regular simplex.
func (s *SeriesShape) AspectRatio() (*exact.Series, error) {
	r, err := s.Inradius()
	if err != nil {
		return nil, wrap("aspect ratio", err)
	}
	l2, err := s.MaxSqEdge()
	if err != nil {
		return nil, wrap("aspect ratio", err)
	}
	var o ops
	k := int64(s.k)
	norm := o.mul(o.sqrt(sconst(2*k*(k+1))), r)
	x := o.quo(o.sqrt(l2), norm)
	return x, wrap("aspect ratio", o.err)
}

package values

import (
	"errors"
	"fmt"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/exact/geom"
	"assay/kernel/interp"
)

// The rest of a simplex's geometry: exspheres, tangent lengths, centroid,
// barycentric coordinates and containment, facet normals, altitudes,
// angles at a vertex, solid angles and the mesh-quality measures. The
// rational parts come from exact/geom; what needs a root is composed here
// into certified reals, algebraic (decided exactly by the zero bound)
// except where acos or atan2 enters.
//
// The reals are returned unevaluated (not through Env.checked): every
// argument is valid by construction — a cosine's square is a rational
// at most 1 (Cauchy–Schwarz, exact), atan2's first argument is 6V > 0,
// roots are of non-negative rationals or of |v − I|² − r² >= 0, and each
// divisor is a positive sum of facet contents or a root of a positive
// rational on a non-degenerate simplex — so no error can surface later;
// evaluating eagerly cost a third of the time on random tetrahedra.

func init() {
	setMethods(SimplexType, exactMethods([]method[*Simplex]{
		{"touch_points", nil, "touch_points() -> the points where the insphere touches the facets, the i-th on the facet opposite vertex i (same as insphere_touch_points())", (*Simplex).touchPoints},
		{"exradius", params("i"), "exradius(i) -> the radius of the exsphere opposite vertex i (tangent to facet i from outside and to the other facets' hyperplanes)", (*Simplex).exradius},
		{"excenter", params("i"), "excenter(i) -> the centre of the exsphere opposite vertex i", (*Simplex).excenter},
		{"exsphere_touch_points", params("i"), "exsphere_touch_points(i) -> where the exsphere opposite vertex i touches each facet's hyperplane, the m-th on facet m", (*Simplex).exsphereTouchPoints},
		{"tangent_lengths", nil, "tangent_lengths() -> per vertex, its distance to the insphere's touch point on each facet through it (the same on all of them)", (*Simplex).tangentLengths},
		{"centroid", nil, "centroid() -> the mean of the vertices", (*Simplex).centroid},
		{"barycentric", params("p"), "barycentric(p) -> the barycentric coordinates of p (summing to 1; negative ones outside)", (*Simplex).barycentric},
		{"contains", params("p"), "contains(p) -> True when p is in the closed simplex (the boundary counts as inside)", (*Simplex).contains},
		{"facet_normal", params("i"), "facet_normal(i) -> (n, |n|^2): the outward normal of facet i, from vertex i to the foot of its altitude", (*Simplex).facetNormal},
		{"altitude_sq", params("i"), "altitude_sq(i) -> the squared height of vertex i over the opposite facet (exact)", (*Simplex).altitudeSq},
		{"altitude", params("i"), "altitude(i) -> the height of vertex i over the opposite facet", (*Simplex).altitude},
		{"vertex_cos", params("i", "j", "k"), "vertex_cos(i, j, k) -> cosine of the angle at vertex i between the edges to j and k (exact when rational)", (*Simplex).vertexCos},
		{"vertex_angle", params("i", "j", "k"), "vertex_angle(i, j, k) -> the angle at vertex i between the edges to j and k, in radians (certified)", (*Simplex).vertexAngle},
		{"dihedral_angle", params("i", "j"), "dihedral_angle(i, j) -> the interior dihedral angle between the facets opposite i and j, in radians (certified)", (*Simplex).dihedralAngle},
		{"solid_angle", params("i"), "solid_angle(i) -> the solid angle of a tetrahedron at vertex i, in steradians (certified; van Oosterom-Strackee)", (*Simplex).solidAngle},
		{"radius_ratio", nil, "radius_ratio() -> k r / R, 1 for the regular simplex", (*Simplex).radiusRatio},
		{"volume_length_ratio", nil, "volume_length_ratio() -> V over the regular simplex's volume at the rms edge length (6 sqrt(2) V / l_rms^3 for tetrahedra)", (*Simplex).volumeLengthRatio},
		{"min_dihedral_angle", nil, "min_dihedral_angle() -> the smallest interior dihedral angle, in radians", (*Simplex).minDihedral},
		{"max_dihedral_angle", nil, "max_dihedral_angle() -> the largest interior dihedral angle, in radians", (*Simplex).maxDihedral},
		{"aspect_ratio", nil, "aspect_ratio() -> longest edge / (sqrt(2k(k+1)) r), 1 for the regular simplex", (*Simplex).aspectRatio},
	}))
}

// vertexArgs reads vertex indices by name, each in range, all distinct.
func (s *Simplex) vertexArgs(name string, a interp.Args, names ...string) ([]int, error) {
	return vertexIndices(name, a, s.s.Vertices(), names...)
}

// vertexIndices reads vertex indices by name, each from 0 to vertices−1,
// all distinct.
func vertexIndices(name string, a interp.Args, vertices int, names ...string) ([]int, error) {
	n := int64(vertices)
	out := make([]int, len(names))
	sig := fmt.Sprintf("%s(%s)", name, joinNames(names))
	for x, nm := range names {
		v, err := a.Int(nm, 0)
		if err != nil || v < 0 || v >= n {
			return nil, py.ExceptionNewf(py.ValueError, "%s needs vertex indices from 0 to %d, got %s = %s", sig, n-1, nm, interp.Str(a.Get(nm)))
		}
		for y := range x {
			if out[y] == int(v) {
				return nil, py.ExceptionNewf(py.ValueError, "%s needs different vertex indices, got %d twice", sig, v)
			}
		}
		out[x] = int(v)
	}
	return out, nil
}

func joinNames(names []string) string {
	out := ""
	for i, n := range names {
		if i > 0 {
			out += ", "
		}
		out += n
	}
	return out
}

// needsSolid refuses a point (no facets) and a degenerate simplex.
func (s *Simplex) needsSolid(name string, minDim int) error {
	if s.s.Dim() < minDim {
		return py.ExceptionNewf(py.ValueError, "%s(): needs a simplex of dimension at least %d, this is a %d-simplex", name, minDim, s.s.Dim())
	}
	if s.s.IsDegenerate() {
		return geomErr(name, geom.ErrDegenerate)
	}
	return nil
}

// rootOf is √q as a certified real.
func rootOf(q *big.Rat) *exact.Real { return exact.RealSqrt(exact.RealFromRat(q)) }

// signedRoot is sign·√q.
func signedRoot(q *big.Rat, sign int) *exact.Real {
	r := rootOf(q)
	if sign < 0 {
		r = exact.RealNeg(r)
	}
	return r
}

// inradiusReal is r = kV/ΣF (from V = r·ΣF/k).
func (s *Simplex) inradiusReal() *exact.Real {
	k := exact.RealFromInt(int64(s.s.Dim()))
	_, total := s.facetContents()
	return exact.RealQuo(exact.RealMul(k, rootOf(s.s.VolumeSq())), total)
}

// exWeights returns the exsphere opposite vertex i as barycentric weights
// (F_0, …, −F_i, …, F_k) and their sum ΣF − 2F_i, which is > 0 for a
// non-degenerate simplex of dimension >= 2 (each facet is smaller than
// the others together, its projection onto them).
func (s *Simplex) exWeights(name string, a interp.Args) ([]*exact.Real, *exact.Real, error) {
	idx, err := s.vertexArgs(name, a, "i")
	if err != nil {
		return nil, nil, err
	}
	if err := s.needsSolid(name, 2); err != nil {
		return nil, nil, err
	}
	F, total := s.facetContents()
	i := idx[0]
	w := append([]*exact.Real(nil), F...)
	w[i] = exact.RealNeg(F[i])
	return w, exact.RealSub(total, exact.RealMul(exact.RealFromInt(2), F[i])), nil
}

// exradius: V = r_i (ΣF − 2F_i)/k, the exsphere's centre being at
// distance r_i from every facet hyperplane, on the far side of facet i.
func (s *Simplex) exradius(a interp.Args) (py.Object, error) {
	_, den, err := s.exWeights("exradius", a)
	if err != nil {
		return nil, err
	}
	k := exact.RealFromInt(int64(s.s.Dim()))
	return s.env.Real(exact.RealQuo(exact.RealMul(k, rootOf(s.s.VolumeSq())), den)), nil
}

func (s *Simplex) excenter(a interp.Args) (py.Object, error) {
	w, den, err := s.exWeights("excenter", a)
	if err != nil {
		return nil, err
	}
	return s.env.realList(s.weighted(w, den)), nil
}

func (s *Simplex) exsphereTouchPoints(a interp.Args) (py.Object, error) {
	w, den, err := s.exWeights("exsphere_touch_points", a)
	if err != nil {
		return nil, err
	}
	return s.feet("exsphere_touch_points", w, den)
}

// sqDistToWeighted is |v_j − X|² for X = Σ w_m v_m with Σ w_m = 1, from
// the squared distances alone: Σ_m w_m d_jm − Σ_{m<n} w_m w_n d_mn.
func (s *Simplex) sqDistToWeighted(j int, w []*exact.Real) *exact.Real {
	sum := exact.RealFromInt(0)
	for m := range w {
		sum = exact.RealAdd(sum, exact.RealMul(w[m], exact.RealFromRat(s.s.SqEdge(j, m))))
		for n := m + 1; n < len(w); n++ {
			sum = exact.RealSub(sum, exact.RealMul(exact.RealMul(w[m], w[n]), exact.RealFromRat(s.s.SqEdge(m, n))))
		}
	}
	return sum
}

// tangentLengths: every tangent segment from vertex j to the insphere has
// the same length √(|v_j − I|² − r²), so the touch points on all facets
// through v_j are at that distance from it (for a triangle, s − a at the
// vertex opposite side a).
func (s *Simplex) tangentLengths(interp.Args) (py.Object, error) {
	if err := s.needsSolid("tangent_lengths", 1); err != nil {
		return nil, err
	}
	F, total := s.facetContents()
	w := make([]*exact.Real, len(F))
	for m := range F {
		w[m] = exact.RealQuo(F[m], total)
	}
	r := s.inradiusReal()
	r2 := exact.RealMul(r, r)
	out := make([]*exact.Real, len(F))
	for j := range out {
		out[j] = exact.RealSqrt(exact.RealSub(s.sqDistToWeighted(j, w), r2))
	}
	return s.env.realList(out), nil
}

func (s *Simplex) centroid(interp.Args) (py.Object, error) {
	n := s.s.Vertices()
	w := make([]*exact.Real, n)
	for i := range w {
		w[i] = exact.RealFromInt(1)
	}
	return s.env.realList(s.weighted(w, exact.RealFromInt(int64(n)))), nil
}

// ambient is the number of coordinates of the simplex's points.
func (s *Simplex) ambient() int {
	if n := s.s.Ambient(); n >= 0 {
		return n
	}
	return len(s.coords()[0])
}

// baryOf returns the barycentric coordinates of the point p as certified
// reals (rational when they are). Rational p on rational points goes
// through geom.Simplex.Barycentric; otherwise λ_1..k = G⁻¹·r with
// r_a = (v_a − v_0)·(p − v_0), and, when the points span fewer dimensions
// than they have coordinates, p is proved to lie in their affine hull.
// off is true (and lam nil) when p is not in the affine hull.
func (s *Simplex) baryOf(name string, po py.Object) (lam []*exact.Real, off bool, err error) {
	items, err := Sequence(po, name+"(p)")
	if err != nil {
		return nil, false, err
	}
	if n := s.ambient(); len(items) != n {
		return nil, false, py.ExceptionNewf(py.ValueError, "%s(p): p has %d coordinates, the simplex's points have %d", name, len(items), n)
	}
	if s.s.IsDegenerate() {
		return nil, false, geomErr(name, geom.ErrDegenerate)
	}
	p := make([]*exact.Real, len(items))
	allRat := !s.algebraic()
	for c, it := range items {
		x, ok := RealOf(it)
		if !ok {
			return nil, false, py.ExceptionNewf(py.TypeError, "%s(p): coordinate %d is %s, not an exact number or certified real%s", name, c, interp.TypeName(it), FloatHint(it))
		}
		_, isRat := x.Rat()
		allRat = allRat && isRat
		p[c] = x
	}
	if allRat {
		q := make([]*big.Rat, len(p))
		for c, x := range p {
			q[c], _ = x.Rat()
		}
		lam, err := s.s.Barycentric(q)
		if errors.Is(err, geom.ErrNotInAffineHull) {
			return nil, true, nil
		}
		if err != nil {
			return nil, false, geomErr(name, err)
		}
		out := make([]*exact.Real, len(lam))
		for i, l := range lam {
			out[i] = exact.RealFromRat(l)
		}
		return out, false, nil
	}
	return s.baryReal(name, p)
}

func (s *Simplex) baryReal(name string, p []*exact.Real) ([]*exact.Real, bool, error) {
	k := s.s.Dim()
	V := s.coords()
	inv, err := s.s.Gram().Inverse()
	if err != nil {
		return nil, false, geomErr(name, geom.ErrDegenerate)
	}
	rhs := make([]*exact.Real, k)
	for a := range rhs {
		rhs[a] = exact.RealFromInt(0)
		for c := range p {
			rhs[a] = exact.RealAdd(rhs[a], exact.RealMul(exact.RealSub(V[a+1][c], V[0][c]), exact.RealSub(p[c], V[0][c])))
		}
	}
	lam := make([]*exact.Real, k+1)
	lam[0] = exact.RealFromInt(1)
	for a := 1; a <= k; a++ {
		lam[a] = exact.RealFromInt(0)
		for b := range rhs {
			lam[a] = exact.RealAdd(lam[a], exact.RealMul(exact.RealFromRat(inv.At(a-1, b)), rhs[b]))
		}
		lam[0] = exact.RealSub(lam[0], lam[a])
	}
	if len(p) > k && !s.algebraic() {
		// Rational points: p is in the affine hull exactly when p − v_0 is
		// orthogonal to a rational basis of the edges' orthogonal
		// complement, one linear form in p per basis vector — the smallest
		// expressions to decide.
		pts, _ := s.s.Points()
		e := exact.Zeros(k, len(p))
		for a := 1; a <= k; a++ {
			for c := range p {
				e.Set(a-1, c, new(big.Rat).Sub(pts[a][c], pts[0][c]))
			}
		}
		ns := e.Nullspace()
		for r := 0; r < ns.Cols(); r++ {
			form := exact.RealFromInt(0)
			for c := range p {
				if x := ns.At(c, r); x.Sign() != 0 {
					form = exact.RealAdd(form, exact.RealMul(exact.RealFromRat(x), exact.RealSub(p[c], V[0][c])))
				}
			}
			sign, err := form.Sign(s.env.Cap)
			if err != nil {
				return nil, false, py.ExceptionNewf(py.ArithmeticError, "%s(p): whether p is in the affine hull of the simplex is not settled: %v", name, interp.Exception(err))
			}
			if sign != 0 {
				return nil, true, nil
			}
		}
	} else if len(p) > k {
		// p is in the affine hull exactly when p = Σ λ_i v_i; each
		// coordinate is tested on its own, linear in p, which keeps the
		// zero bound far smaller than that of the squared distance.
		back := s.weighted(lam, exact.RealFromInt(1))
		for c := range p {
			sign, err := exact.RealSub(back[c], p[c]).Sign(s.env.Cap)
			if err != nil {
				return nil, false, py.ExceptionNewf(py.ArithmeticError, "%s(p): whether p is in the affine hull of the simplex is not settled: %v", name, interp.Exception(err))
			}
			if sign != 0 {
				return nil, true, nil
			}
		}
	}
	return lam, false, nil
}

func (s *Simplex) barycentric(a interp.Args) (py.Object, error) {
	lam, off, err := s.baryOf("barycentric", a.Get("p"))
	if err != nil {
		return nil, err
	}
	if off {
		return nil, py.ExceptionNewf(py.ValueError, "barycentric(p): p is not in the affine hull of the simplex, so it has no barycentric coordinates")
	}
	return s.env.realList(lam), nil
}

// contains: every barycentric coordinate >= 0, each sign decided exactly
// (zero bound) for algebraic ones; a point off the affine hull is outside.
func (s *Simplex) contains(a interp.Args) (py.Object, error) {
	lam, off, err := s.baryOf("contains", a.Get("p"))
	if err != nil {
		return nil, err
	}
	if off {
		return py.False, nil
	}
	for i, l := range lam {
		sign, err := l.Sign(s.env.Cap)
		if err != nil {
			return nil, py.ExceptionNewf(py.ArithmeticError, "contains(p): the sign of barycentric coordinate %d is not settled: %v", i, interp.Exception(err))
		}
		if sign < 0 {
			return py.False, nil
		}
	}
	return py.True, nil
}

func (s *Simplex) facetNormal(a interp.Args) (py.Object, error) {
	idx, err := s.vertexArgs("facet_normal", a, "i")
	if err != nil {
		return nil, err
	}
	if err := s.needsSolid("facet_normal", 1); err != nil {
		return nil, err
	}
	i := idx[0]
	c, err := s.s.FootRatios(i)
	if err != nil {
		return nil, geomErr("facet_normal", err)
	}
	h, err := s.s.AltitudeSq(i)
	if err != nil {
		return nil, geomErr("facet_normal", err)
	}
	w := make([]*exact.Real, len(c))
	for m, x := range c {
		w[m] = exact.RealFromRat(new(big.Rat).Neg(x))
	}
	return py.Tuple{s.env.realList(s.weighted(w, exact.RealFromInt(1))), s.env.Rational(h)}, nil
}

func (s *Simplex) altitudeSqRat(name string, a interp.Args) (*big.Rat, error) {
	idx, err := s.vertexArgs(name, a, "i")
	if err != nil {
		return nil, err
	}
	if s.s.Dim() < 1 {
		return nil, py.ExceptionNewf(py.ValueError, "%s(): a point has no facets, so no altitude", name)
	}
	h, err := s.s.AltitudeSq(idx[0])
	return h, geomErr(name, err)
}

func (s *Simplex) altitudeSq(a interp.Args) (py.Object, error) {
	h, err := s.altitudeSqRat("altitude_sq", a)
	if err != nil {
		return nil, err
	}
	return s.env.Rational(h), nil
}

func (s *Simplex) altitude(a interp.Args) (py.Object, error) {
	h, err := s.altitudeSqRat("altitude", a)
	if err != nil {
		return nil, err
	}
	return s.env.Real(rootOf(h)), nil
}

func (s *Simplex) vertexCosReal(name string, a interp.Args) (*exact.Real, error) {
	idx, err := s.vertexArgs(name, a, "i", "j", "k")
	if err != nil {
		return nil, err
	}
	c2, sign, err := s.s.VertexCosSq(idx[0], idx[1], idx[2])
	if err != nil {
		return nil, geomErr(name, err)
	}
	return signedRoot(c2, sign), nil
}

func (s *Simplex) vertexCos(a interp.Args) (py.Object, error) {
	return s.realResult(s.vertexCosReal("vertex_cos", a))
}

func (s *Simplex) vertexAngle(a interp.Args) (py.Object, error) {
	return s.angleResult(s.vertexCosReal("vertex_angle", a))
}

// dihedralCosReal is the cosine of the dihedral angle between the facets
// opposite the vertices i and j read from a.
func (s *Simplex) dihedralCosReal(name string, a interp.Args) (*exact.Real, error) {
	i, j, err := s.vertexPair(name, a, true)
	if err != nil {
		return nil, err
	}
	cos2, sign, err := s.s.DihedralCosSq(i, j)
	if err != nil {
		return nil, geomErr(name, err)
	}
	return signedRoot(cos2, sign), nil
}

func (s *Simplex) dihedralAngle(a interp.Args) (py.Object, error) {
	return s.angleResult(s.dihedralCosReal("dihedral_angle", a))
}

// realResult returns x as a notebook value, or err.
func (s *Simplex) realResult(x *exact.Real, err error) (py.Object, error) {
	if err != nil {
		return nil, err
	}
	return s.env.Real(x), nil
}

// angleResult returns acos(cos), or err; cos is a cosine made exactly
// (its square a rational at most 1), so acos cannot fail.
func (s *Simplex) angleResult(cos *exact.Real, err error) (py.Object, error) {
	if err != nil {
		return nil, err
	}
	return s.env.Real(exact.RealAcos(cos)), nil
}

// solidAngle: Ω = 2·atan2(|a·(b×c)|, abc + (a·b)c + (a·c)b + (b·c)a)
// (van Oosterom and Strackee 1983); atan2 keeps Ω in (0, 2π) when the
// denominator is negative, and the numerator is 6V > 0.
func (s *Simplex) solidAngle(a interp.Args) (py.Object, error) {
	if s.s.Dim() != 3 {
		return nil, py.ExceptionNewf(py.ValueError, "solid_angle(i): defined for tetrahedra (3-simplices), this is a %d-simplex", s.s.Dim())
	}
	idx, err := s.vertexArgs("solid_angle", a, "i")
	if err != nil {
		return nil, err
	}
	triple, sq, dots, err := s.s.SolidAngleTerms(idx[0])
	if err != nil {
		return nil, geomErr("solid_angle", err)
	}
	l := [3]*exact.Real{rootOf(sq[0]), rootOf(sq[1]), rootOf(sq[2])}
	den := exact.RealMul(exact.RealMul(l[0], l[1]), l[2])
	for x, d := range dots {
		den = exact.RealAdd(den, exact.RealMul(exact.RealFromRat(d), l[2-x]))
	}
	return s.env.Real(exact.RealMul(exact.RealFromInt(2), exact.RealAtan2(rootOf(triple), den))), nil
}

// radiusRatio is k·r/R (Euler's inequality R >= k·r makes it <= 1, with
// equality for the regular simplex).
func (s *Simplex) radiusRatio(interp.Args) (py.Object, error) {
	if err := s.needsSolid("radius_ratio", 1); err != nil {
		return nil, err
	}
	R2, err := s.s.CircumradiusSq()
	if err != nil {
		return nil, geomErr("radius_ratio", err)
	}
	k := exact.RealFromInt(int64(s.s.Dim()))
	return s.env.Real(exact.RealQuo(exact.RealMul(k, s.inradiusReal()), rootOf(R2))), nil
}

func (s *Simplex) volumeLengthRatio(interp.Args) (py.Object, error) {
	r, err := s.s.VolumeLengthRatioSq()
	if err != nil {
		return nil, geomErr("volume_length_ratio", err)
	}
	return s.env.Real(rootOf(r)), nil
}

func (s *Simplex) dihedralExtreme(name string, largest bool) (py.Object, error) {
	if err := s.needsSolid(name, 2); err != nil {
		return nil, err
	}
	lo, hi, err := s.s.DihedralExtremes()
	if err != nil {
		return nil, geomErr(name, err)
	}
	p := lo
	if largest {
		p = hi
	}
	return s.angleResult(signedRoot(p.Cos2, p.Sign), nil)
}

func (s *Simplex) minDihedral(interp.Args) (py.Object, error) {
	return s.dihedralExtreme("min_dihedral_angle", false)
}

func (s *Simplex) maxDihedral(interp.Args) (py.Object, error) {
	return s.dihedralExtreme("max_dihedral_angle", true)
}

// aspectRatio is ℓ_max/(√(2k(k+1))·r): the regular k-simplex of edge ℓ
// has inradius ℓ/√(2k(k+1)) (ℓ/(2√6) for the tetrahedron), so it is 1
// there and grows without bound as the simplex degenerates.
func (s *Simplex) aspectRatio(interp.Args) (py.Object, error) {
	if err := s.needsSolid("aspect_ratio", 1); err != nil {
		return nil, err
	}
	k := int64(s.s.Dim())
	norm := exact.RealMul(exact.RealSqrt(exact.RealFromInt(2*k*(k+1))), s.inradiusReal())
	return s.env.Real(exact.RealQuo(rootOf(s.s.MaxSqEdge()), norm)), nil
}

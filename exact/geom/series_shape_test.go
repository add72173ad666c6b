package geom

import (
	"errors"
	"fmt"
	"math/big"
	"testing"

	"assay/exact"
)

// A family of simplices whose coordinates are polynomials in t: coord[i][c]
// lists the coefficients of 1, t, t², … (as strings).
type polyFamily [][][]string

// at is the rational simplex at t = t0.
func (f polyFamily) at(t0 *big.Rat) [][]*big.Rat {
	out := make([][]*big.Rat, len(f))
	for i, row := range f {
		for _, coefs := range row {
			x, pow := new(big.Rat), big.NewRat(1, 1)
			for _, c := range coefs {
				x.Add(x, new(big.Rat).Mul(q(c), pow))
				pow = new(big.Rat).Mul(pow, t0)
			}
			out[i] = append(out[i], x)
		}
	}
	return out
}

// series is the family on t + O(t^order).
func (f polyFamily) series(order int) SeriesPoints { return f.seriesCap(order, seriesCap) }

// seriesCap is series with the precision cap for deciding whether a
// coefficient is zero.
func (f polyFamily) seriesCap(order int, cap uint) SeriesPoints {
	v := exact.SeriesVar(order, cap)
	out := make(SeriesPoints, len(f))
	for i, row := range f {
		for _, coefs := range row {
			x, pow := sconst(0), sconst(1)
			for _, c := range coefs {
				x, _ = exact.SeriesAdd(x, mustMul(exact.SeriesConst(exact.RealFromRat(q(c)), cap), pow))
				pow = mustMul(pow, v)
			}
			out[i] = append(out[i], x)
		}
	}
	return out
}

func mustMul(a, b *exact.Series) *exact.Series {
	x, err := exact.SeriesMul(a, b)
	if err != nil {
		panic(err)
	}
	return x
}

// seriesAt is the sum of the known terms of s at t0 (exponents p/q taken
// as (t0^(1/q))^p).
func seriesAt(s *exact.Series, t0 *big.Rat) (*exact.Real, error) {
	coefs, exps, err := s.Terms()
	if err != nil {
		return nil, err
	}
	sum := exact.RealFromInt(0)
	for i, c := range coefs {
		e := exps[i]
		base := exact.RealRoot(exact.RealFromRat(t0), int(e.Denom().Int64()))
		p := e.Num().Int64()
		x := exact.RealPowInt(base, int(abs64(p)))
		if p < 0 {
			x = exact.RealQuo(exact.RealFromInt(1), x)
		}
		sum = exact.RealAdd(sum, exact.RealMul(c, x))
	}
	return sum, nil
}

func abs64(x int64) int64 {
	if x < 0 {
		return -x
	}
	return x
}

// t0 is where the expansions are checked: 2^-30.
var t0 = big.NewRat(1, 1<<30)

// agree checks that the truncated series s, evaluated at t0, is within
// 2^12·t0^N of the exact value x (N the order s is known to): the error
// term O(t^N) allows that for coefficients up to 2^12, and a wrong
// coefficient of t^(N−1/q) or below is off by at least ~2^-18·t0^(N−1).
func agree(t *testing.T, what string, s *exact.Series, x *exact.Real) {
	t.Helper()
	n, ok := s.Order()
	if !ok {
		n = big.NewRat(64, 1) // exact: agree to the precision below
	}
	if n.Cmp(big.NewRat(2, 1)) < 0 {
		t.Errorf("%s = %s: known only to O(t^%s), too little to test", what, s.String("t"), n.RatString())
	}
	at, err := seriesAt(s, t0)
	if err != nil {
		t.Errorf("%s: %v", what, err)
		return
	}
	diff := exact.RealSub(at, x)
	// t0^N = 2^(-30N); the bound 2^(12 − 30N), N rounded down to a quarter.
	quarter := new(big.Int).Quo(new(big.Int).Mul(n.Num(), big.NewInt(4)), n.Denom()).Int64()
	bits := 30*quarter/4 - 12
	iv, err := diff.Approx(uint(bits+40), seriesCap*4)
	if err != nil {
		t.Fatalf("%s: %v", what, err)
	}
	bound := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), uint(bits)))
	lo := new(big.Rat).Neg(bound)
	if iv.Lo.Cmp(lo) < 0 || iv.Hi.Cmp(bound) > 0 {
		f, _ := iv.Hi.Float64()
		t.Errorf("%s = %s at t = 2^-30 is off the exact value by about %.3g, more than 2^-%d", what, s.String("t"), f, bits)
	}
}

func agreeVec(t *testing.T, what string, s []*exact.Series, x []*exact.Real) {
	t.Helper()
	if len(s) != len(x) {
		t.Fatalf("%s: %d coordinates, want %d", what, len(s), len(x))
	}
	for c := range s {
		agree(t, fmt.Sprintf("%s[%d]", what, c), s[c], x[c])
	}
}

func realsOf(v []*big.Rat) []*exact.Real {
	out := make([]*exact.Real, len(v))
	for i, x := range v {
		out[i] = exact.RealFromRat(x)
	}
	return out
}

func rootR(q *big.Rat) *exact.Real { return exact.RealSqrt(exact.RealFromRat(q)) }

func signedRootR(q *big.Rat, sign int) *exact.Real {
	if sign < 0 {
		return exact.RealNeg(rootR(q))
	}
	return rootR(q)
}

// exactShape is the reference: the rational simplex at t0 and its
// algebraic measures composed as certified reals from the rational
// methods (shape.go, measure.go, frame.go).
type exactShape struct {
	s        *Simplex
	pts      [][]*exact.Real
	F        []*exact.Real
	total, r *exact.Real
}

func newExactShape(t *testing.T, pts [][]*big.Rat) *exactShape {
	s := mustPoints(t, pts...)
	e := &exactShape{s: s, total: exact.RealFromInt(0)}
	for _, p := range pts {
		e.pts = append(e.pts, realsOf(p))
	}
	for _, f2 := range s.FacetContentsSq() {
		f := rootR(f2)
		e.F = append(e.F, f)
		e.total = exact.RealAdd(e.total, f)
	}
	e.r = exact.RealQuo(exact.RealMul(exact.RealFromInt(int64(s.Dim())), rootR(s.VolumeSq())), e.total)
	return e
}

// weighted is Σ w_m v_m / total.
func (e *exactShape) weighted(w []*exact.Real, total *exact.Real) []*exact.Real {
	out := make([]*exact.Real, len(e.pts[0]))
	for c := range out {
		sum := exact.RealFromInt(0)
		for m, x := range w {
			sum = exact.RealAdd(sum, exact.RealMul(x, e.pts[m][c]))
		}
		out[c] = exact.RealQuo(sum, total)
	}
	return out
}

// along is X + (scale/|n|)·n for a rational vector n of squared length n2.
func along(x []*exact.Real, scale *exact.Real, n []*big.Rat, n2 *big.Rat) []*exact.Real {
	f := exact.RealQuo(scale, rootR(n2))
	out := make([]*exact.Real, len(x))
	for c := range x {
		out[c] = exact.RealAdd(x[c], exact.RealMul(f, exact.RealFromRat(n[c])))
	}
	return out
}

func distR(a, b []*exact.Real) *exact.Real {
	sum := exact.RealFromInt(0)
	for c := range a {
		d := exact.RealSub(a[c], b[c])
		sum = exact.RealAdd(sum, exact.RealMul(d, d))
	}
	return exact.RealSqrt(sum)
}

// Families checked: the sliver demo's squeeze (volume ~ t, circumradius
// ~ 1/t), a needle (three vertices within ~t), a tetrahedron moving with
// t in every coordinate and not degenerating (every measure has a finite
// value at 0), and a flattening triangle.
var seriesFamilies = map[string]polyFamily{
	"sliver":        {{{"0"}, {"0"}, {"0"}}, {{"4"}, {"0"}, {"0", "1"}}, {{"1"}, {"3"}, {"0", "2"}}, {{"3"}, {"2"}, {"0", "-1"}}},
	"needle":        {{{"0"}, {"0"}, {"0"}}, {{"1"}, {"0"}, {"0"}}, {{"0"}, {"0", "1"}, {"0"}}, {{"0"}, {"0"}, {"0", "1"}}},
	"moving":        {{{"0", "1"}, {"0"}, {"0"}}, {{"2"}, {"0", "0", "1"}, {"1/3"}}, {{"1/2"}, {"3/2", "-1"}, {"0"}}, {{"1"}, {"1"}, {"2", "1/2"}}},
	"flat triangle": {{{"0"}, {"0"}}, {{"3"}, {"0"}}, {{"1"}, {"0", "1"}}},
	// the corner (0,0,0), (3,0,0), (0,2,0), (0,0,1) at t = 0: facet areas
	// 3, 3/2, 1 and ½√(6² + 2² + 3²) = 7/2, all rational (from the
	// Pythagorean quadruple 2² + 3² + 6² = 7²), so the expansions of the
	// contents have rational coefficients
	"moving corner": {{{"0", "1"}, {"0"}, {"0"}}, {{"3"}, {"0", "0", "1"}, {"0"}}, {{"0"}, {"2"}, {"0", "1"}}, {{"0"}, {"0"}, {"1", "-1"}}},
}

// Each series measure of a series simplex against the exact measure of
// the rational simplex at t = 2^-30: centres and radii against their
// closed forms from the rational methods; the touch points by an
// independent route, the incentre moved by r along each facet's unit
// outward normal (the insphere touches a facet at the foot of the
// perpendicular from its centre, common practice); the exsphere opposite
// vertex i likewise, its centre on the inner side of every facet but i;
// tangent lengths as the distances from a vertex to those touch points.
func TestSeriesShapeAgainstExact(t *testing.T) {
	for name, fam := range seriesFamilies {
		t.Run(name, func(t *testing.T) {
			sh, err := fam.series(8).Shape()
			if err != nil {
				t.Fatal(err)
			}
			e := newExactShape(t, fam.at(t0))
			k := e.s.Dim()
			sx := e.s

			got, err := sh.Circumcenter()
			must(t, err)
			c, err := sx.Circumcenter()
			must(t, err)
			agreeVec(t, "circumcenter", got, realsOf(c))
			r2, err := sh.CircumradiusSq()
			must(t, err)
			want, _ := sx.CircumradiusSq()
			agree(t, "R²", r2, exact.RealFromRat(want))
			cen, err := sh.Centroid()
			must(t, err)
			wc, _ := sx.Centroid()
			agreeVec(t, "centroid", cen, realsOf(wc))
			r, err := sh.Inradius()
			must(t, err)
			agree(t, "inradius", r, e.r)
			in, err := sh.Incenter()
			must(t, err)
			inX := e.weighted(e.F, e.total)
			agreeVec(t, "incenter", in, inX)

			touch, err := sh.TouchPoints()
			must(t, err)
			tangents, err := sh.TangentLengths()
			must(t, err)
			var touchX [][]*exact.Real
			for i := 0; i <= k; i++ {
				n, n2, err := sx.FacetNormal(i)
				must(t, err)
				touchX = append(touchX, along(inX, e.r, n, n2))
				agreeVec(t, fmt.Sprintf("touch point %d", i), touch[i], touchX[i])

				h2, err := sh.AltitudeSq(i)
				must(t, err)
				agree(t, fmt.Sprintf("altitude² %d", i), h2, exact.RealFromRat(n2))
				sn, sn2, err := sh.FacetNormal(i)
				must(t, err)
				agreeVec(t, fmt.Sprintf("facet normal %d", i), sn, realsOf(n))
				agree(t, fmt.Sprintf("|facet normal %d|²", i), sn2, exact.RealFromRat(n2))
			}
			for j := 0; j <= k; j++ {
				m := (j + 1) % (k + 1) // a facet through vertex j
				agree(t, fmt.Sprintf("tangent length %d", j), tangents[j], distR(e.pts[j], touchX[m]))
			}

			if k >= 2 {
				for i := 0; i <= k; i++ {
					w := append([]*exact.Real(nil), e.F...)
					w[i] = exact.RealNeg(e.F[i])
					den := exact.RealSub(e.total, exact.RealMul(exact.RealFromInt(2), e.F[i]))
					ri := exact.RealQuo(exact.RealMul(exact.RealFromInt(int64(k)), rootR(sx.VolumeSq())), den)
					ex := e.weighted(w, den)
					got, err := sh.Exradius(i)
					must(t, err)
					agree(t, fmt.Sprintf("exradius %d", i), got, ri)
					gc, err := sh.Excenter(i)
					must(t, err)
					agreeVec(t, fmt.Sprintf("excenter %d", i), gc, ex)
					feet, err := sh.ExsphereTouchPoints(i)
					must(t, err)
					for m := 0; m <= k; m++ {
						n, n2, _ := sx.FacetNormal(m)
						scale := ri
						if m == i {
							scale = exact.RealNeg(ri)
						}
						agreeVec(t, fmt.Sprintf("exsphere %d touch point %d", i, m), feet[m], along(ex, scale, n, n2))
					}
					for j := 0; j <= k; j++ {
						if j == i {
							continue
						}
						cos, err := sh.DihedralCos(i, j)
						must(t, err)
						c2, sign, _ := sx.DihedralCosSq(i, j)
						agree(t, fmt.Sprintf("dihedral cos %d %d", i, j), cos, signedRootR(c2, sign))
					}
				}
			}
			for i := 0; i <= k; i++ {
				for j := 0; j <= k; j++ {
					for m := j + 1; m <= k; m++ {
						if i == j || i == m {
							continue
						}
						cos, err := sh.VertexCos(i, j, m)
						must(t, err)
						c2, sign, _ := sx.VertexCosSq(i, j, m)
						agree(t, fmt.Sprintf("vertex cos %d %d %d", i, j, m), cos, signedRootR(c2, sign))
					}
				}
			}

			R := rootR(want)
			kk := exact.RealFromInt(int64(k))
			rr, err := sh.RadiusRatio()
			must(t, err)
			agree(t, "radius ratio", rr, exact.RealQuo(exact.RealMul(kk, e.r), R))
			vl, err := sh.VolumeLengthRatio()
			must(t, err)
			vl2, _ := sx.VolumeLengthRatioSq()
			agree(t, "volume-length ratio", vl, rootR(vl2))
			ar, err := sh.AspectRatio()
			must(t, err)
			norm := exact.RealMul(exact.RealSqrt(exact.RealFromInt(int64(2*k*(k+1)))), e.r)
			agree(t, "aspect ratio", ar, exact.RealQuo(rootR(sx.MaxSqEdge()), norm))
		})
	}
}

// Barycentric coordinates of a point with series coordinates against
// the exact ones at t = 2^-30, and of a vertex (a unit vector, exactly).
func TestSeriesBarycentric(t *testing.T) {
	for name, fam := range seriesFamilies {
		t.Run(name, func(t *testing.T) {
			p := fam.series(8)
			sh, err := p.Shape()
			must(t, err)
			dim := len(fam[0])
			pf := make(polyFamily, 1)
			for c := range dim {
				pf[0] = append(pf[0], []string{fmt.Sprintf("%d/7", c+1), "1", fmt.Sprintf("-%d", c)})
			}
			got, err := sh.Barycentric(pf.series(8)[0])
			must(t, err)
			want, err := mustPoints(t, fam.at(t0)...).Barycentric(pf.at(t0)[0])
			must(t, err)
			agreeVec(t, "barycentric", got, realsOf(want))
			got, err = sh.Barycentric(p[1])
			must(t, err)
			for i, l := range got {
				if i == 1 {
					l, _ = exact.SeriesSub(l, sconst(1))
				}
				if _, _, ok := l.Leading(); ok {
					t.Errorf("barycentric of vertex 1: λ_%d = %s, want %d + O(t^N)", i, got[i].String("t"), map[bool]int{true: 1}[i == 1])
				}
			}
		})
	}
}

func must(t *testing.T, err error) {
	t.Helper()
	if err != nil {
		t.Fatal(err)
	}
}

// Σ 1/r_i = 2/r for every tetrahedron (from V = r·S/3 and
// V = r_i·(S − 2S_i)/3, classical: the sum of S − 2S_i over i is 2S), as
// an identity of series: the difference has no known term up to its
// order (at least 4). The families are those whose facet contents expand
// with rational coefficients: with algebraic ones the cancelling
// coefficients are sums of several square roots whose zero bounds
// (BFMSS) soon exceed any precision cap, and the coefficient is
// undecided (an error, never a guess).
func TestSeriesExradiiIdentity(t *testing.T) {
	for _, name := range []string{"sliver", "moving corner"} {
		sh, err := seriesFamilies[name].series(8).Shape()
		must(t, err)
		var o ops
		sum := sconst(0)
		for i := range 4 {
			ri, err := sh.Exradius(i)
			must(t, err)
			sum = o.add(sum, o.quo(sconst(1), ri))
		}
		r, err := sh.Inradius()
		must(t, err)
		d := o.sub(sum, o.quo(sconst(2), r))
		if o.err != nil {
			t.Fatalf("%s: %v", name, o.err)
		}
		n, _ := d.Order()
		if _, _, ok := d.Leading(); ok || n.Cmp(big.NewRat(4, 1)) < 0 {
			t.Errorf("%s: Σ 1/r_i − 2/r = %s, want no known term to at least O(t^4)", name, d.String("t"))
		}
	}
}

// A flattening tetrahedron: base (0,0,0), (1,0,0), (0,1,0) and apex
// (a, b, t). The circumcentre is over the base's circumcentre (1/2, 1/2)
// at height z with (a − 1/2)² + (b − 1/2)² + (t − z)² = 1/2 + z², so
// z = (P + t²)/(2t) with P = (a − 1/2)² + (b − 1/2)² − 1/2 the power of
// (a, b) with respect to the base's circumcircle, and
// R² = 1/2 + z² = P²/(4t²) + (1 + P)/2 + t²/4 (derived by hand). Off the
// circle (a, b) = (2, 1), P = 2: R² = t⁻² + 3/2 + t²/4, R ~ 1/t; on it,
// (a, b) = (1, 1), P = 0: R² = 1/2 + t²/4 stays bounded (four concyclic
// points lie on spheres of every large radius but the limit one).
func TestSeriesFlatteningCircumradius(t *testing.T) {
	apex := func(a, b string) SeriesPoints {
		return spts(t, 8, []string{"0", "0", "0"}, []string{"1", "0", "0"}, []string{"0", "1", "0"}, []string{a, b, "1*t"})
	}
	r2, err := apex("2", "1").CircumradiusSq()
	must(t, err)
	wantTerms(t, "R² off the circle", r2, [2]string{"1", "-2"}, [2]string{"3/2", "0"}, [2]string{"1/4", "2"})
	r2, err = apex("1", "1").CircumradiusSq()
	must(t, err)
	wantTerms(t, "R² on the circle", r2, [2]string{"1/2", "0"}, [2]string{"1/4", "2"})
	sh, err := apex("2", "1").Shape()
	must(t, err)
	c, err := sh.Circumcenter()
	must(t, err)
	wantTerms(t, "circumcentre x", c[0], [2]string{"1/2", "0"})
	wantTerms(t, "circumcentre z", c[2], [2]string{"1", "-1"}, [2]string{"1/2", "1"})
}

// The sliver demo's squeeze of (0,0,0), (4,0,1), (1,3,2), (3,2,−1): the
// inradius is r = 3V/S with V = (35/6)·t (the base volume times the
// squeeze) and S → 2·(15/2), twice the projected quadrilateral's area by
// the shoelace formula, so r ~ (7/6)·t (derived by hand); its
// circumcentre runs off as (18/35)/t over (131/70, 7/10), from the
// leading order of 2p_j·x + 2t·h_j·z = |p_j|² + t²h_j² (p_j the projected
// vertices, h_j the heights 1, 2, −1; derived by hand).
func TestSeriesSliverLeadingTerms(t *testing.T) {
	sh, err := seriesFamilies["sliver"].series(8).Shape()
	must(t, err)
	r, err := sh.Inradius()
	must(t, err)
	if c, k, ok := r.Leading(); !ok || k.Cmp(big.NewRat(1, 1)) != 0 || c.String() != "7/6" {
		t.Errorf("sliver inradius %s, want 7/6·t + …", r.String("t"))
	}
	c, err := sh.Circumcenter()
	must(t, err)
	lead := func(what string, s *exact.Series, coef string, exp int64) {
		c, k, ok := s.Leading()
		if !ok || k.Cmp(big.NewRat(exp, 1)) != 0 || c.String() != coef {
			t.Errorf("%s = %s, want %s·t^%d + …", what, s.String("t"), coef, exp)
		}
	}
	lead("circumcentre x", c[0], "131/70", 0)
	lead("circumcentre y", c[1], "7/10", 0)
	lead("circumcentre z", c[2], "18/35", -1)
}

// Refusals: a family degenerate for every t, indices out of range, and a
// barycentric point of a simplex that is not full-dimensional.
func TestSeriesShapeRefusals(t *testing.T) {
	flat := spts(t, 6, []string{"0", "0", "0"}, []string{"1", "0", "0"}, []string{"0", "1", "0"}, []string{"1", "1", "0"})
	sh, err := flat.Shape()
	must(t, err)
	if _, err := sh.Circumcenter(); err == nil || !errors.Is(err, ErrDegenerate) {
		t.Errorf("flat circumcentre: %v", err)
	}
	seg := spts(t, 6, []string{"0", "0"}, []string{"1", "1*t"})
	sh, err = seg.Shape()
	must(t, err)
	if _, err := sh.Exradius(0); err == nil || !errors.Is(err, exact.ErrShape) {
		t.Errorf("segment exradius: %v", err)
	}
	if _, err := sh.AltitudeSq(2); err == nil || !errors.Is(err, exact.ErrShape) {
		t.Errorf("altitude 2 of a segment: %v", err)
	}
	if _, err := sh.Barycentric(seg[1]); err == nil || !errors.Is(err, exact.ErrShape) {
		t.Errorf("barycentric on a segment in the plane: %v", err)
	}
}

// sfactorial against math/big's MulRange, past (13!)², which wraps an
// int64, and 21!, which does too.
func TestSFactorialExact(t *testing.T) {
	for k := 0; k <= 25; k++ {
		f := new(big.Int).MulRange(1, int64(k))
		for _, sq := range []bool{false, true} {
			want := new(big.Int).Set(f)
			if sq {
				want.Mul(want, f)
			}
			c, _, ok := sfactorial(k, sq).Leading()
			if !ok {
				t.Fatalf("sfactorial(%d, %v) has no leading term", k, sq)
			}
			got, ok := c.Rat()
			if !ok || !got.IsInt() || got.Num().Cmp(want) != 0 {
				t.Errorf("sfactorial(%d, %v) = %v, want %v", k, sq, got, want)
			}
		}
	}
}

package geom

import (
	"math/big"
	"testing"

	"assay/exact"
)

const seriesCap = 4096

// spts builds series points: entries are rationals, or "t" times a
// rational for the series variable (known to O(t^order)).
func spts(t *testing.T, order int, rows ...[]string) SeriesPoints {
	t.Helper()
	v := exact.SeriesVar(order, seriesCap)
	out := make(SeriesPoints, len(rows))
	for i, row := range rows {
		for _, s := range row {
			var x *exact.Series
			if len(s) > 1 && s[len(s)-1] == 't' {
				q, _ := new(big.Rat).SetString(s[:len(s)-2])
				x, _ = exact.SeriesMul(exact.SeriesConst(exact.RealFromRat(q), seriesCap), v)
			} else {
				q, ok := new(big.Rat).SetString(s)
				if !ok {
					t.Fatalf("bad entry %q", s)
				}
				x = exact.SeriesConst(exact.RealFromRat(q), seriesCap)
			}
			out[i] = append(out[i], x)
		}
	}
	return out
}

// wantTerms checks a series' known non-zero terms "c@k" (c·t^k).
func wantTerms(t *testing.T, what string, s *exact.Series, want ...[2]string) {
	t.Helper()
	coefs, exps, err := s.Terms()
	if err != nil {
		t.Fatal(err)
	}
	if len(coefs) != len(want) {
		t.Fatalf("%s = %s, want %d terms", what, s.String("t"), len(want))
	}
	for i, w := range want {
		q, ok := coefs[i].Rat()
		c, _ := new(big.Rat).SetString(w[0])
		k, _ := new(big.Rat).SetString(w[1])
		if !ok || q.Cmp(c) != 0 || exps[i].Cmp(k) != 0 {
			t.Errorf("%s = %s: term %d is not %s·t^%s", what, s.String("t"), i, w[0], w[1])
		}
	}
}

// A tetrahedron whose apex is at height t over the base plane has volume
// (base area)·t/3, exactly linear in t (volume of a pyramid, classical):
// base (0,0,0), (4,0,0), (0,3,0) of area 6, apex (1,1,t): V = 2t, V² = 4t².
func TestSeriesPyramidVolumeIsLinear(t *testing.T) {
	p := spts(t, 6, []string{"0", "0", "0"}, []string{"4", "0", "0"}, []string{"0", "3", "0"}, []string{"1", "1", "1*t"})
	v2, err := p.VolumeSq()
	if err != nil {
		t.Fatal(err)
	}
	wantTerms(t, "V²", v2, [2]string{"4", "2"})
	v, err := exact.SeriesPow(v2, 1, 2)
	if err != nil {
		t.Fatal(err)
	}
	wantTerms(t, "V", v, [2]string{"2", "1"})
}

// Circumradii of constant simplices against classical values (from
// memory): a right triangle's circumradius is half its hypotenuse (legs
// 3, 4: R² = 25/4); the regular tetrahedron (±1, ±1, ±1) with an even
// number of minus signs is inscribed in the sphere of radius √3 (R² = 3).
func TestSeriesCircumradiusConstants(t *testing.T) {
	for _, c := range []struct {
		p    SeriesPoints
		want string
	}{
		{spts(t, 6, []string{"0", "0"}, []string{"3", "0"}, []string{"0", "4"}), "25/4"},
		{spts(t, 6, []string{"1", "1", "1"}, []string{"1", "-1", "-1"}, []string{"-1", "1", "-1"}, []string{"-1", "-1", "1"}), "3"},
	} {
		r2, err := c.p.CircumradiusSq()
		if err != nil {
			t.Fatal(err)
		}
		wantTerms(t, "R²", r2, [2]string{c.want, "0"})
	}
}

// A needle (0,0,0), (1,0,0), (0,t,0), (0,0,t): V = t²/6; the facets have
// areas t/2, t/2, t²/2 and t·√(2 + t²)/2, so r = 3V/S = t/(2 + √2) + O(t²)
// (derived by hand; the session tests check it by extrapolation too).
func TestSeriesNeedleInradiusIsOrderT(t *testing.T) {
	p := spts(t, 6, []string{"0", "0", "0"}, []string{"1", "0", "0"}, []string{"0", "1*t", "0"}, []string{"0", "0", "1*t"})
	r, err := p.Inradius()
	if err != nil {
		t.Fatal(err)
	}
	c, k, ok := r.Leading()
	if !ok || k.Cmp(big.NewRat(1, 1)) != 0 {
		t.Fatalf("needle inradius %s: leading exponent %v, want 1", r.String("t"), k)
	}
	want := exact.RealQuo(exact.RealFromInt(1), exact.RealAdd(exact.RealFromInt(2), exact.RealSqrt(exact.RealFromInt(2))))
	if d, err := exact.RealCmp(c, want, seriesCap); err != nil || d != 0 {
		t.Errorf("needle inradius %s: leading coefficient is not 1/(2 + √2) (%d, %v)", r.String("t"), d, err)
	}
}

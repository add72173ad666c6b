package session

import (
	"testing"

	"assay/cells"
)

// The algebraic measures of a simplex on series coordinates, from a
// notebook. The sliver demo's squeeze: the circumcentre runs off as
// (18/35)/t over (131/70, 7/10) (derived by hand in
// exact/geom/series_shape_test.go), the radius ratio 3r/R ~ (245/36)·t²
// agrees with inradius()/circumradius_sq() composed by hand, and a point
// squeezed with the simplex keeps its barycentric coordinates (affine
// maps preserve them, common practice): (1, 1, t) is the image of
// (1, 1, 1), whose coordinates at t = 1 are exact. A flattening
// tetrahedron with apex (2, 1, t) over the base (0,0,0), (1,0,0),
// (0,1,0) has R² = t⁻² + 3/2 + t²/4 (derived in the same file), so
// R ~ 1/t. The sliver's r ~ (7/6)·t, its radius ratio's and circumcentre
// height's leading coefficients are checked by the extrapolation route
// too (the needle's inradius in TestAsymptoticClaims).
func TestSeriesSimplexClaims(t *testing.T) {
	rep := runHere(t, `def squeezed(t):
    return simplex([[x, y, t * z] for x, y, z in [[0, 0, 0], [4, 0, 1], [1, 3, 2], [3, 2, -1]]])
def apex(t):
    return simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0], [2, 1, t]])
asymptotic("circumcentre height", lambda t: squeezed(t).circumcenter()[2], expect=(frac(18, 35), -1))
limit("circumcentre x", lambda t: squeezed(t).circumcenter()[0], toward=0, expect=frac(131, 70))
asymptotic("radius ratio", lambda t: squeezed(t).radius_ratio(), expect=(frac(245, 36), 2))
limit("radius ratio against r and R", lambda t: squeezed(t).radius_ratio() * sqrt(squeezed(t).circumradius_sq()) / squeezed(t).inradius(), toward=0, expect=3)
limit("barycentric of a squeezed point", lambda t: squeezed(t).barycentric([1, 1, t])[2], toward=0, expect=squeezed(1).barycentric([1, 1, 1])[2])
asymptotic("flattening circumradius", lambda t: sqrt(apex(t).circumradius_sq()), expect=(1, -1))
limit("radius ratio by extrapolation", lambda t: squeezed(t).radius_ratio() / t**2, toward=0, expect=frac(245, 36), method="extrapolation")
limit("inradius / t by extrapolation", lambda t: squeezed(t).inradius() / t, toward=0, expect=frac(7, 6), method="extrapolation")
limit("circumcentre height * t by extrapolation", lambda t: squeezed(t).circumcenter()[2] * t, toward=0, expect=frac(18, 35), method="extrapolation")
limit("vertex angle", lambda t: squeezed(t).vertex_angle(0, 1, 2), toward=0, expect=acos(sqrt(frac(1, 10))))
limit("dihedral angle folding flat falls back", lambda t: squeezed(t).dihedral_angle(1, 2), toward=0, expect=pi, steps=16)
limit("contains falls back", lambda t: 1 if squeezed(t).contains([1, 1, 0]) else 0, toward=0, expect=1, steps=12)`)
	o := rep.Outcomes[0]
	checkClaims(t, o, []claimWant{
		{cells.Holds, "series expansion", "18/35*t^(-1)"},
		{cells.Holds, "series expansion", "the limit is 131/70"},
		{cells.Holds, "series expansion", "245/36*t^2"},
		{cells.Holds, "series expansion", "the limit is 3"},
		{cells.Holds, "series expansion", ""},
		{cells.Holds, "series expansion", "t^(-1)"},
		{cells.Estimated, "", ""},
		{cells.Estimated, "", ""},
		{cells.Estimated, "", ""},
		// acos(1/√10) is transcendental: certified digits, by series.
		{cells.HoldsToDigits, "series expansion", "the limit is 1.249045772"},
		// the cosine tends to −1, a branch point of acos
		{cells.Estimated, "", "acos has a branch point at ±1"},
		{cells.Estimated, "", "contains() is not available for a simplex with series coordinates"},
	})
	for _, c := range o.Claims[6:9] {
		if c.Digits < 10 {
			t.Errorf("%s: %d digits by extrapolation (%s)", c.Name, c.Digits, c.Note)
		}
	}
}

// Every result of a series simplex is what the simplex of numbers gives,
// in the same shape: a point is a list, facet_normal a pair, and the
// methods that are not algebraic refuse with their reason.
func TestSeriesSimplexResults(t *testing.T) {
	expectPrints(t, []printCase{
		{`s = series(lambda t: simplex([[0, 0], [3, 0], [1, t]]).centroid()[1], order=3)
print(s)`, "1/3*t + O(t^3)"},
		// The tangent lengths of a triangle are s − a, s − b, s − c
		// (classical): for (0,0), (3,0), (1,t), with sides a = √(4 + t²)
		// opposite vertex 0, b = √(1 + t²), c = 3, vertex 0's is
		// s − a = (3 + √(1 + t²) − √(4 + t²))/2
		// = (3 + 1 + t²/2 − 2 − t²/4)/2 + O(t⁴) = 1 + t²/8 + O(t⁴)
		// (binomial series, by hand).
		{`print(series(lambda t: simplex([[0, 0], [3, 0], [1, t]]).tangent_lengths()[0], order=4))`, "1 + 1/8*t^2 + O(t^4)"},
		{`n = series(lambda t: simplex([[0, 0], [3, 0], [1, t]]).facet_normal(2)[0][1], order=3)
print(n)`, "-t + O(t^3)"},
		// a list, as on numbers: list concatenation works on it
		{`print(series(lambda t: (simplex([[0, 0], [3, 0], [1, t]]).circumcenter() + [t])[2]))`, "t + O(t^6)"},
	})
	expectErrors(t, []errorCase{
		{`series(lambda t: simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, t]]).solid_angle(0))`, "solid_angle() is not available for a simplex with series coordinates: it is an atan2"},
		{`series(lambda t: simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, t]]).min_dihedral_angle())`, "dihedral_angle(i, j) expands for each pair"},
		{`series(lambda t: simplex([[0, 0, 0], [1, 0, 0], [0, 1, t]]).barycentric([0, 0, 0]))`, "a truncated series cannot settle"},
		{`series(lambda t: simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, t]]).exradius(4))`, "needs vertex indices from 0 to 3"},
		{`series(lambda t: simplex([[0, 0], [1, 0], [2, 0]]).circumcenter() + [t])`, "degenerate"},
		{`series(lambda t: simplex([[0, 0], [1, 0], [0, t]]).gram())`, "gram() is not available"},
	})
}

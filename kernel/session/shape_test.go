package session

import "testing"

// The unit right corner (0,0,0), (1,0,0), (0,1,0), (0,0,1), by hand:
// incentre (r, r, r) with r = 3V/S = (3 − √3)/6; the exsphere opposite the
// origin has radius 3V/(S − 2·(√3/2)) = (3 + √3)/6 and its centre on the
// diagonal at that distance from the coordinate planes; tangents from the
// origin to the insphere have length √2·r, from the other vertices √(1 − 2r + 3r² − r²)
// = √6/3 (|v − I|² − r² with v = (1, 0, 0)). The 3-4-5 triangle's
// tangent lengths are s − a (textbook): 1, 3, 2 at its vertices (0, 0),
// (4, 0), (0, 3).
func TestShapeValues(t *testing.T) {
	corner := "c = simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]])\n"
	expectPrints(t, []printCase{
		{corner + "print(c.exradius(0), c.excenter(0))", "(3 + sqrt(3))/6 [(3 + sqrt(3))/6, (3 + sqrt(3))/6, (3 + sqrt(3))/6]"},
		{corner + "print(c.tangent_lengths()[1:])", "[sqrt(6)/3, sqrt(6)/3, sqrt(6)/3]"},
		{corner + "print(c.tangent_lengths()[0] ** 2 == 2 * c.inradius() ** 2)", "True"},
		{"print(simplex([[0, 0], [4, 0], [0, 3]]).tangent_lengths())", "[1, 3, 2]"},
		// Excircles of the right triangle (0,0), (4,0), (0,3), by hand: opposite
		// the right angle, centre (6, 6) tangent to both axes; opposite (4, 0),
		// centre (−2, 2), at distance 2 from x = 0, y = 0 and 3x + 4y = 12,
		// touching them at (0, 2), (−2, 0) and (−2, 2) + (10/25)(3, 4).
		{"t = simplex([[0, 0], [4, 0], [0, 3]])\nprint(t.excenter(0), t.excenter(1), t.exsphere_touch_points(1))", "[6, 6] [-2, 2] [[-4/5, 18/5], [0, 2], [-2, 0]]"},
		{corner + "print(c.centroid(), c.barycentric([1, 1, 1]), c.contains([0, 0, 0]), c.contains([1, 1, 1]))", "[1/4, 1/4, 1/4] [-2, 1, 1, 1] True False"},
		{corner + "print(c.facet_normal(0), c.facet_normal(3), c.altitude(0), c.altitude_sq(1))", "([1/3, 1/3, 1/3], 1/3) ([0, 0, -1], 1) sqrt(3)/3 1"},
		{corner + "print(c.vertex_cos(0, 1, 2), c.vertex_cos(1, 0, 2))", "0 sqrt(2)/2"},
		{corner + "print(c.radius_ratio(), c.volume_length_ratio(), c.aspect_ratio())", "sqrt(3) - 1 4*sqrt(3)/9 (1 + sqrt(3))/2"},
		// A triangle in space: a point off its plane is outside, one on it is decided exactly.
		{"t = simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0]])\nprint(t.contains([1, 1, 1]), t.contains([sqrt(2) / 4, sqrt(2) / 4, 0]), t.contains([sqrt(2) / 4, sqrt(2) / 4, sqrt(3) / 100]))", "False True False"},
		// The boundary counts as inside: a point of the face x + y + z = 1.
		{corner + "print(c.contains([sqrt(2) / 2, 1 - sqrt(2) / 2, 0]), c.contains([sqrt(2) / 2, 1 - sqrt(2) / 2, frac(1, 10 ** 30)]))", "True False"},
	})
}

func TestShapeErrors(t *testing.T) {
	flat := "f = simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0], [1, 1, 0]])\n"
	tet := "t = simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]])\n"
	var cases []errorCase
	for _, m := range []string{"exradius(0)", "excenter(1)", "exsphere_touch_points(2)", "tangent_lengths()", "touch_points()",
		"barycentric([0, 0, 0])", "contains([0, 0, 0])", "facet_normal(0)", "solid_angle(0)", "radius_ratio()",
		"aspect_ratio()", "min_dihedral_angle()", "max_dihedral_angle()", "dihedral_angle(0, 1)"} {
		cases = append(cases, errorCase{flat + "print(f." + m + ")", "degenerate"})
	}
	cases = append(cases, []errorCase{
		{tet + "print(t.exradius(4))", "exradius(i) needs vertex indices from 0 to 3, got i = 4"},
		{tet + "print(t.vertex_angle(0, 1, 1))", "needs different vertex indices, got 1 twice"},
		{tet + "print(t.vertex_cos(0, 1, -1))", "got k = -1"},
		{tet + "print(t.barycentric([1, 2]))", "p has 2 coordinates, the simplex's points have 3"},
		{tet + "print(t.contains([1, 2, 3, 4]))", "p has 4 coordinates, the simplex's points have 3"},
		{tet + "print(t.barycentric([1, 2, 0.5]))", "coordinate 2 is a float"},
		{"print(simplex([[0, 0], [1, 0], [0, 1]]).solid_angle(0))", "defined for tetrahedra (3-simplices), this is a 2-simplex"},
		{"print(simplex([[0], [1]]).exradius(0))", "dimension at least 2, this is a 1-simplex"},
		{"print(simplex([[0], [1]]).min_dihedral_angle())", "dimension at least 2, this is a 1-simplex"},
		{"print(simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0]]).barycentric([1, 1, 1]))", "not in the affine hull"},
		{"print(simplex([[0, 0], [0, 0], [1, 0]]).vertex_angle(0, 1, 2))", "vertex 0 coincides with vertex 1 or 2"},
		{"print(simplex([[0, 0], [0, 0], [1, 0]]).altitude(2))", "the facet opposite vertex 2 has content 0"},
	}...)
	expectErrors(t, cases)
}

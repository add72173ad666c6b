package session

import (
	"strings"
	"testing"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/values"
)

// embeddingHelpers are cell functions the embedding tests share.
const embeddingHelpers = `def sub(p, q):
    return [p[c] - q[c] for c in range(len(p))]
def dist2(p, q):
    return sum([x * x for x in sub(p, q)])
def det3(u, v, w):
    return u[0] * (v[1] * w[2] - v[2] * w[1]) - u[1] * (v[0] * w[2] - v[2] * w[0]) + u[2] * (v[0] * w[1] - v[1] * w[0])
def factorial(n):
    f = 1
    for i in range(2, n + 1):
        f = f * i
    return f
def unit(n):
    return matrix([[0 if i == j else 1 for j in range(n + 1)] for i in range(n + 1)])
`

// allHold runs one cell and fails the test unless it ran and every claim
// holds; it returns the outcome.
func allHold(t *testing.T, src string) cells.Outcome {
	t.Helper()
	o := runHere(t, src).Outcomes[0]
	if o.Error != nil {
		t.Fatalf("line %d: %s", o.Error.Line, o.Error.Message)
	}
	for _, c := range o.Claims {
		if c.Verdict != cells.Holds {
			t.Errorf("%s: %s (%s; %s)", c.Name, c.Verdict, c.Residual, c.Note)
		}
	}
	return o
}

// The regular n-simplex of unit edge has volume √(n+1)/(n!·2^(n/2)) (a
// standard formula; from memory). Its canonical embedding is lower
// triangular, so the volume is also the product of the diagonal
// coordinates over n!; both are proved equal to the closed form.
func TestRegularSimplexEmbedding(t *testing.T) {
	src := embeddingHelpers + `for n in range(1, 7):
    s = distance_simplex(unit(n))
    V = sqrt(n + 1) / (factorial(n) * sqrt(2) ** n)
    identity("volume %d" % n, s.volume(), V)
    P = s.points()
    diag = 1
    for i in range(1, n + 1):
        diag = diag * P[i][i - 1]
    identity("coordinates %d" % n, diag / factorial(n), V)
    for i in range(n + 1):
        for j in range(i + 1, n + 1):
            identity("edge %d %d-%d" % (n, i, j), dist2(P[i], P[j]), 1)
    C = s.circumcenter()
    for i in range(n + 1):
        identity("circumradius %d at %d" % (n, i), dist2(C, P[i]), s.circumradius_sq())
print(distance_simplex(unit(2)).points())`
	o := allHold(t, src)
	if len(o.Claims) < 6*2+56 {
		t.Errorf("only %d claims", len(o.Claims))
	}
	if !strings.HasPrefix(o.Output, "[[0, 0], [1, 0], [1/2, sqrt(3)/2]]") {
		t.Errorf("printed %q", o.Output)
	}
}

// Heronian tetrahedra (integer edges, face areas and volume) from OEIS
// A272388, "Longest side of Heronian tetrahedron", its table of examples:
// dAB, dAC, dBC, dCD, dBD, dAD, the areas of ABC, ABD, ACD, BCD and the
// volume. Given by their edges, they get coordinates in which every
// squared distance is the given one, the circumcentre is equidistant from
// the vertices and the incentre at distance r from every facet — each
// proved by the zero bound.
func TestHeronianTetrahedraEmbedded(t *testing.T) {
	src := embeddingHelpers + `table = [
    [117, 84, 51, 52, 53, 80, 1890, 1800, 2016, 1170, 18144],
    [160, 153, 25, 39, 56, 120, 1872, 2688, 1404, 420, 8064],
    [203, 195, 148, 203, 195, 148, 13650, 13650, 13650, 13650, 611520],
    [225, 200, 65, 119, 156, 87, 6300, 4914, 2436, 3570, 35280],
    [234, 168, 102, 104, 106, 160, 7560, 7200, 8064, 4680, 145152],
    [318, 221, 203, 42, 175, 221, 22260, 18564, 4620, 2940, 206976],
    [319, 318, 175, 175, 210, 221, 26796, 23100, 18564, 14700, 1034880],
    [319, 318, 175, 203, 252, 221, 26796, 27720, 22260, 17640, 1241856],
    [320, 306, 50, 78, 112, 240, 7488, 10752, 5616, 1680, 64512],
    [351, 252, 153, 156, 159, 240, 17010, 16200, 18144, 10530, 489888],
]
for row in table:
    AB, AC, BC, CD, BD, AD = row[0:6]
    D = matrix([[0, AB**2, AC**2, AD**2], [AB**2, 0, BC**2, BD**2], [AC**2, BC**2, 0, CD**2], [AD**2, BD**2, CD**2, 0]])
    s = distance_simplex(D)
    name = "%d-%d-%d-%d-%d-%d" % tuple(row[0:6])
    identity(name + " volume", s.volume(), row[10])
    F = [sqrt(a) for a in s.facet_areas_sq()]
    identity(name + " faces", [F[3], F[2], F[1], F[0]], row[6:10])
    P = s.points()
    for i in range(4):
        for j in range(i + 1, 4):
            identity(name + " d%d%d" % (i, j), dist2(P[i], P[j]), D[i, j])
    C = s.circumcenter()
    for i in range(4):
        identity(name + " circumcentre %d" % i, dist2(C, P[i]), s.circumradius_sq())
    I = s.incenter()
    r = s.inradius()
    for i in range(4):
        a, b, c = [P[j] for j in range(4) if j != i]
        identity(name + " incentre %d" % i, abs(det3(sub(a, I), sub(b, I), sub(c, I))) / (2 * F[i]), r)
    identity(name + " facet keeps coordinates", s.facet(0).points(), P[1:4])`
	if o := allHold(t, src); len(o.Claims) != 10*(2+6+4+4+1) {
		t.Errorf("%d claims", len(o.Claims))
	}
}

// A disphenoid (opposite edges equal: AB = CD = a, AC = BD = b, AD = BC =
// c) has volume² = (a²+b²−c²)(a²−b²+c²)(−a²+b²+c²)/72, congruent faces,
// and its circumcentre, incentre and centroid coincide (standard facts
// about isosceles tetrahedra; from memory). Its canonical coordinates are
// irrational, so these are proved by the zero bound.
func TestDisphenoidCentres(t *testing.T) {
	src := embeddingHelpers + `for a2, b2, c2 in [(5, 6, 7), (10, 11, 13), (frac(9, 2), 5, 6)]:
    D = matrix([[0, a2, b2, c2], [a2, 0, c2, b2], [b2, c2, 0, a2], [c2, b2, a2, 0]])
    s = distance_simplex(D)
    n = "%s-%s-%s " % (a2, b2, c2)
    identity(n + "volume", s.volume(), sqrt((a2 + b2 - c2) * (a2 - b2 + c2) * (-a2 + b2 + c2) / 72))
    P = s.points()
    G = [sum([P[i][c] for i in range(4)]) / 4 for c in range(3)]
    identity(n + "circumcentre", s.circumcenter(), G)
    identity(n + "incentre", s.incenter(), G)
    for i in range(4):
        for j in range(i + 1, 4):
            identity(n + "d%d%d" % (i, j), dist2(P[i], P[j]), D[i, j])`
	o := allHold(t, src)
	for _, c := range o.Claims {
		if c.Method != claim.AlgebraicMethod && !strings.HasSuffix(c.Name, "volume") {
			t.Errorf("%s: %s by %q (%s; %s)", c.Name, c.Verdict, c.Method, c.Residual, c.Note)
		}
	}
}

// Points with algebraic coordinates: the regular tetrahedron of unit edge
// placed by hand, (0,0,0), (1,0,0), (1/2, √3/2, 0), (1/2, √3/6, √6/3), has
// volume √2/12 (V = a³/(6√2); from memory) and its circumcentre at its
// centroid (1/2, √3/6, √6/12); points at an irrational squared distance
// are refused.
func TestAlgebraicPointsSimplex(t *testing.T) {
	src := `s = simplex([[0, 0, 0], [1, 0, 0], [frac(1, 2), sqrt(3) / 2, 0], [frac(1, 2), sqrt(3) / 6, sqrt(6) / 3]])
identity("volume", s.volume(), sqrt(2) / 12)
identity("circumcentre", s.circumcenter(), [frac(1, 2), sqrt(3) / 6, sqrt(6) / 12])
identity("incentre", s.incenter(), [frac(1, 2), sqrt(3) / 6, sqrt(6) / 12])
identity("sq_edges", s.sq_edges(), [1, 1, 1, 1, 1, 1])
print(s.facet(3))`
	o := allHold(t, src)
	for _, c := range o.Claims {
		if c.Name == "volume" && c.Method != claim.AlgebraicMethod {
			t.Errorf("volume by %q", c.Method)
		}
	}
	if want := "simplex([[0, 0, 0], [1, 0, 0], [1/2, sqrt(3)/2, 0]])"; !strings.HasPrefix(o.Output, want) {
		t.Errorf("printed %q, want %q", o.Output, want)
	}
	expectErrors(t, []errorCase{
		// |(1, √2) − (√3, 0)|² = (1 − √3)² + 2 = 6 − 2√3 ≈ 2.5359.
		{"s = simplex([[0, 0], [1, sqrt(2)], [sqrt(3), 0]])", "between points 1 and 2 (6 - 2*sqrt(3)) is irrational"},
		{"s = distance_simplex(matrix([[0, 1], [1, 0]]))\nt = affine(s, matrix([[2]]), [0])", "algebraic coordinates"},
		{"s = simplex([[0, 0], [1, sqrt(2)], [1, 0], [2, 1]])", "needs at least 3 coordinates"},
	})
}

// The insphere touches facet i at the foot of the perpendicular from the
// incentre: for the 3-4-5 triangle (0,0), (4,0), (0,3) the incircle of
// radius 1 about (1, 1) touches the sides at (8/5, 9/5), (0, 1), (1, 0)
// (computed by hand; common practice). In a tetrahedron each touch point
// is at distance r from the incentre, with T_i − I normal to facet i, and
// the tangent segments from a vertex to the touch points of the three
// facets through it are equal (tangents from a point to a sphere; a
// standard fact) — proved on tetrahedra from distances.
func TestInsphereTouchPoints(t *testing.T) {
	src := embeddingHelpers + `identity("3-4-5", simplex([[0, 0], [4, 0], [0, 3]]).insphere_touch_points(), [[frac(8, 5), frac(9, 5)], [0, 1], [1, 0]])
def dot(u, v):
    return sum([u[i] * v[i] for i in range(len(u))])
for name, D in [("disphenoid", matrix([[0, 5, 6, 7], [5, 0, 7, 6], [6, 7, 0, 5], [7, 6, 5, 0]])),
                ("scalene", matrix([[0, 4, 5, 6], [4, 0, 7, 8], [5, 7, 0, 9], [6, 8, 9, 0]]))]:
    s = distance_simplex(D)
    P, I, T, r = s.points(), s.incenter(), s.insphere_touch_points(), s.inradius()
    for i in range(4):
        identity("%s touch %d at distance r" % (name, i), dist2(T[i], I), r ** 2)
        a, b, c = [P[j] for j in range(4) if j != i]
        identity("%s touch %d normal" % (name, i), [dot(sub(T[i], I), sub(b, a)), dot(sub(T[i], I), sub(c, a))], [0, 0])
    for m in range(4):
        tangents = [dist2(P[m], T[i]) for i in range(4) if i != m]
        identity("%s equal tangents from %d" % (name, m), tangents[1:], tangents[:1] * 2)`
	if o := allHold(t, src); len(o.Claims) != 1+2*12 {
		t.Errorf("%d claims", len(o.Claims))
	}
	expectErrors(t, []errorCase{
		{"print(simplex([[0, 0], [1, 1], [2, 2]]).insphere_touch_points())", "degenerate"},
		{"print(simplex([[1, 2]]).insphere_touch_points())", "a point has no facets"},
		{"print(distance_simplex(matrix([[0]])).inradius())", "a point has no facets"},
	})
	// A point is its own incentre.
	expectPrints(t, []printCase{{"print(simplex([[1, 2]]).incenter(), distance_simplex(matrix([[0]])).incenter())", "[1, 2] []"}})
}

// Every method of a simplex works on one with algebraic coordinates (from
// distances, or points given with certified reals), or says clearly that
// it needs rational coordinates; the table of methods is read from the
// type, so a method added later must be added here. The values are
// checked elsewhere; this is about reach.
func TestEveryMethodOnAlgebraicSimplices(t *testing.T) {
	calls := map[string]string{
		"sq_edges": "t.sq_edges()", "cayley_menger": "t.cayley_menger()", "cayley_menger_matrix": "t.cayley_menger_matrix()",
		"volume_sq": "t.volume_sq()", "volume": "t.volume()", "facet_areas_sq": "t.facet_areas_sq()", "gram": "t.gram()",
		"dim": "t.dim()", "is_degenerate": "t.is_degenerate()", "points": "t.points()", "circumradius_sq": "t.circumradius_sq()",
		"circumcenter": "t.circumcenter()", "inradius": "t.inradius()", "incenter": "t.incenter()",
		"insphere_touch_points": "t.insphere_touch_points()", "sq_edge": "t.sq_edge(0, 2)", "face": "t.face([0, 2]).points()",
		"facet": "t.facet(1).points()", "dihedral_cos": "t.dihedral_cos(0, 1)",
		"touch_points": "t.touch_points()", "exradius": "t.exradius(1)", "excenter": "t.excenter(2)",
		"exsphere_touch_points": "t.exsphere_touch_points(3)", "tangent_lengths": "t.tangent_lengths()",
		"centroid": "t.centroid()", "barycentric": "t.barycentric(t.points()[1])", "contains": "t.contains(t.incenter())",
		"facet_normal": "t.facet_normal(2)", "altitude_sq": "t.altitude_sq(1)", "altitude": "t.altitude(0)",
		"vertex_cos": "t.vertex_cos(0, 1, 2)", "vertex_angle": "t.vertex_angle(1, 2, 3)", "solid_angle": "t.solid_angle(2)", "dihedral_angle": "t.dihedral_angle(0, 3)",
		"radius_ratio": "t.radius_ratio()", "volume_length_ratio": "t.volume_length_ratio()",
		"min_dihedral_angle": "t.min_dihedral_angle()", "max_dihedral_angle": "t.max_dihedral_angle()", "aspect_ratio": "t.aspect_ratio()",
	}
	refused := map[string]string{"facet_area_vectors": "t.facet_area_vectors()"}
	found := 0
	for name := range values.SimplexType.Dict {
		if strings.HasPrefix(name, "__") {
			continue
		}
		found++
		if calls[name] == "" && refused[name] == "" {
			t.Errorf("method %s is not covered", name)
		}
	}
	if found != len(calls)+len(refused) {
		t.Errorf("the simplex type has %d methods, %d are listed here", found, len(calls)+len(refused))
	}
	setup := `s = distance_simplex(matrix([[0, 4, 5, 6], [4, 0, 7, 8], [5, 7, 0, 9], [6, 8, 9, 0]]))
g = simplex([[0, 0, 0], [1, 0, 0], [frac(1, 2), sqrt(3) / 2, 0], [frac(1, 2), sqrt(3) / 6, sqrt(6) / 3]])
`
	for _, which := range []string{"s", "g"} {
		var b strings.Builder
		b.WriteString(setup + "t = " + which + "\n")
		for _, c := range calls {
			b.WriteString("print(" + c + ")\n")
		}
		b.WriteString("print(cayley_menger(t), volume_sq(t))")
		if o := runHere(t, b.String()).Outcomes[0]; o.Error != nil {
			t.Errorf("%s: line %d: %s", which, o.Error.Line, o.Error.Message)
		}
		expectErrors(t, []errorCase{
			{setup + "t = " + which + "\n" + refused["facet_area_vectors"], "needs rational ones"},
			{setup + "affine(" + which + ", unit_matrix(3), [0, 0, 0])", "needs rational ones"},
		})
	}
}

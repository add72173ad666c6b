package exact

import (
	"errors"
	"flag"
	"fmt"
	"math/big"
	"math/rand"
	"slices"
	"strings"
	"testing"
)

// factorStrings returns "u: f1^k1, f2, …" for comparing with a table.
func factorStrings(f *Factorization) string {
	var parts []string
	for _, fp := range f.Factors {
		s := fp.Factor.String()
		if fp.Mult > 1 {
			s += fmt.Sprintf("^%d", fp.Mult)
		}
		parts = append(parts, s)
	}
	return f.Unit.RatString() + ": " + strings.Join(parts, ", ")
}

// circulant returns the n×n circulant matrix with first row vs.
func circulant(tb testing.TB, r *Ring, vs []*Poly) *PolyMatrix {
	n := len(vs)
	rows := make([][]*Poly, n)
	for i := range rows {
		rows[i] = make([]*Poly, n)
		for j := range rows[i] {
			rows[i][j] = vs[(j-i+n)%n]
		}
	}
	m, err := NewPolyMatrix(r, rows)
	if err != nil {
		tb.Fatal(err)
	}
	return m
}

// vandermonde returns the n×n Vandermonde matrix (x_i^j).
func vandermonde(tb testing.TB, r *Ring, xs []*Poly) *PolyMatrix {
	rows := make([][]*Poly, len(xs))
	for i, x := range xs {
		for j := range xs {
			rows[i] = append(rows[i], mustPow(tb, x, j))
		}
	}
	m, err := NewPolyMatrix(r, rows)
	if err != nil {
		tb.Fatal(err)
	}
	return m
}

func mustPolyDet(tb testing.TB, m *PolyMatrix) *Poly {
	tb.Helper()
	d, err := m.Det()
	if err != nil {
		tb.Fatal(err)
	}
	return d
}

// heron returns 16·Area² of a triangle with sides a, b, c in its expanded
// form 2a²b² + 2b²c² + 2c²a² − a⁴ − b⁴ − c⁴ (handbook: CRC Standard
// Mathematical Tables, Heron's formula multiplied out).
func heron(tb testing.TB, r *Ring) *Poly {
	return mustParse(tb, r, "2*a^2*b^2 + 2*b^2*c^2 + 2*c^2*a^2 - a^4 - b^4 - c^4")
}

// TestFactorMultivariateClassical factors polynomials whose factorization
// is classical, each against its source.
func TestFactorMultivariateClassical(t *testing.T) {
	r, v := testRing(t, "a", "b", "c", "d", "e", "x", "y")
	cases := []struct {
		name, source string
		p            *Poly
		want         string
	}{
		{"Sophie Germain", "Sophie Germain's identity x⁴ + 4y⁴ = (x² + 2xy + 2y²)(x² − 2xy + 2y²) (from memory; any number-theory text)",
			mustParse(t, r, "x^4 + 4*y^4"), "1: x^2 - 2*x*y + 2*y^2, x^2 + 2*x*y + 2*y^2"},
		{"Heron", "Heron: 16·Area² = (a+b+c)(−a+b+c)(a−b+c)(a+b−c) (handbook)",
			heron(t, r), "-1: a - b - c, a - b + c, a + b - c, a + b + c"},
		{"circulant 3x3", "det circ(a, b, c) = a³ + b³ + c³ − 3abc = (a+b+c)(a²+b²+c²−ab−bc−ca) (from memory; the eigenvalues a + bω + cω²)",
			mustPolyDet(t, circulant(t, r, v[:3])), "1: a + b + c, a^2 - a*b - a*c + b^2 - b*c + c^2"},
		{"circulant 4x4", "det circ(a, b, c, d) = (a+b+c+d)(a−b+c−d)((a−c)² + (b−d)²) (from memory: the eigenvalues a + bζ + cζ² + dζ³ for ζ = ±1, ±i, the last two conjugate)",
			mustPolyDet(t, circulant(t, r, v[:4])), "1: a - b + c - d, a + b + c + d, a^2 - 2*a*c + b^2 - 2*b*d + c^2 + d^2"},
		{"Vandermonde 5x5", "det (x_i^j) = ∏_{i<j} (x_j − x_i) (Vandermonde; any linear algebra text)",
			mustPolyDet(t, vandermonde(t, r, v[:5])), "1: a - b, a - c, a - d, a - e, b - c, b - d, b - e, c - d, c - e, d - e"},
		{"difference of squares, squared", "(x² − y²)² = (x − y)²(x + y)² (from memory)",
			mustParse(t, r, "(x^2 - y^2)^2*3/4"), "3/4: x - y^2, x + y^2"},
	}
	for _, c := range cases {
		f := mustFactor(t, c.p)
		if got := factorStrings(f); got != c.want {
			t.Errorf("%s (%s): got %s, want %s", c.name, c.source, got, c.want)
		}
	}
}

// TestFactorContentStage: the content in the main variable is split off
// and factored on its own. (y² − 1)(x²y + x + y): x has the lower degree,
// the content in x is y² − 1 = (y − 1)(y + 1), and x²y + x + y =
// (x² + 1)y + x, primitive and of degree 1 in y, is irreducible (from
// memory: a primitive polynomial of degree 1 in one of its variables has
// no proper factor).
func TestFactorContentStage(t *testing.T) {
	r, _ := testRing(t, "x", "y", "z")
	F := mustParse(t, r, "(y^2 - 1)*(x^2*y + x + y)")
	if x := mainVariable(F, F.Vars()); x != 0 {
		t.Errorf("main variable %d, want x, of lower degree", x)
	}
	// x²y + y³ + 1: y has the constant leading coefficient 1 (x has y),
	// so y is chosen though its degree is higher.
	if x := mainVariable(mustParse(t, r, "x^2*y + y^3 + 1"), []int{0, 1}); x != 1 {
		t.Errorf("main variable %d, want the one with a constant leading coefficient", x)
	}
	// Degree 2 in each; leading coefficients yz, x, x: y, the first of
	// those with a leading coefficient of lower degree.
	if x := mainVariable(mustParse(t, r, "x^2*y*z + x*y^2 + x*z^2 + 1"), []int{0, 1, 2}); x != 1 {
		t.Errorf("main variable %d, want y", x)
	}
	fs, err := (&factorer{}).primitive(F, true)
	if err != nil {
		t.Fatal(err)
	}
	var ps []*Poly
	for _, f := range fs {
		ps = append(ps, f.Factor)
	}
	got := polyStrings(ps)
	if want := "[x^2*y + x + y y + 1 y - 1]"; got != want {
		t.Errorf("factors %s, want %s", got, want)
	}
}

func polyStrings(ps []*Poly) string {
	var out []string
	for _, p := range ps {
		out = append(out, p.String())
	}
	slices.Sort(out)
	return fmt.Sprint(out)
}

// TestFactorEvaluationPoint: the point keeps the leading coefficient
// nonzero and the image square-free, checked by a second route (the
// discriminant, a resultant, is nonzero exactly for a square-free
// polynomial; from memory, any algebra text), and the origin is refused
// when its image x³ is not square-free. For Sophie Germain's x⁴ + 4y⁴ the
// image at y = a splits as (x² + 2ax + 2a²)(x² − 2ax + 2a²) (the identity
// at y = a).
func TestFactorEvaluationPoint(t *testing.T) {
	r, _ := testRing(t, "x", "y", "z")
	P := mustParse(t, r, "(x - y)*(x - z)*(x + y + z)*(y*x + 1)")
	a, images, _, err := (&factorer{}).choosePoint(P, 0, []int{1, 2}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if a[0] == 0 && a[1] == 0 {
		t.Errorf("the origin was taken though the image x^3 is not square-free")
	}
	vals := map[int]*big.Rat{1: big.NewRat(a[0], 1), 2: big.NewRat(a[1], 1)}
	img := P.Eval(vals)
	if img.DegreeIn(0) != P.DegreeIn(0) {
		t.Errorf("point %v loses degree: %v", a, img)
	}
	disc, err := Discriminant(img, 0)
	if err != nil || disc.IsZero() {
		t.Errorf("point %v: image %v has discriminant %v (%v)", a, img, disc, err)
	}
	if len(images) != 4 {
		t.Errorf("point %v: image factors %v, want 4", a, images)
	}
	prod := mustProduct(t, r, images)
	if !prod.PrimitivePart().Equal(img.PrimitivePart()) {
		t.Errorf("image factors multiply to %v, not %v", prod, img)
	}

	G := mustParse(t, r, "x^4 + 4*y^4")
	a, images, _, err = (&factorer{}).choosePoint(G, 0, []int{1}, nil)
	if err != nil || a[0] == 0 {
		t.Fatalf("point %v, %v", a, err)
	}
	want := fmt.Sprintf("[x^2 + %d*x + %d x^2 - %d*x + %d]", 2*abs64(a[0]), 2*a[0]*a[0], 2*abs64(a[0]), 2*a[0]*a[0])
	if got := polyStrings(images); got != want && got != strings.Replace(want, "1*x", "x", 2) {
		t.Errorf("image factors at y = %d: %s, want %s", a[0], got, want)
	}
}

func abs64(x int64) int64 {
	if x < 0 {
		return -x
	}
	return x
}

func mustProduct(t testing.TB, r *Ring, ps []*Poly) *Poly {
	p, err := mulAll(r, ps)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// knownFactors are three factors in x, y, z whose leading coefficients in
// x are y + 1, z + 2 and 1, for the tests of lifting alone.
func knownFactors(t testing.TB, r *Ring) []*Poly {
	return []*Poly{
		mustParse(t, r, "(y + 1)*x^2 + z - 3"),
		mustParse(t, r, "(z + 2)*x - y^2 + 1"),
		mustParse(t, r, "x^3 + y*z + 2*y + 5"),
	}
}

// TestHenselLiftKnownProduct: the lift alone, from the images at the
// origin of a product of known factors with non-constant leading
// coefficients, gives back exactly those factors (up to the constant the
// primitive part removes); the product is built here, so the factors are
// known without factoring.
func TestHenselLiftKnownProduct(t *testing.T) {
	r, _ := testRing(t, "x", "y", "z")
	known := knownFactors(t, r)
	P := mustProduct(t, r, known)
	f := &factorer{}
	images := make([]*Poly, len(known))
	for i, g := range known {
		images[i] = g.Eval(map[int]*big.Rat{1: new(big.Rat), 2: new(big.Rat)}).PrimitivePart()
	}
	gs, ok, err := f.liftImages(P, 0, []int{1, 2}, images)
	if err != nil || !ok {
		t.Fatalf("lift: %v %v", ok, err)
	}
	for i, g := range gs {
		if !g.Equal(known[i].PrimitivePart()) {
			t.Errorf("lifted factor %d: %v, want %v", i, g, known[i])
		}
	}
}

// TestLeadingCoefficientPredetermined: Wang's predetermination alone, on
// a product of known factors whose leading coefficients in x are y + 1,
// z + 2 and 1: at a point that separates y + 1 and z + 2, the leading
// coefficient of each image's factor is found to be the known one, and
// the lift with them gives the factors back (the product is built here,
// so the factors are known without factoring).
func TestLeadingCoefficientPredetermined(t *testing.T) {
	r, _ := testRing(t, "x", "y", "z")
	known := knownFactors(t, r)
	P := mustProduct(t, r, known)
	f := &factorer{}
	lf, err := f.factorization(P.lcIn(0))
	if err != nil {
		t.Fatal(err)
	}
	ys := []int{1, 2}
	a, images, q, err := f.choosePoint(P, 0, ys, lf)
	if err != nil || q == nil || len(images) != 3 {
		t.Fatalf("point %v, images %v, q %v, %v", a, images, q, err)
	}
	shift, back := map[int]*Poly{}, map[int]*Poly{}
	for i, y := range ys {
		c := r.Const(big.NewRat(a[i], 1))
		shift[y], back[y] = r.varPoly(y).Add(c), r.varPoly(y).Sub(c)
	}
	pre, err := predetermine(P, 0, lf, q, images, shift)
	if err != nil || pre == nil {
		t.Fatalf("no predetermination: %v", err)
	}
	var lcs, want []*Poly
	for i, d := range pre.lc {
		g, err := d.Substitute(back)
		if err != nil {
			t.Fatal(err)
		}
		lcs = append(lcs, g)
		for _, k := range known {
			if k.Eval(map[int]*big.Rat{1: big.NewRat(a[0], 1), 2: big.NewRat(a[1], 1)}).PrimitivePart().Equal(images[i]) {
				want = append(want, k.lcIn(0))
			}
		}
	}
	if polyStrings(lcs) != polyStrings(want) || len(want) != 3 {
		t.Errorf("leading coefficients %s, want %s", polyStrings(lcs), polyStrings(want))
	}
	gs, ok, err := f.liftWith(pre.A, 0, ys, images, pre.lc)
	if err != nil || !ok {
		t.Fatalf("lift: %v %v", ok, err)
	}
	for i, g := range gs {
		if gs[i], err = g.Substitute(back); err != nil {
			t.Fatal(err)
		}
		gs[i] = gs[i].PrimitivePart()
	}
	if polyStrings(gs) != polyStrings(known) {
		t.Errorf("lifted %s, want %s", polyStrings(gs), polyStrings(known))
	}
}

// TestRecombinationExtraneous: x² − y − 1 is irreducible (y + 1 is not a
// square in Q[y]; from memory), but its image at the origin is
// (x − 1)(x + 1). The lift of all three images of (x² − y − 1)(x + y + 2)
// must fail, and the subset search must pair (x − 1)(x + 1) back up.
func TestRecombinationExtraneous(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	P := mustParse(t, r, "(x^2 - y - 1)*(x + y + 2)")
	images := []*Poly{mustParse(t, r, "x - 1"), mustParse(t, r, "x + 1"), mustParse(t, r, "x + 2")}
	f := &factorer{}
	if _, ok, err := f.liftImages(P, 0, []int{1}, images); err != nil || ok {
		t.Errorf("the lift of three images succeeded: %v %v", ok, err)
	}
	gs, err := f.recombine(P, 0, []int{1}, images, maxLiftSubsets, nil)
	if err != nil {
		t.Fatal(err)
	}
	if got, want := polyStrings(gs), "[x + y + 2 x^2 - y - 1]"; got != want {
		t.Errorf("recombined %s, want %s", got, want)
	}
	// Capped at one subset, the search cannot finish: undecided, not a
	// wrong factorization.
	if gs, err := f.recombine(P, 0, []int{1}, images, 1, nil); !errors.Is(err, ErrFactorLimit) {
		t.Errorf("capped recombination: %v, %v", polyStrings(gs), err)
	}
}

// irreducibleSecondRoute proves g irreducible without Hensel lifting or
// recombination: for a variable v in which g is primitive and a random
// point for the others keeping deg_v, an image irreducible over Q (the
// univariate factorization) proves g irreducible (a split of g would give
// one of the image: Algorithms for Computer Algebra, ch. 6; from memory).
// It tries variables in turn and points from its own generator; false
// means no attempt succeeded, not that g is reducible.
func irreducibleSecondRoute(t testing.TB, g *Poly, rng *rand.Rand) bool {
	vs := g.Vars()
	if len(vs) == 1 {
		f := mustFactor(t, g)
		return len(f.Factors) == 1 && f.Factors[0].Mult == 1
	}
	for try := 0; try < 40; try++ {
		v := vs[try%len(vs)]
		c, err := contentIn(g.PrimitivePart(), v)
		if err != nil || !c.isConst() {
			continue
		}
		vals := map[int]*big.Rat{}
		for _, w := range vs {
			if w != v {
				vals[w] = big.NewRat(rng.Int63n(201)-100, 1)
			}
		}
		img := g.Eval(vals)
		if img.DegreeIn(v) != g.DegreeIn(v) {
			continue
		}
		f := mustFactor(t, img)
		if len(f.Factors) == 1 && f.Factors[0].Mult == 1 {
			return true
		}
	}
	return false
}

var factorTrials = flag.Int("factor.trials", 2000, "random products in TestFactorRandomProducts")

// TestFactorRandomProducts: on random products of powers of random
// factors in two, three and four variables, the factors multiply back to the
// input exactly (mustFactor) and each is proved irreducible by the second
// route; the planted factors' count bounds the result's from below.
func TestFactorRandomProducts(t *testing.T) {
	r, _ := testRing(t, "x", "y", "z", "w")
	rng := rand.New(rand.NewSource(1616))
	check := rand.New(rand.NewSource(61))
	trials := *factorTrials
	if testing.Short() {
		trials = min(trials, 200)
	}
	for trial := 0; trial < trials; trial++ {
		nv := 2 + trial%3
		p := r.Const(big.NewRat(rng.Int63n(9)-4|1, 1+rng.Int63n(3)))
		planted := 0
		for k := 1 + rng.Intn(3); k > 0; k-- {
			g := randPoly(rng, r, nv, 2+rng.Intn(3), 2, 0)
			if g.IsZero() || g.isConst() {
				continue
			}
			e := 1 + rng.Intn(2)
			planted += e
			p = mustMulP(t, p, mustPow(t, g, e))
		}
		f := mustFactor(t, p)
		n := 0
		for _, fp := range f.Factors {
			n += fp.Mult
			if !irreducibleSecondRoute(t, fp.Factor, check) {
				t.Fatalf("%v: factor %v not proved irreducible by the second route", p, fp.Factor)
			}
		}
		if n < planted {
			t.Fatalf("%v: %d factors, fewer than the %d planted", p, n, planted)
		}
	}
}

// TestFactorStagesReported: the stages come in order of the method and
// the last report is "" (the factorization returned).
func TestFactorStagesReported(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	var got []string
	if _, err := mustParse(t, r, "x^4 + 4*y^4").FactorStages(func(s string) { got = append(got, s) }); err != nil {
		t.Fatal(err)
	}
	joined := strings.Join(got, "; ")
	for _, w := range []string{"splitting off the content in", "choosing an evaluation point", "factoring a polynomial in x alone", "imposing the leading coefficient on 2 factors", "Hensel lifting in y (degree 1 of 4)"} {
		if !strings.Contains(joined, w) {
			t.Errorf("stages %q lack %q", joined, w)
		}
	}
	if got[len(got)-1] != "" {
		t.Errorf("last stage %q, want the empty string", got[len(got)-1])
	}
}

// TestFactorHomogeneousCyclotomic: xⁿ − yⁿ = ∏_{d|n} y^φ(d)·Φ_d(x/y), the
// homogenized cyclotomic polynomials, each irreducible over Q (Gauss; the
// cyclotomic polynomials, OEIS A013595, built here by their recursive
// definition): one factor per divisor, each becoming Φ_d at y = 1.
func TestFactorHomogeneousCyclotomic(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	phi := cyclotomic(t, r, 30)
	x, y := mustParse(t, r, "x"), mustParse(t, r, "y")
	one := map[int]*big.Rat{1: big.NewRat(1, 1)}
	for n := 1; n <= 30; n++ {
		f := mustFactor(t, mustPow(t, x, n).Sub(mustPow(t, y, n)))
		var want []string
		for d := 1; d <= n; d++ {
			if n%d == 0 {
				want = append(want, phi[d].String())
			}
		}
		var got []string
		for _, g := range f.Factors {
			if h, ok := g.Factor.Homogeneous(); !ok || g.Mult != 1 || h != g.Factor.DegreeIn(0) {
				t.Fatalf("x^%d − y^%d: factor %v^%d not homogeneous of its degree in x", n, n, g.Factor, g.Mult)
			}
			got = append(got, g.Factor.Eval(one).String())
		}
		slices.Sort(want)
		slices.Sort(got)
		if fmt.Sprint(got) != fmt.Sprint(want) {
			t.Fatalf("x^%d − y^%d at y = 1: %v, want %v", n, n, got, want)
		}
	}
}

// TestFactorClassicalIdentities: expanded forms from handbooks and
// classical algebra, factored without being told the factors.
func TestFactorClassicalIdentities(t *testing.T) {
	r, _ := testRing(t, "a", "b", "c", "d")
	for _, c := range []struct{ source, p, want string }{
		// Brahmagupta: 16K² of a cyclic quadrilateral with sides a, b, c,
		// d is (−a+b+c+d)(a−b+c+d)(a+b−c+d)(a+b+c−d), expanded
		// 2Σa²b² − Σa⁴ + 8abcd (from memory; CRC handbook).
		{"Brahmagupta", "2*(a^2*b^2 + a^2*c^2 + a^2*d^2 + b^2*c^2 + b^2*d^2 + c^2*d^2) - a^4 - b^4 - c^4 - d^4 + 8*a*b*c*d",
			"-1: a - b - c - d, a - b + c + d, a + b - c + d, a + b + c - d"},
		// (a + b + c)³ − a³ − b³ − c³ = 3(a + b)(b + c)(c + a) (from
		// memory; a classical olympiad identity).
		// (In the order of cmpFactor a + c comes before a + b: at the
		// monomial b its coefficient 0 is the smaller.)
		{"sum of cubes", "(a + b + c)^3 - a^3 - b^3 - c^3", "3: a + c, a + b, b + c"},
		// a³(b − c) + b³(c − a) + c³(a − b) = −(a − b)(b − c)(c − a)(a + b
		// + c) (from memory; the alternant a³ over the Vandermonde).
		{"alternant", "a^3*(b - c) + b^3*(c - a) + c^3*(a - b)", "1: a - b, a - c, a + b + c, b - c"},
		// a⁴ + b⁴ is irreducible over Q (its roots a = b·ζ₈ need √2 and
		// i; from memory), a⁴ + 4b⁴ is not (Sophie Germain).
		{"a^4 + b^4", "a^4 + b^4", "1: a^4 + b^4"},
	} {
		f := mustFactor(t, mustParse(t, r, c.p))
		if got := factorStrings(f); got != c.want {
			t.Errorf("%s: got %s, want %s", c.source, got, c.want)
		}
	}
}

// TestFactorMonomialsAndPowers: monomials and powers in several
// variables, with rational units (unique factorization; from memory).
func TestFactorMonomialsAndPowers(t *testing.T) {
	r, _ := testRing(t, "x", "y", "z")
	for _, c := range []struct{ p, want string }{
		{"-2/3*x^2*y^3", "-2/3: x^2, y^3"},
		{"x*y*z", "1: x, y, z"},
		{"(x*y - z)^3*(x + 1)^2*z", "1: x + 1^2, z, x*y - z^3"},
		{"(x^2 + y^2 + z^2)^2 - (x^2 + y^2 + z^2)", "1: x^2 + y^2 + z^2 - 1, x^2 + y^2 + z^2"},
		{"5", "5: "},
	} {
		if got := factorStrings(mustFactor(t, mustParse(t, r, c.p))); got != c.want {
			t.Errorf("%s: got %s, want %s", c.p, got, c.want)
		}
	}
}

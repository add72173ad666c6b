package exact

import (
	"errors"
	"fmt"
	"math/big"
	"math/rand"
	"testing"
)

// checkGCD verifies g = gcd(p, q) from its definition: g is monic, divides
// both, and the cofactors are coprime (their gcd is 1).
func checkGCD(t *testing.T, p, q, g *Poly) {
	t.Helper()
	if g.IsZero() {
		if !p.IsZero() || !q.IsZero() {
			t.Fatalf("gcd(%v, %v) = 0", p, q)
		}
		return
	}
	if lc := g.LeadingCoefficient(); lc.Cmp(big.NewRat(1, 1)) != 0 {
		t.Fatalf("gcd %v is not monic", g)
	}
	pg, ok1, _ := p.DivExact(g)
	qg, ok2, _ := q.DivExact(g)
	if !ok1 || !ok2 {
		t.Fatalf("gcd %v does not divide %v and %v", g, p, q)
	}
	if c, err := GCD(pg, qg); err != nil || !c.isOne() {
		t.Fatalf("cofactors %v and %v have gcd %v (%v)", pg, qg, c, err)
	}
}

func mustGCD(t *testing.T, p, q *Poly) *Poly {
	t.Helper()
	g, err := GCD(p, q)
	if err != nil {
		t.Fatal(err)
	}
	checkCanonical(t, g)
	return g
}

func TestGCDCases(t *testing.T) {
	for _, prs := range []bool{false, true} {
		gcdPRSOnly = prs
		testGCDCases(t)
	}
	gcdPRSOnly = false
}

func testGCDCases(t *testing.T) {
	r, _ := testRing(t, "x", "y", "z", "w")
	P := func(s string) *Poly { return mustParse(t, r, s) }
	for _, c := range []struct{ p, q, want string }{
		{"(x+y)^2*(x-1)", "(x+y)*(x+2)", "x + y"},
		{"x^2 - 1", "x^3 - 1", "x - 1"},
		{"6*x^2*y", "4*x*y^3", "x*y"},
		{"2*x + 2", "0", "x + 1"},
		{"0", "-3/4*x^2 + 3/2", "x^2 - 2"},
		{"0", "0", "0"},
		{"3", "x", "1"},
		{"3", "5/7", "1"},
		{"x^2 + y^2", "x + y", "1"},
		{"x*y + 1", "x*y - 1", "1"},
		{"2*x + 3*y", "4*x + 6*y", "x + 3/2*y"},
		// Content in several variables.
		{"(y^2+z)*(x^2 + x*y + 1)*(z*w + 1)", "(y^2+z)*(x - y)*(z*w + 1)*w", "y^2*z*w + z^2*w + y^2 + z"},
		{"(x*y+z)^2*(z^2+x)", "(x*y+z)*(x*z+1)*(y+1)", "x*y + z"},
		// Variables in only one operand.
		{"(x + y)*(z + 1)", "(z + 1)*w", "z + 1"},
		{"x^3*y^2*(z+1)", "x*y^5*(z+1)^2", "x*y^2*z + x*y^2"},
		{"(x^2 + 1)^3*(y - 1)", "(x^2 + 1)^2*(y + 1)", "x^4 + 2*x^2 + 1"},
	} {
		p, q := P(c.p), P(c.q)
		g := mustGCD(t, p, q)
		if g.String() != c.want {
			t.Errorf("gcd(%s, %s) = %v, want %s", c.p, c.q, g, c.want)
		}
		checkGCD(t, p, q, g)
		if g2 := mustGCD(t, q, p); !g2.Equal(g) {
			t.Errorf("gcd is not symmetric: %v, %v", g, g2)
		}
	}
}

// TestGCDPlanted builds p = a*g, q = b*g from random a, b, g and checks
// that gcd(p, q) is g normalised (when gcd(a, b) = 1, checked
// independently by a second gcd) and always satisfies the definition.
func TestGCDPlanted(t *testing.T) {
	rng := rand.New(rand.NewSource(8))
	r, _ := testRing(t, "x", "y", "z")
	for trial := 0; trial < 80; trial++ {
		nv := 1 + rng.Intn(3)
		g := randPoly(rng, r, nv, 1+rng.Intn(4), 2, []int{0, 3}[rng.Intn(2)])
		a := randPoly(rng, r, nv, 1+rng.Intn(4), 2, 0)
		b := randPoly(rng, r, 1+rng.Intn(3), 1+rng.Intn(4), 2, 0)
		if g.IsZero() || a.IsZero() || b.IsZero() {
			continue
		}
		p, q := mustMulP(t, a, g), mustMulP(t, b, g)
		got := mustGCD(t, p, q)
		checkGCD(t, p, q, got)
		ab := mustGCD(t, a, b)
		want, err := mustMulP(t, ab, g).Scale(big.NewRat(1, 1)), error(nil)
		if err != nil {
			t.Fatal(err)
		}
		if want = want.monic(); !got.Equal(want) {
			t.Fatalf("gcd(%v, %v) = %v, want %v", p, q, got, want)
		}
		// gcd(p, 0) is p normalised.
		if z := mustGCD(t, p, r.zero()); !z.Equal(p.monic()) {
			t.Fatalf("gcd(p, 0) = %v", z)
		}
	}
}

// TestGCDMethodsAgree compares the heuristic gcd with the primitive
// remainder sequence (two independent methods) on random planted
// problems small enough for the latter, and checks larger heuristic
// results from the definition.
func TestGCDMethodsAgree(t *testing.T) {
	rng := rand.New(rand.NewSource(12))
	r, _ := testRing(t, "x", "y", "z", "w")
	for trial := 0; trial < 60; trial++ {
		nv := 1 + rng.Intn(3)
		small := trial%2 == 0
		terms, deg := 6, 3
		if !small {
			terms, deg, nv = 25, 4, 4
		}
		g := randPoly(rng, r, nv, 1+rng.Intn(terms), deg, 0)
		a := randPoly(rng, r, nv, 1+rng.Intn(terms), deg, 0)
		b := randPoly(rng, r, nv, 1+rng.Intn(terms), deg, 0)
		if g.IsZero() || a.IsZero() || b.IsZero() {
			continue
		}
		p, q := mustMulP(t, a, g), mustMulP(t, b, g)
		heu := mustGCD(t, p, q)
		checkGCD(t, p, q, heu)
		if small && nv <= 2 {
			gcdPRSOnly = true
			prs := mustGCD(t, p, q)
			gcdPRSOnly = false
			if !prs.Equal(heu) {
				t.Fatalf("gcd(%v, %v): heuristic %v, PRS %v", p, q, heu, prs)
			}
		}
	}
}

// TestGCDCoprime: distinct monic irreducible linear factors give gcd 1.
func TestGCDCoprime(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	P := func(s string) *Poly { return mustParse(t, r, s) }
	p := P("(x - 1)*(x - 2)*(x + y)*(x*y + 3)")
	q := P("(x - 3)*(x + 2*y)*(y^2 + 1)*(x*y - 3)")
	if g := mustGCD(t, p, q); !g.isOne() {
		t.Errorf("gcd = %v", g)
	}
}

// sylvesterDet computes Res_v(p, q) as the determinant of the Sylvester
// matrix by Laplace expansion (memoised over column sets), independently
// of the subresultant code.
func sylvesterDet(t *testing.T, p, q *Poly, v int) *Poly {
	r := p.ring
	m, n := p.DegreeIn(v), q.DegreeIn(v)
	N := m + n
	if N == 0 {
		return r.one()
	}
	pc, qc := p.Collect(v), q.Collect(v)
	coef := func(cs []*Poly, k int) *Poly {
		if k < 0 || k >= len(cs) || cs[k] == nil {
			return r.zero()
		}
		return cs[k]
	}
	M := make([][]*Poly, N)
	for i := 0; i < n; i++ { // n rows of p's coefficients
		M[i] = make([]*Poly, N)
		for j := 0; j < N; j++ {
			M[i][j] = coef(pc, m-(j-i))
		}
	}
	for i := 0; i < m; i++ { // m rows of q's coefficients
		M[n+i] = make([]*Poly, N)
		for j := 0; j < N; j++ {
			M[n+i][j] = coef(qc, n-(j-i))
		}
	}
	memo := map[int]*Poly{}
	var det func(row, used int) *Poly
	det = func(row, used int) *Poly {
		if row == N {
			return r.one()
		}
		if d, ok := memo[used]; ok {
			return d
		}
		sum := r.zero()
		pos := 0
		for j := 0; j < N; j++ {
			if used&(1<<j) != 0 {
				continue
			}
			if !M[row][j].IsZero() {
				term := mustMulP(t, M[row][j], det(row+1, used|1<<j))
				if pos%2 == 1 {
					term = term.Neg()
				}
				sum = sum.Add(term)
			}
			pos++
		}
		memo[used] = sum
		return sum
	}
	return det(0, 0)
}

// TestResultantQuadratics: for a2x^2+a1x+a0 and b2x^2+b1x+b0 the resultant
// is (a2b0 - a0b2)^2 - (a2b1 - a1b2)(a1b0 - a0b1) (standard closed form;
// Gelfand, Kapranov and Zelevinsky, ch. 12).
func TestResultantQuadratics(t *testing.T) {
	r, _ := testRing(t, "x", "a2", "a1", "a0", "b2", "b1", "b0")
	P := func(s string) *Poly { return mustParse(t, r, s) }
	p, q := P("a2*x^2 + a1*x + a0"), P("b2*x^2 + b1*x + b0")
	want := P("(a2*b0 - a0*b2)^2 - (a2*b1 - a1*b2)*(a1*b0 - a0*b1)")
	got, err := Resultant(p, q, 0)
	if err != nil || !got.Equal(want) {
		t.Fatalf("Res = %v, %v; want %v", got, err, want)
	}
	if syl := sylvesterDet(t, p, q, 0); !syl.Equal(want) {
		t.Fatalf("Sylvester determinant %v", syl)
	}
}

func TestDiscriminants(t *testing.T) {
	r, _ := testRing(t, "x", "a", "b", "c", "d", "e")
	P := func(s string) *Poly { return mustParse(t, r, s) }
	for _, c := range []struct{ p, want, src string }{
		{"a*x^2 + b*x + c", "b^2 - 4*a*c", "quadratic formula"},
		{"a*x^3 + b*x^2 + c*x + d", "b^2*c^2 - 4*a*c^3 - 4*b^3*d - 27*a^2*d^2 + 18*a*b*c*d", "standard closed form"},
		{"x^3 + c*x + d", "-4*c^3 - 27*d^2", "depressed cubic, standard"},
		{"x^4 + c*x + d", "-27*c^4 + 256*d^3", "x^4 + px + q: -27p^4 + 256q^3, standard (from memory)"},
		{"b*x + c", "1", "convention for degree 1"},
		{"(x - a)^2*(x - b)", "0", "repeated root"},
		{"(x - a)*(x - b)*(x - c)", "(a-b)^2*(a-c)^2*(b-c)^2", "product of squared root differences"},
		{"2*(x - a)*(x - b)", "4*(a-b)^2", "a_n^(2n-2) prod (r_i - r_j)^2"},
		{"1/2*x^2 - 3/4*x + 1/8", "5/16", "b^2 - 4ac with fractions"},
	} {
		got, err := Discriminant(P(c.p), 0)
		if err != nil {
			t.Fatal(err)
		}
		if want := P(c.want); !got.Equal(want) {
			t.Errorf("disc(%s) = %v, want %v (%s)", c.p, got, want, c.src)
		}
	}
	for _, s := range []string{"a + b", "0", "7"} {
		if _, err := Discriminant(P(s), 0); !errors.Is(err, ErrDegree) {
			t.Errorf("disc(%s): %v", s, err)
		}
	}
}

// TestResultantSylvester compares the subresultant algorithm with the
// Sylvester determinant on random polynomials, and checks the
// conventions and Res(q, p) = (-1)^(mn) Res(p, q).
func TestResultantSylvester(t *testing.T) {
	rng := rand.New(rand.NewSource(9))
	r, _ := testRing(t, "x", "y", "z")
	for trial := 0; trial < 80; trial++ {
		p := randPoly(rng, r, 1+rng.Intn(3), 1+rng.Intn(5), 3, []int{0, 3}[rng.Intn(2)])
		q := randPoly(rng, r, 1+rng.Intn(3), 1+rng.Intn(5), 3, []int{0, 3}[rng.Intn(2)])
		if trial%5 == 0 {
			f := randPoly(rng, r, 2, 2, 2, 0)
			p, q = mustMulP(t, p, f), mustMulP(t, q, f)
		}
		v := rng.Intn(2)
		got, err := Resultant(p, q, v)
		if err != nil {
			t.Fatal(err)
		}
		checkCanonical(t, got)
		want := r.zero()
		if !p.IsZero() && !q.IsZero() {
			want = sylvesterDet(t, p, q, v)
		}
		if !got.Equal(want) {
			t.Fatalf("Res_%d(%v, %v) = %v, Sylvester %v", v, p, q, got, want)
		}
		back, _ := Resultant(q, p, v)
		if m, n := p.DegreeIn(v), q.DegreeIn(v); m*n%2 == 1 {
			back = back.Neg()
		}
		if !back.Equal(got) {
			t.Fatalf("Res(q, p) = %v, Res(p, q) = %v", back, got)
		}
	}
	P := func(s string) *Poly { return mustParse(t, r, s) }
	for _, c := range []struct{ p, q, want string }{
		{"3", "x^2 + 1", "9"},
		{"x^2 + 1", "y", "y^2"},
		{"3", "5", "1"},
		{"0", "x", "0"},
		{"x - y", "x - z", "y - z"}, // det [[1, -y], [1, -z]]
		{"x^2 - 1", "x - 1", "0"},
		{"x^3 + 2", "x^2 + 3", "31"},
	} {
		got, err := Resultant(P(c.p), P(c.q), 0)
		if err != nil || got.String() != c.want {
			t.Errorf("Res(%s, %s) = %v, %v; want %s", c.p, c.q, got, err, c.want)
		}
	}
}

// TestGCDResultantAgree: Res(p, q) = 0 exactly when p and q have a common
// factor of positive degree in the variable (univariate over Q).
func TestGCDResultantAgree(t *testing.T) {
	rng := rand.New(rand.NewSource(10))
	r, _ := testRing(t, "x")
	for trial := 0; trial < 100; trial++ {
		p := randPoly(rng, r, 1, 1+rng.Intn(4), 4, 0)
		q := randPoly(rng, r, 1, 1+rng.Intn(4), 4, 0)
		if p.Degree() < 1 || q.Degree() < 1 {
			continue
		}
		g := mustGCD(t, p, q)
		res, _ := Resultant(p, q, 0)
		if (g.Degree() > 0) != res.IsZero() {
			t.Fatalf("gcd(%v, %v) = %v but Res = %v", p, q, g, res)
		}
	}
	_ = fmt.Sprint
}

package exact

import (
	"errors"
	"fmt"
	"math/big"
	"math/rand"
	"testing"
)

// rf parses num/den in r into a rational function, or fails the test.
func rf(t testing.TB, r *Ring, num, den string) *RatFunc {
	t.Helper()
	f, err := NewRatFunc(mustParse(t, r, num), mustParse(t, r, den))
	if err != nil {
		t.Fatalf("%s / %s: %v", num, den, err)
	}
	return f
}

// mustRF returns a function that unwraps a rational function result or
// fails the test.
func mustRF(t testing.TB) func(*RatFunc, error) *RatFunc {
	return func(f *RatFunc, err error) *RatFunc {
		t.Helper()
		if err != nil {
			t.Fatal(err)
		}
		return f
	}
}

func TestRatFuncNormalForm(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	cases := []struct{ num, den, want string }{
		{"x^2 - 1", "x - 1", "x + 1"},                         // a polynomial when q divides p
		{"2*x + 2", "4*x - 4", "(1/2*x + 1/2)/(x - 1)"},       // content moved to the numerator
		{"x", "-x - y", "(-x)/(x + y)"},                       // denominator with positive leading coefficient
		{"x^2 - y^2", "x^2 + 2*x*y + y^2", "(x - y)/(x + y)"}, // common factor x + y removed
		{"3", "6*x", "(1/2)/x"},
		{"0", "x + 1", "0"},
	}
	for _, c := range cases {
		f := rf(t, r, c.num, c.den)
		if got := f.String(); got != c.want {
			t.Errorf("(%s)/(%s) = %s, want %s", c.num, c.den, got, c.want)
		}
		if c.den != "x - 1" && f.IsPoly() != (c.want == "0") {
			t.Errorf("(%s)/(%s): IsPoly = %v", c.num, c.den, f.IsPoly())
		}
	}
	if _, err := NewRatFunc(mustParse(t, r, "x"), r.zero()); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("x/0: err = %v, want ErrDivisionByZero", err)
	}
}

// The rational parametrisation of the unit circle (standard, from memory):
// ((1 − t²)/(1 + t²))² + (2t/(1 + t²))² = 1.
func TestRatFuncCircle(t *testing.T) {
	ok := mustRF(t)
	r, _ := testRing(t, "t")
	x := rf(t, r, "1 - t^2", "1 + t^2")
	y := rf(t, r, "2*t", "1 + t^2")
	s := ok(ok(x.Pow(2)).Add(ok(y.Pow(2))))
	if !s.Equal(RatFuncOf(r.one())) {
		t.Fatalf("x^2 + y^2 = %s, want 1", s)
	}
	// At t = 1/2: (3/5, 4/5), the 3-4-5 triangle.
	at := ok(x.Eval(map[int]*big.Rat{0: big.NewRat(1, 2)}))
	if c, _ := at.Num().Constant(); c.Cmp(big.NewRat(3, 5)) != 0 || !at.IsPoly() {
		t.Errorf("x(1/2) = %s, want 3/5", at)
	}
}

// Partial fractions (textbook): 1/(x(x+1)) = 1/x − 1/(x+1) and
// 1/(x² − 1) = (1/2)(1/(x − 1) − 1/(x + 1)); and Henrici's sum against
// the plain one, (a·d + c·b)/(b·d) reduced by one gcd, on random operands.
func TestRatFuncPartialFractions(t *testing.T) {
	ok := mustRF(t)
	r, _ := testRing(t, "x", "y", "z")
	lhs := rf(t, r, "1", "x*(x + 1)")
	rhs := ok(rf(t, r, "1", "x").Sub(rf(t, r, "1", "x + 1")))
	if !lhs.Equal(rhs) {
		t.Errorf("1/x − 1/(x+1) = %s, want %s", rhs, lhs)
	}
	half := RatFuncOf(r.Const(big.NewRat(1, 2)))
	rhs = ok(half.Mul(ok(rf(t, r, "1", "x - 1").Sub(rf(t, r, "1", "x + 1")))))
	if want := rf(t, r, "1", "x^2 - 1"); !rhs.Equal(want) {
		t.Errorf("(1/2)(1/(x−1) − 1/(x+1)) = %s, want %s", rhs, want)
	}
	rng := rand.New(rand.NewSource(16))
	common := randPoly(rng, r, 3, 3, 1, 0)
	for k := 0; k < 60; k++ {
		d1, d2 := randPoly(rng, r, 3, 3, 2, 0), randPoly(rng, r, 3, 3, 2, 3)
		if k%2 == 0 { // shared factors: the case Henrici's gcd of t with g handles
			d1, d2 = mustMulP(t, d1, common), mustMulP(t, d2, common)
		}
		if d1.IsZero() || d2.IsZero() {
			continue
		}
		f := ok(NewRatFunc(randPoly(rng, r, 3, 4, 2, 3), d1))
		g := ok(NewRatFunc(randPoly(rng, r, 3, 4, 2, 0), d2))
		got := ok(f.Add(g))
		plain := ok(NewRatFunc(mustMulP(t, f.num, g.den).Add(mustMulP(t, g.num, f.den)), mustMulP(t, f.den, g.den)))
		if !got.Equal(plain) {
			t.Fatalf("case %d: Henrici sum %s, plain sum %s", k, got, plain)
		}
		prod := ok(f.Mul(g))
		plain = ok(NewRatFunc(mustMulP(t, f.num, g.num), mustMulP(t, f.den, g.den)))
		if !prod.Equal(plain) {
			t.Fatalf("case %d: Henrici product %s, plain product %s", k, prod, plain)
		}
		if back := ok(got.Sub(g)); !back.Equal(f) {
			t.Fatalf("case %d: (f + g) − g = %s, want %s", k, back, f)
		}
		if !g.IsZero() {
			if back := ok(prod.Quo(g)); !back.Equal(f) {
				t.Fatalf("case %d: (f·g)/g = %s, want %s", k, back, f)
			}
		}
	}
}

// Quotient rule worked by hand (textbook examples):
// d/dx x/(x² + 1) = (1 − x²)/(x² + 1)², d/dx (x + 1)/(x − 1) = −2/(x − 1)²,
// and ∂/∂y of x/(x + y) = −x/(x + y)².
func TestRatFuncDerivative(t *testing.T) {
	ok := mustRF(t)
	r, _ := testRing(t, "x", "y")
	cases := []struct {
		f        *RatFunc
		v        int
		num, den string
	}{
		{rf(t, r, "x", "x^2 + 1"), 0, "1 - x^2", "(x^2 + 1)^2"},
		{rf(t, r, "x + 1", "x - 1"), 0, "-2", "(x - 1)^2"},
		{rf(t, r, "x", "x + y"), 1, "-x", "(x + y)^2"},
		{rf(t, r, "x", "x + y"), 0, "y", "(x + y)^2"},
	}
	for _, c := range cases {
		got := ok(c.f.Derivative(c.v))
		if want := rf(t, r, c.num, c.den); !got.Equal(want) {
			t.Errorf("d(%s)/d%s = %s, want %s", c.f, r.Names()[c.v], got, want)
		}
	}
}

// Möbius maps compose as their matrices multiply (textbook): with
// f(z) = (2z + 1)/(z + 3) and g(z) = (z − 1)/(4z + 2), f∘g has the matrix
// [[2, 1], [1, 3]]·[[1, −1], [4, 2]] = [[6, 0], [13, 5]], so f(g(z)) = 6z/(13z + 5).
func TestRatFuncSubstitute(t *testing.T) {
	ok := mustRF(t)
	r, _ := testRing(t, "z", "a", "b")
	f := rf(t, r, "2*z + 1", "z + 3")
	g := rf(t, r, "z - 1", "4*z + 2")
	got := ok(f.Substitute(map[int]*RatFunc{0: g}))
	if want := rf(t, r, "6*z", "13*z + 5"); !got.Equal(want) {
		t.Errorf("f(g(z)) = %s, want %s", got, want)
	}
	// All at once: swapping a and b in a/(a + b^2) with polynomial replacements.
	h := rf(t, r, "a", "a + b^2")
	swapped := ok(h.Substitute(map[int]*RatFunc{1: RatFuncOf(mustParse(t, r, "b")), 2: RatFuncOf(mustParse(t, r, "a"))}))
	if want := rf(t, r, "b", "b + a^2"); !swapped.Equal(want) {
		t.Errorf("swap = %s, want %s", swapped, want)
	}
	// Mixed: a = 1/z, b = z in a/(a + b^2) gives (1/z)/(1/z + z^2) = 1/(1 + z^3).
	mixed := ok(h.Substitute(map[int]*RatFunc{1: rf(t, r, "1", "z"), 2: RatFuncOf(mustParse(t, r, "z"))}))
	if want := rf(t, r, "1", "1 + z^3"); !mixed.Equal(want) {
		t.Errorf("mixed = %s, want %s", mixed, want)
	}
	// The denominator becomes 0: 1/(a − b) with a = b = 1/z.
	_, err := rf(t, r, "1", "a - b").Substitute(map[int]*RatFunc{1: rf(t, r, "1", "z"), 2: rf(t, r, "1", "z")})
	if !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("1/(a − b) at a = b: err = %v, want ErrDivisionByZero", err)
	}
}

func TestRatFuncEvalPole(t *testing.T) {
	ok := mustRF(t)
	r, _ := testRing(t, "x", "y")
	f := rf(t, r, "x", "x - y")
	if _, err := f.Eval(map[int]*big.Rat{0: big.NewRat(2, 1), 1: big.NewRat(2, 1)}); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("x/(x − y) at (2, 2): err = %v, want ErrDivisionByZero", err)
	}
	g := ok(f.Eval(map[int]*big.Rat{1: big.NewRat(0, 1)}))
	if !g.Equal(RatFuncOf(r.one())) {
		t.Errorf("x/(x − y) at y = 0: %s, want 1", g)
	}
	if _, err := f.Pow(-1); err != nil {
		t.Error(err)
	}
	if _, err := RatFuncOf(r.zero()).Pow(-2); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("0^-2: err = %v", err)
	}
}

// rfMatrix builds a matrix of rational functions from "num/den" texts.
func rfMatrix(t testing.TB, r *Ring, rows [][]string) *RatFuncMatrix {
	t.Helper()
	out := make([][]*RatFunc, len(rows))
	for i, row := range rows {
		for _, s := range row {
			num, den := s, "1"
			for k := len(s) - 1; k >= 0; k-- {
				if s[k] == '|' {
					num, den = s[:k], s[k+1:]
				}
			}
			out[i] = append(out[i], rf(t, r, num, den))
		}
	}
	m, err := NewRatFuncMatrix(r, out)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// The Cauchy determinant (classical, from memory):
// det[1/(x_i + y_j)] = ∏_{i<j} (x_j − x_i)(y_j − y_i) / ∏_{i,j} (x_i + y_j).
func TestRatFuncMatrixCauchy(t *testing.T) {
	for _, n := range []int{2, 3, 4} {
		r, m := cauchyMatrix(t, n)
		got, err := m.Det()
		if err != nil {
			t.Fatal(err)
		}
		num, den := r.one(), r.one()
		for i := 0; i < n; i++ {
			for j := 0; j < n; j++ {
				den = mustMulP(t, den, mustParse(t, r, fmt.Sprintf("x%d + y%d", i, j)))
				if i < j {
					num = mustMulP(t, num, mustParse(t, r, fmt.Sprintf("(x%d - x%d)*(y%d - y%d)", j, i, j, i)))
				}
			}
		}
		// Compared by cross-multiplication, a route of its own.
		if d := mustMulP(t, got.Num(), den).Sub(mustMulP(t, num, got.Den())); !d.IsZero() {
			t.Errorf("n = %d: det = %s", n, got)
		}
	}
}

func cauchyMatrix(t testing.TB, n int) (*Ring, *RatFuncMatrix) {
	r := NewRing()
	for i := 0; i < n; i++ {
		r.Var(fmt.Sprintf("x%d", i))
	}
	for i := 0; i < n; i++ {
		r.Var(fmt.Sprintf("y%d", i))
	}
	rows := make([][]string, n)
	for i := range rows {
		for j := 0; j < n; j++ {
			rows[i] = append(rows[i], fmt.Sprintf("1|x%d + y%d", i, j))
		}
	}
	return r, rfMatrix(t, r, rows)
}

// The inverse of [[a, b], [c, d]] is [[d, −b], [−c, a]]/(ad − bc) (the
// adjugate formula, textbook); for a 3x3 matrix of polynomials and
// rational functions the inverse is checked against the cofactors
// (adj M)_ij = (−1)^(i+j) det M_ji, and M·M^-1 = I; solve against
// Cramer's rule, x_i = det M_i / det M with column i replaced by b.
func TestRatFuncMatrixInverseSolve(t *testing.T) {
	ok := mustRF(t)
	r, _ := testRing(t, "a", "b", "c", "d", "t")
	m := rfMatrix(t, r, [][]string{{"a", "b"}, {"c", "d"}})
	inv, err := m.Inverse()
	if err != nil {
		t.Fatal(err)
	}
	want := rfMatrix(t, r, [][]string{{"d|a*d - b*c", "-b|a*d - b*c"}, {"-c|a*d - b*c", "a|a*d - b*c"}})
	if !inv.Equal(want) {
		t.Errorf("inverse =\n%s\nwant\n%s", inv, want)
	}
	m3 := rfMatrix(t, r, [][]string{
		{"t", "1|t + 1", "a"},
		{"b", "t^2 - 1", "1|a - t"},
		{"1", "c|t", "d + t"},
	})
	inv3, err := m3.Inverse()
	if err != nil {
		t.Fatal(err)
	}
	det := ok(m3.Det())
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			minor := ok(m3.Minor(skip(j), skip(i)))
			if (i+j)%2 == 1 {
				minor = minor.Neg()
			}
			if cof := ok(minor.Quo(det)); !cof.Equal(inv3.At(i, j)) {
				t.Errorf("inverse[%d, %d] = %s, cofactor formula gives %s", i, j, inv3.At(i, j), cof)
			}
		}
	}
	prod, err := m3.Mul(inv3)
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			want := RatFuncOf(r.zero())
			if i == j {
				want = RatFuncOf(r.one())
			}
			if !prod.At(i, j).Equal(want) {
				t.Errorf("(M·M^-1)[%d, %d] = %s", i, j, prod.At(i, j))
			}
		}
	}
	rhs := rfMatrix(t, r, [][]string{{"1"}, {"t|a"}, {"b + c"}})
	x, err := m3.Solve(rhs)
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < 3; i++ {
		rows := make([][]*RatFunc, 3)
		for k := range rows {
			for j := 0; j < 3; j++ {
				e := m3.At(k, j)
				if j == i {
					e = rhs.At(k, 0)
				}
				rows[k] = append(rows[k], e)
			}
		}
		mi, _ := NewRatFuncMatrix(r, rows)
		if cramer := ok(ok(mi.Det()).Quo(det)); !cramer.Equal(x.At(i, 0)) {
			t.Errorf("x[%d] = %s, Cramer's rule gives %s", i, x.At(i, 0), cramer)
		}
	}
	sing := rfMatrix(t, r, [][]string{{"1|t", "1"}, {"1", "t"}})
	if _, err := sing.Inverse(); !errors.Is(err, ErrSingular) {
		t.Errorf("singular inverse: err = %v", err)
	}
}

func skip(k int) []int {
	var out []int
	for i := 0; i < 3; i++ {
		if i != k {
			out = append(out, i)
		}
	}
	return out
}

// EvalReal at t = √2: the circle's point (−1/3, 2√2/3), x² + y² = 1.
func TestRatFuncEvalReal(t *testing.T) {
	r, _ := testRing(t, "t")
	x := rf(t, r, "1 - t^2", "1 + t^2")
	num, den, err := x.EvalReal(map[int]*Real{0: RealSqrt(RealFromInt(2))})
	if err != nil {
		t.Fatal(err)
	}
	v := RealSub(RealQuo(num, den), RealFromRat(big.NewRat(-1, 3)))
	if s, err := v.Sign(2000); err != nil || s != 0 {
		t.Errorf("x(√2) + 1/3: sign %d, err %v; want proved 0", s, err)
	}
	if _, _, err := rf(t, r, "1", "t").EvalReal(map[int]*Real{}); !errors.Is(err, ErrShape) {
		t.Errorf("no value: err = %v", err)
	}
}

// Solve on random matrices of rational functions in two variables: the
// solution satisfies M·X = B exactly (the definition), and det(M) agrees
// with the product of the row-cleared polynomial determinant and the
// row factors taken out, det(diag(1/d_i)·P) = det(P)/∏ d_i.
func TestRatFuncMatrixRandomSolve(t *testing.T) {
	ok := mustRF(t)
	r, _ := testRing(t, "x", "y")
	rng := rand.New(rand.NewSource(7))
	for trial := 0; trial < 12; trial++ {
		n := 2 + trial%3
		rows := make([][]*RatFunc, n)
		prows := make([][]*Poly, n)
		var ds []*Poly
		for i := range rows {
			d := randPoly(rng, r, 2, 2, 1, 0).Add(r.one())
			if d.IsZero() {
				d = r.one()
			}
			ds = append(ds, d)
			for j := 0; j < n; j++ {
				p := randPoly(rng, r, 2, 3, 2, 3)
				prows[i] = append(prows[i], p)
				rows[i] = append(rows[i], ok(NewRatFunc(p, d)))
			}
		}
		m, err := NewRatFuncMatrix(r, rows)
		if err != nil {
			t.Fatal(err)
		}
		pm, _ := NewPolyMatrix(r, prows)
		pd, err := pm.Det()
		if err != nil {
			t.Fatal(err)
		}
		prod, err := mulAll(ds[0].ring, ds)
		if err != nil {
			t.Fatal(err)
		}
		want := ok(NewRatFunc(pd, prod))
		if got := ok(m.Det()); !got.Equal(want) {
			t.Fatalf("trial %d: det = %s, want %s", trial, got, want)
		}
		if pd.IsZero() {
			continue
		}
		b := make([][]*RatFunc, n)
		for i := range b {
			b[i] = []*RatFunc{ok(NewRatFunc(randPoly(rng, r, 2, 2, 2, 0), ds[(i+1)%n])), RatFuncOf(randPoly(rng, r, 2, 2, 1, 3))}
		}
		bm, _ := NewRatFuncMatrix(r, b)
		x, err := m.Solve(bm)
		if err != nil {
			t.Fatal(err)
		}
		if back, err := m.Mul(x); err != nil || !back.Equal(bm) {
			t.Fatalf("trial %d: M·X =\n%s\nwant\n%s (%v)", trial, back, bm, err)
		}
	}
}

package exact

import (
	"errors"
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

func TestRingVariables(t *testing.T) {
	r := NewRing()
	for _, bad := range []string{"", "1a", "a b", "a-b", "é", "a.b"} {
		if _, err := r.Var(bad); !errors.Is(err, ErrSyntax) {
			t.Errorf("Var(%q): got %v, want ErrSyntax", bad, err)
		}
	}
	x, err := r.Var("x")
	if err != nil {
		t.Fatal(err)
	}
	x2, _ := r.Var("x")
	if !x.Equal(x2) || len(r.Names()) != 1 {
		t.Errorf("Var twice: %v %v %v", x, x2, r.Names())
	}
	// A polynomial made before later variables combines with them.
	p := x.Add(r.Const(big.NewRat(1, 2)))
	names := []string{"y", "z", "w", "u", "v", "_t0"}
	for _, n := range names {
		if _, err := r.Var(n); err != nil {
			t.Fatal(err)
		}
	}
	if i, ok := r.Index("_t0"); !ok || i != 6 {
		t.Errorf("Index(_t0) = %d, %v", i, ok)
	}
	if _, ok := r.Index("nope"); ok {
		t.Error("Index of a missing name")
	}
	u := mustParse(t, r, "_t0^2*u - x")
	s := p.Add(u)
	if got := s.String(); got != "u*_t0^2 + 1/2" {
		t.Errorf("sum = %q", got)
	}
	if got := strings.Join(r.Names(), ","); got != "x,y,z,w,u,v,_t0" {
		t.Errorf("Names = %s", got)
	}
	ts := p.Terms()
	if len(ts) != 2 || len(ts[0].Exps) != 7 || ts[0].Exps[0] != 1 || ts[1].Coef.Cmp(big.NewRat(1, 2)) != 0 {
		t.Errorf("Terms = %+v", ts)
	}
	// Equal ignores the width of the representation.
	wide := mustParse(t, r, "x + _t0 - _t0 + 1/2")
	if !wide.Equal(p) || !p.Equal(wide) {
		t.Errorf("%v and %v should be equal", wide, p)
	}
	// Different rings.
	r2 := NewRing()
	x3, _ := r2.Var("x")
	if x3.Equal(x) {
		t.Error("polynomials of different rings compare equal")
	}
	if _, err := x.Mul(x3); !errors.Is(err, ErrRingMismatch) {
		t.Errorf("Mul across rings: %v", err)
	}
	if _, err := GCD(x, x3); !errors.Is(err, ErrRingMismatch) {
		t.Errorf("GCD across rings: %v", err)
	}
	func() {
		defer func() {
			if recover() == nil {
				t.Error("Add across rings did not panic")
			}
		}()
		x.Add(x3)
	}()
}

func TestPolyAccessors(t *testing.T) {
	r, _ := testRing(t, "x", "y", "z")
	p := mustParse(t, r, "3*x^2*y - 5/2*y^3 + x*z + 7")
	if got := p.String(); got != "3*x^2*y - 5/2*y^3 + x*z + 7" {
		t.Errorf("String = %q", got)
	}
	if p.Len() != 4 || p.Degree() != 3 || p.DegreeIn(0) != 2 || p.DegreeIn(1) != 3 || p.DegreeIn(2) != 1 || p.DegreeIn(9) != 0 {
		t.Errorf("Len/Degree: %d %d %d %d %d", p.Len(), p.Degree(), p.DegreeIn(0), p.DegreeIn(1), p.DegreeIn(2))
	}
	if got := p.Coefficient([]int{0, 3}); got.Cmp(big.NewRat(-5, 2)) != 0 {
		t.Errorf("Coefficient(y^3) = %v", got)
	}
	if got := p.Coefficient(nil); got.Cmp(big.NewRat(7, 1)) != 0 {
		t.Errorf("Coefficient(1) = %v", got)
	}
	for _, e := range [][]int{{1}, {-1, 4}, {0, 0, 0, 1}, {70000}} {
		if got := p.Coefficient(e); got.Sign() != 0 {
			t.Errorf("Coefficient(%v) = %v", e, got)
		}
	}
	if got := p.LeadingCoefficient(); got.Cmp(big.NewRat(3, 1)) != 0 {
		t.Errorf("LeadingCoefficient = %v", got)
	}
	if vs := p.Vars(); len(vs) != 3 {
		t.Errorf("Vars = %v", vs)
	}
	if _, ok := p.Constant(); ok {
		t.Error("Constant of a non-constant")
	}
	if c, ok := mustParse(t, r, "x - x + 2/3").Constant(); !ok || c.Cmp(big.NewRat(2, 3)) != 0 {
		t.Errorf("Constant = %v, %v", c, ok)
	}
	zero := r.zero()
	if c, ok := zero.Constant(); !ok || c.Sign() != 0 || zero.Degree() != -1 || zero.DegreeIn(0) != -1 || zero.String() != "0" || zero.LeadingCoefficient().Sign() != 0 {
		t.Error("zero polynomial accessors")
	}
	if d, ok := mustParse(t, r, "x^2*y + y^3 - z^3").Homogeneous(); !ok || d != 3 {
		t.Errorf("Homogeneous = %d, %v", d, ok)
	}
	if _, ok := p.Homogeneous(); ok {
		t.Error("p is not homogeneous")
	}
	if d, ok := zero.Homogeneous(); !ok || d != -1 {
		t.Error("zero is homogeneous of degree -1")
	}
	// Content and primitive part.
	q := mustParse(t, r, "-6/5*x^2 + 9/10*y - 3")
	if c := q.Content(); c.Cmp(big.NewRat(-3, 10)) != 0 {
		t.Errorf("Content = %v", c)
	}
	if pp := q.PrimitivePart(); pp.String() != "4*x^2 - 3*y + 10" {
		t.Errorf("PrimitivePart = %v", pp)
	}
	if zero.Content().Sign() != 0 || !zero.PrimitivePart().IsZero() {
		t.Error("content of zero")
	}
	// Scale, QuoConst, Neg.
	if got := q.Scale(big.NewRat(-10, 3)).String(); got != "4*x^2 - 3*y + 10" {
		t.Errorf("Scale = %v", got)
	}
	if _, err := q.QuoConst(new(big.Rat)); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("QuoConst(0): %v", err)
	}
	if got, _ := q.QuoConst(big.NewRat(-3, 10)); got.String() != "4*x^2 - 3*y + 10" {
		t.Errorf("QuoConst = %v", got)
	}
	if !q.Neg().Neg().Equal(q) || !q.Add(q.Neg()).IsZero() || !q.Sub(q).IsZero() {
		t.Error("Neg/Sub")
	}
	if !q.Scale(nil).IsZero() || !r.Const(nil).IsZero() {
		t.Error("nil scale")
	}
}

// TestInt64Edges exercises the overflow checks of the int64 fast paths.
func TestInt64Edges(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	maxS, minS := "9223372036854775807", "-9223372036854775808"
	a := mustParse(t, r, maxS+"*x + "+minS)
	for _, c := range []struct {
		got  *Poly
		want string
	}{
		{a.Add(a), "18446744073709551614*x - 18446744073709551616"},
		{a.Neg(), "-9223372036854775807*x + 9223372036854775808"},
		{a.Sub(a.Neg()), "18446744073709551614*x - 18446744073709551616"},
		{a.Scale(big.NewRat(2, 1)), "18446744073709551614*x - 18446744073709551616"},
		{a.Scale(big.NewRat(1, 2)), "9223372036854775807/2*x - 4611686018427387904"},
		{a.Derivative(0), maxS},
		{mustParse(t, r, minS+"*x^2").Derivative(0), "-18446744073709551616*x"},
		{a.Add(a).Sub(a), a.String()},
	} {
		checkCanonical(t, c.got)
		if c.got.String() != c.want {
			t.Errorf("got %v, want %s", c.got, c.want)
		}
	}
	// Big numerators that shrink back to int64 are stored small.
	b := a.Add(a).Scale(big.NewRat(1, 2))
	checkCanonical(t, b)
	if !b.Equal(a) || b.bnum != nil {
		t.Errorf("halving 2a: %v (bnum %v)", b, b.bnum != nil)
	}
}

func TestExponentRange(t *testing.T) {
	r, vs := testRing(t, "x", "y")
	x := vs[0]
	p := mustPow(t, x, MaxExponent)
	if p.DegreeIn(0) != MaxExponent {
		t.Fatalf("degree %d", p.DegreeIn(0))
	}
	if _, err := p.Mul(x); !errors.Is(err, ErrExponentRange) {
		t.Errorf("x^65535 * x: %v", err)
	}
	if _, err := mustParse(t, r, "x^2+y").Pow(40000); !errors.Is(err, ErrExponentRange) {
		t.Errorf("(x^2+y)^40000: %v", err)
	} else {
		t.Log(err)
	}
	if _, err := x.Pow(-1); !errors.Is(err, ErrExponentRange) {
		t.Errorf("x^-1: %v", err)
	}
	if _, err := x.Pow(1 << 40); !errors.Is(err, ErrExponentRange) {
		t.Errorf("x^(2^40): %v", err)
	}
	if _, err := r.Parse("x^65536"); !errors.Is(err, ErrExponentRange) {
		t.Errorf("parse x^65536: %v", err)
	}
	if _, err := r.Parse("x^99999999999999999999"); !errors.Is(err, ErrExponentRange) {
		t.Errorf("parse huge exponent: %v", err)
	}
	// Mixed high exponents in several variables stay exact.
	q := mustParse(t, r, "x^30000*y^65000 + y + 1")
	q2 := mustMulP(t, q, mustParse(t, r, "x^35535*y^535 - 1"))
	if got := q2.String(); got != "x^65535*y^65535 - x^30000*y^65000 + x^35535*y^536 + x^35535*y^535 - y - 1" {
		t.Errorf("got %v", got)
	}
	if _, err := q2.Mul(q); !errors.Is(err, ErrExponentRange) {
		t.Errorf("overflowing product: %v", err)
	}
	// Constants: zero power, huge powers of constants refused.
	if got := mustPow(t, r.zero(), 0); !got.isOne() {
		t.Errorf("0^0 = %v", got)
	}
	if _, err := r.Const(big.NewRat(3, 1)).Pow(1 << 30); !errors.Is(err, ErrExponentRange) {
		t.Errorf("3^(2^30): %v", err)
	}
	if got := mustPow(t, r.Const(big.NewRat(-2, 3)), 3); got.String() != "-8/27" {
		t.Errorf("(-2/3)^3 = %v", got)
	}
}

func TestPowMatchesRepeatedMul(t *testing.T) {
	rng := rand.New(rand.NewSource(4))
	r, _ := testRing(t, "x", "y", "z")
	for trial := 0; trial < 60; trial++ {
		p := randPoly(rng, r, 3, 1+rng.Intn(4), 3, rng.Intn(4))
		k := rng.Intn(7)
		want := r.one()
		for i := 0; i < k; i++ {
			want = naiveMul(r, want, p)
		}
		got := mustPow(t, p, k)
		checkCanonical(t, got)
		if !got.Equal(want) {
			t.Fatalf("(%v)^%d: got %v, want %v", p, k, got, want)
		}
	}
}

// TestFatemanTermCounts checks the term counts of Fateman's benchmark
// against a fact of combinatorics: there are C(d+4, 4) monomials of degree
// at most d in 4 variables, and every one occurs in (1+x+y+z+t)^d with a
// positive coefficient (a multinomial coefficient).
func TestFatemanTermCounts(t *testing.T) {
	f, g := fateman(t, 20)
	if f.Len() != 10626 || binom(24, 4).Int64() != 10626 {
		t.Errorf("f has %d terms, want C(24,4) = 10626", f.Len())
	}
	// The largest coefficient of f is the multinomial 20!/(4!^5).
	max := new(big.Int)
	for _, tm := range f.Terms() {
		if tm.Coef.Num().Cmp(max) > 0 {
			max.Set(tm.Coef.Num())
		}
	}
	if want := "305540235000"; max.String() != want {
		t.Errorf("largest coefficient %v, want 20!/(4!^5) = %s", max, want)
	}
	if testing.Short() {
		t.Skip("the full product takes a fraction of a second")
	}
	h := mustMulP(t, f, g)
	if h.Len() != 135751 || binom(44, 4).Int64() != 135751 {
		t.Errorf("f*(f+1) has %d terms, want C(44,4) = 135751", h.Len())
	}
	// f*(f+1) = f^2 + f: its coefficient of x^40 is 1 (from f^2 only),
	// its constant term is 2, and at x*y*z*t it is the coefficient of
	// x*y*z*t in (1+x+y+z+t)^40 plus that in f: 40!/36! + 20!/16!.
	if c := h.Coefficient([]int{40}); c.Cmp(big.NewRat(1, 1)) != 0 {
		t.Errorf("x^40: %v", c)
	}
	if c := h.Coefficient(nil); c.Cmp(big.NewRat(2, 1)) != 0 {
		t.Errorf("constant: %v", c)
	}
	want := int64(40*39*38*37 + 20*19*18*17)
	if c := h.Coefficient([]int{1, 1, 1, 1}); c.Cmp(big.NewRat(want, 1)) != 0 {
		t.Errorf("xyzt: %v, want %d", c, want)
	}
}

func TestParseValues(t *testing.T) {
	r := NewRing()
	for _, c := range []struct{ in, want string }{
		{"2*a^2*b - c", "2*a^2*b - c"},
		{"(a + b)^3/4 - 3/2*c", "1/4*a^3 + 3/4*a^2*b + 3/4*a*b^2 + 1/4*b^3 - 3/2*c"},
		{"a*b^2", "a*b^2"},
		{"0.1*a", "1/10*a"},
		{"1.5 + 2e-3", "751/500"},
		{"2E+2*a", "200*a"},
		{"-a^2", "-a^2"},
		{"(-a)^2", "a^2"},
		{"- - a", "a"},
		{"+a", "a"},
		{"a**3", "a^3"},
		{"a^0", "1"},
		{"2^10", "1024"},
		{"1/2/3*a", "1/6*a"},
		{"a/(1/2)", "2*a"},
		{"a/(b - b + 4)", "1/4*a"},
		{"  a\t*\n b ", "a*b"},
		{"(a - b)*(a + b)", "a^2 - b^2"},
		{"x1_2 + _y", "x1_2 + _y"},
		{"0", "0"},
		{"a - a", "0"},
		{"2*a*3", "6*a"},
	} {
		p, err := r.Parse(c.in)
		if err != nil {
			t.Errorf("Parse(%q): %v", c.in, err)
			continue
		}
		if got := p.String(); got != c.want {
			t.Errorf("Parse(%q) = %q, want %q", c.in, got, c.want)
		}
	}
	// Names enter the ring in order of first appearance.
	r2 := NewRing()
	mustParse(t, r2, "z*y + x^2 + z")
	if got := strings.Join(r2.Names(), ","); got != "z,y,x" {
		t.Errorf("names %s", got)
	}
	// Decimal coefficients are exact.
	p := mustParse(t, r2, "0.1*x")
	if c := p.Coefficient([]int{0, 0, 1}); c.Cmp(big.NewRat(1, 10)) != 0 {
		t.Errorf("0.1*x has coefficient %v", c)
	}
}

func TestParseErrors(t *testing.T) {
	r := NewRing()
	for _, c := range []struct {
		in   string
		col  int
		want error
		msg  string
	}{
		{"2*a^", 5, ErrSyntax, "expected an exponent"},
		{"a + * b", 5, ErrSyntax, `expected a term after "+"`},
		{"(a + b", 7, ErrSyntax, `expected ")" to close "(" at column 1`},
		{"a^-1", 3, ErrSyntax, "non-negative integer"},
		{"a/b", 3, ErrSyntax, "not a constant"},
		{"a/(b+1)", 3, ErrSyntax, "not a constant"},
		{"3 4", 3, ErrSyntax, `expected an operator before "4"`},
		{"2 a", 3, ErrSyntax, `expected an operator before "a"`},
		{"a)", 2, ErrSyntax, `unmatched ")"`},
		{"", 1, ErrSyntax, "end of input"},
		{"()", 2, ErrSyntax, "inside"},
		{"a^1.5", 3, ErrSyntax, "non-negative integer"},
		{"a^b", 3, ErrSyntax, "non-negative integer"},
		{"a^2^3", 4, ErrSyntax, "parentheses"},
		{"1.", 3, ErrSyntax, "digits"},
		{".5", 1, ErrSyntax, "unexpected character"},
		{"a # b", 3, ErrSyntax, "unexpected character"},
		{"é + a", 1, ErrSyntax, "unexpected character"},
		{"a + é", 5, ErrSyntax, "unexpected character"},
		{"a/0", 2, ErrDivisionByZero, "division by zero"},
		{"a/(a-a)", 2, ErrDivisionByZero, "division by zero"},
		{"a*", 3, ErrSyntax, "end of input"},
		{"x^70000", 2, ErrExponentRange, "exceed 65535"},
		{strings.Repeat("(", 2000) + "a" + strings.Repeat(")", 2000), 1002, ErrSyntax, "nested"},
	} {
		_, err := r.Parse(c.in)
		var pe *ParseError
		if !errors.As(err, &pe) {
			t.Errorf("Parse(%q): %v is not a *ParseError", c.in, err)
			continue
		}
		if pe.Col != c.col || !errors.Is(err, c.want) || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("Parse(%q) = %v (column %d), want column %d, %v, %q", c.in, err, pe.Col, c.col, c.want, c.msg)
		}
	}
	// A failed parse adds no variables.
	if len(r.Names()) != 0 {
		t.Errorf("names after failed parses: %v", r.Names())
	}
}

// TestParseStringRoundTrip prints random polynomials and parses them back.
func TestParseStringRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	r, _ := testRing(t, "a", "b", "c", "d", "e", "x_1", "Y")
	for trial := 0; trial < 300; trial++ {
		p := randPoly(rng, r, 7, rng.Intn(12), 4, rng.Intn(4))
		s := p.String()
		q, err := r.Parse(s)
		if err != nil {
			t.Fatalf("Parse(%q): %v", s, err)
		}
		if !q.Equal(p) {
			t.Fatalf("round trip of %q gave %q", s, q)
		}
		// A second ring with the variables in another order reads the same
		// text as the same function.
		if trial < 20 {
			r2 := NewRing()
			q2, err := r2.Parse(s)
			if err != nil {
				t.Fatal(err)
			}
			if q2.String() != mustParse(t, r2, q2.String()).String() {
				t.Fatalf("round trip in a fresh ring: %q", s)
			}
		}
	}
}

// TestRingConcurrent parses, multiplies and adds variables from several
// goroutines at once on one ring (run with -race).
func TestRingConcurrent(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	base := mustParse(t, r, "(x + y + 1)^3")
	done := make(chan error)
	for g := 0; g < 8; g++ {
		go func(g int) {
			for i := 0; i < 20; i++ {
				name := string(rune('a'+g)) + strings.Repeat("_", i%3)
				p, err := r.Parse(name + "^2 + x*" + name + " - (x + y + 1)^3")
				if err != nil {
					done <- err
					return
				}
				q, err := p.Mul(base)
				if err != nil {
					done <- err
					return
				}
				if q.Len() == 0 || q.String() == "" {
					done <- errors.New("empty product")
					return
				}
			}
			done <- nil
		}(g)
	}
	for g := 0; g < 8; g++ {
		if err := <-done; err != nil {
			t.Fatal(err)
		}
	}
	if n := len(r.Names()); n != 2+8*3 {
		t.Errorf("%d names: %v", n, r.Names())
	}
	for _, n := range r.Names() {
		p := mustParse(t, r, n)
		if p.String() != n {
			t.Errorf("variable %s prints as %v", n, p)
		}
	}
}

// FuzzRingParse: Parse never panics, and what it accepts prints to text
// that parses back to an equal polynomial.
func FuzzRingParse(f *testing.F) {
	for _, s := range []string{"2*a^2*b - c", "(a + b)^3/4 - 3/2*c", "0.1*a", "a^-1", "a/b", "3 4", "((a)", "x**2**3", "1e5*x/7", "-(-x)^3"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		r := NewRing()
		r.SetMaxTerms(2000)
		p, err := r.Parse(s)
		if err != nil {
			return
		}
		q, err := r.Parse(p.String())
		if err != nil || !q.Equal(p) {
			t.Fatalf("%q -> %q -> %v, %v", s, p, q, err)
		}
	})
}

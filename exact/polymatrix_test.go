package exact

import (
	"errors"
	"fmt"
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

// Helpers are prefixed pm so that they cannot collide with other test files.

func pmVars(tb testing.TB, r *Ring, names ...string) []*Poly {
	tb.Helper()
	out := make([]*Poly, len(names))
	for i, name := range names {
		v, err := r.Var(name)
		if err != nil {
			tb.Fatal(err)
		}
		out[i] = v
	}
	return out
}

func pmMul(tb testing.TB, ps ...*Poly) *Poly {
	tb.Helper()
	p := ps[0]
	for _, f := range ps[1:] {
		var err error
		if p, err = p.Mul(f); err != nil {
			tb.Fatal(err)
		}
	}
	return p
}

func pmMatrix(tb testing.TB, r *Ring, rows ...[]*Poly) *PolyMatrix {
	tb.Helper()
	m, err := NewPolyMatrix(r, rows)
	if err != nil {
		tb.Fatal(err)
	}
	return m
}

func pmConst(r *Ring, s string) *Poly { return r.Const(q(s)) }

// pmDetAll computes the determinant by every method (Bareiss only up to
// order maxBareiss), checks that they agree, and returns it.
func pmDetAll(tb testing.TB, m *PolyMatrix, maxBareiss int) *Poly {
	tb.Helper()
	d, err := m.Det()
	if err != nil {
		tb.Fatal(err)
	}
	if m.Rows() < 2 {
		return d
	}
	methods := []int{pmDetLaplace, pmDetLaplacePoly}
	if m.Rows() <= maxBareiss {
		methods = append(methods, pmDetBareiss)
	}
	for _, meth := range methods {
		e, err := m.det(meth)
		if err != nil {
			tb.Fatalf("method %d: %v", meth, err)
		}
		if !e.Equal(d) {
			tb.Fatalf("method %d gives %v, Det gives %v", meth, e, d)
		}
	}
	return d
}

// pmEvalDet checks d(vals) == det(m(vals)) with the rational Det.
func pmEvalDet(tb testing.TB, m *PolyMatrix, d *Poly, vals map[int]*big.Rat) {
	tb.Helper()
	c, ok := m.Eval(vals).Constant()
	if !ok {
		tb.Fatal("evaluated matrix not constant")
	}
	want := mustDet(tb, c)
	got, ok := pmEval(d, vals).Constant()
	if !ok {
		tb.Fatal("evaluated determinant not constant")
	}
	if got.Cmp(want) != 0 {
		tb.Fatalf("det at %v: symbolic %s, rational %s", vals, got.RatString(), want.RatString())
	}
}

// pmRandomVals gives every variable of r a random small rational.
func pmRandomVals(rng *rand.Rand, r *Ring) map[int]*big.Rat {
	vals := make(map[int]*big.Rat)
	for i := range r.Names() {
		vals[i] = randomSmallRat(rng, 30)
	}
	return vals
}

// pmRandomPoly returns a random polynomial with up to nt terms of degree
// up to deg in vars, small rational coefficients.
func pmRandomPoly(tb testing.TB, rng *rand.Rand, r *Ring, vars []*Poly, nt, deg int) *Poly {
	tb.Helper()
	p := r.Const(new(big.Rat))
	for k := 0; k < nt; k++ {
		t := r.Const(randomSmallRat(rng, 9))
		for e := rng.Intn(deg + 1); e > 0; e-- {
			t = pmMul(tb, t, vars[rng.Intn(len(vars))])
		}
		p = p.Add(t)
	}
	return p
}

func pmRandomPolyMatrix(tb testing.TB, rng *rand.Rand, r *Ring, vars []*Poly, rows, cols, nt, deg int) *PolyMatrix {
	tb.Helper()
	rs := make([][]*Poly, rows)
	for i := range rs {
		rs[i] = make([]*Poly, cols)
		for j := range rs[i] {
			rs[i][j] = pmRandomPoly(tb, rng, r, vars, nt, deg)
		}
	}
	return pmMatrix(tb, r, rs...)
}

// Heron's formula in squared sides (Blumenthal, Theory and Applications of
// Distance Geometry; any handbook): the Cayley–Menger determinant of a
// triangle with squared sides a, b, c is -16 Area^2 =
// -(2ab + 2bc + 2ca - a^2 - b^2 - c^2).
func TestPolyDetTriangleHeron(t *testing.T) {
	r := NewRing()
	v := pmVars(t, r, "a", "b", "c")
	a, b, c := v[0], v[1], v[2]
	zero, one := pmConst(r, "0"), pmConst(r, "1")
	m := pmMatrix(t, r,
		[]*Poly{zero, one, one, one},
		[]*Poly{one, zero, c, b},
		[]*Poly{one, c, zero, a},
		[]*Poly{one, b, a, zero})
	d := pmDetAll(t, m, 4)
	two := q("2")
	sixteenArea2 := pmMul(t, a, b).Scale(two).Add(pmMul(t, b, c).Scale(two)).Add(pmMul(t, c, a).Scale(two)).
		Sub(pmMul(t, a, a)).Sub(pmMul(t, b, b)).Sub(pmMul(t, c, c))
	if want := sixteenArea2.Neg(); !d.Equal(want) {
		t.Fatalf("triangle CM det = %v, want %v", d, want)
	}
	// 3-4-5 right triangle: area 6, so the determinant is -576.
	got, _ := pmEval(d, map[int]*big.Rat{0: q("9"), 1: q("16"), 2: q("25")}).Constant()
	if got.Cmp(q("-576")) != 0 {
		t.Fatalf("3-4-5 triangle: %s, want -576", got.RatString())
	}
}

// The Cayley–Menger determinant of an n-simplex with vertices p_0..p_n is
// (-1)^(n+1) 2^n (n!)^2 V^2 (Blumenthal; for n = 3 the classical
// 288 V^2), and n! V = |det(p_1 - p_0, ..., p_n - p_0)|. The symbolic
// determinant, evaluated at the squared distances of random rational
// simplices, must match the volume computed from coordinates.
func TestPolyDetCayleyMengerVolume(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	for n := 1; n <= 6; n++ {
		m, r := pmCayleyMenger(t, n)
		d, err := m.Det()
		if err != nil {
			t.Fatal(err)
		}
		for trial := 0; trial < 3; trial++ {
			pts := make([][]*big.Rat, n+1)
			for i := range pts {
				pts[i] = make([]*big.Rat, n)
				for k := range pts[i] {
					pts[i][k] = randomSmallRat(rng, 20)
				}
			}
			edges := Zeros(n, n)
			for i := 1; i <= n; i++ {
				for k := 0; k < n; k++ {
					edges.Set(i-1, k, new(big.Rat).Sub(pts[i][k], pts[0][k]))
				}
			}
			nfV := mustDet(t, edges) // n! V up to sign
			vals := make(map[int]*big.Rat)
			for i := 0; i <= n; i++ {
				for j := i + 1; j <= n; j++ {
					idx, ok := r.Index(fmt.Sprintf("d%d%d", i, j))
					if !ok {
						t.Fatal("missing variable")
					}
					s := new(big.Rat)
					for k := 0; k < n; k++ {
						x := new(big.Rat).Sub(pts[i][k], pts[j][k])
						s.Add(s, x.Mul(x, x))
					}
					vals[idx] = s
				}
			}
			got, ok := pmEval(d, vals).Constant()
			if !ok {
				t.Fatal("not constant")
			}
			want := new(big.Rat).Mul(nfV, nfV)
			want.Mul(want, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(n))))
			if n%2 == 0 {
				want.Neg(want)
			}
			if got.Cmp(want) != 0 {
				t.Fatalf("n=%d: CM det %s, want (-1)^(n+1) 2^n (n! V)^2 = %s", n, got.RatString(), want.RatString())
			}
		}
	}
}

// Term counts of the expanded Cayley–Menger determinants, n = 1..6:
// 1, 6, 22, 130, 822, 6202. They are this package's own results, checked
// here by independent computations: the methods must agree (Laplace
// expansion and Bareiss elimination, up to n = 4), and every determinant must agree with the rational Det of the matrix
// evaluated at random rational points. Each determinant is also
// homogeneous of degree n (each term of the Leibniz expansion of the
// bordered matrix takes two 1s from the border and n entries d_ij).
func TestPolyDetCayleyMengerCounts(t *testing.T) {
	rng := rand.New(rand.NewSource(4))
	wantTerms := []int{0, 1, 6, 22, 130, 822, 6202}
	for n := 1; n <= 6; n++ {
		m, r := pmCayleyMenger(t, n)
		d := pmDetAll(t, m, 4)
		if d.Len() != wantTerms[n] {
			t.Errorf("n=%d: %d terms, want %d", n, d.Len(), wantTerms[n])
		}
		for _, term := range d.Terms() {
			deg := 0
			for _, e := range term.Exps {
				deg += e
			}
			if deg != n {
				t.Fatalf("n=%d: term of degree %d", n, deg)
			}
		}
		for trial := 0; trial < 4; trial++ {
			pmEvalDet(t, m, d, pmRandomVals(rng, r))
		}
	}
}

// The Laplace expansion spreads large levels over goroutines; force
// that on small matrices too and compare with the sequential general code.
func TestPolyDetParallelLevels(t *testing.T) {
	saved := pmParallelWork
	pmParallelWork = 1
	defer func() { pmParallelWork = saved }()
	for n := 2; n <= 5; n++ {
		m, _ := pmCayleyMenger(t, n)
		pmDetAll(t, m, 3)
	}
}

// Vandermonde determinant (standard): det [x_i^j] = prod_{i<j} (x_j - x_i).
func TestPolyDetVandermonde(t *testing.T) {
	for n := 1; n <= 6; n++ {
		r := NewRing()
		names := make([]string, n)
		for i := range names {
			names[i] = fmt.Sprintf("x%d", i)
		}
		x := pmVars(t, r, names...)
		rows := make([][]*Poly, n)
		want := pmConst(r, "1")
		for i := 0; i < n; i++ {
			p := pmConst(r, "1")
			for j := 0; j < n; j++ {
				rows[i] = append(rows[i], p)
				p = pmMul(t, p, x[i])
			}
			for j := i + 1; j < n; j++ {
				want = pmMul(t, want, x[j].Sub(x[i]))
			}
		}
		m := pmMatrix(t, r, rows...)
		d := pmDetAll(t, m, 5)
		if !d.Equal(want) {
			t.Fatalf("n=%d: Vandermonde det %v, want %v", n, d, want)
		}
	}
}

// Leibniz formula (standard): the determinant of a matrix of n^2 distinct
// indeterminates has n! terms, each coefficient +-1 with the sign of the
// permutation.
func TestPolyDetGeneric(t *testing.T) {
	for n := 2; n <= 5; n++ {
		r := NewRing()
		rows := make([][]*Poly, n)
		for i := range rows {
			for j := 0; j < n; j++ {
				rows[i] = append(rows[i], pmVars(t, r, fmt.Sprintf("a%d%d", i, j))[0])
			}
		}
		m := pmMatrix(t, r, rows...)
		d := pmDetAll(t, m, 4)
		fact := 1
		for k := 2; k <= n; k++ {
			fact *= k
		}
		if d.Len() != fact {
			t.Fatalf("n=%d: %d terms, want %d", n, d.Len(), fact)
		}
		for _, term := range d.Terms() {
			// The monomial picks one variable per row: a permutation.
			perm := make([]int, n)
			for v, e := range term.Exps {
				if e != 0 {
					perm[v/n] = v % n
				}
			}
			if want := pmPermSign(perm); term.Coef.Cmp(big.NewRat(int64(want), 1)) != 0 {
				t.Fatalf("n=%d: coefficient %s for permutation %v", n, term.Coef.RatString(), perm)
			}
		}
	}
}

func pmPermSign(p []int) int {
	s := 1
	for i := range p {
		for j := i + 1; j < len(p); j++ {
			if p[i] > p[j] {
				s = -s
			}
		}
	}
	return s
}

// det(AB) = det(A) det(B) and det(A^T) = det(A) (standard theorems), on
// random polynomial matrices; also checked at random points against the
// rational Det.
func TestPolyDetProductTranspose(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	for n := 1; n <= 4; n++ {
		r := NewRing()
		vars := pmVars(t, r, "x", "y", "z")
		a := pmRandomPolyMatrix(t, rng, r, vars, n, n, 3, 2)
		b := pmRandomPolyMatrix(t, rng, r, vars, n, n, 3, 2)
		ab, err := a.Mul(b)
		if err != nil {
			t.Fatal(err)
		}
		da, db := pmDetAll(t, a, 4), pmDetAll(t, b, 4)
		dab := pmDetAll(t, ab, 4)
		if want := pmMul(t, da, db); !dab.Equal(want) {
			t.Fatalf("n=%d: det(AB) = %v, det(A) det(B) = %v", n, dab, want)
		}
		if dt := pmDetAll(t, a.Transpose(), 4); !dt.Equal(da) {
			t.Fatalf("n=%d: det(A^T) = %v, det(A) = %v", n, dt, da)
		}
		pmEvalDet(t, ab, dab, pmRandomVals(rng, r))
	}
}

// Entries with large rational coefficients: the methods agree, and the
// determinant agrees with the rational Det at a point.
func TestPolyDetLargeCoefficients(t *testing.T) {
	r := NewRing()
	v := pmVars(t, r, "x", "y")
	big1 := pmConst(r, "123456789012345678/7")
	big2 := pmConst(r, "987654321098765432/11")
	m := pmMatrix(t, r,
		[]*Poly{pmMul(t, big1, v[0]), big2, v[1]},
		[]*Poly{big2, pmMul(t, big1, v[1]), v[0]},
		[]*Poly{v[0], big1, big2})
	d := pmDetAll(t, m, 3)
	pmEvalDet(t, m, d, map[int]*big.Rat{0: q("3/5"), 1: q("-7/2")})
	// Rational entries with small denominators.
	m2 := pmMatrix(t, r,
		[]*Poly{v[0].Scale(q("1/3")), pmConst(r, "2/7")},
		[]*Poly{pmConst(r, "-5/6"), v[1].Scale(q("3/4"))})
	d2 := pmDetAll(t, m2, 2)
	want := pmMul(t, v[0], v[1]).Scale(q("1/4")).Add(pmConst(r, "5/21"))
	if !d2.Equal(want) {
		t.Fatalf("det = %v, want %v", d2, want)
	}
}

// Forty variables with exponents near the top of their range (30000 in
// entries, 60000 in the determinant).
func TestPolyDetWideExponents(t *testing.T) {
	r := NewRing()
	var vs []*Poly
	for i := 0; i < 40; i++ {
		x, err := pmVars(t, r, fmt.Sprintf("v%d", i))[0].Pow(30000)
		if err != nil {
			t.Fatal(err)
		}
		vs = append(vs, x)
	}
	var rows [][]*Poly
	for i := 0; i < 2; i++ {
		var row []*Poly
		for j := 0; j < 2; j++ {
			p := pmConst(r, "1")
			for k := 0; k < 10; k++ {
				p = p.Add(vs[(i*2+j)*10+k])
			}
			row = append(row, p)
		}
		rows = append(rows, row)
	}
	m := pmMatrix(t, r, rows...)
	d := pmDetAll(t, m, 2)
	if want := pmMul(t, rows[0][0], rows[1][1]).Sub(pmMul(t, rows[0][1], rows[1][0])); !d.Equal(want) {
		t.Fatalf("det = %v, want %v", d, want)
	}
}

// Singular and degenerate matrices.
func TestPolyDetSingular(t *testing.T) {
	r := NewRing()
	v := pmVars(t, r, "x", "y")
	zero, one := pmConst(r, "0"), pmConst(r, "1")
	for _, m := range []*PolyMatrix{
		pmMatrix(t, r, []*Poly{v[0], v[1]}, []*Poly{v[0], v[1]}),
		pmMatrix(t, r, []*Poly{v[0], v[1], one}, []*Poly{zero, zero, zero}, []*Poly{one, v[0], v[1]}),
		pmMatrix(t, r, []*Poly{v[0], pmMul(t, v[0], v[1])}, []*Poly{one, v[1]}),
	} {
		if d := pmDetAll(t, m, 3); !d.IsZero() {
			t.Fatalf("det of %v = %v, want 0", m, d)
		}
	}
	// 1x1 and 0x0.
	m := pmMatrix(t, r, []*Poly{v[1]})
	if d, err := m.Det(); err != nil || !d.Equal(v[1]) {
		t.Fatalf("1x1 det = %v, %v", d, err)
	}
	empty, err := m.Submatrix(nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	if d, err := empty.Det(); err != nil || !d.Equal(one) {
		t.Fatalf("0x0 det = %v, %v", d, err)
	}
}

// Minor is the determinant of the submatrix (definition); checked against
// a hand expansion.
func TestPolyMinor(t *testing.T) {
	r := NewRing()
	v := pmVars(t, r, "a", "b", "c", "d", "e", "f", "g", "h", "i")
	m := pmMatrix(t, r, v[0:3], v[3:6], v[6:9])
	got, err := m.Minor([]int{0, 2}, []int{2, 0})
	if err != nil {
		t.Fatal(err)
	}
	// rows (a b c), (g h i), columns 2 then 0: det [[c, a], [i, g]] = cg - ai.
	if want := pmMul(t, v[2], v[6]).Sub(pmMul(t, v[0], v[8])); !got.Equal(want) {
		t.Fatalf("minor = %v, want %v", got, want)
	}
	if got, err := m.Minor(nil, nil); err != nil || !got.Equal(pmConst(r, "1")) {
		t.Fatalf("empty minor = %v, %v", got, err)
	}
	if _, err := m.Minor([]int{0}, []int{0, 1}); !errors.Is(err, ErrNotSquare) {
		t.Fatalf("err = %v, want ErrNotSquare", err)
	}
	if _, err := m.Minor([]int{0, 0}, []int{0, 1}); !errors.Is(err, ErrShape) {
		t.Fatalf("err = %v, want ErrShape", err)
	}
	if _, err := m.Minor([]int{3}, []int{0}); !errors.Is(err, ErrShape) {
		t.Fatalf("err = %v, want ErrShape", err)
	}
}

func TestPolyDetErrors(t *testing.T) {
	r := NewRing()
	v := pmVars(t, r, "x", "y")
	rect := pmMatrix(t, r, []*Poly{v[0], v[1], v[0]}, []*Poly{v[1], v[0], v[1]})
	if _, err := rect.Det(); !errors.Is(err, ErrNotSquare) {
		t.Fatalf("non-square: err = %v", err)
	}
	if _, err := NewPolyMatrix(r, [][]*Poly{{v[0], v[1]}, {v[0]}}); !errors.Is(err, ErrShape) {
		t.Fatalf("ragged: err = %v", err)
	}
	if _, err := NewPolyMatrix(r, nil); !errors.Is(err, ErrShape) {
		t.Fatalf("no rows: err = %v", err)
	}
	if _, err := NewPolyMatrix(r, [][]*Poly{{}}); !errors.Is(err, ErrShape) {
		t.Fatalf("empty row: err = %v", err)
	}
	other := NewRing()
	w := pmVars(t, other, "x")[0]
	if _, err := NewPolyMatrix(r, [][]*Poly{{v[0], w}}); !errors.Is(err, ErrRingMismatch) {
		t.Fatalf("foreign ring: err = %v", err)
	}
	// Term cap: the generic 3x3 determinant has 6 terms.
	capped := NewRing()
	var rows [][]*Poly
	for i := 0; i < 3; i++ {
		rows = append(rows, pmVars(t, capped, fmt.Sprintf("a%d", i), fmt.Sprintf("b%d", i), fmt.Sprintf("c%d", i)))
	}
	m := pmMatrix(t, capped, rows...)
	capped.SetMaxTerms(5)
	for _, meth := range []int{pmDetAuto, pmDetLaplace, pmDetLaplacePoly, pmDetBareiss} {
		_, err := m.det(meth)
		if !errors.Is(err, ErrTooManyTerms) {
			t.Fatalf("method %d with cap 5: err = %v, want ErrTooManyTerms", meth, err)
		}
	}
	_, err := m.Det()
	if !errors.Is(err, ErrTooManyTerms) || !strings.Contains(err.Error(), "5") {
		t.Fatalf("Det with cap 5: err = %v", err)
	}
	capped.SetMaxTerms(6)
	if d, err := m.Det(); err != nil || d.Len() != 6 {
		t.Fatalf("Det with cap 6: %v, %v", d, err)
	}
}

func TestPolyMatrixArithmetic(t *testing.T) {
	r := NewRing()
	v := pmVars(t, r, "x", "y")
	x, y := v[0], v[1]
	one := pmConst(r, "1")
	a := pmMatrix(t, r, []*Poly{x, one}, []*Poly{nil, y})
	b := pmMatrix(t, r, []*Poly{y, x}, []*Poly{one, one})
	if a.Rows() != 2 || a.Cols() != 2 || !a.At(1, 0).IsZero() {
		t.Fatalf("shape or nil entry: %v", a)
	}
	sum, err := a.Add(b)
	if err != nil {
		t.Fatal(err)
	}
	if !sum.At(0, 0).Equal(x.Add(y)) || !sum.At(1, 0).Equal(one) {
		t.Fatalf("sum = %v", sum)
	}
	diff, err := sum.Sub(b)
	if err != nil || !diff.Equal(a) {
		t.Fatalf("(a+b)-b = %v, %v", diff, err)
	}
	prod, err := a.Mul(b)
	if err != nil {
		t.Fatal(err)
	}
	// [[x, 1], [0, y]] [[y, x], [1, 1]] = [[xy + 1, x^2 + 1], [y, y]]
	want := pmMatrix(t, r,
		[]*Poly{pmMul(t, x, y).Add(one), pmMul(t, x, x).Add(one)},
		[]*Poly{y, y})
	if !prod.Equal(want) {
		t.Fatalf("product = %v, want %v", prod, want)
	}
	sc, err := a.Scale(x)
	if err != nil || !sc.At(0, 0).Equal(pmMul(t, x, x)) || !sc.At(0, 1).Equal(x) {
		t.Fatalf("scale = %v, %v", sc, err)
	}
	if tr := a.Transpose(); !tr.At(0, 1).IsZero() || !tr.At(1, 0).Equal(one) {
		t.Fatalf("transpose = %v", tr)
	}
	sub, err := a.Submatrix([]int{1}, []int{1, 0})
	if err != nil || sub.Rows() != 1 || sub.Cols() != 2 || !sub.At(0, 0).Equal(y) {
		t.Fatalf("submatrix = %v, %v", sub, err)
	}
	if _, err := a.Submatrix([]int{2}, []int{0}); !errors.Is(err, ErrShape) {
		t.Fatalf("submatrix out of range: %v", err)
	}
	e := a.Eval(map[int]*big.Rat{0: q("1/2")})
	if !e.At(0, 0).Equal(pmConst(r, "1/2")) || !e.At(1, 1).Equal(y) {
		t.Fatalf("eval = %v", e)
	}
	if _, ok := e.Constant(); ok {
		t.Fatal("Constant true with y left")
	}
	c, ok := a.Eval(map[int]*big.Rat{0: q("2"), 1: q("3")}).Constant()
	if !ok || !c.Equal(mustMatrix(t, []string{"2", "1"}, []string{"0", "3"})) {
		t.Fatalf("constant = %v, %v", c, ok)
	}
	h := hilbert(3)
	if back, ok := PolyMatrixFrom(r, h).Constant(); !ok || !back.Equal(h) {
		t.Fatalf("round trip = %v", back)
	}
	if s := prod.String(); s != "["+"["+prod.At(0, 0).String()+", "+prod.At(0, 1).String()+"], [y, y]]" {
		t.Fatalf("String = %q", s)
	}
	// Errors.
	rect := pmMatrix(t, r, []*Poly{x, y, one})
	if _, err := a.Add(rect); !errors.Is(err, ErrShape) {
		t.Fatalf("add shapes: %v", err)
	}
	if _, err := a.Sub(rect); !errors.Is(err, ErrShape) {
		t.Fatalf("sub shapes: %v", err)
	}
	if _, err := a.Mul(rect); !errors.Is(err, ErrShape) {
		t.Fatalf("mul shapes: %v", err)
	}
	if p, err := rect.Mul(rect.Transpose()); err != nil || !p.At(0, 0).Equal(pmMul(t, x, x).Add(pmMul(t, y, y)).Add(one)) {
		t.Fatalf("1x3 times 3x1 = %v, %v", p, err)
	}
	other := NewRing()
	ov := pmVars(t, other, "x")[0]
	om := pmMatrix(t, other, []*Poly{ov, ov}, []*Poly{ov, ov})
	if _, err := a.Add(om); !errors.Is(err, ErrRingMismatch) {
		t.Fatalf("add across rings: %v", err)
	}
	if _, err := a.Mul(om); !errors.Is(err, ErrRingMismatch) {
		t.Fatalf("mul across rings: %v", err)
	}
	if _, err := a.Scale(ov); !errors.Is(err, ErrRingMismatch) {
		t.Fatalf("scale across rings: %v", err)
	}
	r.SetMaxTerms(1)
	if _, err := a.Mul(b); !errors.Is(err, ErrTooManyTerms) {
		t.Fatalf("mul with cap 1: %v", err)
	}
}

// Partial evaluation combines the terms that become alike.
func TestPolyMatrixEvalPartial(t *testing.T) {
	r := NewRing()
	v := pmVars(t, r, "x", "y", "z")
	x, y, z := v[0], v[1], v[2]
	p := pmMul(t, x, x, y).Add(pmMul(t, x, y).Scale(q("3"))).Sub(y).Add(z)
	m := pmMatrix(t, r, []*Poly{p, x})
	e := m.Eval(map[int]*big.Rat{0: q("2")})
	if want := y.Scale(q("9")).Add(z); !e.At(0, 0).Equal(want) || !e.At(0, 1).Equal(pmConst(r, "2")) {
		t.Fatalf("x = 2: %v", e)
	}
	e = m.Eval(map[int]*big.Rat{1: new(big.Rat), 2: q("-1/3")})
	if !e.At(0, 0).Equal(pmConst(r, "-1/3")) || !e.At(0, 1).Equal(x) {
		t.Fatalf("y = 0, z = -1/3: %v", e)
	}
	e = m.Eval(map[int]*big.Rat{0: q("-1/2"), 1: q("3"), 2: q("0")})
	// 1/4*3 - 9/2 - 3 = -27/4
	if c, ok := e.Constant(); !ok || c.At(0, 0).Cmp(q("-27/4")) != 0 {
		t.Fatalf("full evaluation: %v", e)
	}
}

// pmEval is partial evaluation of p through Terms alone: an evaluator
// independent of Poly.Eval, to cross-check determinants.
func pmEval(p *Poly, vals map[int]*big.Rat) *Poly {
	r := p.Ring()
	names := r.Names()
	type acc struct {
		c    *big.Rat
		exps []int
	}
	var order []string
	sums := make(map[string]*acc)
	for _, t := range p.Terms() {
		c := new(big.Rat).Set(t.Coef)
		rest := make([]int, len(t.Exps))
		var key strings.Builder
		for v, e := range t.Exps {
			if x, ok := vals[v]; ok && e > 0 {
				if x == nil || x.Sign() == 0 {
					c.SetInt64(0)
					break
				}
				xe := new(big.Rat).SetFrac(
					new(big.Int).Exp(x.Num(), big.NewInt(int64(e)), nil),
					new(big.Int).Exp(x.Denom(), big.NewInt(int64(e)), nil))
				c.Mul(c, xe)
				continue
			}
			rest[v] = e
			fmt.Fprintf(&key, "%d,", e)
		}
		if c.Sign() == 0 {
			continue
		}
		k := key.String()
		if a, ok := sums[k]; ok {
			a.c.Add(a.c, c)
		} else {
			sums[k] = &acc{c: c, exps: rest}
			order = append(order, k)
		}
	}
	ps := make([]*Poly, 0, len(order))
	for _, k := range order {
		a := sums[k]
		if a.c.Sign() == 0 {
			continue
		}
		t := r.Const(a.c)
		for v, e := range a.exps {
			if e == 0 {
				continue
			}
			x, err := r.Var(names[v])
			if err == nil {
				x, err = x.Pow(e)
			}
			if err == nil {
				t, err = t.Mul(x)
			}
			if err != nil {
				panic(fmt.Sprintf("exact: evaluating %v: %v", p, err)) // a monomial of p cannot fail
			}
		}
		ps = append(ps, t)
	}
	// A balanced sum, not pmSum: the result has no more terms than p, so
	// the cap is not checked again.
	if len(ps) == 0 {
		return r.Const(new(big.Rat))
	}
	for len(ps) > 1 {
		next := ps[:0]
		for k := 0; k < len(ps); k += 2 {
			if k+1 == len(ps) {
				next = append(next, ps[k])
			} else {
				next = append(next, ps[k].Add(ps[k+1]))
			}
		}
		ps = next
	}
	return ps[0]
}

package exact

import (
	"fmt"
	"math/big"
	"math/rand"
	"slices"
	"testing"
)

// ratRows converts integer rows to a Matrix.
func ratRows(t testing.TB, b [][]*big.Int) *Matrix {
	rows := make([][]*big.Rat, len(b))
	for i, r := range b {
		for _, c := range r {
			rows[i] = append(rows[i], new(big.Rat).SetInt(c))
		}
	}
	m, err := NewMatrix(rows)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

func cloneRows(b [][]*big.Int) [][]*big.Int {
	out := make([][]*big.Int, len(b))
	for i, r := range b {
		for _, c := range r {
			out[i] = append(out[i], new(big.Int).Set(c))
		}
	}
	return out
}

// checkLLL checks the definition of a reduced basis (Lenstra, Lenstra,
// Lovász 1982, (1.4) and (1.5), with δ = 3/4; |μ| ≤ 1/2 allowed a float
// slack of 1/100) in exact rational Gram–Schmidt, and that out spans the
// lattice of in: out·in⁻¹ is an integer matrix of determinant ±1.
func checkLLL(t *testing.T, in, out [][]*big.Int) {
	t.Helper()
	n := len(out)
	bs := make([][]*big.Rat, n) // b*_i
	norm := make([]*big.Rat, n)
	dot := func(a, b []*big.Rat) *big.Rat {
		s := new(big.Rat)
		for i := range a {
			s.Add(s, new(big.Rat).Mul(a[i], b[i]))
		}
		return s
	}
	for i, row := range out {
		v := make([]*big.Rat, len(row))
		for l, c := range row {
			v[l] = new(big.Rat).SetInt(c)
		}
		bi := slices.Clone(v)
		for j := 0; j < i; j++ {
			mu := new(big.Rat).Quo(dot(v, bs[j]), norm[j])
			if a := new(big.Rat).Abs(mu); a.Cmp(big.NewRat(51, 100)) > 0 {
				t.Fatalf("μ[%d][%d] = %v: not size-reduced", i, j, mu)
			}
			for l := range bi {
				bi[l] = new(big.Rat).Sub(bi[l], new(big.Rat).Mul(mu, bs[j][l]))
			}
			if j == i-1 {
				// Lovász: |b*_i|² ≥ (3/4 − μ²)|b*_{i−1}|².
				lhs := dot(bi, bi)
				rhs := new(big.Rat).Sub(big.NewRat(3, 4), new(big.Rat).Mul(mu, mu))
				if lhs.Cmp(rhs.Mul(rhs, norm[j])) < 0 {
					t.Fatalf("Lovász condition fails at %d", i)
				}
			}
		}
		bs[i], norm[i] = bi, dot(bi, bi)
	}
	inv, err := ratRows(t, in).Inverse()
	if err != nil {
		t.Fatal(err)
	}
	U, err := ratRows(t, out).Mul(inv)
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			if !U.At(i, j).IsInt() {
				t.Fatalf("output row %d is not an integer combination of the input", i)
			}
		}
	}
	if d, err := U.Det(); err != nil || new(big.Rat).Abs(d).Cmp(big.NewRat(1, 1)) != 0 {
		t.Fatalf("transformation determinant %v, %v; want ±1", d, err)
	}
}

func intRows(rows [][]int64) [][]*big.Int {
	out := make([][]*big.Int, len(rows))
	for i, r := range rows {
		for _, c := range r {
			out[i] = append(out[i], big.NewInt(c))
		}
	}
	return out
}

// TestLLLExample: the basis (1,1,1), (−1,0,2), (3,5,6) reduces to
// (0,1,0), (1,0,1), (−1,0,2), of squared norms 1, 2, 5 (the worked
// example of the LLL article on Wikipedia, from memory).
func TestLLLExample(t *testing.T) {
	in := intRows([][]int64{{1, 1, 1}, {-1, 0, 2}, {3, 5, 6}})
	out := cloneRows(in)
	if !lllReduce(out, 1000) {
		t.Fatal("gave up")
	}
	checkLLL(t, in, out)
	var norms []int64
	for _, r := range out {
		s := int64(0)
		for _, c := range r {
			s += c.Int64() * c.Int64()
		}
		norms = append(norms, s)
	}
	if !slices.Equal(norms, []int64{1, 2, 5}) {
		t.Errorf("squared norms %v, want [1 2 5]: %v", norms, out)
	}
}

// TestLLLRandom: random full-rank lattices, including knapsack-shaped
// ones like the recombination's (identity beside a column, and a large
// modulus row), reduce to bases meeting the definition (checkLLL).
func TestLLLRandom(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	for trial := 0; trial < 60; trial++ {
		n := 2 + rng.Intn(9)
		in := make([][]*big.Int, n)
		if trial%2 == 0 {
			for i := range in {
				for j := 0; j < n; j++ {
					in[i] = append(in[i], big.NewInt(rng.Int63n(2001)-1000))
				}
			}
		} else {
			// Rows (e_i, a_i) and (0, …, 0, 2^30).
			for i := 0; i < n-1; i++ {
				in[i] = make([]*big.Int, n)
				for j := range in[i] {
					in[i][j] = new(big.Int)
				}
				in[i][i].SetInt64(1)
				in[i][n-1].SetInt64(rng.Int63n(1 << 30))
			}
			in[n-1] = make([]*big.Int, n)
			for j := range in[n-1] {
				in[n-1][j] = new(big.Int)
			}
			in[n-1][n-1].SetInt64(1 << 30)
		}
		if d := gramMinors(in); d[n].Sign() == 0 {
			continue // dependent rows
		}
		out := cloneRows(in)
		if !lllReduce(out, 100000) {
			t.Fatalf("trial %d: gave up", trial)
		}
		checkLLL(t, in, out)
	}
}

// TestGramMinors: the Gram determinants of (1,1,1), (−1,0,2), (3,5,6)
// are 3, 3·5 − 1² = 14 and det² = 9 (by hand: the determinant is −3).
func TestGramMinors(t *testing.T) {
	d := gramMinors(intRows([][]int64{{1, 1, 1}, {-1, 0, 2}, {3, 5, 6}}))
	if fmt.Sprint(d) != "[1 3 14 9]" {
		t.Errorf("minors %v, want [1 3 14 9]", d)
	}
}

// latticeFactors factors the primitive square-free f by van Hoeij's
// method alone, failing the test when the method does not conclude or
// the prime leaves too few modular factors to exercise it.
func latticeFactors(t testing.TB, f []*big.Int) (r int, gs [][]*big.Int) {
	t.Helper()
	lf := liftForLattice(t, f)
	if len(lf.lifted) < vanHoeijMinFactors {
		t.Fatalf("only %d modular factors", len(lf.lifted))
	}
	gs, ok := vanHoeij(f, lf.lifted, lf.M, lf.p, lf.plan)
	if !ok {
		t.Fatalf("van Hoeij did not conclude on %d factors mod %d", len(lf.lifted), lf.p)
	}
	return len(lf.lifted), gs
}

// liftedFactors is the input of a recombination.
type liftedFactors struct {
	p      uint64
	M      *big.Int
	lifted [][]*big.Int
	plan   vhPlan
}

// liftForLattice lifts the modular factors of f far enough for both
// recombinations.
func liftForLattice(t testing.TB, f []*big.Int) liftedFactors {
	p, facs, err := choosePrime(f)
	if err != nil {
		t.Fatal(err)
	}
	plan := planVanHoeij(f, len(facs), p)
	need := new(big.Int).Exp(new(big.Int).SetUint64(p), big.NewInt(int64(plan.need)), nil)
	if b := new(big.Int).Lsh(mignotte(f), 1); b.Cmp(need) > 0 {
		need = b
	}
	lifted, M := liftPast(f, facs, p, need)
	return liftedFactors{p, M, lifted, plan}
}

// sameFactors reports whether the polynomials gs are the factors want,
// in any order.
func sameFactors(r *Ring, gs [][]*big.Int, want []*Poly) bool {
	if len(gs) != len(want) {
		return false
	}
	var got []*Poly
	for _, g := range gs {
		got = append(got, fromDense(r, 0, g))
	}
	cmp := func(a, b *Poly) int { return cmpFactor(a, b) }
	slices.SortFunc(got, cmp)
	w := slices.Clone(want)
	slices.SortFunc(w, cmp)
	return slices.EqualFunc(got, w, (*Poly).Equal)
}

// TestVanHoeijSwinnertonDyer: the Swinnerton-Dyer polynomials
// ∏(x ± √2 ± √3 ± √5 ± √7 ± √11 [± √13]) are irreducible over Q and
// split into linear and quadratic factors modulo every prime (classical:
// E. R. Berlekamp's and Swinnerton-Dyer's example of the worst case of
// Zassenhaus's search); the lattice alone proves it.
func TestVanHoeijSwinnertonDyer(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	sets := [][]int{{2, 3, 5, 7, 11}, {2, 3, 5, 7, 11, 13}}
	if testing.Short() {
		sets = sets[:1]
	}
	for _, ps := range sets {
		p := swinnertonDyer(t, r, ps)
		f := toDense(p.PrimitivePart(), 0)
		n, gs := latticeFactors(t, f)
		if len(gs) != 1 || n < p.Degree()/2 {
			t.Fatalf("degree %d: %d factors from %d modular ones", p.Degree(), len(gs), n)
		}
		if ok, err := p.IsIrreducible(); err != nil || !ok {
			t.Fatalf("degree %d: irreducible %v, %v", p.Degree(), ok, err)
		}
	}
}

// shift returns p(a·x + b).
func shift(t testing.TB, p *Poly, a, b int64) *Poly {
	r := p.Ring()
	x := mustParse(t, r, "x")
	q, err := p.Substitute(map[int]*Poly{0: x.Scale(big.NewRat(a, 1)).Add(r.Const(big.NewRat(b, 1)))})
	if err != nil {
		t.Fatal(err)
	}
	return q.PrimitivePart()
}

// TestVanHoeijProducts: products of irreducible polynomials whose images
// split into many factors modulo every prime: Swinnerton-Dyer
// polynomials under x ↦ a·x + b (an affine change of variable keeps
// irreducibility; S8 = x⁸ − 40x⁶ + 352x⁴ − 960x² + 576 from memory,
// checked in TestSwinnertonDyerIrreducible) and cyclotomic polynomials
// (irreducible, Gauss; OEIS A013595), random choices, factored back
// into exactly those factors by the lattice, and by Factor.
func TestVanHoeijProducts(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	s8 := swinnertonDyer(t, r, []int{2, 3, 5})
	s16 := swinnertonDyer(t, r, []int{2, 3, 5, 7})
	phi := cyclotomic(t, r, 60)
	rng := rand.New(rand.NewSource(16))
	for trial := 0; trial < 8; trial++ {
		var want []*Poly
		seen := map[string]bool{}
		add := func(g *Poly) {
			if !seen[g.String()] {
				seen[g.String()] = true
				want = append(want, g)
			}
		}
		for k := 2 + rng.Intn(2); k > 0; k-- {
			add(shift(t, s8, 1+rng.Int63n(2), rng.Int63n(7)-3))
		}
		if trial%3 == 0 {
			add(shift(t, s16, 1, rng.Int63n(3)))
		}
		for k := rng.Intn(3); k > 0; k-- {
			add(phi[5+rng.Intn(56)])
		}
		prod := r.one()
		for _, g := range want {
			prod = mustMulP(t, prod, g)
		}
		_, gs := latticeFactors(t, toDense(prod, 0))
		if !sameFactors(r, gs, want) {
			t.Fatalf("trial %d: lattice gave %d factors, want %v", trial, len(gs), want)
		}
		f := mustFactor(t, prod)
		if len(f.Factors) != len(want) {
			t.Fatalf("trial %d: Factor gave %v, want %v", trial, f.Factors, want)
		}
	}
}

// TestCyclotomicTo120: x^n − 1 = ∏_{d|n} Φ_d, each Φ_d irreducible
// (Gauss; OEIS A013595), for n = 61..120 (TestCyclotomicFactorizations
// has n ≤ 60); Φ_105 is the first with a coefficient −2, at x⁷ and x⁴¹
// (Migotti 1883; OEIS A013595 row 105).
func TestCyclotomicTo120(t *testing.T) {
	r, _ := testRing(t, "x")
	phi := cyclotomic(t, r, 120)
	for _, e := range []int{7, 41} {
		if c := phi[105].Coefficient([]int{e}); c.Cmp(big.NewRat(-2, 1)) != 0 {
			t.Fatalf("Φ_105 coefficient of x^%d is %v, want −2", e, c)
		}
	}
	x := mustParse(t, r, "x")
	for n := 61; n <= 120; n++ {
		f := mustFactor(t, mustPow(t, x, n).Sub(r.one()))
		var want []*Poly
		for d := 1; d <= n; d++ {
			if n%d == 0 {
				want = append(want, phi[d])
			}
		}
		var got []*Poly
		for _, g := range f.Factors {
			if g.Mult != 1 {
				t.Fatalf("x^%d − 1: multiplicity %d", n, g.Mult)
			}
			got = append(got, g.Factor)
		}
		slices.SortFunc(want, cmpFactor)
		if !slices.EqualFunc(got, want, (*Poly).Equal) {
			t.Fatalf("x^%d − 1: %v, want %v", n, got, want)
		}
	}
}

// BenchmarkRecombine compares the subset search with the lattice on the
// same lifted factors, to place vanHoeijMinFactors: Swinnerton-Dyer
// polynomials (irreducible, the search's worst case) and a product of
// two shifted S8 (reducible).
func BenchmarkRecombine(b *testing.B) {
	r, _ := testRing(b, "x", "y")
	s8 := swinnertonDyer(b, r, []int{2, 3, 5})
	cases := []*Poly{
		s8,
		mustMulP(b, s8, shift(b, s8, 1, 1)),
		swinnertonDyer(b, r, []int{2, 3, 5, 7}),
		mustMulP(b, mustMulP(b, s8, shift(b, s8, 1, 1)), shift(b, s8, 1, -1)),
		swinnertonDyer(b, r, []int{2, 3, 5, 7, 11}),
	}
	for _, c := range cases {
		f := toDense(c, 0)
		lf := liftForLattice(b, f)
		name := fmt.Sprintf("deg%d_r%d", c.Degree(), len(lf.lifted))
		b.Run(name+"/subsets", func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := recombine(f, lf.lifted, lf.M, lf.p, maxSubsets); err != nil {
					b.Fatal(err)
				}
			}
		})
		b.Run(name+"/lattice", func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, ok := vanHoeij(f, lf.lifted, lf.M, lf.p, lf.plan); !ok {
					b.Fatal("no conclusion")
				}
			}
		})
	}
}

// TestVanHoeijGivesUp: with too few traces (only the first, zero for an
// even polynomial such as a Swinnerton-Dyer one) the lattice reports no
// conclusion instead of an answer, and Zassenhaus's search still proves
// the polynomial irreducible.
func TestVanHoeijGivesUp(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	f := toDense(swinnertonDyer(t, r, []int{2, 3, 5, 7, 11}), 0)
	lf := liftForLattice(t, f)
	plan := lf.plan
	plan.N = 1
	if gs, ok := vanHoeij(f, lf.lifted, lf.M, lf.p, plan); ok {
		t.Fatalf("concluded from one trace: %d factors", len(gs))
	}
	gs, err := recombine(f, lf.lifted, lf.M, lf.p, maxSubsets)
	if err != nil || len(gs) != 1 {
		t.Fatalf("subset search: %d factors, %v", len(gs), err)
	}
}

// TestLLLGivesUp: past the swap cap, or with entries beyond float64's
// range, the reduction reports false, and the rows still span the same
// lattice (equal Gram determinant, by the definition of a lattice's
// volume).
func TestLLLGivesUp(t *testing.T) {
	huge := new(big.Int).Lsh(big.NewInt(1), 1100)
	for _, in := range [][][]*big.Int{
		intRows([][]int64{{1, 1, 1}, {-1, 0, 2}, {3, 5, 6}}),
		{{huge, big.NewInt(1)}, {big.NewInt(1), big.NewInt(0)}},
	} {
		out := cloneRows(in)
		if lllReduce(out, 0) {
			t.Fatalf("%v: reduced without a swap", in)
		}
		if a, b := gramMinors(in), gramMinors(out); a[len(in)].Cmp(b[len(in)]) != 0 {
			t.Fatalf("%v: lattice changed to %v", in, out)
		}
	}
}

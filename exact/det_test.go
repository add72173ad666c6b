package exact

import (
	"errors"
	"fmt"
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

// detMethods are the independent determinant algorithms in the package;
// every determinant test runs all of them, and Det itself.
var detMethods = []struct {
	name string
	f    func(*Matrix) *big.Rat
}{
	{"Det", func(m *Matrix) *big.Rat { return must(m.Det()) }},
	{"bareiss", (*Matrix).detBareiss},
	{"modular-lcm", func(m *Matrix) *big.Rat { return m.detModular(clearLCM) }},
	{"modular-product", func(m *Matrix) *big.Rat { return m.detModular(clearProduct) }},
	{"gauss-rat", (*Matrix).detGaussRat},
	{"bareiss-words", func(m *Matrix) *big.Rat { return viaWords(m, bareissWordsOnly) }},
	{"modular-words", func(m *Matrix) *big.Rat { return viaWords(m, modularWords) }},
	// Bareiss in fixed-width words (n <= fixedMaxN, minors not too wide)
	// and DetWide's cofactors (n <= 3, entries below 2^192).
	{"bareiss-fixed", func(m *Matrix) *big.Rat { return viaIntRows(m, detIntsFixed) }},
	{"cofactors-wide", func(m *Matrix) *big.Rat { return viaIntRows(m, detIntsWide) }},
}

// viaIntRows is det on m's integer rows over their scale, nil where det
// does not apply.
func viaIntRows(m *Matrix, det func([][]*big.Int) (*big.Int, bool)) *big.Rat {
	rows, scale := m.integerRows()
	d, ok := det(rows)
	if !ok {
		return nil
	}
	return new(big.Rat).SetFrac(d, scale)
}

// bareissWordsOnly is Bareiss in words, nil where it overflows.
func bareissWordsOnly(n int, a []int64) *big.Int {
	if d, ok := bareissWords(n, append([]int64(nil), a...)); ok {
		return big.NewInt(d)
	}
	return nil
}

// modularWords is the multi-modular method on words, whatever the size.
func modularWords(n int, a []int64) *big.Int {
	hb, ok := hadamardBits(n, a)
	if !ok {
		return new(big.Int)
	}
	return detModWords(n, a, hb)
}

// viaWords returns det(m) by det on the word rows of m, or nil where m's
// rows do not fit words or det returns nil (the method does not apply).
func viaWords(m *Matrix, det func(n int, a []int64) *big.Int) *big.Rat {
	a, scale, ok := m.wordRows(nil)
	if !ok || m.rows == 0 {
		return nil
	}
	d := det(m.rows, a)
	if d == nil {
		return nil
	}
	if scale == nil {
		scale = big.NewInt(1)
	}
	return new(big.Rat).SetFrac(d, scale)
}

func checkDet(t *testing.T, label string, m *Matrix, want *big.Rat) {
	t.Helper()
	for _, meth := range detMethods {
		if got := meth.f(m); got != nil && got.Cmp(want) != 0 {
			t.Errorf("%s: %s det = %s, want %s", label, meth.name, FormatRat(got), FormatRat(want))
		}
	}
}

// hilbertInvDetOEIS is OEIS A005249 (https://oeis.org/A005249, "Determinant
// of inverse Hilbert matrix"), a(1)..a(10). Typed from memory, then checked
// digit for digit against the stored copy of the OEIS page.
var hilbertInvDetOEIS = []string{
	"1",
	"12",
	"2160",
	"6048000",
	"266716800000",
	"186313420339200000",
	"2067909047925770649600000",
	"365356847125734485878112256000000",
	"1028781784378569697887052962909388800000000",
	"46206893947914691316295628839036278726983680000000000",
}

// superfactorial returns c_n = prod_{i=1}^{n-1} i!.
func superfactorial(n int64) *big.Int {
	c := big.NewInt(1)
	for i := int64(1); i < n; i++ {
		c.Mul(c, new(big.Int).MulRange(1, i))
	}
	return c
}

func TestHilbertDeterminant(t *testing.T) {
	for n := 1; n <= 20; n++ {
		// Closed form det(H_n) = c_n^4 / c_{2n} (Hilbert 1894; Choi, "Tricks
		// or treats with the Hilbert matrix", Amer. Math. Monthly 90 (1983)).
		cn := superfactorial(int64(n))
		want := new(big.Rat).SetFrac(new(big.Int).Exp(cn, big.NewInt(4), nil), superfactorial(int64(2*n)))
		if n <= len(hilbertInvDetOEIS) {
			// OEIS A005249: 1/det(H_n).
			if inv := new(big.Rat).Inv(want); FormatRat(inv) != hilbertInvDetOEIS[n-1] {
				t.Fatalf("closed form gives 1/det(H_%d) = %s, OEIS A005249 says %s", n, FormatRat(inv), hilbertInvDetOEIS[n-1])
			}
		}
		checkDet(t, fmt.Sprintf("H_%d", n), hilbert(n), want)
	}
	// OEIS A005249 formula: a(n+1) = a(n) (2n+1) C(2n,n)^2 (E. Pérez Herrero).
	for n := int64(1); n < 12; n++ {
		a := new(big.Rat).Inv(must(hilbert(int(n)).Det()))
		b := new(big.Rat).Inv(must(hilbert(int(n + 1)).Det()))
		c := binom(2*n, n)
		a.Mul(a, new(big.Rat).SetInt(c.Mul(c, c).Mul(c, big.NewInt(2*n+1))))
		if a.Cmp(b) != 0 {
			t.Errorf("A005249 recurrence fails at n=%d", n)
		}
	}
}

// Vandermonde matrix V_ij = x_i^j (j = 0..n-1) has det prod_{i<j} (x_j - x_i)
// (the standard Vandermonde determinant formula).
func TestVandermonde(t *testing.T) {
	nodeSets := [][]string{
		{"1", "2"},
		{"0", "1", "2"},
		{"1", "2", "3", "4"},
		{"-2", "-1", "0", "1", "2"},
		{"1/2", "1/3", "1/4", "1/5", "1/6"},
		{"-3/7", "5/2", "0", "11/3", "-1", "2/9"},
		{"7", "-7", "1/7", "-1/7", "49", "-1/49", "3"},
		{"1", "-2", "3/4", "-5/6", "7/8", "-9/10", "11/12", "-13/14"},
		{"1000000007/3", "-2", "1/1000000009", "5", "-17/19", "23", "0", "29/31"},
		{"1", "2", "3", "2"},               // repeated node: det 0
		{"1/3", "-1/2", "5", "1/3", "7/5"}, // repeated node
		{"0", "0", "1", "2", "3", "4", "5", "6"},
	}
	for _, nodes := range nodeSets {
		n := len(nodes)
		m := Zeros(n, n)
		want := big.NewRat(1, 1)
		for i, s := range nodes {
			x := q(s)
			p := big.NewRat(1, 1)
			for j := 0; j < n; j++ {
				m.Set(i, j, p)
				p.Mul(p, x)
			}
			for _, s2 := range nodes[i+1:] {
				want.Mul(want, new(big.Rat).Sub(q(s2), x))
			}
		}
		checkDet(t, "Vandermonde "+strings.Join(nodes, ","), m, want)
	}
}

// tridiagonal returns the n x n tridiagonal Toeplitz matrix with a on the
// diagonal, b above and c below.
func tridiagonal(n int, a, b, c *big.Rat) *Matrix {
	m := Zeros(n, n)
	for i := 0; i < n; i++ {
		m.Set(i, i, a)
		if i+1 < n {
			m.Set(i, i+1, b)
			m.Set(i+1, i, c)
		}
	}
	return m
}

func ratPow(x *big.Rat, k int) *big.Rat {
	r := big.NewRat(1, 1)
	for i := 0; i < k; i++ {
		r.Mul(r, x)
	}
	return r
}

// Tridiagonal Toeplitz determinants D_n (Kulkarni, Schmidt, Tsui,
// "Eigenvalues of tridiagonal pseudo-Toeplitz matrices", Linear Algebra
// Appl. 297 (1999); also any linear algebra text):
// D_n = a D_{n-1} - bc D_{n-2}, D_0 = 1, D_1 = a; and in closed form
// D_n = (r1^(n+1) - r2^(n+1)) / (r1 - r2), r1,2 = (a ± sqrt(a^2 - 4bc)) / 2,
// or (n+1) (a/2)^n when a^2 = 4bc.
func TestTridiagonalToeplitz(t *testing.T) {
	tests := []struct {
		a, b, c string
		sqrt    string // sqrt(a^2 - 4bc) if rational, "" to check only the recurrence
		closed  func(n int) *big.Rat
	}{
		// a=2, b=c=-1 (the discrete Laplacian): D_n = n+1.
		{"2", "-1", "-1", "0", func(n int) *big.Rat { return big.NewRat(int64(n+1), 1) }},
		{"2", "1", "1", "0", nil},
		{"1", "1/2", "1/2", "0", nil},
		{"-4", "2", "2", "0", nil},
		{"6", "-9", "-1", "0", nil},
		{"5", "2", "2", "3", nil},       // roots 4, 1
		{"1", "-2", "1", "3", nil},      // roots 2, -1
		{"0", "1", "-1", "2", nil},      // roots 1, -1
		{"5/6", "1/6", "1", "1/6", nil}, // roots 1/2, 1/3
		{"-7/3", "2/3", "-5/4", "", nil},
		{"3/2", "-2/5", "7/11", "", nil},
		{"1", "1", "1", "", nil},
	}
	for _, tt := range tests {
		a, b, c := q(tt.a), q(tt.b), q(tt.c)
		bc := new(big.Rat).Mul(b, c)
		prev, cur := big.NewRat(1, 1), new(big.Rat).Set(a) // D_0, D_1
		for n := 1; n <= 24; n++ {
			label := fmt.Sprintf("tridiagonal a=%s b=%s c=%s n=%d", tt.a, tt.b, tt.c, n)
			m := tridiagonal(n, a, b, c)
			checkDet(t, label, m, cur)
			if tt.closed != nil && tt.closed(n).Cmp(cur) != 0 {
				t.Errorf("%s: recurrence %s, closed form %s", label, FormatRat(cur), FormatRat(tt.closed(n)))
			}
			if tt.sqrt != "" {
				s := q(tt.sqrt)
				if disc := new(big.Rat).Sub(new(big.Rat).Mul(a, a), new(big.Rat).Mul(big.NewRat(4, 1), bc)); new(big.Rat).Mul(s, s).Cmp(disc) != 0 {
					t.Fatalf("%s: %s is not sqrt(a^2-4bc)", label, tt.sqrt)
				}
				var want *big.Rat
				if s.Sign() == 0 {
					want = ratPow(new(big.Rat).Quo(a, big.NewRat(2, 1)), n)
					want.Mul(want, big.NewRat(int64(n+1), 1))
				} else {
					r1 := new(big.Rat).Quo(new(big.Rat).Add(a, s), big.NewRat(2, 1))
					r2 := new(big.Rat).Quo(new(big.Rat).Sub(a, s), big.NewRat(2, 1))
					want = new(big.Rat).Sub(ratPow(r1, n+1), ratPow(r2, n+1))
					want.Quo(want, new(big.Rat).Sub(r1, r2))
				}
				if want.Cmp(cur) != 0 {
					t.Errorf("%s: det %s, closed form %s", label, FormatRat(cur), FormatRat(want))
				}
			}
			next := new(big.Rat).Mul(a, cur)
			prev, cur = cur, next.Sub(next, new(big.Rat).Mul(bc, prev))
		}
	}
}

// detLeibniz is the definition of the determinant (Leibniz formula): the
// sum over permutations of signed products. Small n only.
func detLeibniz(m *Matrix) *big.Rat {
	n := m.Rows()
	sum := new(big.Rat)
	perm := make([]int, n)
	used := make([]bool, n)
	var rec func(i int, sign int, prod *big.Rat)
	rec = func(i int, sign int, prod *big.Rat) {
		if i == n {
			if sign < 0 {
				sum.Sub(sum, prod)
			} else {
				sum.Add(sum, prod)
			}
			return
		}
		for j := 0; j < n; j++ {
			if used[j] {
				continue
			}
			// sign flips once per earlier-placed larger value (inversions)
			s := sign
			for k := 0; k < i; k++ {
				if perm[k] > j {
					s = -s
				}
			}
			used[j], perm[i] = true, j
			rec(i+1, s, new(big.Rat).Mul(prod, m.at(i, j)))
			used[j] = false
		}
	}
	rec(0, 1, big.NewRat(1, 1))
	return sum
}

// Against the Leibniz formula (definition of det) on awkward inputs:
// zero diagonal (pivoting), singular, zero rows and columns, huge and tiny
// entries, integers, and 64-bit numerators and denominators.
func TestDetAgainstLeibniz(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	big1 := new(big.Int).Lsh(big.NewInt(1), 200)
	var cases []*Matrix
	for n := 1; n <= 7; n++ {
		cases = append(cases,
			randomMatrix(rng, n, n, 9),
			randomMatrix(rng, n, n, 1<<40),
			randomRatMatrix(n, int64(n)),
			randomIntMatrix(n, int64(n), 3),
		)
		m := randomMatrix(rng, n, n, 5)
		for i := 0; i < n; i++ {
			m.Set(i, i, new(big.Rat)) // zero diagonal forces row swaps
		}
		cases = append(cases, m)
		if n > 1 {
			s := randomMatrix(rng, n, n, 5)
			for j := 0; j < n; j++ { // last row = sum of the others: singular
				sum := new(big.Rat)
				for i := 0; i < n-1; i++ {
					sum.Add(sum, s.at(i, j))
				}
				s.Set(n-1, j, sum)
			}
			z := randomMatrix(rng, n, n, 5)
			z.Set(n-1, 0, nil)
			for i := 0; i < n; i++ {
				z.Set(i, n-1, nil) // zero column
			}
			h := randomMatrix(rng, n, n, 5) // multi-word entries
			for i := 0; i < n; i++ {
				x := new(big.Rat).SetFrac(new(big.Int).Add(big1, big.NewInt(int64(i))), big.NewInt(3))
				h.Set(i, (i+1)%n, x)
				h.Set(i, i, new(big.Rat).SetFrac(big.NewInt(int64(i+1)), new(big.Int).Sub(big1, big.NewInt(1))))
			}
			cases = append(cases, s, z, h)
		}
	}
	cases = append(cases, Zeros(4, 4), Identity(6))
	for k, m := range cases {
		checkDet(t, fmt.Sprintf("case %d (%dx%d)", k, m.Rows(), m.Rows()), m, detLeibniz(m))
	}
}

// The modular method must skip primes that divide a denominator: use the
// first primes it would pick as denominators.
func TestDetModularSkipsPrimes(t *testing.T) {
	ms := moduli(3)
	rng := rand.New(rand.NewSource(3))
	for n := 1; n <= 6; n++ {
		m := randomMatrix(rng, n, n, 100)
		for i := 0; i < n; i++ {
			p := new(big.Int).SetUint64(ms[i%3].p)
			m.Set(i, (i*2)%n, new(big.Rat).SetFrac(big.NewInt(int64(i+1)), p))
		}
		checkDet(t, fmt.Sprintf("prime denominators n=%d", n), m, detLeibniz(m))
	}
}

// Standard theorems, on random rationals: det(AB) = det(A) det(B),
// det(A^T) = det(A), det(sA) = s^n det(A), det(A^-1) = 1/det(A), and
// swapping two rows negates det.
func TestDetTheorems(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	for n := 1; n <= 12; n++ {
		a, b := randomMatrix(rng, n, n, 20), randomMatrix(rng, n, n, 1<<30)
		da, db := mustDet(t, a), mustDet(t, b)
		if got := mustDet(t, mustMul(t, a, b)); got.Cmp(new(big.Rat).Mul(da, db)) != 0 {
			t.Errorf("n=%d: det(AB) != det(A) det(B)", n)
		}
		if got := mustDet(t, a.Transpose()); got.Cmp(da) != 0 {
			t.Errorf("n=%d: det(A^T) != det(A)", n)
		}
		s := q("-7/3")
		if got := mustDet(t, a.Scale(s)); got.Cmp(new(big.Rat).Mul(ratPow(s, n), da)) != 0 {
			t.Errorf("n=%d: det(sA) != s^n det(A)", n)
		}
		if da.Sign() != 0 {
			inv, err := a.Inverse()
			if err != nil {
				t.Fatal(err)
			}
			if got := mustDet(t, inv); got.Cmp(new(big.Rat).Inv(da)) != 0 {
				t.Errorf("n=%d: det(A^-1) != 1/det(A)", n)
			}
		}
		if n > 1 {
			rows := make([]int, n)
			for i := range rows {
				rows[i] = i
			}
			rows[0], rows[n-1] = rows[n-1], rows[0]
			cols := make([]int, n)
			for i := range cols {
				cols[i] = i
			}
			swapped, _ := a.Submatrix(rows, cols)
			if got := mustDet(t, swapped); got.Cmp(new(big.Rat).Neg(da)) != 0 {
				t.Errorf("n=%d: row swap does not negate det", n)
			}
		}
	}
}

func TestDetErrors(t *testing.T) {
	m := Zeros(2, 3)
	_, err := m.Det()
	if !errors.Is(err, ErrNotSquare) {
		t.Fatalf("det of 2x3: error %v, want ErrNotSquare", err)
	}
	if !strings.Contains(err.Error(), "det needs a square matrix, got 2x3") {
		t.Errorf("det of 2x3: message %q", err)
	}
	if d := mustDet(t, Zeros(0, 0)); d.Cmp(q("1")) != 0 {
		t.Errorf("det of 0x0 = %s, want 1 (empty product)", FormatRat(d))
	}
}

// BenchmarkDetSmallWide times Det below modularMinSize on matrices whose
// rows do not clear into words: integers of about 100 bits (which DetWide
// and the fixed-width Bareiss take) and random rationals of 63-bit parts
// (whose cleared rows are too wide for either, so big.Int Bareiss).
func BenchmarkDetSmallWide(b *testing.B) {
	for n := 3; n < modularMinSize; n++ {
		rng := rand.New(rand.NewSource(int64(n)))
		ints := Zeros(n, n)
		for i := range ints.e {
			x := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), 100))
			if rng.Intn(2) == 0 {
				x.Neg(x)
			}
			ints.e[i].SetInt(x)
		}
		for _, c := range []struct {
			name string
			m    *Matrix
		}{{"int100", ints}, {"rat63", randomRatMatrix(n, int64(n))}} {
			b.Run(fmt.Sprintf("n=%d/%s", n, c.name), func(b *testing.B) {
				bestOf(b, func() { must(c.m.Det()) })
			})
		}
	}
}

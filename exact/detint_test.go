package exact

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// intMatrix returns the n x n matrix with entries f(i, j).
func intMatrix(n int, f func(i, j int) int64) *Matrix {
	m := Zeros(n, n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			m.at(i, j).SetInt64(f(i, j))
		}
	}
	return m
}

// checkDetInts checks every method of detMethods and DetInts on m against
// want.
func checkDetInts(t *testing.T, label string, m *Matrix, want *big.Rat) {
	t.Helper()
	checkDet(t, label, m, want)
	rows := make([][]*big.Int, m.rows)
	for i := range rows {
		for j := 0; j < m.cols; j++ {
			rows[i] = append(rows[i], new(big.Int).Set(m.at(i, j).Num()))
		}
	}
	got, err := DetInts(rows)
	if err != nil || new(big.Rat).SetInt(got).Cmp(want) != 0 {
		t.Errorf("%s: DetInts = %v, %v; want %s", label, got, err, FormatRat(want))
	}
}

// Entries at and near the ends of the int64 range, where every product of
// Bareiss's elimination in words overflows a word: the word route must
// notice and the modular route must agree with the definition (Leibniz
// formula, in math/big) and with Gaussian elimination over big.Rat.
func TestDetWordsNearOverflow(t *testing.T) {
	rng := rand.New(rand.NewSource(20))
	near := func() int64 {
		switch rng.Intn(5) {
		case 0:
			return math.MaxInt64 - rng.Int63n(1000)
		case 1:
			return math.MinInt64 + rng.Int63n(1000)
		case 2:
			return math.MinInt64
		case 3:
			return rng.Int63n(7) - 3
		}
		return int64(rng.Uint64())
	}
	for n := 2; n <= 6; n++ {
		for trial := 0; trial < 6; trial++ {
			m := intMatrix(n, func(i, j int) int64 { return near() })
			checkDetInts(t, fmt.Sprintf("near 2^63, n=%d #%d", n, trial), m, detLeibniz(m))
		}
	}
	for _, n := range []int{8, 12, 16} {
		m := intMatrix(n, func(i, j int) int64 { return near() })
		checkDetInts(t, fmt.Sprintf("near 2^63, n=%d", n), m, m.detGaussRat())
	}
	// Bareiss in words: the quotients fit, but the products before the
	// division need the 128 bits (entries ~2^40, minors of order 2 ~2^81
	// would not fit, so the elimination must stop there or be exact).
	m := intMatrix(3, func(i, j int) int64 { return int64(1)<<40 + int64(i*7+j*j) })
	checkDetInts(t, "2^40 + small", m, detLeibniz(m))
}

// Sylvester's Hadamard matrices (Sylvester 1867: H_1 = [1], H_2n =
// [[H, H], [H, −H]]) meet Hadamard's bound with equality: |det H_n| =
// n^(n/2) (Hadamard 1893). By det(A⊗B) = det(A)^m det(B)^n (A n x n, B
// m x m; Horn and Johnson, Topics in Matrix Analysis, 4.2.1), det H_2 = −2
// and det H_n > 0 for n >= 4. Scaled by c, det(c H_n) = c^n n^(n/2), and
// as c runs through 2^e − 1 and 2^e the determinant crosses every
// boundary between numbers of primes: the tight case of the bound the
// modular route sizes its primes by.
func TestDetWordsHadamardBound(t *testing.T) {
	for _, n := range []int{2, 4, 8, 16} {
		h := sylvester(n)
		for e := 0; e < 63; e++ {
			for _, c := range []int64{int64(1)<<e - 1, int64(1) << e} {
				if c == 0 || n == 2 && e < 62 && e%5 != 0 {
					continue
				}
				m := intMatrix(n, func(i, j int) int64 { return c * h[i][j] })
				want := new(big.Int).Exp(big.NewInt(c), big.NewInt(int64(n)), nil)
				want.Mul(want, new(big.Int).Exp(big.NewInt(int64(n)), big.NewInt(int64(n/2)), nil))
				if n == 2 {
					want.Neg(want)
				}
				checkDetInts(t, fmt.Sprintf("%d * H_%d", c, n), m, new(big.Rat).SetInt(want))
			}
		}
	}
}

func sylvester(n int) [][]int64 {
	h := [][]int64{{1}}
	for len(h) < n {
		k := len(h)
		g := make([][]int64, 2*k)
		for i := range g {
			g[i] = make([]int64, 2*k)
			for j := range g[i] {
				x := h[i%k][j%k]
				if i >= k && j >= k {
					x = -x
				}
				g[i][j] = x
			}
		}
		h = g
	}
	return h
}

// Singular matrices, and one singular modulo the first prime the modular
// route uses but not over the integers: each against the definition.
func TestDetWordsSingular(t *testing.T) {
	rng := rand.New(rand.NewSource(21))
	for n := 2; n <= 6; n++ {
		m := intMatrix(n, func(i, j int) int64 { return rng.Int63n(1<<61) - 1<<60 })
		for j := 0; j < n; j++ { // last row = first + second: rank n−1
			m.at(n-1, j).Add(m.at(0, j), m.at(1%n, j))
		}
		if n == 2 {
			m = intMatrix(2, func(i, j int) int64 { return 1 << 62 })
		}
		checkDetInts(t, fmt.Sprintf("rank-deficient n=%d", n), m, detLeibniz(m))
		z := intMatrix(n, func(i, j int) int64 { return rng.Int63() })
		for j := 0; j < n; j++ {
			z.at(n/2, j).SetInt64(0) // a zero row
		}
		checkDetInts(t, fmt.Sprintf("zero row n=%d", n), z, detLeibniz(z))
	}
	p := int64(moduli(1)[0].p)
	for n := 2; n <= 5; n++ {
		m := intMatrix(n, func(i, j int) int64 {
			if i == j {
				return 1
			}
			return 0
		})
		m.at(0, 0).SetInt64(p)
		m.at(n-1, 0).SetInt64(p - 1)
		checkDetInts(t, fmt.Sprintf("p I, n=%d", n), m, detLeibniz(m))
	}
}

// Rational rows whose denominators clear into words take the word route;
// Det must agree with the big.Rat elimination, and with the definition
// where it is cheap.
func TestDetWordRows(t *testing.T) {
	rng := rand.New(rand.NewSource(22))
	for n := 2; n <= 20; n++ {
		m := randomMatrix(rng, n, n, 1000)
		if _, _, ok := m.wordRows(nil); !ok && n <= 5 { // lcm of 5 numbers <= 1000 < 2^50
			t.Fatalf("n=%d: small rationals should fit words", n)
		}
		want := m.detGaussRat()
		if n <= 6 {
			want = detLeibniz(m)
		}
		checkDet(t, fmt.Sprintf("small rationals n=%d", n), m, want)
	}
	// A product of row multipliers beyond a word, and a multiplier that
	// does not fit (no word route).
	m := intMatrix(3, func(i, j int) int64 { return int64(i + 2*j + 1) })
	m.at(0, 0).SetFrac64(1, 1<<40)
	m.at(1, 1).SetFrac64(3, 1<<41-1)
	m.at(2, 2).SetFrac64(5, 1<<43+7)
	checkDet(t, "wide multipliers", m, detLeibniz(m))
	m.at(0, 1).SetFrac64(1, 1<<40-3)
	if _, _, ok := m.wordRows(nil); ok {
		t.Errorf("lcm(2^40, 2^40-3) does not fit a word")
	}
	checkDet(t, "no word route", m, detLeibniz(m))
}

func TestDetIntsShape(t *testing.T) {
	if d, err := DetInts(nil); err != nil || d.Cmp(big.NewInt(1)) != 0 {
		t.Errorf("DetInts of 0x0 = %v, %v; want 1", d, err)
	}
	_, err := DetInts([][]*big.Int{{big.NewInt(1), big.NewInt(2)}})
	if !errors.Is(err, ErrNotSquare) {
		t.Errorf("1x2: err = %v, want ErrNotSquare", err)
	}
	big2 := new(big.Int).Lsh(big.NewInt(1), 100)
	d, err := DetInts([][]*big.Int{{big2, big.NewInt(1)}, {big.NewInt(3), big2}})
	want := new(big.Int).Sub(new(big.Int).Mul(big2, big2), big.NewInt(3))
	if err != nil || d.Cmp(want) != 0 {
		t.Errorf("2^100 entries: %v, %v; want %v", d, err, want)
	}
}

// Where Hadamard's bound is below 2^62, every minor fits a word (each is
// bounded by the product of its rows' norms, and no row is zero), so
// Bareiss in words must finish, whatever the signs and powers of two of
// its pivots; its value is checked against the definition.
func TestBareissWordsWithinBound(t *testing.T) {
	rng := rand.New(rand.NewSource(23))
	for trial := 0; trial < 300; trial++ {
		n := 2 + trial%5
		e := int64(1) << (60/n - 1)
		m := intMatrix(n, func(i, j int) int64 { return (rng.Int63n(2*e+1) - e) << rng.Intn(2) })
		a, _, _ := m.wordRows(nil)
		if hb, ok := hadamardBits(n, a); !ok || hb/2 >= 62 {
			continue
		}
		d, ok := bareissWords(n, a)
		if !ok {
			t.Fatalf("%v: Bareiss in words gave up within Hadamard's bound", m)
		}
		if want := detLeibniz(m); want.Cmp(new(big.Rat).SetInt64(d)) != 0 {
			t.Fatalf("%v: det %d, want %s", m, d, FormatRat(want))
		}
	}
}

// Bareiss in fixed widths of words (detIntsFixed) must take every matrix
// of order <= fixedMaxN whose minors' Hadamard bound fits fixedMaxWords
// words, and agree with the definition (Leibniz formula in math/big):
// entries of every width up to 4 words and near ±2^63, ±2^64, ±2^127,
// Sylvester's Hadamard matrices scaled past a word (they meet the bound
// the widths come from), matrices of rank n−1 and with a zero row.
func TestDetIntsFixed(t *testing.T) {
	rng := rand.New(rand.NewSource(24))
	entry := func(bits int) *big.Int {
		x := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(bits)))
		switch rng.Intn(6) {
		case 0: // ±2^e and its neighbours
			e := []uint{61, 62, 63, 64, 127, 128}[rng.Intn(6)]
			x.Lsh(big.NewInt(1), e).Add(x, big.NewInt(rng.Int63n(3)-1))
		case 1:
			x.SetInt64(rng.Int63n(5) - 2)
		}
		if rng.Intn(2) == 0 {
			x.Neg(x)
		}
		return x
	}
	// Orders times entry bits up to 800 keep the bound of every minor
	// below 2^(64 fixedMaxWords − 1) (n (2b + 3) / 2 + 1 < 1023).
	check := func(label string, rows [][]*big.Int, mustTake bool) {
		t.Helper()
		m := Zeros(len(rows), len(rows))
		for i, r := range rows {
			for j, x := range r {
				m.at(i, j).SetInt(x)
			}
		}
		want := detLeibniz(m)
		got, ok := detIntsFixed(rows)
		if !ok && mustTake {
			t.Fatalf("%s: detIntsFixed did not take %v", label, m)
		}
		if ok && new(big.Rat).SetInt(got).Cmp(want) != 0 {
			t.Fatalf("%s: detIntsFixed = %v, want %s", label, got, FormatRat(want))
		}
		checkDetInts(t, label, m, want)
	}
	random := func(n, bits int) [][]*big.Int {
		rows := make([][]*big.Int, n)
		for i := range rows {
			for j := 0; j < n; j++ {
				rows[i] = append(rows[i], entry(bits))
			}
		}
		return rows
	}
	for n := 1; n <= fixedMaxN; n++ {
		for _, b := range []int{3, 40, 63, 64, 65, 100, 128, 200, 256} {
			for trial := 0; trial < 4; trial++ {
				rows := random(n, b)
				take := n*b <= 800
				check(fmt.Sprintf("n=%d, %d bits #%d", n, b, trial), rows, take)
				if n >= 2 { // rank n−1: last row = first − second
					for j := range rows[n-1] {
						rows[n-1][j] = new(big.Int).Sub(rows[0][j], rows[1][j])
					}
					check(fmt.Sprintf("rank %d, %d bits #%d", n-1, b, trial), rows, take)
				}
				rows[rng.Intn(n)] = random(1, 1)[0]
				for j := range rows[0] {
					rows[0][j] = new(big.Int)
				}
				check(fmt.Sprintf("zero row, n=%d, %d bits", n, b), rows, true)
			}
		}
	}
	for _, n := range []int{1, 2, 4} {
		h := sylvester(n)
		for _, e := range []uint{62, 63, 64, 127, 128, 200, 300} {
			for _, dc := range []int64{-1, 0, 1} {
				c := new(big.Int).Lsh(big.NewInt(1), e)
				c.Add(c, big.NewInt(dc))
				rows := make([][]*big.Int, n)
				for i := range rows {
					for j := 0; j < n; j++ {
						rows[i] = append(rows[i], new(big.Int).Mul(c, big.NewInt(h[i][j])))
					}
				}
				check(fmt.Sprintf("(2^%d%+d) H_%d", e, dc, n), rows, n*int(e) <= 800)
			}
		}
	}
	// Beyond its limits it declines: order 7, and minors past
	// fixedMaxWords words.
	if _, ok := detIntsFixed(random(fixedMaxN+1, 10)); ok {
		t.Errorf("order %d taken", fixedMaxN+1)
	}
	if _, ok := detIntsFixed(random(fixedMaxN, 64*fixedMaxWords/fixedMaxN+64)); ok {
		t.Errorf("entries past the width taken")
	}
}

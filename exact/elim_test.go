package exact

import (
	"errors"
	"fmt"
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

// Inverse of the Hilbert matrix against the closed form (Choi, "Tricks or
// treats with the Hilbert matrix", Amer. Math. Monthly 90 (1983)):
// (H^-1)_ij = (-1)^(i+j) (i+j-1) C(n+i-1, n-j) C(n+j-1, n-i) C(i+j-2, i-1)^2.
// The same paper notes that H^-1 has integer entries summing to n^2.
func TestHilbertInverse(t *testing.T) {
	for n := 1; n <= 12; n++ {
		h := hilbert(n)
		inv, err := h.Inverse()
		if err != nil {
			t.Fatalf("H_%d: %v", n, err)
		}
		sum := new(big.Rat)
		for i := 1; i <= n; i++ {
			for j := 1; j <= n; j++ {
				ii, jj, nn := int64(i), int64(j), int64(n)
				c := binom(ii+jj-2, ii-1)
				w := new(big.Int).Mul(big.NewInt(ii+jj-1), binom(nn+ii-1, nn-jj))
				w.Mul(w, binom(nn+jj-1, nn-ii)).Mul(w, c).Mul(w, c)
				if (i+j)%2 == 1 {
					w.Neg(w)
				}
				got := inv.At(i-1, j-1)
				if !got.IsInt() {
					t.Errorf("H_%d^-1 (%d,%d) = %s is not an integer", n, i, j, FormatRat(got))
				}
				if got.Cmp(new(big.Rat).SetInt(w)) != 0 {
					t.Errorf("H_%d^-1 (%d,%d) = %s, closed form %s", n, i, j, FormatRat(got), w)
				}
				sum.Add(sum, got)
			}
		}
		if sum.Cmp(big.NewRat(int64(n*n), 1)) != 0 {
			t.Errorf("H_%d^-1 entries sum to %s, want %d", n, FormatRat(sum), n*n)
		}
		if p := mustMul(t, h, inv); !p.Equal(Identity(n)) {
			t.Errorf("H_%d H_%d^-1 != I", n, n)
		}
	}
}

// Rank of matrices whose rank is known by construction or by hand: the
// identity, the zero matrix, an outer product u v^T (rank 1), the textbook
// [[1,2,3],[4,5,6],[7,8,9]] (rows in arithmetic progression: rank 2),
// echelon-like patterns, and Hilbert matrices (non-singular, det from the
// closed form). Rank of the transpose must agree (row rank = column rank).
func TestRank(t *testing.T) {
	tests := []struct {
		m    *Matrix
		want int
	}{
		{Identity(5), 5},
		{Zeros(3, 4), 0},
		{Zeros(0, 0), 0},
		{mustMatrix(t, []string{"1", "2", "3"}, []string{"4", "5", "6"}, []string{"7", "8", "9"}), 2},
		{mustMatrix(t, []string{"1/2", "1/3"}, []string{"1/3", "1/4"}), 2},
		{mustMatrix(t, []string{"0", "0", "1"}, []string{"0", "0", "2"}), 1},
		{mustMatrix(t, []string{"0", "1", "0", "3"}, []string{"0", "0", "0", "1"}, []string{"0", "2", "0", "7"}), 2},
		{hilbert(9), 9},
	}
	u := mustMatrix(t, []string{"1/2"}, []string{"-3"}, []string{"5/7"}, []string{"0"})
	v := mustMatrix(t, []string{"2", "-1/9", "4", "13/2", "0"})
	tests = append(tests, struct {
		m    *Matrix
		want int
	}{mustMul(t, u, v), 1})
	for k, tt := range tests {
		if got := tt.m.Rank(); got != tt.want {
			t.Errorf("case %d: rank %d, want %d", k, got, tt.want)
		}
		if got := tt.m.Transpose().Rank(); got != tt.want {
			t.Errorf("case %d: rank of transpose %d, want %d", k, got, tt.want)
		}
	}
}

// Rank–nullity theorem (rank + dim null space = number of columns), and
// m N = 0 for the null space basis N, with N in reduced echelon form: the
// rows of the free variables form an identity.
func TestNullspace(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	var cases []*Matrix
	for _, d := range [][3]int{{3, 2, 5}, {4, 4, 4}, {5, 1, 6}, {2, 3, 7}, {6, 5, 8}, {1, 1, 1}, {3, 3, 3}} {
		a := randomMatrix(rng, d[0], d[1], 9)
		b := randomMatrix(rng, d[1], d[2], 9)
		cases = append(cases, mustMul(t, a, b))
	}
	cases = append(cases, Zeros(3, 4), Identity(4), hilbert(5), mustMatrix(t, []string{"1", "2", "3"}, []string{"4", "5", "6"}, []string{"7", "8", "9"}))
	for k, m := range cases {
		nm := m.Nullspace()
		if nm.Rows() != m.Cols() {
			t.Fatalf("case %d: null space basis has %d rows, want %d", k, nm.Rows(), m.Cols())
		}
		if r := m.Rank(); r+nm.Cols() != m.Cols() {
			t.Errorf("case %d: rank %d + nullity %d != %d columns", k, r, nm.Cols(), m.Cols())
		}
		if !mustMul(t, m, nm).IsZero() {
			t.Errorf("case %d: m N != 0", k)
		}
		if nm.Cols() > 0 && nm.Rank() != nm.Cols() {
			t.Errorf("case %d: null space basis is not independent", k)
		}
	}
	// Worked by hand: x - 2y + z = 0 is the null space of [[1,2,3],[4,5,6],[7,8,9]];
	// the basis with free variable z = 1 is (1, -2, 1).
	n := mustMatrix(t, []string{"1", "2", "3"}, []string{"4", "5", "6"}, []string{"7", "8", "9"}).Nullspace()
	if want := mustMatrix(t, []string{"1"}, []string{"-2"}, []string{"1"}); !n.Equal(want) {
		t.Errorf("null space of [[1,2,3],[4,5,6],[7,8,9]] = %v, want %v", n, want)
	}
	// Worked by hand: for [[0,1,0,3],[0,0,0,1]] the free variables are
	// x1 and x3, giving basis columns e1 and e3.
	n = mustMatrix(t, []string{"0", "1", "0", "3"}, []string{"0", "0", "0", "1"}).Nullspace()
	if want := mustMatrix(t, []string{"1", "0"}, []string{"0", "0"}, []string{"0", "1"}, []string{"0", "0"}); !n.Equal(want) {
		t.Errorf("null space = %v, want %v", n, want)
	}
	if n := Identity(3).Nullspace(); n.Rows() != 3 || n.Cols() != 0 {
		t.Errorf("null space of I_3 is %dx%d, want 3x0", n.Rows(), n.Cols())
	}
}

// Solve against Inverse times b, and m x = b.
func TestSolve(t *testing.T) {
	rng := rand.New(rand.NewSource(9))
	for n := 1; n <= 9; n++ {
		for _, k := range []int{1, 3} {
			m := randomMatrix(rng, n, n, 50)
			b := randomMatrix(rng, n, k, 50)
			x, err := m.Solve(b)
			if err != nil {
				if errors.Is(err, ErrSingular) && m.Rank() < n {
					continue
				}
				t.Fatal(err)
			}
			inv, err := m.Inverse()
			if err != nil {
				t.Fatal(err)
			}
			if !x.Equal(mustMul(t, inv, b)) {
				t.Errorf("n=%d: Solve != Inverse * b", n)
			}
			if !mustMul(t, m, x).Equal(b) {
				t.Errorf("n=%d: m x != b", n)
			}
			if !mustMul(t, inv, m).Equal(Identity(n)) {
				t.Errorf("n=%d: m^-1 m != I", n)
			}
		}
	}
}

func TestSolveErrors(t *testing.T) {
	sing := mustMatrix(t, []string{"1", "2", "3"}, []string{"4", "5", "6"}, []string{"7", "8", "9"})
	_, err := sing.Inverse()
	if !errors.Is(err, ErrSingular) {
		t.Fatalf("inverse of singular: error %v, want ErrSingular", err)
	}
	if !strings.Contains(err.Error(), "matrix is singular (rank 2 of 3)") {
		t.Errorf("inverse of singular: message %q does not give the rank", err)
	}
	if _, err := sing.Solve(Identity(3)); !errors.Is(err, ErrSingular) {
		t.Errorf("solve with singular: error %v, want ErrSingular", err)
	}
	if _, err := Zeros(2, 3).Inverse(); !errors.Is(err, ErrNotSquare) {
		t.Errorf("inverse of 2x3: error %v, want ErrNotSquare", err)
	}
	if _, err := Zeros(2, 3).Solve(Zeros(2, 1)); !errors.Is(err, ErrNotSquare) {
		t.Errorf("solve with 2x3: error %v, want ErrNotSquare", err)
	}
	_, err = Identity(3).Solve(Zeros(2, 1))
	if !errors.Is(err, ErrShape) {
		t.Errorf("solve with 2-row b: error %v, want ErrShape", err)
	} else if !strings.Contains(err.Error(), "3x3") || !strings.Contains(err.Error(), "2x1") {
		t.Errorf("solve shape message %q lacks the shapes", err)
	}
	if _, err := Zeros(3, 3).Inverse(); !errors.Is(err, ErrSingular) || !strings.Contains(err.Error(), "rank 0 of 3") {
		t.Errorf("inverse of zero: error %v", err)
	}
}

// Power: the Fibonacci Q-matrix [[1,1],[1,0]]^k = [[F(k+1),F(k)],[F(k),F(k-1)]]
// (standard identity; F = OEIS A000045), negative powers through the
// inverse, and A^j A^k = A^(j+k).
func TestPower(t *testing.T) {
	qm := mustMatrix(t, []string{"1", "1"}, []string{"1", "0"})
	fib := []int64{0, 1, 1, 2, 3, 5, 8, 13, 21, 34, 55, 89, 144, 233, 377, 610, 987} // A000045
	for k := 1; k+1 < len(fib); k++ {
		p, err := qm.Power(k)
		if err != nil {
			t.Fatal(err)
		}
		want := Zeros(2, 2)
		want.Set(0, 0, big.NewRat(fib[k+1], 1))
		want.Set(0, 1, big.NewRat(fib[k], 1))
		want.Set(1, 0, big.NewRat(fib[k], 1))
		want.Set(1, 1, big.NewRat(fib[k-1], 1))
		if !p.Equal(want) {
			t.Errorf("Q^%d = %v, want %v", k, p, want)
		}
	}
	rng := rand.New(rand.NewSource(13))
	a := randomMatrix(rng, 4, 4, 5)
	for j := -3; j <= 3; j++ {
		for k := -3; k <= 3; k++ {
			pj, err1 := a.Power(j)
			pk, err2 := a.Power(k)
			pjk, err3 := a.Power(j + k)
			if err1 != nil || err2 != nil || err3 != nil {
				t.Fatal(err1, err2, err3)
			}
			if !mustMul(t, pj, pk).Equal(pjk) {
				t.Errorf("A^%d A^%d != A^%d", j, k, j+k)
			}
		}
	}
	if p, _ := a.Power(0); !p.Equal(Identity(4)) {
		t.Error("A^0 != I")
	}
	if _, err := Zeros(2, 3).Power(2); !errors.Is(err, ErrNotSquare) {
		t.Errorf("power of 2x3: %v", err)
	}
	if _, err := Zeros(2, 2).Power(-1); !errors.Is(err, ErrSingular) {
		t.Errorf("negative power of singular: %v", err)
	}
}

// Bareiss elimination (Rank) and rational Gauss–Jordan (Nullspace, Solve)
// must find the same pivot columns, on random low-rank matrices with many
// zeros.
func TestPivotsAgree(t *testing.T) {
	rng := rand.New(rand.NewSource(17))
	for k := 0; k < 200; k++ {
		r, inner, c := 1+rng.Intn(6), 1+rng.Intn(4), 1+rng.Intn(6)
		m := mustMul(t, randomMatrix(rng, r, inner, 1), randomMatrix(rng, inner, c, 1))
		rows, _ := m.integerRows()
		p1, _ := fractionFree(rows)
		p2 := gaussJordan(m.ratRows(nil), c)
		if fmt.Sprint(p1) != fmt.Sprint(p2) {
			t.Errorf("%v: Bareiss pivots %v, Gauss-Jordan pivots %v", m, p1, p2)
		}
	}
}

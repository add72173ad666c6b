package exact

import (
	"errors"
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

func TestNewMatrixErrors(t *testing.T) {
	r := func(vals ...int64) []*big.Rat {
		out := make([]*big.Rat, len(vals))
		for i, v := range vals {
			out[i] = big.NewRat(v, 1)
		}
		return out
	}
	tests := []struct {
		rows [][]*big.Rat
		msg  string
	}{
		{nil, "no rows"},
		{[][]*big.Rat{}, "no rows"},
		{[][]*big.Rat{{}}, "row 1 is empty"},
		{[][]*big.Rat{r(1, 2), r(3)}, "row 2 has length 1, row 1 has length 2"},
		{[][]*big.Rat{r(1, 2), r(3, 4), r(5, 6, 7)}, "row 3 has length 3, row 1 has length 2"},
	}
	for _, tt := range tests {
		_, err := NewMatrix(tt.rows)
		if !errors.Is(err, ErrShape) {
			t.Errorf("NewMatrix(%v): error %v, want ErrShape", tt.rows, err)
			continue
		}
		if !strings.Contains(err.Error(), tt.msg) {
			t.Errorf("NewMatrix(%v): message %q lacks %q", tt.rows, err, tt.msg)
		}
	}
}

// Entries are copied in and out: changing the caller's values must not
// change the matrix.
func TestCopySemantics(t *testing.T) {
	x := big.NewRat(1, 2)
	m, err := NewMatrix([][]*big.Rat{{x, nil}})
	if err != nil {
		t.Fatal(err)
	}
	x.SetInt64(9)
	if m.At(0, 0).Cmp(q("1/2")) != 0 || m.At(0, 1).Sign() != 0 {
		t.Errorf("NewMatrix did not copy: %v", m)
	}
	m.At(0, 0).SetInt64(7)
	m.Row(0)[0].SetInt64(7)
	m.Col(0)[0].SetInt64(7)
	if m.At(0, 0).Cmp(q("1/2")) != 0 {
		t.Error("At/Row/Col returned shared values")
	}
	y := big.NewRat(3, 1)
	m.Set(0, 1, y)
	y.SetInt64(4)
	if m.At(0, 1).Cmp(q("3")) != 0 {
		t.Error("Set did not copy")
	}
	c := m.Clone()
	c.Set(0, 0, q("5"))
	if m.At(0, 0).Cmp(q("1/2")) != 0 {
		t.Error("Clone shares entries")
	}
	defer func() {
		if recover() == nil {
			t.Error("At out of range did not panic")
		}
	}()
	m.At(1, 0)
}

// Arithmetic worked by hand on 2x2 examples.
func TestArithmetic(t *testing.T) {
	a := mustMatrix(t, []string{"1", "2"}, []string{"3/4", "-5"})
	b := mustMatrix(t, []string{"1/2", "0"}, []string{"-1", "1/3"})
	if got := a.String(); got != "[[1, 2], [3/4, -5]]" {
		t.Errorf("String = %q", got)
	}
	sum, _ := a.Add(b)
	if want := mustMatrix(t, []string{"3/2", "2"}, []string{"-1/4", "-14/3"}); !sum.Equal(want) {
		t.Errorf("A+B = %v, want %v", sum, want)
	}
	diff, _ := a.Sub(b)
	if want := mustMatrix(t, []string{"1/2", "2"}, []string{"7/4", "-16/3"}); !diff.Equal(want) {
		t.Errorf("A-B = %v, want %v", diff, want)
	}
	// [1 2; 3/4 -5][1/2 0; -1 1/3] = [1/2-2, 2/3; 3/8+5, -5/3]
	prod := mustMul(t, a, b)
	if want := mustMatrix(t, []string{"-3/2", "2/3"}, []string{"43/8", "-5/3"}); !prod.Equal(want) {
		t.Errorf("AB = %v, want %v", prod, want)
	}
	if want := mustMatrix(t, []string{"-2", "-4"}, []string{"-3/2", "10"}); !a.Scale(q("-2")).Equal(want) {
		t.Errorf("-2A = %v", a.Scale(q("-2")))
	}
	if !a.Neg().Equal(a.Scale(q("-1"))) {
		t.Error("Neg != Scale(-1)")
	}
	if want := mustMatrix(t, []string{"1", "3/4"}, []string{"2", "-5"}); !a.Transpose().Equal(want) {
		t.Errorf("A^T = %v", a.Transpose())
	}
	if tr, _ := a.Trace(); tr.Cmp(q("-4")) != 0 {
		t.Errorf("trace = %s", FormatRat(tr))
	}
	if _, err := Zeros(2, 3).Trace(); !errors.Is(err, ErrNotSquare) {
		t.Errorf("trace of 2x3: %v", err)
	}
	if !Zeros(2, 3).IsZero() || a.IsZero() {
		t.Error("IsZero")
	}
	if a.Equal(a.Transpose()) || a.Equal(Zeros(2, 3)) || !a.Equal(a.Clone()) {
		t.Error("Equal")
	}
	if got := Zeros(2, 0).String(); got != "[[], []]" {
		t.Errorf("2x0 String = %q", got)
	}
	if got := Zeros(0, 0).String(); got != "[]" {
		t.Errorf("0x0 String = %q", got)
	}
	if !mustMul(t, Identity(3), Identity(3)).Equal(Identity(3)) {
		t.Error("I I != I")
	}
}

func TestShapeErrors(t *testing.T) {
	a, b := Zeros(2, 3), Zeros(3, 2)
	for name, f := range map[string]func() (*Matrix, error){
		"add": func() (*Matrix, error) { return a.Add(b) },
		"sub": func() (*Matrix, error) { return a.Sub(b) },
		"mul": func() (*Matrix, error) { return a.Mul(a) },
	} {
		_, err := f()
		if !errors.Is(err, ErrShape) {
			t.Errorf("%s: error %v, want ErrShape", name, err)
			continue
		}
		if !strings.Contains(err.Error(), "2x3") || (name != "mul" && !strings.Contains(err.Error(), "3x2")) {
			t.Errorf("%s: message %q lacks the shapes", name, err)
		}
	}
}

// Matrix product laws (standard theorems) on random rationals:
// associativity, distributivity, (AB)^T = B^T A^T.
func TestProductLaws(t *testing.T) {
	rng := rand.New(rand.NewSource(21))
	for k := 0; k < 20; k++ {
		n1, n2, n3, n4 := 1+rng.Intn(5), 1+rng.Intn(5), 1+rng.Intn(5), 1+rng.Intn(5)
		a, b, c := randomMatrix(rng, n1, n2, 30), randomMatrix(rng, n2, n3, 30), randomMatrix(rng, n3, n4, 30)
		if !mustMul(t, mustMul(t, a, b), c).Equal(mustMul(t, a, mustMul(t, b, c))) {
			t.Error("(AB)C != A(BC)")
		}
		b2 := randomMatrix(rng, n2, n3, 30)
		bb, _ := b.Add(b2)
		lhs := mustMul(t, a, bb)
		rhs, _ := mustMul(t, a, b).Add(mustMul(t, a, b2))
		if !lhs.Equal(rhs) {
			t.Error("A(B+B') != AB + AB'")
		}
		if !mustMul(t, a, b).Transpose().Equal(mustMul(t, b.Transpose(), a.Transpose())) {
			t.Error("(AB)^T != B^T A^T")
		}
	}
}

func TestSubmatrixAndMinor(t *testing.T) {
	m := mustMatrix(t,
		[]string{"1", "2", "3"},
		[]string{"4", "5", "6"},
		[]string{"7", "8", "10"})
	s, err := m.Submatrix([]int{2, 0}, []int{1, 2})
	if err != nil {
		t.Fatal(err)
	}
	if want := mustMatrix(t, []string{"8", "10"}, []string{"2", "3"}); !s.Equal(want) {
		t.Errorf("submatrix = %v, want %v", s, want)
	}
	// Minor by hand: rows {0,1}, cols {0,1}: 1*5 - 2*4 = -3.
	if mi, err := m.Minor([]int{0, 1}, []int{0, 1}); err != nil || mi.Cmp(q("-3")) != 0 {
		t.Errorf("minor = %v, %v; want -3", mi, err)
	}
	// Laplace expansion along row 0 (definition): det = sum_j (-1)^j m_0j M_0j.
	lap := new(big.Rat)
	for j := 0; j < 3; j++ {
		var cols []int
		for k := 0; k < 3; k++ {
			if k != j {
				cols = append(cols, k)
			}
		}
		mi, err := m.Minor([]int{1, 2}, cols)
		if err != nil {
			t.Fatal(err)
		}
		term := new(big.Rat).Mul(m.At(0, j), mi)
		if j%2 == 1 {
			term.Neg(term)
		}
		lap.Add(lap, term)
	}
	if d := mustDet(t, m); d.Cmp(lap) != 0 || d.Cmp(q("-3")) != 0 {
		t.Errorf("det %s, Laplace %s, by hand -3", FormatRat(d), FormatRat(lap))
	}
	for _, bad := range [][2][]int{
		{{3}, {0}},
		{{-1}, {0}},
		{{0}, {5}},
		{{0, 0}, {0, 1}},
		{{0, 1}, {2, 2}},
	} {
		if _, err := m.Submatrix(bad[0], bad[1]); !errors.Is(err, ErrShape) {
			t.Errorf("Submatrix(%v, %v): error %v, want ErrShape", bad[0], bad[1], err)
		}
		if _, err := m.Minor(bad[0], bad[1]); !errors.Is(err, ErrShape) {
			t.Errorf("Minor(%v, %v): error %v, want ErrShape", bad[0], bad[1], err)
		}
	}
	if _, err := m.Minor([]int{0, 1}, []int{0}); !errors.Is(err, ErrNotSquare) {
		t.Errorf("Minor with 2 rows, 1 column: %v", err)
	}
	if mi, err := m.Minor(nil, nil); err != nil || mi.Cmp(q("1")) != 0 {
		t.Errorf("empty minor = %v, %v; want 1", mi, err)
	}
}

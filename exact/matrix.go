package exact

import (
	"fmt"
	"math/big"
	"strings"
)

// Matrix is a dense matrix of exact rationals. Methods never modify their
// operands and never share entries with them: values passed in are copied,
// values handed out are copies. The zero Matrix is 0x0.
type Matrix struct {
	rows, cols int
	e          []*big.Rat // row-major, len rows*cols, never nil entries
}

// NewMatrix builds a matrix from its rows, copying every entry; a nil entry
// is read as 0. It returns ErrShape if there are no rows, if a row is empty,
// or if the rows do not all have the same length.
func NewMatrix(rows [][]*big.Rat) (*Matrix, error) {
	c, err := rowLength("new matrix", rows)
	if err != nil {
		return nil, err
	}
	m := Zeros(len(rows), c)
	for i, r := range rows {
		for j, v := range r {
			if v != nil {
				m.e[i*c+j].Set(v)
			}
		}
	}
	return m, nil
}

// rowLength returns the common length of rows, or ErrShape if there are no
// rows, if a row is empty, or if the lengths differ.
func rowLength[T any](op string, rows [][]T) (int, error) {
	if len(rows) == 0 {
		return 0, fmt.Errorf("%s: no rows: %w", op, ErrShape)
	}
	c := len(rows[0])
	for i, r := range rows {
		if len(r) == 0 {
			return 0, fmt.Errorf("%s: row %d is empty: %w", op, i+1, ErrShape)
		}
		if len(r) != c {
			return 0, fmt.Errorf("%s: row %d has length %d, row 1 has length %d: %w", op, i+1, len(r), c, ErrShape)
		}
	}
	return c, nil
}

// Zeros returns the r x c zero matrix. Either dimension may be 0; a negative
// one panics.
func Zeros(r, c int) *Matrix {
	if r < 0 || c < 0 {
		panic(fmt.Sprintf("exact: negative matrix dimensions %dx%d", r, c))
	}
	m := &Matrix{rows: r, cols: c, e: make([]*big.Rat, r*c)}
	for k := range m.e {
		m.e[k] = new(big.Rat)
	}
	return m
}

// Identity returns the n x n identity matrix.
func Identity(n int) *Matrix {
	m := Zeros(n, n)
	for i := 0; i < n; i++ {
		m.e[i*n+i].SetInt64(1)
	}
	return m
}

// Rows returns the number of rows.
func (m *Matrix) Rows() int { return m.rows }

// Cols returns the number of columns.
func (m *Matrix) Cols() int { return m.cols }

func (m *Matrix) check(i, j int) {
	if i < 0 || i >= m.rows || j < 0 || j >= m.cols {
		panic(fmt.Sprintf("exact: index (%d, %d) out of range for %dx%d matrix", i, j, m.rows, m.cols))
	}
}

// at returns the stored entry (no copy).
func (m *Matrix) at(i, j int) *big.Rat { return m.e[i*m.cols+j] }

// At returns a copy of entry (i, j), 0-based. It panics if out of range.
func (m *Matrix) At(i, j int) *big.Rat {
	m.check(i, j)
	return new(big.Rat).Set(m.at(i, j))
}

// Set stores a copy of v at (i, j), 0-based; nil stores 0. It panics if out
// of range.
func (m *Matrix) Set(i, j int, v *big.Rat) {
	m.check(i, j)
	if v == nil {
		m.at(i, j).SetInt64(0)
		return
	}
	m.at(i, j).Set(v)
}

// Row returns a copy of row i, 0-based. It panics if i is out of range.
func (m *Matrix) Row(i int) []*big.Rat { return m.line("row", i, m.rows, i*m.cols, 1, m.cols) }

// Col returns a copy of column j, 0-based. It panics if j is out of range.
func (m *Matrix) Col(j int) []*big.Rat { return m.line("column", j, m.cols, j, m.cols, m.rows) }

// line returns copies of the n entries of row or column k (of count) that
// start at m.e[first] and lie step apart.
func (m *Matrix) line(what string, k, count, first, step, n int) []*big.Rat {
	if k < 0 || k >= count {
		panic(fmt.Sprintf("exact: %s %d out of range for %s matrix", what, k, m.shape()))
	}
	out := make([]*big.Rat, n)
	for x := range out {
		out[x] = new(big.Rat).Set(m.e[first+x*step])
	}
	return out
}

// Clone returns a deep copy of m.
func (m *Matrix) Clone() *Matrix {
	out := Zeros(m.rows, m.cols)
	for k, v := range m.e {
		out.e[k].Set(v)
	}
	return out
}

func (m *Matrix) shape() string { return fmt.Sprintf("%dx%d", m.rows, m.cols) }

func (m *Matrix) sameShape(op string, o *Matrix) error {
	if m.rows != o.rows || m.cols != o.cols {
		return fmt.Errorf("%s: %s and %s: %w", op, m.shape(), o.shape(), ErrShape)
	}
	return nil
}

// Add returns m + o, or ErrShape if the shapes differ.
func (m *Matrix) Add(o *Matrix) (*Matrix, error) { return m.entrywise("add", o, (*big.Rat).Add) }

// Sub returns m - o, or ErrShape if the shapes differ.
func (m *Matrix) Sub(o *Matrix) (*Matrix, error) { return m.entrywise("sub", o, (*big.Rat).Sub) }

// entrywise returns the matrix of f(z, a, b) over the entries a of m and b
// of o, which must have m's shape; f sets z and returns it, as big.Rat's
// methods do.
func (m *Matrix) entrywise(op string, o *Matrix, f func(z, a, b *big.Rat) *big.Rat) (*Matrix, error) {
	if err := m.sameShape(op, o); err != nil {
		return nil, err
	}
	out := Zeros(m.rows, m.cols)
	for k := range out.e {
		f(out.e[k], m.e[k], o.e[k])
	}
	return out, nil
}

// Mul returns the matrix product m o, or ErrShape unless m.Cols() == o.Rows().
func (m *Matrix) Mul(o *Matrix) (*Matrix, error) {
	if m.cols != o.rows {
		return nil, fmt.Errorf("mul: %s times %s: %w", m.shape(), o.shape(), ErrShape)
	}
	out := Zeros(m.rows, o.cols)
	t := new(big.Rat)
	for i := 0; i < m.rows; i++ {
		for k := 0; k < m.cols; k++ {
			a := m.at(i, k)
			if a.Sign() == 0 {
				continue
			}
			for j := 0; j < o.cols; j++ {
				if b := o.at(k, j); b.Sign() != 0 {
					out.at(i, j).Add(out.at(i, j), t.Mul(a, b))
				}
			}
		}
	}
	return out, nil
}

// Scale returns s m.
func (m *Matrix) Scale(s *big.Rat) *Matrix {
	out := Zeros(m.rows, m.cols)
	for k := range out.e {
		out.e[k].Mul(m.e[k], s)
	}
	return out
}

// Neg returns -m.
func (m *Matrix) Neg() *Matrix {
	out := Zeros(m.rows, m.cols)
	for k := range out.e {
		out.e[k].Neg(m.e[k])
	}
	return out
}

// Equal reports whether m and o have the same shape and equal entries.
func (m *Matrix) Equal(o *Matrix) bool {
	if m.rows != o.rows || m.cols != o.cols {
		return false
	}
	for k := range m.e {
		if m.e[k].Cmp(o.e[k]) != 0 {
			return false
		}
	}
	return true
}

// IsZero reports whether every entry is 0 (true for empty matrices).
func (m *Matrix) IsZero() bool {
	for _, v := range m.e {
		if v.Sign() != 0 {
			return false
		}
	}
	return true
}

// Transpose returns the transpose of m.
func (m *Matrix) Transpose() *Matrix {
	out := Zeros(m.cols, m.rows)
	for i := 0; i < m.rows; i++ {
		for j := 0; j < m.cols; j++ {
			out.at(j, i).Set(m.at(i, j))
		}
	}
	return out
}

// Trace returns the sum of the diagonal entries, or ErrNotSquare.
func (m *Matrix) Trace() (*big.Rat, error) {
	if m.rows != m.cols {
		return nil, fmt.Errorf("trace needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	s := new(big.Rat)
	for i := 0; i < m.rows; i++ {
		s.Add(s, m.at(i, i))
	}
	return s, nil
}

// Submatrix returns the matrix of the entries of m in the given rows and
// columns (0-based, in the order given). An index out of range or repeated
// gives ErrShape. Empty index lists give an empty matrix.
func (m *Matrix) Submatrix(rows, cols []int) (*Matrix, error) {
	if err := checkIndices("row", rows, m.rows); err != nil {
		return nil, err
	}
	if err := checkIndices("column", cols, m.cols); err != nil {
		return nil, err
	}
	out := Zeros(len(rows), len(cols))
	for a, i := range rows {
		for b, j := range cols {
			out.at(a, b).Set(m.at(i, j))
		}
	}
	return out, nil
}

func checkIndices(what string, idx []int, n int) error {
	seen := make(map[int]bool, len(idx))
	for _, i := range idx {
		if i < 0 || i >= n {
			return fmt.Errorf("submatrix: %s index %d out of range [0, %d): %w", what, i, n, ErrShape)
		}
		if seen[i] {
			return fmt.Errorf("submatrix: %s index %d repeated: %w", what, i, ErrShape)
		}
		seen[i] = true
	}
	return nil
}

// Minor returns the determinant of Submatrix(rows, cols). The index lists
// must have equal lengths (ErrNotSquare otherwise); bad indices give
// ErrShape. The minor with no rows and no columns is 1.
func (m *Matrix) Minor(rows, cols []int) (*big.Rat, error) { return minor(m, rows, cols) }

// minor is Minor for Matrix and PolyMatrix.
func minor[M interface {
	Submatrix(rows, cols []int) (M, error)
	Det() (D, error)
}, D any](m M, rows, cols []int) (D, error) {
	var none D
	if len(rows) != len(cols) {
		return none, fmt.Errorf("minor needs as many rows as columns, got %d and %d: %w", len(rows), len(cols), ErrNotSquare)
	}
	s, err := m.Submatrix(rows, cols)
	if err != nil {
		return none, err
	}
	return s.Det()
}

// Power returns m^k. k = 0 gives the identity; k < 0 gives the |k|-th power
// of the inverse (ErrSingular if m is singular). m must be square
// (ErrNotSquare).
func (m *Matrix) Power(k int) (*Matrix, error) {
	if m.rows != m.cols {
		return nil, fmt.Errorf("power needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	base := m
	if k < 0 {
		inv, err := m.Inverse()
		if err != nil {
			return nil, err
		}
		base, k = inv, -k
	}
	result := Identity(m.rows)
	for ; k > 0; k >>= 1 {
		if k&1 == 1 {
			result, _ = result.Mul(base)
		}
		if k > 1 {
			base, _ = base.Mul(base)
		}
	}
	return result, nil
}

// String formats m row by row, e.g. "[[1, 2], [3/4, -5]]".
func (m *Matrix) String() string {
	return formatRows(m.rows, m.cols, func(i, j int) string { return FormatRat(m.at(i, j)) })
}

// formatRows writes a rows×cols grid of entries as nested brackets.
func formatRows(rows, cols int, entry func(i, j int) string) string {
	var b strings.Builder
	b.WriteByte('[')
	for i := 0; i < rows; i++ {
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteByte('[')
		for j := 0; j < cols; j++ {
			if j > 0 {
				b.WriteString(", ")
			}
			b.WriteString(entry(i, j))
		}
		b.WriteByte(']')
	}
	b.WriteByte(']')
	return b.String()
}

package exact

import (
	"fmt"
	"math"
	"math/big"
)

// PolyMatrix is a dense matrix whose entries are polynomials of one Ring.
// Like the polynomials it holds, a PolyMatrix is immutable: every method
// returns a new matrix and never changes its operands. The zero value is
// not valid; make one with NewPolyMatrix or PolyMatrixFrom.
type PolyMatrix struct {
	r          *Ring
	rows, cols int
	e          []*Poly // row-major, len rows*cols, never nil entries
}

// NewPolyMatrix builds a matrix over r from its rows; a nil entry is read
// as 0. Like NewMatrix it returns ErrShape if there are no rows, if a row
// is empty, or if the rows do not all have the same length, and
// ErrRingMismatch if an entry was made by another ring. r must not be nil.
func NewPolyMatrix(r *Ring, rows [][]*Poly) (*PolyMatrix, error) {
	if r == nil {
		panic("exact: NewPolyMatrix with a nil ring")
	}
	c, err := rowLength("new poly matrix", rows)
	if err != nil {
		return nil, err
	}
	m := &PolyMatrix{r: r, rows: len(rows), cols: c, e: make([]*Poly, len(rows)*c)}
	var zero *Poly
	for i, row := range rows {
		for j, p := range row {
			if p == nil {
				if zero == nil {
					zero = r.Const(new(big.Rat))
				}
				p = zero
			} else if p.Ring() != r {
				return nil, fmt.Errorf("new poly matrix: entry (%d, %d) belongs to another ring: %w", i+1, j+1, ErrRingMismatch)
			}
			m.e[i*c+j] = p
		}
	}
	return m, nil
}

// PolyMatrixFrom returns the matrix over r with the (constant) entries of m.
func PolyMatrixFrom(r *Ring, m *Matrix) *PolyMatrix {
	out := &PolyMatrix{r: r, rows: m.rows, cols: m.cols, e: make([]*Poly, len(m.e))}
	for k, v := range m.e {
		out.e[k] = r.Const(v)
	}
	return out
}

// Rows returns the number of rows.
func (m *PolyMatrix) Rows() int { return m.rows }

// Cols returns the number of columns.
func (m *PolyMatrix) Cols() int { return m.cols }

func (m *PolyMatrix) shape() string { return fmt.Sprintf("%dx%d", m.rows, m.cols) }

func (m *PolyMatrix) at(i, j int) *Poly { return m.e[i*m.cols+j] }

// At returns entry (i, j), 0-based. It panics if out of range.
func (m *PolyMatrix) At(i, j int) *Poly {
	if i < 0 || i >= m.rows || j < 0 || j >= m.cols {
		panic(fmt.Sprintf("exact: index (%d, %d) out of range for %s poly matrix", i, j, m.shape()))
	}
	return m.at(i, j)
}

func (m *PolyMatrix) sameRing(op string, o *PolyMatrix) error {
	if m.r != o.r {
		return fmt.Errorf("%s: the matrices belong to different rings: %w", op, ErrRingMismatch)
	}
	return nil
}

func (m *PolyMatrix) sameShape(op string, o *PolyMatrix) error {
	if m.rows != o.rows || m.cols != o.cols {
		return fmt.Errorf("%s: %s and %s: %w", op, m.shape(), o.shape(), ErrShape)
	}
	return m.sameRing(op, o)
}

func (m *PolyMatrix) like(rows, cols int) *PolyMatrix {
	return &PolyMatrix{r: m.r, rows: rows, cols: cols, e: make([]*Poly, rows*cols)}
}

// Add returns m + o, or ErrShape if the shapes differ and ErrRingMismatch
// if the rings do.
func (m *PolyMatrix) Add(o *PolyMatrix) (*PolyMatrix, error) {
	return m.entrywise("add", o, (*Poly).Add)
}

// Sub returns m - o, or ErrShape if the shapes differ and ErrRingMismatch
// if the rings do.
func (m *PolyMatrix) Sub(o *PolyMatrix) (*PolyMatrix, error) {
	return m.entrywise("sub", o, (*Poly).Sub)
}

// entrywise returns the matrix of f(a, b) over the entries a of m and b of
// o, which must have m's shape and ring.
func (m *PolyMatrix) entrywise(op string, o *PolyMatrix, f func(a, b *Poly) *Poly) (*PolyMatrix, error) {
	if err := m.sameShape(op, o); err != nil {
		return nil, err
	}
	out := m.like(m.rows, m.cols)
	for k := range out.e {
		out.e[k] = f(m.e[k], o.e[k])
	}
	return out, nil
}

// Mul returns the matrix product m o. It returns ErrShape unless
// m.Cols() == o.Rows(), ErrRingMismatch unless both belong to the same
// ring, and ErrTooManyTerms if an entry would exceed the ring's term cap.
func (m *PolyMatrix) Mul(o *PolyMatrix) (*PolyMatrix, error) {
	if m.cols != o.rows {
		return nil, fmt.Errorf("mul: %s times %s: %w", m.shape(), o.shape(), ErrShape)
	}
	if err := m.sameRing("mul", o); err != nil {
		return nil, err
	}
	out := m.like(m.rows, o.cols)
	terms := make([]*Poly, 0, m.cols)
	for i := 0; i < m.rows; i++ {
		for j := 0; j < o.cols; j++ {
			terms = terms[:0]
			for k := 0; k < m.cols; k++ {
				a, b := m.at(i, k), o.at(k, j)
				if a.IsZero() || b.IsZero() {
					continue
				}
				p, err := a.Mul(b)
				if err != nil {
					return nil, fmt.Errorf("mul: entry (%d, %d): %w", i+1, j+1, err)
				}
				terms = append(terms, p)
			}
			s, err := pmSum(m.r, terms)
			if err != nil {
				return nil, fmt.Errorf("mul: entry (%d, %d): %w", i+1, j+1, err)
			}
			out.e[i*o.cols+j] = s
		}
	}
	return out, nil
}

// Scale returns p m, every entry multiplied by p. It returns
// ErrRingMismatch if p belongs to another ring and ErrTooManyTerms if a product would exceed the
// ring's term cap.
func (m *PolyMatrix) Scale(p *Poly) (*PolyMatrix, error) {
	if p.Ring() != m.r {
		return nil, fmt.Errorf("scale: the factor belongs to another ring: %w", ErrRingMismatch)
	}
	out := m.like(m.rows, m.cols)
	for k, v := range m.e {
		s, err := v.Mul(p)
		if err != nil {
			return nil, fmt.Errorf("scale: %w", err)
		}
		out.e[k] = s
	}
	return out, nil
}

// Transpose returns the transpose of m.
func (m *PolyMatrix) Transpose() *PolyMatrix {
	out := m.like(m.cols, m.rows)
	out.e = transposed(m.e, m.rows, m.cols)
	return out
}

// transposed returns the entries of a rows x cols matrix transposed.
func transposed[T any](e []T, rows, cols int) []T {
	out := make([]T, len(e))
	for i := 0; i < rows; i++ {
		for j := 0; j < cols; j++ {
			out[j*rows+i] = e[i*cols+j]
		}
	}
	return out
}

// Submatrix returns the matrix of the entries of m in the given rows and
// columns (0-based, in the order given). An index out of range or repeated
// gives ErrShape. Empty index lists give an empty matrix.
func (m *PolyMatrix) Submatrix(rows, cols []int) (*PolyMatrix, error) {
	e, err := subEntries(m.e, m.rows, m.cols, rows, cols)
	if err != nil {
		return nil, err
	}
	out := m.like(len(rows), len(cols))
	out.e = e
	return out, nil
}

// subEntries returns the entries of a rows x cols matrix on the rows and
// columns given (ErrShape for an index out of range or repeated).
func subEntries[T any](e []T, nr, nc int, rows, cols []int) ([]T, error) {
	if err := checkIndices("row", rows, nr); err != nil {
		return nil, err
	}
	if err := checkIndices("column", cols, nc); err != nil {
		return nil, err
	}
	out := make([]T, 0, len(rows)*len(cols))
	for _, i := range rows {
		for _, j := range cols {
			out = append(out, e[i*nc+j])
		}
	}
	return out, nil
}

// Minor returns the determinant of Submatrix(rows, cols), expanded. The
// index lists must have equal lengths (ErrNotSquare otherwise); bad indices
// give ErrShape. The minor with no rows and no columns is 1.
func (m *PolyMatrix) Minor(rows, cols []int) (*Poly, error) { return minor(m, rows, cols) }

// Eval returns the matrix with every entry evaluated: the variables with
// the given indices (positions in the ring) are replaced by their values,
// the others stay; a nil value is read as 0.
func (m *PolyMatrix) Eval(vals map[int]*big.Rat) *PolyMatrix {
	zeroed := make(map[int]*big.Rat, len(vals))
	for v, x := range vals {
		if x == nil {
			x = new(big.Rat)
		}
		zeroed[v] = x
	}
	out := m.like(m.rows, m.cols)
	for k, v := range m.e {
		out.e[k] = v.Eval(zeroed)
	}
	return out
}

// Equal reports whether m and o have the same shape and equal entries.
func (m *PolyMatrix) Equal(o *PolyMatrix) bool {
	return m.rows == o.rows && m.cols == o.cols && equalEntries(m.e, o.e)
}

// Constant returns m as a rational Matrix when every entry is a constant;
// otherwise it returns nil, false.
func (m *PolyMatrix) Constant() (*Matrix, bool) {
	out := Zeros(m.rows, m.cols)
	for k, v := range m.e {
		c, ok := v.Constant()
		if !ok {
			return nil, false
		}
		out.e[k].Set(c)
	}
	return out, true
}

// String formats m row by row with Poly.String, e.g. "[[a + b, 1], [0, c^2]]".
func (m *PolyMatrix) String() string {
	return formatRows(m.rows, m.cols, func(i, j int) string { return m.at(i, j).String() })
}

// pmSum returns the sum of ps (0 for none), adding in a balanced tree so
// that long sums do not copy a growing accumulator over and over. It
// returns ErrTooManyTerms if the sum exceeds the ring's term cap; partial
// sums are not held to it.
func pmSum(r *Ring, ps []*Poly) (*Poly, error) {
	if len(ps) == 0 {
		return r.zero(), nil
	}
	s, err := sumPolys(ps, math.MaxInt, "sum")
	if err != nil {
		return nil, err
	}
	if n, lim := s.Len(), r.MaxTerms(); n > lim {
		return nil, pmTooManyTerms(n, lim)
	}
	return s, nil
}

// pmTooManyTerms is the error for a result of n terms over the cap.
func pmTooManyTerms(n, lim int) error {
	return fmt.Errorf("a result of %d terms exceeds the ring's cap of %d terms: %w", n, lim, ErrTooManyTerms)
}

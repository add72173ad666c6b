package exact

// Matrices of rational functions. Determinants, inverses and solutions
// are computed fraction-free: each row is multiplied by the lcm L_i of
// its denominators, which leaves a matrix of polynomials P with
// M = diag(L)^-1·P. Then det M = det P / ∏ L_i, with det P from
// PolyMatrix.Det (memoised Laplace or Bareiss, whichever suits), and
// M x = B is P x = diag(L)·B, solved by the fraction-free Gauss–Jordan
// elimination of Bareiss (E. H. Bareiss, "Sylvester's identity and
// multistep integer-preserving Gaussian elimination", Math. Comp. 22
// (1968) 565–578), whose divisions by the previous pivot are exact in the
// polynomial ring. Only the last step divides rational functions, each
// entry once.

import (
	"fmt"
	"math/big"
)

// RatFuncMatrix is a dense matrix of rational functions of one Ring. It
// is immutable. Make one with NewRatFuncMatrix or RatFuncMatrixFrom.
type RatFuncMatrix struct {
	r          *Ring
	rows, cols int
	e          []*RatFunc // row-major, never nil
}

// NewRatFuncMatrix builds a matrix over r from its rows; a nil entry is
// read as 0. It returns ErrShape for no rows, an empty row or rows of
// different lengths, and ErrRingMismatch for an entry of another ring.
func NewRatFuncMatrix(r *Ring, rows [][]*RatFunc) (*RatFuncMatrix, error) {
	c, err := rowLength("new rational function matrix", rows)
	if err != nil {
		return nil, err
	}
	m := &RatFuncMatrix{r: r, rows: len(rows), cols: c, e: make([]*RatFunc, len(rows)*c)}
	for i, row := range rows {
		for j, f := range row {
			switch {
			case f == nil:
				f = RatFuncOf(r.zero())
			case f.Ring() != r:
				return nil, fmt.Errorf("new rational function matrix: entry (%d, %d) belongs to another ring: %w", i+1, j+1, ErrRingMismatch)
			}
			m.e[i*c+j] = f
		}
	}
	return m, nil
}

// RatFuncMatrixFrom returns m with its entries read as rational functions.
func RatFuncMatrixFrom(m *PolyMatrix) *RatFuncMatrix {
	out := &RatFuncMatrix{r: m.r, rows: m.rows, cols: m.cols, e: make([]*RatFunc, len(m.e))}
	for k, p := range m.e {
		out.e[k] = RatFuncOf(p)
	}
	return out
}

// Rows returns the number of rows.
func (m *RatFuncMatrix) Rows() int { return m.rows }

// Cols returns the number of columns.
func (m *RatFuncMatrix) Cols() int { return m.cols }

// At returns entry (i, j), counted from 0; it panics out of range.
func (m *RatFuncMatrix) At(i, j int) *RatFunc {
	if i < 0 || i >= m.rows || j < 0 || j >= m.cols {
		panic(fmt.Sprintf("exact: index (%d, %d) out of range for a %dx%d matrix", i, j, m.rows, m.cols))
	}
	return m.e[i*m.cols+j]
}

// Poly returns m as a matrix of polynomials when every denominator is 1.
func (m *RatFuncMatrix) Poly() (*PolyMatrix, bool) {
	out := &PolyMatrix{r: m.r, rows: m.rows, cols: m.cols, e: make([]*Poly, len(m.e))}
	for k, f := range m.e {
		if !f.IsPoly() {
			return nil, false
		}
		out.e[k] = f.num
	}
	return out, true
}

func (m *RatFuncMatrix) shape() string { return fmt.Sprintf("%dx%d", m.rows, m.cols) }

// Add returns m + o.
func (m *RatFuncMatrix) Add(o *RatFuncMatrix) (*RatFuncMatrix, error) {
	return m.entrywise("add", o, (*RatFunc).Add)
}

// Sub returns m − o.
func (m *RatFuncMatrix) Sub(o *RatFuncMatrix) (*RatFuncMatrix, error) {
	return m.entrywise("sub", o, (*RatFunc).Sub)
}

func (m *RatFuncMatrix) entrywise(op string, o *RatFuncMatrix, f func(a, b *RatFunc) (*RatFunc, error)) (*RatFuncMatrix, error) {
	if m.rows != o.rows || m.cols != o.cols {
		return nil, fmt.Errorf("%s: %s and %s: %w", op, m.shape(), o.shape(), ErrShape)
	}
	out := &RatFuncMatrix{r: m.r, rows: m.rows, cols: m.cols, e: make([]*RatFunc, len(m.e))}
	for k := range m.e {
		var err error
		if out.e[k], err = f(m.e[k], o.e[k]); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// Mul returns the matrix product m·o.
func (m *RatFuncMatrix) Mul(o *RatFuncMatrix) (*RatFuncMatrix, error) {
	if m.cols != o.rows {
		return nil, fmt.Errorf("mul: %s times %s: %w", m.shape(), o.shape(), ErrShape)
	}
	out := &RatFuncMatrix{r: m.r, rows: m.rows, cols: o.cols, e: make([]*RatFunc, m.rows*o.cols)}
	for i := 0; i < m.rows; i++ {
		for j := 0; j < o.cols; j++ {
			s := RatFuncOf(m.r.zero())
			for k := 0; k < m.cols; k++ {
				t, err := m.e[i*m.cols+k].Mul(o.e[k*o.cols+j])
				if err != nil {
					return nil, err
				}
				if s, err = s.Add(t); err != nil {
					return nil, err
				}
			}
			out.e[i*o.cols+j] = s
		}
	}
	return out, nil
}

// Scale returns f·m.
func (m *RatFuncMatrix) Scale(f *RatFunc) (*RatFuncMatrix, error) {
	out := &RatFuncMatrix{r: m.r, rows: m.rows, cols: m.cols, e: make([]*RatFunc, len(m.e))}
	for k, x := range m.e {
		var err error
		if out.e[k], err = x.Mul(f); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// Transpose returns the transposed matrix.
func (m *RatFuncMatrix) Transpose() *RatFuncMatrix {
	return &RatFuncMatrix{r: m.r, rows: m.cols, cols: m.rows, e: transposed(m.e, m.rows, m.cols)}
}

// Submatrix returns the matrix on the given rows and columns (0-based, in
// the order given; ErrShape for an index out of range or repeated).
func (m *RatFuncMatrix) Submatrix(rows, cols []int) (*RatFuncMatrix, error) {
	e, err := subEntries(m.e, m.rows, m.cols, rows, cols)
	if err != nil {
		return nil, err
	}
	return &RatFuncMatrix{r: m.r, rows: len(rows), cols: len(cols), e: e}, nil
}

// Minor returns the determinant of Submatrix(rows, cols) (ErrNotSquare
// for lists of different lengths).
func (m *RatFuncMatrix) Minor(rows, cols []int) (*RatFunc, error) { return minor(m, rows, cols) }

// Eval puts rational values in for variables in every entry
// (ErrDivisionByZero when a denominator vanishes there).
func (m *RatFuncMatrix) Eval(vals map[int]*big.Rat) (*RatFuncMatrix, error) {
	out := &RatFuncMatrix{r: m.r, rows: m.rows, cols: m.cols, e: make([]*RatFunc, len(m.e))}
	for k, f := range m.e {
		var err error
		if out.e[k], err = f.Eval(vals); err != nil {
			return nil, fmt.Errorf("entry (%d, %d): %w", k/m.cols+1, k%m.cols+1, err)
		}
	}
	return out, nil
}

// Equal reports whether m and o have the same shape and entries.
func (m *RatFuncMatrix) Equal(o *RatFuncMatrix) bool {
	return m.rows == o.rows && m.cols == o.cols && equalEntries(m.e, o.e)
}

// equalEntries reports whether two entry slices of one length are equal.
func equalEntries[T interface{ Equal(T) bool }](a, b []T) bool {
	for k := range a {
		if !a[k].Equal(b[k]) {
			return false
		}
	}
	return true
}

// String prints the rows, as Matrix.String does.
func (m *RatFuncMatrix) String() string {
	return formatRows(m.rows, m.cols, func(i, j int) string { return m.e[i*m.cols+j].String() })
}

// clearRows multiplies each row of the blocks side by side (all with the
// same number of rows) by the lcm of the row's denominators; it returns
// the polynomial rows and the multipliers L_i (primitive, positive
// leading coefficient).
func clearRows(blocks ...*RatFuncMatrix) ([][]*Poly, []*Poly, error) {
	n := blocks[0].rows
	rows := make([][]*Poly, n)
	mult := make([]*Poly, n)
	for i := 0; i < n; i++ {
		var row []*RatFunc
		for _, b := range blocks {
			row = append(row, b.e[i*b.cols:(i+1)*b.cols]...)
		}
		l := blocks[0].r.one()
		for _, f := range row {
			if f.IsPoly() {
				continue
			}
			_, d, err := cancel(l, f.den)
			if err != nil {
				return nil, nil, err
			}
			if l, err = l.Mul(d); err != nil {
				return nil, nil, err
			}
		}
		l = l.PrimitivePart()
		mult[i] = l
		rows[i] = make([]*Poly, len(row))
		for j, f := range row {
			c, err := quoExact(l, f.den)
			if err != nil {
				return nil, nil, err
			}
			if rows[i][j], err = f.num.Mul(c); err != nil {
				return nil, nil, err
			}
		}
	}
	return rows, mult, nil
}

// quoReduced returns n/(d_1·…·d_k) in lowest terms, taking the gcd of
// the numerator with one d_i at a time: a factor left in both the final
// numerator and some d_i would have been in that step's gcd, so the
// result is in lowest terms without forming the whole product first.
func quoReduced(n *Poly, ds []*Poly) (*RatFunc, error) {
	if n.IsZero() {
		return RatFuncOf(n), nil
	}
	den := n.ring.one()
	for _, d := range ds {
		var err error
		if n, d, err = cancel(n, d); err != nil {
			return nil, err
		}
		if den, err = den.Mul(d); err != nil {
			return nil, err
		}
	}
	return normal(n, den), nil
}

// Det returns the determinant of the square matrix m (ErrNotSquare
// otherwise), in lowest terms.
func (m *RatFuncMatrix) Det() (*RatFunc, error) {
	if m.rows != m.cols {
		return nil, fmt.Errorf("det needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	if m.rows == 0 {
		return RatFuncOf(m.r.one()), nil
	}
	rows, mult, err := clearRows(m)
	if err != nil {
		return nil, err
	}
	p, err := NewPolyMatrix(m.r, rows)
	if err != nil {
		return nil, err
	}
	d, err := p.Det()
	if err != nil {
		return nil, err
	}
	return quoReduced(d, mult)
}

// Inverse returns m^-1, or ErrSingular when det m = 0.
func (m *RatFuncMatrix) Inverse() (*RatFuncMatrix, error) {
	if m.rows != m.cols {
		return nil, fmt.Errorf("inverse needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	id := &RatFuncMatrix{r: m.r, rows: m.rows, cols: m.rows, e: make([]*RatFunc, m.rows*m.rows)}
	for k := range id.e {
		id.e[k] = RatFuncOf(m.r.zero())
		if k/m.rows == k%m.rows {
			id.e[k] = RatFuncOf(m.r.one())
		}
	}
	return m.Solve(id)
}

// Solve returns X with m·X = b for a square, invertible m (ErrNotSquare,
// ErrSingular) and b with as many rows (ErrShape).
func (m *RatFuncMatrix) Solve(b *RatFuncMatrix) (*RatFuncMatrix, error) {
	n := m.rows
	if m.cols != n {
		return nil, fmt.Errorf("solve needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	if b.rows != n {
		return nil, fmt.Errorf("solve: a %s matrix and a right-hand side with %d rows: %w", m.shape(), b.rows, ErrShape)
	}
	a, _, err := clearRows(m, b)
	if err != nil {
		return nil, err
	}
	if err := gaussJordanFF(a, n, m.r.MaxTerms()); err != nil {
		return nil, err
	}
	d := []*Poly{a[n-1][n-1]}
	out := &RatFuncMatrix{r: m.r, rows: n, cols: b.cols, e: make([]*RatFunc, n*b.cols)}
	for i := 0; i < n; i++ {
		for j := 0; j < b.cols; j++ {
			if out.e[i*b.cols+j], err = quoReduced(a[i][n+j], d); err != nil {
				return nil, err
			}
		}
	}
	return out, nil
}

// gaussJordanFF runs Bareiss's one-step fraction-free Gauss–Jordan
// elimination on the n x (n+k) polynomial matrix a in place. At step k
// every row but the pivot row becomes (a_kk·a_ij − a_ik·a_kj)/p, p the
// previous pivot: by Sylvester's identity each entry is then a minor of
// the original matrix, so the division is exact. At the end the left
// block is d·I, d the determinant of the row-permuted left block, and
// the right block is d times the solution. The pivot is the nonzero
// candidate with the fewest terms; no nonzero candidate means singular.
func gaussJordanFF(a [][]*Poly, n, limit int) error {
	var prev *Poly // nil stands for 1
	for k := 0; k < n; k++ {
		p := -1
		for i := k; i < n; i++ {
			if !a[i][k].IsZero() && (p < 0 || a[i][k].Len() < a[p][k].Len()) {
				p = i
			}
		}
		if p < 0 {
			return fmt.Errorf("the matrix of rational functions is singular (its determinant is 0): %w", ErrSingular)
		}
		a[p], a[k] = a[k], a[p]
		piv := a[k][k]
		for i := 0; i < n; i++ {
			if i == k {
				continue
			}
			for j := range a[i] {
				if j == k {
					continue
				}
				x, err := piv.Mul(a[i][j])
				if err != nil {
					return err
				}
				if !a[i][k].IsZero() && !a[k][j].IsZero() {
					y, err := a[i][k].Mul(a[k][j])
					if err != nil {
						return err
					}
					x = x.Sub(y)
				}
				if prev != nil {
					q, ok, err := x.DivExact(prev)
					if err != nil {
						return err
					}
					if !ok {
						return fmt.Errorf("fraction-free elimination: inexact division at step %d (a bug): %w", k+1, ErrDivisionByZero)
					}
					x = q
				}
				if x.Len() > limit {
					return pmTooManyTerms(x.Len(), limit)
				}
				a[i][j] = x
			}
			a[i][k] = piv.ring.zero()
		}
		prev = piv
	}
	return nil
}

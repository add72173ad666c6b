package exact

import (
	"fmt"
	"math/big"
)

// This file holds the elimination routines behind Rank, Inverse, Solve and
// Nullspace: fraction-free (Bareiss) elimination over the integers for rank
// and small determinants, and Gauss–Jordan over the rationals for reduced
// row echelon forms.

// integerRows returns the rows of m, each multiplied by the least common
// multiple of its denominators, as integers, together with the product of
// those multipliers. det(m) = det(rows) / scale.
func (m *Matrix) integerRows() (rows [][]*big.Int, scale *big.Int) {
	rows = make([][]*big.Int, m.rows)
	scale = big.NewInt(1)
	l, g := new(big.Int), new(big.Int)
	for i := range rows {
		l.SetInt64(1)
		for j := 0; j < m.cols; j++ {
			d := m.at(i, j).Denom()
			if d.Cmp(l) == 0 || d.IsInt64() && d.Int64() == 1 {
				continue
			}
			g.GCD(nil, nil, l, d)
			l.Mul(l, g.Quo(d, g))
		}
		row := make([]*big.Int, m.cols)
		for j := range row {
			v := m.at(i, j)
			row[j] = new(big.Int).Quo(l, v.Denom())
			row[j].Mul(row[j], v.Num())
		}
		rows[i] = row
		scale.Mul(scale, l)
	}
	return rows, scale
}

// fractionFree brings the integer matrix a (modified in place) to a
// fraction-free row echelon form by Bareiss's algorithm (Bareiss 1968,
// "Sylvester's identity and multistep integer-preserving Gaussian
// elimination"): every division is exact. It returns the pivot columns and
// the sign of the row permutation used. For a square non-singular a,
// det(a) = sign * a[n-1][n-1].
func fractionFree(a [][]*big.Int) (pivots []int, sign int) {
	sign = 1
	if len(a) == 0 {
		return nil, sign
	}
	r, c := len(a), len(a[0])
	prev := big.NewInt(1)
	var t, u, rem big.Int
	k := 0
	for col := 0; col < c && k < r; col++ {
		p := k
		for p < r && a[p][col].Sign() == 0 {
			p++
		}
		if p == r {
			continue
		}
		if p != k {
			a[p], a[k] = a[k], a[p]
			sign = -sign
		}
		piv := a[k][col]
		// Unit pivots are common (a bordered matrix such as Cayley–
		// Menger's starts with two): skip multiplying and dividing by 1.
		pivOne, prevOne := isUnit(piv), isUnit(prev)
		// a_ij = (a_ij piv − a_i,col a_kj) / prev, through t and u: math/big
		// allocates afresh when a product or quotient overwrites an
		// operand, and reuses the storage otherwise.
		for i := k + 1; i < r; i++ {
			ai := a[i]
			f := ai[col]
			for j := col + 1; j < c; j++ {
				x := ai[j]
				if pivOne {
					t.Set(x)
				} else {
					t.Mul(x, piv)
				}
				if f.Sign() != 0 && a[k][j].Sign() != 0 {
					t.Sub(&t, u.Mul(f, a[k][j]))
				}
				if prevOne {
					x.Set(&t)
				} else {
					x.QuoRem(&t, prev, &rem)
				}
			}
			f.SetInt64(0)
		}
		prev = piv
		pivots = append(pivots, col)
		k++
	}
	return pivots, sign
}

// isUnit reports whether x = 1.
func isUnit(x *big.Int) bool { return x.IsInt64() && x.Int64() == 1 }

// Rank returns the rank of m (0 for an empty or zero matrix).
func (m *Matrix) Rank() int {
	if m.rows == 0 || m.cols == 0 {
		return 0
	}
	rows, _ := m.integerRows()
	pivots, _ := fractionFree(rows)
	return len(pivots)
}

// ratRows returns a deep copy of m's rows, each extended by the matching row
// of aug (if not nil).
func (m *Matrix) ratRows(aug *Matrix) [][]*big.Rat {
	w := m.cols
	if aug != nil {
		w += aug.cols
	}
	rows := make([][]*big.Rat, m.rows)
	for i := range rows {
		row := make([]*big.Rat, w)
		for j := range row {
			if j < m.cols {
				row[j] = new(big.Rat).Set(m.at(i, j))
			} else {
				row[j] = new(big.Rat).Set(aug.at(i, j-m.cols))
			}
		}
		rows[i] = row
	}
	return rows
}

// gaussJordan brings a (modified in place) to reduced row echelon form,
// choosing pivots among its first n columns only; later columns (an
// augmented part) are carried along. It returns the pivot columns.
func gaussJordan(a [][]*big.Rat, n int) (pivots []int) {
	t, inv := new(big.Rat), new(big.Rat)
	k := 0
	for col := 0; col < n && k < len(a); col++ {
		p := k
		for p < len(a) && a[p][col].Sign() == 0 {
			p++
		}
		if p == len(a) {
			continue
		}
		a[p], a[k] = a[k], a[p]
		rk := a[k]
		inv.Inv(rk[col])
		for j := col; j < len(rk); j++ {
			if rk[j].Sign() != 0 {
				rk[j].Mul(rk[j], inv)
			}
		}
		for i, ri := range a {
			if i == k || ri[col].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(ri[col])
			for j := col; j < len(ri); j++ {
				if rk[j].Sign() != 0 {
					ri[j].Sub(ri[j], t.Mul(f, rk[j]))
				}
			}
		}
		pivots = append(pivots, col)
		k++
	}
	return pivots
}

// Inverse returns the inverse of m: ErrNotSquare if m is not square,
// ErrSingular (with the rank in the message) if it is singular.
func (m *Matrix) Inverse() (*Matrix, error) {
	if m.rows != m.cols {
		return nil, fmt.Errorf("inverse needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	return m.solve("inverse", Identity(m.rows))
}

// Solve returns the x with m x = b. m must be square (ErrNotSquare) and
// non-singular (ErrSingular); b must have m.Rows() rows and may have any
// number of columns (ErrShape otherwise).
func (m *Matrix) Solve(b *Matrix) (*Matrix, error) {
	if m.rows != m.cols {
		return nil, fmt.Errorf("solve needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	if b.rows != m.rows {
		return nil, fmt.Errorf("solve: %s matrix with %s right-hand side: %w", m.shape(), b.shape(), ErrShape)
	}
	return m.solve("solve", b)
}

func (m *Matrix) solve(op string, b *Matrix) (*Matrix, error) {
	n := m.rows
	a := m.ratRows(b)
	if pivots := gaussJordan(a, n); len(pivots) < n {
		return nil, fmt.Errorf("%s: %w (rank %d of %d)", op, ErrSingular, len(pivots), n)
	}
	x := Zeros(n, b.cols)
	for i := 0; i < n; i++ {
		for j := 0; j < b.cols; j++ {
			x.at(i, j).Set(a[i][n+j])
		}
	}
	return x, nil
}

// Nullspace returns a matrix whose columns are a basis of {x : m x = 0}:
// the basis read off the reduced row echelon form, one column per free
// variable, with 1 in that variable's place and 0 in the other free places.
// If the null space is trivial the result is Cols() x 0.
func (m *Matrix) Nullspace() *Matrix {
	a := m.ratRows(nil)
	pivots := gaussJordan(a, m.cols)
	isPivot := make([]bool, m.cols)
	for _, p := range pivots {
		isPivot[p] = true
	}
	var free []int
	for j := 0; j < m.cols; j++ {
		if !isPivot[j] {
			free = append(free, j)
		}
	}
	out := Zeros(m.cols, len(free))
	for k, f := range free {
		out.at(f, k).SetInt64(1)
		for r, p := range pivots {
			out.at(p, k).Neg(a[r][f])
		}
	}
	return out
}

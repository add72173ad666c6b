package kernel

import (
	"errors"
	"fmt"
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"
	"gonum.org/v1/gonum/mat"

	"assay/exact"
)

// Matrix is an exact matrix over Q in a cell.
type Matrix struct{ m *exact.Matrix }

// MatrixType is the Python type of Matrix.
var MatrixType = py.NewType("matrix", "An exact matrix of rationals: matrix([[1, 2], [3, frac(1, 2)]]).")

// Type returns MatrixType.
func (m *Matrix) Type() *py.Type { return MatrixType }

// FloatMatrix is a float64 matrix, the companion of an exact one.
type FloatMatrix struct{ m *mat.Dense }

// FloatMatrixType is the Python type of FloatMatrix.
var FloatMatrixType = py.NewType("float_matrix", "A float64 matrix (gonum): M.to_float().")

// Type returns FloatMatrixType.
func (m *FloatMatrix) Type() *py.Type { return FloatMatrixType }

// matrixFrom builds an exact matrix from a list of rows of exact scalars.
func matrixFrom(o py.Object) (*exact.Matrix, error) {
	if m, ok := o.(*Matrix); ok {
		return m.m, nil
	}
	rows, err := sequence(o, "matrix rows")
	if err != nil {
		return nil, err
	}
	if len(rows) == 0 {
		return nil, py.ExceptionNewf(py.ValueError, "matrix needs at least one row")
	}
	grid := make([][]*big.Rat, len(rows))
	for i, row := range rows {
		entries, err := sequence(row, fmt.Sprintf("row %d of the matrix", i))
		if err != nil {
			return nil, err
		}
		grid[i] = make([]*big.Rat, len(entries))
		for j, e := range entries {
			v, ok := exactOf(e)
			if !ok {
				return nil, py.ExceptionNewf(py.TypeError, "matrix entry [%d, %d] is %s, not an exact number%s", i, j, typeName(e), floatHint(e))
			}
			grid[i][j] = v
		}
	}
	m, err := exact.NewMatrix(grid)
	if err != nil {
		return nil, py.ExceptionNewf(py.ValueError, "%v", err)
	}
	return m, nil
}

// floatHint explains how to get an exact value when a float turned up.
func floatHint(o py.Object) string {
	if _, ok := o.(py.Float); ok {
		return " (it is a float64; write frac(\"0.1\") for the decimal or frac(x) for the float's exact value)"
	}
	return ""
}

func typeName(o py.Object) string {
	if o == nil {
		return "nothing"
	}
	return "a " + o.Type().Name
}

// sequence lists the items of a list, tuple or other iterable.
func sequence(o py.Object, what string) ([]py.Object, error) {
	switch x := o.(type) {
	case *py.List:
		return x.Items, nil
	case py.Tuple:
		return x, nil
	case py.String, *Rational, py.Int, py.Float:
		return nil, py.ExceptionNewf(py.TypeError, "%s must be a list or tuple, got %s", what, typeName(o))
	}
	var items []py.Object
	err := py.Iterate(o, func(item py.Object) bool { items = append(items, item); return false })
	if err != nil {
		return nil, py.ExceptionNewf(py.TypeError, "%s must be a list or tuple, got %s", what, typeName(o))
	}
	return items, nil
}

// wrapErr turns an exact-package error into a Python exception of the right class.
func wrapErr(err error) error {
	if err == nil {
		return nil
	}
	switch {
	case errors.Is(err, exact.ErrDivisionByZero), errors.Is(err, exact.ErrSingular):
		return py.ExceptionNewf(py.ZeroDivisionError, "%v", err)
	case errors.Is(err, exact.ErrNotSquare), errors.Is(err, exact.ErrShape):
		return py.ExceptionNewf(py.ValueError, "%v", err)
	case errors.Is(err, exact.ErrSyntax):
		return py.ExceptionNewf(py.ValueError, "%v", err)
	}
	return py.ExceptionNewf(py.ValueError, "%v", err)
}

func matrixObject(m *exact.Matrix) *Matrix { return &Matrix{m: m} }

// indexList reads a list of integer indices.
func indexList(o py.Object, what string) ([]int, error) {
	items, err := sequence(o, what)
	if err != nil {
		return nil, err
	}
	out := make([]int, len(items))
	for i, it := range items {
		k, err := py.Index(it)
		if err != nil {
			return nil, py.ExceptionNewf(py.TypeError, "%s must hold integers", what)
		}
		out[i] = int(k)
	}
	return out, nil
}

// vectorOrMatrix accepts a list of numbers (a column) or a matrix.
func vectorOrMatrix(o py.Object) (*exact.Matrix, bool, error) {
	if m, ok := o.(*Matrix); ok {
		return m.m, false, nil
	}
	items, err := sequence(o, "right-hand side")
	if err != nil {
		return nil, false, err
	}
	rows := make([]py.Object, len(items))
	for i, it := range items {
		rows[i] = py.Tuple{it}
	}
	m, err := matrixFrom(py.NewListFromItems(rows))
	return m, true, err
}

func column(m *exact.Matrix, j int) *py.List {
	out := make([]py.Object, m.Rows())
	for i := range out {
		out[i] = newRational(m.At(i, j))
	}
	return py.NewListFromItems(out)
}

func init() {
	method := func(name, doc string, f func(m *exact.Matrix, args py.Tuple) (py.Object, error)) {
		MatrixType.Dict[name] = py.MustNewMethod(name, func(self py.Object, args py.Tuple) (py.Object, error) {
			return f(self.(*Matrix).m, args)
		}, 0, doc)
	}
	noArgs := func(name string, args py.Tuple) error {
		if len(args) != 0 {
			return py.ExceptionNewf(py.TypeError, "%s() takes no arguments (%d given)", name, len(args))
		}
		return nil
	}
	method("det", "det() -> the exact determinant", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		if err := noArgs("det", args); err != nil {
			return nil, err
		}
		d, err := m.Det()
		if err != nil {
			return nil, wrapErr(err)
		}
		return newRational(d), nil
	})
	method("rank", "rank() -> the rank over Q", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		return py.Int(m.Rank()), noArgs("rank", args)
	})
	method("transpose", "transpose() -> the transposed matrix", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		return matrixObject(m.Transpose()), noArgs("transpose", args)
	})
	method("inverse", "inverse() -> the exact inverse; ZeroDivisionError if singular", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		if err := noArgs("inverse", args); err != nil {
			return nil, err
		}
		inv, err := m.Inverse()
		if err != nil {
			return nil, wrapErr(err)
		}
		return matrixObject(inv), nil
	})
	method("solve", "solve(b) -> x with M x = b; b a list (gives a list) or a matrix", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		if len(args) != 1 {
			return nil, py.ExceptionNewf(py.TypeError, "solve(b) takes one argument")
		}
		b, isVector, err := vectorOrMatrix(args[0])
		if err != nil {
			return nil, err
		}
		x, err := m.Solve(b)
		if err != nil {
			return nil, wrapErr(err)
		}
		if isVector {
			return column(x, 0), nil
		}
		return matrixObject(x), nil
	})
	method("nullspace", "nullspace() -> a list of basis vectors of {x : M x = 0}", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		if err := noArgs("nullspace", args); err != nil {
			return nil, err
		}
		n := m.Nullspace()
		out := make([]py.Object, n.Cols())
		for j := range out {
			out[j] = column(n, j)
		}
		return py.NewListFromItems(out), nil
	})
	method("minor", "minor(rows, cols) -> determinant of the submatrix on those rows and columns", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		r, c, err := rowsCols("minor", args)
		if err != nil {
			return nil, err
		}
		d, err := m.Minor(r, c)
		if err != nil {
			return nil, wrapErr(err)
		}
		return newRational(d), nil
	})
	method("submatrix", "submatrix(rows, cols) -> the matrix on those rows and columns", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		r, c, err := rowsCols("submatrix", args)
		if err != nil {
			return nil, err
		}
		s, err := m.Submatrix(r, c)
		if err != nil {
			return nil, wrapErr(err)
		}
		return matrixObject(s), nil
	})
	method("trace", "trace() -> sum of the diagonal", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		if m.Rows() != m.Cols() {
			return nil, py.ExceptionNewf(py.ValueError, "trace needs a square matrix, got %dx%d", m.Rows(), m.Cols())
		}
		t := new(big.Rat)
		for i := 0; i < m.Rows(); i++ {
			t.Add(t, m.At(i, i))
		}
		return newRational(t), noArgs("trace", args)
	})
	method("rows", "rows() -> the entries as a list of rows", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		rows := make([]py.Object, m.Rows())
		for i := range rows {
			row := make([]py.Object, m.Cols())
			for j := range row {
				row[j] = newRational(m.At(i, j))
			}
			rows[i] = py.NewListFromItems(row)
		}
		return py.NewListFromItems(rows), noArgs("rows", args)
	})
	method("to_float", "to_float() -> the float64 companion (gonum) of this matrix", func(m *exact.Matrix, args py.Tuple) (py.Object, error) {
		return &FloatMatrix{m: m.Float()}, noArgs("to_float", args)
	})
	MatrixType.Dict["shape"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		m := self.(*Matrix).m
		return py.Tuple{py.Int(m.Rows()), py.Int(m.Cols())}, nil
	}, Doc: "(rows, columns)"}

	FloatMatrixType.Dict["det"] = py.MustNewMethod("det", func(self py.Object) (py.Object, error) {
		d, err := exact.FloatDet(self.(*FloatMatrix).m)
		return py.Float(d), wrapErr(err)
	}, 0, "det() -> float64 determinant by gonum's LU factorisation")
	FloatMatrixType.Dict["solve"] = py.MustNewMethod("solve", func(self, arg py.Object) (py.Object, error) {
		a := self.(*FloatMatrix).m
		b, isVector, err := floatVectorOrMatrix(arg)
		if err != nil {
			return nil, err
		}
		x, err := exact.FloatSolve(a, b)
		if err != nil {
			return nil, wrapErr(err)
		}
		if isVector {
			r, _ := x.Dims()
			out := make([]py.Object, r)
			for i := range out {
				out[i] = py.Float(x.At(i, 0))
			}
			return py.NewListFromItems(out), nil
		}
		return &FloatMatrix{m: x}, nil
	}, 0, "solve(b) -> float64 solution by gonum")
}

func floatVectorOrMatrix(o py.Object) (*mat.Dense, bool, error) {
	if m, ok := o.(*FloatMatrix); ok {
		return m.m, false, nil
	}
	items, err := sequence(o, "right-hand side")
	if err != nil {
		return nil, false, err
	}
	col := make([]float64, len(items))
	for i, it := range items {
		f, err := py.FloatAsFloat64(toFloatObject(it))
		if err != nil {
			return nil, false, py.ExceptionNewf(py.TypeError, "right-hand side entry %d is %s, not a number", i, typeName(it))
		}
		col[i] = f
	}
	return mat.NewDense(len(col), 1, col), true, nil
}

func rowsCols(name string, args py.Tuple) ([]int, []int, error) {
	if len(args) != 2 {
		return nil, nil, py.ExceptionNewf(py.TypeError, "%s(rows, cols) takes two lists of indices", name)
	}
	r, err := indexList(args[0], name+" rows")
	if err != nil {
		return nil, nil, err
	}
	c, err := indexList(args[1], name+" cols")
	return r, c, err
}

// M__getitem__ reads M[i, j] (an entry) or M[i] (a row as a list).
func (m *Matrix) M__getitem__(key py.Object) (py.Object, error) {
	rows, cols := m.m.Rows(), m.m.Cols()
	index := func(o py.Object, n int, what string) (int, error) {
		k, err := py.Index(o)
		if err != nil {
			return 0, py.ExceptionNewf(py.TypeError, "matrix %s index must be an integer", what)
		}
		i := int(k)
		if i < 0 {
			i += n
		}
		if i < 0 || i >= n {
			return 0, py.ExceptionNewf(py.IndexError, "matrix %s index %d out of range for a %dx%d matrix", what, int(k), rows, cols)
		}
		return i, nil
	}
	if t, ok := key.(py.Tuple); ok {
		if len(t) != 2 {
			return nil, py.ExceptionNewf(py.TypeError, "matrix index needs [row, column]")
		}
		i, err := index(t[0], rows, "row")
		if err != nil {
			return nil, err
		}
		j, err := index(t[1], cols, "column")
		if err != nil {
			return nil, err
		}
		return newRational(m.m.At(i, j)), nil
	}
	i, err := index(key, rows, "row")
	if err != nil {
		return nil, err
	}
	row := make([]py.Object, cols)
	for j := range row {
		row[j] = newRational(m.m.At(i, j))
	}
	return py.NewListFromItems(row), nil
}

// M__len__ is the number of rows.
func (m *Matrix) M__len__() (py.Object, error) { return py.Int(m.m.Rows()), nil }

func (m *Matrix) arith(o py.Object, swap bool, op func(a, b *exact.Matrix) (*exact.Matrix, error)) (py.Object, error) {
	other, ok := o.(*Matrix)
	if !ok {
		return py.NotImplemented, nil
	}
	a, b := m.m, other.m
	if swap {
		a, b = b, a
	}
	r, err := op(a, b)
	if err != nil {
		return nil, wrapErr(err)
	}
	return matrixObject(r), nil
}

// M__add__ adds entrywise.
func (m *Matrix) M__add__(o py.Object) (py.Object, error) {
	return m.arith(o, false, (*exact.Matrix).Add)
}

// M__sub__ subtracts entrywise.
func (m *Matrix) M__sub__(o py.Object) (py.Object, error) {
	return m.arith(o, false, (*exact.Matrix).Sub)
}

// M__mul__ is the matrix product, or scaling by an exact scalar.
func (m *Matrix) M__mul__(o py.Object) (py.Object, error) {
	if s, ok := exactOf(o); ok {
		return matrixObject(m.m.Scale(s)), nil
	}
	return m.arith(o, false, (*exact.Matrix).Mul)
}

// M__rmul__ scales by an exact scalar on the left.
func (m *Matrix) M__rmul__(o py.Object) (py.Object, error) {
	if s, ok := exactOf(o); ok {
		return matrixObject(m.m.Scale(s)), nil
	}
	return py.NotImplemented, nil
}

// M__truediv__ divides by an exact scalar.
func (m *Matrix) M__truediv__(o py.Object) (py.Object, error) {
	s, ok := exactOf(o)
	if !ok {
		return py.NotImplemented, nil
	}
	inv, err := ratQuo(big.NewRat(1, 1), s)
	if err != nil {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "matrix divided by zero")
	}
	return matrixObject(m.m.Scale(inv)), nil
}

// M__pow__ raises a square matrix to an integer power (negative: of the inverse).
func (m *Matrix) M__pow__(o, mod py.Object) (py.Object, error) {
	k, err := py.Index(o)
	if err != nil || mod != py.None {
		return nil, py.ExceptionNewf(py.TypeError, "a matrix power needs an integer exponent")
	}
	if k > maxExponent || k < -maxExponent {
		return nil, py.ExceptionNewf(py.OverflowError, "matrix exponent %d is too large (limit %d)", k, maxExponent)
	}
	p, err := m.m.Power(int(k))
	if err != nil {
		return nil, wrapErr(err)
	}
	return matrixObject(p), nil
}

// M__neg__ negates every entry.
func (m *Matrix) M__neg__() (py.Object, error) { return matrixObject(m.m.Neg()), nil }

// M__eq__ is exact equality of shape and entries.
func (m *Matrix) M__eq__(o py.Object) (py.Object, error) {
	other, ok := o.(*Matrix)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(m.m.Equal(other.m)), nil
}

// M__ne__ is the negation of M__eq__.
func (m *Matrix) M__ne__(o py.Object) (py.Object, error) {
	other, ok := o.(*Matrix)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(!m.m.Equal(other.m)), nil
}

// M__str__ lays the matrix out as aligned rows.
func (m *Matrix) M__str__() (py.Object, error) {
	cells := make([][]string, m.m.Rows())
	for i := range cells {
		cells[i] = make([]string, m.m.Cols())
		for j := range cells[i] {
			cells[i][j] = exact.FormatRat(m.m.At(i, j))
		}
	}
	return py.String(grid(cells)), nil
}

// M__repr__ is the expression that rebuilds the matrix.
func (m *Matrix) M__repr__() (py.Object, error) {
	return py.String("matrix(" + m.m.String() + ")"), nil
}

// M__str__ lays the float matrix out as aligned rows.
func (m *FloatMatrix) M__str__() (py.Object, error) {
	r, c := m.m.Dims()
	cells := make([][]string, r)
	for i := range cells {
		cells[i] = make([]string, c)
		for j := range cells[i] {
			cells[i][j] = fmt.Sprintf("%.17g", m.m.At(i, j))
		}
	}
	return py.String(grid(cells)), nil
}

// M__repr__ is the same as str for float matrices.
func (m *FloatMatrix) M__repr__() (py.Object, error) { return m.M__str__() }

// grid right-aligns the columns of a table of strings inside brackets.
func grid(cells [][]string) string {
	if len(cells) == 0 {
		return "[]"
	}
	width := make([]int, len(cells[0]))
	for _, row := range cells {
		for j, s := range row {
			width[j] = max(width[j], len([]rune(s)))
		}
	}
	var b strings.Builder
	for i, row := range cells {
		if i > 0 {
			b.WriteByte('\n')
		}
		b.WriteString("[")
		for j, s := range row {
			b.WriteString(" ")
			b.WriteString(strings.Repeat(" ", width[j]-len([]rune(s))))
			b.WriteString(s)
		}
		b.WriteString(" ]")
	}
	return b.String()
}

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

// Matrix is an exact matrix in a cell: over Q, or over Q[variables] when an
// entry is a polynomial. Exactly one of q and p is set.
type Matrix struct {
	q    *exact.Matrix
	p    *exact.PolyMatrix
	ring *exact.Ring // the session's ring, for lifting and new variables
}

// MatrixType is the Python type of Matrix.
var MatrixType = py.NewType("matrix", "An exact matrix of rationals or polynomials: matrix([[1, 2], [3, frac(1, 2)]]).")

// Type returns MatrixType.
func (m *Matrix) Type() *py.Type { return MatrixType }

// FloatMatrix is a float64 matrix, the companion of an exact one.
type FloatMatrix struct{ m *mat.Dense }

// FloatMatrixType is the Python type of FloatMatrix.
var FloatMatrixType = py.NewType("float_matrix", "A float64 matrix (gonum): M.to_float().")

// Type returns FloatMatrixType.
func (m *FloatMatrix) Type() *py.Type { return FloatMatrixType }

func rationalMatrix(ring *exact.Ring, q *exact.Matrix) *Matrix { return &Matrix{q: q, ring: ring} }

// polyMatrix wraps a polynomial matrix, as a rational one when every entry is constant.
func polyMatrix(ring *exact.Ring, p *exact.PolyMatrix) *Matrix {
	if q, ok := p.Constant(); ok {
		return &Matrix{q: q, ring: ring}
	}
	return &Matrix{p: p, ring: ring}
}

func (m *Matrix) rows() int {
	if m.q != nil {
		return m.q.Rows()
	}
	return m.p.Rows()
}

func (m *Matrix) cols() int {
	if m.q != nil {
		return m.q.Cols()
	}
	return m.p.Cols()
}

// lifted is m over Q[variables].
func (m *Matrix) lifted() *exact.PolyMatrix {
	if m.p != nil {
		return m.p
	}
	return exact.PolyMatrixFrom(m.ring, m.q)
}

// entry returns m[i, j] as a Python value.
func (m *Matrix) entry(i, j int) py.Object {
	if m.q != nil {
		return newRational(m.q.At(i, j))
	}
	return resultObject(m.p.At(i, j))
}

// matrixFrom builds a matrix from a list of rows of exact numbers and polynomials.
func matrixFrom(ring *exact.Ring, o py.Object) (*Matrix, error) {
	if m, ok := o.(*Matrix); ok {
		return m, nil
	}
	rows, err := sequence(o, "matrix rows")
	if err != nil {
		return nil, err
	}
	if len(rows) == 0 {
		return nil, py.ExceptionNewf(py.ValueError, "matrix needs at least one row")
	}
	grid := make([][]py.Object, len(rows))
	symbolic := false
	for i, row := range rows {
		if grid[i], err = sequence(row, fmt.Sprintf("row %d of the matrix", i)); err != nil {
			return nil, err
		}
		for j, e := range grid[i] {
			switch e.(type) {
			case *Polynomial:
				symbolic = true
			default:
				if !isExactScalar(e) {
					return nil, py.ExceptionNewf(py.TypeError, "matrix entry [%d, %d] is %s, not an exact number or a polynomial%s", i, j, typeName(e), floatHint(e))
				}
			}
		}
	}
	if symbolic {
		prows := make([][]*exact.Poly, len(grid))
		for i, row := range grid {
			prows[i] = make([]*exact.Poly, len(row))
			for j, e := range row {
				prows[i][j], _ = polyOf(ring, e)
			}
		}
		p, err := exact.NewPolyMatrix(ring, prows)
		if err != nil {
			return nil, wrapErr(err)
		}
		return polyMatrix(ring, p), nil
	}
	qrows := make([][]*big.Rat, len(grid))
	for i, row := range grid {
		qrows[i] = make([]*big.Rat, len(row))
		for j, e := range row {
			qrows[i][j], _ = exactOf(e)
		}
	}
	q, err := exact.NewMatrix(qrows)
	if err != nil {
		return nil, wrapErr(err)
	}
	return rationalMatrix(ring, q), nil
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
	case py.String, *Rational, py.Int, py.Float, *Polynomial:
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
	switch {
	case err == nil:
		return nil
	case errors.Is(err, exact.ErrDivisionByZero), errors.Is(err, exact.ErrSingular):
		return py.ExceptionNewf(py.ZeroDivisionError, "%v", err)
	case errors.Is(err, exact.ErrTooManyTerms):
		return py.ExceptionNewf(py.MemoryError, "%v", err)
	}
	return py.ExceptionNewf(py.ValueError, "%v", err)
}

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

// columnOrMatrix accepts a list of numbers (a column) or a matrix.
func columnOrMatrix(ring *exact.Ring, o py.Object) (*exact.Matrix, bool, error) {
	if m, ok := o.(*Matrix); ok {
		if m.q == nil {
			return nil, false, symbolicRefusal("solve")
		}
		return m.q, false, nil
	}
	items, err := sequence(o, "right-hand side")
	if err != nil {
		return nil, false, err
	}
	rows := make([]py.Object, len(items))
	for i, it := range items {
		rows[i] = py.Tuple{it}
	}
	m, err := matrixFrom(ring, py.NewListFromItems(rows))
	if err != nil {
		return nil, false, err
	}
	if m.q == nil {
		return nil, false, symbolicRefusal("solve")
	}
	return m.q, true, nil
}

func symbolicRefusal(op string) error {
	return py.ExceptionNewf(py.TypeError, "%s needs a matrix of rationals, and this one has polynomial entries; put values in first with M.at(a=…)", op)
}

func column(m *exact.Matrix, j int) *py.List {
	out := make([]py.Object, m.Rows())
	for i := range out {
		out[i] = newRational(m.At(i, j))
	}
	return py.NewListFromItems(out)
}

func init() {
	method := func(name, doc string, f func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error)) {
		MatrixType.Dict[name] = py.MustNewMethod(name, func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
			m := self.(*Matrix)
			if floatMode {
				return m.floatMethod(name, args, kw)
			}
			return f(m, args, kw)
		}, 0, doc)
	}
	noArgs := func(name string, args py.Tuple, kw py.StringDict) error {
		_, err := bind(name, args, kw, nil, 0)
		return err
	}
	// rational wraps a method defined for matrices over Q only.
	rational := func(name string, f func(q *exact.Matrix, m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error)) func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		return func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
			if m.q == nil {
				return nil, symbolicRefusal(name + "()")
			}
			return f(m.q, m, args, kw)
		}
	}
	method("det", "det() -> the exact determinant (expanded, for polynomial entries)", func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if err := noArgs("det", args, kw); err != nil {
			return nil, err
		}
		return m.det()
	})
	method("rank", "rank() -> the rank over Q", rational("rank", func(q *exact.Matrix, _ *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		return py.Int(q.Rank()), noArgs("rank", args, kw)
	}))
	method("transpose", "transpose() -> the transposed matrix", func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if m.q != nil {
			return rationalMatrix(m.ring, m.q.Transpose()), noArgs("transpose", args, kw)
		}
		return polyMatrix(m.ring, m.p.Transpose()), noArgs("transpose", args, kw)
	})
	method("inverse", "inverse() -> the exact inverse; ZeroDivisionError if singular", rational("inverse", func(q *exact.Matrix, m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if err := noArgs("inverse", args, kw); err != nil {
			return nil, err
		}
		inv, err := q.Inverse()
		if err != nil {
			return nil, wrapErr(err)
		}
		return rationalMatrix(m.ring, inv), nil
	}))
	method("solve", "solve(b) -> x with M x = b; b a list (gives a list) or a matrix", rational("solve", func(q *exact.Matrix, m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("solve", args, kw, []string{"b"}, 1)
		if err != nil {
			return nil, err
		}
		b, isVector, err := columnOrMatrix(m.ring, a[0])
		if err != nil {
			return nil, err
		}
		x, err := q.Solve(b)
		if err != nil {
			return nil, wrapErr(err)
		}
		if isVector {
			return column(x, 0), nil
		}
		return rationalMatrix(m.ring, x), nil
	}))
	method("nullspace", "nullspace() -> a list of basis vectors of {x : M x = 0}", rational("nullspace", func(q *exact.Matrix, _ *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if err := noArgs("nullspace", args, kw); err != nil {
			return nil, err
		}
		n := q.Nullspace()
		out := make([]py.Object, n.Cols())
		for j := range out {
			out[j] = column(n, j)
		}
		return py.NewListFromItems(out), nil
	}))
	method("minor", "minor(rows, cols) -> determinant of the submatrix on those rows and columns", func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		s, err := m.submatrix("minor", args, kw)
		if err != nil {
			return nil, err
		}
		if s.rows() != s.cols() {
			return nil, py.ExceptionNewf(py.ValueError, "minor needs as many rows as columns, got %d and %d", s.rows(), s.cols())
		}
		return s.det()
	})
	method("submatrix", "submatrix(rows, cols) -> the matrix on those rows and columns", func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		return m.submatrix("submatrix", args, kw)
	})
	method("trace", "trace() -> sum of the diagonal", func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if err := noArgs("trace", args, kw); err != nil {
			return nil, err
		}
		if m.rows() != m.cols() {
			return nil, py.ExceptionNewf(py.ValueError, "trace needs a square matrix, got %dx%d", m.rows(), m.cols())
		}
		t := m.ring.Const(new(big.Rat))
		for i := 0; i < m.rows(); i++ {
			e, _ := polyOf(m.ring, m.entry(i, i))
			t = t.Add(e)
		}
		return resultObject(t), nil
	})
	method("rows", "rows() -> the entries as a list of rows", func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		rows := make([]py.Object, m.rows())
		for i := range rows {
			rows[i] = m.row(i)
		}
		return py.NewListFromItems(rows), noArgs("rows", args, kw)
	})
	method("at", "M.at(a=2, b=3) -> the matrix with those values put in for the variables", func(m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		if len(args) > 0 {
			return nil, py.ExceptionNewf(py.TypeError, "at() takes values by name: M.at(a=2, b=3)")
		}
		if m.q != nil {
			return m, nil
		}
		vals, err := keywordValues(m.ring, "at", kw)
		if err != nil {
			return nil, err
		}
		return polyMatrix(m.ring, m.p.Eval(vals)), nil
	})
	method("characteristic_polynomial", "characteristic_polynomial(\"t\") -> det(t*I - M) as a polynomial in t", rational("characteristic_polynomial", func(q *exact.Matrix, m *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("characteristic_polynomial", args, kw, []string{"variable"}, 1)
		if err != nil {
			return nil, err
		}
		var t *exact.Poly
		switch v := a[0].(type) {
		case py.String:
			if t, err = m.ring.Var(string(v)); err != nil {
				return nil, py.ExceptionNewf(py.ValueError, "characteristic_polynomial(): %v", err)
			}
		default:
			i, err := variableIndex(m.ring, "characteristic_polynomial", v)
			if err != nil {
				return nil, err
			}
			t, _ = m.ring.Var(m.ring.Names()[i])
		}
		c, err := exact.CharacteristicPolynomial(q, t)
		if err != nil {
			return nil, polyErr(err)
		}
		return polyObject(c), nil
	}))
	method("to_float", "to_float() -> the float64 companion (gonum) of this matrix", rational("to_float", func(q *exact.Matrix, _ *Matrix, args py.Tuple, kw py.StringDict) (py.Object, error) {
		return &FloatMatrix{m: q.Float()}, noArgs("to_float", args, kw)
	}))
	MatrixType.Dict["shape"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		m := self.(*Matrix)
		return py.Tuple{py.Int(m.rows()), py.Int(m.cols())}, nil
	}, Doc: "(rows, columns)"}

	FloatMatrixType.Dict["det"] = py.MustNewMethod("det", func(self py.Object) (py.Object, error) {
		d, err := exact.FloatDet(self.(*FloatMatrix).m)
		return py.Float(d), wrapErr(err)
	}, 0, "det() -> float64 determinant by gonum's LU factorisation")
	FloatMatrixType.Dict["solve"] = py.MustNewMethod("solve", func(self, arg py.Object) (py.Object, error) {
		a := self.(*FloatMatrix).m
		b, isVector, err := floatColumnOrMatrix(arg)
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

// det is the exact determinant: a rational, or an expanded polynomial.
func (m *Matrix) det() (py.Object, error) {
	if m.q != nil {
		d, err := m.q.Det()
		if err != nil {
			return nil, wrapErr(err)
		}
		return newRational(d), nil
	}
	d, err := m.p.Det()
	if err != nil {
		return nil, polyErr(err)
	}
	return resultObject(d), nil
}

func (m *Matrix) submatrix(name string, args py.Tuple, kw py.StringDict) (*Matrix, error) {
	a, err := bind(name, args, kw, []string{"rows", "cols"}, 2)
	if err != nil {
		return nil, err
	}
	r, err := indexList(a[0], name+" rows")
	if err != nil {
		return nil, err
	}
	c, err := indexList(a[1], name+" cols")
	if err != nil {
		return nil, err
	}
	if m.q != nil {
		s, err := m.q.Submatrix(r, c)
		if err != nil {
			return nil, wrapErr(err)
		}
		return rationalMatrix(m.ring, s), nil
	}
	s, err := m.p.Submatrix(r, c)
	if err != nil {
		return nil, wrapErr(err)
	}
	return polyMatrix(m.ring, s), nil
}

func (m *Matrix) row(i int) *py.List {
	row := make([]py.Object, m.cols())
	for j := range row {
		row[j] = m.entry(i, j)
	}
	return py.NewListFromItems(row)
}

func floatColumnOrMatrix(o py.Object) (*mat.Dense, bool, error) {
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

// M__getitem__ reads M[i, j] (an entry) or M[i] (a row as a list).
func (m *Matrix) M__getitem__(key py.Object) (py.Object, error) {
	if floatMode && m.q != nil {
		return (&FloatMatrix{m: m.q.Float()}).M__getitem__(key)
	}
	rows, cols := m.rows(), m.cols()
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
		return m.entry(i, j), nil
	}
	i, err := index(key, rows, "row")
	if err != nil {
		return nil, err
	}
	return m.row(i), nil
}

// M__len__ is the number of rows.
func (m *Matrix) M__len__() (py.Object, error) { return py.Int(m.rows()), nil }

// arith combines two matrices, over Q when both are rational.
func (m *Matrix) arith(o py.Object, swap bool, q func(a, b *exact.Matrix) (*exact.Matrix, error), p func(a, b *exact.PolyMatrix) (*exact.PolyMatrix, error)) (py.Object, error) {
	other, ok := o.(*Matrix)
	if !ok {
		return py.NotImplemented, nil
	}
	a, b := m, other
	if swap {
		a, b = b, a
	}
	if a.q != nil && b.q != nil {
		r, err := q(a.q, b.q)
		if err != nil {
			return nil, wrapErr(err)
		}
		return rationalMatrix(m.ring, r), nil
	}
	r, err := p(a.lifted(), b.lifted())
	if err != nil {
		return nil, polyErr(err)
	}
	return polyMatrix(m.ring, r), nil
}

// scale multiplies by an exact number or a polynomial.
func (m *Matrix) scale(o py.Object) (py.Object, error) {
	if s, ok := exactOf(o); ok && m.q != nil {
		return rationalMatrix(m.ring, m.q.Scale(s)), nil
	}
	p, ok := polyOf(m.ring, o)
	if !ok {
		return py.NotImplemented, nil
	}
	r, err := m.lifted().Scale(p)
	if err != nil {
		return nil, polyErr(err)
	}
	return polyMatrix(m.ring, r), nil
}

// M__add__ adds entrywise.
func (m *Matrix) M__add__(o py.Object) (py.Object, error) {
	if floatMode {
		return m.floatOperator(o, false, py.Add)
	}
	return m.arith(o, false, (*exact.Matrix).Add, (*exact.PolyMatrix).Add)
}

// M__sub__ subtracts entrywise.
func (m *Matrix) M__sub__(o py.Object) (py.Object, error) {
	if floatMode {
		return m.floatOperator(o, false, py.Sub)
	}
	return m.arith(o, false, (*exact.Matrix).Sub, (*exact.PolyMatrix).Sub)
}

// M__mul__ is the matrix product, or scaling by a number or polynomial.
func (m *Matrix) M__mul__(o py.Object) (py.Object, error) {
	if floatMode {
		return m.floatOperator(o, false, py.Mul)
	}
	if _, ok := o.(*Matrix); ok {
		return m.arith(o, false, (*exact.Matrix).Mul, (*exact.PolyMatrix).Mul)
	}
	return m.scale(o)
}

// M__rmul__ scales by a number or polynomial on the left.
func (m *Matrix) M__rmul__(o py.Object) (py.Object, error) {
	if floatMode {
		return m.floatOperator(o, true, py.Mul)
	}
	return m.scale(o)
}

// M__truediv__ divides by an exact non-zero number.
func (m *Matrix) M__truediv__(o py.Object) (py.Object, error) {
	s, ok := exactOf(o)
	if !ok {
		return py.NotImplemented, nil
	}
	inv, err := ratQuo(big.NewRat(1, 1), s)
	if err != nil {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "matrix divided by zero")
	}
	return m.scale(newRational(inv))
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
	if m.q == nil {
		if k < 0 {
			return nil, symbolicRefusal("a negative power")
		}
		if m.rows() != m.cols() {
			return nil, py.ExceptionNewf(py.ValueError, "a matrix power needs a square matrix, got %dx%d", m.rows(), m.cols())
		}
		r := exact.PolyMatrixFrom(m.ring, exact.Identity(m.rows()))
		for i := 0; i < int(k); i++ {
			if r, err = r.Mul(m.p); err != nil {
				return nil, polyErr(err)
			}
		}
		return polyMatrix(m.ring, r), nil
	}
	p, err := m.q.Power(int(k))
	if err != nil {
		return nil, wrapErr(err)
	}
	return rationalMatrix(m.ring, p), nil
}

// M__neg__ negates every entry.
func (m *Matrix) M__neg__() (py.Object, error) { return m.scale(py.Int(-1)) }

// M__eq__ is exact equality of shape and entries.
func (m *Matrix) M__eq__(o py.Object) (py.Object, error) {
	other, ok := o.(*Matrix)
	if !ok {
		return py.NotImplemented, nil
	}
	if m.q != nil && other.q != nil {
		return py.NewBool(m.q.Equal(other.q)), nil
	}
	return py.NewBool(m.lifted().Equal(other.lifted())), nil
}

// M__ne__ is the negation of M__eq__.
func (m *Matrix) M__ne__(o py.Object) (py.Object, error) {
	eq, err := m.M__eq__(o)
	if err != nil || eq == py.NotImplemented {
		return eq, err
	}
	return py.NewBool(eq == py.False), nil
}

// M__str__ lays the matrix out as aligned rows.
func (m *Matrix) M__str__() (py.Object, error) {
	cells := make([][]string, m.rows())
	for i := range cells {
		cells[i] = make([]string, m.cols())
		for j := range cells[i] {
			cells[i][j] = str(m.entry(i, j))
		}
	}
	return py.String(grid(cells)), nil
}

// M__repr__ is the expression that rebuilds the matrix.
func (m *Matrix) M__repr__() (py.Object, error) {
	if m.q != nil {
		return py.String("matrix(" + m.q.String() + ")"), nil
	}
	return py.String("matrix(" + m.p.String() + ")"), nil
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

// floatMethod runs a method on the float64 companion of m (float64 code).
func (m *Matrix) floatMethod(name string, args py.Tuple, kw py.StringDict) (py.Object, error) {
	fm, err := floatValue(m)
	if err != nil {
		return nil, err
	}
	if _, ok := FloatMatrixType.Dict[name]; !ok {
		return nil, noCompanion("M." + name + "()")
	}
	attr, err := py.GetAttrString(fm, name)
	if err != nil {
		return nil, err
	}
	return py.Call(attr, args, kw)
}

// floatOperator applies an operator to the float64 companion of m.
func (m *Matrix) floatOperator(o py.Object, swap bool, op func(a, b py.Object) (py.Object, error)) (py.Object, error) {
	fm, err := floatValue(m)
	if err != nil {
		return nil, err
	}
	other, err := floatValue(o)
	if err != nil {
		return nil, err
	}
	if swap {
		return op(other, fm)
	}
	return op(fm, other)
}

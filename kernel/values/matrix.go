package values

import (
	"errors"
	"fmt"
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// Matrix is an exact matrix in a cell: over Q, over Q[variables] when an
// entry is a polynomial, or over the rational functions when an entry is
// one. Exactly one of q, p and f is set.
type Matrix struct {
	q       *exact.Matrix
	p       *exact.PolyMatrix
	f       *exact.RatFuncMatrix
	env     *Env
	rounded bool // made by the input-rounding run (rounding.go)
}

// MatrixType is the Python type of Matrix.
var MatrixType = py.NewType("matrix", "An exact matrix of rationals or polynomials: matrix([[1, 2], [3, frac(1, 2)]]).")

// Type returns MatrixType.
func (m *Matrix) Type() *py.Type { return MatrixType }

// RationalMatrix wraps a matrix over Q.
func (e *Env) RationalMatrix(q *exact.Matrix) *Matrix { return &Matrix{q: q, env: e} }

// PolyMatrix wraps a polynomial matrix, as a rational one when every entry is constant.
func (e *Env) PolyMatrix(p *exact.PolyMatrix) *Matrix {
	if q, ok := p.Constant(); ok {
		return &Matrix{q: q, env: e}
	}
	return &Matrix{p: p, env: e}
}

// RatFuncMatrix wraps a matrix of rational functions, as a polynomial or
// rational one when every denominator is 1.
func (e *Env) RatFuncMatrix(f *exact.RatFuncMatrix) *Matrix {
	if p, ok := f.Poly(); ok {
		return e.PolyMatrix(p)
	}
	return &Matrix{f: f, env: e}
}

// Rational is the matrix over Q, when it is one.
func (m *Matrix) Rational() (*exact.Matrix, bool) { return m.q, m.q != nil }

// RatLifted is m over the rational functions.
func (m *Matrix) RatLifted() *exact.RatFuncMatrix {
	if m.f != nil {
		return m.f
	}
	return exact.RatFuncMatrixFrom(m.Lifted())
}

// HasRatFuncs reports whether an entry of m is a rational function that
// is not a polynomial.
func (m *Matrix) HasRatFuncs() bool { return m.f != nil }

// Lifted is m over Q[variables]; m must not have rational-function entries.
func (m *Matrix) Lifted() *exact.PolyMatrix {
	if m.p != nil {
		return m.p
	}
	return exact.PolyMatrixFrom(m.env.Ring, m.q)
}

func (m *Matrix) rows() int {
	switch {
	case m.q != nil:
		return m.q.Rows()
	case m.f != nil:
		return m.f.Rows()
	}
	return m.p.Rows()
}

func (m *Matrix) cols() int {
	switch {
	case m.q != nil:
		return m.q.Cols()
	case m.f != nil:
		return m.f.Cols()
	}
	return m.p.Cols()
}

// entry returns m[i, j] as a notebook value.
func (m *Matrix) entry(i, j int) py.Object {
	switch {
	case m.q != nil:
		return m.env.Rational(m.q.At(i, j))
	case m.f != nil:
		return m.env.RatFuncValue(m.f.At(i, j))
	}
	return m.env.PolyResult(m.p.At(i, j))
}

// MatrixOf builds a matrix from a list of rows of exact numbers and polynomials.
func (e *Env) MatrixOf(o py.Object) (*Matrix, error) {
	if m, ok := o.(*Matrix); ok {
		return m, nil
	}
	rows, err := Sequence(o, "matrix rows")
	if err != nil {
		return nil, err
	}
	if len(rows) == 0 {
		return nil, py.ExceptionNewf(py.ValueError, "matrix needs at least one row")
	}
	grid := make([][]py.Object, len(rows))
	symbolic, fractions := false, false
	for i, row := range rows {
		if grid[i], err = Sequence(row, fmt.Sprintf("row %d of the matrix", i)); err != nil {
			return nil, err
		}
		for j, x := range grid[i] {
			switch x.(type) {
			case *Polynomial:
				symbolic = true
			case *RationalFunction:
				fractions = true
			default:
				if !isExactScalar(x) {
					return nil, py.ExceptionNewf(py.TypeError, "matrix entry [%d, %d] is %s, not an exact number, a polynomial or a rational function%s", i, j, interp.TypeName(x), FloatHint(x))
				}
			}
		}
	}
	if fractions {
		frows := make([][]*exact.RatFunc, len(grid))
		for i, row := range grid {
			frows[i] = make([]*exact.RatFunc, len(row))
			for j, x := range row {
				frows[i][j], _ = e.RatFunc(x)
			}
		}
		f, err := exact.NewRatFuncMatrix(e.Ring, frows)
		if err != nil {
			return nil, interp.Exception(err)
		}
		return e.RatFuncMatrix(f), nil
	}
	if symbolic {
		prows := make([][]*exact.Poly, len(grid))
		for i, row := range grid {
			prows[i] = make([]*exact.Poly, len(row))
			for j, x := range row {
				prows[i][j], _ = e.Poly(x)
			}
		}
		p, err := exact.NewPolyMatrix(e.Ring, prows)
		if err != nil {
			return nil, interp.Exception(err)
		}
		return e.PolyMatrix(p), nil
	}
	qrows := make([][]*big.Rat, len(grid))
	for i, row := range grid {
		qrows[i] = make([]*big.Rat, len(row))
		for j, x := range row {
			qrows[i][j], _ = ExactOf(x)
		}
	}
	q, err := exact.NewMatrix(qrows)
	if err != nil {
		return nil, interp.Exception(err)
	}
	return e.RationalMatrix(q), nil
}

// RationalMatrixArg reads a matrix argument that must have rational entries.
func (e *Env) RationalMatrixArg(what string, o py.Object) (*exact.Matrix, error) {
	m, err := e.MatrixOf(o)
	if err != nil {
		return nil, err
	}
	if m.q == nil {
		return nil, symbolicRefusal(what, m)
	}
	return m.q, nil
}

// columnOrMatrix accepts a list of numbers (a column) or a matrix.
func (e *Env) columnOrMatrix(o py.Object) (*exact.Matrix, bool, error) {
	if m, ok := o.(*Matrix); ok {
		if m.q == nil {
			return nil, false, symbolicRefusal("solve", m)
		}
		return m.q, false, nil
	}
	items, err := Sequence(o, "right-hand side")
	if err != nil {
		return nil, false, err
	}
	rows := make([]py.Object, len(items))
	for i, it := range items {
		rows[i] = py.Tuple{it}
	}
	q, err := e.RationalMatrixArg("solve", py.NewListFromItems(rows))
	return q, true, err
}

func symbolicRefusal(op string, m *Matrix) error {
	entries := "polynomial entries"
	if m.f != nil {
		entries = "rational-function entries"
	}
	return py.ExceptionNewf(py.TypeError, "%s needs a matrix of rationals, and this one has %s; put values in first with M.at(a=…)", op, entries)
}

func (e *Env) column(m *exact.Matrix, j int) *py.List {
	out := make([]py.Object, m.Rows())
	for i := range out {
		out[i] = e.Rational(m.At(i, j))
	}
	return py.NewListFromItems(out)
}

func (e *Env) matrixBuiltins(b py.StringDict) {
	setBuiltins(b, []builtin{
		{"matrix", params("rows"), "matrix(rows) -> exact matrix over Q", e.matrix},
		{"det", params("M"), "det(M) -> exact determinant of a square matrix", e.det},
		{"unit_matrix", params("n"), "unit_matrix(n) -> the n x n identity matrix", e.unitMatrix},
		{"random_matrix", params("rows", "cols", "bound=", "denom=", "seed="), "random_matrix(rows, cols, bound=10, denom=1, seed=None) -> matrix of random rationals p/q, |p| <= bound, 1 <= q <= denom", e.randomMatrix},
	})
}

func (e *Env) matrix(a interp.Args) (py.Object, error) {
	if e.Float {
		return floatMatrixFromRows(a.Get("rows"))
	}
	if e.Rounding {
		return e.roundingBuiltin(e.matrix, a)
	}
	return e.MatrixOf(a.Get("rows"))
}

func (e *Env) det(a interp.Args) (py.Object, error) {
	if f, ok := a.Get("M").(*FloatMatrix); ok {
		d, err := exact.FloatDet(f.m)
		return py.Float(d), err
	}
	if e.Float {
		f, err := floatMatrixFromRows(a.Get("M"))
		if err != nil {
			return nil, err
		}
		d, err := exact.FloatDet(f.m)
		return py.Float(d), err
	}
	if e.Rounding {
		return e.roundingBuiltin(e.det, a)
	}
	m, err := e.MatrixOf(a.Get("M"))
	if err != nil {
		return nil, err
	}
	if m.rows() != m.cols() {
		return nil, py.ExceptionNewf(py.ValueError, "det needs a square matrix, got %dx%d", m.rows(), m.cols())
	}
	return m.det()
}

func (e *Env) unitMatrix(a interp.Args) (py.Object, error) {
	n, err := a.Int("n", 0)
	if err != nil {
		return nil, err
	}
	if n < 1 || n > 10000 {
		return nil, py.ExceptionNewf(py.ValueError, "unit_matrix(n) needs 1 <= n <= 10000, got %d", n)
	}
	return e.RationalMatrix(exact.Identity(int(n))), nil
}

func (e *Env) randomMatrix(a interp.Args) (py.Object, error) {
	var n [4]int64
	for i, spec := range []struct {
		name string
		def  int64
	}{{"rows", 0}, {"cols", 0}, {"bound", 10}, {"denom", 1}} {
		var err error
		if n[i], err = a.Int(spec.name, spec.def); err != nil {
			return nil, err
		}
	}
	if n[0] < 1 || n[1] < 1 || n[0]*n[1] > 1<<20 || n[2] < 0 || n[3] < 1 {
		return nil, py.ExceptionNewf(py.ValueError, "random_matrix needs rows, cols >= 1 (at most 2^20 entries), bound >= 0 and denom >= 1")
	}
	r, err := e.Rand(a.Get("seed"))
	if err != nil {
		return nil, err
	}
	m := exact.Zeros(int(n[0]), int(n[1]))
	for i := 0; i < int(n[0]); i++ {
		for j := 0; j < int(n[1]); j++ {
			p := r.Int64N(2*n[2]+1) - n[2]
			q := r.Int64N(n[3]) + 1
			m.Set(i, j, big.NewRat(p, q))
		}
	}
	return e.RationalMatrix(m), nil
}

func init() {
	setMethods(MatrixType, []method[*Matrix]{
		{"det", nil, "det() -> the exact determinant (expanded, for polynomial entries)", inFloatToo("det", (*Matrix).detMethod)},
		{"rank", nil, "rank() -> the rank over Q", inFloatToo("rank", overQ("rank", (*Matrix).rank))},
		{"transpose", nil, "transpose() -> the transposed matrix", inFloatToo("transpose", (*Matrix).transpose)},
		{"inverse", nil, "inverse() -> the exact inverse (rational functions for symbolic entries); ZeroDivisionError if singular", inFloatToo("inverse", (*Matrix).inverse)},
		{"solve", params("b"), "solve(b) -> x with M x = b; b a list (gives a list) or a matrix", inFloatToo("solve", (*Matrix).solve)},
		{"nullspace", nil, "nullspace() -> a list of basis vectors of {x : M x = 0}", inFloatToo("nullspace", overQ("nullspace", (*Matrix).nullspace))},
		{"minor", params("rows", "cols"), "minor(rows, cols) -> determinant of the submatrix on those rows and columns", inFloatToo("minor", (*Matrix).minor)},
		{"submatrix", params("rows", "cols"), "submatrix(rows, cols) -> the matrix on those rows and columns", inFloatToo("submatrix", (*Matrix).submatrixMethod)},
		{"trace", nil, "trace() -> sum of the diagonal", inFloatToo("trace", (*Matrix).trace)},
		{"rows", nil, "rows() -> the entries as a list of rows", inFloatToo("rows", (*Matrix).rowList)},
		{"at", params("*values", "**values"), "M.at(a=2, b=3) -> the matrix with those values put in for the variables", inFloatToo("at", (*Matrix).at)},
		{"characteristic_polynomial", params("variable"), "characteristic_polynomial(\"t\") -> det(t*I - M) as a polynomial in t", inFloatToo("characteristic_polynomial", overQ("characteristic_polynomial", (*Matrix).characteristicPolynomial))},
		{"to_float", nil, "to_float() -> the float64 companion (gonum) of this matrix", inFloatToo("to_float", overQ("to_float", (*Matrix).toFloat))},
	})
	MatrixType.Dict["shape"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		m := self.(*Matrix)
		return py.Tuple{py.Int(m.rows()), py.Int(m.cols())}, nil
	}, Doc: "(rows, columns)"}
}

// inFloatToo makes a method run on the float64 companion in float64 code.
func inFloatToo(name string, f func(*Matrix, interp.Args) (py.Object, error)) func(*Matrix, interp.Args) (py.Object, error) {
	return func(m *Matrix, a interp.Args) (py.Object, error) {
		if m.env.Float {
			return m.floatMethod(name, a)
		}
		if m.env.Rounding {
			return m.env.roundingBuiltin(func(a interp.Args) (py.Object, error) {
				rounded, err := m.env.RoundIn(m)
				if err != nil {
					return nil, err
				}
				return f(rounded.(*Matrix), a)
			}, a)
		}
		return f(m, a)
	}
}

// overQ makes a method refuse matrices with polynomial entries.
func overQ(name string, f func(*Matrix, interp.Args) (py.Object, error)) func(*Matrix, interp.Args) (py.Object, error) {
	return func(m *Matrix, a interp.Args) (py.Object, error) {
		if m.q == nil {
			return nil, symbolicRefusal(name+"()", m)
		}
		return f(m, a)
	}
}

func (m *Matrix) detMethod(interp.Args) (py.Object, error) { return m.det() }

func (m *Matrix) rank(interp.Args) (py.Object, error) { return py.Int(m.q.Rank()), nil }

func (m *Matrix) transpose(interp.Args) (py.Object, error) {
	switch {
	case m.q != nil:
		return m.env.RationalMatrix(m.q.Transpose()), nil
	case m.f != nil:
		return m.env.RatFuncMatrix(m.f.Transpose()), nil
	}
	return m.env.PolyMatrix(m.p.Transpose()), nil
}

func (m *Matrix) inverse(interp.Args) (py.Object, error) {
	if m.q == nil {
		inv, err := m.RatLifted().Inverse()
		if err != nil {
			return nil, err
		}
		return m.env.RatFuncMatrix(inv), nil
	}
	inv, err := m.q.Inverse()
	if err != nil {
		return nil, err
	}
	return m.env.RationalMatrix(inv), nil
}

func (m *Matrix) solve(a interp.Args) (py.Object, error) {
	if m.q == nil || !rationalColumns(a.Get("b")) {
		return m.solveSymbolic(a.Get("b"))
	}
	b, isVector, err := m.env.columnOrMatrix(a.Get("b"))
	if err != nil {
		return nil, err
	}
	x, err := m.q.Solve(b)
	if err != nil {
		return nil, err
	}
	if isVector {
		return m.env.column(x, 0), nil
	}
	return m.env.RationalMatrix(x), nil
}

// rationalColumns reports whether a right-hand side is a rational matrix
// or a list of exact numbers (anything else is solved symbolically, or
// refused there).
func rationalColumns(o py.Object) bool {
	if m, ok := o.(*Matrix); ok {
		return m.q != nil
	}
	items, err := Sequence(o, "right-hand side")
	if err != nil {
		return true
	}
	for _, it := range items {
		if !isExactScalar(it) {
			if _, ok := it.(*Polynomial); ok {
				return false
			}
			if _, ok := it.(*RationalFunction); ok {
				return false
			}
		}
	}
	return true
}

// solveSymbolic solves M x = b over the rational functions; b is a list
// (the answer is a list) or a matrix.
func (m *Matrix) solveSymbolic(o py.Object) (py.Object, error) {
	b, isVector := o.(*Matrix)
	isVector = !isVector
	if isVector {
		items, err := Sequence(o, "right-hand side")
		if err != nil {
			return nil, err
		}
		rows := make([]py.Object, len(items))
		for i, it := range items {
			rows[i] = py.Tuple{it}
		}
		if b, err = m.env.MatrixOf(py.NewListFromItems(rows)); err != nil {
			return nil, err
		}
	}
	x, err := m.RatLifted().Solve(b.RatLifted())
	if err != nil {
		return nil, err
	}
	if !isVector {
		return m.env.RatFuncMatrix(x), nil
	}
	out := make([]py.Object, x.Rows())
	for i := range out {
		out[i] = m.env.RatFuncValue(x.At(i, 0))
	}
	return py.NewListFromItems(out), nil
}

func (m *Matrix) nullspace(interp.Args) (py.Object, error) {
	n := m.q.Nullspace()
	out := make([]py.Object, n.Cols())
	for j := range out {
		out[j] = m.env.column(n, j)
	}
	return py.NewListFromItems(out), nil
}

func (m *Matrix) minor(a interp.Args) (py.Object, error) {
	s, err := m.submatrix("minor", a)
	if err != nil {
		return nil, err
	}
	if s.rows() != s.cols() {
		return nil, py.ExceptionNewf(py.ValueError, "minor needs as many rows as columns, got %d and %d", s.rows(), s.cols())
	}
	return s.det()
}

func (m *Matrix) submatrixMethod(a interp.Args) (py.Object, error) {
	return m.submatrix("submatrix", a)
}

func (m *Matrix) trace(interp.Args) (py.Object, error) {
	if m.rows() != m.cols() {
		return nil, py.ExceptionNewf(py.ValueError, "trace needs a square matrix, got %dx%d", m.rows(), m.cols())
	}
	t := exact.RatFuncOf(m.env.Ring.Const(new(big.Rat)))
	for i := 0; i < m.rows(); i++ {
		e, _ := m.env.RatFunc(m.entry(i, i))
		var err error
		if t, err = t.Add(e); err != nil {
			return nil, err
		}
	}
	return m.env.RatFuncValue(t), nil
}

func (m *Matrix) rowList(interp.Args) (py.Object, error) {
	rows := make([]py.Object, m.rows())
	for i := range rows {
		rows[i] = m.row(i)
	}
	return py.NewListFromItems(rows), nil
}

func (m *Matrix) at(a interp.Args) (py.Object, error) {
	if err := byName(a, "at() takes values by name: M.at(a=2, b=3)"); err != nil {
		return nil, err
	}
	if m.q != nil {
		return m, nil
	}
	vals, err := m.env.keywordValues("at", a.Keywords())
	if err != nil {
		return nil, err
	}
	if m.f != nil {
		f, err := m.f.Eval(vals)
		if errors.Is(err, exact.ErrDivisionByZero) {
			return nil, py.ExceptionNewf(py.ZeroDivisionError, "M.at(): %v", err)
		}
		if err != nil {
			return nil, err
		}
		return m.env.RatFuncMatrix(f), nil
	}
	return m.env.PolyMatrix(m.p.Eval(vals)), nil
}

func (m *Matrix) characteristicPolynomial(a interp.Args) (py.Object, error) {
	t, err := m.env.namedVariable("characteristic_polynomial", a.Get("variable"))
	if err != nil {
		return nil, err
	}
	c, err := exact.CharacteristicPolynomial(m.q, t)
	if err != nil {
		return nil, err
	}
	return m.env.Polynomial(c), nil
}

func (m *Matrix) toFloat(interp.Args) (py.Object, error) { return &FloatMatrix{m: m.q.Float()}, nil }

// det is the exact determinant: a rational, an expanded polynomial, or a
// rational function in lowest terms.
func (m *Matrix) det() (py.Object, error) {
	if m.f != nil {
		d, err := m.f.Det()
		if err != nil {
			return nil, err
		}
		return m.env.RatFuncValue(d), nil
	}
	if m.q != nil {
		d, err := m.q.Det()
		if err != nil {
			return nil, err
		}
		return m.env.Rational(d), nil
	}
	d, err := m.p.Det()
	if err != nil {
		return nil, err
	}
	return m.env.PolyResult(d), nil
}

func (m *Matrix) submatrix(name string, a interp.Args) (*Matrix, error) {
	r, err := indexList(a.Get("rows"), name+" rows")
	if err != nil {
		return nil, err
	}
	c, err := indexList(a.Get("cols"), name+" cols")
	if err != nil {
		return nil, err
	}
	if m.q != nil {
		s, err := m.q.Submatrix(r, c)
		if err != nil {
			return nil, err
		}
		return m.env.RationalMatrix(s), nil
	}
	if m.f != nil {
		s, err := m.f.Submatrix(r, c)
		if err != nil {
			return nil, err
		}
		return m.env.RatFuncMatrix(s), nil
	}
	s, err := m.p.Submatrix(r, c)
	if err != nil {
		return nil, err
	}
	return m.env.PolyMatrix(s), nil
}

func (m *Matrix) row(i int) *py.List {
	row := make([]py.Object, m.cols())
	for j := range row {
		row[j] = m.entry(i, j)
	}
	return py.NewListFromItems(row)
}

// M__getitem__ reads M[i, j] (an entry) or M[i] (a row as a list).
func (m *Matrix) M__getitem__(key py.Object) (res py.Object, err error) {
	defer interp.Recover("matrix.__getitem__", &res, &err)
	if m.env.Float && m.q != nil {
		return (&FloatMatrix{m: m.q.Float()}).M__getitem__(key)
	}
	if m.env.Rounding && m.q != nil {
		return m.env.rounding(func(xs []py.Object) (py.Object, error) { return xs[0].(*Matrix).M__getitem__(key) }, m)
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
func (m *Matrix) M__len__() (res py.Object, err error) {
	defer interp.Recover("matrix.__len__", &res, &err)
	return py.Int(m.rows()), nil
}

// arith combines two matrices, over Q when both are rational, over the
// rational functions when either has such entries.
func (m *Matrix) arith(o py.Object, swap bool, q func(a, b *exact.Matrix) (*exact.Matrix, error), p func(a, b *exact.PolyMatrix) (*exact.PolyMatrix, error), f func(a, b *exact.RatFuncMatrix) (*exact.RatFuncMatrix, error)) (res py.Object, err error) {
	defer interp.Recover("matrix arithmetic", &res, &err)
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
			return nil, err
		}
		return m.env.RationalMatrix(r), nil
	}
	if a.f != nil || b.f != nil {
		r, err := f(a.RatLifted(), b.RatLifted())
		if err != nil {
			return nil, err
		}
		return m.env.RatFuncMatrix(r), nil
	}
	r, err := p(a.Lifted(), b.Lifted())
	if err != nil {
		return nil, err
	}
	return m.env.PolyMatrix(r), nil
}

// scale multiplies by an exact number, a polynomial or a rational function.
func (m *Matrix) scale(o py.Object) (py.Object, error) {
	if s, ok := ExactOf(o); ok && m.q != nil {
		return m.env.RationalMatrix(m.q.Scale(s)), nil
	}
	p, ok := m.env.Poly(o)
	if _, isFraction := o.(*RationalFunction); isFraction || (ok && m.f != nil) {
		f, _ := m.env.RatFunc(o)
		r, err := m.RatLifted().Scale(f)
		if err != nil {
			return nil, err
		}
		return m.env.RatFuncMatrix(r), nil
	}
	if !ok {
		return py.NotImplemented, nil
	}
	r, err := m.Lifted().Scale(p)
	if err != nil {
		return nil, err
	}
	return m.env.PolyMatrix(r), nil
}

// M__add__ adds entrywise.
func (m *Matrix) M__add__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("matrix.__add__", &res, &err)
	if m.env.Float || m.env.Rounding {
		return m.floatOperator(o, false, py.Add)
	}
	return m.arith(o, false, (*exact.Matrix).Add, (*exact.PolyMatrix).Add, (*exact.RatFuncMatrix).Add)
}

// M__sub__ subtracts entrywise.
func (m *Matrix) M__sub__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("matrix.__sub__", &res, &err)
	if m.env.Float || m.env.Rounding {
		return m.floatOperator(o, false, py.Sub)
	}
	return m.arith(o, false, (*exact.Matrix).Sub, (*exact.PolyMatrix).Sub, (*exact.RatFuncMatrix).Sub)
}

// M__mul__ is the matrix product, or scaling by a number or polynomial.
func (m *Matrix) M__mul__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("matrix.__mul__", &res, &err)
	if m.env.Float || m.env.Rounding {
		return m.floatOperator(o, false, py.Mul)
	}
	if _, ok := o.(*Matrix); ok {
		return m.arith(o, false, (*exact.Matrix).Mul, (*exact.PolyMatrix).Mul, (*exact.RatFuncMatrix).Mul)
	}
	return m.scale(o)
}

// M__rmul__ scales by a number or polynomial on the left.
func (m *Matrix) M__rmul__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("matrix.__rmul__", &res, &err)
	if m.env.Float || m.env.Rounding {
		return m.floatOperator(o, true, py.Mul)
	}
	return m.scale(o)
}

// M__truediv__ divides by an exact non-zero number.
func (m *Matrix) M__truediv__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("matrix.__truediv__", &res, &err)
	s, ok := ExactOf(o)
	if !ok {
		return py.NotImplemented, nil
	}
	if s.Sign() == 0 {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "matrix divided by zero")
	}
	return m.scale(m.env.Rational(new(big.Rat).Inv(s)))
}

// M__pow__ raises a square matrix to an integer power (negative: of the inverse).
func (m *Matrix) M__pow__(o, mod py.Object) (res py.Object, err error) {
	defer interp.Recover("matrix.__pow__", &res, &err)
	k, err := py.Index(o)
	if err != nil || mod != py.None {
		return nil, py.ExceptionNewf(py.TypeError, "a matrix power needs an integer exponent")
	}
	if k > MaxExponent || k < -MaxExponent {
		return nil, py.ExceptionNewf(py.OverflowError, "matrix exponent %d is too large (limit %d)", k, MaxExponent)
	}
	if m.q == nil && (k < 0 || m.f != nil) {
		return m.ratPower(int(k))
	}
	if m.q == nil {
		if m.rows() != m.cols() {
			return nil, py.ExceptionNewf(py.ValueError, "a matrix power needs a square matrix, got %dx%d", m.rows(), m.cols())
		}
		r := exact.PolyMatrixFrom(m.env.Ring, exact.Identity(m.rows()))
		for i := 0; i < int(k); i++ {
			if r, err = r.Mul(m.p); err != nil {
				return nil, err
			}
		}
		return m.env.PolyMatrix(r), nil
	}
	p, err := m.q.Power(int(k))
	if err != nil {
		return nil, err
	}
	return m.env.RationalMatrix(p), nil
}

// ratPower raises a square matrix of rational functions to an integer
// power, through the inverse for a negative one.
func (m *Matrix) ratPower(k int) (py.Object, error) {
	if m.rows() != m.cols() {
		return nil, py.ExceptionNewf(py.ValueError, "a matrix power needs a square matrix, got %dx%d", m.rows(), m.cols())
	}
	base := m.RatLifted()
	if k < 0 {
		var err error
		if base, err = base.Inverse(); err != nil {
			return nil, err
		}
		k = -k
	}
	r := exact.RatFuncMatrixFrom(exact.PolyMatrixFrom(m.env.Ring, exact.Identity(m.rows())))
	for i := 0; i < k; i++ {
		var err error
		if r, err = r.Mul(base); err != nil {
			return nil, err
		}
	}
	return m.env.RatFuncMatrix(r), nil
}

// M__neg__ negates every entry.
func (m *Matrix) M__neg__() (res py.Object, err error) {
	defer interp.Recover("matrix.__neg__", &res, &err)
	res, err = m.scale(py.Int(-1))
	if m.rounded && err == nil {
		res = marked(res)
	}
	return res, err
}

// M__eq__ is exact equality of shape and entries.
func (m *Matrix) M__eq__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("matrix.__eq__", &res, &err)
	other, ok := o.(*Matrix)
	if !ok {
		return py.NotImplemented, nil
	}
	if m.q != nil && other.q != nil {
		return py.NewBool(m.q.Equal(other.q)), nil
	}
	if m.f != nil || other.f != nil {
		return py.NewBool(m.RatLifted().Equal(other.RatLifted())), nil
	}
	return py.NewBool(m.Lifted().Equal(other.Lifted())), nil
}

// M__ne__ is the negation of M__eq__.
func (m *Matrix) M__ne__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("matrix.__ne__", &res, &err)
	eq, err := m.M__eq__(o)
	if err != nil || eq == py.NotImplemented {
		return eq, err
	}
	return py.NewBool(eq == py.False), nil
}

// M__str__ lays the matrix out as aligned rows.
func (m *Matrix) M__str__() (res py.Object, err error) {
	defer interp.Recover("matrix.__str__", &res, &err)
	cells := make([][]string, m.rows())
	for i := range cells {
		cells[i] = make([]string, m.cols())
		for j := range cells[i] {
			cells[i][j] = interp.Str(m.entry(i, j))
		}
	}
	return py.String(grid(cells)), nil
}

// M__repr__ is the expression that rebuilds the matrix.
func (m *Matrix) M__repr__() (res py.Object, err error) {
	defer interp.Recover("matrix.__repr__", &res, &err)
	switch {
	case m.q != nil:
		return py.String("matrix(" + m.q.String() + ")"), nil
	case m.f != nil:
		return py.String("matrix(" + m.f.String() + ")"), nil
	}
	return py.String("matrix(" + m.p.String() + ")"), nil
}

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
func (m *Matrix) floatMethod(name string, a interp.Args) (py.Object, error) {
	fm, err := FloatValue(m)
	if err != nil {
		return nil, err
	}
	if _, ok := FloatMatrixType.Dict[name]; !ok {
		return nil, NoCompanion("M." + name + "()")
	}
	attr, err := py.GetAttrString(fm, name)
	if err != nil {
		return nil, err
	}
	args, kw := a.Call()
	return py.Call(attr, args, kw)
}

// floatOperator applies an operator to the float64 companion of m.
// In the input-rounding run it applies the exact operator to the rounded
// values instead.
func (m *Matrix) floatOperator(o py.Object, swap bool, op func(a, b py.Object) (py.Object, error)) (py.Object, error) {
	if m.env.Rounding {
		return m.env.rounding(func(xs []py.Object) (py.Object, error) { return op(xs[0], xs[1]) }, swapped(m, o, swap)...)
	}
	fm, err := FloatValue(m)
	if err != nil {
		return nil, err
	}
	other, err := FloatValue(o)
	if err != nil {
		return nil, err
	}
	if swap {
		return op(other, fm)
	}
	return op(fm, other)
}

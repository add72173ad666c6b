package values

import (
	"fmt"

	"github.com/go-python/gpython/py"
	"gonum.org/v1/gonum/mat"

	"assay/exact"
	"assay/kernel/interp"
)

// FloatMatrix is a float64 matrix, the companion of an exact one: the
// float64 audit computes with it, through gonum.
type FloatMatrix struct{ m *mat.Dense }

// FloatMatrixType is the Python type of FloatMatrix.
var FloatMatrixType = py.NewType("float_matrix", "A float64 matrix (gonum): M.to_float().")

// Type returns FloatMatrixType.
func (m *FloatMatrix) Type() *py.Type { return FloatMatrixType }

func init() {
	setMethods(FloatMatrixType, []method[*FloatMatrix]{
		{"det", nil, "det() -> float64 determinant by gonum's LU factorisation", (*FloatMatrix).det},
		{"solve", params("b"), "solve(b) -> float64 solution by gonum", (*FloatMatrix).solve},
		{"inverse", nil, "inverse() -> float64 inverse by gonum", (*FloatMatrix).inverse},
		{"transpose", nil, "transpose() -> the transposed float64 matrix", (*FloatMatrix).transpose},
		{"rows", nil, "rows() -> the entries as a list of rows", (*FloatMatrix).rowList},
	})
}

func (m *FloatMatrix) det(interp.Args) (py.Object, error) {
	d, err := exact.FloatDet(m.m)
	return py.Float(d), err
}

func (m *FloatMatrix) solve(a interp.Args) (py.Object, error) {
	b, isVector, err := floatColumnOrMatrix(a.Get("b"))
	if err != nil {
		return nil, err
	}
	x, err := exact.FloatSolve(m.m, b)
	if err != nil {
		return nil, err
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
}

func (m *FloatMatrix) inverse(interp.Args) (py.Object, error) {
	var inv mat.Dense
	if err := inv.Inverse(m.m); err != nil {
		return nil, py.ExceptionNewf(py.ZeroDivisionError, "float64 inverse: %v", err)
	}
	return &FloatMatrix{m: &inv}, nil
}

func (m *FloatMatrix) transpose(interp.Args) (py.Object, error) {
	return &FloatMatrix{m: mat.DenseCopyOf(m.m.T())}, nil
}

func (m *FloatMatrix) rowList(interp.Args) (py.Object, error) {
	r, c := m.m.Dims()
	rows := make([]py.Object, r)
	for i := range rows {
		row := make([]py.Object, c)
		for j := range row {
			row[j] = py.Float(m.m.At(i, j))
		}
		rows[i] = py.NewListFromItems(row)
	}
	return py.NewListFromItems(rows), nil
}

func floatColumnOrMatrix(o py.Object) (*mat.Dense, bool, error) {
	if m, ok := o.(*FloatMatrix); ok {
		return m.m, false, nil
	}
	items, err := Sequence(o, "right-hand side")
	if err != nil {
		return nil, false, err
	}
	col := make([]float64, len(items))
	for i, it := range items {
		f, err := py.FloatAsFloat64(toFloatObject(it))
		if err != nil {
			return nil, false, py.ExceptionNewf(py.TypeError, "right-hand side entry %d is %s, not a number", i, interp.TypeName(it))
		}
		col[i] = f
	}
	return mat.NewDense(len(col), 1, col), true, nil
}

// M__getitem__ reads M[i, j] or a row M[i].
func (m *FloatMatrix) M__getitem__(key py.Object) (res py.Object, err error) {
	defer interp.Recover("float_matrix.__getitem__", &res, &err)
	r, c := m.m.Dims()
	index := func(o py.Object, n int) (int, error) {
		k, err := py.Index(o)
		if err != nil || int(k) >= n || int(k) < -n {
			return 0, py.ExceptionNewf(py.IndexError, "matrix index out of range")
		}
		if k < 0 {
			k += py.Int(n)
		}
		return int(k), nil
	}
	if t, ok := key.(py.Tuple); ok && len(t) == 2 {
		i, err := index(t[0], r)
		if err != nil {
			return nil, err
		}
		j, err := index(t[1], c)
		if err != nil {
			return nil, err
		}
		return py.Float(m.m.At(i, j)), nil
	}
	i, err := index(key, r)
	if err != nil {
		return nil, err
	}
	row := make([]py.Object, c)
	for j := range row {
		row[j] = py.Float(m.m.At(i, j))
	}
	return py.NewListFromItems(row), nil
}

// M__len__ is the number of rows.
func (m *FloatMatrix) M__len__() (res py.Object, err error) {
	defer interp.Recover("float_matrix.__len__", &res, &err)
	r, _ := m.m.Dims()
	return py.Int(r), nil
}

func (m *FloatMatrix) combine(o py.Object, product bool, op func(r *mat.Dense, a, b mat.Matrix)) (py.Object, error) {
	other, ok := floatMatrixOf(o)
	if !ok {
		return py.NotImplemented, nil
	}
	ar, ac := m.m.Dims()
	br, bc := other.Dims()
	if (product && ac != br) || (!product && (ar != br || ac != bc)) {
		return nil, py.ExceptionNewf(py.ValueError, "float64 matrices of shapes %dx%d and %dx%d do not fit", ar, ac, br, bc)
	}
	var r mat.Dense
	op(&r, m.m, other)
	return &FloatMatrix{m: &r}, nil
}

// floatMatrixOf accepts a float matrix, or an exact one (converted).
func floatMatrixOf(o py.Object) (*mat.Dense, bool) {
	switch x := o.(type) {
	case *FloatMatrix:
		return x.m, true
	case *Matrix:
		if x.q != nil {
			return x.q.Float(), true
		}
	}
	return nil, false
}

// M__add__ adds entrywise.
func (m *FloatMatrix) M__add__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("float_matrix.__add__", &res, &err)
	return m.combine(o, false, (*mat.Dense).Add)
}

// M__sub__ subtracts entrywise.
func (m *FloatMatrix) M__sub__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("float_matrix.__sub__", &res, &err)
	return m.combine(o, false, (*mat.Dense).Sub)
}

// M__mul__ is the matrix product, or scaling by a number.
func (m *FloatMatrix) M__mul__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("float_matrix.__mul__", &res, &err)
	if f, ok := FloatOf(o); ok {
		var r mat.Dense
		r.Scale(f, m.m)
		return &FloatMatrix{m: &r}, nil
	}
	return m.combine(o, true, (*mat.Dense).Mul)
}

// M__rmul__ scales by a number on the left.
func (m *FloatMatrix) M__rmul__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("float_matrix.__rmul__", &res, &err)
	if _, ok := FloatOf(o); ok {
		return m.M__mul__(o)
	}
	return py.NotImplemented, nil
}

// M__str__ lays the float matrix out as aligned rows.
func (m *FloatMatrix) M__str__() (res py.Object, err error) {
	defer interp.Recover("float_matrix.__str__", &res, &err)
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
func (m *FloatMatrix) M__repr__() (res py.Object, err error) {
	defer interp.Recover("float_matrix.__repr__", &res, &err)
	return m.M__str__()
}

// floatMatrixFromRows builds a gonum matrix from rows of numbers (floats
// included), or converts a matrix: matrix() and det() in float64 code.
func floatMatrixFromRows(o py.Object) (*FloatMatrix, error) {
	if m, ok := floatMatrixOf(o); ok {
		return &FloatMatrix{m: m}, nil
	}
	if m, ok := o.(*Matrix); ok && m.q == nil {
		return nil, NoCompanion("a matrix with polynomial entries")
	}
	rows, err := Sequence(o, "matrix rows")
	if err != nil {
		return nil, err
	}
	var data []float64
	cols := -1
	for i, row := range rows {
		items, err := Sequence(row, "a matrix row")
		if err != nil {
			return nil, err
		}
		if cols >= 0 && len(items) != cols || len(items) == 0 {
			return nil, py.ExceptionNewf(py.ValueError, "row %d of the matrix has %d entries", i, len(items))
		}
		cols = len(items)
		for _, it := range items {
			f, ok := FloatOf(it)
			if !ok {
				if r, isReal := it.(*Real); isReal {
					if f, err = r.float64(); err != nil {
						return nil, err
					}
					ok = true
				}
			}
			if !ok {
				return nil, NoCompanion("a matrix entry of type " + it.Type().Name)
			}
			data = append(data, f)
		}
	}
	if len(rows) == 0 {
		return nil, py.ExceptionNewf(py.ValueError, "matrix needs at least one row")
	}
	return &FloatMatrix{m: mat.NewDense(len(rows), cols, data)}, nil
}

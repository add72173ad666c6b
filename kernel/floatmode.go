package kernel

import (
	"math"
	"math/big"

	"github.com/go-python/gpython/py"
	"gonum.org/v1/gonum/mat"
)

// floatMode is on while the float64 companion of a claim runs: exact
// numbers then compute as float64 and matrices through gonum, as ordinary
// code would. A kernel process runs one cell at a time, so one flag serves.
var floatMode bool

// inFloat runs f with floatMode on.
func inFloat(f func() (py.Object, error)) (py.Object, error) {
	floatMode = true
	defer func() { floatMode = false }()
	return f()
}

// floatValue is the float64 companion of a value: rationals become floats,
// rational matrices gonum matrices, reals their nearest float64; lists and
// tuples are converted entry by entry; ints stay ints, as in float code.
func floatValue(o py.Object) (py.Object, error) {
	switch x := o.(type) {
	case *Rational:
		f, _ := x.v.Float64()
		return py.Float(f), nil
	case *Real:
		f, err := x.x.Float64(x.cap)
		if err != nil {
			return nil, realErr(err, x.cap)
		}
		return py.Float(f), nil
	case *Matrix:
		if x.q == nil {
			return nil, noCompanion("a matrix with polynomial entries")
		}
		return &FloatMatrix{m: x.q.Float()}, nil
	case *Polynomial:
		return nil, noCompanion("a polynomial")
	case *Simplex, *KVector:
		return nil, noCompanion("a " + o.Type().Name)
	case *py.List:
		items, err := floatValues(x.Items)
		return py.NewListFromItems(items), err
	case py.Tuple:
		items, err := floatValues(x)
		return py.Tuple(items), err
	}
	return o, nil
}

func floatValues(items []py.Object) ([]py.Object, error) {
	out := make([]py.Object, len(items))
	for i, it := range items {
		var err error
		if out[i], err = floatValue(it); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// noCompanionText starts the message of a value with no float64
// counterpart; the audit is then skipped for that claim, not failed.
const noCompanionText = "no float64 companion for "

func noCompanion(what string) error {
	return py.ExceptionNewf(py.NotImplementedError, "%s%s", noCompanionText, what)
}

// floatOf reads a float64 companion value: a float, an int, or an exact
// number (converted).
func floatOf(o py.Object) (float64, bool) {
	switch x := o.(type) {
	case py.Float:
		return float64(x), true
	case py.Int:
		return float64(x), true
	case py.Bool:
		if x {
			return 1, true
		}
		return 0, true
	}
	if q, ok := exactOf(o); ok {
		f, _ := q.Float64()
		return f, true
	}
	return 0, false
}

// floatEntries flattens a float64 companion value (number, list, tuple,
// gonum matrix) into its numbers.
func floatEntries(o py.Object) ([]float64, bool) {
	if f, ok := floatOf(o); ok {
		return []float64{f}, true
	}
	switch x := o.(type) {
	case *Real: // an exact value the float64 code passed through untouched
		f, err := x.x.Float64(x.cap)
		return []float64{f}, err == nil
	case *Matrix:
		if x.q != nil {
			return floatEntries(&FloatMatrix{m: x.q.Float()})
		}
	case *FloatMatrix:
		r, c := x.m.Dims()
		out := make([]float64, 0, r*c)
		for i := 0; i < r; i++ {
			for j := 0; j < c; j++ {
				out = append(out, x.m.At(i, j))
			}
		}
		return out, true
	}
	if items, ok := listLike(o); ok {
		var out []float64
		for _, it := range items {
			fs, ok := floatEntries(it)
			if !ok {
				return nil, false
			}
			out = append(out, fs...)
		}
		return out, true
	}
	return nil, false
}

// exactEntries flattens an exact value (number, real, matrix, list) into
// high-precision approximations, in the same order as floatEntries.
func exactEntries(o py.Object) ([]*big.Float, bool) {
	approx := func(q *big.Rat) *big.Float { return new(big.Float).SetPrec(128).SetRat(q) }
	if q, ok := exactOf(o); ok {
		return []*big.Float{approx(q)}, true
	}
	switch x := o.(type) {
	case *Real:
		iv, err := x.x.Approx(120, x.cap)
		if err != nil {
			return nil, false
		}
		mid := new(big.Rat).Add(iv.Lo, iv.Hi)
		return []*big.Float{approx(mid.Quo(mid, big.NewRat(2, 1)))}, true
	case *Matrix:
		if x.q == nil {
			return nil, false
		}
		var out []*big.Float
		for i := 0; i < x.q.Rows(); i++ {
			for j := 0; j < x.q.Cols(); j++ {
				out = append(out, approx(x.q.At(i, j)))
			}
		}
		return out, true
	}
	if items, ok := listLike(o); ok {
		var out []*big.Float
		for _, it := range items {
			es, ok := exactEntries(it)
			if !ok {
				return nil, false
			}
			out = append(out, es...)
		}
		return out, true
	}
	return nil, false
}

// float64Digits is the number of decimal digits a float64 carries.
const float64Digits = 15.95

// sideError is the worst relative error of float64 entries against exact
// ones (absolute where the exact entry is 0) and the digits it costs.
func companionError(exactSide []*big.Float, floatSide []float64) (worst float64, lost float64) {
	for i, e := range exactSide {
		v, _ := e.Float64()
		err := math.Abs(floatSide[i] - v)
		if math.IsNaN(floatSide[i]) || math.IsInf(floatSide[i], 0) {
			err = math.Inf(1)
		}
		if v != 0 {
			err /= math.Abs(v)
		}
		worst = math.Max(worst, err)
	}
	correct := float64Digits
	if worst > 0 {
		correct = math.Min(float64Digits, -math.Log10(worst))
	}
	return worst, math.Max(0, float64Digits-math.Max(0, correct))
}

// FloatMatrix operations, so float64 companions of matrix code run.
func init() {
	FloatMatrixType.Dict["inverse"] = py.MustNewMethod("inverse", func(self py.Object) (py.Object, error) {
		var inv mat.Dense
		if err := inv.Inverse(self.(*FloatMatrix).m); err != nil {
			return nil, py.ExceptionNewf(py.ZeroDivisionError, "float64 inverse: %v", err)
		}
		return &FloatMatrix{m: &inv}, nil
	}, 0, "inverse() -> float64 inverse by gonum")
	FloatMatrixType.Dict["transpose"] = py.MustNewMethod("transpose", func(self py.Object) (py.Object, error) {
		return &FloatMatrix{m: mat.DenseCopyOf(self.(*FloatMatrix).m.T())}, nil
	}, 0, "transpose() -> the transposed float64 matrix")
	FloatMatrixType.Dict["rows"] = py.MustNewMethod("rows", func(self py.Object) (py.Object, error) {
		m := self.(*FloatMatrix).m
		r, c := m.Dims()
		rows := make([]py.Object, r)
		for i := range rows {
			row := make([]py.Object, c)
			for j := range row {
				row[j] = py.Float(m.At(i, j))
			}
			rows[i] = py.NewListFromItems(row)
		}
		return py.NewListFromItems(rows), nil
	}, 0, "rows() -> the entries as a list of rows")
}

// M__getitem__ reads M[i, j] or a row M[i].
func (m *FloatMatrix) M__getitem__(key py.Object) (py.Object, error) {
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
func (m *FloatMatrix) M__len__() (py.Object, error) { r, _ := m.m.Dims(); return py.Int(r), nil }

func (m *FloatMatrix) combine(o py.Object, op func(a, b *mat.Dense) (*mat.Dense, error)) (py.Object, error) {
	other, ok := floatMatrixOf(o)
	if !ok {
		return py.NotImplemented, nil
	}
	r, err := op(m.m, other)
	if err != nil {
		return nil, err
	}
	return &FloatMatrix{m: r}, nil
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

func shapeCheck(a, b *mat.Dense, product bool) error {
	ar, ac := a.Dims()
	br, bc := b.Dims()
	if (product && ac != br) || (!product && (ar != br || ac != bc)) {
		return py.ExceptionNewf(py.ValueError, "float64 matrices of shapes %dx%d and %dx%d do not fit", ar, ac, br, bc)
	}
	return nil
}

// M__add__ adds entrywise.
func (m *FloatMatrix) M__add__(o py.Object) (py.Object, error) {
	return m.combine(o, func(a, b *mat.Dense) (*mat.Dense, error) {
		if err := shapeCheck(a, b, false); err != nil {
			return nil, err
		}
		var r mat.Dense
		r.Add(a, b)
		return &r, nil
	})
}

// M__sub__ subtracts entrywise.
func (m *FloatMatrix) M__sub__(o py.Object) (py.Object, error) {
	return m.combine(o, func(a, b *mat.Dense) (*mat.Dense, error) {
		if err := shapeCheck(a, b, false); err != nil {
			return nil, err
		}
		var r mat.Dense
		r.Sub(a, b)
		return &r, nil
	})
}

// M__mul__ is the matrix product, or scaling by a number.
func (m *FloatMatrix) M__mul__(o py.Object) (py.Object, error) {
	if f, ok := floatOf(o); ok {
		var r mat.Dense
		r.Scale(f, m.m)
		return &FloatMatrix{m: &r}, nil
	}
	return m.combine(o, func(a, b *mat.Dense) (*mat.Dense, error) {
		if err := shapeCheck(a, b, true); err != nil {
			return nil, err
		}
		var r mat.Dense
		r.Mul(a, b)
		return &r, nil
	})
}

// M__rmul__ scales by a number on the left.
func (m *FloatMatrix) M__rmul__(o py.Object) (py.Object, error) {
	if _, ok := floatOf(o); ok {
		return m.M__mul__(o)
	}
	return py.NotImplemented, nil
}

// floatRealFunction is the float64 counterpart of a certified function.
var floatRealFunction = map[string]func(float64) float64{
	"sqrt": math.Sqrt, "exp": math.Exp, "log": math.Log, "sin": math.Sin, "cos": math.Cos, "acos": math.Acos,
}

// floatMatrixFromRows builds a gonum matrix from rows of numbers (floats
// included), or converts a matrix: matrix() and det() in float64 code.
func floatMatrixFromRows(o py.Object) (py.Object, error) {
	if m, ok := floatMatrixOf(o); ok {
		return &FloatMatrix{m: m}, nil
	}
	if m, ok := o.(*Matrix); ok && m.q == nil {
		return nil, noCompanion("a matrix with polynomial entries")
	}
	rows, err := sequence(o, "matrix rows")
	if err != nil {
		return nil, err
	}
	var data []float64
	cols := -1
	for i, row := range rows {
		items, err := sequence(row, "a matrix row")
		if err != nil {
			return nil, err
		}
		if cols >= 0 && len(items) != cols || len(items) == 0 {
			return nil, py.ExceptionNewf(py.ValueError, "row %d of the matrix has %d entries", i, len(items))
		}
		cols = len(items)
		for _, it := range items {
			f, ok := floatOf(it)
			if !ok {
				if r, isReal := it.(*Real); isReal {
					v, err := r.x.Float64(r.cap)
					if err != nil {
						return nil, realErr(err, r.cap)
					}
					f, ok = v, true
				}
			}
			if !ok {
				return nil, noCompanion("a matrix entry of type " + it.Type().Name)
			}
			data = append(data, f)
		}
	}
	if len(rows) == 0 {
		return nil, py.ExceptionNewf(py.ValueError, "matrix needs at least one row")
	}
	return &FloatMatrix{m: mat.NewDense(len(rows), cols, data)}, nil
}

package values

import (
	"math/big"

	"github.com/go-python/gpython/py"
)

// The float64 companions of notebook values: what the float64 audit
// computes with, and how its sides are read back.

// NoCompanionText starts the message of a value with no float64
// counterpart; the audit is then skipped for that claim, not failed.
const NoCompanionText = "no float64 companion for "

// NoCompanion is the error of a value with no float64 counterpart.
func NoCompanion(what string) error {
	return py.ExceptionNewf(py.NotImplementedError, "%s%s", NoCompanionText, what)
}

// FloatValue is the float64 companion of a value: rationals become floats,
// rational matrices gonum matrices, reals their nearest float64; lists and
// tuples are converted entry by entry; ints stay ints, as in float code.
func FloatValue(o py.Object) (py.Object, error) {
	switch x := o.(type) {
	case *Rational:
		f, _ := x.v.Float64()
		return py.Float(f), nil
	case *Real:
		f, err := x.float64()
		if err != nil {
			return nil, err
		}
		return py.Float(f), nil
	case *Matrix:
		if x.f != nil {
			return nil, NoCompanion("a matrix with rational-function entries")
		}
		if x.q == nil {
			return nil, NoCompanion("a matrix with polynomial entries")
		}
		return &FloatMatrix{m: x.q.Float()}, nil
	case *Polynomial:
		return nil, NoCompanion("a polynomial")
	case *RationalFunction:
		return nil, NoCompanion("a rational function")
	case *Simplex, *KVector:
		return nil, NoCompanion("a " + o.Type().Name)
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
		if out[i], err = FloatValue(it); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// FloatOf reads a float64 companion value: a float, an int, or an exact
// number (converted).
func FloatOf(o py.Object) (float64, bool) {
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
	if q, ok := ExactOf(o); ok {
		f, _ := q.Float64()
		return f, true
	}
	return 0, false
}

// FloatEntries flattens a float64 companion value (number, list, tuple,
// gonum matrix) into its numbers.
func FloatEntries(o py.Object) ([]float64, bool) {
	if f, ok := FloatOf(o); ok {
		return []float64{f}, true
	}
	switch x := o.(type) {
	case *Real: // an exact value the float64 code passed through untouched
		f, err := x.x.Float64(x.env.Cap)
		return []float64{f}, err == nil
	case *Matrix:
		if x.q != nil {
			return FloatEntries(&FloatMatrix{m: x.q.Float()})
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
	return flatten(o, FloatEntries)
}

// ExactEntries flattens an exact value (number, real, matrix, list) into
// high-precision approximations, in the same order as FloatEntries.
func ExactEntries(o py.Object) ([]*big.Float, bool) {
	approx := func(q *big.Rat) *big.Float { return new(big.Float).SetPrec(128).SetRat(q) }
	if q, ok := ExactOf(o); ok {
		return []*big.Float{approx(q)}, true
	}
	switch x := o.(type) {
	case *Real:
		iv, err := x.x.Approx(120, x.env.Cap)
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
	return flatten(o, ExactEntries)
}

// flatten applies entries to each item of a list or tuple and joins them.
func flatten[T any](o py.Object, entries func(py.Object) ([]T, bool)) ([]T, bool) {
	var items []py.Object
	switch x := o.(type) {
	case *py.List:
		items = x.Items
	case py.Tuple:
		items = x
	default:
		return nil, false
	}
	var out []T
	for _, it := range items {
		es, ok := entries(it)
		if !ok {
			return nil, false
		}
		out = append(out, es...)
	}
	return out, true
}

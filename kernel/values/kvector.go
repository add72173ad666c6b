package values

import (
	"fmt"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/exact/geom"
	"assay/kernel/interp"
)

// KVector is a k-vector of the exterior algebra in a cell.
type KVector struct {
	w   *geom.KVector
	env *Env
}

// KVectorType is the Python type of KVector.
var KVectorType = py.NewType("kvector", "A k-vector: wedge(u, v) for vectors u, v.")

// Type returns KVectorType.
func (k *KVector) Type() *py.Type { return KVectorType }

// Value is the k-vector.
func (k *KVector) Value() *geom.KVector { return k.w }

// KVector makes a notebook k-vector.
func (e *Env) KVector(w *geom.KVector) *KVector { return &KVector{w: w, env: e} }

func (e *Env) kvectorBuiltins(b py.StringDict) {
	setBuiltins(b, e.exactOnly([]builtin{
		{"wedge", params("*vectors", "**vectors"), "wedge(u, v, ...) -> the k-vector u ∧ v ∧ ...", e.wedge},
	}))
}

func (e *Env) wedge(a interp.Args) (py.Object, error) {
	args := a.Rest()
	if len(a.Keywords()) > 0 || len(args) == 0 {
		return nil, py.ExceptionNewf(py.TypeError, "wedge(u, v, ...) takes one or more vectors")
	}
	vs := make([][]*big.Rat, len(args))
	for i, v := range args {
		var err error
		if vs[i], err = rationalVector(v, fmt.Sprintf("wedge: vector %d", i)); err != nil {
			return nil, err
		}
	}
	w, err := geom.Wedge(vs...)
	if err != nil {
		return nil, geomErr("wedge", err)
	}
	return e.KVector(w), nil
}

func init() {
	setMethods(KVectorType, []method[*KVector]{
		{"norm_sq", nil, "norm_sq() -> the squared norm (the Gram determinant of the factors)", func(k *KVector, _ interp.Args) (py.Object, error) {
			return k.env.Rational(k.w.NormSq()), nil
		}},
		{"grade", nil, "grade() -> k", func(k *KVector, _ interp.Args) (py.Object, error) { return py.Int(k.w.Grade()), nil }},
		{"components", nil, "components() -> [((i1, ..., ik), coefficient), ...] on the standard basis blades", (*KVector).components},
	})
}

func (k *KVector) components(interp.Args) (py.Object, error) {
	var out []py.Object
	for _, b := range k.w.Components() {
		idx := make(py.Tuple, len(b.Index))
		for i, x := range b.Index {
			idx[i] = py.Int(x)
		}
		out = append(out, py.Tuple{idx, k.env.Rational(b.Coef)})
	}
	return py.NewListFromItems(out), nil
}

func (k *KVector) arith(o py.Object, op func(a, b *geom.KVector) (*geom.KVector, error)) (res py.Object, err error) {
	defer interp.Recover("k-vector arithmetic", &res, &err)
	other, ok := o.(*KVector)
	if !ok {
		return py.NotImplemented, nil
	}
	r, err := op(k.w, other.w)
	if err != nil {
		return nil, geomErr("k-vector", err)
	}
	return k.env.KVector(r), nil
}

// M__add__ adds k-vectors of the same grade and ambient dimension.
func (k *KVector) M__add__(o py.Object) (py.Object, error) { return k.arith(o, (*geom.KVector).Add) }

// M__sub__ subtracts.
func (k *KVector) M__sub__(o py.Object) (py.Object, error) { return k.arith(o, (*geom.KVector).Sub) }

// M__mul__ scales by an exact number.
func (k *KVector) M__mul__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("kvector.__mul__", &res, &err)
	c, ok := ExactOf(o)
	if !ok {
		return py.NotImplemented, nil
	}
	return k.env.KVector(k.w.Scale(c)), nil
}

// M__rmul__ scales by an exact number.
func (k *KVector) M__rmul__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("kvector.__rmul__", &res, &err)
	return k.M__mul__(o)
}

// M__neg__ negates.
func (k *KVector) M__neg__() (res py.Object, err error) {
	defer interp.Recover("kvector.__neg__", &res, &err)
	return k.env.KVector(k.w.Scale(big.NewRat(-1, 1))), nil
}

// M__eq__ compares exactly.
func (k *KVector) M__eq__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("kvector.__eq__", &res, &err)
	other, ok := o.(*KVector)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(k.w.Equal(other.w)), nil
}

// M__str__ prints the blades, e.g. "3*e1^e2 - e1^e3".
func (k *KVector) M__str__() (res py.Object, err error) {
	defer interp.Recover("kvector.__str__", &res, &err)
	return py.String(k.w.String()), nil
}

// M__repr__ prints the same as str.
func (k *KVector) M__repr__() (res py.Object, err error) {
	defer interp.Recover("kvector.__repr__", &res, &err)
	return k.M__str__()
}

package pyext

import (
	"fmt"
	"reflect"
	"slices"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/kernel/interp"
)

// positional checks the arguments of a function that, like most of
// CPython's built-in ones, takes between min and max arguments by position
// and none by keyword.
func positional(name string, args py.Tuple, kwargs py.StringDict, min, max int) error {
	if len(kwargs) != 0 {
		return py.ExceptionNewf(py.TypeError, "%s() takes no keyword arguments", name)
	}
	return nargs(name, args, min, max)
}

// nargs checks the number of positional arguments.
func nargs(name string, args py.Tuple, min, max int) error {
	n := len(args)
	switch {
	case n < min && min == max:
		return py.ExceptionNewf(py.TypeError, "%s() takes exactly %d argument%s (%d given)", name, min, plural(min), n)
	case n < min:
		return py.ExceptionNewf(py.TypeError, "%s() takes at least %d argument%s (%d given)", name, min, plural(min), n)
	case n > max && min == max:
		return py.ExceptionNewf(py.TypeError, "%s() takes exactly %d argument%s (%d given)", name, max, plural(max), n)
	case n > max:
		return py.ExceptionNewf(py.TypeError, "%s() takes at most %d argument%s (%d given)", name, max, plural(max), n)
	}
	return nil
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

// typeName is the bare name of o's type. CPython's messages that pyext
// reproduces quote it bare ("expected str instance, int found"), where
// interp.TypeName reads as prose ("a list").
func typeName(o py.Object) string {
	if o == nil || o.Type() == nil {
		return "object"
	}
	return o.Type().Name
}

// isNone reports whether o is absent or None.
func isNone(o py.Object) bool {
	if o == nil {
		return true
	}
	_, ok := o.(py.NoneType)
	return ok
}

// isUserInstance reports whether o is an instance of a class defined in
// Python (gpython represents those as *py.Type values whose type is the
// class).
func isUserInstance(o py.Object) bool {
	t, ok := o.(*py.Type)
	if !ok || t.ObjectType == nil {
		return false
	}
	cls := t.ObjectType
	return cls != py.ObjectType && cls != py.TypeType && t.Base == cls
}

// userMethod returns the bound method name of a Python-defined instance, if
// its class (or a base) defines it.
func userMethod(o py.Object, name string) (py.Object, bool, error) {
	if !isUserInstance(o) {
		return nil, false, nil
	}
	if o.(*py.Type).ObjectType.NativeGetAttrOrNil(name) == nil {
		return nil, false, nil
	}
	m, err := py.GetAttrString(o, name)
	if err != nil {
		return nil, true, err
	}
	return m, true, nil
}

// callUser calls the special method name of a Python-defined instance.
// found is false when o is not such an instance or its class does not
// define the method.
func callUser(o py.Object, name string, args ...py.Object) (res py.Object, found bool, err error) {
	m, found, err := userMethod(o, name)
	if !found || err != nil {
		return nil, found, err
	}
	res, err = py.Call(m, py.Tuple(args), nil)
	return res, true, err
}

// iterate calls fn for every item of the iterable obj.
func iterate(obj py.Object, fn func(py.Object) error) error {
	if items, ok := interp.Items(obj); ok {
		// A copy, so that fn may change the list (l.extend(l)).
		for _, item := range slices.Clone(items) {
			if err := fn(item); err != nil {
				return err
			}
		}
		return nil
	}
	it, err := py.Iter(obj)
	if err != nil {
		return err
	}
	for {
		item, err := py.Next(it)
		if err != nil {
			if py.IsException(py.StopIteration, err) {
				return nil
			}
			return err
		}
		if err := fn(item); err != nil {
			return err
		}
	}
}

// collect returns the items of the iterable obj.
func collect(obj py.Object) ([]py.Object, error) {
	var out []py.Object
	err := iterate(obj, func(item py.Object) error {
		out = append(out, item)
		return nil
	})
	return out, err
}

// truth is Python's bool(o).
func truth(o py.Object) (bool, error) {
	if res, found, err := callUser(o, "__bool__"); found {
		if err != nil {
			return false, err
		}
		b, ok := res.(py.Bool)
		if !ok {
			return false, py.ExceptionNewf(py.TypeError, "__bool__ should return bool, returned %s", typeName(res))
		}
		return bool(b), nil
	}
	if res, found, err := callUser(o, "__len__"); found {
		if err != nil {
			return false, err
		}
		n, err := py.IndexInt(res)
		return n != 0, err
	}
	if isUserInstance(o) {
		return true, nil
	}
	return py.ObjectIsTrue(o)
}

// sameObject reports whether a and b are the same object (Python's "is")
// for reference types; value types compare false here and are left to
// eqObjects.
func sameObject(a, b py.Object) bool {
	va, vb := reflect.ValueOf(a), reflect.ValueOf(b)
	if va.Type() != vb.Type() {
		return false
	}
	switch va.Kind() {
	case reflect.Pointer, reflect.Map, reflect.Chan, reflect.Func, reflect.UnsafePointer:
		return va.Pointer() == vb.Pointer()
	}
	return false
}

// userCompare asks Python classes for a op b: a's method op, then b's
// reflected method. found is false when neither is defined or both answer
// NotImplemented.
func userCompare(a, b py.Object, op, reflected string) (result, found bool, err error) {
	for _, c := range []struct {
		self, other py.Object
		name        string
	}{{a, b, op}, {b, a, reflected}} {
		res, defined, err := callUser(c.self, c.name, c.other)
		if err != nil {
			return false, true, err
		}
		if defined && res != py.NotImplemented {
			result, err := truth(res)
			return result, true, err
		}
	}
	return false, false, nil
}

// eqObjects is Python's "a is b or a == b", as used by list.index,
// list.count, list.remove and the in operator of containers.
func eqObjects(a, b py.Object) (bool, error) {
	if a == nil || b == nil {
		return a == nil && b == nil, nil
	}
	if sameObject(a, b) {
		return true, nil
	}
	if eq, found, err := userCompare(a, b, "__eq__", "__eq__"); found || err != nil {
		return eq, err
	}
	if isUserInstance(a) || isUserInstance(b) {
		return false, nil
	}
	res, err := py.Eq(a, b)
	if err != nil {
		// gpython raises TypeError for == between two objects of a type
		// without __eq__; Python falls back to identity.
		if isUnsupportedOperand(err) {
			return false, nil
		}
		return false, err
	}
	return truth(res)
}

func isUnsupportedOperand(err error) bool {
	return py.IsException(py.TypeError, err) && strings.Contains(fmt.Sprint(err), "unsupported operand type")
}

// lessThan is Python's a < b, extended where gpython's operator lacks it:
// tuples and lists compare lexicographically, and instances of Python
// classes use their __lt__ (or the reflected __gt__).
func lessThan(a, b py.Object) (bool, error) {
	switch x := a.(type) {
	case py.Tuple:
		if y, ok := b.(py.Tuple); ok {
			return seqLess(x, y)
		}
	case *py.List:
		if y, ok := b.(*py.List); ok {
			return seqLess(x.Items, y.Items)
		}
	}
	if lt, found, err := userCompare(a, b, "__lt__", "__gt__"); found || err != nil {
		return lt, err
	}
	if isUserInstance(a) || isUserInstance(b) {
		return false, py.ExceptionNewf(py.TypeError, "'<' not supported between instances of '%s' and '%s'", typeName(a), typeName(b))
	}
	res, err := py.Lt(a, b)
	if err != nil {
		return false, err
	}
	return truth(res)
}

func seqLess(x, y []py.Object) (bool, error) {
	for i := 0; i < len(x) && i < len(y); i++ {
		eq, err := eqObjects(x[i], y[i])
		if err != nil {
			return false, err
		}
		if !eq {
			return lessThan(x[i], y[i])
		}
	}
	return len(x) < len(y), nil
}

// keyError makes KeyError(key), whose str() is repr(key) as in CPython.
func keyError(key py.Object) error {
	return &py.Exception{Base: py.KeyError, Args: py.Tuple{key}, Dict: py.StringDict{}}
}

// toInt converts an object supporting __index__ to a Go int.
func toInt(o py.Object) (int, error) {
	if b, ok := o.(py.Bool); ok {
		return int(boolInt(b)), nil
	}
	return py.IndexInt(o)
}

// adjustIndices applies Python's slice-index rules for the optional start
// and end arguments of str and list methods, args[0] and args[1]. end is
// clamped to [0, n]; start is clamped below at 0 but may exceed n (callers
// treat start > end as an empty range).
func adjustIndices(args py.Tuple, n int) (start, end int, err error) {
	start, end = 0, n
	if len(args) > 0 && !isNone(args[0]) {
		if start, err = toInt(args[0]); err != nil {
			return 0, 0, err
		}
	}
	if len(args) > 1 && !isNone(args[1]) {
		if end, err = toInt(args[1]); err != nil {
			return 0, 0, err
		}
	}
	if end > n {
		end = n
	} else if end < 0 {
		end += n
		if end < 0 {
			end = 0
		}
	}
	if start < 0 {
		start += n
		if start < 0 {
			start = 0
		}
	}
	return start, end, nil
}

// receiver resolves the object a method of typ operates on: self in a bound
// call ("x".upper(), l.pop()), or the first argument in a call through the
// type (str.upper("x"), map(str.strip, lines)), where self is not a T.
func receiver[T py.Object](typ *py.Type, name string, self py.Object, args py.Tuple) (T, py.Tuple, error) {
	var zero T
	if v, ok := self.(T); ok {
		return v, args, nil
	}
	if len(args) == 0 {
		return zero, nil, py.ExceptionNewf(py.TypeError, "descriptor '%s' of '%s' object needs an argument", name, typ.Name)
	}
	v, ok := args[0].(T)
	if !ok {
		return zero, nil, py.ExceptionNewf(py.TypeError, "descriptor '%s' requires a '%s' object but received a '%s'", name, typ.Name, typeName(args[0]))
	}
	return v, args[1:], nil
}

// method registers a method of typ through interp's panic guard; fn gets
// the receiver whether the call was bound or made through the type.
func method[T py.Object](typ *py.Type, name, doc string, fn func(self T, args py.Tuple, kwargs py.StringDict) (py.Object, error)) {
	typ.Dict[name] = interp.Method(name, doc, func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		v, args, err := receiver[T](typ, name, self, args)
		if err != nil {
			return nil, err
		}
		return fn(v, args, kwargs)
	})
}

// positionalMethod registers a method of typ taking positional arguments
// only, at least min and at most max of them, as CPython's methods of the
// built-in types do.
func positionalMethod[T py.Object](typ *py.Type, name string, min, max int, doc string, fn func(self T, args py.Tuple) (py.Object, error)) {
	method(typ, name, doc, func(v T, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		if err := positional(name, args, kwargs, min, max); err != nil {
			return nil, err
		}
		return fn(v, args)
	})
}

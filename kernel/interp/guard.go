package interp

import (
	"fmt"

	"github.com/go-python/gpython/py"
)

// Func makes a notebook builtin from Go, through the one panic guard.
func Func(name, doc string, fn func(args py.Tuple, kw py.StringDict) (py.Object, error)) *py.Method {
	label := name + "()" // made once, not on every call
	return py.MustNewMethod(name, func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
		return Guard(label, func() (py.Object, error) { return fn(args, kw) })
	}, 0, doc)
}

// Method makes a method for a type's dictionary: self is the receiver (or,
// called through the type, the first argument is), through the one panic
// guard.
func Method(name, doc string, fn func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error)) *py.Method {
	label := name + "()"
	return py.MustNewMethod(name, func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
		return Guard(label, func() (py.Object, error) { return fn(self, args, kw) })
	}, 0, doc)
}

// PositionalMethod is Method for a method that takes no keyword
// arguments: the interpreter calls Method's form with an empty keyword
// dictionary it makes on every call, and this one with none, refusing
// keywords itself ("volume_sq() takes no keyword arguments").
func PositionalMethod(name, doc string, fn func(self py.Object, args py.Tuple) (py.Object, error)) *py.Method {
	label := name + "()"
	return py.MustNewMethod(name, func(self py.Object, args py.Tuple) (py.Object, error) {
		return Guard(label, func() (py.Object, error) { return fn(self, args) })
	}, 0, doc)
}

// Guard runs the Go code behind a builtin or method named name, through
// Recover.
func Guard(name string, fn func() (py.Object, error)) (res py.Object, err error) {
	defer Recover(name, &res, &err)
	return fn()
}

// Recover is the one panic guard. Deferred directly by the Go code behind
// a builtin, method or operator (defer interp.Recover("+", &res, &err)), it
// turns a Go panic into a RuntimeError the notebook can catch, naming the
// function and never carrying a Go stack into a report; a Python exception
// raised by panic inside the interpreter passes on as itself; and any
// error returned passes through Exception.
func Recover(name string, res *py.Object, err *error) {
	r := recover()
	if r == nil {
		*err = Exception(*err)
		if *err != nil {
			*res = nil
		}
		return
	}
	recovered(r, name, res, err)
}

// recovered is what Recover makes of a recovered panic r.
func recovered(r any, name string, res *py.Object, err *error) {
	*res = nil
	switch e := r.(type) {
	case *py.Exception:
		*err = e
	case py.ExceptionInfo:
		*err = e
	default:
		*err = py.ExceptionNewf(py.RuntimeError, "internal error in %s: %v (a fault in assay, not in the notebook)", name, r)
	}
}

// Errorf is a shorthand for a Python exception of the given type.
func Errorf(typ *py.Type, format string, args ...any) error {
	return py.ExceptionNewf(typ, "%s", fmt.Sprintf(format, args...))
}

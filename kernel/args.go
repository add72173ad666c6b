package kernel

import (
	"fmt"
	"runtime/debug"

	"github.com/go-python/gpython/py"
)

// builtin makes a Python function from Go. A Go panic inside it becomes a
// RuntimeError naming the function instead of taking the kernel down.
func builtin(name, doc string, f func(args py.Tuple, kw py.StringDict) (py.Object, error)) *py.Method {
	return py.MustNewMethod(name, func(self py.Object, args py.Tuple, kw py.StringDict) (res py.Object, err error) {
		defer func() {
			if r := recover(); r != nil {
				if e, ok := r.(*py.Exception); ok {
					err = e // a Python exception raised by panic inside the interpreter
					return
				}
				err = py.ExceptionNewf(py.RuntimeError, "internal error in %s(): %v\n%s", name, r, debug.Stack())
			}
		}()
		return f(args, kw)
	}, 0, doc)
}

// bind matches positional and keyword arguments to named slots. The first
// `required` names must be given; missing optional slots are nil.
func bind(fn string, args py.Tuple, kw py.StringDict, names []string, required int) ([]py.Object, error) {
	if len(args) > len(names) {
		return nil, py.ExceptionNewf(py.TypeError, "%s() takes at most %d arguments (%d given)", fn, len(names), len(args))
	}
	out := make([]py.Object, len(names))
	copy(out, args)
	for k, v := range kw {
		found := false
		for i, n := range names {
			if n == k {
				if out[i] != nil {
					return nil, py.ExceptionNewf(py.TypeError, "%s() got two values for %q", fn, k)
				}
				out[i], found = v, true
			}
		}
		if !found {
			return nil, py.ExceptionNewf(py.TypeError, "%s() has no argument %q (it takes %v)", fn, k, names)
		}
	}
	for i := 0; i < required; i++ {
		if out[i] == nil {
			return nil, py.ExceptionNewf(py.TypeError, "%s() is missing its argument %q", fn, names[i])
		}
	}
	return out, nil
}

// intArg reads an optional integer argument.
func intArg(fn, name string, o py.Object, def int64) (int64, error) {
	if o == nil || o == py.None {
		return def, nil
	}
	if r, ok := o.(*Rational); ok && r.v.IsInt() && r.v.Num().IsInt64() {
		return r.v.Num().Int64(), nil
	}
	switch x := o.(type) {
	case py.Int:
		return int64(x), nil
	case *py.BigInt:
		if v, err := x.GoInt64(); err == nil {
			return v, nil
		}
	}
	return 0, py.ExceptionNewf(py.TypeError, "%s(): %s must be an integer, got %s", fn, name, typeName(o))
}

// stringArg reads a required string argument.
func stringArg(fn, name string, o py.Object) (string, error) {
	s, ok := o.(py.String)
	if !ok {
		return "", py.ExceptionNewf(py.TypeError, "%s(): %s must be a string, got %s", fn, name, typeName(o))
	}
	return string(s), nil
}

// str is str(o), or a placeholder if o cannot print itself.
func str(o py.Object) string {
	s, err := py.StrAsString(o)
	if err != nil {
		return fmt.Sprintf("<%s>", o.Type().Name)
	}
	return s
}

// callable reports whether o can be called.
func callable(o py.Object) bool {
	_, ok := o.(py.I__call__)
	return ok
}

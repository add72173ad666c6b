package values

import (
	"github.com/go-python/gpython/py"

	"assay/kernel/interp"
)

// method is one entry of a value type's method table: its name, its
// parameters as interp.Bind reads them, its doc and the Go function.
type method[T py.Object] struct {
	name   string
	params []string
	doc    string
	fn     func(self T, a interp.Args) (py.Object, error)
}

// setMethods puts a method table into a type's dictionary. Each method
// goes through the panic guard and reads its arguments by name.
func setMethods[T py.Object](t *py.Type, table []method[T]) {
	for _, m := range table {
		sig := interp.NewSignature(m.name, m.params...) // read once, bound on every call
		call := func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
			a, err := sig.Bind(args, kw)
			if err != nil {
				return nil, err
			}
			return m.fn(self.(T), a)
		}
		if len(m.params) == 0 {
			// Nothing to name: no keyword dictionary made per call.
			t.Dict[m.name] = interp.PositionalMethod(m.name, m.doc, func(self py.Object, args py.Tuple) (py.Object, error) { return call(self, args, nil) })
			continue
		}
		t.Dict[m.name] = interp.Method(m.name, m.doc, call)
	}
}

// builtin is one entry of a builtin table, read like a method's.
type builtin struct {
	name   string
	params []string
	doc    string
	fn     func(a interp.Args) (py.Object, error)
}

// setBuiltins puts a builtin table into b.
func setBuiltins(b py.StringDict, table []builtin) {
	for _, f := range table {
		b[f.name] = interp.Builtin(f.name, f.doc, f.params, f.fn)
	}
}

// params is a shorthand for a parameter list.
func params(names ...string) []string { return names }

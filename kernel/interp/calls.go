package interp

import (
	"github.com/go-python/gpython/py"
	"github.com/go-python/gpython/vm"
)

// A call of a builtin with keywords, random_simplex(3, seed=k, bound=1000,
// denom=100), had gpython build a keyword dictionary (a map, its first
// group, an insertion a keyword) which Signature.Bind then looked up once
// a parameter: with a call without keywords, which still gets an empty
// dictionary, a sixth of the interpreter's share of a sample in
// BenchmarkExactSampledIdentity. A builtin made by Builtin is called by
// the patched CALL_FUNCTION (opcodes.go) with its arguments bound straight
// off the value stack (bindStack), the call then made under the same
// guard; a call that does not bind cleanly (too many arguments, a keyword
// no parameter has or one given twice, a required one missing) is left to
// the interpreter's own route, whose messages the notebook then reads, as
// are builtins with *args or **keywords.

// builtinCall is what a call of a builtin made by Builtin runs.
type builtinCall struct {
	sig   *Signature
	fn    func(Args) (py.Object, error)
	label string
}

var builtinCallType = py.NewType("builtin call", "the Go function behind a builtin")

// Type returns builtinCallType.
func (*builtinCall) Type() *py.Type { return builtinCallType }

// builtinKey is where a builtin's call is kept, in the globals of the
// placeholder module its py.Method names as its own; no notebook code can
// reach that module.
const builtinKey = "__assay_call__"

// Builtin makes a notebook builtin from Go that reads its arguments by
// name (params as NewSignature reads them, once), through the one panic
// guard: Func with the signature bound, and the call off the value stack
// described above.
func Builtin(name, doc string, params []string, fn func(Args) (py.Object, error)) *py.Method {
	sig := NewSignature(name, params...)
	b := &builtinCall{sig: sig, fn: fn, label: name + "()"}
	m := py.MustNewMethod(name, func(_ py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
		return Guard(b.label, func() (py.Object, error) {
			a, err := sig.Bind(args, kw)
			if err != nil {
				return nil, err
			}
			return fn(a)
		})
	}, 0, doc)
	if !sig.star && !sig.starStar {
		// gpython passes Module to the function as self, which it ignores.
		m.Module = &py.Module{Globals: py.StringDict{builtinKey: b}}
	}
	return m
}

// stackBuiltin is the builtin call n entries down the value stack, nil
// when the callee there is not a builtin made by Builtin.
func stackBuiltin(v *vm.Vm, n int) *builtinCall {
	if v.STACK_LEVEL() < n {
		return nil
	}
	m, ok := v.PEEK(n).(*py.Method)
	if !ok || m.Module == nil || m.Module.ModuleImpl != nil { // a module of the interpreter's
		return nil
	}
	b, _ := m.Module.Globals[builtinKey].(*builtinCall)
	return b
}

// bindStack binds the nargs positional arguments and nkw keyword ones of
// a CALL_FUNCTION as Bind would bind them, reading them off the value
// stack (laid out as vm.Vm.Call reads it: the function, the positional
// arguments, then name and value for each keyword), or reports false when
// Bind would raise.
func (s *Signature) bindStack(v *vm.Vm, nargs, nkw int) (Args, bool) {
	if nargs > len(s.names) || s.star || s.starStar {
		return Args{}, false
	}
	a := Args{fn: s.fn, names: s.names, stacked: true, npos: nargs}
	if n := len(s.names); n > inlineArgs {
		a.more = make([]py.Object, n-inlineArgs)
	}
	top := nargs + 2*nkw
	for i := range nargs {
		*a.slot(i) = v.PEEK(top - i)
	}
	for j := range nkw {
		name, ok := v.PEEK(2*nkw - 2*j).(py.String)
		if !ok {
			return Args{}, false
		}
		i := a.index(string(name))
		if i < 0 || a.value(i) != nil {
			return Args{}, false
		}
		*a.slot(i) = v.PEEK(2*nkw - 2*j - 1)
		a.byKeyword |= 1 << i
	}
	for i := range s.names {
		if s.required&(1<<i) != 0 && a.value(i) == nil {
			return Args{}, false
		}
	}
	return a, true
}

// callOpcode wraps CALL_FUNCTION: a builtin made by Builtin is called
// with its arguments bound off the stack; any other call, and one that
// does not bind, runs the original handler.
func callOpcode(original func(*vm.Vm, int32) error) func(*vm.Vm, int32) error {
	return func(v *vm.Vm, argc int32) error {
		nargs, nkw := int(argc&0xff), int(argc>>8&0xff)
		n := 1 + nargs + 2*nkw
		b := stackBuiltin(v, n)
		if b == nil {
			return original(v, argc)
		}
		a, ok := b.sig.bindStack(v, nargs, nkw)
		if !ok {
			return original(v, argc)
		}
		v.DROPN(n) // as vm.Vm.Call drops the call before making it
		res, err := Guard(b.label, func() (py.Object, error) { return b.fn(a) })
		if err != nil {
			return err
		}
		v.PUSH(res)
		return nil
	}
}

package interp

import (
	"sync"
	"sync/atomic"

	"github.com/go-python/gpython/py"
	"github.com/go-python/gpython/vm"
)

// Telltales. A proof from a series (limit, asymptotic) runs f once on a
// value that stands for every t near a point; it is a proof about f on
// numbers only if f could not tell the two apart and computed one
// expression of t. Besides the introspection builtins (watch.go) and
// caught exceptions (Raised), f could tell them apart by identity (`x is
// y`: a number's operators make new objects where a series' may not, and
// small integers are shared), by formatting text with `%` (gpython prints
// the Go value), or compute something else on a later call by keeping
// state between calls: a store outside its own local variables, a method
// taken from a list, dict or set, an iterator or generator advanced, a
// builtin that reaches the namespace or draws from the session's random
// stream. Each of these, anywhere in a sandbox's code, is counted here
// (Sandbox.Telltales), so comparing the count before and after a call
// tells whether the call did any. The list errs on the side of counting
// (a list built by index inside f counts): a counted call only sends a
// claim from the series route to extrapolation, which says less.

// telltaleCount counts a sandbox's telltales and keeps the latest one's
// description.
type telltaleCount struct {
	n    atomic.Uint64
	mu   sync.Mutex
	last string
}

func (c *telltaleCount) note(what string) {
	c.mu.Lock()
	c.last = what
	c.mu.Unlock()
	c.n.Add(1)
}

// Telltales returns how many telltales code running in ctx has done so
// far, and what the latest was.
func (ctx *Sandbox) Telltales() (uint64, string) {
	ctx.telltales.mu.Lock()
	defer ctx.telltales.mu.Unlock()
	return ctx.telltales.n.Load(), ctx.telltales.last
}

const (
	storedOutside    = "stored into a global, a closure's variable, a container or an attribute"
	comparedIdentity = "compared identities with `is`"
	formattedText    = "formatted text with `%`"
	tookContainer    = "took a method or attribute of a list, dict or set"
	advancedIterator = "advanced an iterator or generator made before it"
)

// NoteTelltale counts a telltale that happened outside the interpreter's
// instructions and builtins (a value type's own state, such as the
// session's random stream).
func (ctx *Sandbox) NoteTelltale(what string) { ctx.telltales.note(what) }

// telltaleOpcodes are the instructions that may be telltales, each with
// the test that says when one is (before it runs) and what it did.
var telltaleOpcodes = map[vm.OpCode]func(v *vm.Vm, arg int32) string{
	vm.STORE_GLOBAL:  always(storedOutside),
	vm.DELETE_GLOBAL: always(storedOutside),
	vm.STORE_DEREF:   freeVariable,
	vm.DELETE_DEREF:  freeVariable,
	vm.STORE_SUBSCR:  always(storedOutside),
	vm.DELETE_SUBSCR: always(storedOutside),
	vm.STORE_ATTR:    always(storedOutside),
	vm.DELETE_ATTR:   always(storedOutside),
	vm.COMPARE_OP: func(_ *vm.Vm, arg int32) string {
		if arg == int32(vm.PyCmp_IS) || arg == int32(vm.PyCmp_IS_NOT) {
			return comparedIdentity
		}
		return ""
	},
	vm.BINARY_MODULO:  stringLeft,
	vm.INPLACE_MODULO: stringLeft,
	vm.LOAD_ATTR: func(v *vm.Vm, _ int32) string {
		if isContainer(v.TOP()) {
			return tookContainer
		}
		return ""
	},
	vm.FOR_ITER: func(v *vm.Vm, _ int32) string {
		if _, ok := v.TOP().(*py.Generator); ok {
			return advancedIterator
		}
		return ""
	},
}

func always(what string) func(*vm.Vm, int32) string {
	return func(*vm.Vm, int32) string { return what }
}

// freeVariable: a store into a cell the running code was given (a
// closure's variable, nonlocal), not one of its own cells, which every
// call makes afresh (a variable a comprehension or lambda inside reads).
func freeVariable(v *vm.Vm, arg int32) string {
	f := runningFrame(v)
	if f != nil && int(arg) < len(f.Code.Cellvars) {
		return ""
	}
	return storedOutside
}

func stringLeft(v *vm.Vm, _ int32) string {
	if _, ok := v.PEEK(2).(py.String); ok {
		return formattedText
	}
	return ""
}

func isContainer(o py.Object) bool {
	switch o.(type) {
	case *py.List, py.StringDict, *py.Set, *py.FrozenSet:
		return true
	}
	return false
}

// telltaleOpcode wraps the handler h of op so that a telltale is counted
// in the sandbox of the running frame (looked up only then).
func telltaleOpcode(test func(*vm.Vm, int32) string, h func(*vm.Vm, int32) error) func(*vm.Vm, int32) error {
	return func(v *vm.Vm, arg int32) error {
		if what := test(v, arg); what != "" {
			if ctx, ok := frameContext(v).(*Sandbox); ok {
				ctx.telltales.note(what)
			}
		}
		return h(v, arg)
	}
}

// stateBuiltins are the builtins that change an object's attributes,
// reach one by name or advance an iterator, whatever their arguments.
// (exec, eval, globals and locals are the interpreter's own and cannot be
// wrapped; the code they run and the stores into what they return are
// counted by the instructions above.)
var stateBuiltins = map[string]string{
	"next":    advancedIterator,
	"setattr": storedOutside,
	"delattr": storedOutside,
	"getattr": "asked for an attribute by name (getattr)",
}

// consumers are the builtins that iterate an argument: given an iterator
// or generator, they advance it.
var consumers = []string{"sum", "list", "tuple", "zip", "map", "filter", "min", "max", "sorted", "any", "all", "enumerate", "dict", "set", "frozenset", "reversed", "iter"}

// WatchState wraps the builtins of b that may be telltales (see above)
// so that a call counts in ctx: those of stateBuiltins always, the
// consumers when an argument is an iterator. (A draw from the session's
// random stream is counted where it is drawn, through NoteTelltale.) Call
// it after WatchIntrospection.
func WatchState(ctx *Sandbox, b py.StringDict) {
	wrap := func(name string, what func(py.Tuple) string) {
		orig, ok := b[name]
		if !ok {
			return
		}
		b[name] = Func(name, name+"()", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
			if w := what(args); w != "" {
				ctx.telltales.note(w)
			}
			return py.Call(orig, args, kw)
		})
	}
	for name, what := range stateBuiltins {
		wrap(name, func(py.Tuple) string { return what })
	}
	for _, name := range consumers {
		wrap(name, func(args py.Tuple) string {
			for _, a := range args {
				if _, ok := a.(py.I__next__); ok {
					return advancedIterator
				}
			}
			return ""
		})
	}
}

package interp

import (
	"github.com/go-python/gpython/py"
	"github.com/go-python/gpython/vm"
)

// Caller calls one function of one argument many times: a sampled claim's
// f and g, once a sample. gpython's own call (py.Function.M__call__ →
// vm.EvalCode) makes a frame each time — the frame, its locals and its
// value stack, three allocations — and for a lambda that does little
// more than call a builtin, that was a third of the interpreter's share of
// a sample. Notebook code of the plain shape (one positional parameter;
// no *args, **kwargs or keyword-only parameters; not a generator) gets one
// frame for all its calls, reset as vm.EvalCode would make it fresh;
// anything else, and a call made while the frame is busy, goes through
// py.Call. Either way the code runs in vm.RunFrame on the patched opcode
// table, so every guard of the sandbox applies to every instruction.
//
// Why the frame may be reused: once RunFrame returns, nothing the notebook
// can reach holds it but tracebacks, which read only its code (the same
// code, since a change of __code__ makes a new frame); its locals
// dictionary, which locals() and exec hand out, is a new one each call
// (made on demand where the code allows, see enter); the locals and cells
// are cleared after each call.
type Caller struct {
	fn   py.Object
	fun  *py.Function // fn, when it is notebook code
	args py.Tuple     // the argument tuple for py.Call, reused
	// frame is fn's frame, reused; nil when fn does not have the plain
	// shape. code is the code it was made for.
	frame *py.Frame
	code  *py.Code
	// lazyLocals: code never writes its locals dictionary by name, so a
	// frame can start without one (see enter).
	lazyLocals bool
	busy       bool
}

// NewCaller prepares calls of fn.
func NewCaller(fn py.Object) *Caller {
	c := &Caller{fn: fn}
	if f, ok := fn.(*py.Function); ok {
		// Notebook code copies its arguments into its frame and keeps no
		// hold of the tuple they came in (*args gets a tuple of its own),
		// so one tuple serves every call; a builtin might keep the tuple.
		c.fun, c.args = f, make(py.Tuple, 1)
	}
	return c
}

// plainShape reports whether code binds exactly one positional argument
// and nothing else, and runs to a result rather than making a generator.
func plainShape(co *py.Code) bool {
	const special = py.CO_VARARGS | py.CO_VARKEYWORDS | py.CO_GENERATOR
	return co.Argcount == 1 && co.Kwonlyargcount == 0 && co.Flags&special == 0
}

// Call calls fn(x).
func (c *Caller) Call(x py.Object) (py.Object, error) {
	if c.fun == nil {
		return py.Call(c.fn, py.Tuple{x}, nil)
	}
	co := c.fun.Code
	if c.busy || !plainShape(co) || len(c.fun.Closure) != len(co.Freevars) {
		c.args[0] = x
		res, err := py.Call(c.fn, c.args, nil)
		c.args[0] = nil // hold no argument past its call
		return res, err
	}
	if c.frame == nil || c.code != co {
		c.frame, c.code = py.NewFrame(c.fun.Context, c.fun.Globals, nil, co, c.fun.Closure), co
		c.lazyLocals = co.Flags&py.CO_OPTIMIZED != 0 && !writesNames(co)
	}
	f := c.frame
	c.enter(f, co, x)
	c.busy = true
	res, err := vm.RunFrame(f)
	c.busy = false
	leave(f)
	return res, err
}

// enter makes f as vm.EvalCode makes a fresh frame for fn(x): a new locals
// dictionary, the argument in the first local, a new cell for each cell
// variable (holding the argument where it is one), the closure's cells
// after them, an empty value stack and no blocks, at the first instruction.
// The locals dictionary of a function's optimized namespace is read only
// through Frame.FastToLocals (locals(), vars(), eval, exec), which makes it
// when the frame has none, as CPython makes f_locals on demand; so such a
// frame starts without one unless its code writes names into it.
func (c *Caller) enter(f *py.Frame, co *py.Code, x py.Object) {
	f.Locals = nil
	if !c.lazyLocals {
		f.Locals = py.NewStringDict()
	}
	f.Lasti, f.Yielded, f.Block = 0, false, nil
	f.Blockstack = f.Blockstack[:0]
	f.Stack = f.Stack[:0]
	fast := f.Localsplus
	fast[0] = x
	nlocals := int(co.Nlocals)
	for i := range co.Cellvars {
		if co.Cell2arg != nil && co.Cell2arg[i] != py.CO_CELL_NOT_AN_ARG {
			fast[nlocals+i] = py.NewCell(fast[co.Cell2arg[i]])
			fast[co.Cell2arg[i]] = nil
		} else {
			fast[nlocals+i] = py.NewCell(nil)
		}
	}
	copy(f.CellAndFreeVars[len(co.Cellvars):], c.fun.Closure)
}

// leave drops the locals the call left in f: a local read before it is
// assigned must raise in the next call, as in a fresh frame. The value
// stack's popped entries are left to be overwritten (nothing reads below
// its top; clearing it, with the collector's write barriers, cost as much
// as the frame saved), held at most until the next call or the sweep's end.
func leave(f *py.Frame) {
	clear(f.Localsplus)
	f.Locals = nil
}

// writesNames reports whether code has an instruction that writes the
// frame's locals dictionary by name, which function code compiled for an
// optimized namespace does not have.
func writesNames(co *py.Code) bool {
	for i := 0; i < len(co.Code); {
		op := vm.OpCode(co.Code[i])
		switch op {
		case vm.STORE_NAME, vm.DELETE_NAME, vm.IMPORT_STAR:
			return true
		}
		i++
		if op.HAS_ARG() {
			i += 2
		}
	}
	return false
}

package interp

// This file is the only place that reaches into the interpreter's
// internals. gpython's int / int gives a float64, and int / x converts x
// with __float__ before x can answer: in a notebook that checks formulas
// exactly, that silently drops digits. The interpreter has no hook for it,
// so its opcode table is patched: / and ** go first to the Arithmetic of
// the Sandbox the running frame belongs to. CALL_FUNCTION is patched too,
// to call builtins without a keyword dictionary (calls.go). DEVELOPERS.md
// says what a gpython upgrade must re-check here.

import (
	"fmt"
	"reflect"
	"runtime/debug"
	"sync"
	_ "unsafe" // for go:linkname

	"github.com/go-python/gpython/py"
	"github.com/go-python/gpython/vm"
)

// gpythonModule and gpythonChecked name the interpreter version this patch
// was checked against; another version refuses to start until re-checked.
const (
	gpythonModule  = "github.com/go-python/gpython"
	gpythonChecked = "v0.2.1-0.20260302130241-444ae5ed29cf"
)

//go:linkname jumpTable github.com/go-python/gpython/vm.jumpTable
var jumpTable [256]func(*vm.Vm, int32) error

// unusedOpcode is an opcode the interpreter does not define: its handler
// is the one for illegal instructions.
const unusedOpcode = 0

var patch struct {
	once sync.Once
	err  error
}

// Ready patches the opcode table once and reports whether the patch could
// be checked: the linked interpreter is the version it was written for,
// the table holds a distinct handler for each opcode it wraps, and a
// probe in a scratch context gets the exact answers.
func Ready() error {
	patch.once.Do(func() { patch.err = install() })
	return patch.err
}

func install() error {
	if v, ok := linkedVersion(); ok && v != gpythonChecked {
		return fmt.Errorf("assay patches the opcode table of %s %s for exact / and **, and this binary links %s: re-check kernel/interp/opcodes.go as DEVELOPERS.md says before raising gpythonChecked", gpythonModule, gpythonChecked, v)
	}
	wrapped := map[vm.OpCode]func(Arithmetic, py.Object, py.Object) (py.Object, bool, error){
		vm.BINARY_TRUE_DIVIDE:  Arithmetic.Quotient,
		vm.INPLACE_TRUE_DIVIDE: Arithmetic.Quotient,
		vm.BINARY_POWER:        Arithmetic.Power,
		vm.INPLACE_POWER:       Arithmetic.Power,
	}
	illegal := handlerAddress(jumpTable[unusedOpcode])
	seen := map[uintptr]vm.OpCode{}
	for op := range wrapped {
		h := jumpTable[op]
		addr := handlerAddress(h)
		if h == nil || addr == illegal {
			return fmt.Errorf("the interpreter's opcode table has no handler for opcode %d where assay's exact-arithmetic patch expects one", op)
		}
		if other, dup := seen[addr]; dup && !sameOperator(op, other) {
			return fmt.Errorf("the interpreter's opcode table gives opcodes %d and %d one handler, which assay's exact-arithmetic patch does not expect", op, other)
		}
		seen[addr] = op
	}
	for op, answer := range wrapped {
		jumpTable[op] = exactOpcode(jumpTable[op], answer)
	}
	jumpTable[vm.CALL_FUNCTION] = callOpcode(jumpTable[vm.CALL_FUNCTION])
	for op, test := range telltaleOpcodes {
		jumpTable[op] = telltaleOpcode(test, jumpTable[op])
	}
	for op, h := range jumpTable {
		if h != nil {
			jumpTable[op] = guardedOpcode(h)
		}
	}
	return probe()
}

// sameOperator reports whether two opcodes are the binary and in-place
// forms of one operator, which may share a handler.
func sameOperator(a, b vm.OpCode) bool {
	div := map[vm.OpCode]bool{vm.BINARY_TRUE_DIVIDE: true, vm.INPLACE_TRUE_DIVIDE: true}
	return div[a] == div[b]
}

func handlerAddress(h func(*vm.Vm, int32) error) uintptr {
	if h == nil {
		return 0
	}
	return reflect.ValueOf(h).Pointer()
}

// linkedVersion is the version of gpython this binary was built with, when
// the build recorded it.
func linkedVersion() (string, bool) {
	info, ok := debug.ReadBuildInfo()
	if !ok {
		return "", false
	}
	for _, m := range info.Deps {
		if m.Path == gpythonModule {
			if m.Replace != nil {
				return m.Replace.Version, true
			}
			return m.Version, true
		}
	}
	return "", false
}

// exactOpcode wraps a binary opcode: the running sandbox's arithmetic may
// answer; otherwise the original handler runs.
func exactOpcode(original func(*vm.Vm, int32) error, answer func(Arithmetic, py.Object, py.Object) (py.Object, bool, error)) func(*vm.Vm, int32) error {
	return func(v *vm.Vm, arg int32) error {
		a, b := v.SECOND(), v.TOP()
		if isFloat(a) || isFloat(b) {
			return original(v, arg) // float code: nothing exact to keep
		}
		arith := operandArithmetic(a, b)
		if arith == nil {
			ctx, ok := frameContext(v).(*Sandbox)
			if !ok || ctx.arith == nil {
				return original(v, arg)
			}
			arith = ctx.arith
		}
		res, ok, err := answer(arith, a, b)
		if !ok {
			return original(v, arg)
		}
		if err != nil {
			return err
		}
		v.DROP()
		v.SET_TOP(res)
		return nil
	}
}

// guardedOpcode turns a Go panic inside an instruction (an operator of a
// value type, or the interpreter's own code, which has no guard) into an
// exception raised at that instruction, so the notebook can catch it and
// the report names the line it happened on. Every exception an
// instruction raises is counted in its sandbox (Sandbox.Raised); the frame
// is looked up only then, so the count costs nothing on the normal path.
func guardedOpcode(h func(*vm.Vm, int32) error) func(*vm.Vm, int32) error {
	return func(v *vm.Vm, arg int32) (err error) {
		defer func() {
			if r := recover(); r != nil {
				var res py.Object
				err = nil
				recovered(r, "the interpreter", &res, &err)
			}
			if err != nil {
				if ctx, ok := frameContext(v).(*Sandbox); ok {
					ctx.raised.n.Add(1)
				}
			}
		}()
		return h(v, arg)
	}
}

// Operand is a value that belongs to one sandbox's session and knows its
// Arithmetic, the one the frame it runs in has: / and ** with it as an
// operand ask that directly, rather than find the frame (frameContext
// makes a traceback entry to reach it, a tenth of what a division by a
// small integer cost).
type Operand interface {
	Arithmetic() Arithmetic
}

// operandArithmetic is the Arithmetic an operand carries, nil when
// neither does.
func operandArithmetic(a, b py.Object) Arithmetic {
	if o, ok := a.(Operand); ok {
		return o.Arithmetic()
	}
	if o, ok := b.(Operand); ok {
		return o.Arithmetic()
	}
	return nil
}

func isFloat(o py.Object) bool {
	_, ok := o.(py.Float)
	return ok
}

// frameContext is the context of the frame the machine is running. The
// interpreter exposes the frame only through the traceback entry it adds
// for the current instruction, so one is made on the side and dropped.
func frameContext(v *vm.Vm) py.Context {
	if f := runningFrame(v); f != nil {
		return f.Context
	}
	return nil
}

// runningFrame is the frame v runs, found through a traceback entry (the
// interpreter keeps it unexported), or nil.
func runningFrame(v *vm.Vm) *py.Frame {
	var info py.ExceptionInfo
	v.AddTraceback(&info)
	if info.Traceback == nil {
		return nil
	}
	return info.Traceback.Frame
}

// probe runs / and ** in a scratch sandbox whose arithmetic marks its
// answers, and in a plain context where the interpreter's own operators
// must still answer.
func probe() error {
	ctx, err := newSandbox(probeArithmetic{})
	if err != nil {
		return fmt.Errorf("assay's exact-arithmetic probe has no context: %w", err)
	}
	defer ctx.Close()
	// A builtin call binds off the value stack (callOpcode) as Bind binds.
	ctx.Builtins().Globals["probe_call"] = Builtin("probe_call", "", []string{"a", "b=", "c="}, func(a Args) (py.Object, error) {
		return py.String(fmt.Sprintf("%v %v %v %v", a.Get("a"), a.Get("b"), a.Get("c"), a.stacked)), nil
	})
	code, err := py.Compile("q = 7 / 2\np = 2 ** -1\nf = 7.0 / 2\nc = probe_call(1, c=3, b=2)\n", "<probe>", py.ExecMode, 0, true)
	if err != nil {
		return fmt.Errorf("assay's exact-arithmetic probe does not compile: %w", err)
	}
	globals, err := ctx.Main()
	if err != nil {
		return err
	}
	if _, err := ctx.RunCode(code, globals, globals, nil); err != nil {
		return fmt.Errorf("assay's exact-arithmetic probe failed: %w", err)
	}
	if globals["q"] != py.String("7/2") || globals["p"] != py.String("2**-1") || globals["f"] != py.Float(3.5) {
		return fmt.Errorf("assay's exact-arithmetic patch of the interpreter does not take effect (probe gave q=%v p=%v f=%v): re-check kernel/interp/opcodes.go", globals["q"], globals["p"], globals["f"])
	}
	if globals["c"] != py.String("1 2 3 true") {
		return fmt.Errorf("assay's builtin call off the value stack binds probe_call(1, c=3, b=2) as %v, not as 1 2 3: re-check kernel/interp/calls.go against vm.Vm.Call", globals["c"])
	}
	return nil
}

// probeArithmetic answers int / int and int ** int with a marker string.
type probeArithmetic struct{}

func (probeArithmetic) Quotient(a, b py.Object) (py.Object, bool, error) {
	return py.String(fmt.Sprintf("%v/%v", a, b)), true, nil
}

func (probeArithmetic) Power(a, b py.Object) (py.Object, bool, error) {
	return py.String(fmt.Sprintf("%v**%v", a, b)), true, nil
}

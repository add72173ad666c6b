package interp

import (
	"fmt"
	"sync"

	"github.com/go-python/gpython/py"
	"github.com/go-python/gpython/vm"

	// Modules a cell may import. The interpreter's os, glob and tempfile
	// modules are deliberately not linked in: cells get no files or processes.
	_ "github.com/go-python/gpython/stdlib/builtin"
	_ "github.com/go-python/gpython/stdlib/math"
	_ "github.com/go-python/gpython/stdlib/string"
	_ "github.com/go-python/gpython/stdlib/sys"
)

// SandboxMessage ends every refusal, so the author knows why.
const SandboxMessage = "notebook cells have no files, processes or network"

// Arithmetic gives / and ** their exact answers where the interpreter alone
// would go through float64. ok false lets the interpreter's own operator run.
type Arithmetic interface {
	Quotient(a, b py.Object) (res py.Object, ok bool, err error)
	Power(a, b py.Object) (res py.Object, ok bool, err error)
}

// Sandbox is an interpreter context that resolves imports only among the
// modules linked into this binary, never touches the file system, and
// answers / and ** through its Arithmetic.
type Sandbox struct {
	store   *py.ModuleStore
	arith   Arithmetic
	mu      sync.Mutex
	running sync.WaitGroup
	closed  bool
	done    chan struct{}
	raised  raisedCount
	// telltales counts what tells a series from a number (telltale.go).
	telltales telltaleCount
}

// NewSandbox makes a fresh context with builtins and sys loaded and every
// route to the outside removed. It fails when the exact-arithmetic patch
// of the interpreter could not be checked (see Ready).
func NewSandbox(arith Arithmetic) (*Sandbox, error) {
	if err := Ready(); err != nil {
		return nil, err
	}
	return newSandbox(arith)
}

func newSandbox(arith Arithmetic) (*Sandbox, error) {
	ctx := &Sandbox{store: py.NewModuleStore(), arith: arith, done: make(chan struct{})}
	if err := py.Import(ctx, "builtins", "sys"); err != nil {
		return nil, err
	}
	b := ctx.store.Builtins.Globals
	delete(b, "input") // would read the kernel protocol from stdin
	for _, name := range []string{"open", "exit", "quit"} {
		b[name] = refusal(name)
	}
	sys := ctx.store.MustGetModule("sys").Globals
	for _, name := range []string{"stdin", "__stdin__", "executable", "argv", "path", "exit"} {
		delete(sys, name)
	}
	return ctx, nil
}

// refusal is a builtin that raises a clear PermissionError when called.
func refusal(name string) *py.Method {
	return Func(name, name+"() is not available in a notebook", func(py.Tuple, py.StringDict) (py.Object, error) {
		return nil, py.ExceptionNewf(py.PermissionError, "%s() is not available: %s", name, SandboxMessage)
	})
}

// Builtins is the context's builtins module, where a session puts its names.
func (ctx *Sandbox) Builtins() *py.Module { return ctx.store.Builtins }

// Sys is the namespace of the context's sys module.
func (ctx *Sandbox) Sys() py.StringDict { return ctx.store.MustGetModule("sys").Globals }

// Main makes the namespace cells run in.
func (ctx *Sandbox) Main() (py.StringDict, error) {
	main, err := ctx.store.NewModule(ctx, &py.ModuleImpl{Info: py.ModuleInfo{Name: py.MainModuleName}})
	if err != nil {
		return nil, err
	}
	return main.Globals, nil
}

// ResolveAndCompile refuses: there is no file system to import from.
func (ctx *Sandbox) ResolveAndCompile(pathname string, opts py.CompileOpts) (py.CompileOut, error) {
	return py.CompileOut{}, py.ExceptionNewf(py.ImportError,
		"module %q is not available: %s (available: math, string, sys)", pathname, SandboxMessage)
}

// importable are the modules a cell may import; other modules linked
// into the binary by the interpreter's own packages (marshal, binascii, …)
// are refused like any other, as the README says.
var importable = map[string]bool{"math": true, "string": true, "sys": true}

// ModuleInit instantiates a linked-in module in this context.
func (ctx *Sandbox) ModuleInit(impl *py.ModuleImpl) (*py.Module, error) {
	if name := impl.Info.Name; !importable[name] && name != "builtins" {
		return nil, py.ExceptionNewf(py.ImportError, "module %q is not available: %s (available: math, string, sys)", name, SandboxMessage)
	}
	if impl.Code == nil && impl.CodeSrc != "" {
		code, err := py.Compile(impl.CodeSrc, impl.Info.FileDesc, py.ExecMode, 0, true)
		if err != nil {
			return nil, err
		}
		impl.Code = code
	}
	if impl.Code == nil && len(impl.CodeBuf) > 0 {
		return nil, py.ExceptionNewf(py.ImportError, "module %q ships compiled code, which the sandbox does not load", impl.Info.Name)
	}
	module, err := ctx.store.NewModule(ctx, impl)
	if err != nil {
		return nil, err
	}
	if impl.Code != nil {
		if _, err := ctx.RunCode(impl.Code, module.Globals, module.Globals, nil); err != nil {
			return nil, err
		}
	}
	return module, nil
}

// RunCode executes code in the given namespaces.
func (ctx *Sandbox) RunCode(code *py.Code, globals, locals py.StringDict, closure py.Tuple) (py.Object, error) {
	ctx.mu.Lock()
	if ctx.closed {
		ctx.mu.Unlock()
		return nil, fmt.Errorf("interpreter context is closed")
	}
	ctx.running.Add(1)
	ctx.mu.Unlock()
	defer ctx.running.Done()
	return vm.EvalCode(ctx, code, globals, locals, nil, nil, nil, nil, closure)
}

// GetModule returns a module already imported into this context.
func (ctx *Sandbox) GetModule(name string) (*py.Module, error) { return ctx.store.GetModule(name) }

// Store gives the context's modules.
func (ctx *Sandbox) Store() *py.ModuleStore { return ctx.store }

// Close waits for running code and releases module resources.
func (ctx *Sandbox) Close() error {
	ctx.mu.Lock()
	if ctx.closed {
		ctx.mu.Unlock()
		return nil
	}
	ctx.closed = true
	ctx.mu.Unlock()
	ctx.running.Wait()
	ctx.store.OnContextClosed()
	close(ctx.done)
	return nil
}

// Done is closed once the context has closed.
func (ctx *Sandbox) Done() <-chan struct{} { return ctx.done }

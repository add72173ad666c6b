package kernel

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

// sandboxMessage is appended to every refusal so the author knows why.
const sandboxMessage = "notebook cells have no files, processes or network"

// sandbox is a py.Context that resolves imports only among the modules
// linked into this binary and never touches the file system.
type sandbox struct {
	store   *py.ModuleStore
	mu      sync.Mutex
	running sync.WaitGroup
	closed  bool
	done    chan struct{}
}

// newSandbox makes a fresh interpreter context with builtins and sys loaded
// and every route to the outside removed.
func newSandbox() (*sandbox, error) {
	ctx := &sandbox{store: py.NewModuleStore(), done: make(chan struct{})}
	if err := py.Import(ctx, "builtins", "sys"); err != nil {
		return nil, err
	}
	b := ctx.store.Builtins.Globals
	delete(b, "input") // would read the kernel protocol from stdin
	b["open"] = refusal("open")
	sys := ctx.store.MustGetModule("sys").Globals
	for _, name := range []string{"stdin", "__stdin__", "executable", "argv", "path", "exit"} {
		delete(sys, name)
	}
	return ctx, nil
}

// refusal is a builtin that raises a clear PermissionError when called.
func refusal(name string) *py.Method {
	return py.MustNewMethod(name, func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
		return nil, py.ExceptionNewf(py.PermissionError, "%s() is not available: %s", name, sandboxMessage)
	}, 0, name+"() is not available in a notebook")
}

// ResolveAndCompile refuses: there is no file system to import from.
func (ctx *sandbox) ResolveAndCompile(pathname string, opts py.CompileOpts) (py.CompileOut, error) {
	return py.CompileOut{}, py.ExceptionNewf(py.ImportError,
		"module %q is not available: %s (available: math, string, sys)", pathname, sandboxMessage)
}

// ModuleInit instantiates a linked-in module in this context.
func (ctx *sandbox) ModuleInit(impl *py.ModuleImpl) (*py.Module, error) {
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
func (ctx *sandbox) RunCode(code *py.Code, globals, locals py.StringDict, closure py.Tuple) (py.Object, error) {
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
func (ctx *sandbox) GetModule(name string) (*py.Module, error) { return ctx.store.GetModule(name) }

// Store gives the context's modules.
func (ctx *sandbox) Store() *py.ModuleStore { return ctx.store }

// Close waits for running code and releases module resources.
func (ctx *sandbox) Close() error {
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
func (ctx *sandbox) Done() <-chan struct{} { return ctx.done }

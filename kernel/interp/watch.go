package interp

import (
	"sync/atomic"

	"github.com/go-python/gpython/py"
)

// Watched is a value that must know when a notebook looks at it beyond
// its operators: asks its type, its attributes or its identity. A series
// standing in for every t near a point is one: a function that can tell
// it from a number may compute something else on numbers, and a proof
// from the series would then not be a proof about the function.
type Watched interface {
	Watched(what string)
}

// introspection lists the builtins that tell one kind of value from
// another without an operator, each with what it asks.
var introspection = map[string]string{
	"type":       "the type",
	"isinstance": "the type",
	"issubclass": "the type",
	"hasattr":    "the attributes",
	"getattr":    "the attributes",
	"dir":        "the attributes",
	"vars":       "the attributes",
	"callable":   "the type",
	"id":         "the identity",
	"hash":       "the hash",
}

// WatchIntrospection wraps those builtins of b so that a Watched argument
// hears the question before the builtin answers it. Call it after every
// other builtin is in place (pyext replaces some of them).
func WatchIntrospection(b py.StringDict) {
	for name, what := range introspection {
		orig, ok := b[name]
		if !ok {
			continue
		}
		b[name] = Func(name, name+"()", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
			for _, a := range args {
				if w, ok := a.(Watched); ok {
					w.Watched(what)
				}
			}
			return py.Call(orig, args, kw)
		})
	}
}

// raisedCount counts the exceptions raised in a sandbox's code (caught or
// not); see Sandbox.Raised.
type raisedCount struct{ n atomic.Uint64 }

// Raised is how many exceptions code running in ctx has raised so far,
// counted in the opcode guard: comparing it before and after a call tells
// whether the call raised and caught something inside.
func (ctx *Sandbox) Raised() uint64 { return ctx.raised.n.Load() }

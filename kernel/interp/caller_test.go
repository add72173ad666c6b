package interp

import (
	"maps"
	"slices"
	"strings"
	"testing"

	"github.com/go-python/gpython/py"
)

// callerSource defines functions of every shape a sweep may be handed: the
// plain ones reuse a frame, the others go through py.Call.
const callerSource = `
pair = lambda k: (k * 2, k + 1)
def with_locals(k):
    x = k * k
    return [x, locals()]
def make_adder(a):
    return lambda k: k + a
add3 = make_adder(3)
def capture(k):
    return lambda: k * 10
def odd_raises(k):
    if k % 2:
        raise ValueError("odd %d" % k)
    return k
def blocks(k):
    s = 0
    for i in range(10):
        if i == k:
            break
        try:
            s += 12 // (i - 3)
        except ZeroDivisionError:
            s += 1000
    return s
def mid_expression(k):
    for i in range(3):
        x = [i, k, 1 // (k - i)]
    return x
def gen(k):
    yield k
    yield k + 1
star = lambda *a: a
defaulted = lambda k, m=5: k + m
def a1(k):
    return k + 1
def a2(k):
    return k + 2
def unbound(k):
    if k > 2:
        x = k
    return x
def imports(k):
    import math
    return math.floor(k * 1.5)
def evals(k):
    exec("y = k * 3")
    return [eval("k + 1"), locals()]
def reenter(k):
    return 0 if k == 0 else hook(k - 1) + 1
`

// TestCallerAgainstPlainCall checks Caller, call after call, against
// gpython's own call of the same function (py.Call, which makes a frame
// with vm.EvalCode each time): the same results and the same exceptions,
// with raising calls in between, closures made in earlier calls keeping
// their own cells, locals() a new dictionary each call, a changed
// __code__ followed, and a call made while the frame is busy.
func TestCallerAgainstPlainCall(t *testing.T) {
	sb, globals := testSandbox(t, nil)
	var reentrant *Caller
	globals["hook"] = Func("hook", "", func(args py.Tuple, _ py.StringDict) (py.Object, error) {
		return reentrant.Call(args[0])
	})
	code, err := py.Compile(callerSource, "<test>", py.ExecMode, 0, true)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := sb.RunCode(code, globals, globals, nil); err != nil {
		t.Fatal(err)
	}
	reentrant = NewCaller(globals["reenter"])
	var show func(o py.Object, err error) string
	show = func(o py.Object, err error) string {
		if err != nil {
			return "raised " + Message(err)
		}
		switch x := o.(type) {
		case *py.Function: // a closure: what it gives
			return "closure giving " + show(py.Call(x, nil, nil))
		case *py.Generator:
			return "generator of " + show(py.Next(x)) + ", " + show(py.Next(x))
		case *py.List:
			parts := make([]string, len(x.Items))
			for i, it := range x.Items {
				parts[i] = show(it, nil)
			}
			return "[" + strings.Join(parts, ", ") + "]"
		case py.StringDict: // in key order: a Go map has none
			keys := slices.Sorted(maps.Keys(x))
			for i, k := range keys {
				keys[i] = k + ": " + show(x[k], nil)
			}
			return "{" + strings.Join(keys, ", ") + "}"
		}
		return Str(o)
	}
	names := []string{"pair", "with_locals", "add3", "capture", "odd_raises", "blocks", "mid_expression", "gen", "star", "defaulted", "unbound", "imports", "evals", "reenter", "abs"}
	inputs := []py.Object{py.Int(0), py.Int(1), py.Int(2), py.Int(3), py.Int(7), py.Int(4), py.Int(3), py.Int(1)}
	for _, name := range names {
		fn := globals[name]
		if fn == nil {
			fn = sb.Builtins().Globals[name]
		}
		c := NewCaller(fn)
		if name == "reenter" {
			c = reentrant
		}
		var kept []py.Object // results of earlier calls, read again at the end
		var want []string
		for _, x := range inputs {
			got := show(c.Call(x))
			plain := show(py.Call(fn, py.Tuple{x}, nil))
			if got != plain {
				t.Errorf("%s(%v): caller %q, py.Call %q", name, x, got, plain)
			}
			res, err := c.Call(x)
			kept, want = append(kept, res), append(want, show(res, err))
		}
		for i, res := range kept {
			if _, once := res.(*py.Generator); once || res == nil {
				continue // a generator was read out by show
			}
			if got := show(res, nil); got != want[i] {
				t.Errorf("%s: the result of call %d changed to %q after later calls, was %q", name, i, got, want[i])
			}
		}
		if c.frame != nil {
			for i, o := range c.frame.Localsplus {
				if o != nil {
					t.Errorf("%s: the reused frame holds local %d (%v) past its call", name, i, o)
				}
			}
		}
	}
	// A changed __code__ is followed, as a fresh call would follow it.
	c := NewCaller(globals["a1"])
	if got := show(c.Call(py.Int(5))); got != "6" {
		t.Errorf("a1(5) = %s", got)
	}
	if _, err := sb.RunCode(mustCompile(t, "a1.__code__ = a2.__code__\n"), globals, globals, nil); err != nil {
		t.Fatal(err)
	}
	if got := show(c.Call(py.Int(5))); got != "7" {
		t.Errorf("a1(5) after a1.__code__ = a2.__code__: %s, want 7", got)
	}
}

func mustCompile(t *testing.T, src string) *py.Code {
	t.Helper()
	code, err := py.Compile(src, "<test>", py.ExecMode, 0, true)
	if err != nil {
		t.Fatal(err)
	}
	return code
}

// Module code writes its namespace by name (STORE_NAME); a function's
// optimized namespace does not, so its frame may start without a locals
// dictionary.
func TestWritesNames(t *testing.T) {
	module := mustCompile(t, "x = 1\ndef f(k):\n    y = k\n    return y\n")
	if !writesNames(module) {
		t.Error("module code does not write names")
	}
	functions := 0
	for _, c := range module.Consts {
		if f, ok := c.(*py.Code); ok {
			functions++
			if writesNames(f) || f.Flags&py.CO_OPTIMIZED == 0 {
				t.Errorf("function %s writes names or is not optimized", f.Name)
			}
		}
	}
	if functions != 1 {
		t.Errorf("found %d function codes, want 1", functions)
	}
}

// testSandbox opens a sandbox with the arithmetic arith, closed when the
// test ends, and its main namespace.
func testSandbox(t *testing.T, arith Arithmetic) (*Sandbox, py.StringDict) {
	t.Helper()
	sb, err := NewSandbox(arith)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { sb.Close() })
	globals, err := sb.Main()
	if err != nil {
		t.Fatal(err)
	}
	return sb, globals
}

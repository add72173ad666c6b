package interp

import (
	"fmt"
	"maps"
	"slices"
	"strings"
	"testing"

	"github.com/go-python/gpython/py"
)

// describeCall is a builtin's view of its call: the values bound, and the
// call as Args.Call gives it back.
func describeCall(a Args) (py.Object, error) {
	args, kw := a.Call()
	keys := slices.Sorted(maps.Keys(kw))
	for i, k := range keys {
		keys[i] = k + "=" + Str(kw[k])
	}
	return py.String(fmt.Sprintf("x=%v y=%v z=%v; call %v {%s}", a.Get("x"), a.Get("y"), a.Get("z"), args, strings.Join(keys, ", "))), nil
}

// A builtin called from notebook code, its arguments bound off the value
// stack (callOpcode), reads what the plain route reads — py.Call with the
// arguments and keywords Python's call rule (Language Reference, 6.3.4
// Calls) makes of the same call, bound by Signature.Bind — and raises the
// same errors, for every mix of positional and keyword arguments;
// Args.Call gives the call back as it was made.
func TestBuiltinCallOffTheStack(t *testing.T) {
	sb, globals := testSandbox(t, nil)
	f := Builtin("f", "", []string{"x", "y=", "z="}, describeCall)
	globals["f"] = f
	cases := []struct {
		src  string
		args py.Tuple
		kw   py.StringDict
	}{
		{"f(1)", py.Tuple{py.Int(1)}, nil},
		{"f(1, 2)", py.Tuple{py.Int(1), py.Int(2)}, nil},
		{"f(1, 2, 3)", py.Tuple{py.Int(1), py.Int(2), py.Int(3)}, nil},
		{"f(1, z=3)", py.Tuple{py.Int(1)}, py.StringDict{"z": py.Int(3)}},
		{"f(x=1)", nil, py.StringDict{"x": py.Int(1)}},
		{"f(z=3, x=1, y=2)", nil, py.StringDict{"x": py.Int(1), "y": py.Int(2), "z": py.Int(3)}},
		{"f(1, y=None)", py.Tuple{py.Int(1)}, py.StringDict{"y": py.None}},
		{"f()", nil, nil},
		{"f(1, 2, 3, 4)", py.Tuple{py.Int(1), py.Int(2), py.Int(3), py.Int(4)}, nil},
		{"f(1, x=2)", py.Tuple{py.Int(1)}, py.StringDict{"x": py.Int(2)}},
		{"f(1, w=5)", py.Tuple{py.Int(1)}, py.StringDict{"w": py.Int(5)}},
		{"f(y=2)", nil, py.StringDict{"y": py.Int(2)}},
		{"f(*[1, 2])", py.Tuple{py.Int(1), py.Int(2)}, nil},
		{"f(1, **{'z': 3})", py.Tuple{py.Int(1)}, py.StringDict{"z": py.Int(3)}},
	}
	show := func(o py.Object, err error) string {
		if err != nil {
			return "raised " + Message(err)
		}
		return Str(o)
	}
	for _, c := range cases {
		_, err := sb.RunCode(mustCompile(t, "r = "+c.src+"\n"), globals, globals, nil)
		got := show(globals["r"], err)
		delete(globals, "r")
		want := show(py.Call(f, c.args, c.kw))
		if got != want {
			t.Errorf("%s: from code %q, plain call %q", c.src, got, want)
		}
	}
	// The plain route is taken where the stack cannot be bound: a builtin
	// with *args, and a name that is not a builtin made by Builtin.
	globals["g"] = Builtin("g", "", []string{"x", "*rest"}, func(a Args) (py.Object, error) {
		return py.String(fmt.Sprintf("%v %v %v", a.Get("x"), a.Rest(), a.stacked)), nil
	})
	globals["h"] = Func("h", "", func(args py.Tuple, kw py.StringDict) (py.Object, error) { return py.Int(len(args) + len(kw)), nil })
	if _, err := sb.RunCode(mustCompile(t, "r = (g(1, 2, 3), h(1, k=2))\n"), globals, globals, nil); err != nil {
		t.Fatal(err)
	}
	if got := Str(globals["r"]); got != "('1 [2 3] false', 2)" {
		t.Errorf("g and h gave %s", got)
	}
}

// The stack route is taken: a call from code binds off the stack, a call
// from Go through the method does not.
func TestBuiltinCallTakesTheStack(t *testing.T) {
	sb, globals := testSandbox(t, nil)
	globals["f"] = Builtin("f", "", []string{"x", "y="}, func(a Args) (py.Object, error) { return py.NewBool(a.stacked), nil })
	if _, err := sb.RunCode(mustCompile(t, "r = f(1, y=2)\n"), globals, globals, nil); err != nil {
		t.Fatal(err)
	}
	if globals["r"] != py.True {
		t.Error("a call from code did not bind off the stack")
	}
	if r, _ := py.Call(globals["f"], py.Tuple{py.Int(1)}, nil); r != py.False {
		t.Error("a call from Go bound off a stack")
	}
}

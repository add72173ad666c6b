package interp

import (
	"testing"

	"github.com/go-python/gpython/py"
)

// watcher records what was asked about it.
type watcher struct{ asked *[]string }

var watcherType = py.NewType("watcher", "")

func (watcher) Type() *py.Type { return watcherType }

func (w watcher) Watched(what string) { *w.asked = append(*w.asked, what) }

// The introspection builtins tell a Watched value what was asked and still
// answer as before; every exception an instruction raises is counted,
// caught or not, and ordinary loops raise none (common practice: Python's
// for loop ends without an exception reaching the program).
func TestIntrospectionWatchedAndRaisedCounted(t *testing.T) {
	sb, err := NewSandbox(nil)
	if err != nil {
		t.Fatal(err)
	}
	defer sb.Close()
	WatchIntrospection(sb.Builtins().Globals)
	globals, err := sb.Main()
	if err != nil {
		t.Fatal(err)
	}
	var asked []string
	globals["w"] = watcher{&asked}
	run := func(src string) {
		t.Helper()
		code, err := Compile(1, 1, src, nil)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := sb.RunCode(code, globals, globals, nil); err != nil {
			t.Fatal(err)
		}
	}
	before := sb.Raised()
	run("s = 0\nfor k in range(5):\n    s = s + k\nn = [k for k in range(3)]\na = type(1) == type(2)\nb = isinstance(1, int)\nc = hasattr(1, 'real')\n")
	if sb.Raised() != before {
		t.Errorf("plain code counted %d exceptions", sb.Raised()-before)
	}
	if globals["a"] != py.True || globals["b"] != py.True || len(asked) != 0 {
		t.Errorf("type/isinstance changed: %v %v, asked %v", globals["a"], globals["b"], asked)
	}
	run("try:\n    1 / 0\nexcept ZeroDivisionError:\n    pass\nt = type(w)\nh = hasattr(w, 'x')\n")
	if sb.Raised() != before+1 {
		t.Errorf("a caught exception counted %d times", sb.Raised()-before)
	}
	if len(asked) != 2 || asked[0] != "the type" || asked[1] != "the attributes" {
		t.Errorf("asked %v", asked)
	}
}

package pycompile

import (
	"testing"

	"github.com/go-python/gpython/py"
	_ "github.com/go-python/gpython/stdlib" // a context to run code in
)

// The expected values are what the Python language reference's execution
// model (binding of names, closures) prescribes; each case failed with the
// original compiler, either silently (wrong cell read) or as UnboundLocalError.
func TestClosureFixes(t *testing.T) {
	py.Compile = Compile // the stdlib package installed the original
	cases := []struct{ src, want string }{
		// free variable in a code object that also has cells
		{"def f(n):\n    m = n\n    return [[i * 10 + j for j in range(m)] for i in range(n)]\nr = f(2)", "[[0, 1], [10, 11]]"},
		// a parameter captured by a comprehension
		{"def f(n):\n    return [[i + j for j in range(n)] for i in range(n)]\nr = f(2)", "[[0, 1], [1, 2]]"},
		// a parameter captured by a closure
		{"def adder(x):\n    return lambda y: x + y\nr = adder(3)(4)", "7"},
		// a closure that is itself closed over
		{"def outer(a):\n    def middle(b):\n        return [a + b + k for k in range(2)]\n    return middle(10)\nr = outer(100)", "[110, 111]"},
		// keyword-only and star arguments captured
		{"def f(*xs, scale=2):\n    return [scale * x for x in xs]\nr = f(1, 2)", "[2, 4]"},
	}
	for _, c := range cases {
		ctx := py.NewContext(py.DefaultContextOpts())
		code, err := Compile(c.src+"\n", "<test>", py.ExecMode, 0, true)
		var m *py.Module
		if err == nil {
			m, err = py.RunCode(ctx, code, "<test>", nil)
		}
		if err == nil {
			var got string
			got, err = py.ReprAsString(m.Globals["r"])
			if err == nil && got != c.want {
				t.Errorf("%q gave %s, want %s", c.src, got, c.want)
			}
		}
		if err != nil {
			t.Errorf("%q: %v", c.src, err)
		}
		ctx.Close()
	}
}

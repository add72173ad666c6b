package interp

import (
	"fmt"
	"os"
	"strings"
	"testing"

	"github.com/go-python/gpython/py"
)

// TestExactArithmeticPatch checks the start-up check passes on the linked
// interpreter, and that / and ** reach the sandbox's arithmetic while
// float code keeps Python's own operators.
func TestExactArithmeticPatch(t *testing.T) {
	if err := Ready(); err != nil {
		t.Fatal(err)
	}
	sb, globals := testSandbox(t, probeArithmetic{})
	code, err := py.Compile("a = 1 / 3\nb = 3 ** -2\nx = 6\nx /= 4\nc = 1.0 / 4\nd = 2 ** 3\n", "<test>", py.ExecMode, 0, true)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := sb.RunCode(code, globals, globals, nil); err != nil {
		t.Fatal(err)
	}
	want := map[string]py.Object{"a": py.String("1/3"), "b": py.String("3**-2"), "x": py.String("6/4"), "c": py.Float(0.25), "d": py.String("2**3")}
	for name, w := range want {
		if globals[name] != w {
			t.Errorf("%s = %v, want %v", name, globals[name], w)
		}
	}
}

// TestPatchCheckedForGoMod keeps the version the patch was checked against
// in step with go.mod: a test binary records no module versions, so the
// start-up check of the version only acts in built binaries.
func TestPatchCheckedForGoMod(t *testing.T) {
	mod, err := os.ReadFile("../../go.mod")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(mod), gpythonModule+" "+gpythonChecked+"\n") {
		t.Errorf("go.mod does not require %s %s: after an upgrade, re-check opcodes.go as DEVELOPERS.md says and raise gpythonChecked", gpythonModule, gpythonChecked)
	}
}

// owned is a value that carries its session's arithmetic, as a notebook
// rational does.
type owned struct{ arith Arithmetic }

var ownedType = py.NewType("owned", "")

func (owned) Type() *py.Type           { return ownedType }
func (o owned) Arithmetic() Arithmetic { return o.arith }
func (owned) String() string           { return "o" }

// markedArithmetic answers like probeArithmetic, with a mark of its own.
type markedArithmetic struct{}

func (markedArithmetic) Quotient(a, b py.Object) (py.Object, bool, error) {
	return py.String(fmt.Sprintf("%v/%v marked", a, b)), true, nil
}

func (markedArithmetic) Power(a, b py.Object) (py.Object, bool, error) {
	return py.String(fmt.Sprintf("%v**%v marked", a, b)), true, nil
}

// An operand that carries its arithmetic (interp.Operand) is answered by
// it, on either side of / and **, without the frame's; int / int still
// asks the frame's sandbox.
func TestOperandArithmetic(t *testing.T) {
	sb, globals := testSandbox(t, probeArithmetic{})
	globals["o"] = owned{markedArithmetic{}}
	code := mustCompile(t, "a = o / 288\nb = 1 / o\nc = o ** -1\nd = 7 / 2\n")
	if _, err := sb.RunCode(code, globals, globals, nil); err != nil {
		t.Fatal(err)
	}
	want := map[string]py.Object{"a": py.String("o/288 marked"), "b": py.String("1/o marked"), "c": py.String("o**-1 marked"), "d": py.String("7/2")}
	for name, w := range want {
		if globals[name] != w {
			t.Errorf("%s = %v, want %v", name, globals[name], w)
		}
	}
}

package interp

import (
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
	sb, err := NewSandbox(probeArithmetic{})
	if err != nil {
		t.Fatal(err)
	}
	defer sb.Close()
	globals, err := sb.Main()
	if err != nil {
		t.Fatal(err)
	}
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

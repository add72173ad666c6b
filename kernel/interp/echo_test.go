package interp

import "testing"

// The rewrite keeps the text and its lines, and wraps only a last
// statement that is an expression (Python's grammar: an expression
// statement; an assignment, def or loop is not one — from memory of the
// language reference). A claim's call shows its verdict line instead.
func TestEchoLast(t *testing.T) {
	for _, c := range []struct{ src, want string }{
		{"1 + 2", "__echo__(1 + 2\n)"},
		{"x = 1; x", "x = 1; __echo__(x\n)"},
		{"x = 1\n[x,\n 2]", "x = 1\n__echo__([x,\n 2]\n)"},
		{"x  # a comment", "__echo__(x  # a comment\n)"},
		{"é = 1; é", "é = 1; __echo__(é\n)"},
		{"x = 1", "x = 1"},
		{"def f():\n    return 1", "def f():\n    return 1"},
		{"for i in range(3):\n    i", "for i in range(3):\n    i"},
		{"1 +", "1 +"}, // does not parse: left for the compile to report
		{"identity(\"a\", 1, 1)", "identity(\"a\", 1, 1)"},
		{"other(1)", "__echo__(other(1)\n)"},
	} {
		if got := EchoLast(c.src, map[string]bool{"identity": true}); got != c.want {
			t.Errorf("EchoLast(%q) = %q, want %q", c.src, got, c.want)
		}
	}
}

// An input is incomplete when more lines could complete it (Python's
// interactive rule, from memory: an open bracket, string or block), and
// complete — or an error — otherwise.
func TestIncomplete(t *testing.T) {
	for src, want := range map[string]bool{
		"def f(x):":                    true,
		"def f(x):\n    return x":      false,
		"[1,\n 2":                      true,
		"f(":                           true,
		"'''open string":               true,
		"with a:":                      true,
		"x = 1":                        false,
		"1 +":                          false, // a syntax error now, not later
		"x = )":                        false,
		"for i in range(3):\n    pass": false,
	} {
		if got := Incomplete(src); got != want {
			t.Errorf("Incomplete(%q) = %v, want %v", src, got, want)
		}
	}
}

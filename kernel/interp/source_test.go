package interp

import (
	"strings"
	"testing"

	"github.com/go-python/gpython/parser"
	"github.com/go-python/gpython/py"
)

// The bracket a cell never closes, found as Python's tokenizer finds it
// (the Python Language Reference, §2.1.6 implicit line joining inside
// brackets, §2.1.3 comments, §2.4.1 string literals, short and triple
// quoted, with backslash escapes); cases written by hand.
func TestUnclosedBracket(t *testing.T) {
	for _, c := range []struct {
		src        string
		open       rune
		line, col  int
		noneToFind bool
	}{
		{src: "identity(\"r\", frac(1, 3), frac(1, 2)\nshow(x)\n", open: '(', line: 1, col: 9},
		{src: "x = [1,\n     {2: (3, 4)\n", open: '{', line: 2, col: 6},
		{src: "s = \"(\" + ')' + '''\n[\n''' # (\nt = f(s\n", open: '(', line: 4, col: 6},
		{src: "a = 'it\\'s (' + g(\n", open: '(', line: 1, col: 18},
		{src: "π = (1\n", open: '(', line: 1, col: 5}, // columns count characters
		{src: "f(1,\n  2 3)\n", noneToFind: true},     // balanced: the parser's message stands
		{src: "f(1]\n", noneToFind: true},             // mismatched
		{src: "s = 'open (\nf(\n", noneToFind: true},  // a short string left open
		{src: "s = '''(\n", noneToFind: true},
	} {
		open, line, col, ok := unclosedBracket(c.src)
		if ok == c.noneToFind || !c.noneToFind && (open != c.open || line != c.line || col != c.col) {
			t.Errorf("%q: %q line %d column %d, found %v", c.src, open, line, col, ok)
		}
	}
}

// A syntax error caused by a bracket left open names the bracket's line,
// not the later line where the parser stopped, and says where that was.
func TestCompileNamesTheOpenBracket(t *testing.T) {
	_, err := Compile(1, 10, "x = frac(1, 3\ny = 2\n", nil)
	line, msg := Describe(err, 0)
	if line != 10 || !strings.HasPrefix(msg, "SyntaxError: '(' is never closed (column 9); the parser stopped at line 11") {
		t.Errorf("line %d: %q", line, msg)
	}
	_, err = Compile(1, 10, "x = f(1,\n  2 3)\n", nil)
	if _, msg := Describe(err, 0); strings.Contains(msg, "never closed") {
		t.Errorf("balanced brackets blamed: %q", msg)
	}
}

// TestUpstreamStillMisplacesUnclosedBracket probes the gap neverClosed
// fills: upstream's parser reports an unclosed bracket at the next line it
// cannot continue with, not at the bracket. When upstream names line 1
// here, neverClosed can go (and the README's list of fixes with it).
func TestUpstreamStillMisplacesUnclosedBracket(t *testing.T) {
	_, err := parser.Parse(strings.NewReader("x = f(1\ny = 2\n"), "<probe>", py.ExecMode)
	e, ok := err.(*py.Exception)
	if !ok {
		t.Fatalf("upstream parsed an unclosed bracket without a syntax error: %v", err)
	}
	if l, _ := e.Dict["lineno"].(py.Int); l == 1 {
		t.Fatalf("upstream now reports the unclosed bracket's own line; neverClosed is no longer needed")
	}
}

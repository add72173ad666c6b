package interp

import (
	"strings"

	"github.com/go-python/gpython/ast"
	"github.com/go-python/gpython/parser"
	"github.com/go-python/gpython/py"
)

// Echo is the hidden builtin that an interactive input's last expression
// is passed to, so its value is shown (assay repl).
const Echo = "__echo__"

// EchoLast rewrites an interactive input so that its last statement, when
// it is an expression, becomes __echo__(expression): the value is shown
// as show() shows it. Line numbers are kept (the call wraps the text where
// it stands). Source that does not parse is returned as it is, for the
// compile to report. A call of one of the claims named is left alone: its
// verdict line is what it shows.
func EchoLast(src string, claims map[string]bool) string {
	tree, err := parser.Parse(strings.NewReader(src+"\n"), "<input>", py.ExecMode)
	if err != nil {
		return src
	}
	mod, ok := tree.(*ast.Module)
	if !ok || len(mod.Body) == 0 {
		return src
	}
	last, ok := mod.Body[len(mod.Body)-1].(*ast.ExprStmt)
	if !ok {
		return src
	}
	if call, ok := last.Value.(*ast.Call); ok {
		if name, ok := call.Func.(*ast.Name); ok && claims[string(name.Id)] {
			return src
		}
	}
	lines := strings.Split(src, "\n")
	at, col := last.Lineno-1, last.ColOffset // col counts bytes
	if at < 0 || at >= len(lines) || col < 0 || col > len(lines[at]) {
		return src
	}
	// What precedes the expression on its line is blank or ends a
	// statement with ";"; anything else is a position not understood.
	if before := strings.TrimSpace(lines[at][:col]); before != "" && !strings.HasSuffix(before, ";") {
		return src
	}
	head := strings.Join(append(lines[:at:at], lines[at][:col]), "\n")
	// The closing bracket goes on a line of its own, after any comment.
	return head + Echo + "(" + strings.Join(append([]string{lines[at][col:]}, lines[at+1:]...), "\n") + "\n)"
}

// Incomplete says whether interactive input stops in the middle of a
// statement (an open bracket, a block with no body yet, a string left
// open at the end of the text): the parser fails at the end of the text
// rather than before it, so more lines may complete it.
func Incomplete(src string) bool {
	_, err := parser.Parse(strings.NewReader(src+"\n"), "<input>", py.ExecMode)
	if err == nil {
		return false
	}
	msg := err.Error()
	return strings.Contains(msg, "EOF")
}

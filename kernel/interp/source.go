package interp

import (
	"bytes"
	"fmt"
	"sort"
	"strings"
	"unicode/utf8"

	"github.com/go-python/gpython/ast"
	"github.com/go-python/gpython/parser"
	"github.com/go-python/gpython/py"
)

// ClaimSite is the hidden builtin that tags a claim call with its line.
const ClaimSite = "__claim_site__"

// cellPrefix starts the file name of a cell's code, so tracebacks can be
// traced back to notebook lines.
const cellPrefix = "<cell "

func cellFile(cell int) string { return fmt.Sprintf("%s%d>", cellPrefix, cell) }

// Compile turns a cell's source into code whose line numbers are notebook
// lines: the source is preceded by line-1 empty lines. Calls of the named
// claim builtins are rewritten from identity(...) to
// __claim_site__(57, identity)(...), so a claim knows its notebook line
// even inside loops and functions.
func Compile(cell, line int, src string, claims map[string]bool) (*py.Code, error) {
	padded := strings.Repeat("\n", line-1) + src
	if !strings.HasSuffix(padded, "\n") {
		padded += "\n"
	}
	tree, err := parser.Parse(bytes.NewBufferString(padded), cellFile(cell), py.ExecMode)
	if err != nil {
		return nil, neverClosed(err, padded)
	}
	type site struct {
		line, col int
		name      string
	}
	var sites []site
	ast.Walk(tree, func(node ast.Ast) bool {
		if call, ok := node.(*ast.Call); ok {
			if name, ok := call.Func.(*ast.Name); ok && claims[string(name.Id)] {
				sites = append(sites, site{name.Lineno, name.ColOffset, string(name.Id)})
			}
		}
		return true
	})
	if len(sites) > 0 {
		lines := strings.Split(padded, "\n")
		// Rewrite from the right so earlier columns stay valid.
		sort.Slice(sites, func(i, j int) bool {
			if sites[i].line != sites[j].line {
				return sites[i].line < sites[j].line
			}
			return sites[i].col > sites[j].col
		})
		for _, s := range sites {
			l := lines[s.line-1]
			if s.col+len(s.name) > len(l) || l[s.col:s.col+len(s.name)] != s.name {
				continue // position not understood: the claim gets the cell's line
			}
			lines[s.line-1] = l[:s.col] + fmt.Sprintf("%s(%d, %s)", ClaimSite, s.line, s.name) + l[s.col+len(s.name):]
		}
		padded = strings.Join(lines, "\n")
	}
	return py.Compile(padded, cellFile(cell), py.ExecMode, 0, true)
}

// neverClosed points a syntax error at its likely cause when the source
// leaves a bracket open to its end, as Python's own tokenizer does ("'('
// was never closed"): the parser stops only at the next line that cannot
// continue the statement, one that is usually correct itself. The error
// then names the bracket's line and column, and says where the parser
// stopped (ExceptionText adds the note).
func neverClosed(err error, src string) error {
	e, ok := err.(*py.Exception)
	if !ok || e.Base.Name != "SyntaxError" {
		return err
	}
	open, line, col, ok := unclosedBracket(src)
	if !ok {
		return err
	}
	stopped := ExceptionMessage(e)
	if l, ok := e.Dict["lineno"].(py.Int); ok && l > 0 {
		stopped = fmt.Sprintf("the parser stopped at line %d: %s", int(l), stopped)
	}
	e.Args = py.Tuple{py.String(fmt.Sprintf("'%c' is never closed", open))}
	e.Dict["lineno"], e.Dict["offset"], e.Dict["note"] = py.Int(line), py.Int(col), py.String(stopped)
	return e
}

// unclosedBracket finds the innermost bracket that src opens and never
// closes, skipping comments and string literals: the bracket and its line
// and column (1-based, in characters). ok is false when every bracket
// closes, a closing one does not match, or a string is left open (the
// parser's own message is then the clue).
func unclosedBracket(src string) (open rune, line, col int, ok bool) {
	type bracket struct {
		c         rune
		line, col int
	}
	closes := map[byte]rune{')': '(', ']': '[', '}': '{'}
	var stack []bracket
	line, start := 1, 0
	for i := 0; i < len(src); i++ {
		switch c := src[i]; c {
		case '\n':
			line, start = line+1, i+1
		case '#':
			for i+1 < len(src) && src[i+1] != '\n' {
				i++
			}
		case '\'', '"':
			q := src[i : i+1]
			if strings.HasPrefix(src[i:], q+q+q) {
				q += q + q
			}
			j := i + len(q)
			for ; j < len(src) && !strings.HasPrefix(src[j:], q); j++ {
				switch {
				case src[j] == '\\' && j+1 < len(src):
					j++ // an escaped character, a quote or a line end among them
					if src[j] == '\n' {
						line, start = line+1, j+1
					}
				case src[j] == '\n' && len(q) == 1:
					return 0, 0, 0, false
				case src[j] == '\n':
					line, start = line+1, j+1
				}
			}
			if j >= len(src) {
				return 0, 0, 0, false
			}
			i = j + len(q) - 1
		case '(', '[', '{':
			stack = append(stack, bracket{rune(c), line, utf8.RuneCountInString(src[start:i]) + 1})
		case ')', ']', '}':
			if len(stack) == 0 || stack[len(stack)-1].c != closes[c] {
				return 0, 0, 0, false
			}
			stack = stack[:len(stack)-1]
		}
	}
	if len(stack) == 0 {
		return 0, 0, 0, false
	}
	b := stack[len(stack)-1]
	return b.c, b.line, b.col, true
}

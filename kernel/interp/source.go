package interp

import (
	"bytes"
	"fmt"
	"sort"
	"strings"

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
		return nil, err
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

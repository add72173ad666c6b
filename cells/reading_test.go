package cells

import (
	"reflect"
	"regexp"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/gomarkdown/markdown/ast"
	mdparser "github.com/gomarkdown/markdown/parser"
)

// The outside source for what a cell is: the CommonMark spec, version
// 0.31.2 (https://spec.commonmark.org/0.31.2/): 2.1 "Characters and lines"
// (LF, CRLF and a lone CR each end a line), 4.4 "Indented code blocks",
// 4.5 "Fenced code blocks" (3 or more backticks or tildes, up to 3 spaces
// of indentation, no backtick in a backtick fence's info string, escapes
// and entities resolved in the info string), 4.6 "HTML blocks" (the seven
// start and end conditions; a comment runs from <!-- to the line holding
// -->), 5.1 "Block quotes" and 5.2 "List items" (a fence inside either is
// not at the top level). As an independent reading of the same spec the
// tests use gomarkdown's CommonMark mode, which passes the spec's 652
// examples (its commonmark_test.go): the cells Parse finds must be the
// fenced code blocks at the top level of that reading whose info string
// starts with the word "cell".

// commonMarkCells lists the info strings and contents of the top-level
// fenced code blocks of src that gomarkdown's CommonMark parser reads as
// having the language "cell".
func commonMarkCells(src string) []string {
	doc := mdparser.NewCommonMark().Parse([]byte(src))
	var out []string
	for _, n := range doc.GetChildren() {
		cb, ok := n.(*ast.CodeBlock)
		if !ok || !cb.IsFenced {
			continue
		}
		if w := strings.Fields(string(cb.Info)); len(w) > 0 && w[0] == "cell" {
			out = append(out, string(cb.Literal))
		}
	}
	return out
}

// parsedCells lists the contents of the cells Parse finds.
func parsedCells(nb *Notebook) []string {
	var out []string
	for _, c := range nb.Cells() {
		out = append(out, c.Text)
	}
	return out
}

// braces hides braces from both readings: gomarkdown takes "{lang}" after
// a fence for the language lang, an extension of its own that CommonMark
// does not have (there the info string is "{lang}"), and braces mean
// nothing else to block structure.
var braces = strings.NewReplacer("{", "(", "}", ")")

// lowerDeclaration starts an HTML block of type 4 in CommonMark 0.31.2
// ("<!" and an ASCII letter), where gomarkdown still follows the older
// rule (an uppercase letter only): such inputs are not compared.
var lowerDeclaration = regexp.MustCompile(`<![a-z]`)

// bareMarker is a list item that begins with a blank line: gomarkdown ends
// it at the next blank line, where CommonMark 0.31.2 goes on while the
// lines are indented enough (spec 5.2, rule 3; "-\n  foo\n\n  bar" is one
// item of two paragraphs): such inputs are not compared.
var bareMarker = regexp.MustCompile(`(?m)^[ >]*([-+*]|[0-9]{1,9}[.)])[ \t]*$`)

// sameReading fails when Parse and the CommonMark reading disagree on the
// cells of src; it returns Parse's notebook of src.
func sameReading(t *testing.T, src string) *Notebook {
	t.Helper()
	nb, _ := Parse("r.md", []byte(src))
	plain := braces.Replace(src)
	other, err := Parse("r.md", []byte(plain))
	if err != nil || lowerDeclaration.MatchString(src) || bareMarker.MatchString(src) {
		return nb
	}
	got, want := parsedCells(other), commonMarkCells(plain)
	if strings.Join(got, "\x00") != strings.Join(want, "\x00") || len(got) != len(want) {
		t.Errorf("cells of %q:\nParse      %q\nCommonMark %q", src, got, want)
	}
	return nb
}

func TestOneReading(t *testing.T) {
	for _, tc := range []struct {
		name  string
		src   string
		cells int
		warn  []int  // lines with a warning
		text  string // in the first warning
	}{
		{"plain", "# T\n\n```cell\nx = 1\n```\n", 1, nil, ""},
		{"html comment hides a cell", "# T\n\n<!--\n```cell\ndet = 0\n```\n-->\n\n```cell\ny = 2\n```\n", 1, []int{4}, "inside an HTML comment (opened at line 3)"},
		{"one-line comment hides nothing", "<!-- note -->\n```cell\nx\n```\n", 1, nil, ""},
		{"html block to the blank line", "<div>\n```cell\nx\n```\n</div>\n\n```cell\ny\n```\n", 1, []int{2}, "inside an HTML block (opened at line 1)"},
		{"CR line ends", "# T\r\r```cell\rx = 1\r```\r\rtext\r", 1, nil, ""},
		{"CRLF line ends", "# T\r\n\r\n```cell\r\nx = 1\r\n```\r\n", 1, nil, ""},
		{"block quote", "> ```cell\n> x\n> ```\n", 0, []int{1}, "inside a block quote"},
		{"lazy line after a quote", "> quoted\n```cell\nx\n```\n", 1, nil, ""},
		{"list item", "- a\n\n  ```cell\n  x\n  ```\n", 0, []int{3}, "inside a list item"},
		{"fence after a list", "- a\n\n```cell\nx\n```\n", 1, nil, ""},
		{"fence on a list item's line", "1. ```cell\n   x\n   ```\n", 0, []int{1}, "inside a list item"},
		{"indented code", "para\n\n    ```cell\n    x\n    ```\n", 0, []int{3}, "indented by 4 or more columns"},
		{"tab is 4 columns", "\t```cell\n\tx\n\t```\n", 0, []int{1}, "indented by 4 or more columns"},
		{"paragraph continuation", "para\n    ```cell\nx\n", 0, []int{2}, "indented by 4 or more columns"},
		{"Cell", "```Cell\nx\n```\n", 0, []int{1}, `info string "Cell" is not a cell`},
		{"cell,", "~~~cell, seed=1\nx\n~~~\n", 0, []int{1}, `info string "cell, seed=1"`},
		{"cells", "```cells\nx\n```\n", 0, []int{1}, `"cells"`},
		{"braces", "```{cell}\nx\n```\n", 0, []int{1}, `"{cell}"`},
		{"two backticks", "``cell\nx\n``\n", 0, []int{1}, "at least 3 backticks"},
		{"backtick in the info string", "```cell `x`\n", 0, []int{1}, "cannot have a backtick"},
		{"entity in the info string", "```c&#101;ll\nx\n```\n", 1, nil, ""},
		{"escape in the info string", "```\\cell\nx\n```\n", 0, []int{1}, `info string "\\cell"`},
		{"python is prose", "```python\nx\n```\n", 0, nil, ""},
		{"fence inside a fence", "````\n```cell\nx\n```\n````\n", 0, nil, ""},
		{"output with no cell", "text\n\n```output\nx\n```\n", 0, []int{3}, "does not directly follow a cell"},
		{"title in a comment is no title", "<!--\n# Secret\n-->\n# Shown\n", 0, nil, ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			nb := sameReading(t, tc.src)
			if len(nb.Cells()) != tc.cells {
				t.Errorf("%d cells, want %d", len(nb.Cells()), tc.cells)
			}
			var lines []int
			for _, w := range nb.Warnings {
				lines = append(lines, w.Line)
			}
			if !reflect.DeepEqual(lines, tc.warn) {
				t.Errorf("warnings at lines %v, want %v: %v", lines, tc.warn, nb.Warnings)
			}
			if tc.text != "" && (len(nb.Warnings) == 0 || !strings.Contains(nb.Warnings[0].Message, tc.text)) {
				t.Errorf("first warning %v lacks %q", nb.Warnings, tc.text)
			}
		})
	}
	nb, _ := Parse("t.md", []byte("<!--\n# Secret\n-->\n# Shown\n"))
	if nb.Title != "Shown" {
		t.Errorf("title %q, want the heading outside the comment", nb.Title)
	}
}

// FuzzOneReading: on any notebook that parses, Parse finds the cells the
// CommonMark reading finds. `go test ./cells -fuzz FuzzOneReading`
// explores further; plain `go test` runs the seeds.
func FuzzOneReading(f *testing.F) {
	for _, seed := range []string{
		"```cell\nx\n```\n", "<!--\n```cell\nx\n```\n-->\n", "> a\n```cell\nx\n```\n", "- a\n\n  ```cell\n  x\n  ```\n",
		"1. a\n\n   ```cell\n   x\n   ```\n", "<div>\n```cell\nx\n```\n\n```cell\ny\n```\n", "    ```cell\n", "# T\r```cell\rx\r```\r",
		"* * *\n```cell\nx\n```\n", "-\n\n  ```cell\n  x\n  ```\n", "> - a\n>\n>   ```cell\n>   x\n>   ```\n", "<pre>\n```cell\n</pre>\n```cell\nx\n```\n",
		"para\n<custom-tag>\n```cell\nx\n```\n", "<custom-tag>\n```cell\nx\n```\n", "\t- a\n\n\t  ```cell\n\t  x\n\t  ```\n",
	} {
		f.Add(seed)
	}
	f.Fuzz(func(t *testing.T, src string) {
		if !utf8.ValidString(src) || strings.ContainsAny(src, "\x00\t\v\f") {
			// NUL becomes U+FFFD and tabs inside code are cut by columns
			// in CommonMark, which only changes a cell's text; gomarkdown
			// takes vertical tab and form feed for the spaces around an
			// HTML tag's name, the spec's older wording.
			return
		}
		sameReading(t, src)
	})
}

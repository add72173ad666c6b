package cells

import (
	"errors"
	"reflect"
	"strings"
	"testing"
	"time"
)

func prose(line int, text string) Block { return Block{Kind: Prose, Line: line, Text: text} }

func cellAt(index, fenceLine int, fence, info, text string) Block {
	return Block{Kind: Code, Index: index, FenceLine: fenceLine, Line: fenceLine + 1, Fence: fence, Info: info, Text: text}
}

func withOpts(b Block, o CellOptions) Block { b.Options = o; return b }

func seed(n int64) *int64 { return &n }

// assayRegion is a generated region holding content as assay writes it:
// its opening marker carries the hash of its lines.
func assayRegion(content string) string {
	w := &mdWriter{eol: "\n"}
	w.region("cell", content)
	return w.b.String()
}

func TestParse(t *testing.T) {
	tests := []struct {
		name  string
		src   string
		want  []Block
		err   string // the whole message, "" for none
		title string // "" means the file's base name, "nb"
		warn  []int  // lines with a warning
	}{
		{name: "empty", src: ""},
		{name: "only prose", src: "# Hello world #\n\nSome text.\n", title: "Hello world",
			want: []Block{prose(1, "# Hello world #\n\nSome text.\n")}},
		{name: "backtick cell", src: "Intro\n```cell\nx = 1\n```\nOutro\n",
			want: []Block{prose(1, "Intro\n"), cellAt(1, 2, "```", "cell", "x = 1\n"), prose(5, "Outro\n")}},
		{name: "tilde cell", src: "~~~cell\nx = 1\ny = 2\n~~~\n",
			want: []Block{cellAt(1, 1, "~~~", "cell", "x = 1\ny = 2\n")}},
		{name: "empty cell", src: "```cell\n```\n", want: []Block{cellAt(1, 1, "```", "cell", "")}},
		{name: "longer fence holds a shorter one", src: "````cell\n```\ninner\n```\n````\n",
			want: []Block{cellAt(1, 1, "````", "cell", "```\ninner\n```\n")}},
		{name: "closing fence at least as long", src: "~~~~cell\nx\n~~~\n~~~~~  \n",
			want: []Block{cellAt(1, 1, "~~~~", "cell", "x\n~~~\n")}},
		{name: "tildes do not close backticks", src: "```cell\n~~~\n```\n",
			want: []Block{cellAt(1, 1, "```", "cell", "~~~\n")}},
		{name: "text after a closing fence", src: "```cell\n``` x\n```\n",
			want: []Block{cellAt(1, 1, "```", "cell", "``` x\n")}},
		{name: "indented fence", src: "  ```cell\n  x\n   y\nz\n   ```\n",
			want: []Block{cellAt(1, 1, "```", "cell", "x\n y\nz\n")}},
		{name: "four spaces is not a fence", src: "    ```cell\n    x\n", want: []Block{prose(1, "    ```cell\n    x\n")}, warn: []int{1}},
		{name: "two backticks is not a fence", src: "``cell\nx\n", want: []Block{prose(1, "``cell\nx\n")}, warn: []int{1}},
		{name: "info string spaces", src: "```   cell   seed=3  \nx\n```\n",
			want: []Block{withOpts(cellAt(1, 1, "```", "cell   seed=3", "x\n"), CellOptions{Seed: seed(3)})}},
		{name: "other info strings are prose", src: "```python\nx\n```\n```cells\ny\n```\n~~~Cell\nz\n~~~\n```\nw\n```\n",
			want: []Block{prose(1, "```python\nx\n```\n```cells\ny\n```\n~~~Cell\nz\n~~~\n```\nw\n```\n")}, warn: []int{4, 7}},
		{name: "backtick in a backtick info string", src: "```a`b```\ntext\n", want: []Block{prose(1, "```a`b```\ntext\n")}},
		{name: "cells numbered in order", src: "```cell\na\n```\n\ntext\n\n~~~cell\nb\n~~~\n```cell\nc\n```\n",
			want: []Block{cellAt(1, 1, "```", "cell", "a\n"), prose(4, "\ntext\n\n"), cellAt(2, 7, "~~~", "cell", "b\n"),
				cellAt(3, 10, "```", "cell", "c\n")}},
		{name: "all options", src: "```cell timeout=1m30s precision=512 seed=-7 id=My_cell-2\n```\n",
			want: []Block{withOpts(cellAt(1, 1, "```", "cell timeout=1m30s precision=512 seed=-7 id=My_cell-2", ""),
				CellOptions{Timeout: 90 * time.Second, Precision: 512, Seed: seed(-7), ID: "My_cell-2"})}},
		{name: "unknown option", src: "text\n```cell foo=1\nx\n```\n",
			err:  `line 2: unknown cell option "foo" (known: id, precision, seed, timeout)`,
			want: []Block{prose(1, "text\n```cell foo=1\nx\n```\n")}},
		{name: "word without =", src: "```cell fast\n```\n",
			err: `line 1: cell option "fast" is not of the form key=value (e.g. timeout=30s)`},
		{name: "empty key", src: "```cell =5\n```\n", err: `line 1: cell option "=5" is not of the form key=value (e.g. timeout=30s)`},
		{name: "bad timeout", src: "```cell timeout=fast\n```\n",
			err: "line 1: cell option timeout=fast: want a positive duration such as 30s or 1m"},
		{name: "timeout without unit", src: "```cell timeout=30\n```\n",
			err: "line 1: cell option timeout=30: want a positive duration such as 30s or 1m"},
		{name: "negative timeout", src: "```cell timeout=-1s\n```\n",
			err: "line 1: cell option timeout=-1s: want a positive duration such as 30s or 1m"},
		{name: "zero timeout", src: "```cell timeout=0s\n```\n",
			err: "line 1: cell option timeout=0s: want a positive duration such as 30s or 1m"},
		{name: "precision too small", src: "```cell precision=1\n```\n",
			err: "line 1: cell option precision=1: want a whole number of bits, at least 2"},
		{name: "precision not a number", src: "```cell precision=64.5\n```\n",
			err: "line 1: cell option precision=64.5: want a whole number of bits, at least 2"},
		{name: "bad seed", src: "```cell seed=x\n```\n",
			err: "line 1: cell option seed=x: want a whole number that fits in 64 bits"},
		{name: "seed too large", src: "```cell seed=99999999999999999999\n```\n",
			err: "line 1: cell option seed=99999999999999999999: want a whole number that fits in 64 bits"},
		{name: "bad id", src: "```cell id=a.b\n```\n",
			err: "line 1: cell option id=a.b: an id is made of letters, digits, _ and - only"},
		{name: "empty id", src: "```cell id=\n```\n",
			err: "line 1: cell option id=: an id is made of letters, digits, _ and - only"},
		{name: "duplicate id", src: "```cell id=a\n```\n```cell id=b\n```\n```cell id=a\n```\n",
			err: `line 5: cell id "a" is already used by cell 1 (line 1)`,
			want: []Block{withOpts(cellAt(1, 1, "```", "cell id=a", ""), CellOptions{ID: "a"}),
				withOpts(cellAt(2, 3, "```", "cell id=b", ""), CellOptions{ID: "b"}), prose(5, "```cell id=a\n```\n")}},
		{name: "option given twice", src: "```cell seed=1 seed=2\n```\n", err: `line 1: cell option "seed" is given twice`},
		{name: "output after a cell is skipped", src: "```cell\nprint(1)\n```\n\n\n````output\n```\n1\n````\ntext\n",
			want: []Block{cellAt(1, 1, "```", "cell", "print(1)\n"), prose(10, "text\n")}},
		{name: "output right after a cell is skipped", src: "~~~cell\nprint(1)\n~~~\n```output\n1\n```\n",
			want: []Block{cellAt(1, 1, "~~~", "cell", "print(1)\n")}},
		{name: "output after prose is kept", src: "```cell\nx\n```\ntext\n```output\n1\n```\n",
			want: []Block{cellAt(1, 1, "```", "cell", "x\n"), prose(4, "text\n```output\n1\n```\n")}, warn: []int{5}},
		{name: "unclosed output", src: "```cell\nx\n```\n```output\n1\n",
			err:  "line 4: the fence ``` opened here is never closed",
			want: []Block{cellAt(1, 1, "```", "cell", "x\n"), prose(4, "```output\n1\n")}},
		{name: "generated regions are skipped", src: "a\n" + assayRegion("# Not the title\n```\n<!-- /assay:generated -->\n```\n") + "b\n" +
			"```cell\nx\n```\n```output\n```\n  " + strings.Replace(assayRegion("| t |\n"), "-->\n", "-->  \n", 1) + "c\n",
			want: []Block{prose(1, "a\nb\n"), cellAt(1, 11, "```", "cell", "x\n"), prose(21, "c\n")}},
		{name: "markers inside a fence are text", src: "```\n<!-- assay:generated -->\n```\n",
			want: []Block{prose(1, "```\n<!-- assay:generated -->\n```\n")}},
		{name: "unclosed generated region", src: "a\n<!-- assay:generated -->\nb\n",
			err:  "line 2: the generated region opened here is never closed (no <!-- /assay:generated --> line)",
			want: []Block{prose(1, "a\n<!-- assay:generated -->\nb\n")}},
		{name: "stray end of region", src: "a\n<!-- /assay:generated -->\n",
			err:  "line 2: <!-- /assay:generated --> without an opening <!-- assay:generated -->",
			want: []Block{prose(1, "a\n<!-- /assay:generated -->\n")}},
		{name: "unclosed cell", src: "text\n```cell\nx = 1\n",
			err:  "line 2: the fence ``` opened here is never closed",
			want: []Block{prose(1, "text\n```cell\nx = 1\n")}},
		{name: "unclosed prose fence after a cell", src: "```cell\nx\n```\n\n~~~~python\nx\n~~~\n",
			err:  "line 5: the fence ~~~~ opened here is never closed",
			want: []Block{cellAt(1, 1, "```", "cell", "x\n"), prose(4, "\n~~~~python\nx\n~~~\n")}},
		{name: "not UTF-8", src: "ok\né ok\nabcdé\xffg\n```cell\n",
			err:  "line 3: the file is not valid UTF-8 (byte 0xff at column 6)",
			want: []Block{prose(1, "ok\né ok\nabcdé\xffg\n```cell\n")}},
		{name: "CRLF", src: "# Title\r\n\r\n```cell id=a\r\nx = 1\r\n\r\n```\r\ntext\r\n```output\r\n```\r\n", title: "Title",
			want: []Block{prose(1, "# Title\r\n\r\n"), withOpts(cellAt(1, 3, "```", "cell id=a", "x = 1\n\n"), CellOptions{ID: "a"}), prose(7, "text\r\n```output\r\n```\r\n")},
			warn: []int{8}},
		{name: "no final newline", src: "```cell\nx\n```", want: []Block{cellAt(1, 1, "```", "cell", "x\n")}},
		{name: "title is the first level-1 heading outside fences", src: "Intro\n## Sub\n#NoSpace\n```\n# In a fence\n```\n  # Real title  \n# Second\n",
			title: "Real title", want: []Block{prose(1, "Intro\n## Sub\n#NoSpace\n```\n# In a fence\n```\n  # Real title  \n# Second\n")}},
		{name: "title keeps a # that is not a closing sequence", src: "# C# notes\n", title: "C# notes", want: []Block{prose(1, "# C# notes\n")}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			nb, err := Parse("notebooks/nb.md", []byte(tc.src))
			if nb == nil {
				t.Fatal("Parse returned a nil notebook")
			}
			switch {
			case tc.err == "" && err != nil:
				t.Fatalf("unexpected error: %v", err)
			case tc.err != "" && err == nil:
				t.Fatalf("no error, want %q", tc.err)
			case err != nil:
				var pe *Error
				if !errors.As(err, &pe) {
					t.Fatalf("error %T is not a *cells.Error", err)
				}
				if err.Error() != tc.err {
					t.Errorf("error\n got %q\nwant %q", err, tc.err)
				}
			}
			if tc.want != nil || tc.err == "" {
				got := make([]Block, len(nb.Blocks))
				for i, b := range nb.Blocks {
					b.Raw = ""
					got[i] = b
				}
				if len(got) == 0 && len(tc.want) == 0 {
					got = nil
				}
				if !reflect.DeepEqual(got, tc.want) {
					t.Errorf("blocks\n got %+v\nwant %+v", got, tc.want)
				}
			}
			title := tc.title
			if title == "" {
				title = "nb"
			}
			if nb.Title != title {
				t.Errorf("title %q, want %q", nb.Title, title)
			}
			if string(nb.Source) != tc.src || nb.Path != "notebooks/nb.md" {
				t.Errorf("Source or Path not kept")
			}
			var warned []int
			for _, w := range nb.Warnings {
				warned = append(warned, w.Line)
			}
			if !reflect.DeepEqual(warned, tc.warn) {
				t.Errorf("warnings at lines %v, want %v: %v", warned, tc.warn, nb.Warnings)
			}
		})
	}
}

// TestParseRaw checks that a cell's Raw is its lines verbatim, and that the
// blocks put back together give the notebook without outputs and regions.
func TestParseRaw(t *testing.T) {
	src := "# T\r\n  ~~~~cell id=x  \r\n  a\r\n ~~~~~\r\n```output\r\n```\r\nend"
	nb, err := Parse("t.md", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if got, want := nb.Cells()[0].Raw, "  ~~~~cell id=x  \r\n  a\r\n ~~~~~\r\n"; got != want {
		t.Errorf("Raw %q, want %q", got, want)
	}
	var b strings.Builder
	for _, bl := range nb.Blocks {
		if bl.Kind == Code {
			b.WriteString(bl.Raw)
		} else {
			b.WriteString(bl.Text)
		}
	}
	if want := "# T\r\n  ~~~~cell id=x  \r\n  a\r\n ~~~~~\r\nend"; b.String() != want {
		t.Errorf("blocks put together give %q, want %q", b.String(), want)
	}
}

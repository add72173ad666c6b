package main

import (
	"bytes"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"assay/cells"
)

// One reading of the notebook (issue 12, items 4 to 6), end to end: what a
// CommonMark reader shows as a fenced code block with the info string
// "cell", at the top level of the document, is a cell, and nothing else
// runs; whatever looks like a cell but is not one is named, with its
// line, on the terminal and in both reports.
//
// The outside source is the CommonMark spec, version 0.31.2
// (https://spec.commonmark.org/0.31.2/): section 2.1 "Characters and
// lines" (a line ending is LF, CRLF or a lone CR), 4.4 "Indented code
// blocks", 4.5 "Fenced code blocks" (the info string's first word), 4.6
// "HTML blocks" (start condition 2: a comment runs from "<!--" to the line
// holding "-->"; a one-line comment ends on its own line), 5.1 "Block
// quotes" and 5.2 "List items" (a fence in either belongs to it).

// badRun runs a testdata/bad notebook with `assay run` and returns the exit
// status, the terminal output (warnings from standard error, then standard
// output) and both reports, failing when a report is missing or the
// notebook was changed.
func badRun(t *testing.T, name string) (code int, term, md, html string) {
	t.Helper()
	nb := copyNotebook(t, filepath.Join("..", "..", "testdata", "bad", name))
	before, _ := os.ReadFile(nb)
	code, stdout, stderr := assay(t, "run", nb, "--max-memory", "200MiB")
	base := strings.TrimSuffix(nb, ".md")
	mdb, err := os.ReadFile(base + ".report.md")
	if err != nil {
		t.Fatalf("no report written: %v\n%s%s", err, stdout, stderr)
	}
	htmlb, err := os.ReadFile(base + ".report.html")
	if err != nil {
		t.Fatalf("no HTML report written: %v", err)
	}
	if after, _ := os.ReadFile(nb); !bytes.Equal(before, after) {
		t.Errorf("the notebook was modified")
	}
	if strings.Contains(stdout, ": warning: ") {
		t.Errorf("warnings on standard output:\n%s", stdout)
	}
	return code, stderr + stdout, string(mdb), string(htmlb)
}

// wants fails for each string of want that text lacks.
func wants(t *testing.T, what, text string, want ...string) {
	t.Helper()
	for _, w := range want {
		if !strings.Contains(text, w) {
			t.Errorf("%s lacks %q:\n%s", what, w, text)
		}
	}
}

// A cell inside an HTML comment is hidden by Markdown viewers: it does not
// run (before, it rebound det and the claim below "held"), and a warning
// names its line.
func TestCellInACommentDoesNotRun(t *testing.T) {
	code, term, md, html := badRun(t, "notebook-comment-cell.md")
	if code != 1 {
		t.Errorf("exit %d, want 1 (the claim fails: det is 5)\n%s", code, term)
	}
	warning := "a cell fence inside an HTML comment (opened at line 6) is hidden by Markdown viewers, not a cell: it was not run"
	wants(t, "the terminal output", term, "notebook-comment-cell.md:7: warning: "+warning, "✘ fails", "notebook-comment-cell.md:13")
	wants(t, "the Markdown report", md, "- warnings: 1", "- line 7: "+warning, "| `5` | ✘ fails |")
	wants(t, "the HTML report", html, "<li>line 7: "+warning, `<td class="verdict v-fails">✘ fails`)
	if strings.Contains(html, "det = lambda") || strings.Contains(html, `class="verdict v-holds"`) {
		t.Errorf("the HTML report shows the hidden cell or a verdict that holds:\n%s", html)
	}
}

// A balanced pair of region markers that assay did not write (no hash of
// the content) hides nothing: the cell between them runs, and a warning
// names the region's lines. Before, the cell was skipped: 0 claims, exit 0.
func TestForgedRegionDoesNotHideACell(t *testing.T) {
	code, term, md, html := badRun(t, "notebook-forged-region.md")
	if code != 1 {
		t.Errorf("exit %d, want 1\n%s", code, term)
	}
	warning := "the generated region of lines 3–7 is not assay's (its opening marker carries no hash of its content): its text is read as part of the notebook"
	wants(t, "the terminal output", term, "notebook-forged-region.md:3: warning: "+warning, "✘ fails", "notebook-forged-region.md:5", "1 claim")
	wants(t, "the Markdown report", md, "- line 3: "+warning, "| 1 | one third plus one sixth is one third |")
	wants(t, "the HTML report", html, `<td class="verdict v-fails">`)
}

// Lone CR line ends are line ends (before: nothing ran, "0 claims", exit
// 0), and errors name the right notebook line.
func TestCarriageReturnLineEnds(t *testing.T) {
	code, term, md, _ := badRun(t, "notebook-cr-line-ends.md")
	if code != 2 {
		t.Errorf("exit %d, want 2 (the second cell's NameError)\n%s", code, term)
	}
	wants(t, "the terminal output", term, "✔ holds  one half twice", "notebook-cr-line-ends.md:4",
		"notebook-cr-line-ends.md:8: NameError", "1 claim")
	wants(t, "the Markdown report", md, "cell 2, line 8: NameError", "\r```output\r")
	if strings.Contains(md, "\n") {
		t.Errorf("the report of a CR notebook mixes in LF line ends")
	}
}

// Fences in a block quote, in a list item or in indented code, and near
// misses of the info string, are not cells: each gets a warning, and the
// exit status is that of the one real cell.
func TestNearCellsAreNamed(t *testing.T) {
	code, term, md, html := badRun(t, "notebook-near-cells.md")
	if code != 0 {
		t.Errorf("exit %d, want 0: warnings do not fail a run\n%s", code, term)
	}
	for _, w := range []string{
		`:3: warning: a cell fence inside a block quote is quoted text, not a cell: it was not run`,
		`:9: warning: a cell fence inside a list item is part of the list, not a cell: it was not run`,
		`:15: warning: a cell fence indented by 4 or more columns is indented text, not a fence: it was not run`,
		`:19: warning: a fence with info string "Cell" is not a cell: it was not run`,
		`:23: warning: a fence with info string "cell, seed=3" is not a cell: it was not run`,
		"1 claim — 1 holds", "; 5 warnings",
	} {
		wants(t, "the terminal output", term, w)
	}
	wants(t, "the Markdown report", md, "- warnings: 5", "- line 3: ", "- line 9: ", "- line 15: ", "- line 19: ", "- line 23: ")
	if n := strings.Count(html, `class="language-cell"`); n != 1 {
		t.Errorf("the HTML report styles %d code blocks as cells, want the 1 that ran", n)
	}
	// check prints the same warnings on standard error and keeps the exit
	// status; with --json they are in the document too.
	code, out, errs := assay(t, "check", filepath.Join("..", "..", "testdata", "bad", "notebook-near-cells.md"))
	if code != 0 || strings.Count(errs, ": warning: ") != 5 || !strings.Contains(out, "; 5 warnings") {
		t.Errorf("check: exit %d\n%s%s", code, errs, out)
	}
	code, out, errs = assay(t, "check", "--json", filepath.Join("..", "..", "testdata", "bad", "notebook-near-cells.md"))
	if code != 0 || !strings.Contains(out, `"warnings": [`) || !strings.Contains(out, `"line": 23`) || strings.Count(errs, ": warning: ") != 5 {
		t.Errorf("check --json: exit %d\n%s%s", code, errs, out)
	}
}

// Notebook text is never styled or placed like a computed verdict: a claim
// named "✔ holds" with terminal escapes, table() cells saying "✔ holds",
// a printed fence line and an output block after no cell.
func TestNotebookTextIsNoVerdict(t *testing.T) {
	code, term, md, html := badRun(t, "notebook-lookalike-output.md")
	if code != 1 {
		t.Errorf("exit %d, want 1\n%s", code, term)
	}
	if strings.ContainsAny(term+md+html, "\x1b") {
		t.Errorf("an escape character reaches the terminal or a report:\n%q", term)
	}
	wants(t, "the terminal output", term, `✘ fails  “\x1b[32m✔ holds\x1b[0m”`,
		"notebook-lookalike-output.md:12: warning: an output block that does not directly follow a cell is not a cell's output")
	wants(t, "the Markdown report", md, `| 1 | “\\x1b\[32m✔ holds\\x1b\[0m” | identity |`, "| det | “✔ holds” |",
		`| a \| b | \<b\>x\</b\> |`, "````output\n```\n\\x1b[2J✔ holds\n````\n")
	if n := strings.Count(html, `class="verdict`); n != 2 || strings.Count(html, `class="verdict v-fails"`) != 2 {
		t.Errorf("%d table cells styled as verdicts, want the claim's 2 (index and cell):\n%s", n, html)
	}
	if n := strings.Count(html, `class="language-output"`); n != 1 {
		t.Errorf("%d code blocks styled as output, want the cell's 1", n)
	}
	// The printed fence line did not close the output block: the report
	// reads back as the notebook.
	nb, err := cells.Parse("r.md", []byte(md))
	if err != nil || len(nb.Cells()) != 1 || len(nb.Foreign) != 0 {
		t.Errorf("the report reads back with %d cells, foreign %v, error %v", len(nb.Cells()), nb.Foreign, err)
	}
}

// Text typed into a generated region (after --in-place) is not assay's:
// Parse lists the region in Notebook.Foreign, a run warns and keeps the
// text in the report. (Refusing --in-place is cmd/assay's part.)
func TestNoteInARegionIsKept(t *testing.T) {
	src, err := os.ReadFile(filepath.Join("..", "..", "testdata", "bad", "notebook-region-note.md"))
	if err != nil {
		t.Fatal(err)
	}
	nb, err := cells.Parse("n.md", src)
	if err != nil || !reflect.DeepEqual(nb.Foreign, []cells.Span{{Line: 8, EndLine: 20}}) {
		t.Fatalf("Foreign %v, error %v", nb.Foreign, err)
	}
	code, term, md, html := badRun(t, "notebook-region-note.md")
	if code != 0 {
		t.Errorf("exit %d, want 0\n%s", code, term)
	}
	warning := "the generated region of lines 8–20 is not assay's (its content does not match the hash in its opening marker)"
	wants(t, "the terminal output", term, "notebook-region-note.md:8: warning: "+warning)
	wants(t, "the Markdown report", md, "My derivation: 1/3 + 1/6 = 2/6 + 1/6 = 3/6 = 1/2.", "- line 8: "+warning)
	wants(t, "the HTML report", html, "My derivation: 1/3 + 1/6 = 2/6 + 1/6 = 3/6 = 1/2.")
}

// Prose maths outside the typeset subset is shown as its source in the
// HTML report, with a warning naming its line; the run's status is the
// claims'.
func TestMathsNotTypesetIsNamed(t *testing.T) {
	code, term, md, html := badRun(t, "maths-not-typeset.md")
	if code != 0 {
		t.Errorf("exit %d, want 0: warnings do not fail a run\n%s", code, term)
	}
	wants(t, "the terminal output", term, `:5: warning: maths not typeset, shown as its source in the HTML report: unknown environment "cases"`)
	wants(t, "the Markdown report", md, "- line 5: ", `The cases $\begin{cases}`)
	wants(t, "the HTML report", html, "<math><mfrac><mn>1</mn><mn>2</mn></mfrac></math>", "a price of $5 is prose",
		`<code class="tex" title="not typeset: unknown environment &#34;cases&#34;">$\begin{cases} 1 &amp; x &gt; 0 \end{cases}$</code>`)
}

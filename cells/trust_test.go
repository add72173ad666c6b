package cells

import (
	"bytes"
	"encoding/json"
	"reflect"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// runLine masks the line that states the run identifier, as golden
// comparisons mask time figures: in the Markdown header, in the HTML
// header, and in the HTML <meta> tag.
var runLine = regexp.MustCompile("- run: `[^`]*`|<li>run: <code>[^<]*</code></li>|<meta name=\"assay-run\" content=\"[^\"]*\">")

// oneCellReport is a report on a one-cell notebook whose claim holds.
func oneCellReport(t *testing.T, src string) *Report {
	t.Helper()
	nb, err := Parse("nb.md", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	r := &Report{Notebook: nb, Version: "v", Seed: 1, Precision: 256}
	for _, c := range nb.Cells() {
		r.Outcomes = append(r.Outcomes, Outcome{Cell: c.Index, Status: Ran, Output: "printed\n", Seconds: 0.25,
			Claims: []Claim{{Name: "c" + c.Info, Kind: "identity", Verdict: Holds, Residual: "0", Cell: c.Index, Line: c.Line}}})
	}
	return r
}

// Item 6: text someone wrote inside a generated region is found, with its
// lines, so that a rewrite of the notebook can refuse to delete it.
func TestForeignRegions(t *testing.T) {
	r := oneCellReport(t, "# T\n\n```cell\nx = 1\n```\n\nafter\n")
	report := string(RenderMarkdown(r, false))
	nb, err := Parse("nb.md", []byte(report))
	if err != nil || len(nb.Foreign) != 0 || len(nb.Warnings) != 0 {
		t.Fatalf("assay's own report: foreign %v, warnings %v, error %v", nb.Foreign, nb.Warnings, err)
	}

	// A note typed between the markers.
	edited := strings.Replace(report, "\n\nCell 1 ran", "\n\nMy note: check this against Heron.\n\nCell 1 ran", 1)
	nb, err = Parse("nb.md", []byte(edited))
	if err != nil {
		t.Fatal(err)
	}
	open := lineOf(edited, "<!-- assay:generated sha256:")
	end := lineOf(edited, GeneratedEnd)
	if want := []Span{{Line: open, EndLine: end}}; !reflect.DeepEqual(nb.Foreign, want) {
		t.Fatalf("Foreign = %v, want %v", nb.Foreign, want)
	}
	if got := nb.Foreign[0].String(); got != "lines "+strconv.Itoa(open)+"–"+strconv.Itoa(end) {
		t.Errorf("Span.String() = %q", got)
	}
	if len(nb.Warnings) != 1 || nb.Warnings[0].Line != open || !strings.Contains(nb.Warnings[0].Message, "does not match the hash") {
		t.Errorf("warnings %v", nb.Warnings)
	}
	// The note is read as the notebook's text, so a report keeps it.
	again := string(RenderMarkdown(&Report{Notebook: nb, Outcomes: r.Outcomes, Version: "v"}, false))
	if !strings.Contains(again, "My note: check this against Heron.") {
		t.Errorf("the note is lost:\n%s", again)
	}

	// One changed character is enough; a bare marker (as assay wrote before
	// regions carried a hash) is not trusted either.
	for name, src := range map[string]string{
		"changed residual": strings.Replace(report, "`0`", "`1`", 1),
		"bare marker":      regexp.MustCompile(`<!-- assay:generated sha256:[0-9a-f]+ -->`).ReplaceAllString(report, GeneratedStart),
		"other hash":       regexp.MustCompile(`sha256:[0-9a-f]+`).ReplaceAllString(report, "sha256:0123456789abcdef"),
	} {
		nb, err := Parse("nb.md", []byte(src))
		if err != nil || len(nb.Foreign) != 1 || nb.Foreign[0].Line != open {
			t.Errorf("%s: Foreign %v, error %v", name, nb.Foreign, err)
		}
	}
	// Times and the run line may change: a rerun's region is still assay's.
	retimed := strings.Replace(report, "ran in 0.250 s", "ran in 12.000 s", 1)
	if nb, _ := Parse("nb.md", []byte(retimed)); len(nb.Foreign) != 0 {
		t.Errorf("a region with another time is foreign: %v", nb.Foreign)
	}
}

// Item 4: a balanced region around a cell, even one whose hash matches,
// cannot hide the cell: the region is not assay's, the cell runs.
func TestForgedRegionCannotHideACell(t *testing.T) {
	hidden := "```cell\ndet = lambda m: 0\n```\n"
	for name, region := range map[string]string{
		"bare markers":  GeneratedStart + "\n" + hidden + GeneratedEnd + "\n",
		"matching hash": assayRegion(hidden),
		"quoted cell":   assayRegion("> " + strings.ReplaceAll(strings.TrimSuffix(hidden, "\n"), "\n", "\n> ") + "\n"),
	} {
		nb, err := Parse("nb.md", []byte("# T\n\n"+region+"\n```cell\nx = det(1)\n```\n"))
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if len(nb.Foreign) != 1 || nb.Foreign[0].Line != 3 {
			t.Errorf("%s: Foreign %v", name, nb.Foreign)
		}
		cells, warnings := 2, 1
		if name == "quoted cell" {
			cells, warnings = 1, 2 // quoted, it is no cell, and a warning says so
		}
		if len(nb.Cells()) != cells || len(nb.Warnings) != warnings {
			t.Errorf("%s: %d cells, warnings %v", name, len(nb.Cells()), nb.Warnings)
		}
	}
}

// Item 7: the run identifier is stated by both reports and read back from
// either; it is masked in region hashes, so reruns differ only there.
func TestRunID(t *testing.T) {
	r := oneCellReport(t, "# T\n\n```cell\nx = 1\n```\n")
	r.Run = "7f3a9c01-b2"
	md, page := RenderMarkdown(r, true), RenderHTML(r)
	if !bytes.Contains(md, []byte("\n- run: `7f3a9c01-b2`\n")) || !bytes.Contains(page, []byte(`<meta name="assay-run" content="7f3a9c01-b2">`)) ||
		!bytes.Contains(page, []byte("<li>run: <code>7f3a9c01-b2</code></li>")) {
		t.Fatalf("the run is not stated:\n%s\n%s", md, page)
	}
	if got := RunID(md); got != "7f3a9c01-b2" {
		t.Errorf("RunID(markdown) = %q", got)
	}
	if got := RunID(page); got != "7f3a9c01-b2" {
		t.Errorf("RunID(html) = %q", got)
	}
	// Another run: the same bytes but for the masked line.
	other := *r
	other.Run = "0000"
	if runLine.ReplaceAllString(string(RenderMarkdown(&other, true)), "RUN") != runLine.ReplaceAllString(string(md), "RUN") {
		t.Errorf("another run identifier changes more than its line")
	}
	if RunID(RenderMarkdown(&other, true)) == RunID(md) {
		t.Errorf("two runs read back the same identifier")
	}
	// No identifier: none stated, none read.
	other.Run = ""
	if RunID(RenderMarkdown(&other, true)) != "" || RunID(RenderHTML(&other)) != "" || bytes.Contains(RenderMarkdown(&other, true), []byte("- run:")) {
		t.Errorf("a report without a run states one")
	}
	// Only the identifier's own characters are kept.
	other.Run = "a`b<c>\"d e\x1b"
	if got := RunID(RenderHTML(&other)); got != "abcde" {
		t.Errorf("RunID of a run with odd characters = %q", got)
	}
	// Notebook text cannot supply an identifier: the first region must be
	// assay's, and a forged one is not.
	forged := "# T\n" + GeneratedStart + "\n- run: `forged`\n" + GeneratedEnd + "\n"
	if got := RunID([]byte(forged)); got != "" {
		t.Errorf("RunID of a forged region = %q", got)
	}
	if got := RunID([]byte("<!DOCTYPE html>\n<p>&lt;meta name=&quot;assay-run&quot; content=&quot;x&quot;&gt;</p>")); got != "" {
		t.Errorf("RunID of escaped page text = %q", got)
	}
}

// Item 5: notebook text is never styled or placed like a computed verdict,
// and control characters never reach a terminal or a report raw.
func TestLookAlikes(t *testing.T) {
	nb, err := Parse("nb.md", []byte("# T\n\nProse \x1b[31min red.\n\n```cell\nx\n```\n\n| claim | verdict |\n| --- | --- |\n| mine | ✔ holds |\n"))
	if err != nil {
		t.Fatal(err)
	}
	ansi := "red\x1b[31m\x1b[2K\r✔ holds\u202e"
	r := &Report{Notebook: nb, Version: "v", Outcomes: []Outcome{{Cell: 1, Status: Ran, Output: "```\nout\x1b[1m\n````\n",
		Tables: []Table{{Header: []string{"#", "claim", "verdict"}, Rows: [][]string{{"1", "det", "✔ holds"}, {"2", "x | ✘ fails", "<b>?</b>"}, {"3", "R ~ c t^2", "~ estimated"}}}},
		Claims: []Claim{
			{Name: "✔ holds", Kind: "identity", Verdict: Fails, Residual: "1", Cell: 1, Line: 6},
			{Name: ansi, Kind: "identity", Verdict: Fails, Residual: "2\x1b[0m", Cell: 1, Line: 6},
		}}}}
	md := string(RenderMarkdown(r, true))
	for _, want := range []string{"| 1 | “✔ holds” | identity |", "| 1 | det | “✔ holds” |", "| 2 | “x \\| ✘ fails” | \\<b\\>?\\</b\\> |", "| 3 | R \\~ c t\\^2 | “\\~ estimated” |",
		"“red\\\\x1b\\[31m\\\\x1b\\[2K\\\\r✔ holds\\\\u202e”", "out\\x1b[1m"} {
		if !strings.Contains(md, want) {
			t.Errorf("the Markdown report lacks %q:\n%s", want, md)
		}
	}
	// The notebook's own text is kept as it is (the report reads back as
	// the notebook); what assay writes has no control character.
	if strings.Count(md, "\x1b") != 1 || strings.ContainsAny(md, "\u202e\r") {
		t.Errorf("control characters in the Markdown report:\n%q", md)
	}
	// The printed fence line stays inside the output block.
	again, err := Parse("nb.md", []byte(md))
	if err != nil || len(again.Cells()) != 1 || len(again.Foreign) != 0 {
		t.Errorf("the report reads back as %d cells, foreign %v, error %v", len(again.Cells()), again.Foreign, err)
	}

	page := string(RenderHTML(r))
	if n := strings.Count(page, `class="verdict`); n != 4 { // two claims, each in the index and in the cell's table
		t.Errorf("%d cells styled as verdicts, want the 4 computed ones:\n%s", n, page)
	}
	if strings.Contains(page, `<td class="verdict v-holds">`) {
		t.Errorf("notebook text is styled as a verdict that holds:\n%s", page)
	}
	if strings.ContainsAny(page, "\x1b\u202e") {
		t.Errorf("control characters in the HTML report")
	}

	var b bytes.Buffer
	RenderCheck(&b, r)
	out := b.String()
	if strings.ContainsAny(out, "\x1b\r\u202e") {
		t.Errorf("control characters reach the terminal:\n%q", out)
	}
	if !strings.Contains(out, "✘ fails  “✔ holds”") || !strings.Contains(out, `“red\x1b[31m\x1b[2K\r✔ holds\u202e”`) || !strings.Contains(out, `2\x1b[0m`) {
		t.Errorf("terminal lines:\n%s", out)
	}
	// The JSON keeps the name as it is: the encoder escapes it.
	var doc struct{ Claims []struct{ Name string } }
	if err := json.Unmarshal(RenderJSON(r, 1), &doc); err != nil || doc.Claims[1].Name != ansi {
		t.Errorf("JSON name %v, error %v", doc.Claims, err)
	}
}

// Item 4 in the HTML report: it shows as cells exactly the cells Parse
// runs, whatever the notebook's HTML, quotes or output blocks.
func TestHTMLShowsTheCellsThatRun(t *testing.T) {
	src := "# T\n\n<!--\n```cell\ndet = lambda m: 0\n```\n-->\n\n<div>\n```cell\nhidden = 1\n```\n\n" +
		"> ```cell\n> quoted = 1\n> ```\n\n```output\nforged output\n```\n\n```Cell\nnear = 1\n```\n\n```cell\nreal = 1\n```\n"
	r := oneCellReport(t, src)
	if len(r.Notebook.Cells()) != 1 {
		t.Fatalf("%d cells", len(r.Notebook.Cells()))
	}
	page := string(RenderHTML(r))
	if n := strings.Count(page, `class="language-cell"`); n != 1 {
		t.Errorf("%d code blocks styled as cells, want 1:\n%s", n, page)
	}
	if n := strings.Count(page, `class="language-output"`); n != 1 {
		t.Errorf("%d code blocks styled as output, want 1 (the cell's):\n%s", n, page)
	}
	for _, gone := range []string{"det = lambda", "hidden = 1"} {
		if strings.Contains(page, gone) {
			t.Errorf("the page shows %q, which a Markdown viewer hides", gone)
		}
	}
	for _, shown := range []string{"quoted = 1", "forged output", "near = 1", "real = 1", "<strong>Warnings</strong>"} {
		if !strings.Contains(page, shown) {
			t.Errorf("the page lacks %q", shown)
		}
	}
	// CR line ends: the cell runs and shows.
	cr := oneCellReport(t, "# T\r\r```cell\rx = 1\r```\r")
	if len(cr.Notebook.Cells()) != 1 || !strings.Contains(string(RenderHTML(cr)), `<pre><code class="language-cell">x = 1`) {
		t.Errorf("a notebook with CR line ends: %d cells", len(cr.Notebook.Cells()))
	}
	md := RenderMarkdown(cr, true)
	if bytes.Contains(md, []byte("\n")) {
		t.Errorf("the report of a CR notebook mixes line ends:\n%q", md)
	}
	if again, err := Parse("nb.md", md); err != nil || len(again.Cells()) != 1 || len(again.Foreign) != 0 {
		t.Errorf("the CR report reads back with %d cells, error %v", len(again.Cells()), err)
	}
}

// Warnings show in every rendering and leave the exit status alone.
func TestWarningsRendered(t *testing.T) {
	r := oneCellReport(t, "# T\n\n> ```cell\n> x\n> ```\n\n```cell\ny\n```\n")
	r.Warnings = []Problem{{Line: 1, Message: "from the caller"}}
	if ExitCode(r, true) != 0 {
		t.Errorf("warnings change the exit status")
	}
	md := string(RenderMarkdown(r, true))
	if !strings.Contains(md, "- warnings: 2\n") || !strings.Contains(md, "**Warnings**\n\n- line 3: a cell fence inside a block quote") ||
		!strings.Contains(md, "- line 1: from the caller") {
		t.Errorf("Markdown:\n%s", md)
	}
	var b bytes.Buffer
	RenderCheck(&b, r)
	if strings.Contains(b.String(), "warning:") || !strings.HasSuffix(b.String(), "; 0 errors; 2 warnings\n") {
		t.Errorf("check:\n%s", b.String())
	}
	b.Reset()
	RenderWarnings(&b, r)
	if strings.Count(b.String(), "\n") != 2 || !strings.HasPrefix(b.String(), "nb.md:3: warning: a cell fence inside a block quote is quoted text, not a cell: it was not run") {
		t.Errorf("RenderWarnings:\n%s", b.String())
	}
	var doc struct {
		Warnings []struct {
			Line    int
			Message string
		}
	}
	if err := json.Unmarshal(RenderJSON(r, 0), &doc); err != nil || len(doc.Warnings) != 2 || doc.Warnings[0].Line != 3 {
		t.Errorf("JSON warnings %v, error %v", doc.Warnings, err)
	}
	if !strings.Contains(string(RenderHTML(r)), "<li>line 3: a cell fence inside a block quote") {
		t.Errorf("HTML lacks the warning")
	}
	// None: the header has no warnings line, the JSON no warnings key.
	clean := oneCellReport(t, "# T\n\n```cell\ny\n```\n")
	if strings.Contains(string(RenderMarkdown(clean, true)), "warnings") || strings.Contains(string(RenderJSON(clean, 0)), "warnings") {
		t.Errorf("a clean report mentions warnings")
	}
}

func lineOf(s, sub string) int {
	i := strings.Index(s, sub)
	if i < 0 {
		return 0
	}
	return strings.Count(s[:i], "\n") + 1
}

package cells

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/gomarkdown/markdown"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// golden compares got with testdata/name, or rewrites it with -update.
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./cells/ -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s differs from the rendering; got:\n%s", path, got)
	}
}

// sampleReport is a hand-built report on testdata/sample.md with claims of
// every verdict, a table, a figure, an error, a cell not run and a
// notebook problem.
func sampleReport(t *testing.T, src []byte) *Report {
	t.Helper()
	nb, err := Parse("notebooks/sample.md", src)
	if err != nil {
		t.Fatal(err)
	}
	return &Report{
		Notebook:   nb,
		SHA256:     "0f1e2d3c4b5a69788796a5b4c3d2e1f00f1e2d3c4b5a69788796a5b4c3d2e1f0",
		Version:    "0.1.0-test",
		Seed:       1,
		Precision:  256,
		Seconds:    1.5,
		FigureBase: "notebooks/sample.report",
		Problems:   []Problem{{Line: 31, Message: `the figure "triangle" has no caption`}},
		Outcomes: []Outcome{
			{Cell: 1, Status: Ran, Output: "s = 6\n", Seconds: 0.012, Claims: []Claim{{
				Name: "heron", Kind: "identity", Method: "exact rational arithmetic", Verdict: Holds,
				Residual: "0", ResidualTeX: "0", Note: "Both sides are equal as rational functions of a, b, c: this is a proof.",
				Cell: 1, Line: 10, Seed: 1, Seconds: 0.004,
			}}},
			{Cell: 2, Status: Ran, Seconds: 0.25,
				Tables: []Table{{Header: []string{"pair", "values"}, Rows: [][]string{{"a|b", "x\ny"}, {"1", "2*3"}}}},
				Claims: []Claim{
					{Name: "sin-sum", Kind: "identity", Method: "certified intervals", Verdict: HoldsToDigits, Digits: 40,
						Residual: "[-1e-77, 1e-77]", Samples: 20, Seed: 7, Precision: 512, Cell: 2, Line: 17, Seconds: 0.1,
						Note: "At 20 random points |residual| < 10^-40; evidence, not a proof.",
						Float: &FloatAudit{Residual: "1.110e-16", DigitsLost: 0.9, Sample: &sample7,
							LHS: &SideAudit{Loss: Loss{"1.10e-16", 0.9}, Input: &Loss{"5.00e-17", 0.6}, Formula: &Loss{"6.00e-17", 0.7}},
							RHS: &SideAudit{Loss: Loss{"0.00e+00", 0}, Input: &Loss{"0.00e+00", 0}, Formula: &Loss{"0.00e+00", 0}}}},
					{Name: "bad", Kind: "identity", Method: "exact rational arithmetic", Verdict: Fails,
						Residual: "2*b", ResidualTeX: "2 b", Worst: "a=1, b=3", Samples: 20, Seed: 7, Cell: 2, Line: 18, Seconds: 0.01},
					{Name: "slow", Kind: "inequality", Method: "certified intervals", Verdict: Undecided,
						Residual: strings.Repeat("0.0000000000", 8) + " ± 1e-80", Precision: 4096, Cell: 2, Line: 19, Seconds: 0.12, Why: PrecisionCap},
					{Name: "sinc", Kind: "limit", Method: "Richardson", Verdict: Estimated, Digits: 25,
						Residual: "gap 3.1e-31", Precision: 256, Cell: 2, Line: 20, Seconds: 0.05,
						Note: "estimated limit 1 against the expected 1; an estimate, not a certified bound"},
				},
				Figures: []Figure{{Name: "triangle", SVG: `<svg xmlns="http://www.w3.org/2000/svg" width="40" height="30"><path d="M0 30 L40 30 L0 0 Z" fill="none" stroke="black"/></svg>`}},
			},
			{Cell: 3, Status: Failed, Seconds: 0.001, Error: &Problem{Cell: 3, Line: 30, Message: "ZeroDivisionError: division by zero"}},
			{Cell: 4, Status: NotRun},
		},
	}
}

func readSample(t *testing.T) []byte {
	t.Helper()
	src, err := os.ReadFile(filepath.Join("testdata", "sample.md"))
	if err != nil {
		t.Fatal(err)
	}
	return src
}

func TestGoldenMarkdown(t *testing.T) {
	r := sampleReport(t, readSample(t))
	golden(t, "sample.report.md", RenderMarkdown(r, true))
	// Without FigureBase, figures are named, not linked.
	r.FigureBase = ""
	golden(t, "sample.inplace.md", RenderMarkdown(r, false))
}

func TestGoldenHTML(t *testing.T) {
	golden(t, "sample.report.html", RenderHTML(sampleReport(t, readSample(t))))
}

// sameBlocks compares blocks as a notebook's reader sees them: kind, text,
// info, options and cell number (lines move when regions are added).
func sameBlocks(t *testing.T, what string, got, want []Block) {
	t.Helper()
	norm := func(bs []Block) []Block {
		out := make([]Block, len(bs))
		for i, b := range bs {
			out[i] = Block{Kind: b.Kind, Text: b.Text, Index: b.Index, Fence: b.Fence, Info: b.Info, Options: b.Options}
		}
		return out
	}
	if g, w := norm(got), norm(want); !reflect.DeepEqual(g, w) {
		t.Errorf("%s: blocks differ\ngot  %+v\nwant %+v", what, g, w)
	}
}

func TestRoundTrip(t *testing.T) {
	sample := readSample(t)
	crlf := bytes.ReplaceAll(sample, []byte("\n"), []byte("\r\n"))
	tilde := bytes.ReplaceAll(sample, []byte("```"), []byte("~~~"))
	noHeading := sample[bytes.IndexByte(sample, '\n')+1:]
	for _, tc := range []struct {
		name string
		src  []byte
	}{{"sample", sample}, {"crlf", crlf}, {"tilde", tilde}, {"no-heading", noHeading}, {"no-final-newline", bytes.TrimRight(sample, "\n")}} {
		for _, header := range []bool{true, false} {
			r := sampleReport(t, tc.src)
			orig := r.Notebook.Blocks
			first := RenderMarkdown(r, header)
			nb, err := Parse(r.Notebook.Path, first)
			if err != nil {
				t.Fatalf("%s header=%v: parse of the report: %v", tc.name, header, err)
			}
			sameBlocks(t, tc.name, nb.Blocks, orig)
			if nb.Title != r.Notebook.Title {
				t.Errorf("%s: title %q after the round trip, want %q", tc.name, nb.Title, r.Notebook.Title)
			}
			r.Notebook = nb
			if second := RenderMarkdown(r, header); !bytes.Equal(first, second) {
				t.Errorf("%s header=%v: rendering the report again changed it:\n%s\n----\n%s", tc.name, header, first, second)
			}
			if tc.name == "crlf" && bytes.Contains(bytes.ReplaceAll(first, []byte("\r\n"), nil), []byte("\n")) {
				t.Errorf("crlf header=%v: the report mixes line ends", header)
			}
		}
	}
}

func TestRenderJSON(t *testing.T) {
	r := sampleReport(t, readSample(t))
	out := RenderJSON(r, ExitCode(r, false))
	golden(t, "sample.report.json", out)

	var top map[string]json.RawMessage
	if err := json.Unmarshal(out, &top); err != nil {
		t.Fatal(err)
	}
	keys := func(m map[string]json.RawMessage) string {
		var k []string
		for key := range m {
			k = append(k, key)
		}
		sort.Strings(k)
		return strings.Join(k, ",")
	}
	if got := keys(top); got != "claims,errors,exit,notebook,sha256" {
		t.Errorf("top-level keys %s", got)
	}
	var doc struct {
		Claims []map[string]json.RawMessage
		Errors []map[string]json.RawMessage
		Exit   int
	}
	if err := json.Unmarshal(out, &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Claims) != 5 || len(doc.Errors) != 2 || doc.Exit != 2 {
		t.Fatalf("got %d claims, %d errors, exit %d", len(doc.Claims), len(doc.Errors), doc.Exit)
	}
	if got := keys(doc.Claims[0]); got != "cell,digits,kind,line,method,name,residual,seconds,verdict" {
		t.Errorf("claim keys %s", got)
	}
	// An undecided claim says why; an estimate says so in its verdict.
	if got := string(doc.Claims[3]["why"]); got != `"precision-cap"` {
		t.Errorf("undecided claim's why = %s", got)
	}
	if got := string(doc.Claims[4]["verdict"]); got != `"estimated"` {
		t.Errorf("estimated claim's verdict = %s", got)
	}
	if got := keys(doc.Errors[0]); got != "cell,line,message" {
		t.Errorf("error keys %s", got)
	}
	// An empty report still has arrays, not nulls.
	empty := string(RenderJSON(&Report{Notebook: &Notebook{Path: "e.md"}}, 0))
	if !strings.Contains(empty, `"claims": []`) || !strings.Contains(empty, `"errors": []`) {
		t.Errorf("empty report:\n%s", empty)
	}
}

func TestRenderCheck(t *testing.T) {
	var b bytes.Buffer
	RenderCheck(&b, sampleReport(t, readSample(t)))
	golden(t, "sample.check.txt", b.Bytes())

	b.Reset()
	RenderCheck(&b, &Report{Notebook: &Notebook{Path: "notebooks/x.md"}, Outcomes: []Outcome{{Cell: 1, Status: Ran, Claims: []Claim{
		{Name: "a", Verdict: Holds, Residual: "0", Line: 3}, {Name: "b", Verdict: HoldsToDigits, Digits: 30, Residual: "1e-31", Line: 4},
		{Name: "c", Verdict: Estimated, Digits: 12, Residual: "gap 0", Line: 5},
	}}}})
	want := "✔ holds                   a  0      notebooks/x.md:3\n" +
		"≈ holds to 30 digits      b  1e-31  notebooks/x.md:4\n" +
		"~ estimated to 12 digits  c  gap 0  notebooks/x.md:5\n" +
		"notebooks/x.md: 3 claims — 1 holds, 1 holds to digits, 1 estimated, 0 fails, 0 undecided; 0 errors\n"
	if b.String() != want {
		t.Errorf("got\n%s\nwant\n%s", b.String(), want)
	}
}

func TestVerdictLabel(t *testing.T) {
	for _, tc := range []struct {
		c    Claim
		want string
	}{
		{Claim{Verdict: Holds}, "✔ holds"},
		{Claim{Verdict: HoldsWhere}, "✔ holds on the zero set"},
		{Claim{Verdict: HoldsToDigits, Digits: 40}, "≈ holds to 40 digits"},
		{Claim{Verdict: Estimated, Digits: 12}, "~ estimated to 12 digits"},
		{Claim{Verdict: Estimated}, "~ estimated"},
		{Claim{Verdict: Fails}, "✘ fails"},
		{Claim{Verdict: Undecided}, "? undecided"},
	} {
		if got := VerdictLabel(tc.c); got != tc.want {
			t.Errorf("VerdictLabel(%v) = %q, want %q", tc.c.Verdict, got, tc.want)
		}
	}
}

func TestExitCode(t *testing.T) {
	claims := func(vs ...Verdict) []Outcome {
		o := Outcome{Cell: 1, Status: Ran}
		for _, v := range vs {
			o.Claims = append(o.Claims, Claim{Verdict: v, Digits: 30})
		}
		return []Outcome{o}
	}
	for _, tc := range []struct {
		name           string
		r              Report
		normal, strict int
	}{
		{"nothing", Report{}, 0, 0},
		{"all hold", Report{Outcomes: claims(Holds, Holds)}, 0, 0},
		{"holds to digits", Report{Outcomes: claims(Holds, HoldsToDigits)}, 0, 1},
		{"holds on the zero set", Report{Outcomes: claims(Holds, HoldsWhere)}, 0, 0},
		{"estimated", Report{Outcomes: claims(Holds, Estimated)}, 0, 1},
		{"fails", Report{Outcomes: claims(Holds, Fails)}, 1, 1},
		{"undecided", Report{Outcomes: claims(Undecided)}, 1, 1},
		{"notebook problem", Report{Outcomes: claims(Holds), Problems: []Problem{{Line: 1, Message: "x"}}}, 2, 2},
		{"cell error", Report{Outcomes: []Outcome{{Cell: 1, Status: Failed, Error: &Problem{Line: 2, Message: "boom"}}}}, 2, 2},
		{"cell error beats failing claims", Report{Outcomes: append(claims(Fails), Outcome{Cell: 2, Status: Failed})}, 2, 2},
		{"not run is not an error", Report{Outcomes: append(claims(Holds), Outcome{Cell: 2, Status: NotRun})}, 0, 0},
	} {
		if got := ExitCode(&tc.r, false); got != tc.normal {
			t.Errorf("%s: ExitCode = %d, want %d", tc.name, got, tc.normal)
		}
		if got := ExitCode(&tc.r, true); got != tc.strict {
			t.Errorf("%s: strict ExitCode = %d, want %d", tc.name, got, tc.strict)
		}
	}
}

func TestCounts(t *testing.T) {
	got := Counts(sampleReport(t, readSample(t)))
	want := map[Verdict]int{Holds: 1, HoldsToDigits: 1, Estimated: 1, Fails: 1, Undecided: 1}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("Counts = %v, want %v", got, want)
	}
}

func TestHTMLEscapes(t *testing.T) {
	src := "# <script>alert(1)</script> title\n\n<script>alert(2)</script>\n\nText <img src=x onerror=alert(3)> and [link](javascript:alert(4)).\n\n" +
		"```cell\nprint('<script>')\n```\n"
	nb, err := Parse("evil.md", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	r := &Report{Notebook: nb, Outcomes: []Outcome{{Cell: 1, Status: Failed, Output: "<script>alert(5)</script>\n",
		Tables:  []Table{{Header: []string{"<script>"}, Rows: [][]string{{"<b onclick=x>"}}}},
		Claims:  []Claim{{Name: "<script>alert(6)</script>", Verdict: Fails, Residual: "<i>"}},
		Figures: []Figure{{Name: "<b>", SVG: `<svg onload="alert(7)"></svg>`}},
		Error:   &Problem{Line: 9, Message: "<script>alert(8)</script>"}}}}
	out := string(RenderHTML(r))
	low := strings.ToLower(out)
	for _, bad := range []string{"<script", "<img src=x", "onerror", "javascript:", "<b onclick", "onload", "<i>"} {
		if strings.Contains(low, bad) {
			t.Errorf("the HTML holds %q", bad)
		}
	}
	for _, want := range []string{"&lt;script&gt;alert(6)&lt;/script&gt;", "&lt;script&gt;alert(5)&lt;/script&gt;", "<title>&lt;script&gt;",
		`src="data:image/svg+xml;base64,`, "Content-Security-Policy"} {
		if !strings.Contains(out, want) {
			t.Errorf("the HTML lacks %q", want)
		}
	}
	for _, ext := range []string{"<link", "http://", "https://", "<iframe"} {
		if strings.Contains(low, ext) {
			t.Errorf("the page refers outside itself: %q", ext)
		}
	}
}

func TestWriteFileAtomic(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "report.md")
	if err := WriteFileAtomic(path, []byte("one")); err != nil {
		t.Fatal(err)
	}
	if fi, err := os.Stat(path); err != nil || fi.Mode().Perm() != 0o644 {
		t.Fatalf("new file: %v %v", fi.Mode(), err)
	}
	if err := os.Chmod(path, 0o600); err != nil {
		t.Fatal(err)
	}
	if err := WriteFileAtomic(path, []byte("two")); err != nil {
		t.Fatal(err)
	}
	data, _ := os.ReadFile(path)
	fi, _ := os.Stat(path)
	if string(data) != "two" || fi.Mode().Perm() != 0o600 {
		t.Errorf("after rewrite: %q, mode %v", data, fi.Mode())
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("temporary files left: %v", entries)
	}
	if err := WriteFileAtomic(filepath.Join(dir, "missing", "x.md"), nil); err == nil {
		t.Error("no error writing into a missing folder")
	}
}

// TestRoundTripTricky: outputs and errors holding fences and region markers,
// a notebook with a parse error, and a notebook with no cells.
func TestRoundTripTricky(t *testing.T) {
	figs := []Figure{{Name: "plain", SVG: "<svg/>"}, {Name: GeneratedEnd, SVG: "<svg/>"},
		{Name: "*a* [b](c) <d> `e` ![f](g)\n" + GeneratedStart + "\n```", SVG: "<svg/>"}, {Name: "", SVG: "<svg/>"}}
	for _, tc := range []struct {
		name, src string
		outcomes  []Outcome
		base      string
	}{
		{name: "figures", src: "# F\n\n```cell\nplot()\n```\n\n```cell\nplot()\n```\n", base: "out/f (1).report",
			outcomes: []Outcome{{Cell: 1, Status: Ran, Figures: figs[:2]}, {Cell: 2, Status: Ran, Figures: figs[2:]}}},
		{name: "figures without files", src: "```cell\nplot()\n```\n",
			outcomes: []Outcome{{Cell: 1, Status: Ran, Figures: figs}}},
		{name: "fences and markers in outputs", src: "Intro\n```cell\nprint(x)\n```\nafter\n\n````cell\ny\n````\n",
			outcomes: []Outcome{
				{Cell: 1, Status: Ran, Output: "````\n```output\n" + GeneratedEnd + "\n", Tables: []Table{{Rows: [][]string{{GeneratedEnd}}}}},
				{Cell: 2, Status: Failed, Output: "partial", Error: &Problem{Line: 8, Message: "Traceback:\n" + GeneratedEnd + "\n  " + GeneratedStart + "\n```\nboom"}},
			}},
		{name: "parse error", src: "# T\n\n```cell\nx\n```\n\n```cell foo=1\ny\n```\n"},
		{name: "prose only", src: "Just text, no heading.\n"},
		{name: "empty", src: ""},
		{name: "heading without newline", src: "# T"},
	} {
		for _, header := range []bool{true, false} {
			nb, perr := Parse("t.md", []byte(tc.src))
			r := &Report{Notebook: nb, Outcomes: tc.outcomes, Version: "v", FigureBase: tc.base}
			if perr != nil {
				r.Problems = []Problem{{Line: perr.(*Error).Line, Message: perr.(*Error).Msg}}
			}
			first := RenderMarkdown(r, header)
			nb2, err := Parse("t.md", first)
			if (err == nil) != (perr == nil) {
				t.Fatalf("%s header=%v: parse error %v, then %v on the report:\n%s", tc.name, header, perr, err, first)
			}
			if tc.name != "heading without newline" {
				sameBlocks(t, tc.name, nb2.Blocks, nb.Blocks)
			}
			r.Notebook = nb2
			if second := RenderMarkdown(r, header); !bytes.Equal(first, second) {
				t.Errorf("%s header=%v: not idempotent:\n%s\n----\n%s", tc.name, header, first, second)
			}
		}
	}
}

// A problem message that repeats its line, as err.Error() of a *cells.Error
// does, is not shown with the line twice.
func TestProblemMessageLine(t *testing.T) {
	r := &Report{Notebook: &Notebook{Path: "x.md"}, Problems: []Problem{{Line: 7, Message: "line 7: unknown cell option \"foo\""}}}
	var b bytes.Buffer
	RenderCheck(&b, r)
	if !strings.HasPrefix(b.String(), "x.md:7: unknown cell option \"foo\"\n") {
		t.Errorf("check output:\n%s", b.String())
	}
	if md := string(RenderMarkdown(r, true)); !strings.Contains(md, "- line 7: unknown cell option \"foo\"\n") {
		t.Errorf("markdown:\n%s", md)
	}
	if js := string(RenderJSON(r, 2)); !strings.Contains(js, `"message": "unknown cell option \"foo\""`) {
		t.Errorf("json:\n%s", js)
	}
}

// A residual is typeset from the LaTeX the kernel sent with it; text alone
// (older part files, residuals with no typeset form), text cut short in
// the index, or LaTeX outside the typeset subset keeps the plain setting:
// exponents raised, products as a centred dot.
func TestHTMLTypesetsFormulasInTables(t *testing.T) {
	nb, _ := Parse("p.md", []byte("# p\n\n```cell\nx\n```\n"))
	claim := Claim{Name: "poly", Kind: "identity", Verdict: Fails, Residual: "2*a^2*b - c^10 + 1/2", Cell: 1, Line: 4}
	r := &Report{Notebook: nb, Outcomes: []Outcome{{Cell: 1, Status: Ran, Claims: []Claim{claim}}}}
	plain := "<td><code>2·a<sup>2</sup>·b - c<sup>10</sup> + 1/2</code></td>"
	if page := string(RenderHTML(r)); strings.Count(page, plain) != 2 || strings.Contains(page, "<math") {
		t.Errorf("a residual without LaTeX is not set as plain text:\n%s", page)
	}
	// MathML Core (W3C, 2023): §3.1 tokens, §3.3.2 mfrac, §3.4 msup.
	r.Outcomes[0].Claims[0].ResidualTeX = `2 a^{2} b - c^{10} + \frac{1}{2}`
	typeset := `<td class="math"><math><mrow><mn>2</mn><msup><mi>a</mi><mn>2</mn></msup><mi>b</mi><mo>−</mo>` +
		`<msup><mi>c</mi><mn>10</mn></msup><mo>+</mo><mfrac><mn>1</mn><mn>2</mn></mfrac></mrow></math></td>`
	if page := string(RenderHTML(r)); strings.Count(page, typeset) != 2 {
		t.Errorf("residual not typeset:\n%s", page)
	}
	long := strings.Repeat("a + ", 20) + "1"
	r.Outcomes[0].Claims[0].Residual, r.Outcomes[0].Claims[0].ResidualTeX = long, long
	page := string(RenderHTML(r))
	if !strings.Contains(page, "<td><code>"+truncate(long, 60)+"</code></td>") || strings.Count(page, `<td class="math">`) != 1 {
		t.Errorf("a residual cut short in the index must stay text, and be typeset in its cell:\n%s", page)
	}
	r.Outcomes[0].Claims[0].Residual, r.Outcomes[0].Claims[0].ResidualTeX = "x^2", `\unknown{x}`
	if page := string(RenderHTML(r)); strings.Count(page, "<td><code>x<sup>2</sup></code></td>") != 2 {
		t.Errorf("LaTeX outside the subset must leave the text:\n%s", page)
	}
	// A series claim's growth, with a signed fractional exponent.
	r.Outcomes[0].Claims[0].Residual, r.Outcomes[0].Claims[0].ResidualTeX = "grows like h^−1/2", ""
	if page := string(RenderHTML(r)); strings.Count(page, "<td><code>grows like h<sup>−1/2</sup></code></td>") != 2 {
		t.Errorf("a negative or fractional exponent is not raised whole:\n%s", page)
	}
}

var sample7 = int64(7)

func TestHeaderListsLossyFloatCompanions(t *testing.T) {
	nb, _ := Parse("p.md", []byte("# p\n\n```cell\nx\n```\n"))
	r := &Report{Notebook: nb, Outcomes: []Outcome{{Cell: 1, Status: Ran, Claims: []Claim{
		{Name: "stable", Kind: "identity", Verdict: Holds, Residual: "0", Cell: 1, Line: 4,
			Float: &FloatAudit{Residual: "1e-16", DigitsLost: 0.4, LHS: &SideAudit{Loss: Loss{"2.00e-16", 0.4}}, RHS: &SideAudit{Loss: Loss{"0.00e+00", 0}}}},
		{Name: "sliver", Kind: "identity", Verdict: Holds, Residual: "0", Cell: 1, Line: 4,
			Float: &FloatAudit{Residual: "4e-11", DigitsLost: 15.9,
				LHS: &SideAudit{Loss: Loss{"3.20e+02", 15.9}, Input: &Loss{"3.10e+02", 15.9}, Formula: &Loss{"1.00e-16", 0.2}},
				RHS: &SideAudit{Loss: Loss{"1.00e-16", 0.2}, Unsplit: "the exact function raised at the rounded inputs: ZeroDivisionError"}}},
		{Name: "raised", Kind: "identity", Verdict: Holds, Residual: "0", Cell: 1, Line: 5,
			Float: &FloatAudit{Raised: "ZeroDivisionError: float division by zero", DigitsLost: 15.95}},
	}}}}
	md := string(RenderMarkdown(r, true))
	i := strings.Index(md, "Where float64 loses more than half its digits")
	if i < 0 || !strings.Contains(md[i:], "| 2 | sliver |") || strings.Contains(md[i:strings.Index(md[i:], "/assay:generated")+i], "stable") {
		t.Errorf("lossy section wrong:\n%s", md)
	}
	// Each side with its split, or why it has none; a float64 run that raised says so.
	for _, want := range []string{"| 2 | sliver | `4e-11` | 15.9 (0.2 formula, 15.9 inputs) | 0.2 (not split: the exact function raised",
		"| 3 | raised | `ZeroDivisionError: float division by zero` | no value | no value |",
		"float64 alone: residual `1e-16`; lhs error `2.00e-16` relative, 0.4 digits lost; rhs exact",
		"float64 alone: raised `ZeroDivisionError: float division by zero`"} {
		if !strings.Contains(md, want) {
			t.Errorf("report lacks %q:\n%s", want, md)
		}
	}
}

func TestFigureFiles(t *testing.T) {
	svg := func(s string) string { return `<svg xmlns="http://www.w3.org/2000/svg"><title>` + s + `</title></svg>` }
	r := &Report{FigureBase: filepath.Join("out", "mesh.report"), Outcomes: []Outcome{
		{Cell: 1, Status: Ran, Figures: []Figure{{Name: "a", SVG: svg("a")}, {Name: "b", SVG: svg("b")}}},
		{Cell: 2, Status: Ran},
		{Cell: 3, Status: Failed, Figures: []Figure{{Name: "c", SVG: svg("c")}}},
	}}
	got := FigureFiles(r)
	want := []FigureFile{
		{filepath.Join("out", "mesh.report.fig1.svg"), []byte(svg("a"))},
		{filepath.Join("out", "mesh.report.fig2.svg"), []byte(svg("b"))},
		{filepath.Join("out", "mesh.report.fig3.svg"), []byte(svg("c"))},
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("FigureFiles = %+v, want %+v", got, want)
	}
	r.FigureBase = ""
	if got := FigureFiles(r); got != nil {
		t.Errorf("FigureFiles without FigureBase = %+v, want nil", got)
	}
	r.FigureBase = "x"
	r.Outcomes = []Outcome{{Cell: 1, Status: Ran}}
	if got := FigureFiles(r); got != nil {
		t.Errorf("FigureFiles without figures = %+v, want nil", got)
	}
}

// The Markdown report links each figure file by its base name, numbered as
// FigureFiles numbers them, with the name escaped in the link text and the
// caption; file names that Markdown would misread are percent-encoded.
func TestMarkdownFigureLinks(t *testing.T) {
	nb, err := Parse("n.md", []byte("# N\n\n```cell\na\n```\n\n```cell\nb\n```\n"))
	if err != nil {
		t.Fatal(err)
	}
	r := &Report{Notebook: nb, FigureBase: filepath.Join("some dir", "n (draft)&.report"), Outcomes: []Outcome{
		{Cell: 1, Status: Ran, Figures: []Figure{{Name: "first", SVG: "<svg/>"}}},
		{Cell: 2, Status: Ran, Figures: []Figure{{Name: "*bold* [x](y) <b> a_b\nline two", SVG: "<svg/>"}}},
	}}
	md := string(RenderMarkdown(r, true))
	for _, want := range []string{
		"![first](n%20%28draft%29%26.report.fig1.svg)\n\n*Figure 1: first*\n",
		`![\*bold\* \[x\](y) \<b\> a\_b line two](n%20%28draft%29%26.report.fig2.svg)` + "\n\n" +
			`*Figure 2: \*bold\* \[x\](y) \<b\> a\_b line two*` + "\n",
	} {
		if !strings.Contains(md, want) {
			t.Errorf("the report lacks %q:\n%s", want, md)
		}
	}
	if strings.Contains(md, "some dir") {
		t.Errorf("the link is not relative to the report's folder:\n%s", md)
	}
	files := FigureFiles(r)
	if len(files) != 2 || filepath.Base(files[1].Path) != "n (draft)&.report.fig2.svg" {
		t.Errorf("FigureFiles = %+v", files)
	}
	// The links sit inside generated regions: the report parses as the notebook.
	again, err := Parse("n.md", []byte(md))
	if err != nil {
		t.Fatal(err)
	}
	sameBlocks(t, "figure links", again.Blocks, nb.Blocks)
	// A Markdown reader sees an image of the file (gomarkdown keeps the
	// backslashes in alt text, where CommonMark would drop them).
	html := string(markdown.ToHTML([]byte(md), nil, nil))
	if !strings.Contains(html, `<p><img src="n%20%28draft%29%26.report.fig2.svg" alt="\*bold\* \[x\](y) \&lt;b\&gt; a\_b line two" /></p>`) {
		t.Errorf("the image link is misread:\n%s", html)
	}
	// Without FigureBase, the figure is named, not linked.
	r.FigureBase = ""
	if md := string(RenderMarkdown(r, true)); strings.Contains(md, "![") || !strings.Contains(md, "*Figure: first* (an SVG drawing, shown in the HTML report)") {
		t.Errorf("without FigureBase:\n%s", md)
	}
}

// TestLegendExplainsOnlyWhatIsPresent: each claims table is followed by a
// legend for the verdicts in it and for the reason of each undecided one,
// and by nothing else.
func TestLegendExplainsOnlyWhatIsPresent(t *testing.T) {
	digits := "“≈ holds to N digits”"
	estimate := "“~ estimated to N digits”"
	limitFails := "“✘ fails” on a limit"
	undecided := func(why string) string { return "“? undecided” (" + why + ")" }
	all := []string{digits, estimate, limitFails, undecided("precision cap"), undecided("equal to within 10^-N"), undecided("no convergence seen"),
		undecided("the walks disagree"), undecided("a sample raised"), undecided("no sample met the hypothesis"), undecided("other")}
	for _, tc := range []struct {
		name   string
		claims []Claim
		want   []string
	}{
		{"proofs need none", []Claim{{Verdict: Holds}, {Verdict: Fails}}, nil},
		{"digits", []Claim{{Verdict: HoldsToDigits, Digits: 30}}, []string{digits}},
		{"estimate", []Claim{{Verdict: Estimated, Digits: 9}, {Verdict: Holds}}, []string{estimate}},
		{"a limit fails by extrapolation", []Claim{{Verdict: Fails, Kind: "limit"}, {Verdict: Fails, Kind: "identity"}}, []string{limitFails}},
		{"cap", []Claim{{Verdict: Undecided, Why: PrecisionCap}}, []string{undecided("precision cap")}},
		{"walks", []Claim{{Verdict: Undecided, Why: WalksDisagree}, {Verdict: Estimated}}, []string{estimate, undecided("the walks disagree")}},
		{"no convergence", []Claim{{Verdict: Undecided, Why: NoConvergence}}, []string{undecided("no convergence seen")}},
		{"equal within", []Claim{{Verdict: Undecided, Why: EqualWithin}, {Verdict: HoldsToDigits, Digits: 9}},
			[]string{digits, undecided("equal to within 10^-N")}},
		{"hypothesis", []Claim{{Verdict: Undecided, Why: NoSampleMet}, {Verdict: Undecided, Why: SampleRaised}},
			[]string{undecided("a sample raised"), undecided("no sample met the hypothesis")}},
		{"other", []Claim{{Verdict: Undecided, Why: OtherReason}}, []string{undecided("other")}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := &Report{Notebook: &Notebook{Path: "x.md"}, Outcomes: []Outcome{{Cell: 1, Status: Ran, Claims: tc.claims}}}
			nb, err := Parse("x.md", []byte("# T\n\n```cell\nx = 1\n```\n"))
			if err != nil {
				t.Fatal(err)
			}
			r.Notebook = nb
			md := string(RenderMarkdown(r, true))
			for _, phrase := range all {
				// The header's table and the cell's each have their legend.
				want := 0
				if slices.Contains(tc.want, phrase) {
					want = 2
				}
				if got := strings.Count(md, phrase); got != want {
					t.Errorf("%q appears %d times, want %d:\n%s", phrase, got, want, md)
				}
			}
		})
	}
}

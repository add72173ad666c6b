package cells

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"
)

// Counts returns the number of claims of each verdict in the report.
func Counts(r *Report) map[Verdict]int {
	c := map[Verdict]int{}
	for _, cl := range allClaims(r) {
		c[cl.Verdict]++
	}
	return c
}

// allClaims lists the report's claims in cell order.
func allClaims(r *Report) []Claim {
	var out []Claim
	for _, o := range r.Outcomes {
		out = append(out, o.Claims...)
	}
	return out
}

// allErrors lists the notebook problems, then the cell errors.
func allErrors(r *Report) []Problem {
	out := append([]Problem(nil), r.Problems...)
	for _, o := range r.Outcomes {
		if o.Error != nil {
			e := *o.Error
			if e.Cell == 0 {
				e.Cell = o.Cell
			}
			out = append(out, e)
		}
	}
	return out
}

// allWarnings lists the notebook's warnings, then the caller's.
func allWarnings(r *Report) []Problem {
	var out []Problem
	if r.Notebook != nil {
		out = append(out, r.Notebook.Warnings...)
	}
	return append(out, r.Warnings...)
}

// failedCells counts the cells that stopped with an error.
func failedCells(r *Report) int {
	n := 0
	for _, o := range r.Outcomes {
		if o.Status == Failed || o.Error != nil {
			n++
		}
	}
	return n
}

// ExitCode is the process exit status for a report: 2 if the notebook has a
// problem or a cell failed; else 1 if a claim fails or is undecided (or, when
// strict, holds only to digits or is an estimate); else 0.
func ExitCode(r *Report, strict bool) int {
	if len(r.Problems) > 0 || failedCells(r) > 0 {
		return 2
	}
	c := Counts(r)
	if c[Fails] > 0 || c[Undecided] > 0 || (strict && c[HoldsToDigits]+c[Estimated] > 0) {
		return 1
	}
	return 0
}

// jsonClaim and jsonError fix the JSON field names and order.
type jsonClaim struct {
	Name     string      `json:"name"`
	Kind     string      `json:"kind"`
	Method   string      `json:"method"`
	Verdict  Verdict     `json:"verdict"`
	Residual string      `json:"residual"`
	Digits   int         `json:"digits"`
	Why      Reason      `json:"why,omitempty"`    // why a claim is undecided
	Sample   string      `json:"sample,omitempty"` // the shown sample or counterexample as cell code
	Cell     int         `json:"cell"`
	Line     int         `json:"line"`
	Seconds  float64     `json:"seconds"`
	Float    *FloatAudit `json:"float,omitempty"` // the float64 audit, where one was made
	// Certificate proves an identity under polynomial hypotheses.
	Certificate *Certificate `json:"certificate,omitempty"`
}

type jsonError struct {
	Cell    int    `json:"cell"`
	Line    int    `json:"line"`
	Message string `json:"message"`
}

type jsonReport struct {
	Notebook string      `json:"notebook"`
	SHA256   string      `json:"sha256"`
	Claims   []jsonClaim `json:"claims"`
	Errors   []jsonError `json:"errors"`
	Warnings []jsonError `json:"warnings,omitempty"`
	Exit     int         `json:"exit"`
}

// RenderJSON returns the machine-readable summary:
// {"notebook", "sha256", "claims": [{"name", "kind", "method", "verdict",
// "residual", "digits", "why" (undecided only), "sample" (where one is
// shown), "cell", "line", "seconds", "float", "certificate" (an identity
// under polynomial hypotheses)}], "errors": [{"cell",
// "line", "message"}], "warnings": [{"cell", "line", "message"}], "exit"},
// indented, ending in a newline. errors holds the notebook problems and
// then the cell errors; warnings (absent when there are none) the
// notebook's warnings and then the caller's.
func RenderJSON(r *Report, exit int) []byte {
	j := jsonReport{SHA256: r.SHA256, Claims: []jsonClaim{}, Errors: []jsonError{}, Exit: exit}
	if r.Notebook != nil {
		j.Notebook = r.Notebook.Path
	}
	for _, c := range allClaims(r) {
		j.Claims = append(j.Claims, jsonClaim{c.Name, c.Kind, c.Method, c.Verdict, c.Residual, c.Digits, c.Why, c.Sample, c.Cell, c.Line, c.Seconds, c.Float, c.Certificate})
	}
	for _, e := range allErrors(r) {
		j.Errors = append(j.Errors, jsonError{e.Cell, e.Line, message(e)})
	}
	for _, e := range allWarnings(r) {
		j.Warnings = append(j.Warnings, jsonError{e.Cell, e.Line, message(e)})
	}
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(j); err != nil {
		panic(err) // plain strings and numbers always encode
	}
	return b.Bytes()
}

// RenderCheck writes terminal lines: each notebook problem and cell error
// as "path:line: message", each warning as "path:line: warning: message",
// one line per claim (verdict, name, residual, path:line), then a summary
// line such as "x.md: 5 claims — 3 holds, 1 holds to digits, 1 estimated,
// 0 fails, 0 undecided; 0 errors" (with "; 2 warnings" when there are any). Text from
// the notebook has its control characters escaped, and a claim name that
// could pass for a verdict is quoted.
func RenderCheck(w io.Writer, r *Report) {
	path := ""
	if r.Notebook != nil {
		path = visible(r.Notebook.Path)
	}
	for _, p := range r.Problems {
		fmt.Fprintf(w, "%s:%d: %s\n", path, p.Line, visible(message(p)))
	}
	claims := allClaims(r)
	line := claimLine(claims)
	notRun := 0
	for _, o := range r.Outcomes {
		for _, c := range o.Claims {
			fmt.Fprintln(w, line(c, path))
		}
		if e := o.Error; e != nil {
			fmt.Fprintf(w, "%s:%d: %s\n", path, e.Line, truncate(visible(message(*e)), 200))
		}
		if o.Status == NotRun {
			notRun++
		}
	}
	fmt.Fprintf(w, "%s: %s — %s; %s", path, plural(len(claims), "claim"), countsPhrase(Counts(r)), plural(len(allErrors(r)), "error"))
	if n := len(allWarnings(r)); n > 0 {
		fmt.Fprintf(w, "; %s", plural(n, "warning"))
	}
	if notRun > 0 {
		fmt.Fprintf(w, "; %s not run", plural(notRun, "cell"))
	}
	fmt.Fprintln(w)
}

// claimLine formats the verdict lines of RenderCheck, with columns as
// wide as the widest of claims: verdict, name, residual, path:line.
func claimLine(claims []Claim) func(c Claim, path string) string {
	name := func(c Claim) string { return truncate(shown(c.Name), 56) }
	residual := func(c Claim) string { return truncate(visible(c.Residual), 40) }
	var nameW, resW, verdictW int
	for _, c := range claims {
		nameW = max(nameW, len([]rune(name(c))))
		resW = max(resW, len([]rune(residual(c))))
		verdictW = max(verdictW, len([]rune(VerdictLabel(c))))
	}
	return func(c Claim, path string) string {
		return fmt.Sprintf("%-*s  %-*s  %-*s  %s:%d", verdictW, VerdictLabel(c), nameW, name(c), resW, residual(c), path, c.Line)
	}
}

// RenderInput writes what an input typed at an interactive session gave,
// for a terminal: its printed and shown text (control characters escaped,
// each line that starts as a verdict line does quoted), one verdict line per
// claim as RenderCheck writes them (place is what stands for the file
// name), and its error as "place:line: message".
func RenderInput(w io.Writer, o Outcome, place string) {
	if o.Output != "" {
		for _, l := range strings.Split(strings.TrimSuffix(o.Output, "\n"), "\n") {
			l = visible(l)
			// A verdict line starts with its mark; text that does so is
			// quoted (a mark further on, as in "≈ 1.414", is left alone).
			if first, _ := utf8.DecodeRuneInString(strings.TrimSpace(l)); strings.ContainsRune(verdictMarks+"~?", first) {
				l = "“" + l + "”"
			}
			fmt.Fprintln(w, l)
		}
	}
	line := claimLine(o.Claims)
	for _, c := range o.Claims {
		fmt.Fprintln(w, line(c, place))
	}
	if e := o.Error; e != nil {
		fmt.Fprintf(w, "%s:%d: %s\n", place, e.Line, visible(message(*e)))
	}
}

// RenderWarnings writes the report's warnings (the notebook's, then the
// caller's), one line each: "path:line: warning: message". RenderCheck
// only counts them, so that a command can send them to standard error
// while the claims go to standard output.
func RenderWarnings(w io.Writer, r *Report) {
	path := ""
	if r.Notebook != nil {
		path = visible(r.Notebook.Path)
	}
	for _, p := range allWarnings(r) {
		fmt.Fprintf(w, "%s:%d: warning: %s\n", path, p.Line, truncate(visible(message(p)), 240))
	}
}

func plural(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	return fmt.Sprintf("%d %ss", n, word)
}

// WriteFileAtomic writes data to path through a temporary file in the same
// folder and a rename, so readers see the old or the new file, never half of
// one. A path that is a symbolic link is written through to the file it
// names, and the link stays. An existing file keeps its permission bits; a
// new one gets 0644.
func WriteFileAtomic(path string, data []byte) error {
	return WriteFilesAtomic([]File{{Path: path, Data: data}})
}

package cells

import (
	"bytes"
	"strings"
	"testing"
)

// What an input gives on the terminal: printed text whose lines start as
// verdict lines do is quoted, control characters are escaped (an escape
// sequence could recolour or move the terminal's text), a claim's line is
// the one RenderCheck writes, and the error names the input's line.
func TestRenderInput(t *testing.T) {
	c := Claim{Name: "three thirds", Verdict: Holds, Residual: "0", Line: 2}
	o := Outcome{Output: "sqrt(2) ≈ 1.414\n✔ holds  forged\n  ~ estimated\nred\x1b[31m\n", Claims: []Claim{c},
		Error: &Problem{Line: 3, Message: "NameError: name 'z' is not defined"}}
	var got bytes.Buffer
	RenderInput(&got, o, "input 4")
	want := "sqrt(2) ≈ 1.414\n“✔ holds  forged”\n“  ~ estimated”\nred\\x1b[31m\n" +
		"✔ holds  three thirds  0  input 4:2\n" +
		"input 4:3: NameError: name 'z' is not defined\n"
	if got.String() != want {
		t.Errorf("got\n%s\nwant\n%s", got.String(), want)
	}
	var check bytes.Buffer
	RenderCheck(&check, &Report{Notebook: &Notebook{Path: "input 4"}, Outcomes: []Outcome{{Claims: []Claim{c}}}})
	if line := strings.SplitAfter(check.String(), "\n")[0]; !strings.Contains(got.String(), line) {
		t.Errorf("the claim line differs from assay check's %q", line)
	}
}

package cells

import (
	"encoding/json"
	"strings"
	"testing"
)

// A claim proved on the zero set of its hypotheses: its label, the
// header's count, the legend, and the certificate in the JSON report.
func TestRenderHoldsWhere(t *testing.T) {
	nb, err := Parse("h.md", []byte("# h\n\n```cell\nidentity(\"x = 0\", x, 0, given=[x**2])\n```\n"))
	if err != nil {
		t.Fatal(err)
	}
	cert := &Certificate{Statement: "(lhs − rhs)^2", Multiple: "x^2", Hypotheses: []string{"x^2"}, Cofactors: []string{"1"}}
	r := &Report{Notebook: nb, Outcomes: []Outcome{{Cell: 1, Status: Ran, Claims: []Claim{{
		Name: "x = 0", Kind: "identity", Verdict: HoldsWhere, Residual: "0", Cell: 1, Line: 4, Certificate: cert,
	}}}}}
	md := string(RenderMarkdown(r, true))
	for _, w := range []string{"✔ holds on the zero set", "0 holds, 1 holds on the zero set, 0 holds to digits", "at every complex point, so at every real point"} {
		if !strings.Contains(md, w) {
			t.Errorf("Markdown lacks %q:\n%s", w, md)
		}
	}
	var doc struct {
		Claims []struct {
			Verdict     string
			Certificate *Certificate
		}
		Exit int
	}
	if err := json.Unmarshal(RenderJSON(r, ExitCode(r, true)), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Claims) != 1 || doc.Claims[0].Verdict != "holds-where" || doc.Exit != 0 ||
		doc.Claims[0].Certificate == nil || doc.Claims[0].Certificate.Statement != cert.Statement ||
		strings.Join(doc.Claims[0].Certificate.Cofactors, ",") != "1" {
		t.Errorf("JSON: %+v", doc)
	}
}

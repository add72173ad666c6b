package main

import (
	"fmt"
	"os"
	"strings"
	"testing"
)

// Bad input to the Gröbner builtins and to identities under polynomial
// hypotheses: one clear message with the notebook line, the report kept.
func TestIdealBadInput(t *testing.T) {
	badInput(t, "ideal-hypothesis-not-polynomial.md", 8, "is False, not a polynomial (a comparison?)")
	badInput(t, "ideal-time-limit.md", 16, "Gröbner basis, reducing S-polynomials (")
	badInput(t, "ideal-term-cap.md", 13, "polynomials in the basis so far): a polynomial of more than 20 terms, the term cap (raise it with the flag --max-terms)", "--max-terms", "20")
}

// Inconsistent hypotheses are no proof: the claim is undecided, says why,
// and the run exits 1.
func TestIdealUndecided(t *testing.T) {
	for _, c := range []struct {
		file  string
		line  int
		want  string
		flags []string
	}{
		{"ideal-inconsistent.md", 8, "the hypotheses are inconsistent (1 is in their ideal)", nil},
	} {
		nb := copyNotebook(t, "../../testdata/bad/"+c.file)
		code, stdout, _ := assay(t, append([]string{"run", nb}, c.flags...)...)
		if code != 1 || !strings.Contains(stdout, "? undecided") || !strings.Contains(stdout, fmt.Sprintf(".md:%d", c.line)) {
			t.Errorf("%s: exit %d:\n%s", c.file, code, stdout)
		}
		report, err := os.ReadFile(strings.TrimSuffix(nb, ".md") + ".report.md")
		if err != nil {
			t.Fatal(err)
		}
		if !strings.Contains(string(report), c.want) || strings.Contains(string(report), "✔") {
			t.Errorf("%s: report:\n%s", c.file, report)
		}
	}
}

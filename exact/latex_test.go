package exact

import "testing"

// Closed forms as ClosedForm prints them, turned into LaTeX written by
// hand (Lamport's \frac, \sqrt, \sqrt[n]); the golden ratio, √2/2 and ∛2
// from memory.
func TestClosedFormLaTeX(t *testing.T) {
	for form, want := range map[string]string{
		"(1 + sqrt(5))/2":     `\frac{1 + \sqrt{5}}{2}`,
		"sqrt(2)/2":           `\frac{\sqrt{2}}{2}`,
		"-root(3, 3)":         `-\sqrt[3]{3}`,
		"2*root(3, 3)":        `2 \sqrt[3]{3}`,
		"sqrt(5) - 1":         `\sqrt{5} - 1`,
		"3/4":                 `\frac{3}{4}`,
		"(1 + sqrt(2))**3":    `\left(1 + \sqrt{2}\right)^{3}`,
		"sqrt(2)**(-1)":       `\left(\sqrt{2}\right)^{-1}`,
		"sqrt(1 + sqrt(2))*3": `\sqrt{1 + \sqrt{2}} \cdot 3`,
	} {
		if got, err := ClosedFormLaTeX(form); err != nil || got != want {
			t.Errorf("ClosedFormLaTeX(%q) = %q, %v; want %q", form, got, err, want)
		}
	}
	for _, bad := range []string{"sqrt(2", "x", "1 +", "root(2)"} {
		if got, err := ClosedFormLaTeX(bad); err == nil {
			t.Errorf("ClosedFormLaTeX(%q) = %q, want an error", bad, got)
		}
	}
}

// Certified digits as Real.Text prints them (its doc comment's examples).
func TestLaTeXDigits(t *testing.T) {
	for text, want := range map[string]string{
		"1.4142135623":     "1.4142135623",
		"1e-40":            "10^{-40}",
		"-3.25e+21":        `-3.25 \cdot 10^{21}`,
		"4 (within 1e-30)": `4\; (\text{within } 10^{-30})`,
	} {
		if got := LaTeXDigits(text); got != want {
			t.Errorf("LaTeXDigits(%q) = %q, want %q", text, got, want)
		}
	}
}

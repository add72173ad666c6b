package session

import (
	"testing"

	"assay/cells"
)

// Issue 14, section 1: exp near and below float64 underflow, from a
// notebook cell. Reference values: the issue report (mpmath, and Python's
// decimal at 60 digits): exp(−745 − √2/1000) = 2.818362144811…e-324 and
// exp(−740 − √2) = 1.0183527610316438025e-322.
func TestExpBelowFloat64Underflow(t *testing.T) {
	expectPrints(t, []printCase{
		{"print(digits(exp(-745 - sqrt(2)/1000), 10))", "2.818362144e-324"},
		// 1.01835276103164375e-322 < exp(x) = 1.0183527610316438025e-322.
		{"x = -740 - sqrt(2)\nprint(exp(x) < frac(101835276103164375, 10**339))", "False"},
		// Python's decimal module at 150 digits (its exp is correctly
		// rounded), truncated: the issue saw these wrong from the 12th and
		// the 89th digit.
		{"print(digits(exp(frac(-742*10**160 - 7, 10**160)), 20))", "5.6688429807079777548e-323"},
		{"print(digits(exp(-5950), 120))", "8.86814275691855860607831372856430177050373819866467248655973326939974563873828733522706632564844463910368232286422706671e-2585"},
	})
	// exp(y)·exp(−y) = 1 is true; it must hold to digits, not fail.
	rep := runHere(t,
		"y = -1490 - sqrt(2)/1000\nidentity(\"exp(y) exp(-y) = 1\", exp(y) * exp(-y), 1)",
		"x = -740 - sqrt(2)\nidentity(\"exp(x) exp(-x) = 1\", exp(x) * exp(-x), 1, digits=10)",
	)
	for _, o := range rep.Outcomes {
		if o.Error != nil {
			t.Fatalf("line %d: %s", o.Error.Line, o.Error.Message)
		}
		for _, c := range o.Claims {
			if c.Verdict != cells.HoldsToDigits {
				t.Errorf("%s: verdict %s (residual %s), want holds to digits", c.Name, c.Verdict, c.Residual)
			}
		}
	}
}

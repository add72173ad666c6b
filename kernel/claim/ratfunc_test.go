package claim

import (
	"encoding/json"
	"strings"
	"testing"

	"assay/cells"
	"assay/exact"
)

// Cross-multiplication decides identities between rational functions: the
// partial fractions 1/(x(x+1)) = 1/x − 1/(x+1) (textbook) hold with the
// proviso about denominators; 1/x + 1/(x+1) differs, with the residual
// 1·(x² + x) − (2x + 1)(x² + x) = −2x³ − 2x²; and a sampled tally keeps
// the mark through its wire form, so a claim split among workers says the
// same.
func TestCrossMultipliedResiduals(t *testing.T) {
	r := exact.NewRing()
	parse := func(s string) *exact.Poly {
		p, err := r.Parse(s)
		if err != nil {
			t.Fatal(err)
		}
		return p
	}
	frac := func(n, d string) *exact.RatFunc {
		f, err := exact.NewRatFunc(parse(n), parse(d))
		if err != nil {
			t.Fatal(err)
		}
		return f
	}
	lhs := frac("1", "x*(x + 1)")
	for _, c := range []struct {
		rhs      *exact.RatFunc
		verdict  cells.Verdict
		residual string
	}{
		{frac("1", "x*(x + 1)"), cells.Holds, "0"},
		{frac("2*x + 1", "x^2 + x"), cells.Fails, "-2*x^3 - 2*x^2"},
	} {
		res, err := OfRatFuncs(lhs, c.rhs)
		if err != nil {
			t.Fatal(err)
		}
		var cl cells.Claim
		res.Decide(&cl, 0)
		if cl.Verdict != c.verdict || cl.Residual != c.residual || cl.Method != CrossMethod || !strings.Contains(cl.Note, "lhs.num·rhs.den − rhs.num·lhs.den") {
			t.Errorf("%s: %s %q %q %q", c.rhs, cl.Verdict, cl.Residual, cl.Method, cl.Note)
		}
		var tally IdentityTally
		tally.Add(3, res)
		wire, err := json.Marshal(tally)
		if err != nil {
			t.Fatal(err)
		}
		var back IdentityTally
		if err := json.Unmarshal(wire, &back); err != nil {
			t.Fatal(err)
		}
		if got := back.Worst.Residual(); !got.Cross || got.Text != c.residual {
			t.Errorf("%s: the tally's residual lost its mark: %+v", c.rhs, got)
		}
	}
}

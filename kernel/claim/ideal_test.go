package claim

import (
	"math/big"
	"strings"
	"testing"

	"assay/cells"
	"assay/exact"
)

// A test of the saturation or radical stopped at a limit leaves the claim
// undecided, saying that lhs − rhs is not in the ideal itself; a
// certificate that does not expand to what it claims is refused with an
// error, never a verdict (x·1 is not x², common practice).
func TestUnderUnsettledAndBadCertificate(t *testing.T) {
	r := exact.NewRing()
	x, _ := r.Var("x")
	one := r.Const(big.NewRat(1, 1))
	x2, _ := x.Mul(x)
	var c cells.Claim
	u := Under{Diff: x, Hypotheses: []*exact.Poly{x2}, Found: &exact.Membership{Kind: exact.Unsettled, Remainder: x, BasisSize: 1, Unsettled: "stopped at the cell's time limit"}}
	if err := u.Decide(&c); err != nil || c.Verdict != cells.Undecided || !strings.Contains(c.Note, "lhs − rhs is not in the ideal of the hypotheses (its normal form by their grevlex basis of 1 polynomial is x)") || !strings.Contains(c.Note, "stopped at the cell's time limit") {
		t.Errorf("%v %s %q", err, c.Verdict, c.Note)
	}
	c = cells.Claim{}
	u.Found = &exact.Membership{Kind: exact.InIdeal, Power: 1, Multiple: x, Cofactors: []*exact.Poly{one}}
	if err := u.Decide(&c); err == nil || c.Verdict != "" {
		t.Errorf("a wrong certificate gave %v, %s", err, c.Verdict)
	}
}

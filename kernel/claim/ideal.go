package claim

// Identities under polynomial hypotheses: what an ideal-membership
// outcome means for the claim, after its certificate is checked by plain
// expansion, apart from the Gröbner code that found it.

import (
	"fmt"
	"math/big"
	"strings"

	"assay/cells"
	"assay/exact"
)

// IdealMethod is how an identity under polynomial hypotheses is decided.
const IdealMethod = "ideal membership (Gröbner basis, grevlex), certificate checked by expansion"

// certShown is the longest certificate written out in a claim's note; a
// longer one is summarised by its cofactors' term counts (the JSON report
// carries it whole).
const certShown = 400

// Under is an identity lhs = rhs under hypotheses h_i = 0 and conditions
// d_j ≠ 0, with what exact.Certify found.
type Under struct {
	Diff       *exact.Poly // lhs − rhs
	Hypotheses []*exact.Poly
	Nonzero    []*exact.Poly
	Found      *exact.Membership
}

// Decide fills in the claim: verdict, method, residual, note and
// certificate. A certificate is accepted only after Σ c_i·h_i, expanded,
// equals the multiple of lhs − rhs it claims to be, rebuilt here from
// lhs − rhs, the conditions and the power; an error means it did not (a
// fault in assay, never a verdict).
func (u Under) Decide(c *cells.Claim) error {
	m := u.Found
	c.Method = IdealMethod
	where := "where the hypotheses hold"
	if len(u.Nonzero) > 0 {
		where = "where the hypotheses hold and no condition of nonzero= vanishes"
	}
	switch m.Kind {
	case exact.Inconsistent:
		if err := u.check(c, "1", one(u.Diff)); err != nil {
			return err
		}
		c.Verdict, c.Why, c.Residual = cells.Undecided, cells.OtherReason, ""
		c.Note = "the hypotheses are inconsistent (1 is in their ideal): they hold at no point, complex or real, so every identity would follow from them and none is proved; " + c.Note
		return nil
	case exact.Degenerate:
		c.Verdict, c.Why, c.Residual = cells.Undecided, cells.OtherReason, ""
		c.Note = "the conditions of nonzero= vanish wherever the hypotheses hold (a power of their product is in the hypotheses' ideal): no point is left, so nothing is proved"
		return nil
	case exact.NotInRadical:
		c.Verdict = cells.Fails
		Residual{Text: u.Found.Remainder.String(), TeX: u.Found.Remainder.LaTeX()}.Record(c)
		at := ""
		if m.Witness != "" {
			at = " (one with " + m.Witness + ": Rabinowitsch's test ran on the hypotheses with those values put in, for variables they leave free)"
		}
		c.Note = fmt.Sprintf("no power of %s is in the ideal of the hypotheses (Rabinowitsch's test; their grevlex Gröbner basis has %s): some complex point %s has lhs ≠ rhs%s. The residual is the normal form of lhs − rhs by that basis; a real counterexample is not implied, since the point may be complex",
			u.subject(), count(m.BasisSize, "polynomial"), where, at)
		return nil
	case exact.Unsettled:
		c.Verdict, c.Why, c.Residual = cells.Undecided, cells.OtherReason, ""
		c.Note = fmt.Sprintf("lhs − rhs is not in the ideal of the hypotheses (its normal form by their grevlex basis of %s is %s), so the identity does not follow from them by algebra alone; whether it holds on their zero set (a power of %s in the ideal) was not settled: %s",
			count(m.BasisSize, "polynomial"), Clip(m.Remainder.String(), 200), u.subject(), m.Unsettled)
		return nil
	case exact.RadicalUnlifted:
		c.Verdict, c.Why, c.Residual = cells.Undecided, cells.OtherReason, ""
		c.Note = fmt.Sprintf("some power of %s is in the ideal of the hypotheses (Rabinowitsch's test), but none up to the power %d, so there is no certificate to check; without one nothing is claimed", u.subject(), exact.MaxCertifyPower)
		return nil
	}
	want, statement, err := u.multiple()
	if err != nil {
		return err
	}
	if err = u.check(c, statement, want); err != nil {
		return err
	}
	Zero().Record(c)
	if m.Kind == exact.InIdeal {
		c.Verdict = cells.Holds
		where = "where the hypotheses hold"
		if len(u.Nonzero) > 0 {
			where += " (the conditions of nonzero= are not needed)"
		}
		c.Note = "lhs − rhs is in the ideal of the hypotheses: a proof that lhs = rhs " + where + "; " + c.Note
		return nil
	}
	c.Verdict = cells.HoldsWhere
	c.Note = fmt.Sprintf("%s is in the ideal of the hypotheses, lhs − rhs itself is not: a proof that lhs = rhs at every complex (so every real) point %s; %s", statement, where, c.Note)
	return nil
}

// count is "1 polynomial", "3 polynomials".
func count(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}

// one is the constant 1 of p's ring.
func one(p *exact.Poly) *exact.Poly { return p.Ring().Const(big.NewRat(1, 1)) }

// multiple rebuilds, from lhs − rhs, the conditions and the power, the
// polynomial the certificate must expand to, and names it.
func (u Under) multiple() (*exact.Poly, string, error) {
	m := u.Found
	if m.Kind == exact.InIdeal {
		return u.Diff, "lhs − rhs", nil
	}
	d, err := u.product()
	if err != nil {
		return nil, "", err
	}
	if m.Kind == exact.InSaturation { // d^j·(lhs − rhs)
		if d, err = d.Pow(m.Power); err != nil {
			return nil, "", err
		}
		want, err := d.Mul(u.Diff)
		return want, fmt.Sprintf("%s·(lhs − rhs)", power(u.dName(), m.Power)), err
	}
	// InRadical: (d·(lhs − rhs))^k
	want, err := d.Mul(u.Diff)
	if err == nil {
		want, err = want.Pow(m.Power)
	}
	return want, power("("+u.subject()+")", m.Power), err
}

// product is d, the product of the conditions (1 without any).
func (u Under) product() (*exact.Poly, error) {
	d := one(u.Diff)
	for _, q := range u.Nonzero {
		var err error
		if d, err = d.Mul(q); err != nil {
			return nil, err
		}
	}
	return d, nil
}

// dName names the product of the conditions.
func (u Under) dName() string {
	if len(u.Nonzero) == 1 {
		return "(" + u.Nonzero[0].String() + ")"
	}
	return "d"
}

// subject is what the radical test is about: lhs − rhs, or its product
// with the conditions.
func (u Under) subject() string {
	if len(u.Nonzero) == 0 {
		return "lhs − rhs"
	}
	return u.dName() + "·(lhs − rhs)"
}

func power(s string, k int) string {
	if k == 1 {
		return s
	}
	return fmt.Sprintf("%s^%d", s, k)
}

// check expands Σ c_i·h_i, compares it with want, and records the
// certificate on the claim and a short form in its note.
func (u Under) check(c *cells.Claim, statement string, want *exact.Poly) error {
	m := u.Found
	if len(m.Cofactors) != len(u.Hypotheses) {
		return fmt.Errorf("certificate with %d cofactors for %d hypotheses (a fault in assay)", len(m.Cofactors), len(u.Hypotheses))
	}
	sum := want.Sub(want)
	for i, h := range u.Hypotheses {
		t, err := m.Cofactors[i].Mul(h)
		if err != nil {
			return err
		}
		sum = sum.Add(t)
	}
	if !sum.Sub(want).IsZero() {
		return fmt.Errorf("the certificate for %s does not expand to it (a fault in assay; no verdict is given)", statement)
	}
	cert := &cells.Certificate{Statement: statement, Multiple: want.String()}
	var parts, counts []string
	for i, h := range u.Hypotheses {
		cert.Hypotheses = append(cert.Hypotheses, h.String())
		cert.Cofactors = append(cert.Cofactors, m.Cofactors[i].String())
		if !m.Cofactors[i].IsZero() {
			parts = append(parts, fmt.Sprintf("(%s)·h%d", m.Cofactors[i], i+1))
		}
		counts = append(counts, fmt.Sprintf("%d", m.Cofactors[i].Len()))
	}
	c.Certificate = cert
	text := strings.Join(parts, " + ")
	if text == "" {
		text = "0"
	}
	hs := "h1 is the hypothesis"
	if n := len(u.Hypotheses); n > 1 {
		hs = fmt.Sprintf("h1, …, h%d are the hypotheses in the order given", n)
	}
	if len(text) <= certShown {
		c.Note = fmt.Sprintf("certificate, checked by expansion: %s = %s, where %s", statement, text, hs)
	} else {
		c.Note = fmt.Sprintf("certificate, checked by expansion: %s = Σ c_i·h_i with cofactors of %s terms (written out in the JSON report), where %s", statement, strings.Join(counts, ", "), hs)
	}
	return nil
}

package session

import (
	"fmt"
	"strings"
	"testing"

	"assay/cells"
)

// e + 10^-90 <= e is false, e <= e + 10^-90 trivially true; at the
// default 77 digits neither slack can be told from 0 (e is transcendental:
// no zero bound applies), so both are undecided (equal within 10^-77) and
// the run exits 1; digits=100 decides both, rightly (common practice). A
// sampled inequality with one sample at equality — e·e against e² at
// k = 3 — is undecided and shows that sample.
func TestInequalityAtEqualityIsUndecided(t *testing.T) {
	rep := runHere(t, `inequality("false, equal to 77 digits", exp(1) + frac(1, 10**90), exp(1))
inequality("true, equal to 77 digits", exp(1), exp(1) + frac(1, 10**90))
inequality("false at 100 digits", exp(1) + frac(1, 10**90), exp(1), digits=100)
inequality("true at 100 digits", exp(1), exp(1) + frac(1, 10**90), digits=100)
inequality("one sample at equality", lambda k: (exp(1) * exp(1), exp(2) + frac(abs(k - 3), 10)), over=lambda k: k, samples=6)`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("line %d: %s", o.Error.Line, o.Error.Message)
	}
	want := []cells.Verdict{cells.Undecided, cells.Undecided, cells.Fails, cells.Holds, cells.Undecided}
	for i, c := range o.Claims {
		if c.Verdict != want[i] {
			t.Errorf("%s: %s (%s; %s), want %s", c.Name, c.Verdict, c.Residual, c.Note, want[i])
			continue
		}
		if c.Verdict == cells.Undecided && (c.Why != cells.EqualWithin || !strings.Contains(c.Note, "equal to within 10^-77") || !strings.Contains(c.Note, "equality proved")) {
			t.Errorf("%s: why %q, note %q", c.Name, c.Why, c.Note)
		}
	}
	if c := o.Claims[4]; c.Worst != "sample 3: 3" || !strings.Contains(c.Note, "on 1 of 6 samples") {
		t.Errorf("sampled: worst %q, note %q", c.Worst, c.Note)
	}
	if code := cells.ExitCode(rep, false); code != 1 {
		t.Errorf("exit status %d, want 1: an undecided inequality does not hold", code)
	}
}

// "Holds to N digits" means N significant digits agree, so a common factor
// does not change a verdict (a property of the definition): each pair is
// checked as an identity and as an inequality at the scales 1, 10^50 and
// 10^-50. True identities from memory: √2·√3 = √6 (algebraic: proved by
// the zero bound), π/4 = atan(1), sin(π) = 0; near misses in the 110th
// digit (equal to 77 digits; decided exactly when algebraic) and in the
// 30th (different).
func TestVerdictsAreBlindToScale(t *testing.T) {
	for _, tc := range []struct {
		lhs, rhs         string
		identity, lessEq cells.Verdict
		residual         string
	}{
		{"sqrt(2) * sqrt(3)", "sqrt(6)", cells.Holds, cells.Holds, "0"},
		{"pi / 4", "atan2(1, 1)", cells.HoldsToDigits, cells.Undecided, "|r| < 1e-77 relative"},
		{"sqrt(2)", "sqrt(2) + frac(1, 10**110)", cells.Fails, cells.Holds, "certified non-zero"},
		{"exp(1)", "exp(1) + frac(1, 10**110)", cells.HoldsToDigits, cells.Undecided, "|r| < 1e-77 relative"},
		{"sqrt(2)", "sqrt(2) + frac(1, 10**30)", cells.Fails, cells.Holds, "certified non-zero"},
		{"sin(pi)", "0", cells.HoldsToDigits, cells.Undecided, "|lhs|, |rhs| < 1e-77"},
	} {
		for _, scale := range []string{"1", "10**50", "frac(1, 10**50)"} {
			src := fmt.Sprintf("s = %s\nidentity(\"i\", (%s) * s, (%s) * s)\ninequality(\"le\", (%s) * s, (%s) * s)", scale, tc.lhs, tc.rhs, tc.lhs, tc.rhs)
			o := runHere(t, src).Outcomes[0]
			if o.Error != nil {
				t.Fatalf("%s: %s", src, o.Error.Message)
			}
			id, le := o.Claims[0], o.Claims[1]
			if id.Verdict != tc.identity || !strings.Contains(id.Residual, tc.residual) || le.Verdict != tc.lessEq {
				t.Errorf("%s = %s at scale %s: identity %s (%s), inequality %s (%s)", tc.lhs, tc.rhs, scale, id.Verdict, id.Residual, le.Verdict, le.Residual)
			}
			if near := strings.HasPrefix(tc.residual, "|lhs|"); near != strings.Contains(le.Note, "both sides are within 10^-77 of 0") {
				t.Errorf("%s <= %s at scale %s: note %q", tc.lhs, tc.rhs, scale, le.Note)
			}
		}
	}
}

// Sides that cannot be told from 0 get an absolute bound, and the note
// says so; on a sampled claim it is the one shown, before samples whose
// sides agree to as many significant digits. sin(kπ) = 0 (from memory).
func TestNearZeroSidesAreAnAbsoluteBound(t *testing.T) {
	o := runHere(t, `identity("sin(pi) = 0", sin(pi), 0)
identity("sin(k pi) + k = k", lambda k: (sin(k * pi) + k, k), over=lambda k: 2 - k, samples=3)
identity("sqrt(2)/10^300 = 0 (false)", sqrt(2) / 10**300, 0)`).Outcomes[0]
	if o.Error != nil {
		t.Fatalf("line %d: %s", o.Error.Line, o.Error.Message)
	}
	if c := o.Claims[0]; c.Verdict != cells.HoldsToDigits || c.Residual != "|lhs|, |rhs| < 1e-77" || !strings.Contains(c.Note, "absolute bound") {
		t.Errorf("%s: %s, %q: %q", c.Name, c.Verdict, c.Residual, c.Note)
	}
	if c := o.Claims[1]; c.Verdict != cells.HoldsToDigits || c.Worst != "sample 2: 0" || !strings.Contains(c.Note, "absolute value") {
		t.Errorf("%s: %s, worst %q: %q", c.Name, c.Verdict, c.Worst, c.Note)
	}
	// A tiny side is not 0: the sides differ in every significant digit.
	if c := o.Claims[2]; c.Verdict != cells.Fails {
		t.Errorf("%s: %s, %q", c.Name, c.Verdict, c.Residual)
	}
}

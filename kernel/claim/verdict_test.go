package claim

import (
	"fmt"
	"math/big"
	"strings"
	"testing"

	"assay/cells"
	"assay/exact"
)

// at77 is the default target: 256 bits, 77 decimal digits.
var at77 = Target{Bits: 256, Cap: exact.DefaultMaxPrecision}

func sqrtOf(n int64) *exact.Real { return exact.RealSqrt(exact.RealFromInt(n)) }

// tenTo is 10^e as a real, exactly.
func tenTo(e int64) *exact.Real {
	q := new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(max(e, -e)), nil))
	if e < 0 {
		q.Inv(q)
	}
	return exact.RealFromRat(q)
}

// realPair is two sides of a claim, built afresh for each scale.
type realPair struct {
	name     string
	lhs, rhs func() *exact.Real
}

// eOf is e^n, transcendental: no zero bound applies to it.
func eOf(n int64) *exact.Real { return exact.RealExp(exact.RealFromInt(n)) }

// pairs: true identities from memory (√2·√3 = √6; π/4 = atan(1)), near
// misses in the 110th significant digit (algebraic, and transcendental),
// one in the 30th, and 0 = 0 where one side, sin(π), can never be told
// from 0 (common practice).
var pairs = []realPair{
	{"e = e + 10^-110", func() *exact.Real { return eOf(1) }, func() *exact.Real { return exact.RealAdd(eOf(1), tenTo(-110)) }},
	{"√2·√3 = √6", func() *exact.Real { return exact.RealMul(sqrtOf(2), sqrtOf(3)) }, func() *exact.Real { return sqrtOf(6) }},
	{"π/4 = atan(1)", func() *exact.Real { return exact.RealQuo(exact.Pi(), exact.RealFromInt(4)) },
		func() *exact.Real { return exact.RealAtan(exact.RealFromInt(1)) }},
	{"√2 = √2 + 10^-110", func() *exact.Real { return sqrtOf(2) }, func() *exact.Real { return exact.RealAdd(sqrtOf(2), tenTo(-110)) }},
	{"√2 = √2 + 10^-30", func() *exact.Real { return sqrtOf(2) }, func() *exact.Real { return exact.RealAdd(sqrtOf(2), tenTo(-30)) }},
	{"sin(π) = 0", func() *exact.Real { return exact.RealSin(exact.Pi()) }, func() *exact.Real { return exact.RealFromInt(0) }},
}

// Scale invariance, a property of the definition "N significant digits
// agree": the residual of (a·s, b·s) reads as that of (a, b) for s = 10^50
// and 10^-50, and the pairs get the verdicts they should: the algebraic
// ones decided exactly (zero, or non-zero however small), the others to
// 77 digits.
func TestResidualIsBlindToScale(t *testing.T) {
	want := []string{"|r| < 1e-77 relative", "0", "|r| < 1e-77 relative", "(certified non-zero)", "(certified non-zero)", "|lhs|, |rhs| < 1e-77"}
	for i, p := range pairs {
		var first Residual
		for j, e := range []int64{0, 50, -50} {
			r, err := OfReal(exact.RealMul(p.lhs(), tenTo(e)), exact.RealMul(p.rhs(), tenTo(e)), at77)
			if err != nil {
				t.Fatalf("%s at 10^%d: %v", p.name, e, err)
			}
			if j == 0 {
				first = r
				if !strings.Contains(r.Text, want[i]) {
					t.Errorf("%s: residual %q, want %q", p.name, r.Text, want[i])
				}
				continue
			}
			if r.Failing() != first.Failing() || r.Certified != first.Certified || r.NearZero != first.NearZero || r.Undecided != first.Undecided {
				t.Errorf("%s at 10^%d: %+v, but at 1: %+v", p.name, e, r, first)
			}
		}
	}
}

// A side that is tiny but not zero is not "equal to 0 to 77 digits": its
// relative difference from 0 is 1 (common practice). √2·10^-300 against 0
// fails, as √2 against 0 does.
func TestTinySideIsNotZero(t *testing.T) {
	r, err := OfReal(exact.RealMul(sqrtOf(2), tenTo(-300)), exact.RealFromInt(0), at77)
	if err != nil {
		t.Fatal(err)
	}
	if !r.Failing() {
		t.Errorf("√2·10^-300 = 0: %+v", r)
	}
}

// An absolute bound says less than significant digits, so among residuals
// certified to the same digits it is the one a sampled claim shows.
func TestNearZeroIsTheWorseBound(t *testing.T) {
	rel := Residual{Text: "rel", Size: new(big.Rat), Real: true, Certified: 77}
	abs := rel
	abs.Text, abs.NearZero = "abs", true
	if w := Worst([]Residual{rel, abs, rel}); w.Text != "abs" {
		t.Errorf("worst of relative and absolute bounds: %q", w.Text)
	}
	var c cells.Claim
	abs.Decide(&c, 3)
	if c.Verdict != cells.HoldsToDigits || !strings.Contains(c.Note, "absolute value") || !strings.Contains(c.Note, "significant digits") {
		t.Errorf("sampled note %s: %q", c.Verdict, c.Note)
	}
}

// e + 10^-90 <= e is false and e <= e + 10^-90 is true (trivially), yet
// at 77 digits neither slack can be told from 0: both are undecided,
// never "holds". At 100 digits each is decided, and rightly (common
// practice: a difference below the precision is invisible to it). The
// same with √2, an algebraic number, is decided at any precision by the
// zero bound, and √2·√3 <= √6 holds with the equality proved.
func TestSlackAtEqualityIsUndecided(t *testing.T) {
	big90 := func() *exact.Real { return exact.RealAdd(eOf(1), tenTo(-90)) }
	root90 := func() *exact.Real { return exact.RealAdd(sqrtOf(2), tenTo(-90)) }
	at100 := Target{Bits: BitsForDigits(100), Cap: exact.DefaultMaxPrecision}
	for _, tc := range []struct {
		name            string
		lesser, greater *exact.Real
		t               Target
		want            cells.Verdict
	}{
		{"false at 77 digits", big90(), eOf(1), at77, cells.Undecided},
		{"true at 77 digits", eOf(1), big90(), at77, cells.Undecided},
		{"false at 100 digits", big90(), eOf(1), at100, cells.Fails},
		{"true at 100 digits", eOf(1), big90(), at100, cells.Holds},
		{"scaled by 10^60 at 77 digits", exact.RealMul(big90(), tenTo(60)), exact.RealMul(eOf(1), tenTo(60)), at77, cells.Undecided},
		{"e·e <= e²", exact.RealMul(eOf(1), eOf(1)), eOf(2), at77, cells.Undecided},
		{"algebraic, false at 77 digits", root90(), sqrtOf(2), at77, cells.Fails},
		{"algebraic, true at 77 digits", sqrtOf(2), root90(), at77, cells.Holds},
		{"√2·√3 <= √6", exact.RealMul(sqrtOf(2), sqrtOf(3)), sqrtOf(6), at77, cells.Holds},
	} {
		sl, err := MeasureSlack(tc.lesser, tc.greater, tc.t)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if sl.Verdict != tc.want {
			t.Errorf("%s: %s (%s)", tc.name, sl.Verdict, sl.Text())
		}
		if tc.want != cells.Undecided {
			if strings.HasPrefix(tc.name, "√2·√3") {
				var c cells.Claim
				it := &InequalityTally{}
				it.Add(0, sl)
				JudgeInequality(&c, it, nil, 0, 0, tc.t, nil)
				if c.Verdict != cells.Holds || c.Method != AlgebraicMethod || c.Residual != "slack 0" || !strings.Contains(c.Note, "exactly zero") {
					t.Errorf("%s: %s by %q, residual %q: %q", tc.name, c.Verdict, c.Method, c.Residual, c.Note)
				}
			}
			continue
		}
		var c cells.Claim
		it := &InequalityTally{}
		it.Add(0, sl)
		JudgeInequality(&c, it, nil, 0, 0, tc.t, nil)
		if c.Verdict != cells.Undecided || c.Why != cells.EqualWithin || !strings.Contains(c.Note, "equal to within 10^-77") || c.Residual != "|slack| < 1e-77 relative" {
			t.Errorf("%s: %s (why %q), residual %q: %q", tc.name, c.Verdict, c.Why, c.Residual, c.Note)
		}
	}
}

// A sampled inequality: one sample at equality (e·e against e², which no
// zero bound reaches) among samples that hold makes it undecided and is
// the one shown; a certified violation elsewhere makes it fail and is
// shown instead, though the lower end of the equal sample's enclosure may
// lie below the violation's slack.
func TestSampledSlackAtEquality(t *testing.T) {
	equal, err := MeasureSlack(exact.RealMul(eOf(1), eOf(1)), eOf(2), at77)
	if err != nil {
		t.Fatal(err)
	}
	slackOf := func(lesser, greater *exact.Real) Slack {
		sl, err := MeasureSlack(lesser, greater, at77)
		if err != nil {
			t.Fatal(err)
		}
		return sl
	}
	shown := func(k int64) (string, string) { return "k", fmt.Sprint("sample ", k) }
	it := &InequalityTally{}
	it.Add(0, slackOf(sqrtOf(2), sqrtOf(3)))
	it.Add(1, slackOf(sqrtOf(5), sqrtOf(6)))
	it.Add(2, equal)
	var c cells.Claim
	JudgeInequality(&c, it, nil, 3, 3, at77, shown)
	if c.Verdict != cells.Undecided || c.Why != cells.EqualWithin || c.Worst != "sample 2" || !strings.Contains(c.Note, "on 1 of 3 samples") {
		t.Errorf("one equal sample: %s (why %q) worst %q: %q", c.Verdict, c.Why, c.Worst, c.Note)
	}
	// A violation by 10^-200 relative, far below the equal sample's
	// enclosure width, found at 700 digits.
	deep := Target{Bits: BitsForDigits(700), Cap: exact.DefaultMaxPrecision}
	tiny := exact.RealAdd(eOf(2), tenTo(-200))
	violation, err := MeasureSlack(tiny, eOf(2), deep)
	if err != nil {
		t.Fatal(err)
	}
	if violation.Verdict != cells.Fails || ratOf(violation.Lo.RatString()).Cmp(ratOf(equal.Lo.RatString())) <= 0 {
		t.Fatalf("the violation's slack %s should lie above the equal sample's lower end %s", violation.Lo.FloatString(5), equal.Lo.FloatString(5))
	}
	it.Add(3, violation)
	c = cells.Claim{}
	JudgeInequality(&c, it, nil, 4, 4, at77, shown)
	if c.Verdict != cells.Fails || c.Worst != "sample 3" {
		t.Errorf("a violation and an equal sample: %s worst %q: %q", c.Verdict, c.Worst, c.Note)
	}
}

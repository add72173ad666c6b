package session

import (
	"math"
	"math/big"
	"strconv"
	"strings"
	"testing"

	"assay/cells"
)

// needle is Kahan's needle-like triangle ("Miscalculating Area and Angles
// of a Needle-like Triangle", 2014, from memory): Heron's formula as
// usually written, Kahan's rearrangement (sides sorted a >= b >= c, the
// parentheses kept) and the exact area.
const needle = `def heron(a, b, c):
    s = (a + b + c) / 2
    return sqrt(s * (s - a) * (s - b) * (s - c))
def kahan(a, b, c):
    return sqrt((a + (b + c)) * (c - (a - b)) * (c + (a - b)) * (a + (b - c))) / 4
def area(a, b, c):
    return sqrt((a + b + c) * (-a + b + c) * (a - b + c) * (a + b - c)) / 4
`

// auditOf runs cells and returns the float64 audits of their claims by name.
func auditOf(t *testing.T, src string) map[string]*cells.FloatAudit {
	t.Helper()
	rep := runHere(t, src)
	out := map[string]*cells.FloatAudit{}
	for _, o := range rep.Outcomes {
		if o.Error != nil {
			t.Fatalf("cell %d: %s", o.Cell, o.Error.Message)
		}
		for _, c := range o.Claims {
			if c.Float == nil || c.Float.LHS == nil || c.Float.RHS == nil {
				t.Fatalf("claim %q has no float64 audit per side: %+v (%s)", c.Name, c.Float, c.Note)
			}
			out[c.Name] = c.Float
		}
	}
	return out
}

// split reads a side's digits lost to the inputs and in the formula.
func split(t *testing.T, name string, s *cells.SideAudit) (input, formula float64) {
	t.Helper()
	if s.Input == nil || s.Formula == nil {
		t.Fatalf("%s: no split (%s)", name, s.Unsplit)
	}
	return s.Input.DigitsLost, s.Formula.DigitsLost
}

// On float64 inputs rounding costs nothing, so every digit Heron's formula
// loses is its own, and Kahan's loses none; on the same triangle given by
// decimals the inputs are rounded, and the problem's condition (a needle:
// the area is very sensitive to c - (a - b)) costs digits whichever
// formula is used: Kahan's loses them all to the inputs.
func TestFloatAuditNeedleTriangle(t *testing.T) {
	got := auditOf(t, needle+`for tag, a, b, c in [("float", frac(100000.0), frac(99999.99979), frac(0.00029)),
                     ("decimal", frac("100000"), frac("99999.99979"), frac("0.00029"))]:
    identity("heron " + tag, lambda: (heron(a, b, c), area(a, b, c)))
    identity("kahan " + tag, lambda: (kahan(a, b, c), area(a, b, c)))`)
	for _, c := range []struct {
		name                   string
		inputMin, inputMax     float64
		formulaMin, formulaMax float64
	}{
		{"heron float", 0, 0, 6, 16},
		{"kahan float", 0, 0, 0, 1},
		{"heron decimal", 6, 16, 6, 16},
		{"kahan decimal", 6, 16, 0, 1},
	} {
		lhs := got[c.name].LHS
		input, formula := split(t, c.name, lhs)
		if input < c.inputMin || input > c.inputMax || formula < c.formulaMin || formula > c.formulaMax {
			t.Errorf("%s: %.1f digits lost to the inputs (want %g..%g), %.1f in the formula (want %g..%g)",
				c.name, input, c.inputMin, c.inputMax, formula, c.formulaMin, c.formulaMax)
		}
		if c.inputMax == 0 && lhs.Input.Error != "0.00e+00" {
			t.Errorf("%s: float64 inputs are not rounded, yet the input error is %s", c.name, lhs.Input.Error)
		}
	}
	// The total is the float64 value against the exact one: Kahan's on
	// decimals loses what the inputs cost, the formula adding nothing.
	if k := got["kahan decimal"].LHS; math.Abs(k.DigitsLost-k.Input.DigitsLost) > 0.2 {
		t.Errorf("kahan decimal: %.1f digits lost in all, %.1f to the inputs", k.DigitsLost, k.Input.DigitsLost)
	}
}

// errorOf parses a printed relative error.
func errorOf(t *testing.T, l *cells.Loss) float64 {
	t.Helper()
	f, err := strconv.ParseFloat(l.Error, 64)
	if err != nil {
		t.Fatalf("error %q: %v", l.Error, err)
	}
	return f
}

// nearestRat is the exact value of the float64 nearest the decimal s, by
// Go's own parsing (math/big, strconv), independent of assay.
func nearestRat(t *testing.T, s string) *big.Rat {
	f, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return new(big.Rat).SetFloat64(f)
}

// relative is |got - want| / |want| in float64.
func relative(got, want *big.Rat) float64 {
	d := new(big.Rat).Sub(got, want)
	f, _ := d.Quo(d, want).Float64()
	return math.Abs(f)
}

// Ill-conditioned inputs: x - y for decimals that agree in six digits has
// condition (|x| + |y|)/|x - y| ~ 6e6, so rounding the inputs costs about
// that many ulps, while float64's subtraction itself is exact (Sterbenz's
// lemma: y/2 <= x <= 2y, common practice). The input error is checked
// against the difference of the rounded decimals in math/big. A nearly
// singular matrix with decimal entries: the determinant of the rounded
// entries, in math/big, gives the input error, whether the determinant is
// asked as det(M) or M.det().
func TestFloatAuditIllConditionedInputs(t *testing.T) {
	got := auditOf(t, `identity("difference", lambda: (frac("0.3000001") - frac("0.3"), frac(1, 10**7)))
M = matrix([[frac("0.1"), frac("0.2")], [frac("0.3"), frac("0.6000001")]])
identity("det", lambda: (det(M), frac(1, 10**8)))
identity("method", lambda: (M.det(), frac(1, 10**8)))`)
	d := got["difference"].LHS
	input, formula := split(t, "difference", d)
	if input < 4 || d.Formula.Error != "0.00e+00" || formula != 0 {
		t.Errorf("difference: %.1f digits lost to the inputs (want >= 4), formula error %s (want 0)", input, d.Formula.Error)
	}
	want := relative(new(big.Rat).Sub(nearestRat(t, "0.3000001"), nearestRat(t, "0.3")), big.NewRat(1, 1e7))
	if e := errorOf(t, d.Input); math.Abs(e-want) > 0.01*want {
		t.Errorf("difference: input error %g, math/big says %g", e, want)
	}
	detRounded := new(big.Rat).Sub(new(big.Rat).Mul(nearestRat(t, "0.1"), nearestRat(t, "0.6000001")),
		new(big.Rat).Mul(nearestRat(t, "0.2"), nearestRat(t, "0.3")))
	want = relative(detRounded, big.NewRat(1, 1e8))
	for _, name := range []string{"det", "method"} {
		if e := errorOf(t, got[name].LHS.Input); math.Abs(e-want) > 0.01*want {
			t.Errorf("%s: input error %g, math/big says %g", name, e, want)
		}
	}
	// The rhs is a decimal input returned as it is: its only error is its
	// own rounding, well under one digit, and none of it the formula's.
	if r := got["difference"].RHS; r.Formula.Error != "0.00e+00" || r.DigitsLost > 0.5 {
		t.Errorf("rhs: %+v", r)
	}
}

// A sampled claim reports the sample where float64 lost most, with the
// split made there: here only sample 3 is a needle given by decimals.
func TestFloatAuditSampledWorst(t *testing.T) {
	got := auditOf(t, needle+`def g(k):
    if k == 3:
        return [frac("100000"), frac("99999.99979"), frac("0.00029")]
    return [frac(5 + k), frac(4 + k), frac(3 + k)]
identity("sampled", lambda x: (kahan(x[0], x[1], x[2]), area(x[0], x[1], x[2])), over=g, samples=6)`)
	f := got["sampled"]
	if f.Sample == nil || *f.Sample != 3 {
		t.Fatalf("sample %v, want 3", f.Sample)
	}
	if input, formula := split(t, "sampled", f.LHS); input < 6 || formula > 1 {
		t.Errorf("sampled: %.1f digits lost to the inputs (want >= 6), %.1f in the formula (want <= 1)", input, formula)
	}
}

// When the exact function cannot run at the rounded inputs (here a square
// root of a number that rounding made negative, where float64 gives NaN),
// the side keeps its total and says why it has no split.
func TestFloatAuditUnsplit(t *testing.T) {
	got := auditOf(t, `identity("nan", lambda: (sqrt(frac(1, 10**7) - (frac("0.3000001") - frac("0.3"))), 0))`)
	l := got["nan"].LHS
	if l.Input != nil || !strings.Contains(l.Unsplit, "raised at the rounded inputs") || l.DigitsLost < 15.9 {
		t.Errorf("lhs %+v", l)
	}
}

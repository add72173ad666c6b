package session

import (
	"strings"
	"testing"

	"assay/cells"
)

// Series printed from a notebook against standard expansions (from
// memory): sin t/t (Abramowitz & Stegun 4.3.65), the binomial series of
// √(1+t), exp (4.2.1), log(1+t) (4.1.24), cos (4.3.66); and the conventions
// toward a value (powers of t − a) and toward infinity (powers of 1/t):
// √(t² + 1) − t = 1/(2t) − 1/(8t³) + … (binomial series in 1/t²).
func TestSeriesFromNotebook(t *testing.T) {
	expectPrints(t, []printCase{
		{`print(series(lambda t: sin(t) / t))`, "1 - 1/6*t^2 + 1/120*t^4 + O(t^6)"},
		{`print(series(lambda t: sqrt(1 + t), order=4))`, "1 + 1/2*t - 1/8*t^2 + 1/16*t^3 + O(t^4)"},
		{`print(series(lambda t: exp(t), order=4))`, "1 + t + 1/2*t^2 + 1/6*t^3 + O(t^4)"},
		{`print(series(lambda t: log(1 + t), order=5))`, "t - 1/2*t^2 + 1/3*t^3 - 1/4*t^4 + O(t^5)"},
		{`print(series(lambda t: cos(t), order=5))`, "1 - 1/2*t^2 + 1/24*t^4 + O(t^5)"},
		{`print(series(lambda t: root(t**3 + t**4, 3), order=3))`, "t + 1/3*t^2 + O(t^3)"},
		{`print(series(lambda t: (t**2 - 4) / (t - 2), toward=2))`, "4 + (t - 2) + O((t - 2)^6)"},
		{`print(series(lambda t: sqrt(t**2 + 1) - t, toward=infinity, order=5))`, "1/2*t^(-1) - 1/8*t^(-3) + O(t^(-5))"},
		{`s = series(lambda t: sqrt(2 + t), order=2)
print(s.leading, s.order, s.terms()[1])`, "(sqrt(2), 0) 2 (sqrt(2)/4, 1)"},
		{`print(series(lambda t: sqrt(t + t**2), order=2))`, "t^(1/2) + 1/2*t^(3/2) + O(t^2)"},
		{`print(series(lambda t: abs(-t) + frac(1, 2) * t))`, "3/2*t + O(t^6)"},
		// arccos t = π/2 − arcsin t, arcsin t = t + t³/6 + 3t⁵/40 + …
		// (A&S 4.4.40, from memory)
		{`print(series(lambda t: acos(t), order=6))`, "1.57079632679 - t - 1/6*t^3 - 3/40*t^5 + O(t^6)"},
	})
	expectErrors(t, []errorCase{
		{`series(lambda t: exp(1 / t))`, "essential singularity"},
		{`series(lambda t: cos(1 / t))`, "cos of a series that tends to infinity"},
		{`series(lambda t: log(t))`, "log t term"},
		{`series(lambda t: sqrt(-t))`, "branch point"},
		{`series(lambda t: max(t, 1))`, "comparison of a series"},
		{`series(lambda t: float(t))`, "a float of a series"},
		{`series(lambda t: 1 if frac(1, 2) < t else 0)`, "comparison of a series"},
		{`series(lambda t: 1 if sqrt(2) < t else 0)`, "comparison of a series"},
		{`series(lambda t: 1 if t else 0)`, "the truth value of a series"},
		{`series(lambda t: [1, 2][t])`, "an index of a series"},
		{`series(lambda t: int(t))`, "an int of a series"},
		{`x = variables("x")
series(lambda t: t + x)`, "unsupported operand"},
		{`series(lambda t: t, order=65)`, "order must be an integer from 1 to 64"},
		{`series(lambda t: acos(1 - t**2))`, "acos has a branch point at ±1"},
		{`series(lambda t: acos(2 + t))`, "outside [−1, 1]"},
		{`series(lambda t: atan2(t, 1))`, "atan2() needs exact numbers or reals"},
		{`series(lambda t: t * 0.5)`, "cannot be mixed with a float64"},
		{`series(lambda t: 2 ** t)`, "exp(t * log(x))"},
		{`series(3)`, "needs a function of t"},
	})
}

// limit() proves by series what it can, and falls back to extrapolation,
// saying why, when f branches on t or uses what series lack.
func TestLimitBySeries(t *testing.T) {
	rep := runHere(t, `limit("sinc", lambda t: sin(t) / t, toward=0, expect=1, order=2)
limit("sinc wrong", lambda t: sin(t) / t, toward=0, expect=frac(101, 100))
limit("e", lambda t: exp(log(1 + t) / t), toward=0, expect=exp(1))
limit("blow-up", lambda t: 1 / (1 - cos(t)), toward=0, expect=infinity, order=2)
limit("minus infinity", lambda t: -1 / t, toward=0, expect=infinity)
limit("wrong order", lambda t: sin(t) / t, toward=0, expect=1, order=1)
limit("branches", lambda t: sin(t) / t if t > frac(1, 2**40) else 1, toward=0, expect=1, steps=20)
def sly(t):
    try:
        return 1 if t < 0 else 2
    except TypeError:
        return 1 + t
limit("catches", sly, toward=0, expect=1, steps=12)
limit("looks", lambda t: 1 + t if str(t)[0] == "t" else 2, toward=0, expect=1, steps=12)
limit("asks the type", lambda t: 1 + t if "series" in str(type(t)) else 2, toward=0, expect=1, steps=12)
limit("asks an attribute", lambda t: 1 + t if hasattr(t, "leading") else 2, toward=0, expect=1, steps=12)
def tries(t):
    try:
        t.leading
        return 1 + t
    except AttributeError:
        return 2
limit("catches its own error", tries, toward=0, expect=1, steps=12)
def squeezed(t):
    s = simplex([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, t]])
    return 1 + t if "series" in str(type(s)) else 2
limit("asks a simplex's type", squeezed, toward=0, expect=1, steps=12)
limit("oscillates", lambda t: sin(1 / t), toward=0, steps=20)
limit("series only", lambda t: sin(1 / t), toward=0, method="series")
limit("archimedes", lambda n: n * sin(pi / n), toward=infinity, expect=pi)`)
	checkClaims(t, rep.Outcomes[0], []claimWant{
		{cells.Holds, "series expansion", "1 - 1/6*t^2 + 1/120*t^4 + O(t^6): the limit is 1"},
		{cells.Fails, "series expansion", "the limit is 1"},
		// exp(1) against the expansion's exp(1): transcendental, so certified digits.
		{cells.HoldsToDigits, "series expansion", "the limit is 2.718281828"},
		{cells.Holds, "series expansion", "2*t^(-2)"},
		{cells.Fails, "series expansion", "tends to −infinity"},
		{cells.Fails, "series expansion", "the stated order 1 is false: the error is of order h^2"},
		{cells.Estimated, "", "not proved by series expansion (f raised on a series: TypeError: comparison of a series"},
		// On numbers sly is 2; on a series it would say 1 + t. The caught
		// refusal keeps the series route out, so the claim fails, rightly.
		{cells.Fails, "", "f asked for comparison of its argument"},
		// So does a look at the printed form.
		{cells.Fails, "", "f asked for the printed form of its argument"},
		// And every other way to tell a series from a number: a question
		// to type() or hasattr(), an exception caught inside f (here the
		// AttributeError a number raises and a series does not, inverted:
		// the series has .leading), the type of a simplex built on it.
		{cells.Fails, "", "f asked for the type of its argument"},
		{cells.Fails, "", "f asked for the attributes of its argument"},
		{cells.Fails, "", "f asked for the leading term of its argument"},
		{cells.Fails, "", "f asked for the type of a simplex with series coordinates"},
		{cells.Undecided, "", "not proved by series expansion (f raised on a series: ValueError: sin of a series that tends to infinity"},
		{cells.Undecided, "series expansion", "not decided by series expansion"},
		// n·sin(π/n) = π − π³/(6n²) + …: the limit π (Archimedes), transcendental.
		{cells.HoldsToDigits, "series expansion", "the limit is 3.14159265"},
	})
}

// claimWant is a claim's expected verdict, method ("" for any) and a
// part of its note.
type claimWant struct {
	verdict cells.Verdict
	method  string
	note    string
}

// checkClaims checks a cell's claims, in order, against want.
func checkClaims(t *testing.T, o cells.Outcome, want []claimWant) {
	t.Helper()
	if o.Error != nil {
		t.Fatalf("cell failed: %s", o.Error.Message)
	}
	if len(o.Claims) != len(want) {
		t.Fatalf("%d claims, want %d", len(o.Claims), len(want))
	}
	for i, c := range o.Claims {
		w := want[i]
		if c.Verdict != w.verdict || (w.method != "" && c.Method != w.method) || !strings.Contains(c.Note, w.note) {
			t.Errorf("%s: %s by %s (%s; %s), want %s by %q with %q", c.Name, c.Verdict, c.Method, c.Residual, c.Note, w.verdict, w.method, w.note)
		}
	}
}

// asymptotic(): f ~ c·t^k proved, or failing with the actual leading term.
// 1 − cos t ~ t²/2 (A&S 4.3.66, from memory); a needle's inradius
// (0,0,0), (1,0,0), (0,t,0), (0,0,t) is t/(2 + √2) + O(t²) (derived in
// exact/geom/series_test.go), checked here by the extrapolation route too.
func TestAsymptoticClaims(t *testing.T) {
	rep := runHere(t, `asymptotic("1 - cos", lambda t: 1 - cos(t), expect=(frac(1, 2), 2))
asymptotic("1 - cos wrong c", lambda t: 1 - cos(t), expect=(frac(1, 3), 2))
asymptotic("1 - cos wrong k", lambda t: 1 - cos(t), expect=(frac(1, 2), 3))
def needle(t):
    return simplex([[0, 0, 0], [1, 0, 0], [0, t, 0], [0, 0, t]])
asymptotic("needle inradius", lambda t: needle(t).inradius(), expect=(1 / (2 + sqrt(2)), 1))
limit("needle inradius / t, extrapolated", lambda t: needle(t).inradius() / t, toward=0, expect=1 / (2 + sqrt(2)), method="extrapolation")
asymptotic("decay at infinity", lambda t: 1 / (t**2 + 1), toward=infinity, expect=(1, -2))
asymptotic("branches", lambda t: t if t < 1 else 1, expect=(1, 1))
asymptotic("branches, half power", lambda t: sqrt(3 * t) if t > 0 else 0, expect=(sqrt(3), frac(1, 2)))
asymptotic("branches, wrong", lambda t: 2 * t if t < 1 else 1, expect=(1, 1))`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("cell failed: %s", o.Error.Message)
	}
	want := []cells.Verdict{cells.Holds, cells.Fails, cells.Fails, cells.Holds, cells.Estimated, cells.Holds, cells.Estimated, cells.Estimated, cells.Fails}
	for i, c := range o.Claims {
		if c.Verdict != want[i] {
			t.Errorf("%s: %s (%s; %s), want %s", c.Name, c.Verdict, c.Residual, c.Note, want[i])
		}
	}
	if c := o.Claims[2]; c.Residual != "leading term 1/2·t^2" {
		t.Errorf("wrong k: residual %q", c.Residual)
	}
	if c := o.Claims[4]; c.Digits < 10 {
		t.Errorf("needle by extrapolation: %d digits (%s)", c.Digits, c.Note)
	}
	if c := o.Claims[6]; !strings.Contains(c.Note, "the coefficient estimated instead as the limit of f(t)/h^1") || c.Kind != "asymptotic" {
		t.Errorf("branches: %s", c.Note)
	}
	expectErrors(t, []errorCase{
		{`asymptotic("x", lambda t: t, expect=1)`, "expect must be a pair (c, k)"},
		{`asymptotic("x", lambda t: t, expect=(0, 1))`, "must be non-zero"},
		{`asymptotic("x", lambda t: t, expect=(1, 0.5))`, "must be an exact rational"},
	})
}

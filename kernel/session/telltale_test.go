package session

import (
	"strings"
	"testing"

	"assay/cells"
)

// A series proof of a limit rests on f not telling a series from a
// number. Each notebook below computes f(t) = t on numbers (so the limit
// at 0 is 0) but 1 + t on the series, through one telltale: an identity
// test, text formatting with %, or state kept between calls. None may be
// "holds": the claim must leave the series route (its note says why) and
// be decided on numbers, where 1 is refuted. (Reproductions of a
// referee's forgeries, December 2026.)
func TestSeriesTelltalesLeaveTheSeriesRoute(t *testing.T) {
	forgeries := map[string]string{
		"identity":        "def f(t):\n    return t + (1 if abs(t) is t else 0)",
		"percent":         "def f(t):\n    return t + (1 if (\"%s\" % (t,)).startswith(\"t\") else 0)",
		"percent repr":    "def f(t):\n    return t + (1 if \"Series\" in (\"%r\" % (t,)) else 0)",
		"subscript store": "calls = [0]\ndef f(t):\n    calls[0] = calls[0] + 1\n    return t + (1 if calls[0] == 1 else 0)",
		"append":          "calls = []\ndef f(t):\n    calls.append(1)\n    return t + (1 if len(calls) == 1 else 0)",
		"global":          "n = 0\ndef f(t):\n    global n\n    n = n + 1\n    return t + (1 if n == 1 else 0)",
		"nonlocal":        "def counter():\n    n = 0\n    def f(t):\n        nonlocal n\n        n = n + 1\n        return t + (1 if n == 1 else 0)\n    return f\nf = counter()",
		"attribute":       "class C:\n    pass\nc = C()\nc.n = 0\ndef f(t):\n    c.n = c.n + 1\n    return t + (1 if c.n == 1 else 0)",
		"setattr":         "class C:\n    pass\nc = C()\nc.n = 0\ndef f(t):\n    setattr(c, \"n\", c.n + 1)\n    return t + (1 if c.n == 1 else 0)",
		"next":            "g = iter([1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0])\ndef f(t):\n    return t + next(g)",
		"generator loop":  "def gen():\n    yield 1\n    while True:\n        yield 0\ng = gen()\ndef f(t):\n    for k in g:\n        return t + k",
		"consumer":        "g = iter([1] + [0] * 100)\ndef f(t):\n    return t + list(zip(g, [0]))[0][0]",
	}
	for name, src := range forgeries {
		t.Run(name, func(t *testing.T) {
			rep := runHere(t, src+"\nlimit(\"f tends to 1\", f, toward=0, expect=1)")
			o := rep.Outcomes[0]
			if o.Error != nil {
				t.Fatalf("cell failed: %s", o.Error.Message)
			}
			c := o.Claims[0]
			if c.Verdict == cells.Holds || !strings.Contains(c.Note, "not proved by series expansion") {
				t.Errorf("verdict %s by %s: %s", c.Verdict, c.Method, c.Note)
			}
		})
	}
}

// A draw from the session's random stream inside f is state too: the
// draws a notebook makes are reproducible, so it could know which draw
// the series run gets. The claim leaves the series route, saying so.
func TestSeriesRandomDrawLeavesTheSeriesRoute(t *testing.T) {
	rep := runHere(t, `def f(t):
    return t + 0 * random_simplex(1).volume()
limit("f -> 0", f, toward=0, expect=0)`)
	c := rep.Outcomes[0].Claims[0]
	if c.Verdict == cells.Holds || !strings.Contains(c.Note, "random stream") {
		t.Errorf("verdict %s: %s", c.Verdict, c.Note)
	}
}

// The guard counts no telltale in plain code of one expression of t,
// whose own variables a comprehension or a lambda inside reads (a cell of
// its own, made afresh each call): such a limit is still proved by its
// series.
func TestSeriesProofSurvivesOwnCells(t *testing.T) {
	rep := runHere(t, `def f(t):
    s = 1 + t
    return sum([s * k for k in range(3)]) / 3 + (lambda: s)() - s
limit("f -> 1", f, toward=0, expect=1)`)
	c := rep.Outcomes[0].Claims[0]
	if c.Verdict != cells.Holds {
		t.Errorf("verdict %s: %s", c.Verdict, c.Note)
	}
}

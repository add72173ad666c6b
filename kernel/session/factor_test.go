package session

import (
	"strings"
	"testing"

	"assay/cells"
	"assay/kernel/claim"
)

// factor, squarefree and is_irreducible from a notebook, against
// classical factorizations: Sophie Germain's identity x⁴ + 4 =
// (x² − 2x + 2)(x² + 2x + 2), and x⁴ + 4y⁴ = (x² − 2xy + 2y²)(x² + 2xy +
// 2y²); x⁶ − 1 = Φ₁Φ₂Φ₃Φ₆ (the cyclotomic polynomials, OEIS A013595);
// Heron's 16·Area² with sides a, 5, 7, = −(a + 12)(a + 2)(a − 2)(a − 12),
// and in three sides (a+b+c)(−a+b+c)(a−b+c)(a+b−c) (handbook); x² − 2
// irreducible (√2 irrational); x² + y² irreducible over Q (from memory: its
// only factors are x ± iy).
func TestFactorFromNotebook(t *testing.T) {
	expectPrints(t, []printCase{
		{"x = variables(\"x\")\nprint(factor(x**4 + 4))", "(x^2 - 2*x + 2)·(x^2 + 2*x + 2)"},
		{"x = variables(\"x\")\nu, fs = factor(x**4 + 4)\nprint(u, fs)", "1 [(x^2 - 2*x + 2, 1), (x^2 + 2*x + 2, 1)]"},
		{"x = variables(\"x\")\nprint(factor(x**6 - 1))", "(x - 1)·(x + 1)·(x^2 - x + 1)·(x^2 + x + 1)"},
		{"a = variables(\"a\")\nb, c = 5, 7\nprint(factor(2*a**2*b**2 + 2*b**2*c**2 + 2*c**2*a**2 - a**4 - b**4 - c**4))", "-(a - 12)·(a - 2)·(a + 2)·(a + 12)"},
		{"x = variables(\"x\")\nf = factor(frac(3, 2)*(x - 1)**2*(2*x + 4))\nprint(f, f[0], f[1], len(f), f == (3, [(x - 1, 2), (x + 2, 1)]))", "3·(x - 1)^2·(x + 2) 3 [(x - 1, 2), (x + 2, 1)] 2 True"},
		{"print(factor(0), factor(frac(-5, 3)), factor(0) == (0, []))", "0 -5/3 True"},
		{"x, y = variables(\"x y\")\nprint(factor(x**4 + 4*y**4))", "(x^2 - 2*x*y + 2*y^2)·(x^2 + 2*x*y + 2*y^2)"},
		{"a, b, c = variables(\"a b c\")\nshow(factor(2*a**2*b**2 + 2*b**2*c**2 + 2*c**2*a**2 - a**4 - b**4 - c**4), label=\"16·area²\")", "16·area² = -(a - b - c)·(a - b + c)·(a + b - c)·(a + b + c)"},
		{"x, y = variables(\"x y\")\nprint(factor(6*x**3*y - 6*x*y**3))", "6·(x - y)·x·(x + y)·y"},
		{"x = variables(\"x\")\nprint((x**2 - 2).is_irreducible(), (x**2 - 4).is_irreducible(), (x**2 + 2*x + 1).is_irreducible())", "True False False"},
		{"x, y = variables(\"x y\")\nprint((x**2 + y**2).is_irreducible(), (x**2 - y**2).is_irreducible(), polynomial(\"3\").is_irreducible())", "True False False"},
		{"x, y = variables(\"x y\")\nprint((-3*(x - y)**2*(x + y)*x**3).squarefree())", "[(x + y, 1), (x - y, 2), (x, 3)]"},
		{"x, y = variables(\"x y\")\nprint(((x*y - 1)**2*(x + 1)**2*y).squarefree())", "[(y, 1), (x^2*y + x*y - x - 1, 2)]"},
	})
}

// factorization(name, p) with no list finds and states the
// factorization; x⁴ − 1 = (x − 1)(x + 1)(x² + 1) (Φ₁Φ₂Φ₄, A013595).
func TestFactorizationWithoutList(t *testing.T) {
	rep := runHere(t, "x = variables(\"x\")\n"+
		"factorization(\"x^4 - 1\", 2*x**4 - 2)\n"+
		"factorization(\"a constant\", 7)")
	claims := rep.Outcomes[0].Claims
	if len(claims) != 2 {
		t.Fatalf("got %d claims: %+v", len(claims), rep.Outcomes[0])
	}
	c := claims[0]
	if c.Verdict != cells.Holds || c.Residual != "0" || c.Method != claim.PolyMethod {
		t.Errorf("%s %q %q", c.Verdict, c.Residual, c.Method)
	}
	for _, w := range []string{"2·(x - 1)·(x + 1)·(x^2 + 1)", "irreducible over Q", "u = 2", "established by the algorithm"} {
		if !strings.Contains(c.Note, w) {
			t.Errorf("note %q lacks %q", c.Note, w)
		}
	}
	if claims[1].Verdict != cells.Holds || !strings.Contains(claims[1].Note, "constant") {
		t.Errorf("constant: %s %q", claims[1].Verdict, claims[1].Note)
	}
}

func TestFactorErrors(t *testing.T) {
	expectErrors(t, []errorCase{
		{"factor(\"x^2\")", "factor() needs a polynomial"},
		{"factor(0.5)", "float64"},
		{"factorization(\"f\", 0)", "p is 0"},
	})
}

// A factorization with a list that holds but whose factor x² − 1 splits
// further, (x − 1)(x + 1) (difference of squares), says so in the note;
// so for a factor in two variables, x² − y² = (x − y)(x + y), while
// x² + y² (irreducible over Q, from memory) is not named.
func TestFactorizationNamesReducibleFactor(t *testing.T) {
	rep := runHere(t, "x, y = variables(\"x y\")\n"+
		"factorization(\"f\", (x**2 - 1)*(x**2 + 1), [x**2 - 1, x**2 + 1])\n"+
		"factorization(\"g\", (x**2 + 1)*(x - y), [x**2 + 1, x - y])\n"+
		"factorization(\"h\", (x**4 - y**4)*(x + 1), [x**2 - y**2, x**2 + y**2, x + 1])")
	claims := rep.Outcomes[0].Claims
	if len(claims) != 3 || claims[0].Verdict != cells.Holds || claims[1].Verdict != cells.Holds || claims[2].Verdict != cells.Holds {
		t.Fatalf("claims: %+v", claims)
	}
	if !strings.Contains(claims[0].Note, "not every factor is irreducible over Q: x^2 - 1 = (x - 1)·(x + 1)") || strings.Contains(claims[0].Note, "x^2 + 1 =") {
		t.Errorf("note %q", claims[0].Note)
	}
	if strings.Contains(claims[1].Note, "irreducible") {
		t.Errorf("note %q", claims[1].Note)
	}
	if !strings.Contains(claims[2].Note, "not every factor is irreducible over Q: x^2 - y^2 = (x - y)·(x + y)") || strings.Contains(claims[2].Note, "x^2 + y^2 =") {
		t.Errorf("note %q", claims[2].Note)
	}
}

// factorization(name, p) with no list, in three variables: the 3×3
// circulant determinant a³ + b³ + c³ − 3abc = (a + b + c)(a² + b² + c² −
// ab − bc − ca) (from memory; the eigenvalues a + bω + cω²).
func TestFactorizationWithoutListMultivariate(t *testing.T) {
	rep := runHere(t, "a, b, c = variables(\"a b c\")\n"+
		"factorization(\"circulant\", det(matrix([[a, b, c], [c, a, b], [b, c, a]])))")
	c := rep.Outcomes[0].Claims[0]
	if c.Verdict != cells.Holds || c.Residual != "0" {
		t.Fatalf("%s %q %q", c.Verdict, c.Residual, c.Note)
	}
	for _, w := range []string{"(a + b + c)·(a^2 - a*b - a*c + b^2 - b*c + c^2)", "Hensel lifting, Wang", "u = 1"} {
		if !strings.Contains(c.Note, w) {
			t.Errorf("note %q lacks %q", c.Note, w)
		}
	}
}

// stageRecorder is a coordinator that computes every sample itself and
// records the stages passed to it.
type stageRecorder struct {
	solo
	stages []string
}

func (r *stageRecorder) Progress(p claim.Progress) {
	if p.Claim == "" {
		r.stages = append(r.stages, p.Stage)
	}
}

// A factorization passes its stage to the driver (the first at once,
// then at most every StageEvery) and clears it when it returns, so that a
// time limit names what was running and nothing after it.
func TestFactorPassesStages(t *testing.T) {
	sess, err := New(DefaultSettings)
	if err != nil {
		t.Fatal(err)
	}
	defer sess.Close()
	rec := &stageRecorder{}
	sess.SetCoordinator(rec)
	out := sess.Run(Cell{Index: 1, Line: 1, Source: "x, y = variables(\"x y\")\nf = factor(x**4 + 4*y**4)"})
	if out.Status == cells.Failed {
		t.Fatalf("%+v", out.Error)
	}
	if len(rec.stages) < 2 || rec.stages[0] == "" || rec.stages[len(rec.stages)-1] != "" {
		t.Errorf("stages %q: want a stage first and the empty stage last", rec.stages)
	}
}

package session

import (
	"fmt"
	"slices"
	"strings"
	"testing"

	"assay/cells"
	"assay/kernel/claim"
)

// notebook builds a notebook from cell sources, each in its own fence.
func notebook(t *testing.T, srcs ...string) *cells.Notebook {
	t.Helper()
	var b strings.Builder
	b.WriteString("# test\n")
	for _, s := range srcs {
		b.WriteString("\n```cell\n" + s + "\n```\n")
	}
	nb, err := cells.Parse("test.md", []byte(b.String()))
	if err != nil {
		t.Fatalf("parse: %v", err)
	}
	return nb
}

// runHere runs cells in one session with the default settings.
func runHere(t *testing.T, srcs ...string) *cells.Report {
	t.Helper()
	return runWith(t, DefaultSettings, srcs...)
}

// runWith runs cells top to bottom in one session, as a notebook run does,
// stopping at the first cell that fails.
func runWith(t *testing.T, s Settings, srcs ...string) *cells.Report {
	t.Helper()
	nb := notebook(t, srcs...)
	sess, err := New(s)
	if err != nil {
		t.Fatal(err)
	}
	defer sess.Close()
	rep := &cells.Report{Notebook: nb, Seed: s.Seed, Precision: s.Precision}
	list := nb.Cells()
	for _, b := range list {
		rep.Outcomes = append(rep.Outcomes, cells.Outcome{Cell: b.Index, Status: cells.NotRun})
	}
	for i, b := range list {
		rep.Outcomes[i] = sess.Run(Cell{Index: b.Index, Line: b.Line, Source: b.Text, Options: b.Options})
		rep.Seed, rep.Precision = sess.Settings().Seed, sess.Settings().Precision
		if rep.Outcomes[i].Status == cells.Failed {
			break
		}
	}
	return rep
}

func output(t *testing.T, rep *cells.Report, cell int) string {
	t.Helper()
	o := rep.Outcomes[cell-1]
	if o.Error != nil {
		t.Fatalf("cell %d failed at line %d: %s", cell, o.Error.Line, o.Error.Message)
	}
	return o.Output
}

// printCase is a cell and what it must print.
type printCase struct{ src, want string }

// expectPrints runs each cell alone and compares what it printed.
func expectPrints(t *testing.T, cases []printCase) {
	t.Helper()
	for _, c := range cases {
		rep := runHere(t, c.src)
		if got := strings.TrimSpace(output(t, rep, 1)); got != c.want {
			t.Errorf("%q printed %q, want %q", c.src, got, c.want)
		}
	}
}

// errorCase is a cell that must fail with a message containing want.
type errorCase struct{ src, want string }

// expectErrors runs each cell alone: it must fail with a clear Python
// exception, never an internal error (a Go panic).
func expectErrors(t *testing.T, cases []errorCase) {
	t.Helper()
	for _, c := range cases {
		o := runHere(t, c.src).Outcomes[0]
		if o.Error == nil {
			t.Errorf("%q: no error", c.src)
			continue
		}
		if !strings.Contains(o.Error.Message, c.want) || strings.Contains(o.Error.Message, "internal error") {
			t.Errorf("%q: %q, want it to mention %q", c.src, o.Error.Message, c.want)
		}
	}
}

func TestExactArithmetic(t *testing.T) {
	cases := []printCase{
		{"print(1/3)", "1/3"},
		{"print(1/3 + 1/6)", "1/2"},
		{"print(2**-3)", "1/8"},
		{"x = 6\nx /= 4\nprint(x)", "3/2"},
		{"print(frac(3, 4) * 4)", "3"},
		{`print(frac("-3/4"))`, "-3/4"},
		{`print(frac("1.0005"))`, "2001/2000"},
		{`print(frac("2e-7"))`, "1/5000000"},
		// IEEE 754: the double nearest 0.1 is 3602879701896397 / 2^55 (standard fact).
		{"print(frac(0.1))", "3602879701896397/36028797018963968"},
		{"print(frac(3, 4).num, frac(3, 4).den)", "3 4"},
		{"print(frac(1, 3) < frac(1, 2), frac(2, 4) == frac(1, 2), 1 == frac(2, 2))", "True True True"},
		{"print(float(frac(1, 4)), frac(1, 4).float())", "0.25 0.25"},
		{"print(1 / frac(1, 3))", "3"},
		{"print(frac(1, 2) + 0.25)", "0.75"},
		{"print(frac(2, 3) ** 2, frac(2, 3) ** -2)", "4/9 9/4"},
		{"print(2**100 / 2**98)", "4"},
		{"print(int(frac(-7, 2)))", "-3"},
		{"print([1, 2, 3][frac(4, 2)])", "3"},
	}
	expectPrints(t, cases)
}

// TestClosures keeps the five closure cases that gpython v0.2.0 compiled
// wrongly (fixed upstream in the version go.mod names). The expected values
// are what the Python language reference's execution model (naming and
// binding, closures) prescribes.
func TestClosures(t *testing.T) {
	expectPrints(t, []printCase{
		// a free variable in a code object that also has cells
		{"def f(n):\n    m = n\n    return [[i * 10 + j for j in range(m)] for i in range(n)]\nprint(f(2))", "[[0, 1], [10, 11]]"},
		// a parameter captured by a comprehension
		{"def f(n):\n    return [[i + j for j in range(n)] for i in range(n)]\nprint(f(2))", "[[0, 1], [1, 2]]"},
		// a parameter captured by a closure
		{"def adder(x):\n    return lambda y: x + y\nprint(adder(3)(4))", "7"},
		// a closure that is itself closed over
		{"def outer(a):\n    def middle(b):\n        return [a + b + k for k in range(2)]\n    return middle(10)\nprint(outer(100))", "[110, 111]"},
		// keyword-only and star arguments captured
		{"def f(*xs, scale=2):\n    return [scale * x for x in xs]\nprint(f(1, 2))", "[2, 4]"},
	})
}

func TestMatrices(t *testing.T) {
	cases := []printCase{
		{"print(det(matrix([[1, 2], [3, 4]])))", "-2"},
		{"M = matrix([[2, 0], [0, frac(1, 2)]])\nprint(M.det(), M.rank(), M.inverse()[1, 1])", "1 2 2"},
		{"print(matrix([[1, 2], [3, 4]]) * matrix([[0, 1], [1, 0]]) == matrix([[2, 1], [4, 3]]))", "True"},
		{"print(matrix([[1, 2], [3, 4]]).solve([5, 6]))", "[-4, 9/2]"},
		{"print(matrix([[1, 2], [2, 4]]).nullspace())", "[[-2, 1]]"},
		{"print(unit_matrix(3).det(), (2 * unit_matrix(2)).det())", "1 4"},
		{"print(matrix([[1, 2, 3], [4, 5, 6], [7, 8, 10]]).minor([0, 1], [0, 1]))", "-3"},
		{"print(matrix([[1, 2], [3, 4]]).transpose()[0])", "[1, 3]"},
		{"print(matrix([[1, 1], [0, 1]]) ** 5 == matrix([[1, 5], [0, 1]]))", "True"},
		{"print(abs(matrix([[1, 2], [3, 4]]).to_float().det() + 2) < 1e-15)", "True"},
		{"x = matrix([[2, 1], [1, 3]]).to_float().solve([3, 5])\nprint(abs(x[0] - 0.8) < 1e-15, abs(x[1] - 1.4) < 1e-15)", "True True"},
		// Regression for the interpreter's closure indexing (kernel/pycompile):
		// free variables of a code object that also has cells.
		{"def a(n):\n    return [[i + j for j in range(n)] for i in range(n)]\nprint(a(2))", "[[0, 1], [1, 2]]"},
		{"def b(n):\n    m = n\n    return [[i * m + j for j in range(m)] for i in range(n)]\nprint(b(2))", "[[0, 1], [2, 3]]"},
		{"def c(x):\n    def g(y):\n        return [x + y + k for k in range(2)]\n    return g(10)\nprint(c(100))", "[110, 111]"},
		{"def d(n):\n    def inc():\n        return [n + i for i in range(1)][0]\n    return inc()\nprint(d(5))", "5"},
		{"show(matrix([[1, frac(-1, 2)], [10, 3]]), label=\"M\")", "M =\n[  1 -1/2 ]\n[ 10    3 ]"},
	}
	expectPrints(t, cases)
}

// Reference values: 1/det(H_n) for the Hilbert matrix is OEIS A005249
// (1, 12, 2160, 6048000, 266716800000, …); the Vandermonde determinant is
// the product of differences (standard formula).
func TestIdentityClaimsFromNotebook(t *testing.T) {
	rep := runHere(t,
		"def hilbert(n):\n    return matrix([[frac(1, i + j + 1) for j in range(n)] for i in range(n)])",
		"identity(\"Hilbert 5 (OEIS A005249)\", 1 / det(hilbert(5)), 266716800000)\n"+
			"xs = [frac(-1, 2), 0, frac(2, 3), 3]\n"+
			"V = matrix([[x**k for k in range(4)] for x in xs])\n"+
			"prod = 1\n"+
			"for j in range(4):\n"+
			"    for i in range(j):\n"+
			"        prod = prod * (xs[j] - xs[i])\n"+
			"identity(\"Vandermonde product formula\", det(V), prod)\n"+
			"identity(\"a deliberately wrong claim\", det(V), prod + frac(1, 7))",
		"identity(\"det is multiplicative\", lambda M: (det(M * M), det(M) ** 2), over=lambda k: random_matrix(3, 3, seed=k), samples=20)",
	)
	claims := append(rep.Outcomes[1].Claims, rep.Outcomes[2].Claims...)
	if len(claims) != 4 {
		t.Fatalf("got %d claims, want 4: %+v", len(claims), rep.Outcomes)
	}
	want := []struct {
		verdict  cells.Verdict
		residual string
		line     int
	}{
		{cells.Holds, "0", 9},
		{cells.Holds, "0", 16},
		{cells.Fails, "-1/7", 17},
		{cells.Holds, "0", 21},
	}
	for i, w := range want {
		c := claims[i]
		if c.Verdict != w.verdict || c.Residual != w.residual || c.Line != w.line {
			t.Errorf("claim %q: verdict %s residual %s line %d, want %s %s line %d", c.Name, c.Verdict, c.Residual, c.Line, w.verdict, w.residual, w.line)
		}
	}
	if claims[3].Samples != 20 {
		t.Errorf("sampled claim reports %d samples", claims[3].Samples)
	}
}

func TestClaimLineInsideFunctionAndLoop(t *testing.T) {
	rep := runHere(t, "def check(k):\n    identity(\"square %d\" % k, (k + 1) ** 2, k * k + 2 * k + 1)\nfor k in range(3):\n    check(k)")
	for _, c := range rep.Outcomes[0].Claims {
		if c.Line != 5 || c.Verdict != cells.Holds {
			t.Errorf("claim %q at line %d verdict %s, want line 5, holds", c.Name, c.Line, c.Verdict)
		}
	}
}

func TestFailingSampleIsReported(t *testing.T) {
	rep := runHere(t, "identity(\"odd squares\", lambda n: (n * n % 2, 1), over=lambda k: 2 * k + 1 + (k == 3), samples=5)")
	c := rep.Outcomes[0].Claims[0]
	if c.Verdict != cells.Fails || !strings.HasPrefix(c.Worst, "sample 3: 8") {
		t.Errorf("got verdict %s worst %q, want fails at sample 3 (value 8)", c.Verdict, c.Worst)
	}
}

// Each bad input gives one clear message with the notebook line.
func TestCellErrors(t *testing.T) {
	cases := []struct {
		src  string
		line int // notebook line; cells start at line 4
		want string
	}{
		{"x = 1\ny = (", 5, "SyntaxError"},
		{"x = 1\nprint(undefined_name)", 5, "NameError"},
		{"x = frac(1, 3)\ny = x / 0", 5, "ZeroDivisionError: division by zero: 1/3 / 0"},
		{"frac(1, 0)", 4, "ZeroDivisionError"},
		{"det(matrix([[1, 2, 3], [4, 5, 6]]))", 4, "2x3"},
		{"matrix([[1, 2], [2, 4]]).inverse()", 4, "singular"},
		{"open(\"x\")", 4, "PermissionError: open() is not available"},
		{"import os", 4, "ImportError: module \"os\" is not available"},
		{"exit(0)", 4, "PermissionError: exit() is not available"},
		{"quit()", 4, "PermissionError: quit() is not available"},
		{"input()", 4, "NameError"},
		{"import glob", 4, "not available"},
		{"identity(\"float\", 0.1 + 0.2, frac(3, 10))", 4, "float64"},
		{"identity(\"a\", 1, 1)\nidentity(\"a\", 2, 2)", 5, "already used at line 4"},
		{"matrix([[1, 2], [3]])", 4, "row 1"},
		{"frac(\"1/2/3\")", 4, "ValueError"},
		{"def f():\n    return 1 / 0\nf()", 5, "called from line 6"},
		{"matrix([[1, 2], [3, 4]])[2, 0]", 4, "IndexError"},
	}
	for _, c := range cases {
		rep := runHere(t, c.src)
		o := rep.Outcomes[0]
		if o.Error == nil {
			t.Errorf("%q: no error", c.src)
			continue
		}
		if o.Error.Line != c.line || !strings.Contains(o.Error.Message, c.want) {
			t.Errorf("%q: error at line %d %q, want line %d containing %q", c.src, o.Error.Line, o.Error.Message, c.line, c.want)
		}
	}
}

func TestSetupAndFlags(t *testing.T) {
	rep := runHere(t, "setup(precision=512, seed=9)")
	if rep.Seed != 9 || rep.Precision != 512 {
		t.Errorf("setup gave seed %d precision %d", rep.Seed, rep.Precision)
	}
	rep = runWith(t, Settings{Seed: 3, Precision: 128, SeedFixed: true, PrecisionFixed: true}, "setup(precision=512, seed=9)")
	if rep.Seed != 3 || rep.Precision != 128 {
		t.Errorf("flags should win over setup: seed %d precision %d", rep.Seed, rep.Precision)
	}
}

func TestRandomIsReproducible(t *testing.T) {
	src := "show(random_matrix(2, 2, bound=100, denom=9))\nshow(random_matrix(2, 2, seed=4))"
	a, b := runHere(t, src), runHere(t, src)
	if output(t, a, 1) != output(t, b, 1) {
		t.Errorf("reruns differ:\n%s\n%s", output(t, a, 1), output(t, b, 1))
	}
	c := runWith(t, Settings{Seed: 2, Precision: 256}, src)
	if output(t, c, 1) == output(t, a, 1) {
		t.Errorf("a different seed gave the same draws")
	}
}

func TestTablesAndPrint(t *testing.T) {
	rep := runHere(t, "table([[1, frac(1, 2)], [2, frac(1, 3)]], header=[\"n\", \"1/(n+1)\"])\nprint(\"a\", \"b\", sep=\"-\")\nimport sys\nsys.stdout.write(\"w\\n\")")
	o := rep.Outcomes[0]
	if len(o.Tables) != 1 || o.Tables[0].Rows[1][1] != "1/3" || o.Tables[0].Header[1] != "1/(n+1)" {
		t.Errorf("table: %+v", o.Tables)
	}
	if o.Output != "a-b\nw\n" {
		t.Errorf("output %q", o.Output)
	}
}

// Builtins called the wrong way raise a Python exception with a message,
// never a Go panic (which would read "internal error").
func TestBuiltinsRejectBadArguments(t *testing.T) {
	cases := []errorCase{
		{`matrix("abc")`, "TypeError"},
		{`matrix([[1, 2], [3, "x"]])`, "matrix entry [1, 1] is a str"},
		{`matrix([[1, 0.5]])`, "float64"},
		{`matrix([])`, "at least one row"},
		{`det(5)`, "TypeError"},
		{`frac(None)`, "TypeError"},
		{`frac("1e999999999")`, "ValueError"},
		{`frac(float("nan"))`, "ValueError"},
		{`identity(1, 2, 3)`, "name must be a string"},
		{`identity("x", lambda: 5)`, "pair (lhs, rhs)"},
		{`identity("x", 1)`, "missing rhs"},
		{`identity("x", "a", "a")`, "exact numbers"},
		{`identity("x", matrix([[1]]), matrix([[1, 2]]))`, "ValueError"},
		{`identity("x", [1, 2], [1])`, "different lengths"},
		{`identity("x", lambda s: (s, s), over=lambda k: k, samples=0)`, "samples must be between"},
		{`identity("x", lambda s: (s, s), over=lambda k: 1 / 0, samples=3)`, "ZeroDivisionError"},
		{`identity("x", 1, 1, bogus=2)`, "no argument \"bogus\""},
		{`table(5)`, "must be a list"},
		{`table([[1, 2], [3]])`, "row 1 has 1 entries"},
		{`show()`, "missing its argument"},
		{`random_matrix(0, 0)`, "ValueError"},
		{`unit_matrix(-1)`, "ValueError"},
		{`matrix([[1, 2], [3, 4]])[1, 2, 3]`, "[row, column]"},
		{`matrix([[1, 2], [3, 4]]) ** frac(1, 2)`, "integer exponent"},
		{`matrix([[1, 2], [3, 4]]) * "x"`, "TypeError"},
		{`frac(1, 2) ** frac(1, 2)`, "integer exponent"},
		{`frac(2) ** (2 ** 40)`, "too large"},
		{`0 ** -1`, "ZeroDivisionError"},
		{`setup(precision=1)`, "at least 2 bits"},
		{`print("x", file=None)`, "PermissionError"},
		{`matrix([[1, 2], [3, 4]]).solve([1, 2, 3])`, "ValueError"},
		{`matrix([[1, 2], [3, 4]]).minor([0], [0, 1])`, "ValueError"},
		{`matrix([[1, 2], [3, 4]]).submatrix([0, 5], [0])`, "ValueError"},
		{`matrix([[1, 2], [2, 4]]).to_float().solve([1, 2])`, "singular"},
		{`simplex([[0], [3]]).volume_sq(2)`, "takes at most 0 arguments"},
		{`simplex([[0], [3]]).volume_sq(scale=2)`, "volume_sq() takes no keyword arguments"},
		{`frac(9, 4) / 0`, "division by zero: 9/4 / 0"},
	}
	expectErrors(t, cases)
}

func TestPolynomials(t *testing.T) {
	cases := []printCase{
		{"a, b = variables(\"a b\")\nprint((a + b) ** 2)", "a^2 + 2*a*b + b^2"},
		{"a, b = variables(\"a b\")\nprint(polynomial(\"2*a^2*b - b\") == 2*a**2*b - b)", "True"},
		{"a, b = variables(\"a b\")\np = (a + 2*b) ** 3\nprint(p.at(a=1, b=frac(1, 2)), p.at(b=0))", "8 a^3"},
		{"a, b = variables(\"a b\")\nprint((a**2 * b).derivative(\"a\"), (a**3 * b**2 + b).degree(), (a**3 * b**2).degree(\"b\"))", "2*a*b 5 2"},
		{"a, b = variables(\"a b\")\nprint((a + b).substitute(a=b - 1))", "2*b - 1"},
		{"a, b = variables(\"a b\")\nprint(len(a + b + 1), (a + b).terms())", "3 [(1, {'a': 1}), (1, {'b': 1})]"},
		{"a, b = variables(\"a b\")\nprint((3*a**2*b + a).coefficient(a=2, b=1), (3*a**2*b + a).coefficient(a**2*b))", "3 3"},
		{"a, b = variables(\"a b\")\nprint((a**2 - b**2).divide(a - b))", "a + b"},
		{"a, b = variables(\"a b\")\nprint((a + b) / 2, 1 / 2 * a)", "1/2*a + 1/2*b 1/2*a"},
		{"a = variables(\"a\")\nprint(gcd(a**2 - 1, a**2 + 2*a + 1))", "a + 1"},
		{"a, b = variables(\"a b\")\nprint((a*b + a).is_homogeneous(), (a*b + a**2).is_homogeneous())", "False True"},
		{"a, b = variables(\"a b\")\nprint((6*a + 4*b).content(), (6*a + 4*b).primitive_part())", "2 3*a + 2*b"},
		{"a, b = variables(\"a b\")\nM = matrix([[a, b], [b, a]])\nprint(det(M), M.at(a=2, b=1).det())", "a^2 - b^2 3"},
		{"a = variables(\"a\")\nprint(matrix([[1, 2], [3, 4]]).characteristic_polynomial(\"t\"))", "t^2 - 5*t - 2"},
	}
	expectPrints(t, cases)
}

func TestPolynomialClaims(t *testing.T) {
	rep := runHere(t, "a, b = variables(\"a b\")\n"+
		"identity(\"square of a sum\", (a + b)**2, a**2 + 2*a*b + b**2)\n"+
		"identity(\"a wrong square\", (a + b)**2, a**2 + b**2)\n"+
		"factorization(\"difference of squares\", 3*a**2 - 3*b**2, [a - b, a + b])\n"+
		"factorization(\"a cube\", a**3 + 3*a**2*b + 3*a*b**2 + b**3, [(a + b, 3)])\n"+
		"factorization(\"a wrong factorization\", a**2 + b**2, [a + b, a - b])")
	want := []struct {
		verdict  cells.Verdict
		residual string
	}{
		{cells.Holds, "0"}, {cells.Fails, "2*a*b"}, {cells.Holds, "0"}, {cells.Holds, "0"}, {cells.Fails, "2*b^2"},
	}
	claims := rep.Outcomes[0].Claims
	if len(claims) != len(want) {
		t.Fatalf("got %d claims: %+v", len(claims), rep.Outcomes[0])
	}
	for i, w := range want {
		if claims[i].Verdict != w.verdict || claims[i].Residual != w.residual || claims[i].Method != claim.PolyMethod {
			t.Errorf("claim %q: %s %q %q", claims[i].Name, claims[i].Verdict, claims[i].Residual, claims[i].Method)
		}
	}
	if !strings.Contains(claims[2].Note, "u = 3") || !strings.Contains(claims[0].Note, "proof") {
		t.Errorf("notes: %q / %q", claims[2].Note, claims[0].Note)
	}
}

func TestPolynomialErrors(t *testing.T) {
	cases := []errorCase{
		{"a = variables(\"a\")\n(a - a) ** -1", "negative power"},
		{"a = variables(\"a\")\na ** (2 ** 30)", "too large"},
		{"a = variables(\"a\")\na ** frac(1, 2)", "integer exponent"},
		{"a = variables(\"a\")\na.divide(a - a)", "ZeroDivisionError"},
		{"a, b = variables(\"a b\")\n(a**2 + 1).divide(a + b)", "remainder"},
		{"a = variables(\"a\")\na / (a - a)", "ZeroDivisionError"},
		{"a = variables(\"a\")\n1 / (a - a)", "ZeroDivisionError"},
		{"a = variables(\"a\")\na + 0.5", "float64"},
		{"a = variables(\"a\")\na.at(a=0.5)", "float64"},
		{"polynomial(\"2*a^\")", "column"},
		{"polynomial(\"a + * b\")", "column"},
		{"variables(\"1x\")", "ValueError"},
		{"a = variables(\"a\")\na.derivative(\"zz\")", "no variable \"zz\""},
		{"a, b = variables(\"a b\")\nmatrix([[a, b], [b, a]]).rank()", "polynomial entries"},
		{"a = variables(\"a\")\nidentity(\"f\", a, 0.5)", "float64"},
		{"a = variables(\"a\")\nfactorization(\"f\", a, [0.5])", "float64"},
	}
	expectErrors(t, cases)
}

func TestTermCap(t *testing.T) {
	rep := runWith(t, Settings{Seed: 1, Precision: 256, MaxTerms: 1000}, "a, b, c = variables(\"a b c\")\np = (1 + a + b + c) ** 40")
	o := rep.Outcomes[0]
	if o.Error == nil || !strings.Contains(o.Error.Message, "1000") || !strings.Contains(o.Error.Message, "--max-terms") || o.Error.Line != 5 {
		t.Fatalf("term cap: %+v", o.Error)
	}
}

func TestRealsAndGeometry(t *testing.T) {
	expectPrints(t, []printCase{
		// sqrt(2) = 1.41421356237309504880… (OEIS A002193, from memory)
		{"print(digits(sqrt(2), 20))", "1.4142135623730950488"},
		// An algebraic real prints its closed form (exact.ClosedForm).
		{"print(sqrt(2), sqrt(8), sqrt(frac(1, 3)), sqrt(2) + 1)", "sqrt(2) 2*sqrt(2) sqrt(3)/3 1 + sqrt(2)"},
		{"print(digits(pi, 10), sqrt(frac(9, 4)), root(-27, 3))", "3.141592653 3/2 -3"},
		{"print(sqrt(2) < frac(3, 2), sqrt(2) > frac(141, 100), float(sqrt(2)) == 2 ** 0.5)", "True True True"},
		{"lo, hi = sqrt(2).enclosure(40)\nprint(lo < sqrt(2), sqrt(2) < hi, hi - lo <= frac(1, 2 ** 40))", "True True True"},
		{"print(1 / sqrt(4), sqrt(2) * sqrt(8), str(8 * sin(pi / 6))[:32])", "1/2 4 4.0000000000000000000 (within 1e"},
		// √(sin π) is the root of an exact zero no enclosure clears (sin π
		// is not algebraic): printing says why instead of naming a cap it
		// did not use. √(√2·√2 − 2) is the root of an algebraic zero,
		// which its zero bound proves.
		{"print(sqrt(sin(pi)))", "<real with no enclosure for printing: root of degree 2: argument not separated from 0 at 8192 bits>"},
		{"print(sqrt(sqrt(2) * sqrt(2) - 2), sqrt(2) - sqrt(2))", "0 0"},
		// Comparisons of algebraic reals are decided exactly (√2·√2 = 2,
		// √2·√3 = √6, from memory).
		{"print(sqrt(2) * sqrt(2) == 2, sqrt(2) == sqrt(2), sqrt(2) * sqrt(3) != sqrt(6), sqrt(2) * sqrt(3) <= sqrt(6))", "True True False True"},
		{"s = simplex([[0, 0], [4, 0], [0, 3]])\nprint(s.volume(), s.inradius(), s.circumradius_sq(), s.sq_edges())", "6 1 25/4 [16, 9, 25]"},
		{"print(wedge([1, 0, 0], [0, 1, 0]) * 3, wedge([1, 2], [3, 4]).components())", "3*e1^e2 [((0, 1), -2)]"},
		{"print(cayley_menger(matrix([[0, 1, 1], [1, 0, 1], [1, 1, 0]])), volume_sq(matrix([[0, 4], [4, 0]])))", "-3 4"},
		{"x, y, z = variables(\"x y z\")\nprint(volume_sq(matrix([[0, z, y], [z, 0, x], [y, x, 0]])))", "-1/16*x^2 + 1/8*x*y + 1/8*x*z - 1/16*y^2 + 1/8*y*z - 1/16*z^2"},
		{"print(embeddable(matrix([[0, 1, 9], [1, 0, 1], [9, 1, 0]]), 2)[0], sliver(frac(1, 10)).is_degenerate())", "False False"},
	})
	expectErrors(t, []errorCase{
		{"exp(1) * exp(1) == exp(2)", "cannot decide"},
		{"1 / (sqrt(2) * sqrt(3) - sqrt(6))", "exactly zero"},
		{"sqrt(2) + 0.5", "float64"},
		{"sqrt(0.5)", "float64"},
		{"digits(sqrt(2), 0)", "1 <= n"},
		{"simplex([[0, 0], [1, 0]]).dihedral_cos(0, 0)", "two different vertex indices"},
		{"distance_simplex(matrix([[0, 1], [1, 0]])).facet_area_vectors()", "algebraic coordinates"},
	})
}

// A claim over a polynomial or a simplex has no float64 companion; the
// report says so instead of inventing one.
func TestFloatAuditSkipsWithoutCompanion(t *testing.T) {
	rep := runHere(t, "s = simplex([[0, 0], [3, 0], [0, 4]])\nidentity(\"area\", lambda: (s.volume_sq(), 36))")
	c := rep.Outcomes[0].Claims[0]
	if c.Float != nil || !strings.Contains(c.Note, "no float64 companion") {
		t.Errorf("float %+v note %q", c.Float, c.Note)
	}
}

// Limits: classical values and orders (sin(t)/t -> 1 with order 2, any
// calculus text), a wrong expectation, a blow-up, no convergence, and a
// function that raises partway.
func TestLimitClaims(t *testing.T) {
	rep := runHere(t, `limit("sinc", lambda t: sin(t) / t, method="extrapolation", toward=0, expect=1)
limit("wrong", lambda t: sin(t) / t, method="extrapolation", toward=0, expect=frac(101, 100))
limit("blow-up", lambda t: 1 / t**2, method="extrapolation", toward=0)
limit("oscillates", lambda t: sin(1 / t), method="extrapolation", toward=0, steps=20)
limit("raises", lambda t: sin(t) / t if t > frac(1, 2**10) else 1 / 0, method="extrapolation", toward=0, expect=1, steps=20)
limit("near 2", lambda t: (t**2 - 4) / (t - 2), method="extrapolation", toward=2, expect=4)`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("cell failed: %s", o.Error.Message)
	}
	// Every limit found is an estimate, never a certified "holds to digits".
	want := []cells.Verdict{cells.Estimated, cells.Fails, cells.Fails, cells.Undecided, cells.Estimated, cells.Estimated}
	for i, c := range o.Claims {
		if c.Verdict != want[i] {
			t.Errorf("%s: verdict %s (%s; %s), want %s", c.Name, c.Verdict, c.Residual, c.Note, want[i])
		}
	}
	if !strings.Contains(o.Claims[0].Note, "order ≈ 2.0") || !strings.Contains(o.Claims[0].Note, "not a certified bound") {
		t.Errorf("sinc note: %q", o.Claims[0].Note)
	}
	// A gap within the error estimate is shown as the estimate, never as
	// the (smaller) distance between the extrapolant and the expectation.
	for _, i := range []int{0, 5} {
		if !strings.HasPrefix(o.Claims[i].Residual, "gap ≲ ") {
			t.Errorf("%s residual: %q", o.Claims[i].Name, o.Claims[i].Residual)
		}
	}
	if r := o.Claims[1].Residual; r != "gap 1.000e-02" {
		t.Errorf("wrong residual: %q, want the gap 1/100", r)
	}
	if !strings.Contains(o.Claims[2].Residual, "h^−2") {
		t.Errorf("blow-up residual: %q", o.Claims[2].Residual)
	}
	if !strings.Contains(o.Claims[4].Note, "stopped early") || !strings.Contains(o.Claims[4].Note, "step 9 (t = 1/1024)") {
		t.Errorf("raises note: %q", o.Claims[4].Note)
	}
	if len(o.Tables) != 6 || len(o.Figures) < 6 {
		t.Errorf("%d tables and %d figures, want a table and figures per limit", len(o.Tables), len(o.Figures))
	}
	if o.Claims[3].Why != cells.NoConvergence {
		t.Errorf("oscillates: why %q", o.Claims[3].Why)
	}
}

// Aliasing: a walk t = r^k sees only the scales r^k. sin(π/t) is 0 at
// every t = 3^-k, and cos(2π·log t/log 2) is 1 at every t = 2^-k, though
// neither has a limit at 0 (sin(π/t) takes every value in [-1, 1] on
// each interval (1/(n+1), 1/n); the cosine is periodic in log t with
// period log 2 — both from memory). The second walk sees other scales and
// the claims are undecided, with both walks' tables.
func TestLimitAliasingIsUndecided(t *testing.T) {
	rep := runHere(t, `limit("sin(pi/t)", lambda t: sin(pi / t), toward=0, ratio=frac(1, 3))
limit("log-periodic", lambda t: cos(2*pi*log(t)/log(2)), toward=0, expect=1)`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("cell failed: %s", o.Error.Message)
	}
	for _, c := range o.Claims {
		if c.Verdict != cells.Undecided || c.Why != cells.WalksDisagree || !strings.Contains(c.Note, "disagree") {
			t.Errorf("%s: %s (why %q): %s", c.Name, c.Verdict, c.Why, c.Note)
		}
	}
	if len(o.Tables) != 2*len(o.Claims) || !strings.Contains(o.Tables[1].Header[1], "second walk") {
		t.Errorf("%d tables for %d claims, want both walks' tables", len(o.Tables), len(o.Claims))
	}
}

// Known limits still estimate correctly with two walks: sin t/t → 1 with
// error t²/6 (Taylor series, any calculus text); (1+t)^(1/t) → e =
// 2.718281828459045… (OEIS A001113; from memory) with error −e·t/2, order
// 1 (from memory); 1/t² → infinity with growth order 2 (common practice).
// A stated order far from the estimate fails, one in between is undecided.
func TestLimitEstimatesAndOrders(t *testing.T) {
	rep := runHere(t, `limit("sinc", lambda t: sin(t) / t, method="extrapolation", toward=0, expect=1, order=2)
limit("e", lambda t: exp(log(1 + t) / t), method="extrapolation", toward=0, order=1)
limit("blow-up", lambda t: 1 / t**2, method="extrapolation", toward=0, expect=infinity, order=2)
limit("wrong order", lambda t: 1 / t**2, method="extrapolation", toward=0, expect=infinity, order=3)
limit("order a little off", lambda t: sin(t) / t, method="extrapolation", toward=0, expect=1, order=frac(9, 4))
limit("converges, not infinity", lambda t: sin(t) / t, method="extrapolation", toward=0, expect=infinity)
limit("minus infinity", lambda t: -1 / t, method="extrapolation", toward=0, expect=infinity)`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("cell failed: %s", o.Error.Message)
	}
	want := []cells.Verdict{cells.Estimated, cells.Estimated, cells.Estimated, cells.Fails, cells.Undecided, cells.Fails, cells.Fails}
	for i, c := range o.Claims {
		if c.Verdict != want[i] {
			t.Errorf("%s: %s (%s; %s), want %s", c.Name, c.Verdict, c.Residual, c.Note, want[i])
		}
	}
	if c := o.Claims[0]; c.Digits < 30 || !strings.Contains(c.Note, "consistent") {
		t.Errorf("sinc: %d digits, %s", c.Digits, c.Note)
	}
	// e to 15 digits from memory, against the estimate's printed value.
	if c := o.Claims[1]; c.Digits < 15 || !strings.Contains(c.Note, "estimated limit 2.718281828459045") {
		t.Errorf("e: %d digits, %s", c.Digits, c.Note)
	}
	if c := o.Claims[2]; !strings.Contains(c.Residual, "h^−2") || c.Digits != 0 {
		t.Errorf("blow-up: %s, %d digits", c.Residual, c.Digits)
	}
	if c := o.Claims[3]; !strings.Contains(c.Note, "an order estimate is itself an estimate") {
		t.Errorf("wrong order: %s", c.Note)
	}
	if c := o.Claims[4]; c.Why != cells.OtherReason || !strings.Contains(c.Note, "not close enough") {
		t.Errorf("order a little off: why %q, %s", c.Why, c.Note)
	}
	expectErrors(t, []errorCase{
		{`limit("x", lambda t: t, order=-1)`, "order must be a positive exact number"},
		{`limit("x", lambda t: t, order="two")`, "order must be a positive exact number"},
		{`limit("x", lambda t: t, expect="big")`, "expect must be an exact number, a real or infinity"},
	})
}

func TestPlot(t *testing.T) {
	rep := runHere(t, `xs = [frac(1, 2**k) for k in range(1, 8)]
plot(xs, [x**2 for x in xs], title="squares", logx=True, logy=True, label="x^2")
plot(series=[(xs, [x for x in xs], "x"), (xs, [sqrt(x) for x in xs], "sqrt x")], title="two series")`)
	o := rep.Outcomes[0]
	if o.Error != nil || len(o.Figures) != 2 || o.Figures[0].Name != "squares" || !strings.Contains(o.Figures[1].SVG, "<svg") ||
		!strings.Contains(o.Figures[1].SVG, "sqrt x") {
		t.Fatalf("figures: %+v %v", o.Error, len(o.Figures))
	}
	expectErrors(t, []errorCase{
		{"plot([1, 2], [1])", "2 x values and 1 y values"},
		{"plot()", "needs xs and ys"},
		{"plot([1, 2], [1, 2], logx=1)", "True or False"},
		{"plot([0, -1], [1, 2], logx=True)", "ValueError"},
	})
}

// Inequalities: Euler's R >= 3r for tetrahedra (Euler 1765 for triangles;
// Klamkin and Tsintsifas 1979 for simplices) with equality for the regular
// one; a facet's area is below the sum of the other three (classical); a
// deliberately strengthened R >= 3.1 r is caught with an exact counterexample.
func TestInequalities(t *testing.T) {
	rep := runHere(t, `def tet(k):
    return random_simplex(3, seed=k, bound=20)
def euler(s):
    return (3 * s.inradius(), sqrt(s.circumradius_sq()))
inequality("Euler R >= 3r", euler, over=tet, samples=40)
def facets(s):
    F = [sqrt(a) for a in s.facet_areas_sq()]
    return (F[0], F[1] + F[2] + F[3])
inequality("a facet below the other three", facets, over=tet, samples=40)
regular = distance_simplex(matrix([[0, 1, 1, 1], [1, 0, 1, 1], [1, 1, 0, 1], [1, 1, 1, 0]]))
inequality("Euler equality, regular tetrahedron", 3 * regular.inradius(), sqrt(regular.circumradius_sq()))
inequality("strengthened Euler R >= 3.1 r (false)", lambda s: (frac(31, 10) * s.inradius(), sqrt(s.circumradius_sq())), over=lambda k: regular, samples=1)
inequality("exact and true", frac(1, 3), frac(1, 2))
inequality("exact and false", frac(2, 3), frac(1, 2))
inequality("x^2 <= x/2 (false from x = 1/2 on)", lambda x: (x * x, x / 2), over=lambda k: frac(k + 1, 4), samples=6)`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("cell failed: line %d: %s", o.Error.Line, o.Error.Message)
	}
	// The Euler equality case R = 3r of the regular tetrahedron (from
	// memory) has an algebraic slack, proved exactly zero by its zero
	// bound: the inequality holds with the equality proved.
	want := []cells.Verdict{cells.Holds, cells.Holds, cells.Holds, cells.Fails, cells.Holds, cells.Fails, cells.Fails}
	for i, c := range o.Claims {
		if c.Verdict != want[i] {
			t.Errorf("%s: %s (%s; %s), want %s", c.Name, c.Verdict, c.Residual, c.Note, want[i])
		}
	}
	if c := o.Claims[2]; c.Method != "exact algebraic arithmetic (zero bound)" || !strings.Contains(c.Note, "exactly zero") {
		t.Errorf("Euler equality: method %q note %q", c.Method, c.Note)
	}
	if c := o.Claims[3]; !strings.Contains(c.Note, "certified negative") || c.Worst == "" {
		t.Errorf("strengthened inequality: note %q worst %q", c.Note, c.Worst)
	}
	if c := o.Claims[6]; !strings.Contains(c.Note, "exact counterexample") || c.Worst != "sample 5: 3/2" || c.Residual != "slack -3/2" {
		t.Errorf("exact counterexample: note %q worst %q residual %q", c.Note, c.Worst, c.Residual)
	}
	if c := o.Claims[5]; c.Residual != "slack -1/6" {
		t.Errorf("exact slack: %q", c.Residual)
	}
}

// Sampled claims: integer samples with degree= turn an all-zero sweep into
// the Schwartz–Zippel bound (Schwartz 1980; Zippel 1979); a sample on which
// f raises leaves the claim undecided and names that sample; box() is
// reproducible and stays in its range.
func TestSampledClaims(t *testing.T) {
	rep := runHere(t, `identity("square of a sum", lambda p: ((p[0] + p[1]) ** 2, p[0] ** 2 + 2 * p[0] * p[1] + p[1] ** 2),
         over=box(2, -1000, 1000), samples=20, degree=2)
identity("a pole at 3", lambda x: (1 / (x - 3), 1 / (x - 3)), over=lambda k: k, samples=6)
g = box(3, -5, 5, denom=10, seed=4)
print(g(7) == g(7), all([-5 <= c <= 5 for k in range(50) for c in g(k)]), len(g(0)))`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("cell failed: %s", o.Error.Message)
	}
	if c := o.Claims[0]; c.Verdict != cells.Holds || !strings.Contains(c.Note, "(2/2001)^20 = 10^-60.0") {
		t.Errorf("Schwartz–Zippel note: %s %q", c.Verdict, c.Note)
	}
	if c := o.Claims[1]; c.Verdict != cells.Undecided || c.Why != cells.SampleRaised || c.Worst != "sample 3: 3" || !strings.Contains(c.Residual, "ZeroDivisionError") {
		t.Errorf("raising sample: %s (why %q) worst %q residual %q", c.Verdict, c.Why, c.Worst, c.Residual)
	}
	if o.Output != "True True 3\n" {
		t.Errorf("box output %q", o.Output)
	}
	expectErrors(t, []errorCase{
		{"identity(\"x\", lambda p: (p, p), over=box(1, 0, 9, denom=3), samples=3, degree=2)", "integer points"},
		{"identity(\"x\", lambda p: (p, p), over=lambda k: [1, 2][k], samples=3)", "sample generator raised at sample 2"},
		{"box(0, 1, 2)", "1 <= dim"},
	})
}

// Counterexample search over a box family: tetrahedra on the grid of
// quarter-integers in [-10, 10]^3, non-degenerate ones by hypothesis. The
// samples of a strengthened Euler inequality R >= 3.1 r (Euler 1765;
// Klamkin and Tsintsifas 1979 give R >= 3r, with equality only for the
// regular tetrahedron) all hold, since random tetrahedra are far from
// regular; the search finds a violation near the regular one, and the
// point it prints, pasted into a fresh run, is a point of the box, is
// non-degenerate and violates the inequality again. The tetrahedral
// isoperimetric inequality S^3 >= 216·sqrt(3)·V^2 (equality for the
// regular tetrahedron: from memory, e.g. Mitrinović, Pečarić and Volenec,
// Recent Advances in Geometric Inequalities, 1989; the constant is checked
// below) survives the search; strengthened by 1% it does not. Neither does
// the volume–length bound 72·V² <= l_rms^6 (equality for the regular
// tetrahedron; Parthasarathy, Graichen and Hathaway 1994, from memory)
// strengthened by 2%, and there the slack is exact.
func TestSearchFindsCounterexamples(t *testing.T) {
	const prelude = `small = box(12, -10, 10, denom=64)
def tet(p):
    return simplex([p[0:3], p[3:6], p[6:9], p[9:12]])
solid = lambda p: not tet(p).is_degenerate()
strong = lambda p: (frac(31, 10) * tet(p).inradius(), sqrt(tet(p).circumradius_sq()))
def iso(c):
    def sides(p):
        s = tet(p)
        S = sqrt(s.facet_areas_sq()[0]) + sqrt(s.facet_areas_sq()[1]) + sqrt(s.facet_areas_sq()[2]) + sqrt(s.facet_areas_sq()[3])
        return (c * 216 * sqrt(3) * s.volume_sq(), S ** 3)
    return sides
def vl(c):
    def sides(p):
        s = tet(p)
        mean = 0
        for d in s.sq_edges():
            mean = mean + d / 6
        return (c * 72 * s.volume_sq(), mean ** 3)
    return sides
`
	rep := runHere(t, prelude+`inequality("samples alone", strong, over=small, samples=200, given=solid)
inequality("with search", strong, over=small, samples=200, given=solid, search=True)
inequality("isoperimetric", iso(1), over=small, samples=100, given=solid, search=True)
inequality("isoperimetric strengthened by 1%", iso(frac(101, 100)), over=small, samples=100, given=solid, search=True)
inequality("volume-length strengthened by 2%", vl(frac(102, 100)), over=small, samples=100, given=solid, search=True)
regular = simplex([[0, 0, 0], [1, 1, 0], [1, 0, 1], [0, 1, 1]])
identity("isoperimetric equality for the regular tetrahedron", iso(1)([0, 0, 0, 1, 1, 0, 1, 0, 1, 0, 1, 1])[0], iso(1)([0, 0, 0, 1, 1, 0, 1, 0, 1, 0, 1, 1])[1])`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("line %d: %s", o.Error.Line, o.Error.Message)
	}
	want := []cells.Verdict{cells.Holds, cells.Fails, cells.Holds, cells.Fails, cells.Fails, cells.Holds}
	for i, c := range o.Claims {
		if c.Verdict != want[i] {
			t.Errorf("%s: %s (%s; %s), want %s", c.Name, c.Verdict, c.Residual, c.Note, want[i])
		}
	}
	// Rational sides give an exactly negative slack: an exact counterexample.
	if c := o.Claims[4]; !strings.Contains(c.Note, "exactly negative — an exact counterexample") || !strings.HasPrefix(c.Residual, "slack -") || strings.Contains(c.Residual, ".") {
		t.Errorf("exact counterexample: residual %q note %q", c.Residual, c.Note)
	}
	for i, f := range map[int]string{1: "strong", 3: "iso(frac(101, 100))", 4: "vl(frac(102, 100))"} {
		c := o.Claims[i]
		if !strings.Contains(c.Note, "counterexample search") || !strings.HasPrefix(c.Worst, "found by search: [") || c.Sample == "" {
			t.Fatalf("%s: note %q worst %q sample %q", c.Name, c.Note, c.Worst, c.Sample)
		}
		// Paste the printed point into a fresh run: a point of the box
		// (quarter-integers in [-10, 10]), meeting the hypothesis, violating.
		again := runHere(t, prelude+fmt.Sprintf("p = %s\nprint(len(p) == 12 and all([-10 <= x <= 10 and x * 64 == int(x * 64) for x in p]), solid(p), %s(p)[0] > %s(p)[1])", c.Sample, f, f))
		if got := output(t, again, 1); got != "True True True\n" {
			t.Errorf("%s: the printed counterexample %s is not a violating point of the family in a fresh run (%q)", c.Name, c.Sample, got)
		}
	}
}

// A search over a function g(k) does not move its samples (they could
// leave the family), and says so.
func TestSearchStaysInUserFamily(t *testing.T) {
	c := runHere(t, `inequality("x", lambda s: (0, 1), over=lambda k: "text", samples=3, search=True)`).Outcomes[0].Claims[0]
	if c.Verdict != cells.Holds || !strings.Contains(c.Note, "counterexample search skipped: over= is a function g(k)") {
		t.Errorf("user family search: %s %q", c.Verdict, c.Note)
	}
}

// Bad input in sampled claims: one clear error each, naming the sample.
func TestSampledBadInput(t *testing.T) {
	expectErrors(t, []errorCase{
		{"identity(\"x\", lambda t: (1, 2, 3), over=lambda k: k, samples=3)", "f(sample 0) must return a pair (lhs, rhs)"},
		{"identity(\"x\", lambda t: (t.volume_sq(), 0), over=lambda k: random_simplex(3), samples=3)", "random draw without seed="},
		{"inequality(\"x\", lambda s: (0, 1), over=lambda k: k, samples=3, search=1)", "search must be True or False"},
		{"inequality(\"x\", 0, 1, search=True)", "inequality(name, f, over=g, samples=N, search=False"},
	})
	// f raising on one sample: the sweep goes on, the claim is undecided
	// and names that sample.
	rep := runHere(t, `inequality("a pole at 4", lambda x: (0, 1 / (x - 4) ** 2), over=lambda k: k, samples=10)
def nested(k):
    identity("inner", k, k)
    return (k, k)
identity("a claim inside f", nested, over=lambda k: k, samples=3)`)
	c := rep.Outcomes[0].Claims[0]
	if c.Verdict != cells.Undecided || c.Why != cells.SampleRaised || c.Worst != "sample 4: 4" || !strings.Contains(c.Note, "f raised on 1 of 10 samples") {
		t.Errorf("raising sample: %s (why %q) worst %q note %q", c.Verdict, c.Why, c.Worst, c.Note)
	}
	if c := rep.Outcomes[0].Claims; len(c) != 2 || c[1].Verdict != cells.Undecided || !strings.Contains(c[1].Residual, "a claim cannot be made per sample") {
		t.Errorf("a claim inside f: %+v", c)
	}
}

// Sessions in one process share nothing: the float64 audit of one (which
// turns / between ints into float division) must not leak into another
// that divides exactly at the same moment. Run with -race.
func TestConcurrentSessions(t *testing.T) {
	const audited = `for i in range(40):
    identity("audit %d" % i, lambda: (frac(1, 3) + i / 7, (7 + 3 * i) / 21))`
	const exactly = `ok = True
for i in range(400):
    ok = ok and (i + 1) / 3 == frac(i + 1, 3)
print(ok)`
	done := make(chan string, 2)
	for _, src := range []string{audited, exactly} {
		go func() {
			rep := runHere(t, src)
			o := rep.Outcomes[0]
			switch {
			case o.Error != nil:
				done <- o.Error.Message
			case len(o.Claims) > 0 && o.Claims[0].Float == nil:
				done <- "no float64 audit"
			default:
				done <- o.Output
			}
		}()
	}
	got := []string{<-done, <-done}
	if !slices.Contains(got, "True\n") || !slices.Contains(got, "") {
		t.Errorf("concurrent sessions gave %q", got)
	}
}

// Messages a notebook author meets: an exception's repr is Python's
// (Python language reference, BaseException), not a Go fault.
func TestExceptionReprs(t *testing.T) {
	expectPrints(t, []printCase{
		{"print(repr(ValueError()))", "ValueError()"},
		{"print(repr(ValueError(\"x\", 2)))", "ValueError('x', 2)"},
		{"try:\n    1 / 0\nexcept ZeroDivisionError as e:\n    print(repr(e).startswith(\"ZeroDivisionError\"))", "True"},
	})
}

// Hypotheses, from the classical triangle identity
// a² + b² + c² = 8R²(1 + cos A cos B cos C) (from memory): the sum of the
// squared sides exceeds 8R² exactly when the triangle is acute, and falls
// short of it when it is obtuse. Over triangles with vertices on a grid,
// given= acute the inequality holds and a search that stays in the family
// and the hypothesis finds no counterexample; given= obtuse it fails, and
// the printed sample, pasted into a fresh run, is an obtuse triangle that
// violates it. Acute and obtuse are decided exactly from the squared sides.
func TestHypothesisAcuteTriangles(t *testing.T) {
	const prelude = `grid = box(6, -10, 10, denom=8)
def tri(p):
    return simplex([p[0:2], p[2:4], p[4:6]])
def acute(p):
    e = tri(p).sq_edges()
    return e[0] < e[1] + e[2] and e[1] < e[0] + e[2] and e[2] < e[0] + e[1]
def obtuse(p):
    e = sorted(tri(p).sq_edges())
    return e[2] > e[0] + e[1] and not tri(p).is_degenerate()
def sides(p):
    e = tri(p).sq_edges()
    return (8 * tri(p).circumradius_sq(), e[0] + e[1] + e[2])
`
	o := runHere(t, prelude+`inequality("acute", sides, over=grid, samples=300, given=acute, search=True)
inequality("obtuse", sides, over=grid, samples=300, given=obtuse)
inequality("nothing acute", sides, over=lambda k: [0, 0, 1, 0, 2, 0], samples=5, given=acute)
inequality("hypothesis raises", sides, over=grid, samples=40, given=lambda p: 1 / (p[0] - p[0]) > 0 if p[1] > 0 else acute(p))
identity("identity with a guard", lambda p: (0, 0) if not acute(p) else (p[0], p[0]), over=grid, samples=40, given=lambda p: True)
print(len([k for k in range(40) if grid(k)[1] > 0]))
print(len([k for k in range(40) if not acute(grid(k)) or grid(k)[0] == 0]))`).Outcomes[0]
	if o.Error != nil {
		t.Fatalf("line %d: %s", o.Error.Line, o.Error.Message)
	}
	acute, obtuse, none, raises, guard := o.Claims[0], o.Claims[1], o.Claims[2], o.Claims[3], o.Claims[4]
	if acute.Verdict != cells.Holds || !strings.Contains(acute.Note, "found no violation") || !strings.Contains(acute.Note, "samples met the hypothesis") {
		t.Errorf("acute: %s %q", acute.Verdict, acute.Note)
	}
	if obtuse.Verdict != cells.Fails || obtuse.Sample == "" || !strings.HasPrefix(obtuse.Worst, "sample ") {
		t.Fatalf("obtuse: %s %q %q", obtuse.Verdict, obtuse.Note, obtuse.Worst)
	}
	again := runHere(t, prelude+"p = "+obtuse.Sample+"\nprint(obtuse(p), sides(p)[0] > sides(p)[1])")
	if got := output(t, again, 1); got != "True True\n" {
		t.Errorf("the printed obtuse sample %s: %q", obtuse.Sample, got)
	}
	if none.Verdict != cells.Undecided || none.Why != cells.NoSampleMet || !strings.Contains(none.Note, "0 of 5 samples met the hypothesis") {
		t.Errorf("no sample met: %s %s %q", none.Verdict, none.Why, none.Note)
	}
	// The cell itself counts the samples on which the hypothesis raises,
	// and those on which the guard returns (0, 0).
	counts := strings.Fields(o.Output)
	if want := "the hypothesis raised on " + counts[0] + " samples, counted as not met"; !strings.Contains(raises.Note, want) || !strings.Contains(raises.Note, "ZeroDivisionError") || raises.Verdict != cells.Holds {
		t.Errorf("raising hypothesis: %s %q, want %q", raises.Verdict, raises.Note, want)
	}
	if want := counts[1] + " of the samples that met it returned 0 on both sides"; !strings.Contains(guard.Note, want) {
		t.Errorf("trivially true pairs: %q, want %q", guard.Note, want)
	}
	expectErrors(t, []errorCase{
		{`identity("x", 1, 1, given=lambda s: True)`, "given= states a hypothesis, which is tested on samples"},
		{`inequality("x", 1, 2, given=lambda s: True)`, "it needs over=g and samples=N"},
		{`limit("x", lambda t: t, toward=0, expect=0, given=lambda t: True)`, "limit() takes no given=: a hypothesis is tested on samples"},
		{`inequality("x", lambda s: (0, 1), over=lambda k: k, samples=2, given=3)`, "given= must be a function"},
		{`inequality("x", lambda s: (0, 1), over=lambda k: k, samples=2, rank="worst")`, "rank must be \"relative\" or \"absolute\""},
	})
}

// The worst sample of an inequality is the one with the smallest relative
// slack (greater − lesser)/(|greater| + |lesser|) unless rank="absolute":
// (100, 102) has slack 2 and relative slack 2/202, (1, 2) slack 1 and
// relative slack 1/3 (common practice: relative error is blind to scale).
func TestRankRelativeOrAbsolute(t *testing.T) {
	o := runHere(t, `pairs = lambda k: [(100, 102), (1, 2), (1, 2)][k]
inequality("relative", lambda s: s, over=pairs, samples=3)
inequality("absolute", lambda s: s, over=pairs, samples=3, rank="absolute")`).Outcomes[0]
	if o.Error != nil {
		t.Fatal(o.Error.Message)
	}
	if c := o.Claims[0]; c.Residual != "slack 2" || !strings.Contains(c.Note, "smallest relative slack (greater − lesser)/(|greater| + |lesser|), 1/101 here") {
		t.Errorf("relative: %q %q", c.Residual, c.Note)
	}
	if c := o.Claims[1]; c.Residual != "slack 1" || !strings.Contains(c.Note, "is 1/3") {
		t.Errorf("absolute: %q %q", c.Residual, c.Note)
	}
}

// A sample the report prints is cell code: pasted into a cell it rebuilds
// the sample (compared through its own printed form and, for a matrix,
// with ==). A sample holding a certified real with no closed form has no
// such code, and the report says so instead of printing digits as code.
func TestPrintedSampleIsCellCode(t *testing.T) {
	const families = `tri = lambda k: random_simplex(2, seed=k, bound=5)
mat = lambda k: matrix([[k, frac(1, 3)], [2, k + 1]])
X = variables("x y")
pol = lambda k: (X[0] ** 2 + frac(k, 2) * X[1], [k, frac(1, 7)])
`
	o := runHere(t, families+`identity("a triangle has no area", lambda s: (s.volume_sq(), 0), over=tri, samples=3)
identity("a matrix is its transpose", lambda m: (m, m.transpose()), over=mat, samples=2)
identity("a polynomial is constant", lambda p: (p[0], 1), over=pol, samples=2)
identity("sqrt(2) k is rational", lambda r: (r, 0), over=lambda k: sqrt(2) * (k + 1), samples=2)
identity("e k is rational", lambda r: (r, 0), over=lambda k: exp(1) * (k + 1), samples=2)`).Outcomes[0]
	if o.Error != nil {
		t.Fatal(o.Error.Message)
	}
	// An algebraic real prints its closed form, which is cell code for
	// exactly that value (== is decided exactly by the zero bound).
	for i, check := range []string{"repr(s) == repr(tri(%d))", "s == mat(%d)", "str(s) == str(pol(%d))", "s == sqrt(2) * (%d + 1)"} {
		c := o.Claims[i]
		var k int
		if _, err := fmt.Sscanf(c.Worst, "sample %d:", &k); err != nil || c.Sample == "" {
			t.Fatalf("%s: worst %q sample %q", c.Name, c.Worst, c.Sample)
		}
		again := runHere(t, families+"s = "+c.Sample+"\nprint("+fmt.Sprintf(check, k)+")")
		if got := output(t, again, 1); got != "True\n" {
			t.Errorf("%s: %s does not rebuild sample %d (%q)", c.Name, c.Sample, k, got)
		}
	}
	if c := o.Claims[4]; c.Sample != "" || !strings.Contains(c.Worst, "not cell code") {
		t.Errorf("a real sample: sample %q worst %q", c.Sample, c.Worst)
	}
}

// An identity whose residual is exactly zero but not known to be rational
// (√2·√3 = √6, from memory), with sides of size 10^-30 computed from
// terms of size 2.4, cannot be enclosed within 2^-64 of the sides' size
// under a cap of 128 bits (the cancellation costs about 100 bits):
// undecided, and it says it was the cap. A common factor, such as e^148,
// would not do it: the target is relative to the sides.
func TestUndecidedAtTheCapSaysWhy(t *testing.T) {
	st := DefaultSettings
	st.Precision, st.MaxPrecision = 64, 128
	rep := runWith(t, st, `identity("sqrt 6", sqrt(2) * sqrt(3) - sqrt(6) + frac(1, 10**30), frac(1, 10**30))
identity("scaled", exp(148) * sqrt(2) * sqrt(3), exp(148) * sqrt(6))`)
	o := rep.Outcomes[0]
	if o.Error != nil {
		t.Fatalf("cell failed: %s", o.Error.Message)
	}
	if c := o.Claims[0]; c.Verdict != cells.Undecided || c.Why != cells.PrecisionCap {
		t.Errorf("%s (why %q): %s", c.Verdict, c.Why, c.Note)
	}
	if c := o.Claims[1]; c.Verdict != cells.HoldsToDigits || c.Digits != 19 {
		t.Errorf("scaled by e^148: %s to %d digits: %s", c.Verdict, c.Digits, c.Note)
	}
}

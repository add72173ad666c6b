package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the committed demo reports")

// TestMain lets the test binary serve as `assay kernel` when the run
// command starts it as a child process (it starts os.Executable()).
func TestMain(m *testing.M) {
	if len(os.Args) > 1 && os.Args[1] == "kernel" {
		os.Exit(kernelCommand(os.Args[2:], os.Stderr))
	}
	if os.Getenv("ASSAY_TEST_MAIN") == "1" { // the test binary as assay itself
		os.Exit(mainCode(os.Args[1:], os.Stdout, os.Stderr))
	}
	code := m.Run()
	if built.dir != "" {
		os.RemoveAll(built.dir)
	}
	os.Exit(code)
}

func assay(t *testing.T, args ...string) (code int, stdout, stderr string) {
	t.Helper()
	var out, errb bytes.Buffer
	code = mainCode(args, &out, &errb)
	return code, out.String(), errb.String()
}

// copyNotebook puts a testdata notebook in a temporary folder.
func copyNotebook(t *testing.T, src string) string {
	t.Helper()
	data, err := os.ReadFile(src)
	if err != nil {
		t.Fatal(err)
	}
	dst := filepath.Join(t.TempDir(), filepath.Base(src))
	if err := os.WriteFile(dst, data, 0o644); err != nil {
		t.Fatal(err)
	}
	return dst
}

// Every bad input: one clear message with the notebook line, exit 2, and
// the report is still written.
func TestBadInputStillWritesReport(t *testing.T) {
	cases := []struct {
		file  string
		line  int
		want  string   // in the report and on the terminal
		flags []string // beyond --max-memory 200MiB
	}{
		{"unclosed-fence.md", 3, "never closed", nil},
		{"unknown-option.md", 3, "unknown cell option \"colour\"", nil},
		{"not-utf8.md", 3, "not valid UTF-8", nil},
		{"syntax-error.md", 5, "SyntaxError", nil},
		{"syntax-unclosed-bracket.md", 8, "SyntaxError: '(' is never closed (column 9); the parser stopped at line 9: invalid syntax", nil},
		{"name-error.md", 5, "NameError: name 'y' is not defined", nil},
		{"division-by-zero.md", 5, "ZeroDivisionError: division by zero: 3/4 / 0", nil},
		{"det-not-square.md", 5, "2x3", nil},
		{"singular-inverse.md", 5, "singular", nil},
		{"open-file.md", 4, "PermissionError: open() is not available", nil},
		{"import-os.md", 4, "ImportError: module \"os\" is not available", nil},
		{"import-marshal.md", 4, "ImportError: module \"marshal\" is not available", nil},
		{"exec-syntax-error.md", 7, "SyntaxError: unexpected EOF while parsing (column 5), at line 1 of the code given to exec or compile", nil},
		{"loop-forever.md", 8, "time limit", nil},
		{"unbounded-memory.md", 4, "memory cap", nil},
		{"deep-recursion.md", 4, "recursion too deep", nil},
		{"poly-negative-power.md", 5, "0 cannot be raised to a negative power", nil},
		{"ratfunc-divide-by-zero.md", 6, "ZeroDivisionError: 1/(x + 1) divided by zero", nil},
		{"ratfunc-at-pole.md", 6, "is not defined at t = 1: its denominator", nil},
		{"ratfunc-at-real-unproved.md", 7, "the denominator x is not proved non-zero there", nil},
		{"ratfunc-not-polynomial.md", 6, "degree() is for polynomials, and (x + y)/(x - y) is a rational function: apply it to f.numerator or f.denominator", nil},
		{"poly-divide-remainder.md", 5, "the remainder is", nil},
		{"poly-divide-by-zero.md", 5, "ZeroDivisionError", nil},
		{"poly-term-cap.md", 5, "--max-terms", []string{"--max-terms", "100000"}},
		{"poly-float-companion.md", 6, "polynomial entries", nil},
		{"poly-unknown-variable.md", 5, `column 15: unknown variable "bb"; the variables are a, b`, nil},
		{"poly-coefficient-unknown.md", 5, `coefficient(): there is no variable "zz"`, nil},
		{"poly-collect-two.md", 5, "collect() takes one variable, got 2 (a, b)", nil},
		{"factor-term-cap.md", 13, "factor() stopped while moving the evaluation point to the origin: substitute: the result would have more than 200 terms", []string{"--max-terms", "200"}},
		{"factor-time-limit.md", 15, "stopped after 1s, its time limit, while factoring: ", nil},
		{"factor-not-polynomial.md", 5, "factor() needs a polynomial or an exact number, got a float", nil},
		{"latex-float.md", 5, "latex() takes an exact value (integer, rational, real, polynomial, rational function, matrix, factorization), not float", nil},
		{"simplex-point-lengths.md", 4, "point 1 has length 3", nil},
		{"simplex-too-many-points.md", 4, "needs at least 3 coordinates", nil},
		{"distance-not-symmetric.md", 5, "symmetric", nil},
		{"distance-negative.md", 5, "negative", nil},
		{"distance-not-square.md", 4, "must be square", nil},
		{"degenerate-inradius.md", 5, "degenerate", nil},
		{"degenerate-circumcenter.md", 5, "degenerate", nil},
		{"degenerate-exradius.md", 5, "exradius: the simplex is degenerate (zero volume)", nil},
		{"degenerate-solid-angle.md", 5, "the simplex is degenerate (zero volume): solid angle: degenerate simplex", nil},
		{"degenerate-barycentric.md", 5, "barycentric: the simplex is degenerate (zero volume)", nil},
		{"degenerate-quality.md", 5, "ratio: the simplex is degenerate (zero volume)", nil},
		{"degenerate-vertex-angle.md", 5, "vertex 0 coincides with vertex 1 or 2", nil},
		{"degenerate-facet-normal.md", 5, "normal: the simplex is degenerate (zero volume)", nil},
		{"degenerate-tangent-lengths.md", 5, "lengths: the simplex is degenerate (zero volume)", nil},
		{"solid-angle-triangle.md", 5, "angle(i): defined for tetrahedra (3-simplices), this is a 2-simplex", nil},
		{"simplex-index-range.md", 5, "exradius(i) needs vertex indices from 0 to 3, got i = 4", nil},
		{"barycentric-wrong-dimension.md", 5, "barycentric(p): p has 2 coordinates, the simplex's points have 3", nil},
		{"contains-wrong-dimension.md", 5, "contains(p): p has 4 coordinates, the simplex's points have 3", nil},
		{"setup-late.md", 12, "setup() after cell 1 (line 7) ran: the report states one seed and one precision for the whole run", nil},
		{"real-sqrt-negative.md", 5, "outside the domain", nil},
		{"real-log-zero.md", 4, "log of 0", nil},
		{"real-acos-domain.md", 4, "acos of 3/2", nil},
		{"real-divide-unseparated.md", 5, "cannot be separated from zero", nil},
		{"real-divide-algebraic-zero.md", 5, "division by a real that is exactly zero", nil},
		{"real-root-zero.md", 5, "root(x, k) needs an integer k from 2 to 1048576, got 0", nil},
		{"real-even-root-negative.md", 5, "root of degree 4 of a negative number", nil},
		{"real-degree-cap.md", 8, "degree 125 on the way, beyond the degree cap of 64 (raise it with the flag --max-degree)", nil},
		{"real-degree-cap.md", 8, "degree 125 on the way, beyond the degree cap of 100 (raise it with the flag --max-degree)", []string{"--max-degree", "100"}},
		{"real-minimal-polynomial-transcendental.md", 7, "involves a transcendental function or pi", nil},
		{"precision-zero.md", 3, "at least 2", nil},
		{"precision-above-cap.md", 4, "above the precision cap", nil},
		{"precision-digits-undecided.md", 9, "ArithmeticError: 30 certified digits not settled within the precision cap of 1000 bits (raise the cap with --max-precision)\n", []string{"--max-precision", "1000"}},
		{"limit-bad-toward.md", 4, "toward must be an exact number or infinity", nil},
		{"limit-bad-ratio.md", 4, "ratio must be an exact number between 0 and 1", nil},
		{"series-essential-singularity.md", 6, "exp of a series that tends to infinity", nil},
		{"series-branch-point.md", 6, "square root of a series whose leading coefficient -1 is negative", nil},
		{"series-compare.md", 6, "TypeError: comparison of a series", nil},
		{"series-simplex-transcendental.md", 8, "it is an atan2 of the coordinates, transcendental", nil},
		{"series-simplex-contains.md", 8, "contains() is not available for a simplex with series coordinates", nil},
		{"series-order-range.md", 4, "series(): order must be an integer from 1 to 64, got 0", nil},
		{"sweep-generator-raises.md", 7, "the sample generator raised at sample 3: IndexError", nil},
		{"sweep-wrong-shape.md", 4, "f(sample 0) must return a pair (lhs, rhs), got a tuple", nil},
		{"sweep-seedless-draw.md", 5, "random draw without seed=", nil},
		{"given-not-sampled.md", 5, "given= states a hypothesis, which is tested on samples: it needs over=g and samples=N", nil},
		{"rank-unknown.md", 5, "rank must be \"relative\" or \"absolute\", got worst", nil},
		{"poly-sqrt-not-square.md", 5, "is not the square of a polynomial over Q (its square-free factor", nil},
		{"poly-plus-real.md", 5, "TypeError: a polynomial cannot be combined with the certified real", nil},
		{"distance-not-embeddable.md", 7, "violates the triangle inequality", nil},
		{"poly-at-real-partial.md", 5, "with a certified real among the values every variable needs one (b left without)", nil},
		{"simplex-algebraic-affine.md", 7, "this simplex has algebraic coordinates", nil},
		{"point-inradius.md", 5, "inradius(): a point has no facets, so no insphere", nil},
		{"degenerate-touch-points.md", 5, "the simplex is degenerate (zero volume)", nil},
		{"simplex-irrational-distance.md", 6, "sqrt(3)) is irrational (proved)", nil},
	}
	for _, c := range cases {
		t.Run(c.file, func(t *testing.T) { badInput(t, c.file, c.line, c.want, c.flags...) })
	}
}

// badInput runs the bad-input notebook file of testdata/bad: exit 2, the
// message want with its line in the report and on the terminal, the
// report written, the notebook untouched.
func badInput(t *testing.T, file string, line int, want string, flags ...string) {
	t.Helper()
	nb := copyNotebook(t, filepath.Join("..", "..", "testdata", "bad", file))
	before, _ := os.ReadFile(nb)
	code, stdout, stderr := assay(t, append([]string{"run", nb, "--max-memory", "200MiB"}, flags...)...)
	if code != 2 {
		t.Errorf("exit %d, want 2\nstdout: %s\nstderr: %s", code, stdout, stderr)
	}
	report, err := os.ReadFile(strings.TrimSuffix(nb, ".md") + ".report.md")
	if err != nil {
		t.Fatalf("no report written: %v", err)
	}
	if !strings.Contains(string(report), want) || !strings.Contains(string(report), fmt.Sprintf("line %d", line)) {
		t.Errorf("report lacks line %d: %q:\n%s", line, want, report)
	}
	if !strings.Contains(stdout, fmt.Sprintf(".md:%d: ", line)) || !strings.Contains(stdout, want) {
		t.Errorf("terminal output lacks line %d: %q:\n%s", line, want, stdout)
	}
	if _, err := os.Stat(strings.TrimSuffix(nb, ".md") + ".report.html"); err != nil {
		t.Errorf("no HTML report: %v", err)
	}
	after, _ := os.ReadFile(nb)
	if !bytes.Equal(before, after) {
		t.Errorf("the notebook was modified")
	}
}

func TestLoopForeverMarksLaterCellsNotRun(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/loop-forever.md")
	assay(t, "run", nb)
	report, _ := os.ReadFile(strings.TrimSuffix(nb, ".md") + ".report.md")
	if !strings.Contains(string(report), "line 8") || !strings.Contains(string(report), "was not run") {
		t.Errorf("report:\n%s", report)
	}
}

func TestEmptyNotebook(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/empty.md")
	code, stdout, _ := assay(t, "run", nb)
	if code != 0 {
		t.Errorf("empty notebook: exit %d\n%s", code, stdout)
	}
	if _, err := os.Stat(strings.TrimSuffix(nb, ".md") + ".report.md"); err != nil {
		t.Errorf("no report for the empty notebook: %v", err)
	}
}

func TestMissingFile(t *testing.T) {
	code, _, stderr := assay(t, "run", filepath.Join(t.TempDir(), "nowhere.md"))
	if code != 2 || !strings.Contains(stderr, "cannot read notebook") {
		t.Errorf("exit %d, stderr %q", code, stderr)
	}
}

func TestReportPathIsNotebook(t *testing.T) {
	nb := copyNotebook(t, "../../notebooks/mesh-orientation.md")
	before, _ := os.ReadFile(nb)
	code, _, stderr := assay(t, "run", "-o", nb, nb)
	if code != 2 || !strings.Contains(stderr, "--in-place") {
		t.Errorf("exit %d, stderr %q", code, stderr)
	}
	if after, _ := os.ReadFile(nb); !bytes.Equal(before, after) {
		t.Errorf("the notebook was overwritten")
	}
}

func TestBadFlags(t *testing.T) {
	for _, args := range [][]string{
		{"run"},
		{"run", "a.md", "b.md"},
		{"run", "--max-memory", "lots", "a.md"},
		{"run", "--timeout", "-1s", "a.md"},
		{"run", "--max-terms", "0", "a.md"},
		{"run", "--max-degree", "0", "a.md"},
		{"frobnicate"},
	} {
		if code, _, _ := assay(t, args...); code != 2 {
			t.Errorf("%v: exit %d, want 2", args, code)
		}
	}
}

var timeRE = regexp.MustCompile(`[0-9]+\.[0-9]+ s\b`)

func normalizeTimes(b []byte) string { return timeRE.ReplaceAllString(string(b), "T s") }

func TestInPlaceIsIdempotent(t *testing.T) {
	nb := copyNotebook(t, "../../notebooks/mesh-orientation.md")
	if code, out, _ := assay(t, "run", "--in-place", nb); code != 0 {
		t.Fatalf("first in-place run: exit %d\n%s", code, out)
	}
	first, _ := os.ReadFile(nb)
	if !bytes.Contains(first, []byte("```output")) {
		t.Fatalf("no output blocks written:\n%s", first)
	}
	assay(t, "run", "--in-place", nb)
	second, _ := os.ReadFile(nb)
	if normalizeTimes(first) != normalizeTimes(second) {
		t.Errorf("second in-place run changed the notebook")
	}
}

func TestCheckJSON(t *testing.T) {
	code, out, _ := assay(t, "check", "--json", "../../notebooks/mesh-orientation.md")
	var doc struct {
		Notebook string `json:"notebook"`
		SHA256   string `json:"sha256"`
		Claims   []struct {
			Name, Kind, Method, Verdict, Residual string
			Digits                                int
			Cell, Line                            int
			Seconds                               float64
		} `json:"claims"`
		Errors []struct {
			Cell, Line int
			Message    string
		} `json:"errors"`
		Exit int `json:"exit"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("not one JSON document: %v\n%s", err, out)
	}
	if code != 0 || doc.Exit != 0 || len(doc.Claims) == 0 || len(doc.SHA256) != 64 {
		t.Errorf("exit %d, doc %+v", code, doc)
	}
	for _, c := range doc.Claims {
		if c.Verdict != "holds" || c.Line == 0 || c.Kind != "identity" {
			t.Errorf("claim %+v", c)
		}
	}
}

func TestCheckExitOneOnFailingClaim(t *testing.T) {
	dir := t.TempDir()
	nb := filepath.Join(dir, "f.md")
	os.WriteFile(nb, []byte("# f\n\n```cell\nidentity(\"wrong\", frac(1, 3) + frac(1, 6), frac(1, 3))\n```\n"), 0o644)
	code, out, _ := assay(t, "check", nb)
	if code != 1 || !strings.Contains(out, "fails") || !strings.Contains(out, "1/6") {
		t.Errorf("exit %d\n%s", code, out)
	}
}

func TestVersionAndHelp(t *testing.T) {
	if code, out, _ := assay(t, "version"); code != 0 || !strings.HasPrefix(out, "assay ") {
		t.Errorf("version: %d %q", code, out)
	}
	if code, out, _ := assay(t, "--help"); code != 0 || !strings.Contains(out, "Examples:") {
		t.Errorf("help: %d %q", code, out)
	}
	for _, sub := range []string{"run", "check", "kernel"} {
		code, _, errs := assay(t, sub, "--help")
		if code != 0 || !strings.Contains(errs, "Usage: assay "+sub) {
			t.Errorf("%s --help: %d %q", sub, code, errs)
		}
	}
}

// The committed reports of the demo notebooks must be what a run gives now
// (apart from lines stating times). -update rewrites them.
func TestDemoReportsAreCurrent(t *testing.T) {
	all, err := filepath.Glob("../../notebooks/*.md")
	var demos []string
	for _, nb := range all {
		if !strings.HasSuffix(nb, ".report.md") {
			demos = append(demos, nb)
		}
	}
	if err != nil || len(demos) == 0 {
		t.Fatalf("no demo notebooks found in ../../notebooks (%v)", err)
	}
	for _, nb := range demos {
		t.Run(filepath.Base(nb), func(t *testing.T) {
			committed, err := filepath.Abs(strings.TrimSuffix(nb, ".md") + ".report.md")
			if err != nil {
				t.Fatal(err)
			}
			committedHTML := strings.TrimSuffix(committed, ".md") + ".html"
			committedFigs, err := filepath.Glob(strings.TrimSuffix(committed, ".md") + ".fig*.svg")
			if err != nil {
				t.Fatal(err)
			}
			// Same file name as the committed report, so figure links agree.
			out := filepath.Join(t.TempDir(), filepath.Base(committed))
			if *update {
				out = committed
				for _, f := range committedFigs {
					if err := os.Remove(f); err != nil { // the run writes the current ones again
						t.Fatal(err)
					}
				}
			}
			// The report names the notebook by the path given; run from the
			// repository root so it reads notebooks/x.md.
			wd, err := os.Getwd()
			if err != nil {
				t.Fatal(err)
			}
			if err := os.Chdir("../.."); err != nil {
				t.Fatal(err)
			}
			defer os.Chdir(wd)
			rel, err := filepath.Rel("../..", nb)
			if err != nil {
				t.Fatal(err)
			}
			if code, stdout, stderr := assay(t, "run", "-o", out, filepath.ToSlash(rel)); code != 0 {
				t.Fatalf("exit %d\n%s\n%s", code, stdout, stderr)
			}
			if *update {
				return
			}
			for _, pair := range [][2]string{{committed, out}, {committedHTML, strings.TrimSuffix(out, ".md") + ".html"}} {
				old, err := os.ReadFile(pair[0])
				if err != nil {
					t.Fatalf("the committed report cannot be read: %v", err)
				}
				fresh, err := os.ReadFile(pair[1])
				if err != nil {
					t.Fatalf("the fresh report cannot be read: %v", err)
				}
				if normalizeTimes(fresh) != normalizeTimes(old) {
					t.Errorf("%s is stale: run `go test ./cmd/assay -run TestDemoReportsAreCurrent -update`", pair[0])
				}
			}
			figures, err := filepath.Glob(strings.TrimSuffix(out, ".md") + ".fig*.svg")
			if err != nil {
				t.Fatal(err)
			}
			made := map[string]bool{}
			for _, f := range figures {
				committedFig := filepath.Join(filepath.Dir(committed), filepath.Base(f))
				made[committedFig] = true
				want, err := os.ReadFile(committedFig)
				got, gerr := os.ReadFile(f)
				if err != nil || gerr != nil || !bytes.Equal(got, want) {
					t.Errorf("figure %s is stale or missing: run `go test ./cmd/assay -run TestDemoReportsAreCurrent -update`", committedFig)
				}
			}
			for _, f := range committedFigs {
				if !made[f] {
					t.Errorf("figure %s is committed but the report no longer makes it: run `go test ./cmd/assay -run TestDemoReportsAreCurrent -update`", f)
				}
			}
		})
	}
}

// The reference notebooks check what a notebook can reach against published
// values (sources named in each notebook); every claim must hold (exactly,
// or to digits where certified reals decide it), or be estimated (limits).
func TestReferenceNotebooks(t *testing.T) {
	refs, _ := filepath.Glob("../../testdata/reference/*.md")
	if len(refs) == 0 {
		t.Fatal("no reference notebooks")
	}
	for _, nb := range refs {
		code, out, _ := assay(t, "check", "--json", nb)
		var doc struct {
			Claims []struct{ Name, Verdict string } `json:"claims"`
			Errors []struct{ Message string }       `json:"errors"`
		}
		if err := json.Unmarshal([]byte(out), &doc); err != nil {
			t.Fatalf("%s: %v", nb, err)
		}
		if code != 0 || len(doc.Errors) > 0 || len(doc.Claims) < 5 {
			t.Errorf("%s: exit %d, %d claims, errors %v", nb, code, len(doc.Claims), doc.Errors)
		}
		for _, c := range doc.Claims {
			// Transcendental certified reals can only ever hold to digits,
			// and limits are estimates; anything else fails the check. A
			// claim named "proved: …" must hold outright.
			if c.Verdict != "holds" && c.Verdict != "holds-where" && (strings.HasPrefix(c.Name, "proved: ") || c.Verdict != "holds-to-digits" && c.Verdict != "estimated") {
				t.Errorf("%s: %q %s", nb, c.Name, c.Verdict)
			}
		}
	}
}

// Estimated limits are not proofs: --strict exits 1 on a notebook of them,
// and the summary line counts them apart.
func TestStrictCountsEstimatesAsNotProved(t *testing.T) {
	nb := "../../testdata/reference/limits.md"
	code, out, _ := assay(t, "check", nb)
	if code != 0 || !strings.Contains(out, "0 holds to digits, 6 estimated, 0 fails, 0 undecided") || !strings.Contains(out, "~ estimated to ") {
		t.Errorf("exit %d:\n%s", code, out)
	}
	if code, _, _ := assay(t, "check", "--strict", nb); code != 1 {
		t.Errorf("--strict: exit %d, want 1", code)
	}
}

func TestInPlaceLeavesUnparsableNotebookAlone(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/unclosed-fence.md")
	before, _ := os.ReadFile(nb)
	code, out, _ := assay(t, "run", "--in-place", nb)
	after, _ := os.ReadFile(nb)
	if code != 2 || !bytes.Equal(before, after) || !strings.Contains(out, "left unchanged") {
		t.Errorf("exit %d, changed %v\n%s", code, !bytes.Equal(before, after), out)
	}
}

// One worker, two workers, and three shards merged all write the same
// report (apart from lines stating times).
func TestWorkersAndShardsWriteTheSameReport(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/reference/sampling.md")
	dir := filepath.Dir(nb)
	report := func(name string) string {
		data, err := os.ReadFile(filepath.Join(dir, name))
		if err != nil {
			t.Fatal(err)
		}
		return normalizeTimes(data)
	}
	if code, out, errs := assay(t, "run", "--workers", "1", "-o", filepath.Join(dir, "one.md"), nb); code != 0 {
		t.Fatalf("one worker: exit %d\n%s%s", code, out, errs)
	}
	if code, out, errs := assay(t, "run", "--workers", "2", "-o", filepath.Join(dir, "two.md"), nb); code != 0 {
		t.Fatalf("two workers: exit %d\n%s%s", code, out, errs)
	}
	var parts []string
	for i := 3; i >= 1; i-- {
		code, out, errs := assay(t, "run", "--shard", fmt.Sprintf("%d/3", i), nb)
		part := strings.TrimSuffix(nb, ".md") + fmt.Sprintf(".part-%d-of-3.json", i)
		if code != 0 || !strings.Contains(out, "part written to "+part) {
			t.Fatalf("shard %d: exit %d\n%s%s", i, code, out, errs)
		}
		parts = append(parts, part)
	}
	args := append([]string{"merge", "-o", filepath.Join(dir, "merged.md")}, parts...)
	if code, out, errs := assay(t, args...); code != 0 {
		t.Fatalf("merge: exit %d\n%s%s", code, out, errs)
	}
	one := report("one.md")
	if report("two.md") != one {
		t.Errorf("two workers wrote another report than one worker")
	}
	// A merged claim says where its samples were computed; apart from
	// that clause, and the run id and region hashes that cover it, the
	// reports are the same.
	unmerged := regexp.MustCompile(`; merged: the samples were computed by the 3 shard runs whose part files were merged, and the merge re-evaluated only the samples this claim shows`)
	hashes := regexp.MustCompile("(assay:generated sha256:|- run: `|<li>run: <code>|<meta name=\"assay-run\" content=\")[0-9a-f]{16}")
	strip := func(s string) string {
		return hashes.ReplaceAllString(unmerged.ReplaceAllString(s, ""), "${1}…")
	}
	merged := report("merged.md")
	if !strings.Contains(merged, "; merged: the samples were computed by the 3 shard runs") {
		t.Errorf("the merged report does not say its samples come from the shard runs")
	}
	if strip(merged) != strip(one) {
		t.Errorf("three shards merged wrote another report than one run")
	}
	if strip(report("merged.html")) != strip(report("one.html")) {
		t.Errorf("the merged HTML report differs")
	}
}

// Bad shard specs, worker counts and part files: one clear message each.
func TestShardAndMergeBadInput(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/reference/sampling.md")
	notPart := filepath.Join(t.TempDir(), "notes.json")
	os.WriteFile(notPart, []byte(`{"hello": 1}`), 0o644)
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"run", "--shard", "3/2", nb}, "i must be between 1 and n = 2"},
		{[]string{"run", "--shard", "0/2", nb}, "i must be between 1 and n = 2"},
		{[]string{"run", "--shard", "two", nb}, "--shard wants i/n"},
		{[]string{"run", "--shard", "1/0", nb}, "n must be between 1"},
		{[]string{"run", "--shard", "1/2", "--in-place", nb}, "drop --in-place"},
		{[]string{"run", "--workers", "0", nb}, "--workers must be between 1 and 256"},
		{[]string{"run", "--shard", "1/2", filepath.Join(t.TempDir(), "gone.md")}, "cannot read notebook"},
		{[]string{"merge"}, "give the part files"},
		{[]string{"merge", notPart}, "is not an assay part file"},
		{[]string{"merge", filepath.Join(t.TempDir(), "gone.json")}, "cannot read part"},
	}
	for _, c := range cases {
		code, out, errs := assay(t, c.args...)
		if code != 2 || !strings.Contains(out+errs, c.want) {
			t.Errorf("%v: exit %d, want 2 and %q\n%s%s", c.args, code, c.want, out, errs)
		}
	}
	// Half of a run is refused, naming the missing shard.
	assay(t, "run", "--shard", "1/2", nb)
	code, _, errs := assay(t, "merge", strings.TrimSuffix(nb, ".md")+".part-1-of-2.json")
	if code != 2 || !strings.Contains(errs, "shard 2/2 is missing") {
		t.Errorf("incomplete merge: exit %d, %q", code, errs)
	}
}

// The JSON document carries a failing claim's sample as cell code, and
// that code, pasted into a notebook, rebuilds a sample that meets the
// hypothesis and violates the claim. The claim is false by the classical
// identity a² + b² + c² = 8R²(1 + cos A cos B cos C) (from memory): for
// an obtuse triangle the sum of the squared sides is below 8R².
func TestJSONCarriesTheSampleAsCode(t *testing.T) {
	const prelude = "```cell\ngrid = box(6, -10, 10, denom=8)\n" +
		"tri = lambda p: simplex([p[0:2], p[2:4], p[4:6]])\n" +
		"def obtuse(p):\n    e = sorted(tri(p).sq_edges())\n    return e[2] > e[0] + e[1] and not tri(p).is_degenerate()\n" +
		"sides = lambda p: (8 * tri(p).circumradius_sq(), sum(tri(p).sq_edges()))\n"
	dir := t.TempDir()
	nb := filepath.Join(dir, "claim.md")
	os.WriteFile(nb, []byte("# t\n\n"+prelude+"inequality(\"a^2 + b^2 + c^2 >= 8R^2\", sides, over=grid, samples=200, given=obtuse)\n```\n"), 0o644)
	code, out, errs := assay(t, "check", "--json", nb)
	var doc struct {
		Claims []struct {
			Verdict, Sample string
		}
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil || code != 1 || len(doc.Claims) != 1 || doc.Claims[0].Verdict != "fails" || doc.Claims[0].Sample == "" {
		t.Fatalf("exit %d, %v\n%s%s", code, err, out, errs)
	}
	again := filepath.Join(dir, "again.md")
	os.WriteFile(again, []byte("# t\n\n"+prelude+"p = "+doc.Claims[0].Sample+"\nidentity(\"obtuse and below\", obtuse(p) and sides(p)[1] < sides(p)[0], True)\n```\n"), 0o644)
	if code, out, errs := assay(t, "check", again); code != 0 || !strings.Contains(out, "✔ holds") {
		t.Errorf("the sample %s does not rebuild a violating obtuse triangle: exit %d\n%s%s", doc.Claims[0].Sample, code, out, errs)
	}
}

package kernel

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"reflect"
	"regexp"
	"strings"
	"testing"
	"time"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/proto"
	"assay/kernel/session"
)

// TestMain lets the test binary stand in for `assay kernel` when a test
// starts it as a child process.
func TestMain(m *testing.M) {
	proto.ServeTestKernel()
	os.Exit(m.Run())
}

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

// runHere runs cells in this process.
func runHere(t *testing.T, srcs ...string) *cells.Report {
	t.Helper()
	return Run(notebook(t, srcs...), Options{Settings: session.DefaultSettings})
}

// runChild runs cells in a kernel child process (this test binary).
func runChild(t *testing.T, opt Options, srcs ...string) *cells.Report {
	t.Helper()
	t.Setenv("ASSAY_TEST_KERNEL", "1")
	opt.Command = []string{os.Args[0]}
	if opt.Settings.Precision == 0 {
		opt.Settings = session.DefaultSettings
	}
	return Run(notebook(t, srcs...), opt)
}

func TestLaterCellsNotRunAfterError(t *testing.T) {
	rep := runHere(t, "x = 1", "y = 1 / 0", "print(x)")
	if got := []cells.Status{rep.Outcomes[0].Status, rep.Outcomes[1].Status, rep.Outcomes[2].Status}; got[0] != cells.Ran || got[1] != cells.Failed || got[2] != cells.NotRun {
		t.Errorf("statuses %v", got)
	}
	rep = Run(notebook(t, "x = 1", "y = 1 / 0", "print(x)"), Options{Settings: session.DefaultSettings, KeepGoing: true})
	if rep.Outcomes[2].Output != "1\n" {
		t.Errorf("keep-going: third cell printed %q", rep.Outcomes[2].Output)
	}
}

func TestChildProcessRunsCells(t *testing.T) {
	rep := runChild(t, Options{}, "x = frac(1, 3)", "identity(\"thirds\", 3 * x, 1)\nprint(x)")
	if o := rep.Outcomes[1]; o.Error != nil || o.Output != "1/3\n" || len(o.Claims) != 1 || o.Claims[0].Verdict != cells.Holds {
		t.Fatalf("child run: %+v", rep.Outcomes)
	}
}

func TestTimeoutStopsCellAndReportsIt(t *testing.T) {
	nb, err := cells.Parse("t.md", []byte("```cell\nx = 1\n```\n\n```cell timeout=300ms\nwhile True:\n    pass\n```\n\n```cell\nprint(x)\n```\n"))
	if err != nil {
		t.Fatal(err)
	}
	t.Setenv("ASSAY_TEST_KERNEL", "1")
	rep := Run(nb, Options{Settings: session.DefaultSettings, Command: []string{os.Args[0]}})
	o := rep.Outcomes[1]
	if o.Status != cells.Failed || o.Error == nil || !strings.Contains(o.Error.Message, "time limit") || !strings.Contains(o.Error.Message, "timeout=") || o.Error.Line != 6 {
		t.Fatalf("timeout outcome: %+v", o)
	}
	if rep.Outcomes[2].Status != cells.NotRun {
		t.Errorf("cell after the timeout should not run")
	}
	// With --keep-going the kernel restarts, replays cell 1, and cell 3 sees x.
	rep = Run(nb, Options{Settings: session.DefaultSettings, Command: []string{os.Args[0]}, KeepGoing: true})
	if rep.Outcomes[2].Output != "1\n" {
		t.Errorf("keep-going after a timeout: cell 3 gave %+v", rep.Outcomes[2])
	}
}

func TestMemoryCapStopsCell(t *testing.T) {
	if testing.Short() {
		t.Skip("allocates a few hundred MiB")
	}
	start := time.Now()
	rep := runChild(t, Options{MaxMemory: 150 << 20}, "x = []\nwhile True:\n    x.append([0] * 100000)")
	o := rep.Outcomes[0]
	if o.Error == nil || !strings.Contains(o.Error.Message, "memory cap") || !strings.Contains(o.Error.Message, "--max-memory") {
		t.Fatalf("memory outcome: %+v", o)
	}
	if time.Since(start) > 30*time.Second {
		t.Errorf("the memory cap took %s to act", time.Since(start))
	}
}

// splitCells exercise every kind of sampled claim: an identity that holds
// (large enough to start helper workers), one that fails, one with a
// sample f cannot evaluate, one with a float64 audit, inequalities that
// hold and fail, and a counterexample search. The printed results must be
// the same however the samples are split, since later code may use them.
var splitCells = []string{
	`tet = lambda k: random_simplex(3, seed=k, bound=1000, denom=100)
ok = identity("volume from coordinates = Cayley-Menger volume", lambda t: (t.volume_sq(), cayley_menger(t) / 288), over=tet, samples=400, companion=False)
bad = identity("a wrong volume", lambda t: (t.volume_sq(), cayley_menger(t) / 287), over=tet, samples=300)
print(ok, bad)`,
	`identity("a pole at 7", lambda x: (1 / (x - 7), 1 / (x - 7)), over=lambda k: k, samples=30)
identity("Heron against the shoelace formula", lambda p: (16 * triangle_area_sq((p[0] - p[2]) ** 2 + (p[1] - p[3]) ** 2, (p[2] - p[4]) ** 2 + (p[3] - p[5]) ** 2, (p[4] - p[0]) ** 2 + (p[5] - p[1]) ** 2),
    4 * ((p[2] - p[0]) * (p[5] - p[1]) - (p[4] - p[0]) * (p[3] - p[1])) ** 2), over=box(6, -50, 50), samples=300, degree=4)
identity("determinant of a random 3x3, with float64 audit", lambda M: (det(M), M[0, 0] * (M[1, 1] * M[2, 2] - M[1, 2] * M[2, 1]) - M[0, 1] * (M[1, 0] * M[2, 2] - M[1, 2] * M[2, 0]) + M[0, 2] * (M[1, 0] * M[2, 1] - M[1, 1] * M[2, 0])),
    over=lambda k: random_matrix(3, 3, bound=50, denom=7, seed=k), samples=300)`,
	`small = lambda k: random_simplex(3, seed=k, bound=10)
def facets(s):
    F = [sqrt(a) for a in s.facet_areas_sq()]
    return (F[0], F[1] + F[2] + F[3])
print(inequality("a facet below the other three", facets, over=small, samples=300))
def tet(p):
    return simplex([p[0:3], p[3:6], p[6:9], p[9:12]])
print(inequality("strengthened Euler R >= 3.1 r (false)", lambda p: (frac(31, 10) * tet(p).inradius(), sqrt(tet(p).circumradius_sq())), over=box(12, -10, 10, denom=64), samples=300, given=lambda p: not tet(p).is_degenerate(), search=True))
print(inequality("x^2 <= x/2 (false from x = 1/2 on)", lambda x: (x * x, x / 2), over=lambda k: frac(k + 1, 4), samples=300))`,
}

// mergedNote is the clause a merged claim adds to say where its samples
// were computed.
var mergedNote = regexp.MustCompile(`; merged: the samples were computed by the \d+ shard runs whose part files were merged, and the merge re-evaluated only the samples this claim shows`)

// comparable strips what may differ between equal runs: times, and the
// note that says a claim was merged from parts.
func comparable(rep *cells.Report) []cells.Outcome {
	out := make([]cells.Outcome, len(rep.Outcomes))
	for i, o := range rep.Outcomes {
		o.Seconds = 0
		o.Claims = append([]cells.Claim(nil), o.Claims...)
		for j := range o.Claims {
			o.Claims[j].Seconds = 0
			o.Claims[j].Note = mergedNote.ReplaceAllString(o.Claims[j].Note, "")
		}
		out[i] = o
	}
	return out
}

func sameRuns(t *testing.T, what string, want, got *cells.Report) {
	t.Helper()
	a, b := comparable(want), comparable(got)
	if !reflect.DeepEqual(a, b) {
		ja, _ := json.MarshalIndent(a, "", " ")
		jb, _ := json.MarshalIndent(b, "", " ")
		t.Errorf("%s differs from one run:\n--- one run\n%s\n--- %s\n%s", what, ja, what, jb)
	}
}

// The promise: W workers, n shards merged, or both, give exactly
// the claims and outputs of one kernel alone.
func TestSplitRunsEqualOneRun(t *testing.T) {
	nb := notebook(t, splitCells...)
	one := Run(nb, Options{Settings: session.DefaultSettings})
	for i, o := range one.Outcomes {
		if o.Error != nil {
			t.Fatalf("cell %d: %s", i+1, o.Error.Message)
		}
	}
	verdicts := map[string]cells.Verdict{}
	for _, o := range one.Outcomes {
		for _, c := range o.Claims {
			verdicts[c.Name] = c.Verdict
		}
	}
	want := map[string]cells.Verdict{
		"volume from coordinates = Cayley-Menger volume": cells.Holds, "a wrong volume": cells.Fails,
		"a pole at 7": cells.Undecided, "Heron against the shoelace formula": cells.Holds,
		"determinant of a random 3x3, with float64 audit": cells.Holds, "a facet below the other three": cells.Holds,
		"strengthened Euler R >= 3.1 r (false)": cells.Fails, "x^2 <= x/2 (false from x = 1/2 on)": cells.Fails,
	}
	if !reflect.DeepEqual(verdicts, want) {
		t.Fatalf("verdicts of one run: %v", verdicts)
	}

	// Shards in this process, merged in this process.
	for _, n := range []int64{2, 3} {
		parts, names := shardParts(t, nb, n, Options{Settings: session.DefaultSettings})
		merged, err := Merge(parts, names, Options{})
		if err != nil {
			t.Fatal(err)
		}
		sameRuns(t, fmt.Sprintf("%d shards merged", n), one, merged)
	}

	// Two worker processes.
	t.Setenv("ASSAY_TEST_KERNEL", "1")
	child := Options{Settings: session.DefaultSettings, Command: []string{os.Args[0]}, Workers: 2}
	two, d := run(nb, child, nil)
	if d == nil || d.peak != 2 {
		t.Errorf("the helper worker did not start")
	}
	sameRuns(t, "2 workers", one, two)

	// Two shards of two workers each, merged by two workers.
	parts, names := shardParts(t, nb, 2, child)
	merged, err := Merge(parts, names, child)
	if err != nil {
		t.Fatal(err)
	}
	sameRuns(t, "2 shards of 2 workers", one, merged)
}

func shardParts(t *testing.T, nb *cells.Notebook, n int64, opt Options) ([]*Part, []string) {
	t.Helper()
	var parts []*Part
	var names []string
	for i := n - 1; i >= 0; i-- { // any order will do
		opt.Shard = claim.Share{Index: i, Count: n}
		_, p := RunShard(nb, opt)
		// Through the file format, as between machines.
		q, err := ParsePart("part", p.Encode())
		if err != nil {
			t.Fatal(err)
		}
		parts, names = append(parts, q), append(names, fmt.Sprintf("part%d", i+1))
	}
	return parts, names
}

// Parts that are not the n shards of one run are refused, each with a
// message naming the files.
func TestMismatchedParts(t *testing.T) {
	nb := notebook(t, `identity("sum", lambda k: (k + k, 2 * k), over=lambda k: k, samples=10)`)
	other := notebook(t, `identity("sum", lambda k: (k + k, 2 * k), over=lambda k: k, samples=11)`)
	part := func(nb *cells.Notebook, i, n int64, seed int64) *Part {
		s := session.DefaultSettings
		s.Seed = seed
		_, p := RunShard(nb, Options{Settings: s, Shard: claim.Share{Index: i, Count: n}})
		return p
	}
	cases := []struct {
		parts []*Part
		want  string
	}{
		{[]*Part{part(nb, 0, 2, 1), part(other, 1, 2, 1)}, "come from different notebooks"},
		{[]*Part{part(nb, 0, 2, 1), part(nb, 1, 3, 1)}, "shard 1/2 but b is shard 2/3"},
		{[]*Part{part(nb, 0, 2, 1), part(nb, 1, 2, 7)}, "different settings (seed 1 and 7"},
		{[]*Part{part(nb, 0, 2, 1), part(nb, 0, 2, 1)}, "shard 1/2 is given twice (a and b)"},
		{[]*Part{part(nb, 0, 3, 1), part(nb, 2, 3, 1)}, "shard 2/3 is missing"},
	}
	for _, c := range cases {
		_, err := Merge(c.parts, []string{"a", "b"}, Options{})
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("merge: %v, want %q", err, c.want)
		}
	}
	old := part(nb, 0, 1, 1)
	old.Version = "0.0.1"
	if _, err := Merge([]*Part{old}, []string{"a"}, Options{}); err == nil || !strings.Contains(err.Error(), "merge with the version that ran the shards") {
		t.Errorf("old version: %v", err)
	}
	for _, c := range []struct{ data, want string }{
		{"not json", "not an assay part file"},
		{`{"format":"assay-part-9"}`, `format "assay-part-9"`},
		{`{"format":"assay-part-1","shard":3,"shards":2}`, "shard 3 of 2"},
	} {
		if _, err := ParsePart("p.json", []byte(c.data)); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("ParsePart(%q): %v, want %q", c.data, err, c.want)
		}
	}
	// A claim some shards ran and others did not cannot be merged.
	a, b := part(nb, 0, 2, 1), part(nb, 1, 2, 1)
	b.Claims = nil
	rep, err := Merge([]*Part{a, b}, []string{"a", "b"}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if e := rep.Outcomes[0].Error; e == nil || !strings.Contains(e.Message, `claim "sum" is in a but not in b`) || e.Line != 4 {
		t.Errorf("partial claim: %+v", e)
	}
}

// The progress line sums its workers and clears itself.
func TestProgressLine(t *testing.T) {
	if newProgressLine(nil) != nil {
		t.Error("no writer should mean no progress line")
	}
	var b bytes.Buffer
	p := newProgressLine(&b)
	p.update(0, claim.Progress{Claim: "c", Done: 300, Total: 5000})
	p.update(1, claim.Progress{Claim: "c", Done: 200, Total: 5000})
	if s := b.String(); !strings.Contains(s, "c: 500 of 10,000 samples") || !strings.Contains(s, "left") {
		t.Errorf("progress %q", s)
	}
	if grouped(1234567) != "1,234,567" || grouped(-1234) != "-1,234" || grouped(999) != "999" {
		t.Errorf("grouped: %s %s %s", grouped(1234567), grouped(-1234), grouped(999))
	}
	b.Reset()
	p.clear()
	if b.String() != "\r\033[K" {
		t.Errorf("clear wrote %q", b.String())
	}
}

// What f prints during a sweep is left out, and the claim says so, so that
// one kernel and several write the same report.
func TestPrintingInsideASweep(t *testing.T) {
	src := `def f(k):
    print("sample", k)
    return (k, k)
identity("noisy", f, over=lambda k: k, samples=300)
print("after")`
	one := runHere(t, src)
	o := one.Outcomes[0]
	if o.Output != "after\n" || !strings.Contains(o.Claims[0].Note, "printed during the sweep") {
		t.Errorf("output %q note %q", o.Output, o.Claims[0].Note)
	}
	t.Setenv("ASSAY_TEST_KERNEL", "1")
	two := Run(notebook(t, src), Options{Settings: session.DefaultSettings, Command: []string{os.Args[0]}, Workers: 2})
	sameRuns(t, "2 workers", one, two)
}

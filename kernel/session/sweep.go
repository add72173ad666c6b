package session

// Sampled claims. What a sample costs, measured on the exact identity of
// BenchmarkExactSampledIdentity (volume from coordinates against the
// Cayley–Menger volume on 10,000 random rational tetrahedra, the notebook
// run in-process on one CPU; processor time, cpu-ms/op, three alternating
// rounds on the shared 2-core machine at load 13–19, where every figure,
// the reference's too, runs about twice its quiet value):
//
//	before (GOGC=100)                         50–58 µs a sample
//	after, GOGC=100                           28–32 µs
//	after, GOGC=400 (then the kernel's)       22–25 µs (0.43–0.50 of before)
//	assay check --workers 1, whole run        before 80–93 µs, after 36–46 µs
//	reference, /tmp/peer-bin/tet (FLINT)      15–19 µs (its process, reading included)
//
// What the profile showed and what was cut: the Cayley–Menger determinant
// (46% of the time) reduced ten fractions d_ij and cleared their
// denominators again in Det, then ran Bareiss on fresh big.Ints; it now
// takes the integer matrix of s·d_ij (exact.DetInts, copies in one block
// of words, no allocation per step, unit pivots skipped). Drawing the
// random simplex (20%) reduced each coordinate in math/big; it now takes
// a word gcd. The collector (a third of the time) then ran at GOGC=400
// (kernel/proto.KernelGCPercent gives that measurement, and the later one
// that set it to 200). Since then the Gram matrix in words, fewer
// allocations, the division by 288 and the tally brought it to 13–16 µs
// a sample (figures at the top of exact/geom/simplex.go).
//
// The per-sample call path (issue 20), measured on an idle machine, -cpu 1,
// alternating go test -c binaries of main and this change, seven rounds,
// with the reference in the same run:
//
//	before                                  14.7–17.3 µs a sample (best 14.7), 130.6 allocations
//	after                                   13.7–15.6 µs (best 13.7), 115.6 allocations
//	reference, /tmp/peer-bin/tet (FLINT)    10.6–13.8 µs (best 10.6)
//
// What was cut: a builtin's parameter list is read once (interp.Signature),
// not parsed on each call, and its keywords are looked up by name rather
// than walked; the guard's label is made once; g and f, when notebook
// code, get one argument tuple for the whole sweep (caller); random_simplex
// draws its one word without making a generator (values.Env.Word); the
// zero residual's text is formatted once.
//
// The interpreter's and the claim's share of a sample (issue 20, December
// 2026): everything but the geometry — calling g and f, binding
// random_simplex's keywords, wrapping the simplex, t.volume_sq(),
// cayley_menger(t), / 288, the tuple, the comparison, the tally. Its share
// is the CPU samples under Session.sweep outside exact/geom (or outside
// exact, which leaves out the / 288) in profiles of
// BenchmarkExactSampledIdentity on one CPU, two profiles each; a sample's
// time is the benchmark's processor time, go test -c binaries of main and
// this change alternated, each round started when at most two tasks were
// runnable (the machine is shared), best six of 20 rounds, the reference
// in the same rounds; µs = share × best time:
//
//	                        outside geom           outside exact          a sample        allocations, bytes
//	before                  27–31% (3.4–3.9 µs)    25–29% (3.1–3.6 µs)    12.5–13.5 µs    115.6, 7,690
//	after                   17–19% (1.7–1.9 µs)    15–17% (1.5–1.8 µs)    10.3–11.8 µs    92.4, 6,145
//	reference, tet (FLINT)                                                9.9–10.5 µs
//
// (The profiled runs themselves ran at 12.3–13.8 µs a sample, which puts
// the share at 3.5–4.2 µs before and 2.0–2.4 µs after.)
// With the geometry of h21a and h21b (main at 40df6a6, and a trial merge
// of this change into it; one profile each, best six of 14 rounds): a
// sample 5.9–6.6 µs before, 4.2–4.3 µs after (the reference 10.4–10.7 in
// those rounds); outside geom 3.3 µs (56% of the sweep) before, 1.6 µs
// (36%) after, outside exact 3.0 and 1.4 µs; 46.6 allocations and 3,659
// bytes a sample before, 23.4 and 2,111 after.
// BenchmarkSampledCallPath, the same notebook on segments, whose geometry
// is a few word operations: 5.4–6.1 µs a sample before, 4.0–4.5 after;
// 78.7 allocations and 3,633 bytes a sample before, 56.3 and 2,124 after.
//
// What was cut: f and g run in one frame reused call after call
// (interp.Caller: no frame, value stack or locals made per call); builtins
// are called with their arguments bound straight off the interpreter's
// value stack (interp.Builtin: no keyword dictionary, no look-up per
// parameter; 0.4 µs of the 1.5 µs cut on segments); a rational over a
// machine integer makes no rational of the divisor, finds its session's
// arithmetic on the operand rather than through a traceback entry, and is
// reduced word by word into one block (exact.QuoInt); methods without
// parameters get no keyword dictionary (interp.PositionalMethod);
// arguments are bound into Args itself; a sampled identity's tally makes
// a sample's record only when it becomes the worst, and a zero residual
// is one shared value.
// What is left is gpython's own: the machine state of each frame
// (vm.RunFrame), tuples boxed as values, a bound method per attribute
// call, two map look-ups per global name.

import (
	"fmt"
	"math"
	"strings"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

// maxSamples bounds a sweep so a typo cannot run for hours.
const maxSamples = 10_000_000

// sampleCount reads samples=N (default 100) for a sampled claim.
func sampleCount(fn string, samples py.Object) (int64, error) {
	n, err := interp.Int(fn, "samples", samples, 100)
	if err != nil {
		return 0, err
	}
	if n < 1 || n > maxSamples {
		return 0, py.ExceptionNewf(py.ValueError, "%s(): samples must be between 1 and %d, got %d", fn, maxSamples, n)
	}
	return n, nil
}

// sampleTally is what one share of a sampled claim fills in as it sweeps.
type sampleTally interface {
	raised(k int64, msg string)                      // f raised on sample k
	visit(k int64, sample, lhs, rhs py.Object) error // f(sample k) = (lhs, rhs)
	into(t *claim.Tally)                             // put the share's part in its tally
}

// family is what a sampled claim sweeps: sample k = g(k), counted only
// when it meets the hypothesis h (nil: every sample), then f(sample).
type family struct{ f, g, h py.Object }

// hypothesis reads given=h of a claim: nil without one. A hypothesis
// needs samples to be tested on.
func hypothesis(fn string, a interp.Args) (py.Object, error) {
	h := a.Get("given")
	if h == nil || h == py.None {
		return nil, nil
	}
	if !a.Has("over") {
		return nil, py.ExceptionNewf(py.TypeError, "%s(): given= states a hypothesis, which is tested on samples: it needs over=g and samples=N (or give a list of polynomial hypotheses, given=[h1, h2, ...], for an identity proved from them)", fn)
	}
	if !interp.Callable(h) {
		return nil, py.ExceptionNewf(py.TypeError, "%s(): given= must be a function of the sample returning True or False, got %s", fn, interp.TypeName(h))
	}
	return h, nil
}

// meets decides whether sample meets the hypothesis h; why is set when h
// raised or did not return a bool, which counts as not met.
func meets(h, sample py.Object) (ok bool, why string) {
	res, err := py.Call(h, py.Tuple{sample}, nil)
	if err != nil {
		return false, interp.Message(err)
	}
	b, isBool := res.(py.Bool)
	if !isBool {
		return false, fmt.Sprintf("the hypothesis returned %s, not True or False", interp.TypeName(res))
	}
	return bool(b), ""
}

// sweepClaim sweeps a sampled claim's samples, split among kernels by the
// coordinator, and returns the merged tally, or the error that ended the
// sweep at its lowest sample. fresh makes the part one share fills.
func (s *Session) sweepClaim(ask claim.Ask, fam family, fresh func() sampleTally) (claim.Tally, error) {
	tally, err := s.distribute(ask, func(sh claim.Share) claim.Tally {
		began := time.Now()
		part := fresh()
		done, given, failed := s.sweep(ask, sh, fam, part.raised, part.visit)
		t := claim.Tally{Computed: done, Seconds: time.Since(began).Seconds(), Err: failed, Printed: s.printed, Given: given}
		part.into(&t)
		return t
	})
	if err != nil {
		return claim.Tally{}, err
	}
	if tally.Err != nil {
		return claim.Tally{}, raise(tally.Err)
	}
	return tally, nil
}

// confirmShown recomputes, as the sweep does, each sample that a tally
// joined from the parts of a sharded run names and the report will show,
// and refuses the merge when a part's record of it differs: a merged report
// shows no sample the merge has not confirmed itself. check compares the
// recomputed one-sample tally with the merged one at sample k.
func (s *Session) confirmShown(ask claim.Ask, fam family, merged claim.Tally, shown []int64, fresh func() sampleTally, check func(k int64, got claim.Tally) (want, have string)) error {
	if len(merged.Parts) == 0 {
		return nil
	}
	for _, k := range shown {
		part := fresh()
		single := claim.Ask{Claim: ask.Claim, Phase: ask.Phase, Line: ask.Line, Samples: k + 1}
		done, _, failed := s.sweep(single, claim.Share{Index: k, Count: k + 1}, fam, part.raised, part.visit)
		got := claim.Tally{Computed: done, Err: failed}
		part.into(&got)
		if failed != nil {
			return py.ExceptionNewf(py.RuntimeError, "merge refused: claim %q: sample %d, which %s records, raises here: %s", ask.Claim, k, merged.Part(k), failed.Message)
		}
		if want, have := check(k, got); want != have {
			return py.ExceptionNewf(py.RuntimeError, "merge refused: claim %q: %s records %s for sample %d, and the merge computes %s there; the part was altered or is not from this notebook", ask.Claim, merged.Part(k), have, k, want)
		}
	}
	return nil
}

// mergedNote tells the reader where a merged claim's samples were
// computed, and what the merge itself confirmed.
func mergedNote(t claim.Tally) string {
	if len(t.Parts) == 0 {
		return ""
	}
	return fmt.Sprintf("; merged: the samples were computed by the %d shard runs whose part files were merged, and the merge re-evaluated only the samples this claim shows", len(t.Parts))
}

// sweep computes a sampled claim's share of samples: sample k = g(k);
// with a hypothesis, a sample that does not meet it is counted in the
// share's GivenTally and goes no further; then f(sample), whose pair goes
// to visit. A sample on which f raises goes to raised and the sweep goes
// on; any other error ends the share and is returned with its sample
// index.
func (s *Session) sweep(a claim.Ask, sh claim.Share, fam family, raised func(k int64, msg string), visit func(k int64, sample, x, y py.Object) error) (int64, *claim.GivenTally, *claim.SweepError) {
	s.env.Sweeping, s.printed = true, false
	defer func() { s.env.Sweeping = false }()
	var given *claim.GivenTally
	if fam.h != nil {
		given = &claim.GivenTally{}
	}
	var failed *claim.SweepError
	g, f := interp.NewCaller(fam.g), interp.NewCaller(fam.f)
	done, _ := s.forShare(a, sh, func(k int64) error {
		sample, err := g.Call(py.Int(k))
		if err != nil {
			failed = &claim.SweepError{K: k, Type: "ValueError", Message: fmt.Sprintf("the sample generator raised at sample %d: %s", k, interp.Message(err))}
			return err
		}
		if given != nil {
			ok, why := meets(fam.h, sample)
			if why != "" {
				given.Raised++
				if given.FirstRaise == nil {
					given.FirstRaise = &claim.SampleNote{K: k, Text: claim.Clip(why, 160)}
				}
			}
			if !ok {
				given.NotMet++
				return nil
			}
			given.Met++
		}
		res, err := f.Call(sample)
		if err != nil {
			raised(k, interp.Message(err))
			return nil
		}
		x, y, err := samplePair(res, k)
		if err == nil {
			if given != nil && zero(x) && zero(y) {
				given.Trivial++
				if given.FirstTrivial == nil {
					given.FirstTrivial = &claim.SampleNote{K: k}
				}
			}
			err = visit(k, sample, x, y)
		}
		if err != nil {
			failed = sweepError(k, err)
		}
		return err
	})
	return done, given, failed
}

// zero reports whether o is the exact number 0.
func zero(o py.Object) bool {
	if _, isBool := o.(py.Bool); isBool {
		return false
	}
	v, ok := values.ExactOf(o)
	return ok && v.Sign() == 0
}

// met is how many samples reached f: those that met the hypothesis, or
// all n without one.
func met(t claim.Tally, n int64) int64 {
	if t.Given == nil {
		return n
	}
	return t.Given.Met
}

// givenNote says how the samples fared against the hypothesis ("" without
// one).
func givenNote(t claim.Tally, n int64) string {
	if t.Given == nil {
		return ""
	}
	return "; " + t.Given.Note(n)
}

// noneMet makes a claim on which no sample met the hypothesis undecided,
// and reports whether it did.
func noneMet(c *cells.Claim, t claim.Tally, n int64) bool {
	if t.Given == nil || t.Given.Met > 0 {
		return false
	}
	c.Verdict, c.Why, c.Samples = cells.Undecided, cells.NoSampleMet, int(n)
	c.Residual = "none: no sample met the hypothesis"
	c.Note = "no sample met the hypothesis, so nothing was checked; " + t.Given.Note(n)
	return true
}

// sweepError records an error that ended the sweep at sample k.
func sweepError(k int64, err error) *claim.SweepError {
	e := &claim.SweepError{K: k, Type: "ValueError", Message: interp.Message(err)}
	if pe, ok := err.(*py.Exception); ok {
		e.Type, e.Message = pe.Base.Name, interp.ExceptionMessage(pe)
	}
	return e
}

// raise turns a recorded sweep error back into the exception it was.
func raise(e *claim.SweepError) error {
	kinds := map[string]*py.Type{"TypeError": py.TypeError, "ValueError": py.ValueError,
		"ZeroDivisionError": py.ZeroDivisionError, "ArithmeticError": py.ArithmeticError}
	kind, ok := kinds[e.Type]
	if !ok {
		kind = py.ValueError
	}
	return py.ExceptionNewf(kind, "%s", e.Message)
}

// sampleCode rebuilds sample k for the report (g is deterministic) as
// cell code that makes it again; ok is false for a sample that has no such
// code (a certified real that is not rational), whose printed form is
// given instead, as is the message if g raises now.
func sampleCode(g py.Object, k int64) (string, bool) { return code(sampleAt(g, k)) }

// code prints a value as the cell code that rebuilds it: its repr, except
// that a polynomial is wrapped in polynomial("…"), a rational function
// is the quotient of two such, and lists and tuples are printed item by
// item. An irrational certified real has such code only when it prints as
// its closed form (exact.ClosedForm), which is exactly its value; a simplex
// whose points were given with such reals has none.
func code(o py.Object) (string, bool) {
	switch v := o.(type) {
	case *values.Polynomial:
		return fmt.Sprintf("polynomial(%q)", interp.Str(v)), true
	case *values.RationalFunction:
		f := v.Value()
		return fmt.Sprintf("polynomial(%q) / polynomial(%q)", f.Num().String(), f.Den().String()), true
	case *values.Simplex:
		if v.CertifiedPoints() {
			return interp.Str(v), false
		}
	case *values.Real:
		x, _ := values.RealOf(v)
		if q, ok := x.Rat(); ok {
			return exact.FormatRat(q), true
		}
		text := interp.Str(v)
		form, ok := x.ClosedForm(exact.ClosedFormMaxLen)
		return text, ok && form == text && exact.ClosedFormIsCode(form)
	case *py.List, py.Tuple:
		items, _ := interp.Items(v)
		parts := make([]string, len(items))
		all := true
		for i, it := range items {
			var ok bool
			parts[i], ok = code(it)
			all = all && ok
		}
		if _, isList := v.(*py.List); isList {
			return "[" + strings.Join(parts, ", ") + "]", all
		}
		if len(parts) == 1 {
			return "(" + parts[0] + ",)", all
		}
		return "(" + strings.Join(parts, ", ") + ")", all
	}
	r, err := py.Repr(o)
	if err != nil {
		return interp.Str(o), false
	}
	return interp.Str(r), true
}

// shownSample is how a claim shows sample k: its cell code in c.Sample and
// in the Worst line, or, for a sample without code, its printed form in
// Worst only, saying so.
func shownSample(g py.Object, k int64) (sample, worst string) {
	text, ok := sampleCode(g, k)
	if !ok {
		return "", fmt.Sprintf("sample %d: %s (printed, not cell code: it holds a certified real)", k, claim.Clip(text, 200))
	}
	return text, fmt.Sprintf("sample %d: %s", k, claim.Clip(text, 200))
}

func sampleAt(g py.Object, k int64) py.Object {
	v, err := py.Call(g, py.Tuple{py.Int(k)}, nil)
	if err != nil {
		return py.String(interp.Message(err))
	}
	return v
}

// printedNote tells the reader that f or g printed during a sweep.
func printedNote(t claim.Tally) string {
	if !t.Printed {
		return ""
	}
	return "; f or g printed during the sweep, and that text is left out of the report: samples may be computed by other kernels, in any order"
}

// schwartzZippel turns degree=d on a sampled identity into the statement
// it licenses: a non-zero polynomial of total degree <= d vanishes at a
// uniformly random point of S^n with probability at most d/|S|
// (Schwartz 1980, Zippel 1979), so N independent zero samples leave a
// false identity a chance of at most (d/|S|)^N.
func schwartzZippel(over, degree py.Object) (func(n int64) string, error) {
	if degree == nil || degree == py.None {
		return nil, nil
	}
	d, err := interp.Int("identity", "degree", degree, 0)
	if err != nil || d < 1 {
		return nil, py.ExceptionNewf(py.ValueError, "identity(): degree must be a positive integer (the total degree of lhs - rhs)")
	}
	b, ok := over.(*values.Box)
	if !ok || !b.Integer() {
		return nil, py.ExceptionNewf(py.TypeError, "identity(): degree= needs over=box(dim, lo, hi) with integer points (denom=1), so the sample set S is known")
	}
	size := b.Hi - b.Lo + 1
	return func(n int64) string {
		if d >= size {
			return fmt.Sprintf("Schwartz–Zippel gives nothing here: degree %d is not below |S| = %d", d, size)
		}
		log10 := float64(n) * math.Log10(float64(d)/float64(size))
		return fmt.Sprintf("Schwartz–Zippel: a false polynomial identity of degree <= %d passes %d independent samples from {%d..%d}^%d with probability at most (%d/%d)^%d = 10^%.1f", d, n, b.Lo, b.Hi, b.Dim, d, size, n, log10)
	}, nil
}

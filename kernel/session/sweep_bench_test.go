// An external test package, so that it can read proto.KernelGCPercent
// (package proto imports session).
package session_test

import (
	"os"
	"runtime/debug"
	"strconv"
	"strings"
	"testing"

	"assay/cells"
	"assay/kernel/proto"
	"assay/kernel/session"
)

// BenchmarkSampledCallPath: the interpreter's and the claim's share of a
// sample — calling g and f, binding random_simplex's keywords, wrapping
// the simplex, the method call, the builtin call, the division of an
// exact rational by an int, the tuple, the comparison and the tally —
// with the geometry made negligible: the notebook of
// BenchmarkExactSampledIdentity (kernel/bench_test.go) on segments, whose
// squared length is half the 3×3 Cayley–Menger determinant (V² =
// (−1)^(n+1)/(2^n (n!)²)·CM for an n-simplex, Blumenthal, "Theory and
// applications of distance geometry", 1953). 10,000 samples a run.
func BenchmarkSampledCallPath(b *testing.B) {
	sess, err := session.New(session.DefaultSettings)
	if err != nil {
		b.Fatal(err)
	}
	defer sess.Close()
	if _, set := os.LookupEnv("GOGC"); !set {
		// The collector as a kernel process runs it (proto.KernelGCPercent).
		defer debug.SetGCPercent(debug.SetGCPercent(proto.KernelGCPercent))
	}
	src := "identity(\"segment NAME\", lambda t: (t.volume_sq(), cayley_menger(t) / 2),\n" +
		"         over=lambda k: random_simplex(1, seed=k, bound=1000, denom=100), samples=10000, companion=False)\n"
	k := 1
	for b.Loop() {
		o := sess.Run(session.Cell{Index: k, Line: 10 * k, Source: strings.Replace(src, "NAME", strconv.Itoa(k), 1)})
		k++
		if o.Error != nil || len(o.Claims) != 1 || o.Claims[0].Verdict != cells.Holds {
			b.Fatalf("%+v", o)
		}
	}
}

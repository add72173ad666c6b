package kernel

import (
	"os"
	"runtime/debug"
	"testing"

	"assay/cells"
	"assay/kernel/cputime"
	"assay/kernel/proto"
	"assay/kernel/session"
)

// BenchmarkRealSampledIdentity: a 256-bit identity with square-root sides
// on 1,000 sampled tetrahedra, the whole notebook run in-process.
// Target (issue: certified reals): < 1 s.
func BenchmarkRealSampledIdentity(b *testing.B) {
	src := []byte("# bench\n\n```cell\n" +
		"def sides(t):\n" +
		"    x, y = t.sq_edge(0, 1), t.sq_edge(2, 3)\n" +
		"    return (sqrt(x) * sqrt(y) + sqrt(t.sq_edge(0, 2)), sqrt(x * y) + sqrt(t.sq_edge(0, 2)))\n" +
		"identity(\"sqrt(x) sqrt(y) = sqrt(xy) on tetrahedron edges\", sides,\n" +
		"         over=lambda k: random_simplex(3, seed=k, bound=50, denom=7), samples=1000)\n```\n")
	benchNotebook(b, src, cells.HoldsToDigits)
}

// BenchmarkExactSampledIdentity: exact volume from coordinates against the
// Cayley–Menger volume on 10,000 random rational tetrahedra, the whole
// notebook run in-process. Target (design): < 1 s.
func BenchmarkExactSampledIdentity(b *testing.B) {
	src := []byte("# bench\n\n```cell\n" +
		"identity(\"volume from coordinates = Cayley-Menger volume\",\n" +
		"         lambda t: (t.volume_sq(), cayley_menger(t) / 288),\n" +
		"         over=lambda k: random_simplex(3, seed=k, bound=1000, denom=100), samples=10000, companion=False)\n```\n")
	benchNotebook(b, src, cells.Holds)
}

// BenchmarkAuditedSampledIdentity: Kahan's triangle area against the exact
// one on 2,000 decimal triangles, with the float64 audit (rerun as float64
// code per sample; split into input and formula error at the worst
// sample only), the whole notebook run in-process. Both sides are square
// roots, proved equal on every sample by the zero bound: "holds".
func BenchmarkAuditedSampledIdentity(b *testing.B) {
	src := []byte("# bench\n\n```cell\n" +
		"def kahan(a, b, c):\n" +
		"    return sqrt((a + (b + c)) * (c - (a - b)) * (c + (a - b)) * (a + (b - c))) / 4\n" +
		"def area(a, b, c):\n" +
		"    return sqrt((a + b + c) * (-a + b + c) * (a - b + c) * (a + b - c)) / 4\n" +
		"identity(\"Kahan's area\", lambda x: (kahan(x[0], x[1], x[2]), area(x[0], x[1], x[2])),\n" +
		"         over=lambda k: [frac(\"100000\") + k, frac(\"99999.99979\") + k, frac(\"0.00029\")], samples=2000)\n```\n")
	benchNotebook(b, src, cells.Holds)
}

// benchNotebook runs a one-claim notebook in-process b.N times and checks
// the claim's verdict every time, with the collector set as in a kernel
// process (proto.KernelGCPercent), unless GOGC is set.
func benchNotebook(b *testing.B, src []byte, want cells.Verdict) {
	nb, err := cells.Parse("bench.md", src)
	if err != nil {
		b.Fatal(err)
	}
	if _, set := os.LookupEnv("GOGC"); !set {
		defer debug.SetGCPercent(debug.SetGCPercent(proto.KernelGCPercent))
	}
	b.ResetTimer()
	cpu0, ok := cputime.Self()
	for i := 0; i < b.N; i++ {
		rep := Run(nb, Options{Settings: session.DefaultSettings})
		if c := rep.Outcomes[0].Claims; len(c) != 1 || c[0].Verdict != want {
			b.Fatalf("outcome %+v", rep.Outcomes[0])
		}
	}
	if cpu1, _ := cputime.Self(); ok {
		// On a shared machine the processor time, not the wall time,
		// is what the notebook costs.
		b.ReportMetric(float64(cpu1-cpu0)/1e6/float64(b.N), "cpu-ms/op")
	}
}

// BenchmarkSimplexShapeSampled: the rest of a tetrahedron's geometry
// (centroid, containment, touch points, tangent lengths, exradii and
// excentres, facet normals, altitudes, the twelve face angles, the four
// solid angles, barycentric coordinates of the vertices and the quality
// measures: 45 results, each certified real that goes through acos, atan2
// or a quotient evaluated once at 64 bits, the rest left lazy) on 1,000
// random tetrahedra, the claim only counting the results, the whole
// notebook run in-process. Issue 18's target is 10,000 tetrahedra in
// < 1 s; see the figures in the README's simplex section.
func BenchmarkSimplexShapeSampled(b *testing.B) {
	src := []byte("# bench\n\n```cell\n" +
		"def everything(t):\n" +
		"    out = [t.centroid(), t.contains(t.centroid()), t.touch_points(), t.tangent_lengths(), t.radius_ratio(),\n" +
		"           t.volume_length_ratio(), t.min_dihedral_angle(), t.max_dihedral_angle(), t.aspect_ratio()]\n" +
		"    for i in range(4):\n" +
		"        out = out + [t.exradius(i), t.excenter(i), t.facet_normal(i), t.altitude(i), t.solid_angle(i), t.barycentric(t.points()[i])]\n" +
		"        for j in range(4):\n" +
		"            for k in range(j + 1, 4):\n" +
		"                if i != j and i != k:\n" +
		"                    out.append(t.vertex_angle(i, j, k))\n" +
		"    return len(out)\n" +
		"identity(\"45 results per tetrahedron\", lambda t: (everything(t), 45),\n" +
		"         over=lambda k: random_simplex(3, seed=k, bound=1000, denom=100), samples=1000, companion=False)\n```\n")
	benchNotebook(b, src, cells.Holds)
}

// BenchmarkSeriesInradius: series() of the inradius of the sliver demo's
// squeezed tetrahedron to order 6, proved equal to its leading term by an
// asymptotic claim, the whole notebook run in-process. Target (issue:
// degenerations proved by series): < 50 ms.
func BenchmarkSeriesInradius(b *testing.B) {
	src := []byte("# bench\n\n```cell\n" +
		"def squeezed(t):\n" +
		"    return simplex([[x, y, t * z] for x, y, z in [[0, 0, 0], [4, 0, 1], [1, 3, 2], [3, 2, -1]]])\n" +
		"s = series(lambda t: squeezed(t).inradius(), order=6)\n" +
		"asymptotic(\"inradius ~ 7/6 t\", lambda t: squeezed(t).inradius(), expect=(frac(7, 6), 1))\n```\n")
	benchNotebook(b, src, cells.Holds)
}

// BenchmarkSeriesCircumcenter: the sliver demo's claim on a new series
// measure — the circumcentre running off as (18/35)/t — and series() of
// a touch point and of the radius ratio, the whole notebook run in-process (figures at the top of
// exact/geom/series_shape.go).
func BenchmarkSeriesCircumcenter(b *testing.B) {
	src := []byte("# bench\n\n```cell\n" +
		"def squeezed(t):\n" +
		"    return simplex([[x, y, t * z] for x, y, z in [[0, 0, 0], [4, 0, 1], [1, 3, 2], [3, 2, -1]]])\n" +
		"s = series(lambda t: squeezed(t).touch_points()[3][2], order=6)\n" +
		"asymptotic(\"circumcentre height\", lambda t: squeezed(t).circumcenter()[2], expect=(frac(18, 35), -1))\n" +
		"r = series(lambda t: squeezed(t).radius_ratio(), order=6)\n```\n")
	benchNotebook(b, src, cells.Holds)
}

package geom

import (
	"fmt"
	"math/big"
	"math/rand"
	"testing"

	"assay/exact"
	"assay/kernel/cputime"
)

// volumeSqFromCoords returns V² of the simplex on pts from the coordinates
// alone, in big.Rat: det(E Eᵀ)/(k!)² with E the edge vectors v_i − v_0 (the
// Gram determinant formula, common practice), the determinant by
// exact.Matrix.Det on the rational Gram matrix.
func volumeSqFromCoords(t *testing.T, pts [][]*big.Rat) *big.Rat {
	t.Helper()
	k := len(pts) - 1
	g := exact.Zeros(k, k)
	for i := 1; i <= k; i++ {
		for j := 1; j <= k; j++ {
			g.Set(i-1, j-1, dot(sub(pts[i], pts[0]), sub(pts[j], pts[0])))
		}
	}
	d, err := g.Det()
	if err != nil {
		t.Fatal(err)
	}
	f := new(big.Rat).SetInt(factorial(k))
	return d.Quo(d.Quo(d, f), f)
}

// checkCayleyMenger checks CayleyMenger on the points simplex from pts
// against the Cayley–Menger formula det CM = (−1)^(k+1) 2^k (k!)² V²
// (Blumenthal, "Theory and Applications of Distance Geometry", 1953;
// cited from memory) with V² from the coordinates, against the
// determinant of the rational bordered matrix (exact.Matrix.Det) and
// against the math/big route cmBig, and scaledEdges against the squared
// distances from the coordinates; wide says whether the word route must
// have taken it.
func checkCayleyMenger(t *testing.T, label string, pts [][]*big.Rat, wide bool) {
	t.Helper()
	s := mustPoints(t, pts...)
	k := s.Dim()
	want := volumeSqFromCoords(t, pts)
	f := factorial(k)
	want.Mul(want, new(big.Rat).SetInt(new(big.Int).Lsh(new(big.Int).Mul(f, f), uint(k))))
	if k%2 == 0 {
		want.Neg(want)
	}
	got := s.CayleyMenger()
	ratEq(t, label+": CayleyMenger vs (−1)^(k+1) 2^k (k!)² V²", got, want)
	if got.Num().Cmp(want.Num()) != 0 || got.Denom().Cmp(want.Denom()) != 0 {
		t.Errorf("%s: CayleyMenger %v/%v not in lowest terms (%s)", label, got.Num(), got.Denom(), want.RatString())
	}
	byDet, err := s.CayleyMengerMatrix().Det()
	if err != nil {
		t.Fatal(err)
	}
	ratEq(t, label+": CayleyMenger vs det of the bordered matrix", got, byDet)
	// The scaled squared distances (in words where edgesWide takes them)
	// against |v_i − v_j|² from the coordinates.
	e := s.scaledEdges()
	for i := range pts {
		for j := range pts {
			d := sub(pts[i], pts[j])
			ratEq(t, fmt.Sprintf("%s: scaledEdges[%d][%d]/s", label, i, j), new(big.Rat).SetFrac(e[i][j], s.s), dot(d, d))
		}
	}
	fresh := mustPoints(t, pts...)
	ratEq(t, label+": cmBig", fresh.cmBig(), want)
	if _, ok := mustPoints(t, pts...).cmWide(); ok != wide {
		t.Errorf("%s: word route taken %v, want %v", label, ok, wide)
	}
}

// The Cayley–Menger determinant of points simplices on both routes: the
// kernel's random tetrahedra (Random(3, seed, 1000, 100)) and dimensions
// 0..3 in words; dimensions 4..6 (with s a word's square or not), an lcm
// of denominators past a word
// (s = l² not a word's square) and coordinates up to 2^95 (Gram entries
// past 2^186) in math/big; degenerate simplices (0) on both.
func TestCayleyMengerRoutes(t *testing.T) {
	for seed := uint64(0); seed < 300; seed++ {
		pts, _ := Random(3, seed, 1000, 100).Points()
		checkCayleyMenger(t, fmt.Sprintf("tetrahedron seed %d", seed), pts, true)
	}
	for k := 0; k <= 6; k++ {
		for seed := uint64(0); seed < 4; seed++ {
			pts, _ := Random(k, seed, 1000, 100).Points()
			checkCayleyMenger(t, fmt.Sprintf("k=%d seed %d", k, seed), pts, k <= 3)
			// Denominators up to 6: s a word's square at every k, so that
			// cmBig reduces by word gcds from k = 4 on.
			pts, _ = Random(k, seed, 1000, 6).Points()
			checkCayleyMenger(t, fmt.Sprintf("k=%d seed %d, denominators <= 6", k, seed), pts, k <= 3)
		}
	}
	rng := rand.New(rand.NewSource(25))
	// Denominators distinct primes near 2^30: their lcm passes 2^64.
	primes := []int64{1073741789, 1073741783, 1073741741, 1073741723, 1073741719, 1073741717}
	var wideDen, huge, flat [][]*big.Rat
	hugeNum := new(big.Int).Lsh(big.NewInt(1), 94)
	for i := 0; i < 4; i++ {
		p := make([]*big.Rat, 3)
		h := make([]*big.Rat, 3)
		for c := range p {
			p[c] = big.NewRat(rng.Int63n(2001)-1000, primes[(i+c)%len(primes)])
			x := new(big.Int).Rand(rng, hugeNum)
			if rng.Intn(2) == 0 {
				x.Neg(x)
			}
			h[c] = new(big.Rat).SetInt(x.Add(x, hugeNum))
		}
		wideDen, huge = append(wideDen, p), append(huge, h)
	}
	checkCayleyMenger(t, "lcm past a word", wideDen, false)
	checkCayleyMenger(t, "coordinates up to 2^95", huge, false)
	// Four coplanar points (z = x + y): CM = 0.
	for i := 0; i < 4; i++ {
		x, y := big.NewRat(rng.Int63n(100), 7), big.NewRat(rng.Int63n(100), 3)
		flat = append(flat, []*big.Rat{x, y, new(big.Rat).Add(x, y)})
	}
	checkCayleyMenger(t, "coplanar", flat, true)
	checkCayleyMenger(t, "a repeated point", [][]*big.Rat{vec(1, 2), vec(1, 2)}, true)
}

// wordRoot against big.Int.Sqrt, at the ends of its range and at random.
func TestWordRoot(t *testing.T) {
	rng := rand.New(rand.NewSource(26))
	one := big.NewInt(1)
	max64 := new(big.Int).SetUint64(1<<64 - 1)
	cases := []*big.Int{
		big.NewInt(0), one, new(big.Int).Lsh(one, 64), new(big.Int).Mul(max64, max64),
		new(big.Int).Sub(new(big.Int).Mul(max64, max64), one), new(big.Int).Sub(new(big.Int).Lsh(one, 128), one),
		new(big.Int).Lsh(one, 128), new(big.Int).Add(new(big.Int).Lsh(one, 64), one),
	}
	for range 300 {
		r := new(big.Int).SetUint64(rng.Uint64() >> uint(rng.Intn(40)))
		sq := new(big.Int).Mul(r, r)
		cases = append(cases, sq, new(big.Int).Add(sq, one), new(big.Int).Sub(sq, one))
	}
	for _, s := range cases {
		if s.Sign() < 0 {
			continue
		}
		f, p, ok := wordRoot(s)
		switch {
		case s.IsUint64():
			if !ok || p != 1 || f != s.Uint64() {
				t.Errorf("wordRoot(%v) = %d, %d, %v; want itself", s, f, p, ok)
			}
		default:
			r := new(big.Int).Sqrt(s)
			square := r.IsUint64() && new(big.Int).Mul(r, r).Cmp(s) == 0
			if ok != square || ok && (p != 2 || f != r.Uint64()) {
				t.Errorf("wordRoot(%v) = %d, %d, %v; square of a word: %v", s, f, p, ok, square)
			}
		}
	}
}

// BenchmarkCayleyMengerTet times CayleyMenger, per op, on one of the
// tetrahedra Random(3, seed, 1000, 100), seeds 0..1023 in turn (those of
// the kernel's sampled-identity benchmark), each a fresh Simplex sharing
// only the points and the scaled Gram matrix, so that no cached integer
// is reused; it reports the processor time too (cpu-ns/op), steadier on
// a shared machine. Target: 1.5 µs (it was ~4.3 µs in the profile of
// BenchmarkExactSampledIdentity).
func BenchmarkCayleyMengerTet(b *testing.B) {
	ts := make([]*Simplex, 1024)
	for i := range ts {
		ts[i] = Random(3, uint64(i), 1000, 100)
	}
	i := 0
	cpu0, ok := cputime.Self()
	defer func() {
		if cpu1, _ := cputime.Self(); ok {
			b.ReportMetric(float64(cpu1-cpu0)/float64(b.N), "cpu-ns/op")
		}
	}()
	for b.Loop() {
		s := ts[i%len(ts)]
		i++
		f := &Simplex{k: s.k, n: s.n, pts: s.pts, g: s.g, s: s.s}
		if f.CayleyMenger().Sign() <= 0 { // 288 V² for a tetrahedron
			b.Fatal("non-positive Cayley–Menger determinant")
		}
	}
}

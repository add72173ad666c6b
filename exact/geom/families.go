package geom

// Random and the volume of what it draws (issue 20: the sampled identity
// on tetrahedra). BenchmarkRandomVolumeSq — Random(3, k, 1000, 100), then
// VolumeSq, what random_simplex(3, seed=k, bound=1000, denom=100) and
// t.volume_sq() cost a notebook sample in geom — measured as process CPU
// a sample (best of 15 runs of 20,000 samples, GOGC=400, one core; old
// and new builds alternated, five rounds, on the shared 2-core machine at
// load 4–5):
//
//	before (main at 3de8599)   4.5–5.0 µs (one round 6.6), 53 allocations, 3.4 KB a sample
//	after                      1.5–1.6 µs (one round 1.9),  4 allocations, 1.2 KB
//
// BenchmarkExactSampledIdentity (kernel, the whole notebook sample, CPU a
// sample, best of eight alternated rounds at load 6–8): 13.5 µs before,
// 9.5 µs after; 8.9 µs with CayleyMenger's final reduction by ratWordPow
// (tried, not part of this change). Cut: the draw on a PCG on the stack (uniformN)
// into words, which the simplex keeps (wpts), making big.Rats of them
// only when a method hands the points out (Simplex.points); the lcm, the
// edge vectors, the Gram matrix and, for k = n <= 3, the edge determinant
// in words (fromWordPoints, edgeWords, setGramWords, detWords), a
// tetrahedron and all it keeps in one allocation (smallWordSimplex); the
// degeneracy test and the volume from that determinant — its sign; its
// value over l^k k! reduced a word factor at a time (exact.ReduceWordPow), then
// squared — instead of the Gram adjugate (computeCore) and a gcd of
// six-word numbers; word gcds by the binary algorithm after one Euclid
// step (exact.GCDWord). Other volumes of word simplices reduce against l
// in words too (ratWordPow, also what a Cayley–Menger determinant over s^k could
// use: half of ratFrac's time there). That reduction was geom's own, by
// division instructions, and is now exact's (ReduceWordPow, DetWideOver's
// chain by Hensel division): VolumeSq on 1,024 drawn tetrahedra, process
// CPU new/old in ten alternated rounds at load 6–8, 0.71–1.38, median
// 0.95; BenchmarkCayleyMengerTet 0.66–1.30, median 0.9 — no slower.

import (
	"fmt"
	"math/big"
	"math/bits"
	"math/rand/v2"

	"assay/exact"
)

// Random returns a reproducible random non-degenerate dim-simplex: dim+1
// points of R^dim whose coordinates are p/q with p uniform in
// [−bound, bound] and q uniform in [1, denom], drawn in order (point by
// point, coordinate by coordinate, numerator then denominator) from
// math/rand/v2's PCG seeded with rand.NewPCG(seed, 0), as
// rand.New(rand.NewPCG(seed, 0)).Uint64N(2·bound+1) and Int64N(denom)
// draw them. Draws that give a degenerate simplex are discarded and the
// next dim+1 points drawn from the same stream. It panics if dim < 0,
// bound < 1 or denom < 1.
func Random(dim int, seed uint64, bound, denom int64) *Simplex {
	if dim < 0 || bound < 1 || denom < 1 {
		panic(fmt.Sprintf("geom: Random(dim=%d, bound=%d, denom=%d): need dim >= 0, bound >= 1, denom >= 1", dim, bound, denom))
	}
	var pcg rand.PCG // on the stack: rand.New would put it and the Rand on the heap
	pcg.Seed(seed, 0)
	span := uint64(bound)*2 + 1 // bound <= MaxInt64, so no overflow
	// The words drawn, on the stack for a tetrahedron (fromWordPoints
	// copies them).
	var buf [24]int64
	var c []int64
	if m := 2 * (dim + 1) * dim; m > len(buf) {
		c = make([]int64, m)
	} else {
		c = buf[:m]
	}
	for {
		// The simplex keeps the words and makes big.Rats of them only
		// when a method hands the points out (Simplex.points).
		for i := 0; i < len(c); i += 2 {
			p := int64(uniformN(&pcg, span) - uint64(bound))
			q := 1 + int64(uniformN(&pcg, uint64(denom)))
			c[i], c[i+1] = lowestTerms(p, q)
		}
		if s := fromWordPoints(dim, dim, c); !s.IsDegenerate() {
			return s
		}
	}
}

// uniformN returns a uniform draw from [0, n), n >= 1, from p's stream
// exactly as math/rand/v2's Rand.Uint64N does (on every platform; its
// 32-bit code keeps the 64-bit sequence): Lemire's multiply-and-reject
// method (D. Lemire, "Fast random integer generation in an interval",
// ACM TOMACS 29 (2019) 3:1–3:12) — the high word of x·n for a 64-bit
// draw x, drawing again while the low word falls below 2^64 mod n — and a
// mask when n is a power of two. TestRandomDrawsAsMathRand checks it
// against math/rand/v2.
func uniformN(p *rand.PCG, n uint64) uint64 {
	if n&(n-1) == 0 {
		return p.Uint64() & (n - 1)
	}
	hi, lo := bits.Mul64(p.Uint64(), n)
	if lo < n { // only then can lo fall below 2^64 mod n (< n)
		thresh := -n % n // 2^64 mod n
		for lo < thresh {
			hi, lo = bits.Mul64(p.Uint64(), n)
		}
	}
	return hi
}

// lowestTerms returns p/q (q > 0) in lowest terms, by a word gcd.
func lowestTerms(p, q int64) (int64, int64) {
	a := p
	if a < 0 {
		a = -a // |p| <= MaxInt64 here: p comes from [−bound, bound]
	}
	if g := int64(exact.GCDWord(uint64(a), uint64(q))); g > 1 {
		return p / g, q / g
	}
	return p, q
}

// setFrac64 sets z to p/q (q > 0), reduced by a word gcd: big.NewRat
// would reduce it again in math/big.
func setFrac64(z *big.Rat, p, q int64) *big.Rat {
	p, q = lowestTerms(p, q)
	z.SetInt64(p) // the denominator is now a word 1, which Denom hands out
	z.Denom().SetInt64(q)
	return z
}

// The four families below (Sliver, Cap, Needle, WedgeTetrahedron — the
// last is not called Wedge, which is the exterior product) are the standard pictures of badly shaped
// tetrahedra in mesh generation (sliver, cap, needle, wedge), with the
// coordinates of the LaGriT documentation's example tetrahedra
// ("QUALITY_sliver_cap_needle_wedge", Los Alamos) for t = 1/10, and t as
// the parameter that sends each to its degenerate limit as t → 0. The
// parameter should be positive; t = 0 gives the degenerate limit and a
// negative t the mirror image. They panic on a nil t.

func ratPoints(t *big.Rat, coords [4][3][2]int64) *Simplex {
	if t == nil {
		panic("geom: nil parameter t")
	}
	pts := make([][]*big.Rat, 4)
	for i, p := range coords {
		pts[i] = make([]*big.Rat, 3)
		for c, ab := range p {
			// coordinate a + b·t
			z := new(big.Rat).Mul(t, big.NewRat(ab[1], 1))
			pts[i][c] = z.Add(z, big.NewRat(ab[0], 1))
		}
	}
	return fromOwnedPoints(pts)
}

// Sliver returns the tetrahedron with vertices (1, 0, t), (−1, 0, t),
// (0, 1, −t), (0, −1, −t): four well-spread vertices near the plane z = 0
// (near a common circle), two opposite edges crossing at height difference
// 2t. Its edges stay between √2 and 2 (for t <= 1/√2) while the volume is
// 4t/3 → 0; the dihedral angles tend to 0 and 180 degrees, but no face
// is small and no edge short.
func Sliver(t *big.Rat) *Simplex {
	return ratPoints(t, [4][3][2]int64{
		{{1, 0}, {0, 0}, {0, 1}},
		{{-1, 0}, {0, 0}, {0, 1}},
		{{0, 0}, {1, 0}, {0, -1}},
		{{0, 0}, {-1, 0}, {0, -1}},
	})
}

// Cap returns the tetrahedron with vertices (1, 0, 0), (1, 1, 0),
// (0, 0, 0), (3/4, 1/4, t): the apex lies at height t above the plane of
// the opposite (right isosceles) triangle and projects to (3/4, 1/4, 0),
// inside it. Every edge stays at least √(1/8) long while the volume is
// t/6 → 0; the largest solid angle (at the apex) tends to 2π and the
// dihedral angles at the apex's edges to 180 degrees.
func Cap(t *big.Rat) *Simplex {
	q := big.NewRat(3, 4)
	if t == nil {
		panic("geom: nil parameter t")
	}
	pts := [][]*big.Rat{
		{big.NewRat(1, 1), new(big.Rat), new(big.Rat)},
		{big.NewRat(1, 1), big.NewRat(1, 1), new(big.Rat)},
		{new(big.Rat), new(big.Rat), new(big.Rat)},
		{q, big.NewRat(1, 4), new(big.Rat).Set(t)},
	}
	return fromOwnedPoints(pts)
}

// Needle returns the tetrahedron with vertices (t, −t, 0), (t, t, 0),
// (−t, 0, 0), (0, 0, 1): three vertices close together (a triangle of
// sides 2t, √5 t, √5 t) and the fourth at distance about 1. The three
// short edges shrink like t, the three long ones stay near 1, and the
// volume is 2t²/3 → 0. The dihedral angles stay bounded away from 0 and
// 180 degrees: those at the short edges tend to 90 degrees, those at the
// long edges to the angles of the small triangle (arccos(3/5) ≈ 53.13
// degrees and twice ≈ 63.43 degrees).
func Needle(t *big.Rat) *Simplex {
	return ratPoints(t, [4][3][2]int64{
		{{0, 1}, {0, -1}, {0, 0}},
		{{0, 1}, {0, 1}, {0, 0}},
		{{0, -1}, {0, 0}, {0, 0}},
		{{0, 0}, {0, 0}, {1, 0}},
	})
}

// WedgeTetrahedron returns the tetrahedron with vertices (1, 0, 0), (−1, 0, 0),
// (0, 1, t), (0, 1, −t): two vertices collapse onto (0, 1, 0), so one
// edge has length 2t while the other five stay between √2 and 2, and the
// volume is 2t/3 → 0. The dihedral angle at the long edge opposite the
// short one tends to 0.
func WedgeTetrahedron(t *big.Rat) *Simplex {
	return ratPoints(t, [4][3][2]int64{
		{{1, 0}, {0, 0}, {0, 0}},
		{{-1, 0}, {0, 0}, {0, 0}},
		{{0, 0}, {1, 0}, {0, 1}},
		{{0, 0}, {1, 0}, {0, -1}},
	})
}

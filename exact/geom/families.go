package geom

import (
	"fmt"
	"math/big"
	"math/rand/v2"
)

// Random returns a reproducible random non-degenerate dim-simplex: dim+1
// points of R^dim whose coordinates are p/q with p uniform in
// [−bound, bound] and q uniform in [1, denom], drawn in order (point by
// point, coordinate by coordinate, numerator then denominator) from
// math/rand/v2's PCG seeded with rand.NewPCG(seed, 0). Draws that give a
// degenerate simplex are discarded and the next dim+1 points drawn from the
// same stream. It panics if dim < 0, bound < 1 or denom < 1.
func Random(dim int, seed uint64, bound, denom int64) *Simplex {
	if dim < 0 || bound < 1 || denom < 1 {
		panic(fmt.Sprintf("geom: Random(dim=%d, bound=%d, denom=%d): need dim >= 0, bound >= 1, denom >= 1", dim, bound, denom))
	}
	rng := rand.New(rand.NewPCG(seed, 0))
	span := uint64(bound)*2 + 1 // bound <= MaxInt64, so no overflow
	for {
		pts := make([][]*big.Rat, dim+1)
		rats := make([]big.Rat, (dim+1)*dim)
		for i := range pts {
			pts[i] = make([]*big.Rat, dim)
			for c := range pts[i] {
				p := int64(rng.Uint64N(span) - uint64(bound))
				q := 1 + rng.Int64N(denom)
				pts[i][c] = setFrac64(&rats[i*dim+c], p, q)
			}
		}
		if s := fromOwnedPoints(pts); !s.IsDegenerate() {
			return s
		}
	}
}

// setFrac64 sets z to p/q (q > 0), reduced by a word gcd: big.NewRat
// would reduce it again in math/big, the larger part of drawing a point.
func setFrac64(z *big.Rat, p, q int64) *big.Rat {
	a := p
	if a < 0 {
		a = -a // |p| <= bound <= MaxInt64
	}
	if g := int64(gcdU(uint64(a), uint64(q))); g > 1 {
		p, q = p/g, q/g
	}
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

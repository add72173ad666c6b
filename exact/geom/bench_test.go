package geom

import (
	"math/big"
	"strings"
	"testing"

	"assay/exact"
)

// tetPoints returns the vertices of Random(3, seed, 1000, 100) for seeds
// 0..n−1.
func tetPoints(n int) [][][]*big.Rat {
	out := make([][][]*big.Rat, n)
	for i := range out {
		out[i], _ = Random(3, uint64(i), 1000, 100).Points()
	}
	return out
}

// BenchmarkTetrahedra10000 times, per op, 10,000 random rational
// tetrahedra (Random(3, seed, 1000, 100)) from their points: FromPoints,
// then exact VolumeSq, FacetContentsSq and CircumradiusSq. Target: < 0.3 s
// per op.
func BenchmarkTetrahedra10000(b *testing.B) { benchTets(b, measureTet) }

// benchTets times, per op, FromPoints and f on the tetrahedra of
// tetPoints(10000).
func benchTets(b *testing.B, f func(*testing.B, *Simplex)) {
	pts := tetPoints(10000)
	b.ResetTimer()
	for b.Loop() {
		for _, p := range pts {
			s, err := FromPoints(p)
			if err != nil {
				b.Fatal(err)
			}
			f(b, s)
		}
	}
}

// BenchmarkTetrahedra10000Random includes the generation by Random.
func BenchmarkTetrahedra10000Random(b *testing.B) {
	for b.Loop() {
		for i := 0; i < 10000; i++ {
			measureTet(b, Random(3, uint64(i), 1000, 100))
		}
	}
}

func measureTet(b *testing.B, s *Simplex) {
	if s.VolumeSq().Sign() <= 0 {
		b.Fatal("degenerate")
	}
	if len(s.FacetContentsSq()) != 4 {
		b.Fatal("facets")
	}
	if _, err := s.CircumradiusSq(); err != nil {
		b.Fatal(err)
	}
}

// BenchmarkTetrahedraShape10000 times, per op, the exact (rational) part
// of the rest of a tetrahedron's geometry on the 10,000 tetrahedra of
// BenchmarkTetrahedra10000: centroid and its containment, the four
// altitudes and facet normals, the foot ratios of the touch points, the
// twelve face angles, the four solid-angle terms, the volume–length
// ratio, the dihedral extremes and the longest edge. Target (issue 18,
// with the kernel's certified parts): < 1 s per op; measured 0.87–1.23 s
// per op before the binary gcd and exact division of intmath.go, some
// 0.6–0.7 of that time after (figures at the top of shape.go).
func BenchmarkTetrahedraShape10000(b *testing.B) { benchTets(b, shapeTet) }

func shapeTet(b *testing.B, s *Simplex) {
	c, err := s.Centroid()
	if err != nil {
		b.Fatal(err)
	}
	if in, err := s.Contains(c); !in || err != nil {
		b.Fatal("centroid outside", err)
	}
	for i := range 4 {
		if _, _, err := s.FacetNormal(i); err != nil {
			b.Fatal(err)
		}
		if _, err := s.FootRatios(i); err != nil {
			b.Fatal(err)
		}
		if _, _, _, err := s.SolidAngleTerms(i); err != nil {
			b.Fatal(err)
		}
		for j := range 4 {
			for m := j + 1; m < 4; m++ {
				if j != i && m != i {
					if _, _, err := s.VertexCosSq(i, j, m); err != nil {
						b.Fatal(err)
					}
				}
			}
		}
	}
	if _, err := s.VolumeLengthRatioSq(); err != nil {
		b.Fatal(err)
	}
	if _, _, err := s.DihedralExtremes(); err != nil {
		b.Fatal(err)
	}
	s.MaxSqEdge()
}

// BenchmarkSeriesInradius: the inradius of the tetrahedron (0,0,0),
// (4,0,t), (1,3,2t), (3,2,−t) as a series to O(t^6) (the sliver demo's
// squeeze). Target (issue: degenerations proved by series): < 50 ms for
// series() from a notebook, of which this is the geometry.
func BenchmarkSeriesInradius(b *testing.B) {
	rows := [][]string{{"0", "0", "0*t"}, {"4", "0", "1*t"}, {"1", "3", "2*t"}, {"3", "2", "-1*t"}}
	for i := 0; i < b.N; i++ {
		v := exact.SeriesVar(7, 4096)
		p := make(SeriesPoints, len(rows))
		for r, row := range rows {
			for c, s := range row {
				q, _ := new(big.Rat).SetString(strings.TrimSuffix(s, "*t"))
				x := exact.SeriesConst(exact.RealFromRat(q), 4096)
				if c == 2 {
					x, _ = exact.SeriesMul(x, v)
				}
				p[r] = append(p[r], x)
			}
		}
		if _, err := p.Inradius(); err != nil {
			b.Fatal(err)
		}
	}
}

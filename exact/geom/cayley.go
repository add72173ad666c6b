package geom

// The Cayley–Menger determinant of a points simplex (Simplex.CayleyMenger),
// from its squared distances. Measured with BenchmarkCayleyMengerTet
// (go test -bench CayleyMengerTet -run XXX ./exact/geom/, GOMAXPROCS=1;
// Random(3, seed, 1000, 100), 1024 seeds, a fresh Simplex per op so that
// nothing cached is reused), the 2-core machine shared with other
// sessions, old (main at 3de8599) and new test binaries alternating, per
// op, processor time (cpu-ns/op; the wall time alike at load 1–2, up to
// twice it at load 5–13):
//
//	before (5x5 bordered matrix in exact.DetInts, big.Int Bareiss; ratFrac)   4.8–10.0 µs
//	after  (border taken out; 3x3 in words, exact.DetWideOver)                 0.82–1.42 µs
//	after/before in each round (eight rounds)                                  0.11–0.24
//
// In the quietest round (load 1.2) 6.1 µs against 0.82 µs. The kernel's
// BenchmarkExactSampledIdentity (GOMAXPROCS=1, cpu-ms/op for 10,000
// samples), five rounds alternating: before 131–151, after 95–109, after/
// before 0.65–0.75 in each round: 9.5–10.9 µs a sample, against the
// reference /tmp/peer-bin/tet (FLINT, fmpq_mat_det on both determinants)
// at 9.9–10.4 µs a sample on the same tetrahedra (five runs). Merged
// (trial, not committed) with main at c602145, which has h21b's words
// for Random and VolumeSq, ten rounds alternating with that main: main
// 92.7–103 cpu-ms, merged 57.7–63 (in a slower phase of the machine
// 155–165 against 89–95): 5.8–6.3 µs a sample. No
// reference program times this determinant alone. Other inputs, 64
// simplices each, best of five alternating runs at load 3–4 (ns/op,
// before → after): a triangle 2,640 → 436; 4-, 5-, 6-simplices 22,900 →
// 4,140, 38,900 → 9,630, 60,000 → 30,900 (DetInts on M, through
// exact/detfixed.go); a tetrahedron of 100-bit integer coordinates
// (math/big route) 4,230 → 2,380; one whose denominators' lcm passes a
// word 10,600 → 8,600.
//
// Two exact steps before any elimination: the bordered matrix
//
//	[[0, 1,    1,    …, 1   ],
//	 [1, 0,    d_01, …, d_0k],
//	 …
//	 [1, d_k0, d_k1, …, 0   ]]
//
// has ones on its border, so subtracting row 1 from rows 2..k+1 and then
// column 1 from columns 2..k+1 (neither changes the determinant) leaves
// row 0 = (0, 1, 0, …, 0), column 0 likewise, and below and right of
// them the k x k matrix −M with M_ij = d_0i + d_0j − d_ij (i, j = 1..k).
// Expanding along row 0 and then column 0:
//
//	det CM = −det(−M) = (−1)^(k+1) det M.
//
// M is formed from the squared distances (here the integers s·d_ij of
// scaledEdges, so det CM = (−1)^(k+1) det(sM)/s^k). For points those are
// themselves formed from the scaled Gram matrix g (s·d_ij = g_ii + g_jj −
// 2 g_ij), so sM = 2g entry for entry: the value is exactly the
// Cayley–Menger determinant, but it is not computed independently of g.
// What keeps a notebook's 288 V² = det CM a cross-check of this code is
// VolumeSq's route: for a word tetrahedron (k = n <= 3) it squares the
// determinant of the edge vectors E (edet), so the identity compares
// det(E)² with det(E·Eᵀ); for other simplices both sides are determinants
// of g, by different eliminations. The tests hold this route against the
// plain big.Rat determinant of the bordered matrix itself.

import (
	"math"
	"math/big"
	"math/bits"

	"assay/exact"
)

// cmReduced returns the Cayley–Menger determinant of the points simplex
// s: (−1)^(k+1) det(M)/s^k with M_ij = e_0i + e_0j − e_ij (i, j = 1..k)
// over the scaled squared distances e = scaledEdges.
func (s *Simplex) cmReduced() *big.Rat {
	if r, ok := s.cmWide(); ok {
		return r
	}
	return s.cmBig()
}

// cmBig is cmReduced in math/big: exact.DetInts on M, then lowest terms
// (by word gcds where s is a word or a word's square).
func (s *Simplex) cmBig() *big.Rat {
	e := s.scaledEdges()
	k := s.k
	rows := make([][]*big.Int, k)
	ints := make([]big.Int, k*k)
	for i := range rows {
		rows[i] = make([]*big.Int, k)
		for j := range rows[i] {
			z := &ints[i*k+j]
			z.Add(e[0][i+1], e[0][j+1])
			rows[i][j] = z.Sub(z, e[i+1][j+1])
		}
	}
	d, err := exact.DetInts(rows)
	if err != nil {
		panic("geom: " + err.Error()) // square by construction
	}
	if k%2 == 0 {
		d.Neg(d)
	}
	if f, p, ok := wordRoot(s.s); ok {
		if r, ok := exact.FracWordPow(d, f, p*k); ok {
			return r
		}
	}
	return ratFrac(d, new(big.Int).Exp(s.s, big.NewInt(int64(k)), nil))
}

// cmWide is cmReduced in words, for k <= 3, Gram entries below 2^186 in
// magnitude (edgesWide) and s a word or the square of one; ok is false
// otherwise.
func (s *Simplex) cmWide() (_ *big.Rat, ok bool) {
	k := s.k
	f, pow, ok := wordRoot(s.s)
	if !ok {
		return nil, false
	}
	var e [4][4]exact.Wide
	if !s.edgesWide(&e) {
		return nil, false
	}
	var m [9]exact.Wide
	for i := 1; i <= k; i++ {
		for j := i; j <= k; j++ {
			z := &m[(i-1)*k+j-1]
			z.Add(&e[0][i], &e[0][j])
			z.Sub(z, &e[i][j]) // e_ii = 0
			m[(j-1)*k+i-1] = *z
		}
	}
	r, ok := exact.DetWideOver(k, m[:k*k], f, pow*k)
	if !ok {
		return nil, false
	}
	if k%2 == 0 {
		r.Neg(r)
	}
	return r, true
}

// edgesWide sets the upper triangle of e (i < j <= k) to the scaled
// squared distances e_ij = s·|v_i − v_j|² = g_ii + g_jj − 2 g_ij, as
// setSqEdgeScaled, in words; it reports false, e partly set, when k > 3
// or a Gram entry is 2^186 or more in magnitude (every e_ij is then below
// 2^188, and sums of three of them below 2^190).
func (s *Simplex) edgesWide(e *[4][4]exact.Wide) bool {
	k := s.k
	if k > 3 {
		return false
	}
	var g [4][4]exact.Wide // the upper triangle of s.gi: row and column 0 zero
	for i := 1; i <= k; i++ {
		for j := i; j <= k; j++ {
			if x := s.g[(i-1)*k+j-1]; x.BitLen() > 186 || !g[i][j].SetInt(x) {
				return false
			}
		}
	}
	for i := 0; i <= k; i++ {
		for j := i + 1; j <= k; j++ {
			z := &e[i][j]
			z.Add(&g[i][i], &g[j][j])
			z.Sub(z, &g[i][j])
			z.Sub(z, &g[i][j])
		}
	}
	return true
}

// wordRoot returns f and p with s = f^p, f a word: p = 1 if s is a word,
// p = 2 if s is the square of one (as for every points simplex whose
// denominators' lcm is a word); ok is false otherwise.
func wordRoot(s *big.Int) (f uint64, p int, ok bool) {
	if s.IsUint64() {
		return s.Uint64(), 1, true
	}
	ws := s.Bits()
	if len(ws) != 2 || bits.UintSize != 64 {
		return 0, 0, false
	}
	hi, lo := uint64(ws[1]), uint64(ws[0])
	r := uint64(math.MaxUint64)
	if fr := math.Sqrt(math.Ldexp(float64(hi), 64) + float64(lo)); fr < 0x1p64 {
		r = uint64(fr)
	}
	// The float root is within some 2^(len(s)/2 − 54) of the root; one
	// Newton step (r + s/r)/2 in words leaves it within a unit or two
	// (the error squares, over 2r); then r² is compared exactly in 128
	// bits (r < 2^64 as s < 2^128).
	if r > hi {
		q, _ := bits.Div64(hi, lo, r)
		r = r>>1 + q>>1 + r&q&1
	}
	for r > 0 {
		if h, l := bits.Mul64(r, r); h > hi || h == hi && l > lo {
			r--
			continue
		}
		break
	}
	for r < math.MaxUint64 {
		if h, l := bits.Mul64(r+1, r+1); h < hi || h == hi && l <= lo {
			r++
			continue
		}
		break
	}
	if h, l := bits.Mul64(r, r); h != hi || l != lo {
		return 0, 0, false
	}
	return r, 2, true
}

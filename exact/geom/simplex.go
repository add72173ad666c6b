package geom

// The sampled identity of BenchmarkExactSampledIdentity (kernel; squared
// volume from coordinates against the Cayley–Menger determinant / 288 on
// 10,000 random tetrahedra, coordinates p/q, |p| <= 1000, 1 <= q <= 100),
// in-process on one CPU (-cpu 1), processor time per sample: three runs
// of five to eight alternating rounds of the previous main and this build
// on the shared 2-core machine (load 0.9–1.6), the reference in the same
// rounds; ranges of the rounds not slowed by a neighbour (in about one
// round of four both builds ran 1.5 times slower):
//
//	before (main at 849bfe4)                 19.1–23.7 µs, 13.9 KB and 214 allocations a sample
//	after                                    14.0–16.1 µs,  8.0 KB and 131 (0.67–0.76 of before)
//	after, GOGC=400 (the kernel's)           12.9–14.9 µs (before 18.3–19.8)
//	reference, /tmp/peer-bin/tet (FLINT)     10.3–14.5 µs its loop, 13–20 µs of process CPU
//
// The reference read the same 10,000 tetrahedra (Random(3, k, 1000, 100),
// k = 0..9999, written as 12 rationals a line by a throwaway test). Cut
// here: the Gram matrix in machine words (gramWords: the lcm of the
// denominators kept in a word, edge vectors below 2^61, 128-bit sums),
// the scaled edges and the 3x3 adjugate in blocks of words, the
// Cayley–Menger determinant's block pooled (exact.detIntsBig); the two
// final reductions (~0.9 µs each) were tried against s one factor at a
// time (ratProd) and against l = √s: no gain, and 12% of them at best,
// so they stayed as they were (both replaced since: VolumeSq from edet,
// families.go; the Cayley–Menger determinant by DetWideOver, cayley.go).
// Outside geom, the
// division by 288 by one word gcd (exact.Quo, by quoWord), equal sides found
// without a subtraction and the tally's size parsed only for failing
// residuals. Left, by the profile: the determinant's Bareiss steps in
// math/big (~18%), the two reductions (~14%), the interpreter's frames
// and calls (~25%), the collector (~10%).

import (
	"fmt"
	"math/big"
	"math/bits"
	"strings"
	"sync"

	"assay/exact"
)

// Simplex is a k-simplex: k+1 vertices given either by points of R^n
// (n >= k) or by their squared distances. It may be degenerate (squared
// volume 0). A Simplex is immutable; methods hand out copies.
type Simplex struct {
	k int
	n int // ambient dimension; -1 when built from distances

	// The points (points simplices only), read through points(): pts, or
	// for Random's simplices wpts, the coordinates p/q as word pairs p, q
	// (lowest terms, q > 0) point by point, of which points() makes pts
	// on first use.
	pts     [][]*big.Rat
	wpts    []int64
	ptsOnce sync.Once

	d *exact.Matrix // the squared distances (distance simplices only)

	// g is the k x k Gram matrix of the edge vectors v_i − v_0 (i = 1..k)
	// times s: Gram = g/s, with g integral and s > 0. Row-major.
	g []*big.Int
	s *big.Int

	// When gramWords formed g: l = √s, a word (else 0), and, for k = n
	// <= 3, edet = det of the integral edge vectors l·(v_i − v_0), whose
	// square is det g (else nil): the volume and the degeneracy test
	// need only it.
	l    uint64
	edet *big.Int

	once sync.Once // computes c
	c    *core

	cache shapeCache // integers shared by the methods of shape.go
}

// FromPoints returns the simplex with the given vertices, copied. There
// must be at least one point, all of the same length n, and n must be at
// least the number of points minus 1 (a k-simplex needs an ambient space
// of dimension at least k); otherwise the error wraps exact.ErrShape and
// names the offending point. A nil coordinate is read as 0. The points may
// be affinely dependent: the simplex is then degenerate.
func FromPoints(pts [][]*big.Rat) (*Simplex, error) {
	lens := make([]int, len(pts))
	for i, p := range pts {
		lens[i] = len(p)
	}
	if err := CheckPoints(lens); err != nil {
		return nil, err
	}
	n := len(pts[0])
	cp := make([][]*big.Rat, len(pts))
	for i, p := range pts {
		cp[i] = make([]*big.Rat, n)
		for j, x := range p {
			cp[i][j] = new(big.Rat)
			if x != nil {
				cp[i][j].Set(x)
			}
		}
	}
	return fromOwnedPoints(cp), nil
}

// CheckPoints checks the shape of a list of points given by their lengths,
// as FromPoints needs it: at least one point, all of one length n, and n
// at least the number of points minus 1; the error wraps exact.ErrShape
// and names the offending point.
func CheckPoints(lens []int) error {
	if len(lens) == 0 {
		return fmt.Errorf("from points: no points: %w", exact.ErrShape)
	}
	n := lens[0]
	for i, l := range lens {
		if l != n {
			return fmt.Errorf("from points: point %d has length %d, point 0 has length %d: %w", i, l, n, exact.ErrShape)
		}
	}
	if n < len(lens)-1 {
		return fmt.Errorf("from points: %d points span a %d-simplex, which needs at least %d coordinates per point, got %d: %w",
			len(lens), len(lens)-1, len(lens)-1, n, exact.ErrShape)
	}
	return nil
}

// fromOwnedPoints builds a points simplex from validated points it may
// keep: with l the least common multiple of all coordinate denominators,
// the edge vectors l·(v_i − v_0) are integral and g is their Gram matrix,
// over s = l².
func fromOwnedPoints(pts [][]*big.Rat) *Simplex {
	k, n := len(pts)-1, len(pts[0])
	var lc lcmAcc
	for _, p := range pts {
		for _, x := range p {
			lc.add(x)
		}
	}
	s := &Simplex{k: k, n: n, pts: pts}
	if lw, ok := lc.word(); ok && s.gramWords(lw) {
		return s
	}
	l := lc.value()
	s.s = new(big.Int).Mul(l, l)
	p0 := make([]big.Int, n)
	for c, x := range pts[0] {
		setScaled(&p0[c], x, l)
	}
	e := make([]big.Int, k*n)
	for i := 1; i <= k; i++ {
		for c, x := range pts[i] {
			z := &e[(i-1)*n+c]
			setScaled(z, x, l)
			z.Sub(z, &p0[c])
		}
	}
	gs := make([]big.Int, k*(k+1)/2)
	s.g = make([]*big.Int, k*k)
	var t big.Int
	pos := 0
	for i := 0; i < k; i++ {
		ei := e[i*n : (i+1)*n]
		for j := i; j < k; j++ {
			ej := e[j*n : (j+1)*n]
			z := &gs[pos]
			pos++
			for c := range ei {
				if ei[c].Sign() != 0 && ej[c].Sign() != 0 {
					z.Add(z, t.Mul(&ei[c], &ej[c]))
				}
			}
			s.g[i*k+j] = z
			s.g[j*k+i] = z
		}
	}
	return s
}

// fromWordPoints builds the points simplex of the k+1 points of R^n whose
// coordinates are c[2j]/c[2j+1] (lowest terms, positive denominators),
// point by point; it keeps a copy of c, and makes big.Rats of it only
// when a method needs the points. The Gram matrix is formed as gramWords
// does, from the words, when the lcm of the denominators and the scaled
// coordinates allow; otherwise from the points as big.Rats
// (fromOwnedPoints).
func fromWordPoints(k, n int, c []int64) *Simplex {
	var s *Simplex
	var st gramStore
	if k <= 3 && len(c) <= len(smallWordSimplex{}.c) {
		b := new(smallWordSimplex)
		s, st = &b.s, gramStore{b.ints[:], b.words[:], b.g[:k*k]}
		s.wpts = b.c[:len(c)]
	} else {
		s = new(Simplex)
		s.wpts = make([]int64, len(c))
	}
	s.k, s.n = k, n
	c = s.wpts[:copy(s.wpts, c)]
	l := uint64(1)
	for j := 1; j < len(c); j += 2 {
		q := uint64(c[j])
		if r := l % q; r != 0 { // else q divides l already
			hi, lo := bits.Mul64(l, q/exact.GCDWord(q, r))
			if hi != 0 {
				return fromOwnedPoints(s.points())
			}
			l = lo
		}
	}
	var buf [64]int64
	e, ok := edgeWords(&buf, k, n, func(i, col int) (int64, bool) {
		j := 2 * (i*n + col)
		return scaleFrac(c[j], uint64(c[j+1]), l)
	})
	if !ok {
		return fromOwnedPoints(s.points())
	}
	if st.g == nil {
		st = newGramStore(k)
	}
	s.setGramWords(st, e, l)
	return s
}

// smallWordSimplex is a word simplex of dimension k <= 3 with at most 12
// coordinates (a tetrahedron in R^3) and what setGramWords keeps, in one
// allocation instead of five.
type smallWordSimplex struct {
	s     Simplex
	c     [24]int64
	ints  [8]big.Int
	words [17]big.Word
	g     [9]*big.Int
}

// gramStore is the storage setGramWords fills: for m = k(k+1)/2, m+2
// Ints (the Gram entries, s, edet), 2m+5 words for them, k·k pointers.
type gramStore struct {
	ints  []big.Int
	words []big.Word
	g     []*big.Int
}

func newGramStore(k int) gramStore {
	m := k * (k + 1) / 2
	return gramStore{make([]big.Int, m+2), make([]big.Word, 2*m+5), make([]*big.Int, k*k)}
}

// gramWords sets s.g and s.s as fromOwnedPoints does, for a word l, in
// machine words: it reports false, setting nothing, when a coordinate of
// an edge vector l·(v_i − v_0) reaches 2^62 or there are more than eight
// coordinates, so that every Gram entry, a sum of at most eight products
// below 2^124, fits a signed 128-bit accumulator. Most random simplices
// (denominators up to 100) take this path; it saves a big.Int per
// coordinate and per product.
func (s *Simplex) gramWords(l uint64) bool {
	pts := s.pts
	var buf [64]int64
	e, ok := edgeWords(&buf, s.k, s.n, func(i, col int) (int64, bool) { return scaledWord(pts[i][col], l) })
	if ok {
		s.setGramWords(newGramStore(s.k), e, l)
	}
	return ok
}

// edgeWords returns the k x n integral edge vectors l·(v_i − v_0),
// row-major in buf (k <= n <= 8, so they fit), from scaled(i, c) =
// l·(coordinate c of v_i), which reports false when that is not below
// 2^61 in size, so that each is below 2^62; false when a coordinate fails
// or n > 8 (see gramWords).
func edgeWords(buf *[64]int64, k, n int, scaled func(i, c int) (int64, bool)) ([]int64, bool) {
	if n > 8 {
		return nil, false
	}
	var p0 [8]int64
	for c := range n {
		a, ok := scaled(0, c)
		if !ok {
			return nil, false
		}
		p0[c] = a
	}
	e := buf[:0]
	for i := 1; i <= k; i++ {
		for c := range n {
			a, ok := scaled(i, c)
			if !ok {
				return nil, false
			}
			e = append(e, a-p0[c]) // both below 2^61 in size
		}
	}
	return e, true
}

// setGramWords sets s.g, s.s = l², s.l and, for k = n <= 3, s.edet from
// the integral edge vectors e (k x n, row-major, entries below 2^62 in
// size, n <= 8), in the storage st.
func (s *Simplex) setGramWords(st gramStore, e []int64, l uint64) {
	k, n := s.k, s.n
	m := k * (k + 1) / 2
	ints, words := st.ints, st.words
	s.g = st.g
	pos := 0
	for i := 0; i < k; i++ {
		ei := e[i*n : (i+1)*n]
		for j := i; j < k; j++ {
			ej := e[j*n : (j+1)*n]
			var hi, lo uint64 // two's complement
			for c := range ei {
				ph, pl := mulSigned(ei[c], ej[c])
				var carry uint64
				lo, carry = bits.Add64(lo, pl, 0)
				hi, _ = bits.Add64(hi, ph, carry)
			}
			z := setSigned(&ints[pos], words[2*pos:2*pos+2:2*pos+2], [3]uint64{lo, hi, uint64(int64(hi) >> 63)})
			pos++
			s.g[i*k+j] = z
			s.g[j*k+i] = z
		}
	}
	hi, lo := bits.Mul64(l, l)
	s.s = ints[m].SetBits(append(words[2*m:2*m:2*m+2], big.Word(lo), big.Word(hi)))
	s.l = l
	if k == n && k >= 1 && k <= 3 {
		s.edet = setSigned(&ints[m+1], words[2*m+2:2*m+5:2*m+5], detWords(e, k))
	}
}

// scaledWord returns x·l as a word and true when x's denominator divides
// l (a word) and the product is below 2^61 in size; nil counts as 0.
func scaledWord(x *big.Rat, l uint64) (int64, bool) {
	if x == nil || x.Sign() == 0 {
		return 0, true
	}
	num := x.Num()
	if !num.IsInt64() {
		return 0, false
	}
	q := uint64(1)
	if !x.IsInt() {
		q = x.Denom().Uint64() // the denominator divides l, a word
	}
	return scaleFrac(num.Int64(), q, l)
}

// scaleFrac returns p·l/q as a word and true when q divides l and the
// product is below 2^61 in size.
func scaleFrac(p int64, q, l uint64) (int64, bool) {
	m := l
	if q != 1 {
		m = l / q
	}
	hi, lo := bits.Mul64(uint64(max(p, -p)), m) // |p| < 2^63 (MinInt64 gives hi != 0 or lo >= 2^61)
	if hi != 0 || lo >= 1<<61 {
		return 0, false
	}
	if p < 0 {
		return -int64(lo), true
	}
	return int64(lo), true
}

// mulSigned returns a·b as a 128-bit two's complement (hi, lo), for
// |a|, |b| < 2^63.
func mulSigned(a, b int64) (hi, lo uint64) {
	hi, lo = bits.Mul64(uint64(max(a, -a)), uint64(max(b, -b)))
	if (a < 0) != (b < 0) {
		var br uint64
		lo, br = bits.Sub64(0, lo, 0)
		hi, _ = bits.Sub64(0, hi, br)
	}
	return hi, lo
}

// FromSquaredDistances returns the simplex whose vertices have the squared
// distances d_ij = |v_i − v_j|² (d is copied). d must be square (else the
// error wraps exact.ErrShape and exact.ErrNotSquare), symmetric, with a
// zero diagonal and non-negative entries, and it must be realisable by
// points of a Euclidean space: every triangle inequality holds and the
// Gram matrix is positive semidefinite (Schoenberg's criterion). Otherwise
// the error wraps ErrNotEmbeddable and names the entry (i, j), the triangle
// or the principal minor at fault. An (N x N) matrix gives an
// (N−1)-simplex; it may be degenerate.
func FromSquaredDistances(d *exact.Matrix) (*Simplex, error) {
	if err := checkDistShape("from squared distances", d); err != nil {
		return nil, err
	}
	if reason := distEntryReason(d); reason != "" {
		return nil, fmt.Errorf("from squared distances: %s: %w", reason, ErrNotEmbeddable)
	}
	s := fromDistances(d.Clone())
	if _, reason := s.euclidean(); reason != "" {
		return nil, fmt.Errorf("from squared distances: %s: %w", reason, ErrNotEmbeddable)
	}
	return s, nil
}

// fromDistances builds a distance simplex from a valid squared-distance
// matrix it may keep.
func fromDistances(d *exact.Matrix) *Simplex {
	N := d.Rows()
	k := N - 1
	s := &Simplex{k: k, n: -1, d: d}
	row0 := d.Row(0)
	upper := make([]*big.Rat, 0, N*(N-1)/2)
	for i := 0; i < N; i++ {
		for j := i + 1; j < N; j++ {
			if i == 0 {
				upper = append(upper, row0[j])
			} else {
				upper = append(upper, d.At(i, j))
			}
		}
	}
	m := lcmDenoms(upper)
	// D = m·d as integers, indexed like upper.
	dint := make([]*big.Int, len(upper))
	for a, x := range upper {
		dint[a] = scaleToInt(x, m)
	}
	idx := func(i, j int) int { // position of (i, j), i < j, in upper
		return i*N - i*(i+1)/2 + (j - i - 1)
	}
	s.s = new(big.Int).Lsh(m, 1)
	s.g = make([]*big.Int, k*k)
	for i := 1; i <= k; i++ {
		for j := i; j <= k; j++ {
			z := new(big.Int).Add(dint[idx(0, i)], dint[idx(0, j)])
			if i != j {
				z.Sub(z, dint[idx(i, j)])
			}
			s.g[(i-1)*k+j-1] = z
			s.g[(j-1)*k+i-1] = z
		}
	}
	return s
}

// checkDistShape checks that d is a non-empty square matrix.
func checkDistShape(op string, d *exact.Matrix) error {
	if d == nil {
		return fmt.Errorf("%s: nil matrix: %w", op, exact.ErrShape)
	}
	if d.Rows() != d.Cols() {
		return fmt.Errorf("%s: a squared-distance matrix must be square, got %dx%d: %w %w", op, d.Rows(), d.Cols(), exact.ErrShape, exact.ErrNotSquare)
	}
	if d.Rows() == 0 {
		return fmt.Errorf("%s: empty matrix (no points): %w", op, exact.ErrShape)
	}
	return nil
}

// distEntryReason returns why the square matrix d is not a matrix of
// squared distances ("" if it is one): a non-zero diagonal entry, an
// asymmetric pair or a negative entry, with its (i, j).
func distEntryReason(d *exact.Matrix) string {
	N := d.Rows()
	for i := 0; i < N; i++ {
		if x := d.At(i, i); x.Sign() != 0 {
			return fmt.Sprintf("diagonal entry (%d, %d) is %s, not 0 (a point is at distance 0 from itself)", i, i, exact.FormatRat(x))
		}
	}
	for i := 0; i < N; i++ {
		for j := i + 1; j < N; j++ {
			a, b := d.At(i, j), d.At(j, i)
			if a.Cmp(b) != 0 {
				return fmt.Sprintf("entries (%d, %d) = %s and (%d, %d) = %s differ (squared distances are symmetric)",
					i, j, exact.FormatRat(a), j, i, exact.FormatRat(b))
			}
			if a.Sign() < 0 {
				return fmt.Sprintf("entry (%d, %d) is %s, negative (a squared distance is >= 0)", i, j, exact.FormatRat(a))
			}
		}
	}
	return ""
}

// Dim returns k, the dimension of the simplex.
func (s *Simplex) Dim() int { return s.k }

// Vertices returns k+1, the number of vertices.
func (s *Simplex) Vertices() int { return s.k + 1 }

// Ambient returns n, the length of the points, or -1 for a simplex built
// from squared distances.
func (s *Simplex) Ambient() int { return s.n }

// Points returns copies of the vertices and true for a simplex built from
// points; nil and false for one built from squared distances.
func (s *Simplex) Points() ([][]*big.Rat, bool) {
	pts := s.points()
	if pts == nil {
		return nil, false
	}
	out := make([][]*big.Rat, len(pts))
	for i, p := range pts {
		out[i] = copyVec(p)
	}
	return out, true
}

// points returns the vertices (shared: read only), nil for a distance
// simplex; for word points it makes them, in one block, on first use.
func (s *Simplex) points() [][]*big.Rat {
	if s.wpts != nil {
		s.ptsOnce.Do(func() {
			N, n := s.k+1, s.n
			rats := make([]big.Rat, N*n)
			ptrs := make([]*big.Rat, N*n)
			s.pts = make([][]*big.Rat, N)
			for j := range rats {
				ptrs[j] = setFrac64(&rats[j], s.wpts[2*j], s.wpts[2*j+1])
			}
			for i := range s.pts {
				s.pts[i] = ptrs[i*n : (i+1)*n : (i+1)*n]
			}
		})
	}
	return s.pts
}

func copyVec(v []*big.Rat) []*big.Rat {
	out := make([]*big.Rat, len(v))
	for i, x := range v {
		out[i] = new(big.Rat).Set(x)
	}
	return out
}

// gi returns the scaled Gram entry for vertices i, j in 0..k (0 when either
// is vertex 0); the result is shared, not a copy.
func (s *Simplex) gi(i, j int) *big.Int {
	if i == 0 || j == 0 {
		return zeroInt
	}
	return s.g[(i-1)*s.k+j-1]
}

var zeroInt = new(big.Int)

func (s *Simplex) checkVertex(op string, i int) error {
	if i < 0 || i > s.k {
		return fmt.Errorf("%s: vertex %d out of range [0, %d]: %w", op, i, s.k, exact.ErrShape)
	}
	return nil
}

// sqEdgeScaled returns s.s·|v_i − v_j|² as an integer.
func (s *Simplex) sqEdgeScaled(i, j int) *big.Int {
	return s.setSqEdgeScaled(new(big.Int), i, j)
}

// setSqEdgeScaled sets z to s.s·|v_i − v_j|² and returns it.
func (s *Simplex) setSqEdgeScaled(z *big.Int, i, j int) *big.Int {
	z.Add(s.gi(i, i), s.gi(j, j))
	gij := s.gi(i, j)
	return z.Sub(z.Sub(z, gij), gij) // no temporary for 2 g_ij
}

// SqEdge returns the squared distance between vertices i and j (0-based).
// It panics if i or j is out of range, like exact.Matrix.At.
func (s *Simplex) SqEdge(i, j int) *big.Rat {
	if i < 0 || i > s.k || j < 0 || j > s.k {
		panic(fmt.Sprintf("geom: vertex pair (%d, %d) out of range for a %d-simplex", i, j, s.k))
	}
	if s.d != nil {
		return s.d.At(i, j)
	}
	if i == j {
		return new(big.Rat)
	}
	return ratFrac(s.sqEdgeScaled(i, j), s.s)
}

// SqEdges returns the k(k+1)/2 squared edge lengths in the order
// (0,1), (0,2), …, (0,k), (1,2), …, (k−1,k).
func (s *Simplex) SqEdges() []*big.Rat {
	out := make([]*big.Rat, 0, s.k*(s.k+1)/2)
	for i := 0; i <= s.k; i++ {
		for j := i + 1; j <= s.k; j++ {
			out = append(out, s.SqEdge(i, j))
		}
	}
	return out
}

// SqDistances returns the (k+1) x (k+1) matrix of squared distances.
func (s *Simplex) SqDistances() *exact.Matrix {
	if s.d != nil {
		return s.d.Clone()
	}
	m := exact.Zeros(s.k+1, s.k+1)
	for i := 0; i <= s.k; i++ {
		for j := i + 1; j <= s.k; j++ {
			x := s.SqEdge(i, j)
			m.Set(i, j, x)
			m.Set(j, i, x)
		}
	}
	return m
}

// CayleyMengerMatrix returns the (k+2) x (k+2) Cayley–Menger matrix
//
//	[[0, 1,    1,    …, 1   ],
//	 [1, 0,    d_01, …, d_0k],
//	 [1, d_10, 0,    …, d_1k],
//	 …
//	 [1, d_k0, d_k1, …, 0   ]]
//
// with d_ij the squared distances.
func (s *Simplex) CayleyMengerMatrix() *exact.Matrix {
	return borderedCM(s.SqDistances())
}

func borderedCM(d *exact.Matrix) *exact.Matrix {
	N := d.Rows()
	m := exact.Zeros(N+1, N+1)
	one := big.NewRat(1, 1)
	for i := 1; i <= N; i++ {
		m.Set(0, i, one)
		m.Set(i, 0, one)
		for j := 1; j <= N; j++ {
			m.Set(i, j, d.At(i-1, j-1))
		}
	}
	return m
}

// CayleyMenger returns the Cayley–Menger determinant, the determinant of
// CayleyMengerMatrix, computed from that matrix (for a points simplex,
// from the scaled squared distances after two exact row and column steps
// on the border: cayley.go). It equals
// (−1)^(k+1) 2^k (k!)² VolumeSq().
func (s *Simplex) CayleyMenger() *big.Rat {
	if s.d != nil {
		d, err := s.CayleyMengerMatrix().Det()
		if err != nil {
			panic("geom: " + err.Error()) // square by construction
		}
		return d
	}
	return s.cmReduced() // cayley.go: the border eliminated first
}

// CayleyMengerDet returns the determinant of the Cayley–Menger matrix
// bordered around d, for any square d (exact.ErrShape otherwise) — no
// check that d holds squared distances, so that the determinant of data
// that no points realise can be shown.
func CayleyMengerDet(d *exact.Matrix) (*big.Rat, error) {
	if err := checkDistShape("cayley-menger", d); err != nil {
		return nil, err
	}
	return borderedCM(d).Det()
}

// Gram returns the k x k Gram matrix of the edge vectors from vertex 0:
// G_ij = (v_i − v_0)·(v_j − v_0) = (d_0i + d_0j − d_ij)/2, i, j = 1..k
// (stored at 0-based (i−1, j−1)).
func (s *Simplex) Gram() *exact.Matrix {
	m := exact.Zeros(s.k, s.k)
	for i := 0; i < s.k; i++ {
		for j := 0; j < s.k; j++ {
			m.Set(i, j, ratFrac(s.g[i*s.k+j], s.s))
		}
	}
	return m
}

// gramInts returns a fresh copy of the scaled Gram matrix as rows.
func (s *Simplex) gramInts() [][]*big.Int {
	a := make([][]*big.Int, s.k)
	for i := range a {
		a[i] = make([]*big.Int, s.k)
		for j := range a[i] {
			a[i][j] = new(big.Int).Set(s.g[i*s.k+j])
		}
	}
	return a
}

// Face returns the face spanned by the vertices idx, in the given order
// (so Face([]int{2, 0}) has vertex 0 = old vertex 2). The indices must be
// distinct and in range, and there must be at least one (else
// exact.ErrShape).
func (s *Simplex) Face(idx []int) (*Simplex, error) {
	if len(idx) == 0 {
		return nil, fmt.Errorf("face: no vertices: %w", exact.ErrShape)
	}
	seen := make(map[int]bool, len(idx))
	for _, i := range idx {
		if err := s.checkVertex("face", i); err != nil {
			return nil, err
		}
		if seen[i] {
			return nil, fmt.Errorf("face: vertex %d repeated: %w", i, exact.ErrShape)
		}
		seen[i] = true
	}
	if s.d != nil {
		sub, err := s.d.Submatrix(idx, idx)
		if err != nil {
			return nil, err
		}
		return fromDistances(sub), nil
	}
	pts := make([][]*big.Rat, len(idx))
	for a, i := range idx {
		pts[a] = copyVec(s.points()[i])
	}
	return fromOwnedPoints(pts), nil
}

// Facet returns the facet opposite vertex i: the face of the other
// vertices in increasing order. It needs k >= 1 (exact.ErrShape).
func (s *Simplex) Facet(i int) (*Simplex, error) {
	if s.k < 1 {
		return nil, fmt.Errorf("facet: a point has no facets: %w", exact.ErrShape)
	}
	if err := s.checkVertex("facet", i); err != nil {
		return nil, err
	}
	return s.Face(others(s.k, i))
}

// others returns 0..k without i.
func others(k, i int) []int {
	idx := make([]int, 0, k)
	for j := 0; j <= k; j++ {
		if j != i {
			idx = append(idx, j)
		}
	}
	return idx
}

// String describes the simplex, e.g. "2-simplex with vertices [[0, 0],
// [3, 0], [0, 4]]" or "1-simplex with squared distances [[0, 2], [2, 0]]".
func (s *Simplex) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "%d-simplex with ", s.k)
	if s.d != nil {
		b.WriteString("squared distances ")
		b.WriteString(s.d.String())
		return b.String()
	}
	b.WriteString("vertices [")
	for i, p := range s.points() {
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteByte('[')
		for j, x := range p {
			if j > 0 {
				b.WriteString(", ")
			}
			b.WriteString(exact.FormatRat(x))
		}
		b.WriteByte(']')
	}
	b.WriteByte(']')
	return b.String()
}

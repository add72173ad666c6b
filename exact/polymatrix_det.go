package exact

// How PolyMatrix.Det chooses its method.
//
// Symbolic Cayley–Menger determinants against the reference program
// (../shared/peers/cm.c: FLINT's fmpz_mpoly, the same memoised Laplace
// expansion), BenchmarkCayleyMenger, alternating with it in one run on 2
// cores shared with other sessions (load 16-24: every figure is several
// times its idle value, FLINT's 7-simplex 49 ms against 7.3 ms idle;
// compare within the run). Milliseconds, best over 5 rounds (of 10-20
// determinants for assay, of 5 for FLINT); allocation per determinant:
//
//	                     before            after             FLINT   after/FLINT
//	6-simplex, 1 core      4.6 (9.4 MB)    0.49 (0.47 MB)     1.08       0.46
//	           2 cores     7.3             0.52 (0.47 MB)
//	7-simplex, 1 core    106   (89 MB)     5.9  (3.9 MB)     49          0.12
//	           2 cores    55               3.9  (3.9-4.6 MB)
//
// Round by round the 7-simplex took 0.06-0.15 of FLINT's time and the
// 6-simplex 0.07-0.6. The results are 0.45 MB and 3.8 MB (terms of 8
// words and a coefficient), so allocation went from 20-23 times the
// result to 1.03-1.2 times.
// "before" was the Laplace expansion in *Poly arithmetic
// (detLaplace, kept for rational and wide entries): every minor was built
// by Mul (a fresh slice per product), pmSum and Sub, on 8-word monomials,
// and the garbage made two cores slower than one. The packed expansion
// (polymatrix_laplace.go) keeps a monomial in one word, merges each minor
// in one k-way pass and keeps minors in per-worker arenas reused every
// other level and, through a sync.Pool, from one determinant to the next:
// the garbage is avoided rather than the collector tuned (GOGC untouched).
//
// BenchmarkPolyDetMethods measures the methods on more shapes (go test
// -bench PolyDetMethods -run XXX ./exact/; 2 shared cores, so +-20%; these
// figures are from before the packed expansion, which changes the Laplace
// column for integer entries). Milliseconds per determinant:
//
//	shape (terms of the result)             auto   Laplace   Bareiss
//	Cayley–Menger  4-simplex (130)          0.15      0.15      0.88
//	               5-simplex (822)          0.96      1.4      13
//	               6-simplex (6202)         4.8       5.5     527
//	               7-simplex (52552)       28        27           -
//	n x n distinct variables  n = 6 (720)   0.20      0.17     18
//	                          n = 7 (5040)  3.0       3.6         -
//	t I - M, M integers in    n = 6         0.12      0.13      0.06
//	[-100, 100]               n = 10        1.3       4.4       0.61
//	                          n = 14        5.5      80         5.0
//	x, y, z; 3 terms of       n = 6         1.7       1.3       1.8
//	degree <= 2 an entry      n = 8        12        15        11
//
// The Laplace expansion is memoised along the rows: the minors on the
// bottom rows are kept by column set, so each of the at most 2^n minors is
// computed once, zero entries are skipped, and the minors of a row are
// spread over the cores. Bareiss elimination with exact division loses
// badly when there are many variables (its intermediate entries are large
// minors, divided at every step) and wins on larger matrices in few
// variables. Evaluation at points and interpolation was not tried: the
// 6-simplex determinant has 6202 terms, so sparse interpolation needs
// thousands of rational determinants before solving for the coefficients.
// (An earlier version had a Laplace expansion on packed monomials of its
// own that stopped paying once poly*.go got fast; the present one differs
// in what it measured to matter: one word a monomial, exact field widths
// from degree bounds, one merge per minor, no garbage.)
//
// So Det:
//   - uses Bareiss elimination from order pmBareissMinOrder (6) on when the
//     entries use fewer variables than the matrix has rows;
//   - otherwise expands by Laplace when at most pmLaplaceMaxMinors (16384)
//     minors are needed, on the matrix or its transpose, whichever needs
//     fewer, and falls back to Bareiss elimination beyond that;
//   - expands on packed monomials (detLaplacePacked) when the entries are
//     integer polynomials and the degree and coefficient bounds fit a word
//     (packedLayout), else in *Poly arithmetic (detLaplace).

import (
	"fmt"
	"math"
	"math/big"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"
)

// Det returns the determinant of m, expanded. m must be square
// (ErrNotSquare); the determinant of the 0x0 matrix is 1. It returns
// ErrTooManyTerms if the determinant, or a minor on the way to it, would
// exceed the ring's term cap.
func (m *PolyMatrix) Det() (*Poly, error) {
	if m.rows != m.cols {
		return nil, fmt.Errorf("det needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	switch m.rows {
	case 0:
		return m.r.Const(big.NewRat(1, 1)), nil
	case 1:
		return m.at(0, 0), nil
	}
	d, err := m.det(pmDetAuto)
	if err != nil {
		return nil, fmt.Errorf("det: %w", err)
	}
	return d, nil
}

// Determinant methods, for det and the tests and benchmarks.
const (
	pmDetAuto        = iota
	pmDetLaplace     // memoised Laplace expansion, on packed monomials where it can
	pmDetLaplacePoly // memoised Laplace expansion in *Poly arithmetic
	pmDetBareiss     // Bareiss elimination with DivExact
)

// pmLaplaceMaxMinors bounds the number of minors Det lets the Laplace
// expansion compute before it prefers Bareiss elimination.
var pmLaplaceMaxMinors = 1 << 14

// pmBareissMinOrder is the order from which Det prefers Bareiss
// elimination for matrices in fewer variables than rows (measured: t·I − M
// and matrices in x, y, z; see the table above).
const pmBareissMinOrder = 6

// det computes the determinant of the square matrix m (order >= 2) by the
// given method; pmDetAuto chooses as the comment at the top of this file
// explains.
func (m *PolyMatrix) det(method int) (*Poly, error) {
	n := m.rows
	if method == pmDetAuto && n >= pmBareissMinOrder && len(m.vars()) < n {
		method = pmDetBareiss
	}
	limit := pmLaplaceMaxMinors
	if method != pmDetAuto {
		limit = math.MaxInt
	}
	var need [][]uint64
	ok := false
	if method != pmDetBareiss && n < 64 {
		m, need, ok = m.laplacePlan(limit)
	}
	if method == pmDetBareiss || !ok {
		if method == pmDetLaplace || method == pmDetLaplacePoly {
			return nil, fmt.Errorf("matrix too large for Laplace expansion: %w", ErrShape)
		}
		return m.detBareiss()
	}
	if method != pmDetLaplacePoly {
		if l, ok := m.packedLayout(); ok {
			return m.detLaplacePacked(l, need)
		}
	}
	return m.detLaplace(need)
}

// vars lists the variables that occur in m's entries.
func (m *PolyMatrix) vars() []int {
	seen := map[int]bool{}
	var out []int
	for _, e := range m.e {
		for _, v := range e.Vars() {
			if !seen[v] {
				seen[v] = true
				out = append(out, v)
			}
		}
	}
	return out
}

// laplacePlan returns the minors a Laplace expansion along the rows of m
// needs (see pmNeededMinors), or those of m's transpose and the transpose if
// that needs fewer; false if both need more than limit.
func (m *PolyMatrix) laplacePlan(limit int) (*PolyMatrix, [][]uint64, bool) {
	count := func(need [][]uint64) int {
		c := 0
		for _, l := range need {
			c += len(l)
		}
		return c
	}
	n := m.rows
	need, ok := pmNeededMinors(n, func(i, j int) bool { return m.at(i, j).IsZero() }, limit)
	if ok {
		limit = count(need) - 1
	}
	if needT, okT := pmNeededMinors(n, func(i, j int) bool { return m.at(j, i).IsZero() }, limit); okT {
		return m.Transpose(), needT, true
	}
	return m, need, ok
}

// detLaplace is the memoised Laplace expansion along the rows, top
// row outermost, with *Poly arithmetic: the minor on rows r..n-1 and the
// column set S is sum_k (-1)^k m[r][S_k] minor(r+1, S \ S_k), S_k the k-th
// smallest column of S. need[r] lists the column sets that are reached
// (pmNeededMinors). The minors of one row are independent and are spread
// over the cores when there is enough work.
func (m *PolyMatrix) detLaplace(need [][]uint64) (*Poly, error) {
	n := m.rows
	lim := m.r.MaxTerms()
	var prev map[uint64]*Poly
	for r := n - 1; r >= 0; r-- {
		masks := need[r]
		out := make([]*Poly, len(masks))
		work := 0
		for _, p := range prev {
			work += p.Len()
		}
		err := pmParallel(len(masks), work*len(masks) >= pmParallelWork, func(int) func(k int) error {
			var plus, minus []*Poly
			return func(k int) error {
				s := masks[k]
				plus, minus = plus[:0], minus[:0]
				pos := 0
				for j := 0; j < n; j++ {
					if s&(1<<j) == 0 {
						continue
					}
					a := m.at(r, j)
					neg := pos&1 == 1
					pos++
					if a.IsZero() {
						continue
					}
					p := a
					if r < n-1 {
						sub := prev[s&^(1<<j)]
						if sub.IsZero() {
							continue
						}
						var err error
						if p, err = a.Mul(sub); err != nil {
							return err
						}
					}
					if neg {
						minus = append(minus, p)
					} else {
						plus = append(plus, p)
					}
				}
				d, err := pmSum(m.r, plus)
				if err != nil {
					return err
				}
				if len(minus) > 0 {
					e, err := pmSum(m.r, minus)
					if err != nil {
						return err
					}
					d = d.Sub(e)
				}
				if d.Len() > lim {
					return pmTooManyTerms(d.Len(), lim)
				}
				out[k] = d
				return nil
			}
		})
		if err != nil {
			return nil, err
		}
		prev = make(map[uint64]*Poly, len(masks))
		for k, s := range masks {
			prev[s] = out[k]
		}
	}
	return prev[1<<n-1], nil
}

// pmWorkers is the number of goroutines pmParallel uses at most.
func pmWorkers() int { return runtime.GOMAXPROCS(0) }

// pmParallel runs task(k) for k = 0..n-1, on up to pmWorkers() goroutines
// if parallel is set. newTask is called once per goroutine with its index
// (for scratch space kept by the caller). It returns the first error;
// after an error no new task starts.
func pmParallel(n int, parallel bool, newTask func(id int) func(k int) error) error {
	workers := 1
	if parallel && n > 1 {
		workers = min(pmWorkers(), n)
	}
	var (
		next     atomic.Int64
		failed   atomic.Bool
		firstErr error
		once     sync.Once
		wg       sync.WaitGroup
	)
	run := func(id int) {
		task := newTask(id)
		for !failed.Load() {
			k := int(next.Add(1) - 1)
			if k >= n {
				return
			}
			if err := task(k); err != nil {
				once.Do(func() { firstErr = err })
				failed.Store(true)
				return
			}
		}
	}
	for w := 1; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			run(w)
		}()
	}
	run(0)
	wg.Wait()
	return firstErr
}

// detBareiss is Bareiss's fraction-free elimination: after step k every
// entry of the trailing block is a minor of m, so each division by the
// previous pivot is exact. The pivot is the nonzero candidate with the
// fewest terms.
func (m *PolyMatrix) detBareiss() (*Poly, error) {
	n := m.rows
	// Each row is first multiplied by the lcm of its denominators, so that
	// the elimination runs on integer polynomials; the result is divided
	// by the product of those factors.
	a := make([][]*Poly, n)
	scale := new(big.Rat).SetInt64(1)
	l, g := new(big.Int), new(big.Int)
	for i := range a {
		l.SetInt64(1)
		for _, p := range m.e[i*n : (i+1)*n] {
			for _, t := range p.Terms() {
				d := t.Coef.Denom()
				g.GCD(nil, nil, l, d)
				l.Mul(l, g.Quo(d, g))
			}
		}
		li := new(big.Rat).SetInt(l)
		scale.Mul(scale, li)
		a[i] = make([]*Poly, n)
		for j, p := range m.e[i*n : (i+1)*n] {
			a[i][j] = p.Scale(li)
		}
	}
	scale.Inv(scale)
	zero := m.r.Const(new(big.Rat))
	negate := false
	var prev *Poly // nil stands for 1
	for k := 0; k < n-1; k++ {
		p := -1
		for i := k; i < n; i++ {
			if !a[i][k].IsZero() && (p < 0 || a[i][k].Len() < a[p][k].Len()) {
				p = i
			}
		}
		if p < 0 {
			return zero, nil
		}
		if p != k {
			a[p], a[k] = a[k], a[p]
			negate = !negate
		}
		piv := a[k][k]
		var prevInv *big.Rat // 1/prev when prev is a constant
		if prev != nil {
			if c, ok := prev.Constant(); ok {
				prevInv = c.Inv(c)
			}
		}
		for i := k + 1; i < n; i++ {
			for j := k + 1; j < n; j++ {
				x, err := piv.Mul(a[i][j])
				if err != nil {
					return nil, err
				}
				if !a[i][k].IsZero() && !a[k][j].IsZero() {
					y, err := a[i][k].Mul(a[k][j])
					if err != nil {
						return nil, err
					}
					x = x.Sub(y)
				}
				switch {
				case prev == nil:
				case prevInv != nil:
					x = x.Scale(prevInv)
				default:
					q, ok, err := x.DivExact(prev)
					if err != nil {
						return nil, err
					}
					if !ok {
						return nil, fmt.Errorf("bareiss: inexact division at step %d (a bug): %w", k+1, ErrDivisionByZero)
					}
					x = q
				}
				if lim := m.r.MaxTerms(); x.Len() > lim {
					return nil, pmTooManyTerms(x.Len(), lim)
				}
				a[i][j] = x
			}
			a[i][k] = zero
		}
		prev = piv
	}
	if negate {
		scale.Neg(scale)
	}
	return a[n-1][n-1].Scale(scale), nil
}

// pmParallelWork is the product of the number of minors of a level and
// the terms of the level below from which the Laplace expansions spread a
// level over several goroutines.
var pmParallelWork = 1 << 16

// pmNeededMinors lists, for each row r, the column sets (bit masks, sorted)
// of the minors on rows r..n-1 that Laplace expansion along the rows
// reaches from the whole matrix, skipping zero entries. It gives up,
// returning false, once more than limit sets have been found.
func pmNeededMinors(n int, zero func(i, j int) bool, limit int) ([][]uint64, bool) {
	need := make([][]uint64, n)
	need[0] = []uint64{1<<n - 1}
	total := 1
	// Sets seen: a bitmap over all sets for small n (the map was a tenth
	// of a 6-simplex determinant), else a map per level. The levels' sets
	// differ in size, so one bitmap serves them all.
	var dense []uint64
	if n <= 16 {
		dense = make([]uint64, (1<<n+63)/64)
	}
	for r := 0; r+1 < n; r++ {
		seen := make(map[uint64]bool)
		for _, s := range need[r] {
			for j := 0; j < n; j++ {
				if s&(1<<j) == 0 || zero(r, j) {
					continue
				}
				t := s &^ (1 << j)
				if dense != nil {
					if dense[t/64]&(1<<(t%64)) == 0 {
						dense[t/64] |= 1 << (t % 64)
						need[r+1] = append(need[r+1], t)
					}
				} else if !seen[t] {
					seen[t] = true
					need[r+1] = append(need[r+1], t)
				}
			}
		}
		total += len(need[r+1])
		if total > limit {
			return nil, false
		}
		slices.Sort(need[r+1])
	}
	return need, true
}

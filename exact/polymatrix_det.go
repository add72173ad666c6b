package exact

// How PolyMatrix.Det chooses its method. Three candidates are implemented;
// BenchmarkPolyDetMethods measures them (go test -bench PolyDetMethods
// -run XXX ./exact/; AMD EPYC, 2 cores shared with other work, load ~2, so
// +-20%). Milliseconds per determinant:
//
//	shape (terms of the result)            auto  packed   *Poly  Bareiss
//	Cayley–Menger  3-simplex (22)         0.050   0.058   0.039    0.26
//	               4-simplex (130)        0.11    0.22    0.16     0.80
//	               5-simplex (822)        1.1     3.1     1.0     18
//	               6-simplex (6202)       9.6    26       9.2    507
//	               7-simplex (52552)     46     221      46         -
//	n x n distinct variables  n = 4 (24)  0.045   0.069   0.024    0.065
//	                          n = 5 (120) 0.10    0.38    0.097    0.64
//	                          n = 6 (720) 0.51    2.8     0.47    23
//	                          n = 7 (5040) 5.9   35       5.6       -
//	t I - M, M integers in   n = 6         0.14    0.097   4.6      7.6
//	[-100, 100]              n = 10       80       ovf   130       84
//	                         n = 14      244       ovf  1600      126
//	x, y, z; 3 terms of      n = 4         0.14    0.15    0.12     2.7
//	degree <= 2 an entry     n = 6         1.9     1.4    18       11.5
//	                         n = 8        11.2    11.3   117       71
//
// ("ovf": the packed coefficients would overflow int64; "auto" then falls
// back to Bareiss.)
//
// The expansions are the same memoised Laplace expansion along the rows:
// the minors on the bottom rows are kept by column set, so each of the at
// most 2^n minors is computed once, zero entries are skipped, and the
// minors of a row are spread over the cores. "*Poly" does it with the
// polynomial arithmetic of poly*.go; "packed" (polymatrix_packed.go) with
// its own packed monomials and int64 coefficients, which is 3-5 times
// faster (Cayley–Menger 7-simplex: 7-11 ms against 33-40 ms) but has to
// turn its result back into a *Poly through the public API, at about
// 3.5 us a term (190 ms for the 7-simplex). Bareiss elimination with
// exact division loses everywhere except on large matrices with few
// variables: its intermediate entries are large minors, divided at every
// step. Evaluation at points and interpolation was not tried: the 6-simplex
// determinant has 6202 terms, so sparse interpolation needs some 12000
// rational 8 x 8 determinants at 11 us each (130 ms, before solving for
// the coefficients), and a dense degree box has 3^21 points.
//
// So Det:
//   - expands by Laplace when at most pmLaplaceMaxMinors (16384) minors
//     are needed, on the matrix or its transpose, whichever needs fewer;
//     otherwise it uses Bareiss elimination;
//   - uses the packed expansion when the result cannot have more terms
//     than twice the number of products in the expansion (counted by the
//     degree bounds of pmAnalysis.boxSize) — few variables, where the *Poly
//     expansion pays for many small operations — and the *Poly expansion
//     otherwise (many variables, large results);
//   - when the packed coefficients could overflow int64 (bound: product of
//     the rows' 1-norms), uses Bareiss from order 8 and the *Poly
//     expansion below.

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"runtime"
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
	pmDetLaplace     // memoised Laplace expansion on packed polynomials
	pmDetLaplacePoly // memoised Laplace expansion on *Poly
	pmDetBareiss     // Bareiss elimination on *Poly with DivExact
)

// pmLaplaceMaxMinors bounds the number of minors Det lets the Laplace
// expansion compute before it prefers Bareiss elimination.
var pmLaplaceMaxMinors = 1 << 14

// pmBareissAfterOverflow is the order from which Det uses Bareiss
// elimination rather than Laplace expansion on *Poly when the packed
// arithmetic overflows.
const pmBareissAfterOverflow = 8

// det computes the determinant of the square matrix m (order >= 2) by the
// given method; pmDetAuto chooses as the comment at the top of this file
// explains.
func (m *PolyMatrix) det(method int) (*Poly, error) {
	n := m.rows
	limit := pmLaplaceMaxMinors
	if method != pmDetAuto {
		limit = math.MaxInt
	}
	var need [][]uint64
	ok := false
	if method != pmDetBareiss && n < 64 {
		m, need, ok = m.laplacePlan(limit)
	}
	switch {
	case method == pmDetBareiss || !ok:
		if method != pmDetAuto && method != pmDetBareiss {
			return nil, fmt.Errorf("matrix too large for Laplace expansion: %w", ErrShape)
		}
		return m.detBareiss()
	case method == pmDetLaplacePoly:
		return m.detLaplacePoly(need)
	}
	an := m.analyse()
	if method == pmDetAuto {
		// Converting the packed result back costs far more per term than
		// the packed arithmetic: expand on *Poly unless the result is
		// known to be small next to the work.
		views := 0
		for r, masks := range need {
			for _, s := range masks {
				for j := 0; j < n; j++ {
					if s&(1<<j) != 0 {
						views += len(an.terms[r*n+j])
					}
				}
			}
		}
		if an.boxSize(2*views+1) > 2*views {
			return m.detLaplacePoly(need)
		}
	}
	d, err := m.detPacked(need, an)
	if errors.Is(err, errPMOverflow) && method == pmDetAuto {
		if n >= pmBareissAfterOverflow {
			return m.detBareiss()
		}
		return m.detLaplacePoly(need)
	}
	return d, err
}

// pmAnalysis describes the entries of a square matrix for the packed
// arithmetic: their terms, and bounds on the degrees of any minor.
type pmAnalysis struct {
	terms [][]Term // per entry, row-major
	nv    int      // length of the exponent vectors
	vars  []int    // the variables that occur, increasing
	bound []int    // bound[k]: the degree in vars[k] of any minor is at most this
	deg   int      // the total degree of any minor is at most this
}

// analyse computes the analysis of the square matrix m. The degree of a
// minor (total, or in one variable) is at most the sum over its rows of
// the largest degree in the row, and likewise for its columns.
func (m *PolyMatrix) analyse() *pmAnalysis {
	n := m.rows
	an := &pmAnalysis{terms: make([][]Term, n*n), nv: len(m.r.Names())}
	for k, p := range m.e {
		an.terms[k] = p.Terms()
		for _, t := range an.terms[k] {
			an.nv = max(an.nv, len(t.Exps))
		}
	}
	rowDeg, colDeg := make([]int, n), make([]int, n)
	rowV, colV := make([][]int, n), make([][]int, n)
	for i := range rowV {
		rowV[i], colV[i] = make([]int, an.nv), make([]int, an.nv)
	}
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			for _, t := range an.terms[i*n+j] {
				d := 0
				for v, e := range t.Exps {
					d += e
					rowV[i][v] = max(rowV[i][v], e)
					colV[j][v] = max(colV[j][v], e)
				}
				rowDeg[i], colDeg[j] = max(rowDeg[i], d), max(colDeg[j], d)
			}
		}
	}
	rs, cs := 0, 0
	for i := 0; i < n; i++ {
		rs, cs = rs+rowDeg[i], cs+colDeg[i]
	}
	an.deg = min(rs, cs)
	for v := 0; v < an.nv; v++ {
		rs, cs := 0, 0
		for i := 0; i < n; i++ {
			rs, cs = rs+rowV[i][v], cs+colV[i][v]
		}
		if b := min(rs, cs); b > 0 {
			an.vars, an.bound = append(an.vars, v), append(an.bound, b)
		}
	}
	return an
}

// boxSize returns the number of monomials within the degree bounds (an
// upper bound on the terms of the determinant), or limit if it is at
// least limit. Counts are floats: only their size matters.
func (an *pmAnalysis) boxSize(limit int) int {
	var total float64
	if an.deg > 4096 {
		// Count without the total degree (a larger bound).
		total = 1
		for _, b := range an.bound {
			total *= float64(b + 1)
		}
	} else {
		// ways[d]: monomials of total degree d in the variables so far.
		ways := make([]float64, an.deg+1)
		next := make([]float64, an.deg+1)
		ways[0] = 1
		for _, b := range an.bound {
			window := 0.0 // ways[d-b] + ... + ways[d]
			for d := range ways {
				window += ways[d]
				if d > b {
					window -= ways[d-b-1]
				}
				next[d] = window
			}
			ways, next = next, ways
		}
		for _, w := range ways {
			total += w
		}
	}
	if total >= float64(limit) {
		return limit
	}
	return int(total)
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

// detPacked runs the Laplace expansion on packed polynomials. It returns
// errPMOverflow when the packing cannot hold the entries or the
// computation.
func (m *PolyMatrix) detPacked(need [][]uint64, an *pmAnalysis) (*Poly, error) {
	n, terms, nv := m.rows, an.terms, an.nv
	pk, ok := newPMPacking(an.vars, an.deg, an.bound)
	if !ok {
		return nil, errPMOverflow
	}
	// Clear denominators row by row: row i times the lcm L_i of its
	// denominators; then det(m) = det(integer matrix) / prod L_i.
	ent := make([][]pmTerm, n*n)
	den := big.NewInt(1)
	l, g, c := new(big.Int), new(big.Int), new(big.Int)
	for i := 0; i < n; i++ {
		l.SetInt64(1)
		for j := 0; j < n; j++ {
			for _, t := range terms[i*n+j] {
				d := t.Coef.Denom()
				g.GCD(nil, nil, l, d)
				l.Mul(l, c.Quo(d, g))
			}
		}
		den.Mul(den, l)
		for j := 0; j < n; j++ {
			for _, t := range terms[i*n+j] {
				c.Quo(l, t.Coef.Denom())
				c.Mul(c, t.Coef.Num())
				if !c.IsInt64() || c.Int64() == math.MinInt64 {
					return nil, errPMOverflow
				}
				ent[i*n+j] = append(ent[i*n+j], pmTerm{exps: t.Exps, coef: c.Int64()})
			}
		}
	}
	// The sum of the absolute values of the coefficients of a minor, or of
	// any partial sum in its expansion, is at most the product of the
	// 1-norms of its rows (or of its columns). If that bound for the whole
	// matrix is below 2^63 nothing can overflow; if it is not, overflow is
	// likely and the packed arithmetic is not tried (pmMerge still checks).
	rowNorm, colNorm := make([]float64, n), make([]float64, n)
	for k, ts := range ent {
		for _, t := range ts {
			a := math.Abs(float64(t.coef))
			rowNorm[k/n] += a
			colNorm[k%n] += a
		}
	}
	rowBits, colBits := 0.0, 0.0
	for i := 0; i < n; i++ {
		rowBits += math.Log2(max(rowNorm[i], 1))
		colBits += math.Log2(max(colNorm[i], 1))
	}
	if min(rowBits, colBits) >= 63 {
		return nil, errPMOverflow
	}
	switch {
	case pk.words == 1:
		return pmDetK[[1]uint64](m.r, n, pk, ent, need, den, nv)
	case pk.words == 2:
		return pmDetK[[2]uint64](m.r, n, pk, ent, need, den, nv)
	case pk.words <= 4:
		return pmDetK[[4]uint64](m.r, n, pk, ent, need, den, nv)
	default:
		return pmDetK[[8]uint64](m.r, n, pk, ent, need, den, nv)
	}
}

// detLaplacePoly is the memoised Laplace expansion along the rows, top
// row outermost, with *Poly arithmetic: the minor on rows r..n-1 and the
// column set S is sum_k (-1)^k m[r][S_k] minor(r+1, S \ S_k), S_k the k-th
// smallest column of S. need[r] lists the column sets that are reached
// (pmNeededMinors). The minors of one row are independent and are spread
// over the cores when there is enough work.
func (m *PolyMatrix) detLaplacePoly(need [][]uint64) (*Poly, error) {
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
		err := pmParallel(len(masks), work*len(masks) >= pmParallelWork, func() func(k int) error {
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

// pmParallel runs task(k) for k = 0..n-1, on all cores if parallel is
// set. newTask is called once per goroutine (for scratch space). It
// returns the first error; after an error no new task starts.
func pmParallel(n int, parallel bool, newTask func() func(k int) error) error {
	workers := 1
	if parallel && n > 1 {
		workers = min(runtime.GOMAXPROCS(0), n)
	}
	var (
		next     atomic.Int64
		failed   atomic.Bool
		firstErr error
		once     sync.Once
		wg       sync.WaitGroup
	)
	run := func() {
		task := newTask()
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
			run()
		}()
	}
	run()
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

// pmFromTerms builds the polynomial with the given terms (distinct
// monomials) through the public arithmetic: each term as a product of a
// constant and powers of variables, then a balanced sum.
func pmFromTerms(r *Ring, terms []Term) (*Poly, error) {
	names := r.Names()
	type power struct{ v, e int }
	pows := make(map[power]*Poly)
	ps := make([]*Poly, len(terms))
	for t, term := range terms {
		p := r.Const(term.Coef)
		for v, e := range term.Exps {
			if e == 0 {
				continue
			}
			xe, ok := pows[power{v, e}]
			if !ok {
				x, err := r.Var(names[v])
				if err != nil {
					return nil, err
				}
				if xe, err = x.Pow(e); err != nil {
					return nil, err
				}
				pows[power{v, e}] = xe
			}
			var err error
			if p, err = p.Mul(xe); err != nil {
				return nil, err
			}
		}
		ps[t] = p
	}
	return pmSum(r, ps)
}

package exact

// Lattice basis reduction for van Hoeij's recombination
// (factor_vanhoeij.go): the LLL algorithm (A. K. Lenstra, H. W. Lenstra,
// L. Lovász, "Factoring polynomials with rational coefficients", Math.
// Ann. 261, 1982) with the Gram–Schmidt data in float64 and the basis
// exact, recomputing a vector's Gram–Schmidt row after each change, as
// C. P. Schnorr and M. Euchner do ("Lattice basis reduction: improved
// practical algorithms…", Math. Programming 66, 1994). Every change of the
// basis is an exact integer row operation or a swap, so the lattice is
// kept exactly whatever the rounding; only the quality of the reduction is
// heuristic, and callers judge the result with exact Gram–Schmidt norms
// (gramMinors), never with the float data.

import (
	"math"
	"math/big"
)

// lllDelta is the Lovász constant of the float reduction; 0.99 rather
// than the paper's 3/4 gives shorter vectors at a modest cost (common
// practice), and leaves room for rounding when the output is checked
// against 3/4 exactly.
const lllDelta = 0.99

// lllReduce LLL-reduces the rows of b, linearly independent integer
// vectors, in place. It reports false when it gave up after maxSwaps
// swaps; b then still spans the same lattice.
func lllReduce(b [][]*big.Int, maxSwaps int) bool {
	n := len(b)
	if n < 2 {
		return true
	}
	m := len(b[0])
	bf := make([][]float64, n)
	bstar := make([][]float64, n)
	mu := make([][]float64, n)
	bs := make([]float64, n)
	for i := range b {
		bf[i], bstar[i], mu[i] = make([]float64, m), make([]float64, m), make([]float64, n)
	}
	refresh := func(i int) {
		for j, c := range b[i] {
			if c.IsInt64() {
				bf[i][j] = float64(c.Int64())
			} else {
				bf[i][j], _ = new(big.Float).SetInt(c).Float64()
			}
		}
	}
	// finite reports whether the float data of row k can be trusted to
	// steer: entries past float64's range or a vanishing Gram–Schmidt
	// norm end the reduction (the basis is still exact).
	finite := func(k int) bool {
		return bs[k] > 0 && !math.IsInf(bs[k], 0) && !math.IsNaN(bs[k])
	}
	// gs recomputes row k of the Gram–Schmidt data from rows below it.
	gs := func(k int) {
		copy(bstar[k], bf[k])
		for j := 0; j < k; j++ {
			mu[k][j] = dotF(bf[k], bstar[j]) / bs[j]
			for l := range bstar[k] {
				bstar[k][l] -= mu[k][j] * bstar[j][l]
			}
		}
		bs[k] = dotF(bstar[k], bstar[k])
	}
	for i := range b {
		refresh(i)
	}
	gs(0)
	if !finite(0) {
		return false
	}
	q, t := new(big.Int), new(big.Int)
	swaps := 0
	for k := 1; k < n; {
		gs(k)
		if !finite(k) {
			return false
		}
		// Size reduction, repeated while a multiplier was large: after a
		// big subtraction the float data is recomputed from the exact row.
		for pass := 0; pass < 10; pass++ {
			big1 := false
			for j := k - 1; j >= 0; j-- {
				r := math.Round(mu[k][j])
				if r == 0 {
					continue
				}
				if math.IsNaN(r) || math.IsInf(r, 0) {
					return false
				}
				big1 = big1 || math.Abs(r) > 1<<20
				new(big.Float).SetFloat64(r).Int(q)
				for l := range b[k] {
					b[k][l].Sub(b[k][l], t.Mul(q, b[j][l]))
				}
				for l := 0; l < j; l++ {
					mu[k][l] -= r * mu[j][l]
				}
				mu[k][j] -= r
			}
			refresh(k)
			gs(k)
			if !finite(k) {
				return false
			}
			if !big1 {
				break
			}
		}
		if bs[k] < (lllDelta-mu[k][k-1]*mu[k][k-1])*bs[k-1] {
			if swaps++; swaps > maxSwaps {
				return false
			}
			b[k], b[k-1] = b[k-1], b[k]
			bf[k], bf[k-1] = bf[k-1], bf[k]
			k = max(k-1, 1)
			if k == 1 {
				if gs(0); !finite(0) {
					return false
				}
			}
			continue
		}
		k++
	}
	return true
}

func dotF(a, b []float64) float64 {
	s := 0.0
	for i, x := range a {
		s += x * b[i]
	}
	return s
}

// gramMinors returns d_0 = 1, d_1, …, d_n: d_i is the determinant of the
// Gram matrix of the first i rows of b, computed exactly by Bareiss's
// fraction-free elimination (E. H. Bareiss, Math. Comp. 22, 1968). The
// squared Gram–Schmidt norm of row i (from 1) is d_i/d_{i−1}; d_i = 0
// exactly when the first i rows are dependent, and the elimination stops
// there (the later minors are left 0).
func gramMinors(b [][]*big.Int) []*big.Int {
	n := len(b)
	g := make([][]*big.Int, n)
	for i := range g {
		g[i] = make([]*big.Int, n)
		for j := range g[i] {
			if j < i {
				g[i][j] = new(big.Int).Set(g[j][i])
				continue
			}
			s := new(big.Int)
			t := new(big.Int)
			for l, c := range b[i] {
				s.Add(s, t.Mul(c, b[j][l]))
			}
			g[i][j] = s
		}
	}
	d := make([]*big.Int, n+1)
	for i := range d {
		d[i] = new(big.Int)
	}
	d[0].SetInt64(1)
	t := new(big.Int)
	for k := 0; k < n; k++ {
		d[k+1].Set(g[k][k])
		if g[k][k].Sign() == 0 {
			return d
		}
		for i := k + 1; i < n; i++ {
			for j := k + 1; j < n; j++ {
				g[i][j].Mul(g[i][j], g[k][k])
				g[i][j].Sub(g[i][j], t.Mul(g[i][k], g[k][j]))
				g[i][j].Quo(g[i][j], d[k])
			}
		}
	}
	return d
}

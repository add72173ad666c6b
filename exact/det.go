package exact

// Why these determinant methods. Measured with BenchmarkDetMethods and
// BenchmarkDet{4,8,16} (go test -bench . -run XXX ./exact/, AMD EPYC, 2
// cores shared with other work; ns/op, GOMAXPROCS=2 unless marked 1 CPU).
// Random entries are num/den with num a random int64 and den a random
// positive int64 (math/rand seed 1):
//
//	n    Bareiss     modular               big.Rat Gauss
//	3      4.6 µs       7.6 µs                 18 µs
//	4     15 µs        16 µs                   60 µs
//	5     24 µs        31 µs                  233 µs
//	6     59 µs        66 µs                  678 µs
//	7    123 µs       102 µs                 1.3 ms
//	8    234 µs       129 µs (1 CPU 138 µs)  2.7 ms
//	12   2.2 ms       0.57 ms (1 CPU 0.62)    22 ms
//	16    12 ms       1.3–1.5 ms (1 CPU 1.9)  139 ms
//	24   226 ms        11 ms (1 CPU 10.5)    1.8 s
//
// With small integer entries (in [-100, 100]) the modular method wins from
// n = 4 (n=6: 2.6 µs against 4.3 µs; n=16: 32 µs against 90 µs).
//
// BenchmarkDet16 (Det itself) measured 1.3–1.5 ms, and 1.9–2.0 ms with
// one CPU or with the other core busy: under the 3 ms target.
//
// Large rational matrices, against FLINT's fmpq_mat_det on the same
// files (/tmp/peer-bin/det /tmp/peer-data/rat_N.txt; 61-bit numerators
// and denominators; BenchmarkDet32/rat, BenchmarkDet64/rat, best of the
// runs, wall time at load 13–19, three alternating rounds):
//
//	n    before            after (same route)   reference        after/reference
//	32   101–236 ms        141–258 ms           172–250 ms       0.6–1.1
//	64   4.1–7.8 s         3.1–7.6 s            3.3–9.5 s        0.5–0.95
//
// Unchanged within the noise: the word route of detint.go gives up at the
// second denominator of the first row.
//
// So Det uses Bareiss below order 6 and the multi-modular method from
// order 6 on, for matrices whose rows do not clear into machine words;
// those that do (integers, small rationals) take the word routes of
// detint.go, 5–8 times faster (figures there); Gaussian elimination over big.Rat (a gcd per operation) is
// never competitive and survives only in the tests as a cross-check.
// Below order 6 the cleared rows go first to the routes DetInts has for
// entries past a word (detIntsSmall: cofactors in words up to order 3,
// Bareiss in fixed widths), which Det had missed; BenchmarkDetSmallWide,
// best-ns/op of three alternating rounds (load 13), before -> after:
// 100-bit integers n=3 1423–1482 -> 1091–1115, n=4 3244–5671 ->
// 2294–2372, n=5 6887–6996 -> 4036–6335; random rationals (rows too
// wide for both, so big.Int Bareiss as before) n=3 5253–5350 ->
// 4710–4827, n=4 11657–11918 -> 10259–10553, n=5 27088–27262 ->
// 27152–27436.
// The first modular version took 4.9 ms at n=16; what brought it down:
// inverses by the extended Euclidean algorithm instead of Fermat (77 ns
// against 239 ns), division-free elimination with one Montgomery
// reduction for both products, product chains interleaved across rows,
// branch-free subtraction, and spreading primes over the cores. What is
// left at n=16 (1 CPU): elimination ~30%, forming the matrix mod p ~25%,
// the final gcd inside big.Rat.SetFrac ~15%, CRT ~15%.

import (
	"fmt"
	"math"
	"math/big"
	"runtime"
	"sync"
)

// Det returns the determinant of m, exactly. m must be square
// (ErrNotSquare); the determinant of the 0x0 matrix is 1.
func (m *Matrix) Det() (*big.Rat, error) {
	if m.rows != m.cols {
		return nil, fmt.Errorf("det needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	n := m.rows
	switch n {
	case 0:
		return big.NewRat(1, 1), nil
	case 1:
		return m.At(0, 0), nil
	}
	var buf [64]int64
	if a, scale, ok := m.wordRows(buf[:0]); ok {
		d, z := detWords(n, a)
		switch {
		case z == nil && scale == nil:
			return new(big.Rat).SetInt64(d), nil
		case z == nil:
			z = big.NewInt(d)
		case scale == nil:
			return new(big.Rat).SetInt(z), nil
		}
		return new(big.Rat).SetFrac(z, scale), nil
	}
	if n < modularMinSize {
		rows, scale := m.integerRows()
		d, ok := detIntsSmall(rows)
		if !ok {
			d = bareissDet(rows)
		}
		return new(big.Rat).SetFrac(d, scale), nil
	}
	return m.detModular(clearAuto), nil
}

// modularMinSize is the order from which Det uses detModular.
const modularMinSize = 6

// detBareiss scales each row to integers and applies Bareiss's
// fraction-free elimination (the tests' Bareiss method; Det tries
// detIntsSmall on the same rows first).
func (m *Matrix) detBareiss() *big.Rat {
	rows, scale := m.integerRows()
	return new(big.Rat).SetFrac(bareissDet(rows), scale)
}

// bareissDet returns the determinant of the square integer matrix rows
// (overwritten) by fractionFree.
func bareissDet(rows [][]*big.Int) *big.Int {
	n := len(rows)
	if pivots, sign := fractionFree(rows); len(pivots) == n {
		d := rows[n-1][n-1]
		if sign < 0 {
			d.Neg(d)
		}
		return d
	}
	return new(big.Int)
}

// detModular computes the determinant modulo enough word-sized primes to
// pass twice Hadamard's bound and rebuilds it by the Chinese remainder
// theorem. Write a_ij = n_ij / d_ij, P_i = prod_j d_ij and L_i = lcm_j d_ij.
// The integer reconstructed is, whichever needs less work,
//
//	det(C) = det(m) prod P_i, C_ij = n_ij prod_{k != j} d_ik, or
//	det(B) = det(m) prod L_i, B_ij = a_ij L_i.
//
// Modulo p only C is formed (prefix and suffix products of the d_ij), and
// det(B) = det(C) prod L_i / prod P_i. Primes dividing a denominator are
// skipped.
//
// clear chooses the integer: clearAuto (by estimated work), clearLCM (B)
// or clearProduct (C); the latter two exist for the tests.
func (m *Matrix) detModular(clear int) *big.Rat {
	n := m.rows
	num := make([][]uint64, n*n)
	den := make([][]uint64, n*n)
	neg := make([]bool, n*n)
	lcms, prods := big.NewInt(1), big.NewInt(1) // prod L_i, prod P_i
	// log2 of Hadamard's bounds for det(B) and det(C):
	// prod_i ||row i|| <= prod_i sqrt(n) max_j |entry ij|. The factor
	// n^(n/2) is bounded by 2^(bitlen(n^n)/2), exactly, rather than by
	// math.Log2, whose accuracy nothing here could vouch for; the other
	// terms are integers, exact in float64.
	boundB := float64(new(big.Int).Exp(big.NewInt(int64(n)), big.NewInt(int64(n)), nil).BitLen()) / 2
	boundC := boundB
	l, g := new(big.Int), new(big.Int)
	for i := 0; i < n; i++ {
		l.SetInt64(1)
		maxBits, dBits, zero := math.MinInt, 0, true
		for j := 0; j < n; j++ {
			v := m.at(i, j)
			d := v.Denom()
			num[i*n+j], den[i*n+j], neg[i*n+j] = words64(v.Num()), words64(d), v.Sign() < 0
			if v.Sign() == 0 {
				continue
			}
			zero = false
			// |v| < 2^(bits(num) - bits(den) + 1)
			maxBits = max(maxBits, v.Num().BitLen()-d.BitLen()+1)
			if !(d.IsInt64() && d.Int64() == 1) {
				dBits += d.BitLen()
				prods.Mul(prods, d)
				g.GCD(nil, nil, l, d)
				l.Mul(l, g.Quo(d, g))
			}
		}
		if zero {
			return new(big.Rat)
		}
		boundB += float64(l.BitLen() + maxBits)
		boundC += float64(dBits + maxBits)
		lcms.Mul(lcms, l)
	}
	// Need prod p > 2 |det|, and each p > 2^61.
	needB := int(math.Ceil((boundB + 1) / primeBits))
	needC := int(math.Ceil((boundC + 1) / primeBits))
	needB, needC = max(needB, 1), max(needC, 1)
	perPrime := n*n*n + 8*n*n // rough cost in modular products
	need, scale, scaleW := needC, prods, []uint64(nil)
	if clear == clearLCM || clear == clearAuto && needB*(perPrime+lcms.BitLen()/64) < needC*perPrime {
		need, scale, scaleW = needB, lcms, words64(lcms)
	}

	var used []*modulus
	var res []uint64
	for next := 0; len(used) < need; {
		ms := moduli(next + need - len(used))[next:]
		rs, ok := make([]uint64, len(ms)), make([]bool, len(ms))
		workers := 1
		if len(ms)*n*n*n >= parallelWork {
			workers = min(runtime.GOMAXPROCS(0), len(ms))
		}
		run := func(w int) {
			a, dm, acc := make([]uint64, n*n), make([]uint64, n*n), make([]uint64, n)
			for k := w; k < len(ms); k += workers {
				rs[k], ok[k] = detMod(ms[k], n, num, den, neg, scaleW, a, dm, acc)
			}
		}
		var wg sync.WaitGroup
		for w := 1; w < workers; w++ {
			wg.Add(1)
			go func() {
				defer wg.Done()
				run(w)
			}()
		}
		run(0)
		wg.Wait()
		for k, md := range ms {
			if ok[k] {
				used = append(used, md)
				res = append(res, rs[k])
			}
		}
		next += len(ms)
	}
	return new(big.Rat).SetFrac(crt(used, res), scale)
}

// Choices of the integer matrix in detModular.
const (
	clearAuto = iota
	clearLCM
	clearProduct
)

// parallelWork is the amount of work (primes times n^3) from which
// detModular spreads the primes over several goroutines.
var parallelWork = 1 << 18

// detMod returns det(C) mod md.p, or det(B) mod md.p if scale (the words of
// prod L_i) is not nil, as an ordinary residue; ok is false if p divides a
// denominator. a, dm and acc are scratch space of n*n, n*n and n words.
func detMod(md *modulus, n int, num, den [][]uint64, neg []bool, scale []uint64, a, dm, acc []uint64) (r uint64, ok bool) {
	residue := func(w []uint64) uint64 {
		if len(w) == 1 {
			return md.small(w[0])
		}
		return md.residue(w)
	}
	// Entries are read as ordinary residues but multiplied in Montgomery
	// form, so each stands for its value divided by R. Then a holds C
	// divided by R^n, and dprod is prod P_i divided by R^(n*n).
	for k := range dm {
		if dm[k] = residue(den[k]); dm[k] == 0 {
			return 0, false
		}
	}
	// Prefix products (left of j) go to a, then times the suffix products
	// (right of j) and the numerator. The loops run down the columns so
	// that the n product chains are independent.
	for i := range acc {
		acc[i] = md.one
	}
	for j := 0; j < n; j++ {
		for i := range acc {
			a[i*n+j] = acc[i]
			acc[i] = md.mul(acc[i], dm[i*n+j])
		}
	}
	dprod := md.one
	for i := range acc {
		dprod = md.mul(dprod, acc[i])
		acc[i] = md.one
	}
	for j := n - 1; j >= 0; j-- {
		for i := range acc {
			x := residue(num[i*n+j])
			if neg[i*n+j] {
				x = md.sub(0, x)
			}
			a[i*n+j] = md.mul(md.mul(a[i*n+j], acc[i]), x)
			acc[i] = md.mul(acc[i], dm[i*n+j])
		}
	}
	det, div := md.eliminate(n, a)
	if det == 0 {
		return 0, true
	}
	if scale == nil {
		// det(C) = det(C / R^n) R^(n*n)
		return md.fromMont(md.mul(md.mul(det, md.inv(div)), md.pow(md.r[2], n*n))), true
	}
	det = md.mul(det, md.inv(md.mul(div, dprod)))
	return md.mul(det, md.residue(scale)), true // Montgomery times ordinary: ordinary
}

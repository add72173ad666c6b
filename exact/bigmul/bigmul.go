// Package bigmul multiplies very large integers faster than math/big.
//
// math/big multiplies by Karatsuba's method, O(n^1.58) in the length n;
// above a few thousand words a number-theoretic transform (ntt.go), O(n log
// n), wins. Mul and Sqr choose by length: below the measured crossover they
// call big.Int.Mul, so they can replace it anywhere (and always on 32-bit
// machines, where the transform's word packing does not apply).
//
// Measured (BenchmarkMul and a min-of-many alternating harness, 2-core
// machine shared with up to 16 other jobs, December 2026; both operands of
// the given length in 64-bit words; best times, which are the stable
// statistic under that load):
//
//	words       big.Int.Mul   Mul (NTT)    ratio
//	1,000         0.18 ms      0.48 ms     2.6   (below the threshold)
//	2,000         0.52–0.68 ms 0.44–0.46 ms 0.7–0.85
//	3,000         1.0 ms       0.81 ms     0.81
//	5,000         2.5–2.6 ms   1.7 ms      0.67–0.69
//	20,000       25–72 ms      7.6–9.8 ms  0.14–0.30
//	50,000       91–300 ms    26–54 ms     0.18–0.3
//	100,000     290–880 ms    59–180 ms    0.2
//	1,000,000    36–37 s       1.5–1.7 s   0.04–0.05
//
// Squares cross over a little later (2,000 words: 0.90; 2,500: 1.16;
// 3,000: 0.85), and unbalanced products still gain at 8:1 (4,000 × 32,000
// words: 0.65), beyond which math/big's splitting is kept.
package bigmul

import (
	"math/big"
	"math/bits"
)

// Thresholds in words of the shorter operand (products) and of the operand
// (squares), from BenchmarkMul and BenchmarkSqr: below them math/big's
// Karatsuba is faster.
const (
	mulThreshold = 2000
	sqrThreshold = 2800
)

// Mul sets z = x·y and returns z. It is big.Int.Mul, faster on very large
// operands; z may alias x or y.
func Mul(z, x, y *big.Int) *big.Int {
	xw, yw := x.Bits(), y.Bits()
	if bits.UintSize != 64 || min(len(xw), len(yw)) < mulThreshold || unbalanced(len(xw), len(yw)) {
		return z.Mul(x, y)
	}
	neg := x.Sign()*y.Sign() < 0
	z.SetBits(nttMul(xw, yw))
	if neg {
		z.Neg(z)
	}
	return z
}

// Sqr sets z = x² and returns z; z may alias x.
func Sqr(z, x *big.Int) *big.Int {
	xw := x.Bits()
	if bits.UintSize != 64 || len(xw) < sqrThreshold {
		return z.Mul(x, x)
	}
	return z.SetBits(nttMul(xw, nil))
}

// unbalanced reports a shape where one transform of the full length would
// cost more than math/big's product, which splits the longer operand into
// pieces of the shorter's length.
func unbalanced(a, b int) bool {
	return max(a, b) > 8*min(a, b)
}

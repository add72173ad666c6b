package limits

import (
	"math/big"
)

// The names Estimate.Method takes.
const (
	MethodRichardson = "Richardson extrapolation"
	MethodAitken     = "Aitken's Δ² process"
	MethodWynn       = "Wynn's ε algorithm"
	MethodLastTerm   = "last term"
)

// richardson runs the Richardson table that eliminates, column by column,
// error terms whose ratios from one step to the next are ρ_j = ρ1·g^(j−1)
// (orders p, p+q, p+2q, … with ρ1 = ratio^p and g = ratio^q):
//
//	T_{k,j} = T_{k,j−1} + (T_{k,j−1} − T_{k−1,j−1}) · ρ_j/(1 − ρ_j).
//
// It returns the diagonal T_{k,k}, the extrapolant after step k. The table
// divides only by 1 − ρ_j ≥ 1 − ρ1, so it needs no noise guard.
func richardson(f []*big.Float, rho1, g *big.Float, prec uint) []*big.Float {
	n := len(f)
	out := make([]*big.Float, n)
	// c_j = ρ_j/(1 − ρ_j), j = 1 … n−1.
	c := make([]*big.Float, n)
	rho := newF(prec).Set(rho1)
	one := newF(prec).SetInt64(1)
	for j := 1; j < n; j++ {
		den := newF(prec).Sub(one, rho)
		c[j] = newF(prec).Quo(rho, den)
		rho.Mul(rho, g)
	}
	prev := []*big.Float{}
	d := newF(prec)
	for k := range n {
		row := make([]*big.Float, k+1)
		row[0] = newF(prec).Set(f[k])
		for j := 1; j <= k; j++ {
			d.Sub(row[j-1], prev[j-1])
			d.Mul(d, c[j])
			row[j] = newF(prec).Add(row[j-1], d)
		}
		out[k] = row[k]
		prev = row
	}
	return out
}

// aitken runs Aitken's Δ² process iterated: level 0 is f, and level j+1 at
// index k (k ≥ 2(j+1)) is
//
//	A_k − (A_k − A_{k−1})² / ((A_k − A_{k−1}) − (A_{k−1} − A_{k−2}))
//
// of level j. An entry whose first difference is at most tau (the level
// has converged to the noise) or whose second difference is at most tau
// (nothing to divide by) is left undefined, and so is everything built on
// it. The extrapolant after step k is the highest level defined at k.
//
// High levels can inherit a plateau from a lower level whose error passed
// through zero (its differences were small there without its having
// converged), and then agree with themselves while wrong; so the second
// result, |top level − the level below| at the last index, joins the
// error estimate (nil when only level 0 is defined there).
func aitken(f []*big.Float, tau *big.Float, prec uint) (ex []*big.Float, corr *big.Float) {
	n := len(f)
	out := make([]*big.Float, n)
	below := make([]*big.Float, n)
	level := make([]*big.Float, n)
	for k := range f {
		level[k] = f[k]
		out[k] = f[k]
	}
	d0, d1, den, t := newF(prec), newF(prec), newF(prec), newF(prec)
	for j := 1; 2*j < n; j++ {
		next := make([]*big.Float, n)
		grew := false
		for k := 2 * j; k < n; k++ {
			a, b, c := level[k-2], level[k-1], level[k]
			if a == nil || b == nil || c == nil {
				continue
			}
			d1.Sub(c, b)
			d0.Sub(b, a)
			if cmpAbs(d1, tau) <= 0 {
				continue
			}
			den.Sub(d1, d0)
			if cmpAbs(den, tau) <= 0 {
				continue
			}
			t.Mul(d1, d1)
			t.Quo(t, den)
			next[k] = newF(prec).Sub(c, t)
			below[k] = out[k]
			out[k] = next[k]
			grew = true
		}
		if !grew {
			break
		}
		level = next
	}
	if below[n-1] != nil {
		corr = absDiff(out[n-1], below[n-1], prec)
	}
	return out, corr
}

// wynn runs Wynn's ε algorithm: ε_{−1} = 0, ε_0^(m) = f_m,
//
//	ε_{i+1}^(m) = ε_{i−1}^(m+1) + 1/(ε_i^(m+1) − ε_i^(m)),
//
// whose even columns are the extrapolants. A difference in an even column
// at most tau, or one in an odd column at most 2^−(prec−guard) times its
// operands, leaves the entry undefined (and everything built on it). The
// extrapolant after step m is ε_{2i}^(m−2i) for the largest i defined.
func wynn(f []*big.Float, tau *big.Float, noiseBits int, prec uint) []*big.Float {
	n := len(f)
	out := make([]*big.Float, n)
	copy(out, f)
	older := make([]*big.Float, n+1) // ε_{−1}: zeros
	for m := range older {
		older[m] = newF(prec)
	}
	cur := make([]*big.Float, n) // ε_0
	copy(cur, f)
	d, rel := newF(prec), newF(prec)
	for i := 0; i+1 < n; i++ {
		// column i has entries m = 0 … n−1−i; column i+1 has m = 0 … n−2−i.
		next := make([]*big.Float, n-1-i)
		grew := false
		for m := range next {
			a, b, c := cur[m], cur[m+1], older[m+1]
			if a == nil || b == nil || c == nil {
				continue
			}
			d.Sub(b, a)
			if i%2 == 0 {
				if cmpAbs(d, tau) <= 0 {
					continue
				}
			} else {
				if d.Sign() == 0 {
					continue
				}
				rel.Abs(a)
				if cmpAbs(b, a) > 0 {
					rel.Abs(b)
				}
				if log2Abs(d) <= log2Abs(rel)-float64(noiseBits) {
					continue
				}
			}
			e := newF(prec).Quo(newF(prec).SetInt64(1), d)
			e.Add(e, c)
			next[m] = e
			grew = true
			if (i+1)%2 == 0 {
				out[m+i+1] = e
			}
		}
		if !grew {
			break
		}
		older, cur = cur, next
	}
	return out
}

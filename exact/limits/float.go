package limits

import (
	"math"
	"math/big"
)

// log2Abs returns log2|x| as a float64 for any finite x (−Inf for 0),
// without the overflow or underflow of converting x itself.
func log2Abs(x *big.Float) float64 {
	if x == nil || x.Sign() == 0 {
		return math.Inf(-1)
	}
	mant := new(big.Float)
	e := x.MantExp(mant)
	m, _ := mant.Float64()
	return float64(e) + math.Log2(math.Abs(m))
}

// newF returns a zero big.Float at prec bits.
func newF(prec uint) *big.Float { return new(big.Float).SetPrec(prec) }

// absDiff returns |x − y| at prec bits.
func absDiff(x, y *big.Float, prec uint) *big.Float {
	d := newF(prec).Sub(x, y)
	return d.Abs(d)
}

// ratPow returns r^a for a ≥ 0, exactly.
func ratPow(r *big.Rat, a int) *big.Rat {
	e := big.NewInt(int64(a))
	num := new(big.Int).Exp(r.Num(), e, nil)
	den := new(big.Int).Exp(r.Denom(), e, nil)
	return new(big.Rat).SetFrac(num, den)
}

// root returns the positive d-th root of x > 0 at prec bits (d ≥ 1), by
// Newton's iteration from a float64 start.
func root(x *big.Float, d int, prec uint) *big.Float {
	switch d {
	case 1:
		return newF(prec).Set(x)
	case 2:
		return newF(prec).Sqrt(x)
	case 4:
		s := newF(prec).Sqrt(x)
		return s.Sqrt(s)
	}
	// x = m·2^e with m in [0.5, 1); write e = d·q + s with 0 ≤ s < d.
	mant := new(big.Float)
	e := x.MantExp(mant)
	q, s := e/d, e%d
	if s < 0 {
		q, s = q-1, s+d
	}
	m, _ := mant.Float64()
	y := newF(prec).SetFloat64(math.Pow(math.Ldexp(m, s), 1/float64(d)))
	y.SetMantExp(y, q)
	bd := newF(prec).SetInt64(int64(d))
	bd1 := newF(prec).SetInt64(int64(d - 1))
	t, u := newF(prec), newF(prec)
	for bits := 40; ; bits *= 2 {
		// y ← ((d−1)·y + x / y^(d−1)) / d
		u.Set(y)
		for range d - 2 {
			u.Mul(u, y)
		}
		t.Quo(x, u)
		u.Mul(bd1, y)
		y.Add(u, t)
		y.Quo(y, bd)
		if bits > int(prec)+8 {
			break
		}
	}
	return y
}

// snap looks for a fraction a/d (d ≤ 4, smallest d first) within tol of
// x; ok is false when there is none or when a/d is not positive.
func snap(x, tol float64) (a, d int, ok bool) {
	for d = 1; d <= 4; d++ {
		af := math.Round(x * float64(d))
		if math.Abs(x-af/float64(d)) <= tol {
			if af < 1 || af > 1<<20 {
				return 0, 0, false
			}
			return int(af), d, true
		}
	}
	return 0, 0, false
}

// ratioPower returns r^(a/d) at prec bits.
func ratioPower(r *big.Rat, a, d int, prec uint) *big.Float {
	x := newF(prec).SetRat(ratPow(r, a))
	return root(x, d, prec)
}

// cmpAbs compares |x| and |y|.
func cmpAbs(x, y *big.Float) int {
	return new(big.Float).Abs(x).Cmp(new(big.Float).Abs(y))
}

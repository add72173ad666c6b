package geom

import "math/big"

// Integer helpers: common denominators and fraction-free determinants.

var bigOne = big.NewInt(1)

// lcmAcc accumulates the least common multiple of denominators, in a
// word while it stays small.
type lcmAcc struct {
	small uint64 // the lcm while big is nil (0 means 1)
	big   *big.Int
	g, q  big.Int
}

// add takes in the denominator of x (nil counts as 0, denominator 1).
func (a *lcmAcc) add(x *big.Rat) {
	if x == nil || x.IsInt() {
		return
	}
	d := x.Denom()
	if a.big == nil {
		if a.small == 0 {
			a.small = 1
		}
		if d.IsUint64() && d.Uint64() < 1<<31 && a.small < 1<<31 {
			du := d.Uint64()
			a.small = a.small / gcdU(a.small, du) * du
			return
		}
		a.big = new(big.Int).SetUint64(a.small)
	}
	a.g.GCD(nil, nil, a.big, d)
	if a.g.Cmp(d) != 0 {
		a.q.Quo(d, &a.g)
		a.big.Mul(a.big, &a.q)
	}
}

// value returns the lcm (a new Int).
func (a *lcmAcc) value() *big.Int {
	if a.big != nil {
		return new(big.Int).Set(a.big)
	}
	if a.small == 0 {
		return big.NewInt(1)
	}
	return new(big.Int).SetUint64(a.small)
}

// lcmDenoms returns the least common multiple of the denominators of the
// given rationals (1 for none); nil entries count as 0.
func lcmDenoms(xs []*big.Rat) *big.Int {
	var a lcmAcc
	for _, x := range xs {
		a.add(x)
	}
	return a.value()
}

func gcdU(a, b uint64) uint64 {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

// scaleToInt returns x·l as an integer; l must be a multiple of x's
// denominator. A nil x gives 0.
func scaleToInt(x *big.Rat, l *big.Int) *big.Int {
	return setScaled(new(big.Int), x, l)
}

// setScaled sets z to x·l and returns z; l must be a multiple of x's
// denominator. A nil x gives 0.
func setScaled(z *big.Int, x *big.Rat, l *big.Int) *big.Int {
	if x == nil || x.Sign() == 0 {
		return z.SetInt64(0)
	}
	if x.IsInt() {
		return z.Mul(x.Num(), l)
	}
	z.Quo(l, x.Denom())
	return z.Mul(z, x.Num())
}

// bareiss returns the determinant of the square integer matrix a (rows of
// equal length), destroying a. Fraction-free elimination (Bareiss 1968)
// with row swaps for zero pivots; every division is exact.
func bareiss(a [][]*big.Int) *big.Int {
	n := len(a)
	switch n {
	case 0:
		return big.NewInt(1)
	case 1:
		return new(big.Int).Set(a[0][0])
	case 2:
		z := new(big.Int).Mul(a[0][0], a[1][1])
		return z.Sub(z, new(big.Int).Mul(a[0][1], a[1][0]))
	}
	neg := false
	prev := bigOne
	var t big.Int
	for p := 0; p < n-1; p++ {
		if a[p][p].Sign() == 0 {
			r := p + 1
			for r < n && a[r][p].Sign() == 0 {
				r++
			}
			if r == n {
				return new(big.Int)
			}
			a[p], a[r] = a[r], a[p]
			neg = !neg
		}
		piv := a[p][p]
		for i := p + 1; i < n; i++ {
			ai := a[i]
			aip := ai[p]
			for j := p + 1; j < n; j++ {
				x := ai[j]
				x.Mul(x, piv)
				t.Mul(aip, a[p][j])
				x.Sub(x, &t)
				if prev != bigOne {
					x.Quo(x, prev)
				}
			}
		}
		prev = piv
	}
	z := new(big.Int).Set(a[n-1][n-1])
	if neg {
		z.Neg(z)
	}
	return z
}

// factorial returns m! as a big.Int.
func factorial(m int) *big.Int {
	z := big.NewInt(1)
	for i := 2; i <= m; i++ {
		z.Mul(z, big.NewInt(int64(i)))
	}
	return z
}

// ratFrac returns num/den as a new big.Rat (den != 0).
func ratFrac(num, den *big.Int) *big.Rat {
	// Divide by the gcd straight into the result's numerator and
	// denominator (references once the Rat is set, per the big.Rat
	// docs), saving SetFrac's copies of num and den.
	if den.Sign() == 0 {
		panic("geom: ratFrac: zero denominator")
	}
	var g big.Int
	g.GCD(nil, nil, num, den)
	r := new(big.Rat).SetInt64(1)
	n, d := r.Num(), r.Denom()
	n.Quo(num, &g)
	d.Quo(den, &g)
	if d.Sign() < 0 {
		n.Neg(n)
		d.Neg(d)
	}
	return r
}

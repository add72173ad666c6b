package exact

import (
	"math/big"
	"math/rand"
	"testing"
)

// closestFraction against a search over every denominator up to n.
func TestClosestFractionBruteForce(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	for trial := 0; trial < 400; trial++ {
		m := big.NewRat(rng.Int63n(200001)-100000, rng.Int63n(9999)+1)
		n := rng.Int63n(60) + 1
		got := closestFraction(m, big.NewInt(n))
		if got.Denom().Int64() > n {
			t.Fatalf("%v, n = %d: %v has a larger denominator", m, n, got)
		}
		dist := new(big.Rat).Abs(new(big.Rat).Sub(got, m))
		for q := int64(1); q <= n; q++ {
			// the nearest p/q: floor and ceiling of m·q
			mq := new(big.Rat).Mul(m, big.NewRat(q, 1))
			f := new(big.Int).Div(mq.Num(), mq.Denom())
			for _, p := range []*big.Int{f, new(big.Int).Add(f, big.NewInt(1))} {
				d := new(big.Rat).Abs(new(big.Rat).Sub(new(big.Rat).SetFrac(p, big.NewInt(q)), m))
				if d.Cmp(dist) < 0 {
					t.Fatalf("%v, n = %d: %v is at %v, but %v/%d is nearer", m, n, got, dist, p, q)
				}
			}
		}
	}
}

func TestRationalValue(t *testing.T) {
	h := RealQuo(rtSqrt("3"), rtR("2"))
	for _, c := range []struct {
		name string
		x    *Real
		want string // "" for irrational
	}{
		// √2·√8 = 4, (√3/2)² + (1/2)² = 1 (the unit circle at 60°), and the
		// squared distance of (1/2, √3/2) from (1, 0): 1 (the equilateral
		// triangle; common practice).
		{"√2·√8", RealMul(rtSqrt("2"), rtSqrt("8")), "4"},
		{"cos²+sin² at 60°", RealAdd(RealMul(h, h), rtR("1/4")), "1"},
		{"equilateral side", RealAdd(RealPowInt(RealSub(rtR("1/2"), rtR("1")), 2), RealPowInt(h, 2)), "1"},
		{"(√5−1)(√5+1)/8", RealQuo(RealMul(RealSub(rtSqrt("5"), rtR("1")), RealAdd(rtSqrt("5"), rtR("1"))), rtR("8")), "1/2"},
		{"Ramanujan squared", RealPowInt(RealSqrt(RealSub(rtRoot("5", 3), rtRoot("4", 3))), 3), ""},
		{"√2", rtSqrt("2"), ""},
		{"1/√2 + √2/2 − √2", RealSub(RealAdd(RealQuo(rtR("1"), rtSqrt("2")), RealQuo(rtSqrt("2"), rtR("2"))), rtSqrt("2")), "0"},
		// √(10^80 + 1) − 10^40 ≈ 5·10^-41 is irrational (10^80 + 1 is no square).
		{"10^40 near miss", RealSub(RealSqrt(RealAdd(rtPow10R(80), rtR("1"))), rtPow10R(40)), ""},
	} {
		r, ok, err := c.x.RationalValue(DefaultMaxPrecision)
		switch {
		case err != nil:
			t.Errorf("%s: %v", c.name, err)
		case c.want == "" && ok:
			t.Errorf("%s: taken for the rational %v", c.name, r)
		case c.want != "" && (!ok || r.Cmp(q(c.want)) != 0):
			t.Errorf("%s: %v, %v, want %s", c.name, r, ok, c.want)
		}
	}
	if _, _, err := RealExp(rtR("1")).RationalValue(DefaultMaxPrecision); err == nil {
		t.Errorf("e decided")
	}
}

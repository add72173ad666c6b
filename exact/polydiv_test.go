package exact

import (
	"errors"
	"math/rand"
	"testing"
)

// withDivAlgo runs f with the exact division strategy forced to algo.
func withDivAlgo(algo int, f func()) {
	old := divAlgo
	divAlgo = algo
	defer func() { divAlgo = old }()
	f()
}

// TestDivExactRandom: products divide exactly by each factor; adding a
// small perturbation breaks divisibility; DivExact agrees with the
// remainder of Divide. Both division strategies are run.
func TestDivExactRandom(t *testing.T) {
	for _, algo := range []int{algoAuto, algoDense, algoHeap} {
		withDivAlgo(algo, func() { testDivExactRandom(t) })
	}
}

func testDivExactRandom(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	r, _ := testRing(t, "x", "y", "z", "w")
	for trial := 0; trial < 200; trial++ {
		a := randPoly(rng, r, 1+rng.Intn(4), 1+rng.Intn(8), 3, rng.Intn(4))
		b := randPoly(rng, r, 1+rng.Intn(4), 1+rng.Intn(8), 3, rng.Intn(4))
		if b.IsZero() {
			continue
		}
		p := mustMulP(t, a, b)
		q, ok, err := p.DivExact(b)
		if err != nil || !ok || !q.Equal(a) {
			t.Fatalf("(%v) / (%v) = %v, %v, %v; want %v", p, b, q, ok, err, a)
		}
		checkCanonical(t, q)
		quo, rem, err := p.Divide(b)
		if err != nil || !rem.IsZero() || !quo.Equal(a) {
			t.Fatalf("Divide: %v rem %v, %v", quo, rem, err)
		}
		// Perturbed: divisible exactly when the remainder is zero.
		e := randPoly(rng, r, 2, 1, 2, 0)
		p2 := p.Add(e)
		q2, ok2, err := p2.DivExact(b)
		if err != nil {
			t.Fatal(err)
		}
		quo2, rem2, err := p2.Divide(b)
		if err != nil {
			t.Fatal(err)
		}
		if ok2 != rem2.IsZero() {
			t.Fatalf("DivExact says %v, Divide leaves %v for (%v)/(%v)", ok2, rem2, p2, b)
		}
		if ok2 && !mustMulP(t, q2, b).Equal(p2) {
			t.Fatalf("wrong exact quotient")
		}
		// p2 = quo2*b + rem2 and no term of rem2 is divisible by LM(b).
		if !mustMulP(t, quo2, b).Add(rem2).Equal(p2) {
			t.Fatalf("p != quo*q + rem")
		}
		for i := 0; i < rem2.n(); i++ {
			if monoDivides(rem2.monoAt(i), b.monoAt(0)) {
				t.Fatalf("remainder term %d of %v divisible by the leading monomial of %v", i, rem2, b)
			}
		}
	}
}

func TestDivideCases(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	P := func(s string) *Poly { return mustParse(t, r, s) }
	for _, c := range []struct{ p, q, quo, rem string }{
		{"x^3 - 1", "x - 1", "x^2 + x + 1", "0"},
		{"x^3 + 2", "x^2 + 1", "x", "-x + 2"},
		{"x^2*y + x*y^2 + y^2", "x*y - 1", "x + y", "y^2 + x + y"},
		{"3*x^2 + 1", "2*x", "3/2*x", "1"},
		{"y", "x", "0", "y"},
		{"x + 1", "5", "1/5*x + 1/5", "0"},
	} {
		quo, rem, err := P(c.p).Divide(P(c.q))
		if err != nil || quo.String() != c.quo || rem.String() != c.rem {
			t.Errorf("(%s) / (%s) = %v rem %v (%v); want %s rem %s", c.p, c.q, quo, rem, err, c.quo, c.rem)
		}
	}
	if _, _, err := P("x").Divide(r.zero()); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("Divide by 0: %v", err)
	}
	if _, _, err := P("x").DivExact(r.zero()); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("DivExact by 0: %v", err)
	}
	for _, c := range []struct {
		p, q string
		ok   bool
	}{
		{"x^5 - 1", "x^4 + x^3 + x^2 + x + 1", true},
		{"x^2 - y^2", "x + y", true},
		{"x^2 + y^2", "x + y", false},
		{"6*x^2*y", "4*x*y", true},
		{"x*y", "x^2", false},
		{"x + 1", "x^2 + 1", false},
		{"0", "x + 7", true},
		{"1/2*x^2 - 1/2", "2/3*x + 2/3", true},
		{"(x + y)^5 + 1", "x + y", false},
	} {
		quo, ok, err := P(c.p).DivExact(P(c.q))
		if err != nil || ok != c.ok {
			t.Errorf("DivExact(%s, %s) = %v, %v", c.p, c.q, ok, err)
			continue
		}
		if ok && !mustMulP(t, quo, P(c.q)).Equal(P(c.p)) {
			t.Errorf("DivExact(%s, %s) = %v, wrong", c.p, c.q, quo)
		}
	}
}

// TestDivExactBigCoefficients divides with coefficients beyond int64 and
// non-monic divisors whose leading coefficient must divide exactly.
func TestDivExactBigCoefficients(t *testing.T) {
	for _, algo := range []int{algoDense, algoHeap} {
		withDivAlgo(algo, func() { testDivExactBig(t) })
	}
}

func testDivExactBig(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	P := func(s string) *Poly { return mustParse(t, r, s) }
	a := P("123456789012345678901*x^2 - 98765432109876543210*y + 7")
	b := P("9223372036854775807*x*y + 3*y^2 - 5")
	p := mustMulP(t, mustMulP(t, a, b), b)
	q, ok, err := p.DivExact(b)
	if err != nil || !ok || !q.Equal(mustMulP(t, a, b)) {
		t.Fatalf("big division: %v %v", ok, err)
	}
	if _, ok, _ := p.Add(P("1")).DivExact(b); ok {
		t.Fatal("p+1 divisible")
	}
	// Quotient coefficients near the 128-bit budget, negative leading
	// coefficients, int64 extremes.
	for _, c := range [][2]string{
		{"9223372036854775807*x^3 - 9223372036854775807*y + 1", "-3*x^2 + 9223372036854775807*x*y - 1"},
		{"-9223372036854775808*x*y + 5", "-x + 9223372036854775807"},
		{"170141183460469231731687303715884105727*x^2 + y", "x - 1"},
	} {
		a, b := P(c[0]), P(c[1])
		p := mustMulP(t, a, b)
		for _, d := range []*Poly{a, b} {
			quo, ok, err := p.DivExact(d)
			if err != nil || !ok || !mustMulP(t, quo, d).Equal(p) {
				t.Fatalf("(%v)/(%v): %v %v %v", p, d, quo, ok, err)
			}
			if _, ok, _ := p.Add(r.one()).DivExact(d); ok {
				t.Fatalf("(%v + 1) divisible by %v", p, d)
			}
		}
	}
	// 2x+2 divides 3x+3 over Q.
	if q, ok, _ := P("3*x + 3").DivExact(P("2*x + 2")); !ok || q.String() != "3/2" {
		t.Fatalf("(3x+3)/(2x+2) = %v, %v", q, ok)
	}
}

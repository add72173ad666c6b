package exact

import (
	"errors"
	"math"
	"math/big"
	"math/rand"
	"strings"
	"sync"
	"testing"
)

func rtR(s string) *Real { return RealFromRat(q(s)) }

func rtSqrt(s string) *Real { return RealSqrt(rtR(s)) }

// rtZeroWithin checks that the enclosure of x (an expression that is 0 by
// an identity) contains 0 and is narrower than 2^-200.
func rtZeroWithin(t *testing.T, name string, x *Real) {
	t.Helper()
	iv, err := x.Approx(201, 4096)
	if err != nil {
		t.Errorf("%s: %v", name, err)
		return
	}
	if !iv.Contains(new(big.Rat)) {
		t.Errorf("%s: enclosure %v misses 0", name, iv)
	}
	lim := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), 200))
	if iv.Width().Cmp(lim) >= 0 {
		t.Errorf("%s: width %s not below 2^-200", name, iv.Width().FloatString(5))
	}
}

func TestRealIdentities(t *testing.T) {
	pi := Pi()
	piOver := func(num, den int64) *Real { return RealMul(pi, RealFromRat(big.NewRat(num, den))) }
	for _, s := range []string{"2", "1/3", "12345/7", "1/1000000000", "3/2"} {
		x := rtR(s)
		rtZeroWithin(t, "exp(log "+s+") − "+s, RealSub(RealExp(RealLog(x)), x))
	}
	rtZeroWithin(t, "exp(log √2) − √2", RealSub(RealExp(RealLog(rtSqrt("2"))), rtSqrt("2")))
	for _, x := range []*Real{rtR("1"), rtR("-7/3"), rtR("50"), rtR("1/100000"), rtSqrt("2"), RealNeg(pi)} {
		rtZeroWithin(t, "log(exp x) − x for "+x.String(), RealSub(RealLog(RealExp(x)), x))
	}
	for _, x := range []*Real{rtR("1"), rtR("1/7"), rtR("100"), rtR("-7/2"), rtR("1000000"), rtSqrt("3"), pi, rtR("1/1000000000000")} {
		s, c := RealSin(x), RealCos(x)
		sum := RealAdd(RealPowInt(s, 2), RealMul(c, c))
		rtZeroWithin(t, "sin²+cos²−1 at "+x.String(), RealSub(sum, RealFromInt(1)))
	}
	one, zero, m1 := RealFromInt(1), RealFromInt(0), RealFromInt(-1)
	rtZeroWithin(t, "atan2(1, 1) − π/4", RealSub(RealAtan2(one, one), piOver(1, 4)))
	rtZeroWithin(t, "atan2(1, 0) − π/2", RealSub(RealAtan2(one, zero), piOver(1, 2)))
	rtZeroWithin(t, "atan2(0, −1) − π", RealSub(RealAtan2(zero, m1), pi))
	rtZeroWithin(t, "atan2(−1, −1) + 3π/4", RealSub(RealAtan2(m1, m1), piOver(-3, 4)))
	rtZeroWithin(t, "atan2(−1, 0) + π/2", RealSub(RealAtan2(m1, zero), piOver(-1, 2)))
	rtZeroWithin(t, "atan2(√3, 1) − π/3", RealSub(RealAtan2(rtSqrt("3"), one), piOver(1, 3)))
	rtZeroWithin(t, "atan2(1, −√3) − 5π/6", RealSub(RealAtan2(one, RealNeg(rtSqrt("3"))), piOver(5, 6)))
	rtZeroWithin(t, "atan(1) − π/4", RealSub(RealAtan(one), piOver(1, 4)))
	rtZeroWithin(t, "atan(2+√3) − 5π/12", RealSub(RealAtan(RealAdd(rtR("2"), rtSqrt("3"))), piOver(5, 12)))
	rtZeroWithin(t, "acos(0) − π/2", RealSub(RealAcos(zero), piOver(1, 2)))
	rtZeroWithin(t, "acos(1/2) − π/3", RealSub(RealAcos(rtR("1/2")), piOver(1, 3)))
	rtZeroWithin(t, "acos(−1/2) − 2π/3", RealSub(RealAcos(rtR("-1/2")), piOver(2, 3)))
	rtZeroWithin(t, "acos(−1) − π", RealSub(RealAcos(m1), pi))
	rtZeroWithin(t, "acos(√2/2) − π/4", RealSub(RealAcos(RealQuo(rtSqrt("2"), rtR("2"))), piOver(1, 4)))
	rtZeroWithin(t, "cos(π/3) − 1/2", RealSub(RealCos(piOver(1, 3)), rtR("1/2")))
	rtZeroWithin(t, "sin(π/6) − 1/2", RealSub(RealSin(piOver(1, 6)), rtR("1/2")))
	rtZeroWithin(t, "sin(π)", RealSin(pi))
	rtZeroWithin(t, "cos(1000001·π) + 1", RealAdd(RealCos(piOver(1000001, 1)), one))
	rtZeroWithin(t, "cos(acos(1/3)) − 1/3", RealSub(RealCos(RealAcos(rtR("1/3"))), rtR("1/3")))
	rtZeroWithin(t, "∛2³ − 2", RealSub(RealPowInt(RealRoot(rtR("2"), 3), 3), rtR("2")))
	rtZeroWithin(t, "(√2)^-4 − 1/4", RealSub(RealPowInt(rtSqrt("2"), -4), rtR("1/4")))
	rtZeroWithin(t, "√2+√3 − √(5+2√6)", RealSub(RealAdd(rtSqrt("2"), rtSqrt("3")),
		RealSqrt(RealAdd(rtR("5"), RealMul(rtR("2"), rtSqrt("6"))))))
	rtZeroWithin(t, "exp(1/3)³ − e", RealSub(RealPowInt(RealExp(rtR("1/3")), 3), RealExp(one)))
	rtZeroWithin(t, "exp(−√2)·exp(√2) − 1", RealSub(RealMul(RealExp(RealNeg(rtSqrt("2"))), RealExp(rtSqrt("2"))), one))
}

// TestRealHeron computes triangle areas from rational squared sides two
// ways — Heron in squared sides (Cayley–Menger: 16A² = 2ab+2bc+2ca−a²−b²−c²)
// and ½·√a·√b·sin C with C = acos((a+b−c)/(2√a√b)) — and asks for 60
// identical certified digits.
func TestRealHeron(t *testing.T) {
	for _, sides := range [][3]string{{"2", "3", "4"}, {"9", "16", "25"}, {"1", "1", "1"}, {"7/3", "5/2", "1/7"}, {"100", "101", "199"}, {"1", "1", "3"}} {
		a, b, c := rtR(sides[0]), rtR(sides[1]), rtR(sides[2])
		two := rtR("2")
		s16 := RealSub(RealMul(two, RealAdd(RealAdd(RealMul(a, b), RealMul(b, c)), RealMul(c, a))),
			RealAdd(RealAdd(RealMul(a, a), RealMul(b, b)), RealMul(c, c)))
		heron := RealQuo(RealSqrt(s16), rtR("4"))
		ra, rb := RealSqrt(a), RealSqrt(b)
		cosC := RealQuo(RealSub(RealAdd(a, b), c), RealMul(two, RealMul(ra, rb)))
		trig := RealMul(rtR("1/2"), RealMul(RealMul(ra, rb), RealSin(RealAcos(cosC))))
		if r, ok := heron.Rat(); ok {
			// A rational area (3-4-5): the trigonometric route cannot
			// certify digits of an exact value on a digit boundary, but its
			// enclosure must hold the value to 60 digits.
			iv, err := RealSub(trig, RealFromRat(r)).Approx(200, DefaultMaxPrecision)
			if err != nil || !iv.Contains(new(big.Rat)) {
				t.Errorf("%v: exact area %s, trigonometric route %v %v", sides, FormatRat(r), iv, err)
			}
			continue
		}
		d1, err1 := heron.Digits(60, DefaultMaxPrecision)
		d2, err2 := trig.Digits(60, DefaultMaxPrecision)
		if err1 != nil || err2 != nil {
			t.Errorf("%v: %v / %v", sides, err1, err2)
			continue
		}
		if d1 != d2 {
			t.Errorf("%v: Heron %s, trigonometric %s", sides, d1, d2)
		}
		if n := len(strings.TrimLeft(strings.Replace(d1, ".", "", 1), "-0")); n != 60 {
			t.Errorf("%v: %q has %d significant digits", sides, d1, n)
		}
		t.Logf("%v: area %s", sides, d1)
	}
	// 3-4-5: the area 6 is found exactly.
	a, b, c := rtR("9"), rtR("16"), rtR("25")
	two := rtR("2")
	s16 := RealSub(RealMul(two, RealAdd(RealAdd(RealMul(a, b), RealMul(b, c)), RealMul(c, a))),
		RealAdd(RealAdd(RealMul(a, a), RealMul(b, b)), RealMul(c, c)))
	if r, ok := RealQuo(RealSqrt(s16), rtR("4")).Rat(); !ok || r.Cmp(big.NewRat(6, 1)) != 0 {
		t.Errorf("3-4-5 area: %v %v", r, ok)
	}
}

func TestRealExactness(t *testing.T) {
	for _, c := range []struct {
		x    *Real
		want string
	}{
		{rtSqrt("9/4"), "3/2"},
		{RealRoot(rtR("-8"), 3), "-2"},
		{RealRoot(rtR("16/81"), 4), "2/3"},
		{RealRoot(rtR("-1/32"), 5), "-1/2"},
		{RealSqrt(rtR("0")), "0"},
		{RealPowInt(rtR("2/3"), -2), "9/4"},
		{RealPowInt(rtSqrt("2"), 0), "1"},
		{RealQuo(rtR("1"), rtR("3")), "1/3"},
		{RealExp(rtR("0")), "1"},
		{RealLog(rtR("1")), "0"},
		{RealSin(rtR("0")), "0"},
		{RealCos(rtR("0")), "1"},
		{RealAcos(rtR("1")), "0"},
		{RealAtan2(rtR("0"), rtR("5")), "0"},
		{RealSqrt(RealMul(rtSqrt("4"), rtR("8"))), "4"},
	} {
		r, ok := c.x.Rat()
		if !ok || FormatRat(r) != c.want {
			t.Errorf("want exact %s, got %v %v", c.want, r, ok)
		}
		iv, err := c.x.Enclose(64)
		if err != nil || iv.Lo.Cmp(r) != 0 || iv.Hi.Cmp(r) != 0 {
			t.Errorf("Enclose of exact %s: %v %v", c.want, iv, err)
		}
	}
	for _, x := range []*Real{rtSqrt("2"), RealRoot(rtR("-9"), 3), RealMul(rtSqrt("2"), rtSqrt("2")), Pi(), RealExp(rtR("1"))} {
		if _, ok := x.Rat(); ok {
			t.Errorf("%v claims to be rational", x)
		}
	}
	// Rat returns a copy.
	x := rtR("1/2")
	r, _ := x.Rat()
	r.SetInt64(7)
	if r2, _ := x.Rat(); r2.Cmp(big.NewRat(1, 2)) != 0 {
		t.Error("Rat exposes the internal value")
	}
}

func TestRealErrors(t *testing.T) {
	const cap = 1024
	check := func(name string, err, want error) {
		t.Helper()
		if !errors.Is(err, want) {
			t.Errorf("%s: got %v, want %v", name, err, want)
		}
	}
	sqrt2 := rtSqrt("2")
	_, err := RealSqrt(rtR("-1/2")).Enclose(64)
	check("sqrt(-1/2)", err, ErrDomain)
	_, err = RealSqrt(RealNeg(sqrt2)).Approx(10, cap)
	check("sqrt(-√2)", err, ErrDomain)
	_, err = RealLog(rtR("0")).Approx(10, cap)
	check("log 0", err, ErrDomain)
	_, err = RealLog(RealSub(rtR("1"), sqrt2)).Sign(cap)
	check("log(1−√2)", err, ErrDomain)
	_, err = RealAcos(rtR("3/2")).Digits(5, cap)
	check("acos(3/2)", err, ErrDomain)
	_, err = RealAcos(RealNeg(sqrt2)).Float64(cap)
	check("acos(−√2)", err, ErrDomain)
	_, err = RealAtan2(rtR("0"), rtR("0")).Enclose(64)
	check("atan2(0, 0)", err, ErrDomain)
	_, err = RealRoot(RealNeg(sqrt2), 4).Enclose(64)
	check("4th root of −√2", err, ErrDomain)

	// Exactly zero, but not knowable by intervals: sin π is not algebraic,
	// so no zero bound applies.
	sinPi := RealSin(Pi())
	_, err = RealQuo(rtR("1"), sinPi).Approx(10, 256)
	check("1/sin π", err, ErrUndecided)
	if err != nil && !strings.Contains(err.Error(), "256") {
		t.Errorf("undecided error does not name the cap: %v", err)
	}
	_, err = RealSqrt(sinPi).Enclose(128)
	check("sqrt(sin π)", err, ErrUndecided)
	_, err = RealSub(RealExp(sqrt2), RealExp(sqrt2)).Sign(cap)
	check("sign(e^√2 − e^√2)", err, ErrUndecided)
	// Exactly zero and algebraic: the zero bound proves it (enough
	// precision given), so the division fails for certain.
	zeroish := RealSub(RealMul(sqrt2, sqrt2), rtR("2"))
	_, err = RealQuo(rtR("1"), zeroish).Approx(10, 256)
	check("1/(√2·√2 − 2)", err, ErrDivisionByZero)
	_, err = RealAtan2(zeroish, rtR("-1")).Enclose(128)
	check("atan2 on the branch cut", err, ErrUndecided)
	_, err = RealQuo(rtR("1"), RealSub(rtR("1/3"), rtR("1/3"))).Enclose(64)
	check("1/(1/3 − 1/3)", err, ErrDivisionByZero)
	_, err = RealPowInt(RealSub(rtR("1/3"), rtR("1/3")), -2).Enclose(64)
	check("0^-2", err, ErrDivisionByZero)
	_, err = RealQuo(rtR("1"), RealSin(rtR("0"))).Enclose(64)
	check("1/sin(0)", err, ErrDivisionByZero)
	if sg, err := RealSub(sqrt2, sqrt2).Sign(cap); err != nil || sg != 0 {
		t.Errorf("sign(√2 − √2): %d %v, want 0 by the zero bound", sg, err)
	}
	_, err = RealExp(rtR("1000000000")).Enclose(64)
	check("exp(1e9)", err, ErrOverflow)
	_, err = RealExp(RealMul(rtR("1000000000"), sqrt2)).Enclose(64)
	check("exp(1e9·√2)", err, ErrOverflow)
	_, err = RealPowInt(RealExp(rtR("1000")), 1000000).Enclose(64)
	check("exp(1000)^1e6", err, ErrOverflow)

	// A value on a digit boundary: √2·√2 is 2, which could be 1.99… or 2.00….
	_, err = RealMul(sqrt2, sqrt2).Digits(10, 2048)
	check("digits of √2·√2", err, ErrUndecided)
	// Near a boundary: 1 − 10^-40·√2 is 0.99999… to 40 places.
	near := RealSub(rtR("1"), RealMul(rtR("1e-40"), sqrt2))
	_, err = near.Digits(5, 64)
	check("digits near a boundary at a small cap", err, ErrUndecided)
	if s, err := near.Digits(5, 4096); err != nil || s != "0.99999" {
		t.Errorf("digits near a boundary at a large cap: %q %v", s, err)
	}
	if s, err := RealAdd(rtR("1"), RealMul(rtR("1e-40"), sqrt2)).Digits(5, 4096); err != nil || s != "1.0000" {
		t.Errorf("digits just above a boundary: %q %v", s, err)
	}

	// Certified errors are sticky, and undecided ones are not: the same node
	// succeeds when enough precision is allowed.
	tiny := RealSub(RealAdd(rtR("1"), RealMul(rtR("1e-100"), sqrt2)), rtR("1"))
	inv := RealQuo(rtR("1"), tiny)
	if _, err := inv.Sign(128); !errors.Is(err, ErrUndecided) {
		t.Errorf("1/tiny at 128 bits: %v", err)
	}
	if s, err := inv.Sign(4096); err != nil || s != 1 {
		t.Errorf("1/tiny at 4096 bits: %d %v", s, err)
	}
}

func TestRealDigitsFormat(t *testing.T) {
	e := RealExp(rtR("1"))
	for _, c := range []struct {
		x    *Real
		n    int
		want string
	}{
		{rtR("1/3"), 5, "0.33333"},
		{rtR("-2/3"), 5, "-0.66666"},
		{rtR("2"), 4, "2.000"},
		// An integer part longer than the digits asked for is written in
		// scientific form, the rule of C's %g (C11 7.21.6.1: style e when
		// the exponent is < -4 or >= the precision): padded zeros would
		// read as known digits.
		{rtR("12345678"), 3, "1.23e+7"},
		{rtR("123"), 3, "123"},
		{rtR("1/40000"), 5, "2.5000e-5"},
		{rtR("1/10000"), 4, "0.0001000"},
		{rtR("-1e21"), 3, "-1.00e+21"},
		{rtR("999999999999999999999/1000"), 25, "999999999999999999.9990000"},
		{rtR("0"), 7, "0"},
		{rtR("7"), 1, "7"},
		{rtR("7"), 0, "7"},
		{RealMul(RealNeg(e), rtR("1e-5")), 8, "-2.7182818e-5"},
		{RealMul(e, rtR("1e-4")), 6, "0.000271828"},
		{RealMul(e, rtR("1e20")), 6, "2.71828e+20"},
		{RealMul(e, rtR("1e5")), 6, "271828"},
		{RealMul(e, rtR("1e21")), 6, "2.71828e+21"},
		{RealMul(Pi(), rtR("1e-300")), 12, "3.14159265358e-300"},
		{RealNeg(rtSqrt("2")), 21, "-1.41421356237309504880"},
		{RealSub(Pi(), rtR("3")), 3, "0.141"},
		{RealSin(RealMul(Pi(), rtR("1000"))), 3, ""},
	} {
		got, err := c.x.Digits(c.n, 2048)
		if c.want == "" {
			if !errors.Is(err, ErrUndecided) {
				t.Errorf("Digits(%d) of %v: want undecided, got %q %v", c.n, c.x, got, err)
			}
			continue
		}
		if err != nil || got != c.want {
			t.Errorf("Digits(%d) of %v: got %q %v, want %q", c.n, c.x, got, err, c.want)
		}
		// Digits parse back as a rational at or toward zero from x.
		if r, perr := ParseRat(got); perr != nil {
			t.Errorf("%q does not parse: %v", got, perr)
		} else if c.x.exact != nil {
			if new(big.Rat).Abs(r).Cmp(new(big.Rat).Abs(c.x.exact)) > 0 {
				t.Errorf("%q is not a truncation of %s", got, FormatRat(c.x.exact))
			}
		}
	}
}

func TestRealFloat64AndString(t *testing.T) {
	for _, c := range []struct {
		x    *Real
		want float64
	}{
		{rtSqrt("2"), math.Sqrt2},
		{Pi(), math.Pi},
		{RealExp(rtR("1")), math.E},
		{RealLog(rtR("10")), math.Ln10},
		{rtR("1/3"), 1.0 / 3},
		{RealExp(rtR("-745")), 5e-324}, // e^-745 ≈ 2.8e-324: the least subnormal
		{RealSub(RealMul(rtSqrt("2"), rtSqrt("2")), rtR("2")), 0},
	} {
		got, err := c.x.Float64(DefaultMaxPrecision)
		if err != nil || got != c.want {
			t.Errorf("Float64 of %v: %v %v, want %v", c.x, got, err, c.want)
		}
	}
	// Against package math, which is not always correctly rounded: 1 ulp.
	for _, c := range []struct {
		x    *Real
		want float64
	}{
		{RealSin(rtR("1")), math.Sin(1)},
		{RealCos(rtR("100")), math.Cos(100)},
		{RealNeg(RealAtan(rtR("1e10"))), -math.Atan(1e10)},
		{RealLog(rtR("1e-300")), math.Log(1e-300)},
		{RealExp(rtR("-2.5")), math.Exp(-2.5)},
	} {
		got, err := c.x.Float64(DefaultMaxPrecision)
		if err != nil || math.Abs(got-c.want) > math.Abs(math.Nextafter(c.want, 0)-c.want) {
			t.Errorf("Float64 of %v: %v %v, want %v within 1 ulp", c.x, got, err, c.want)
		}
	}
	if _, err := RealExp(rtR("1000")).Float64(1024); !errors.Is(err, ErrNotFinite) {
		t.Errorf("exp(1000) as float64: %v", err)
	}
	if s := rtR("-3/4").String(); s != "-3/4" {
		t.Errorf("String of -3/4: %q", s)
	}
	if s := rtSqrt("2").String(); s != "1.4142135623730950488…" {
		t.Errorf("String of √2: %q", s)
	}
	if s := RealSqrt(rtR("-2")).String(); !strings.Contains(s, "domain") {
		t.Errorf("String of √-2: %q", s)
	}
}

func TestRealCmpSign(t *testing.T) {
	pi := Pi()
	for _, c := range []struct {
		x, y *Real
		want int
	}{
		{pi, rtR("355/113"), -1},
		{pi, rtR("333/106"), 1},
		{rtR("1/3"), rtR("2/6"), 0},
		{pi, pi, 0},
		{RealAdd(rtSqrt("2"), rtSqrt("3")), rtSqrt("10"), -1}, // 3.146 < 3.162
		{RealExp(pi), RealPowInt(pi, 3), -1},                  // e^π = 23.14 < π³ = 31.0
		{RealExp(RealMul(pi, rtSqrt("163"))), rtR("262537412640768744"), -1},
	} {
		got, err := RealCmp(c.x, c.y, DefaultMaxPrecision)
		if err != nil || got != c.want {
			t.Errorf("RealCmp(%v, %v) = %d %v, want %d", c.x, c.y, got, err, c.want)
		}
	}
	if s, err := RealSin(Pi()).Sign(256); !errors.Is(err, ErrUndecided) {
		t.Errorf("sign of sin π: %d %v", s, err)
	}
	if s, err := RealSub(RealExp(RealMul(pi, rtSqrt("163"))), rtR("262537412640768744")).Sign(DefaultMaxPrecision); err != nil || s != -1 {
		t.Errorf("sign of e^(π√163) − 640320³ − 744: %d %v", s, err)
	}
}

func TestRealConcurrent(t *testing.T) {
	// Shared nodes evaluated from many goroutines at different precisions.
	x := RealAdd(RealSqrt(rtR("2")), RealLog(RealExp(RealSin(rtR("3")))))
	y := RealMul(x, RealAtan2(x, Pi()))
	var wg sync.WaitGroup
	res := make([]string, 8)
	for i := range res {
		wg.Add(1)
		go func(i int) {
			defer wg.Done()
			p := uint(64 << (i % 4))
			if _, err := y.Enclose(p); err != nil {
				t.Error(err)
			}
			s, err := y.Digits(50, DefaultMaxPrecision)
			if err != nil {
				t.Error(err)
			}
			res[i] = s
		}(i)
	}
	wg.Wait()
	for _, s := range res {
		if s != res[0] {
			t.Errorf("concurrent digits differ: %q %q", s, res[0])
		}
	}
}

func TestRealEncloseCache(t *testing.T) {
	// A DAG with heavy sharing: x_{i+1} = (x_i·x_i + x_i)/2, 60 levels.
	// Without per-node caching this is 3^60 evaluations.
	x := RealSqrt(rtR("1/2"))
	for i := 0; i < 60; i++ {
		x = RealQuo(RealAdd(RealMul(x, x), x), rtR("2"))
	}
	if _, err := x.Approx(100, 8192); err != nil {
		t.Fatal(err)
	}
	// Refining gives nested enclosures.
	prev, err := x.Enclose(64)
	if err != nil {
		t.Fatal(err)
	}
	for p := uint(128); p <= 4096; p *= 2 {
		cur, err := x.Enclose(p)
		if err != nil {
			t.Fatal(err)
		}
		if cur.Lo.Cmp(prev.Lo) < 0 || cur.Hi.Cmp(prev.Hi) > 0 {
			t.Errorf("enclosure at %d bits not inside the earlier one", p)
		}
		prev = cur
	}
}

// isqrt against big.Int.Sqrt (math/big's own integer square root, an
// independent route) on squares, their neighbours and random numbers of
// lengths around and far above the switch-over.
func TestIsqrtAgainstBigSqrt(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	for _, bits := range []int{1, 64, 2047, 2048, 2049, 4100, 9000, 40000, 100003} {
		for trial := 0; trial < 6; trial++ {
			n := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(bits)))
			r := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(bits/2+1)))
			sq := new(big.Int).Mul(r, r)
			for _, m := range []*big.Int{n, sq, new(big.Int).Sub(sq, big.NewInt(1)), new(big.Int).Add(sq, big.NewInt(1))} {
				if m.Sign() < 0 {
					continue
				}
				if got, want := realIntRoot(m, 2), new(big.Int).Sqrt(m); got.Cmp(want) != 0 {
					t.Fatalf("isqrt of a %d-bit number: %v, want %v", m.BitLen(), got, want)
				}
			}
		}
	}
}

package exact

import (
	"errors"
	"fmt"
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

// ptParse splits a Text result into the printed decimal and its bound
// (nil when none is stated), read back with math/big, not with the
// package's own parser.
func ptParse(t *testing.T, s string) (d, bound *big.Rat) {
	t.Helper()
	value, b, found := strings.Cut(s, " (within ")
	d, ok := new(big.Rat).SetString(value)
	if !ok {
		t.Fatalf("%q: the value does not parse", s)
	}
	if !found {
		return d, nil
	}
	bound, ok = new(big.Rat).SetString(strings.TrimSuffix(b, ")"))
	if !ok || !strings.HasSuffix(b, ")") || bound.Sign() <= 0 {
		t.Fatalf("%q: the bound does not parse", s)
	}
	return d, bound
}

// ptScaled is v·10^k.
func ptScaled(v *big.Rat, k int) *big.Rat {
	p := new(big.Rat).SetInt(rtPow10(max(k, -k)))
	if k < 0 {
		return v.Quo(v, p)
	}
	return v.Mul(v, p)
}

// ptSignificant counts the significant digits of a printed decimal.
func ptSignificant(s string) int {
	s, _, _ = strings.Cut(s, " ")
	s, _, _ = strings.Cut(s, "e")
	s = strings.TrimLeft(strings.NewReplacer("-", "", ".", "").Replace(s), "0")
	return len(s)
}

// ptCheckContains checks that the printed decimal d with its bound holds
// the value v exactly: |v − d| < bound, or, with no bound, that d is the
// truncation of v to its printed digits (Digits' promise).
func ptCheckContains(t *testing.T, what, s string, v *big.Rat) {
	t.Helper()
	d, bound := ptParse(t, s)
	dev := new(big.Rat).Sub(v, d)
	if bound != nil {
		if dev.Abs(dev).Cmp(bound) >= 0 {
			t.Errorf("%s printed %q: |value − printed| = %s is not below the bound", what, s, dev.FloatString(5))
		}
		return
	}
	if d.Sign()*v.Sign() < 0 || new(big.Rat).Abs(d).Cmp(new(big.Rat).Abs(v)) > 0 {
		t.Errorf("%s printed %q: not a truncation of %s", what, s, v.FloatString(30))
	}
}

// A value known to be rational prints exactly when its decimal expansion
// ends within 20 significant digits, and as its certified truncation
// otherwise. The values are read back with math/big.
func TestRealTextExactRationals(t *testing.T) {
	for _, c := range []struct{ q, want string }{
		{"1/2", "0.5"},
		{"-13/4", "-3.25"},
		{"1/10000000000000000000000000000000000000000", "1e-40"}, // 10^-40
		{"1/10000", "0.0001"},
		{"1/100000", "1e-5"},
		{"12300", "12300"},
		{"15000000000000000000000000", "1.5e+25"},
		{"4", "4"},
		{"0", "0"},
		// 2^-30 = 9.31322574615478515625e-10 has 21 significant digits
		// (common practice: 2^-k has k decimals), so it is truncated.
		{"1/1073741824", "9.3132257461547851562e-10"},
		{"1/3", "0.33333333333333333333"},
	} {
		v := q(c.q)
		got, err := RealFromRat(v).Text(20, 1024)
		if err != nil || got != c.want {
			t.Errorf("Text of %s: %q %v, want %q", c.q, got, err, c.want)
			continue
		}
		d, bound := ptParse(t, got)
		if bound != nil {
			t.Errorf("Text of the exact %s states a bound: %q", c.q, got)
		}
		if short := ptSignificant(got) < 20; short && d.Cmp(v) != 0 {
			t.Errorf("Text of %s: %q is not the value", c.q, got)
		}
		ptCheckContains(t, c.q, got, v)
	}
}

// Values that sit exactly on a digit boundary, but are not known to be
// rational, across magnitudes 10^-300 … 10^300: √2·√2·(q/2),
// (4 − √2·√2)·(q/2), √2·√8·(q/4) and 2·cos(π/3)·q all equal q
// (classical: √2·√2 = 2, √8 = 2√2,
// cos(π/3) = 1/2, from memory). The printed decimal and its bound must
// contain q, computed with math/big.Rat, and, as q has at most 20
// significant digits, the rounded decimal is q itself.
func TestRealTextBoundaryAcrossMagnitudes(t *testing.T) {
	rng := rand.New(rand.NewSource(14))
	sqrt2, sqrt8 := RealSqrt(RealFromInt(2)), RealSqrt(RealFromInt(8))
	half := RealCos(RealQuo(Pi(), RealFromInt(3)))
	for i := range 160 {
		digits := 1 + rng.Intn(20)
		m := new(big.Int).Rand(rng, rtPow10(digits))
		m.Add(m, big.NewInt(1))
		exp := rng.Intn(601) - 300
		v := ptScaled(new(big.Rat).SetInt(m), exp)
		if rng.Intn(2) == 0 {
			v.Neg(v)
		}
		var x *Real
		switch i % 4 {
		case 0:
			x = RealMul(RealMul(sqrt2, sqrt2), RealFromRat(new(big.Rat).Quo(v, big.NewRat(2, 1))))
		case 3: // 4 − √2·√2 = 2, its enclosure mirrored about 2
			x = RealMul(RealSub(RealFromInt(4), RealMul(sqrt2, sqrt2)), RealFromRat(new(big.Rat).Quo(v, big.NewRat(2, 1))))
		case 1:
			x = RealMul(RealMul(sqrt2, sqrt8), RealFromRat(new(big.Rat).Quo(v, big.NewRat(4, 1))))
		default:
			x = RealMul(RealMul(half, RealFromInt(2)), RealFromRat(v))
		}
		what := fmt.Sprintf("value %s", v.FloatString(3))
		s, err := x.Text(20, 8192)
		if err != nil {
			t.Fatalf("%s: %v", what, err)
		}
		if ptSignificant(s) != 20 {
			t.Errorf("%s printed %q: want 20 significant digits", what, s)
		}
		ptCheckContains(t, what, s, v)
		d, bound := ptParse(t, s)
		if bound == nil {
			continue // certified digits: checked as a truncation
		}
		if d.Cmp(v) != 0 {
			t.Errorf("%s printed %q, not the value itself", what, s)
		}
		// Scientific form exactly outside 1e-4 ≤ |v| < 1e21 (the format
		// of Digits).
		mag := new(big.Rat).Abs(v)
		positional := mag.Cmp(big.NewRat(1, 10000)) >= 0 && mag.Cmp(new(big.Rat).SetInt(rtPow10(21))) < 0
		if value, _, _ := strings.Cut(s, " "); strings.Contains(value, "e") == positional {
			t.Errorf("%s printed %q: wrong form", what, s)
		}
		// The bound is far below the last printed digit: 8192 bits is
		// about 2466 decimal digits (common practice: bits·log10 2).
		unit := new(big.Rat).Mul(mag, new(big.Rat).SetFrac(big.NewInt(1), rtPow10(2400)))
		if bound.Cmp(unit) > 0 {
			t.Errorf("%s printed %q: a bound looser than 2400 digits", what, s)
		}
	}
}

// Off the boundary the digits settle: √2·q printed with 20 certified
// digits equals the truncation computed independently as the integer
// square root of 2·q²·10^(2k) (floor(√⌊y⌋) = floor(√y), common practice).
func TestRealTextDigitsAcrossMagnitudes(t *testing.T) {
	rng := rand.New(rand.NewSource(41))
	for range 60 {
		m := big.NewInt(1 + rng.Int63n(1_000_000))
		exp := rng.Intn(601) - 300
		v := ptScaled(new(big.Rat).SetInt(m), exp)
		s, err := RealMul(RealSqrt(RealFromInt(2)), RealFromRat(v)).Text(20, 8192)
		if err != nil {
			t.Fatal(err)
		}
		d, bound := ptParse(t, s)
		if bound != nil {
			t.Errorf("√2·%s printed %q with a bound", v.FloatString(3), s)
			continue
		}
		// The scale 10^k that puts 20 digits before the point.
		for k := 19 - exp - len(m.String()) - 1; ; k++ {
			y := ptScaled(new(big.Rat).Mul(new(big.Rat).Mul(v, v), big.NewRat(2, 1)), 2*k)
			root := new(big.Int).Sqrt(new(big.Int).Quo(y.Num(), y.Denom()))
			if len(root.String()) < 20 {
				continue
			}
			want := ptScaled(new(big.Rat).SetInt(root), -k)
			if d.Cmp(want) != 0 {
				t.Errorf("√2·%s printed %q, want %s", v.FloatString(3), s, want.FloatString(30))
			}
			break
		}
	}
}

// The fallback's edges: a sign that is not settled, an enclosure wider
// than 20 digits, a huge value with a wide absolute enclosure, and the
// errors when no enclosure exists.
func TestRealTextFallbackEdges(t *testing.T) {
	sqrt2 := RealSqrt(RealFromInt(2))
	zero := RealSub(RealMul(sqrt2, sqrt2), RealFromInt(2)) // √2·√2 − 2 = 0
	tiny := new(big.Rat).SetFrac(big.NewInt(1), rtPow10(3000))
	for _, c := range []struct {
		what string
		x    *Real
		prec uint
		v    *big.Rat
	}{
		{"e·e − e²", RealSub(RealMul(RealExp(RealFromInt(1)), RealExp(RealFromInt(1))), RealExp(RealFromInt(2))), 8192, new(big.Rat)},
		{"√2·√2 − 2 + 10^-3000", RealAdd(zero, RealFromRat(tiny)), 8192, tiny},
		{"√2·√2 at 40 bits", RealMul(sqrt2, sqrt2), 40, big.NewRat(2, 1)},
		{"−√2·√2 at 40 bits", RealNeg(RealMul(sqrt2, sqrt2)), 40, big.NewRat(-2, 1)},
		{"1/(√2·√2 − 2 + 10^-2000)", RealQuo(RealFromInt(1), RealAdd(zero, RealFromRat(new(big.Rat).SetFrac(big.NewInt(1), rtPow10(2000))))), 8192, new(big.Rat).SetInt(rtPow10(2000))},
	} {
		s, err := c.x.Text(20, c.prec)
		if err != nil {
			t.Fatalf("%s: %v", c.what, err)
		}
		ptCheckContains(t, c.what, s, c.v)
		if _, bound := ptParse(t, s); bound == nil {
			t.Errorf("%s printed %q without a bound", c.what, s)
		}
		if c.prec == 40 && ptSignificant(s) >= 20 {
			// 40 bits fix about 12 digits: more would be noise.
			t.Errorf("%s printed %q: more digits than the enclosure fixes", c.what, s)
		}
	}
	// An algebraic zero is proved one, and prints as one.
	if s, err := zero.Text(20, 8192); err != nil || s != "0" {
		t.Errorf("√2·√2 − 2 printed %q, %v", s, err)
	}
	if _, err := RealSqrt(RealSin(Pi())).Text(20, 8192); !errors.Is(err, ErrUndecided) {
		t.Errorf("√(sin π): %v, want undecided", err)
	}
	below := RealSub(zero, RealFromRat(new(big.Rat).SetFrac(big.NewInt(1), rtPow10(2000))))
	if _, err := RealSqrt(below).Text(20, 8192); !errors.Is(err, ErrDomain) {
		t.Errorf("√(√2·√2 − 2 − 10^-2000): %v, want a domain error", err)
	}
}

// The rounded form's promise holds at every point of the enclosure, its
// ends included: for random intervals [lo, hi] (some narrow, some wide,
// some around 0) |lo − d| and |hi − d| are below the stated bound, and
// the bound is the least power of ten that is (checked with math/big).
func TestRealTextBoundCoversEnclosure(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	for range 400 {
		lo := new(big.Rat).SetFrac(big.NewInt(rng.Int63n(2_000_001)-1_000_000), rtPow10(rng.Intn(40)))
		width := new(big.Rat).SetFrac(big.NewInt(rng.Int63n(1000)), rtPow10(rng.Intn(60)))
		hi := new(big.Rat).Add(lo, width)
		s := boundedText(Interval{lo, hi}, 1+rng.Intn(20))
		d, bound := ptParse(t, s)
		if bound == nil {
			if lo.Cmp(d) != 0 || hi.Cmp(d) != 0 {
				t.Errorf("[%s, %s] printed %q without a bound", lo.FloatString(60), hi.FloatString(60), s)
			}
			continue
		}
		dev := new(big.Rat)
		for _, end := range []*big.Rat{lo, hi} {
			if e := new(big.Rat).Sub(end, d); e.Abs(e).Cmp(dev) > 0 {
				dev = e
			}
		}
		tenth := new(big.Rat).Quo(bound, big.NewRat(10, 1))
		if dev.Cmp(bound) >= 0 || dev.Cmp(tenth) < 0 {
			t.Errorf("[%s, %s] printed %q: the largest deviation %s is not in [bound/10, bound)", lo.FloatString(60), hi.FloatString(60), s, dev.FloatString(60))
		}
	}
}

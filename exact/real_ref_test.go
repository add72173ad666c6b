package exact

// Checks of Real against outside sources: published digit tables (first
// 100 digits typed from memory) and, for thousands of digits, independent
// routes in exact integer/rational arithmetic with explicit error bounds.
// The exact-rational exp and log series here (rtExpRef, rtLogRef) are also
// the references of real_explog_test.go.

import (
	"math"
	"math/big"
	"strings"
	"testing"
)

// First 100 significant digits, typed from memory of the published tables:
// OEIS A002193 (√2), A001113 (e), A000796 (π).
const (
	rtSqrt2Digits100 = "1.414213562373095048801688724209698078569671875376948073176679737990732478462107038850387534327641572"
	rtEDigits100     = "2.718281828459045235360287471352662497757247093699959574966967627724076630353547594571382178525166427"
	rtPiDigits100    = "3.141592653589793238462643383279502884197169399375105820974944592307816406286208998628034825342117067"
)

func rtPow10(n int) *big.Int { return new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(n)), nil) }

// rtSqrt2Scaled returns ⌊√2·10^d⌋ exactly, as ⌊√(2·10^(2d))⌋ (big.Int.Sqrt).
func rtSqrt2Scaled(d int) *big.Int {
	n := new(big.Int).Lsh(rtPow10(2*d), 1)
	return n.Sqrt(n)
}

// rtEScaled returns ⌊e·10^d⌋ from the exact rational partial sum
// s = Σ_{k≤N} 1/k! = M/N! with e − s < 1/(N!·N): both s and s + 1/(N!·N)
// must give the same floor, else it fails the test.
func rtEScaled(t testing.TB, d int) *big.Int {
	// N with N! > 10^(d+10).
	fact := big.NewInt(1)
	n := int64(1)
	lim := rtPow10(d + 10)
	for fact.Cmp(lim) <= 0 {
		n++
		fact.Mul(fact, big.NewInt(n))
	}
	// M = Σ_{k=0}^{N} N!/k! = 1 + N·(1 + (N−1)·(1 + … (1 + 1·1))), by Horner
	// from the inside.
	m := big.NewInt(1)
	for k := int64(1); k <= n; k++ {
		m.Mul(m, big.NewInt(k))
		m.Add(m, big.NewInt(1))
	}
	scale := rtPow10(d)
	lo := new(big.Int).Mul(m, scale)
	lo.Quo(lo, fact)
	// hi: (M·N + 1)/(N!·N)
	hn := new(big.Int).Mul(m, big.NewInt(n))
	hn.Add(hn, big.NewInt(1))
	hn.Mul(hn, scale)
	hd := new(big.Int).Mul(fact, big.NewInt(n))
	hi := hn.Quo(hn, hd)
	if lo.Cmp(hi) != 0 {
		t.Fatalf("e reference: bounds disagree at %d digits", d)
	}
	return lo
}

// rtMachinPiScaled returns ⌊π·10^d⌋ by Machin's formula
// π = 16·atan(1/5) − 4·atan(1/239), each arctangent summed in exact integer
// arithmetic scaled by X = 10^(d+12): term_k = ⌊X/((2k+1)·n^(2k+1))⌋ is
// exact up to < 1 (nested floors of exact divisions), and the series is
// summed until a term is 0, so the exact tail is < 1 too. The total error is
// below 16·(K5+1) + 4·(K239+1); both ends of the error band must give the
// same floor, else it fails the test.
func rtMachinPiScaled(t testing.TB, d int) *big.Int {
	const guard = 12
	x := rtPow10(d + guard)
	atanInv := func(n int64) (*big.Int, int64) {
		sum := new(big.Int)
		p := new(big.Int).Quo(x, big.NewInt(n)) // ⌊X/n^(2k+1)⌋
		n2 := big.NewInt(n * n)
		var k int64
		for ; p.Sign() != 0; k++ {
			term := new(big.Int).Quo(p, big.NewInt(2*k+1))
			if k%2 == 0 {
				sum.Add(sum, term)
			} else {
				sum.Sub(sum, term)
			}
			p.Quo(p, n2)
		}
		return sum, k
	}
	a5, k5 := atanInv(5)
	a239, k239 := atanInv(239)
	v := new(big.Int).Mul(a5, big.NewInt(16))
	v.Sub(v, new(big.Int).Mul(a239, big.NewInt(4)))
	errb := big.NewInt(16*(k5+1) + 4*(k239+1))
	g := rtPow10(guard)
	lo := new(big.Int).Sub(v, errb)
	lo.Quo(lo, g)
	hi := new(big.Int).Add(v, errb)
	hi.Quo(hi, g)
	if lo.Cmp(hi) != 0 {
		t.Fatalf("Machin reference: bounds disagree at %d digits", d)
	}
	return lo
}

// rtDigitsOf turns "1.414…" into the integer 1414….
func rtDigitsOf(t testing.TB, s string) *big.Int {
	v, ok := new(big.Int).SetString(strings.Replace(s, ".", "", 1), 10)
	if !ok {
		t.Fatalf("not digits: %q", s)
	}
	return v
}

func TestRealDigitsFromMemory(t *testing.T) {
	for _, c := range []struct {
		name string
		x    *Real
		want string
	}{
		{"sqrt2", RealSqrt(RealFromInt(2)), rtSqrt2Digits100},
		{"e", RealExp(RealFromInt(1)), rtEDigits100},
		{"pi", Pi(), rtPiDigits100},
	} {
		got, err := c.x.Digits(100, DefaultMaxPrecision)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if got != c.want {
			t.Errorf("%s: 100 digits\n got %s\nwant %s", c.name, got, c.want)
		}
	}
}

// TestRealDigitsIndependent checks 1,200 and 10,000 digits of √2, e and π
// against the independent exact routes above, to the last digit printed.
func TestRealDigitsIndependent(t *testing.T) {
	// The references also agree with the typed tables.
	if got := rtSqrt2Scaled(99); got.Cmp(rtDigitsOf(t, rtSqrt2Digits100)) != 0 {
		t.Errorf("isqrt reference disagrees with the table: %s", got)
	}
	if got := rtEScaled(t, 99); got.Cmp(rtDigitsOf(t, rtEDigits100)) != 0 {
		t.Errorf("partial-sum reference disagrees with the table: %s", got)
	}
	if got := rtMachinPiScaled(t, 99); got.Cmp(rtDigitsOf(t, rtPiDigits100)) != 0 {
		t.Errorf("Machin reference disagrees with the table: %s", got)
	}
	for _, d := range []int{1200, 10000} {
		refs := []struct {
			name string
			x    *Real
			want *big.Int
		}{
			{"sqrt2", RealSqrt(RealFromInt(2)), rtSqrt2Scaled(d - 1)},
			{"e", RealExp(RealFromInt(1)), rtEScaled(t, d-1)},
			{"pi", Pi(), rtMachinPiScaled(t, d-1)},
		}
		for _, c := range refs {
			got, err := c.x.Digits(d, DefaultMaxPrecision)
			if err != nil {
				t.Fatalf("%s: %v", c.name, err)
			}
			if g := rtDigitsOf(t, got); g.Cmp(c.want) != 0 {
				t.Errorf("%s: %d digits disagree with the independent route", c.name, d)
			}
			if len(got) != d+1 {
				t.Errorf("%s: %d characters for %d digits", c.name, len(got), d)
			}
		}
	}
}

// rtExpRef encloses exp(z) for a rational z by the Taylor series summed
// exactly: with y = |z| = a/b and N+2 ≥ 2y, Σ_{k≤N} y^k/k! is the fraction
// R_0 of the Horner scheme R_N = 1, R_(k−1) = 1 + y·R_k/k (exact integer
// numerator and denominator b^N·N!), and the tail is at most
// 2·y^(N+1)/(N+1)!. exp(z) for z < 0 is the reciprocal.
func rtExpRef(z *big.Rat, bits int) (lo, hi *big.Rat) {
	y := new(big.Rat).Abs(z)
	a, b := y.Num(), y.Denom()
	yf, _ := y.Float64()
	n := int64(2*yf) + 2
	// Pick N by a float64 estimate, then check the exact tail bound.
	ly := math.Log2(yf)
	for {
		lg, _ := math.Lgamma(float64(n + 2))
		if float64(n+1)*ly-lg/math.Ln2 < -float64(bits+4) {
			break
		}
		n += 8
	}
	var tail *big.Rat
	eps := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), uint(bits)))
	for {
		tn := new(big.Int).Exp(a, big.NewInt(n+1), nil)
		td := new(big.Int).Exp(b, big.NewInt(n+1), nil)
		td.Mul(td, new(big.Int).MulRange(1, n+1))
		tail = new(big.Rat).SetFrac(tn.Lsh(tn, 1), td)
		if tail.Cmp(eps) <= 0 {
			break
		}
		n += 8
	}
	num, den := big.NewInt(1), big.NewInt(1)
	for k := n; k >= 1; k-- {
		bk := new(big.Int).Mul(b, big.NewInt(k))
		num.Add(new(big.Int).Mul(den, bk), new(big.Int).Mul(a, num))
		den.Mul(den, bk)
	}
	lo = new(big.Rat).SetFrac(num, den)
	hi = new(big.Rat).Add(lo, tail)
	if z.Sign() < 0 {
		lo, hi = new(big.Rat).Inv(hi), new(big.Rat).Inv(lo)
	}
	return lo, hi
}

// rtAtanhSum encloses Σ_k s^(2k+1)/(2k+1) = atanh(s) for a rational s with
// |s| ≤ 1/2, summing K terms exactly over the common denominator
// b^(2K−1)·Π(2k+1), with the tail bound |s|^(2K+1)/((2K+1)(1−s²)).
func rtAtanhSum(s *big.Rat, bits int) (lo, hi *big.Rat) {
	a, b := s.Num(), s.Denom()
	sa := new(big.Rat).Abs(s)
	one := big.NewRat(1, 1)
	oneMinus := new(big.Rat).Sub(one, new(big.Rat).Mul(s, s))
	tail := func(k int64) *big.Rat {
		p := new(big.Rat).SetFrac(new(big.Int).Exp(sa.Num(), big.NewInt(2*k+1), nil), new(big.Int).Exp(sa.Denom(), big.NewInt(2*k+1), nil))
		p.Quo(p, big.NewRat(2*k+1, 1))
		return p.Quo(p, oneMinus)
	}
	eps := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), uint(bits)))
	var kk int64 = 1
	for tail(kk).Cmp(eps) > 0 {
		kk += 4
	}
	prodOdd := big.NewInt(1)
	for k := int64(0); k < kk; k++ {
		prodOdd.Mul(prodOdd, big.NewInt(2*k+1))
	}
	sum := new(big.Int)
	for k := int64(0); k < kk; k++ {
		term := new(big.Int).Exp(a, big.NewInt(2*k+1), nil)
		term.Mul(term, new(big.Int).Exp(b, big.NewInt(2*(kk-1-k)), nil))
		term.Mul(term, new(big.Int).Quo(prodOdd, big.NewInt(2*k+1)))
		sum.Add(sum, term)
	}
	den := new(big.Int).Exp(b, big.NewInt(2*kk-1), nil)
	den.Mul(den, prodOdd)
	mid := new(big.Rat).SetFrac(sum, den)
	tb := tail(kk)
	return new(big.Rat).Sub(mid, tb), new(big.Rat).Add(mid, tb)
}

// rtLogRef encloses log z for a rational z > 0 as j·log 2 + log(z/2^j) with
// z/2^j in [3/4, 3/2), log 2 = 2·atanh(1/3) and log m = 2·atanh((m−1)/(m+1)).
func rtLogRef(z *big.Rat, bits int) (lo, hi *big.Rat) {
	j := z.Num().BitLen() - z.Denom().BitLen()
	m := new(big.Rat).Set(z)
	for {
		m.Set(z)
		if j >= 0 {
			m.Quo(m, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(j))))
		} else {
			m.Mul(m, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(-j))))
		}
		if m.Cmp(big.NewRat(3, 4)) < 0 {
			j--
			continue
		}
		if m.Cmp(big.NewRat(3, 2)) >= 0 {
			j++
			continue
		}
		break
	}
	s := new(big.Rat).Quo(new(big.Rat).Sub(m, big.NewRat(1, 1)), new(big.Rat).Add(m, big.NewRat(1, 1)))
	mlo, mhi := rtAtanhSum(s, bits+2)
	l2lo, l2hi := rtAtanhSum(big.NewRat(1, 3), bits+16)
	two := big.NewRat(2, 1)
	jr := big.NewRat(int64(j), 1)
	a := new(big.Rat).Mul(jr, new(big.Rat).Mul(two, l2lo))
	b := new(big.Rat).Mul(jr, new(big.Rat).Mul(two, l2hi))
	if j < 0 {
		a, b = b, a
	}
	lo = new(big.Rat).Add(a, new(big.Rat).Mul(two, mlo))
	hi = new(big.Rat).Add(b, new(big.Rat).Mul(two, mhi))
	return lo, hi
}

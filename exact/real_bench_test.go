package exact

import (
	"math/big"
	"testing"
)

// Targets: 10,000 certified digits of √2 and of e in under 0.5 s each; a
// 256-bit evaluation of √a + √b − √c, 1,000 times, well under a second.

func BenchmarkRealDigitsSqrt2_10000(b *testing.B) {
	for i := 0; i < b.N; i++ {
		x := RealSqrt(RealFromInt(2)) // fresh: no cached enclosure
		if _, err := x.Digits(10000, DefaultMaxPrecision); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkRealDigitsE_10000(b *testing.B) {
	for i := 0; i < b.N; i++ {
		x := RealExp(RealFromInt(1))
		if _, err := x.Digits(10000, DefaultMaxPrecision); err != nil {
			b.Fatal(err)
		}
	}
}

func rtResetPiCache() {
	piCache.Lock()
	piCache.v, piCache.prec = ival{}, 0
	piCache.Unlock()
	piNode.mu.Lock()
	piNode.enc, piNode.prec = ival{}, 0
	piNode.mu.Unlock()
}

func BenchmarkRealDigitsPi_10000(b *testing.B) {
	for i := 0; i < b.N; i++ {
		rtResetPiCache()
		if _, err := Pi().Digits(10000, DefaultMaxPrecision); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRealSqrtSum256 is one 256-bit evaluation of √a + √b − √c from
// fresh nodes; multiply ns/op by 1,000 for the target.
func BenchmarkRealSqrtSum256(b *testing.B) {
	ra, rb, rc := big.NewRat(12345, 17), big.NewRat(99991, 3), big.NewRat(7, 1000)
	for i := 0; i < b.N; i++ {
		x := RealSub(RealAdd(RealSqrt(RealFromRat(ra)), RealSqrt(RealFromRat(rb))), RealSqrt(RealFromRat(rc)))
		if _, err := x.Enclose(256); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkRealSinCosExpLog256(b *testing.B) {
	for i := 0; i < b.N; i++ {
		s := RealSqrt(RealFromInt(3))
		x := RealAdd(RealAdd(RealSin(s), RealCos(s)), RealAdd(RealExp(s), RealLog(s)))
		if _, err := x.Enclose(256); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkRealAtan2Acos256(b *testing.B) {
	for i := 0; i < b.N; i++ {
		s := RealSqrt(RealFromInt(3))
		x := RealAdd(RealAtan2(s, RealFromInt(-2)), RealAcos(RealQuo(s, RealFromInt(2))))
		if _, err := x.Enclose(256); err != nil {
			b.Fatal(err)
		}
	}
}

// benchExpLog encloses exp and log of an irrational argument (so neither
// takes a rational shortcut) from fresh nodes at the given precision.
func benchExpLog(b *testing.B, prec uint, log bool) {
	for i := 0; i < b.N; i++ {
		s := RealSqrt(RealFromInt(3))
		x := RealExp(RealMul(s, RealFromInt(100)))
		if log {
			x = RealLog(RealMul(s, RealFromInt(100)))
		}
		if _, err := x.Enclose(prec); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkRealExp256(b *testing.B)  { benchExpLog(b, 256, false) }
func BenchmarkRealExp1024(b *testing.B) { benchExpLog(b, 1024, false) }
func BenchmarkRealExp4096(b *testing.B) { benchExpLog(b, 4096, false) }
func BenchmarkRealLog256(b *testing.B)  { benchExpLog(b, 256, true) }
func BenchmarkRealLog1024(b *testing.B) { benchExpLog(b, 1024, true) }
func BenchmarkRealLog4096(b *testing.B) { benchExpLog(b, 4096, true) }

// Issue 20: 100,000 certified digits, compared with the reference program
// (digits NAME 100000); the figures are at the top of real_const.go.
func benchDigits100k(b *testing.B, mk func() *Real) {
	for i := 0; i < b.N; i++ {
		rtResetPiCache()
		ln2Cache.Lock()
		ln2Cache.l, ln2Cache.w = nil, 0
		ln2Cache.Unlock()
		if _, err := mk().Digits(100000, 1<<21); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkRealDigitsPi_100000(b *testing.B) { benchDigits100k(b, Pi) }
func BenchmarkRealDigitsE_100000(b *testing.B) {
	benchDigits100k(b, func() *Real { return RealExp(RealFromInt(1)) })
}
func BenchmarkRealDigitsLog2_100000(b *testing.B) {
	benchDigits100k(b, func() *Real { return RealLog(RealFromInt(2)) })
}
func BenchmarkRealDigitsSin1_100000(b *testing.B) {
	benchDigits100k(b, func() *Real { return RealSin(RealFromInt(1)) })
}
func BenchmarkRealDigitsExp1_3_100000(b *testing.B) {
	benchDigits100k(b, func() *Real { return RealExp(RealFromRat(big.NewRat(1, 3))) })
}

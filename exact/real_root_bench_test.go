package exact

import "testing"

// BenchmarkRealDigitsSqrt2_100000 is 100,000 certified digits of √2 from a
// fresh node (no cached enclosure), the issue-20 row compared with arb
// (/tmp/peer-bin/digits sqrt2 100000); figures at the top of real_root.go.
func BenchmarkRealDigitsSqrt2_100000(b *testing.B) {
	for i := 0; i < b.N; i++ {
		x := RealSqrt(RealFromInt(2))
		if _, err := x.Digits(100000, 1<<20); err != nil {
			b.Fatal(err)
		}
	}
}

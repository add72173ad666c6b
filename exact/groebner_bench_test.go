package exact

import "testing"

// The targets on the 2-core machine: Cyclic-5 grevlex < 1 s,
// Cyclic-6 < 30 s, Katsura-5 < 5 s (figures in DEVELOPERS.md).

func benchGroebner(b *testing.B, in []*Poly) {
	b.ReportAllocs()
	var n int
	for b.Loop() {
		g, err := Groebner(in, Grevlex, GroebnerLimits{})
		if err != nil {
			b.Fatal(err)
		}
		n = len(g)
	}
	b.ReportMetric(float64(n), "basis")
}

func BenchmarkGroebnerCyclic5(b *testing.B)  { benchGroebner(b, cyclic(b, 5)) }
func BenchmarkGroebnerCyclic6(b *testing.B)  { benchGroebner(b, cyclic(b, 6)) }
func BenchmarkGroebnerKatsura5(b *testing.B) { benchGroebner(b, katsura(b, 5)) }

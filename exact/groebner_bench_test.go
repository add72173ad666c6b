package exact

import "testing"

// The targets on the 2-core machine: Cyclic-5 grevlex < 1 s,
// Cyclic-6 < 30 s, Katsura-5 < 5 s (figures in DEVELOPERS.md). After
// timing, each basis is checked: reduced, every S-polynomial reducing to
// 0, every input in the ideal, and as many standard monomials as the
// system has solutions: 70 for Cyclic-5 and 156 for Cyclic-6 (Björck and
// Fröberg 1991), 2^5 = 32 for Katsura-5 (common benchmark fact, from
// memory). Cyclic-6 is checked only here, as it takes seconds.

func benchGroebner(b *testing.B, in []*Poly, solutions int) {
	b.ReportAllocs()
	var g []*Poly
	for b.Loop() {
		var err error
		if g, err = Groebner(in, Grevlex, GroebnerLimits{}); err != nil {
			b.Fatal(err)
		}
	}
	b.StopTimer()
	b.ReportMetric(float64(len(g)), "basis")
	checkReduced(b, g, Grevlex)
	for _, p := range in {
		if nf, err := Reduce(p, g, Grevlex, GroebnerLimits{}); err != nil || !nf.IsZero() {
			b.Errorf("input %v: normal form %v, %v", p, nf, err)
		}
	}
	if got := standardMonomials(b, g, Grevlex, len(in), 40); got != solutions {
		b.Errorf("%d standard monomials, want %d", got, solutions)
	}
}

func BenchmarkGroebnerCyclic5(b *testing.B)  { benchGroebner(b, cyclic(b, 5), 70) }
func BenchmarkGroebnerCyclic6(b *testing.B)  { benchGroebner(b, cyclic(b, 6), 156) }
func BenchmarkGroebnerKatsura5(b *testing.B) { benchGroebner(b, katsura(b, 5), 32) }

package exact

import (
	"errors"
	"fmt"
	"math/big"
	"math/rand"
	"testing"
	"time"
)

// product returns unit·∏ f^k of a factorization.
func product(t testing.TB, r *Ring, u *big.Rat, fs []FactorPower) *Poly {
	t.Helper()
	out := r.Const(u)
	for _, f := range fs {
		out = mustMulP(t, out, mustPow(t, f.Factor, f.Mult))
	}
	return out
}

// mustFactor factors p and checks the product and the normal form.
func mustFactor(t testing.TB, p *Poly) *Factorization {
	t.Helper()
	f, err := p.Factor()
	if err != nil {
		t.Fatalf("factor %v: %v", p, err)
	}
	if got := product(t, p.Ring(), f.Unit, f.Factors); !got.Equal(p) {
		t.Fatalf("factor %v: product of the factors is %v", p, got)
	}
	for i, fp := range f.Factors {
		if !fp.Factor.PrimitivePart().Equal(fp.Factor) || fp.Factor.Degree() < 1 || fp.Mult < 1 {
			t.Fatalf("factor %v: factor %v^%d not primitive, positive and non-constant", p, fp.Factor, fp.Mult)
		}
		if i > 0 && cmpFactor(f.Factors[i-1].Factor, fp.Factor) >= 0 {
			t.Fatalf("factor %v: factors not sorted strictly", p)
		}
	}
	return f
}

// TestModPFactorsMultiplyBack: the mod-p factors are monic, irreducible by
// construction, and their product is the monic input (the definition of a
// factorization; Cantor–Zassenhaus).
func TestModPFactorsMultiplyBack(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	for _, p := range []uint64{3, 5, 101, 65521} {
		F := fp{p}
		for trial := 0; trial < 30; trial++ {
			a := make([]uint64, 2+rng.Intn(20))
			for i := range a {
				a[i] = uint64(rng.Int63n(int64(p)))
			}
			a[len(a)-1] = 1
			if !F.squareFree(a, len(a)-1) {
				continue
			}
			facs := F.factorSquareFree(F.ddf(a))
			prod := []uint64{1}
			for _, f := range facs {
				if f[len(f)-1] != 1 {
					t.Fatalf("p=%d: factor %v not monic", p, f)
				}
				// Irreducible of degree d: x^(p^d) ≡ x mod f and no proper
				// ddf split (common practice: Rabin's test, simplified to
				// the ddf of the factor itself).
				if parts := F.ddf(f); len(parts) != 1 || parts[0].deg != len(f)-1 {
					t.Fatalf("p=%d: factor %v is not irreducible: %v", p, f, parts)
				}
				prod = F.mul(prod, f)
			}
			if fmt.Sprint(prod) != fmt.Sprint(a) {
				t.Fatalf("p=%d: product %v, want %v", p, prod, a)
			}
		}
	}
}

// TestHenselLiftedFactorsMultiplyToF: the lifted factors multiply to f
// modulo p^(2^k), up to lc(f) (Hensel's lemma, MCA Theorem 15.18).
func TestHenselLiftedFactorsMultiplyToF(t *testing.T) {
	rng := rand.New(rand.NewSource(6))
	for trial := 0; trial < 40; trial++ {
		f := make([]*big.Int, 3+rng.Intn(12))
		for i := range f {
			f[i] = big.NewInt(rng.Int63n(2001) - 1000)
		}
		f[len(f)-1] = big.NewInt(1 + rng.Int63n(50))
		p, facs, err := choosePrime(f)
		if err != nil {
			continue
		}
		steps := 1 + rng.Intn(4)
		lifted := henselLift(f, facs, p, steps)
		M := new(big.Int).SetUint64(p)
		for i := 0; i < steps; i++ {
			M.Mul(M, M)
		}
		prod := []*big.Int{new(big.Int).Set(f[len(f)-1])}
		for i, g := range lifted {
			if g[len(g)-1].Cmp(bigOne) != 0 {
				t.Fatalf("lifted factor %v not monic", g)
			}
			if fmt.Sprint(fp{p}.fromZ(g)) != fmt.Sprint(facs[i]) {
				t.Fatalf("lifted factor %v does not reduce to %v mod %d", g, facs[i], p)
			}
			prod = zMod(zMul(prod, g), M)
		}
		if fmt.Sprint(prod) != fmt.Sprint(zMod(zAdd(f, nil, 1), M)) {
			t.Fatalf("f=%v mod %v: lifted product %v", f, M, prod)
		}
	}
}

// TestRecombinationFindsKnownSplit: (x²−2)(x²−3)(x−5) splits mod every
// suitable prime into at least three factors, and recombination must
// pair them back into exactly the known rational factors (the quadratics
// are irreducible over Q since √2, √3 are irrational; from memory).
func TestRecombinationFindsKnownSplit(t *testing.T) {
	r, _ := testRing(t, "x")
	p := mustParse(t, r, "(x^2-2)*(x^2-3)*(x-5)")
	f := mustFactor(t, p)
	want := []string{"x - 5", "x^2 - 3", "x^2 - 2"}
	if len(f.Factors) != 3 {
		t.Fatalf("got %d factors: %v", len(f.Factors), f.Factors)
	}
	for i, w := range want {
		if got := f.Factors[i].Factor.String(); got != w {
			t.Errorf("factor %d: got %s, want %s", i, got, w)
		}
	}
}

// cyclotomic returns Φ_1..Φ_n by the recursive definition
// Φ_n = (x^n − 1)/∏_{d|n, d<n} Φ_d (the definition of cyclotomic
// polynomials; OEIS A013595 tabulates their coefficients).
func cyclotomic(t testing.TB, r *Ring, n int) []*Poly {
	x := mustParse(t, r, "x")
	phi := make([]*Poly, n+1)
	for k := 1; k <= n; k++ {
		num := mustPow(t, x, k).Sub(r.one())
		for d := 1; d < k; d++ {
			if k%d == 0 {
				q, ok, err := num.DivExact(phi[d])
				if err != nil || !ok {
					t.Fatalf("Φ_%d does not divide x^%d−1", d, k)
				}
				num = q
			}
		}
		phi[k] = num
	}
	return phi
}

// TestCyclotomicFactorizations: x^n − 1 = ∏_{d|n} Φ_d with every Φ_d
// irreducible over Q (Gauss; the cyclotomic polynomials, OEIS A013595).
func TestCyclotomicFactorizations(t *testing.T) {
	r, _ := testRing(t, "x")
	phi := cyclotomic(t, r, 60)
	// Spot checks of the independent construction against A013595 rows
	// (from memory): Φ_6 = x² − x + 1, Φ_12 = x⁴ − x² + 1.
	if phi[6].String() != "x^2 - x + 1" || phi[12].String() != "x^4 - x^2 + 1" {
		t.Fatalf("Φ_6 = %v, Φ_12 = %v", phi[6], phi[12])
	}
	x := mustParse(t, r, "x")
	for n := 1; n <= 60; n++ {
		f := mustFactor(t, mustPow(t, x, n).Sub(r.one()))
		var divisors []int
		for d := 1; d <= n; d++ {
			if n%d == 0 {
				divisors = append(divisors, d)
			}
		}
		if len(f.Factors) != len(divisors) || f.Unit.Cmp(big.NewRat(1, 1)) != 0 {
			t.Fatalf("x^%d − 1: %d factors, unit %v; want %d (the divisors of n)", n, len(f.Factors), f.Unit, len(divisors))
		}
		for _, d := range divisors {
			found := false
			for _, g := range f.Factors {
				found = found || g.Factor.Equal(phi[d]) && g.Mult == 1
			}
			if !found {
				t.Fatalf("x^%d − 1: Φ_%d = %v missing from %v", n, d, phi[d], f.Factors)
			}
		}
	}
}

// TestSophieGermainUnivariate: x⁴ + 4 = (x² + 2x + 2)(x² − 2x + 2)
// (Sophie Germain's identity a⁴ + 4b⁴ at b = 1).
func TestSophieGermainUnivariate(t *testing.T) {
	r, _ := testRing(t, "x")
	f := mustFactor(t, mustParse(t, r, "x^4 + 4"))
	if len(f.Factors) != 2 || f.Factors[0].Factor.String() != "x^2 - 2*x + 2" || f.Factors[1].Factor.String() != "x^2 + 2*x + 2" {
		t.Fatalf("x^4+4: %v", f.Factors)
	}
}

// TestHeronInOneSide: 16·Area² = (a+b+c)(−a+b+c)(a−b+c)(a+b−c) (Heron's
// formula); with b = 5, c = 7, as a polynomial in a, it is
// −(a + 12)(a + 2)(a − 2)(a − 12): four linear factors and the unit −1.
func TestHeronInOneSide(t *testing.T) {
	r, _ := testRing(t, "a")
	// 16·Area² = 2a²b² + 2b²c² + 2c²a² − a⁴ − b⁴ − c⁴ (Heron, expanded).
	p := mustParse(t, r, "2*a^2*25 + 2*25*49 + 2*49*a^2 - a^4 - 625 - 2401")
	f := mustFactor(t, p)
	want := []string{"a - 12", "a - 2", "a + 2", "a + 12"}
	if len(f.Factors) != 4 || f.Unit.Cmp(big.NewRat(-1, 1)) != 0 {
		t.Fatalf("Heron: unit %v, factors %v", f.Unit, f.Factors)
	}
	for i, w := range want {
		if f.Factors[i].Factor.String() != w {
			t.Errorf("factor %d: %v, want %s", i, f.Factors[i].Factor, w)
		}
	}
}

// swinnertonDyer returns ∏(x ± √2 ± √3 ± √5 [± √7]) built by the
// resultant-free recursion P_{k+1}(x) = P_k(x + √p)·P_k(x − √p), which is
// a polynomial in x² only in √p: expanded with y² = p substituted.
func swinnertonDyer(t testing.TB, r *Ring, primes []int) *Poly {
	x := mustParse(t, r, "x")
	y := mustParse(t, r, "y")
	P := x
	for _, p := range primes {
		plus, err := P.Substitute(map[int]*Poly{0: x.Add(y)})
		if err != nil {
			t.Fatal(err)
		}
		minus, err := P.Substitute(map[int]*Poly{0: x.Sub(y)})
		if err != nil {
			t.Fatal(err)
		}
		prod := mustMulP(t, plus, minus) // even in y
		var out *Poly = r.zero()
		for e, c := range prod.Collect(1) {
			if c == nil {
				continue
			}
			pe := new(big.Int).Exp(big.NewInt(int64(p)), big.NewInt(int64(e/2)), nil)
			out = out.Add(c.Scale(new(big.Rat).SetInt(pe)))
		}
		P = out
	}
	return P
}

// TestSwinnertonDyerIrreducible: the degree-8 Swinnerton-Dyer polynomial
// x⁸ − 40x⁶ + 352x⁴ − 960x² + 576 (from memory) is irreducible over Q,
// though it factors modulo every prime; the degree-16 one likewise.
func TestSwinnertonDyerIrreducible(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	s8 := swinnertonDyer(t, r, []int{2, 3, 5})
	if s8.String() != "x^8 - 40*x^6 + 352*x^4 - 960*x^2 + 576" {
		t.Fatalf("S8 = %v", s8)
	}
	for _, p := range []*Poly{s8, swinnertonDyer(t, r, []int{2, 3, 5, 7})} {
		start := time.Now()
		ok, err := p.IsIrreducible()
		if err != nil || !ok {
			t.Fatalf("degree %d Swinnerton-Dyer: irreducible %v, %v", p.Degree(), ok, err)
		}
		t.Logf("degree %d: irreducible in %v", p.Degree(), time.Since(start))
		// The hard case for recombination: reducible modulo every prime
		// (from memory: all its factors mod p have degree at most 2).
		f := toDense(p.PrimitivePart(), 0)
		for _, q := range smallPrimes()[:30] {
			F := fp{q}
			if a := F.fromZ(f); F.squareFree(a, len(f)-1) {
				if n := countFactors(F.ddf(F.monic(a))); n < p.Degree()/2 {
					t.Errorf("degree %d mod %d: %d factors, want at least %d", p.Degree(), q, n, p.Degree()/2)
				}
			}
		}
	}
}

// randUni returns a random univariate polynomial in x of degree 1..maxDeg
// with small integer coefficients.
func randUni(rng *rand.Rand, r *Ring, maxDeg int) *Poly {
	d := 1 + rng.Intn(maxDeg)
	c := make([]*big.Int, d+1)
	for i := range c {
		c[i] = big.NewInt(rng.Int63n(21) - 10)
	}
	for c[d].Sign() == 0 {
		c[d] = big.NewInt(rng.Int63n(21) - 10)
	}
	return fromDense(r, 0, c)
}

// TestFactorProperty: on random products of random factors, the product
// of the returned factors equals the input exactly, and no factor of
// degree ≥ 2 has a rational root (second route: the rational root
// theorem — a root p/q has p | a₀ and q | a_n).
func TestFactorProperty(t *testing.T) {
	r, _ := testRing(t, "x")
	rng := rand.New(rand.NewSource(7))
	for trial := 0; trial < 1000; trial++ {
		p := r.Const(big.NewRat(rng.Int63n(9)-4, 1+rng.Int63n(5)))
		for k := 1 + rng.Intn(4); k > 0; k-- {
			p = mustMulP(t, p, mustPow(t, randUni(rng, r, 4), 1+rng.Intn(2)))
		}
		f := mustFactor(t, p)
		if p.IsZero() {
			continue
		}
		for _, g := range f.Factors {
			if g.Factor.Degree() >= 2 && g.Factor.Degree() <= 6 {
				if root := rationalRoot(toDense(g.Factor, 0)); root != nil {
					t.Fatalf("factor %v of %v has the rational root %v", g.Factor, p, root)
				}
			}
		}
	}
}

// rationalRoot returns a rational root of a by the rational root theorem,
// or nil.
func rationalRoot(a []*big.Int) *big.Rat {
	if a[0].Sign() == 0 {
		return new(big.Rat)
	}
	for _, num := range divisorsOf(a[0]) {
		for _, den := range divisorsOf(a[len(a)-1]) {
			for _, s := range []int64{1, -1} {
				x := new(big.Rat).SetFrac(new(big.Int).Mul(num, big.NewInt(s)), den)
				v := new(big.Rat)
				for i := len(a) - 1; i >= 0; i-- {
					v.Add(v.Mul(v, x), new(big.Rat).SetInt(a[i]))
				}
				if v.Sign() == 0 {
					return x
				}
			}
		}
	}
	return nil
}

func divisorsOf(n *big.Int) []*big.Int {
	m := new(big.Int).Abs(n).Int64()
	var out []*big.Int
	for d := int64(1); d <= m; d++ {
		if m%d == 0 {
			out = append(out, big.NewInt(d))
		}
	}
	return out
}

// TestSquareFreeYun: the decomposition of known powers (definition of a
// square-free decomposition), in one and several variables.
func TestSquareFreeYun(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	check := func(in, unit string, want map[string]int) {
		p := mustParse(t, r, in)
		u, parts, err := p.SquareFree()
		if err != nil {
			t.Fatal(err)
		}
		if got := product(t, r, u, parts); !got.Equal(p) {
			t.Fatalf("%s: product %v", in, got)
		}
		if u.RatString() != unit {
			t.Errorf("%s: unit %v, want %s", in, u, unit)
		}
		got := map[string]int{}
		for _, fp := range parts {
			got[fp.Factor.String()] = fp.Mult
		}
		if fmt.Sprint(got) != fmt.Sprint(want) {
			t.Errorf("%s: parts %v, want %v", in, got, want)
		}
	}
	check("-3*(x-1)*(x+2)^2*(x^2+1)^3", "-3", map[string]int{"x - 1": 1, "x + 2": 2, "x^2 + 1": 3})
	check("(x*y - 1)^2*(x+y)*y^3/5", "1/5", map[string]int{"x + y": 1, "x*y - 1": 2, "y": 3})
	check("(x-y)^2*(x+y)^2", "1", map[string]int{"x^2 - y^2": 2})
	check("7", "7", map[string]int{})
}

// TestFactorRefusals: the subset cap gives its sentinel, never a wrong
// answer.
func TestFactorRefusals(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	// The recombination stage alone, capped at 3 products: the degree-8
	// Swinnerton-Dyer polynomial has at least 4 modular factors, so the
	// search cannot finish.
	f := toDense(swinnertonDyer(t, r, []int{2, 3, 5}), 0)
	p, facs, err := choosePrime(f)
	if err != nil || len(facs) < 4 {
		t.Fatalf("prime %d: %d factors, %v", p, len(facs), err)
	}
	steps := 6
	M := new(big.Int).SetUint64(p)
	for i := 0; i < steps; i++ {
		M.Mul(M, M)
	}
	if _, err := recombine(f, henselLift(f, facs, p, steps), M, p, 3); !errors.Is(err, ErrFactorLimit) {
		t.Errorf("capped recombination: %v", err)
	}
}

// TestFactorConstants: zero and constants have a unit and no factors.
func TestFactorConstants(t *testing.T) {
	r, _ := testRing(t, "x")
	for _, s := range []string{"0", "-5/3"} {
		f := mustFactor(t, mustParse(t, r, s))
		if len(f.Factors) != 0 || f.Unit.RatString() != s {
			t.Errorf("%s: %v %v", s, f.Unit, f.Factors)
		}
	}
}

// BenchmarkFactorCyclotomic factors x^60 − 1 (twelve cyclotomic factors)
// and x^120 − 1 (sixteen).
func BenchmarkFactorCyclotomic(b *testing.B) {
	r, _ := testRing(b, "x")
	for _, n := range []int{60, 120} {
		p := mustParse(b, r, fmt.Sprintf("x^%d - 1", n))
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := p.Factor(); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkSwinnertonDyer proves the degree-8, 16, 32 and 64
// Swinnerton-Dyer polynomials irreducible.
func BenchmarkSwinnertonDyer(b *testing.B) {
	r, _ := testRing(b, "x", "y")
	for _, ps := range [][]int{{2, 3, 5}, {2, 3, 5, 7}, {2, 3, 5, 7, 11}, {2, 3, 5, 7, 11, 13}} {
		p := swinnertonDyer(b, r, ps)
		b.Run(fmt.Sprint("degree", p.Degree()), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if ok, err := p.IsIrreducible(); err != nil || !ok {
					b.Fatal(ok, err)
				}
			}
		})
	}
}

// TestSquareFreeProperty: on random products of powers of random
// bivariate polynomials, the parts multiply back to p, are pairwise
// coprime, and are square-free by the derivative criterion (common
// practice: s is square-free over a field of characteristic 0 exactly
// when gcd(s, ∂s/∂v) is free of v for every variable v).
func TestSquareFreeProperty(t *testing.T) {
	r, _ := testRing(t, "x", "y")
	rng := rand.New(rand.NewSource(8))
	for trial := 0; trial < 100; trial++ {
		p := r.Const(big.NewRat(1+rng.Int63n(6), 1+rng.Int63n(4)))
		for k := 1 + rng.Intn(3); k > 0; k-- {
			p = mustMulP(t, p, mustPow(t, randPoly(rng, r, 2, 1+rng.Intn(3), 2, 0), 1+rng.Intn(3)))
		}
		u, parts, err := p.SquareFree()
		if err != nil {
			t.Fatal(err)
		}
		if got := product(t, r, u, parts); !got.Equal(p) {
			t.Fatalf("%v: product %v", p, got)
		}
		for i, a := range parts {
			for v := 0; v < 2; v++ {
				g, err := GCD(a.Factor, a.Factor.Derivative(v))
				if err != nil || g.DegreeIn(v) > 0 {
					t.Fatalf("%v: part %v not square-free in variable %d (gcd %v)", p, a.Factor, v, g)
				}
			}
			for _, b := range parts[i+1:] {
				if g, err := GCD(a.Factor, b.Factor); err != nil || !g.isOne() {
					t.Fatalf("%v: parts %v and %v share %v", p, a.Factor, b.Factor, g)
				}
			}
		}
	}
}

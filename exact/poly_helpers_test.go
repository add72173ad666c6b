package exact

import (
	"math/big"
	"math/rand"
	"testing"
)

// testRing returns a ring with the given variables.
func testRing(t testing.TB, names ...string) (*Ring, []*Poly) {
	t.Helper()
	r := NewRing()
	vs := make([]*Poly, len(names))
	for i, n := range names {
		v, err := r.Var(n)
		if err != nil {
			t.Fatal(err)
		}
		vs[i] = v
	}
	return r, vs
}

// mustParse parses s in r or fails the test.
func mustParse(t testing.TB, r *Ring, s string) *Poly {
	t.Helper()
	p, err := r.Parse(s)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return p
}

func mustMulP(t testing.TB, a, b *Poly) *Poly {
	t.Helper()
	p, err := a.Mul(b)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

func mustPow(t testing.TB, a *Poly, k int) *Poly {
	t.Helper()
	p, err := a.Pow(k)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// randCoef returns a random nonzero rational: with kind 0 a small integer,
// 1 an integer of up to 62 bits, 2 a big integer, 3 a small fraction.
func randCoef(rng *rand.Rand, kind int) *big.Rat {
	for {
		var c *big.Rat
		switch kind {
		case 0:
			c = big.NewRat(rng.Int63n(21)-10, 1)
		case 1:
			c = big.NewRat(rng.Int63()>>uint(rng.Intn(62))*int64(1-2*rng.Intn(2)), 1)
		case 2:
			n := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(60+rng.Intn(100))))
			if rng.Intn(2) == 0 {
				n.Neg(n)
			}
			c = new(big.Rat).SetInt(n)
		default:
			c = big.NewRat(rng.Int63n(21)-10, rng.Int63n(12)+1)
		}
		if c.Sign() != 0 {
			return c
		}
	}
}

// randPoly returns a random polynomial in the first nv variables of r with
// up to n terms of degree up to deg in each variable.
func randPoly(rng *rand.Rand, r *Ring, nv, n, deg, kind int) *Poly {
	nvars := r.numVars()
	p := r.zero()
	for k := 0; k < n; k++ {
		e := make([]int, nvars)
		for v := 0; v < nv; v++ {
			e[v] = rng.Intn(deg + 1)
		}
		p = p.Add(monomialOf(r, e, randCoef(rng, kind)))
	}
	return p
}

// monomialOf returns c times the monomial with exponents e.
func monomialOf(r *Ring, e []int, c *big.Rat) *Poly {
	m, ok := packExps(e, wordsFor(len(e)))
	if !ok {
		panic("bad exponents")
	}
	for v, x := range e {
		_ = v
		_ = x
	}
	b := newBuilder(len(m))
	b.pushBig(m, c.Num())
	return b.poly(r, c.Denom())
}

// naiveMul multiplies term by term with big.Rat arithmetic through Terms
// and a map, independently of the packed code paths.
func naiveMul(r *Ring, a, b *Poly) *Poly {
	sum := map[string]*big.Rat{}
	exps := map[string][]int{}
	for _, s := range a.Terms() {
		for _, t := range b.Terms() {
			e := make([]int, max(len(s.Exps), len(t.Exps)))
			for v := range e {
				if v < len(s.Exps) {
					e[v] += s.Exps[v]
				}
				if v < len(t.Exps) {
					e[v] += t.Exps[v]
				}
			}
			key := string(packKey(e))
			c := new(big.Rat).Mul(s.Coef, t.Coef)
			if old, ok := sum[key]; ok {
				old.Add(old, c)
			} else {
				sum[key] = c
				exps[key] = e
			}
		}
	}
	p := r.zero()
	for k, c := range sum {
		if c.Sign() != 0 {
			p = p.Add(monomialOf(r, exps[k], c))
		}
	}
	return p
}

func packKey(e []int) []byte {
	out := make([]byte, 0, 2*len(e))
	for _, x := range e {
		out = append(out, byte(x>>8), byte(x))
	}
	return out
}

// checkCanonical verifies the representation invariants of p.
func checkCanonical(t testing.TB, p *Poly) {
	t.Helper()
	if len(p.mono) != p.n()*p.w {
		t.Fatalf("mono length %d, want %d*%d", len(p.mono), p.n(), p.w)
	}
	for i := 0; i < p.n(); i++ {
		m := p.monoAt(i)
		tot := 0
		for v := 0; v < p.nvars(); v++ {
			tot += monoExp(m, v)
		}
		if uint64(tot) != m[0] {
			t.Fatalf("term %d: total degree word %d, exponents sum to %d", i, m[0], tot)
		}
		if i > 0 && monoCmp(p.monoAt(i-1), m) <= 0 {
			t.Fatalf("terms %d and %d out of order in %v", i-1, i, p)
		}
		if p.numSign(i) == 0 {
			t.Fatalf("zero coefficient at term %d", i)
		}
		if !p.small(i) && p.bnum[i].IsInt64() {
			t.Fatalf("term %d: big numerator %v fits an int64", i, p.bnum[i])
		}
	}
	if p.bnum != nil {
		any := false
		for _, b := range p.bnum {
			any = any || b != nil
		}
		if !any || len(p.bnum) != p.n() {
			t.Fatalf("bnum present without big numerators or with wrong length")
		}
	}
	if p.den != nil {
		if p.den.Cmp(bigOne) <= 0 {
			t.Fatalf("denominator %v", p.den)
		}
		g := new(big.Int).Set(p.den)
		for i := 0; i < p.n(); i++ {
			g.GCD(nil, nil, g, p.numAt(i, new(big.Int)))
		}
		if g.Cmp(bigOne) != 0 {
			t.Fatalf("not in lowest terms: gcd %v with denominator %v", g, p.den)
		}
	}
}

package exact

import (
	"fmt"
	"math/big"
	"math/rand"
	"testing"
)

// Modular arithmetic against math/big (Mod, ModInverse, Exp).
func TestModulus(t *testing.T) {
	rng := rand.New(rand.NewSource(31))
	for _, m := range moduli(20) {
		p := new(big.Int).SetUint64(m.p)
		if !p.ProbablyPrime(20) || m.p>>61 != 1 {
			t.Fatalf("%d is not a prime in (2^61, 2^62)", m.p)
		}
		for k := 0; k < 50; k++ {
			words := make([]uint64, 1+rng.Intn(12))
			for i := range words {
				words[i] = rng.Uint64()
			}
			x := new(big.Int)
			for i := len(words) - 1; i >= 0; i-- {
				x.Lsh(x, 64).Or(x, new(big.Int).SetUint64(words[i]))
			}
			want := new(big.Int).Mod(x, p).Uint64()
			if got := m.residue(words); got != want {
				t.Fatalf("residue of %d words mod %d = %d, want %d", len(words), m.p, got, want)
			}
			if w := words64(x); fmt.Sprint(w) != fmt.Sprint(words) {
				t.Fatalf("words64 = %v, want %v", w, words)
			}
			a, b := want, rng.Uint64()%m.p
			prod := new(big.Int).Mul(new(big.Int).SetUint64(a), new(big.Int).SetUint64(b))
			if got := m.fromMont(m.mul(m.toMont(a), m.toMont(b))); got != prod.Mod(prod, p).Uint64() {
				t.Fatalf("mul mod %d wrong", m.p)
			}
			if a != 0 {
				inv := new(big.Int).ModInverse(new(big.Int).SetUint64(a), p).Uint64()
				if got := m.fromMont(m.inv(m.toMont(a))); got != inv {
					t.Fatalf("inverse of %d mod %d = %d, want %d", a, m.p, got, inv)
				}
			}
			e := rng.Intn(1000)
			pw := new(big.Int).Exp(new(big.Int).SetUint64(a), big.NewInt(int64(e)), p).Uint64()
			if got := m.fromMont(m.pow(m.toMont(a), e)); got != pw {
				t.Fatalf("%d^%d mod %d = %d, want %d", a, e, m.p, got, pw)
			}
		}
	}
}

// CRT reconstruction against math/big, including negative values and
// values at the edge of the symmetric range.
func TestCRT(t *testing.T) {
	ms := moduli(6)
	prod := big.NewInt(1)
	for _, m := range ms {
		prod.Mul(prod, new(big.Int).SetUint64(m.p))
	}
	half := new(big.Int).Rsh(prod, 1)
	rng := rand.New(rand.NewSource(37))
	vals := []*big.Int{big.NewInt(0), big.NewInt(1), big.NewInt(-1), half, new(big.Int).Neg(half)}
	for k := 0; k < 100; k++ {
		v := new(big.Int).Rand(rng, prod)
		vals = append(vals, v.Sub(v, half))
	}
	for _, v := range vals {
		rs := make([]uint64, len(ms))
		for i, m := range ms {
			rs[i] = new(big.Int).Mod(v, new(big.Int).SetUint64(m.p)).Uint64()
		}
		if got := crt(ms, rs); got.Cmp(v) != 0 {
			t.Fatalf("crt gives %s, want %s", got, v)
		}
	}
}

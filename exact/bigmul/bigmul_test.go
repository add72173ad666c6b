package bigmul

import (
	"fmt"
	"math/big"
	"math/rand"
	"testing"
)

// The reference throughout is math/big's own product, big.Int.Mul
// (schoolbook and Karatsuba, an independent route).

func randInt(r *rand.Rand, words int) *big.Int {
	w := make([]big.Word, words)
	for i := range w {
		w[i] = big.Word(r.Uint64())
	}
	return new(big.Int).SetBits(w)
}

// edgeInt returns operands that stress carries and reduction: all ones,
// a power of two, a single high word.
func edgeInt(kind, words int) *big.Int {
	one := big.NewInt(1)
	switch kind {
	case 0: // 2^(64·words) − 1: every word all ones
		return new(big.Int).Sub(new(big.Int).Lsh(one, uint(64*words)), one)
	case 1: // 2^(64·words − 1)
		return new(big.Int).Lsh(one, uint(64*words-1))
	default: // a single word at the top, zeros below
		return new(big.Int).Lsh(big.NewInt(0x7fffffffffffffff), uint(64*(words-1)))
	}
}

func checkMul(t *testing.T, x, y *big.Int, what string) {
	t.Helper()
	want := new(big.Int).Mul(x, y)
	if got := Mul(new(big.Int), x, y); got.Cmp(want) != 0 {
		t.Fatalf("Mul %s (%d×%d words) wrong", what, len(x.Bits()), len(y.Bits()))
	}
	if x.Sign() == 0 || y.Sign() == 0 {
		return
	}
	if got := new(big.Int).SetBits(nttMul(x.Bits(), y.Bits())); got.Cmp(new(big.Int).Abs(want)) != 0 {
		t.Fatalf("nttMul %s (%d×%d words) wrong", what, len(x.Bits()), len(y.Bits()))
	}
	// The signs, against the same reference product.
	nx, ny := new(big.Int).Neg(x), new(big.Int).Neg(y)
	neg := new(big.Int).Neg(want)
	if Mul(new(big.Int), nx, y).Cmp(neg) != 0 || Mul(new(big.Int), x, ny).Cmp(neg) != 0 || Mul(new(big.Int), nx, ny).Cmp(want) != 0 {
		t.Fatalf("Mul %s (%d×%d words): wrong with negative operands", what, len(x.Bits()), len(y.Bits()))
	}
}

// TestTransformDirect checks the transform itself below the thresholds,
// where Mul would not call it: every length class 2^k and 3·2^k from 4
// up, random and extreme words, and the products of single words at
// every pair of positions (the cyclic convolution of two unit vectors).
func TestTransformDirect(t *testing.T) {
	r := rand.New(rand.NewSource(1))
	for _, n := range []int{1, 2, 3, 5, 6, 7, 8, 11, 16, 17, 31, 64, 100, 255, 256, 257, 1000, 1536, 2047, 2048, 2049, 3071} {
		for _, m := range []int{1, n / 3, n, n + 1} {
			if m < 1 {
				continue
			}
			checkMul(t, randInt(r, n), randInt(r, m), "random")
			for kind := range 3 {
				checkMul(t, edgeInt(kind, n), edgeInt(kind, m), fmt.Sprintf("edge %d", kind))
			}
		}
		x := randInt(r, n)
		if got := new(big.Int).SetBits(nttMul(x.Bits(), nil)); got.Cmp(new(big.Int).Mul(x, x)) != 0 {
			t.Fatalf("nttMul square of %d words wrong", n)
		}
	}
	for _, f := range getFields() {
		for _, n := range []int{4, 12, 16, 24, 48} {
			for i := range n {
				for j := range n {
					x, y := make([]big.Word, n), make([]big.Word, n)
					x[i], y[j] = 1, 1
					a, b := make([]uint64, n), make([]uint64, n)
					f.cyclic(a, b, x, y)
					for q, v := range a {
						if want := uint64(0); q == (i+j)%n && v != 1 || q != (i+j)%n && v != want {
							t.Fatalf("cyclic length %d: e%d * e%d wrong at %d", n, i, j, q)
						}
					}
				}
			}
		}
	}
}

// TestMulSizes covers every size class through the public functions: below,
// at and above the thresholds, powers of two and the lengths where the
// transform length steps (2^k and 3·2^k), unbalanced shapes, signs, zero.
func TestMulSizes(t *testing.T) {
	r := rand.New(rand.NewSource(2))
	sizes := []int{0, 1, mulThreshold - 1, mulThreshold, mulThreshold + 1, 3072, 4096, 6144 / 2, 8192 / 2, 8193 / 2, 12289 / 2, 20000}
	if !testing.Short() {
		sizes = append(sizes, 65536, 100000)
	}
	for _, n := range sizes {
		shapes := []int{n, n + 7, 3 * n, 9 * n}
		if n > 20000 {
			shapes = shapes[:2] // the reference product is slow here
		}
		for _, m := range shapes {
			checkMul(t, randInt(r, n), randInt(r, m), "random")
			if n > 0 && m < 30000 {
				checkMul(t, edgeInt(0, n), edgeInt(0, m), "all ones")
			}
		}
		x := randInt(r, n)
		want := new(big.Int).Mul(x, x)
		if Sqr(new(big.Int), x).Cmp(want) != 0 || Sqr(new(big.Int), new(big.Int).Neg(x)).Cmp(want) != 0 {
			t.Fatalf("Sqr of %d words wrong", n)
		}
	}
}

// TestMulAliasing: z may be x, y or both.
func TestMulAliasing(t *testing.T) {
	r := rand.New(rand.NewSource(3))
	for _, n := range []int{5, 3 * mulThreshold} {
		x, y := randInt(r, n), randInt(r, n+1)
		want := new(big.Int).Mul(x, y)
		z := new(big.Int).Set(x)
		if Mul(z, z, y); z.Cmp(want) != 0 {
			t.Fatalf("z = z·y wrong at %d words", n)
		}
		z.Set(y)
		if Mul(z, x, z); z.Cmp(want) != 0 {
			t.Fatalf("z = x·z wrong at %d words", n)
		}
		want.Mul(x, x)
		z.Set(x)
		if Mul(z, z, z); z.Cmp(want) != 0 {
			t.Fatalf("z = z·z wrong at %d words", n)
		}
		z.Set(x)
		if Sqr(z, z); z.Cmp(want) != 0 {
			t.Fatalf("Sqr(z, z) wrong at %d words", n)
		}
	}
	// A zero operand gives zero, and the result does not keep x's sign.
	z := Mul(new(big.Int), big.NewInt(-5), new(big.Int))
	if z.Sign() != 0 {
		t.Fatalf("−5·0 = %v", z)
	}
}

// TestPrimes checks the moduli the transform relies on: prime (math/big's
// ProbablyPrime is exact below 2^64), below 2^62, with 3·2^38 dividing
// p − 1, and a generator whose order is p − 1.
func TestPrimes(t *testing.T) {
	for i, f := range getFields() {
		p := new(big.Int).SetUint64(f.p)
		if !p.ProbablyPrime(0) || f.p >= 1<<62 {
			t.Fatalf("modulus %d: %d not a prime below 2^62", i, f.p)
		}
		if (f.p-1)%(3<<38) != 0 {
			t.Fatalf("modulus %d: 3·2^38 does not divide p − 1", i)
		}
		pm1 := new(big.Int).Sub(p, big.NewInt(1))
		g := new(big.Int).SetUint64(f.root)
		if new(big.Int).Exp(g, pm1, p).Cmp(big.NewInt(1)) != 0 {
			t.Fatalf("modulus %d: Fermat fails", i)
		}
		for _, q := range []int64{2, 3} {
			if new(big.Int).Exp(g, new(big.Int).Quo(pm1, big.NewInt(q)), p).Cmp(big.NewInt(1)) == 0 {
				t.Fatalf("modulus %d: %d is not a generator", i, f.root)
			}
		}
		if f.p*f.pinv != 1 {
			t.Fatalf("modulus %d: wrong inverse mod 2^64", i)
		}
	}
}

// FuzzMul compares Mul and Sqr with big.Int.Mul on operands built from the
// fuzzer's bytes, repeated to reach the transform's sizes.
// `go test ./exact/bigmul -fuzz FuzzMul` explores further; plain `go test`
// runs the seeds.
func FuzzMul(f *testing.F) {
	f.Add([]byte{1}, []byte{2}, uint16(0), false, false)
	f.Add([]byte{0xff, 0xff}, []byte{0xff}, uint16(3000), true, false)
	f.Add([]byte{0x80, 0, 0, 1}, []byte{7, 7, 7}, uint16(5000), false, true)
	f.Fuzz(func(t *testing.T, a, b []byte, rep uint16, negA, negB bool) {
		grow := func(s []byte) *big.Int {
			if len(s) == 0 {
				return new(big.Int)
			}
			n := int(rep) % 40000
			out := make([]byte, 0, len(s)*(1+n*8/len(s)))
			for len(out) < n*8 || len(out) == 0 {
				out = append(out, s...)
				s[0]++ // vary the copies
			}
			return new(big.Int).SetBytes(out)
		}
		x, y := grow(a), grow(b)
		if negA {
			x.Neg(x)
		}
		if negB {
			y.Neg(y)
		}
		want := new(big.Int).Mul(x, y)
		if got := Mul(new(big.Int), x, y); got.Cmp(want) != 0 {
			t.Fatalf("Mul wrong: %d×%d words", len(x.Bits()), len(y.Bits()))
		}
		if got := Sqr(new(big.Int), x); got.Cmp(new(big.Int).Mul(x, x)) != 0 {
			t.Fatalf("Sqr wrong: %d words", len(x.Bits()))
		}
	})
}

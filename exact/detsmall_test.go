package exact

import (
	"fmt"
	"math/big"
	"math/rand"
	"testing"
)

// wideEntry draws an integer for DetWide's tests: 1 to 4 words at random,
// or one at the overflow boundaries of one, two and three words
// (2^64 − 1, 2^64, 2^128 ± 1, 2^192 − 1, 2^192), of either sign.
func wideEntry(rng *rand.Rand) *big.Int {
	one := big.NewInt(1)
	pow := func(b uint) *big.Int { return new(big.Int).Lsh(one, b) }
	var x *big.Int
	switch rng.Intn(8) {
	case 0:
		x = new(big.Int).Sub(pow(64), one)
	case 1:
		x = pow(64)
	case 2:
		x = new(big.Int).Sub(pow(128), one)
	case 3:
		x = new(big.Int).Add(pow(128), big.NewInt(rng.Int63n(3)-1))
	case 4:
		x = new(big.Int).Sub(pow(192), big.NewInt(rng.Int63n(2)))
	case 5:
		x = big.NewInt(rng.Int63n(5) - 2)
	default:
		x = new(big.Int).Rand(rng, pow(uint(min(255, 64*(1+rng.Intn(4))))))
	}
	if rng.Intn(2) == 0 {
		x.Neg(x)
	}
	return x
}

// wideMatrix returns the n x n matrix of f's entries as rows, as a Matrix
// and as Wide words.
func wideMatrix(n int, f func() *big.Int) (rows [][]*big.Int, m *Matrix, w []Wide) {
	m = Zeros(n, n)
	w = make([]Wide, n*n)
	rows = make([][]*big.Int, n)
	for i := range rows {
		for j := 0; j < n; j++ {
			x := f()
			rows[i] = append(rows[i], x)
			m.at(i, j).SetInt(x)
			if !w[i*n+j].SetInt(x) {
				panic("entry beyond 2^255")
			}
		}
	}
	return rows, m, w
}

// DetWide, and DetInts through it, against the Leibniz formula in
// math/big (the definition) and every method of checkDet, on entries of
// one to four words and at the boundaries 2^64, 2^128, 2^192 (the
// products of those fill the accumulator's top words): DetWide must take
// exactly the matrices whose entries are below 2^192, and DetInts the
// others by its other routes; singular matrices (a repeated row) give 0.
func TestDetWideAgainstBig(t *testing.T) {
	rng := rand.New(rand.NewSource(21))
	p192 := new(big.Int).Lsh(big.NewInt(1), 192)
	for n := 1; n <= 3; n++ {
		for trial := 0; trial < 80; trial++ {
			_, m, w := wideMatrix(n, func() *big.Int { return wideEntry(rng) })
			if n >= 2 && trial%10 == 0 {
				for j := 0; j < n; j++ {
					m.at(n-1, j).Set(m.at(0, j))
					w[(n-1)*n+j] = w[j]
				}
			}
			fits := true
			for _, x := range m.e {
				fits = fits && x.Num().CmpAbs(p192) < 0
			}
			want := detLeibniz(m)
			label := fmt.Sprintf("n=%d #%d", n, trial)
			got, ok := DetWide(n, w)
			if ok != fits || ok && new(big.Rat).SetInt(got).Cmp(want) != 0 {
				t.Errorf("%s: DetWide = %v, %v; want %s (entries below 2^192: %v)", label, got, ok, FormatRat(want), fits)
			}
			checkDetInts(t, label, m, want)
		}
	}
	// Every entry −(2^192 − 1): the determinant's terms at their largest.
	_, m, w := wideMatrix(3, func() *big.Int {
		x := new(big.Int).Lsh(big.NewInt(1), 192)
		return x.Sub(big.NewInt(1), x)
	})
	m.at(0, 0).SetInt64(1) // else singular
	w[0] = Wide{1}
	want := detLeibniz(m)
	if got, ok := DetWide(3, w); !ok || new(big.Rat).SetInt(got).Cmp(want) != 0 {
		t.Errorf("entries 1 − 2^192: DetWide = %v, %v; want %s", got, ok, FormatRat(want))
	}
}

// DetWide refuses entries of 2^192 or more and orders past 3; SetInt
// refuses 2^255 and more; DetInts then takes its other routes.
func TestDetWideLimits(t *testing.T) {
	p192 := new(big.Int).Lsh(big.NewInt(1), 192)
	_, _, w := wideMatrix(2, func() *big.Int { return big.NewInt(3) })
	for _, x := range []*big.Int{p192, new(big.Int).Neg(p192)} {
		w[2].SetInt(x)
		if _, ok := DetWide(2, w); ok {
			t.Errorf("DetWide took an entry of %v", x)
		}
	}
	if d, ok := DetWide(0, nil); !ok || d.Cmp(big.NewInt(1)) != 0 {
		t.Errorf("DetWide of the 0x0 matrix = %v, %v; want 1", d, ok)
	}
	var z Wide
	if z.SetInt(new(big.Int).Lsh(big.NewInt(1), 255)) {
		t.Error("SetInt took 2^255")
	}
	if !z.SetInt(new(big.Int).Neg(new(big.Int).Lsh(big.NewInt(1), 254))) {
		t.Error("SetInt refused −2^254")
	}
	if _, ok := DetWide(4, make([]Wide, 16)); ok {
		t.Error("DetWide took order 4")
	}
}

// Add and Sub against math/big modulo 2^256 (two's complement); Int gives
// back what SetInt took, in the Int's own words when they have room.
func TestWideAddSub(t *testing.T) {
	rng := rand.New(rand.NewSource(22))
	mod := new(big.Int).Lsh(big.NewInt(1), 256)
	words := func(z *Wide) *big.Int {
		v := new(big.Int)
		for i := len(z) - 1; i >= 0; i-- {
			v.Lsh(v, 64).Or(v, new(big.Int).SetUint64(z[i]))
		}
		return v
	}
	for trial := 0; trial < 200; trial++ {
		x, y := wideEntry(rng), wideEntry(rng)
		var a, b, z Wide
		a.SetInt(x)
		b.SetInt(y)
		backing := make([]big.Word, 0, 4)
		room := new(big.Int).SetBits(backing)
		if got := a.Int(room); got.Cmp(x) != 0 || got != room {
			t.Errorf("Int after SetInt(%v) = %v", x, got)
		} else if x.Sign() != 0 && &room.Bits()[0] != &backing[:1][0] {
			t.Errorf("Int of %v did not use the Int's words", x)
		}
		if got := b.Int(new(big.Int)); got.Cmp(y) != 0 {
			t.Errorf("Int after SetInt(%v) = %v", y, got)
		}
		for _, c := range []struct {
			name string
			got  *Wide
			want *big.Int
		}{
			{"+", z.Add(&a, &b), new(big.Int).Add(x, y)},
			{"−", new(Wide).Sub(&a, &b), new(big.Int).Sub(x, y)},
		} {
			if want := c.want.Mod(c.want, mod); words(c.got).Cmp(want) != 0 {
				t.Errorf("%v %s %v wrong", x, c.name, y)
			}
		}
	}
}

// DetWideOver is det/f^k in lowest terms: against math/big's SetFrac,
// which reduces by its own gcd, for words f with many small primes
// (powers of 2 and 3, factorials, lcms), primes, 1 and 2^64 − 1, and
// k = 0..6; singular matrices give 0.
func TestDetWideOver(t *testing.T) {
	rng := rand.New(rand.NewSource(23))
	fs := []uint64{1, 2, 3, 1 << 63, 3486784401, 2432902008176640000 /* 20! */, 232792560 /* lcm(1..20) */, 18446744073709551557 /* prime */, 1<<64 - 1, 4294967291 * 3}
	for trial := 0; trial < 300; trial++ {
		n := rng.Intn(4)
		// Entries made of small primes, so that much of f^k cancels.
		_, m, w := wideMatrix(n, func() *big.Int {
			x := big.NewInt(rng.Int63n(1<<20) - 1<<19)
			for range rng.Intn(12) {
				x.Mul(x, big.NewInt([]int64{2, 3, 4, 5, 7, 11, 13, 60}[rng.Intn(8)]))
			}
			if rng.Intn(4) == 0 {
				x.Mul(x, new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), 120)))
			}
			return x.Rsh(x, uint(max(0, x.BitLen()-190))) // below 2^192
		})
		f := fs[trial%len(fs)]
		if trial%3 == 0 {
			f = rng.Uint64() | 1
		}
		k := rng.Intn(7)
		den := new(big.Int).Exp(new(big.Int).SetUint64(f), big.NewInt(int64(k)), nil)
		want := new(big.Rat).SetFrac(detLeibniz(m).Num(), den)
		got, ok := DetWideOver(n, w, f, k)
		if !ok || got.Cmp(want) != 0 || got.Num().Cmp(want.Num()) != 0 || got.Denom().Cmp(want.Denom()) != 0 {
			t.Errorf("n=%d f=%d k=%d: DetWideOver = %v, %v; want %s", n, f, k, got, ok, want.String())
		}
		// Numerator and denominator share a block of words: growing one
		// must leave the other alone.
		if ok {
			got.Num().Lsh(got.Num(), 300)
			if got.Denom().Cmp(want.Denom()) != 0 {
				t.Errorf("n=%d f=%d k=%d: growing the numerator changed the denominator to %v", n, f, k, got.Denom())
			}
			got, _ = DetWideOver(n, w, f, k)
			got.Denom().Lsh(got.Denom(), 300)
			if got.Num().Cmp(want.Num()) != 0 {
				t.Errorf("n=%d f=%d k=%d: growing the denominator changed the numerator to %v", n, f, k, got.Num())
			}
		}
	}
	if _, ok := DetWideOver(1, []Wide{{1}}, 0, 1); ok {
		t.Error("DetWideOver took f = 0")
	}
}

// GCDWord against big.Int.GCD (math/big, Lehmer's algorithm) on operands of
// equal and very unequal sizes (the Euclid step), common powers of two,
// zeros and the largest words.
func TestGCDWordAgainstMathBig(t *testing.T) {
	rng := rand.New(rand.NewSource(21))
	word := func() uint64 {
		x := rng.Uint64() >> uint(rng.Intn(64))
		if rng.Intn(4) == 0 {
			x <<= uint(rng.Intn(20)) // common factors of two
		}
		return x
	}
	cases := [][2]uint64{{0, 0}, {0, 5}, {7, 0}, {1, 1}, {1<<64 - 1, 1<<64 - 1}, {1<<64 - 1, 1 << 63}, {1 << 63, 1 << 62}, {1<<64 - 1, 3}}
	for range 50000 {
		c := word() | 1
		cases = append(cases, [2]uint64{word(), word()}, [2]uint64{word() * (c & 0xffff), word() * (c & 0xffff)})
	}
	for _, p := range cases {
		want := new(big.Int).GCD(nil, nil, new(big.Int).SetUint64(p[0]), new(big.Int).SetUint64(p[1]))
		if got := GCDWord(p[0], p[1]); got != want.Uint64() {
			t.Fatalf("GCDWord(%d, %d) = %d, want %v", p[0], p[1], got, want)
		}
	}
}

// gcdStein against math/big's GCD (Lehmer's algorithm).
func TestGcdStein(t *testing.T) {
	rng := rand.New(rand.NewSource(24))
	cases := [][2]uint64{{0, 1}, {0, 7}, {1, 1}, {1 << 63, 1 << 62}, {1<<64 - 1, 1<<64 - 1}, {1<<64 - 1, 3}, {12, 18}}
	for range 500 {
		g := rng.Uint64() >> uint(rng.Intn(64))
		cases = append(cases, [2]uint64{rng.Uint64() >> uint(rng.Intn(64)) * g, max(1, (rng.Uint64()>>uint(rng.Intn(64)))*g)})
	}
	for _, c := range cases {
		if c[1] == 0 {
			continue
		}
		want := new(big.Int).GCD(nil, nil, new(big.Int).SetUint64(c[0]), new(big.Int).SetUint64(c[1]))
		if got := gcdStein(c[0], c[1]); got != want.Uint64() {
			t.Errorf("gcdStein(%d, %d) = %d, want %s", c[0], c[1], got, want)
		}
	}
}

// BenchmarkDetWide3 times DetWide's elimination on 3x3 matrices of
// entries of 64–128 bits, either sign, the reduced Cayley–Menger
// matrices' sizes.
func BenchmarkDetWide3(b *testing.B) {
	rng := rand.New(rand.NewSource(1))
	var ms [64][9]Wide
	for i := range ms {
		for j := range ms[i] {
			x := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(64+rng.Intn(64))))
			if rng.Intn(2) == 0 {
				x.Neg(x)
			}
			ms[i][j].SetInt(x)
		}
	}
	i := 0
	for b.Loop() {
		var acc [detAccWords]uint64
		detWideMag(3, ms[i%len(ms)][:], &acc)
		i++
	}
}

// FracWordPow is x/f^k in lowest terms: against math/big's SetFrac on
// integers of 0 to 24 words, many of them products of small primes and
// of powers of f's factors (so that most of f^k cancels), for the words
// f of TestDetWideOver and random ones, k = 0..20 (past the 16 words the
// denominator and quotient keep on the stack).
func TestFracWordPow(t *testing.T) {
	rng := rand.New(rand.NewSource(27))
	fs := []uint64{1, 2, 6, 1 << 63, 2432902008176640000, 232792560, 18446744073709551557, 1<<64 - 1}
	for trial := 0; trial < 400; trial++ {
		f := fs[trial%len(fs)]
		if trial%4 == 0 {
			f = rng.Uint64() >> uint(rng.Intn(60))
			f = max(f, 1)
		}
		k := rng.Intn(21)
		x := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), uint(rng.Intn(24*64+1))))
		if trial%2 == 0 { // a multiple of a power of f, times small primes
			x.Add(x, big.NewInt(1))
			x.Mul(x, new(big.Int).Exp(new(big.Int).SetUint64(f), big.NewInt(int64(rng.Intn(k+2))), nil))
			for range rng.Intn(10) {
				x.Mul(x, big.NewInt([]int64{2, 3, 5, 7, 9, 16}[rng.Intn(6)]))
			}
		}
		if rng.Intn(2) == 0 {
			x.Neg(x)
		}
		want := new(big.Rat).SetFrac(x, new(big.Int).Exp(new(big.Int).SetUint64(f), big.NewInt(int64(k)), nil))
		got, ok := FracWordPow(x, f, k)
		if !ok || got.Num().Cmp(want.Num()) != 0 || got.Denom().Cmp(want.Denom()) != 0 {
			t.Errorf("FracWordPow(%v, %d, %d) = %v, %v; want %s", x, f, k, got, ok, want.String())
		}
	}
	if _, ok := FracWordPow(big.NewInt(3), 0, 1); ok {
		t.Error("FracWordPow took f = 0")
	}
	if _, ok := FracWordPow(big.NewInt(3), 2, -1); ok {
		t.Error("FracWordPow took k = −1")
	}
}

// BenchmarkFracWordPow: x/l^6 in lowest terms, x a multiple of l^3 of
// some 250 bits and l a product of small primes near 2^40 (the sizes of
// det(sM)/s^3 for the kernel's random tetrahedra, s = l²), by
// FracWordPow and by math/big's SetFrac.
func BenchmarkFracWordPow(b *testing.B) {
	rng := rand.New(rand.NewSource(28))
	const l = 2 * 2 * 3 * 5 * 7 * 11 * 13 * 17 * 19 * 23 * 29 * 31 * 37 // ~2^43
	xs := make([]*big.Int, 64)
	for i := range xs {
		x := new(big.Int).Rand(rng, new(big.Int).Lsh(big.NewInt(1), 120))
		xs[i] = x.Mul(x, new(big.Int).Exp(big.NewInt(l), big.NewInt(3), nil))
	}
	den := new(big.Int).Exp(big.NewInt(l), big.NewInt(6), nil)
	b.Run("words", func(b *testing.B) {
		i := 0
		for b.Loop() {
			FracWordPow(xs[i%len(xs)], l, 6)
			i++
		}
	})
	b.Run("SetFrac", func(b *testing.B) {
		i := 0
		for b.Loop() {
			new(big.Rat).SetFrac(xs[i%len(xs)], den)
			i++
		}
	})
}

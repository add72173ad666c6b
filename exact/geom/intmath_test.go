package geom

import (
	"fmt"
	"math/big"
	"math/rand"
	"testing"
)

// gcdInto sets z to gcd(|x|, |y|) through gcdOdd, as ratFrac takes it.
func gcdInto(z, x, y *big.Int) *big.Int {
	g, k, ok := gcdOdd(x, y)
	if !ok {
		return z.GCD(nil, nil, x, y)
	}
	z.SetBits([]big.Word{big.Word(g.w0), big.Word(g.w1), big.Word(g.w2), big.Word(g.w3)})
	return z.Lsh(z, k)
}

// gcdOdd (through gcdInto) is checked against big.Int.GCD (math/big, Lehmer's algorithm),
// an independent route, on operands built to stress the binary
// algorithm: common factors and common powers of two, every length from
// zero to six words (crossing the four-word fast path and the one-word
// and two-word phases), signs, equal operands and all-ones words.
func TestGCDIntoAgainstMathBig(t *testing.T) {
	rng := rand.New(rand.NewSource(18))
	randBits := func(n int) *big.Int {
		if n == 0 {
			return new(big.Int)
		}
		x := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(n)))
		return x.SetBit(x, n-1, 1)
	}
	check := func(x, y *big.Int) {
		t.Helper()
		want := new(big.Int).GCD(nil, nil, new(big.Int).Abs(x), new(big.Int).Abs(y))
		if got := gcdInto(new(big.Int), x, y); got.Cmp(want) != 0 {
			t.Fatalf("gcd(%v, %v) = %v, want %v", x, y, got, want)
		}
		// z aliasing an operand.
		z := new(big.Int).Set(x)
		if gcdInto(z, z, y); z.Cmp(want) != 0 {
			t.Fatalf("aliased gcd(%v, %v) = %v, want %v", x, y, z, want)
		}
	}
	for range 30000 {
		c := randBits(1 + rng.Intn(200))
		x := new(big.Int).Mul(c, randBits(rng.Intn(220)))
		y := new(big.Int).Mul(c, randBits(rng.Intn(220)))
		x.Lsh(x, uint(rng.Intn(130)))
		y.Lsh(y, uint(rng.Intn(130)))
		if rng.Intn(3) == 0 {
			x.Neg(x)
		}
		if rng.Intn(3) == 0 {
			y.Neg(y)
		}
		check(x, y)
		check(x, x)
	}
	ones := new(big.Int).Sub(new(big.Int).Lsh(bigOne, 256), bigOne) // 2^256 − 1
	for _, p := range [][2]*big.Int{
		{new(big.Int), new(big.Int)},
		{new(big.Int), big.NewInt(-7)},
		{big.NewInt(1), ones},
		{ones, new(big.Int).Rsh(ones, 1)},
		{ones, new(big.Int).Lsh(ones, 64)},
		{new(big.Int).Lsh(bigOne, 255), new(big.Int).Lsh(bigOne, 200)},
		{new(big.Int).Lsh(bigOne, 300), big.NewInt(3 << 20)},
	} {
		check(p[0], p[1])
		check(p[1], p[0])
	}
}

// divExact is checked against big.Int.Quo (math/big) on exact
// multiples: quotients of zero to eight words, odd divisors of one to four
// words (all-ones words included) times powers of two, both signs.
func TestDivExactAgainstMathBig(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	ones := new(big.Int).Sub(new(big.Int).Lsh(bigOne, 256), bigOne)
	for it := range 20000 {
		g := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(1+rng.Intn(256))))
		if it%50 == 0 {
			g.Rsh(ones, uint(rng.Intn(256)))
		}
		g.SetBit(g, 0, 1) // odd
		k := uint(rng.Intn(140))
		q := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(rng.Intn(512))))
		if rng.Intn(2) == 0 {
			q.Neg(q)
		}
		x := new(big.Int).Lsh(new(big.Int).Mul(q, g), k)
		ug := u256Of(g.Bits())
		if got := divExact(new(big.Int), x, ug, k); got.Cmp(q) != 0 {
			t.Fatalf("%v / (%v·2^%d) = %v, want %v", x, g, k, got, q)
		}
	}
}

// ratFrac and ratProd must give big.Rat's own lowest terms (SetFrac,
// math/big), sign on the numerator.
func TestRatFracLowestTerms(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	for range 5000 {
		c := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(1+rng.Intn(150))))
		c.Add(c, bigOne)
		n := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(1+rng.Intn(200))))
		d := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(1+rng.Intn(200))))
		d.Add(d, bigOne)
		n.Mul(n, c)
		d.Mul(d, c)
		if rng.Intn(2) == 0 {
			d.Neg(d)
		}
		sameRat(t, "ratFrac", ratFrac(n, d), new(big.Rat).SetFrac(n, d))
		// ratProd: the same quotient with d split into factors, one of
		// them sometimes past four words (the big.Int.GCD branch).
		f := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(1+rng.Intn(320))))
		f.Add(f, bigOne)
		e := new(big.Int).Mul(n, f)
		sameRat(t, "ratProd", ratProd(e, d, f, c), new(big.Rat).SetFrac(e, new(big.Int).Mul(d, new(big.Int).Mul(f, c))))
	}
}

// ratWordPow (and so exact.ReduceWordPow) must give big.Rat's own lowest terms
// (SetFrac, math/big) of num/(l^m·c): l with repeated prime powers (so
// that the chain of gcds runs several steps), numerators built to share
// them, both signs, m from 0 to 8.
func TestRatWordPowLowestTerms(t *testing.T) {
	rng := rand.New(rand.NewSource(22))
	smooth := func() uint64 { // a product of small prime powers below 2^62
		x := uint64(1)
		for _, p := range []uint64{2, 3, 5, 7, 11, 13, 97} {
			for rng.Intn(3) == 0 && x < 1<<50 {
				x *= p
			}
		}
		return x
	}
	for range 20000 {
		l, c := smooth(), smooth()
		if rng.Intn(5) == 0 {
			l = rng.Uint64()>>uint(rng.Intn(64)) | 1
		}
		m := rng.Intn(9)
		num := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(rng.Intn(300))))
		for range rng.Intn(12) {
			num.Mul(num, new(big.Int).SetUint64([]uint64{l, c, smooth()}[rng.Intn(3)]))
		}
		if rng.Intn(2) == 0 {
			num.Neg(num)
		}
		den := new(big.Int).Exp(new(big.Int).SetUint64(l), big.NewInt(int64(m)), nil)
		den.Mul(den, new(big.Int).SetUint64(c))
		sameRat(t, fmt.Sprintf("%v/(%d^%d·%d)", num, l, m, c), ratWordPow(num, l, m, c), new(big.Rat).SetFrac(num, den))
	}
}

// mulWords against big.Int.Mul (math/big), all-ones words included.
func TestMulWordsAgainstMathBig(t *testing.T) {
	rng := rand.New(rand.NewSource(23))
	for it := range 20000 {
		x := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(rng.Intn(5*64))))
		y := new(big.Int).Rand(rng, new(big.Int).Lsh(bigOne, uint(rng.Intn(5*64))))
		if it%10 == 0 {
			x.Sub(x.Lsh(bigOne, uint(64*(1+rng.Intn(4)))), bigOne)
		}
		z := make([]big.Word, len(x.Bits())+len(y.Bits()))
		if got, want := new(big.Int).SetBits(mulWords(z, wordsOf(nil, x.Bits()), wordsOf(nil, y.Bits()))), new(big.Int).Mul(x, y); got.Cmp(want) != 0 {
			t.Fatalf("%v·%v = %v, want %v", x, y, got, want)
		}
	}
}

// detWords against the cofactor (Laplace) expansion in math/big on 1x1
// to 3x3 matrices with entries up to the limit, ±(2^62 − 1), where the
// three terms reach 2^187.
func TestDetWordsAgainstMathBig(t *testing.T) {
	rng := rand.New(rand.NewSource(24))
	lim := int64(1<<62 - 1)
	entry := func() int64 {
		switch rng.Intn(4) {
		case 0:
			return []int64{lim, -lim, 0, 1, -1}[rng.Intn(5)]
		case 1:
			return rng.Int63n(2*lim+1) - lim
		}
		return rng.Int63n(2001) - 1000
	}
	var det func(a [][]*big.Int) *big.Int
	det = func(a [][]*big.Int) *big.Int {
		if len(a) == 1 {
			return new(big.Int).Set(a[0][0])
		}
		sum := new(big.Int)
		for j := range a {
			minor := make([][]*big.Int, 0, len(a)-1)
			for _, row := range a[1:] {
				minor = append(minor, append(append([]*big.Int(nil), row[:j]...), row[j+1:]...))
			}
			t := new(big.Int).Mul(a[0][j], det(minor))
			if j%2 == 1 {
				t.Neg(t)
			}
			sum.Add(sum, t)
		}
		return sum
	}
	for it := range 30000 {
		k := 1 + it%3
		e := make([]int64, k*k)
		rows := make([][]*big.Int, k)
		for i := range e {
			e[i] = entry()
			rows[i/k] = append(rows[i/k], big.NewInt(e[i]))
		}
		var words [3]big.Word
		got := setSigned(new(big.Int), words[:], detWords(e, k))
		if want := det(rows); got.Cmp(want) != 0 {
			t.Fatalf("det %v = %v, want %v", e, got, want)
		}
	}
}

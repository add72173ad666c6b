package exact

import (
	"errors"
	"fmt"
	"math/big"
	"testing"
)

// binomialPoly returns C(n, k) * v^e, the binomial coefficient from
// math/big's Binomial (a general-purpose library, not this package).
func binomialPoly(t *testing.T, r *Ring, n, k int64, v *Poly, e int) *Poly {
	t.Helper()
	c := r.Const(new(big.Rat).SetInt(new(big.Int).Binomial(n, k)))
	return mustMulP(t, c, mustPow(t, v, e))
}

// The binomial theorem: the coefficient of a^k in (a + b)^n is
// C(n, k) b^(n-k). n = 70 takes coefficients past int64 (C(70, 35) is
// about 1.1e20), so the big numerators are collected too.
func TestCoefficientInBinomial(t *testing.T) {
	r, vs := testRing(t, "a", "b")
	a, b := vs[0], vs[1]
	for _, n := range []int{0, 1, 5, 12, 70} {
		p := mustPow(t, a.Add(b), n)
		parts := p.Collect(0)
		if len(parts) != n+1 {
			t.Fatalf("n = %d: Collect gave %d coefficients", n, len(parts))
		}
		for k := 0; k <= n; k++ {
			want := binomialPoly(t, r, int64(n), int64(k), b, n-k)
			if got := p.CoefficientIn(map[int]int{0: k}); !got.Equal(want) {
				t.Errorf("n = %d, a^%d: %v, want %v", n, k, got, want)
			}
			if !parts[k].Equal(want) {
				t.Errorf("n = %d: Collect(a)[%d] = %v, want %v", n, k, parts[k], want)
			}
			// Naming both variables gives the number, as Coefficient does.
			if got, ok := p.CoefficientIn(map[int]int{0: k, 1: n - k}).Constant(); !ok || got.Cmp(p.Coefficient([]int{k, n - k})) != 0 || got.Cmp(new(big.Rat).SetInt(new(big.Int).Binomial(int64(n), int64(k)))) != 0 {
				t.Errorf("n = %d, a^%d b^%d: %v", n, k, n-k, got)
			}
		}
		for _, k := range []int{n + 1, -1, MaxExponent + 1} {
			if got := p.CoefficientIn(map[int]int{0: k}); !got.IsZero() {
				t.Errorf("n = %d, a^%d: %v, want 0", n, k, got)
			}
		}
	}
}

// The multinomial theorem in six variables (two exponent words): the
// coefficient of x1^i x5^j in (x0 + ... + x5)^n is
// n!/(i! j! (n-i-j)!) (x0 + x2 + x3 + x4)^(n-i-j), the multinomial
// coefficient as C(n, i) C(n-i, j) from math/big.
func TestCoefficientInMultinomial(t *testing.T) {
	r, xs := testRing(t, "x0", "x1", "x2", "x3", "x4", "x5")
	sum, rest := r.zero(), r.zero()
	for i, x := range xs {
		sum = sum.Add(x)
		if i != 1 && i != 5 {
			rest = rest.Add(x)
		}
	}
	const n = 6
	p := mustPow(t, sum, n)
	for i := 0; i <= n; i++ {
		for j := 0; i+j <= n; j++ {
			c := new(big.Int).Binomial(n, int64(i))
			c.Mul(c, new(big.Int).Binomial(int64(n-i), int64(j)))
			want := mustMulP(t, r.Const(new(big.Rat).SetInt(c)), mustPow(t, rest, n-i-j))
			if got := p.CoefficientIn(map[int]int{1: i, 5: j}); !got.Equal(want) {
				t.Errorf("x1^%d x5^%d: %v, want %v", i, j, got, want)
			}
		}
	}
}

// A variable made after p does not occur in p: exponent 0 leaves p as it
// is, any other gives 0 (by definition of the coefficient).
func TestCoefficientInLaterVariable(t *testing.T) {
	r := NewRing()
	p := mustParse(t, r, "3/2*a^2*b - a + 7")
	for i := 0; i < 8; i++ {
		if _, err := r.Var(fmt.Sprintf("later%d", i)); err != nil {
			t.Fatal(err)
		}
	}
	if got := p.CoefficientIn(map[int]int{9: 0}); !got.Equal(p) {
		t.Errorf("exponent 0 in a later variable: %v", got)
	}
	if got := p.CoefficientIn(map[int]int{9: 1}); !got.IsZero() {
		t.Errorf("exponent 1 in a later variable: %v", got)
	}
	if got := p.CoefficientIn(map[int]int{0: 2}); !got.Equal(mustParse(t, r, "3/2*b")) {
		t.Errorf("the coefficient keeps the denominator: %v", got)
	}
	if got := r.zero().Collect(0); got != nil {
		t.Errorf("Collect of 0: %v", got)
	}
}

func TestParseKnown(t *testing.T) {
	if _, err := NewRing().ParseKnown("a + 1"); !errors.Is(err, ErrUnknownVariable) {
		t.Fatalf("no variables yet: %v", err)
	}
	r, _ := testRing(t, "a", "b")
	p, err := r.ParseKnown("(a + b)^2")
	if err != nil || !p.Equal(mustParse(t, r, "a^2 + 2*a*b + b^2")) {
		t.Fatalf("known names: %v, %v", p, err)
	}
	// The case: "bb" starts at column 15 (counted by hand).
	_, err = r.ParseKnown("a^2 + 2*a*b + bb^2 + cc")
	var pe *ParseError
	if !errors.As(err, &pe) || !errors.Is(err, ErrUnknownVariable) || pe.Col != 15 || pe.Name != "bb" {
		t.Fatalf("unknown name: %#v", err)
	}
	if got := r.Names(); len(got) != 2 {
		t.Errorf("ParseKnown added variables: %v", got)
	}
	// Malformed text is reported as such before any name is looked up.
	if _, err := r.ParseKnown("zz + * b"); !errors.Is(err, ErrSyntax) {
		t.Errorf("syntax first: %v", err)
	}
}

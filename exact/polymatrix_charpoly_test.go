package exact

import (
	"errors"
	"math/big"
	"math/rand"
	"testing"
)

// pmCoeffs returns the coefficients c_0..c_deg of a polynomial in the one
// variable with index v (other variables must not occur).
func pmCoeffs(tb testing.TB, p *Poly, v int) []*big.Rat {
	tb.Helper()
	c := make([]*big.Rat, max(p.Degree(), 0)+1)
	for i := range c {
		c[i] = new(big.Rat)
	}
	for _, term := range p.Terms() {
		for w, e := range term.Exps {
			if w != v && e != 0 {
				tb.Fatalf("%v is not univariate", p)
			}
		}
		e := 0
		if v < len(term.Exps) {
			e = term.Exps[v]
		}
		c[e].Set(term.Coef)
	}
	return c
}

// pmEvalAtMatrix evaluates sum c_k M^k by Horner's rule with exact Matrix
// operations.
func pmEvalAtMatrix(tb testing.TB, c []*big.Rat, m *Matrix) *Matrix {
	tb.Helper()
	n := m.Rows()
	acc := Zeros(n, n)
	for k := len(c) - 1; k >= 0; k-- {
		acc = mustMul(tb, acc, m)
		var err error
		if acc, err = acc.Add(Identity(n).Scale(c[k])); err != nil {
			tb.Fatal(err)
		}
	}
	return acc
}

// Standard facts about det(t I - M) for M n x n: monic of degree n, the
// coefficient of t^(n-1) is -trace(M), the constant term is (-1)^n det(M),
// and (Cayley–Hamilton) the polynomial evaluated at M is the zero matrix.
// Also cross-checked against the symbolic Det of t I - M.
func TestCharacteristicPolynomial(t *testing.T) {
	rng := rand.New(rand.NewSource(6))
	r := NewRing()
	tv := pmVars(t, r, "t")[0]
	for n := 1; n <= 9; n++ {
		for trial := 0; trial < 3; trial++ {
			m := randomMatrix(rng, n, n, 9)
			if trial == 2 {
				// Sparse, with zero subdiagonal stretches (the Hessenberg
				// reduction must search for pivots).
				for i := 0; i < n; i++ {
					for j := 0; j < n; j++ {
						if rng.Intn(3) > 0 {
							m.Set(i, j, nil)
						}
					}
				}
			}
			p, err := CharacteristicPolynomial(m, tv)
			if err != nil {
				t.Fatal(err)
			}
			c := pmCoeffs(t, p, 0)
			if len(c) != n+1 || c[n].Cmp(q("1")) != 0 {
				t.Fatalf("n=%d: %v is not monic of degree n", n, p)
			}
			tr, _ := m.Trace()
			if c[n-1].Cmp(new(big.Rat).Neg(tr)) != 0 {
				t.Fatalf("n=%d: t^(n-1) coefficient %s, trace %s", n, c[n-1].RatString(), tr.RatString())
			}
			det := mustDet(t, m)
			if n%2 == 1 {
				det.Neg(det)
			}
			if c[0].Cmp(det) != 0 {
				t.Fatalf("n=%d: constant term %s, (-1)^n det %s", n, c[0].RatString(), det.RatString())
			}
			if z := pmEvalAtMatrix(t, c, m); !z.IsZero() {
				t.Fatalf("n=%d: Cayley–Hamilton fails: p(M) = %v", n, z)
			}
			if n <= 7 {
				tim, err := PolyMatrixFrom(r, Identity(n)).Scale(tv)
				if err != nil {
					t.Fatal(err)
				}
				tim, err = tim.Sub(PolyMatrixFrom(r, m))
				if err != nil {
					t.Fatal(err)
				}
				d, err := tim.Det()
				if err != nil {
					t.Fatal(err)
				}
				if !d.Equal(p) {
					t.Fatalf("n=%d: det(tI - M) = %v, CharacteristicPolynomial = %v", n, d, p)
				}
			}
		}
	}
}

// A companion matrix (ones on the subdiagonal, last column -a_0..-a_{n-1})
// has characteristic polynomial t^n + a_{n-1} t^(n-1) + ... + a_0
// (standard).
func TestCharacteristicPolynomialCompanion(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	r := NewRing()
	pmVars(t, r, "s") // t gets index 1
	tv := pmVars(t, r, "t")[0]
	for n := 1; n <= 8; n++ {
		a := make([]*big.Rat, n)
		m := Zeros(n, n)
		for i := range a {
			a[i] = randomSmallRat(rng, 50)
			if i == 1 {
				a[i] = new(big.Rat) // a zero coefficient too
			}
			m.Set(i, n-1, new(big.Rat).Neg(a[i]))
			if i > 0 {
				m.Set(i, i-1, q("1"))
			}
		}
		p, err := CharacteristicPolynomial(m, tv)
		if err != nil {
			t.Fatal(err)
		}
		c := pmCoeffs(t, p, 1)
		for i := 0; i < n; i++ {
			if c[i].Cmp(a[i]) != 0 {
				t.Fatalf("n=%d: coefficient of t^%d is %s, want %s", n, i, c[i].RatString(), a[i].RatString())
			}
		}
	}
}

func TestCharacteristicPolynomialSpecial(t *testing.T) {
	r := NewRing()
	tv := pmVars(t, r, "t")[0]
	// Identity(3): (t - 1)^3.
	p, err := CharacteristicPolynomial(Identity(3), tv)
	if err != nil {
		t.Fatal(err)
	}
	want, _ := tv.Sub(pmConst(r, "1")).Pow(3)
	if !p.Equal(want) {
		t.Fatalf("char poly of I3 = %v, want %v", p, want)
	}
	// Zero matrix: t^n. 0x0: 1.
	if p, _ := CharacteristicPolynomial(Zeros(2, 2), tv); !p.Equal(pmMul(t, tv, tv)) {
		t.Fatalf("char poly of 0 = %v", p)
	}
	if p, _ := CharacteristicPolynomial(Zeros(0, 0), tv); !p.Equal(pmConst(r, "1")) {
		t.Fatalf("char poly of 0x0 = %v", p)
	}
	if _, err := CharacteristicPolynomial(Zeros(2, 3), tv); !errors.Is(err, ErrNotSquare) {
		t.Fatalf("non-square: %v", err)
	}
	// The Hilbert matrix H_4 (rational entries): cross-check with Det.
	h := hilbert(4)
	p, err = CharacteristicPolynomial(h, tv)
	if err != nil {
		t.Fatal(err)
	}
	if z := pmEvalAtMatrix(t, pmCoeffs(t, p, 0), h); !z.IsZero() {
		t.Fatalf("Cayley–Hamilton fails for H4")
	}
}

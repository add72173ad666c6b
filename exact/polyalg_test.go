package exact

import (
	"fmt"
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// TestHeron checks Heron's formula in its two classical forms (any
// handbook of geometry): 16*Area^2 = (a+b+c)(-a+b+c)(a-b+c)(a+b-c)
// = 2a^2b^2 + 2b^2c^2 + 2c^2a^2 - a^4 - b^4 - c^4.
func TestHeron(t *testing.T) {
	r, _ := testRing(t, "a", "b", "c")
	factored := mustParse(t, r, "(a+b+c)*(-a+b+c)*(a-b+c)*(a+b-c)")
	expanded := mustParse(t, r, "2*a^2*b^2 + 2*b^2*c^2 + 2*c^2*a^2 - a^4 - b^4 - c^4")
	if !factored.Equal(expanded) {
		t.Fatalf("Heron: %v != %v", factored, expanded)
	}
	if d, ok := expanded.Homogeneous(); !ok || d != 4 {
		t.Errorf("Heron's polynomial is homogeneous of degree 4, got %d %v", d, ok)
	}
	// The 3-4-5 right triangle has area 6: 16*36 = 576.
	v := expanded.Eval(map[int]*big.Rat{0: big.NewRat(3, 1), 1: big.NewRat(4, 1), 2: big.NewRat(5, 1)})
	if c, ok := v.Constant(); !ok || c.Cmp(big.NewRat(576, 1)) != 0 {
		t.Errorf("16*Area^2 of the 3-4-5 triangle: %v", v)
	}
	// Each linear factor divides it.
	for _, f := range []string{"a+b+c", "-a+b+c", "a-b+c", "a+b-c"} {
		if _, ok, err := expanded.DivExact(mustParse(t, r, f)); !ok || err != nil {
			t.Errorf("%s does not divide Heron's polynomial: %v", f, err)
		}
	}
	// And a non-factor does not.
	if _, ok, _ := expanded.DivExact(mustParse(t, r, "a+2*b-c")); ok {
		t.Error("a+2b-c divides Heron's polynomial")
	}
}

// TestPolyVandermonde expands prod_{i<j} (x_j - x_i), the Vandermonde
// determinant. By the Leibniz formula it is sum over permutations s of
// sgn(s) prod x_i^(s(i)-1) with distinct monomials: exactly n! terms, each
// +-1 times a monomial (standard fact). It is alternating: swapping two
// variables negates it.
func TestPolyVandermonde(t *testing.T) {
	fact := 1
	for n := 2; n <= 7; n++ {
		fact *= n
		names := make([]string, n)
		for i := range names {
			names[i] = fmt.Sprintf("x%d", i)
		}
		r, xs := testRing(t, names...)
		v := r.one()
		for j := 0; j < n; j++ {
			for i := 0; i < j; i++ {
				v = mustMulP(t, v, xs[j].Sub(xs[i]))
			}
		}
		if v.Len() != fact {
			t.Errorf("n=%d: %d terms, want %d", n, v.Len(), fact)
		}
		for _, tm := range v.Terms() {
			if a := new(big.Rat).Abs(tm.Coef); a.Cmp(big.NewRat(1, 1)) != 0 {
				t.Fatalf("n=%d: coefficient %v", n, tm.Coef)
			}
		}
		if d, ok := v.Homogeneous(); !ok || d != n*(n-1)/2 {
			t.Errorf("n=%d: degree %d, %v", n, d, ok)
		}
		swapped, err := v.Substitute(map[int]*Poly{0: xs[n-1], n - 1: xs[0]})
		if err != nil {
			t.Fatal(err)
		}
		if !swapped.Equal(v.Neg()) {
			t.Errorf("n=%d: swapping x0 and x%d does not negate", n, n-1)
		}
	}
}

// chebyshev returns T_0..T_n by T_0 = 1, T_1 = x, T_{k+1} = 2x T_k - T_{k-1}.
func chebyshev(t testing.TB, x *Poly, n int) []*Poly { return chebyshevFrom(t, x, x, n) }

// chebyshevFrom returns the n+1 polynomials of the Chebyshev recurrence
// P_{k+1} = 2x P_k - P_{k-1} from P_0 = 1 and P_1 = first.
func chebyshevFrom(t testing.TB, x, first *Poly, n int) []*Poly {
	ts := []*Poly{x.ring.one(), first}
	two := x.Scale(big.NewRat(2, 1))
	for k := 1; k < n; k++ {
		ts = append(ts, mustMulP(t, two, ts[k]).Sub(ts[k-1]))
	}
	return ts
}

// TestChebyshev checks T_5 = 16x^5 - 20x^3 + 5x and T_6 (DLMF 18.3,
// Abramowitz and Stegun table 22.3) and the composition rule
// T_m(T_n) = T_mn (it follows from T_n(cos t) = cos nt, DLMF 18.5.1).
func TestChebyshev(t *testing.T) {
	r, vs := testRing(t, "x")
	x := vs[0]
	ts := chebyshev(t, x, 36)
	for k, want := range map[int]string{
		5:  "16*x^5 - 20*x^3 + 5*x",
		6:  "32*x^6 - 48*x^4 + 18*x^2 - 1",
		10: "512*x^10 - 1280*x^8 + 1120*x^6 - 400*x^4 + 50*x^2 - 1",
	} {
		if got := ts[k].String(); got != want {
			t.Errorf("T_%d = %s, want %s", k, got, want)
		}
	}
	for m := 0; m <= 6; m++ {
		for n := 0; n <= 6; n++ {
			got, err := ts[m].Substitute(map[int]*Poly{0: ts[n]})
			if err != nil {
				t.Fatal(err)
			}
			if !got.Equal(ts[m*n]) {
				t.Errorf("T_%d(T_%d) = %v, want T_%d", m, n, got, m*n)
			}
		}
	}
	// T_n(1) = 1 and T_n(cos t) = cos(n t) numerically.
	for n, tn := range ts[:12] {
		if c, _ := tn.Eval(map[int]*big.Rat{0: big.NewRat(1, 1)}).Constant(); c.Cmp(big.NewRat(1, 1)) != 0 {
			t.Errorf("T_%d(1) = %v", n, c)
		}
		if got, want := tn.Float([]float64{math.Cos(0.3)}), math.Cos(0.3*float64(n)); math.Abs(got-want) > 1e-9 {
			t.Errorf("T_%d(cos 0.3) = %v, want %v", n, got, want)
		}
	}
	_ = r
}

// TestNewtonIdentities checks k e_k = sum_{i=1..k} (-1)^(i-1) e_{k-i} p_i
// between elementary symmetric polynomials e_k and power sums p_k
// (Newton's identities, standard) in 4 and 5 variables, for k up to n+2
// (e_k = 0 for k > n).
func TestNewtonIdentities(t *testing.T) {
	for _, n := range []int{4, 5} {
		names := make([]string, n)
		for i := range names {
			names[i] = fmt.Sprintf("x%d", i)
		}
		r, xs := testRing(t, names...)
		// e_k from prod (1 + x_i T): coefficients of T^k.
		tv, _ := r.Var("T")
		gen := r.one()
		for _, x := range xs {
			gen = mustMulP(t, gen, r.one().Add(mustMulP(t, x, tv)))
		}
		ti, _ := r.Index("T")
		parts := gen.Collect(ti)
		e := func(k int) *Poly {
			if k < len(parts) && parts[k] != nil {
				return parts[k]
			}
			return r.zero()
		}
		p := func(k int) *Poly {
			s := r.zero()
			for _, x := range xs {
				s = s.Add(mustPow(t, x, k))
			}
			return s
		}
		if e(n).Len() != 1 || e(2).Len() != n*(n-1)/2 {
			t.Errorf("n=%d: e_n has %d terms, e_2 has %d", n, e(n).Len(), e(2).Len())
		}
		for k := 1; k <= n+2; k++ {
			rhs := r.zero()
			for i := 1; i <= k; i++ {
				term := mustMulP(t, e(k-i), p(i))
				if i%2 == 0 {
					term = term.Neg()
				}
				rhs = rhs.Add(term)
			}
			lhs := e(k).Scale(big.NewRat(int64(k), 1))
			if !lhs.Equal(rhs) {
				t.Errorf("n=%d k=%d: %v != %v", n, k, lhs, rhs)
			}
		}
	}
}

// TestCalculusRules checks the product rule (pq)' = p'q + pq' and the
// chain rule d/dx p(q(x, y), y) = p_u(q, y) q_x + ... (standard theorems)
// on random polynomials.
func TestCalculusRules(t *testing.T) {
	rng := rand.New(rand.NewSource(6))
	r, vs := testRing(t, "x", "y", "z", "u")
	for trial := 0; trial < 60; trial++ {
		p := randPoly(rng, r, 3, 1+rng.Intn(8), 4, rng.Intn(4))
		q := randPoly(rng, r, 3, 1+rng.Intn(8), 4, rng.Intn(4))
		for v := 0; v < 3; v++ {
			lhs := mustMulP(t, p, q).Derivative(v)
			rhs := mustMulP(t, p.Derivative(v), q).Add(mustMulP(t, p, q.Derivative(v)))
			if !lhs.Equal(rhs) {
				t.Fatalf("product rule fails for %v, %v in variable %d", p, q, v)
			}
			checkCanonical(t, lhs)
		}
		// Chain rule: f(u) with u := q(x,y,z); d/dx f(q) = f'(q) * q_x,
		// and with two inner functions (u := q, y := s).
		f := randPoly(rng, r, 4, 1+rng.Intn(5), 3, rng.Intn(4))
		s := randPoly(rng, r, 3, 1+rng.Intn(4), 2, 0)
		comp, err := f.Substitute(map[int]*Poly{3: q, 1: s})
		if err != nil {
			t.Fatal(err)
		}
		for v := 0; v < 3; v++ {
			fu, _ := f.Derivative(3).Substitute(map[int]*Poly{3: q, 1: s})
			fy, _ := f.Derivative(1).Substitute(map[int]*Poly{3: q, 1: s})
			fv := r.zero()
			if v != 1 {
				fv, _ = f.Derivative(v).Substitute(map[int]*Poly{3: q, 1: s})
			}
			rhs := mustMulP(t, fu, q.Derivative(v)).Add(mustMulP(t, fy, s.Derivative(v))).Add(fv)
			if !comp.Derivative(v).Equal(rhs) {
				t.Fatalf("chain rule fails: f=%v q=%v s=%v v=%d", f, q, s, v)
			}
		}
	}
	_ = vs
}

// TestEvalSubstituteFloat: evaluating at a point equals substituting
// constants; Float agrees with the exact value on small integers; partial
// evaluation commutes.
func TestEvalSubstituteFloat(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	r, _ := testRing(t, "x", "y", "z")
	for trial := 0; trial < 100; trial++ {
		p := randPoly(rng, r, 3, 1+rng.Intn(10), 4, []int{0, 3}[rng.Intn(2)])
		pt := map[int]*big.Rat{}
		consts := map[int]*Poly{}
		fl := make([]float64, 3)
		for v := 0; v < 3; v++ {
			c := big.NewRat(rng.Int63n(7)-3, 1)
			pt[v] = c
			consts[v] = r.Const(c)
			fl[v], _ = c.Float64()
		}
		e := p.Eval(pt)
		s, err := p.Substitute(consts)
		if err != nil {
			t.Fatal(err)
		}
		if !e.Equal(s) {
			t.Fatalf("Eval %v != Substitute %v for %v", e, s, p)
		}
		c, ok := e.Constant()
		if !ok {
			t.Fatalf("full evaluation is not constant: %v", e)
		}
		want, _ := c.Float64()
		if got := p.Float(fl); math.Abs(got-want) > 1e-9*math.Max(1, math.Abs(want)) {
			t.Fatalf("Float = %v, exact %v", got, c)
		}
		// Evaluate x first, then y and z.
		step := p.Eval(map[int]*big.Rat{0: pt[0]}).Eval(map[int]*big.Rat{1: pt[1], 2: pt[2]})
		if !step.Equal(e) {
			t.Fatalf("stepwise evaluation differs")
		}
		checkCanonical(t, p.Eval(map[int]*big.Rat{1: big.NewRat(1, 3)}))
	}
	// Ignored indices; Eval of a variable the polynomial does not have.
	p := mustParse(t, r, "x + 1")
	if !p.Eval(map[int]*big.Rat{2: big.NewRat(5, 1), 40: big.NewRat(1, 1)}).Equal(p) {
		t.Error("Eval at absent variables changed p")
	}
	// Substitution is simultaneous.
	q := mustParse(t, r, "x^2*y + 3*y")
	sw, _ := q.Substitute(map[int]*Poly{0: mustParse(t, r, "y"), 1: mustParse(t, r, "x")})
	if got := sw.String(); got != "x*y^2 + 3*x" {
		t.Errorf("swap = %s", got)
	}
	// The cap applies to substitution.
	r.SetMaxTerms(100)
	if _, err := mustParse(t, r, "x^20").Substitute(map[int]*Poly{0: mustParse(t, r, "x+y+z+1")}); err == nil {
		t.Error("substitution beyond the cap succeeded")
	}
}

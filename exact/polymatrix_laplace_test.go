package exact

import (
	"errors"
	"fmt"
	"math/big"
	"testing"
)

// The expanded Cayley–Menger determinants of the 6- and 7-simplex against
// the reference program cm.c (FLINT's fmpz_mpoly, in ../shared/peers; run
// once, figures copied here): 6202 and 52552 terms, sums of |coefficients|
// 14833 and 133496, and values -5161688 and 135416442 at d_ij = i+2j+1.
// The value is also checked by an independent route, the rational
// determinant of the matrix evaluated there (pmEvalDet), and the packed
// expansion against the *Poly one.
func TestPolyDetCayleyMengerReference(t *testing.T) {
	for _, c := range []struct {
		n, terms      int
		sumAbs, value int64
	}{
		{6, 6202, 14833, -5161688},
		{7, 52552, 133496, 135416442},
	} {
		if c.n == 7 && testing.Short() {
			continue
		}
		m, r := pmCayleyMenger(t, c.n)
		if _, ok := m.packedLayout(); !ok {
			t.Fatalf("n=%d: no packed layout", c.n)
		}
		d := pmDetAll(t, m, 0)
		if d.Len() != c.terms {
			t.Errorf("n=%d: %d terms, want %d", c.n, d.Len(), c.terms)
		}
		sum := new(big.Int)
		for i := 0; i < d.n(); i++ {
			sum.Add(sum, new(big.Int).Abs(d.numAt(i, new(big.Int))))
		}
		if d.den != nil || sum.Cmp(big.NewInt(c.sumAbs)) != 0 {
			t.Errorf("n=%d: sum of |coefficients| %v (denominator %v), want %d", c.n, sum, d.den, c.sumAbs)
		}
		vals := map[int]*big.Rat{}
		for i := 0; i <= c.n; i++ {
			for j := i + 1; j <= c.n; j++ {
				v, _ := r.Index(fmt.Sprintf("d%d%d", i, j))
				vals[v] = big.NewRat(int64(i+2*j+1), 1)
			}
		}
		if got, _ := pmEval(d, vals).Constant(); got.Cmp(big.NewRat(c.value, 1)) != 0 {
			t.Errorf("n=%d: value %s, want %d", c.n, got.RatString(), c.value)
		}
		pmEvalDet(t, m, d, vals)
	}
}

// 288 V^2 is the Cayley–Menger determinant of a tetrahedron (common
// practice): the regular tetrahedron of edge 1 has V = 1/(6√2), so 4; the
// corner (0,0,0), e1, e2, e3 has V = 1/6 and squared edges 1, 1, 1, 2, 2, 2,
// so 8.
func TestPolyDetTetrahedron288(t *testing.T) {
	m, r := pmCayleyMenger(t, 3)
	d := pmDetAll(t, m, 5)
	for _, c := range []struct {
		sq   map[string]string
		want string
	}{
		{map[string]string{"d01": "1", "d02": "1", "d03": "1", "d12": "1", "d13": "1", "d23": "1"}, "4"},
		{map[string]string{"d01": "1", "d02": "1", "d03": "1", "d12": "2", "d13": "2", "d23": "2"}, "8"},
	} {
		vals := map[int]*big.Rat{}
		for name, s := range c.sq {
			v, _ := r.Index(name)
			vals[v] = q(s)
		}
		if got, _ := pmEval(d, vals).Constant(); got.Cmp(q(c.want)) != 0 {
			t.Fatalf("%v: %s, want %s", c.sq, got.RatString(), c.want)
		}
	}
}

// packedLayout takes integer entries whose bounds fit, and declines the
// rest, whose determinants then come from the *Poly expansion (pmDetAll
// compares the methods).
func TestPolyDetPackedLayout(t *testing.T) {
	m, _ := pmCayleyMenger(t, 7)
	l, ok := m.packedLayout()
	// 28 variables of exponent <= 2 (2 bits) under a degree field for <= 9.
	if !ok || len(l.vars) != 28 || l.degShift != 60 || l.words == nil {
		t.Fatalf("CM 7-simplex: layout %+v, %v", l, ok)
	}
	r := NewRing()
	x := pmVars(t, r, "x", "y", "z", "u", "v", "w")
	one := pmConst(r, "1")
	xyz := pmMul(t, pmMul(t, x[0], x[1]), x[2])
	all := pmMul(t, pmMul(t, xyz, x[3]), pmMul(t, x[4], x[5]))
	for _, c := range []struct {
		name   string
		entry  *Poly // placed on the diagonal of a 3x3 matrix with x, y, z around
		packed bool
	}{
		{"integer", x[0].Add(one), true},
		{"rational", x[0].Scale(q("1/2")), false},
		{"bound 2^62", x[0].Scale(q("4611686018427387904")), false},
		{"bound below 2^62", x[0].Scale(q("100000")), true},
		{"exponents over 64 bits", mustPow(t, all, 1000), false}, // 6 fields of 12 bits
		{"exponents under 64 bits", mustPow(t, xyz, 1000), true}, // 3 fields of 12 bits
	} {
		rows := [][]*Poly{{c.entry, x[0], x[1]}, {x[2], c.entry, one}, {x[1], x[2], c.entry}}
		m := pmMatrix(t, r, rows...)
		if _, ok := m.packedLayout(); ok != c.packed {
			t.Errorf("%s: packed %v, want %v", c.name, ok, c.packed)
		}
		pmDetAll(t, m, 3)
	}
	// Exponents that may pass MaxExponent are left to the *Poly expansion,
	// which reports them.
	huge := mustPow(t, xyz, 40000)
	m = pmMatrix(t, r, []*Poly{huge, one}, []*Poly{one, huge})
	if _, ok := m.packedLayout(); ok {
		t.Fatal("exponent bound 80000 above MaxExponent: packed")
	}
	if _, err := m.Det(); !errors.Is(err, ErrExponentRange) {
		t.Fatalf("x^80000...: err = %v, want ErrExponentRange", err)
	}
}

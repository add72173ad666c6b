package exact

// Multivariate Hensel lifting over Q, one variable at a time (P. S. Wang,
// "An improved multivariate polynomial factoring algorithm", Math. Comp.
// 32, 1978; K. O. Geddes, S. R. Czapor and G. Labahn, Algorithms for
// Computer Algebra, 1992, Algorithms 6.2–6.4: univariate and multivariate
// diophantine equations, and the lifting itself).
//
// The evaluation point has been moved to the origin (the caller
// substitutes y → y + a), so the ideal is (y_1, …, y_k) and the y-adic
// coefficients are plain coefficients. Every factor's leading coefficient
// in the main variable x is imposed (here the same polynomial for each,
// see factor_multi.go), which makes the lift unique: each correction has
// x-degree below its factor's, and the lift either reaches A exactly or
// proves that no factorization with these images exists. Arithmetic is
// exact over Q, so no prime-power bound is needed; the price is rational
// coefficients, kept to a common denominator by the Poly type.

import (
	"math/big"
)

// lifter lifts images u_i(x) of A(x, 0, …, 0) to factors of A.
type lifter struct {
	x     int     // the main variable
	ys    []int   // the other variables, in lifting order
	bound []int   // bound[s]: degree of A in ys[s], a bound for every factor
	A     *Poly   // the polynomial to factor, evaluation point at the origin
	lc    []*Poly // the imposed leading coefficient in x of each factor
	say   func(string)
}

// lift returns factors U_i with ∏ U_i = A, lc_x(U_i) = lc[i] and
// U_i(x, 0) = u[i], or false when there are none (the images do not
// come from a factorization of A).
func (l *lifter) lift(u []*Poly) ([]*Poly, bool, error) {
	U := u
	k := len(l.ys)
	for j := 0; j < k; j++ {
		y := l.ys[j]
		rest := l.ys[j+1:]
		Aj := atZero(l.A, rest)
		prev := U
		U = make([]*Poly, len(prev))
		for i, a := range prev {
			// Impose the leading coefficient with y_j back in it.
			d := a.DegreeIn(l.x)
			U[i] = a.Sub(a.lcIn(l.x).mulVarPow(l.x, d)).Add(atZero(l.lc[i], rest).mulVarPow(l.x, d))
		}
		d, err := newDiophant(l.x, l.ys[:j], l.bound, prev)
		if err != nil {
			return nil, false, err
		}
		if U, err = l.liftIn(y, j, Aj, U, d); err != nil || U == nil {
			return nil, false, err
		}
	}
	return U, true, nil
}

// liftIn lifts the factors U (correct modulo y) to factors of Aj, or
// returns nil when there are none. The y-adic digits of the factors and
// of their prefix products U_0⋯U_i are kept, so the digit of ∏ U at y^m
// costs a few small products instead of a whole product of the factors
// at every step (BenchmarkFactorDenseLeadingCoefficients, five factors:
// 3.8 s with whole products, 1–2 s with digits, on a loaded machine).
func (l *lifter) liftIn(y, j int, Aj *Poly, U []*Poly, d *diophant) ([]*Poly, error) {
	D := Aj.DegreeIn(y)
	r := len(U)
	zero := Aj.ring.zero()
	at := func(ps []*Poly, k int) *Poly {
		if k < len(ps) && ps[k] != nil {
			return ps[k]
		}
		return zero
	}
	digits := make([][]*Poly, r)
	for i, u := range U {
		cs := u.Collect(y)
		digits[i] = make([]*Poly, max(D+1, len(cs)))
		for k := range digits[i] {
			digits[i][k] = at(cs, k)
		}
	}
	prefix := make([][]*Poly, r)
	// digit returns digit m of U_0⋯U_i.
	digit := func(i, m int) (*Poly, error) {
		if i == 0 {
			return digits[0][m], nil
		}
		terms := make([]*Poly, 0, m+1)
		for k := 0; k <= m; k++ {
			a, b := prefix[i-1][k], digits[i][m-k]
			if a.IsZero() || b.IsZero() {
				continue
			}
			t, err := a.Mul(b)
			if err != nil {
				return nil, err
			}
			terms = append(terms, t)
		}
		return sumOrZero(Aj.ring, terms)
	}
	Ac := Aj.Collect(y)
	for m := 0; m <= D; m++ {
		for i := range prefix {
			t, err := digit(i, m)
			if err != nil {
				return nil, err
			}
			prefix[i] = append(prefix[i], t)
		}
		c := at(Ac, m).Sub(prefix[r-1][m])
		if m == 0 || c.IsZero() {
			continue
		}
		l.say(liftStage(l.A.ring, y, m, D))
		ds, ok, err := d.solve(c, j)
		if err != nil || !ok {
			return nil, err
		}
		// Only digit m of each factor changed, by ds_i, so digit m of
		// the prefix products changes by δ_i = P_{i−1}[0]·ds_i +
		// δ_{i−1}·U_i[0]: two products, not m + 1.
		var delta *Poly
		for i := range digits {
			digits[i][m] = digits[i][m].Add(ds[i])
			step := ds[i]
			if i > 0 {
				a, err := prefix[i-1][0].Mul(ds[i])
				if err != nil {
					return nil, err
				}
				b, err := delta.Mul(digits[i][0])
				if err != nil {
					return nil, err
				}
				step = a.Add(b)
			}
			prefix[i][m] = prefix[i][m].Add(step)
			delta = step
		}
	}
	out := make([]*Poly, r)
	for i, ds := range digits {
		terms := make([]*Poly, 0, len(ds))
		for k, c := range ds {
			terms = append(terms, c.mulVarPow(y, k))
		}
		var err error
		if out[i], err = sumOrZero(Aj.ring, terms); err != nil {
			return nil, err
		}
	}
	e, err := residue(Aj, out)
	if err != nil || !e.IsZero() {
		return nil, err
	}
	return out, nil
}

// sumOrZero adds ps, held to the term cap (0 for none).
func sumOrZero(r *Ring, ps []*Poly) (*Poly, error) {
	if len(ps) == 0 {
		return r.zero(), nil
	}
	return sumPolys(ps, r.MaxTerms(), "lift")
}

func liftStage(r *Ring, y, m, of int) string {
	return "Hensel lifting in " + r.name(y) + " (degree " + itoa(m) + " of " + itoa(of) + ")"
}

func itoa(n int) string { return big.NewInt(int64(n)).String() }

// atZero returns p with the variables vs set to 0: its terms free of
// them (a selection, much cheaper than Eval).
func atZero(p *Poly, vs []int) *Poly {
	if len(vs) == 0 {
		return p
	}
	exps := make(map[int]int, len(vs))
	for _, v := range vs {
		exps[v] = 0
	}
	return p.CoefficientIn(exps)
}

// residue returns A − ∏ U.
func residue(A *Poly, U []*Poly) (*Poly, error) {
	p, err := mulAll(A.ring, U)
	if err != nil {
		return nil, err
	}
	return A.Sub(p), nil
}

// mulAll returns the product of ps (1 for none).
func mulAll(r *Ring, ps []*Poly) (*Poly, error) {
	out := r.one()
	for _, p := range ps {
		var err error
		if out, err = out.Mul(p); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// diophant solves Σ σ_i·b_i = c, b_i = ∏_{k≠i} a_k, for σ_i of x-degree
// below a_i's, in x and the variables ys[:s] (Algorithms for Computer
// Algebra, Algorithm 6.3): the y-adic digits of σ are found one by one,
// each from a diophantine equation one variable down, and the last
// variable's equation is univariate (Algorithm 6.2).
type diophant struct {
	x     int
	ys    []int
	bound []int
	a, b  [][]*Poly // a[s], b[s]: the factors and cofactors with ys[s:] at 0
	base  []qTable
}

// qTable holds x^m·s_i rem a_i for m below deg ∏ a, where Σ s_i·b_i = 1
// in Q[x]: as integer numerators over one denominator.
type qTable struct {
	num [][]*big.Int // num[m] holds the coefficients, lowest first
	den *big.Int
}

func newDiophant(x int, ys []int, bound []int, a []*Poly) (*diophant, error) {
	d := &diophant{x: x, ys: ys, bound: bound}
	d.a = make([][]*Poly, len(ys)+1)
	d.b = make([][]*Poly, len(ys)+1)
	d.a[len(ys)] = a
	for s := len(ys); s >= 0; s-- {
		if s < len(ys) {
			d.a[s] = make([]*Poly, len(a))
			for i, f := range d.a[s+1] {
				d.a[s][i] = atZero(f, ys[s:s+1])
			}
		}
		var err error
		if d.b[s], err = cofactors(d.a[s]); err != nil {
			return nil, err
		}
	}
	d.base = univariateTables(x, d.a[0])
	return d, nil
}

// cofactors returns b_i = ∏_{k≠i} a_k.
func cofactors(a []*Poly) ([]*Poly, error) {
	out := make([]*Poly, len(a))
	for i := range a {
		var err error
		if out[i], err = mulAll(a[i].ring, append(append([]*Poly(nil), a[:i]...), a[i+1:]...)); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// solve solves the equation for c in x and ys[:s]; false means it has no
// solution within the degree bounds (the lift is failing).
func (d *diophant) solve(c *Poly, s int) ([]*Poly, bool, error) {
	if s == 0 {
		return d.solveUni(c)
	}
	y := d.ys[s-1]
	sigma, ok, err := d.solve(atZero(c, []int{y}), s-1)
	if err != nil || !ok {
		return nil, ok, err
	}
	e := c
	for i, sg := range sigma {
		t, err := sg.Mul(d.b[s][i])
		if err != nil {
			return nil, false, err
		}
		e = e.Sub(t)
	}
	for m := 1; m <= d.bound[s-1] && !e.IsZero(); m++ {
		cm := e.coeffIn(y, m)
		if cm.IsZero() {
			continue
		}
		ds, ok, err := d.solve(cm, s-1)
		if err != nil || !ok {
			return nil, ok, err
		}
		for i := range sigma {
			t := ds[i].mulVarPow(y, m)
			sigma[i] = sigma[i].Add(t)
			tb, err := t.Mul(d.b[s][i])
			if err != nil {
				return nil, false, err
			}
			e = e.Sub(tb)
		}
	}
	return sigma, e.IsZero(), nil
}

// solveUni solves the univariate equation: σ_i = c·s_i rem a_i, by the
// table of x^m·s_i rem a_i.
func (d *diophant) solveUni(c *Poly) ([]*Poly, bool, error) {
	n := len(d.base[0].num)
	cn := make([]*big.Int, n)
	for i := range cn {
		cn[i] = new(big.Int)
	}
	for i := 0; i < c.n(); i++ {
		e := monoExp(c.monoAt(i), d.x)
		if e >= n || c.monoAt(i)[0] != uint64(e) {
			return nil, false, nil // x-degree too high, or not univariate
		}
		c.numAt(i, cn[e])
	}
	out := make([]*Poly, len(d.base))
	t := new(big.Int)
	for i, tab := range d.base {
		deg := len(tab.num[0])
		acc := make([]*big.Int, deg)
		for k := range acc {
			acc[k] = new(big.Int)
		}
		for m, cm := range cn {
			if cm.Sign() == 0 {
				continue
			}
			for k, v := range tab.num[m] {
				acc[k].Add(acc[k], t.Mul(cm, v))
			}
		}
		den := new(big.Int).Mul(tab.den, c.denOr1())
		out[i] = fromDense(c.ring, d.x, zTrim(acc)).Scale(new(big.Rat).SetFrac(bigOne, den))
	}
	return out, true, nil
}

// univariateTables makes the tables of the univariate equation for
// pairwise coprime a_i in x: s_i is the inverse of b_i modulo a_i, so
// Σ s_i·b_i ≡ 1 modulo every a_j, and has degree below deg ∏ a: it is 1.
func univariateTables(x int, a []*Poly) []qTable {
	q := make([]qpoly, len(a))
	n := 0
	for i, f := range a {
		q[i] = qFromPoly(f, x)
		n += len(q[i]) - 1
	}
	out := make([]qTable, len(a))
	for i := range a {
		b := qpoly{big.NewRat(1, 1)}
		for k := range a {
			if k != i {
				b = qRem(qMul(b, q[k]), q[i])
			}
		}
		s := qInvMod(b, q[i])
		rows := make([]qpoly, n)
		for m := range rows {
			rows[m] = s
			s = qRem(qMul(s, qpoly{new(big.Rat), big.NewRat(1, 1)}), q[i])
		}
		out[i] = integerTable(rows, len(q[i])-1)
	}
	return out
}

// integerTable puts rows of rational coefficients (each padded to deg
// entries) over their common denominator.
func integerTable(rows []qpoly, deg int) qTable {
	den := big.NewInt(1)
	g := new(big.Int)
	for _, r := range rows {
		for _, c := range r {
			g.GCD(nil, nil, den, c.Denom())
			den.Mul(den, new(big.Int).Quo(c.Denom(), g))
		}
	}
	t := qTable{den: den, num: make([][]*big.Int, len(rows))}
	for m, r := range rows {
		row := make([]*big.Int, deg)
		for k := range row {
			row[k] = new(big.Int)
			if k < len(r) {
				row[k].Mul(r[k].Num(), new(big.Int).Quo(den, r[k].Denom()))
			}
		}
		t.num[m] = row
	}
	return t
}

// qpoly is a dense univariate polynomial over Q, lowest degree first,
// trimmed; used only for the small tables of the univariate equation.
type qpoly []*big.Rat

func qFromPoly(p *Poly, x int) qpoly {
	out := make(qpoly, p.DegreeIn(x)+1)
	for i := range out {
		out[i] = new(big.Rat)
	}
	for i := 0; i < p.n(); i++ {
		out[monoExp(p.monoAt(i), x)] = p.coefAt(i)
	}
	return out
}

func qTrim(a qpoly) qpoly {
	for len(a) > 0 && a[len(a)-1].Sign() == 0 {
		a = a[:len(a)-1]
	}
	return a
}

func qMul(a, b qpoly) qpoly {
	if len(a) == 0 || len(b) == 0 {
		return nil
	}
	out := make(qpoly, len(a)+len(b)-1)
	for i := range out {
		out[i] = new(big.Rat)
	}
	t := new(big.Rat)
	for i, x := range a {
		for j, y := range b {
			out[i+j].Add(out[i+j], t.Mul(x, y))
		}
	}
	return qTrim(out)
}

// qDivMod returns the quotient and remainder of a by a nonzero b.
func qDivMod(a, b qpoly) (qpoly, qpoly) {
	r := make(qpoly, len(a))
	for i, c := range a {
		r[i] = new(big.Rat).Set(c)
	}
	if len(r) < len(b) {
		return nil, r
	}
	q := make(qpoly, len(r)-len(b)+1)
	lb := b[len(b)-1]
	t := new(big.Rat)
	for k := len(q) - 1; k >= 0; k-- {
		c := new(big.Rat).Quo(r[k+len(b)-1], lb)
		q[k] = c
		for j, y := range b {
			r[k+j].Sub(r[k+j], t.Mul(c, y))
		}
	}
	return qTrim(q), qTrim(r[:len(b)-1])
}

func qRem(a, b qpoly) qpoly {
	_, r := qDivMod(a, b)
	return r
}

// qInvMod returns the inverse of a modulo m, a and m coprime (extended
// Euclid).
func qInvMod(a, m qpoly) qpoly {
	r0, r1 := m, qRem(a, m)
	s0, s1 := qpoly(nil), qpoly{big.NewRat(1, 1)}
	for len(r1) > 1 {
		q, r := qDivMod(r0, r1)
		r0, r1 = r1, r
		s0, s1 = s1, qSub(s0, qMul(q, s1))
	}
	// r1 is a nonzero constant (coprime inputs): scale s1 by its inverse.
	if len(r1) == 0 {
		panic("exact: internal error: the images of the factors are not coprime")
	}
	inv := new(big.Rat).Inv(r1[0])
	out := make(qpoly, len(s1))
	for i, c := range s1 {
		out[i] = new(big.Rat).Mul(c, inv)
	}
	return qRem(out, m)
}

func qSub(a, b qpoly) qpoly {
	out := make(qpoly, max(len(a), len(b)))
	for i := range out {
		out[i] = new(big.Rat)
		if i < len(a) {
			out[i].Set(a[i])
		}
		if i < len(b) {
			out[i].Sub(out[i], b[i])
		}
	}
	return qTrim(out)
}

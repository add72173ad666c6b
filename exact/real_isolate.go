package exact

// Real root isolation of integer polynomials, and the certified reals that
// are roots of them.
//
// # Isolation
//
// The Vincent–Collins–Akritas bisection (G. E. Collins, A. G. Akritas,
// "Polynomial real root isolation using Descartes' rule of signs", SYMSAC
// 1976): for a square-free q, the number of sign variations in the
// coefficients of (x+1)^n·q(1/(x+1)) bounds the number of roots of q in
// the open interval (0, 1) and equals it when it is 0 or 1 (the two-circle
// theorem; Obreschkoff). So (0, 1) is bisected, the halves rescaled to
// (0, 1) exactly (2^n·q(y/2), then a Taylor shift by 1), until every piece
// has count 0 or 1; a midpoint where q vanishes is a rational root, kept
// exactly. Positive roots lie below Cauchy's bound 1 + max|a_i/a_n| ≤ 2^b,
// so p(2^b·y) on (0, 1) finds them all; negative ones are those of p(−x).
// All arithmetic is on integers: no rounding anywhere.
//
// # The root as a certified real
//
// A root node holds an irreducible (or at least square-free) integer
// polynomial p and an isolating interval (lo, hi) with exactly one root α
// in it; its enclosure is refined by bisection with the exact sign of p at
// each rational midpoint (p has one sign on (lo, α) and the other on
// (α, hi), since α is a simple root). Its zero-bound bookkeeping is at the
// top of real_algebraic.go.

import (
	"fmt"
	"math/big"
	"slices"
	"strings"
)

// algRoot is the data of a root node: the root of p (integer coefficients,
// lowest degree first, square-free, no rational root) in (lo, hi).
type algRoot struct {
	p        []*big.Int
	lo0, hi0 *big.Rat // the isolating interval as found, for printing
	lc, hc   *big.Int // the current interval (lc/2^k, hc/2^k), under the node's mutex
	k        uint
	sLo      int // the sign of p on (lo, α)
}

// isoRoot is one isolated root: the exact rational when exact, otherwise
// an open interval (lo, hi) holding exactly one root.
type isoRoot struct {
	lo, hi *big.Rat
	exact  bool
}

// signAt returns the sign of p(r), exactly: Σ a_i·n^i·d^(n−i) by Horner.
func signAt(p []*big.Int, r *big.Rat) int {
	n := len(p) - 1
	num, den := r.Num(), r.Denom()
	v := new(big.Int).Set(p[n])
	dp := big.NewInt(1)
	t := new(big.Int)
	for i := n - 1; i >= 0; i-- {
		dp.Mul(dp, den)
		v.Mul(v, num)
		v.Add(v, t.Mul(p[i], dp))
	}
	return v.Sign()
}

// derivative returns p' (dense, lowest degree first).
func derivative(p []*big.Int) []*big.Int {
	if len(p) <= 1 {
		return []*big.Int{new(big.Int)}
	}
	d := make([]*big.Int, len(p)-1)
	for i := range d {
		d[i] = new(big.Int).Mul(p[i+1], big.NewInt(int64(i+1)))
	}
	return d
}

// taylorShift1 returns q(x+1), in place on a copy (O(n²) additions).
func taylorShift1(q []*big.Int) []*big.Int {
	a := make([]*big.Int, len(q))
	for i := range q {
		a[i] = new(big.Int).Set(q[i])
	}
	n := len(a) - 1
	for i := 0; i < n; i++ {
		for j := n - 1; j >= i; j-- {
			a[j].Add(a[j], a[j+1])
		}
	}
	return a
}

// descartes01 returns the sign variations of (x+1)^n·q(1/(x+1)): a bound
// on the roots of q in (0, 1), exact when it is 0 or 1.
func descartes01(q []*big.Int) int {
	r := slices.Clone(q)
	slices.Reverse(r)
	a := taylorShift1(r)
	v, last := 0, 0
	for _, c := range a {
		if s := c.Sign(); s != 0 {
			if last != 0 && s != last {
				v++
			}
			last = s
		}
	}
	return v
}

// isolatePositive isolates the positive roots of the square-free p with
// p(0) ≠ 0, in increasing order.
func isolatePositive(p []*big.Int) []isoRoot {
	n := len(p) - 1
	if n < 1 {
		return nil
	}
	an := new(big.Int).Abs(p[n])
	mx := 0
	for _, c := range p[:n] {
		mx = max(mx, c.BitLen())
	}
	b := max(1, mx-an.BitLen()+2) // 2^b ≥ 1 + max|a_i|/|a_n| (Cauchy)
	q := make([]*big.Int, n+1)
	for i := range p {
		q[i] = new(big.Int).Lsh(p[i], uint(b*i))
	}
	var out []isoRoot
	// interval of q: (c/2^k, (c+1)/2^k) in y, x = 2^b·y.
	at := func(c *big.Int, k int) *big.Rat {
		r := new(big.Rat).SetInt(c)
		sh := b - k
		if sh >= 0 {
			return r.Mul(r, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(sh))))
		}
		return r.Quo(r, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(-sh))))
	}
	var rec func(q []*big.Int, c *big.Int, k int)
	rec = func(q []*big.Int, c *big.Int, k int) {
		switch descartes01(q) {
		case 0:
			return
		case 1:
			out = append(out, isoRoot{lo: at(c, k), hi: at(new(big.Int).Add(c, big.NewInt(1)), k)})
			return
		}
		// qL(y) = 2^n·q(y/2) on the left half; qR(y) = qL(y+1).
		l := make([]*big.Int, n+1)
		for i := range q {
			l[i] = new(big.Int).Lsh(q[i], uint(n-i))
		}
		c2 := new(big.Int).Lsh(c, 1)
		rec(l, c2, k+1)
		r := taylorShift1(l)
		if r[0].Sign() == 0 { // q(1/2) = 0: a rational root
			m := at(new(big.Int).Add(c2, big.NewInt(1)), k+1)
			out = append(out, isoRoot{lo: m, hi: m, exact: true})
		}
		rec(r, new(big.Int).Add(c2, big.NewInt(1)), k+1)
	}
	rec(q, new(big.Int), 0)
	return out
}

// isolateRealRoots returns the real roots of the square-free integer
// polynomial p, in increasing order, each exact or in an isolating open
// interval with rational endpoints.
func isolateRealRoots(p []*big.Int) []isoRoot {
	for len(p) > 1 && p[len(p)-1].Sign() == 0 {
		p = p[:len(p)-1]
	}
	var zero []isoRoot
	if len(p) > 1 && p[0].Sign() == 0 { // square-free: x divides p once
		p = p[1:]
		zero = []isoRoot{{lo: new(big.Rat), hi: new(big.Rat), exact: true}}
	}
	neg := make([]*big.Int, len(p))
	for i, c := range p {
		neg[i] = new(big.Int).Set(c)
		if i%2 == 1 {
			neg[i].Neg(neg[i])
		}
	}
	var out []isoRoot
	ns := isolatePositive(neg)
	for i := len(ns) - 1; i >= 0; i-- {
		r := ns[i]
		out = append(out, isoRoot{lo: new(big.Rat).Neg(r.hi), hi: new(big.Rat).Neg(r.lo), exact: r.exact})
	}
	out = append(out, zero...)
	return append(out, isolatePositive(p)...)
}

// realAlgRoot returns the root of p in the isolating interval (lo, hi):
// p square-free with integer coefficients, exactly one root in the open
// interval, and that root not rational (rational roots are returned as
// rationals by the callers).
func realAlgRoot(p []*big.Int, lo, hi *big.Rat) *Real {
	s := signAt(p, lo)
	if s == 0 { // lo is another (simple) root: p' gives the sign just right of it
		s = signAt(derivative(p), lo)
	}
	c := make([]*big.Int, len(p))
	for i := range p {
		c[i] = new(big.Int).Set(p[i])
	}
	// The endpoints are dyadic (isolation bisects from powers of 2); a
	// common power-of-2 denominator keeps bisection free of gcds.
	k := uint(max(lo.Denom().BitLen(), hi.Denom().BitLen()) - 1)
	scale := func(r *big.Rat) *big.Int {
		n := new(big.Int).Lsh(r.Num(), k)
		return n.Quo(n, r.Denom())
	}
	return &Real{op: opAlgRoot, ar: &algRoot{p: c, lo0: lo, hi0: hi, lc: scale(lo), hc: scale(hi), k: k, sLo: s}}
}

// signAtDyadic returns the sign of p(m/2^k): Σ a_i·m^i·2^(k(n−i)).
func signAtDyadic(p []*big.Int, m *big.Int, k uint) int {
	n := len(p) - 1
	v := new(big.Int).Set(p[n])
	t := new(big.Int)
	for i := n - 1; i >= 0; i-- {
		v.Mul(v, m)
		v.Add(v, t.Lsh(p[i], k*uint(n-i)))
	}
	return v.Sign()
}

// refine bisects the interval until it is at most 2^-p wide (called under
// the node's mutex) and returns it, rounded outward to precision p.
func (a *algRoot) refine(p uint) ival {
	if p > 128 {
		a.bisect(64)
		a.newton(p)
	}
	a.bisect(p)
	den := new(big.Int).Lsh(big.NewInt(1), a.k)
	return ival{fDown(p).SetRat(new(big.Rat).SetFrac(a.lc, den)), fUp(p).SetRat(new(big.Rat).SetFrac(a.hc, den))}
}

// newton tries to narrow the interval to width 2^-(p+1) at once: Newton's
// iteration in floating point from the midpoint, doubling the precision,
// gives a guess c/2^K; the interval ((c−1)/2^K, (c+1)/2^K) is kept only
// when it lies inside the current one and p changes sign across it in the
// known direction, checked exactly: then it holds a root (intermediate
// values), and that root is α, the only one in the isolating interval.
// Otherwise nothing changes and bisection does the work.
func (a *algRoot) newton(p uint) {
	K := p + 1
	if a.k >= K {
		return
	}
	prec := uint(64)
	x := new(big.Float).SetPrec(prec).SetInt(new(big.Int).Add(a.lc, a.hc))
	x.SetMantExp(x, -int(a.k)-1)
	d := derivative(a.p)
	horner := func(c []*big.Int, x *big.Float) *big.Float {
		v := new(big.Float).SetPrec(x.Prec()).SetInt(c[len(c)-1])
		for i := len(c) - 2; i >= 0; i-- {
			v.Mul(v, x)
			v.Add(v, new(big.Float).SetPrec(x.Prec()).SetInt(c[i]))
		}
		return v
	}
	for {
		prec = min(2*prec, K+64)
		x.SetPrec(prec)
		for range 2 {
			fd := horner(d, x)
			if fd.Sign() == 0 {
				return
			}
			x.Sub(x, new(big.Float).SetPrec(prec).Quo(horner(a.p, x), fd))
		}
		if prec == K+64 {
			break
		}
	}
	c, _ := new(big.Float).SetMantExp(x, int(K)).Int(nil)
	lo, hi := new(big.Int).Sub(c, big.NewInt(1)), new(big.Int).Add(c, big.NewInt(1))
	sh := K - a.k
	if lo.Cmp(new(big.Int).Lsh(a.lc, sh)) < 0 || hi.Cmp(new(big.Int).Lsh(a.hc, sh)) > 0 {
		return
	}
	if signAtDyadic(a.p, lo, K) != a.sLo || signAtDyadic(a.p, hi, K) != -a.sLo {
		return
	}
	a.lc, a.hc, a.k = lo, hi, K
}

// bisect halves the interval until it is at most 2^-p wide.
func (a *algRoot) bisect(p uint) {
	w := new(big.Int)
	// The width (hc − lc)/2^k is at most 2^-p once k ≥ p and hc − lc ≤ 2^(k−p).
	for a.k < p || w.Sub(a.hc, a.lc).Cmp(new(big.Int).Lsh(big.NewInt(1), a.k-p)) > 0 {
		a.lc.Lsh(a.lc, 1)
		a.hc.Lsh(a.hc, 1)
		a.k++
		m := new(big.Int).Add(a.lc, a.hc)
		m.Rsh(m, 1)
		switch s := signAtDyadic(a.p, m, a.k); {
		case s == 0: // cannot happen for an irrational root; exact if it does
			a.lc, a.hc = m, new(big.Int).Set(m)
		case s == a.sLo:
			a.lc = m
		default:
			a.hc = m
		}
	}
}

// algRootInfo is the BFMSS bookkeeping of a root of p (real_algebraic.go):
// u = |a_n| + max_{i<n} |a_i|, l = |a_n|, bits rounded up.
func algRootInfo(p []*big.Int) algInfo {
	n := len(p) - 1
	an := new(big.Int).Abs(p[n])
	mx := new(big.Int)
	for _, c := range p[:n] {
		if c.CmpAbs(mx) > 0 {
			mx.Abs(c)
		}
	}
	return algInfo{ok: true, lu: int64(mx.Add(mx, an).BitLen()), ll: int64(an.BitLen())}
}

// rootOfPrefix opens the printed form of a root node.
const rootOfPrefix = "[root of "

// ClosedFormIsCode reports whether a closed form is cell code that
// rebuilds the value: it is, unless it names a root of a polynomial by its
// isolating interval (text() below), which no cell can read back.
func ClosedFormIsCode(form string) bool { return !strings.Contains(form, rootOfPrefix) }

// text prints a root node as "[root of 2t^3 - t + 1 in (a, b)]": words
// and ^, so it cannot be read as cell code.
func (a *algRoot) text() string {
	var sb strings.Builder
	sb.WriteString(rootOfPrefix)
	first := true
	for i := len(a.p) - 1; i >= 0; i-- {
		c := a.p[i]
		if c.Sign() == 0 {
			continue
		}
		abs := new(big.Int).Abs(c)
		switch {
		case first && c.Sign() < 0:
			sb.WriteString("-")
		case !first && c.Sign() < 0:
			sb.WriteString(" - ")
		case !first:
			sb.WriteString(" + ")
		}
		first = false
		if abs.Cmp(big.NewInt(1)) != 0 || i == 0 {
			sb.WriteString(abs.String())
		}
		switch {
		case i == 1:
			sb.WriteString("t")
		case i > 1:
			fmt.Fprintf(&sb, "t^%d", i)
		}
	}
	fmt.Fprintf(&sb, " in (%s, %s)]", FormatRat(a.lo0), FormatRat(a.hi0))
	return sb.String()
}

// RealRoots returns the distinct real roots of a univariate polynomial over
// Q in increasing order: rationals exactly, the others as roots of their
// irreducible factor in an isolating interval (certified reals with an
// exact zero test). p must be non-zero in at most one variable; a constant
// has no roots. Factorization past its search cap falls back to the
// square-free parts (the roots are then still exact, only their
// polynomials not known irreducible). maxPrec caps the precision used to
// order roots of different factors.
func RealRoots(p *Poly, maxPrec uint) ([]*Real, error) {
	if p.IsZero() {
		return nil, fmt.Errorf("the zero polynomial vanishes everywhere: %w", ErrDomain)
	}
	vs := p.Vars()
	if len(vs) > 1 {
		return nil, fmt.Errorf("real roots need a polynomial in one variable, this one has %d: %w", len(vs), ErrDomain)
	}
	if len(vs) == 0 {
		return nil, nil
	}
	v := vs[0]
	var parts []*Poly
	if f, err := p.Factor(); err == nil {
		for _, fp := range f.Factors {
			parts = append(parts, fp.Factor)
		}
	} else {
		_, sf, err := p.SquareFree()
		if err != nil {
			return nil, err
		}
		for _, fp := range sf {
			parts = append(parts, fp.Factor)
		}
	}
	var out []*Real
	for _, f := range parts {
		a := toDense(f.PrimitivePart(), v)
		switch len(a) {
		case 2:
			out = append(out, RealFromRat(new(big.Rat).SetFrac(new(big.Int).Neg(a[0]), a[1])))
			continue
		case 3:
			out = append(out, quadraticRoots(a)...)
			continue
		}
		for _, r := range isolateRealRoots(a) {
			if r.exact {
				out = append(out, RealFromRat(r.lo))
			} else {
				out = append(out, realAlgRoot(a, r.lo, r.hi))
			}
		}
	}
	var cmpErr error
	slices.SortStableFunc(out, func(x, y *Real) int {
		c, err := RealCmp(x, y, maxPrec)
		if err != nil && cmpErr == nil {
			cmpErr = err
		}
		return c
	})
	if cmpErr != nil {
		return nil, fmt.Errorf("ordering the roots: %w", cmpErr)
	}
	return out, nil
}

// quadraticRoots returns the real roots of the irreducible c + b·t + a·t²
// (a > 0, as factors come) by the quadratic formula, (−b ∓ √(b² − 4ac))/(2a),
// smaller first: radicals print in closed form and need no interval.
func quadraticRoots(p []*big.Int) []*Real {
	c, b, a := p[0], p[1], p[2]
	d := new(big.Int).Mul(b, b)
	d.Sub(d, new(big.Int).Mul(big.NewInt(4), new(big.Int).Mul(a, c)))
	if d.Sign() < 0 {
		return nil
	}
	sq := RealSqrt(RealFromRat(new(big.Rat).SetInt(d)))
	mb := RealFromRat(new(big.Rat).SetInt(new(big.Int).Neg(b)))
	den := RealFromRat(new(big.Rat).SetInt(new(big.Int).Lsh(a, 1)))
	lo, hi := RealQuo(RealSub(mb, sq), den), RealQuo(RealAdd(mb, sq), den)
	if a.Sign() < 0 {
		lo, hi = hi, lo
	}
	return []*Real{lo, hi}
}

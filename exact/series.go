package exact

// Truncated Puiseux series in one variable t, for t → 0⁺.
//
// A Series is Σ c_i·t^((val+i)/den) + O(t^(ord/den)): exponents are
// multiples of 1/den, the coefficients are certified reals (rationals
// while they can be), and the error term is tracked through every
// operation, so a printed series never claims a coefficient it does not
// know:
//
//   - a + b is known to the lower of the two orders;
//   - a·b to min(ord(a) + val(b), ord(b) + val(a));
//   - a^α (α rational: 1/b, roots, powers) keeps the relative precision
//     ord(a) − val(a): a = c·t^v·(1 + u) with u known to O(t^(ord−v)), so
//     (1 + u)^α is too, and the result is known to O(t^(α·v + ord − v)).
//     Dividing by a series with positive valuation v therefore loses v
//     orders: sin(t)/t is known to one order less than sin(t);
//   - exp, log, sin, cos and acos of a series with a finite value at 0
//     keep its absolute order.
//
// Only constants are exact (no error term); the variable itself is
// t + O(t^order), a true statement that lets products and quotients
// truncate instead of growing without end.
//
// The coefficient recurrences are the classical ones for power series
// (Euler's for powers, J. C. P. Miller's form, as in Knuth, TAOCP vol. 2,
// §4.7; the logarithmic-derivative recurrences for exp, log, sin and cos):
// each coefficient is a finite exact combination of earlier ones, O(n²)
// for n terms. Whether a coefficient is zero is decided exactly (a
// rational; an algebraic real by its zero bound) or by an enclosure that
// excludes 0; an undecided one is an error, never a guess.

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strings"
)

// Errors of series expansion.
var (
	// ErrSeriesUndetermined reports a series whose leading term is not
	// known within its order, where the operation needs it (dividing by
	// O(t^k), a root of it).
	ErrSeriesUndetermined = errors.New("leading term not determined within the order")
	// ErrEssentialSingularity reports exp, sin or cos of a series that
	// tends to infinity (exp(1/t) at 0): no Puiseux series exists.
	ErrEssentialSingularity = errors.New("essential singularity")
	// ErrBranchPoint reports a root that no real branch continues at the
	// expansion point (an even root of a series with negative leading
	// coefficient), and log of a series tending to 0 or infinity.
	ErrBranchPoint = errors.New("branch point")
)

// seriesExact is the order of an exact series (a constant).
const seriesExact = math.MaxInt32

// MaxSeriesTerms bounds the number of terms an operation computes, so a
// request cannot swamp memory.
const MaxSeriesTerms = 4096

// maxSeriesDen bounds the exponent grid 1/den (roots of high index, and
// sums of series on unrelated grids, refine it).
const maxSeriesDen = 1 << 12

// commonDen is the grid both a and b lie on, refused when too fine.
func commonDen(a, b int) (int, error) {
	d := lcm(a, b)
	if d > maxSeriesDen {
		return 0, fmt.Errorf("exponents on the grid 1/%d (finer than 1/%d): %w", d, maxSeriesDen, ErrTooManyTerms)
	}
	return d, nil
}

// Series is a truncated Puiseux series in t as t → 0⁺ (see the top of
// this file). It is immutable.
type Series struct {
	den int     // exponents are multiples of 1/den
	val int     // exponent of c[0], in units of 1/den (= ord when c is empty)
	c   []*Real // c[i] is the coefficient of t^((val+i)/den); c[0] ≠ 0
	ord int     // error term O(t^(ord/den)); seriesExact for a constant
	cap uint    // precision cap for deciding whether a coefficient is zero
}

// SeriesVar returns t + O(t^order), the variable of an expansion with
// absolute order order ≥ 2. maxPrec caps the precision spent deciding
// whether a coefficient is zero.
func SeriesVar(order int, maxPrec uint) *Series {
	return &Series{den: 1, val: 1, c: []*Real{RealFromInt(1)}, ord: max(order, 2), cap: maxPrec}
}

// SeriesReciprocalVar returns 1/s + O(s^order): t = 1/s, the variable of
// an expansion as t → infinity.
func SeriesReciprocalVar(order int, maxPrec uint) *Series {
	return &Series{den: 1, val: -1, c: []*Real{RealFromInt(1)}, ord: max(order, 2), cap: maxPrec}
}

// Truncate returns s with the terms from t^order on dropped into the error
// term (s itself when it is known to less).
func (s *Series) Truncate(order int) *Series {
	if s.Exact() || s.ord <= order*s.den {
		return s
	}
	o := order * s.den
	c := s.c
	if s.val+len(c) > o {
		c = c[:max(o-s.val, 0)]
	}
	val := s.val
	if len(c) == 0 {
		val = o
	}
	return &Series{den: s.den, val: val, c: c, ord: o, cap: s.cap}
}

// SeriesConst returns the exact constant x.
func SeriesConst(x *Real, maxPrec uint) *Series {
	if q, ok := x.Rat(); ok && q.Sign() == 0 {
		return &Series{den: 1, val: seriesExact, ord: seriesExact, cap: maxPrec}
	}
	return &Series{den: 1, c: []*Real{x}, ord: seriesExact, cap: maxPrec}
}

// Exact reports whether s is a constant, with no error term.
func (s *Series) Exact() bool { return s.ord == seriesExact }

// Leading returns the leading term c·t^(num/den), ok false when no
// coefficient is known to be non-zero within the order.
func (s *Series) Leading() (c *Real, exp *big.Rat, ok bool) {
	if len(s.c) == 0 {
		return nil, nil, false
	}
	return s.c[0], big.NewRat(int64(s.val), int64(s.den)), true
}

// LeadingSign returns the sign of the leading coefficient, which is the
// sign of the series' value near the expansion point; ok is false when
// no term is known within the order.
func (s *Series) LeadingSign() (sign int, ok bool, err error) {
	if len(s.c) == 0 {
		return 0, false, nil
	}
	sign, err = s.c[0].Sign(s.cap)
	return sign, err == nil, err
}

// Order returns k of the error term O(t^k); ok is false for a constant.
func (s *Series) Order() (*big.Rat, bool) {
	if s.Exact() {
		return nil, false
	}
	return big.NewRat(int64(s.ord), int64(s.den)), true
}

// Terms returns the known coefficients that are not zero and their
// exponents. Whether a coefficient is zero is decided as for a leading
// one (exactly, by the zero bound, or by an enclosure); an undecided one
// is an error.
func (s *Series) Terms() (coefs []*Real, exps []*big.Rat, err error) {
	for i, c := range s.c {
		e := big.NewRat(int64(s.val+i), int64(s.den))
		if !isZeroRat(c) && c.exact == nil {
			sign, err := c.Sign(s.cap)
			if err != nil {
				return nil, nil, fmt.Errorf("cannot decide whether the coefficient of t^%s is zero: %w", FormatRat(e), err)
			}
			if sign == 0 {
				continue
			}
		}
		if isZeroRat(c) {
			continue
		}
		coefs = append(coefs, c)
		exps = append(exps, e)
	}
	return coefs, exps, nil
}

// lift returns s's coefficients on the exponent grid 1/d (d a multiple
// of s.den) as a map from exponent to coefficient, with val and ord.
func (s *Series) lift(d int) (val, ord int, c []*Real) {
	m := d / s.den
	ord = s.ord
	if s.ord != seriesExact {
		ord = s.ord * m
	}
	if len(s.c) == 0 {
		return ord, ord, nil
	}
	val = s.val * m
	c = make([]*Real, (len(s.c)-1)*m+1)
	for i := range c {
		c[i] = realZero
	}
	for i, x := range s.c {
		c[i*m] = x
	}
	return val, ord, c
}

var realZero = RealFromInt(0)

func lcm(a, b int) int { return a / gcdInt(a, b) * b }

// addOrd adds exponents, keeping seriesExact absorbing.
func addOrd(a, b int) int {
	if a == seriesExact || b == seriesExact {
		return seriesExact
	}
	return a + b
}

// seriesNormal makes a series with c[0] ≠ 0: leading coefficients that are zero
// are dropped, and a coefficient whose zeroness cannot be decided within
// the cap is an error (a guess could make a wrong leading term).
func seriesNormal(den, val, ord int, c []*Real, cap uint) (*Series, error) {
	for len(c) > 0 {
		sign, err := c[0].Sign(cap)
		if err != nil {
			return nil, fmt.Errorf("cannot decide whether the coefficient of t^%s is zero: %w", FormatRat(big.NewRat(int64(val), int64(den))), err)
		}
		if sign != 0 {
			break
		}
		c, val = c[1:], val+1
	}
	if ord != seriesExact && val+len(c) > ord {
		c = c[:max(ord-val, 0)]
	}
	if len(c) == 0 {
		val = ord
	}
	if len(c) > MaxSeriesTerms {
		return nil, fmt.Errorf("a series of more than %d terms: %w", MaxSeriesTerms, ErrTooManyTerms)
	}
	g := den
	for i, x := range c {
		if q, ok := x.Rat(); !ok || q.Sign() != 0 {
			g = stepGcd(g, i)
		}
	}
	if ord != seriesExact {
		g = stepGcd(g, ord)
	}
	if len(c) > 0 {
		g = stepGcd(g, val)
	}
	if g > 1 { // fewer exponent steps: t^(2/2) is t
		cc := make([]*Real, 0, len(c)/g+1)
		for i := 0; i < len(c); i += g {
			cc = append(cc, c[i])
		}
		c, den, val = cc, den/g, val/g
		if ord != seriesExact {
			ord /= g
		}
		if len(c) == 0 {
			val = ord
		}
	}
	return &Series{den: den, val: val, c: c, ord: ord, cap: cap}, nil
}

// stepGcd is gcd(g, |x|) for g ≥ 1.
func stepGcd(g, x int) int {
	if x < 0 {
		x = -x
	}
	return gcdInt(g, x)
}

// SeriesAdd returns a + b.
func SeriesAdd(a, b *Series) (*Series, error) { return seriesSum(a, b, addR) }

// SeriesSub returns a − b.
func SeriesSub(a, b *Series) (*Series, error) { return seriesSum(a, b, subR) }

func seriesSum(a, b *Series, op func(x, y *Real) *Real) (*Series, error) {
	d, err := commonDen(a.den, b.den)
	if err != nil {
		return nil, err
	}
	va, oa, ca := a.lift(d)
	vb, ob, cb := b.lift(d)
	ord := min(oa, ob)
	// An operand with no known term only lowers the order.
	val, end := ord, ord
	if len(ca) > 0 {
		val, end = va, va+len(ca)
	}
	if len(cb) > 0 {
		val, end = min(val, vb), vb+len(cb)
		if len(ca) > 0 {
			end = max(end, va+len(ca))
		}
	}
	if ord != seriesExact {
		end = min(end, ord)
	}
	if val >= end {
		return seriesNormal(d, ord, ord, nil, max(a.cap, b.cap))
	}
	c := make([]*Real, end-val)
	for i := range c {
		e := val + i
		x, y := coefAt(ca, va, e), coefAt(cb, vb, e)
		c[i] = op(x, y)
	}
	return seriesNormal(d, val, ord, c, max(a.cap, b.cap))
}

// coefAt is the coefficient of exponent e in c starting at val.
func coefAt(c []*Real, val, e int) *Real {
	if e < val || e-val >= len(c) {
		return realZero
	}
	return c[e-val]
}

// SeriesNeg returns −a.
func SeriesNeg(a *Series) *Series {
	c := make([]*Real, len(a.c))
	for i, x := range a.c {
		c[i] = RealNeg(x)
	}
	return &Series{den: a.den, val: a.val, c: c, ord: a.ord, cap: a.cap}
}

// SeriesMul returns a·b.
func SeriesMul(a, b *Series) (*Series, error) {
	d, err := commonDen(a.den, b.den)
	if err != nil {
		return nil, err
	}
	va, oa, ca := a.lift(d)
	vb, ob, cb := b.lift(d)
	cap := max(a.cap, b.cap)
	ord := min(addOrd(oa, vb), addOrd(ob, va))
	if len(ca) == 0 || len(cb) == 0 {
		return seriesNormal(d, ord, ord, nil, cap)
	}
	val := va + vb
	end := val + len(ca) + len(cb) - 1
	if ord != seriesExact {
		end = min(end, ord)
	}
	if end-val > MaxSeriesTerms {
		return nil, fmt.Errorf("a series of more than %d terms: %w", MaxSeriesTerms, ErrTooManyTerms)
	}
	c := make([]*Real, max(end-val, 0))
	for k := range c {
		var sum *Real
		for i := max(0, k-len(cb)+1); i <= k && i < len(ca); i++ {
			if isZeroRat(ca[i]) || isZeroRat(cb[k-i]) {
				continue
			}
			p := mulR(ca[i], cb[k-i])
			if sum == nil {
				sum = p
			} else {
				sum = addR(sum, p)
			}
		}
		if sum == nil {
			sum = realZero
		}
		c[k] = sum
	}
	// The leading coefficient is a product of non-zero ones: no test needed.
	return seriesNormal(d, val, ord, c, cap)
}

func isZeroRat(x *Real) bool { return x.exact != nil && x.exact.Sign() == 0 }

func isOneRat(x *Real) bool { return x.exact != nil && x.exact.Cmp(ratOne) == 0 }

var ratOne = big.NewRat(1, 1)

// mulR is x·y with the products by an exact 0 or 1 folded, so that a
// coefficient that is zero by construction stays a rational zero (sin 0·x
// would otherwise be a Real only an enclosure could tell from 0).
func mulR(x, y *Real) *Real {
	switch {
	case isZeroRat(x) || isZeroRat(y):
		return realZero
	case isOneRat(x):
		return y
	case isOneRat(y):
		return x
	}
	return RealMul(x, y)
}

// addR is x + y with an exact 0 folded.
func addR(x, y *Real) *Real {
	switch {
	case isZeroRat(x):
		return y
	case isZeroRat(y):
		return x
	}
	return RealAdd(x, y)
}

// subR is x − y with an exact 0 folded.
func subR(x, y *Real) *Real {
	if isZeroRat(y) {
		return x
	}
	return RealSub(x, y)
}

// relative is the relative precision of s: the number of terms of u in
// c·t^v·(1 + u) that are known.
func (s *Series) relative() (n int) {
	if s.Exact() {
		return len(s.c)
	}
	return s.ord - s.val
}

// SeriesPow returns a^(p/q), q ≥ 1, p/q in lowest terms: for t → 0⁺ and
// a = c·t^v·(1 + u), the branch c^(p/q)·t^(v·p/q)·(1 + u)^(p/q), where
// c^(1/q) is the positive root of a positive c, and the real (negative)
// root of a negative c when q is odd. A negative c under an even root is
// ErrBranchPoint: no real branch continues there.
func SeriesPow(a *Series, p, q int) (*Series, error) {
	if q < 1 || p == 0 {
		if p == 0 {
			return SeriesConst(RealFromInt(1), a.cap), nil
		}
		return nil, fmt.Errorf("power with denominator %d: %w", q, ErrDomain)
	}
	if len(a.c) == 0 {
		if a.Exact() {
			if p < 0 {
				return nil, fmt.Errorf("a power %d/%d of 0: %w", p, q, ErrDivisionByZero)
			}
			return a, nil
		}
		if p > 0 && q == 1 {
			// |a| ≤ C·t^k gives |a^p| ≤ C^p·t^(k·p).
			return &Series{den: a.den, val: a.ord * p, ord: a.ord * p, cap: a.cap}, nil
		}
		return nil, fmt.Errorf("%s has no known term: %w (raise the order)", a.String("t"), ErrSeriesUndetermined)
	}
	c0 := a.c[0]
	sign, err := c0.Sign(a.cap)
	if err != nil {
		return nil, err
	}
	if sign < 0 && q%2 == 0 {
		lead, _ := c0.Text(8, a.cap)
		return nil, fmt.Errorf("%s root of a series whose leading coefficient %s is negative: the radicand is negative just past the expansion point (approached from above), which is a %w with no real branch to follow (series take the positive root of a positive leading coefficient, and the real root under odd roots)", ordinal(q), lead, ErrBranchPoint)
	}
	b0 := RealPowInt(RealRoot(c0, q), p)
	if a.Exact() && len(a.c) == 1 && a.val == 0 {
		return SeriesConst(b0, a.cap), nil
	}
	n := a.relative()
	if a.Exact() {
		return nil, fmt.Errorf("a power of an exact series of several terms: %w", ErrSeriesUndetermined)
	}
	// When q divides v·p the result stays on a's grid; else it moves to
	// the grid 1/(den·q), with q − 1 zeros between the relative terms.
	onGrid := (a.val*p)%q == 0
	if n > MaxSeriesTerms || !onGrid && (n-1)*q+1 > MaxSeriesTerms {
		return nil, fmt.Errorf("a series of more than %d terms: %w", MaxSeriesTerms, ErrTooManyTerms)
	}
	if _, err := commonDen(a.den*q, 1); err != nil && !onGrid {
		return nil, err
	}
	b := eulerPower(a.c, big.NewRat(int64(p), int64(q)), b0, n)
	if onGrid {
		val := a.val * p / q
		return seriesNormal(a.den, val, val+n, b, a.cap)
	}
	// On the grid 1/(den·q): the exponent v/den becomes v·p/(den·q), and
	// step j of the relative series lands at v·p + j·q.
	den := a.den * q
	val := a.val * p
	c := make([]*Real, (n-1)*q+1)
	for i := range c {
		c[i] = realZero
	}
	for k, x := range b {
		c[k*q] = x
	}
	return seriesNormal(den, val, val+n*q, c, a.cap)
}

// eulerPower returns the first n coefficients of b = a^α, a power series
// with a_0 ≠ 0 (coefficients past len(a) are 0) and b_0 = a_0^α given, by
// Euler's recurrence (Knuth, TAOCP 2, §4.7):
// b_k = 1/(k·a_0) · Σ_{j=1..k} ((α+1)·j − k)·a_j·b_{k−j}.
func eulerPower(a []*Real, alpha *big.Rat, b0 *Real, n int) []*Real {
	inv := RealQuo(RealFromInt(1), a[0])
	b := make([]*Real, n)
	b[0] = b0
	for k := 1; k < n; k++ {
		var sum *Real
		for j := 1; j <= k && j < len(a); j++ {
			if isZeroRat(a[j]) {
				continue
			}
			w := new(big.Rat).Add(alpha, big.NewRat(1, 1))
			w.Mul(w, big.NewRat(int64(j), 1))
			w.Sub(w, big.NewRat(int64(k), 1))
			if w.Sign() == 0 {
				continue
			}
			t := mulR(RealFromRat(w), mulR(a[j], b[k-j]))
			if sum == nil {
				sum = t
			} else {
				sum = addR(sum, t)
			}
		}
		if sum == nil {
			b[k] = realZero
			continue
		}
		b[k] = mulR(mulR(sum, inv), RealFromRat(big.NewRat(1, int64(k))))
	}
	return b
}

func ordinal(q int) string {
	switch q {
	case 2:
		return "square"
	case 3:
		return "cube"
	}
	return fmt.Sprintf("%d-th", q)
}

// SeriesQuo returns a / b.
func SeriesQuo(a, b *Series) (*Series, error) {
	if len(b.c) == 0 && b.Exact() {
		return nil, fmt.Errorf("series division: %w", ErrDivisionByZero)
	}
	inv, err := SeriesPow(b, -1, 1)
	if err != nil {
		return nil, err
	}
	return SeriesMul(a, inv)
}

// split returns the constant term of a series with a finite value at 0 and
// the coefficients u_1, u_2, … of the rest, u_j at exponent j/den, known
// below ord; fn names the function for the error of a series that tends
// to infinity.
func (a *Series) split(fn string) (c0 *Real, u []*Real, err error) {
	if len(a.c) > 0 && a.val < 0 {
		return nil, nil, fmt.Errorf("%s of a series that tends to infinity (leading term t^%s): %w at the expansion point; no Puiseux series exists", fn, FormatRat(big.NewRat(int64(a.val), int64(a.den))), ErrEssentialSingularity)
	}
	if !a.Exact() && a.ord <= 0 {
		return nil, nil, fmt.Errorf("%s of %s, whose value at the expansion point is not known: %w (raise the order)", fn, a.String("t"), ErrSeriesUndetermined)
	}
	c0 = realZero
	n := len(a.c) + a.val
	if !a.Exact() {
		n = a.ord
	}
	if n > MaxSeriesTerms {
		return nil, nil, fmt.Errorf("a series of more than %d terms: %w", MaxSeriesTerms, ErrTooManyTerms)
	}
	u = make([]*Real, n)
	for j := range u {
		u[j] = coefAt(a.c, a.val, j)
	}
	c0, u[0] = u[0], realZero
	return c0, u, nil
}

// fromCoefs makes the series Σ b_j t^(j/den) + O(t^(ord/den)).
func (a *Series) fromCoefs(b []*Real) (*Series, error) {
	if a.Exact() {
		return seriesNormal(a.den, 0, seriesExact, b, a.cap)
	}
	return seriesNormal(a.den, 0, a.ord, b, a.cap)
}

// SeriesExp returns exp(a) for a series with a finite value at 0.
func SeriesExp(a *Series) (*Series, error) {
	c0, u, err := a.split("exp")
	if err != nil {
		return nil, err
	}
	if a.Exact() {
		return SeriesConst(RealExp(c0), a.cap), nil
	}
	// E = exp(u): E' = u'·E, so k·E_k = Σ_{j=1..k} j·u_j·E_{k−j}.
	e := make([]*Real, len(u))
	e[0] = RealFromInt(1)
	for k := 1; k < len(u); k++ {
		e[k] = derivSum(u, e, k, 1)
	}
	ec := RealExp(c0)
	for k := range e {
		e[k] = mulR(ec, e[k])
	}
	return a.fromCoefs(e)
}

// derivSum is sign/k · Σ_{j=1..k} j·u_j·v_{k−j}, the step of the
// recurrences got from a logarithmic derivative.
func derivSum(u, v []*Real, k int, sign int64) *Real {
	var sum *Real
	for j := 1; j <= k; j++ {
		if isZeroRat(u[j]) || isZeroRat(v[k-j]) {
			continue
		}
		t := mulR(RealFromInt(int64(j)), mulR(u[j], v[k-j]))
		if sum == nil {
			sum = t
		} else {
			sum = addR(sum, t)
		}
	}
	if sum == nil {
		return realZero
	}
	return mulR(sum, RealFromRat(big.NewRat(sign, int64(k))))
}

// SeriesLog returns log(a) for a series with a positive finite value at
// 0. A series tending to 0 or infinity has log t in its logarithm, outside
// Puiseux series: ErrBranchPoint.
func SeriesLog(a *Series) (*Series, error) {
	if len(a.c) > 0 && a.val != 0 {
		return nil, fmt.Errorf("log of a series that tends to %s (leading term t^%s): its logarithm has a log t term, which a Puiseux series cannot hold (t = 0 is a %w of log)", map[bool]string{true: "0", false: "infinity"}[a.val > 0], FormatRat(big.NewRat(int64(a.val), int64(a.den))), ErrBranchPoint)
	}
	c0, u, err := a.split("log")
	if err != nil {
		return nil, err
	}
	sign, err := c0.Sign(a.cap)
	if err != nil {
		return nil, err
	}
	if sign <= 0 {
		return nil, fmt.Errorf("log of a series whose value at the expansion point is not positive: %w", ErrDomain)
	}
	if a.Exact() {
		return SeriesConst(RealLog(c0), a.cap), nil
	}
	// With w = u/c0 and L = log(1 + w): (1 + w)·L' = w', so
	// k·L_k = k·w_k − Σ_{j=1..k−1} j·L_j·w_{k−j}.
	inv := RealQuo(RealFromInt(1), c0)
	w := make([]*Real, len(u))
	for j := range u {
		w[j] = mulR(u[j], inv)
	}
	l := make([]*Real, len(u))
	l[0] = RealLog(c0)
	for k := 1; k < len(u); k++ {
		// With w_0 = 0 the term j = k vanishes: derivSum is Σ_{j<k} j·L_j·w_{k−j}/k.
		l[k] = realZero
		l[k] = subR(w[k], derivSum(l, w, k, 1))
	}
	return a.fromCoefs(l)
}

// SeriesSin returns sin(a) for a series with a finite value at 0.
func SeriesSin(a *Series) (*Series, error) { return seriesTrig(a, "sin") }

// SeriesCos returns cos(a) for a series with a finite value at 0.
func SeriesCos(a *Series) (*Series, error) { return seriesTrig(a, "cos") }

func seriesTrig(a *Series, fn string) (*Series, error) {
	c0, u, err := a.split(fn)
	if err != nil {
		return nil, err
	}
	sc, cc := RealSin(c0), RealCos(c0)
	if a.Exact() {
		if fn == "sin" {
			return SeriesConst(sc, a.cap), nil
		}
		return SeriesConst(cc, a.cap), nil
	}
	// S = sin u, C = cos u: S' = u'·C and C' = −u'·S.
	s := make([]*Real, len(u))
	c := make([]*Real, len(u))
	s[0], c[0] = realZero, RealFromInt(1)
	for k := 1; k < len(u); k++ {
		s[k] = derivSum(u, c, k, 1)
		c[k] = derivSum(u, s, k, -1)
	}
	// sin(c0 + u) = sin c0·C + cos c0·S; cos(c0 + u) = cos c0·C − sin c0·S.
	out := make([]*Real, len(u))
	for k := range out {
		if fn == "sin" {
			out[k] = addR(mulR(sc, c[k]), mulR(cc, s[k]))
		} else {
			out[k] = subR(mulR(cc, c[k]), mulR(sc, s[k]))
		}
	}
	return a.fromCoefs(out)
}

// SeriesAcos returns acos(a) for a series whose value c0 at 0 lies in
// (−1, 1), where acos is analytic. At ±1 acos has a branch point
// (acos(1 − x) ~ √(2x)) and beyond it no real value: both are refused.
func SeriesAcos(a *Series) (*Series, error) {
	c0, u, err := a.split("acos")
	if err != nil {
		return nil, err
	}
	// h_0 = 1 − c0² must be positive.
	h0 := subR(RealFromInt(1), mulR(c0, c0))
	sign, err := h0.Sign(a.cap)
	if err != nil {
		return nil, err
	}
	if sign <= 0 {
		lead, _ := c0.Text(8, a.cap)
		if sign == 0 {
			return nil, fmt.Errorf("acos of a series whose value at the expansion point is %s: acos has a %w at ±1 (acos(1 − x) ~ √(2x), acos(−1 + x) ~ π − √(2x)), which this expansion does not follow", lead, ErrBranchPoint)
		}
		return nil, fmt.Errorf("acos of a series whose value at the expansion point is %s, outside [−1, 1]: %w", lead, ErrDomain)
	}
	if a.Exact() {
		return SeriesConst(RealAcos(c0), a.cap), nil
	}
	// y = acos(c0 + u): y' = −u'·g with g = h^(−1/2), h = 1 − (c0 + u)²,
	// so k·y_k = −Σ_{j=1..k} j·u_j·g_{k−j}; g by Euler's recurrence
	// (eulerPower) on h_k = −2c0·u_k − Σ_{j=1..k−1} u_j·u_{k−j}.
	n := len(u)
	h := make([]*Real, n)
	h[0] = h0
	for k := 1; k < n; k++ {
		x := mulR(RealFromInt(-2), mulR(c0, u[k]))
		for j := 1; j < k; j++ {
			if !isZeroRat(u[j]) && !isZeroRat(u[k-j]) {
				x = subR(x, mulR(u[j], u[k-j]))
			}
		}
		h[k] = x
	}
	g := eulerPower(h, big.NewRat(-1, 2), RealQuo(RealFromInt(1), RealSqrt(h0)), n)
	y := make([]*Real, n)
	y[0] = RealAcos(c0)
	for k := 1; k < n; k++ {
		y[k] = derivSum(u, g, k, -1)
	}
	return a.fromCoefs(y)
}

// String prints s in the variable name, e.g. "1 - 1/6*t^2 + O(t^4)":
// rational coefficients exactly, algebraic ones in closed form when short,
// others as certified digits.
func (s *Series) String(name string) string { return s.Format(name, false) }

// Format prints s in the variable name; with flip the exponents are
// negated (a series in s = 1/t printed in t).
func (s *Series) Format(name string, flip bool) string {
	coefs, exps, err := s.Terms()
	if err != nil { // print what is known, undecided zeros included
		coefs, exps = nil, nil
		for i, c := range s.c {
			if !isZeroRat(c) {
				coefs = append(coefs, c)
				exps = append(exps, big.NewRat(int64(s.val+i), int64(s.den)))
			}
		}
	}
	var b strings.Builder
	for i, c := range coefs {
		coef := coefText(c, s.cap)
		neg := strings.HasPrefix(coef, "-")
		if neg {
			coef = coef[1:]
		}
		switch {
		case b.Len() == 0 && neg:
			b.WriteString("-")
		case b.Len() > 0 && neg:
			b.WriteString(" - ")
		case b.Len() > 0:
			b.WriteString(" + ")
		}
		pow := power(name, exps[i], flip)
		switch {
		case pow == "":
			b.WriteString(coef)
		case coef == "1":
			b.WriteString(pow)
		default:
			b.WriteString(coef + "*" + pow)
		}
	}
	if !s.Exact() {
		if b.Len() > 0 {
			b.WriteString(" + ")
		}
		pow := power(name, big.NewRat(int64(s.ord), int64(s.den)), flip)
		if pow == "" {
			pow = "1"
		}
		b.WriteString("O(" + pow + ")")
	}
	if b.Len() == 0 {
		return "0"
	}
	return b.String()
}

// power prints name^r, "" for exponent 0.
func power(name string, r *big.Rat, flip bool) string {
	if flip {
		r = new(big.Rat).Neg(r)
	}
	switch {
	case r.Sign() == 0:
		return ""
	case r.IsInt() && r.Sign() > 0 && r.Num().Int64() == 1:
		return name
	case r.IsInt() && r.Sign() > 0:
		return name + "^" + r.Num().String()
	}
	return name + "^(" + FormatRat(r) + ")"
}

// coefText prints a coefficient: exact when rational, in closed form when
// algebraic and short, else 12 certified digits.
func coefText(c *Real, cap uint) string {
	if q, ok := c.Rat(); ok {
		return FormatRat(q)
	}
	if f, ok := c.ClosedForm(60); ok {
		if strings.ContainsAny(strings.TrimPrefix(f, "-"), "+- ") {
			return "(" + f + ")"
		}
		return f
	}
	t, err := c.Text(12, cap)
	if err != nil {
		return "(?)"
	}
	if strings.ContainsAny(strings.TrimPrefix(t, "-"), " ") {
		return "(" + t + ")"
	}
	return t
}

// SeriesDet is the determinant of a square matrix of series, by Laplace
// expansion along the rows with the minors of the remaining rows kept by
// column set (2^n·n products): no division, so no precision is lost to
// it, and the small matrices of geometry (Gram, Cayley–Menger) stay fast.
func SeriesDet(m [][]*Series) (*Series, error) {
	n := len(m)
	for _, row := range m {
		if len(row) != n {
			return nil, fmt.Errorf("series determinant of a non-square matrix: %w", ErrShape)
		}
	}
	if n == 0 {
		return SeriesConst(RealFromInt(1), 0), nil
	}
	if n > 12 {
		return nil, fmt.Errorf("series determinant of size %d (at most 12): %w", n, ErrShape)
	}
	// memo[cols] is the determinant of the rows n−|cols|… on the columns in cols.
	memo := map[uint]*Series{}
	var minor func(row int, cols uint) (*Series, error)
	minor = func(row int, cols uint) (*Series, error) {
		if row == n {
			return SeriesConst(RealFromInt(1), m[0][0].cap), nil
		}
		if d, ok := memo[cols]; ok {
			return d, nil
		}
		var sum *Series
		sign := 1
		for j := 0; j < n; j++ {
			if cols&(1<<j) == 0 {
				continue
			}
			e := m[row][j]
			if e.Exact() && len(e.c) == 0 {
				sign = -sign
				continue
			}
			sub, err := minor(row+1, cols&^(1<<j))
			if err != nil {
				return nil, err
			}
			p, err := SeriesMul(e, sub)
			if err != nil {
				return nil, err
			}
			if sign < 0 {
				p = SeriesNeg(p)
			}
			sign = -sign
			if sum == nil {
				sum = p
			} else if sum, err = SeriesAdd(sum, p); err != nil {
				return nil, err
			}
		}
		if sum == nil {
			sum = SeriesConst(realZero, m[0][0].cap)
		}
		memo[cols] = sum
		return sum, nil
	}
	return minor(0, 1<<n-1)
}

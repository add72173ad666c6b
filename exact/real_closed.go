package exact

// Closed forms of algebraic reals: an exact expression in the cell
// language (sqrt(128999)/12, (1 + sqrt(5))/2, 2*root(3, 3)), printed when
// it is short.
//
// Every rewrite here is an identity of positive real radicals, so the form
// is exactly equal to the value, whatever simplification is or is not
// found (the tests parse the form back and prove it equal by the zero
// bound):
//
//   - rational arithmetic is folded;
//   - a root of a rational is written over an integer radicand:
//     (a/b)^(1/k) = (a·b^(k−1))^(1/k)/b, −(|a|…) for an odd root of a
//     negative;
//   - k-th powers of small primes (below 1000), and a radicand that is a
//     perfect k-th power, are taken out: √8 = 2√2, √(1/3) = √3/3;
//     m^(1/k) = (m^(1/d))^(1/(k/d)) when m is a perfect d-th power;
//   - sums of radicals m^(1/k) with rational coefficients are collected by
//     (k, m), and products of radicals are merged over the least common
//     index: m₁^(1/k₁)·m₂^(1/k₂) = (m₁^(k/k₁)·m₂^(k/k₂))^(1/k);
//   - a division by a sum of square roots is rationalized by multiplying
//     through by conjugates (sign changes of the square roots sharing a
//     factor), kept only when the denominator becomes a non-zero rational;
//     a/d = (a·c)/(d·c) for any c ≠ 0, so this needs no theory to be exact.
//
// What does not reduce to a sum of radicals of integers (a root of a sum,
// a power of a nested root) is printed as built, with the parts that do
// reduce in their reduced form. Radicands are not factored beyond the
// small primes, so the collected form is not always the simplest
// (√(p²q) beside √q for a large prime p), only exactly equal.

import (
	"math/big"
	"sort"
	"strconv"
	"strings"
	"sync"
)

// ClosedFormMaxLen is the longest closed form String-like printing uses;
// closedMaxDigits the most digits of one integer in it. Past either, the
// certified digits say more to a reader than the form does.
const (
	ClosedFormMaxLen = 48
	closedMaxDigits  = 12
)

// Limits that keep the simplification cheap: terms in one sum, bits of a
// radicand, the root index, the exponent expanded by multiplication.
const (
	closedMaxTerms = 24
	closedMaxBits  = 2048
	closedMaxIndex = 60
	closedMaxPow   = 16
)

// radTerm is c·m^(1/k): m ≥ 1 an integer (m = 1, k = 1 for a rational c).
type radTerm struct {
	c *big.Rat
	m *big.Int
	k int
}

// radSum is a sum of radTerms with distinct (k, m), sorted, no zero c.
type radSum []radTerm

// Precedences of a printed form, lowest first.
const (
	precSum  = iota // a + b, a - b, -a
	precProd        // a*b, a/b
	precAtom        // 2, sqrt(2), (…)
)

// cform is the closed form of a node: a radSum when it reduces to one,
// else text with its precedence. tooLong marks a node with no short form.
type cform struct {
	rs      radSum
	isSum   bool
	text    string
	prec    int
	tooLong bool
}

// ClosedForm returns x as an expression in the cell language that is
// exactly equal to it, when x is algebraic (built from rationals by
// + − × ÷, integer powers, roots and roots of polynomials — the last
// printed "[root of p in (a, b)]", which is not cell code: see
// ClosedFormIsCode) and the expression is short: at most
// maxLen characters, and no integer in it longer than 12 digits. What is
// simplified, and why the form is exact, is at the top of real_closed.go.
// Ask it only of an x that has a value (an enclosure exists): a form is
// refused where the simplification shows a division by zero or an even
// root of a negative, but not every such x is recognised here.
func (x *Real) ClosedForm(maxLen int) (string, bool) {
	if !x.algebraic().ok {
		return "", false
	}
	c := &closer{maxLen: maxLen, memo: map[*Real]cform{}}
	f := c.form(x)
	if f.tooLong {
		return "", false
	}
	s := f.String()
	if len(s) > maxLen || longInteger(s) {
		return "", false
	}
	return s, true
}

// longInteger reports whether s holds a run of more than closedMaxDigits digits.
func longInteger(s string) bool {
	run := 0
	for _, r := range s {
		if r >= '0' && r <= '9' {
			run++
			if run > closedMaxDigits {
				return true
			}
		} else {
			run = 0
		}
	}
	return false
}

type closer struct {
	maxLen int
	memo   map[*Real]cform
}

func (c *closer) form(x *Real) cform {
	if f, ok := c.memo[x]; ok {
		return f
	}
	f := c.build(x)
	if !f.isSum && !f.tooLong && len(f.text) > 4*c.maxLen {
		// Text only grows from here (a shared node may be printed many
		// times over), so give up early.
		f = cform{tooLong: true}
	}
	c.memo[x] = f
	return f
}

func (c *closer) build(x *Real) cform {
	if x.exact != nil {
		return sumForm(radSum{{c: new(big.Rat).Set(x.exact), m: big.NewInt(1), k: 1}}.norm())
	}
	if x.op == opFail {
		return cform{tooLong: true}
	}
	if x.op == opAlgRoot {
		return cform{text: x.ar.text(), prec: precAtom}
	}
	a := c.form(x.x)
	if a.tooLong {
		return a
	}
	var b cform
	if x.y != nil {
		if b = c.form(x.y); b.tooLong {
			return b
		}
	}
	if invalid(x, a, b) {
		// x is not a real number (a division by zero, an even root of a
		// negative): there is nothing to print.
		return cform{tooLong: true}
	}
	if x.op == opPow && x.k > 0 && x.x.op == opRoot && x.k%x.x.k == 0 {
		// (a^(1/k))^(k·j) = a^j: the root exists, so this is exact.
		if arg := c.form(x.x.x); arg.isSum {
			if rs, ok := sumOp(&Real{op: opPow, k: x.k / x.x.k}, arg.rs, nil); ok {
				return sumForm(rs)
			}
		}
	}
	if a.isSum && (x.y == nil || b.isSum) {
		if rs, ok := sumOp(x, a.rs, b.rs); ok {
			return sumForm(rs)
		}
	}
	return textOp(x, a, b)
}

// invalid reports an operation that the forms show to have no real value.
func invalid(x *Real, a, b cform) bool {
	switch x.op {
	case opQuo:
		return b.isSum && len(b.rs) == 0
	case opPow:
		return x.k < 0 && a.isSum && len(a.rs) == 0
	case opRoot:
		return x.k%2 == 0 && a.isSum && len(a.rs) == 1 && a.rs[0].c.Sign() < 0
	}
	return false
}

func sumForm(rs radSum) cform { return cform{rs: rs, isSum: true} }

// sumOp applies x's operation to radSums, when the result is one.
func sumOp(x *Real, a, b radSum) (radSum, bool) {
	switch x.op {
	case opAdd:
		return a.add(b, 1)
	case opSub:
		return a.add(b, -1)
	case opNeg:
		return a.scale(big.NewRat(-1, 1)), true
	case opMul:
		return a.mul(b)
	case opQuo:
		inv, ok := b.inverse()
		if !ok {
			return nil, false
		}
		return a.mul(inv)
	case opPow:
		n := x.k
		if n < 0 {
			inv, ok := a.inverse()
			if !ok {
				return nil, false
			}
			a, n = inv, -n
		}
		if n > closedMaxPow {
			return nil, false
		}
		out := radSum{{c: big.NewRat(1, 1), m: big.NewInt(1), k: 1}}
		for range n {
			var ok bool
			if out, ok = out.mul(a); !ok {
				return nil, false
			}
		}
		return out, true
	case opRoot:
		return a.root(x.k)
	}
	return nil, false
}

// textOp prints x's operation on forms that are not all radSums.
func textOp(x *Real, a, b cform) cform {
	switch {
	case (x.op == opMul || x.op == opQuo) && b.isOne():
		return a
	case x.op == opMul && a.isOne():
		return b
	}
	switch x.op {
	case opAdd:
		if b.isSum && b.rs.allNegative() {
			// a + (−3/4) reads better as a − 3/4.
			nb := sumForm(b.rs.scale(big.NewRat(-1, 1)))
			return cform{text: a.String() + " - " + nb.paren(precProd), prec: precSum}
		}
		return cform{text: a.String() + " + " + b.paren(precSum), prec: precSum}
	case opSub:
		return cform{text: a.String() + " - " + b.paren(precProd), prec: precSum}
	case opNeg:
		return cform{text: "-" + a.paren(precProd), prec: precSum}
	case opMul:
		return cform{text: a.paren(precProd) + "*" + b.paren(precProd), prec: precProd}
	case opQuo:
		return cform{text: a.paren(precProd) + "/" + b.paren(precAtom), prec: precProd}
	case opPow:
		n := strconv.Itoa(x.k)
		if x.k < 0 {
			n = "(" + n + ")"
		}
		return cform{text: a.paren(precAtom) + "**" + n, prec: precProd}
	case opRoot:
		return cform{text: rootText(a.String(), x.k), prec: precAtom}
	}
	return cform{tooLong: true}
}

// allNegative reports whether s has terms, all with negative coefficients.
func (s radSum) allNegative() bool {
	for _, t := range s {
		if t.c.Sign() > 0 {
			return false
		}
	}
	return len(s) > 0
}

// isOne reports whether f is the rational 1.
func (f cform) isOne() bool {
	return f.isSum && len(f.rs) == 1 && f.rs[0].k == 1 && f.rs[0].c.Cmp(big.NewRat(1, 1)) == 0
}

func rootText(arg string, k int) string {
	if k == 2 {
		return "sqrt(" + arg + ")"
	}
	return "root(" + arg + ", " + strconv.Itoa(k) + ")"
}

// paren prints f, in parentheses unless its precedence is at least p.
func (f cform) paren(p int) string {
	s := f.String()
	if f.precedence() < p {
		return "(" + s + ")"
	}
	return s
}

func (f cform) precedence() int {
	if !f.isSum {
		return f.prec
	}
	_, p := f.rs.text()
	return p
}

// String prints the form.
func (f cform) String() string {
	if !f.isSum {
		return f.text
	}
	s, _ := f.rs.text()
	return s
}

// text prints a radSum over a common denominator: "(1 + sqrt(5))/2",
// "3*sqrt(2)/4", "-root(3, 3)", with its precedence.
func (s radSum) text() (string, int) {
	if len(s) == 0 {
		return "0", precAtom
	}
	den := big.NewInt(1)
	for _, t := range s {
		d := t.c.Denom()
		g := new(big.Int).GCD(nil, nil, den, d)
		den.Mul(den, new(big.Int).Quo(d, g))
	}
	if s[0].c.Sign() < 0 {
		// Lead with a positive term where there is one: √5 − 1, not −1 + √5.
		for i, t := range s {
			if t.c.Sign() > 0 {
				s = append(append(radSum{t}, s[:i:i]...), s[i+1:]...)
				break
			}
		}
	}
	var b strings.Builder
	for i, t := range s {
		n := new(big.Int).Mul(t.c.Num(), new(big.Int).Quo(den, t.c.Denom()))
		writeSign(&b, i, n.Sign() < 0)
		n.Abs(n)
		switch {
		case t.k == 1:
			b.WriteString(n.String())
		case n.Cmp(bigOne) == 0:
			b.WriteString(rootText(t.m.String(), t.k))
		default:
			b.WriteString(n.String() + "*" + rootText(t.m.String(), t.k))
		}
	}
	body := b.String()
	neg := s[0].c.Sign() < 0
	switch {
	case len(s) > 1 && den.Cmp(bigOne) != 0:
		return "(" + body + ")/" + den.String(), precProd
	case len(s) > 1 || neg:
		if den.Cmp(bigOne) != 0 {
			body += "/" + den.String()
		}
		return body, precSum
	case den.Cmp(bigOne) != 0:
		return body + "/" + den.String(), precProd
	case s[0].k == 1 || s[0].c.Num().CmpAbs(bigOne) == 0:
		return body, precAtom
	}
	return body, precProd
}

// norm sorts by (k, m), merges equal radicals and drops zeros.
func (s radSum) norm() radSum {
	sort.SliceStable(s, func(i, j int) bool {
		if s[i].k != s[j].k {
			return s[i].k < s[j].k
		}
		return s[i].m.Cmp(s[j].m) < 0
	})
	out := s[:0:0]
	for _, t := range s {
		if n := len(out); n > 0 && out[n-1].k == t.k && out[n-1].m.Cmp(t.m) == 0 {
			out[n-1].c = new(big.Rat).Add(out[n-1].c, t.c)
			continue
		}
		out = append(out, radTerm{c: new(big.Rat).Set(t.c), m: t.m, k: t.k})
	}
	res := out[:0]
	for _, t := range out {
		if t.c.Sign() != 0 {
			res = append(res, t)
		}
	}
	return res
}

func (s radSum) add(o radSum, sign int64) (radSum, bool) {
	out := append(radSum{}, s...)
	for _, t := range o {
		out = append(out, radTerm{c: new(big.Rat).Mul(t.c, big.NewRat(sign, 1)), m: t.m, k: t.k})
	}
	out = out.norm()
	return out, len(out) <= closedMaxTerms
}

func (s radSum) scale(q *big.Rat) radSum {
	out := make(radSum, len(s))
	for i, t := range s {
		out[i] = radTerm{c: new(big.Rat).Mul(t.c, q), m: t.m, k: t.k}
	}
	return out.norm()
}

func (s radSum) mul(o radSum) (radSum, bool) {
	if len(s)*len(o) > 4*closedMaxTerms {
		return nil, false
	}
	var out radSum
	for _, a := range s {
		for _, b := range o {
			c, m, k, ok := radMul(a.m, a.k, b.m, b.k)
			if !ok {
				return nil, false
			}
			c.Mul(c, a.c)
			c.Mul(c, b.c)
			out = append(out, radTerm{c: c, m: m, k: k})
		}
	}
	out = out.norm()
	return out, len(out) <= closedMaxTerms
}

// radMul is m₁^(1/k₁)·m₂^(1/k₂) = c·m^(1/k), reduced.
func radMul(m1 *big.Int, k1 int, m2 *big.Int, k2 int) (*big.Rat, *big.Int, int, bool) {
	k := k1 / gcdInt(k1, k2) * k2
	if k > closedMaxIndex || m1.BitLen()*(k/k1)+m2.BitLen()*(k/k2) > closedMaxBits {
		return nil, nil, 0, false
	}
	m := new(big.Int).Exp(m1, big.NewInt(int64(k/k1)), nil)
	m.Mul(m, new(big.Int).Exp(m2, big.NewInt(int64(k/k2)), nil))
	c, m, k := radReduce(m, k)
	return new(big.Rat).SetInt(c), m, k, true
}

func gcdInt(a, b int) int {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

// radReduce writes m^(1/k) (m ≥ 1) as c·m'^(1/k'): k-th powers of small
// primes and perfect powers taken out, the index lowered where m is a
// perfect power of a divisor of k.
func radReduce(m *big.Int, k int) (*big.Int, *big.Int, int) {
	c := big.NewInt(1)
	m = new(big.Int).Set(m)
	for changed := true; changed && k > 1; {
		changed = false
		if r, ok := exactIntRoot(m, k); ok {
			return c.Mul(c, r), big.NewInt(1), 1
		}
		for _, p := range closedPrimes() {
			pk := new(big.Int).Exp(big.NewInt(int64(p)), big.NewInt(int64(k)), nil)
			if pk.Cmp(m) > 0 {
				break
			}
			q, r := new(big.Int), new(big.Int)
			for {
				q.QuoRem(m, pk, r)
				if r.Sign() != 0 {
					break
				}
				m.Set(q)
				c.Mul(c, big.NewInt(int64(p)))
			}
		}
		for d := 2; d <= k; d++ {
			if k%d != 0 {
				continue
			}
			if r, ok := exactIntRoot(m, d); ok {
				m, k, changed = r, k/d, true
				break
			}
		}
	}
	if m.Cmp(bigOne) == 0 {
		k = 1
	}
	return c, m, k
}

// exactIntRoot returns m^(1/k) when m ≥ 0 is a perfect k-th power.
func exactIntRoot(m *big.Int, k int) (*big.Int, bool) {
	if k == 1 {
		return new(big.Int).Set(m), true
	}
	return intRoot(m, k)
}

// closedPrimes are the primes below 1000, whose powers radReduce takes
// out of a radicand; made at the first call (at package initialisation,
// the sieve under it cost every process 1 ms at start).
var closedPrimes = sync.OnceValue(func() []int {
	out := []int{2}
	for _, p := range smallPrimes() {
		if p >= 1000 {
			break
		}
		out = append(out, int(p))
	}
	return out
})

// root is the real k-th root of a radSum of one term (a rational or
// c·m^(1/j)): |c|^(1/k)·m^(1/(jk)), negative for an odd root of a negative c.
func (s radSum) root(k int) (radSum, bool) {
	if len(s) == 0 {
		return radSum{}, true
	}
	if len(s) != 1 || k > closedMaxIndex {
		return nil, false
	}
	t := s[0]
	neg := t.c.Sign() < 0
	if neg && k%2 == 0 {
		return nil, false
	}
	// |c|^(1/k) = (a·b^(k−1))^(1/k)/b for |c| = a/b.
	a, b := new(big.Int).Abs(t.c.Num()), t.c.Denom()
	if a.BitLen()+(k-1)*b.BitLen() > closedMaxBits {
		return nil, false
	}
	rad := new(big.Int).Mul(a, new(big.Int).Exp(b, big.NewInt(int64(k-1)), nil))
	c1, m1, k1 := radReduce(rad, k)
	c, m, kk, ok := radMul(m1, k1, t.m, t.k*k)
	if !ok {
		return nil, false
	}
	c.Mul(c, new(big.Rat).SetFrac(c1, b))
	if neg {
		c.Neg(c)
	}
	return radSum{{c: c, m: m, k: kk}}.norm(), true
}

// inverse is 1/s: for one term c·m^(1/k), m^((k−1)/k)/(c·m); for a sum of
// square roots, rationalized by conjugates (see the top of this file).
func (s radSum) inverse() (radSum, bool) {
	switch len(s) {
	case 0:
		return nil, false
	case 1:
		t := s[0]
		if t.k == 1 {
			return radSum{{c: new(big.Rat).Inv(t.c), m: t.m, k: 1}}, true
		}
		if t.m.BitLen()*(t.k-1) > closedMaxBits {
			return nil, false
		}
		c, m, k := radReduce(new(big.Int).Exp(t.m, big.NewInt(int64(t.k-1)), nil), t.k)
		q := new(big.Rat).Mul(t.c, new(big.Rat).SetInt(t.m))
		q.Quo(new(big.Rat).SetInt(c), q)
		return radSum{{c: q, m: m, k: k}}.norm(), true
	}
	num := radSum{{c: big.NewRat(1, 1), m: big.NewInt(1), k: 1}}
	den := s
	for range 8 {
		if len(den) == 1 && den[0].k == 1 {
			return num.scale(new(big.Rat).Inv(den[0].c)), true
		}
		conj, ok := den.conjugate()
		if !ok {
			return nil, false
		}
		if num, ok = num.mul(conj); !ok {
			return nil, false
		}
		if den, ok = den.mul(conj); !ok || len(den) == 0 {
			return nil, false
		}
	}
	return nil, false
}

// conjugate flips the sign of the square roots √m of s whose m shares the
// factor g, g found by gcds so that it divides or is prime to every m. It
// needs s to be rational and square roots only.
func (s radSum) conjugate() (radSum, bool) {
	var g *big.Int
	for _, t := range s {
		if t.k > 2 {
			return nil, false
		}
		if t.k == 2 && g == nil {
			g = new(big.Int).Set(t.m)
		}
	}
	if g == nil {
		return nil, false
	}
	for changed := true; changed; {
		changed = false
		for _, t := range s {
			if t.k != 2 {
				continue
			}
			d := new(big.Int).GCD(nil, nil, g, t.m)
			if d.Cmp(bigOne) != 0 && d.Cmp(g) != 0 {
				g, changed = d, true
			}
		}
	}
	out := make(radSum, len(s))
	for i, t := range s {
		out[i] = t
		if t.k == 2 && new(big.Int).Rem(t.m, g).Sign() == 0 {
			out[i].c = new(big.Rat).Neg(t.c)
		}
	}
	return out, true
}

package exact

// Property test: for random expressions, every enclosure at precision p
// contains the value computed independently at 4p+64 bits, and widths
// shrink as p grows. The independent reference evaluator below uses plain
// round-to-nearest big.Float arithmetic with different algorithms from
// Real's: big.Float.Sqrt, Newton for cube roots, exp by Taylor series with
// repeated squaring, log by atanh series, sin and cos by Taylor series with
// double-angle steps, π by Machin's formula, atan by half-angle reduction.

import (
	"fmt"
	"math"
	"math/big"
	"math/rand"
	"testing"
)

type rtNode struct {
	op   string
	kids []*rtNode
	r    *big.Rat
	k    int
}

func rtLeaf(r *big.Rat) *rtNode                 { return &rtNode{op: "rat", r: r} }
func rtOp(op string, kids ...*rtNode) *rtNode   { return &rtNode{op: op, kids: kids} }
func rtOpK(op string, k int, x *rtNode) *rtNode { return &rtNode{op: op, k: k, kids: []*rtNode{x}} }

func (n *rtNode) String() string {
	if n.op == "rat" {
		return FormatRat(n.r)
	}
	s := n.op + "("
	for i, c := range n.kids {
		if i > 0 {
			s += ", "
		}
		s += c.String()
	}
	if n.op == "pow" || n.op == "root" {
		s += fmt.Sprintf(", %d", n.k)
	}
	return s + ")"
}

func (n *rtNode) real() *Real {
	var a, b *Real
	if len(n.kids) > 0 {
		a = n.kids[0].real()
	}
	if len(n.kids) > 1 {
		b = n.kids[1].real()
	}
	switch n.op {
	case "rat":
		return RealFromRat(n.r)
	case "add":
		return RealAdd(a, b)
	case "sub":
		return RealSub(a, b)
	case "mul":
		return RealMul(a, b)
	case "quo":
		return RealQuo(a, b)
	case "sqrt":
		return RealSqrt(a)
	case "root":
		return RealRoot(a, n.k)
	case "pow":
		return RealPowInt(a, n.k)
	case "exp":
		return RealExp(a)
	case "log":
		return RealLog(a)
	case "sin":
		return RealSin(a)
	case "cos":
		return RealCos(a)
	case "atan":
		return RealAtan(a)
	case "acos":
		return RealAcos(a)
	case "atan2":
		return RealAtan2(a, b)
	case "pi":
		return Pi()
	}
	panic(n.op)
}

// ---- the independent reference, round to nearest at w bits ----

func rtF(w uint) *big.Float { return new(big.Float).SetPrec(w) }

func rtRefPi(w uint) *big.Float {
	wp := w + 32
	atanInv := func(n int64) *big.Float {
		x := rtF(wp).Quo(rtF(wp).SetInt64(1), rtF(wp).SetInt64(n))
		x2 := rtF(wp).Mul(x, x)
		sum := rtF(wp).Set(x)
		pw := rtF(wp).Set(x)
		eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(wp+8))
		for k := int64(1); ; k++ {
			pw.Mul(pw, x2)
			t := rtF(wp).Quo(pw, rtF(wp).SetInt64(2*k+1))
			if t.Cmp(eps) < 0 {
				break
			}
			if k%2 == 1 {
				sum.Sub(sum, t)
			} else {
				sum.Add(sum, t)
			}
		}
		return sum
	}
	a := rtF(wp).Mul(atanInv(5), rtF(wp).SetInt64(16))
	b := rtF(wp).Mul(atanInv(239), rtF(wp).SetInt64(4))
	return rtF(w).Sub(a, b)
}

func rtRefExp(x *big.Float, w uint) *big.Float {
	e := x.MantExp(nil)
	k := 24 + e
	if k < 0 {
		k = 0
	}
	wp := w + uint(k) + 64
	y := rtF(wp).SetMantExp(x, -k)
	sum := rtF(wp).SetInt64(1)
	term := rtF(wp).SetInt64(1)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(wp+8))
	for n := int64(1); ; n++ {
		term.Mul(term, y)
		term.Quo(term, rtF(wp).SetInt64(n))
		sum.Add(sum, term)
		if new(big.Float).Abs(term).Cmp(eps) < 0 {
			break
		}
	}
	for i := 0; i < k; i++ {
		sum.Mul(sum, sum)
	}
	return rtF(w).Set(sum)
}

func rtRefAtanh(s *big.Float, w uint) *big.Float {
	s2 := rtF(w).Mul(s, s)
	sum := rtF(w).Set(s)
	pw := rtF(w).Set(s)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(w+8))
	for k := int64(1); ; k++ {
		pw.Mul(pw, s2)
		t := rtF(w).Quo(pw, rtF(w).SetInt64(2*k+1))
		sum.Add(sum, t)
		if new(big.Float).Abs(t).Cmp(eps) < 0 {
			break
		}
	}
	return sum
}

func rtRefLog(x *big.Float, w uint) *big.Float {
	wp := w + 64
	m := rtF(wp)
	e := x.MantExp(m) // x = m·2^e, m in [0.5, 1)
	one := rtF(wp).SetInt64(1)
	s := rtF(wp).Quo(rtF(wp).Sub(m, one), rtF(wp).Add(m, one))
	lm := rtF(wp).Mul(rtRefAtanh(s, wp), big.NewFloat(2))
	ln2 := rtF(wp).Mul(rtRefAtanh(rtF(wp).Quo(one, rtF(wp).SetInt64(3)), wp), big.NewFloat(2))
	return rtF(w).Add(lm, rtF(wp).Mul(ln2, rtF(wp).SetInt64(int64(e))))
}

func rtRefSinCos(x *big.Float, w uint) (s, c *big.Float) {
	e := x.MantExp(nil)
	if e < 0 {
		e = 0
	}
	const halvings = 8
	wp := w + uint(e) + 64 + 2*halvings
	twoPi := rtF(wp).Mul(rtRefPi(wp), big.NewFloat(2))
	kf := rtF(wp).Quo(x, twoPi)
	k, _ := kf.Int(nil)
	r := rtF(wp).Sub(x, rtF(wp).Mul(twoPi, rtF(wp).SetInt(k)))
	r.SetMantExp(r, -halvings)
	r2 := rtF(wp).Mul(r, r)
	s = rtF(wp).Set(r)
	c = rtF(wp).SetInt64(1)
	ts := rtF(wp).Set(r)
	tc := rtF(wp).SetInt64(1)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(wp+8))
	for n := int64(1); ; n++ {
		ts.Mul(ts, r2)
		ts.Quo(ts, rtF(wp).SetInt64((2*n)*(2*n+1)))
		ts.Neg(ts)
		tc.Mul(tc, r2)
		tc.Quo(tc, rtF(wp).SetInt64((2*n-1)*(2*n)))
		tc.Neg(tc)
		s.Add(s, ts)
		c.Add(c, tc)
		if new(big.Float).Abs(tc).Cmp(eps) < 0 && new(big.Float).Abs(ts).Cmp(eps) < 0 {
			break
		}
	}
	for i := 0; i < halvings; i++ {
		s2 := rtF(wp).Mul(s, c)
		s2.SetMantExp(s2, 1)
		c2 := rtF(wp).Mul(c, c)
		c2.SetMantExp(c2, 1)
		c2.Sub(c2, big.NewFloat(1))
		s, c = s2, c2
	}
	return rtF(w).Set(s), rtF(w).Set(c)
}

func rtRefAtan(x *big.Float, w uint) *big.Float {
	wp := w + 64
	if x.Sign() < 0 {
		return rtF(w).Neg(rtRefAtan(rtF(wp).Neg(x), wp))
	}
	one := rtF(wp).SetInt64(1)
	if x.Cmp(one) > 0 {
		h := rtRefPi(wp)
		h.SetMantExp(h, -1)
		return rtF(w).Sub(h, rtRefAtan(rtF(wp).Quo(one, x), wp))
	}
	y := rtF(wp).Set(x)
	const halvings = 4
	for i := 0; i < halvings; i++ {
		d := rtF(wp).Mul(y, y)
		d.Add(d, one)
		d.Sqrt(d)
		d.Add(d, one)
		y.Quo(y, d)
	}
	y2 := rtF(wp).Mul(y, y)
	sum := rtF(wp).Set(y)
	pw := rtF(wp).Set(y)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -int(wp+8))
	for k := int64(1); ; k++ {
		pw.Mul(pw, y2)
		t := rtF(wp).Quo(pw, rtF(wp).SetInt64(2*k+1))
		if k%2 == 1 {
			sum.Sub(sum, t)
		} else {
			sum.Add(sum, t)
		}
		if t.Cmp(eps) < 0 {
			break
		}
	}
	sum.SetMantExp(sum, halvings)
	return rtF(w).Set(sum)
}

func (n *rtNode) ref(w uint) *big.Float {
	wp := w + 64
	var a, b *big.Float
	if len(n.kids) > 0 {
		a = n.kids[0].ref(wp)
	}
	if len(n.kids) > 1 {
		b = n.kids[1].ref(wp)
	}
	switch n.op {
	case "rat":
		return rtF(w).SetRat(n.r)
	case "add":
		return rtF(w).Add(a, b)
	case "sub":
		return rtF(w).Sub(a, b)
	case "mul":
		return rtF(w).Mul(a, b)
	case "quo":
		return rtF(w).Quo(a, b)
	case "sqrt":
		return rtF(w).Sqrt(a)
	case "root": // cube roots: Newton y ← y − (y³ − a)/(3y²)
		neg := a.Sign() < 0
		a = new(big.Float).Abs(a)
		f, _ := a.Float64()
		y := rtF(wp).SetFloat64(math.Cbrt(f)) // a float64 start for Newton
		for i := 0; i < 30; i++ {
			y3 := rtF(wp).Mul(y, y)
			y3.Mul(y3, y)
			d := rtF(wp).Sub(y3, a)
			d.Quo(d, rtF(wp).Mul(rtF(wp).Mul(y, y), big.NewFloat(3)))
			y.Sub(y, d)
		}
		if neg {
			y.Neg(y)
		}
		return rtF(w).Set(y)
	case "pow":
		k := n.k
		if k < 0 {
			a = rtF(wp).Quo(big.NewFloat(1), a)
			k = -k
		}
		r := rtF(wp).SetInt64(1)
		for i := 0; i < k; i++ {
			r.Mul(r, a)
		}
		return rtF(w).Set(r)
	case "exp":
		return rtRefExp(a, w)
	case "log":
		return rtRefLog(a, w)
	case "sin":
		s, _ := rtRefSinCos(a, w)
		return s
	case "cos":
		_, c := rtRefSinCos(a, w)
		return c
	case "atan":
		return rtRefAtan(a, w)
	case "acos": // π/2 − atan(a/√(1−a²))
		d := rtF(wp).Mul(a, a)
		d.Sub(big.NewFloat(1), d)
		d.Sqrt(d)
		h := rtRefPi(wp)
		h.SetMantExp(h, -1)
		return rtF(w).Sub(h, rtRefAtan(rtF(wp).Quo(a, d), wp))
	case "atan2": // y = a, x = b
		t := rtRefAtan(rtF(wp).Quo(a, b), wp)
		if b.Sign() > 0 {
			return rtF(w).Set(t)
		}
		pi := rtRefPi(wp)
		if a.Sign() >= 0 {
			return rtF(w).Add(t, pi)
		}
		return rtF(w).Sub(t, pi)
	case "pi":
		return rtRefPi(w)
	}
	panic(n.op)
}

// rtRandomExpr draws an expression from templates whose domains hold.
func rtRandomExpr(rng *rand.Rand) *rtNode {
	rat := func(maxNum, maxDen int64) *big.Rat {
		n := rng.Int63n(2*maxNum+1) - maxNum
		return big.NewRat(n, rng.Int63n(maxDen)+1)
	}
	pos := func(maxNum, maxDen int64) *big.Rat {
		return big.NewRat(rng.Int63n(maxNum)+1, rng.Int63n(maxDen)+1)
	}
	unit := func() *big.Rat { // in (−1, 1)
		d := rng.Int63n(1000) + 2
		return big.NewRat(rng.Int63n(2*d-1)-(d-1), d)
	}
	L := rtLeaf
	switch rng.Intn(17) {
	case 0:
		return L(rat(1000000, 10000))
	case 1:
		return rtOp("sub", rtOp("add", rtOp("sqrt", L(pos(1000000, 1000))), rtOp("sqrt", L(pos(1000, 1000)))), rtOp("sqrt", L(pos(1000000, 100))))
	case 2:
		return rtOp("exp", L(rat(3000, 100)))
	case 3:
		return rtOp("log", L(pos(1000000, 1000)))
	case 4:
		return rtOp("sin", L(rat(10000, 100)))
	case 5:
		return rtOp("cos", L(rat(10000, 100)))
	case 6:
		return rtOp("atan", L(rat(10000, 100)))
	case 7:
		return rtOp("exp", rtOp("sub", rtOp("sqrt", L(pos(1000, 10))), L(big.NewRat(2, 1))))
	case 8:
		return rtOp("log", rtOp("add", rtOp("sqrt", L(pos(1000, 10))), L(pos(100, 7))))
	case 9:
		return rtOp("sin", rtOp("mul", rtOp("sqrt", L(pos(1000, 10))), L(rat(100, 3))))
	case 10:
		return rtOpK("root", 3, L(rat(1000000, 1000)))
	case 11:
		k := rng.Intn(9) - 4
		if k == 0 {
			k = 5
		}
		return rtOpK("pow", k, rtOp("add", rtOp("sqrt", L(pos(1000, 10))), L(pos(100, 10))))
	case 12:
		return rtOp("acos", L(unit()))
	case 13:
		y, x := rat(1000, 10), rat(1000, 10)
		if x.Sign() == 0 {
			x.SetInt64(1)
		}
		return rtOp("atan2", L(y), L(x))
	case 14:
		return rtOp("add", rtOp("mul", rtOp("exp", rtOp("sin", L(rat(100, 7)))), rtOp("log", L(pos(1000, 3)))), rtOp("atan", rtOp("sqrt", L(pos(1000, 3)))))
	case 15:
		return rtOp("quo", rtOp("add", rtOp("sqrt", L(pos(1000, 10))), L(rat(10, 3))), rtOp("add", rtOp("sqrt", L(pos(1000, 10))), L(pos(10, 3))))
	default:
		return rtOp("mul", rtOp("pi", nil...), rtOp("cos", rtOp("exp", L(rat(30, 10)))))
	}
}

// rtHardExprs are fixed cases at the edges: huge trigonometric arguments
// (sin 10^22 needs π to 150 bits), extreme magnitudes, arguments next to
// the ends of acos and the branch cut of atan2.
func rtHardExprs() []*rtNode {
	L := func(s string) *rtNode { return rtLeaf(q(s)) }
	p2 := func(k uint) string { return new(big.Int).Lsh(big.NewInt(3), k).String() }
	return []*rtNode{
		rtOp("sin", L("10000000000000000000000")),
		rtOp("cos", L("10000000000000000000000")),
		rtOp("sin", L(p2(200))),
		rtOp("cos", rtOp("mul", rtOp("sqrt", L("2")), L(p2(100)))),
		rtOp("atan", L("1e300")),
		rtOp("atan", L("-1e-300")),
		rtOp("exp", L("-3000/7")),
		rtOp("exp", rtOp("mul", rtOp("sqrt", L("2")), L("1000"))),
		rtOp("exp", rtOp("mul", rtOp("sqrt", L("2")), L("-1/1000000000000"))),
		rtOp("log", L("1e-300")),
		rtOp("log", rtOp("add", L("1"), rtOp("mul", rtOp("sqrt", L("2")), L("1e-20")))),
		rtOp("acos", L("-999999999999999999999999999999/1000000000000000000000000000000")),
		rtOp("acos", L("999999999999999999999999999999/1000000000000000000000000000000")),
		rtOp("atan2", L("-1e-30"), L("-1")),
		rtOp("atan2", L("1e-30"), L("-1")),
		rtOp("atan2", L("-1"), L("1e-30")),
		rtOpK("root", 3, L("-1e-300")),
		rtOpK("pow", -7, rtOp("sqrt", L("1e-40"))),
		rtOp("sin", L("1e-200")),
		rtOp("cos", L("1e-200")),
		rtOp("sin", rtOp("pi")),
	}
}

func TestRealEnclosureProperty(t *testing.T) {
	rng := rand.New(rand.NewSource(20240611))
	precs := []uint{53, 100, 200, 400}
	hard := rtHardExprs()
	for i := 0; i < 300+len(hard); i++ {
		var e *rtNode
		if i < len(hard) {
			e = hard[i]
		} else {
			e = rtRandomExpr(rng)
		}
		var prevW *big.Rat
		for _, p := range precs {
			x := e.real() // a fresh DAG each time: no shared cache
			iv, err := x.Enclose(p)
			if err != nil {
				t.Errorf("%v at %d bits: %v", e, p, err)
				break
			}
			ref, _ := e.ref(4*p + 64).Rat(nil)
			if r, ok := x.Rat(); ok {
				// Known exactly: the reference is only within its own
				// rounding of it.
				d := new(big.Rat).Abs(new(big.Rat).Sub(r, ref))
				tol := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), 4*p))
				tol.Mul(tol, new(big.Rat).Add(big.NewRat(1, 1), new(big.Rat).Abs(r)))
				if d.Cmp(tol) > 0 || iv.Lo.Cmp(r) != 0 || iv.Hi.Cmp(r) != 0 {
					t.Errorf("%v: exact %s, reference %s", e, FormatRat(r), ref.FloatString(30))
				}
				break
			}
			if !iv.Contains(ref) {
				t.Errorf("%v at %d bits: enclosure %v misses the reference %s", e, p, iv, ref.FloatString(30))
			}
			w := iv.Width()
			if i < len(hard) {
				// Ill-conditioned on purpose (a 2^101 argument to cos is
				// [-1, 1] at 53 bits): only ask that the widths end small.
				lim := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), 100))
				if mag := new(big.Rat).Abs(ref); mag.Cmp(big.NewRat(1, 1)) > 0 {
					lim.Mul(lim, mag)
				}
				if p == precs[len(precs)-1] && w.Cmp(lim) > 0 {
					t.Errorf("%v at %d bits: width %s too large", e, p, w.FloatString(30))
				}
				continue
			}
			if prevW != nil && w.Sign() != 0 && w.Cmp(prevW) >= 0 {
				t.Errorf("%v: width did not shrink at %d bits", e, p)
			}
			// Width about 2^-p·max(1, |x|); allow 2^(p/2) for conditioning.
			mag := new(big.Rat).Abs(ref)
			if mag.Cmp(big.NewRat(1, 1)) < 0 {
				mag.SetInt64(1)
			}
			lim := new(big.Rat).Mul(mag, new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), p/2)))
			if w.Cmp(lim) > 0 {
				t.Errorf("%v at %d bits: width %s too large", e, p, w.FloatString(30))
			}
			prevW = w
		}
	}
}

// TestRootBound checks the integer-root bounds directly: lo^k ≤ a ≤ hi^k
// exactly, and hi − lo within 2^-(p−1) relative.
func TestRootBound(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	for i := 0; i < 500; i++ {
		k := 2 + rng.Intn(6)
		p := uint(24 + rng.Intn(300))
		a := new(big.Float).SetPrec(uint(1 + rng.Intn(400))).SetFloat64(rng.Float64())
		a.SetMantExp(a, rng.Intn(400)-200)
		if a.Sign() == 0 {
			continue
		}
		lo := rootBound(a, k, p, false)
		hi := rootBound(a, k, p, true)
		ar, _ := a.Rat(nil)
		lr, _ := lo.Rat(nil)
		hr, _ := hi.Rat(nil)
		pw := func(r *big.Rat) *big.Rat {
			out := big.NewRat(1, 1)
			for j := 0; j < k; j++ {
				out.Mul(out, r)
			}
			return out
		}
		if pw(lr).Cmp(ar) > 0 || pw(hr).Cmp(ar) < 0 {
			t.Fatalf("root %d of %s at %d bits: [%s, %s] does not enclose", k, a.Text('g', 20), p, lo.Text('g', 20), hi.Text('g', 20))
		}
		rel := new(big.Rat).Quo(new(big.Rat).Sub(hr, lr), lr)
		if lim := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), p-1)); rel.Cmp(lim) > 0 {
			t.Fatalf("root %d of %s at %d bits: too wide", k, a.Text('g', 20), p)
		}
	}
	// realIntRoot against brute force.
	for n := int64(0); n < 3000; n++ {
		for k := 2; k <= 5; k++ {
			r := realIntRoot(big.NewInt(n), k).Int64()
			pk := func(x int64) int64 {
				o := int64(1)
				for j := 0; j < k; j++ {
					o *= x
				}
				return o
			}
			if pk(r) > n || pk(r+1) <= n {
				t.Fatalf("intRoot(%d, %d) = %d", n, k, r)
			}
		}
	}
}

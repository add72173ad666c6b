package exact

// Constants and rational-argument series by binary splitting: π by the
// Chudnovsky series, ln 2 by Zuniga's series, and exp, sin, cos, atan and
// log at short rationals by their Taylor and atanh series. Each sums a
// finite number of terms exactly in big.Int arithmetic, divides once into a
// midpoint–radius ball (real_ball.go) and adds an explicit bound on the
// omitted tail, so the only roundings are the final outward ones.
//
// Issue 20, 100,000 certified digits (Digits, string included), against
// the arb reference program (peers/digits NAME 100000, first evaluation in
// its process, string included), alternated in one shell loop on the
// shared 2-core machine under a load of 14–21 (December 2026). CPU seconds
// (user + system, whole process, best of 3–4; /usr/bin/time's 10 ms grain)
// are the steadier figure; wall milliseconds (in-process ns/op, best of 3)
// swing with the load:
//
//	        before (CPU)  after (CPU)  arb (CPU)  ratio   after / arb wall ms
//	π       0.14 s        0.09 s       0.03 s     ~3×     224 / 121
//	e       0.09 s        0.07 s       0.02–0.03  ~2.5–3× 83 / 64
//	log 2   0.50 s        0.15 s       0.08 s     ~1.9×   307 / 294
//	sin 1   6.4 s         0.06 s       0.20 s     0.3×    100 / 931
//	exp 1/3 0.11 s        0.07 s       0.15 s     0.45×   142 / 628
//
// In-process CPU profiles put π at ~66 ms (binary splitting 25, the
// integer square root of 10005·4^w 12, the division 6, the digits 16) and
// e at ~37 ms (splitting 14, division 8, digits 16). The table was taken
// with Digits truncating both ends of the enclosure with one long product
// (a pairing real_digits.go gets with the square-root work); without it
// Digits costs ~5 ms more. On a quiet machine arb takes 22, 15, 60, 175
// and 125 ms for these five. The rest of the gap is Go's Karatsuba
// multiplication, which mulInt is the place to replace.

import (
	"math"
	"math/big"
	"math/bits"
	"sync"
)

// binSplit returns P = Π p_j, Q = Π q_j and T with
// T/Q = Σ_{k=a}^{b−1} c_k·Π_{j=a}^{k} p_j/q_j, given leaf(k, p, q, t),
// which sets p, q, t to p_k, q_k, p_k·c_k for integers p_k, q_k, c_k (into
// integers binSplit owns: no allocation per term): the two halves
// combine as T = T₁·Q₂ + P₁·T₂, Q = Q₁·Q₂, P = P₁·P₂, all exact
// (Haible and Papanikolaou, "Fast multiprecision evaluation of series of
// rational numbers", 1998). P of the whole range is computed only when
// needP is set: the sums alone do not use it.
func binSplit(a, b int64, leaf func(k int64, p, q, t *big.Int), needP bool) (p, q, t *big.Int) {
	if b-a <= binSplitRun {
		return binSplitRange(a, b, leaf, needP)
	}
	m := (a + b) / 2
	p1, q1, t1 := binSplit(a, m, leaf, true)
	p2, q2, t2 := binSplit(m, b, leaf, needP)
	t = mulInt(new(big.Int), t1, q2)
	t.Add(t, mulInt(t2, p1, t2))
	q = mulInt(q1, q1, q2)
	if needP {
		p = mulInt(p1, p1, p2)
	}
	return p, q, t
}

// binSplitRun is the length of the ranges that binSplit sums term by
// term: their numbers are a few words long, and merging them in place
// saves the allocations of the lowest levels of the recursion.
const binSplitRun = 8

// binSplitRange is binSplit for a short range, adding one term at a time:
// [a, k) and [k, k+1) combine as T = T·q_k + P·t_k, Q = Q·q_k, P = P·p_k.
// Products go to a scratch integer that is then swapped in, because
// big.Int.Mul into one of its operands allocates anyway.
func binSplitRange(a, b int64, leaf func(k int64, p, q, t *big.Int), needP bool) (p, q, t *big.Int) {
	p, q, t = new(big.Int), new(big.Int), new(big.Int)
	leaf(a, p, q, t)
	s, pk, qk, tk := new(big.Int), new(big.Int), new(big.Int), new(big.Int)
	for k := a + 1; k < b; k++ {
		leaf(k, pk, qk, tk)
		s.Mul(t, qk)
		t, s = s, t
		t.Add(t, s.Mul(p, tk))
		s.Mul(q, qk)
		q, s = s, q
		if needP || k+1 < b {
			s.Mul(p, pk)
			p, s = s, p
		}
	}
	if !needP && b-a > 1 {
		p = nil // not the product; the caller did not ask for it
	}
	return p, q, t
}

var ln2Cache struct {
	sync.Mutex
	l *big.Int // l ≤ ln2·2^w < l + 2
	w uint
}

// ln2Compute returns L with L ≤ ln2·2^w < L + 2, from ln2Zuniga at unit
// 2^-(w+g): with B = ⌊r⌋ + 1 > r (ball.ends), L = ⌊(m − B)/2^g⌋ is a lower bound,
// and ln2·2^w ≤ (m + B)/2^g < H + 1 for H = ⌊(m + B)/2^g⌋; H ≤ L + 1
// (checked; more guard bits otherwise) gives ln2·2^w < L + 2.
func ln2Compute(w uint) *big.Int {
	for g := 8; ; g += 8 {
		b := ln2Zuniga(int(w) + g)
		sh := uint(-b.e - int(w)) // g plus the series' guard bits
		l, h := b.ends()
		l.Rsh(l, sh)
		h.Rsh(h, sh)
		if h.Cmp(new(big.Int).Add(l, big.NewInt(1))) <= 0 {
			return l
		}
	}
}

// ln2Zuniga returns a ball at unit 2^-(w+4) containing ln 2 by the series
// of J. Zuniga (2024, posted on MathOverflow, question 463436, "Are these
// fast convergent series for log 2, log 3 and log 5 already known?"):
//
//	ln 2 = ½·Σ_{n≥1} (1794n − 297)/(n(2n−1)) · c_n,
//	c_n = Π_{j=1}^{n} j(2j−1)/(216·(6j−5)(6j−1)),
//
// 11.9 bits a term. The n(2n−1) cancels against c_n's last factor, so the
// sum is Σ_n a_n·Π_{j≤n} p_j/q_j with a_n = 1794n − 297, p_1 = 1,
// p_j = (j−1)(2j−3), q_j = 216(6j−5)(6j−1): binSplit with t_n = a_n·p_n.
// The terms are positive and each is below 1/1000 of the one before
// (a_(n+1)/a_n ≤ 3291/1497 < 2.2 and p_(n+1)/q_(n+1) = n(2n−1)/(216(6n+1)(6n+5))
// < 1/3888), so the tail after N terms is below 2·term_(N+1), computed
// from the exact P and Q of the split. TestLn2Routes checks the result
// against the Machin-type formula (ln2Machin) and 2·atanh(1/3).
func ln2Zuniga(w int) ball {
	v := w + 4
	n := int64(v+16)*1000/11920 + 2 // log2(3888) > 11.92
	aj := new(big.Int)
	leaf := func(j int64, p, q, t *big.Int) {
		p.SetInt64(1)
		if j > 1 {
			p.SetInt64((j - 1) * (2*j - 3))
		}
		q.SetInt64(216 * (6*j - 5) * (6*j - 1))
		t.Mul(p, aj.SetInt64(1794*j-297))
	}
	pp, q, t := binSplit(1, n+1, leaf, true)
	// term_(N+1) = a_(N+1)·P·p_(N+1)/(Q·q_(N+1)); the tail of ½·Σ is at
	// most term_(N+1).
	qn, tn := new(big.Int), new(big.Int)
	leaf(n+1, new(big.Int), qn, tn)
	tail := quoUp(64, fUp(64).Mul(radUp(pp), radUp(tn)), fDown(64).Mul(radDown(q), radDown(qn)))
	s, _ := ballQuo(ball{t, 0, new(big.Float)}, ball{q.Lsh(q, 1), 0, new(big.Float)}, v)
	return s.addRadAbs(tail)
}

// ln2Fixed returns L with L ≤ ln2·2^w < L + 2, from a shared cache. From
// the cached L′ at w′ ≥ w, L = ⌊L′/2^d⌋ with d = w′ − w keeps the bound:
// ln2·2^w < (L′ + 2)/2^d ≤ L + 1 + 2/2^d ≤ L + 2 for d ≥ 1.
func ln2Fixed(w uint) *big.Int {
	ln2Cache.Lock()
	defer ln2Cache.Unlock()
	if ln2Cache.w < w {
		nw := w + 64
		if nw < ln2Cache.w*3/2 {
			nw = ln2Cache.w * 3 / 2 // grow geometrically under doubling refinement
		}
		ln2Cache.l, ln2Cache.w = ln2Compute(nw), nw
	}
	return new(big.Int).Rsh(ln2Cache.l, ln2Cache.w-w)
}

// ln2Ival encloses ln 2 at precision p.
func ln2Ival(p uint) ival {
	w := p + 4
	l := ln2Fixed(w)
	return fixedIval(l, new(big.Int).Add(l, big.NewInt(2)), -int(w), p)
}

// ln2Ball is ln 2 as a ball at unit 2^-(w+1), from ln2Fixed:
// ln2·2^(w+1) lies in [2L, 2L + 4] = (2L + 2) ± 2.
func ln2Ball(w uint) ball {
	l := ln2Fixed(w)
	m := new(big.Int).Lsh(l, 1)
	return ball{m.Add(m, big.NewInt(2)), -int(w) - 1, big.NewFloat(2)}
}

// Chudnovsky: 1/π = 12 Σ_k (-1)^k (6k)! (A + Bk) / ((3k)! (k!)^3 C^(3k+3/2)),
// written here as π = 426880·√10005 / S with
// S = Σ_k t_k, t_k = (-1)^k (6k)! (A + Bk) / ((3k)! (k!)^3 C^(3k)).
const (
	chudA = 13591409
	chudB = 545140134
	// chudC3over24 is 640320³/24.
	chudC3over24 = 10939058860032000
	// chudLog2D is a lower bound of log2(640320³/1728) = log2(151931373056000)
	// ≈ 47.11; see piChudnovsky for its use.
	chudLog2D = 47
)

// chudLeaf is term k of the Chudnovsky sum for binSplit:
// p_k = (6k−5)(2k−1)(6k−1), q_k = k³·C³/24 (p_0 = q_0 = 1) and
// t_k = p_k·(−1)^k·(A + Bk).
func chudLeaf(k int64, p, q, t *big.Int) {
	if k == 0 {
		p.SetInt64(1)
		q.SetInt64(1)
	} else {
		p.Set(big.NewInt(6*k - 5))
		p.Mul(p, big.NewInt(2*k-1))
		p.Mul(p, big.NewInt(6*k-1))
		q.Set(big.NewInt(k))
		q.Mul(q, q)
		q.Mul(q, big.NewInt(k))
		q.Mul(q, big.NewInt(chudC3over24))
	}
	t.Mul(p, big.NewInt(chudA+chudB*k))
	if k&1 == 1 {
		t.Neg(t)
	}
}

// piChudnovsky encloses π at precision p.
//
// Tail bound: the ratio |t_(k+1)/t_k| is
// 8(6k+1)(6k+3)(6k+5)/(k+1)³ · (A+B(k+1))/(A+Bk) / 640320³, and
// 8(6k+1)(6k+3)(6k+5)/(k+1)³ < 8·216 = 1728, so (6N)!/((3N)!(N!)³) ≤ 1728^N
// and |t_N| ≤ (A+BN)/D^N with D = 640320³/1728 = 151931373056000 ≥ 2^47.
// The ratio is below 1, so the series alternates with decreasing terms and
// the tail after N terms is at most τ = (A+BN)·2^(-47N).
//
// With T/Q the first N terms (binSplit), S = (T + εQ)/Q for some |ε| ≤ τ,
// so π = 426880·√10005·Q/(T + εQ): one quotient of two balls, the
// numerator the product of 426880·Q cut to w + 64 bits and
// √10005·2^(w+1) ∈ [2R, 2R + 2], R = ⌊√(10005·4^w)⌋, and the denominator
// T ± τQ.
func piChudnovsky(p uint) ival {
	w := int(p) + 16
	n := int64(w+100)/chudLog2D + 1
	_, q, t := binSplit(0, n, chudLeaf, false)
	tail := fUp(64).SetInt64(chudA + chudB*n)
	tail.SetMantExp(tail, -int(chudLog2D*n))
	r := realIntRoot(new(big.Int).Lsh(big.NewInt(10005), 2*uint(w)), 2)
	r.Lsh(r, 1).Add(r, big.NewInt(1))
	c := ballTrunc(ball{new(big.Int).Mul(q, big.NewInt(426880)), 0, new(big.Float)}, w+64)
	num := ballMul(ball{r, -w - 1, big.NewFloat(1)}, c)
	den := ball{t, 0, fUp(64).Mul(tail, radUp(q))}
	v, ok := ballQuo(num, den, w)
	if !ok { // T is about 1.4·10^7·Q: far from 0
		panic("exact: internal error: Chudnovsky sum not separated from 0")
	}
	return v.ival(p)
}

var piCache struct {
	sync.Mutex
	v    ival
	prec uint
}

// piIval encloses π at precision p (at least), from a shared cache.
func piIval(p uint) ival {
	piCache.Lock()
	defer piCache.Unlock()
	if piCache.prec < p {
		piCache.v = piChudnovsky(p)
		piCache.prec = p
	}
	return ivRound(piCache.v, p)
}

// halfPiIval encloses π/2 at precision p.
func halfPiIval(p uint) ival { return ivScale(piIval(p), -1) }

// ratSeriesBits bounds the size (bits of numerator plus denominator) of a
// rational argument that the series below take: every term multiplies by
// numbers of about that size, so long ones go to the general routes.
const ratSeriesBits = 128

// ratSeriesOK reports whether r is short enough for the series here and
// its magnitude at most maxAbs.
func ratSeriesOK(r *big.Rat, maxAbs float64) bool { return ratShort(r, ratSeriesBits, maxAbs) }

// ratShort reports whether r has at most maxBits bits of numerator and
// denominator together and |r| ≤ maxAbs.
func ratShort(r *big.Rat, maxBits int, maxAbs float64) bool {
	if r.Num().BitLen()+r.Denom().BitLen() > maxBits {
		return false
	}
	f, _ := r.Float64()
	return math.Abs(f) <= maxAbs
}

// termsFor returns the least n ≥ n0 (and ≥ 1) with log2(x^n/n!) ≤ −bits
// by a float64 estimate, lx = log2 x. It only picks how many terms to sum;
// the tail is bounded rigorously afterwards.
func termsFor(lx float64, n0 int64, bits int) int64 {
	n := max(n0, 1)
	lg, _ := math.Lgamma(float64(n + 1))
	l := float64(n)*lx - lg/math.Ln2
	for l > -float64(bits) {
		n++
		l += lx - math.Log2(float64(n))
	}
	return n
}

// powUp returns an upper bound of x^k for x ≥ 0, k ≥ 1, at 64 bits.
func powUp(x *big.Float, k int64) *big.Float { return powBound(x, uint64(k), 64, true) }

// factDown returns a lower bound of k! for k ≥ 1: e^k = Σ_j k^j/j! > k^k/k!,
// so k! > (k/e)^k ≥ (k/2.72)^k (the float64 nearest 2.72 exceeds e).
func factDown(k int64) *big.Float {
	base := quoDown(64, new(big.Float).SetInt64(k), big.NewFloat(2.72))
	return powBound(base, uint64(k), 64, false)
}

// ratUp returns a 64-bit upper bound of |a|/b for b > 0.
func ratUp(a, b *big.Int) *big.Float { return quoUp(64, radUp(a), radDown(b)) }

// ratLog2 is log2(|a|/b) in float64, for choosing term counts.
func ratLog2(a, b *big.Int) float64 { return log2Int(new(big.Int).Abs(a)) - log2Int(b) }

// expRatBall returns a ball at unit 2^-w containing exp(a/b) for integers
// a > 0, b > 0, by binary splitting of the Taylor series: with x = a/b and
// N + 2 ≥ 2x,
//
//	exp(x) = 1 + Σ_{k=1}^{N} x^k/k! + R,  0 ≤ R ≤ 2·x^(N+1)/(N+1)!,
//
// since the tail's terms shrink at least by x/(N+2) ≤ 1/2 each. The partial
// sum is (Q + T)/Q exactly (p_k = a, q_k = b·k); R is bounded by powUp
// and factDown.
func expRatBall(a, b *big.Int, w int) ball {
	xf, _ := new(big.Rat).SetFrac(a, b).Float64()
	n := termsFor(ratLog2(a, b), int64(math.Ceil(2*xf))+1, w+8) - 1
	n = max(n, 1)
	jb := new(big.Int)
	_, q, t := binSplit(1, n+1, func(j int64, p, q, t *big.Int) {
		p.Set(a)
		q.Mul(b, jb.SetInt64(j))
		t.Set(a)
	}, false)
	v, _ := ballQuo(ball{t.Add(t, q), 0, new(big.Float)}, ball{q, 0, new(big.Float)}, w)
	tail := quoUp(64, powUp(ratUp(a, b), n+1), factDown(n+1))
	return v.addRadAbs(tail.SetMantExp(tail, 1))
}

// expRatSmall reports whether expRatIval handles r: moderate size and
// |r| ≤ 4096.
func expRatSmall(r *big.Rat) bool { return ratShort(r, 512, 4096) }

// expRatIval encloses exp(r) at precision p for a rational r (see
// expRatSmall): expRatBall at |r|, with the unit chosen for p + 16
// significant bits (exp|r| ≈ 2^(|r|·log2 e)); exp(r) for r < 0 is the
// reciprocal.
func expRatIval(r *big.Rat, p uint) ival {
	if r.Sign() == 0 {
		return ivExact(1)
	}
	a := new(big.Int).Abs(r.Num())
	xf, _ := new(big.Rat).Abs(r).Float64()
	mag := int(math.Floor(xf * math.Log2E))
	v := expRatBall(a, r.Denom(), int(p)+16-mag)
	if r.Sign() > 0 {
		return v.ival(p)
	}
	z, ok := ballQuo(ball{big.NewInt(1), 0, new(big.Float)}, v, int(p)+17+mag)
	if !ok { // v is about exp|r| ≥ 1 with a radius of a few units
		return ival{new(big.Float), fOne}
	}
	return z.ival(p)
}

// sinCosRatBall returns a ball at unit 2^-w containing sin(a/b), or
// cos(a/b) when cos is set, for integers a > 0, b > 0.
//
// sin x = x·Σ_{k≥0} (−x²)^k/(2k+1)! and cos x = Σ_{k≥0} (−x²)^k/(2k)!;
// terms k = 1..N−1 by binSplit with p_k = −a², t_k = p_k and
// q_k = (2k)(2k+1)·b² (sin) or (2k−1)(2k)·b² (cos), so the partial sums
// are a(Q + T)/(bQ) and (Q + T)/Q. With 2N + 1 ≥ x the omitted terms
// alternate in sign and do not grow (their ratio is x² over
// (2k+2)(2k+3) or (2k+1)(2k+2) ≥ (2N+1)²), so the tail is at most the
// first omitted term, x^(2N+1)/(2N+1)! or x^(2N)/(2N)!.
func sinCosRatBall(a, b *big.Int, w int, cos bool) ball {
	xf, _ := new(big.Rat).SetFrac(a, b).Float64()
	m := termsFor(ratLog2(a, b), int64(math.Ceil(xf))+1, w+8)
	var n int64 // the first omitted term has degree m′ = 2N+1 (sin) or 2N (cos), m′ ≥ m
	if cos {
		n = (m + 1) / 2
	} else {
		n = m / 2
	}
	n = max(n, 1)
	a2, b2 := new(big.Int).Mul(a, a), new(big.Int).Mul(b, b)
	off := int64(0)
	if cos {
		off = 1
	}
	var q, t *big.Int
	if n > 1 {
		kb := new(big.Int)
		_, q, t = binSplit(1, n, func(k int64, p, q, t *big.Int) {
			p.Neg(a2)
			q.Mul(b2, kb.SetInt64((2*k-off)*(2*k+1-off)))
			t.Neg(a2)
		}, false)
	} else {
		q, t = big.NewInt(1), new(big.Int)
	}
	num, den := t.Add(t, q), q
	deg := 2 * n
	if !cos {
		num.Mul(num, a)
		den = new(big.Int).Mul(q, b)
		deg++
	}
	v, _ := ballQuo(ball{num, 0, new(big.Float)}, ball{den, 0, new(big.Float)}, w)
	return v.addRadAbs(quoUp(64, powUp(ratUp(a, b), deg), factDown(deg)))
}

// sinCosRatIval encloses sin r (or cos r) at precision p for a rational
// r ≠ 0 with ratSeriesOK(r, 8), by sinCosRatBall at |r| (sin is odd, cos
// even). The unit starts at p + 16 bits after the point, more for small
// |r| (sin r ≈ r); a value with fewer than p + 8 significant bits (r near
// a multiple of π/2) is recomputed with the bits it lacked, twice at most.
func sinCosRatIval(r *big.Rat, p uint, cos bool) ival {
	a := new(big.Int).Abs(r.Num())
	w := int(p) + 16
	if e := a.BitLen() - r.Denom().BitLen(); !cos && e < 0 {
		w -= e
	}
	var v ball
	for i := 0; i < 3; i++ {
		v = sinCosRatBall(a, r.Denom(), w, cos)
		short := int(p) + 12 - v.m.BitLen()
		if short <= 0 {
			break
		}
		w += short
	}
	if !cos && r.Sign() < 0 {
		v.m.Neg(v.m)
	}
	return v.ival(p)
}

// atanRatBall returns a ball at unit 2^-w containing atanh(c/d) (hyper
// set) or atan(c/d), for integers c ≠ 0 and d > 0 with |c/d| ≤ 1/2:
// atanh u = Σ_j u^(2j+1)/(2j+1) and atan u = Σ_j (−1)^j u^(2j+1)/(2j+1).
// Terms j = 1..J−1 by binSplit with p_j = ±(2j−1)c², q_j = (2j+1)d²,
// t_j = p_j, so the partial sum is c(Q + T)/(dQ). The omitted terms are at
// most |u|^(2J+1)/(2J+1)·Σ_i u^(2i) ≤ 2·|u|^(2J+1)/(2J+1) for u² ≤ 1/4.
func atanRatBall(c, d *big.Int, w int, hyper bool) ball {
	lu := -ratLog2(c, d) // bits gained per power of u
	jj := int64(math.Ceil((float64(w+8)/lu - 1) / 2))
	jj = max(jj, 1)
	c2, d2 := new(big.Int).Mul(c, c), new(big.Int).Mul(d, d)
	var q, t *big.Int
	if jj > 1 {
		jb := new(big.Int)
		_, q, t = binSplit(1, jj, func(j int64, p, q, t *big.Int) {
			p.Mul(c2, jb.SetInt64(2*j-1))
			if !hyper {
				p.Neg(p)
			}
			q.Mul(d2, jb.SetInt64(2*j+1))
			t.Set(p)
		}, false)
	} else {
		q, t = big.NewInt(1), new(big.Int)
	}
	num := mulInt(t, t.Add(t, q), c)
	v, _ := ballQuo(ball{num, 0, new(big.Float)}, ball{mulInt(new(big.Int), q, d), 0, new(big.Float)}, w)
	tail := quoUp(64, powUp(ratUp(c, d), 2*jj+1), big.NewFloat(float64(2*jj+1)))
	return v.addRadAbs(tail.SetMantExp(tail, 1))
}

// logRatIval encloses log r at precision p for a rational r > 0, r ≠ 1,
// with ratSeriesOK(r, ∞): r = m·2^e with m in [2/3, 4/3), and
// log r = e·ln 2 + 2·atanh(u) with u = (m − 1)/(m + 1), |u| ≤ 1/5. When
// e = 0 the value is about 2u, so the unit gets the bits u lacks; else
// |log r| ≥ log(4/3) > 1/4.
func logRatIval(r *big.Rat, p uint) ival {
	a, b := new(big.Int).Set(r.Num()), new(big.Int).Set(r.Denom())
	e := a.BitLen() - b.BitLen()
	if e > 0 {
		b.Lsh(b, uint(e))
	} else {
		a.Lsh(a, uint(-e))
	}
	// Now m = a/b in (1/2, 2); move it into [2/3, 4/3).
	if a3 := new(big.Int).Mul(a, big.NewInt(3)); a3.Cmp(new(big.Int).Lsh(b, 1)) < 0 { // m < 2/3
		a.Lsh(a, 1)
		e--
	} else if a3.Cmp(new(big.Int).Lsh(b, 2)) >= 0 { // m ≥ 4/3
		b.Lsh(b, 1)
		e++
	}
	c, d := new(big.Int).Sub(a, b), new(big.Int).Add(a, b)
	if c.Sign() == 0 && e == 0 {
		return ivExact(0)
	}
	w := int(p) + 16 + bits.Len(uint(abs(e)))
	if e == 0 {
		w += d.BitLen() - c.BitLen()
	}
	var v ball
	if c.Sign() != 0 {
		g := new(big.Int).GCD(nil, nil, new(big.Int).Abs(c), d)
		v = ballMulInt(atanRatBall(c.Quo(c, g), d.Quo(d, g), w, true), 2)
	}
	if e != 0 {
		l := ballMulInt(ln2Ball(uint(w+4)), int64(e))
		if v.m == nil {
			v = l
		} else {
			v = ballAdd(v, l)
		}
	}
	return v.ival(p)
}

// atanRatIval encloses atan r at precision p for a rational r ≠ 0 with
// ratSeriesOK(r, ∞) and |r| ≤ 1/2 or |r| ≥ 2 (atanRatOK): the series
// directly, or atan r = ±π/2 − atan(1/r).
func atanRatIval(r *big.Rat, p uint) ival {
	w := int(p) + 16
	c, d := r.Num(), r.Denom()
	if e := c.BitLen() - d.BitLen(); e < 0 {
		w -= e
	}
	if new(big.Int).Abs(c).Cmp(d) < 0 {
		return atanRatBall(c, d, w, false).ival(p)
	}
	// |r| ≥ 2: 1/r = d/c = (−d)/(−c), with a positive denominator.
	hp := halfPiIval(uint(w))
	if c.Sign() < 0 {
		c, d = new(big.Int).Neg(c), new(big.Int).Neg(d)
		hp = ivNeg(hp)
	}
	inv := atanRatBall(d, c, w, false)
	return ivRound(ivSub(hp, inv.ival(uint(w)), uint(w)), p)
}

// atanRatOK reports whether atanRatIval takes r.
func atanRatOK(r *big.Rat) bool {
	if !ratSeriesOK(r, math.Inf(1)) {
		return false
	}
	a := new(big.Int).Abs(r.Num())
	a2 := new(big.Int).Lsh(a, 1)
	return a2.Cmp(r.Denom()) <= 0 || a.Cmp(new(big.Int).Lsh(r.Denom(), 1)) >= 0
}

package exact

// Constants and rational-argument series by binary splitting: π by the
// Chudnovsky series, ln 2 by the atanh series and exp(a/b) by its Taylor
// series. Each sums a finite number of terms exactly in big.Int arithmetic
// and adds an explicit bound on the omitted tail, so the only roundings
// are the final outward ones.

import (
	"math"
	"math/big"
	"sync"
)

// binSplit returns P = Π p_j, Q = Π q_j and T with
// T/Q = Σ_{k=a}^{b−1} c_k·Π_{j=a}^{k} p_j/q_j, given
// leaf(k) = (p_k, q_k, p_k·c_k) for integers p_k, q_k, c_k: the two halves
// combine as T = T₁·Q₂ + P₁·T₂, Q = Q₁·Q₂, all exact.
func binSplit(a, b int64, leaf func(k int64) (p, q, t *big.Int)) (p, q, t *big.Int) {
	if b-a == 1 {
		return leaf(a)
	}
	m := (a + b) / 2
	p1, q1, t1 := binSplit(a, m, leaf)
	p2, q2, t2 := binSplit(m, b, leaf)
	t = new(big.Int).Mul(t1, q2)
	t.Add(t, new(big.Int).Mul(p1, t2))
	return p1.Mul(p1, p2), q1.Mul(q1, q2), t
}

// ln2Compute returns L with L ≤ ln2·2^w < L + 2.
//
// ln 2 = 2·atanh(1/3) = (2/3)·Σ_{j≥0} 9^-j/(2j+1). The first J terms are
// T/Q exactly (binSplit with p_j = 2j−1, q_j = 9(2j+1) for j ≥ 1), and the
// tail is (2/3)·Σ_{j≥J} 9^-j/(2j+1) ≤ (2/3)·(9/8)·9^-J/(2J+1) < 9^-J/4.
// Here J = ⌊(w+2)/3⌋ + 1 ≥ w/3, so 9^J ≥ 8^J ≥ 2^w and the tail is below
// 2^-(w+2). Hence
// ln2·2^w lies in [2^(w+1)·T/(3Q), 2^(w+1)·T/(3Q) + 1/4), and
// L = ⌊2^(w+1)·T/(3Q)⌋ satisfies L ≤ ln2·2^w < L + 2.
func ln2Compute(w uint) *big.Int {
	n := int64(w+2) / 3
	_, q, t := binSplit(0, n+1, func(j int64) (p, q, t *big.Int) {
		if j == 0 {
			return big.NewInt(1), big.NewInt(1), big.NewInt(1)
		}
		p = big.NewInt(2*j - 1)
		return p, big.NewInt(9 * (2*j + 1)), new(big.Int).Set(p)
	})
	t.Lsh(t, w+1)
	return t.Quo(t, q.Mul(q, big.NewInt(3)))
}

var ln2Cache struct {
	sync.Mutex
	l *big.Int // l ≤ ln2·2^w < l + 2
	w uint
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

// Chudnovsky: 1/π = 12 Σ_k (-1)^k (6k)! (A + Bk) / ((3k)! (k!)^3 C^(3k+3/2)),
// written here as π = 426880·√10005 / S with
// S = Σ_k t_k, t_k = (-1)^k (6k)! (A + Bk) / ((3k)! (k!)^3 C^(3k)).
const (
	chudA = 13591409
	chudB = 545140134
	// chudC3over24 is 640320³/24.
	chudC3over24 = 10939058860032000
	// chudLog2D is a lower bound of log2(640320³/1728) = log2(151931373056000)
	// ≈ 47.11; see piIval for its use.
	chudLog2D = 47
)

// chudLeaf is term k of the Chudnovsky sum for binSplit:
// p_k = (6k−5)(2k−1)(6k−1), q_k = k³·C³/24 (p_0 = q_0 = 1) and
// t_k = p_k·(−1)^k·(A + Bk).
func chudLeaf(k int64) (p, q, t *big.Int) {
	if k == 0 {
		p = big.NewInt(1)
		q = big.NewInt(1)
	} else {
		p = big.NewInt(6*k - 5)
		p.Mul(p, big.NewInt(2*k-1))
		p.Mul(p, big.NewInt(6*k-1))
		q = big.NewInt(k)
		q.Mul(q, q)
		q.Mul(q, big.NewInt(k))
		q.Mul(q, big.NewInt(chudC3over24))
	}
	t = new(big.Int).Mul(p, big.NewInt(chudA+chudB*k))
	if k&1 == 1 {
		t.Neg(t)
	}
	return p, q, t
}

// piChudnovsky encloses π at precision p.
//
// Tail bound: the ratio |t_(k+1)/t_k| is
// 8(6k+1)(6k+3)(6k+5)/(k+1)³ · (A+B(k+1))/(A+Bk) / 640320³, and
// 8(6k+1)(6k+3)(6k+5)/(k+1)³ < 8·216 = 1728, so (6N)!/((3N)!(N!)³) ≤ 1728^N
// and |t_N| ≤ (A+BN)/D^N with D = 640320³/1728 = 151931373056000 ≥ 2^47.
// The ratio is below 1, so the series alternates with decreasing terms and
// the tail after N terms is at most |t_N| ≤ (A+BN)·2^(-47N).
func piChudnovsky(p uint) ival {
	w := p + 32
	n := int64(w)/chudLog2D + 2
	_, q, t := binSplit(0, n, chudLeaf)
	tail := fUp(64).SetInt64(chudA + chudB*n)
	tail.SetMantExp(tail, -int(chudLog2D*n))
	tf := new(big.Float).SetInt(t)
	qf := new(big.Float).SetInt(q)
	s := fDown(w).Quo(tf, qf)
	sLo := sub(fDown(w), s, tail)
	s = fUp(w).Quo(tf, qf)
	sHi := fUp(w).Add(s, tail)
	root := ivSqrt(ivPoint(big.NewFloat(10005)), w)
	num := ivMul(root, ivPoint(big.NewFloat(426880)), w)
	return ivRound(ival{quoDown(w, num.lo, sHi), quoUp(w, num.hi, sLo)}, p)
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

// expRatSmall reports whether expRatIval handles r: moderate size and
// |r| ≤ 4096.
func expRatSmall(r *big.Rat) bool {
	if r.Num().BitLen()+r.Denom().BitLen() > 512 {
		return false
	}
	f, _ := r.Float64()
	return math.Abs(f) <= 4096
}

// expRatIval encloses exp(r) at precision p for a rational r (see
// expRatSmall) by binary splitting of the Taylor series of exp(|r|):
// with x = |r| = a/b and N + 2 ≥ 2x,
//
//	exp(x) = 1 + Σ_{k=1}^{N} x^k/k! + R,  0 ≤ R ≤ 2·x^(N+1)/(N+1)!,
//
// since the tail's terms shrink at least by x/(N+2) ≤ 1/2 each. The partial
// sum is the exact fraction 1 + T/Q and the bound 2·P·a/(Q·b·(N+1)) is
// exact too; exp(r) for r < 0 is the reciprocal.
func expRatIval(r *big.Rat, p uint) ival {
	if r.Sign() == 0 {
		return ivExact(1)
	}
	w := p + 16
	a := new(big.Int).Abs(r.Num())
	b := r.Denom()
	xf, _ := new(big.Rat).Abs(r).Float64()
	// Choose N: smallest N ≥ max(2x, 1) with log2(x^(N+1)/(N+1)!) ≤ -(w+8),
	// estimated in float64 (the bound used below is exact regardless).
	n := int64(2*math.Ceil(xf)) + 1
	lx := math.Log2(xf)
	lg, _ := math.Lgamma(float64(n + 2))
	l := float64(n+1)*lx - lg/math.Ln2
	for l > -float64(w+8) {
		n++
		l += lx - math.Log2(float64(n+1))
	}
	// Σ_{k=1}^{N} Π_{j=1}^{k} a/(b·j) = T/Q by binSplit, with P = a^N.
	pp, q, t := binSplit(1, n+1, func(j int64) (p, q, t *big.Int) {
		return new(big.Int).Set(a), new(big.Int).Mul(b, big.NewInt(j)), new(big.Int).Set(a)
	})
	// Partial sum 1 + T/Q.
	num := new(big.Int).Add(q, t)
	numF := new(big.Float).SetInt(num)
	qF := new(big.Float).SetInt(q)
	lo := fDown(w).Quo(numF, qF)
	hi := fUp(w).Quo(numF, qF)
	// Tail bound 2·P·a / (Q·b·(N+1)).
	rn := new(big.Int).Mul(pp, a)
	rn.Lsh(rn, 1)
	rd := new(big.Int).Mul(q, b)
	rd.Mul(rd, big.NewInt(n+1))
	tail := fUp(64).Quo(new(big.Float).SetInt(rn), new(big.Float).SetInt(rd))
	hi = fUp(w).Add(hi, tail)
	v := ival{lo, hi}
	if r.Sign() < 0 {
		v = ival{quoDown(w, fOne, v.hi), quoUp(w, fOne, v.lo)}
	}
	return ivRound(v, p)
}

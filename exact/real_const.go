package exact

// Constants and rational-argument series by binary splitting: π by the
// Chudnovsky series and exp(a/b) by its Taylor series. Both sum a finite
// number of terms exactly in big.Int arithmetic and add an explicit bound
// on the omitted tail, so the only roundings are the final outward ones.

import (
	"math"
	"math/big"
	"sync"
)

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

func chudBS(a, b int64) (p, q, t *big.Int) {
	if b-a == 1 {
		if a == 0 {
			p = big.NewInt(1)
			q = big.NewInt(1)
		} else {
			p = big.NewInt(6*a - 5)
			p.Mul(p, big.NewInt(2*a-1))
			p.Mul(p, big.NewInt(6*a-1))
			q = big.NewInt(a)
			q.Mul(q, q)
			q.Mul(q, big.NewInt(a))
			q.Mul(q, big.NewInt(chudC3over24))
		}
		t = new(big.Int).Mul(p, big.NewInt(chudA+chudB*a))
		if a&1 == 1 {
			t.Neg(t)
		}
		return p, q, t
	}
	m := (a + b) / 2
	p1, q1, t1 := chudBS(a, m)
	p2, q2, t2 := chudBS(m, b)
	t = new(big.Int).Mul(t1, q2)
	t.Add(t, new(big.Int).Mul(p1, t2))
	return p1.Mul(p1, p2), q1.Mul(q1, q2), t
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
	_, q, t := chudBS(0, n)
	tail := fUp(64).SetInt64(chudA + chudB*n)
	tail.SetMantExp(tail, -int(chudLog2D*n))
	tf := new(big.Float).SetInt(t)
	qf := new(big.Float).SetInt(q)
	s := fDown(w).Quo(tf, qf)
	sLo := fDown(w).Sub(s, tail)
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

// expBS sums Σ_{k=l}^{r-1} Π_{j=l}^{k} a/(b·j) = T/Q, with P = a^(r-l) and
// Q = b^(r-l)·(r-1)!/(l-1)!.
func expBS(a, b *big.Int, l, r int64) (p, q, t *big.Int) {
	if r-l == 1 {
		q = new(big.Int).Mul(b, big.NewInt(l))
		return new(big.Int).Set(a), q, new(big.Int).Set(a)
	}
	m := (l + r) / 2
	p1, q1, t1 := expBS(a, b, l, m)
	p2, q2, t2 := expBS(a, b, m, r)
	t = new(big.Int).Mul(t1, q2)
	t.Add(t, new(big.Int).Mul(p1, t2))
	return p1.Mul(p1, p2), q1.Mul(q1, q2), t
}

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
	pp, q, t := expBS(a, b, 1, n+1)
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

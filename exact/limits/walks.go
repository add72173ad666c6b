package limits

import (
	"fmt"
	"math"
	"math/big"
)

// A geometric walk t = ratio^k sees f only on a lattice of scales: a
// quantity that oscillates in log t with a period dividing log(1/ratio)
// (cos(2π·log t/log 2) at ratio 1/2), or one that vanishes on the lattice
// (sin(π/t) at ratio 1/3, where 1/t is an integer), looks constant along
// it. A second walk at a ratio whose logarithm is not a small rational
// multiple of the first's sees other scales, and the two walks disagree.

// aliasHeight is the largest a for which SecondRatio keeps a·log r2/log r1
// away from the integers: an oscillation with log-period log(1/r1)/a for
// a ≤ aliasHeight is seen by at least one of the two walks.
const aliasHeight = 6

// SecondRatio returns the ratio of a second walk for a walk at ratio r,
// and the number of steps that takes it about as close to the target as
// steps steps at r do (at least min(steps, 6), at most MaxSteps).
//
// It is r·p/q for the simple fraction p/q in [1/2, 4/5] (q ≤ 7) for which
// x = log r2/log r is furthest from the rationals of height aliasHeight,
// min over a ≤ aliasHeight of the distance from a·x to the nearest
// integer, ties going to the smaller q. The second ratio's numerator is at
// least 2, so its walk never meets only integers 1/t (toward 0) or t
// (toward infinity): f(t) = sin(π/t) and sin(π·t) are not zero all along
// both walks.
func SecondRatio(r *big.Rat, steps int) (*big.Rat, int) {
	lr := ratLog(r)
	var best *big.Rat
	bestScore := -1.0
	var bestX float64
	for q := int64(2); q <= 7; q++ {
		for p := (q + 1) / 2; 5*p <= 4*q; p++ {
			if new(big.Int).GCD(nil, nil, big.NewInt(p), big.NewInt(q)).Int64() != 1 {
				continue
			}
			r2 := new(big.Rat).Mul(r, big.NewRat(p, q))
			if r2.Num().Cmp(big.NewInt(1)) == 0 {
				continue
			}
			x := ratLog(r2) / lr
			if s := aliasScore(x); s > bestScore+1e-12 {
				best, bestScore, bestX = r2, s, x
			}
		}
	}
	n := int(math.Ceil(float64(steps) / bestX))
	n = min(max(n, min(steps, 6), MinSteps), MaxSteps)
	return best, n
}

// aliasScore is min over a = 1 … aliasHeight of the distance from a·x to
// the nearest integer.
func aliasScore(x float64) float64 {
	s := 1.0
	for a := 1; a <= aliasHeight; a++ {
		y := float64(a) * x
		s = min(s, math.Abs(y-math.Round(y)))
	}
	return s
}

// ratLog is the natural logarithm of a positive rational, also beyond
// float64's range.
func ratLog(r *big.Rat) float64 {
	return (log2Abs(new(big.Float).SetInt(r.Num())) - log2Abs(new(big.Float).SetInt(r.Denom()))) * math.Ln2
}

// orderAgreement: two order or growth estimates agree when they differ by
// at most this fraction of max(1, |order|).
const orderAgreement = 0.05

// Agree combines the estimates a and b of two walks toward one target. The
// walks agree when both find a limit and the gap between them is within
// the larger error estimate, or both find a blow-up at growth rates within
// orderAgreement of each other, or both find neither. The result is a's
// estimate, its error estimate raised to b's (and Digits lowered to
// match) when the limits agree; why says in words how they disagree.
func Agree(a, b Estimate) (e Estimate, agree bool, why string) {
	e = a
	switch {
	case a.Limit != nil && b.Limit != nil:
		gap := absDiff(a.Limit, b.Limit, max(a.Limit.Prec(), b.Limit.Prec())+64)
		bound := maxF(a.ErrorEst, b.ErrorEst)
		if gap.Cmp(bound) > 0 {
			return e, false, fmt.Sprintf("the walks' limits %s and %s differ by %s, more than their error estimates (%s and %s)",
				a.Limit.Text('g', 12), b.Limit.Text('g', 12), gap.Text('e', 2), a.ErrorEst.Text('e', 2), b.ErrorEst.Text('e', 2))
		}
		e.ErrorEst = newF(64).Set(bound)
		e.Digits = min(a.Digits, b.Digits)
		return e, true, ""
	case a.Diverges && b.Diverges:
		if math.Abs(a.Growth-b.Growth) > orderAgreement*max(1, math.Abs(a.Growth)) {
			return e, false, fmt.Sprintf("both walks blow up, but at different rates (h^−%s and h^−%s)", formatOrder(a.Growth), formatOrder(b.Growth))
		}
		return e, true, ""
	case a.Limit == nil && !a.Diverges && b.Limit == nil && !b.Diverges:
		return e, true, ""
	}
	return e, false, "the first walk " + outcome(a) + ", the second " + outcome(b)
}

// outcome says in a few words what a walk found.
func outcome(e Estimate) string {
	switch {
	case e.Limit != nil:
		return "converges to " + e.Limit.Text('g', 12)
	case e.Diverges:
		return "blows up (" + e.Reason + ")"
	}
	return "shows no convergence (" + e.Reason + ")"
}

// OrderConsistent is OrderCheck's answer for an estimated order close to
// the stated one.
const OrderConsistent = "consistent"

// OrderCheck compares an estimated order (the convergence order, or the
// growth rate of a blow-up) with a stated one: OrderConsistent within
// orderAgreement of max(1, |stated|), "fails" beyond OrderFailure of it,
// "undecided" in between or when no order was estimated (got = 0 for a
// converging walk). Like every order here, got is an estimate.
func OrderCheck(got, stated float64, estimated bool) string {
	d := math.Abs(got-stated) / max(1, math.Abs(stated))
	switch {
	case !estimated:
		return VerdictUndecided
	case d <= orderAgreement:
		return OrderConsistent
	case d > OrderFailure:
		return VerdictFails
	}
	return VerdictUndecided
}

// OrderFailure is the relative difference (of max(1, |stated|)) beyond
// which OrderCheck calls a stated order false.
const OrderFailure = 0.25

// FormatOrder writes an order or growth rate as the reports do: an
// integer or a small fraction when it is that within 10^−6, else three
// significant digits.
func FormatOrder(x float64) string { return formatOrder(x) }

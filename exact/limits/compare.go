package limits

import (
	"math"
	"math/big"
)

// The verdicts Compare returns.
const (
	VerdictEstimated = "estimated"
	VerdictFails     = "fails"
	VerdictUndecided = "undecided"
)

// FailFactor is how many times the error estimate a gap must exceed for
// Compare to call a claim false: the error estimate is only an estimate,
// so a gap merely above it is not enough.
const FailFactor = 10

// Compare decides a limit claim against an expected value (which should
// be known to more digits than the estimate; a float64 constant is not):
//
//   - "estimated" when the gap |Limit − expect| is within ErrorEst,
//     with digits = e.Digits (at least 1 digit must be trusted, else the
//     verdict is "undecided");
//   - "fails" when the gap exceeds FailFactor × ErrorEst, with digits the
//     number of leading digits that do agree, floor(−log10(gap/max(1,
//     |expect|))) (at least 0);
//   - "undecided" in between, with the same count of agreeing digits.
//
// A sequence that blows up fails any finite expected value; one that
// shows no convergence is undecided. gap is |Limit − expect|, or +Inf when
// there is no limit (or no expected value). Like the estimate itself, the
// verdict rests on an error estimate, not a certified bound.
func Compare(e Estimate, expect *big.Float) (verdict string, digits int, gap *big.Float) {
	inf := new(big.Float).SetInf(false)
	if e.Limit == nil || e.ErrorEst == nil || expect == nil || expect.IsInf() {
		if e.Diverges && expect != nil && !expect.IsInf() {
			return VerdictFails, 0, inf
		}
		return VerdictUndecided, 0, inf
	}
	prec := max(e.Limit.Prec(), expect.Prec()) + 64
	gap = new(big.Float).SetPrec(prec).Sub(e.Limit, expect)
	gap.Abs(gap)
	agree := agreeing(gap, expect, prec)
	switch {
	case gap.Cmp(e.ErrorEst) <= 0:
		if e.Digits < 1 {
			return VerdictUndecided, 0, gap
		}
		return VerdictEstimated, e.Digits, gap
	case gap.Cmp(new(big.Float).Mul(e.ErrorEst, big.NewFloat(FailFactor))) > 0:
		return VerdictFails, agree, gap
	}
	return VerdictUndecided, agree, gap
}

// agreeing returns floor(−log10(gap/max(1, |expect|))), at least 0.
func agreeing(gap, expect *big.Float, prec uint) int {
	lg := log2Abs(gap)
	if math.IsInf(lg, -1) {
		return int(float64(prec) * math.Log10(2))
	}
	scale := max(0, log2Abs(expect))
	return max(0, int(math.Floor((scale-lg)*math.Log10(2))))
}

// Package limits is the numerical core of assay's limit claims: given the
// values of a quantity f(t) along a geometric walk of the parameter toward
// a target (0, a finite value, or infinity), it estimates the limit by
// extrapolation, the order of convergence and the size of the remaining
// error, and it recognises sequences that blow up (reporting their growth
// rate) or that do not settle at all.
//
// Everything this package says about a limit is an ESTIMATE. The limit is
// extrapolated from finitely many values, and the error estimate comes
// from how well successive extrapolants agree: it is not a certified
// bound, and a quantity that changes its behaviour beyond the last step
// (or whose asymptotic expansion the methods misread) can fool it. The
// values themselves may be certified (midpoints of exact.Real enclosures
// taken at a precision well above the target), but nothing after them is.
//
// # The walk
//
// Grid makes the parameters t_k and the distances h_k = ratio^(k+1) to the
// target, k = 0 … steps−1. On such a geometric grid a quantity with an
// expansion f = L + Σ c_j h^(p_j) gives a sequence whose differences
// Δ_k = f_{k+1} − f_k shrink like ratio^(p·k), so the local order
//
//	p_k = log(|Δ_k| / |Δ_{k+1}|) / log(1/ratio)
//
// tends to the leading order p, and the error of the raw value f_k is about
// C·h_k^p.
//
// # The methods
//
// Analyse runs, on the same values,
//
//   - Richardson extrapolation: the leading order p is estimated from the
//     local orders (and snapped to a nearby fraction with denominator at
//     most 4 when the estimate is that close to one), and the table
//     eliminates the orders p, p+q, p+2q, … for q = 1, q = p and q
//     estimated from the first eliminated column, keeping the variant
//     whose extrapolants agree best;
//   - Aitken's Δ² process, iterated (each level applied to the previous),
//     run only when the local orders have settled to within 1% (it is the
//     method most easily deceived, settling on plateaus, by a walk that has
//     not reached its asymptotic regime);
//   - Wynn's ε algorithm, which is exact for finite sums of geometric
//     sequences — what f(h_k) = L + Σ c_j h_k^(p_j) is on a geometric grid;
//   - the last term itself, whose error is estimated from the last
//     differences and the order.
//
// Each method's extrapolant after step k uses f_0 … f_k (the diagonal of
// its table). A method's error estimate is the larger of
//
//   - the last two gaps between its successive extrapolants, enlarged to
//     g·ρ/(1 − ρ) when they shrink only linearly (ρ = ratio of the gaps
//     above 1/2), since such extrapolants are still that far from their
//     limit;
//   - twice the change of its last extrapolant when the values are moved
//     by their own noise level 2^−prec·max|f| (two fixed pseudo-random
//     sign patterns): amplified noise runs through all the extrapolants
//     alike, so their agreement alone misses it;
//   - for Aitken, the gap between its top level and the level below at
//     the last step (high levels can inherit a plateau from a lower level
//     whose error passed through zero);
//   - a few units of the values' last place.
//
// The method with the smallest estimate is chosen, an earlier one in the
// list above (last term, Richardson, Aitken, Wynn) being kept unless a
// later one is better by more than a factor 2. When another method's own
// estimate would make it call the chosen limit false (the two disagree by
// more than FailFactor times that estimate), the chosen estimate is
// raised to cover the disagreement. Aitken's and Wynn's tables stop where
// a difference they would divide by falls to the values' noise level.
//
// The local orders have settled when, somewhere in the later half of the
// walk, three successive ones agree to within 5% (of max(1, |p|)) over
// differences of one sign, with at least six values in all; Richardson,
// Aitken and Wynn need that (or a sequence already at the noise level),
// and otherwise only the last term is used.
//
// Before extrapolating, Analyse decides whether the sequence converges at
// all: the differences must shrink geometrically (a least-squares fit of
// log|Δ_k| over the last half of the walk), or have already fallen to the
// noise level. Differences that grow geometrically while |f| grows at the
// same rate mean blow-up, reported with the growth rate q in |f| ≈ C·h^−q
// (or as faster than any power, or as logarithmic growth when the
// differences tend to a constant). No limit is reported either for
// oscillation, for differences that change sign at the last step after
// keeping one sign (a turning point before the asymptotic regime), or
// for local orders that drift toward 0 like 1/k (logarithmic convergence,
// as of 1/log(1/h), which no power-law extrapolation handles); Reason
// says which. Irregular but geometric convergence (t·sin(1/t)) leaves only
// the last term.
//
// # Two walks
//
// A geometric walk sees f only at the scales ratio^k, so a quantity that
// oscillates in log t with a period dividing log(1/ratio), or vanishes on
// that lattice, looks constant along it. SecondRatio picks a second ratio
// whose logarithm is no small rational multiple of the first's, and Agree
// accepts a limit (or a blow-up) only when both walks find it within
// their error estimates. OrderCheck compares an estimated order with a
// stated one. All of it is still an estimate.
//
// Compare turns an estimate and an expected value into a verdict: the
// digits that agree when the gap is within the error estimate, a failure
// when the gap is clearly (ten times) larger, undecided in between.
package limits

package limits

import (
	"fmt"
	"math"
	"math/big"
	"strconv"
)

// Estimate is the result of analysing f(t_k). Every number in it is an
// estimate drawn from finitely many values, not a certified bound.
type Estimate struct {
	// Limit is the extrapolated limit, at the values' precision; nil when
	// the sequence blows up or shows no convergence.
	Limit *big.Float
	// ErrorEst is the estimated |Limit − true limit|, from the agreement of
	// the chosen method's last extrapolants (never below a few units of the
	// values' last place) — an estimate, not a bound. Nil with Limit.
	ErrorEst *big.Float
	// Digits is the number of decimal digits the estimate is trusted to,
	// floor(−log10(ErrorEst / max(1, |Limit|))), at least 0.
	Digits int
	// Method is the method chosen: MethodRichardson, MethodAitken,
	// MethodWynn or MethodLastTerm; "" when there is no limit.
	Method string
	// Detail says more about the method in words, e.g. the orders a
	// Richardson table eliminated.
	Detail string
	// Order is the estimated convergence order p, error ≈ C·h^p (0 if not
	// estimated).
	Order float64
	// Diverges says that |f| grows without bound.
	Diverges bool
	// Growth is, when Diverges, the q with |f| ≈ C·h^−q (0 for a
	// logarithmic growth).
	Growth float64
	// Differences are f_{k+1} − f_k, k = 0 … n−2 (nil when the input was
	// rejected).
	Differences []*big.Float
	// Extrapolants are the chosen method's extrapolant after each step k
	// (from f_0 … f_k), nil where not defined; nil when there is no limit.
	Extrapolants []*big.Float
	// Reason says why no limit was found (too few steps, blow-up,
	// oscillation, …); "" when there is one.
	Reason string
}

// noiseGuardBits is the margin, in bits, above the values' noise level
// 2^−prec·|f| below which a difference counts as noise.
const noiseGuardBits = 16

// floorUlps: an error estimate is never below 2^floorUlps units of the
// values' last place (relative to max|f|).
const floorUlps = 2

// seq holds a sequence under analysis.
type seq struct {
	n        int
	prec, wp uint
	r        *big.Rat
	lr       float64 // log2(1/ratio)
	f        []*big.Float
	d        []*big.Float // f_{k+1} − f_k, exact at wp
	ld       []float64    // log2|Δ_k|
	inf      []bool       // Δ_k above the local noise level
	tau      *big.Float   // global noise threshold 2^(guard−prec)·max|f|
	ltau     float64
	floor    *big.Float // smallest error estimate
	lScale   float64    // log2 max|f|, or 0 when every value is 0

	perturbed [][]*big.Float // see perturbations
}

// Analyse estimates the limit of values (f(t_k), e.g. midpoints of
// certified enclosures at a precision the caller chose, say 3–4 times the
// target digits) along the distances hs (h_k = ratio^(k+1), as Grid makes
// them: any geometric sequence decreasing to 0 will do, only its ratio is
// used). The values' precision (the largest Prec among them) sets the noise
// level. See the package documentation for the methods and how one is
// chosen; when no limit is found, Reason says why.
func Analyse(hs []*big.Rat, values []*big.Float) Estimate {
	var e Estimate
	n := len(values)
	if len(hs) != n {
		e.Reason = fmt.Sprintf("%d distances but %d values", len(hs), n)
		return e
	}
	if n < 3 {
		e.Reason = "too few steps: at least 3 values are needed"
		return e
	}
	r, err := gridRatio(hs)
	if err != nil {
		e.Reason = err.Error()
		return e
	}
	var prec uint
	for k, v := range values {
		if v == nil {
			e.Reason = fmt.Sprintf("value %d is missing", k)
			return e
		}
		if v.IsInf() {
			e.Reason = fmt.Sprintf("value %d is infinite", k)
			return e
		}
		prec = max(prec, v.Prec())
	}
	if prec == 0 {
		prec = 64
	}
	s := newSeq(r, values, prec)
	e.Differences = make([]*big.Float, n-1)
	for k, d := range s.d {
		e.Differences[k] = newF(s.wp).Set(d)
	}
	s.analyse(&e)
	return e
}

func newSeq(r *big.Rat, values []*big.Float, prec uint) *seq {
	n := len(values)
	wp := prec + 64
	s := &seq{n: n, prec: prec, wp: wp, r: r}
	rf, _ := r.Float64()
	s.lr = -math.Log2(rf)
	if math.IsInf(s.lr, 0) || s.lr == 0 {
		// A ratio beyond float64 range: fall back to exact logarithms.
		s.lr = -log2Abs(newF(wp).SetRat(r))
	}
	s.f = make([]*big.Float, n)
	lf := make([]float64, n)
	scale := math.Inf(-1)
	for k, v := range values {
		s.f[k] = newF(wp).Set(v)
		lf[k] = log2Abs(v)
		scale = max(scale, lf[k])
	}
	s.d = make([]*big.Float, n-1)
	s.ld = make([]float64, n-1)
	s.inf = make([]bool, n-1)
	run := math.Inf(-1)
	for k := range n - 1 {
		s.d[k] = newF(wp).Sub(s.f[k+1], s.f[k])
		s.ld[k] = log2Abs(s.d[k])
		run = max(run, lf[k], lf[k+1])
		s.inf[k] = s.ld[k] > run-float64(prec)+noiseGuardBits
	}
	if math.IsInf(scale, -1) {
		scale = 0 // all values zero: count the noise as absolute
	}
	s.lScale = scale
	s.ltau = scale - float64(prec) + noiseGuardBits
	s.tau = newF(wp).SetMantExp(newF(wp).SetInt64(1), int(math.Ceil(s.ltau)))
	s.floor = newF(64).SetMantExp(newF(64).SetInt64(1), int(math.Ceil(scale))-int(prec)+floorUlps)
	return s
}

// localOrders returns p_k = (log2|Δ_k| − log2|Δ_{k+1}|)/lr for the k where
// both differences are informative, NaN elsewhere.
func localOrders(ld []float64, inf []bool, lr float64) []float64 {
	if len(ld) < 2 {
		return nil
	}
	p := make([]float64, len(ld)-1)
	for k := range p {
		if inf[k] && inf[k+1] {
			p[k] = (ld[k] - ld[k+1]) / lr
		} else {
			p[k] = math.NaN()
		}
	}
	return p
}

// orderPick is the order read off a run of local orders.
type orderPick struct {
	ok      bool
	p       float64 // the local order at the chosen index
	k       int     // the chosen index
	spread  float64 // |p_{k+1} − p_k| + |p_k − p_{k−1}|
	regular bool    // the local orders have settled there
}

// pickOrder chooses, in the later half of the local orders p (p_k from
// the differences d_k and d_{k+1}), the index where they change least
// (|p_{k+1} − p_k| + |p_k − p_{k−1}|): there the local order has settled
// and noise has not yet spoilt it. The run is regular when the change
// there is below regularSpread·max(1, |p|), the four differences involved
// share one sign, and there are at least four local orders.
func pickOrder(p []float64, d []*big.Float) orderPick {
	var cand []int
	for k := 1; k+1 < len(p); k++ {
		if !math.IsNaN(p[k-1]) && !math.IsNaN(p[k]) && !math.IsNaN(p[k+1]) {
			cand = append(cand, k)
		}
	}
	if len(cand) == 0 {
		// At most pairs: take the last defined local order, irregular.
		for k := len(p) - 1; k >= 0; k-- {
			if !math.IsNaN(p[k]) {
				return orderPick{ok: true, p: p[k], k: k, spread: math.Inf(1)}
			}
		}
		return orderPick{}
	}
	// Settling needs at least four local orders (six values): three alone
	// agree by chance too easily.
	enough := len(cand) >= 2
	if len(cand) > 3 {
		cand = cand[len(cand)/2:]
	}
	best := orderPick{ok: true, spread: math.Inf(1)}
	for _, k := range cand {
		c := math.Abs(p[k+1]-p[k]) + math.Abs(p[k]-p[k-1])
		if c <= best.spread {
			best.p, best.k, best.spread = p[k], k, c
		}
	}
	k := best.k
	sg := d[k-1].Sign()
	best.regular = enough && best.spread <= regularSpread*max(1, math.Abs(best.p)) &&
		d[k].Sign() == sg && d[k+1].Sign() == sg && d[k+2].Sign() == sg
	return best
}

// regression fits log2|Δ_k| ≈ a − p·lr·k by least squares over the last
// half (at least 4) of the informative differences, returning p and its
// standard error; ok is false with fewer than 3 informative differences.
func regression(ld []float64, inf []bool, lr float64) (p, sigma float64, ok bool) {
	var idx []int
	for k := range ld {
		if inf[k] {
			idx = append(idx, k)
		}
	}
	if len(idx) < 3 {
		return 0, math.Inf(1), false
	}
	w := max(4, (len(idx)+1)/2)
	if w < len(idx) {
		idx = idx[len(idx)-w:]
	}
	m := float64(len(idx))
	var sx, sy float64
	for _, k := range idx {
		sx += float64(k)
		sy += ld[k]
	}
	mx, my := sx/m, sy/m
	var sxx, sxy float64
	for _, k := range idx {
		dx := float64(k) - mx
		sxx += dx * dx
		sxy += dx * (ld[k] - my)
	}
	b := sxy / sxx
	var rss float64
	for _, k := range idx {
		res := ld[k] - my - b*(float64(k)-mx)
		rss += res * res
	}
	sigma = math.Inf(1)
	if len(idx) > 2 {
		sigma = math.Sqrt(rss/(m-2)/sxx) / lr
	}
	return -b / lr, sigma, true
}

// analyse classifies the sequence and fills e.
func (s *seq) analyse(e *Estimate) {
	n := s.n
	// The last two differences at the noise level: converged as far as the
	// values can tell.
	converged := s.ld[n-2] <= s.ltau && s.ld[n-3] <= s.ltau
	if !converged && n < 5 {
		e.Reason = "too few steps: at least 5 values are needed to judge convergence"
		return
	}
	p := localOrders(s.ld, s.inf, s.lr)
	pick := pickOrder(p, s.d)
	pfit, sigma, fitOK := regression(s.ld, s.inf, s.lr)
	const eps = 0.01
	switch {
	case !converged && s.turning():
		e.Reason = "no convergence seen yet: the differences change sign at the last step after keeping one sign (a turning point: the walk may not have reached the asymptotic regime; take more steps)"
		return
	case !converged && logarithmic(p):
		e.Reason = "converges too slowly to extrapolate: the local order drifts toward 0 like 1/k (logarithmic convergence, as of 1/log(1/h))"
		return
	case converged, fitOK && pfit-2*sigma > eps:
		s.extrapolate(e, pick, pfit, fitOK, converged)
		return
	case fitOK && pfit+2*sigma < -eps:
		// The differences grow geometrically.
		q := -pfit
		if pick.regular && pick.p < 0 {
			q = -pick.p
		}
		// |f| itself must grow at the rate its differences do: |f| ≈ C·h^−q
		// gives |f_{n−1}/f_{n−2}| = ratio^−q. Growing differences on a
		// quantity that hardly grows are a pre-asymptotic turn.
		qf := (log2Abs(s.f[n-1]) - log2Abs(s.f[n-2])) / s.lr
		last, faster := fasterThanPowers(p)
		switch {
		case !s.sameSignTail():
			e.Reason = "no convergence: the values oscillate with growing amplitude"
		case !s.growing():
			e.Reason = fmt.Sprintf("no convergence seen: the values move by growing steps of one sign (like h^−%s) but |f| is not growing yet (it may be crossing zero); take more steps", formatOrder(q))
		case faster && qf > 0.5*last:
			e.Diverges = true
			e.Growth = last
			e.Reason = fmt.Sprintf("grows faster than any power of 1/h (like h^−%s at the last steps)", formatOrder(last))
		case math.Abs(qf-q) > 0.3*q:
			e.Reason = fmt.Sprintf("no convergence seen: the differences grow like h^−%s but |f| does not yet grow in proportion (like h^−%s at the last step): not yet asymptotic, or a slow blow-up on top of a large constant; take more steps", formatOrder(q), formatOrder(qf))
		default:
			e.Diverges = true
			e.Growth = q
			e.Reason = "grows like h^−" + formatOrder(q)
		}
		return
	case pick.regular && math.Abs(pick.p) <= eps && s.sameSignTail() && s.growing():
		e.Diverges = true
		e.Growth = 0
		e.Reason = "grows like log(1/h): the differences tend to a nonzero constant"
		return
	case !fitOK:
		e.Reason = "too few informative steps: the differences are at the noise level except for a few"
		return
	case !s.sameSignTail():
		e.Reason = "no convergence: the values oscillate without settling (the differences do not shrink)"
	default:
		e.Reason = "no convergence seen: the differences do not shrink geometrically (the quantity may drift, or converge too slowly to extrapolate)"
	}
}

// logarithmic says whether the local orders look like those of a
// logarithmically convergent sequence (f ≈ L + c/log(1/h)^a), which
// shrink like 1/k: over the last half (at least 6) of the positive local
// orders, 1/p_k grows linearly in k, through the origin or nearly (the
// fitted slope accounts for more than 70% of the last 1/p_k), at a rate
// that does not fade (the second half of the window rises at least 60% as
// fast as the first; a sequence whose order settles at a small positive
// value rises ever more slowly).
func logarithmic(p []float64) bool {
	var ks, ys []float64
	for k, v := range p {
		if !math.IsNaN(v) && v > 0 {
			ks = append(ks, float64(k))
			ys = append(ys, 1/v)
		}
	}
	if len(ks) < 6 {
		return false
	}
	w := max(6, len(ks)/2)
	ks, ys = ks[len(ks)-w:], ys[len(ys)-w:]
	var mx, my float64
	for i := range ks {
		mx += ks[i]
		my += ys[i]
	}
	mx /= float64(w)
	my /= float64(w)
	var sxx, sxy float64
	for i := range ks {
		sxx += (ks[i] - mx) * (ks[i] - mx)
		sxy += (ks[i] - mx) * (ys[i] - my)
	}
	slope := sxy / sxx
	last, mid := w-1, w/2
	if slope*(ks[last]+1)/ys[last] <= 0.7 {
		return false
	}
	first := (ys[mid] - ys[0]) / (ks[mid] - ks[0])
	second := (ys[last] - ys[mid]) / (ks[last] - ks[mid])
	return first > 0 && second >= 0.6*first
}

// growing says that |f| increased over the last three steps.
func (s *seq) growing() bool {
	n := s.n
	return cmpAbs(s.f[n-1], s.f[n-2]) > 0 && cmpAbs(s.f[n-2], s.f[n-3]) > 0
}

// turning says that the last two differences are informative and of
// opposite signs while the rest of the last half (at least 4) kept the
// sign of the one before last.
func (s *seq) turning() bool {
	m := len(s.d)
	if !s.inf[m-1] || !s.inf[m-2] {
		return false
	}
	sg := s.d[m-2].Sign()
	if s.d[m-1].Sign() == sg {
		return false
	}
	from := max(0, min(m/2, m-4))
	for _, d := range s.d[from : m-1] {
		if d.Sign() != sg {
			return false
		}
	}
	return true
}

// sameSignTail says that the last half of the differences (at least 3)
// share one nonzero sign.
func (s *seq) sameSignTail() bool {
	m := len(s.d)
	from := min(m/2, m-3)
	from = max(from, 0)
	sign := s.d[m-1].Sign()
	if sign == 0 {
		return false
	}
	for _, d := range s.d[from:] {
		if d.Sign() != sign {
			return false
		}
	}
	return true
}

// fasterThanPowers says whether the last three local orders are negative
// and each at least 1.5 times the one before (the rate of growth itself
// grows geometrically, as for exp(1/h)), returning −p at the last one.
func fasterThanPowers(p []float64) (float64, bool) {
	var last []float64
	for k := len(p) - 1; k >= 0 && len(last) < 3; k-- {
		if math.IsNaN(p[k]) {
			break
		}
		last = append(last, p[k])
	}
	if len(last) < 3 {
		return 0, false
	}
	// last[0] is the latest.
	if last[2] < 0 && last[1] < 1.5*last[2] && last[0] < 1.5*last[1] {
		return -last[0], true
	}
	return 0, false
}

// formatOrder writes an order or growth rate: an integer or a fraction
// with denominator ≤ 4 when within 10^−6 of one, else 3 significant digits.
func formatOrder(x float64) string {
	if a, d, ok := snap(x, 1e-6); ok {
		if d == 1 {
			return strconv.Itoa(a)
		}
		return fmt.Sprintf("%d/%d", a, d)
	}
	return strconv.FormatFloat(x, 'g', 3, 64)
}

// candidate is one method's outcome.
type candidate struct {
	method, detail string
	ex             []*big.Float
	err            *big.Float
}

// agreement returns the error estimate of a method from its extrapolants
// ex: the larger of the last two gaps g1 (latest) and g2 between successive
// extrapolants (g1 alone when only two are defined), raised to the floor;
// nil when the last two extrapolants are not both defined.
//
// Extrapolants that converge only linearly, with ratio ρ = g1/g2, are
// still about g1·ρ/(1 − ρ) away from their limit, more than g1 when ρ > 1/2
// (as on quantities with logarithmic terms); so when both gaps stand well
// above the noise floor the estimate is at least that (ρ capped at 0.99).
func (s *seq) agreement(ex []*big.Float) *big.Float {
	n := len(ex)
	if n < 2 || ex[n-1] == nil || ex[n-2] == nil {
		return nil
	}
	g1 := absDiff(ex[n-1], ex[n-2], s.wp)
	est := g1
	if n >= 3 && ex[n-3] != nil {
		g2 := absDiff(ex[n-2], ex[n-3], s.wp)
		if g2.Cmp(est) > 0 {
			est = g2
		}
		quiet := newF(64).SetMantExp(s.floor, linearGuardBits)
		if g1.Cmp(quiet) > 0 && g2.Cmp(quiet) > 0 {
			rho, _ := newF(64).Quo(g1, g2).Float64()
			rho = min(rho, 0.99)
			if rho > 0.5 {
				tail := newF(s.wp).Mul(g1, newF(64).SetFloat64(rho/(1-rho)))
				if tail.Cmp(est) > 0 {
					est = tail
				}
			}
		}
	}
	return s.floored(est)
}

// linearGuardBits: gaps within 2^linearGuardBits of the noise floor are
// too noisy for their ratio to mean anything.
const linearGuardBits = 10

// sensitivity returns twice the largest change of the last extrapolant
// when run is applied to copies of the values moved by their own noise
// level (see perturbations): the part of the error that amplified noise
// makes, which the agreement of successive extrapolants can miss, since
// the same noise runs through all of them.
func (s *seq) sensitivity(run func([]*big.Float) []*big.Float, base *big.Float) *big.Float {
	if s.perturbed == nil {
		s.perturbed = s.perturbations()
	}
	worst := newF(64)
	for _, f := range s.perturbed {
		ex := run(f)
		x := ex[len(ex)-1]
		if x == nil {
			continue
		}
		worst = maxF(worst, absDiff(x, base, s.wp))
	}
	return s.floored(worst.Mul(worst, newF(64).SetInt64(2)))
}

// perturbations returns two copies of the values, each value moved by
// ±2^−prec·max|f| with signs from a fixed pseudo-random sequence.
func (s *seq) perturbations() [][]*big.Float {
	delta := newF(s.wp).SetMantExp(newF(s.wp).SetInt64(1), int(math.Ceil(s.lScale))-int(s.prec))
	x := uint64(0x9E3779B97F4A7C15)
	out := make([][]*big.Float, 2)
	for i := range out {
		out[i] = make([]*big.Float, s.n)
		for k, v := range s.f {
			x = x*6364136223846793005 + 1442695040888963407
			if x>>63 == 0 {
				out[i][k] = newF(s.wp).Add(v, delta)
			} else {
				out[i][k] = newF(s.wp).Sub(v, delta)
			}
		}
	}
	return out
}

// maxF returns the larger of x and y.
func maxF(x, y *big.Float) *big.Float {
	if y.Cmp(x) > 0 {
		return y
	}
	return x
}

func (s *seq) floored(x *big.Float) *big.Float {
	if x.Cmp(s.floor) < 0 {
		return newF(64).Set(s.floor)
	}
	return newF(64).Set(x)
}

// extrapolate runs the methods on a sequence judged convergent and fills e
// with the best.
func (s *seq) extrapolate(e *Estimate, pick orderPick, pfit float64, fitOK, converged bool) {
	n := s.n
	switch {
	case pick.ok && pick.regular && pick.p > 0:
		e.Order = pick.p
	case fitOK && pfit > 0:
		e.Order = pfit
	}
	// The last term, with the tail Σ Δ ≈ |Δ|·ρ/(1 − ρ) of a sequence
	// converging like ρ^k as its error; |Δ| is the larger of the last two
	// differences, or of the last three when the differences are irregular.
	last := make([]*big.Float, n)
	copy(last, s.f)
	lastErr := newF(s.wp)
	from := n - 3
	if !pick.regular && n >= 4 {
		from = n - 4
	}
	for _, d := range s.d[from:] {
		if cmpAbs(d, lastErr) > 0 {
			lastErr.Abs(d)
		}
	}
	if e.Order > 0 {
		rho := math.Exp2(-e.Order * s.lr)
		if f := rho / (1 - rho); f > 1 && !math.IsInf(f, 0) {
			lastErr.Mul(lastErr, newF(s.wp).SetFloat64(f))
		}
	}
	cands := []candidate{{method: MethodLastTerm, detail: "the value at the last step", ex: last, err: s.floored(lastErr)}}
	if pick.ok && pick.regular && pick.p > 0 {
		if c, ok := s.richardsonBest(pick); ok {
			cands = append(cands, c)
		}
	}
	// Iterated Aitken is the most easily deceived by a walk that has not
	// reached its asymptotic regime (it settles on plateaus), so it runs
	// only when the local orders have settled closely.
	settled := pick.regular && pick.spread <= aitkenSpread*max(1, math.Abs(pick.p))
	if settled || converged {
		var corr *big.Float
		runA := func(f []*big.Float) []*big.Float {
			ex, c := aitken(f, s.tau, s.wp)
			if corr == nil {
				corr = c
			}
			return ex
		}
		ex := runA(s.f)
		if err := s.agreement(ex); err != nil {
			if corr != nil && corr.Cmp(err) > 0 {
				err = s.floored(corr)
			}
			err = maxF(err, s.sensitivity(runA, ex[n-1]))
			cands = append(cands, candidate{method: MethodAitken, detail: "iterated Aitken Δ²", ex: ex, err: err})
		}
	}
	if pick.regular || converged {
		runW := func(f []*big.Float) []*big.Float { return wynn(f, s.tau, int(s.prec)-noiseGuardBits, s.wp) }
		ex := runW(s.f)
		if err := s.agreement(ex); err != nil {
			err = maxF(err, s.sensitivity(runW, ex[n-1]))
			cands = append(cands, candidate{method: MethodWynn, detail: "highest even column of the ε table", ex: ex, err: err})
		}
	}
	best := cands[0]
	two := newF(64)
	for _, c := range cands[1:] {
		if two.Mul(c.err, newF(64).SetInt64(2)).Cmp(best.err) < 0 {
			best = c
		}
	}
	// Consensus: another method whose own estimate makes the disagreement
	// with the chosen limit decisive (more than FailFactor times that
	// estimate: by its lights the chosen limit is wrong) casts doubt on
	// it, and the estimate grows to cover the disagreement.
	errEst := newF(64).Set(best.err)
	for _, c := range cands {
		gap := absDiff(c.ex[n-1], best.ex[n-1], s.wp)
		if gap.Cmp(newF(64).Mul(c.err, newF(64).SetInt64(FailFactor))) > 0 && gap.Cmp(errEst) > 0 {
			errEst.Set(gap)
			best.detail += "; the estimate covers the disagreement with " + c.method
		}
	}
	e.Method, e.Detail = best.method, best.detail
	e.Limit = newF(s.prec).Set(best.ex[n-1])
	e.ErrorEst = errEst
	e.Extrapolants = make([]*big.Float, n)
	for k, x := range best.ex {
		if x != nil {
			e.Extrapolants[k] = newF(s.prec).Set(x)
		}
	}
	e.Digits = digits(e.ErrorEst, e.Limit, s.prec)
}

// digits returns floor(−log10(err/max(1, |limit|))), clamped to
// [0, prec·log10 2].
func digits(err, limit *big.Float, prec uint) int {
	scale := max(0, log2Abs(limit))
	le := log2Abs(err)
	maxD := int(float64(prec) * math.Log10(2))
	if math.IsInf(le, -1) {
		return maxD
	}
	d := int(math.Floor((scale - le) * math.Log10(2)))
	return min(max(d, 0), maxD)
}

// richardsonBest runs the Richardson table for the leading order of pick
// with q = 1, q = p and q estimated from the first eliminated column, and
// returns the variant whose extrapolants agree best.
func (s *seq) richardsonBest(pick orderPick) (candidate, bool) {
	wp := s.wp
	one := newF(wp).SetInt64(1)
	tol := min(0.05, max(1e-9, 20*pick.spread))
	var rho1 *big.Float
	var pDesc string
	pv := pick.p
	if a, d, ok := snap(pick.p, tol); ok {
		rho1 = ratioPower(s.r, a, d, wp)
		pv = float64(a) / float64(d)
		pDesc = formatFrac(a, d)
	} else {
		rho1 = newF(wp).Quo(s.d[pick.k+1], s.d[pick.k])
		pDesc = strconv.FormatFloat(pick.p, 'g', 6, 64)
	}
	if rho1.Sign() <= 0 || rho1.Cmp(one) >= 0 {
		return candidate{}, false
	}
	rf := newF(wp).SetRat(s.r)
	vars := []variant{{rf, 1, "1"}}
	if math.Abs(pv-1) > 1e-12 {
		vars = append(vars, variant{rho1, pv, pDesc})
	}
	if v, ok := s.secondOrder(rho1, pv); ok {
		dup := false
		for _, w := range vars {
			if math.Abs(w.q-v.q) <= 1e-9 {
				dup = true
			}
		}
		if !dup {
			vars = append(vars, v)
		}
	}
	var best candidate
	found := false
	for _, v := range vars {
		run := func(f []*big.Float) []*big.Float { return richardson(f, rho1, v.g, wp) }
		ex := run(s.f)
		err := s.agreement(ex)
		if err == nil {
			continue
		}
		err = maxF(err, s.sensitivity(run, ex[s.n-1]))
		if !found || err.Cmp(best.err) < 0 {
			best = candidate{method: MethodRichardson, ex: ex, err: err,
				detail: fmt.Sprintf("orders p, p+q, p+2q, … eliminated, p = %s, q = %s", pDesc, v.desc)}
			found = true
		}
	}
	return best, found
}

// secondOrder estimates q from the local orders of the first Richardson
// column (which has lost the h^p term): its order is p + q.
func (s *seq) secondOrder(rho1 *big.Float, p float64) (variant, bool) {
	type out = variant
	wp := s.wp
	n := s.n
	c := newF(wp).Quo(rho1, newF(wp).Sub(newF(wp).SetInt64(1), rho1))
	t1 := make([]*big.Float, n-1) // T_{k,1}, k = 1 … n−1
	for k := 1; k < n; k++ {
		t := newF(wp).Mul(s.d[k-1], c)
		t1[k-1] = t.Add(t, s.f[k])
	}
	d1 := make([]*big.Float, n-2)
	ld := make([]float64, n-2)
	inf := make([]bool, n-2)
	for k := range d1 {
		d1[k] = newF(wp).Sub(t1[k+1], t1[k])
		ld[k] = log2Abs(d1[k])
		inf[k] = ld[k] > s.ltau
	}
	pick := pickOrder(localOrders(ld, inf, s.lr), d1)
	if !pick.ok || !pick.regular {
		return out{}, false
	}
	q := pick.p - p
	if q <= 0.05 {
		return out{}, false
	}
	tol := min(0.05, max(1e-9, 20*pick.spread))
	if a, d, ok := snap(q, tol); ok {
		return out{ratioPower(s.r, a, d, wp), float64(a) / float64(d), formatFrac(a, d)}, true
	}
	// r^q = (Δ'_{k+1}/Δ'_k) / ρ1.
	g := newF(wp).Quo(d1[pick.k+1], d1[pick.k])
	g.Quo(g, rho1)
	if g.Sign() <= 0 || g.Cmp(newF(wp).SetInt64(1)) >= 0 {
		return out{}, false
	}
	return out{g, q, strconv.FormatFloat(q, 'g', 6, 64)}, true
}

// variant is a choice of the later orders of a Richardson table: the ratio
// g = ratio^q between the step ratios of successive columns.
type variant struct {
	g    *big.Float
	q    float64
	desc string
}

func formatFrac(a, d int) string {
	if d == 1 {
		return strconv.Itoa(a)
	}
	return fmt.Sprintf("%d/%d", a, d)
}

// regularSpread: local orders have settled when the change around the
// chosen index is below this fraction of max(1, |p|); aitkenSpread is the
// stricter bound under which iterated Aitken runs.
var regularSpread, aitkenSpread = 0.05, 0.01

package kernel

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strings"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
)

const identityDoc = `identity(name, lhs, rhs) checks lhs == rhs: exactly for numbers, polynomials
and matrices, to the working precision for certified reals (digits=N sets it).
identity(name, f) calls f() for (lhs, rhs).
identity(name, f, over=g, samples=N) checks f(g(k)) for k = 0..N-1.`

// Methods as the report names them.
const (
	exactMethod = "exact rational arithmetic"
	polyMethod  = "exact polynomial arithmetic (expanded)"
	realMethod  = "certified interval arithmetic"
)

// target is the precision a claim with real sides is decided to.
type target struct {
	bits uint // |residual| must be certified below 2^-bits for "holds to digits"
	cap  uint // refinement stops here: undecided
}

// digits is the number of decimal digits that bits certify.
func (t target) digits() int { return int(float64(t.bits) * 0.30102999566398120) }

// residual is lhs − rhs, measured exactly or certified.
type residual struct {
	text      string   // printed residual
	size      *big.Rat // how large: |residual|, an upper bound for reals, the term count for polynomials
	zero      bool     // exactly zero
	symbolic  bool     // a polynomial difference: zero proves the identity for all values
	real      bool     // decided by interval arithmetic
	certified int      // for a real residual enclosing 0: |residual| < 10^-certified
	undecided bool     // the precision cap came first
}

func exactResidual(d *big.Rat) residual {
	return residual{text: exact.FormatRat(d), size: new(big.Rat).Abs(d), zero: d.Sign() == 0}
}

// measure computes the residual of two sides: numbers, reals, polynomials,
// matrices, or lists and tuples of them. Floats are refused: they would make
// "holds" a statement about rounding.
func measure(ring *exact.Ring, t target, lhs, rhs py.Object) (residual, error) {
	_, lp := lhs.(*Polynomial)
	_, rp := rhs.(*Polynomial)
	_, lr := lhs.(*Real)
	_, rr := rhs.(*Real)
	switch {
	case lr || rr:
		a, ok1 := realOf(lhs)
		b, ok2 := realOf(rhs)
		if !ok1 {
			return residual{}, sideError(lhs)
		}
		if !ok2 {
			return residual{}, sideError(rhs)
		}
		return realResidual(exact.RealSub(a, b), t)
	case lp || rp:
		a, ok1 := polyOf(ring, lhs)
		b, ok2 := polyOf(ring, rhs)
		if !ok1 {
			return residual{}, sideError(lhs)
		}
		if !ok2 {
			return residual{}, sideError(rhs)
		}
		d := a.Sub(b)
		return residual{text: preview(d), size: big.NewRat(int64(d.Len()), 1), zero: d.IsZero(), symbolic: true}, nil
	}
	if x, ok := exactOf(lhs); ok {
		y, ok := exactOf(rhs)
		if !ok {
			return residual{}, sideError(rhs)
		}
		return exactResidual(new(big.Rat).Sub(x, y)), nil
	}
	if a, ok := lhs.(*KVector); ok {
		b, ok := rhs.(*KVector)
		if !ok {
			return residual{}, py.ExceptionNewf(py.TypeError, "one side is a k-vector and the other is %s", typeName(rhs))
		}
		d, err := a.w.Sub(b.w)
		if err != nil {
			return residual{}, geomErr("identity", err)
		}
		size := new(big.Rat)
		for _, bl := range d.Components() {
			if c := new(big.Rat).Abs(bl.Coef); c.Cmp(size) > 0 {
				size = c
			}
		}
		return residual{text: d.String(), size: size, zero: d.IsZero()}, nil
	}
	if a, ok := lhs.(*Matrix); ok {
		b, ok := rhs.(*Matrix)
		if !ok {
			return residual{}, py.ExceptionNewf(py.TypeError, "one side is a matrix and the other is %s", typeName(rhs))
		}
		return matrixResidual(a, b)
	}
	ls, lok := listLike(lhs)
	rs, rok := listLike(rhs)
	if !lok || !rok {
		return residual{}, sideError(lhs)
	}
	if len(ls) != len(rs) {
		return residual{}, py.ExceptionNewf(py.ValueError, "the sides have different lengths: %d and %d", len(ls), len(rs))
	}
	entries := make([]residual, len(ls))
	for i := range ls {
		r, err := measure(ring, t, ls[i], rs[i])
		if err != nil {
			return residual{}, err
		}
		r.text = fmt.Sprintf("entry %d: %s", i, r.text)
		entries[i] = r
	}
	w := worst(append(entries, exactResidual(new(big.Rat))))
	if w.zero {
		w.text = "0"
	}
	return w, nil
}

// realResidual decides a certified real difference: exactly when it is
// known to be rational, else by refining its enclosure to the target.
func realResidual(d *exact.Real, t target) (residual, error) {
	if q, ok := d.Rat(); ok {
		return exactResidual(q), nil
	}
	iv, err := d.Approx(t.bits, t.cap)
	switch {
	case err != nil && errors.Is(err, exact.ErrUndecided):
		return residual{text: fmt.Sprintf("not separated from 0 at the cap of %d bits", t.cap), size: new(big.Rat), real: true, undecided: true}, nil
	case err != nil:
		return residual{}, realErr(err, t.cap)
	}
	if iv.Lo.Sign() > 0 || iv.Hi.Sign() < 0 {
		text, derr := d.Digits(12, t.cap)
		if derr != nil {
			text = exact.FormatRat(iv.Lo) + " … " + exact.FormatRat(iv.Hi)
		}
		bound := new(big.Rat).Abs(iv.Lo)
		if h := new(big.Rat).Abs(iv.Hi); h.Cmp(bound) > 0 {
			bound = h
		}
		return residual{text: text + " (certified non-zero)", size: bound, real: true}, nil
	}
	n := t.digits()
	width := new(big.Rat).Sub(iv.Hi, iv.Lo)
	return residual{text: fmt.Sprintf("|r| < 1e-%d", n), size: width, real: true, certified: n}, nil
}

// worst combines the residuals of entries: any failure wins, then
// undecided, then the fewest certified digits; the largest failing
// residual is the one shown, the first on ties.
func worst(rs []residual) residual {
	out := rs[0]
	for _, r := range rs[1:] {
		if compareResiduals(r, out) > 0 {
			out = r
		}
	}
	for _, r := range rs {
		out.symbolic = out.symbolic || r.symbolic
		out.real = out.real || r.real
	}
	return out
}

// rank orders residuals by how bad they are for the claim.
func (r residual) rank() int {
	switch {
	case !r.zero && r.certified == 0 && !r.undecided:
		return 3 // fails
	case r.undecided:
		return 2
	case r.certified > 0:
		return 1
	}
	return 0
}

// compareResiduals is positive when a is worse than b, negative when
// better, and 0 when worst has no reason to prefer either.
func compareResiduals(a, b residual) int {
	ra, rb := a.rank(), b.rank()
	switch {
	case ra != rb:
		return ra - rb
	case ra == 3:
		return a.size.Cmp(b.size)
	case ra == 1:
		return b.certified - a.certified
	}
	return 0
}

// verdict states what a residual means for the claim.
func (r residual) verdict(c *cells.Claim, samples int) {
	every := "for this instance"
	if samples > 0 {
		every = fmt.Sprintf("on each of the %d samples", samples)
	}
	switch {
	case r.zero && r.symbolic:
		c.Verdict, c.Method = cells.Holds, polyMethod
		c.Note = "the expanded difference is the zero polynomial: a proof of the identity for all values of the variables"
		if samples > 0 {
			c.Note = fmt.Sprintf("the expanded difference is the zero polynomial on each of the %d samples: for each sample, a proof for all values of the variables; for the general statement, evidence, not a proof", samples)
		}
	case r.zero && samples > 0:
		c.Verdict = cells.Holds
		c.Note = "exact zero residual " + every + ": each instance is proved; for the general statement this is evidence, not a proof"
	case r.zero:
		c.Verdict = cells.Holds
		c.Note = "exact zero residual: a proof for this instance"
	case r.certified > 0:
		c.Verdict, c.Method, c.Digits = cells.HoldsToDigits, realMethod, r.certified
		c.Note = fmt.Sprintf("certified |residual| < 10^-%d %s: evidence, not a proof — an exactly zero residual and a very small one look the same at any finite precision", r.certified, every)
	case r.undecided:
		c.Verdict, c.Method = cells.Undecided, realMethod
		c.Note = "the enclosure of the residual still contains 0 at the precision cap but is wider than the target: raise --max-precision or lower digits="
	case r.symbolic:
		c.Verdict, c.Method = cells.Fails, polyMethod
		c.Note = "the expanded difference is a non-zero polynomial"
	case r.real:
		c.Verdict, c.Method = cells.Fails, realMethod
		c.Note = "the residual is certified non-zero: its enclosure excludes 0"
	default:
		c.Verdict = cells.Fails
		c.Note = "exact non-zero residual"
	}
	c.Residual = r.text
}

// claimTarget is the precision for a claim: the notebook's, or digits=N.
func (s *Session) claimTarget(digits py.Object) (target, error) {
	t := target{bits: uint(s.precision), cap: uint(s.settings.MaxPrecision)}
	if digits != nil && digits != py.None {
		n, err := intArg("identity", "digits", digits, 0)
		if err != nil || n < 1 {
			return target{}, py.ExceptionNewf(py.ValueError, "identity(): digits must be a positive integer")
		}
		t.bits = uint(float64(n)/0.30102999566398120) + 1
	}
	if t.bits > t.cap {
		return target{}, py.ExceptionNewf(py.ValueError, "the claim asks for %d bits, above the precision cap of %d bits (raise it with --max-precision)", t.bits, t.cap)
	}
	return t, nil
}

// matrixResidual compares two matrices entry by entry.
func matrixResidual(a, b *Matrix) (residual, error) {
	if a.q != nil && b.q != nil {
		d, err := a.q.Sub(b.q)
		if err != nil {
			return residual{}, wrapErr(err)
		}
		size := new(big.Rat)
		for i := 0; i < d.Rows(); i++ {
			for j := 0; j < d.Cols(); j++ {
				if e := new(big.Rat).Abs(d.At(i, j)); e.Cmp(size) > 0 {
					size = e
				}
			}
		}
		text := "0"
		if size.Sign() != 0 {
			text = "difference " + d.String()
			if d.Rows()*d.Cols() > 16 {
				text = "largest entry of the difference: " + exact.FormatRat(size)
			}
		}
		return residual{text: text, size: size, zero: size.Sign() == 0}, nil
	}
	d, err := a.lifted().Sub(b.lifted())
	if err != nil {
		return residual{}, wrapErr(err)
	}
	for i := 0; i < d.Rows(); i++ {
		for j := 0; j < d.Cols(); j++ {
			if e := d.At(i, j); !e.IsZero() {
				return residual{text: fmt.Sprintf("entry [%d, %d] of the difference: %s", i, j, preview(e)), size: big.NewRat(int64(e.Len()), 1), symbolic: true}, nil
			}
		}
	}
	return residual{text: "0", size: new(big.Rat), zero: true, symbolic: true}, nil
}

// preview prints a polynomial, or its first terms and the count when long.
func preview(p *exact.Poly) string {
	const shown = 6
	s := p.String()
	if p.Len() <= shown+2 {
		return s
	}
	// Terms are separated by " + " and " - " at the top level of the text.
	seps := 0
	for i := 0; i+3 <= len(s); i++ {
		if s[i] == ' ' && (s[i+1] == '+' || s[i+1] == '-') && s[i+2] == ' ' {
			if seps++; seps == shown {
				return fmt.Sprintf("%s + … (%d terms in all)", s[:i], p.Len())
			}
		}
	}
	return s
}

func listLike(o py.Object) ([]py.Object, bool) {
	switch x := o.(type) {
	case *py.List:
		return x.Items, true
	case py.Tuple:
		return x, true
	}
	return nil, false
}

func sideError(o py.Object) error {
	if _, ok := o.(py.Float); ok {
		return py.ExceptionNewf(py.TypeError, "a side of the identity is a float64 (%s), which cannot be checked exactly; build it from ints and frac(...) instead (int / int is already exact in assay)", str(o))
	}
	return py.ExceptionNewf(py.TypeError, "a side of the identity is %s; claims compare exact numbers, polynomials, matrices, or lists and tuples of them", typeName(o))
}

// pair unpacks the (lhs, rhs) returned by a claim's function.
func pair(o py.Object, what string) (py.Object, py.Object, error) {
	t, ok := listLike(o)
	if !ok || len(t) != 2 {
		return nil, nil, py.ExceptionNewf(py.TypeError, "%s must return a pair (lhs, rhs), got %s", what, typeName(o))
	}
	return t[0], t[1], nil
}

func (s *Session) identity(line int, args py.Tuple, kw py.StringDict) (py.Object, error) {
	start := time.Now()
	a, err := bind("identity", args, kw, []string{"name", "lhs", "rhs", "over", "samples", "digits", "companion", "degree"}, 2)
	if err != nil {
		return nil, err
	}
	c, err := s.newClaim("identity", a[0], line)
	if err != nil {
		return nil, err
	}
	t, err := s.claimTarget(a[5])
	if err != nil {
		return nil, err
	}
	companion := a[6] == nil || a[6] == py.True
	if a[6] != nil && a[6] != py.True && a[6] != py.False {
		return nil, py.ExceptionNewf(py.TypeError, "identity(): companion must be True or False")
	}
	if a[3] != nil { // sampled form
		if a[2] != nil {
			return nil, py.ExceptionNewf(py.TypeError, "identity(name, f, over=g, samples=N) takes no rhs")
		}
		zippel, err := schwartzZippel(a[3], a[7])
		if err != nil {
			return nil, err
		}
		if err := s.sampled(&c, t, a[1], a[3], a[4], companion, zippel); err != nil {
			return nil, err
		}
		return s.record(c, start), nil
	}
	if a[4] != nil || a[7] != nil {
		return nil, py.ExceptionNewf(py.TypeError, "identity(): samples= and degree= need over= (the function making sample k)")
	}
	lhs, rhs := a[1], a[2]
	var call func() (py.Object, py.Object, error)
	if rhs == nil {
		f := lhs
		if !callable(f) {
			return nil, py.ExceptionNewf(py.TypeError, "identity(name, lhs, rhs) is missing rhs (or pass a function returning (lhs, rhs))")
		}
		call = func() (py.Object, py.Object, error) {
			res, err := py.Call(f, nil, nil)
			if err != nil {
				return nil, nil, err
			}
			return pair(res, "the identity's function")
		}
		if lhs, rhs, err = call(); err != nil {
			return nil, err
		}
	}
	r, err := measure(s.ring, t, lhs, rhs)
	if err != nil {
		return nil, err
	}
	r.verdict(&c, 0)
	if call != nil && companion {
		audit, skipped := s.companion(call, lhs, rhs)
		c.Float = audit
		if skipped != "" {
			c.Note += "; " + skipped
		}
	}
	if r.real {
		c.Precision = int(t.bits)
	}
	return s.record(c, start), nil
}

// newClaim starts the record of a claim, checking that its name is new.
func (s *Session) newClaim(kind string, name py.Object, line int) (cells.Claim, error) {
	n, err := stringArg(kind, "name", name)
	if err != nil {
		return cells.Claim{}, err
	}
	if s.sweeping {
		return cells.Claim{}, py.ExceptionNewf(py.ValueError, "%s(%q) inside a sampled claim's f or g: a claim cannot be made per sample; return both sides from f instead", kind, n)
	}
	s.elsewhere = 0
	if prev, dup := s.claimAt[n]; dup {
		return cells.Claim{}, py.ExceptionNewf(py.ValueError, "claim name %q is already used at line %d; give each claim its own name", n, prev)
	}
	return cells.Claim{Name: n, Kind: kind, Method: exactMethod, Seed: s.seed, Cell: s.cell, Line: line}, nil
}

// record files a decided claim with the cell and returns whether it holds.
func (s *Session) record(c cells.Claim, start time.Time) py.Object {
	c.Seconds = time.Since(start).Seconds() + s.elsewhere
	s.elsewhere = 0
	s.claimAt[c.Name] = c.Line
	s.outcome.Claims = append(s.outcome.Claims, c)
	return py.NewBool(c.Verdict == cells.Holds)
}

const factorizationDoc = `factorization(name, p, [f1, f2, ...]) checks p == u * f1 * f2 * ... for
a rational unit u that the check finds; a factor may be given as (f, k) for f**k.`

func (s *Session) factorization(line int, args py.Tuple, kw py.StringDict) (py.Object, error) {
	start := time.Now()
	a, err := bind("factorization", args, kw, []string{"name", "p", "factors"}, 3)
	if err != nil {
		return nil, err
	}
	c, err := s.newClaim("factorization", a[0], line)
	if err != nil {
		return nil, err
	}
	p, ok := polyOf(s.ring, a[1])
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "factorization(): p must be a polynomial or an exact number, got %s%s", typeName(a[1]), floatHint(a[1]))
	}
	items, err := sequence(a[2], "the factors")
	if err != nil {
		return nil, err
	}
	product := s.ring.Const(big.NewRat(1, 1))
	var degrees []string
	for i, it := range items {
		f, k := it, int64(1)
		if pair, ok := it.(py.Tuple); ok && len(pair) == 2 {
			f = pair[0]
			if k, err = intArg("factorization", "a factor's exponent", pair[1], 1); err != nil || k < 1 || k > maxExponent {
				return nil, py.ExceptionNewf(py.ValueError, "factor %d: the exponent in (f, k) must be a positive integer", i)
			}
		}
		fp, ok := polyOf(s.ring, f)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "factor %d is %s, not a polynomial%s", i, typeName(f), floatHint(f))
		}
		if k > 1 {
			if fp, err = fp.Pow(int(k)); err != nil {
				return nil, polyErr(err)
			}
			degrees = append(degrees, fmt.Sprintf("%d (to the power %d)", fp.Degree()/int(k), k))
		} else {
			degrees = append(degrees, fmt.Sprint(fp.Degree()))
		}
		if product, err = product.Mul(fp); err != nil {
			return nil, polyErr(err)
		}
	}
	c.Method = polyMethod
	unit := big.NewRat(1, 1)
	if !p.IsZero() && !product.IsZero() {
		unit = new(big.Rat).Quo(p.LeadingCoefficient(), product.LeadingCoefficient())
	}
	diff := p.Sub(product.Scale(unit))
	c.Residual = preview(diff)
	factors := fmt.Sprintf("%d factors of degree %s", len(items), strings.Join(degrees, ", "))
	if diff.IsZero() {
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("p = u · (product of the factors) with u = %s exactly (%s): a proof of the factorization", exact.FormatRat(unit), factors)
	} else {
		c.Verdict = cells.Fails
		c.Note = fmt.Sprintf("p − u · (product of the factors) is not zero for u = %s, the ratio of leading coefficients (%s)", exact.FormatRat(unit), factors)
	}
	return s.record(c, start), nil
}

// maxSamples bounds a sweep so a typo cannot run for hours.
const maxSamples = 10_000_000

// sampleCount reads samples=N (default 100) for a sampled claim.
func sampleCount(fn string, samples py.Object) (int64, error) {
	n, err := intArg(fn, "samples", samples, 100)
	if err != nil {
		return 0, err
	}
	if n < 1 || n > maxSamples {
		return 0, py.ExceptionNewf(py.ValueError, "%s(): samples must be between 1 and %d, got %d", fn, maxSamples, n)
	}
	return n, nil
}

// sweep computes a sampled claim's share of samples: sample k = g(k),
// then f(sample), whose pair goes to visit. A sample on which f raises
// goes to raised and the sweep goes on; any other error ends the share and
// is returned with its sample index.
func (s *Session) sweep(a Ask, sh Share, f, g py.Object, raised func(k int64, msg string), visit func(k int64, sample, x, y py.Object) error) (int64, *SweepError) {
	s.sweeping, s.printed = true, false
	defer func() { s.sweeping = false }()
	var failed *SweepError
	done, _ := s.forShare(a, sh, func(k int64) error {
		sample, err := py.Call(g, py.Tuple{py.Int(k)}, nil)
		if err != nil {
			_, msg := describe(err, 0)
			failed = &SweepError{K: k, Type: "ValueError", Message: fmt.Sprintf("the sample generator raised at sample %d: %s", k, msg)}
			return err
		}
		res, err := py.Call(f, py.Tuple{sample}, nil)
		if err != nil {
			_, msg := describe(err, 0)
			raised(k, msg)
			return nil
		}
		x, y, err := pair(res, fmt.Sprintf("f(sample %d)", k))
		if err == nil {
			err = visit(k, sample, x, y)
		}
		if err != nil {
			failed = sweepError(k, err)
		}
		return err
	})
	return done, failed
}

func (s *Session) sampled(c *cells.Claim, t target, f, over, samples py.Object, companion bool, zippel func(n int64) string) error {
	if !callable(f) || !callable(over) {
		return py.ExceptionNewf(py.TypeError, "identity(name, f, over=g, samples=N) needs functions f and g")
	}
	n, err := sampleCount("identity", samples)
	if err != nil {
		return err
	}
	ask := Ask{Claim: c.Name, Phase: phaseSweep, Line: c.Line, Samples: n}
	tally, err := s.distribute(ask, func(sh Share) Tally {
		began := time.Now()
		it := &IdentityTally{}
		done, failed := s.sweep(ask, sh, f, over, func(k int64, msg string) {
			// One sample that raises does not end the sweep: it makes the
			// claim undecided, and the report names the sample.
			it.add(k, residual{text: fmt.Sprintf("f raised: %s", clip(msg, 160)), size: new(big.Rat), undecided: true})
			it.Raised++
		}, func(k int64, sample, lhs, rhs py.Object) error {
			r, err := measure(s.ring, t, lhs, rhs)
			if err != nil {
				return py.ExceptionNewf(py.TypeError, "sample %d: %v", k, err)
			}
			it.add(k, r)
			if companion && it.Skip == nil {
				call := func() (py.Object, py.Object, error) {
					fs, err := floatValue(sample)
					if err != nil {
						return nil, nil, err
					}
					res, err := py.Call(f, py.Tuple{fs}, nil)
					if err != nil {
						return nil, nil, err
					}
					return pair(res, fmt.Sprintf("f(sample %d)", k))
				}
				audit, why := s.companion(call, lhs, rhs)
				if why != "" {
					it.Skip = &SampleNote{K: k, Text: why}
				} else {
					it.merge(&IdentityTally{Audit: &SampleAudit{K: k, Audit: *audit}})
				}
			}
			return nil
		})
		return Tally{Computed: done, Seconds: time.Since(began).Seconds(), Err: failed, Identity: it, Printed: s.printed}
	})
	if err != nil {
		return err
	}
	if tally.Err != nil {
		return tally.Err.raise()
	}
	it := tally.Identity
	if it == nil || it.Worst == nil {
		return py.ExceptionNewf(py.RuntimeError, "claim %q: the merged tally has no samples", c.Name)
	}
	w := it.Worst.residual()
	w.symbolic, w.real = it.Symbolic, it.Real
	w.verdict(c, int(n))
	c.Samples = int(n)
	if w.real {
		c.Precision = int(t.bits)
	}
	if c.Verdict != cells.Holds {
		// Rebuild the worst sample (g is deterministic) rather than keep them all.
		c.Worst = fmt.Sprintf("sample %d: %s", it.Worst.K, clip(str(mustCall(over, it.Worst.K)), 200))
	}
	if it.Failing > 0 {
		c.Note = fmt.Sprintf("%d of %d samples have a non-zero residual; the largest is shown", it.Failing, n)
	}
	if it.Raised > 0 && c.Verdict == cells.Undecided {
		c.Note = fmt.Sprintf("f raised on %d of %d samples; the sweep went on, and a claim with samples it could not evaluate cannot hold (the first such sample is shown)", it.Raised, n)
	} else if it.Raised > 0 {
		c.Note += fmt.Sprintf("; f also raised on %d of %d samples", it.Raised, n)
	}
	if c.Verdict == cells.Holds && zippel != nil {
		c.Note += "; " + zippel(n)
	}
	c.Note += printedNote(tally)
	switch {
	case it.Skip != nil:
		c.Note += "; " + it.Skip.Text
	case it.Audit != nil:
		audit := it.Audit.Audit
		audit.Residual += fmt.Sprintf(" (at sample %d, where float64 lost most)", it.Audit.K)
		c.Float = &audit
	}
	return nil
}

// printedNote tells the reader that f or g printed during a sweep.
func printedNote(t Tally) string {
	if !t.Printed {
		return ""
	}
	return "; f or g printed during the sweep, and that text is left out of the report: samples may be computed by other kernels, in any order"
}

// clip shortens s to at most n runes.
func clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

// companion runs a claim's function again as float64 code (every exact
// input turned into float64, gonum for linear algebra) and states how far
// its sides are from the exact ones. It returns a reason instead when the
// sides have no float64 counterpart.
func (s *Session) companion(call func() (py.Object, py.Object, error), lhs, rhs py.Object) (*cells.FloatAudit, string) {
	el, ok1 := exactEntries(lhs)
	er, ok2 := exactEntries(rhs)
	if !ok1 || !ok2 {
		return nil, "no float64 companion: the sides are not numbers, matrices or lists of them"
	}
	var lf, rf py.Object
	_, err := inFloat(func() (py.Object, error) {
		var err error
		lf, rf, err = call()
		return nil, err
	})
	if err != nil {
		_, msg := describe(err, 0)
		if strings.Contains(msg, noCompanionText) {
			return nil, strings.TrimPrefix(msg, "NotImplementedError: ")
		}
		return &cells.FloatAudit{Residual: "float64 code raised " + clip(msg, 160), Error: "no value", DigitsLost: float64Digits}, ""
	}
	fl, ok1 := floatEntries(lf)
	fr, ok2 := floatEntries(rf)
	if !ok1 || !ok2 || len(fl) != len(el) || len(fr) != len(er) {
		return nil, "no float64 companion: the float64 code returned values of another shape"
	}
	res := 0.0
	if len(fl) == len(fr) {
		for i := range fl {
			res = math.Max(res, math.Abs(fl[i]-fr[i]))
		}
	}
	rel, lost := companionError(append(el, er...), append(fl, fr...))
	return &cells.FloatAudit{Residual: fmt.Sprintf("%.3e", res), Error: fmt.Sprintf("%.2e relative", rel), DigitsLost: math.Round(lost*10) / 10}, ""
}

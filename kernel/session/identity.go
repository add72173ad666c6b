package session

import (
	"fmt"
	"math/big"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

const identityDoc = `identity(name, lhs, rhs) checks lhs == rhs: exactly for numbers, polynomials
and matrices, to the working precision for certified reals (digits=N sets it).
identity(name, f) calls f() for (lhs, rhs).
identity(name, f, over=g, samples=N) checks f(g(k)) for k = 0..N-1;
given=h counts only the samples where h(sample) is True.
identity(name, lhs, rhs, given=[h1, h2, ...], nonzero=[d1, ...]) proves a polynomial
identity where the hypotheses h_i = 0 hold (and the d_j do not vanish), with a certificate.`

var identityParams = []string{"name", "lhs", "rhs=", "over=", "samples=", "digits=", "companion=", "degree=", "given=", "nonzero="}

func (s *Session) identity(c *cells.Claim, t claim.Target, a interp.Args) error {
	companion, err := a.Bool("companion", true)
	if err != nil {
		return err
	}
	if symbolicHypotheses(a) {
		return s.identityUnder(c, a)
	}
	if a.Has("nonzero") {
		return py.ExceptionNewf(py.TypeError, "identity(): nonzero= states non-degeneracy conditions, which need polynomial hypotheses: given=[h1, h2, ...]")
	}
	h, err := hypothesis("identity", a)
	if err != nil {
		return err
	}
	if a.Has("over") { // sampled form
		if a.Has("rhs") {
			return py.ExceptionNewf(py.TypeError, "identity(name, f, over=g, samples=N) takes no rhs")
		}
		zippel, err := schwartzZippel(a.Get("over"), a.Get("degree"))
		if err != nil {
			return err
		}
		return s.sampled(c, t, family{f: a.Get("lhs"), g: a.Get("over"), h: h}, a.Get("samples"), companion, zippel)
	}
	if a.Has("samples") || a.Has("degree") {
		return py.ExceptionNewf(py.TypeError, "identity(): samples= and degree= need over= (the function making sample k)")
	}
	lhs, rhs := a.Get("lhs"), a.Get("rhs")
	var call func() (py.Object, py.Object, error)
	if rhs == nil {
		f := lhs
		if !interp.Callable(f) {
			return py.ExceptionNewf(py.TypeError, "identity(name, lhs, rhs) is missing rhs (or pass a function returning (lhs, rhs))")
		}
		call = func() (py.Object, py.Object, error) {
			res, err := py.Call(f, nil, nil)
			if err != nil {
				return nil, nil, err
			}
			return pair(res, "the identity's function")
		}
		if lhs, rhs, err = call(); err != nil {
			return err
		}
	}
	r, err := s.measure(t, lhs, rhs)
	if err != nil {
		return err
	}
	r.Decide(c, 0)
	if squareRootSide(lhs) || squareRootSide(rhs) {
		c.Note += "; " + values.SquareRootNote
	}
	if call != nil && companion {
		audit, skipped := s.companion(plainRun(call), lhs, rhs, true)
		c.Float = audit
		if skipped != "" {
			c.Note += "; " + skipped
		}
	}
	if r.Real {
		c.Precision = int(t.Bits)
	}
	return nil
}

// newClaim starts the record of a claim, checking that its name is new.
func (s *Session) newClaim(kind string, name py.Object, line int) (cells.Claim, error) {
	n, err := interp.String(kind, "name", name)
	if err != nil {
		return cells.Claim{}, err
	}
	if s.env.Sweeping {
		return cells.Claim{}, py.ExceptionNewf(py.ValueError, "%s(%q) inside a sampled claim's f or g: a claim cannot be made per sample; return both sides from f instead", kind, n)
	}
	s.elsewhere = 0
	if prev, dup := s.claimAt[n]; dup {
		return cells.Claim{}, py.ExceptionNewf(py.ValueError, "claim name %q is already used at line %d; give each claim its own name", n, prev)
	}
	return cells.Claim{Name: n, Kind: kind, Method: claim.ExactMethod, Seed: s.env.Seed(), Cell: s.cell, Line: line}, nil
}

// record files a decided claim with the cell and returns whether it holds.
func (s *Session) record(c cells.Claim, start time.Time) py.Object {
	c.Seconds = time.Since(start).Seconds() + s.elsewhere
	s.elsewhere = 0
	s.claimAt[c.Name] = c.Line
	s.outcome.Claims = append(s.outcome.Claims, c)
	return py.NewBool(c.Verdict == cells.Holds || c.Verdict == cells.HoldsWhere)
}

// sampled decides identity(name, f, over=g, samples=N).
func (s *Session) sampled(c *cells.Claim, t claim.Target, fam family, samples py.Object, companion bool, zippel func(n int64) string) error {
	if !interp.Callable(fam.f) || !interp.Callable(fam.g) {
		return py.ExceptionNewf(py.TypeError, "identity(name, f, over=g, samples=N) needs functions f and g")
	}
	n, err := sampleCount("identity", samples)
	if err != nil {
		return err
	}
	ask := claim.Ask{Claim: c.Name, Phase: claim.PhaseSweep, Line: c.Line, Samples: n}
	fresh := func() sampleTally {
		return &identitySweep{s: s, t: t, f: fam.f, companion: companion, it: &claim.IdentityTally{}}
	}
	tally, err := s.sweepClaim(ask, fam, fresh)
	if err != nil {
		return err
	}
	if noneMet(c, tally, n) {
		return nil
	}
	counted := met(tally, n)
	it := tally.Identity
	if it == nil || it.Worst == nil {
		return py.ExceptionNewf(py.RuntimeError, "claim %q: the merged tally has no samples", c.Name)
	}
	if err := s.confirmShown(ask, fam, tally, it.Shown(), fresh, func(k int64, got claim.Tally) (string, string) {
		return got.Identity.RecordAt(k, it), it.RecordAt(k, it)
	}); err != nil {
		return err
	}
	w := it.Worst.Residual()
	w.Symbolic, w.Real = it.Symbolic, it.Real
	if w.Zero {
		// Every sample is zero: proved by the zero bound on some of them.
		w.Algebraic = it.Algebraic
	}
	w.Decide(c, int(counted))
	c.Samples = int(n)
	if w.Real {
		c.Precision = int(t.Bits)
	}
	if c.Verdict != cells.Holds {
		// Rebuild the worst sample (g is deterministic) rather than keep them all.
		c.Sample, c.Worst = shownSample(fam.g, it.Worst.K)
	}
	if it.Failing > 0 {
		c.Note = fmt.Sprintf("%d of %d samples have a non-zero residual; the largest is shown", it.Failing, counted)
	}
	if it.Raised > 0 && c.Verdict == cells.Undecided {
		c.Why = cells.SampleRaised
		c.Note = fmt.Sprintf("f raised on %d of %d samples; the sweep went on, and a claim with samples it could not evaluate cannot hold (the first such sample is shown)", it.Raised, counted)
	} else if it.Raised > 0 {
		c.Note += fmt.Sprintf("; f also raised on %d of %d samples", it.Raised, counted)
	}
	if c.Verdict == cells.Holds && zippel != nil {
		c.Note += "; " + zippel(counted)
	}
	c.Note += givenNote(tally, n) + printedNote(tally) + mergedNote(tally)
	switch {
	case it.Skip != nil:
		c.Note += "; " + it.Skip.Text
	case it.Audit != nil:
		c.Float = s.worstAudit(ask, fam, it.Audit)
	}
	return nil
}

// identitySweep fills the tally of one share of a sampled identity.
type identitySweep struct {
	s         *Session
	t         claim.Target
	f         py.Object
	companion bool
	it        *claim.IdentityTally
}

// raised: one sample that raises does not end the sweep; it makes the
// claim undecided, and the report names the sample.
func (w *identitySweep) raised(k int64, msg string) {
	w.it.Add(k, claim.Residual{Text: fmt.Sprintf("f raised: %s", claim.Clip(msg, 160)), Size: new(big.Rat), Undecided: true})
	w.it.Raised++
}

func (w *identitySweep) visit(k int64, sample, lhs, rhs py.Object) error {
	r, err := w.s.measure(w.t, lhs, rhs)
	if err != nil {
		return py.ExceptionNewf(py.TypeError, "sample %d: %v", k, err)
	}
	w.it.Add(k, r)
	if w.companion && w.it.Skip == nil {
		audit, why := w.s.companion(sampleRun(w.f, sample, k), lhs, rhs, false)
		if why != "" {
			w.it.Skip = &claim.SampleNote{K: k, Text: why}
		} else {
			w.it.AddAudit(k, *audit)
		}
	}
	return nil
}

func (w *identitySweep) into(t *claim.Tally) { t.Identity = w.it }

// squareRootSide reports whether a claim's side, or an item of it, is a
// polynomial made by sqrt() of a perfect square.
func squareRootSide(o py.Object) bool {
	if p, ok := o.(*values.Polynomial); ok {
		return p.SquareRoot()
	}
	items, _ := interp.Items(o)
	for _, it := range items {
		if squareRootSide(it) {
			return true
		}
	}
	return false
}

package claim

import (
	"fmt"
	"math/big"
	"slices"
	"strings"

	"assay/cells"
)

// A sampled claim is computed as tallies: each kernel sweeps its share of
// the samples into a Tally, and tallies merge. Merging is associative and
// commutative, and every tie is broken by the lower sample index, so any
// split of the samples — one kernel, W workers, n shards — merges into the
// tally one kernel would have made alone, and the claim reads the same.

// Tally is the mergeable summary of the samples one kernel computed.
type Tally struct {
	Computed int64       `json:"computed"` // samples computed
	Seconds  float64     `json:"seconds"`  // longest wall time of a share
	Err      *SweepError `json:"error,omitempty"`
	Printed  bool        `json:"printed,omitempty"` // f or g printed; the text was left out

	// Parts is set on a tally joined from the part files of a sharded run:
	// the files in shard order, so the merge can name the part a sample it
	// re-evaluates came from. Merge leaves it alone.
	Parts []string `json:"parts,omitempty"`

	// Given counts the samples against the claim's hypothesis (given=h);
	// nil when the claim has none.
	Given      *GivenTally      `json:"given,omitempty"`
	Identity   *IdentityTally   `json:"identity,omitempty"`
	Inequality *InequalityTally `json:"inequality,omitempty"`
	Search     *SearchTally     `json:"search,omitempty"`
}

// SweepError is an error that ends a sweep (a generator that raised, a
// wrongly shaped result). The one with the lowest sample index wins, as it
// would in a sweep that runs k = 0, 1, 2, … and stops at the first.
type SweepError struct {
	K       int64  `json:"k"`
	Type    string `json:"type"` // Python exception name, e.g. "ValueError"
	Message string `json:"message"`
}

// GivenTally counts a sampled claim's samples against its hypothesis
// given=h. Only samples that met it reach f; a sample on which h raised
// counts as not met.
type GivenTally struct {
	Met        int64       `json:"met"`
	NotMet     int64       `json:"not_met"`          // including those on which h raised
	Raised     int64       `json:"raised,omitempty"` // h raised
	FirstRaise *SampleNote `json:"first_raise,omitempty"`
	// Trivial counts samples that met the hypothesis and on which f
	// returned 0 on both sides: what a guard left in f usually returns.
	Trivial      int64       `json:"trivial,omitempty"`
	FirstTrivial *SampleNote `json:"first_trivial,omitempty"`
}

// IdentityTally summarises the residuals of a sampled identity.
type IdentityTally struct {
	Worst    *SampleResidual `json:"worst,omitempty"`
	Symbolic bool            `json:"symbolic,omitempty"` // some residual was a polynomial
	Real     bool            `json:"real,omitempty"`     // some residual was decided by intervals
	Failing  int64           `json:"failing,omitempty"`
	Raised   int64           `json:"raised,omitempty"` // samples on which f raised
	Audit    *SampleAudit    `json:"audit,omitempty"`  // the float64 audit that lost most digits
	Skip     *SampleNote     `json:"skip,omitempty"`   // why the audit was skipped, first sample
	// Algebraic: some zero residual was proved by the zero bound.
	Algebraic bool `json:"algebraic,omitempty"`
}

// SampleResidual is one sample's residual.
type SampleResidual struct {
	K         int64  `json:"k"`
	Text      string `json:"text"`
	TeX       string `json:"tex,omitempty"`
	Size      string `json:"size"` // exact rational
	Zero      bool   `json:"zero,omitempty"`
	Symbolic  bool   `json:"symbolic,omitempty"`
	Cross     bool   `json:"cross,omitempty"`
	Real      bool   `json:"real,omitempty"`
	Certified int    `json:"certified,omitempty"`
	NearZero  bool   `json:"near_zero,omitempty"`
	Undecided bool   `json:"undecided,omitempty"`
	Algebraic bool   `json:"algebraic,omitempty"`
	ZeroBits  int64  `json:"zero_bits,omitempty"`
}

// SampleAudit is the float64 audit of one sample.
type SampleAudit struct {
	K     int64            `json:"k"`
	Audit cells.FloatAudit `json:"audit"`
}

// SampleNote is a message about one sample.
type SampleNote struct {
	K    int64  `json:"k"`
	Text string `json:"text"`
}

// InequalityTally summarises the slacks of a sampled inequality.
type InequalityTally struct {
	// Absolute ranks samples by the slack itself (rank="absolute"); by
	// default they are ranked by the relative slack, which is blind to
	// scale.
	Absolute   bool          `json:"absolute,omitempty"`
	Smallest   []SampleSlack `json:"smallest"` // the smallest slacks in the ranking, at most keepSmallest
	Violations int64         `json:"violations,omitempty"`
	Loose      int64         `json:"loose,omitempty"` // slack not separated from 0: the sides equal to the target's digits
	Raised     int64         `json:"raised,omitempty"`
	FirstRaise *SampleNote   `json:"first_raise,omitempty"`
}

// SampleSlack is one instance's slack, greater − lesser.
type SampleSlack struct {
	K  int64  `json:"k"`
	Lo string `json:"lo"` // exact rational: the slack, or the lower end of its enclosure
	// Rel is the relative slack (greater − lesser)/(|greater| + |lesser|):
	// exact when the sides are, else the middle of a fine enclosure.
	Rel     string        `json:"rel"`
	Exact   bool          `json:"exact,omitempty"`
	Verdict cells.Verdict `json:"verdict"`
	// NearZero: an undecided slack whose sides could not be told from 0.
	NearZero bool   `json:"near_zero,omitempty"`
	Text     string `json:"text"`
	Ratio    string `json:"ratio,omitempty"`
	Sample   string `json:"sample,omitempty"` // printed instance, for one found by search
	// Algebraic: the sign was decided by the zero bound; with Exact, the
	// slack was proved zero.
	Algebraic bool `json:"algebraic,omitempty"`
}

// SearchTally is the best point a counterexample search found.
type SearchTally struct {
	Skipped     string       `json:"skipped,omitempty"` // why no search ran
	Starts      int64        `json:"starts"`
	Evaluations int64        `json:"evaluations"`
	Best        *SampleSlack `json:"best,omitempty"` // K is the start's position
	Start       int64        `json:"start_sample"`   // sample index the best start came from
}

// keepSmallest is how many of the smallest slacks a tally keeps: the
// starting points of a counterexample search.
const keepSmallest = 4

// Part names the part file that computed sample k, for a tally joined
// from parts ("" otherwise).
func (t *Tally) Part(k int64) string {
	if len(t.Parts) == 0 || k < 0 {
		return ""
	}
	return t.Parts[k%int64(len(t.Parts))]
}

// Samples lists every sample index the tally names: the worst residual,
// the audit, the notes, the smallest slacks and the error that ended the
// sweep.
func (t *Tally) Samples() []int64 {
	var ks []int64
	if t.Err != nil {
		ks = append(ks, t.Err.K)
	}
	if g := t.Given; g != nil {
		for _, n := range []*SampleNote{g.FirstRaise, g.FirstTrivial} {
			if n != nil {
				ks = append(ks, n.K)
			}
		}
	}
	if it := t.Identity; it != nil {
		if it.Worst != nil {
			ks = append(ks, it.Worst.K)
		}
		if it.Audit != nil {
			ks = append(ks, it.Audit.K)
		}
		if it.Skip != nil {
			ks = append(ks, it.Skip.K)
		}
	}
	if it := t.Inequality; it != nil {
		for _, sl := range it.Smallest {
			ks = append(ks, sl.K)
		}
		if it.FirstRaise != nil {
			ks = append(ks, it.FirstRaise.K)
		}
	}
	return ks
}

// Merge folds o into t.
func (t *Tally) Merge(o Tally) {
	t.Computed += o.Computed
	t.Seconds = max(t.Seconds, o.Seconds)
	t.Printed = t.Printed || o.Printed
	if o.Err != nil && (t.Err == nil || o.Err.K < t.Err.K) {
		t.Err = o.Err
	}
	if o.Given != nil {
		if t.Given == nil {
			t.Given = &GivenTally{}
		}
		t.Given.merge(o.Given)
	}
	if o.Identity != nil {
		if t.Identity == nil {
			t.Identity = &IdentityTally{}
		}
		t.Identity.merge(o.Identity)
	}
	if o.Inequality != nil {
		if t.Inequality == nil {
			t.Inequality = &InequalityTally{}
		}
		t.Inequality.merge(o.Inequality)
	}
	if o.Search != nil {
		if t.Search == nil {
			t.Search = &SearchTally{}
		}
		t.Search.merge(o.Search)
	}
}

func (t *GivenTally) merge(o *GivenTally) {
	t.Met += o.Met
	t.NotMet += o.NotMet
	t.Raised += o.Raised
	t.Trivial += o.Trivial
	t.FirstRaise = first(t.FirstRaise, o.FirstRaise)
	t.FirstTrivial = first(t.FirstTrivial, o.FirstTrivial)
}

// first is the note about the lower sample.
func first(a, b *SampleNote) *SampleNote {
	if b != nil && (a == nil || b.K < a.K) {
		return b
	}
	return a
}

// Note says, for the claim's note, how many samples met the hypothesis,
// how often h raised, and how many returned a trivially true pair.
func (t *GivenTally) Note(samples int64) string {
	s := fmt.Sprintf("%d of %d samples met the hypothesis (given=); only they are counted", t.Met, samples)
	if t.Raised > 0 {
		s += fmt.Sprintf("; the hypothesis raised on %d samples, counted as not met (the first, sample %d: %s)", t.Raised, t.FirstRaise.K, t.FirstRaise.Text)
	}
	if t.Trivial > 0 {
		s += fmt.Sprintf("; %d of the samples that met it returned 0 on both sides (the first is sample %d): a trivially true pair, from a guard left in f or a degenerate sample the hypothesis lets in", t.Trivial, t.FirstTrivial.K)
	}
	return s
}

func (t *IdentityTally) merge(o *IdentityTally) {
	if o.Worst != nil && (t.Worst == nil || o.Worst.worseThan(t.Worst)) {
		t.Worst = o.Worst
	}
	t.Symbolic = t.Symbolic || o.Symbolic
	t.Real = t.Real || o.Real
	t.Algebraic = t.Algebraic || o.Algebraic
	t.Failing += o.Failing
	t.Raised += o.Raised
	if a := o.Audit; a != nil && (t.Audit == nil || a.Audit.DigitsLost > t.Audit.Audit.DigitsLost ||
		a.Audit.DigitsLost == t.Audit.Audit.DigitsLost && a.K < t.Audit.K) {
		t.Audit = a
	}
	t.Skip = first(t.Skip, o.Skip)
}

// Add records one sample's residual. Its record is made only when it
// becomes the worst, as merging a one-sample tally would keep it (a
// record a sample was most of the tally's allocation).
func (t *IdentityTally) Add(k int64, r Residual) {
	if t.Worst == nil || worse(k, r, t.Worst) {
		t.Worst = sampleResidual(k, r)
	}
	t.Symbolic = t.Symbolic || r.Symbolic
	t.Real = t.Real || r.Real
	t.Algebraic = t.Algebraic || r.Zero && r.Algebraic
	if r.Failing() {
		t.Failing++
	}
}

// AddAudit keeps the float64 audit of sample k if it lost the most digits.
func (t *IdentityTally) AddAudit(k int64, audit cells.FloatAudit) {
	t.merge(&IdentityTally{Audit: &SampleAudit{K: k, Audit: audit}})
}

func sampleResidual(k int64, r Residual) *SampleResidual {
	size := "0" // RatString of zero, the size of nearly every sample's residual, unformatted
	if r.Size.Sign() != 0 {
		size = r.Size.RatString()
	}
	return &SampleResidual{K: k, Text: r.Text, TeX: r.TeX, Size: size, Zero: r.Zero, Symbolic: r.Symbolic, Cross: r.Cross,
		Real: r.Real, Certified: r.Certified, NearZero: r.NearZero, Undecided: r.Undecided, Algebraic: r.Algebraic, ZeroBits: r.ZeroBits}
}

// Residual turns the record back into the residual it was made from.
func (s *SampleResidual) Residual() Residual {
	r := s.unsized()
	size, ok := new(big.Rat).SetString(s.Size)
	if !ok {
		size = new(big.Rat)
	}
	r.Size = size
	return r
}

// unsized is Residual without the size, which only failing residuals
// are compared by (parsing it for every sample of a sweep was most of
// the tally's time).
func (s *SampleResidual) unsized() Residual {
	return Residual{Text: s.Text, TeX: s.TeX, Zero: s.Zero, Symbolic: s.Symbolic, Cross: s.Cross, Real: s.Real,
		Certified: s.Certified, NearZero: s.NearZero, Undecided: s.Undecided, Algebraic: s.Algebraic, ZeroBits: s.ZeroBits}
}

// worseThan orders residuals as Worst does, the lower index first on ties.
func (s *SampleResidual) worseThan(o *SampleResidual) bool {
	a := s.unsized()
	if a.Failing() {
		a = s.Residual() // its size, which worse compares should o fail too
	}
	return worse(s.K, a, o)
}

// worse is worseThan for the residual r of sample k, not yet recorded;
// r's size is read only when both fail, as Compare reads it only then.
func worse(k int64, r Residual, o *SampleResidual) bool {
	b := o.unsized()
	if r.Failing() && b.Failing() {
		b = o.Residual()
	}
	if c := Compare(r, b); c != 0 {
		return c > 0
	}
	return k < o.K
}

func (t *InequalityTally) merge(o *InequalityTally) {
	t.Absolute = t.Absolute || o.Absolute
	t.Smallest = mergeSmallest(t.Smallest, o.Smallest, t.Absolute)
	t.Violations += o.Violations
	t.Loose += o.Loose
	t.Raised += o.Raised
	t.FirstRaise = first(t.FirstRaise, o.FirstRaise)
}

// mergeSmallest keeps the keepSmallest smallest slacks of a and b in the
// ranking, ascending.
func mergeSmallest(a, b []SampleSlack, absolute bool) []SampleSlack {
	all := append(slices.Clone(a), b...)
	slices.SortStableFunc(all, func(x, y SampleSlack) int { return compareSlacks(x, y, absolute) })
	return all[:min(len(all), keepSmallest)]
}

// compareSlacks orders slacks by verdict — violations, then slacks not
// told from 0, then the rest — then by the relative slack (or by the
// slack itself when absolute), then by sample index. The verdict comes
// first because an undecided slack's key is the lower end of an
// enclosure around 0, which can lie below a certified violation's.
func compareSlacks(a, b SampleSlack, absolute bool) int {
	if c := slackClass(a.Verdict) - slackClass(b.Verdict); c != 0 {
		return c
	}
	x, y := a.Rel, b.Rel
	if absolute {
		x, y = a.Lo, b.Lo
	}
	if c := ratOf(x).Cmp(ratOf(y)); c != 0 {
		return c
	}
	switch {
	case a.K < b.K:
		return -1
	case a.K > b.K:
		return 1
	}
	return 0
}

// slackClass ranks a slack's verdict for compareSlacks.
func slackClass(v cells.Verdict) int {
	switch v {
	case cells.Fails:
		return 0
	case cells.Undecided:
		return 1
	}
	return 2
}

func ratOf(s string) *big.Rat {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		return new(big.Rat)
	}
	return r
}

// Keep records the best point of one search start.
func (t *SearchTally) Keep(best *SampleSlack, start int64) {
	t.merge(&SearchTally{Best: best, Start: start})
}

func (t *SearchTally) merge(o *SearchTally) {
	if t.Skipped == "" {
		t.Skipped = o.Skipped
	}
	t.Starts += o.Starts
	t.Evaluations += o.Evaluations
	if o.Best != nil && (t.Best == nil || compareSlacks(*o.Best, *t.Best, false) < 0) {
		t.Best, t.Start = o.Best, o.Start
	}
}

// Shown lists the samples a report of the tally names: the worst residual,
// the float64 audit and the sample whose audit was skipped.
func (t *IdentityTally) Shown() []int64 {
	var ks []int64
	if t.Worst != nil {
		ks = append(ks, t.Worst.K)
	}
	if t.Audit != nil && !slices.Contains(ks, t.Audit.K) {
		ks = append(ks, t.Audit.K)
	}
	if t.Skip != nil && !slices.Contains(ks, t.Skip.K) {
		ks = append(ks, t.Skip.K)
	}
	return ks
}

// RecordAt says what t records about sample k, in the entries where like
// names k: a one-sample tally and a merged one compare this way.
func (t *IdentityTally) RecordAt(k int64, like *IdentityTally) string {
	var said []string
	if like.Worst != nil && like.Worst.K == k {
		said = append(said, "residual "+orNothing(t != nil && t.Worst != nil, func() string { return record(t.Worst.Residual()) }))
	}
	if like.Audit != nil && like.Audit.K == k {
		said = append(said, "float64 audit "+orNothing(t != nil && t.Audit != nil, func() string { return record(t.Audit.Audit) }))
	}
	if like.Skip != nil && like.Skip.K == k {
		said = append(said, "no float64 audit ("+orNothing(t != nil && t.Skip != nil, func() string { return t.Skip.Text })+")")
	}
	return strings.Join(said, ", ")
}

// Shown lists the samples a report of the tally names: the smallest slack
// and the first sample f raised on.
func (t *InequalityTally) Shown() []int64 {
	var ks []int64
	if len(t.Smallest) > 0 {
		ks = append(ks, t.Smallest[0].K)
	}
	if t.FirstRaise != nil && !slices.Contains(ks, t.FirstRaise.K) {
		ks = append(ks, t.FirstRaise.K)
	}
	return ks
}

// RecordAt says what t records about sample k, in the entries where like
// names k.
func (t *InequalityTally) RecordAt(k int64, like *InequalityTally) string {
	var said []string
	if len(like.Smallest) > 0 && like.Smallest[0].K == k {
		slack := "nothing"
		if t != nil {
			for _, sl := range t.Smallest {
				if sl.K == k {
					slack = record(sl)
				}
			}
		}
		said = append(said, "slack "+slack)
	}
	if like.FirstRaise != nil && like.FirstRaise.K == k {
		said = append(said, "f raised ("+orNothing(t != nil && t.FirstRaise != nil, func() string { return t.FirstRaise.Text })+")")
	}
	return strings.Join(said, ", ")
}

// orNothing is text() when there is something to say.
func orNothing(ok bool, text func() string) string {
	if !ok {
		return "nothing"
	}
	return text()
}

// record prints a tally entry for a message: its text and the fields
// that decide a verdict.
func record(v any) string {
	switch x := v.(type) {
	case Residual:
		return fmt.Sprintf("%q (zero %v, certified digits %d, near zero %v, undecided %v)", x.Text, x.Zero, x.Certified, x.NearZero, x.Undecided)
	case cells.FloatAudit:
		if x.Raised != "" || x.LHS == nil || x.RHS == nil {
			return fmt.Sprintf("raised %q", x.Raised)
		}
		return fmt.Sprintf("residual %q, lhs error %s, rhs error %s, %.1f digits lost", x.Residual, x.LHS.Error, x.RHS.Error, x.DigitsLost)
	case SampleSlack:
		return fmt.Sprintf("%q (%s, exact %v)", x.Text, x.Verdict, x.Exact)
	}
	return fmt.Sprint(v)
}

package claim

import (
	"math/big"
	"slices"

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

// IdentityTally summarises the residuals of a sampled identity.
type IdentityTally struct {
	Worst    *SampleResidual `json:"worst,omitempty"`
	Symbolic bool            `json:"symbolic,omitempty"` // some residual was a polynomial
	Real     bool            `json:"real,omitempty"`     // some residual was decided by intervals
	Failing  int64           `json:"failing,omitempty"`
	Raised   int64           `json:"raised,omitempty"` // samples on which f raised
	Audit    *SampleAudit    `json:"audit,omitempty"`  // the float64 audit that lost most digits
	Skip     *SampleNote     `json:"skip,omitempty"`   // why the audit was skipped, first sample
}

// SampleResidual is one sample's residual.
type SampleResidual struct {
	K         int64  `json:"k"`
	Text      string `json:"text"`
	Size      string `json:"size"` // exact rational
	Zero      bool   `json:"zero,omitempty"`
	Symbolic  bool   `json:"symbolic,omitempty"`
	Real      bool   `json:"real,omitempty"`
	Certified int    `json:"certified,omitempty"`
	Undecided bool   `json:"undecided,omitempty"`
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
	Smallest   []SampleSlack `json:"smallest"` // the smallest slacks, ascending, at most keepSmallest
	Violations int64         `json:"violations,omitempty"`
	Loose      int64         `json:"loose,omitempty"` // slack not certified either way
	Raised     int64         `json:"raised,omitempty"`
	FirstRaise *SampleNote   `json:"first_raise,omitempty"`
}

// SampleSlack is one instance's slack, greater − lesser.
type SampleSlack struct {
	K       int64         `json:"k"`
	Lo      string        `json:"lo"` // exact rational: the slack, or the lower end of its enclosure
	Exact   bool          `json:"exact,omitempty"`
	Verdict cells.Verdict `json:"verdict"`
	Text    string        `json:"text"`
	Ratio   string        `json:"ratio,omitempty"`
	Sample  string        `json:"sample,omitempty"` // printed instance, for one found by search
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

// Merge folds o into t.
func (t *Tally) Merge(o Tally) {
	t.Computed += o.Computed
	t.Seconds = max(t.Seconds, o.Seconds)
	t.Printed = t.Printed || o.Printed
	if o.Err != nil && (t.Err == nil || o.Err.K < t.Err.K) {
		t.Err = o.Err
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

func (t *IdentityTally) merge(o *IdentityTally) {
	if o.Worst != nil && (t.Worst == nil || o.Worst.worseThan(t.Worst)) {
		t.Worst = o.Worst
	}
	t.Symbolic = t.Symbolic || o.Symbolic
	t.Real = t.Real || o.Real
	t.Failing += o.Failing
	t.Raised += o.Raised
	if a := o.Audit; a != nil && (t.Audit == nil || a.Audit.DigitsLost > t.Audit.Audit.DigitsLost ||
		a.Audit.DigitsLost == t.Audit.Audit.DigitsLost && a.K < t.Audit.K) {
		t.Audit = a
	}
	if o.Skip != nil && (t.Skip == nil || o.Skip.K < t.Skip.K) {
		t.Skip = o.Skip
	}
}

// Add records one sample's residual.
func (t *IdentityTally) Add(k int64, r Residual) {
	t.merge(&IdentityTally{Worst: sampleResidual(k, r), Symbolic: r.Symbolic, Real: r.Real})
	if r.Failing() {
		t.Failing++
	}
}

// AddAudit keeps the float64 audit of sample k if it lost the most digits.
func (t *IdentityTally) AddAudit(k int64, audit cells.FloatAudit) {
	t.merge(&IdentityTally{Audit: &SampleAudit{K: k, Audit: audit}})
}

func sampleResidual(k int64, r Residual) *SampleResidual {
	return &SampleResidual{K: k, Text: r.Text, Size: r.Size.RatString(), Zero: r.Zero, Symbolic: r.Symbolic,
		Real: r.Real, Certified: r.Certified, Undecided: r.Undecided}
}

// Residual turns the record back into the residual it was made from.
func (s *SampleResidual) Residual() Residual {
	size, ok := new(big.Rat).SetString(s.Size)
	if !ok {
		size = new(big.Rat)
	}
	return Residual{Text: s.Text, Size: size, Zero: s.Zero, Symbolic: s.Symbolic, Real: s.Real,
		Certified: s.Certified, Undecided: s.Undecided}
}

// worseThan orders residuals as Worst does, the lower index first on ties.
func (s *SampleResidual) worseThan(o *SampleResidual) bool {
	a, b := s.Residual(), o.Residual()
	if c := Compare(a, b); c != 0 {
		return c > 0
	}
	return s.K < o.K
}

func (t *InequalityTally) merge(o *InequalityTally) {
	t.Smallest = mergeSmallest(t.Smallest, o.Smallest)
	t.Violations += o.Violations
	t.Loose += o.Loose
	t.Raised += o.Raised
	if o.FirstRaise != nil && (t.FirstRaise == nil || o.FirstRaise.K < t.FirstRaise.K) {
		t.FirstRaise = o.FirstRaise
	}
}

// mergeSmallest keeps the keepSmallest smallest slacks of a and b, ascending.
func mergeSmallest(a, b []SampleSlack) []SampleSlack {
	all := append(slices.Clone(a), b...)
	slices.SortStableFunc(all, compareSlacks)
	return all[:min(len(all), keepSmallest)]
}

// compareSlacks orders slacks by value, then by sample index.
func compareSlacks(a, b SampleSlack) int {
	if c := ratOf(a.Lo).Cmp(ratOf(b.Lo)); c != 0 {
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
	if o.Best != nil && (t.Best == nil || compareSlacks(*o.Best, *t.Best) < 0) {
		t.Best, t.Start = o.Best, o.Start
	}
}

package claim

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math/big"
	"math/rand/v2"
	"testing"

	"assay/cells"
)

// Merging is free of order and grouping: any split of per-sample tallies,
// merged in any order, gives the tally of one sequential sweep. Ties
// (equal residuals, equal slacks, equal digits lost) are frequent here.
func TestTallyMergeIsOrderFree(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	const n = 200
	per := make([]Tally, n)
	seq := &IdentityTally{} // the same residuals added to one tally, in order
	for k := range per {
		size := big.NewRat(int64(r.IntN(4)), 1)
		res := Residual{Text: fmt.Sprint("r", k), Size: size, Zero: size.Sign() == 0}
		switch r.IntN(5) {
		case 0:
			res.Undecided, res.Zero = true, false
		case 1:
			res.Certified, res.Zero, res.Real = 10+r.IntN(3), false, true
			res.NearZero = r.IntN(2) == 0
		}
		it := &IdentityTally{}
		it.Add(int64(k), res)
		audit := cells.FloatAudit{DigitsLost: float64(r.IntN(3))}
		it.AddAudit(int64(k), audit)
		seq.Add(int64(k), res)
		seq.AddAudit(int64(k), audit)
		verdicts := []cells.Verdict{cells.Holds, cells.Fails, cells.Undecided}
		sl := SampleSlack{K: int64(k), Lo: fmt.Sprint(r.IntN(7) - 2), Rel: fmt.Sprintf("%d/7", r.IntN(5)-2), Verdict: verdicts[r.IntN(3)]}
		given := &GivenTally{Met: 1}
		switch r.IntN(3) {
		case 0:
			given = &GivenTally{NotMet: 1, Raised: 1, FirstRaise: &SampleNote{K: int64(k), Text: fmt.Sprint("h raised at ", k)}}
		case 1:
			given.Trivial, given.FirstTrivial = 1, &SampleNote{K: int64(k)}
		}
		per[k] = Tally{Computed: 1, Given: given, Identity: it, Inequality: &InequalityTally{Smallest: []SampleSlack{sl}}}
	}
	var want Tally
	for _, p := range per {
		want.Merge(p)
	}
	// The first sample among equally bad ones is the one reported, as a
	// plain scan k = 0, 1, … would report it.
	first := 0
	for k := range per {
		if Compare(per[k].Identity.Worst.Residual(), per[first].Identity.Worst.Residual()) > 0 {
			first = k
		}
	}
	if want.Identity.Worst.K != int64(first) {
		t.Errorf("worst sample %d, want the first of the worst, %d", want.Identity.Worst.K, first)
	}
	wantJSON, _ := json.Marshal(want)
	// Add, which records a residual only when it becomes the worst, keeps
	// what merging the one-sample tallies keeps.
	if seqJSON, wantIdentity := must(json.Marshal(seq)), must(json.Marshal(want.Identity)); !bytes.Equal(seqJSON, wantIdentity) {
		t.Errorf("samples added in order:\n%s\nmerged:\n%s", seqJSON, wantIdentity)
	}
	for trial := 0; trial < 50; trial++ {
		groups := make([]Tally, 1+r.IntN(6))
		for _, k := range r.Perm(n) {
			groups[r.IntN(len(groups))].Merge(per[k])
		}
		var got Tally
		for _, g := range r.Perm(len(groups)) {
			got.Merge(groups[g])
		}
		if gotJSON, _ := json.Marshal(got); !bytes.Equal(gotJSON, wantJSON) {
			t.Fatalf("trial %d: merged tally differs:\n%s\n%s", trial, gotJSON, wantJSON)
		}
	}
}

// A sample's residual record keeps its size as math/big prints it
// (Rat.RatString, the reference), zero included, whose text Zero and
// sampleResidual no longer format each time; Exact formats it afresh.
func TestSampleResidualSize(t *testing.T) {
	for _, q := range []*big.Rat{new(big.Rat), big.NewRat(-3, 4), big.NewRat(5, 1)} {
		r := Exact(q)
		if q.Sign() == 0 {
			r = Zero()
			if want := Exact(new(big.Rat)); r.Text != want.Text || r.TeX != want.TeX || !r.Zero {
				t.Errorf("Zero() = %+v, want %+v", r, want)
			}
		}
		s := sampleResidual(1, r)
		want := new(big.Rat).Abs(q).RatString()
		if s.Size != want || s.Residual().Size.Cmp(new(big.Rat).Abs(q)) != 0 {
			t.Errorf("%v: size %q, want %q", q, s.Size, want)
		}
	}
}

func must[T any](v T, err error) T {
	if err != nil {
		panic(err)
	}
	return v
}

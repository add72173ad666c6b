package kernel

import (
	"crypto/sha256"
	"encoding/hex"
	"strings"
	"testing"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/session"
)

// A merge confirms what it shows and trusts no part blindly. Each case is
// a way a part was edited to make a failing claim read "holds" (or a
// notebook other than the one run be replayed): each must be refused,
// naming the part and the claim, and never give a holding verdict.
func TestMergeRefusesAlteredParts(t *testing.T) {
	// k + 1 == k fails on every sample; k * k == k * k holds on every one.
	const fails = `identity("off by one", lambda k: (k + 1, k), over=lambda k: k, samples=12)`
	const holds = `identity("squares", lambda k: (k * k, k * k), over=lambda k: k, samples=12)`
	nb := notebook(t, fails)
	parts := func(nb *cells.Notebook, n int64) []*Part {
		var out []*Part
		for i := int64(0); i < n; i++ {
			_, p := RunShard(nb, Options{Settings: session.DefaultSettings, Shard: claim.Share{Index: i, Count: n}})
			q, err := ParsePart("part", p.Encode())
			if err != nil {
				t.Fatal(err)
			}
			out = append(out, q)
		}
		return out
	}
	names := []string{"a.json", "b.json"}
	// whitewash makes a part's tally say every sample of its share holds.
	whitewash := func(p *Part) {
		it := p.Claims[0].Tally.Identity
		it.Worst.Text, it.Worst.Size, it.Worst.Zero = "0", "0", true
		it.Failing = 0
	}
	reseal := func(p *Part, src string) {
		p.Source = src
		sum := sha256.Sum256([]byte(src))
		p.SHA256 = hex.EncodeToString(sum[:])
	}
	cases := []struct {
		what  string
		edit  func(ps []*Part)
		want  string
		parts int64
	}{
		{"a tally edited to hold", func(ps []*Part) { whitewash(ps[0]); whitewash(ps[1]) }, `merge refused: claim "off by one": a.json records`, 2},
		{"no samples computed", func(ps []*Part) { ps[1].Claims[0].Tally.Computed = 0 }, "b.json: claim \"off by one\": it counts 0 samples computed, and shard 2/2 holds 6", 2},
		{"a worst sample from the other shard", func(ps []*Part) { ps[0].Claims[0].Tally.Identity.Worst.K = 1 }, "a.json: claim \"off by one\": it names sample 1, which is not in shard 1/2", 2},
		{"notebook text swapped, seal kept", func(ps []*Part) { ps[0].Source = strings.Replace(ps[0].Source, "k + 1", "k + 0", 1) }, "a.json: the notebook text it carries does not have the SHA-256 it states", 2},
		{"one forged part, marked 1/1", func(ps []*Part) {
			// A shard run of 1/1 keeps no tallies: the forger writes one.
			ps[0].Claims = []PartClaim{{Ask: claim.Ask{Claim: "off by one", Phase: claim.PhaseSweep, Line: 4, Samples: 12},
				Tally: claim.Tally{Computed: 12, Identity: &claim.IdentityTally{Worst: &claim.SampleResidual{K: 3, Text: "0", Size: "0", Zero: true}}}}}
		}, `merge refused: claim "off by one": a.json records`, 1},
	}
	for _, c := range cases {
		ps := parts(nb, c.parts)
		c.edit(ps)
		rep, err := Merge(ps, names[:len(ps)], Options{})
		msg := ""
		switch {
		case err != nil:
			msg = err.Error()
		case rep.Outcomes[0].Error != nil:
			msg = rep.Outcomes[0].Error.Message
			if len(rep.Outcomes[0].Claims) > 0 {
				t.Errorf("%s: the merged report still states a claim: %+v", c.what, rep.Outcomes[0].Claims)
			}
		}
		if !strings.Contains(msg, c.want) {
			t.Errorf("%s: merge gave %q, want %q", c.what, msg, c.want)
		}
	}
	// A notebook swapped with its seal updated is the notebook replayed; the
	// tallies of the one that ran do not fit it, and the merge says so.
	ps := parts(notebook(t, holds), 2)
	for _, p := range ps {
		reseal(p, strings.Replace(p.Source, "(k * k, k * k)", "(k * k, k * k + 1)", 1))
	}
	rep, err := Merge(ps, names, Options{})
	if err != nil || rep.Outcomes[0].Error == nil || !strings.Contains(rep.Outcomes[0].Error.Message, `merge refused: claim "squares": a.json records`) {
		t.Errorf("resealed swapped notebook: %v %+v", err, rep.Outcomes)
	}
	// Honest parts still merge into the single run's claim.
	rep, err = Merge(parts(nb, 2), names, Options{})
	if err != nil || len(rep.Outcomes[0].Claims) != 1 || rep.Outcomes[0].Claims[0].Verdict != cells.Fails {
		t.Fatalf("honest parts: %v %+v", err, rep.Outcomes)
	}
	// The report says where a merged claim's samples were computed.
	if note := rep.Outcomes[0].Claims[0].Note; !strings.Contains(note, "computed by the 2 shard runs whose part files were merged, and the merge re-evaluated only the samples this claim shows") {
		t.Errorf("merged note: %q", note)
	}
}

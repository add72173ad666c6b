package kernel

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"sort"
	"strings"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/session"
)

// PartFormat names the partial-result file format; it changes when the
// format does.
const PartFormat = "assay-part-1"

// Part is what one shard of a run (assay run --shard i/n) leaves for the
// merge: the tallies of its share of every sampled claim, and the notebook
// itself, so that the merge needs no other file.
type Part struct {
	Format   string           `json:"format"`
	Version  string           `json:"version"`
	Notebook string           `json:"notebook"` // path as given to the shard run
	SHA256   string           `json:"sha256"`
	Source   string           `json:"source"`
	Settings session.Settings `json:"settings"`
	Shard    int              `json:"shard"` // 1-based
	Shards   int              `json:"shards"`
	Claims   []PartClaim      `json:"claims"`
	// Errors are the cell errors of the shard run, for its user; the merge
	// meets them again when it replays the notebook.
	Errors []cells.Problem `json:"errors,omitempty"`
}

// PartClaim is one sampled claim's tally in a part.
type PartClaim struct {
	Ask   claim.Ask   `json:"ask"`
	Tally claim.Tally `json:"tally"`
}

// ParsePart reads a part file's contents; name is for messages.
func ParsePart(name string, data []byte) (*Part, error) {
	var p Part
	if err := json.Unmarshal(data, &p); err != nil || p.Format == "" {
		return nil, fmt.Errorf("%s is not an assay part file (written by assay run --shard i/n)", name)
	}
	if p.Format != PartFormat {
		return nil, fmt.Errorf("%s is a part file of format %q; this assay reads %q", name, p.Format, PartFormat)
	}
	if p.Shards < 1 || p.Shard < 1 || p.Shard > p.Shards {
		return nil, fmt.Errorf("%s says it is shard %d of %d", name, p.Shard, p.Shards)
	}
	return &p, nil
}

// Encode writes a part as indented JSON.
func (p *Part) Encode() []byte {
	data, _ := json.MarshalIndent(p, "", " ")
	return append(data, '\n')
}

// partSet is a complete, consistent set of parts, ready to merge.
type partSet struct {
	parts []*Part // in shard order
	names []string
}

// checkParts makes sure the parts are the n shards of one run: the same
// notebook, version and settings, each shard once.
func checkParts(parts []*Part, names []string) (*partSet, error) {
	if len(parts) == 0 {
		return nil, fmt.Errorf("give the part files to merge")
	}
	first := parts[0]
	byShard := map[int]int{}
	for i, p := range parts {
		sum := sha256.Sum256([]byte(p.Source))
		switch {
		case p.SHA256 != hex.EncodeToString(sum[:]):
			return nil, fmt.Errorf("%s: the notebook text it carries does not have the SHA-256 it states; the part was altered and is refused", names[i])
		case p.SHA256 != first.SHA256:
			return nil, fmt.Errorf("%s and %s come from different notebooks (SHA-256 %.12s… and %.12s…)", names[0], names[i], first.SHA256, p.SHA256)
		case p.Version != first.Version:
			return nil, fmt.Errorf("%s and %s were written by different assay versions (%s and %s)", names[0], names[i], first.Version, p.Version)
		case p.Shards != first.Shards:
			return nil, fmt.Errorf("%s is shard %d/%d but %s is shard %d/%d: they are not parts of one run", names[0], first.Shard, first.Shards, names[i], p.Shard, p.Shards)
		case p.Settings != first.Settings:
			return nil, fmt.Errorf("%s and %s ran with different settings (seed %d and %d, precision %d and %d bits): they are not parts of one run", names[0], names[i], first.Settings.Seed, p.Settings.Seed, first.Settings.Precision, p.Settings.Precision)
		}
		if j, dup := byShard[p.Shard]; dup {
			return nil, fmt.Errorf("shard %d/%d is given twice (%s and %s)", p.Shard, p.Shards, names[j], names[i])
		}
		byShard[p.Shard] = i
	}
	var missing []string
	for s := 1; s <= first.Shards; s++ {
		if _, ok := byShard[s]; !ok {
			missing = append(missing, fmt.Sprintf("%d/%d", s, first.Shards))
		}
	}
	if len(missing) > 0 {
		return nil, fmt.Errorf("shard %s is missing: give all %d parts of the run", strings.Join(missing, ", "), first.Shards)
	}
	set := &partSet{}
	order := make([]int, 0, len(parts))
	for _, i := range byShard {
		order = append(order, i)
	}
	sort.Slice(order, func(a, b int) bool { return parts[order[a]].Shard < parts[order[b]].Shard })
	for _, i := range order {
		set.parts = append(set.parts, parts[i])
		set.names = append(set.names, names[i])
	}
	return set, nil
}

// tally joins the parts' tallies of one sweep. A sweep no part has is
// computed by the merge itself (nil, nil); one that only some parts have
// means the shards ran different code, and cannot be merged. Each part's
// tally must be what its shard can have made: as many samples as its share
// holds, and only samples of its share.
func (s *partSet) tally(a claim.Ask) (*claim.Tally, error) {
	var t claim.Tally
	var have, lack []string
	for i, p := range s.parts {
		found := false
		for _, c := range p.Claims {
			if c.Ask.Key() != a.Key() {
				continue
			}
			if c.Ask != a {
				return nil, fmt.Errorf("claim %q differs between the notebook and %s (line %d, %d samples there; line %d, %d samples here)", a.Claim, s.names[i], c.Ask.Line, c.Ask.Samples, a.Line, a.Samples)
			}
			share := claim.Share{Index: int64(p.Shard - 1), Count: int64(p.Shards)}
			if why := shareMismatch(c.Tally, share, a.Samples); why != "" {
				return nil, fmt.Errorf("%s: claim %q: %s; the part was altered or is not from this run, and is refused", s.names[i], a.Claim, why)
			}
			t.Merge(c.Tally)
			found = true
			break
		}
		if found {
			have = append(have, s.names[i])
		} else {
			lack = append(lack, s.names[i])
		}
	}
	switch {
	case len(have) == 0:
		return nil, nil
	case len(lack) > 0:
		return nil, fmt.Errorf("claim %q is in %s but not in %s: the shards ran different code (did an earlier result differ between shards?); run without --shard", a.Claim, strings.Join(have, ", "), strings.Join(lack, ", "))
	}
	t.Parts = s.names
	return &t, nil
}

// shareMismatch says why a shard's tally cannot be the sweep of its share,
// or "" when it can: the count of samples computed, and every sample index
// it names.
func shareMismatch(t claim.Tally, sh claim.Share, samples int64) string {
	size := sh.Items(samples)
	switch {
	case t.Err == nil && t.Computed != size:
		return fmt.Sprintf("it counts %d samples computed, and shard %d/%d holds %d", t.Computed, sh.Index+1, sh.Count, size)
	case t.Err != nil && (t.Computed < 0 || t.Computed > size):
		return fmt.Sprintf("it counts %d samples computed, more than the %d of shard %d/%d", t.Computed, size, sh.Index+1, sh.Count)
	case t.Search != nil:
		return "it holds a counterexample search, which only a merge runs"
	}
	for _, k := range t.Samples() {
		if k < 0 || k >= samples || k%sh.Count != sh.Index {
			return fmt.Sprintf("it names sample %d, which is not in shard %d/%d", k, sh.Index+1, sh.Count)
		}
	}
	return ""
}

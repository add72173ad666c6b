package main

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// An edited part file cannot make a failing claim read "holds": merge
// refuses it, exit 2, naming the part and the claim.
func TestMergeRefusesAnEditedPart(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/merge/off-by-one.md")
	var parts []string
	for i := 1; i <= 2; i++ {
		if code, out, errs := assay(t, "run", "--shard", fmt.Sprintf("%d/2", i), nb); code != 0 {
			t.Fatalf("shard %d: exit %d\n%s%s", i, code, out, errs)
		}
		parts = append(parts, strings.TrimSuffix(nb, ".md")+fmt.Sprintf(".part-%d-of-2.json", i))
	}
	// Whitewash both parts: every sample's residual made zero.
	for _, p := range parts {
		data, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		var doc map[string]any
		if err := json.Unmarshal(data, &doc); err != nil {
			t.Fatal(err)
		}
		tally := doc["claims"].([]any)[0].(map[string]any)["tally"].(map[string]any)
		it := tally["identity"].(map[string]any)
		worst := it["worst"].(map[string]any)
		worst["text"], worst["size"], worst["zero"] = "0", "0", true
		delete(it, "failing")
		edited, _ := json.Marshal(doc)
		if err := os.WriteFile(p, edited, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	out := filepath.Join(filepath.Dir(nb), "merged.md")
	code, stdout, stderr := assay(t, append([]string{"merge", "-o", out}, parts...)...)
	text := stdout + stderr
	if code != 2 || !strings.Contains(text, `merge refused: claim "off by one": `+parts[0]) || strings.Contains(text, "✔ holds") {
		t.Fatalf("merge of edited parts: exit %d\n%s", code, text)
	}
	if data, err := os.ReadFile(out); err != nil || strings.Contains(string(data), "✔ holds") || !strings.Contains(string(data), "merge refused") {
		t.Errorf("the merged report must state the refusal, not a verdict (%v):\n%s", err, data)
	}
}

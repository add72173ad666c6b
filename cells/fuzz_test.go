package cells

import (
	"bytes"
	"testing"
)

// FuzzParse: any input parses without a panic, and a notebook that parses
// cleanly survives being rendered as a report (outcomes for every cell)
// and parsed again, with identical bytes on a second rendering. A header
// that lists warnings names notebook lines, which move in the report, so
// with warnings only the report without a header must come back the same.
// `go test ./cells -fuzz FuzzParse` explores further; plain `go test` runs
// the seeds.
func FuzzParse(f *testing.F) {
	for _, seed := range []string{
		"", "# t\n", "```cell\nx = 1\n```\n", "~~~~cell seed=3\ny\n~~~~\n```output\nold\n```\n",
		"# t\r\n\r\n```cell id=a\r\nx\r\n```\r\n", "```cell\n````\n```\n", "<!-- assay:generated -->\nx\n<!-- /assay:generated -->\n",
		"```cell\nunclosed\n", "```cell bogus=1\n```\n", "   ```cell\n  x\n   ```\n", "\xff\n",
		"<!--\n```cell\nx\n```\n-->\n", "> ```cell\n> x\n> ```\n", "# t\r```cell\rx\r```\r", "- a\n\n  ```cell\n  x\n  ```\n",
		"<!-- assay:generated -->\n```cell\nx\n```\n<!-- /assay:generated -->\n", "text\n```output\nx\n```\n",
	} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		nb, err := Parse("f.md", src)
		if nb == nil {
			t.Fatal("Parse returned no notebook")
		}
		if err != nil {
			return
		}
		r := &Report{Notebook: nb, Version: "fuzz", Seed: 1, Precision: 256}
		for _, c := range nb.Cells() {
			r.Outcomes = append(r.Outcomes, Outcome{Cell: c.Index, Status: Ran, Output: "```\n" + c.Text})
		}
		for _, header := range []bool{true, false} {
			first := RenderMarkdown(r, header)
			again, err := Parse("f.md", first)
			if err != nil {
				t.Fatalf("the report does not parse: %v\n%q", err, first)
			}
			if len(again.Cells()) != len(nb.Cells()) {
				t.Fatalf("%d cells after the round trip, want %d\n%q", len(again.Cells()), len(nb.Cells()), first)
			}
			if len(again.Foreign) != len(nb.Foreign) {
				t.Fatalf("%d foreign regions after the round trip, want %d\n%q", len(again.Foreign), len(nb.Foreign), first)
			}
			r2 := *r
			r2.Notebook = again
			if header && len(nb.Warnings) > 0 {
				continue
			}
			if second := RenderMarkdown(&r2, header); !bytes.Equal(first, second) {
				t.Fatalf("rendering again changed the report:\n%q\n%q", first, second)
			}
		}
	})
}

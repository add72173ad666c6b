package watch

import (
	"fmt"
	"strings"
	"testing"
	"time"
)

// slowCells is a notebook of 19 cells of about 0.1 s each on the 2-core
// machine (a loop of 5·10^5 additions; the benchmark reports the first
// run's time), then a cell with a claim that the benchmark edits.
func slowCells(last string) string {
	var b strings.Builder
	b.WriteString("# Twenty cells\n")
	for i := 0; i < 19; i++ {
		fmt.Fprintf(&b, "\n```cell\nn%d = 0\nfor i in range(500000):\n    n%d = n%d + 1\n```\n", i, i, i)
	}
	b.WriteString("\n```cell\n" + last + "\n```\n")
	return b.String()
}

// benchmarkSave measures save-to-page: from writing an edited notebook to
// the event that carries the new report, for an edit of the first or the
// last cell, each edit made once the spare kernel has replayed its cells
// (the spare's replay, after each run, is not timed). It reports the
// first run's time, the cost of the earlier cells.
func benchmarkSave(b *testing.B, edit func(i int) string) {
	s := start(b, edit(-1))
	ev := s.events(b)
	began := time.Now()
	ev.until(b, "ok")
	first := time.Since(began).Seconds()
	for i := 0; b.Loop(); i++ {
		b.StopTimer()
		s.live.Ready()
		b.StartTimer()
		s.save(b, edit(i))
		want := fmt.Sprintf("edit %d", i)
		for {
			_, html := ev.until(b, "ok")
			if strings.Contains(html, want) {
				break
			}
		}
	}
	b.ReportMetric(first, "s/first-run")
}

// The target: a one-cell change at the end of a 20-cell notebook
// whose earlier cells take 2 s, under 300 ms.
func BenchmarkSaveToPageLastCell(b *testing.B) {
	benchmarkSave(b, func(i int) string {
		return slowCells(fmt.Sprintf("identity(\"edit %d\", n0 + %d, 500000 + %d)", i, i, i))
	})
}

// For comparison: an edit of the first cell runs every cell again.
func BenchmarkSaveToPageFirstCell(b *testing.B) {
	benchmarkSave(b, func(i int) string {
		nb := slowCells("identity(\"edit\", 1, 1)")
		return strings.Replace(nb, "n0 = 0\n", fmt.Sprintf("n0 = 0\nlabel = \"edit %d\"\nprint(label)\n", i), 1)
	})
}

package figure

import (
	"bytes"
	"encoding/xml"
	"flag"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// golden compares got with testdata/name, or rewrites it with -update.
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		if err := os.MkdirAll("testdata", 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./kernel/figure/ -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s differs from the rendering (run with -update and review the diff)", path)
	}
}

func sampleSpec() Spec {
	var xs, sq, lin []float64
	for i := 0; i <= 10; i++ {
		x := float64(i) / 2
		xs = append(xs, x)
		sq = append(sq, x*x)
		lin = append(lin, 3*x+1)
	}
	return Spec{
		Title:  "Squares & lines <sample>",
		XLabel: "x (units)",
		YLabel: "f(x)",
		Series: []Series{
			{Label: "x²", X: xs, Y: sq, Lines: true, Points: true},
			{Label: "3x + 1", X: xs, Y: lin, Lines: true},
			{Label: "measured", X: []float64{0.5, 1.5, 2.5, 3.5}, Y: []float64{2, 4.5, 7, 13}, Points: true},
		},
	}
}

func logSpec() Spec {
	return Spec{
		Title:  "Error against step size",
		XLabel: "h",
		YLabel: "|error|",
		LogX:   true,
		LogY:   true,
		Series: []Series{
			{Label: "first order", X: []float64{1e-4, 1e-3, 1e-2, 1e-1, 1}, Y: []float64{1e-4, 1e-3, 1e-2, 1e-1, 1}, Lines: true, Points: true},
			{Label: "second order", X: []float64{0, 1e-4, 1e-3, 1e-2, 1e-1, 1}, Y: []float64{0, 1e-8, 1e-6, 1e-4, -1, 1}, Lines: true, Points: true},
		},
	}
}

func render(t *testing.T, s Spec) string {
	t.Helper()
	svg, err := SVG(s)
	if err != nil {
		t.Fatal(err)
	}
	return svg
}

func TestGolden(t *testing.T) {
	golden(t, "sample.svg", []byte(render(t, sampleSpec())))
	golden(t, "log.svg", []byte(render(t, logSpec())))
}

func TestDeterministic(t *testing.T) {
	for _, s := range []Spec{sampleSpec(), logSpec()} {
		a, b := render(t, s), render(t, s)
		if a != b {
			t.Errorf("%q: two renderings differ", s.Title)
		}
	}
}

// wellFormed parses svg as XML and returns its character data.
func wellFormed(t *testing.T, svg string) string {
	t.Helper()
	d := xml.NewDecoder(strings.NewReader(svg))
	var text strings.Builder
	root := ""
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("the SVG is not well-formed XML: %v", err)
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			if root == "" {
				root = tok.Name.Local
				if tok.Name.Space != "http://www.w3.org/2000/svg" {
					t.Errorf("root element in namespace %q", tok.Name.Space)
				}
			}
		case xml.CharData:
			text.Write(tok)
			text.WriteByte('\n')
		}
	}
	if root != "svg" {
		t.Errorf("root element %q, want svg", root)
	}
	return text.String()
}

func TestXMLAndText(t *testing.T) {
	svg := render(t, sampleSpec())
	text := wellFormed(t, svg)
	for _, want := range []string{"Squares & lines <sample>", "x (units)", "f(x)", "x²", "3x + 1", "measured"} {
		if !strings.Contains(text, want) {
			t.Errorf("the SVG lacks the text %q", want)
		}
	}
	if !strings.Contains(svg, "<title>Squares &amp; lines &lt;sample&gt;</title>") {
		t.Errorf("no <title> element")
	}
	if !regexp.MustCompile(`<svg width="453\.5\d*pt" height="283\.4\d*pt"`).MatchString(svg) {
		t.Errorf("size is not 16cm x 10cm: %.120s", svg)
	}
	// Self-contained: no links, scripts, embedded fonts or images; fonts
	// named by family ending in a generic one.
	low := strings.ToLower(svg)
	for _, bad := range []string{"href", "<script", "<image", "url(", "@font-face", "<!--"} {
		if strings.Contains(low, bad) {
			t.Errorf("the SVG holds %q", bad)
		}
	}
	for _, f := range regexp.MustCompile(`font-family:([^;"]*)`).FindAllStringSubmatch(svg, -1) {
		if !strings.HasSuffix(f[1], ",sans-serif") {
			t.Errorf("font family %q does not end in a generic family", f[1])
		}
	}
}

// Control characters and invalid UTF-8 in labels still give valid XML.
func TestOddText(t *testing.T) {
	s := Spec{Title: "a\x00b\x1b\xffc\r\nsecond line", XLabel: "]]> &amp; \"q\" 'a'", YLabel: "tab\there",
		Series: []Series{{Label: "<s>\x07", X: []float64{1, 2}, Y: []float64{3, 4}}}}
	text := wellFormed(t, render(t, s))
	for _, want := range []string{"ab\uFFFDc", "second line", "]]> &amp; \"q\" 'a'", "tab here", "<s>"} {
		if !strings.Contains(text, want) {
			t.Errorf("the SVG lacks the text %q:\n%s", want, text)
		}
	}
}

func TestLogDropsNonPositive(t *testing.T) {
	svg := render(t, logSpec())
	text := wellFormed(t, svg)
	// (0, 0) and (0.1, -1) of the second series are left out.
	if !strings.Contains(text, "2 points with a non-positive value on a logarithmic axis left out") {
		t.Errorf("the SVG does not say that 2 points were dropped:\n%s", text)
	}
	for _, want := range []string{"0.0001", "0.01", "1", "1e-8", "1e-2", "1e0"} {
		if !strings.Contains(text, "\n"+want+"\n") {
			t.Errorf("no tick label %q:\n%s", want, text)
		}
	}
	// One axis logarithmic: only the points non-positive on it are dropped.
	s := Spec{LogY: true, Series: []Series{{X: []float64{-1, 0, 1, 2}, Y: []float64{1, 10, 0, 100}}}}
	if text := wellFormed(t, render(t, s)); !strings.Contains(text, "1 point with a non-positive value") {
		t.Errorf("log y: want 1 point dropped:\n%s", text)
	}
	// Nothing dropped, no note.
	s = Spec{Title: "t", LogX: true, Series: []Series{{X: []float64{1, 2}, Y: []float64{-1, 0}}}}
	if svg := render(t, s); strings.Contains(svg, "left out") {
		t.Errorf("a note with nothing dropped")
	}
}

func TestErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, tc := range []struct {
		name string
		s    Spec
		want string
	}{
		{"empty spec", Spec{}, "no series"},
		{"no points", Spec{Series: []Series{{Label: "a"}, {}}}, "no points"},
		{"lengths", Spec{Series: []Series{{X: []float64{1}, Y: []float64{1}}, {Label: "b", X: []float64{1, 2}, Y: []float64{1}}}},
			`series 2 ("b") has 2 x values and 1 y values`},
		{"nan", Spec{Series: []Series{{Label: "a", X: []float64{1, 2, 3}, Y: []float64{1, nan, 3}}}}, `series 1 ("a"): y[1] is NaN`},
		{"inf", Spec{Series: []Series{{X: []float64{1}, Y: []float64{1}}, {X: []float64{1, -inf}, Y: []float64{1, 1}}}}, `series 2: x[1] is -Inf`},
		{"all dropped", Spec{LogX: true, Series: []Series{{X: []float64{0, -1}, Y: []float64{1, 2}}, {X: []float64{-3}, Y: []float64{1}}}},
			"all 3 points have a non-positive value on a logarithmic axis"},
		{"too wide", Spec{Series: []Series{{X: []float64{-1e308, 1e308}, Y: []float64{1, 2}}}}, "too wide for a linear axis"},
	} {
		svg, err := SVG(tc.s)
		if err == nil {
			t.Errorf("%s: no error (%d bytes of SVG)", tc.name, len(svg))
			continue
		}
		if !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %q, want it to contain %q", tc.name, err, tc.want)
		}
		if svg != "" {
			t.Errorf("%s: SVG returned with the error", tc.name)
		}
	}
}

// Awkward data still draws: one point, a constant series, extreme and tiny
// ranges, log axes over a single value and over hundreds of decades, and
// more series than there are styles.
func TestAwkwardData(t *testing.T) {
	var many []Series
	for i := 0; i < 11; i++ {
		many = append(many, Series{Label: strings.Repeat("long label ", i%3+1), X: []float64{0, 1}, Y: []float64{float64(i), float64(i + 1)}, Lines: true})
	}
	for _, tc := range []struct {
		name string
		s    Spec
	}{
		{"one point", Spec{Series: []Series{{X: []float64{1}, Y: []float64{2}, Lines: true}}}},
		{"constant", Spec{Series: []Series{{X: []float64{1, 2, 3}, Y: []float64{5, 5, 5}}}}},
		{"huge", Spec{Series: []Series{{X: []float64{-1e300, 1e300}, Y: []float64{1e-300, 2e-300}}}}},
		{"tiny range", Spec{Series: []Series{{X: []float64{1, 1 + 1e-15}, Y: []float64{0, 1}}}}},
		{"log one value", Spec{LogX: true, LogY: true, Series: []Series{{X: []float64{1, 1}, Y: []float64{100, 100}}}}},
		{"log narrow", Spec{LogY: true, Series: []Series{{X: []float64{1, 2}, Y: []float64{0.05, 0.08}}}}},
		{"log extreme", Spec{LogX: true, LogY: true, Series: []Series{{X: []float64{5e-324, 1, math.MaxFloat64}, Y: []float64{1e-300, 1, 1e300}}}}},
		{"many series", Spec{Title: "many", Series: many}},
		{"empty series", Spec{Series: []Series{{Label: "empty"}, {Label: "two\nlines " + strings.Repeat("long ", 40), X: []float64{1, 2}, Y: []float64{2, 1}}}}},
	} {
		svg, err := SVG(tc.s)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		wellFormed(t, svg)
		if strings.Contains(svg, "NaN") || strings.Contains(svg, "Inf") {
			t.Errorf("%s: the SVG has NaN or Inf coordinates", tc.name)
		}
	}
}

// Rendering from several goroutines at once gives the same bytes (run the
// tests with -race to check for data races in the plot module's caches).
func TestConcurrent(t *testing.T) {
	want := render(t, sampleSpec())
	errs := make(chan string, 8)
	for range 8 {
		go func() {
			svg, err := SVG(sampleSpec())
			if err != nil {
				errs <- err.Error()
				return
			}
			if svg != want {
				errs <- "a concurrent rendering differs"
				return
			}
			errs <- ""
		}()
	}
	for range 8 {
		if e := <-errs; e != "" {
			t.Error(e)
		}
	}
}

// Series get distinct colours and distinct markers and dash patterns.
func TestDistinctStyles(t *testing.T) {
	if len(palette) < 6 || len(shapes) < 6 || len(dashes) < 6 {
		t.Fatal("too few styles")
	}
	seen := map[any]bool{}
	for _, c := range palette {
		r, g, b, _ := c.RGBA()
		k := [3]uint32{r, g, b}
		if seen[k] {
			t.Errorf("colour %v twice", c)
		}
		seen[k] = true
	}
	for i, sh := range shapes {
		for j := range i {
			if shapes[j] == sh {
				t.Errorf("shape %T twice", sh)
			}
		}
	}
	svg := render(t, Spec{Series: []Series{
		{Label: "a", X: []float64{0, 1}, Y: []float64{0, 1}, Lines: true},
		{Label: "b", X: []float64{0, 1}, Y: []float64{1, 0}, Lines: true},
	}})
	if !strings.Contains(svg, "stroke-dasharray:7,3") {
		t.Errorf("the second series is not dashed")
	}
}

func TestLogTicks(t *testing.T) {
	labels := func(min, max float64) string {
		var ls []string
		for _, tk := range (logTicks{}).Ticks(min, max) {
			if tk.Label != "" {
				ls = append(ls, tk.Label)
			}
			if !(tk.Value > 0) || math.IsInf(tk.Value, 0) {
				t.Errorf("Ticks(%g, %g): tick at %g", min, max, tk.Value)
			}
		}
		return strings.Join(ls, " ")
	}
	for _, tc := range []struct {
		min, max float64
		want     string
	}{
		{0.05, 0.08, "0.01 0.02 0.05 0.1"},
		{1e-4, 1, "0.0001 0.001 0.01 0.1 1"},
		{1e-8, 10, "1e-8 1e-6 1e-4 1e-2 1e0"},
		{1e-7, 1e-6, "1e-7 2e-7 5e-7 1e-6"},
		{1, 1e30, "1e0 1e5 1e10 1e15 1e20 1e25 1e30"},
		{5e-324, math.MaxFloat64, "1e-300 1e-200 1e-100 1e0 1e100 1e200 1e300"},
	} {
		if got := labels(tc.min, tc.max); got != tc.want {
			t.Errorf("Ticks(%g, %g) labels %q, want %q", tc.min, tc.max, got, tc.want)
		}
	}
	if decadeFloor(5e-324) != -324 || decadeCeil(math.MaxFloat64) != 309 || decadeFloor(1000) != 3 || decadeCeil(1000) != 3 || decadeCeil(1001) != 4 {
		t.Error("decadeFloor/decadeCeil wrong at the ends of the float64 range")
	}
}

// Package figure draws line and scatter plots as self-contained SVG
// documents, with gonum's plot module.
//
// The output is deterministic: the same Spec gives the same bytes. Text is
// laid out with the metrics of the Liberation Sans font that gonum ships, and
// the SVG names that font, its metric-compatible equivalents and the generic
// sans-serif family, so nothing is embedded or loaded from outside.
package figure

import (
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"image/color"
	"math"
	"strconv"
	"strings"

	xfont "golang.org/x/image/font"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Series is one set of points.
type Series struct {
	Label  string // legend text; series without a label are left out of the legend
	X, Y   []float64
	Lines  bool // join the points
	Points bool // mark the points
	// A series with neither Lines nor Points set is drawn with both.
}

// Spec describes a plot.
type Spec struct {
	Title, XLabel, YLabel string
	// LogX and LogY make the axes logarithmic. Points with a non-positive
	// coordinate on a logarithmic axis are left out, and a note under the
	// title (repeated in the SVG's <desc> element) says how many were.
	LogX, LogY bool
	// Series are drawn in order. Each gets its own colour and its own
	// marker shape and dash pattern, so they can be told apart without
	// colour.
	Series []Series
}

// Width and Height are the size of the drawing.
const (
	Width  = 16 * vg.Centimeter
	Height = 10 * vg.Centimeter
)

// fontFamily replaces the font family gonum writes (the Liberation font it
// measured the text with) in the SVG.
const fontFamily = "Liberation Sans,Arial,Helvetica,sans-serif"

var (
	sans     = font.Font{Typeface: "Liberation", Variant: "Sans"}
	sansBold = font.Font{Typeface: "Liberation", Variant: "Sans", Weight: xfont.WeightBold}

	// palette: dark, well separated hues that read on white.
	palette = []color.Color{
		color.RGBA{R: 0x1f, G: 0x4e, B: 0x99, A: 0xff}, // blue
		color.RGBA{R: 0xc4, G: 0x45, B: 0x00, A: 0xff}, // vermilion
		color.RGBA{R: 0x1a, G: 0x7f, B: 0x3c, A: 0xff}, // green
		color.RGBA{R: 0x7b, G: 0x2d, B: 0x8e, A: 0xff}, // purple
		color.RGBA{R: 0x9c, G: 0x6b, B: 0x00, A: 0xff}, // ochre
		color.RGBA{R: 0x00, G: 0x7c, B: 0x89, A: 0xff}, // teal
		color.RGBA{R: 0xb0, G: 0x22, B: 0x6a, A: 0xff}, // magenta
		color.RGBA{R: 0x4d, G: 0x4d, B: 0x4d, A: 0xff}, // grey
	}

	// shapes: filled and open markers of different outlines.
	shapes = []marker{disc, openSquare, openTriangle, cross, ring, filledSquare, plus, filledDiamond}

	// dashes: solid first, then patterns that stay distinct when short.
	dashes = [][]vg.Length{
		nil,
		{vg.Points(7), vg.Points(3)},
		{vg.Points(2), vg.Points(2)},
		{vg.Points(7), vg.Points(2), vg.Points(1.5), vg.Points(2)},
		{vg.Points(12), vg.Points(3)},
		{vg.Points(7), vg.Points(2), vg.Points(1.5), vg.Points(2), vg.Points(1.5), vg.Points(2)},
	}

	gridColor = color.Gray{Y: 0xdd}
)

// SVG renders the spec as a self-contained SVG document of Width by Height:
// title, then the plot with a light grid, then a legend of the labelled
// series. The title is also the SVG's <title> element.
//
// It fails on a spec with no points, a series whose X and Y differ in
// length, a NaN or infinite value (the error names the series and index),
// values too far apart for a linear axis, and when a logarithmic axis leaves
// no point to draw.
func SVG(s Spec) (string, error) {
	series, dropped, err := prepare(s)
	if err != nil {
		return "", err
	}

	p := plot.New()
	p.BackgroundColor = nil // the whole canvas is filled below
	title := clean(s.Title)
	note := ""
	if dropped > 0 {
		note = fmt.Sprintf("%s with a non-positive value on a logarithmic axis left out", plural(dropped, "point"))
	}
	p.X.Label.Text = clean(s.XLabel)
	p.Y.Label.Text = clean(s.YLabel)
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Label.TextStyle.Font = font.From(sans, 11)
		a.Label.Padding = vg.Points(4)
		a.Tick.Label.Font = font.From(sans, 9.5)
		a.Tick.LineStyle.Color = color.Gray{Y: 0x33}
		a.LineStyle.Color = color.Gray{Y: 0x33}
		a.Tick.Length = vg.Points(5)
	}

	grid := plotter.NewGrid()
	grid.Vertical = draw.LineStyle{Color: gridColor, Width: vg.Points(0.5)}
	grid.Horizontal = grid.Vertical
	p.Add(grid)

	var entries []legendEntry
	for i, sr := range series {
		xys := make(plotter.XYs, len(sr.x))
		for j := range sr.x {
			xys[j] = plotter.XY{X: sr.x[j], Y: sr.y[j]}
		}
		clr := palette[i%len(palette)]
		var thumbs []plot.Thumbnailer
		lines, points := sr.Lines, sr.Points
		if !lines && !points {
			lines, points = true, true
		}
		if lines {
			l, err := plotter.NewLine(xys)
			if err != nil {
				return "", fmt.Errorf("figure: series %d: %v", sr.index+1, err)
			}
			l.LineStyle = draw.LineStyle{Color: clr, Width: vg.Points(1.5), Dashes: dashes[i%len(dashes)]}
			p.Add(l)
			thumbs = append(thumbs, l)
		}
		if points || len(xys) == 1 {
			sc, err := plotter.NewScatter(xys)
			if err != nil {
				return "", fmt.Errorf("figure: series %d: %v", sr.index+1, err)
			}
			sc.GlyphStyle = draw.GlyphStyle{Color: clr, Radius: vg.Points(3), Shape: shapes[i%len(shapes)]}
			p.Add(sc)
			thumbs = append(thumbs, sc)
		}
		if label := legendLabel(sr.Label); label != "" {
			entries = append(entries, legendEntry{label, thumbs})
		}
	}

	if s.LogX {
		setLog(&p.X)
	}
	if s.LogY {
		setLog(&p.Y)
	}

	canvas := vgsvg.New(Width, Height)
	dc := draw.New(canvas)
	dc.SetColor(color.White)
	dc.Fill(dc.Rectangle.Path())
	area := draw.Crop(dc, vg.Points(8), -vg.Points(12), vg.Points(6), -vg.Points(8))
	area = drawTitle(area, title, note)
	if len(entries) > 0 {
		h := drawLegend(area, entries)
		area = draw.Crop(area, 0, 0, h, 0)
	}
	if err := drawPlot(p, area); err != nil {
		return "", err
	}

	var b bytes.Buffer
	if _, err := canvas.WriteTo(&b); err != nil {
		return "", fmt.Errorf("figure: %v", err)
	}
	return finish(b.String(), title, note), nil
}

// drawPlot draws p, turning a panic of the plot module into an error.
func drawPlot(p *plot.Plot, c draw.Canvas) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("figure: cannot draw the plot: %v", r)
		}
	}()
	p.Draw(c)
	return nil
}

// series is a Series after checking, with the points that can be drawn.
type series struct {
	Series
	index int
	x, y  []float64
}

// prepare checks the spec and drops the points that a logarithmic axis
// cannot show; it returns the series to draw and the number dropped.
func prepare(s Spec) ([]series, int, error) {
	if len(s.Series) == 0 {
		return nil, 0, errors.New("figure: nothing to plot: the spec has no series")
	}
	var out []series
	total, dropped := 0, 0
	for i, sr := range s.Series {
		name := seriesName(i, sr)
		if len(sr.X) != len(sr.Y) {
			return nil, 0, fmt.Errorf("figure: %s has %d x values and %d y values", name, len(sr.X), len(sr.Y))
		}
		for j := range sr.X {
			for _, v := range []struct {
				axis string
				val  float64
			}{{"x", sr.X[j]}, {"y", sr.Y[j]}} {
				if math.IsNaN(v.val) || math.IsInf(v.val, 0) {
					return nil, 0, fmt.Errorf("figure: %s: %s[%d] is %v; only finite values can be plotted", name, v.axis, j, v.val)
				}
			}
		}
		total += len(sr.X)
		keep := series{Series: sr, index: i}
		for j := range sr.X {
			if (s.LogX && sr.X[j] <= 0) || (s.LogY && sr.Y[j] <= 0) {
				dropped++
				continue
			}
			keep.x = append(keep.x, sr.X[j])
			keep.y = append(keep.y, sr.Y[j])
		}
		out = append(out, keep)
	}
	if total == 0 {
		return nil, 0, errors.New("figure: nothing to plot: the series have no points")
	}
	if dropped == total {
		return nil, 0, fmt.Errorf("figure: nothing to plot: all %s have a non-positive value on a logarithmic axis", plural(total, "point"))
	}
	for _, a := range []struct {
		name string
		log  bool
		get  func(series) []float64
	}{{"x", s.LogX, func(s series) []float64 { return s.x }}, {"y", s.LogY, func(s series) []float64 { return s.y }}} {
		if a.log {
			continue
		}
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, sr := range out {
			for _, v := range a.get(sr) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
		if hi-lo > math.MaxFloat64/4 {
			return nil, 0, fmt.Errorf("figure: the %s values span [%g, %g], too wide for a linear axis", a.name, lo, hi)
		}
	}
	return out, dropped, nil
}

func seriesName(i int, sr Series) string {
	if sr.Label == "" {
		return fmt.Sprintf("series %d", i+1)
	}
	return fmt.Sprintf("series %d (%q)", i+1, sr.Label)
}

func plural(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	return strconv.Itoa(n) + " " + word + "s"
}

// setLog gives a a logarithmic scale over the whole decades around its
// data.
func setLog(a *plot.Axis) {
	lo, hi := decadeFloor(a.Min), decadeCeil(a.Max)
	if lo == hi {
		lo, hi = lo-1, hi+1
	}
	lo, hi = max(lo, -323), min(hi, 308)
	a.Min = math.Min(a.Min, pow10(lo))
	a.Max = math.Max(a.Max, pow10(hi))
	a.Scale = plot.LogScale{}
	a.Tick.Marker = logTicks{}
}

// pow10 is 10^d correctly rounded (0 below the float64 range, +Inf above).
func pow10(d int) float64 {
	v, _ := strconv.ParseFloat("1e"+strconv.Itoa(d), 64)
	return v
}

// decadeFloor is the largest d with 10^d <= x, for x > 0 (at least -324).
func decadeFloor(x float64) int {
	d := int(math.Floor(math.Log10(x)))
	for d > -324 && pow10(d) > x {
		d--
	}
	for pow10(d+1) <= x {
		d++
	}
	return d
}

// decadeCeil is the smallest d with 10^d >= x, for x > 0.
func decadeCeil(x float64) int {
	d := decadeFloor(x)
	if pow10(d) < x {
		d++
	}
	return d
}

// logTicks labels powers of ten, each decade or every few (on multiples of
// 2, 3, 5, 10, 20, … decades) so that at most about eight are labelled.
// Minor ticks are at 2…9 times each power when every decade is labelled,
// and those at 2 and 5 are labelled too when the axis spans at most two
// decades. Labels are decimals ("0.001", "1000") when all lie between
// 0.0001 and 100000, else all in e-notation ("1e-6", "2e-6", "1e0").
type logTicks struct{}

// Ticks implements plot.Ticker.
func (logTicks) Ticks(min, max float64) []plot.Tick {
	if !(min > 0 && max > min) {
		return nil
	}
	lo, hi := decadeFloor(min), decadeCeil(max)
	step := 1
	for _, s := range []int{1, 2, 3, 5, 10, 20, 30, 50, 100, 200} {
		if step = s; (hi-lo)/s <= 8 {
			break
		}
	}
	plain := lo >= -4 && hi <= 5
	var ticks []plot.Tick
	add := func(k, d int, labelled bool) {
		v, _ := strconv.ParseFloat(strconv.Itoa(k)+"e"+strconv.Itoa(d), 64)
		if v <= 0 || math.IsInf(v, 0) {
			return
		}
		t := plot.Tick{Value: v}
		switch {
		case !labelled:
		case plain:
			t.Label = strconv.FormatFloat(v, 'f', -1, 64)
		default:
			t.Label = strconv.Itoa(k) + "e" + strconv.Itoa(d)
		}
		ticks = append(ticks, t)
	}
	for d := lo; d <= hi; d++ {
		if d%step == 0 || hi-lo <= 60 {
			add(1, d, d%step == 0)
		}
		if step == 1 && d < hi {
			for k := 2; k < 10; k++ {
				add(k, d, hi-lo <= 2 && (k == 2 || k == 5))
			}
		}
	}
	return ticks
}

// legendEntry is one labelled series in the legend.
type legendEntry struct {
	label  string
	thumbs []plot.Thumbnailer
}

// drawLegend draws the entries in rows along the bottom of c, left to
// right, and returns the height used.
func drawLegend(c draw.Canvas, entries []legendEntry) vg.Length {
	sty := text.Style{
		Color:   color.Black,
		Font:    font.From(sans, 10),
		XAlign:  draw.XLeft,
		YAlign:  draw.YCenter,
		Handler: plot.DefaultTextHandler,
	}
	const (
		thumbW = vg.Length(24)
		gap    = vg.Length(5)
		space  = vg.Length(16)
		rowH   = vg.Length(15)
		indent = vg.Length(40) // roughly under the data area
	)
	width := c.Max.X - c.Min.X - indent
	// Lay the entries out in rows.
	var rows [][]int
	var x vg.Length
	for i, e := range entries {
		w := thumbW + gap + sty.Width(e.label)
		if len(rows) == 0 || (x > 0 && x+w > width) {
			rows = append(rows, nil)
			x = 0
		}
		rows[len(rows)-1] = append(rows[len(rows)-1], i)
		x += w + space
	}
	height := vg.Length(len(rows))*rowH + vg.Points(6)
	for r, row := range rows {
		y := c.Min.Y + vg.Length(len(rows)-1-r)*rowH
		x := c.Min.X + indent
		for _, i := range row {
			e := entries[i]
			icon := draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{
				Min: vg.Point{X: x, Y: y},
				Max: vg.Point{X: x + thumbW, Y: y + rowH},
			}}
			for _, t := range e.thumbs {
				t.Thumbnail(&icon)
			}
			c.FillText(sty, vg.Point{X: x + thumbW + gap, Y: y + rowH/2}, e.label)
			x += thumbW + gap + sty.Width(e.label) + space
		}
	}
	return height
}

// legendLabel is a series label on one line, at most 80 characters long.
func legendLabel(s string) string {
	r := []rune(strings.Join(strings.Fields(clean(s)), " "))
	if len(r) > 80 {
		r = append(r[:79], '…')
	}
	return string(r)
}

// clean makes s safe to draw and to put in XML: valid UTF-8, without
// control characters other than line breaks, and with "\n" line breaks.
func clean(s string) string {
	s = strings.ToValidUTF8(s, "\uFFFD")
	s = strings.ReplaceAll(s, "\r\n", "\n")
	return strings.Map(func(r rune) rune {
		switch {
		case r == '\n':
			return r
		case r == '\t' || r == '\r':
			return ' '
		case r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0) || r == 0xFFFE || r == 0xFFFF:
			return -1
		}
		return r
	}, s)
}

// finish rewrites gonum's SVG: no generator comment (so the document starts
// with its <svg> tag after the XML declaration), generic font families,
// and <title> and <desc> elements saying what the plot is of.
func finish(svg, title, note string) string {
	svg = strings.Replace(svg, "<!-- Generated by SVGo and Plotinum VG -->\n", "", 1)
	svg = strings.ReplaceAll(svg, "font-family:Liberation Sans;", "font-family:"+fontFamily+";")
	var b strings.Builder
	for _, el := range []struct{ name, text string }{{"title", title}, {"desc", note}} {
		if el.text != "" {
			b.WriteString("\n<" + el.name + ">")
			_ = xml.EscapeText(&b, []byte(strings.ReplaceAll(el.text, "\n", " ")))
			b.WriteString("</" + el.name + ">")
		}
	}
	if i := strings.Index(svg, "<svg"); i >= 0 && b.Len() > 0 {
		if j := strings.IndexByte(svg[i:], '>'); j >= 0 {
			k := i + j + 1
			svg = svg[:k] + b.String() + svg[k:]
		}
	}
	return svg
}

// drawTitle draws the title, centred in bold, and under it the note in
// smaller italics, at the top of c; it returns the rest of c.
func drawTitle(c draw.Canvas, title, note string) draw.Canvas {
	for _, t := range []struct {
		text string
		fnt  font.Font
		size vg.Length
		clr  color.Color
	}{
		{title, sansBold, 13, color.Black},
		{note, font.Font{Typeface: "Liberation", Variant: "Sans", Style: xfont.StyleItalic}, 9.5, color.Gray{Y: 0x44}},
	} {
		if t.text == "" {
			continue
		}
		sty := text.Style{Color: t.clr, Font: font.From(t.fnt, t.size), XAlign: draw.XCenter, YAlign: draw.YTop,
			Handler: plot.DefaultTextHandler}
		c.FillText(sty, vg.Point{X: c.Center().X, Y: c.Max.Y}, t.text)
		c = draw.Crop(c, 0, 0, 0, -(sty.Height(t.text) + vg.Points(3)))
	}
	if title != "" || note != "" {
		c = draw.Crop(c, 0, 0, 0, -vg.Points(4))
	}
	return c
}

// marker is a marker shape; the open ones and the strokes are drawn with
// lines thick enough to read at print size.
type marker int

const (
	disc marker = iota
	openSquare
	openTriangle
	cross
	ring
	filledSquare
	plus
	filledDiamond
)

// DrawGlyph implements draw.GlyphDrawer.
func (m marker) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	r := sty.Radius
	line := draw.LineStyle{Color: sty.Color, Width: vg.Points(1.2)}
	at := func(dx, dy float64) vg.Point { return vg.Point{X: pt.X + r*vg.Length(dx), Y: pt.Y + r*vg.Length(dy)} }
	shape := func(fill bool, ps ...vg.Point) {
		var p vg.Path
		p.Move(ps[0])
		for _, q := range ps[1:] {
			p.Line(q)
		}
		p.Close()
		if fill {
			c.SetColor(sty.Color)
			c.Fill(p)
		} else {
			c.SetLineStyle(line)
			c.Stroke(p)
		}
	}
	circle := func(fill bool, rad vg.Length) {
		var p vg.Path
		p.Move(vg.Point{X: pt.X + rad, Y: pt.Y})
		p.Arc(pt, rad, 0, 2*math.Pi)
		p.Close()
		if fill {
			c.SetColor(sty.Color)
			c.Fill(p)
		} else {
			c.SetLineStyle(line)
			c.Stroke(p)
		}
	}
	switch m {
	case disc:
		circle(true, r)
	case ring:
		circle(false, r*0.9)
	case openSquare:
		shape(false, at(-0.8, -0.8), at(0.8, -0.8), at(0.8, 0.8), at(-0.8, 0.8))
	case filledSquare:
		shape(true, at(-0.85, -0.85), at(0.85, -0.85), at(0.85, 0.85), at(-0.85, 0.85))
	case openTriangle:
		shape(false, at(0, 1.05), at(-0.95, -0.6), at(0.95, -0.6))
	case filledDiamond:
		shape(true, at(0, 1.2), at(1, 0), at(0, -1.2), at(-1, 0))
	case cross:
		c.StrokeLines(line, []vg.Point{at(-0.85, -0.85), at(0.85, 0.85)}, []vg.Point{at(-0.85, 0.85), at(0.85, -0.85)})
	case plus:
		c.StrokeLines(line, []vg.Point{at(-1.1, 0), at(1.1, 0)}, []vg.Point{at(0, -1.1), at(0, 1.1)})
	}
}

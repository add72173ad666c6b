package session

import (
	"fmt"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/kernel/figure"
	"assay/kernel/interp"
	"assay/kernel/values"
)

const plotDoc = `plot(xs, ys, label=None, title="", xlabel="x", ylabel="y", logx=False, logy=False,
lines=True, points=True, series=None) puts a figure in the report; series=[(xs, ys, "label"), ...]
draws several series at once.`

var plotParams = []string{"xs=", "ys=", "label=", "title=", "xlabel=", "ylabel=", "logx=", "logy=", "lines=", "points=", "series="}

func (s *Session) plot(a interp.Args) (py.Object, error) {
	flags := map[string]bool{"logx": false, "logy": false, "lines": true, "points": true}
	for _, name := range []string{"logx", "logy", "lines", "points"} {
		v, err := a.Bool(name, flags[name])
		if err != nil {
			return nil, err
		}
		flags[name] = v
	}
	spec := figure.Spec{Title: a.Text("title", ""), XLabel: a.Text("xlabel", "x"), YLabel: a.Text("ylabel", "y"), LogX: flags["logx"], LogY: flags["logy"]}
	add := func(xs, ys, label py.Object, k int) error {
		x, err := values.FloatList(xs, fmt.Sprintf("plot: xs of series %d", k))
		if err != nil {
			return err
		}
		y, err := values.FloatList(ys, fmt.Sprintf("plot: ys of series %d", k))
		if err != nil {
			return err
		}
		if len(x) != len(y) {
			return py.ExceptionNewf(py.ValueError, "plot: series %d has %d x values and %d y values", k, len(x), len(y))
		}
		text := ""
		if label != nil && label != py.None {
			text = interp.Str(label)
		}
		spec.Series = append(spec.Series, figure.Series{Label: text, X: x, Y: y, Lines: flags["lines"], Points: flags["points"]})
		return nil
	}
	switch {
	case a.Has("series"):
		if a.Has("xs") || a.Has("ys") {
			return nil, py.ExceptionNewf(py.TypeError, "plot(): give xs and ys, or series=[...], not both")
		}
		items, err := values.Sequence(a.Get("series"), "plot series")
		if err != nil {
			return nil, err
		}
		for k, it := range items {
			parts, ok := interp.Items(it)
			if !ok || len(parts) < 2 || len(parts) > 3 {
				return nil, py.ExceptionNewf(py.TypeError, "plot(): series %d must be (xs, ys) or (xs, ys, label)", k)
			}
			var label py.Object
			if len(parts) == 3 {
				label = parts[2]
			}
			if err := add(parts[0], parts[1], label, k); err != nil {
				return nil, err
			}
		}
	case a.Has("xs") && a.Has("ys"):
		if err := add(a.Get("xs"), a.Get("ys"), a.Get("label"), 0); err != nil {
			return nil, err
		}
	default:
		return nil, py.ExceptionNewf(py.TypeError, "plot() needs xs and ys, or series=[(xs, ys, label), ...]")
	}
	svg, err := figure.SVG(spec)
	if err != nil {
		return nil, py.ExceptionNewf(py.ValueError, "plot(): %v", err)
	}
	name := spec.Title
	if name == "" {
		name = fmt.Sprintf("figure %d of cell %d", len(s.outcome.Figures)+1, s.cell)
	}
	if s.shows() {
		s.outcome.Figures = append(s.outcome.Figures, cells.Figure{Name: name, SVG: svg})
	}
	return py.None, nil
}

package kernel

import (
	"fmt"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/kernel/figure"
)

const plotDoc = `plot(xs, ys, label=None, title="", xlabel="x", ylabel="y", logx=False, logy=False,
lines=True, points=True, series=None) puts a figure in the report; series=[(xs, ys, "label"), ...]
draws several series at once.`

// floatList reads a list of numbers (ints, rationals, reals, floats) as float64.
func floatList(o py.Object, what string) ([]float64, error) {
	items, err := sequence(o, what)
	if err != nil {
		return nil, err
	}
	out := make([]float64, len(items))
	for i, it := range items {
		if out[i], err = floatArg(what, it); err != nil {
			return nil, py.ExceptionNewf(py.TypeError, "%s: entry %d is %s, not a number", what, i, typeName(it))
		}
	}
	return out, nil
}

func boolArg(fn, name string, o py.Object, def bool) (bool, error) {
	switch o {
	case nil:
		return def, nil
	case py.True:
		return true, nil
	case py.False:
		return false, nil
	}
	return false, py.ExceptionNewf(py.TypeError, "%s(): %s must be True or False", fn, name)
}

func textArg(o py.Object, def string) string {
	if o == nil || o == py.None {
		return def
	}
	return str(o)
}

func (s *Session) plot(args py.Tuple, kw py.StringDict) (py.Object, error) {
	a, err := bind("plot", args, kw, []string{"xs", "ys", "label", "title", "xlabel", "ylabel", "logx", "logy", "lines", "points", "series"}, 0)
	if err != nil {
		return nil, err
	}
	var flags [4]bool
	for i, def := range []bool{false, false, true, true} {
		if flags[i], err = boolArg("plot", []string{"logx", "logy", "lines", "points"}[i], a[6+i], def); err != nil {
			return nil, err
		}
	}
	spec := figure.Spec{Title: textArg(a[3], ""), XLabel: textArg(a[4], "x"), YLabel: textArg(a[5], "y"), LogX: flags[0], LogY: flags[1]}
	add := func(xs, ys, label py.Object, k int) error {
		x, err := floatList(xs, fmt.Sprintf("plot: xs of series %d", k))
		if err != nil {
			return err
		}
		y, err := floatList(ys, fmt.Sprintf("plot: ys of series %d", k))
		if err != nil {
			return err
		}
		if len(x) != len(y) {
			return py.ExceptionNewf(py.ValueError, "plot: series %d has %d x values and %d y values", k, len(x), len(y))
		}
		spec.Series = append(spec.Series, figure.Series{Label: textArg(label, ""), X: x, Y: y, Lines: flags[2], Points: flags[3]})
		return nil
	}
	switch {
	case a[10] != nil:
		if a[0] != nil || a[1] != nil {
			return nil, py.ExceptionNewf(py.TypeError, "plot(): give xs and ys, or series=[...], not both")
		}
		items, err := sequence(a[10], "plot series")
		if err != nil {
			return nil, err
		}
		for k, it := range items {
			parts, ok := listLike(it)
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
	case a[0] != nil && a[1] != nil:
		if err := add(a[0], a[1], a[2], 0); err != nil {
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

package values

import (
	"fmt"
	"strings"
	"sync"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/exact/geom"
	"assay/kernel/interp"
)

// SeriesSimplex is a simplex whose coordinates are series: what simplex()
// makes while f runs on a series, so that the measures algebraic in the
// coordinates expand too (geom.SeriesPoints).
type SeriesSimplex struct {
	p   geom.SeriesPoints
	env *Env
	at  *SeriesPoint

	shapeOnce sync.Once // makes shp: what the measures share
	shp       *geom.SeriesShape
	shpErr    error
}

// Watched records that f asked for the simplex's type, attributes or
// identity, which tell it from a simplex of numbers (see Series.Watched).
func (s *SeriesSimplex) Watched(what string) {
	if s.at != nil && s.at.Inspected == "" {
		s.at.Inspected = "asked for " + what + " of a simplex with series coordinates"
	}
}

// SeriesSimplexType is the Python type of SeriesSimplex.
var SeriesSimplexType = py.NewType("series_simplex", "A simplex with series coordinates, made by simplex() inside series(f) or a limit: every measure algebraic in the coordinates (volume, facet areas, radii, centres, touch points, normals, cosines, quality ratios) expands as a series.")

// Type returns SeriesSimplexType.
func (s *SeriesSimplex) Type() *py.Type { return SeriesSimplexType }

// seriesPoints reads points of which at least one coordinate is a series;
// ok is false when none is.
func (e *Env) seriesPoints(items []py.Object) (pts geom.SeriesPoints, at *SeriesPoint, ok bool, err error) {
	rows := make([][]py.Object, len(items))
	for i, it := range items {
		if rows[i], err = Sequence(it, fmt.Sprintf("point %d", i)); err != nil {
			return nil, nil, false, err
		}
		for _, x := range rows[i] {
			if s, isSeries := x.(*Series); isSeries && at == nil {
				at = s.at
			}
		}
	}
	if at == nil {
		return nil, nil, false, nil
	}
	pts = make(geom.SeriesPoints, len(rows))
	for i, row := range rows {
		pts[i] = make([]*exact.Series, len(row))
		for c, x := range row {
			s, ok, err := e.seriesOf(x, at)
			if err != nil {
				return nil, nil, false, err
			}
			if !ok {
				return nil, nil, false, py.ExceptionNewf(py.TypeError, "simplex(points): point %d, coordinate %d is %s; with series coordinates the others must be series, exact numbers or reals%s", i, c, interp.TypeName(x), FloatHint(x))
			}
			pts[i][c] = s
		}
	}
	return pts, at, true, nil
}

// seriesSimplexOnce guards the refusals of simplex methods series
// simplices lack.
var seriesSimplexOnce sync.Once

func (e *Env) seriesSimplex(pts geom.SeriesPoints, at *SeriesPoint) (py.Object, error) {
	seriesSimplexOnce.Do(refuseSimplexOnly)
	if _, err := pts.SqDistances(); err != nil {
		return nil, geomErr("simplex", err)
	}
	return &SeriesSimplex{p: pts, env: e, at: at}, nil
}

// refuseSimplexOnly gives series simplices, for every simplex method they
// lack, a refusal that says why (seriesRefusal): a function using it is
// not expanded, and a limit falls back to extrapolation.
func refuseSimplexOnly() {
	var table []method[*SeriesSimplex]
	for name := range SimplexType.Dict {
		if _, ok := SeriesSimplexType.Dict[name]; ok || strings.HasPrefix(name, "__") {
			continue
		}
		msg := seriesRefusal(name)
		table = append(table, method[*SeriesSimplex]{name, params("*args", "**kwargs"), name + "() is not available on series coordinates", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
			return nil, py.ExceptionNewf(py.TypeError, "%s", msg)
		}})
	}
	setMethods(SeriesSimplexType, table)
}

func (s *SeriesSimplex) one(x *exact.Series, err error) (py.Object, error) {
	if err != nil {
		return nil, geomErr("series simplex", err)
	}
	return s.wrap(x), nil
}

func (s *SeriesSimplex) list(xs []*exact.Series, err error) (py.Object, error) {
	if err != nil {
		return nil, geomErr("series simplex", err)
	}
	return s.seriesList(xs), nil
}

func init() {
	setMethods(SeriesSimplexType, []method[*SeriesSimplex]{
		{"volume", nil, "volume() -> the volume, a series (the square root of volume_sq with a positive leading coefficient)", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
			return s.measure("volume", func(x *geom.SeriesShape) (*exact.Series, error) {
				v2, err := x.VolumeSq()
				if err != nil {
					return nil, err
				}
				return exact.SeriesPow(v2, 1, 2)
			})
		}},
		{"facet_areas_sq", nil, "facet_areas_sq() -> the squared facet contents, facet i opposite vertex i, as series", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) { return s.list(s.p.FacetContentsSq()) }},
		{"dim", nil, "dim()", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) { return py.Int(len(s.p) - 1), nil }},
		{"sq_edges", nil, "sq_edges() -> squared edge lengths in the order (0,1), (0,2), …, as series", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
			d, err := s.p.SqDistances()
			var out []*exact.Series
			for i := range d {
				for j := i + 1; j < len(d); j++ {
					out = append(out, d[i][j])
				}
			}
			return s.list(out, err)
		}},
		{"sq_edge", params("i", "j"), "sq_edge(i, j) -> the squared distance between vertices i and j, a series", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			i, err1 := a.Int("i", 0)
			j, err2 := a.Int("j", 0)
			if err1 != nil || err2 != nil || i < 0 || j < 0 || int(i) >= len(s.p) || int(j) >= len(s.p) {
				return nil, py.ExceptionNewf(py.IndexError, "sq_edge(i, j): vertex indices must be integers from 0 to %d", len(s.p)-1)
			}
			d, err := s.p.SqDistances()
			if err != nil {
				return s.one(nil, err)
			}
			return s.one(d[i][j], nil)
		}},
	})
}

// M__str__ prints the vertices.
func (s *SeriesSimplex) M__str__() (py.Object, error) {
	var rows []string
	for _, p := range s.p {
		var cs []string
		for _, x := range p {
			cs = append(cs, x.Format(s.at.Name, s.at.Flip))
		}
		rows = append(rows, "["+strings.Join(cs, ", ")+"]")
	}
	return py.String("simplex([" + strings.Join(rows, ", ") + "])"), nil
}

// M__repr__ prints the vertices.
func (s *SeriesSimplex) M__repr__() (py.Object, error) { return s.M__str__() }

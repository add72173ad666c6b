package values

import (
	"fmt"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/exact/geom"
	"assay/kernel/interp"
)

// The measures of a series simplex beyond volume and radii: each one
// that is algebraic in the coordinates, from geom.SeriesShape, with the
// same arguments and the same shape of result as the simplex method of
// the same name (a point is a list of series, facet_normal a pair), so
// that f computes on series what it computes on numbers.

// seriesUnexpanded says why a series simplex lacks a simplex method:
// atan2 has no series here, choosing the extreme of several angles is a
// comparison, and the decisions (a sign, an equality) may change with t
// at no order a truncated series reaches. refuseSimplexOnly raises these.
var seriesUnexpanded = map[string]string{
	"solid_angle":        "it is an atan2 of the coordinates, transcendental, and series expand acos but not atan2; vertex_angle(i, j, k) and dihedral_angle(i, j) expand",
	"min_dihedral_angle": "it picks the smallest of the dihedral angles, a comparison between them; dihedral_angle(i, j) expands for each pair",
	"max_dihedral_angle": "it picks the largest of the dihedral angles, a comparison between them; dihedral_angle(i, j) expands for each pair",
	"contains":           "whether p is inside is a sign decision on each barycentric coordinate, and a coordinate that tends to 0 may change sign at an order no truncated series reaches; use barycentric(p), whose coordinates expand",
	"is_degenerate":      "whether the volume is exactly zero is an equality no truncated series can prove; use volume_sq(), whose leading term is known when it is not",
}

// seriesRefusal is the message of a simplex method a series simplex does
// not have.
func seriesRefusal(name string) string {
	if why, ok := seriesUnexpanded[name]; ok {
		return fmt.Sprintf("%s() is not available for a simplex with series coordinates: %s", name, why)
	}
	return fmt.Sprintf("%s() is not available for a simplex with series coordinates (its result is not a number or a point, which series simplices give)", name)
}

// shape is the simplex's geom.SeriesShape, made once.
func (s *SeriesSimplex) shape() (*geom.SeriesShape, error) {
	s.shapeOnce.Do(func() { s.shp, s.shpErr = s.p.Shape() })
	return s.shp, s.shpErr
}

// onShape runs f on the shape, naming the method in its errors.
func onShape[T any](s *SeriesSimplex, name string, f func(*geom.SeriesShape) (T, error)) (T, error) {
	var zero T
	sh, err := s.shape()
	if err != nil {
		return zero, geomErr(name, err)
	}
	x, err := f(sh)
	if err != nil {
		return zero, geomErr(name, err)
	}
	return x, nil
}

// measure runs f on the shape and returns its series.
func (s *SeriesSimplex) measure(name string, f func(*geom.SeriesShape) (*exact.Series, error)) (py.Object, error) {
	x, err := onShape(s, name, f)
	if err != nil {
		return nil, err
	}
	return s.wrap(x), nil
}

// point runs f on the shape and returns its point as a list of series.
func (s *SeriesSimplex) point(name string, f func(*geom.SeriesShape) ([]*exact.Series, error)) (py.Object, error) {
	x, err := onShape(s, name, f)
	if err != nil {
		return nil, err
	}
	return s.seriesList(x), nil
}

// points runs f on the shape and returns its points as lists of series.
func (s *SeriesSimplex) points(name string, f func(*geom.SeriesShape) ([][]*exact.Series, error)) (py.Object, error) {
	x, err := onShape(s, name, f)
	if err != nil {
		return nil, err
	}
	return s.pointList(x), nil
}

// pointList is points as lists of series.
func (s *SeriesSimplex) pointList(ps [][]*exact.Series) *py.List {
	out := make([]py.Object, len(ps))
	for i, p := range ps {
		out[i] = s.seriesList(p)
	}
	return py.NewListFromItems(out)
}

func (s *SeriesSimplex) wrap(x *exact.Series) *Series { return &Series{s: x, env: s.env, at: s.at} }

func (s *SeriesSimplex) seriesList(xs []*exact.Series) *py.List {
	out := make([]py.Object, len(xs))
	for i, x := range xs {
		out[i] = s.wrap(x)
	}
	return py.NewListFromItems(out)
}

// vertex reads one vertex index i.
func (s *SeriesSimplex) vertex(name string, a interp.Args) (int, error) {
	idx, err := vertexIndices(name, a, len(s.p), "i")
	if err != nil {
		return 0, err
	}
	return idx[0], nil
}

// face is the series simplex on the vertices idx.
func (s *SeriesSimplex) face(name string, idx []int) (py.Object, error) {
	sub := make(geom.SeriesPoints, 0, len(idx))
	seen := map[int]bool{}
	for _, i := range idx {
		if i < 0 || i >= len(s.p) || seen[i] {
			return nil, py.ExceptionNewf(py.ValueError, "%s: vertex indices must be distinct, from 0 to %d, got %v", name, len(s.p)-1, idx)
		}
		seen[i] = true
		sub = append(sub, s.p[i])
	}
	return s.env.seriesSimplex(sub, s.at)
}

func init() {
	type sh = *geom.SeriesShape
	one := func(name string, f func(sh) (*exact.Series, error)) func(*SeriesSimplex, interp.Args) (py.Object, error) {
		return func(s *SeriesSimplex, _ interp.Args) (py.Object, error) { return s.measure(name, f) }
	}
	at := func(name string, f func(sh, int) (*exact.Series, error)) func(*SeriesSimplex, interp.Args) (py.Object, error) {
		return func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			i, err := s.vertex(name, a)
			if err != nil {
				return nil, err
			}
			return s.measure(name, func(x sh) (*exact.Series, error) { return f(x, i) })
		}
	}
	touch := func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
		return s.points("touch_points", sh.TouchPoints)
	}
	setMethods(SeriesSimplexType, []method[*SeriesSimplex]{
		{"volume_sq", nil, "volume_sq() -> the squared volume, a series", one("volume_sq", sh.VolumeSq)},
		{"inradius", nil, "inradius() -> dim·V / (sum of facet contents), a series", one("inradius", sh.Inradius)},
		{"circumradius_sq", nil, "circumradius_sq() -> the squared circumradius, a series", one("circumradius_sq", sh.CircumradiusSq)},
		{"circumcenter", nil, "circumcenter() -> the circumcentre, a list of series", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
			return s.point("circumcenter", sh.Circumcenter)
		}},
		{"incenter", nil, "incenter() -> the incentre, a list of series", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
			return s.point("incenter", sh.Incenter)
		}},
		{"centroid", nil, "centroid() -> the mean of the vertices, a list of series", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
			return s.point("centroid", sh.Centroid)
		}},
		{"touch_points", nil, "touch_points() -> the insphere's points of contact, the i-th on the facet opposite vertex i", touch},
		{"insphere_touch_points", nil, "insphere_touch_points() -> the same as touch_points()", touch},
		{"exradius", params("i"), "exradius(i) -> the radius of the exsphere opposite vertex i, a series", at("exradius", sh.Exradius)},
		{"excenter", params("i"), "excenter(i) -> the centre of the exsphere opposite vertex i", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			i, err := s.vertex("excenter", a)
			if err != nil {
				return nil, err
			}
			return s.point("excenter", func(x sh) ([]*exact.Series, error) { return x.Excenter(i) })
		}},
		{"exsphere_touch_points", params("i"), "exsphere_touch_points(i) -> where the exsphere opposite vertex i touches each facet's hyperplane", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			i, err := s.vertex("exsphere_touch_points", a)
			if err != nil {
				return nil, err
			}
			return s.points("exsphere_touch_points", func(x sh) ([][]*exact.Series, error) { return x.ExsphereTouchPoints(i) })
		}},
		{"tangent_lengths", nil, "tangent_lengths() -> per vertex, the length of its tangents to the insphere, as series", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
			return s.point("tangent_lengths", sh.TangentLengths)
		}},
		{"altitude_sq", params("i"), "altitude_sq(i) -> the squared height of vertex i over the opposite facet, a series", at("altitude_sq", sh.AltitudeSq)},
		{"altitude", params("i"), "altitude(i) -> the height of vertex i over the opposite facet, a series", at("altitude", func(x sh, i int) (*exact.Series, error) {
			h2, err := x.AltitudeSq(i)
			if err != nil {
				return nil, err
			}
			return exact.SeriesPow(h2, 1, 2)
		})},
		{"facet_normal", params("i"), "facet_normal(i) -> (n, |n|^2): the outward normal of facet i, from vertex i to the foot of its altitude, as series", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			i, err := s.vertex("facet_normal", a)
			if err != nil {
				return nil, err
			}
			var h2 *exact.Series
			n, err := onShape(s, "facet_normal", func(x sh) (n []*exact.Series, err error) {
				n, h2, err = x.FacetNormal(i)
				return n, err
			})
			if err != nil {
				return nil, err
			}
			return py.Tuple{s.seriesList(n), s.wrap(h2)}, nil
		}},
		{"barycentric", params("p"), "barycentric(p) -> the barycentric coordinates of p (series or numbers), as series", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			items, err := Sequence(a.Get("p"), "barycentric(p)")
			if err != nil {
				return nil, err
			}
			p := make([]*exact.Series, len(items))
			for c, it := range items {
				x, ok, err := s.env.seriesOf(it, s.at)
				if err != nil {
					return nil, err
				}
				if !ok {
					return nil, py.ExceptionNewf(py.TypeError, "barycentric(p): coordinate %d is %s, not a series, an exact number or a real%s", c, interp.TypeName(it), FloatHint(it))
				}
				p[c] = x
			}
			return s.point("barycentric", func(x sh) ([]*exact.Series, error) { return x.Barycentric(p) })
		}},
		{"vertex_cos", params("i", "j", "k"), "vertex_cos(i, j, k) -> cosine of the angle at vertex i between the edges to j and k, a series", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			idx, err := vertexIndices("vertex_cos", a, len(s.p), "i", "j", "k")
			if err != nil {
				return nil, err
			}
			return s.measure("vertex_cos", func(x sh) (*exact.Series, error) { return x.VertexCos(idx[0], idx[1], idx[2]) })
		}},
		{"vertex_angle", params("i", "j", "k"), "vertex_angle(i, j, k) -> acos of vertex_cos(i, j, k), a series while the cosine's value at the point is inside (-1, 1)", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			idx, err := vertexIndices("vertex_angle", a, len(s.p), "i", "j", "k")
			if err != nil {
				return nil, err
			}
			return s.measure("vertex_angle", func(x sh) (*exact.Series, error) { return acosOf(x.VertexCos(idx[0], idx[1], idx[2])) })
		}},
		{"dihedral_angle", params("i", "j"), "dihedral_angle(i, j) -> acos of dihedral_cos(i, j), a series while the cosine's value at the point is inside (-1, 1)", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			idx, err := vertexIndices("dihedral_angle", a, len(s.p), "i", "j")
			if err != nil {
				return nil, err
			}
			return s.measure("dihedral_angle", func(x sh) (*exact.Series, error) { return acosOf(x.DihedralCos(idx[0], idx[1])) })
		}},
		{"dihedral_cos", params("i", "j"), "dihedral_cos(i, j) -> cosine of the dihedral angle between the facets opposite i and j, a series", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			idx, err := vertexIndices("dihedral_cos", a, len(s.p), "i", "j")
			if err != nil {
				return nil, err
			}
			return s.measure("dihedral_cos", func(x sh) (*exact.Series, error) { return x.DihedralCos(idx[0], idx[1]) })
		}},
		{"radius_ratio", nil, "radius_ratio() -> k r / R, a series", one("radius_ratio", sh.RadiusRatio)},
		{"volume_length_ratio", nil, "volume_length_ratio() -> V over the regular simplex's volume at the rms edge length, a series", one("volume_length_ratio", sh.VolumeLengthRatio)},
		{"aspect_ratio", nil, "aspect_ratio() -> longest edge / (sqrt(2k(k+1)) r), a series", one("aspect_ratio", sh.AspectRatio)},
		{"cayley_menger", nil, "cayley_menger() -> the Cayley-Menger determinant, a series", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
			return s.one(s.p.CayleyMenger())
		}},
		{"points", nil, "points() -> the vertices, lists of series", func(s *SeriesSimplex, _ interp.Args) (py.Object, error) {
			return s.pointList(s.p), nil
		}},
		{"face", params("indices"), "face(indices) -> the face on those vertices, a series simplex", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			idx, err := indexList(a.Get("indices"), "face indices")
			if err != nil {
				return nil, err
			}
			return s.face("face", idx)
		}},
		{"facet", params("i"), "facet(i) -> the facet opposite vertex i, a series simplex", func(s *SeriesSimplex, a interp.Args) (py.Object, error) {
			i, err := s.vertex("facet", a)
			if err != nil {
				return nil, err
			}
			return s.face("facet", allBut(len(s.p), i))
		}},
	})
}

// acosOf is acos of a cosine (exact.SeriesAcos: refused where the
// cosine tends to ±1, a branch point of acos).
func acosOf(cos *exact.Series, err error) (*exact.Series, error) {
	if err != nil {
		return nil, err
	}
	return exact.SeriesAcos(cos)
}

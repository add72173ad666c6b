package kernel

import (
	"errors"
	"fmt"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/exact/geom"
)

// Simplex is a simplex in a cell, from points or from squared distances.
type Simplex struct {
	s    *geom.Simplex
	cap  uint        // precision cap for the certified reals it gives
	ring *exact.Ring // for the matrices it gives
}

// SimplexType is the Python type of Simplex.
var SimplexType = py.NewType("simplex", "A simplex: simplex([[0, 0], [1, 0], [0, 1]]) or distance_simplex(D).")

// Type returns SimplexType.
func (s *Simplex) Type() *py.Type { return SimplexType }

// KVector is a k-vector of the exterior algebra, made by wedge(u, v, …).
type KVector struct{ w *geom.KVector }

// KVectorType is the Python type of KVector.
var KVectorType = py.NewType("kvector", "A k-vector: wedge(u, v) for vectors u, v.")

// Type returns KVectorType.
func (k *KVector) Type() *py.Type { return KVectorType }

// geomErr turns a geometry error into a Python exception naming the reason.
func geomErr(what string, err error) error {
	if err == nil {
		return nil
	}
	if errors.Is(err, geom.ErrDegenerate) {
		return py.ExceptionNewf(py.ValueError, "%s: the simplex is degenerate (zero volume): %v", what, err)
	}
	return py.ExceptionNewf(py.ValueError, "%s: %v", what, err)
}

// rationalVector reads a list of exact numbers.
func rationalVector(o py.Object, what string) ([]*big.Rat, error) {
	items, err := sequence(o, what)
	if err != nil {
		return nil, err
	}
	out := make([]*big.Rat, len(items))
	for i, it := range items {
		v, ok := exactOf(it)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "%s: coordinate %d is %s, not an exact number%s", what, i, typeName(it), floatHint(it))
		}
		out[i] = v
	}
	return out, nil
}

func rationalList(v []*big.Rat) *py.List {
	out := make([]py.Object, len(v))
	for i, x := range v {
		out[i] = newRational(x)
	}
	return py.NewListFromItems(out)
}

// sqrtSum is Σ sqrt(q_i) as a certified real.
func sqrtSum(qs []*big.Rat) *exact.Real {
	sum := exact.RealFromRat(new(big.Rat))
	for _, q := range qs {
		sum = exact.RealAdd(sum, exact.RealSqrt(exact.RealFromRat(q)))
	}
	return sum
}

func (s *Session) installGeometry(b py.StringDict) {
	defer func() {
		// Geometry has no float64 companion yet: in float64 code every
		// geometry builtin says so, and the claim's audit is skipped.
		for _, name := range []string{"simplex", "distance_simplex", "cayley_menger", "volume_sq", "wedge", "embeddable",
			"triangle_area_sq", "tangent_lengths", "affine", "random_simplex", "sliver", "needle", "cap", "wedge_tetrahedron"} {
			exactOnly(b, name)
		}
	}()
	cap := func() uint { return uint(s.settings.MaxPrecision) }
	wrap := func(g *geom.Simplex) *Simplex { return &Simplex{s: g, cap: cap(), ring: s.ring} }
	b["simplex"] = builtin("simplex", "simplex(points) -> the simplex with those vertices (rational coordinates, any dimension)", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("simplex", args, kw, []string{"points"}, 1)
		if err != nil {
			return nil, err
		}
		items, err := sequence(a[0], "simplex points")
		if err != nil {
			return nil, err
		}
		pts := make([][]*big.Rat, len(items))
		for i, it := range items {
			if pts[i], err = rationalVector(it, fmt.Sprintf("point %d", i)); err != nil {
				return nil, err
			}
		}
		g, err := geom.FromPoints(pts)
		if err != nil {
			return nil, geomErr("simplex", err)
		}
		return wrap(g), nil
	})
	b["distance_simplex"] = builtin("distance_simplex", "distance_simplex(D) -> the simplex with squared distances D (symmetric, zero diagonal)", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("distance_simplex", args, kw, []string{"D"}, 1)
		if err != nil {
			return nil, err
		}
		q, err := s.rationalMatrixArg("distance_simplex() (for indeterminate distances use cayley_menger(D) or volume_sq(D))", a[0])
		if err != nil {
			return nil, err
		}
		g, err := geom.FromSquaredDistances(q)
		if err != nil {
			return nil, geomErr("distance_simplex", err)
		}
		return wrap(g), nil
	})
	b["cayley_menger"] = builtin("cayley_menger", "cayley_menger(D) -> the bordered Cayley-Menger determinant of squared distances D (rationals or polynomials)", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		return s.distanceFunction("cayley_menger", args, kw, (*geom.Simplex).CayleyMenger, geom.CayleyMengerPoly)
	})
	b["volume_sq"] = builtin("volume_sq", "volume_sq(D) -> the squared volume of the simplex with squared distances D (rationals or polynomials)", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		return s.distanceFunction("volume_sq", args, kw, (*geom.Simplex).VolumeSq, geom.VolumeSqPoly)
	})
	b["wedge"] = builtin("wedge", "wedge(u, v, ...) -> the k-vector u ∧ v ∧ ...", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		if len(kw) > 0 || len(args) == 0 {
			return nil, py.ExceptionNewf(py.TypeError, "wedge(u, v, ...) takes one or more vectors")
		}
		vs := make([][]*big.Rat, len(args))
		for i, a := range args {
			var err error
			if vs[i], err = rationalVector(a, fmt.Sprintf("wedge: vector %d", i)); err != nil {
				return nil, err
			}
		}
		w, err := geom.Wedge(vs...)
		if err != nil {
			return nil, geomErr("wedge", err)
		}
		return &KVector{w: w}, nil
	})
	b["embeddable"] = builtin("embeddable", "embeddable(D, k) -> (True, \"\") if squared distances D are realised by points in R^k, else (False, reason)", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("embeddable", args, kw, []string{"D", "k"}, 2)
		if err != nil {
			return nil, err
		}
		q, err := s.rationalMatrixArg("embeddable", a[0])
		if err != nil {
			return nil, err
		}
		k, err := intArg("embeddable", "k", a[1], 0)
		if err != nil || k < 0 {
			return nil, py.ExceptionNewf(py.ValueError, "embeddable(D, k) needs a dimension k >= 0")
		}
		ok, reason, err := geom.Embeddable(q, int(k))
		if err != nil {
			return nil, geomErr("embeddable", err)
		}
		return py.Tuple{py.NewBool(ok), py.String(reason)}, nil
	})
	triangle := func(name, doc string, sides []string, f func(a, b, c *big.Rat) (py.Object, error)) {
		b[name] = builtin(name, doc, func(args py.Tuple, kw py.StringDict) (py.Object, error) {
			a, err := bind(name, args, kw, sides, 3)
			if err != nil {
				return nil, err
			}
			v, err := rationalVector(py.Tuple(a), name)
			if err != nil {
				return nil, err
			}
			res, err := f(v[0], v[1], v[2])
			return res, geomErr(name, err)
		})
	}
	triangle("triangle_area_sq", "triangle_area_sq(a2, b2, c2) -> the squared area from the squared sides", []string{"a2", "b2", "c2"},
		func(a, b, c *big.Rat) (py.Object, error) {
			area, err := geom.TriangleAreaSq(a, b, c)
			return newRational(area), err
		})
	triangle("tangent_lengths", "tangent_lengths(a, b, c) -> [s-a, s-b, s-c] for the side lengths of a triangle", []string{"a", "b", "c"},
		func(a, b, c *big.Rat) (py.Object, error) {
			t, err := geom.TangentLengths(a, b, c)
			return rationalList(t[:]), err
		})
	b["affine"] = builtin("affine", "affine(s, A, t) -> the simplex with every vertex x sent to A x + t", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("affine", args, kw, []string{"s", "A", "t"}, 3)
		if err != nil {
			return nil, err
		}
		sx, ok := a[0].(*Simplex)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "affine(s, A, t): s must be a simplex, got %s", typeName(a[0]))
		}
		m, err := s.rationalMatrixArg("affine", a[1])
		if err != nil {
			return nil, err
		}
		t, err := rationalVector(a[2], "affine: t")
		if err != nil {
			return nil, err
		}
		g, err := sx.s.Affine(m, t)
		if err != nil {
			return nil, geomErr("affine", err)
		}
		return wrap(g), nil
	})
	b["random_simplex"] = builtin("random_simplex", "random_simplex(dim, seed=None, bound=10, denom=1) -> a reproducible random non-degenerate simplex in R^dim", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("random_simplex", args, kw, []string{"dim", "seed", "bound", "denom"}, 1)
		if err != nil {
			return nil, err
		}
		var n [3]int64
		for i, def := range []int64{0, 10, 1} {
			if n[i], err = intArg("random_simplex", []string{"dim", "bound", "denom"}[i], a[[]int{0, 2, 3}[i]], def); err != nil {
				return nil, err
			}
		}
		if n[0] < 1 || n[0] > 64 || n[1] < 1 || n[2] < 1 {
			return nil, py.ExceptionNewf(py.ValueError, "random_simplex needs 1 <= dim <= 64, bound >= 1 and denom >= 1")
		}
		r, err := s.rng(a[1])
		if err != nil {
			return nil, err
		}
		return wrap(geom.Random(int(n[0]), r.Uint64(), n[1], n[2])), nil
	})
	family := func(name, doc string, f func(*big.Rat) *geom.Simplex) {
		b[name] = builtin(name, doc, func(args py.Tuple, kw py.StringDict) (py.Object, error) {
			a, err := bind(name, args, kw, []string{"t"}, 1)
			if err != nil {
				return nil, err
			}
			t, ok := exactOf(a[0])
			if !ok || t.Sign() <= 0 {
				return nil, py.ExceptionNewf(py.ValueError, "%s(t) needs an exact t > 0 (it degenerates as t -> 0)", name)
			}
			return wrap(f(t)), nil
		})
	}
	family("sliver", "sliver(t) -> a tetrahedron with four nearly coplanar, well-spread vertices: volume ~ t", geom.Sliver)
	family("needle", "needle(t) -> a needle tetrahedron: three vertices close together (edges ~ t), the fourth far", geom.Needle)
	family("cap", "cap(t) -> a cap tetrahedron: one vertex at height ~ t over the inside of the opposite face", geom.Cap)
	family("wedge_tetrahedron", "wedge_tetrahedron(t) -> a wedge tetrahedron: two vertices collapse (one edge ~ t)", geom.WedgeTetrahedron)
}

// rationalMatrixArg reads a matrix argument that must have rational entries.
func (s *Session) rationalMatrixArg(what string, o py.Object) (*exact.Matrix, error) {
	m, err := matrixFrom(s.ring, o)
	if err != nil {
		return nil, err
	}
	if m.q == nil {
		return nil, symbolicRefusal(what)
	}
	return m.q, nil
}

// distanceFunction applies a function of squared distances, rational or polynomial.
func (s *Session) distanceFunction(name string, args py.Tuple, kw py.StringDict, q func(*geom.Simplex) *big.Rat, p func(*exact.PolyMatrix) (*exact.Poly, error)) (py.Object, error) {
	a, err := bind(name, args, kw, []string{"D"}, 1)
	if err != nil {
		return nil, err
	}
	if sx, ok := a[0].(*Simplex); ok {
		return newRational(q(sx.s)), nil
	}
	m, err := matrixFrom(s.ring, a[0])
	if err != nil {
		return nil, err
	}
	if m.q != nil {
		g, err := geom.FromSquaredDistances(m.q)
		if err != nil {
			return nil, geomErr(name, err)
		}
		return newRational(q(g)), nil
	}
	r, err := p(m.p)
	if err != nil {
		return nil, polyErr(err)
	}
	return resultObject(r), nil
}

func init() {
	method := func(name, doc string, f func(s *Simplex, args py.Tuple, kw py.StringDict) (py.Object, error)) {
		SimplexType.Dict[name] = py.MustNewMethod(name, func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
			if floatMode {
				return nil, noCompanion("simplex." + name + "()")
			}
			return f(self.(*Simplex), args, kw)
		}, 0, doc)
	}
	noArgs := func(name string, f func(s *Simplex) (py.Object, error)) {
		method(name, name+"()", func(s *Simplex, args py.Tuple, kw py.StringDict) (py.Object, error) {
			if _, err := bind(name, args, kw, nil, 0); err != nil {
				return nil, err
			}
			return f(s)
		})
	}
	noArgs("sq_edges", func(s *Simplex) (py.Object, error) { return rationalList(s.s.SqEdges()), nil })
	noArgs("cayley_menger", func(s *Simplex) (py.Object, error) { return newRational(s.s.CayleyMenger()), nil })
	noArgs("cayley_menger_matrix", func(s *Simplex) (py.Object, error) {
		return rationalMatrix(s.ring, s.s.CayleyMengerMatrix()), nil
	})
	noArgs("volume_sq", func(s *Simplex) (py.Object, error) { return newRational(s.s.VolumeSq()), nil })
	noArgs("volume", func(s *Simplex) (py.Object, error) {
		return realResult(exact.RealSqrt(exact.RealFromRat(s.s.VolumeSq())), s.cap), nil
	})
	noArgs("facet_areas_sq", func(s *Simplex) (py.Object, error) { return rationalList(s.s.FacetContentsSq()), nil })
	noArgs("gram", func(s *Simplex) (py.Object, error) { return rationalMatrix(s.ring, s.s.Gram()), nil })
	noArgs("dim", func(s *Simplex) (py.Object, error) { return py.Int(s.s.Dim()), nil })
	noArgs("is_degenerate", func(s *Simplex) (py.Object, error) { return py.NewBool(s.s.IsDegenerate()), nil })
	noArgs("points", func(s *Simplex) (py.Object, error) {
		pts, ok := s.s.Points()
		if !ok {
			return nil, py.ExceptionNewf(py.ValueError, "points(): this simplex was built from distances and has no coordinates")
		}
		out := make([]py.Object, len(pts))
		for i, p := range pts {
			out[i] = rationalList(p)
		}
		return py.NewListFromItems(out), nil
	})
	noArgs("facet_area_vectors", func(s *Simplex) (py.Object, error) {
		vs, err := s.s.FacetAreaVectors()
		if err != nil {
			return nil, geomErr("facet_area_vectors", err)
		}
		out := make([]py.Object, len(vs))
		for i, v := range vs {
			out[i] = &KVector{w: v}
		}
		return py.NewListFromItems(out), nil
	})
	noArgs("circumradius_sq", func(s *Simplex) (py.Object, error) {
		r, err := s.s.CircumradiusSq()
		if err != nil {
			return nil, geomErr("circumradius_sq", err)
		}
		return newRational(r), nil
	})
	noArgs("circumcenter", func(s *Simplex) (py.Object, error) {
		c, err := s.s.Circumcenter()
		if err != nil {
			return nil, geomErr("circumcenter", err)
		}
		return rationalList(c), nil
	})
	noArgs("inradius", func(s *Simplex) (py.Object, error) {
		if s.s.IsDegenerate() {
			return nil, geomErr("inradius", geom.ErrDegenerate)
		}
		k := big.NewRat(int64(s.s.Dim()), 1)
		v := exact.RealMul(exact.RealFromRat(k), exact.RealSqrt(exact.RealFromRat(s.s.VolumeSq())))
		return realResult(exact.RealQuo(v, sqrtSum(s.s.FacetContentsSq())), s.cap), nil
	})
	noArgs("incenter", func(s *Simplex) (py.Object, error) {
		if s.s.IsDegenerate() {
			return nil, geomErr("incenter", geom.ErrDegenerate)
		}
		pts, ok := s.s.Points()
		if !ok {
			return nil, py.ExceptionNewf(py.ValueError, "incenter(): this simplex was built from distances and has no coordinates")
		}
		areas := s.s.FacetContentsSq()
		total := sqrtSum(areas)
		out := make([]py.Object, len(pts[0]))
		for c := range out {
			sum := exact.RealFromRat(new(big.Rat))
			for i, p := range pts {
				w := exact.RealMul(exact.RealSqrt(exact.RealFromRat(areas[i])), exact.RealFromRat(p[c]))
				sum = exact.RealAdd(sum, w)
			}
			out[c] = realResult(exact.RealQuo(sum, total), s.cap)
		}
		return py.NewListFromItems(out), nil
	})
	method("sq_edge", "sq_edge(i, j) -> the squared distance between vertices i and j", func(s *Simplex, args py.Tuple, kw py.StringDict) (py.Object, error) {
		i, j, err := vertexPair(s, "sq_edge", args, kw)
		if err != nil {
			return nil, err
		}
		return newRational(s.s.SqEdge(i, j)), nil
	})
	method("face", "face(indices) -> the face on those vertices", func(s *Simplex, args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("face", args, kw, []string{"indices"}, 1)
		if err != nil {
			return nil, err
		}
		idx, err := indexList(a[0], "face indices")
		if err != nil {
			return nil, err
		}
		f, err := s.s.Face(idx)
		if err != nil {
			return nil, geomErr("face", err)
		}
		return &Simplex{s: f, cap: s.cap, ring: s.ring}, nil
	})
	method("facet", "facet(i) -> the facet opposite vertex i", func(s *Simplex, args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("facet", args, kw, []string{"i"}, 1)
		if err != nil {
			return nil, err
		}
		i, err := intArg("facet", "i", a[0], 0)
		if err != nil {
			return nil, err
		}
		f, err := s.s.Facet(int(i))
		if err != nil {
			return nil, geomErr("facet", err)
		}
		return &Simplex{s: f, cap: s.cap, ring: s.ring}, nil
	})
	method("dihedral_cos", "dihedral_cos(i, j) -> cosine of the dihedral angle between the facets opposite i and j (exact when rational)", func(s *Simplex, args py.Tuple, kw py.StringDict) (py.Object, error) {
		i, j, err := vertexPair(s, "dihedral_cos", args, kw)
		if err != nil {
			return nil, err
		}
		cos2, sign, err := s.s.DihedralCosSq(i, j)
		if err != nil {
			return nil, geomErr("dihedral_cos", err)
		}
		c := exact.RealSqrt(exact.RealFromRat(cos2))
		if sign < 0 {
			c = exact.RealNeg(c)
		}
		return realResult(c, s.cap), nil
	})
}

func vertexPair(s *Simplex, name string, args py.Tuple, kw py.StringDict) (int, int, error) {
	a, err := bind(name, args, kw, []string{"i", "j"}, 2)
	if err != nil {
		return 0, 0, err
	}
	i, err1 := intArg(name, "i", a[0], 0)
	j, err2 := intArg(name, "j", a[1], 0)
	n := int64(s.s.Vertices())
	if err1 != nil || err2 != nil || i < 0 || j < 0 || i >= n || j >= n || i == j {
		return 0, 0, py.ExceptionNewf(py.ValueError, "%s(i, j) needs two different vertex indices below %d", name, n)
	}
	return int(i), int(j), nil
}

// M__str__ describes the simplex briefly.
func (s *Simplex) M__str__() (py.Object, error) {
	if pts, ok := s.s.Points(); ok {
		rows := make([]string, len(pts))
		for i, p := range pts {
			rows[i] = str(rationalList(p))
		}
		return py.String(fmt.Sprintf("simplex(%v)", rows)), nil
	}
	return py.String(fmt.Sprintf("distance_simplex(%s)", s.s.SqDistances())), nil
}

// M__repr__ prints the same as str.
func (s *Simplex) M__repr__() (py.Object, error) { return s.M__str__() }

func init() {
	kmethod := func(name, doc string, f func(w *geom.KVector) py.Object) {
		KVectorType.Dict[name] = py.MustNewMethod(name, func(self py.Object) (py.Object, error) {
			return f(self.(*KVector).w), nil
		}, 0, doc)
	}
	kmethod("norm_sq", "norm_sq() -> the squared norm (the Gram determinant of the factors)", func(w *geom.KVector) py.Object { return newRational(w.NormSq()) })
	kmethod("grade", "grade() -> k", func(w *geom.KVector) py.Object { return py.Int(w.Grade()) })
	kmethod("components", "components() -> [((i1, ..., ik), coefficient), ...] on the standard basis blades", func(w *geom.KVector) py.Object {
		var out []py.Object
		for _, b := range w.Components() {
			idx := make(py.Tuple, len(b.Index))
			for i, x := range b.Index {
				idx[i] = py.Int(x)
			}
			out = append(out, py.Tuple{idx, newRational(b.Coef)})
		}
		return py.NewListFromItems(out)
	})
}

func (k *KVector) arith(o py.Object, op func(a, b *geom.KVector) (*geom.KVector, error)) (py.Object, error) {
	other, ok := o.(*KVector)
	if !ok {
		return py.NotImplemented, nil
	}
	r, err := op(k.w, other.w)
	if err != nil {
		return nil, geomErr("k-vector", err)
	}
	return &KVector{w: r}, nil
}

// M__add__ adds k-vectors of the same grade and ambient dimension.
func (k *KVector) M__add__(o py.Object) (py.Object, error) { return k.arith(o, (*geom.KVector).Add) }

// M__sub__ subtracts.
func (k *KVector) M__sub__(o py.Object) (py.Object, error) { return k.arith(o, (*geom.KVector).Sub) }

// M__mul__ scales by an exact number.
func (k *KVector) M__mul__(o py.Object) (py.Object, error) {
	c, ok := exactOf(o)
	if !ok {
		return py.NotImplemented, nil
	}
	return &KVector{w: k.w.Scale(c)}, nil
}

// M__rmul__ scales by an exact number.
func (k *KVector) M__rmul__(o py.Object) (py.Object, error) { return k.M__mul__(o) }

// M__neg__ negates.
func (k *KVector) M__neg__() (py.Object, error) {
	return &KVector{w: k.w.Scale(big.NewRat(-1, 1))}, nil
}

// M__eq__ compares exactly.
func (k *KVector) M__eq__(o py.Object) (py.Object, error) {
	other, ok := o.(*KVector)
	if !ok {
		return py.NotImplemented, nil
	}
	return py.NewBool(k.w.Equal(other.w)), nil
}

// M__str__ prints the blades, e.g. "3*e1^e2 - e1^e3".
func (k *KVector) M__str__() (py.Object, error) { return py.String(k.w.String()), nil }

// M__repr__ prints the same as str.
func (k *KVector) M__repr__() (py.Object, error) { return k.M__str__() }

// exactOnly makes builtin name refuse to run in float64 code.
func exactOnly(b py.StringDict, name string) {
	exactFn := b[name]
	b[name] = builtin(name, exactFn.(*py.Method).Doc, func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		if floatMode {
			return nil, noCompanion(name + "()")
		}
		return py.Call(exactFn, args, kw)
	})
}

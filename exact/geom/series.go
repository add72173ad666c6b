package geom

// Simplices whose coordinates are truncated Puiseux series in a parameter
// t (exact.Series): the measures that are algebraic in the coordinates,
// from Gram and Cayley–Menger determinants over series, so that a
// degenerating family is expanded, not sampled. Only determinants and one
// division per measure are taken, so the series' error terms stay small.

import (
	"fmt"

	"assay/exact"
)

// SeriesPoints is the vertex list of a simplex with series coordinates.
type SeriesPoints [][]*exact.Series

// check validates the shape as FromPoints does.
func (p SeriesPoints) check() error {
	lens := make([]int, len(p))
	for i, x := range p {
		lens[i] = len(x)
	}
	return CheckPoints(lens)
}

// sqDist is |a − b|².
func sqDist(a, b []*exact.Series) (*exact.Series, error) {
	var sum *exact.Series
	for c := range a {
		d, err := exact.SeriesSub(a[c], b[c])
		if err != nil {
			return nil, err
		}
		if d, err = exact.SeriesMul(d, d); err != nil {
			return nil, err
		}
		if sum == nil {
			sum = d
		} else if sum, err = exact.SeriesAdd(sum, d); err != nil {
			return nil, err
		}
	}
	return sum, nil
}

// SqDistances is the matrix of squared distances between the vertices.
func (p SeriesPoints) SqDistances() ([][]*exact.Series, error) {
	if err := p.check(); err != nil {
		return nil, err
	}
	n := len(p)
	d := make([][]*exact.Series, n)
	for i := range d {
		d[i] = make([]*exact.Series, n)
	}
	zero := exact.SeriesConst(exact.RealFromInt(0), 0)
	for i := range n {
		d[i][i] = zero
		for j := i + 1; j < n; j++ {
			x, err := sqDist(p[i], p[j])
			if err != nil {
				return nil, err
			}
			d[i][j], d[j][i] = x, x
		}
	}
	return d, nil
}

// VolumeSq is the squared k-volume of the k-simplex: det(G)/(k!)², G the
// Gram matrix of the edges from vertex 0.
func (p SeriesPoints) VolumeSq() (*exact.Series, error) {
	if err := p.check(); err != nil {
		return nil, err
	}
	k := len(p) - 1
	g := make([][]*exact.Series, k)
	for i := range g {
		g[i] = make([]*exact.Series, k)
	}
	edge := make([][]*exact.Series, k)
	for i := range k {
		edge[i] = make([]*exact.Series, len(p[0]))
		for c := range p[0] {
			var err error
			if edge[i][c], err = exact.SeriesSub(p[i+1][c], p[0][c]); err != nil {
				return nil, err
			}
		}
	}
	for i := range k {
		for j := i; j < k; j++ {
			var dot *exact.Series
			for c := range edge[i] {
				x, err := exact.SeriesMul(edge[i][c], edge[j][c])
				if err != nil {
					return nil, err
				}
				if dot == nil {
					dot = x
				} else if dot, err = exact.SeriesAdd(dot, x); err != nil {
					return nil, err
				}
			}
			g[i][j], g[j][i] = dot, dot
		}
	}
	det, err := exact.SeriesDet(g)
	if err != nil {
		return nil, err
	}
	f := int64(1)
	for i := 2; i <= k; i++ {
		f *= int64(i)
	}
	return exact.SeriesQuo(det, exact.SeriesConst(exact.RealFromInt(f*f), 0))
}

// FacetContentsSq lists the squared (k−1)-volumes of the facets, facet i
// opposite vertex i.
func (p SeriesPoints) FacetContentsSq() ([]*exact.Series, error) {
	if err := p.check(); err != nil {
		return nil, err
	}
	out := make([]*exact.Series, len(p))
	for i := range p {
		facet := make(SeriesPoints, 0, len(p)-1)
		facet = append(facet, p[:i]...)
		facet = append(facet, p[i+1:]...)
		var err error
		if out[i], err = facet.VolumeSq(); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// Inradius is k·V / Σ F_i, V the volume and F_i the facet contents
// (square roots taken on the branch of exact.SeriesPow: positive leading
// coefficients, as volumes have).
func (p SeriesPoints) Inradius() (*exact.Series, error) {
	v2, err := p.VolumeSq()
	if err != nil {
		return nil, err
	}
	v, err := exact.SeriesPow(v2, 1, 2)
	if err != nil {
		return nil, fmt.Errorf("inradius: the volume: %w", err)
	}
	fs, err := p.FacetContentsSq()
	if err != nil {
		return nil, err
	}
	var sum *exact.Series
	for _, f2 := range fs {
		f, err := exact.SeriesPow(f2, 1, 2)
		if err != nil {
			return nil, fmt.Errorf("inradius: a facet's content: %w", err)
		}
		if sum == nil {
			sum = f
		} else if sum, err = exact.SeriesAdd(sum, f); err != nil {
			return nil, err
		}
	}
	kv, err := exact.SeriesMul(exact.SeriesConst(exact.RealFromInt(int64(len(p)-1)), 0), v)
	if err != nil {
		return nil, err
	}
	return exact.SeriesQuo(kv, sum)
}

// CircumradiusSq is R² = −det(D) / (2·det(CM)), D the squared distances
// and CM the Cayley–Menger matrix (D bordered by a row and column of ones
// and a zero corner). From the circumcentre's barycentric coordinates,
// which solve CM·(λ0, λ) = (1, 0…); checked on the equilateral and right
// triangles and the regular tetrahedron (R² = 1/3, c²/4, 3/8 for unit
// edges and legs).
func (p SeriesPoints) CircumradiusSq() (*exact.Series, error) {
	d, err := p.SqDistances()
	if err != nil {
		return nil, err
	}
	n := len(d)
	one := exact.SeriesConst(exact.RealFromInt(1), 0)
	cm := make([][]*exact.Series, n+1)
	cm[0] = make([]*exact.Series, n+1)
	cm[0][0] = exact.SeriesConst(exact.RealFromInt(0), 0)
	for j := 1; j <= n; j++ {
		cm[0][j] = one
	}
	for i := range n {
		cm[i+1] = append([]*exact.Series{one}, d[i]...)
	}
	dd, err := exact.SeriesDet(d)
	if err != nil {
		return nil, err
	}
	dcm, err := exact.SeriesDet(cm)
	if err != nil {
		return nil, err
	}
	den, err := exact.SeriesMul(exact.SeriesConst(exact.RealFromInt(-2), 0), dcm)
	if err != nil {
		return nil, err
	}
	return exact.SeriesQuo(dd, den)
}

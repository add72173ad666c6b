package geom

// Simplices whose coordinates are truncated Puiseux series in a parameter
// t (exact.Series): the measures that are algebraic in the coordinates,
// from Gram and Cayley–Menger determinants over series, so that a
// degenerating family is expanded, not sampled. Only determinants and one
// division per measure are taken, so the series' error terms stay small.

import (
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
	var o ops
	_, g := gramOf(&o, p)
	if o.err != nil {
		return nil, o.err
	}
	det, err := exact.SeriesDet(g)
	if err != nil {
		return nil, err
	}
	return o.quo(det, sfactorial(len(p)-1, true)), o.err
}

// gramOf returns the edges e_a = v_a − v_0 and their Gram matrix.
func gramOf(o *ops, p SeriesPoints) (edges, gram [][]*exact.Series) {
	k := len(p) - 1
	edges = make([][]*exact.Series, k)
	for a := range k {
		edges[a] = make([]*exact.Series, len(p[0]))
		for c := range p[0] {
			edges[a][c] = o.sub(p[a+1][c], p[0][c])
		}
	}
	gram = make([][]*exact.Series, k)
	for a := range gram {
		gram[a] = make([]*exact.Series, k)
	}
	for a := range k {
		for b := a; b < k; b++ {
			gram[a][b] = o.dot(edges[a], edges[b])
			gram[b][a] = gram[a][b]
		}
	}
	return edges, gram
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
// coefficients, as volumes have); see SeriesShape.Inradius.
func (p SeriesPoints) Inradius() (*exact.Series, error) {
	s, err := p.Shape()
	if err != nil {
		return nil, err
	}
	return s.Inradius()
}

// CircumradiusSq is R², checked on the equilateral and right triangles
// and the regular tetrahedron (R² = 1/3, c²/4, 3/8 for unit edges and
// legs); see SeriesShape.CircumradiusSq.
func (p SeriesPoints) CircumradiusSq() (*exact.Series, error) {
	s, err := p.Shape()
	if err != nil {
		return nil, err
	}
	return s.CircumradiusSq()
}

// CayleyMenger is the determinant of the squared distances bordered by a
// row and column of ones and a zero corner.
func (p SeriesPoints) CayleyMenger() (*exact.Series, error) {
	d, err := p.SqDistances()
	if err != nil {
		return nil, err
	}
	n := len(d)
	cm := make([][]*exact.Series, n+1)
	cm[0] = make([]*exact.Series, n+1)
	cm[0][0] = sconst(0)
	for j := 1; j <= n; j++ {
		cm[0][j] = sconst(1)
	}
	for i := range n {
		cm[i+1] = append([]*exact.Series{sconst(1)}, d[i]...)
	}
	return exact.SeriesDet(cm)
}

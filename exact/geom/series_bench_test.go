package geom

import "testing"

// BenchmarkSeriesShape: the circumcentre and the insphere's touch points
// of the sliver demo's squeezed tetrahedron (0,0,0), (4,0,t), (1,3,2t),
// (3,2,−t) on t + O(t^7), as BenchmarkSeriesInradius (figures at the top
// of series_shape.go).
func BenchmarkSeriesShape(b *testing.B) { benchSeriesShape(b, "sliver") }

// BenchmarkSeriesShapeMoving: the same on the moving tetrahedron of the
// tests, whose facet contents expand with algebraic coefficients.
func BenchmarkSeriesShapeMoving(b *testing.B) { benchSeriesShape(b, "moving") }

func benchSeriesShape(b *testing.B, family string) {
	fam := seriesFamilies[family]
	for i := 0; i < b.N; i++ {
		sh, err := fam.series(7).Shape()
		if err != nil {
			b.Fatal(err)
		}
		if _, err := sh.Circumcenter(); err != nil {
			b.Fatal(err)
		}
		if _, err := sh.TouchPoints(); err != nil {
			b.Fatal(err)
		}
	}
}

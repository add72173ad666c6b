package exact

import (
	"fmt"
	"math/big"
	"math/rand"
	"testing"
	"time"
)

// pmCayleyMenger returns the (n+2)x(n+2) Cayley–Menger matrix of the
// n-simplex over a new ring with one variable d_ij per squared edge length
// (created in the order d01, d02, ..., d12, ...), and the ring.
func pmCayleyMenger(tb testing.TB, n int) (*PolyMatrix, *Ring) {
	tb.Helper()
	r := NewRing()
	pts := n + 1
	d := make([][]*Poly, pts)
	for i := range d {
		d[i] = make([]*Poly, pts)
	}
	for i := 0; i < pts; i++ {
		for j := i + 1; j < pts; j++ {
			v, err := r.Var(fmt.Sprintf("d%d%d", i, j))
			if err != nil {
				tb.Fatal(err)
			}
			d[i][j], d[j][i] = v, v
		}
	}
	one, zero := r.Const(q("1")), r.Const(q("0"))
	rows := make([][]*Poly, pts+1)
	rows[0] = []*Poly{zero}
	for j := 0; j < pts; j++ {
		rows[0] = append(rows[0], one)
	}
	for i := 0; i < pts; i++ {
		rows[i+1] = []*Poly{one}
		for j := 0; j < pts; j++ {
			if i == j {
				rows[i+1] = append(rows[i+1], zero)
			} else {
				rows[i+1] = append(rows[i+1], d[i][j])
			}
		}
	}
	m, err := NewPolyMatrix(r, rows)
	if err != nil {
		tb.Fatal(err)
	}
	return m, r
}

// BenchmarkCayleyMenger measures Det on the expanded Cayley–Menger
// determinant of the n-simplex; the 6- and 7-simplex are compared with
// the reference program (cm N laplace 5, which prints its best of 5) in
// the table at the top of polymatrix_det.go, so best-ms is reported too.
func BenchmarkCayleyMenger(b *testing.B) {
	for _, n := range []int{3, 4, 5, 6, 7} {
		m, _ := pmCayleyMenger(b, n)
		b.Run(fmt.Sprintf("simplex=%d", n), func(b *testing.B) {
			var terms int
			benchBest(b, func() {
				d, err := m.Det()
				if err != nil {
					b.Fatal(err)
				}
				terms = d.Len()
			})
			b.ReportMetric(float64(terms), "terms")
		})
	}
}

// pmShapes are the matrix shapes BenchmarkPolyDetMethods measures.
func pmShapes(tb testing.TB) []pmShape {
	var out []pmShape
	for _, n := range []int{3, 4, 5, 6, 7} {
		m, _ := pmCayleyMenger(tb, n)
		out = append(out, pmShape{fmt.Sprintf("cm/simplex=%d", n), m})
	}
	for _, n := range []int{4, 5, 6, 7} {
		r := NewRing()
		rows := make([][]*Poly, n)
		for i := range rows {
			for j := 0; j < n; j++ {
				rows[i] = append(rows[i], pmVars(tb, r, fmt.Sprintf("a%d_%d", i, j))[0])
			}
		}
		out = append(out, pmShape{fmt.Sprintf("generic/n=%d", n), pmMatrix(tb, r, rows...)})
	}
	for _, n := range []int{6, 10, 14} {
		r := NewRing()
		tv := pmVars(tb, r, "t")[0]
		tim, _ := PolyMatrixFrom(r, Identity(n)).Scale(tv)
		m, _ := tim.Sub(PolyMatrixFrom(r, randomIntMatrix(n, 1, 100)))
		out = append(out, pmShape{fmt.Sprintf("tI-M/n=%d", n), m})
	}
	for _, n := range []int{4, 6, 8} {
		rng := rand.New(rand.NewSource(int64(n)))
		r := NewRing()
		vars := pmVars(tb, r, "x", "y", "z")
		rows := make([][]*Poly, n)
		for i := range rows {
			for j := 0; j < n; j++ {
				p := r.Const(new(big.Rat))
				for k := 0; k < 3; k++ {
					mono := r.Const(big.NewRat(rng.Int63n(19)-9, 1))
					for e := rng.Intn(3); e > 0; e-- {
						mono = pmMul(tb, mono, vars[rng.Intn(3)])
					}
					p = p.Add(mono)
				}
				rows[i] = append(rows[i], p)
			}
		}
		out = append(out, pmShape{fmt.Sprintf("dense3var/n=%d", n), pmMatrix(tb, r, rows...)})
	}
	return out
}

type pmShape struct {
	name string
	m    *PolyMatrix
}

// BenchmarkPolyDetMethods compares the determinant methods on several
// shapes; the figures are recorded at the top of polymatrix_det.go. A
// method is skipped on a shape where one determinant takes more than 2 s.
func BenchmarkPolyDetMethods(b *testing.B) {
	methods := []struct {
		name string
		id   int
	}{
		{"auto", pmDetAuto},
		{"laplace", pmDetLaplace},
		{"laplacePoly", pmDetLaplacePoly},
		{"bareiss", pmDetBareiss},
	}
	for _, sh := range pmShapes(b) {
		for _, meth := range methods {
			b.Run(sh.name+"/"+meth.name, func(b *testing.B) {
				start := time.Now()
				if _, err := sh.m.det(meth.id); err != nil {
					b.Skip(err)
				}
				if d := time.Since(start); d > 2*time.Second {
					b.Skipf("%v for one determinant", d)
				}
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					if _, err := sh.m.det(meth.id); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

package exact

import "math/big"

// detGaussRat is candidate (c) for Det, kept for the benchmarks and as an
// independent cross-check: Gaussian elimination over big.Rat.
func (m *Matrix) detGaussRat() *big.Rat {
	a := m.ratRows(nil)
	n := m.rows
	det := big.NewRat(1, 1)
	t, f := new(big.Rat), new(big.Rat)
	for k := 0; k < n; k++ {
		p := k
		for p < n && a[p][k].Sign() == 0 {
			p++
		}
		if p == n {
			return new(big.Rat)
		}
		if p != k {
			a[p], a[k] = a[k], a[p]
			det.Neg(det)
		}
		det.Mul(det, a[k][k])
		for i := k + 1; i < n; i++ {
			if a[i][k].Sign() == 0 {
				continue
			}
			f.Quo(a[i][k], a[k][k])
			for j := k + 1; j < n; j++ {
				a[i][j].Sub(a[i][j], t.Mul(f, a[k][j]))
			}
		}
	}
	return det
}

package geom

import (
	"fmt"
	"math/big"

	"assay/exact"
)

// CayleyMengerPoly returns the Cayley–Menger determinant of symbolic
// squared distances: the determinant of d bordered by a row and a column
// [0, 1, …, 1] as in Simplex.CayleyMengerMatrix. d must be square
// (exact.ErrShape, exact.ErrNotSquare), symmetric and with a zero diagonal
// (ErrNotEmbeddable, naming the entry). Errors of the determinant (the
// ring's term cap, exact.ErrTooManyTerms) are passed on.
func CayleyMengerPoly(d *exact.PolyMatrix) (*exact.Poly, error) {
	if d == nil {
		return nil, fmt.Errorf("cayley-menger: nil matrix: %w", exact.ErrShape)
	}
	N := d.Rows()
	if N != d.Cols() {
		return nil, fmt.Errorf("cayley-menger: a squared-distance matrix must be square, got %dx%d: %w %w", N, d.Cols(), exact.ErrShape, exact.ErrNotSquare)
	}
	if N == 0 {
		return nil, fmt.Errorf("cayley-menger: empty matrix: %w", exact.ErrShape)
	}
	r := d.At(0, 0).Ring()
	for i := 0; i < N; i++ {
		if !d.At(i, i).IsZero() {
			return nil, fmt.Errorf("cayley-menger: diagonal entry (%d, %d) is %s, not 0: %w", i, i, d.At(i, i), ErrNotEmbeddable)
		}
		for j := i + 1; j < N; j++ {
			if !d.At(i, j).Equal(d.At(j, i)) {
				return nil, fmt.Errorf("cayley-menger: entries (%d, %d) = %s and (%d, %d) = %s differ (squared distances are symmetric): %w",
					i, j, d.At(i, j), j, i, d.At(j, i), ErrNotEmbeddable)
			}
		}
	}
	zero, one := r.Const(nil), r.Const(big.NewRat(1, 1))
	rows := make([][]*exact.Poly, N+1)
	rows[0] = make([]*exact.Poly, N+1)
	rows[0][0] = zero
	for j := 1; j <= N; j++ {
		rows[0][j] = one
	}
	for i := 1; i <= N; i++ {
		rows[i] = make([]*exact.Poly, N+1)
		rows[i][0] = one
		for j := 1; j <= N; j++ {
			rows[i][j] = d.At(i-1, j-1)
		}
	}
	m, err := exact.NewPolyMatrix(r, rows)
	if err != nil {
		return nil, fmt.Errorf("cayley-menger: %w", err)
	}
	det, err := m.Det()
	if err != nil {
		return nil, fmt.Errorf("cayley-menger: %w", err)
	}
	return det, nil
}

// VolumeSqPoly returns the squared k-volume of the simplex with symbolic
// squared distances d ((k+1) x (k+1)): (−1)^(k+1) CM / (2^k (k!)²), with
// CM = CayleyMengerPoly(d), whose errors it returns.
func VolumeSqPoly(d *exact.PolyMatrix) (*exact.Poly, error) {
	cm, err := CayleyMengerPoly(d)
	if err != nil {
		return nil, err
	}
	return cm.Scale(cmFactor(d.Rows() - 1)), nil
}

// cmFactor returns (−1)^(k+1) / (2^k (k!)²).
func cmFactor(k int) *big.Rat {
	f := factorial(k)
	den := new(big.Int).Mul(f, f)
	den.Lsh(den, uint(k))
	c := new(big.Rat).SetFrac(big.NewInt(1), den)
	if k%2 == 0 {
		c.Neg(c)
	}
	return c
}

package exact

import (
	"fmt"
	"math/big"
)

// CharacteristicPolynomial returns det(t I - M), the monic characteristic
// polynomial of the square rational matrix m written in t, which is
// normally a variable of some ring (any polynomial t gives the composition
// of the characteristic polynomial with t). m must be square
// (ErrNotSquare); the 0x0 matrix gives 1. ErrTooManyTerms can arise only
// when t is not a variable.
//
// The coefficients are computed over Q by reduction to Hessenberg form and
// the Hessenberg recurrence (Cohen, A Course in Computational Algebraic
// Number Theory, Algorithm 2.2.9), O(n^3) rational operations.
func CharacteristicPolynomial(m *Matrix, t *Poly) (*Poly, error) {
	if m.rows != m.cols {
		return nil, fmt.Errorf("characteristic polynomial needs a square matrix, got %s: %w", m.shape(), ErrNotSquare)
	}
	c := pmCharPolyCoeffs(m)
	r := t.Ring()
	p := r.Const(big.NewRat(1, 1))
	for k := m.rows - 1; k >= 0; k-- {
		var err error
		if p, err = p.Mul(t); err != nil {
			return nil, fmt.Errorf("characteristic polynomial: %w", err)
		}
		p = p.Add(r.Const(c[k]))
	}
	return p, nil
}

// pmCharPolyCoeffs returns c_0, ..., c_n with det(x I - m) = sum c_k x^k
// (c_n = 1).
func pmCharPolyCoeffs(m *Matrix) []*big.Rat {
	n := m.rows
	h := make([][]*big.Rat, n)
	for i := range h {
		h[i] = m.Row(i)
	}
	u, t := new(big.Rat), new(big.Rat)
	// Reduce to upper Hessenberg form by similarity transformations: for
	// each column, a pivot below the subdiagonal is swapped up, then the
	// entries below it are eliminated (row i -= u row m) and the inverse
	// operation is applied to the columns (column m += u column i).
	for c := 1; c < n-1; c++ {
		p := c
		for p < n && h[p][c-1].Sign() == 0 {
			p++
		}
		if p == n {
			continue
		}
		if p != c {
			h[p], h[c] = h[c], h[p]
			for i := 0; i < n; i++ {
				h[i][p], h[i][c] = h[i][c], h[i][p]
			}
		}
		piv := h[c][c-1]
		for i := c + 1; i < n; i++ {
			if h[i][c-1].Sign() == 0 {
				continue
			}
			u.Quo(h[i][c-1], piv)
			for j := 0; j < n; j++ {
				if h[c][j].Sign() != 0 {
					h[i][j].Sub(h[i][j], t.Mul(u, h[c][j]))
				}
			}
			for j := 0; j < n; j++ {
				if h[j][i].Sign() != 0 {
					h[j][c].Add(h[j][c], t.Mul(u, h[j][i]))
				}
			}
		}
	}
	// p_0 = 1; p_k = (x - h_kk) p_{k-1} - sum_{i<k} h_ik (prod_{j=i+1}^{k}
	// h_{j,j-1}) p_{i-1}, 1-based; p[k] holds the coefficients of p_k.
	p := make([][]*big.Rat, n+1)
	p[0] = []*big.Rat{big.NewRat(1, 1)}
	for k := 1; k <= n; k++ {
		q := make([]*big.Rat, k+1)
		for i := range q {
			q[i] = new(big.Rat)
		}
		for i, a := range p[k-1] { // (x - h_kk) p_{k-1}
			q[i+1].Add(q[i+1], a)
			q[i].Sub(q[i], t.Mul(h[k-1][k-1], a))
		}
		prod := big.NewRat(1, 1)
		for i := k - 1; i >= 1; i-- {
			prod.Mul(prod, h[i][i-1])
			if prod.Sign() == 0 {
				break
			}
			f := new(big.Rat).Mul(h[i-1][k-1], prod)
			if f.Sign() == 0 {
				continue
			}
			for l, a := range p[i-1] {
				q[l].Sub(q[l], t.Mul(f, a))
			}
		}
		p[k] = q
	}
	return p[n]
}

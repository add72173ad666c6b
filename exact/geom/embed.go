package geom

import (
	"fmt"
	"math/big"
	"sort"
	"strings"

	"assay/exact"
)

// Embeddable reports whether the squared distances d (an N x N matrix) are
// those of N points of R^k, with a reason in words either way.
//
// Schoenberg's criterion (1935): a symmetric matrix with zero diagonal is a
// matrix of squared Euclidean distances of points in R^k if and only if
// the Gram matrix G_ij = (d_0i + d_0j − d_ij)/2 (i, j = 1..N−1) is positive
// semidefinite of rank at most k. The check is exact: first every entry
// (symmetry, zero diagonal, d_ij >= 0), then every triangle inequality
// (for the clearest reason), then an LDLᵀ elimination of G with diagonal
// pivoting over the rationals, which either finds rank(G) or exhibits a
// negative principal minor of G as the witness. Typical reasons:
//
//	the triangle 0,1,3 violates the triangle inequality: …
//	the Gram matrix (edge vectors from point 0) is not positive semidefinite: its principal minor on {1, 2, 3} is −3/4 …
//	needs dimension 3, asked for 2
//
// err is non-nil only for malformed input: d nil, empty or not square
// (exact.ErrShape, exact.ErrNotSquare) or k < 0 (exact.ErrShape).
func Embeddable(d *exact.Matrix, k int) (ok bool, reason string, err error) {
	if err := checkDistShape("embeddable", d); err != nil {
		return false, "", err
	}
	if k < 0 {
		return false, "", fmt.Errorf("embeddable: negative dimension %d: %w", k, exact.ErrShape)
	}
	if r := distEntryReason(d); r != "" {
		return false, r, nil
	}
	s := fromDistances(d.Clone())
	rank, r := s.euclidean()
	if r != "" {
		return false, r, nil
	}
	if rank > k {
		return false, fmt.Sprintf("needs dimension %d, asked for %d (the Gram matrix from point 0 is positive semidefinite of rank %d)", rank, k, rank), nil
	}
	return true, fmt.Sprintf("realised in R^%d (the Gram matrix from point 0 is positive semidefinite of rank %d <= %d)", rank, rank, k), nil
}

// euclidean decides whether a distance simplex's data are Euclidean: it
// returns the rank of the Gram matrix, or a reason why it is not positive
// semidefinite.
func (s *Simplex) euclidean() (rank int, reason string) {
	if r := s.triangleReason(); r != "" {
		return 0, r
	}
	k := s.k
	a := make([][]*big.Rat, k)
	for i := range a {
		a[i] = make([]*big.Rat, k)
		for j := range a[i] {
			a[i][j] = new(big.Rat).SetInt(s.g[i*k+j])
		}
	}
	rank, wit, minor := psd(a)
	if wit == nil {
		return rank, ""
	}
	// The scaled Gram matrix is s·G: the minor of G is minor / s^|wit|.
	den := new(big.Int).Exp(s.s, big.NewInt(int64(len(wit))), nil)
	minor.Quo(minor, new(big.Rat).SetInt(den))
	pts := make([]string, len(wit))
	for i, w := range wit {
		pts[i] = fmt.Sprint(w + 1)
	}
	set := strings.Join(pts, ", ")
	return 0, fmt.Sprintf("the Gram matrix (edge vectors from point 0) is not positive semidefinite: its principal minor on {%s} is %s < 0, so points 0, %s would span a %d-simplex of negative squared volume (Cayley–Menger)",
		set, exact.FormatRat(minor), set, len(wit))
}

// triangleReason returns the first triangle (i < j < l) whose squared
// sides violate the triangle inequality, in words, or "".
func (s *Simplex) triangleReason() string {
	N := s.k + 1
	if N < 3 {
		return ""
	}
	d := make([][]*big.Int, N) // s·d_ij
	for i := range d {
		d[i] = make([]*big.Int, N)
		for j := range d[i] {
			if i < j {
				d[i][j] = s.sqEdgeScaled(i, j)
			}
		}
	}
	for i := 0; i < N; i++ {
		for j := i + 1; j < N; j++ {
			for l := j + 1; l < N; l++ {
				h := heron16(d[i][j], d[j][l], d[i][l])
				if h.Sign() < 0 {
					return fmt.Sprintf("the triangle %d,%d,%d violates the triangle inequality (squared sides d(%d,%d) = %s, d(%d,%d) = %s, d(%d,%d) = %s give 16·area² = %s < 0)",
						i, j, l, i, j, fmtScaled(d[i][j], s.s), j, l, fmtScaled(d[j][l], s.s), i, l, fmtScaled(d[i][l], s.s),
						exact.FormatRat(ratFrac(h, new(big.Int).Mul(s.s, s.s))))
				}
			}
		}
	}
	return ""
}

func fmtScaled(x, s *big.Int) string { return exact.FormatRat(ratFrac(x, s)) }

// heron16 returns 2ab + 2bc + 2ca − a² − b² − c², which is 16·area² for a
// triangle of squared sides a, b, c (Heron's formula); it is negative
// exactly when the sides violate a triangle inequality.
func heron16(a, b, c *big.Int) *big.Int {
	// = 4ab − (a + b − c)²
	z := new(big.Int).Mul(a, b)
	z.Lsh(z, 2)
	t := new(big.Int).Add(a, b)
	t.Sub(t, c)
	t.Mul(t, t)
	return z.Sub(z, t)
}

// psd decides whether the symmetric rational matrix a is positive
// semidefinite by LDLᵀ elimination with diagonal pivoting (a is
// destroyed). It returns the rank when it is; otherwise a witness: indices
// T (sorted) whose principal minor det a[T] is negative, and that minor.
//
// Invariant: after eliminating the pivots P, the remaining block is the
// Schur complement S of a[P], and det a[P ∪ T] = det a[P] · det S[T] with
// det a[P] the product of the (positive) pivots. A negative S_jj gives
// T = P ∪ {j}; when every remaining diagonal entry is 0, a non-zero S_ij
// gives T = P ∪ {i, j} with minor −det a[P]·S_ij².
func psd(a [][]*big.Rat) (rank int, witness []int, minor *big.Rat) {
	m := len(a)
	alive := make([]bool, m)
	for i := range alive {
		alive[i] = true
	}
	var piv []int
	prod := big.NewRat(1, 1)
	var t big.Rat
	for {
		p := -1
		for j := 0; j < m; j++ {
			if !alive[j] {
				continue
			}
			if a[j][j].Sign() < 0 {
				w := append(append([]int(nil), piv...), j)
				sort.Ints(w)
				return 0, w, new(big.Rat).Mul(prod, a[j][j])
			}
			if p < 0 && a[j][j].Sign() > 0 {
				p = j
			}
		}
		if p < 0 {
			for i := 0; i < m; i++ {
				for j := i + 1; j < m; j++ {
					if alive[i] && alive[j] && a[i][j].Sign() != 0 {
						w := append(append([]int(nil), piv...), i, j)
						sort.Ints(w)
						z := new(big.Rat).Mul(a[i][j], a[i][j])
						return 0, w, z.Neg(z.Mul(z, prod))
					}
				}
			}
			return len(piv), nil, nil
		}
		alive[p] = false
		piv = append(piv, p)
		prod.Mul(prod, a[p][p])
		inv := new(big.Rat).Inv(a[p][p])
		for i := 0; i < m; i++ {
			if !alive[i] || a[i][p].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Mul(a[i][p], inv)
			for j := 0; j < m; j++ {
				if alive[j] && a[p][j].Sign() != 0 {
					a[i][j].Sub(a[i][j], t.Mul(f, a[p][j]))
				}
			}
		}
	}
}

// TriangleAreaSq returns the squared area A² of the triangle with squared
// sides a2, b2, c2, by Heron's formula in squared sides:
//
//	16·A² = 2·a2·b2 + 2·b2·c2 + 2·c2·a2 − a2² − b2² − c2².
//
// A negative (or nil) squared side, or sides violating the triangle
// inequality (16·A² < 0), give an error wrapping ErrNotEmbeddable. A
// degenerate triangle (equality) gives 0.
func TriangleAreaSq(a2, b2, c2 *big.Rat) (*big.Rat, error) {
	sides := [3]*big.Rat{a2, b2, c2}
	names := [3]string{"a2", "b2", "c2"}
	for i, x := range sides {
		if x == nil {
			return nil, fmt.Errorf("triangle area: squared side %s is nil: %w", names[i], exact.ErrShape)
		}
		if x.Sign() < 0 {
			return nil, fmt.Errorf("triangle area: squared side %s = %s is negative: %w", names[i], exact.FormatRat(x), ErrNotEmbeddable)
		}
	}
	// 16A² = 4·a2·b2 − (a2 + b2 − c2)²
	z := new(big.Rat).Mul(a2, b2)
	z.Mul(z, big.NewRat(4, 1))
	t := new(big.Rat).Add(a2, b2)
	t.Sub(t, c2)
	t.Mul(t, t)
	z.Sub(z, t)
	if z.Sign() < 0 {
		return nil, fmt.Errorf("triangle area: squared sides %s, %s, %s violate the triangle inequality (16·area² = %s < 0): %w",
			exact.FormatRat(a2), exact.FormatRat(b2), exact.FormatRat(c2), exact.FormatRat(z), ErrNotEmbeddable)
	}
	return z.Quo(z, big.NewRat(16, 1)), nil
}

// TangentLengths returns s−a, s−b, s−c for a triangle with side lengths a,
// b, c and semiperimeter s = (a+b+c)/2: the lengths of the tangents from
// the vertices opposite a, b and c to the incircle. A negative (or nil)
// side, or a side longer than the sum of the other two, gives an error
// wrapping ErrNotEmbeddable; degenerate triangles are allowed (a tangent
// length 0).
func TangentLengths(a, b, c *big.Rat) ([3]*big.Rat, error) {
	var out [3]*big.Rat
	sides := [3]*big.Rat{a, b, c}
	names := [3]string{"a", "b", "c"}
	for i, x := range sides {
		if x == nil {
			return out, fmt.Errorf("tangent lengths: side %s is nil: %w", names[i], exact.ErrShape)
		}
		if x.Sign() < 0 {
			return out, fmt.Errorf("tangent lengths: side %s = %s is negative: %w", names[i], exact.FormatRat(x), ErrNotEmbeddable)
		}
	}
	s := new(big.Rat).Add(a, b)
	s.Add(s, c)
	s.Quo(s, big.NewRat(2, 1))
	for i, x := range sides {
		out[i] = new(big.Rat).Sub(s, x)
		if out[i].Sign() < 0 {
			o1, o2 := sides[(i+1)%3], sides[(i+2)%3]
			return [3]*big.Rat{}, fmt.Errorf("tangent lengths: side %s = %s exceeds the sum of the others, %s: %w",
				names[i], exact.FormatRat(x), exact.FormatRat(new(big.Rat).Add(o1, o2)), ErrNotEmbeddable)
		}
	}
	return out, nil
}

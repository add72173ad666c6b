package geom

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"assay/exact"
)

// q parses a rational ("3/4", "-2", "0.5").
func q(s string) *big.Rat {
	r, err := exact.ParseRat(s)
	if err != nil {
		panic(err)
	}
	return r
}

func qi(n int64) *big.Rat { return big.NewRat(n, 1) }

// vec makes a vector of integers.
func vec(xs ...int64) []*big.Rat {
	v := make([]*big.Rat, len(xs))
	for i, x := range xs {
		v[i] = qi(x)
	}
	return v
}

// mustPoints builds a points simplex or fails the test.
func mustPoints(t testing.TB, pts ...[]*big.Rat) *Simplex {
	t.Helper()
	s, err := FromPoints(pts)
	if err != nil {
		t.Fatalf("FromPoints: %v", err)
	}
	return s
}

// mustDist builds a distance simplex from rows of strings.
func mustDist(t testing.TB, m *exact.Matrix) *Simplex {
	t.Helper()
	s, err := FromSquaredDistances(m)
	if err != nil {
		t.Fatalf("FromSquaredDistances: %v", err)
	}
	return s
}

// matrixOf builds a matrix from rows of rationals written as strings.
func matrixOf(rows ...[]string) *exact.Matrix {
	rr := make([][]*big.Rat, len(rows))
	for i, r := range rows {
		rr[i] = make([]*big.Rat, len(r))
		for j, s := range r {
			rr[i][j] = q(s)
		}
	}
	m, err := exact.NewMatrix(rr)
	if err != nil {
		panic(err)
	}
	return m
}

// regularDistances is the N x N squared-distance matrix of the regular
// simplex with edge² e2.
func regularDistances(N int, e2 *big.Rat) *exact.Matrix {
	m := exact.Zeros(N, N)
	for i := 0; i < N; i++ {
		for j := 0; j < N; j++ {
			if i != j {
				m.Set(i, j, e2)
			}
		}
	}
	return m
}

// randVec returns n random rationals p/q with |p| <= bound, 1 <= q <= den.
func randVec(rng *rand.Rand, n int, bound, den int64) []*big.Rat {
	v := make([]*big.Rat, n)
	for i := range v {
		v[i] = big.NewRat(rng.Int64N(2*bound+1)-bound, 1+rng.Int64N(den))
	}
	return v
}

func dot(a, b []*big.Rat) *big.Rat {
	z := new(big.Rat)
	for i := range a {
		z.Add(z, new(big.Rat).Mul(a[i], b[i]))
	}
	return z
}

func sub(a, b []*big.Rat) []*big.Rat {
	out := make([]*big.Rat, len(a))
	for i := range a {
		out[i] = new(big.Rat).Sub(a[i], b[i])
	}
	return out
}

func ratEq(t testing.TB, what string, got, want *big.Rat) {
	t.Helper()
	if got.Cmp(want) != 0 {
		t.Errorf("%s = %s, want %s", what, got.RatString(), want.RatString())
	}
}

// prec is the working precision of the certified float comparisons.
const prec = 256

func bigSqrt(x *big.Rat) *big.Float {
	f := new(big.Float).SetPrec(prec).SetRat(x)
	return f.Sqrt(f)
}

// inradiusSq returns r² = (k V / Σ F_i)² in big.Float.
func inradiusSq(s *Simplex) *big.Float {
	sum := new(big.Float).SetPrec(prec)
	for _, f := range s.FacetContentsSq() {
		sum.Add(sum, bigSqrt(f))
	}
	r := bigSqrt(s.VolumeSq())
	r.Mul(r, new(big.Float).SetInt64(int64(s.Dim())))
	r.Quo(r, sum)
	return r.Mul(r, r)
}

// angleDeg returns the dihedral angle in degrees from cos² and sign.
func angleDeg(cos2 *big.Rat, sign int) float64 {
	f, _ := cos2.Float64()
	return math.Acos(float64(sign)*math.Sqrt(f)) * 180 / math.Pi
}

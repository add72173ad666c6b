package kernel

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"

	"github.com/go-python/gpython/py"
)

// Box is a family of random rational points: box(dim, lo, hi, denom=1,
// seed=None) is called with a sample index k and gives point k. The same
// seed and k always give the same point.
type Box struct {
	dim     int
	lo, hi  int64
	denom   int64
	seed    uint64
	integer bool // denom == 1: points of the grid {lo, …, hi}^dim
}

// BoxType is the Python type of Box.
var BoxType = py.NewType("box", "A family of random rational points: box(dim, lo, hi, denom=1, seed=None); call it with k for point k.")

// Type returns BoxType.
func (b *Box) Type() *py.Type { return BoxType }

// M__call__ gives point k: dim rationals p/q with lo <= p/q <= hi, 1 <= q <= denom.
func (b *Box) M__call__(args py.Tuple, kw py.StringDict) (py.Object, error) {
	a, err := bind("box", args, kw, []string{"k"}, 1)
	if err != nil {
		return nil, err
	}
	k, err := intArg("box", "k", a[0], 0)
	if err != nil || k < 0 {
		return nil, py.ExceptionNewf(py.ValueError, "a box family takes a sample index k >= 0")
	}
	r := rand.New(rand.NewPCG(b.seed, uint64(k)))
	point := make([]py.Object, b.dim)
	for i := range point {
		q := r.Int64N(b.denom) + 1
		// p/q in [lo, hi]: p in [lo*q, hi*q]
		p := b.lo*q + r.Int64N((b.hi-b.lo)*q+1)
		point[i] = newRational(big.NewRat(p, q))
	}
	return py.NewListFromItems(point), nil
}

// M__repr__ describes the family.
func (b *Box) M__repr__() (py.Object, error) {
	return py.String(fmt.Sprintf("box(%d, %d, %d, denom=%d)", b.dim, b.lo, b.hi, b.denom)), nil
}

func (s *Session) box(args py.Tuple, kw py.StringDict) (py.Object, error) {
	a, err := bind("box", args, kw, []string{"dim", "lo", "hi", "denom", "seed"}, 3)
	if err != nil {
		return nil, err
	}
	var n [4]int64
	for i, def := range []int64{0, 0, 0, 1} {
		if n[i], err = intArg("box", []string{"dim", "lo", "hi", "denom"}[i], a[i], def); err != nil {
			return nil, err
		}
	}
	if n[0] < 1 || n[0] > 1024 || n[1] > n[2] || n[3] < 1 || n[2]-n[1] > math.MaxInt32 || n[3] > math.MaxInt32 {
		return nil, py.ExceptionNewf(py.ValueError, "box(dim, lo, hi, denom=1) needs 1 <= dim <= 1024, lo <= hi (a range below 2^31) and denom >= 1")
	}
	seed := uint64(s.seed)<<20 ^ uint64(s.cell)
	if a[4] != nil && a[4] != py.None {
		v, err := intArg("box", "seed", a[4], 0)
		if err != nil {
			return nil, err
		}
		seed = uint64(v)
	}
	return &Box{dim: int(n[0]), lo: n[1], hi: n[2], denom: n[3], seed: seed, integer: n[3] == 1}, nil
}

// schwartzZippel turns degree=d on a sampled identity into the statement
// it licenses: a non-zero polynomial of total degree <= d vanishes at a
// uniformly random point of S^n with probability at most d/|S|
// (Schwartz 1980, Zippel 1979), so N independent zero samples leave a
// false identity a chance of at most (d/|S|)^N.
func schwartzZippel(over, degree py.Object) (func(n int64) string, error) {
	if degree == nil || degree == py.None {
		return nil, nil
	}
	d, err := intArg("identity", "degree", degree, 0)
	if err != nil || d < 1 {
		return nil, py.ExceptionNewf(py.ValueError, "identity(): degree must be a positive integer (the total degree of lhs - rhs)")
	}
	b, ok := over.(*Box)
	if !ok || !b.integer {
		return nil, py.ExceptionNewf(py.TypeError, "identity(): degree= needs over=box(dim, lo, hi) with integer points (denom=1), so the sample set S is known")
	}
	size := b.hi - b.lo + 1
	return func(n int64) string {
		if d >= size {
			return fmt.Sprintf("Schwartz–Zippel gives nothing here: degree %d is not below |S| = %d", d, size)
		}
		log10 := float64(n) * math.Log10(float64(d)/float64(size))
		return fmt.Sprintf("Schwartz–Zippel: a false polynomial identity of degree <= %d passes %d independent samples from {%d..%d}^%d with probability at most (%d/%d)^%d = 10^%.1f", d, n, b.lo, b.hi, b.dim, d, size, n, log10)
	}, nil
}

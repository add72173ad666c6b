package values

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"

	"github.com/go-python/gpython/py"

	"assay/kernel/interp"
)

// Box is a family of random rational points: box(dim, lo, hi, denom=1,
// seed=None) is called with a sample index k and gives point k. The same
// seed and k always give the same point.
type Box struct {
	Dim    int
	Lo, Hi int64
	Denom  int64
	seed   uint64
	env    *Env
}

// BoxType is the Python type of Box.
var BoxType = py.NewType("box", "A family of random rational points: box(dim, lo, hi, denom=1, seed=None); call it with k for point k.")

// Type returns BoxType.
func (b *Box) Type() *py.Type { return BoxType }

// Integer reports whether the points are those of the grid {lo, …, hi}^dim.
func (b *Box) Integer() bool { return b.Denom == 1 }

// M__call__ gives point k: dim rationals p/q with lo <= p/q <= hi, 1 <= q <= denom.
func (b *Box) M__call__(args py.Tuple, kw py.StringDict) (py.Object, error) {
	return interp.Guard("box", func() (py.Object, error) {
		a, err := interp.Bind("box", args, kw, "k")
		if err != nil {
			return nil, err
		}
		k, err := a.Int("k", 0)
		if err != nil || k < 0 {
			return nil, py.ExceptionNewf(py.ValueError, "a box family takes a sample index k >= 0")
		}
		r := rand.New(rand.NewPCG(b.seed, uint64(k)))
		point := make([]py.Object, b.Dim)
		for i := range point {
			q := r.Int64N(b.Denom) + 1
			// p/q in [lo, hi]: p in [lo*q, hi*q]
			p := b.Lo*q + r.Int64N((b.Hi-b.Lo)*q+1)
			point[i] = b.env.Rational(big.NewRat(p, q))
		}
		return py.NewListFromItems(point), nil
	})
}

// M__repr__ describes the family.
func (b *Box) M__repr__() (res py.Object, err error) {
	defer interp.Recover("box.__repr__", &res, &err)
	return py.String(fmt.Sprintf("box(%d, %d, %d, denom=%d)", b.Dim, b.Lo, b.Hi, b.Denom)), nil
}

func (e *Env) boxBuiltins(b py.StringDict) {
	setBuiltins(b, []builtin{
		{"box", params("dim", "lo", "hi", "denom=", "seed="), "box(dim, lo, hi, denom=1, seed=None) -> a family of random rational points; g(k) gives point k", e.box},
	})
}

func (e *Env) box(a interp.Args) (py.Object, error) {
	var n [4]int64
	for i, spec := range []struct {
		name string
		def  int64
	}{{"dim", 0}, {"lo", 0}, {"hi", 0}, {"denom", 1}} {
		var err error
		if n[i], err = a.Int(spec.name, spec.def); err != nil {
			return nil, err
		}
	}
	if n[0] < 1 || n[0] > 1024 || n[1] > n[2] || n[3] < 1 || n[2]-n[1] > math.MaxInt32 || n[3] > math.MaxInt32 {
		return nil, py.ExceptionNewf(py.ValueError, "box(dim, lo, hi, denom=1) needs 1 <= dim <= 1024, lo <= hi (a range below 2^31) and denom >= 1")
	}
	seed := uint64(e.seed)<<20 ^ uint64(e.cell)
	if a.Given("seed") {
		v, err := a.Int("seed", 0)
		if err != nil {
			return nil, err
		}
		seed = uint64(v)
	}
	return &Box{Dim: int(n[0]), Lo: n[1], Hi: n[2], Denom: n[3], seed: seed, env: e}, nil
}

package kernel

import (
	"fmt"
	"math/big"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
)

const identityDoc = `identity(name, lhs, rhs) checks lhs == rhs exactly.
identity(name, f) calls f() for (lhs, rhs).
identity(name, f, over=g, samples=N) checks f(g(k)) for k = 0..N-1.`

const exactMethod = "exact rational arithmetic"

// residual is lhs - rhs measured exactly.
type residual struct {
	text string   // printed residual
	size *big.Rat // its largest absolute entry; zero iff the sides agree
}

// measure computes the exact residual of two sides: numbers, matrices, or
// lists and tuples of them. Floats are refused: they would make "holds"
// a statement about rounding.
func measure(lhs, rhs py.Object) (residual, error) {
	if x, ok := exactOf(lhs); ok {
		y, ok := exactOf(rhs)
		if !ok {
			return residual{}, sideError(rhs)
		}
		d := new(big.Rat).Sub(x, y)
		return residual{text: exact.FormatRat(d), size: new(big.Rat).Abs(d)}, nil
	}
	if a, ok := lhs.(*Matrix); ok {
		b, ok := rhs.(*Matrix)
		if !ok {
			return residual{}, py.ExceptionNewf(py.TypeError, "one side is a matrix and the other is %s", typeName(rhs))
		}
		d, err := a.m.Sub(b.m)
		if err != nil {
			return residual{}, wrapErr(err)
		}
		size := new(big.Rat)
		for i := 0; i < d.Rows(); i++ {
			for j := 0; j < d.Cols(); j++ {
				if e := new(big.Rat).Abs(d.At(i, j)); e.Cmp(size) > 0 {
					size = e
				}
			}
		}
		text := "0"
		if size.Sign() != 0 {
			text = "difference " + d.String()
			if d.Rows()*d.Cols() > 16 {
				text = "largest entry of the difference: " + exact.FormatRat(size)
			}
		}
		return residual{text: text, size: size}, nil
	}
	ls, lok := listLike(lhs)
	rs, rok := listLike(rhs)
	if lok && rok {
		if len(ls) != len(rs) {
			return residual{}, py.ExceptionNewf(py.ValueError, "the sides have different lengths: %d and %d", len(ls), len(rs))
		}
		worst := residual{text: "0", size: new(big.Rat)}
		for i := range ls {
			r, err := measure(ls[i], rs[i])
			if err != nil {
				return residual{}, err
			}
			if r.size.Cmp(worst.size) > 0 {
				worst = residual{text: fmt.Sprintf("entry %d: %s", i, r.text), size: r.size}
			}
		}
		return worst, nil
	}
	return residual{}, sideError(lhs)
}

func listLike(o py.Object) ([]py.Object, bool) {
	switch x := o.(type) {
	case *py.List:
		return x.Items, true
	case py.Tuple:
		return x, true
	}
	return nil, false
}

func sideError(o py.Object) error {
	if _, ok := o.(py.Float); ok {
		return py.ExceptionNewf(py.TypeError, "a side of the identity is a float64 (%s), which cannot be checked exactly; build it from ints and frac(...) instead (int / int is already exact in assay)", str(o))
	}
	return py.ExceptionNewf(py.TypeError, "a side of the identity is %s; claims compare exact numbers, matrices, or lists and tuples of them", typeName(o))
}

// pair unpacks the (lhs, rhs) returned by a claim's function.
func pair(o py.Object, what string) (py.Object, py.Object, error) {
	t, ok := listLike(o)
	if !ok || len(t) != 2 {
		return nil, nil, py.ExceptionNewf(py.TypeError, "%s must return a pair (lhs, rhs), got %s", what, typeName(o))
	}
	return t[0], t[1], nil
}

func (s *Session) identity(line int, args py.Tuple, kw py.StringDict) (py.Object, error) {
	start := time.Now()
	a, err := bind("identity", args, kw, []string{"name", "lhs", "rhs", "over", "samples"}, 2)
	if err != nil {
		return nil, err
	}
	name, err := stringArg("identity", "name", a[0])
	if err != nil {
		return nil, err
	}
	if prev, dup := s.claimAt[name]; dup {
		return nil, py.ExceptionNewf(py.ValueError, "claim name %q is already used at line %d; give each claim its own name", name, prev)
	}
	c := cells.Claim{Name: name, Kind: "identity", Method: exactMethod, Seed: s.seed, Cell: s.cell, Line: line}
	switch {
	case a[3] != nil: // sampled form
		if a[2] != nil {
			return nil, py.ExceptionNewf(py.TypeError, "identity(name, f, over=g, samples=N) takes no rhs")
		}
		if err := s.sampled(&c, a[1], a[3], a[4]); err != nil {
			return nil, err
		}
	default:
		if a[4] != nil {
			return nil, py.ExceptionNewf(py.TypeError, "identity(): samples= needs over= (the function making sample k)")
		}
		lhs, rhs := a[1], a[2]
		if rhs == nil {
			if !callable(lhs) {
				return nil, py.ExceptionNewf(py.TypeError, "identity(name, lhs, rhs) is missing rhs (or pass a function returning (lhs, rhs))")
			}
			res, err := py.Call(lhs, nil, nil)
			if err != nil {
				return nil, err
			}
			if lhs, rhs, err = pair(res, "the identity's function"); err != nil {
				return nil, err
			}
		}
		r, err := measure(lhs, rhs)
		if err != nil {
			return nil, err
		}
		c.Residual = r.text
		if r.size.Sign() == 0 {
			c.Verdict = cells.Holds
			c.Note = "exact zero residual: a proof for this instance"
		} else {
			c.Verdict = cells.Fails
			c.Note = "exact non-zero residual"
		}
	}
	c.Seconds = time.Since(start).Seconds()
	s.claimAt[name] = line
	s.outcome.Claims = append(s.outcome.Claims, c)
	return py.NewBool(c.Verdict == cells.Holds), nil
}

// maxSamples bounds a sweep so a typo cannot run for hours.
const maxSamples = 10_000_000

func (s *Session) sampled(c *cells.Claim, f, over, samples py.Object) error {
	if !callable(f) || !callable(over) {
		return py.ExceptionNewf(py.TypeError, "identity(name, f, over=g, samples=N) needs functions f and g")
	}
	n, err := intArg("identity", "samples", samples, 100)
	if err != nil {
		return err
	}
	if n < 1 || n > maxSamples {
		return py.ExceptionNewf(py.ValueError, "identity(): samples must be between 1 and %d, got %d", maxSamples, n)
	}
	worst := residual{text: "0", size: new(big.Rat)}
	worstK, failing := int64(-1), 0
	var worstSample py.Object
	for k := int64(0); k < n; k++ {
		sample, err := py.Call(over, py.Tuple{py.Int(k)}, nil)
		if err != nil {
			return err
		}
		res, err := py.Call(f, py.Tuple{sample}, nil)
		if err != nil {
			return err
		}
		lhs, rhs, err := pair(res, fmt.Sprintf("f(sample %d)", k))
		if err != nil {
			return err
		}
		r, err := measure(lhs, rhs)
		if err != nil {
			return py.ExceptionNewf(py.TypeError, "sample %d: %v", k, err)
		}
		if r.size.Sign() != 0 {
			failing++
		}
		if worstK < 0 || r.size.Cmp(worst.size) > 0 {
			worst, worstK, worstSample = r, k, sample
		}
	}
	c.Samples = int(n)
	c.Residual = worst.text
	if failing == 0 {
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("exact zero residual on all %d samples: each instance is proved; for the general statement this is evidence, not a proof", n)
		return nil
	}
	c.Verdict = cells.Fails
	c.Worst = fmt.Sprintf("sample %d: %s", worstK, clip(str(worstSample), 200))
	c.Note = fmt.Sprintf("%d of %d samples have a non-zero residual; the largest is shown", failing, n)
	return nil
}

// clip shortens s to at most n runes.
func clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

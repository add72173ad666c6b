package kernel

import (
	"fmt"
	"math/big"
	"strings"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
)

const identityDoc = `identity(name, lhs, rhs) checks lhs == rhs exactly.
identity(name, f) calls f() for (lhs, rhs).
identity(name, f, over=g, samples=N) checks f(g(k)) for k = 0..N-1.`

// Methods as the report names them.
const (
	exactMethod = "exact rational arithmetic"
	polyMethod  = "exact polynomial arithmetic (expanded)"
)

// residual is lhs - rhs measured exactly.
type residual struct {
	text     string   // printed residual
	size     *big.Rat // its largest absolute entry (term count for polynomials); zero iff the sides agree
	symbolic bool     // a polynomial difference: zero proves the identity for all values
}

// measure computes the exact residual of two sides: numbers, polynomials,
// matrices, or lists and tuples of them. Floats are refused: they would make
// "holds" a statement about rounding.
func measure(ring *exact.Ring, lhs, rhs py.Object) (residual, error) {
	_, lp := lhs.(*Polynomial)
	_, rp := rhs.(*Polynomial)
	if x, ok := exactOf(lhs); ok && !rp {
		y, ok := exactOf(rhs)
		if !ok {
			return residual{}, sideError(rhs)
		}
		d := new(big.Rat).Sub(x, y)
		return residual{text: exact.FormatRat(d), size: new(big.Rat).Abs(d)}, nil
	}
	if lp || rp {
		a, ok1 := polyOf(ring, lhs)
		b, ok2 := polyOf(ring, rhs)
		if !ok1 {
			return residual{}, sideError(lhs)
		}
		if !ok2 {
			return residual{}, sideError(rhs)
		}
		d := a.Sub(b)
		return residual{text: preview(d), size: big.NewRat(int64(d.Len()), 1), symbolic: true}, nil
	}
	if a, ok := lhs.(*Matrix); ok {
		b, ok := rhs.(*Matrix)
		if !ok {
			return residual{}, py.ExceptionNewf(py.TypeError, "one side is a matrix and the other is %s", typeName(rhs))
		}
		return matrixResidual(a, b)
	}
	ls, lok := listLike(lhs)
	rs, rok := listLike(rhs)
	if lok && rok {
		if len(ls) != len(rs) {
			return residual{}, py.ExceptionNewf(py.ValueError, "the sides have different lengths: %d and %d", len(ls), len(rs))
		}
		worst := residual{text: "0", size: new(big.Rat)}
		for i := range ls {
			r, err := measure(ring, ls[i], rs[i])
			if err != nil {
				return residual{}, err
			}
			worst.symbolic = worst.symbolic || r.symbolic
			if r.size.Cmp(worst.size) > 0 {
				worst = residual{text: fmt.Sprintf("entry %d: %s", i, r.text), size: r.size, symbolic: worst.symbolic}
			}
		}
		return worst, nil
	}
	return residual{}, sideError(lhs)
}

// matrixResidual compares two matrices entry by entry.
func matrixResidual(a, b *Matrix) (residual, error) {
	if a.q != nil && b.q != nil {
		d, err := a.q.Sub(b.q)
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
	d, err := a.lifted().Sub(b.lifted())
	if err != nil {
		return residual{}, wrapErr(err)
	}
	for i := 0; i < d.Rows(); i++ {
		for j := 0; j < d.Cols(); j++ {
			if e := d.At(i, j); !e.IsZero() {
				return residual{text: fmt.Sprintf("entry [%d, %d] of the difference: %s", i, j, preview(e)), size: big.NewRat(int64(e.Len()), 1), symbolic: true}, nil
			}
		}
	}
	return residual{text: "0", size: new(big.Rat), symbolic: true}, nil
}

// preview prints a polynomial, or its first terms and the count when long.
func preview(p *exact.Poly) string {
	const shown = 6
	s := p.String()
	if p.Len() <= shown+2 {
		return s
	}
	// Terms are separated by " + " and " - " at the top level of the text.
	seps := 0
	for i := 0; i+3 <= len(s); i++ {
		if s[i] == ' ' && (s[i+1] == '+' || s[i+1] == '-') && s[i+2] == ' ' {
			if seps++; seps == shown {
				return fmt.Sprintf("%s + … (%d terms in all)", s[:i], p.Len())
			}
		}
	}
	return s
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
	return py.ExceptionNewf(py.TypeError, "a side of the identity is %s; claims compare exact numbers, polynomials, matrices, or lists and tuples of them", typeName(o))
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
	c, err := s.newClaim("identity", a[0], line)
	if err != nil {
		return nil, err
	}
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
		r, err := measure(s.ring, lhs, rhs)
		if err != nil {
			return nil, err
		}
		c.Residual = r.text
		switch {
		case r.symbolic && r.size.Sign() == 0:
			c.Verdict, c.Method = cells.Holds, polyMethod
			c.Note = "the expanded difference is the zero polynomial: a proof of the identity for all values of the variables"
		case r.symbolic:
			c.Verdict, c.Method = cells.Fails, polyMethod
			c.Note = "the expanded difference is a non-zero polynomial"
		case r.size.Sign() == 0:
			c.Verdict = cells.Holds
			c.Note = "exact zero residual: a proof for this instance"
		default:
			c.Verdict = cells.Fails
			c.Note = "exact non-zero residual"
		}
	}
	return s.record(c, start), nil
}

// newClaim starts the record of a claim, checking that its name is new.
func (s *Session) newClaim(kind string, name py.Object, line int) (cells.Claim, error) {
	n, err := stringArg(kind, "name", name)
	if err != nil {
		return cells.Claim{}, err
	}
	if prev, dup := s.claimAt[n]; dup {
		return cells.Claim{}, py.ExceptionNewf(py.ValueError, "claim name %q is already used at line %d; give each claim its own name", n, prev)
	}
	return cells.Claim{Name: n, Kind: kind, Method: exactMethod, Seed: s.seed, Cell: s.cell, Line: line}, nil
}

// record files a decided claim with the cell and returns whether it holds.
func (s *Session) record(c cells.Claim, start time.Time) py.Object {
	c.Seconds = time.Since(start).Seconds()
	s.claimAt[c.Name] = c.Line
	s.outcome.Claims = append(s.outcome.Claims, c)
	return py.NewBool(c.Verdict == cells.Holds)
}

const factorizationDoc = `factorization(name, p, [f1, f2, ...]) checks p == u * f1 * f2 * ... for
a rational unit u that the check finds; a factor may be given as (f, k) for f**k.`

func (s *Session) factorization(line int, args py.Tuple, kw py.StringDict) (py.Object, error) {
	start := time.Now()
	a, err := bind("factorization", args, kw, []string{"name", "p", "factors"}, 3)
	if err != nil {
		return nil, err
	}
	c, err := s.newClaim("factorization", a[0], line)
	if err != nil {
		return nil, err
	}
	p, ok := polyOf(s.ring, a[1])
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "factorization(): p must be a polynomial or an exact number, got %s%s", typeName(a[1]), floatHint(a[1]))
	}
	items, err := sequence(a[2], "the factors")
	if err != nil {
		return nil, err
	}
	product := s.ring.Const(big.NewRat(1, 1))
	var degrees []string
	for i, it := range items {
		f, k := it, int64(1)
		if pair, ok := it.(py.Tuple); ok && len(pair) == 2 {
			f = pair[0]
			if k, err = intArg("factorization", "a factor's exponent", pair[1], 1); err != nil || k < 1 || k > maxExponent {
				return nil, py.ExceptionNewf(py.ValueError, "factor %d: the exponent in (f, k) must be a positive integer", i)
			}
		}
		fp, ok := polyOf(s.ring, f)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "factor %d is %s, not a polynomial%s", i, typeName(f), floatHint(f))
		}
		if k > 1 {
			if fp, err = fp.Pow(int(k)); err != nil {
				return nil, polyErr(err)
			}
			degrees = append(degrees, fmt.Sprintf("%d (to the power %d)", fp.Degree()/int(k), k))
		} else {
			degrees = append(degrees, fmt.Sprint(fp.Degree()))
		}
		if product, err = product.Mul(fp); err != nil {
			return nil, polyErr(err)
		}
	}
	c.Method = polyMethod
	unit := big.NewRat(1, 1)
	if !p.IsZero() && !product.IsZero() {
		unit = new(big.Rat).Quo(p.LeadingCoefficient(), product.LeadingCoefficient())
	}
	diff := p.Sub(product.Scale(unit))
	c.Residual = preview(diff)
	factors := fmt.Sprintf("%d factors of degree %s", len(items), strings.Join(degrees, ", "))
	if diff.IsZero() {
		c.Verdict = cells.Holds
		c.Note = fmt.Sprintf("p = u · (product of the factors) with u = %s exactly (%s): a proof of the factorization", exact.FormatRat(unit), factors)
	} else {
		c.Verdict = cells.Fails
		c.Note = fmt.Sprintf("p − u · (product of the factors) is not zero for u = %s, the ratio of leading coefficients (%s)", exact.FormatRat(unit), factors)
	}
	return s.record(c, start), nil
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
		r, err := measure(s.ring, lhs, rhs)
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

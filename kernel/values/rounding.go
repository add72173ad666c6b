package values

import (
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// The input-rounding run of the float64 audit: the claim's function runs
// a third time, exactly, but every exact input is first replaced by the
// exact value of its nearest float64. Its sides, against the exact ones,
// are what rounding the inputs alone costs — the condition of the problem
// — apart from what the float64 evaluation adds.
//
// It mirrors float64 code step by step: where float64 code turns an exact
// value into a float (an operator, a function, a matrix method), this run
// rounds the value instead and then computes exactly; what it computes is
// marked rounded, as float64 code would hold a float, and is not rounded
// again. Values it does not touch stay exact and unmarked, as in float64
// code, and are rounded where they are next used.

// InRounding runs f as the input-rounding run.
func (e *Env) InRounding(f func() error) error {
	e.Rounding = true
	defer func() { e.Rounding = false }()
	return f()
}

// roundRat is the exact value of the float64 nearest q.
func roundRat(q *big.Rat) *big.Rat {
	f, _ := q.Float64()
	r, err := exact.RatFromFloat(f)
	if err != nil { // beyond float64's range: float64 code would hold an infinity
		return new(big.Rat).Set(q)
	}
	return r
}

// RoundIn is the value float64 code would start from: an exact number,
// real or matrix not yet rounded becomes its nearest float64 (entrywise),
// marked rounded; a marked value stays; lists and tuples go entry by entry;
// ints stay, as they do in float64 code.
func (e *Env) RoundIn(o py.Object) (py.Object, error) {
	switch x := o.(type) {
	case *Rational:
		if x.rounded {
			return x, nil
		}
		return &Rational{v: roundRat(x.v), env: e, rounded: true}, nil
	case *Real:
		if x.rounded {
			return x, nil
		}
		f, err := x.float64()
		if err != nil {
			return nil, err
		}
		q, err := exact.RatFromFloat(f)
		if err != nil {
			return nil, err
		}
		return &Rational{v: q, env: e, rounded: true}, nil
	case *Matrix:
		if x.rounded {
			return x, nil
		}
		if x.q == nil {
			return nil, NoCompanion("a matrix with polynomial entries")
		}
		rows := make([][]*big.Rat, x.q.Rows())
		for i := range rows {
			rows[i] = make([]*big.Rat, x.q.Cols())
			for j := range rows[i] {
				rows[i][j] = roundRat(x.q.At(i, j))
			}
		}
		q, err := exact.NewMatrix(rows)
		if err != nil {
			return nil, err
		}
		return &Matrix{q: q, env: e, rounded: true}, nil
	case *Polynomial:
		return nil, NoCompanion("a polynomial")
	case *RationalFunction:
		return nil, NoCompanion("a rational function")
	case *Simplex, *KVector:
		return nil, NoCompanion("a " + o.Type().Name)
	case *py.List:
		items, err := e.roundAll(x.Items)
		return py.NewListFromItems(items), err
	case py.Tuple:
		items, err := e.roundAll(x)
		return py.Tuple(items), err
	}
	return o, nil
}

func (e *Env) roundAll(items []py.Object) ([]py.Object, error) {
	out := make([]py.Object, len(items))
	for i, it := range items {
		var err error
		if out[i], err = e.RoundIn(it); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// marked marks what the input-rounding run computed, as float64 code would
// hold floats: numbers, reals and matrices, in lists and tuples too.
func marked(o py.Object) py.Object {
	switch x := o.(type) {
	case *Rational:
		return &Rational{v: x.v, env: x.env, rounded: true}
	case *Real:
		return &Real{x: x.x, env: x.env, rounded: true}
	case *Matrix:
		return &Matrix{q: x.q, p: x.p, env: x.env, rounded: true}
	case *py.List:
		return py.NewListFromItems(markAll(x.Items))
	case py.Tuple:
		return py.Tuple(markAll(x))
	}
	return o
}

func markAll(items []py.Object) []py.Object {
	out := make([]py.Object, len(items))
	for i, it := range items {
		out[i] = marked(it)
	}
	return out
}

// rounding computes op exactly on the rounded operands and marks its
// result. Rounding is off while op runs, so op may call the exact
// operation it stands in for.
func (e *Env) rounding(op func(xs []py.Object) (py.Object, error), operands ...py.Object) (py.Object, error) {
	xs, err := e.roundAll(operands)
	if err != nil {
		return nil, err
	}
	res, err := e.exactly(func() (py.Object, error) { return op(xs) })
	if err != nil || res == py.NotImplemented {
		return res, err
	}
	return marked(res), nil
}

// exactly runs f with Rounding off, and on again after, even if f panics.
func (e *Env) exactly(f func() (py.Object, error)) (py.Object, error) {
	e.Rounding = false
	defer func() { e.Rounding = true }()
	return f()
}

// roundingQuotient is a / b in the input-rounding run: between ints, the
// nearest float64 of the quotient, an input as float64 code's int / int
// is; else the exact quotient of the rounded operands.
func (e *Env) roundingQuotient(a, b py.Object) (py.Object, bool, error) {
	_, r1 := a.(*Rational)
	_, r2 := b.(*Rational)
	res, err := e.rounding(func(xs []py.Object) (py.Object, error) {
		x, _ := ExactOf(xs[0])
		y, _ := ExactOf(xs[1])
		q, err := quotient(x, y)
		if err != nil {
			return nil, err
		}
		if !r1 && !r2 {
			q = roundRat(q)
		}
		return e.Rational(q), nil
	}, a, b)
	return res, true, err
}

// swapped is the operands a, b of an operator, in the order it applies
// them.
func swapped(a, b py.Object, swap bool) []py.Object {
	if swap {
		return []py.Object{b, a}
	}
	return []py.Object{a, b}
}

// roundingBuiltin runs a builtin exactly on its rounded arguments and
// marks the result (the input-rounding run).
func (e *Env) roundingBuiltin(fn func(interp.Args) (py.Object, error), a interp.Args) (py.Object, error) {
	rounded, err := a.Map(e.RoundIn)
	if err != nil {
		return nil, err
	}
	return e.rounding(func([]py.Object) (py.Object, error) { return fn(rounded) })
}

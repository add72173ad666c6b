package values

// Factoring polynomials: factor(p) and the value it returns,
// p.squarefree(), p.is_irreducible().

import (
	"errors"
	"fmt"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// Factor factors p over Q, in any number of variables, telling Env.Stage
// the stage it is in; an error names the stage it stopped in.
func (e *Env) Factor(p *exact.Poly) (*exact.Factorization, error) {
	last := ""
	f, err := p.FactorStages(func(s string) {
		if s != "" {
			last = s
		}
		if e.Stage != nil {
			e.Stage(s)
		}
	})
	if err != nil && last != "" && !errors.Is(err, exact.ErrFactorLimit) { // that one names its stage
		err = fmt.Errorf("factor() stopped while %s: %w", last, err)
	}
	return f, err
}

// Factored is what factor(p) returns: p = u·f1^k1·…, printed as that
// product, and unpacked, indexed and compared as the pair
// (u, [(f1, k1), …]).
type Factored struct {
	f   *exact.Factorization
	env *Env
}

// FactoredType is the Python type of Factored.
var FactoredType = py.NewType("factored", "The factorization factor(p) returns: prints as the product; u, fs = factor(p) gives the unit u and the list fs of (factor, multiplicity).")

// Type returns FactoredType.
func (f *Factored) Type() *py.Type { return FactoredType }

// Value is the factorization.
func (f *Factored) Value() *exact.Factorization { return f.f }

// Pair is the factorization as the tuple (u, [(f1, k1), ...]).
func (f *Factored) Pair() py.Tuple {
	return py.Tuple{f.env.Rational(f.f.Unit), f.env.factorPairs(f.f.Factors)}
}

// M__str__ is the product, e.g. -(a - b - c)·(a + b + c).
func (f *Factored) M__str__() (py.Object, error) { return py.String(f.f.String()), nil }

// M__repr__ is the same as str.
func (f *Factored) M__repr__() (py.Object, error) { return f.M__str__() }

// M__len__ is 2: the unit and the list of factors.
func (f *Factored) M__len__() (py.Object, error) { return py.Int(2), nil }

// M__iter__ yields the unit, then the list of factors.
func (f *Factored) M__iter__() (py.Object, error) { return f.Pair().M__iter__() }

// M__getitem__ is [0] the unit, [1] the list of factors.
func (f *Factored) M__getitem__(key py.Object) (res py.Object, err error) {
	defer interp.Recover("factored.__getitem__", &res, &err)
	return f.Pair().M__getitem__(key)
}

// M__eq__ compares as the pair, with a pair or another factorization.
func (f *Factored) M__eq__(o py.Object) (res py.Object, err error) {
	defer interp.Recover("factored.__eq__", &res, &err)
	if g, ok := o.(*Factored); ok {
		o = g.Pair()
	}
	if _, ok := o.(py.Tuple); !ok {
		return py.NotImplemented, nil
	}
	return py.Eq(f.Pair(), o)
}

// M__ne__ is the negation of M__eq__.
func (f *Factored) M__ne__(o py.Object) (py.Object, error) {
	eq, err := f.M__eq__(o)
	if err != nil || eq == py.NotImplemented {
		return eq, err
	}
	return py.Not(eq)
}

// factorPairs gives factors as the notebook list [(f1, k1), (f2, k2), ...].
func (e *Env) factorPairs(fs []exact.FactorPower) py.Object {
	out := make([]py.Object, len(fs))
	for i, f := range fs {
		out[i] = py.Tuple{e.Polynomial(f.Factor), py.Int(f.Mult)}
	}
	return py.NewListFromItems(out)
}

func (e *Env) factor(a interp.Args) (py.Object, error) {
	p, ok := e.Poly(a.Get("p"))
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "factor() needs a polynomial or an exact number, got %s%s", interp.TypeName(a.Get("p")), FloatHint(a.Get("p")))
	}
	f, err := e.Factor(p)
	if err != nil {
		return nil, err
	}
	return &Factored{f: f, env: e}, nil
}

func (p *Polynomial) squarefree(interp.Args) (py.Object, error) {
	_, parts, err := p.p.SquareFree()
	if err != nil {
		return nil, err
	}
	return p.env.factorPairs(parts), nil
}

func (p *Polynomial) isIrreducible(interp.Args) (py.Object, error) {
	if p.p.Degree() < 1 {
		return py.False, nil
	}
	f, err := p.env.Factor(p.p)
	if err != nil {
		return nil, err
	}
	return py.NewBool(len(f.Factors) == 1 && f.Factors[0].Mult == 1), nil
}

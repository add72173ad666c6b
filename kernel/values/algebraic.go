package values

import (
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// The algebraic side of a real: its minimal polynomial and degree
// (exact.Real.MinimalPolynomial), and its closed form (exact.Real.ClosedForm).

func init() {
	setMethods(RealType, []method[*Real]{
		{"minimal_polynomial", params("variable"), "x.minimal_polynomial(\"t\") -> the minimal polynomial of x over Q in t: irreducible, coprime integer coefficients, positive leading coefficient (x built from rationals by + - * /, powers, sqrt and root)", (*Real).minimalPolynomial},
		{"degree", nil, "x.degree() -> the degree of x over Q, the degree of its minimal polynomial", (*Real).degree},
	})
}

// minimal returns the minimal polynomial's coefficients, constant first.
func (r *Real) minimal() ([]*big.Int, error) {
	if r.env.Float || r.env.Rounding {
		return nil, py.ExceptionNewf(py.NotImplementedError, "a minimal polynomial has no float64 companion")
	}
	return r.x.MinimalPolynomial(r.env.MaxDegree, r.env.Cap)
}

func (r *Real) minimalPolynomial(a interp.Args) (py.Object, error) {
	t, err := r.env.namedVariable("minimal_polynomial", a.Get("variable"))
	if err != nil {
		return nil, err
	}
	c, err := r.minimal()
	if err != nil {
		return nil, err
	}
	p := r.env.Ring.Const(nil)
	for i := len(c) - 1; i >= 0; i-- {
		// Horner: p·t + c_i.
		if p, err = p.Mul(t); err != nil {
			return nil, err
		}
		p = p.Add(r.env.Ring.Const(new(big.Rat).SetInt(c[i])))
	}
	return r.env.Polynomial(p), nil
}

func (r *Real) degree(interp.Args) (py.Object, error) {
	c, err := r.minimal()
	if err != nil {
		return nil, err
	}
	return py.Int(len(c) - 1), nil
}

// closedForm is r's exact closed form, when it has a short one.
func (r *Real) closedForm() (string, bool) {
	if r.rounded {
		return "", false
	}
	return r.x.ClosedForm(exact.ClosedFormMaxLen)
}

// Show is what show(x) writes: the closed form, when x has a short one
// with a root in it, then "≈" and 20 certified digits; otherwise what str
// prints.
func (r *Real) Show() (string, error) {
	s, err := r.M__str__()
	if err != nil {
		return "", err
	}
	text := string(s.(py.String))
	if form, ok := r.closedForm(); ok && form == text && strings.ContainsRune(form, '(') {
		if d, err := r.x.Text(printedDigits, min(r.env.Cap, 8192)); err == nil {
			return form + " ≈ " + d, nil
		}
	}
	return text, nil
}

package values

// latex(x): the LaTeX of an exact value (exact/latex.go does the writing).

import (
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/exact"
)

// LaTeX is x in LaTeX, for latex(x) and show(x, latex=True): rationals,
// integers, reals (the closed form when there is a short one, else the
// certified digits str prints), polynomials, rational functions, matrices
// and factorizations. Anything else is a TypeError naming its type.
func LaTeX(x py.Object) (string, error) {
	switch v := x.(type) {
	case py.Bool:
		// bool is an int in Python, but True is no number to typeset.
	case py.Int:
		return exact.LaTeXRat(new(big.Rat).SetInt64(int64(v))), nil
	case *py.BigInt:
		return (*big.Int)(v).String(), nil
	case *Rational:
		return exact.LaTeXRat(v.v), nil
	case *Real:
		return v.LaTeX()
	case *Polynomial:
		return v.p.LaTeX(), nil
	case *RationalFunction:
		return v.f.LaTeX(), nil
	case *Factored:
		return v.f.LaTeX(), nil
	case *Matrix:
		return v.LaTeX(), nil
	case Infinity, *Infinity:
		return `\infty`, nil
	}
	return "", py.ExceptionNewf(py.TypeError, "latex() takes an exact value (integer, rational, real, polynomial, rational function, matrix, factorization), not %s", x.Type().Name)
}

// LaTeX is r's closed form in LaTeX when it has a short one (exactly
// equal) in radicals, else the digits str prints (a root named by its
// isolating interval included), truncated ones marked by \ldots
// (exact.Real.LaTeXText).
func (r *Real) LaTeX() (string, error) {
	digits, err := r.x.LaTeXText(printedDigits, min(r.env.Cap, 8192))
	if err != nil {
		return "", err
	}
	if form, ok := r.closedForm(); ok && exact.ClosedFormIsCode(form) {
		return exact.ClosedFormLaTeX(form)
	}
	return digits, nil
}

// LaTeX is the matrix as a pmatrix.
func (m *Matrix) LaTeX() string {
	switch {
	case m.q != nil:
		return exact.LaTeXMatrix(m.q.Rows(), m.q.Cols(), func(i, j int) string { return exact.LaTeXRat(m.q.At(i, j)) })
	case m.p != nil:
		return exact.LaTeXMatrix(m.p.Rows(), m.p.Cols(), func(i, j int) string { return m.p.At(i, j).LaTeX() })
	}
	return exact.LaTeXMatrix(m.f.Rows(), m.f.Cols(), func(i, j int) string { return m.f.At(i, j).LaTeX() })
}

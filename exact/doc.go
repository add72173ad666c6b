// Package exact owns assay's number systems and their algebra: exact
// rationals (math/big.Rat) and dense matrices over the rationals, with
// determinants, rank, inverses, linear solves and null spaces computed
// without rounding.
//
// It also offers float64 companions built on gonum (Matrix.Float, FloatDet,
// FloatSolve) so that callers can show where floating point and exact
// arithmetic part ways.
//
// Sparse multivariate polynomials over Q (Poly, made in a Ring of variable
// names) add, multiply, divide exactly or with remainder, and give gcds,
// resultants and discriminants, all exactly, with the further sentinel
// errors ErrTooManyTerms, ErrExponentRange, ErrRingMismatch and ErrDegree;
// the representation and its measurements are described at the top of
// poly.go. Matrices over them (PolyMatrix) give expanded determinants.
//
// Certified reals (Real) are lazily evaluated expressions — square and k-th
// roots, exp, log, sin, cos, atan2, acos, pi — whose enclosures (Interval,
// exact rational endpoints) always contain the value and shrink as the
// precision grows; Sign, Digits and Approx refine until certain or until a
// precision cap, failing with ErrUndecided, ErrDomain or ErrOverflow.
//
// The package is pure algebra: it knows nothing of Python, notebook cells or
// reports. Failures are reported with the sentinel errors ErrDivisionByZero,
// ErrNotSquare, ErrSingular, ErrShape, ErrSyntax and ErrNotFinite, wrapped with
// context; test for them with errors.Is.
package exact

// Package exact is assay's exact arithmetic: rationals, dense matrices over
// the rationals, sparse multivariate polynomials over the rationals and
// matrices of them, certified real numbers, and float64 companions to set
// beside the exact results. It is pure algebra: it knows nothing of Python,
// notebook cells or reports.
//
// # Rationals and matrices
//
// Rationals are math/big.Rat values, read exactly from decimal or
// fractional text (ParseRat), from float64 (RatFromFloat) and written back
// (FormatRat). Matrix is a dense matrix over Q with determinants (Det:
// fraction-free elimination for small orders, a multi-modular method with
// Chinese remaindering for larger ones; det.go records the measurements),
// rank, inverses, linear solves, null spaces, minors and powers, all
// computed without rounding.
//
// # Polynomials
//
// Poly is a sparse multivariate polynomial over Q in the variables of a
// Ring, which also holds a term cap (--max-terms). Polynomials add,
// multiply, raise to powers, divide exactly or with remainder, substitute
// and differentiate, and give gcds, resultants and discriminants, all
// exactly; Ring.Parse reads them from text. PolyMatrix is a matrix of
// polynomials of one ring with expanded determinants and minors, and
// CharacteristicPolynomial gives det(t I − M) of a rational matrix. The
// representation and its measurements are described at the top of poly.go.
//
// # Certified reals
//
// Real is a lazily evaluated expression over rationals — arithmetic,
// square and k-th roots, exp, log, sin, cos, atan, atan2, acos, π — whose
// enclosures (Interval, with exact rational endpoints) always contain the
// value and shrink as the working precision grows. Sign, RealCmp, Approx,
// Digits and Float64 refine until their answer is certain or a precision
// cap is reached. How the bounds are kept is described at the top of
// real.go.
//
// # float64 companions
//
// Matrix.Float, FloatDet and FloatSolve compute with gonum in float64 so
// that callers can show where floating point and exact arithmetic part
// ways; Poly.Float evaluates a polynomial in float64.
//
// # Errors
//
// Failures are reported with sentinel errors wrapped with context; test
// for them with errors.Is: ErrDivisionByZero, ErrNotSquare, ErrSingular,
// ErrShape, ErrSyntax and ErrNotFinite for rationals and matrices;
// ErrTooManyTerms, ErrExponentRange, ErrRingMismatch and ErrDegree for
// polynomials (Ring.Parse returns a *ParseError with the column); ErrDomain,
// ErrUndecided and ErrOverflow for reals.
//
// # One package
//
// The polynomials and the reals stay in this package rather than in
// exact/poly and exact/real. The reals would split off cleanly (they use
// only FormatRat and the sentinel errors), but every name used by the
// kernel would change (exact.RealAdd to real.Add, exact.Real to the
// stuttering real.Real) and a package named real shadows the builtin real
// in its importers. The polynomials would not: PolyMatrix is made from and
// turned back into Matrix (PolyMatrixFrom, PolyMatrix.Constant,
// CharacteristicPolynomial) and shares the shape checks, minors and
// formatting with it, which would have to be exported or copied again.
// The files are grouped by prefix instead (poly*, polymatrix*, real*).
package exact

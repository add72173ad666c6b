package exact

import "errors"

// Sentinel errors. Functions wrap them with context (fmt.Errorf with %w);
// compare with errors.Is.
var (
	// ErrDivisionByZero reports a division by an exact zero.
	ErrDivisionByZero = errors.New("division by zero")
	// ErrNotSquare reports an operation that needs a square matrix.
	ErrNotSquare = errors.New("not square")
	// ErrSingular reports a singular matrix where an invertible one is needed.
	ErrSingular = errors.New("matrix is singular")
	// ErrShape reports ragged, empty or mismatched matrix shapes and
	// out-of-range indices.
	ErrShape = errors.New("shape mismatch")
	// ErrSyntax reports text that is not a number, a polynomial or a
	// variable name in an accepted form.
	ErrSyntax = errors.New("invalid syntax")
	// ErrNotFinite reports a NaN or infinite float64 where a finite value is
	// needed.
	ErrNotFinite = errors.New("not a finite number")
	// ErrTooManyTerms reports a polynomial result that would exceed the
	// ring's term cap (Ring.MaxTerms).
	ErrTooManyTerms = errors.New("too many terms")
	// ErrExponentRange reports an exponent that is negative where it may
	// not be, or above MaxExponent.
	ErrExponentRange = errors.New("exponent out of range")
	// ErrRingMismatch reports polynomials from different rings combined.
	ErrRingMismatch = errors.New("polynomials from different rings")
	// ErrUnknownVariable reports a name that is not a variable of the
	// ring where only known variables are accepted (Ring.ParseKnown).
	ErrUnknownVariable = errors.New("unknown variable")
	// ErrDegree reports a polynomial whose degree does not suit the
	// operation (the discriminant of a polynomial of degree 0).
	ErrDegree = errors.New("unsuitable degree")
)

// Sentinel errors of the certified real numbers (Real).
var (
	// ErrDomain reports an argument certified to lie outside a function's
	// domain: the square root of a negative number, the logarithm of a
	// non-positive one, acos outside [-1, 1], atan2(0, 0).
	ErrDomain = errors.New("argument outside the domain")
	// ErrUndecided reports a question about a real number (its sign, a
	// digit, whether a divisor or an argument is clear of a boundary) that
	// interval refinement did not settle before the precision cap. The
	// answer may simply need more precision, or the value may sit exactly
	// on the boundary, which intervals can never prove.
	ErrUndecided = errors.New("undecided at the precision cap")
	// ErrOverflow reports a real number, or an intermediate value, whose
	// magnitude is beyond what the evaluator represents (binary exponents
	// beyond about ±2^28).
	ErrOverflow = errors.New("magnitude out of range")
	// ErrNotAlgebraic reports a Real with a transcendental function or π
	// in it where an algebraic one is needed (MinimalPolynomial). Its
	// value may still be algebraic (cos(2π/5) is); the expression does not
	// show it.
	ErrNotAlgebraic = errors.New("not built from rationals by arithmetic and roots")
	// ErrDegreeCap reports an algebraic computation that would pass the
	// degree cap (MinimalPolynomial's maxDegree, the flag --max-degree).
	ErrDegreeCap = errors.New("degree cap reached")
)

// capError is ErrUndecided with a message of its own: what was asked and
// the cap it was not settled within, said once.
type capError struct{ msg string }

func (e capError) Error() string { return e.msg }
func (e capError) Unwrap() error { return ErrUndecided }

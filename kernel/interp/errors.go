package interp

import (
	"errors"

	"github.com/go-python/gpython/py"

	"assay/exact"
)

// Exception is the one place where a Go error becomes a notebook
// exception. Python exceptions pass unchanged; the errors of the exact
// arithmetic and the certified reals map to the Python type a notebook
// author would expect (ZeroDivisionError, MemoryError for the term cap,
// ArithmeticError at the precision cap), and every other error, a
// degenerate simplex among them, to ValueError, keeping its message.
func Exception(err error) error {
	if err == nil {
		return nil
	}
	var pe *py.Exception
	switch err.(type) {
	case *py.Exception, py.ExceptionInfo, *py.ExceptionInfo:
		return err
	}
	if errors.As(err, &pe) {
		return err
	}
	typ := py.ValueError
	switch {
	case errors.Is(err, exact.ErrDivisionByZero), errors.Is(err, exact.ErrSingular):
		typ = py.ZeroDivisionError
	case errors.Is(err, exact.ErrTooManyTerms):
		typ = py.MemoryError
	case errors.Is(err, exact.ErrDegreeCap):
		typ = py.ArithmeticError
	case errors.Is(err, exact.ErrDeadline):
		typ = py.RuntimeError
	case errors.Is(err, exact.ErrUndecided):
		return py.ExceptionNewf(py.ArithmeticError, "%v (raise the cap with --max-precision)", err)
	}
	return py.ExceptionNewf(typ, "%v", err)
}

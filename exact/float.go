package exact

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// Float returns m as a gonum matrix holding the nearest float64 to each
// entry (entries beyond the float64 range become ±Inf). A matrix with no
// rows or no columns gives an empty mat.Dense, since gonum has no 0-sized
// matrices.
func (m *Matrix) Float() *mat.Dense {
	if m.rows == 0 || m.cols == 0 {
		return &mat.Dense{}
	}
	data := make([]float64, len(m.e))
	for k, v := range m.e {
		data[k], _ = v.Float64()
	}
	return mat.NewDense(m.rows, m.cols, data)
}

// FloatDet returns gonum's floating-point determinant of a (by LU
// factorization): ErrNotSquare if a is not square, ErrShape if it is empty.
func FloatDet(a *mat.Dense) (float64, error) {
	if a == nil || a.IsEmpty() {
		return 0, fmt.Errorf("float det of an empty matrix: %w", ErrShape)
	}
	if r, c := a.Dims(); r != c {
		return 0, fmt.Errorf("float det needs a square matrix, got %dx%d: %w", r, c, ErrNotSquare)
	}
	return mat.Det(a), nil
}

// FloatSolve solves a x = b in float64 with gonum's Dense.Solve. a must be
// square (ErrNotSquare) with as many rows as b (ErrShape). If gonum reports
// a singular or ill-conditioned a (a mat.Condition error, condition number
// above mat.ConditionTolerance), the error wraps both ErrSingular and
// gonum's error; when the condition number is finite, gonum's (unreliable)
// solution is returned alongside it.
func FloatSolve(a, b *mat.Dense) (*mat.Dense, error) {
	if a == nil || b == nil || a.IsEmpty() || b.IsEmpty() {
		return nil, fmt.Errorf("float solve with an empty matrix: %w", ErrShape)
	}
	ar, ac := a.Dims()
	br, bc := b.Dims()
	if ar != ac {
		return nil, fmt.Errorf("float solve needs a square matrix, got %dx%d: %w", ar, ac, ErrNotSquare)
	}
	if br != ar {
		return nil, fmt.Errorf("float solve: %dx%d matrix with %dx%d right-hand side: %w", ar, ac, br, bc, ErrShape)
	}
	var x mat.Dense
	err := x.Solve(a, b)
	var cond mat.Condition
	if errors.As(err, &cond) {
		err = fmt.Errorf("float solve: %w: %w", ErrSingular, err)
		if math.IsInf(float64(cond), 1) {
			return nil, err
		}
		return &x, err
	}
	if err != nil {
		return nil, fmt.Errorf("float solve: %w", err)
	}
	return &x, nil
}

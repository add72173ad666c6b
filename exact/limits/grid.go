package limits

import (
	"errors"
	"fmt"
	"math/big"
)

// Toward says where the parameter goes.
type Toward int

// The targets of a walk.
const (
	// ToZero walks t_k = ratio^(k+1) down to 0.
	ToZero Toward = iota
	// ToValue walks t_k = value + ratio^(k+1) down to value, from above.
	ToValue
	// ToInfinity walks t_k = ratio^−(k+1) up without bound.
	ToInfinity
)

// String names the target: "0", "value" or "infinity".
func (t Toward) String() string {
	switch t {
	case ToZero:
		return "0"
	case ToValue:
		return "value"
	case ToInfinity:
		return "infinity"
	}
	return fmt.Sprintf("Toward(%d)", int(t))
}

// MinSteps and MaxSteps bound the number of steps of a Grid.
const (
	MinSteps = 3
	MaxSteps = 400
)

// ErrGrid reports arguments from which no walk can be made (a ratio
// outside (0, 1), a step count outside [MinSteps, MaxSteps], an unknown
// target, a missing value); Grid wraps it with the details.
var ErrGrid = errors.New("invalid walk")

// Grid returns the parameters t_k and the distances h_k = ratio^(k+1) to
// the target, k = 0 … steps−1, all exact:
//
//	ToZero:     t_k = ratio^(k+1)
//	ToValue:    t_k = value + ratio^(k+1)   (approach from above)
//	ToInfinity: t_k = ratio^−(k+1)          (2, 4, 8, … for ratio 1/2)
//
// The error of a quantity converging with order p is then about C·h_k^p
// in every case. ratio must lie strictly between 0 and 1 and steps in
// [MinSteps, MaxSteps]; value is used (and required) only for ToValue.
// The slices and their elements are new.
func Grid(toward Toward, value *big.Rat, ratio *big.Rat, steps int) (ts, hs []*big.Rat, err error) {
	if ratio == nil || ratio.Sign() <= 0 || ratio.Cmp(big.NewRat(1, 1)) >= 0 {
		return nil, nil, fmt.Errorf("the ratio must lie strictly between 0 and 1: %w", ErrGrid)
	}
	if steps < MinSteps || steps > MaxSteps {
		return nil, nil, fmt.Errorf("the number of steps must be between %d and %d, got %d: %w", MinSteps, MaxSteps, steps, ErrGrid)
	}
	switch toward {
	case ToZero, ToInfinity:
	case ToValue:
		if value == nil {
			return nil, nil, fmt.Errorf("a walk toward a value needs the value: %w", ErrGrid)
		}
	default:
		return nil, nil, fmt.Errorf("unknown target %v: %w", toward, ErrGrid)
	}
	ts = make([]*big.Rat, steps)
	hs = make([]*big.Rat, steps)
	h := new(big.Rat).Set(ratio)
	for k := range steps {
		hs[k] = new(big.Rat).Set(h)
		switch toward {
		case ToZero:
			ts[k] = new(big.Rat).Set(h)
		case ToValue:
			ts[k] = new(big.Rat).Add(value, h)
		case ToInfinity:
			ts[k] = new(big.Rat).Inv(h)
		}
		h.Mul(h, ratio)
	}
	return ts, hs, nil
}

// gridRatio returns the common ratio h_{k+1}/h_k of hs, which must be a
// geometric sequence of positive numbers with a ratio in (0, 1).
func gridRatio(hs []*big.Rat) (*big.Rat, error) {
	for k, h := range hs {
		if h == nil || h.Sign() <= 0 {
			return nil, fmt.Errorf("distance h_%d is not positive", k)
		}
	}
	r := new(big.Rat).Quo(hs[1], hs[0])
	if r.Cmp(big.NewRat(1, 1)) >= 0 {
		return nil, errors.New("the distances h_k do not decrease")
	}
	q := new(big.Rat)
	for k := 1; k+1 < len(hs); k++ {
		if q.Quo(hs[k+1], hs[k]).Cmp(r) != 0 {
			return nil, fmt.Errorf("the distances h_k are not a geometric sequence (h_%d/h_%d ≠ h_1/h_0)", k+1, k)
		}
	}
	return r, nil
}

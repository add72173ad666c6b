package session

import (
	"fmt"
	"math"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

// floatCall is the float64 rerun of f on sample k: the sample turned into
// float64 first.
func (s *Session) floatCall(f, sample py.Object, k int64) func() (py.Object, py.Object, error) {
	return func() (py.Object, py.Object, error) {
		fs, err := values.FloatValue(sample)
		if err != nil {
			return nil, nil, err
		}
		res, err := py.Call(f, py.Tuple{fs}, nil)
		if err != nil {
			return nil, nil, err
		}
		return pair(res, fmt.Sprintf("f(sample %d)", k))
	}
}

// companion runs a claim's function again as float64 code (every exact
// input turned into float64, gonum for linear algebra) and states how far
// its sides are from the exact ones. It returns a reason instead when the
// sides have no float64 counterpart.
func (s *Session) companion(call func() (py.Object, py.Object, error), lhs, rhs py.Object) (*cells.FloatAudit, string) {
	el, ok1 := values.ExactEntries(lhs)
	er, ok2 := values.ExactEntries(rhs)
	if !ok1 || !ok2 {
		return nil, "no float64 companion: the sides are not numbers, matrices or lists of them"
	}
	var lf, rf py.Object
	err := s.env.InFloat(func() error {
		var err error
		lf, rf, err = call()
		return err
	})
	if err != nil {
		msg := interp.Message(err)
		if strings.Contains(msg, values.NoCompanionText) {
			return nil, strings.TrimPrefix(msg, "NotImplementedError: ")
		}
		return &cells.FloatAudit{Residual: "float64 code raised " + claim.Clip(msg, 160), Error: "no value", DigitsLost: claim.Float64Digits}, ""
	}
	fl, ok1 := values.FloatEntries(lf)
	fr, ok2 := values.FloatEntries(rf)
	if !ok1 || !ok2 || len(fl) != len(el) || len(fr) != len(er) {
		return nil, "no float64 companion: the float64 code returned values of another shape"
	}
	res := 0.0
	if len(fl) == len(fr) {
		for i := range fl {
			res = math.Max(res, math.Abs(fl[i]-fr[i]))
		}
	}
	rel, lost := claim.AuditError(append(el, er...), append(fl, fr...))
	return &cells.FloatAudit{Residual: fmt.Sprintf("%.3e", res), Error: fmt.Sprintf("%.2e relative", rel), DigitsLost: math.Round(lost*10) / 10}, ""
}

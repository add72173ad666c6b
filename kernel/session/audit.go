package session

import (
	"fmt"
	"math"
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/interp"
	"assay/kernel/values"
)

// rerun runs a claim's function again with its inputs converted: to
// float64 for the float64 run, to their nearest float64 kept exact for the
// input-rounding run.
type rerun func(convert func(py.Object) (py.Object, error)) (py.Object, py.Object, error)

// plainRun is the rerun of identity(name, f): f takes no sample, and its
// inputs are whatever exact values it uses.
func plainRun(call func() (py.Object, py.Object, error)) rerun {
	return func(func(py.Object) (py.Object, error)) (py.Object, py.Object, error) { return call() }
}

// sampleRun is the rerun of f on sample k, the sample converted first.
func sampleRun(f, sample py.Object, k int64) rerun {
	return func(convert func(py.Object) (py.Object, error)) (py.Object, py.Object, error) {
		in, err := convert(sample)
		if err != nil {
			return nil, nil, err
		}
		res, err := py.Call(f, py.Tuple{in}, nil)
		if err != nil {
			return nil, nil, err
		}
		return samplePair(res, k)
	}
}

// companion runs a claim's function again as float64 code (every exact
// input turned into float64, gonum for linear algebra) and states how far
// each side is from the exact one. With split it also runs the function
// exactly at the float64-rounded inputs, to tell the error rounding the
// inputs already makes (the problem's condition) from the float64
// evaluation's own. It returns a reason instead when the sides have no
// float64 counterpart.
func (s *Session) companion(run rerun, lhs, rhs py.Object, split bool) (*cells.FloatAudit, string) {
	el, ok1 := values.ExactEntries(lhs)
	er, ok2 := values.ExactEntries(rhs)
	if !ok1 || !ok2 {
		return nil, "no float64 companion: the sides are not numbers, matrices or lists of them"
	}
	var lf, rf py.Object
	err := s.env.InFloat(func() error {
		var err error
		lf, rf, err = run(values.FloatValue)
		return err
	})
	if err != nil {
		msg := interp.Message(err)
		if strings.Contains(msg, values.NoCompanionText) {
			return nil, strings.TrimPrefix(msg, "NotImplementedError: ")
		}
		return &cells.FloatAudit{Raised: claim.Clip(msg, 160), DigitsLost: claim.Float64Digits}, ""
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
	audit := &cells.FloatAudit{Residual: fmt.Sprintf("%.3e", res),
		LHS: &cells.SideAudit{Loss: claim.LossOf(claim.FloatError(el, el, fl))},
		RHS: &cells.SideAudit{Loss: claim.LossOf(claim.FloatError(er, er, fr))}}
	audit.DigitsLost = math.Max(audit.LHS.DigitsLost, audit.RHS.DigitsLost)
	if split {
		s.splitAudit(run, audit, [2][]*big.Float{el, er}, [2][]float64{fl, fr})
	}
	return audit, ""
}

// splitAudit runs the function exactly at the float64-rounded inputs and
// splits each side's loss into the inputs' share, V̂ against V, and the
// float64 evaluation's, F against V̂.
func (s *Session) splitAudit(run rerun, audit *cells.FloatAudit, exact [2][]*big.Float, floats [2][]float64) {
	sides := [2]*cells.SideAudit{audit.LHS, audit.RHS}
	unsplit := func(why string) {
		for _, side := range sides {
			side.Unsplit = why
		}
	}
	var got [2]py.Object
	err := s.env.InRounding(func() error {
		var err error
		if got[0], got[1], err = run(s.env.RoundIn); err != nil {
			return err
		}
		// A side returned untouched is an input, and float64 code holds it rounded.
		for i := range got {
			if got[i], err = s.env.RoundIn(got[i]); err != nil {
				return err
			}
		}
		return nil
	})
	if err != nil {
		unsplit("the exact function raised at the rounded inputs: " + claim.Clip(interp.Message(err), 160))
		return
	}
	for i, side := range sides {
		rounded, ok := values.ExactEntries(got[i])
		if !ok || len(rounded) != len(exact[i]) {
			side.Unsplit = "the exact function at the rounded inputs did not return exact values of the same shape"
			continue
		}
		input := claim.LossOf(claim.RelativeError(exact[i], exact[i], rounded))
		formula := claim.LossOf(claim.FloatError(exact[i], rounded, floats[i]))
		side.Input, side.Formula = &input, &formula
	}
}

// worstAudit is the audit of a sampled claim: at the sample where float64
// lost most, rerun with the split between inputs and formula, which costs
// two more runs of f and so is made there only.
func (s *Session) worstAudit(ask claim.Ask, fam family, worst *claim.SampleAudit) *cells.FloatAudit {
	k := worst.K
	audit := worst.Audit
	single := claim.Ask{Claim: ask.Claim, Phase: ask.Phase, Line: ask.Line, Samples: k + 1}
	s.sweep(single, claim.Share{Index: k, Count: k + 1}, fam, func(int64, string) {}, func(k int64, sample, lhs, rhs py.Object) error {
		if a, _ := s.companion(sampleRun(fam.f, sample, k), lhs, rhs, true); a != nil {
			audit = *a
		}
		return nil
	})
	audit.Sample = &k
	return &audit
}

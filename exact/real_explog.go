package exact

// exp and log on intervals, from github.com/ALTree/bigfloat with a stated
// accuracy assumption.

import (
	"fmt"
	"math/big"
	"sync"

	"github.com/ALTree/bigfloat"
)

// bigfloatMu serialises calls into bigfloat: its Log (and so its Exp)
// updates a package-level cache of π without synchronisation.
var bigfloatMu sync.Mutex

// bigfloatGuard is the number of bits by which exp and log are computed
// beyond the caller's precision q, and bigfloatSlack the number of bits of
// that guard spent on the assumed error bound: the result of bigfloat at
// precision q+64 is trusted to 2^-(q+32), i.e. 2^32 of its own ulps.
const (
	bigfloatGuard = 64
	bigfloatSlack = 32
)

// bigfloatAt returns f(z) computed by bigfloat at precision
// max(q+bigfloatGuard, z.Prec()).
func bigfloatAt(f func(*big.Float) *big.Float, z *big.Float, q uint) *big.Float {
	w := q + bigfloatGuard
	if z.Prec() > w {
		w = z.Prec()
	}
	zz := new(big.Float).SetPrec(w).Set(z)
	bigfloatMu.Lock()
	defer bigfloatMu.Unlock()
	return f(zz)
}

// expPoint encloses exp(z) at precision q.
//
// Accuracy assumption: bigfloat.Exp(z), with z held at precision
// w = q+64 ≥ z.Prec(), returns y with |y − exp(z)| ≤ 2^-(q+32)·|y|, i.e.
// within 2^32 ulps at its precision. (bigfloat.Exp runs Newton's method on
// bigfloat.Log with 64 guard bits; measured errors are below 1 ulp.) We
// widen y by 2^-(q+32)·|y| each way. TestBigfloatExpAccuracy checks the
// assumption with a margin of 2^31 against the Taylor series of exp
// summed in exact rational arithmetic with its remainder bound.
func expPoint(z *big.Float, q uint) (ival, error) {
	if z.Sign() == 0 {
		return ivExact(1), nil
	}
	if z.MantExp(nil) > 27 {
		return ival{}, fmt.Errorf("exp of a number of magnitude 2^%d: %w", z.MantExp(nil), ErrOverflow)
	}
	y := bigfloatAt(bigfloat.Exp, z, q)
	if y.IsInf() || y.Sign() <= 0 {
		return ival{}, fmt.Errorf("exp of %s: %w", z.Text('g', 10), ErrOverflow)
	}
	d := new(big.Float).SetMantExp(y, -int(q+bigfloatSlack))
	return ival{fDown(q).Sub(y, d), fUp(q).Add(y, d)}, nil
}

// logPoint encloses log(z) at precision q for z > 0.
//
// Accuracy assumption: bigfloat.Log(z), with z held at precision
// w = q+64 ≥ z.Prec(), returns y with |y − log(z)| ≤ 2^-(q+32)·max(1, |y|),
// relative for |log z| ≥ 1 and absolute below. (bigfloat.Log squares z up
// past 2^(w/2) and applies the AGM formula with 64 guard bits; its error is
// a few ulps of 2^-(w+64)·max(1, |log z|) plus the final rounding, so the
// absolute form is what holds near z = 1.) We widen y by that bound each
// way. TestBigfloatLogAccuracy checks the assumption with a margin of 2^30
// against log z = 2·atanh((z−1)/(z+1)) summed in exact rationals with its
// remainder bound.
func logPoint(z *big.Float, q uint) ival {
	if z.Cmp(fOne) == 0 {
		return ivExact(0)
	}
	y := bigfloatAt(bigfloat.Log, z, q)
	var d *big.Float
	if y.MantExp(nil) > 0 { // |y| ≥ 1
		d = new(big.Float).Abs(y)
		d.SetMantExp(d, -int(q+bigfloatSlack))
	} else {
		d = new(big.Float).SetMantExp(fOne, -int(q+bigfloatSlack))
	}
	return ival{fDown(q).Sub(y, d), fUp(q).Add(y, d)}
}

// ivExp is exp on an interval: exp is increasing.
func ivExp(a ival, p uint) (ival, error) {
	q := p + 8
	lo, err := expPoint(a.lo, q)
	if err != nil {
		return ival{}, err
	}
	hi := lo
	if !a.isPoint() {
		if hi, err = expPoint(a.hi, q); err != nil {
			return ival{}, err
		}
	}
	return ivRound(ival{lo.lo, hi.hi}, p), nil
}

// ivLog is log on an interval with a.lo > 0: log is increasing.
func ivLog(a ival, p uint) ival {
	q := p + 8
	lo := logPoint(a.lo, q)
	hi := lo
	if !a.isPoint() {
		hi = logPoint(a.hi, q)
	}
	return ivRound(ival{lo.lo, hi.hi}, p)
}

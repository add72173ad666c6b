package values

import (
	"errors"
	"math"
	"math/big"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// Series is a truncated Puiseux series in a notebook: what series(f) gives,
// and what f receives in place of t while it is expanded.
//
// Why a series expansion proves something about f on numbers: f is run
// once, on the series. Every operation a series supports (+ − × ÷, powers,
// roots, exp, log, sin, cos, acos, abs) computes the expansion of the same
// operation on numbers, for every t close enough to the expansion point.
// What could make f compute something else on numbers is a branch on the
// value of t — `if t < h:`, min, max, a conversion to a float or an int —
// and each of those raises on a series. A function that catches any
// exception (interp.Sandbox.Raised counts them, whatever raised them, so
// an attribute a number lacks is covered too), looks at the series itself
// (its printed form, its leading term), or asks a builtin about its type,
// attributes or identity (interp.WatchIntrospection, Series.Watched)
// leaves its mark on the run (Inspected), and the claims then do not use
// the series.
type Series struct {
	s   *exact.Series
	env *Env
	at  *SeriesPoint
}

// SeriesPoint is the expansion point of a series and the record of one
// run of f: how the series variable relates to t, and whether f tried to
// look at the value of the series.
type SeriesPoint struct {
	Name string // the variable printed: "t", "(t - 2)", or "t" with flipped exponents
	Flip bool   // toward infinity: the series is in 1/t, printed in t
	// Inspected says the first thing f did that may tell a series from a
	// number: a refusal (compare it, convert it to a number) or any other
	// exception caught inside f, a look at the series itself, or a question
	// to a builtin about its type, attributes or identity; "" if none.
	Inspected string
}

// SeriesType is the Python type of Series.
var SeriesType = py.NewType("series", "A truncated Puiseux series with exact coefficients and a known error term: series(lambda t: sin(t)/t).")

// Type returns SeriesType.
func (s *Series) Type() *py.Type { return SeriesType }

// Value is the series.
func (s *Series) Value() *exact.Series { return s.s }

// Point is the expansion point.
func (s *Series) Point() *SeriesPoint { return s.at }

// SeriesOf lifts a series, an exact number or a certified real to a
// series at the point of at (nil for a constant of no point).
func (e *Env) seriesOf(o py.Object, at *SeriesPoint) (*exact.Series, bool, error) {
	if s, ok := o.(*Series); ok {
		if at != nil && s.at != at && (s.at.Name != at.Name || s.at.Flip != at.Flip) {
			return nil, false, py.ExceptionNewf(py.ValueError, "series at different points cannot be combined: one in %s, one in %s", s.at.describe(), at.describe())
		}
		return s.s, true, nil
	}
	if x, ok := RealOf(o); ok {
		return exact.SeriesConst(x, e.Cap), true, nil
	}
	return nil, false, nil
}

func (p *SeriesPoint) describe() string {
	if p.Flip {
		return "powers of 1/t (t → infinity)"
	}
	return "powers of " + p.Name
}

// Watched records that f asked for the series' type, attributes or
// identity (interp.WatchIntrospection): a number answers differently.
func (s *Series) Watched(what string) { s.inspect(what) }

// inspect records the first thing f asked of a series beyond arithmetic:
// its printed form or leading term tells a series from a number, so a
// claim does not rely on a run that asked.
func (s *Series) inspect(what string) {
	if s.at.Inspected == "" {
		s.at.Inspected = "asked for " + what + " of its argument"
	}
}

// refuse records that f looked at the value of a series and returns the
// error that says why it cannot.
func (s *Series) refuse(what string) error {
	s.inspect(what)
	return py.ExceptionNewf(py.TypeError, "%s of a series: a series stands for every t near the expansion point at once, so it has no single value to %s; a function expanded by series() or proved by limit() must compute one expression of t, without branching on t", what, map[bool]string{true: "compare", false: "convert"}[what == "comparison"])
}

func (s *Series) result(x *exact.Series, err error) (py.Object, error) {
	if err != nil {
		return nil, err
	}
	return &Series{s: x, env: s.env, at: s.at}, nil
}

func (s *Series) binary(o py.Object, swap bool, op func(a, b *exact.Series) (*exact.Series, error)) (res py.Object, err error) {
	defer interp.Recover("series arithmetic", &res, &err)
	y, ok, err := s.env.seriesOf(o, s.at)
	if err != nil {
		return nil, err
	}
	if !ok {
		if _, isFloat := o.(py.Float); isFloat {
			return nil, py.ExceptionNewf(py.TypeError, "a series cannot be mixed with a float64 (%s): its coefficients are exact; use frac(…)", interp.Str(o))
		}
		return py.NotImplemented, nil
	}
	a, b := s.s, y
	if swap {
		a, b = b, a
	}
	return s.result(op(a, b))
}

// M__add__ adds.
func (s *Series) M__add__(o py.Object) (py.Object, error) { return s.binary(o, false, exact.SeriesAdd) }

// M__radd__ adds.
func (s *Series) M__radd__(o py.Object) (py.Object, error) { return s.binary(o, true, exact.SeriesAdd) }

// M__sub__ subtracts.
func (s *Series) M__sub__(o py.Object) (py.Object, error) { return s.binary(o, false, exact.SeriesSub) }

// M__rsub__ subtracts.
func (s *Series) M__rsub__(o py.Object) (py.Object, error) { return s.binary(o, true, exact.SeriesSub) }

// M__mul__ multiplies.
func (s *Series) M__mul__(o py.Object) (py.Object, error) { return s.binary(o, false, exact.SeriesMul) }

// M__rmul__ multiplies.
func (s *Series) M__rmul__(o py.Object) (py.Object, error) { return s.binary(o, true, exact.SeriesMul) }

// M__truediv__ divides.
func (s *Series) M__truediv__(o py.Object) (py.Object, error) {
	return s.binary(o, false, exact.SeriesQuo)
}

// M__rtruediv__ divides by s.
func (s *Series) M__rtruediv__(o py.Object) (py.Object, error) {
	return s.binary(o, true, exact.SeriesQuo)
}

// M__pow__ raises to a rational power: integers, and fractions for roots
// (the branch is the one of exact.SeriesPow).
func (s *Series) M__pow__(o, mod py.Object) (res py.Object, err error) {
	defer interp.Recover("series.__pow__", &res, &err)
	if mod != py.None {
		return nil, py.ExceptionNewf(py.TypeError, "pow() with a modulus is not defined for series")
	}
	q, ok := ExactOf(o)
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "a series can be raised to an exact rational power (an int or frac(p, q)), not to %s%s", interp.TypeName(o), FloatHint(o))
	}
	if !q.Num().IsInt64() || !q.Denom().IsInt64() || q.Num().Int64() > MaxExponent || q.Num().Int64() < -MaxExponent || q.Denom().Int64() > MaxExponent {
		return nil, py.ExceptionNewf(py.OverflowError, "series exponent %s is too large (limit %d)", exact.FormatRat(q), MaxExponent)
	}
	return s.result(exact.SeriesPow(s.s, int(q.Num().Int64()), int(q.Denom().Int64())))
}

// M__rpow__ refuses x ** series.
func (s *Series) M__rpow__(o py.Object) (py.Object, error) {
	return nil, py.ExceptionNewf(py.TypeError, "a power with a series exponent: write exp(t * log(x)) for x ** t")
}

// M__neg__ negates.
func (s *Series) M__neg__() (py.Object, error) { return s.result(exact.SeriesNeg(s.s), nil) }

// M__pos__ returns s.
func (s *Series) M__pos__() (py.Object, error) { return s, nil }

// M__abs__ is ±s by the sign of the leading coefficient: near the
// expansion point (t → 0⁺) the series has that sign.
func (s *Series) M__abs__() (res py.Object, err error) {
	defer interp.Recover("series.__abs__", &res, &err)
	c, _, ok := s.s.Leading()
	if !ok {
		return nil, py.ExceptionNewf(py.ValueError, "abs() of %s: its sign is not determined within the order (raise order=)", s.text())
	}
	sign, err := c.Sign(s.env.Cap)
	if err != nil {
		return nil, err
	}
	if sign < 0 {
		return s.M__neg__()
	}
	return s, nil
}

func (s *Series) text() string { return s.s.Format(s.at.Name, s.at.Flip) }

// M__str__ prints the series, "1 - 1/6*t^2 + O(t^4)".
func (s *Series) M__str__() (py.Object, error) {
	s.inspect("the printed form")
	return py.String(s.text()), nil
}

// M__repr__ prints the series.
func (s *Series) M__repr__() (py.Object, error) { return s.M__str__() }

// M__bool__ refuses: the truth of a series is a branch on t.
func (s *Series) M__bool__() (py.Object, error) { return nil, s.refuse("the truth value") }

// M__float__ refuses.
func (s *Series) M__float__() (py.Object, error) { return nil, s.refuse("a float") }

// M__int__ refuses.
func (s *Series) M__int__() (py.Object, error) { return nil, s.refuse("an int") }

// M__index__ refuses.
func (s *Series) M__index__() (py.Int, error) { return 0, s.refuse("an index") }

// M__lt__ refuses.
func (s *Series) M__lt__(py.Object) (py.Object, error) { return nil, s.refuse("comparison") }

// M__le__ refuses.
func (s *Series) M__le__(py.Object) (py.Object, error) { return nil, s.refuse("comparison") }

// M__gt__ refuses.
func (s *Series) M__gt__(py.Object) (py.Object, error) { return nil, s.refuse("comparison") }

// M__ge__ refuses.
func (s *Series) M__ge__(py.Object) (py.Object, error) { return nil, s.refuse("comparison") }

// M__eq__ refuses.
func (s *Series) M__eq__(py.Object) (py.Object, error) { return nil, s.refuse("comparison") }

// M__ne__ refuses.
func (s *Series) M__ne__(py.Object) (py.Object, error) { return nil, s.refuse("comparison") }

// seriesFunction applies a builtin (sqrt, root, exp, log, sin, cos, acos) to a series.
func (s *Series) function(name string, k int) (res py.Object, err error) {
	defer interp.Recover(name, &res, &err)
	switch name {
	case "sqrt":
		return s.result(exact.SeriesPow(s.s, 1, 2))
	case "root":
		return s.result(exact.SeriesPow(s.s, 1, k))
	case "exp":
		return s.result(exact.SeriesExp(s.s))
	case "log":
		return s.result(exact.SeriesLog(s.s))
	case "sin":
		return s.result(exact.SeriesSin(s.s))
	case "cos":
		return s.result(exact.SeriesCos(s.s))
	case "acos":
		return s.result(exact.SeriesAcos(s.s))
	}
	return nil, py.ExceptionNewf(py.TypeError, "%s() of a series is not supported (series support + - * / **, sqrt, root, exp, log, sin, cos, acos and abs)", name)
}

func init() {
	SeriesType.Dict["leading"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		s := self.(*Series)
		s.inspect("the leading term")
		c, e, ok := s.s.Leading()
		if !ok {
			return nil, py.ExceptionNewf(py.ValueError, "%s has no known term: its leading term is not determined within the order (raise order=)", s.text())
		}
		if s.at.Flip {
			e.Neg(e)
		}
		return py.Tuple{s.env.Real(c), s.env.Rational(e)}, nil
	}, Doc: "(c, k): the leading term c*t^k (in the printed variable)"}
	SeriesType.Dict["order"] = &py.Property{Fget: func(self py.Object) (py.Object, error) {
		s := self.(*Series)
		s.inspect("the order")
		k, ok := s.s.Order()
		if !ok {
			return py.None, nil
		}
		if s.at.Flip {
			k.Neg(k)
		}
		return s.env.Rational(k), nil
	}, Doc: "k of the error term O(t^k) (in the printed variable), None for a constant"}
	setMethods(SeriesType, []method[*Series]{
		{"terms", nil, "terms() -> [(c, k), ...]: the known non-zero terms c*t^k, in order", func(s *Series, _ interp.Args) (py.Object, error) {
			s.inspect("the terms")
			coefs, exps, err := s.s.Terms()
			if err != nil {
				return nil, err
			}
			out := make([]py.Object, len(coefs))
			for i := range coefs {
				if s.at.Flip {
					exps[i].Neg(exps[i])
				}
				out[i] = py.Tuple{s.env.Real(coefs[i]), s.env.Rational(exps[i])}
			}
			return py.NewListFromItems(out), nil
		}},
	})
}

// MaxSeriesOrder bounds series(order=…).
const MaxSeriesOrder = 64

// SeriesPointOf reads toward= of series(), limit(), sequence() and
// asymptotic(), for the walks and the series alike: 0
// (t = s, s → 0⁺), a value a (t = a + s) or infinity (t = 1/s).
func SeriesPointOf(fn string, toward py.Object) (a *big.Rat, inf bool, err error) {
	switch {
	case toward == nil || toward == py.None:
		return new(big.Rat), false, nil
	case IsInfinity(toward):
		return nil, true, nil
	}
	v, ok := ExactOf(toward)
	if !ok {
		return nil, false, py.ExceptionNewf(py.TypeError, "%s(): toward must be an exact number or infinity, got %s%s", fn, interp.TypeName(toward), FloatHint(toward))
	}
	return v, false, nil
}

// IsInfinity says whether o is the builtin infinity or float("inf").
func IsInfinity(o py.Object) bool {
	if f, ok := o.(py.Float); ok {
		return math.IsInf(float64(f), 1)
	}
	return o == py.Object(Infinity{})
}

// SeriesRun is one expansion of f: its result and what f did.
type SeriesRun struct {
	Value *Series // the result, with its point
	// Work is the order the variable was given in the run that answered.
	Work int
}

// Expand calls f with the series variable of the point (a, or infinity
// when inf) and returns f(t) as a series known at least to O(s^order)
// where that can be had (s the distance to the point). The variable's
// order is raised (up to 4·order + 8) while the result is known to less,
// or has no known term, or f divided by a series with no known term.
func (e *Env) Expand(f py.Object, a *big.Rat, inf bool, order int) (*SeriesRun, error) {
	at := &SeriesPoint{Name: "t"}
	switch {
	case inf:
		at.Flip = true
	case a.Sign() != 0:
		at.Name = "(t - " + exact.FormatRat(a) + ")"
		if a.Sign() < 0 {
			at.Name = "(t + " + exact.FormatRat(new(big.Rat).Neg(a)) + ")"
		}
	}
	var last *Series
	var lastErr error
	for work := order; work <= 4*order+8; work += order/2 + 2 {
		v, err := e.seriesVariable(a, inf, work, at)
		if err != nil {
			return nil, err
		}
		raised := e.raisedSoFar()
		told, _ := e.telltalesSoFar()
		out, err := py.Call(f, py.Tuple{v}, nil)
		if err == nil && e.raisedSoFar() != raised && at.Inspected == "" {
			// f caught an exception: whatever raised it may not raise on
			// numbers (an attribute a number has, a builtin a series
			// refuses), so f on the series may differ from f on numbers.
			at.Inspected = "caught an exception raised inside it"
		}
		if n, what := e.telltalesSoFar(); err == nil && n != told && at.Inspected == "" {
			// f may have told the series from a number, or kept state
			// that makes a later call on numbers compute something else.
			at.Inspected = what
		}
		if err != nil {
			if errors.Is(err, exact.ErrSeriesUndetermined) || isUndetermined(err) {
				lastErr = err
				continue
			}
			return nil, err
		}
		x, ok, err := e.seriesOf(out, at)
		if err != nil {
			return nil, err
		}
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "f returned %s, not a series, an exact number or a real%s", interp.TypeName(out), FloatHint(out))
		}
		last, lastErr = &Series{s: x, env: e, at: at}, nil
		k, bounded := x.Order()
		_, _, known := x.Leading()
		if !bounded || (known && k.Cmp(big.NewRat(int64(order), 1)) >= 0) {
			return &SeriesRun{Value: last.truncated(order), Work: work}, nil
		}
	}
	if last == nil {
		return nil, lastErr
	}
	return &SeriesRun{Value: last, Work: 4*order + 8}, nil
}

// raisedSoFar is the session's count of raised exceptions (0 outside a
// session, where no notebook code runs).
func (e *Env) raisedSoFar() uint64 {
	if e.Raised == nil {
		return 0
	}
	return e.Raised()
}

// telltalesSoFar is the session's count of telltales and the latest
// (0 outside a session).
func (e *Env) telltalesSoFar() (uint64, string) {
	if e.Telltales == nil {
		return 0, ""
	}
	return e.Telltales()
}

// isUndetermined spots ErrSeriesUndetermined after the guard turned it
// into a notebook exception.
func isUndetermined(err error) bool {
	return strings.Contains(interp.Message(err), exact.ErrSeriesUndetermined.Error())
}

// truncated drops terms from O(s^order) on, for a tidy printout.
func (s *Series) truncated(order int) *Series {
	return &Series{s: s.s.Truncate(order), env: s.env, at: s.at}
}

// seriesVariable is t as a series at the point: s, a + s or 1/s, each
// + O(s^work).
func (e *Env) seriesVariable(a *big.Rat, inf bool, work int, at *SeriesPoint) (*Series, error) {
	s := exact.SeriesVar(work, e.Cap)
	var err error
	switch {
	case inf:
		s = exact.SeriesReciprocalVar(work, e.Cap)
	case a.Sign() != 0:
		s, err = exact.SeriesAdd(exact.SeriesConst(exact.RealFromRat(a), e.Cap), s)
	}
	return &Series{s: s, env: e, at: at}, err
}

func (e *Env) seriesBuiltins(b py.StringDict) {
	setBuiltins(b, []builtin{
		{"series", params("f", "toward=", "order="), "series(f, toward=0, order=6) -> f(t) expanded as t -> toward (from above; toward=infinity: in powers of 1/t), to O(t^order)", e.series},
	})
}

func (e *Env) series(a interp.Args) (py.Object, error) {
	if !interp.Callable(a.Get("f")) {
		return nil, py.ExceptionNewf(py.TypeError, "series(f, …) needs a function of t, e.g. series(lambda t: sin(t) / t)")
	}
	order, err := SeriesOrder("series", a)
	if err != nil {
		return nil, err
	}
	p, inf, err := SeriesPointOf("series", a.Get("toward"))
	if err != nil {
		return nil, err
	}
	run, err := e.Expand(a.Get("f"), p, inf, order)
	if err != nil {
		return nil, err
	}
	return run.Value, nil
}

// SeriesOrder reads order= (default 6) of series().
func SeriesOrder(fn string, a interp.Args) (int, error) {
	if !a.Has("order") {
		return 6, nil
	}
	n, err := a.Int("order", 6)
	if err != nil || n < 1 || n > MaxSeriesOrder {
		return 0, py.ExceptionNewf(py.ValueError, "%s(): order must be an integer from 1 to %d, got %s", fn, MaxSeriesOrder, interp.Str(a.Get("order")))
	}
	return int(n), nil
}

// String is the series as printed.
func (s *Series) String() string { return s.text() }

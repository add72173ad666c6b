package values

import (
	"math/big"
	"math/rand/v2"
	"time"

	"github.com/go-python/gpython/py"

	"assay/exact"
	"assay/kernel/interp"
)

// Env is what the values of one notebook share with their session.
type Env struct {
	Ring *exact.Ring // the notebook's polynomial variables
	Cap  uint        // precision cap, in bits, of any certified-real refinement
	// MaxDegree caps the degree of the polynomials a minimal polynomial is
	// computed through (--max-degree; 0: exact.DefaultMaxDegree).
	MaxDegree int
	// Float is on while the float64 audit reruns a claim's function: exact
	// numbers then compute as float64 and matrices through gonum, as
	// ordinary code would.
	Float bool
	// Rounding is on during the audit's input-rounding run (rounding.go):
	// exact arithmetic on the float64-rounded inputs.
	Rounding bool
	// Sweeping is on inside a sampled claim's f or g, where sample k may
	// be computed by any kernel in any order.
	Sweeping bool
	// Stage, when set, hears the stage a long computation (factoring) is
	// in, so that a cell stopped by its time limit can say what was
	// running; "" when the computation returns.
	Stage func(string)
	// Deadline is when a long computation of the running cell (a Gröbner
	// basis) stops with a message naming where it was, before the parent's
	// timeout kills the kernel; zero for none.
	Deadline time.Time
	// Raised counts the exceptions the session's code has raised so far
	// (interp.Sandbox.Raised); nil outside a session.
	Raised func() uint64
	// Telltales and Telltale read and count what tells a series from a
	// number (interp.Sandbox.Telltales, NoteTelltale); nil outside a
	// session.
	Telltales func() (uint64, string)
	Telltale  func(what string)

	seed  int64  // seed in force for this cell
	cell  int    // the cell running
	draws uint64 // random draws taken without an explicit seed in this cell
}

// NewEnv makes the environment of a notebook's values.
func NewEnv(maxTerms int, cap uint) *Env {
	ring := exact.NewRing()
	ring.SetMaxTerms(maxTerms)
	return &Env{Ring: ring, Cap: cap}
}

// Install puts the builtins of every value type into b.
func (e *Env) Install(b py.StringDict) {
	refusePolynomialOnly()
	for _, install := range []func(py.StringDict){
		e.rationalBuiltins,
		e.realBuiltins,
		e.polynomialBuiltins,
		e.idealBuiltins,
		e.solveBuiltins,
		e.matrixBuiltins,
		e.simplexBuiltins,
		e.kvectorBuiltins,
		e.boxBuiltins,
		e.infinityBuiltins,
		e.seriesBuiltins,
	} {
		install(b)
	}
}

// StartCell resets the random state for a cell with the given seed.
func (e *Env) StartCell(cell int, seed int64) { e.cell, e.seed, e.draws = cell, seed, 0 }

// SetSeed changes the seed in force (setup(seed=…)).
func (e *Env) SetSeed(seed int64) { e.seed = seed }

// Drawn reports whether the running cell has drawn from the session's
// random stream.
func (e *Env) Drawn() bool { return e.draws > 0 }

// Seed is the seed in force.
func (e *Env) Seed() int64 { return e.seed }

// Rand returns a generator: from an explicit seed alone, or else from the
// cell's seed and the number of draws so far, so reruns repeat exactly.
func (e *Env) Rand(explicit py.Object) (*rand.Rand, error) {
	src, err := e.source(explicit)
	if err != nil {
		return nil, err
	}
	return rand.New(&src), nil
}

// Word is the first word Rand(explicit) would give, drawn without making
// a generator (random_simplex draws one a sample, in a sweep).
func (e *Env) Word(explicit py.Object) (uint64, error) {
	src, err := e.source(explicit)
	if err != nil {
		return 0, err
	}
	return src.Uint64(), nil
}

// source is the stream Rand draws from.
func (e *Env) source(explicit py.Object) (rand.PCG, error) {
	var src rand.PCG
	if explicit != nil && explicit != py.None {
		seed, err := interp.Int("random", "seed", explicit, 0)
		if err != nil {
			return src, err
		}
		src.Seed(uint64(seed), 0x6173736179)
		return src, nil
	}
	if e.Sweeping {
		// Sample k must be the same whichever kernel computes it, and
		// in whatever order: a draw may depend on k, not on earlier draws.
		return src, py.ExceptionNewf(py.ValueError, "a random draw without seed= inside a sampled claim's f or g: pass seed= (for instance seed=k) so that sample k can be rebuilt, and split among workers")
	}
	if e.Telltale != nil {
		e.Telltale("drew from the session's random stream")
	}
	e.draws++
	src.Seed(uint64(e.seed), uint64(e.cell)<<32|e.draws)
	return src, nil
}

// InFloat runs f as float64 code: the float64 audit.
func (e *Env) InFloat(f func() error) error {
	e.Float = true
	defer func() { e.Float = false }()
	return f()
}

// Sequence lists the items of a list, tuple or other iterable; single
// numbers, strings and polynomials are refused by name.
func Sequence(o py.Object, what string) ([]py.Object, error) {
	switch x := o.(type) {
	case *py.List:
		return x.Items, nil
	case py.Tuple:
		return x, nil
	case py.String, *Rational, py.Int, py.Float, *Polynomial:
		return nil, py.ExceptionNewf(py.TypeError, "%s must be a list or tuple, got %s", what, interp.TypeName(o))
	}
	var items []py.Object
	err := py.Iterate(o, func(item py.Object) bool { items = append(items, item); return false })
	if err != nil {
		return nil, py.ExceptionNewf(py.TypeError, "%s must be a list or tuple, got %s", what, interp.TypeName(o))
	}
	return items, nil
}

// indexList reads a list of integer indices.
func indexList(o py.Object, what string) ([]int, error) {
	items, err := Sequence(o, what)
	if err != nil {
		return nil, err
	}
	out := make([]int, len(items))
	for i, it := range items {
		k, err := py.Index(it)
		if err != nil {
			return nil, py.ExceptionNewf(py.TypeError, "%s must hold integers", what)
		}
		out[i] = int(k)
	}
	return out, nil
}

// FloatHint explains how to get an exact value when a float turned up,
// and how to reach the polynomials of a rational function where a
// polynomial is needed.
func FloatHint(o py.Object) string {
	switch o.(type) {
	case py.Float:
		return " (it is a float64; write frac(\"0.1\") for the decimal or frac(x) for the float's exact value)"
	case *RationalFunction:
		return " (for a polynomial, take its .numerator or .denominator)"
	}
	return ""
}

// rationalVector reads a list of exact numbers.
func rationalVector(o py.Object, what string) ([]*big.Rat, error) {
	items, err := Sequence(o, what)
	if err != nil {
		return nil, err
	}
	out := make([]*big.Rat, len(items))
	for i, it := range items {
		v, ok := ExactOf(it)
		if !ok {
			return nil, py.ExceptionNewf(py.TypeError, "%s: coordinate %d is %s, not an exact number%s", what, i, interp.TypeName(it), FloatHint(it))
		}
		out[i] = v
	}
	return out, nil
}

// list makes a Python list of rationals.
func (e *Env) list(v []*big.Rat) *py.List {
	out := make([]py.Object, len(v))
	for i, x := range v {
		out[i] = e.Rational(x)
	}
	return py.NewListFromItems(out)
}

// noArgs checks that a method was called without arguments.
func noArgs(name string, args py.Tuple, kw py.StringDict) error {
	_, err := interp.Bind(name, args, kw)
	return err
}

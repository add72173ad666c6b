package session

import (
	"fmt"
	"slices"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/interp"
)

// claimNames are the claim builtins, whose call sites are tagged with their line.
var claimNames = map[string]bool{"identity": true, "factorization": true, "limit": true, "inequality": true, "asymptotic": true}

// claimBuiltin decides a claim: it fills in the record c, which is opened
// (named, placed at its line) and filed by makeClaim. t is the precision
// the claim is decided to.
type claimBuiltin func(c *cells.Claim, t claim.Target, a interp.Args) error

// install puts the notebook's names into the builtins module.
func (s *Session) install(b py.StringDict) {
	b["print"] = interp.Func("print", "print(*values, sep=' ', end='\\n') writes to the cell's output", s.print)
	s.env.Install(b)
	for _, f := range []struct {
		name   string
		params []string
		doc    string
		fn     func(interp.Args) (py.Object, error)
	}{
		{"show", []string{"value", "label=", "latex="}, "show(value, label=None, latex=False) puts a value in the report, as LaTeX with latex=True", s.show},
		{"latex", []string{"value"}, "latex(value) -> the LaTeX of an exact value, as a string", latex},
		{"table", []string{"rows", "header="}, "table(rows, header=None) puts a table in the report", s.table},
		{"setup", []string{"precision=", "seed="}, "setup(precision=256, seed=1) sets notebook defaults; command-line flags win", s.setup},
		{"plot", plotParams, plotDoc, s.plot},
		{"sequence", []string{"f", "toward=", "steps=", "ratio="}, "sequence(f, toward=0, steps=30, ratio=1/2) -> [(t, f(t)), ...] along the same walk limit() takes", s.sequence},
		{interp.Echo, []string{"value", "label=", "latex="}, "internal: shows an interactive input's value as show() does, None excepted", s.echo},
	} {
		b[f.name] = interp.Builtin(f.name, f.doc, f.params, f.fn)
	}
	claims := map[string]struct {
		params []string
		doc    string
		fn     claimBuiltin
	}{
		"identity":      {identityParams, identityDoc, s.identity},
		"factorization": {[]string{"name", "p", "factors="}, factorizationDoc, s.factorization},
		"limit":         {limitParams, limitDoc, s.limit},
		"inequality":    {inequalityParams, inequalityDoc, s.inequality},
		"asymptotic":    {asymptoticParams, asymptoticDoc, s.asymptotic},
	}
	at := func(name string, line func() int) *py.Method {
		c := claims[name]
		params := c.params
		if !slices.Contains(params, "given=") {
			// Read given= only to say why this kind of claim cannot take it.
			params = append(slices.Clone(params), "given=")
		}
		return interp.Builtin(name, c.doc, params, func(a interp.Args) (py.Object, error) { return s.makeClaim(name, line(), a, c.fn) })
	}
	for name := range claims {
		b[name] = at(name, func() int { return s.line })
	}
	b[interp.ClaimSite] = interp.Func(interp.ClaimSite, "internal: tags a claim call with its notebook line", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		if len(args) != 2 {
			return nil, py.ExceptionNewf(py.TypeError, "%s takes a line and a function", interp.ClaimSite)
		}
		line, _ := args[0].(py.Int)
		fn := args[1]
		m, ok := fn.(*py.Method)
		if !ok || b[m.Name] != fn {
			return fn, nil // the name was rebound by the notebook: call it as it is
		}
		if _, known := claims[m.Name]; !known {
			return fn, nil
		}
		return at(m.Name, func() int { return int(line) }), nil
	})
}

// makeClaim opens the record of a claim of the given kind made at line,
// lets decide fill it in, and files it with the cell. It returns whether
// the claim holds.
func (s *Session) makeClaim(kind string, line int, a interp.Args, decide claimBuiltin) (py.Object, error) {
	start := time.Now()
	if kind != "identity" && kind != "inequality" && a.Has("given") {
		return nil, py.ExceptionNewf(py.TypeError, "%s() takes no given=: a hypothesis is tested on samples, and only identity and inequality have a sampled form (over=g, samples=N); polynomial hypotheses (given=[h1, h2, ...]) are taken by identity", kind)
	}
	c, err := s.newClaim(kind, a.Get("name"), line)
	if err != nil {
		return nil, err
	}
	t := claim.Target{Bits: uint(s.precision), Cap: uint(s.settings.MaxPrecision)}
	if kind != "factorization" {
		if t, err = s.target(kind, a); err != nil {
			return nil, err
		}
	}
	if err := decide(&c, t, a); err != nil {
		return nil, err
	}
	return s.record(c, start), nil
}

func (s *Session) setup(a interp.Args) (py.Object, error) {
	// The report's header states one seed and one precision for the
	// run: a setup() that would change them after cells used the old
	// ones would make the header wrong for those cells.
	late := ""
	switch {
	case s.ran != 0:
		late = fmt.Sprintf("cell %d (line %d) ran", s.ran, s.ranLine)
	case s.env.Drawn():
		late = "a random draw in this cell"
	case len(s.outcome.Claims) > 0:
		late = "a claim in this cell"
	}
	changes := (a.Has("seed") && !s.settings.SeedFixed) || (a.Has("precision") && !s.settings.PrecisionFixed)
	if late != "" && changes {
		return nil, py.ExceptionNewf(py.ValueError, "setup() after %s: the report states one seed and one precision for the whole run, so setup() goes at the top of the first cell (a single cell takes its own as options: ```cell seed=7 precision=512)", late)
	}
	if a.Has("precision") {
		p, err := a.Int("precision", 0)
		if err != nil {
			return nil, err
		}
		if p < 2 {
			return nil, py.ExceptionNewf(py.ValueError, "setup(): precision must be at least 2 bits, got %d", p)
		}
		if p > int64(s.settings.MaxPrecision) {
			return nil, py.ExceptionNewf(py.ValueError, "setup(): precision %d is above the precision cap of %d bits (raise it with --max-precision)", p, s.settings.MaxPrecision)
		}
		if !s.settings.PrecisionFixed {
			s.settings.Precision = int(p)
			s.precision = int(p)
		}
	}
	if a.Has("seed") {
		seed, err := a.Int("seed", 0)
		if err != nil {
			return nil, err
		}
		if !s.settings.SeedFixed {
			s.settings.Seed = seed
			s.env.SetSeed(seed)
		}
	}
	return py.None, nil
}

package kernel

import (
	"math/big"
	"math/rand/v2"
	"strings"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
)

// install puts the notebook's names into the builtins module.
func (s *Session) install(b py.StringDict) {
	b["print"] = builtin("print", "print(*values, sep=' ', end='\\n') writes to the cell's output", s.print)
	b["frac"] = builtin("frac", "frac(3, 4), frac(\"-3/4\"), frac(\"1.0005\"), frac(\"2e-7\"), frac(0.1) -> exact rational", frac)
	b["matrix"] = builtin("matrix", "matrix(rows) -> exact matrix over Q", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("matrix", args, kw, []string{"rows"}, 1)
		if err != nil {
			return nil, err
		}
		if floatMode {
			return floatMatrixFromRows(a[0])
		}
		return matrixFrom(s.ring, a[0])
	})
	b["det"] = builtin("det", "det(M) -> exact determinant of a square matrix", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("det", args, kw, []string{"M"}, 1)
		if err != nil {
			return nil, err
		}
		if f, ok := a[0].(*FloatMatrix); ok {
			d, err := exact.FloatDet(f.m)
			return py.Float(d), wrapErr(err)
		}
		if floatMode {
			f, err := floatMatrixFromRows(a[0])
			if err != nil {
				return nil, err
			}
			d, err := exact.FloatDet(f.(*FloatMatrix).m)
			return py.Float(d), wrapErr(err)
		}
		m, err := matrixFrom(s.ring, a[0])
		if err != nil {
			return nil, err
		}
		if m.rows() != m.cols() {
			return nil, py.ExceptionNewf(py.ValueError, "det needs a square matrix, got %dx%d", m.rows(), m.cols())
		}
		return m.det()
	})
	b["unit_matrix"] = builtin("unit_matrix", "unit_matrix(n) -> the n x n identity matrix", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := bind("unit_matrix", args, kw, []string{"n"}, 1)
		if err != nil {
			return nil, err
		}
		n, err := intArg("unit_matrix", "n", a[0], 0)
		if err != nil {
			return nil, err
		}
		if n < 1 || n > 10000 {
			return nil, py.ExceptionNewf(py.ValueError, "unit_matrix(n) needs 1 <= n <= 10000, got %d", n)
		}
		return rationalMatrix(s.ring, exact.Identity(int(n))), nil
	})
	b["random_matrix"] = builtin("random_matrix", "random_matrix(rows, cols, bound=10, denom=1, seed=None) -> matrix of random rationals p/q, |p| <= bound, 1 <= q <= denom", s.randomMatrix)
	b["show"] = builtin("show", "show(value, label=None) puts a value in the report", s.show)
	b["table"] = builtin("table", "table(rows, header=None) puts a table in the report", s.table)
	b["setup"] = builtin("setup", "setup(precision=256, seed=1) sets notebook defaults; command-line flags win", s.setup)
	claims := map[string]func(line int, args py.Tuple, kw py.StringDict) (py.Object, error){
		"identity":      s.identity,
		"factorization": s.factorization,
		"limit":         s.limit,
		"inequality":    s.inequality,
	}
	docs := map[string]string{"identity": identityDoc, "factorization": factorizationDoc, "limit": limitDoc, "inequality": inequalityDoc}
	for name, impl := range claims {
		b[name] = builtin(name, docs[name], func(args py.Tuple, kw py.StringDict) (py.Object, error) {
			return impl(s.line, args, kw)
		})
	}
	b[siteName] = builtin(siteName, "internal: tags a claim call with its notebook line", func(args py.Tuple, kw py.StringDict) (py.Object, error) {
		if len(args) != 2 {
			return nil, py.ExceptionNewf(py.TypeError, "%s takes a line and a function", siteName)
		}
		line, _ := args[0].(py.Int)
		fn := args[1]
		m, ok := fn.(*py.Method)
		if !ok || claims[m.Name] == nil || b[m.Name] != fn {
			return fn, nil // the name was rebound by the notebook: call it as it is
		}
		impl := claims[m.Name]
		return builtin(m.Name, docs[m.Name], func(args py.Tuple, kw py.StringDict) (py.Object, error) {
			return impl(int(line), args, kw)
		}), nil
	})
	s.installPolynomials(b)
	s.installReals(b)
	s.installGeometry(b)
	s.installLimits(b)
	b["plot"] = builtin("plot", plotDoc, s.plot)
	b["box"] = builtin("box", "box(dim, lo, hi, denom=1, seed=None) -> a family of random rational points; g(k) gives point k", s.box)
}

func (s *Session) print(args py.Tuple, kw py.StringDict) (py.Object, error) {
	sep, end := " ", "\n"
	for k, v := range kw {
		switch k {
		case "sep", "end":
			if v == py.None {
				continue
			}
			text, ok := v.(py.String)
			if !ok {
				return nil, py.ExceptionNewf(py.TypeError, "print(): %s must be a string", k)
			}
			if k == "sep" {
				sep = string(text)
			} else {
				end = string(text)
			}
		case "flush":
		case "file":
			return nil, py.ExceptionNewf(py.PermissionError, "print(file=...) is not available: %s", sandboxMessage)
		default:
			return nil, py.ExceptionNewf(py.TypeError, "print() has no argument %q", k)
		}
	}
	var b strings.Builder
	for i, a := range args {
		if i > 0 {
			b.WriteString(sep)
		}
		b.WriteString(str(a))
	}
	b.WriteString(end)
	s.write(b.String())
	return py.None, nil
}

func frac(args py.Tuple, kw py.StringDict) (py.Object, error) {
	res, err := exactFrac(args, kw)
	if err != nil || !floatMode {
		return res, err
	}
	return floatValue(res)
}

func exactFrac(args py.Tuple, kw py.StringDict) (py.Object, error) {
	a, err := bind("frac", args, kw, []string{"x", "denominator"}, 1)
	if err != nil {
		return nil, err
	}
	if a[1] != nil {
		p, ok1 := exactOf(a[0])
		q, ok2 := exactOf(a[1])
		if !ok1 || !ok2 {
			return nil, py.ExceptionNewf(py.TypeError, "frac(p, q) needs exact numbers, got %s and %s", typeName(a[0]), typeName(a[1]))
		}
		v, err := ratQuo(p, q)
		if err != nil {
			return nil, err
		}
		return newRational(v), nil
	}
	switch x := a[0].(type) {
	case py.String:
		v, err := exact.ParseRat(string(x))
		if err != nil {
			return nil, wrapErr(err)
		}
		return newRational(v), nil
	case py.Float:
		v, err := exact.RatFromFloat(float64(x))
		if err != nil {
			return nil, py.ExceptionNewf(py.ValueError, "frac(%v): %v", float64(x), err)
		}
		return newRational(v), nil
	}
	if v, ok := exactOf(a[0]); ok {
		return newRational(new(big.Rat).Set(v)), nil
	}
	return nil, py.ExceptionNewf(py.TypeError, "frac() takes an int, a rational, a string or a float, got %s", typeName(a[0]))
}

func (s *Session) show(args py.Tuple, kw py.StringDict) (py.Object, error) {
	a, err := bind("show", args, kw, []string{"value", "label"}, 1)
	if err != nil {
		return nil, err
	}
	text := str(a[0])
	if a[1] != nil && a[1] != py.None {
		label := str(a[1])
		if strings.Contains(text, "\n") {
			text = label + " =\n" + text
		} else {
			text = label + " = " + text
		}
	}
	s.write(text + "\n")
	return py.None, nil
}

func (s *Session) table(args py.Tuple, kw py.StringDict) (py.Object, error) {
	a, err := bind("table", args, kw, []string{"rows", "header"}, 1)
	if err != nil {
		return nil, err
	}
	rows, err := sequence(a[0], "table rows")
	if err != nil {
		return nil, err
	}
	var t cells.Table
	width := -1
	if a[1] != nil && a[1] != py.None {
		hs, err := sequence(a[1], "table header")
		if err != nil {
			return nil, err
		}
		for _, h := range hs {
			t.Header = append(t.Header, str(h))
		}
		width = len(hs)
	}
	for i, r := range rows {
		items, err := sequence(r, "a table row")
		if err != nil {
			return nil, err
		}
		if width < 0 {
			width = len(items)
		}
		if len(items) != width {
			return nil, py.ExceptionNewf(py.ValueError, "table row %d has %d entries, expected %d", i, len(items), width)
		}
		row := make([]string, len(items))
		for j, it := range items {
			row[j] = str(it)
		}
		t.Rows = append(t.Rows, row)
	}
	if s.shows() {
		s.outcome.Tables = append(s.outcome.Tables, t)
	}
	return py.None, nil
}

func (s *Session) setup(args py.Tuple, kw py.StringDict) (py.Object, error) {
	a, err := bind("setup", args, kw, []string{"precision", "seed"}, 0)
	if err != nil {
		return nil, err
	}
	if a[0] != nil {
		p, err := intArg("setup", "precision", a[0], 0)
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
	if a[1] != nil {
		seed, err := intArg("setup", "seed", a[1], 0)
		if err != nil {
			return nil, err
		}
		if !s.settings.SeedFixed {
			s.settings.Seed = seed
			s.seed = seed
		}
	}
	return py.None, nil
}

// rng returns a generator: from an explicit seed alone, or else from the
// cell's seed and the number of draws so far, so reruns repeat exactly.
func (s *Session) rng(explicit py.Object) (*rand.Rand, error) {
	if explicit != nil && explicit != py.None {
		seed, err := intArg("random", "seed", explicit, 0)
		if err != nil {
			return nil, err
		}
		return rand.New(rand.NewPCG(uint64(seed), 0x6173736179)), nil
	}
	if s.sweeping {
		// Sample k must be the same whichever kernel computes it, and
		// in whatever order: a draw may depend on k, not on earlier draws.
		return nil, py.ExceptionNewf(py.ValueError, "a random draw without seed= inside a sampled claim's f or g: pass seed= (for instance seed=k) so that sample k can be rebuilt, and split among workers")
	}
	s.draws++
	return rand.New(rand.NewPCG(uint64(s.seed), uint64(s.cell)<<32|s.draws)), nil
}

func (s *Session) randomMatrix(args py.Tuple, kw py.StringDict) (py.Object, error) {
	a, err := bind("random_matrix", args, kw, []string{"rows", "cols", "bound", "denom", "seed"}, 2)
	if err != nil {
		return nil, err
	}
	var n [4]int64
	for i, def := range []int64{0, 0, 10, 1} {
		if n[i], err = intArg("random_matrix", []string{"rows", "cols", "bound", "denom"}[i], a[i], def); err != nil {
			return nil, err
		}
	}
	if n[0] < 1 || n[1] < 1 || n[0]*n[1] > 1<<20 || n[2] < 0 || n[3] < 1 {
		return nil, py.ExceptionNewf(py.ValueError, "random_matrix needs rows, cols >= 1 (at most 2^20 entries), bound >= 0 and denom >= 1")
	}
	r, err := s.rng(a[4])
	if err != nil {
		return nil, err
	}
	m := exact.Zeros(int(n[0]), int(n[1]))
	for i := 0; i < int(n[0]); i++ {
		for j := 0; j < int(n[1]); j++ {
			p := r.Int64N(2*n[2]+1) - n[2]
			q := r.Int64N(n[3]) + 1
			m.Set(i, j, big.NewRat(p, q))
		}
	}
	return rationalMatrix(s.ring, m), nil
}

package session

import (
	"fmt"
	"os"
	"runtime/debug"
	"strings"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/kernel/interp"
	"assay/kernel/interp/pyext"
	"assay/kernel/values"
)

// Settings are the run-wide defaults a session starts with.
type Settings struct {
	Seed      int64 `json:"seed"`
	Precision int   `json:"precision"`
	// SeedFixed and PrecisionFixed mean the command line set them, so a
	// notebook's setup() cannot change them.
	SeedFixed      bool `json:"seed_fixed,omitempty"`
	PrecisionFixed bool `json:"precision_fixed,omitempty"`
	// MaxTerms caps the terms of any polynomial (0: exact.DefaultMaxTerms).
	MaxTerms int `json:"max_terms,omitempty"`
	// MaxPrecision caps the bits of any certified-real refinement (0: DefaultMaxPrecision).
	MaxPrecision int `json:"max_precision,omitempty"`
	// MaxDegree caps the degree of the polynomials a minimal polynomial
	// is computed through (0: exact.DefaultMaxDegree).
	MaxDegree int `json:"max_degree,omitempty"`
	// Driven means a driver answers the kernel's exchanges: it splits
	// sampled claims among workers and shards and merges their tallies.
	Driven bool `json:"driven,omitempty"`
}

// DefaultMaxPrecision is the default cap, in bits, on refining a certified real
// (about 39,000 decimal digits).
const DefaultMaxPrecision = 1 << 17

// DefaultSettings are used when neither flags nor setup() say otherwise.
var DefaultSettings = Settings{Seed: 1, Precision: 256}

// Session is one notebook's interpreter: one namespace shared by its cells.
type Session struct {
	sandbox  *interp.Sandbox
	globals  py.StringDict
	env      *values.Env
	settings Settings
	claimAt  map[string]int // claim name -> line where it was made
	coord    Coordinator    // splits and merges sampled claims
	printed  bool           // f or g printed during the sweep
	// elsewhere is the time other kernels spent on the claim being made,
	// when their result came whole (a merge of shard parts).
	elsewhere float64
	// stageSent and stageAt are the last stage passed to the driver, and
	// when (stage in coordinator.go).
	stageSent string
	stageAt   time.Time

	// Per-cell state, reset by Run.
	cell      int
	line      int
	precision int // working precision in bits for this cell
	out       strings.Builder
	outcome   *cells.Outcome
	// ran is the first cell that ran to its end, 0 before one has: a
	// setup() after it would change the defaults the report's header
	// states for cells that did not use them.
	ran, ranLine int
}

// New makes a session with a fresh namespace.
func New(s Settings) (*Session, error) {
	if s.Precision == 0 {
		s.Precision = DefaultSettings.Precision
	}
	if s.MaxPrecision == 0 {
		s.MaxPrecision = DefaultMaxPrecision
	}
	env := values.NewEnv(s.MaxTerms, uint(s.MaxPrecision))
	env.MaxDegree = s.MaxDegree
	sb, err := interp.NewSandbox(env)
	if err != nil {
		return nil, err
	}
	pyext.Install(sb.Builtins())
	interp.WatchIntrospection(sb.Builtins().Globals)
	env.Raised = sb.Raised
	env.Telltales, env.Telltale = sb.Telltales, sb.NoteTelltale
	interp.WatchState(sb, sb.Builtins().Globals)
	sess := &Session{sandbox: sb, env: env, settings: s, claimAt: map[string]int{}, coord: solo{}}
	env.Stage = sess.stage
	sess.install(sb.Builtins().Globals)
	stream := &outputStream{s: sess}
	sys := sb.Sys()
	for _, name := range []string{"stdout", "stderr", "__stdout__", "__stderr__"} {
		sys[name] = stream
	}
	if sess.globals, err = sb.Main(); err != nil {
		return nil, err
	}
	return sess, nil
}

// Settings reports the settings in force (setup() may have changed them).
func (s *Session) Settings() Settings { return s.settings }

// SetCoordinator gives the session the driver that splits its sampled claims.
func (s *Session) SetCoordinator(c Coordinator) { s.coord = c }

// Close releases the interpreter.
func (s *Session) Close() { s.sandbox.Close() }

// Cell is one cell to run.
type Cell struct {
	Index   int               `json:"cell"`
	Line    int               `json:"line"` // notebook line of the first source line
	Source  string            `json:"source"`
	Options cells.CellOptions `json:"options"`
	// Echo shows the value of the last statement when it is an expression
	// (an input typed at assay repl), as show() shows it; None is not shown.
	Echo bool `json:"echo,omitempty"`
}

// Run executes one cell in the session's namespace and returns its outcome.
// Go panics inside builtins become the cell's error, never a crash.
func (s *Session) Run(c Cell) (out cells.Outcome) {
	start := time.Now()
	s.cell, s.line = c.Index, c.Line
	s.out.Reset()
	seed := s.settings.Seed
	if c.Options.Seed != nil {
		seed = *c.Options.Seed
	}
	s.env.StartCell(c.Index, seed)
	s.env.Deadline = time.Time{}
	if t := c.Options.Timeout; t > 0 {
		// A long computation stops itself before the cell's limit, so its
		// message can say where it was (exact.ErrDeadline); the parent's
		// timeout stays the hard limit. The margin, a tenth of the limit
		// but at least a second (half of a short limit), leaves a step of
		// the computation time to finish on a loaded machine.
		s.env.Deadline = start.Add(t - max(t/10, min(time.Second, t/2)))
	}
	s.precision = s.settings.Precision
	if c.Options.Precision > 0 {
		s.precision = c.Options.Precision
	}
	out = cells.Outcome{Cell: c.Index, Status: cells.Ran}
	s.outcome = &out
	defer func() {
		if s.ran == 0 {
			s.ran, s.ranLine = c.Index, c.Line
		}
	}()
	if s.precision > s.settings.MaxPrecision {
		out.Status = cells.Failed
		out.Error = &cells.Problem{Cell: c.Index, Line: c.Line - 1, Message: fmt.Sprintf("precision=%d is above the precision cap of %d bits (raise it with --max-precision)", s.precision, s.settings.MaxPrecision)}
		return out
	}
	defer func() {
		if r := recover(); r != nil {
			// Builtins and operators have their own guard; this one is the
			// last resort. The Go stack goes to the kernel's standard error,
			// for a developer, never into a report.
			fmt.Fprintf(os.Stderr, "assay: internal error in cell %d: %v\n%s", c.Index, r, debug.Stack())
			out.Status = cells.Failed
			out.Error = &cells.Problem{Cell: c.Index, Line: c.Line, Message: fmt.Sprintf("internal error: %v (a fault in assay, not in the notebook)", r)}
		}
		out.Output = s.out.String()
		out.Seconds = time.Since(start).Seconds()
		s.outcome = nil
	}()
	src := c.Source
	if c.Echo {
		src = interp.EchoLast(src, claimNames)
	}
	code, err := interp.Compile(c.Index, c.Line, src, claimNames)
	if err == nil {
		_, err = s.sandbox.RunCode(code, s.globals, s.globals, nil)
	}
	if err != nil {
		out.Status = cells.Failed
		line, msg := interp.Describe(err, c.Line)
		if last := c.Line + strings.Count(strings.TrimRight(c.Source, "\n"), "\n"); line > last {
			line = last // "unexpected EOF" points past the cell
		}
		out.Error = &cells.Problem{Cell: c.Index, Line: line, Message: msg}
	}
	return out
}

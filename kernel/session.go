package kernel

import (
	"errors"
	"fmt"
	"runtime/debug"
	"strings"
	"time"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/exact"
	"assay/kernel/interp/pyext"
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
	ctx      *sandbox
	globals  py.StringDict
	ring     *exact.Ring // the notebook's polynomial variables
	settings Settings
	claimAt  map[string]int // claim name -> line where it was made
	coord    coordinator    // splits and merges sampled claims
	sweeping bool           // inside a sampled claim's f or g
	printed  bool           // f or g printed during the sweep
	// elsewhere is the time other kernels spent on the claim being made,
	// when their result came whole (a merge of shard parts).
	elsewhere float64

	// Per-cell state, reset by Run.
	cell      int
	line      int
	seed      int64 // seed in force for this cell
	precision int   // working precision in bits for this cell
	out       strings.Builder
	outcome   *cells.Outcome
	draws     uint64 // random draws taken without an explicit seed
}

// NewSession makes a session with a fresh namespace.
func NewSession(s Settings) (*Session, error) {
	if s.Precision == 0 {
		s.Precision = DefaultSettings.Precision
	}
	if s.MaxPrecision == 0 {
		s.MaxPrecision = DefaultMaxPrecision
	}
	ctx, err := newSandbox()
	if err != nil {
		return nil, err
	}
	pyext.Install(ctx.store.Builtins)
	sess := &Session{ctx: ctx, settings: s, claimAt: map[string]int{}, ring: exact.NewRing(), coord: solo{}}
	sess.ring.SetMaxTerms(s.MaxTerms)
	sess.install(ctx.store.Builtins.Globals)
	sys := ctx.store.MustGetModule("sys").Globals
	stream := &outputStream{s: sess}
	for _, name := range []string{"stdout", "stderr", "__stdout__", "__stderr__"} {
		sys[name] = stream
	}
	main, err := ctx.store.NewModule(ctx, &py.ModuleImpl{Info: py.ModuleInfo{Name: py.MainModuleName}})
	if err != nil {
		return nil, err
	}
	sess.globals = main.Globals
	return sess, nil
}

// Settings reports the settings in force (setup() may have changed them).
func (s *Session) Settings() Settings { return s.settings }

// Close releases the interpreter.
func (s *Session) Close() { s.ctx.Close() }

// Cell is one cell to run.
type Cell struct {
	Index   int               `json:"cell"`
	Line    int               `json:"line"` // notebook line of the first source line
	Source  string            `json:"source"`
	Options cells.CellOptions `json:"options"`
}

// Run executes one cell in the session's namespace and returns its outcome.
// Go panics inside builtins become the cell's error, never a crash.
func (s *Session) Run(c Cell) (out cells.Outcome) {
	start := time.Now()
	s.cell, s.line = c.Index, c.Line
	s.out.Reset()
	s.seed = s.settings.Seed
	if c.Options.Seed != nil {
		s.seed = *c.Options.Seed
	}
	s.precision = s.settings.Precision
	if c.Options.Precision > 0 {
		s.precision = c.Options.Precision
	}
	s.draws = 0
	out = cells.Outcome{Cell: c.Index, Status: cells.Ran}
	s.outcome = &out
	if s.precision > s.settings.MaxPrecision {
		out.Status = cells.Failed
		out.Error = &cells.Problem{Cell: c.Index, Line: c.Line - 1, Message: fmt.Sprintf("precision=%d is above the precision cap of %d bits (raise it with --max-precision)", s.precision, s.settings.MaxPrecision)}
		return out
	}
	defer func() {
		if r := recover(); r != nil {
			out.Status = cells.Failed
			out.Error = &cells.Problem{Cell: c.Index, Line: c.Line, Message: fmt.Sprintf("internal error: %v\n%s", r, debug.Stack())}
		}
		out.Output = s.out.String()
		out.Seconds = time.Since(start).Seconds()
		s.outcome = nil
	}()
	code, err := prepare(c.Index, c.Line, c.Source)
	if err == nil {
		_, err = s.ctx.RunCode(code, s.globals, s.globals, nil)
	}
	if err != nil {
		out.Status = cells.Failed
		line, msg := describe(err, c.Line)
		if last := c.Line + strings.Count(strings.TrimRight(c.Source, "\n"), "\n"); line > last {
			line = last // "unexpected EOF" points past the cell
		}
		out.Error = &cells.Problem{Cell: c.Index, Line: line, Message: msg}
	}
	return out
}

// describe turns an interpreter error into a notebook line and a message.
func describe(err error, fallback int) (int, string) {
	var info py.ExceptionInfo
	switch e := err.(type) {
	case py.ExceptionInfo:
		info = e
	case *py.ExceptionInfo:
		info = *e
	case *py.Exception:
		return exceptionLine(e, fallback), exceptionText(e)
	default:
		var pe *py.Exception
		if errors.As(err, &pe) {
			return exceptionLine(pe, fallback), exceptionText(pe)
		}
		return fallback, err.Error()
	}
	exc, _ := info.Value.(*py.Exception)
	var lines []int // notebook frames, outermost first
	for tb := info.Traceback; tb != nil; tb = tb.Next {
		if strings.HasPrefix(tb.Frame.Code.Filename, "<cell ") {
			lines = append(lines, int(tb.Lineno))
		}
	}
	line, msg := fallback, info.Error()
	if len(lines) > 0 {
		line = lines[len(lines)-1]
	}
	if exc != nil {
		if l := exceptionLine(exc, 0); l > 0 {
			line = l // syntax errors carry their own line
		}
		msg = exceptionText(exc)
	}
	if len(lines) > 1 {
		var outer []string
		for _, l := range lines[:len(lines)-1] {
			outer = append(outer, fmt.Sprint(l))
		}
		msg += " (called from line " + strings.Join(outer, ", line ") + ")"
	}
	return line, msg
}

func exceptionLine(e *py.Exception, fallback int) int {
	if l, ok := e.Dict["lineno"].(py.Int); ok && l > 0 {
		return int(l)
	}
	return fallback
}

// exceptionMessage is an exception's arguments, without its type name.
func exceptionMessage(e *py.Exception) string {
	var parts []string
	args, _ := e.Args.(py.Tuple)
	for _, a := range args {
		s, err := py.StrAsString(a)
		if err == nil {
			parts = append(parts, s)
		}
	}
	return strings.Join(parts, ", ")
}

func exceptionText(e *py.Exception) string {
	name := e.Base.Name
	text := exceptionMessage(e)
	if name == "SyntaxError" {
		if off, ok := e.Dict["offset"].(py.Int); ok && off > 0 {
			text += fmt.Sprintf(" (column %d)", int(off))
		}
	}
	if text == "" {
		return name
	}
	return name + ": " + text
}

// write appends text to the cell's output.
func (s *Session) write(text string) {
	if s.shows() {
		s.out.WriteString(text)
	}
}

// shows says whether output may go into the report now. During a sweep it
// may not: a sample may be computed by any kernel, so what it prints, shows
// or plots cannot be put in order; it is left out, and the claim says so.
func (s *Session) shows() bool {
	if s.sweeping {
		s.printed = true
		return false
	}
	return true
}

// outputStream stands in for sys.stdout so writes land in the cell's output.
type outputStream struct{ s *Session }

var outputStreamType = py.NewType("cell_output", "The cell's output; print() writes here.")

// Type returns the stream's type.
func (o *outputStream) Type() *py.Type { return outputStreamType }

func init() {
	outputStreamType.Dict["write"] = py.MustNewMethod("write", func(self, arg py.Object) (py.Object, error) {
		text, err := py.StrAsString(arg)
		if err != nil {
			return nil, err
		}
		self.(*outputStream).s.write(text)
		return py.Int(len(text)), nil
	}, 0, "write(text) appends to the cell's output")
	outputStreamType.Dict["flush"] = py.MustNewMethod("flush", func(self py.Object) (py.Object, error) {
		return py.None, nil
	}, 0, "flush() does nothing")
}

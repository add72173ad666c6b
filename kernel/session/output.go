package session

import (
	"strings"

	"github.com/go-python/gpython/py"

	"assay/cells"
	"assay/kernel/interp"
	"assay/kernel/values"
)

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
	if s.env.Sweeping {
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
	outputStreamType.Dict["write"] = interp.Method("write", "write(text) appends to the cell's output", func(self py.Object, args py.Tuple, kw py.StringDict) (py.Object, error) {
		a, err := interp.Bind("write", args, kw, "text")
		if err != nil {
			return nil, err
		}
		text, err := py.StrAsString(a.Get("text"))
		if err != nil {
			return nil, err
		}
		self.(*outputStream).s.write(text)
		return py.Int(len(text)), nil
	})
	outputStreamType.Dict["flush"] = interp.Method("flush", "flush() does nothing", func(py.Object, py.Tuple, py.StringDict) (py.Object, error) {
		return py.None, nil
	})
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
			return nil, py.ExceptionNewf(py.PermissionError, "print(file=...) is not available: %s", interp.SandboxMessage)
		default:
			return nil, py.ExceptionNewf(py.TypeError, "print() has no argument %q", k)
		}
	}
	var b strings.Builder
	for i, a := range args {
		if i > 0 {
			b.WriteString(sep)
		}
		b.WriteString(interp.Str(a))
	}
	b.WriteString(end)
	s.write(b.String())
	return py.None, nil
}

func (s *Session) show(a interp.Args) (py.Object, error) {
	text := interp.Str(a.Get("value"))
	asLaTeX, err := a.Bool("latex", false)
	if err != nil {
		return nil, err
	}
	if asLaTeX {
		if text, err = values.LaTeX(a.Get("value")); err != nil {
			return nil, err
		}
	} else if x, ok := a.Get("value").(*values.Real); ok {
		var err error
		if text, err = x.Show(); err != nil {
			return nil, err
		}
	}
	if a.Given("label") {
		label := interp.Str(a.Get("label"))
		if strings.Contains(text, "\n") {
			text = label + " =\n" + text
		} else {
			text = label + " = " + text
		}
	}
	s.write(text + "\n")
	return py.None, nil
}

// echo shows an interactive input's value; None is not shown.
func (s *Session) echo(a interp.Args) (py.Object, error) {
	if a.Get("value") == py.None {
		return py.None, nil
	}
	return s.show(a)
}

func (s *Session) table(a interp.Args) (py.Object, error) {
	rows, err := values.Sequence(a.Get("rows"), "table rows")
	if err != nil {
		return nil, err
	}
	var t cells.Table
	width := -1
	if a.Given("header") {
		hs, err := values.Sequence(a.Get("header"), "table header")
		if err != nil {
			return nil, err
		}
		for _, h := range hs {
			t.Header = append(t.Header, interp.Str(h))
		}
		width = len(hs)
	}
	for i, r := range rows {
		items, err := values.Sequence(r, "a table row")
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
			row[j] = interp.Str(it)
		}
		t.Rows = append(t.Rows, row)
	}
	if s.shows() {
		s.outcome.Tables = append(s.outcome.Tables, t)
	}
	return py.None, nil
}

func latex(a interp.Args) (py.Object, error) {
	s, err := values.LaTeX(a.Get("value"))
	return py.String(s), err
}

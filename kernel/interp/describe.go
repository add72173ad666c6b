package interp

import (
	"errors"
	"fmt"
	"strings"

	"github.com/go-python/gpython/py"
)

// Describe turns an interpreter error into the notebook line it happened
// on (fallback when it names none) and a message: the exception's type and
// text, and the lines of the calls that led there.
func Describe(err error, fallback int) (int, string) {
	var info py.ExceptionInfo
	switch e := err.(type) {
	case py.ExceptionInfo:
		info = e
	case *py.ExceptionInfo:
		info = *e
	case *py.Exception:
		return exceptionLine(e, fallback), ExceptionText(e)
	default:
		var pe *py.Exception
		if errors.As(err, &pe) {
			return exceptionLine(pe, fallback), ExceptionText(pe)
		}
		return fallback, err.Error()
	}
	exc, _ := info.Value.(*py.Exception)
	var lines []int // notebook frames, outermost first
	for tb := info.Traceback; tb != nil; tb = tb.Next {
		if strings.HasPrefix(tb.Frame.Code.Filename, cellPrefix) {
			lines = append(lines, int(tb.Lineno))
		}
	}
	line, msg := fallback, info.Error()
	if len(lines) > 0 {
		line = lines[len(lines)-1]
	}
	if exc != nil {
		msg = ExceptionText(exc)
		if l := exceptionLine(exc, 0); l > 0 {
			// A syntax error carries its own line: a notebook line when
			// it is in a cell, a line of a string when exec or compile
			// met it, which the message then names beside the cell's line.
			if file, _ := exc.Dict["filename"].(py.String); strings.HasPrefix(string(file), cellPrefix) || len(lines) == 0 {
				line = l
			} else {
				msg += fmt.Sprintf(", at line %d of the code given to exec or compile", l)
			}
		}
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

// Message is Describe's message alone.
func Message(err error) string {
	_, msg := Describe(err, 0)
	return msg
}

func exceptionLine(e *py.Exception, fallback int) int {
	if l, ok := e.Dict["lineno"].(py.Int); ok && l > 0 {
		return int(l)
	}
	return fallback
}

// ExceptionMessage is an exception's arguments, without its type name.
func ExceptionMessage(e *py.Exception) string {
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

// ExceptionText is "Type: message", with the column of a syntax error.
func ExceptionText(e *py.Exception) string {
	name := e.Base.Name
	text := ExceptionMessage(e)
	if name == "SyntaxError" {
		if off, ok := e.Dict["offset"].(py.Int); ok && off > 0 {
			text += fmt.Sprintf(" (column %d)", int(off))
		}
		if note, ok := e.Dict["note"].(py.String); ok {
			text += "; " + string(note)
		}
	}
	if text == "" {
		return name
	}
	return name + ": " + text
}

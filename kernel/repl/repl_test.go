package repl

import (
	"bufio"
	"errors"
	"io"
	"reflect"
	"strings"
	"testing"
)

// Inputs are split as an interactive Python splits them (from memory):
// a line, unless a bracket or string is open or a block has begun; a
// block ends at a blank line, and so does every input.
func TestReadSplitsInputs(t *testing.T) {
	text := "x = 1\n\n\ndef f(y):\n    if y:\n        return 1\n    return 2\n\n[1,\n\n 2]\nf(\n 1)\nfor i in range(2):\n    x = i"
	in := plain{bufio.NewReader(strings.NewReader(text))}
	var got []string
	for {
		src, err := read(in)
		if src != "" {
			got = append(got, src)
		}
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatal(err)
		}
	}
	want := []string{"x = 1", "def f(y):\n    if y:\n        return 1\n    return 2", "[1,", " 2]", "f(\n 1)", "for i in range(2):\n    x = i"}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("inputs %q, want %q", got, want)
	}
}

package proto

import (
	"bufio"
	"encoding/json"
	"strings"
	"testing"
)

// The protocol answers every request line with exactly one reply line,
// including requests it cannot take.
func TestServeProtocol(t *testing.T) {
	in := strings.Join([]string{
		`{"op":"run","cell":{"cell":1,"line":3,"source":"x = 1"}}`,
		`not json`,
		`{"op":"start","settings":{"seed":5,"precision":128}}`,
		`{"op":"run","cell":{"cell":1,"line":3,"source":"x = frac(1, 2)\nprint(x + x)"}}`,
		`{"op":"run","cell":{"cell":2,"line":8,"source":"identity(\"half\", 2 * x, 1)\ny = x / 0"}}`,
		`{"op":"run"}`,
		`{"op":"dance"}`,
	}, "\n") + "\n"
	var out strings.Builder
	if err := Serve(strings.NewReader(in), &out); err != nil {
		t.Fatal(err)
	}
	var replies []Reply
	sc := bufio.NewScanner(strings.NewReader(out.String()))
	for sc.Scan() {
		var r Reply
		if err := json.Unmarshal(sc.Bytes(), &r); err != nil {
			t.Fatalf("reply is not one JSON line: %q", sc.Text())
		}
		replies = append(replies, r)
	}
	if len(replies) != 7 {
		t.Fatalf("%d replies to 7 requests", len(replies))
	}
	if replies[0].Error != "run before start" || !strings.Contains(replies[1].Error, "bad request") {
		t.Errorf("errors before start: %q, %q", replies[0].Error, replies[1].Error)
	}
	if replies[2].Error != "" || replies[2].Settings.Seed != 5 || replies[2].Version != Version {
		t.Errorf("start: %+v", replies[2])
	}
	if o := replies[3].Outcome; o == nil || o.Output != "1\n" {
		t.Errorf("first cell: %+v", o)
	}
	o := replies[4].Outcome
	if o == nil || len(o.Claims) != 1 || o.Claims[0].Line != 8 || o.Error == nil || o.Error.Line != 9 {
		t.Errorf("second cell: %+v", o)
	}
	if replies[5].Error != "run without a cell" || !strings.Contains(replies[6].Error, "unknown op") {
		t.Errorf("bad requests: %q, %q", replies[5].Error, replies[6].Error)
	}
}

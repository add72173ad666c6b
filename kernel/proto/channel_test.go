package proto

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"strings"
	"testing"
	"time"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/session"
)

// TestMain lets the test binary stand in for a kernel process: the real
// one (ASSAY_TEST_KERNEL=1), or one that breaks the protocol in the way
// ASSAY_TEST_KERNEL names.
func TestMain(m *testing.M) {
	switch mode := os.Getenv("ASSAY_TEST_KERNEL"); mode {
	case "":
		os.Exit(m.Run())
	case "1":
		if err := ServeChild(os.Stdin, os.Stdout); err != nil {
			os.Exit(2)
		}
		os.Exit(0)
	default:
		badKernel(mode)
		os.Exit(0)
	}
}

// badKernel answers start as a kernel should, then answers a run in the
// way mode names; "deaf" outlives the end of its requests.
func badKernel(mode string) {
	requests, replies, _, err := openChannel()
	if err != nil {
		os.Exit(3)
	}
	sc := bufio.NewScanner(requests)
	enc := json.NewEncoder(replies)
	var nonce string
	for sc.Scan() {
		var req Request
		json.Unmarshal(sc.Bytes(), &req)
		if req.Op == "start" {
			nonce = req.Nonce
			enc.Encode(Reply{Version: Version, Nonce: nonce})
			continue
		}
		good := Reply{Version: Version, Nonce: nonce, Cell: req.Cell.Index, Outcome: &cells.Outcome{Cell: req.Cell.Index, Status: cells.Ran}}
		switch mode {
		case "wrong-nonce":
			good.Nonce = "guessed"
			enc.Encode(good)
		case "wrong-cell":
			good.Cell++
			good.Outcome.Cell++
			enc.Encode(good)
		case "outcome-of-another-cell":
			good.Outcome.Cell++
			enc.Encode(good)
		case "two-replies":
			enc.Encode(good)
			enc.Encode(good)
		case "not-a-reply":
			replies.WriteString("*** a debug line of the interpreter\n")
		case "long":
			good.Outcome.Output = strings.Repeat("x", 4<<20)
			enc.Encode(good)
		}
	}
	if mode == "deaf" {
		time.Sleep(time.Hour) // outlives its requests, until it is killed
	}
}

// A cell sent right behind the start request, before its reply, is run
// once the session is open; the replies come in the order of the
// requests, and a reply beyond them is refused as before.
func TestRequestsAnsweredInOrder(t *testing.T) {
	t.Setenv("ASSAY_TEST_KERNEL", "1")
	inbox := make(chan Message, 16)
	p, err := Start([]string{os.Args[0]}, session.DefaultSettings, Limits{}, inbox)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(p.Kill)
	for i := 1; i <= 2; i++ {
		if err := p.Send(Request{Op: "run", Cell: &session.Cell{Index: i, Line: 10 * i, Source: fmt.Sprintf("x%d = %d", i, i)}}); err != nil {
			t.Fatal(err)
		}
	}
	if m := receive(t, inbox); m.Dead || m.Reply.Error != "" || m.Reply.Outcome != nil {
		t.Fatalf("the first reply, to start: %+v, %v", m, p.Death())
	}
	for i := 1; i <= 2; i++ {
		m := receive(t, inbox)
		if m.Dead || m.Reply.Outcome == nil || m.Reply.Outcome.Cell != i || m.Reply.Outcome.Status != cells.Ran {
			t.Fatalf("reply %d: %+v, want cell %d's outcome (%v)", i+1, m.Reply, i, p.Death())
		}
	}
	p.mu.Lock()
	left := len(p.want)
	p.mu.Unlock()
	if left != 0 {
		t.Errorf("%d requests still outstanding after their replies", left)
	}
}

// Release ends a kernel without waiting for it to exit: a kernel ends
// with its requests, and one that does not ("deaf") is killed 2 s later.
func TestRelease(t *testing.T) {
	for _, mode := range []string{"1", "deaf"} {
		t.Run(mode, func(t *testing.T) {
			p, _ := startKernel(t, mode, Limits{})
			p.Release()
			if mode == "deaf" {
				select {
				case <-p.exited:
					t.Fatal("a kernel that outlives its requests exited before it was killed")
				default: // Release returned without waiting
				}
			}
			select {
			case <-p.exited:
			case <-time.After(10 * time.Second):
				t.Fatal("the kernel still runs 10 s after Release")
			}
			if killed := p.state.ExitCode() == -1; killed != (mode == "deaf") {
				t.Errorf("ended by a kill: %v (%v), want %v", killed, p.state, mode == "deaf")
			}
		})
	}
}

// startKernel starts this test binary as a kernel in the given mode and
// waits for its start reply.
func startKernel(t *testing.T, mode string, lim Limits) (*Process, chan Message) {
	t.Helper()
	t.Setenv("ASSAY_TEST_KERNEL", mode)
	inbox := make(chan Message, 16)
	p, err := Start([]string{os.Args[0]}, session.DefaultSettings, lim, inbox)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(p.Kill)
	if m := receive(t, inbox); m.Dead || m.Reply.Error != "" || m.Reply.Nonce != p.nonce {
		t.Fatalf("start: %+v, %v", m, p.Death())
	}
	return p, inbox
}

// receive waits a few seconds for a message.
func receive(t *testing.T, inbox chan Message) Message {
	t.Helper()
	select {
	case m := <-inbox:
		return m
	case <-time.After(10 * time.Second):
		t.Fatal("no message from the kernel")
		return Message{}
	}
}

// A reply that does not answer the request outstanding — another run's
// nonce, another cell, a second reply, a line that is no reply, a line
// longer than the output cap allows — ends the process, and its death
// says why.
func TestRepliesMustAnswerTheRequest(t *testing.T) {
	cases := []struct{ mode, want string }{
		{"wrong-nonce", "without this run's nonce"},
		{"wrong-cell", "a reply about cell 8 while cell 7 was running"},
		{"outcome-of-another-cell", `the outcome of cell 8 in answer to "run"`},
		{"two-replies", "a reply when no request was outstanding"},
		{"not-a-reply", `"*** a debug line of the interpreter\n", which is not a reply`},
		{"long", "a reply longer than the output cap of 1 MiB allows; raise it with --max-output"},
	}
	for _, c := range cases {
		t.Run(c.mode, func(t *testing.T) {
			p, inbox := startKernel(t, c.mode, Limits{MaxOutput: 1 << 20})
			if err := p.Send(Request{Op: "run", Cell: &session.Cell{Index: 7, Line: 30, Source: "x = 1"}}); err != nil {
				t.Fatal(err)
			}
			m := receive(t, inbox)
			if c.mode == "two-replies" {
				if m.Dead || m.Reply.Outcome == nil {
					t.Fatalf("the first reply was good: %+v", m)
				}
				m = receive(t, inbox)
			}
			if !m.Dead {
				t.Fatalf("a bad reply was passed on: %+v", m.Reply)
			}
			err := p.Death()
			if !strings.Contains(err.Error(), "the kernel sent a reply that does not answer the request: ") || !strings.Contains(err.Error(), c.want) {
				t.Errorf("death: %v, want %q", err, c.want)
			}
		})
	}
}

// A kernel on its channel ends when the request stream does, even in
// the middle of a cell that never ends.
func TestKernelEndsWithItsRequests(t *testing.T) {
	p, inbox := startKernel(t, "1", Limits{})
	if err := p.Send(Request{Op: "run", Cell: &session.Cell{Index: 1, Line: 3, Source: "while True:\n    pass"}}); err != nil {
		t.Fatal(err)
	}
	time.Sleep(200 * time.Millisecond) // into the loop
	p.requests.Close()
	select {
	case <-p.exited:
	case <-time.After(5 * time.Second):
		t.Fatal("the kernel still runs its cell after its requests ended")
	}
	if m := receive(t, inbox); !m.Dead {
		t.Errorf("a reply from a kernel whose requests ended: %+v", m.Reply)
	}
}

// Every reply echoes the start request's nonce and the cell it is about;
// the kernel's own prints to standard output do not reach the replies.
func TestRepliesCarryNonceAndCell(t *testing.T) {
	p, inbox := startKernel(t, "1", Limits{})
	src := "exec(compile('12345\\n', '<repr>', 'single'))\nT = type('T', (object,), {})\nidentity(\"sum\", lambda k: (k + k, 2 * k), over=lambda k: k, samples=10)"
	if err := p.Send(Request{Op: "run", Cell: &session.Cell{Index: 4, Line: 20, Source: src}}); err != nil {
		t.Fatal(err)
	}
	for {
		m := receive(t, inbox)
		if m.Dead {
			t.Fatalf("the kernel died: %v", p.Death())
		}
		if r := m.Reply; r.Nonce != p.nonce || r.Cell != 4 {
			t.Fatalf("reply without nonce or cell: %+v", r)
		}
		if x := m.Reply.Exchange; x != nil {
			ans := claim.Answer{Share: &claim.Share{Index: 0, Count: 1}}
			if x.Tally != nil {
				ans = claim.Answer{Result: x.Tally}
			}
			if err := p.Send(Request{Op: "answer", Answer: &ans}); err != nil {
				t.Fatal(err)
			}
		}
		if o := m.Reply.Outcome; o != nil {
			if o.Error != nil || len(o.Claims) != 1 || o.Output != "" {
				t.Fatalf("outcome %+v", o)
			}
			return
		}
	}
}

// Serve echoes the nonce and the cell in every reply, and a cell whose
// outcome is larger than the output cap fails with a message naming its
// line and the flag, keeping the start of its output and its claims.
func TestServeCapsOutput(t *testing.T) {
	in := strings.Join([]string{
		`{"op":"start","nonce":"n0nce","settings":{"seed":1,"precision":64}}`,
		`{"op":"run","cell":{"cell":2,"line":9,"source":"s = 'y' * 1000\nfor i in range(200):\n    print(s)\nidentity(\"one\", 1, 1)"}}`,
		`{"op":"run","cell":{"cell":3,"line":15,"source":"print('small')"}}`,
	}, "\n") + "\n"
	var out strings.Builder
	if err := serve(strings.NewReader(in), &out, 100<<10, nil); err != nil {
		t.Fatal(err)
	}
	var replies []Reply
	for _, line := range strings.Split(strings.TrimSpace(out.String()), "\n") {
		var r Reply
		if err := json.Unmarshal([]byte(line), &r); err != nil {
			t.Fatal(err)
		}
		if len(line) > 100<<10+ReplySlack {
			t.Errorf("a reply of %d bytes", len(line))
		}
		replies = append(replies, r)
	}
	if len(replies) != 3 || replies[0].Nonce != "n0nce" || replies[1].Nonce != "n0nce" || replies[1].Cell != 2 || replies[2].Cell != 3 {
		t.Fatalf("replies %+v", replies)
	}
	o := replies[1].Outcome
	if o.Status != cells.Failed || o.Error == nil || o.Error.Line != 9 || !strings.Contains(o.Error.Message, "more than 100 KiB, the output cap") || !strings.Contains(o.Error.Message, "--max-output") {
		t.Errorf("capped outcome: %+v", o.Error)
	}
	if len(o.Output) > 65<<10 || !strings.HasPrefix(o.Output, strings.Repeat("y", 1000)) || len(o.Claims) != 1 {
		t.Errorf("capped outcome keeps %d bytes of output and %d claims", len(o.Output), len(o.Claims))
	}
	if o := replies[2].Outcome; o.Error != nil || o.Output != "small\n" {
		t.Errorf("the next cell: %+v", o)
	}
}

// readLine stops at its bound without reading the rest of the line.
func TestReadLineIsBounded(t *testing.T) {
	r := bufio.NewReaderSize(strings.NewReader("short\n"+strings.Repeat("x", 1000)+"\n"), 16)
	if line, err := readLine(r, 100); string(line) != "short\n" || err != nil {
		t.Errorf("%q, %v", line, err)
	}
	if _, err := readLine(r, 100); err != errLongLine {
		t.Errorf("long line: %v", err)
	}
}

// ahead passes a stream on unchanged and reports its end as soon as it
// comes, before anyone has read it.
func TestReadAhead(t *testing.T) {
	ended := make(chan struct{})
	a := readAhead(strings.NewReader("one\ntwo\n"), func() { close(ended) })
	select {
	case <-ended:
	case <-time.After(5 * time.Second):
		t.Fatal("the end was not seen")
	}
	data, err := io.ReadAll(a)
	if string(data) != "one\ntwo\n" || err != nil {
		t.Errorf("%q, %v", data, err)
	}
}

package proto

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"unicode/utf8"

	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/session"
	"assay/kernel/spawn"
)

// Serve runs a kernel over JSON lines: requests from in, replies to out,
// one reply per request, until in ends. A cell's reply is kept within
// DefaultMaxOutput.
func Serve(in io.Reader, out io.Writer) error {
	return serve(in, out, DefaultMaxOutput, nil)
}

// serve is Serve with the output cap of the process; limit, when not nil,
// applies the limits of a start request to the process and returns its
// output cap.
func serve(in io.Reader, out io.Writer, maxOutput int64, limit func(Limits) int64) error {
	sc := bufio.NewScanner(in)
	sc.Buffer(make([]byte, 64<<10), maxLine)
	var (
		sess  *session.Session
		nonce string
		cell  int // the cell being run, 0 between cells
		at    int // its line in the notebook
	)
	// Every reply carries the nonce and the cell it is about, so the
	// driver can tell it answers the request outstanding.
	send := func(r Reply) error {
		r.Version, r.Nonce, r.Cell = Version, nonce, cell
		line, err := json.Marshal(r)
		if err == nil && r.Outcome != nil && int64(len(line)) > maxOutput {
			// Over the cap: cut the outcome down, and marshal it again.
			capOutput(r.Outcome, cell, at, maxOutput)
			line, err = json.Marshal(r)
		}
		if err != nil {
			return err
		}
		_, err = out.Write(append(line, '\n'))
		return err
	}
	defer func() {
		if sess != nil {
			sess.Close()
		}
	}()
	for sc.Scan() {
		var req Request
		var reply Reply
		spawn.Mark("request")
		if err := json.Unmarshal(sc.Bytes(), &req); err != nil {
			reply.Error = fmt.Sprintf("bad request: %v", err)
		} else {
			if req.Cell != nil {
				cell, at = req.Cell.Index, req.Cell.Line
			}
			switch req.Op {
			case "start":
				s := session.DefaultSettings
				if req.Settings != nil {
					s = *req.Settings
				}
				if sess != nil {
					sess.Close()
				}
				nonce = req.Nonce
				if limit != nil && req.Limits != nil {
					maxOutput = limit(*req.Limits)
				}
				var err error
				if sess, err = session.New(s); err != nil {
					reply.Error = err.Error()
				} else if s.Driven {
					sess.SetCoordinator(wire{sc: sc, send: send})
				}
			case "run":
				switch {
				case sess == nil:
					reply.Error = "run before start"
				case req.Cell == nil:
					reply.Error = "run without a cell"
				default:
					o := sess.Run(*req.Cell)
					reply.Outcome = &o
				}
			default:
				reply.Error = fmt.Sprintf("unknown op %q", req.Op)
			}
		}
		if sess != nil {
			reply.Settings = sess.Settings()
		}
		spawn.Mark("handled", req.Op)
		if err := send(reply); err != nil {
			return err
		}
		spawn.Mark("replied")
		cell = 0
	}
	return sc.Err()
}

// keptOutput is how much printed text a cell over the output cap keeps.
const keptOutput = 64 << 10

// capOutput cuts down the outcome of a cell whose reply came to more
// than max bytes of JSON, so that the driver never reads a reply larger
// than the cap (plus ReplySlack): the cell fails, keeping the start of
// its printed text and its claims, or only the error if the claims alone
// are too large.
func capOutput(o *cells.Outcome, cell, line int, max int64) {
	msg := fmt.Sprintf("the cell's output (printed text, tables, figures and claims) came to more than %s, the output cap; the first %s of printed text are kept; raise the cap with --max-output",
		FormatBytes(max), FormatBytes(keptOutput))
	if len(o.Output) > keptOutput {
		cut := keptOutput
		for cut > 0 && !utf8.RuneStart(o.Output[cut]) {
			cut--
		}
		o.Output = o.Output[:cut] + "\n…\n"
	}
	o.Tables, o.Figures, o.Status = nil, nil, cells.Failed
	if o.Error == nil {
		o.Error = &cells.Problem{Cell: cell, Line: line, Message: msg}
	} else {
		o.Error.Message += "; and " + msg
	}
	if line, err := json.Marshal(o); err != nil || int64(len(line)) > max {
		o.Output, o.Claims = "", nil
	}
}

// wire is the coordinator of a kernel process: exchanges travel as reply
// lines, and the driver's answer comes back as the next request line.
type wire struct {
	sc   *bufio.Scanner
	send func(Reply) error
}

func (w wire) Exchange(e claim.Exchange) (claim.Answer, error) {
	if err := w.send(Reply{Exchange: &e}); err != nil {
		return claim.Answer{}, err
	}
	if !w.sc.Scan() {
		return claim.Answer{}, fmt.Errorf("the driver went away during an exchange")
	}
	var req Request
	if err := json.Unmarshal(w.sc.Bytes(), &req); err != nil || req.Op != "answer" || req.Answer == nil {
		return claim.Answer{}, fmt.Errorf("the driver sent %.80q where an answer to an exchange was due", w.sc.Text())
	}
	return *req.Answer, nil
}

func (w wire) Progress(p claim.Progress) { w.send(Reply{Progress: &p}) }

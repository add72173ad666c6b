package kernel

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"

	"assay/cells"
)

// Version is the assay version, stated in every report.
const Version = "0.1.0"

// Request is one line from the driver to a kernel process.
type Request struct {
	// Op is "start" (first line: make the session) or "run" (run one cell).
	// Op "answer" is the driver's reply to an Exchange, sent only while a
	// cell is waiting for it.
	Op       string    `json:"op"`
	Settings *Settings `json:"settings,omitempty"` // with start
	Cell     *Cell     `json:"cell,omitempty"`     // with run
	Answer   *Answer   `json:"answer,omitempty"`   // with answer
}

// Reply is one line from a kernel process to the driver.
type Reply struct {
	Version  string         `json:"version"`
	Settings Settings       `json:"settings"`          // settings in force after the request
	Outcome  *cells.Outcome `json:"outcome,omitempty"` // with run
	Error    string         `json:"error,omitempty"`   // a request the kernel could not take
	// While a cell runs, a kernel whose settings say Driven may send
	// exchanges (each answered by one "answer" request) and progress
	// lines (not answered) before the cell's reply.
	Exchange *Exchange `json:"exchange,omitempty"`
	Progress *Progress `json:"progress,omitempty"`
}

// maxLine bounds one protocol line (a cell's source or outcome).
const maxLine = 256 << 20

// Serve runs a kernel over JSON lines: requests from in, replies to out,
// one reply per request, until in ends.
func Serve(in io.Reader, out io.Writer) error {
	sc := bufio.NewScanner(in)
	sc.Buffer(make([]byte, 64<<10), maxLine)
	enc := json.NewEncoder(out)
	var sess *Session
	defer func() {
		if sess != nil {
			sess.Close()
		}
	}()
	for sc.Scan() {
		var req Request
		reply := Reply{Version: Version}
		if err := json.Unmarshal(sc.Bytes(), &req); err != nil {
			reply.Error = fmt.Sprintf("bad request: %v", err)
		} else {
			switch req.Op {
			case "start":
				s := DefaultSettings
				if req.Settings != nil {
					s = *req.Settings
				}
				if sess != nil {
					sess.Close()
				}
				var err error
				if sess, err = NewSession(s); err != nil {
					reply.Error = err.Error()
				} else if s.Driven {
					sess.coord = wire{sc: sc, send: func(r Reply) error { return enc.Encode(r) }}
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
		if err := enc.Encode(reply); err != nil {
			return err
		}
	}
	return sc.Err()
}

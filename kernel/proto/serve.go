package proto

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"

	"assay/kernel/claim"
	"assay/kernel/session"
)

// Serve runs a kernel over JSON lines: requests from in, replies to out,
// one reply per request, until in ends.
func Serve(in io.Reader, out io.Writer) error {
	sc := bufio.NewScanner(in)
	sc.Buffer(make([]byte, 64<<10), maxLine)
	enc := json.NewEncoder(out)
	var sess *session.Session
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
				s := session.DefaultSettings
				if req.Settings != nil {
					s = *req.Settings
				}
				if sess != nil {
					sess.Close()
				}
				var err error
				if sess, err = session.New(s); err != nil {
					reply.Error = err.Error()
				} else if s.Driven {
					sess.SetCoordinator(wire{sc: sc, send: func(r Reply) error { return enc.Encode(r) }})
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

// wire is the coordinator of a kernel process: exchanges travel as reply
// lines, and the driver's answer comes back as the next request line.
type wire struct {
	sc   *bufio.Scanner
	send func(Reply) error
}

func (w wire) Exchange(e claim.Exchange) (claim.Answer, error) {
	if err := w.send(Reply{Version: Version, Exchange: &e}); err != nil {
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

func (w wire) Progress(p claim.Progress) { w.send(Reply{Version: Version, Progress: &p}) }

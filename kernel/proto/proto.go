package proto

import (
	"assay/cells"
	"assay/kernel/claim"
	"assay/kernel/session"
)

// Version is the assay version, stated in every report and reply.
const Version = "0.1.0"

// Request is one line from the driver to a kernel process.
type Request struct {
	// Op is "start" (first line: make the session) or "run" (run one cell).
	// Op "answer" is the driver's reply to an Exchange, sent only while a
	// cell is waiting for it.
	Op       string            `json:"op"`
	Settings *session.Settings `json:"settings,omitempty"` // with start
	Cell     *session.Cell     `json:"cell,omitempty"`     // with run
	Answer   *claim.Answer     `json:"answer,omitempty"`   // with answer
}

// Reply is one line from a kernel process to the driver.
type Reply struct {
	Version  string           `json:"version"`
	Settings session.Settings `json:"settings"`          // settings in force after the request
	Outcome  *cells.Outcome   `json:"outcome,omitempty"` // with run
	Error    string           `json:"error,omitempty"`   // a request the kernel could not take
	// While a cell runs, a kernel whose settings say Driven may send
	// exchanges (each answered by one "answer" request) and progress
	// lines (not answered) before the cell's reply.
	Exchange *claim.Exchange `json:"exchange,omitempty"`
	Progress *claim.Progress `json:"progress,omitempty"`
}

// maxLine bounds one protocol line (a cell's source or outcome).
const maxLine = 256 << 20

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
	// Limits, with start, are the limits the process keeps to (a kernel
	// process only; see ServeChild).
	Limits *Limits `json:"limits,omitempty"`
	// Nonce, with start, is the run's secret: the kernel echoes it in
	// every reply, and the driver refuses a reply without it.
	Nonce  string        `json:"nonce,omitempty"`
	Cell   *session.Cell `json:"cell,omitempty"`   // with run
	Answer *claim.Answer `json:"answer,omitempty"` // with answer
}

// Reply is one line from a kernel process to the driver.
type Reply struct {
	Version string `json:"version"`
	// Nonce echoes the start request's; Cell is the index of the cell the
	// reply is about (0 for start): the driver checks both against the
	// request it has outstanding.
	Nonce    string           `json:"nonce,omitempty"`
	Cell     int              `json:"cell,omitempty"`
	Settings session.Settings `json:"settings"`          // settings in force after the request
	Outcome  *cells.Outcome   `json:"outcome,omitempty"` // with run
	Error    string           `json:"error,omitempty"`   // a request the kernel could not take
	// While a cell runs, a kernel whose settings say Driven may send
	// exchanges (each answered by one "answer" request) and progress
	// lines (not answered) before the cell's reply.
	Exchange *claim.Exchange `json:"exchange,omitempty"`
	Progress *claim.Progress `json:"progress,omitempty"`
}

// maxLine bounds one request line (a cell's source).
const maxLine = 256 << 20

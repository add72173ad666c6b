// Package cells is the notebook document: it parses Markdown notebooks into
// prose and executable cells, holds the outcome of running each cell, and
// renders reports as Markdown, HTML and JSON.
//
// It knows nothing of the interpreter or of exact arithmetic: a claim reaches
// this package as a plain record.
package cells

import (
	"fmt"
	"time"
)

// BlockKind tells prose from an executable cell.
type BlockKind int

const (
	// Prose is Markdown text, including fences that are not cells.
	Prose BlockKind = iota
	// Code is an executable cell: a fence whose info string starts with "cell".
	Code
)

// Notebook is a parsed notebook file.
type Notebook struct {
	Path   string  // file path as given by the user
	Source []byte  // the raw file contents
	Title  string  // text of the first level-1 heading, or the file name
	Blocks []Block // prose and cells in file order
	// Warnings name what looks like a cell, or like a cell's output, but
	// is not one, and the generated regions assay did not write. They do
	// not stop a run; the renderers show them with the report's own.
	Warnings []Problem
	// Foreign lists the generated regions that are not assay's: no hash
	// of their content in the opening marker, or one that does not match,
	// or content assay does not write (a cell). Their text, markers
	// included, is read as part of the notebook, so a rewrite of the
	// notebook that replaces generated regions would delete text someone
	// else wrote there.
	Foreign []Span
}

// Span is a stretch of notebook lines, the first and the last included.
type Span struct {
	Line    int // the first line, 1-based
	EndLine int // the last line
}

// String names the lines, e.g. "lines 12–18".
func (s Span) String() string { return fmt.Sprintf("lines %d–%d", s.Line, s.EndLine) }

// Cells returns the executable blocks in order.
func (nb *Notebook) Cells() []*Block {
	var out []*Block
	for i := range nb.Blocks {
		if nb.Blocks[i].Kind == Code {
			out = append(out, &nb.Blocks[i])
		}
	}
	return out
}

// Block is one stretch of the notebook: prose or a cell.
type Block struct {
	Kind BlockKind
	// Text is the prose verbatim, or the cell's source without its fences
	// (for a cell, with CRLF line ends turned into LF).
	Text string
	// Line is the 1-based notebook line of the first line of Text.
	Line int
	// Cell-only fields.
	Index     int         // 1-based cell number
	FenceLine int         // line of the opening fence
	Fence     string      // the opening fence characters, e.g. "```" or "~~~~"
	Info      string      // the whole info string, e.g. "cell timeout=5s"
	Options   CellOptions // parsed options
	// Raw is the cell verbatim, from its opening fence line to its closing
	// fence line inclusive, line ends as in the file. Renderers re-emit it
	// byte for byte; when empty they rebuild the cell from Fence, Info, Text.
	Raw string
}

// CellOptions are the key=value words after "cell" in a fence's info string.
type CellOptions struct {
	Timeout   time.Duration // timeout=30s; zero means the run's default
	Precision int           // precision=512 (bits); zero means the run's default
	Seed      *int64        // seed=7; nil means the run's seed
	ID        string        // id=name
}

// Verdict is the outcome of a claim.
type Verdict string

// The verdicts; their string values are part of the JSON format.
const (
	Holds         Verdict = "holds"           // exact zero residual
	HoldsToDigits Verdict = "holds-to-digits" // certified |residual| < 10^-Digits
	// Estimated is an extrapolated value whose successive estimates agree
	// to Digits digits: an estimate, not a certified bound.
	Estimated Verdict = "estimated"
	// HoldsWhere is a proof that lhs = rhs wherever polynomial hypotheses
	// hold (and non-degeneracy conditions do not vanish), from a
	// certificate that puts a power of lhs − rhs, or its product with a
	// power of the conditions, in the hypotheses' ideal: lhs − rhs itself
	// is not in it. Claim.Certificate holds the certificate.
	HoldsWhere Verdict = "holds-where"
	Fails      Verdict = "fails"     // residual certified non-zero
	Undecided  Verdict = "undecided" // not settled; Claim.Why says why
)

// Reason says why a claim is undecided; its string values are part of the
// JSON format.
type Reason string

// The reasons a claim is undecided.
const (
	PrecisionCap  Reason = "precision-cap"  // the enclosure still straddled zero at the precision cap
	NoConvergence Reason = "no-convergence" // a limit's estimates did not settle
	WalksDisagree Reason = "walks-disagree" // a limit's walks at different ratios gave different estimates
	SampleRaised  Reason = "sample-raised"  // evaluating the claim on a sample raised
	NoSampleMet   Reason = "no-sample-met"  // no sample met the hypothesis (given=)
	EqualWithin   Reason = "equal-within"   // an inequality's sides agree to the digits asked: its slack is not told from 0
	OtherReason   Reason = "other"          // anything else: Note says what
)

// Claim is the record of one checked claim, as the kernel reports it.
type Claim struct {
	Name     string  `json:"name"`
	Kind     string  `json:"kind"`   // identity, factorization, inequality, limit
	Method   string  `json:"method"` // how it was decided, e.g. "exact rational arithmetic"
	Verdict  Verdict `json:"verdict"`
	Digits   int     `json:"digits,omitempty"` // for holds-to-digits
	Residual string  `json:"residual"`         // printed residual (exact where exact)
	// ResidualTeX is the residual in LaTeX, typeset in the HTML report
	// ("" when it has no typeset form: the text is shown).
	ResidualTeX string `json:"residual_tex,omitempty"`
	Note        string `json:"note,omitempty"`    // what the verdict means, in words
	Samples     int    `json:"samples,omitempty"` // number of configurations checked
	Seed        int64  `json:"seed"`              // seed in force
	Worst       string `json:"worst,omitempty"`   // the sample with the largest residual
	// Sample is the worst sample or the counterexample as cell code that
	// rebuilds it when pasted into a cell.
	Sample string `json:"sample,omitempty"`
	// Why says why the verdict is Undecided.
	Why       Reason  `json:"why,omitempty"`
	Precision int     `json:"precision,omitempty"` // bits, where certified reals were used
	Cell      int     `json:"cell"`
	Line      int     `json:"line"` // notebook line of the call
	Seconds   float64 `json:"seconds"`
	// Float is the float64 companion, where one was computed.
	Float *FloatAudit `json:"float,omitempty"`
	// Certificate proves an identity under polynomial hypotheses, where
	// one was found.
	Certificate *Certificate `json:"certificate,omitempty"`
}

// Certificate is what proves an identity under polynomial hypotheses h_i:
// Multiple = Σ Cofactors[i]·Hypotheses[i], re-checked by expansion before
// the verdict was written, so a reader can check it with any algebra
// system. Multiple is lhs − rhs, a power of it, or its product with a
// power of the non-degeneracy conditions; 1 for inconsistent hypotheses.
type Certificate struct {
	Statement  string   `json:"statement"` // Multiple in words, e.g. "(lhs − rhs)^2"
	Multiple   string   `json:"multiple"`  // Multiple expanded
	Hypotheses []string `json:"hypotheses"`
	Cofactors  []string `json:"cofactors"`
}

// FloatAudit is what float64 arithmetic said about a claim: the claim's
// function run again as float64 code, each side's float64 value F set
// against the exact value V at the exact inputs and against V̂, the exact
// value at the float64-rounded inputs. Input error |V̂ − V| is the
// problem's condition, formula error |F − V̂| the evaluation's own.
type FloatAudit struct {
	Residual   string  `json:"residual"`         // float64 residual max |lhs − rhs| as printed
	Raised     string  `json:"raised,omitempty"` // what the float64 code raised, instead of sides
	DigitsLost float64 `json:"digits_lost"`      // the worse side's total loss, decimal digits against 15.95
	// Sample is, for a sampled claim, the sample where float64 lost most.
	Sample *int64     `json:"sample,omitempty"`
	LHS    *SideAudit `json:"lhs,omitempty"`
	RHS    *SideAudit `json:"rhs,omitempty"`
}

// SideAudit is the float64 audit of one side of a claim. Loss is the total,
// F against V; Input and Formula split it, and are absent (with Unsplit
// saying why) when the exact function could not be run at the rounded
// inputs.
type SideAudit struct {
	Loss
	Input   *Loss  `json:"input,omitempty"`   // V̂ against V: rounding the inputs alone
	Formula *Loss  `json:"formula,omitempty"` // F against V̂: the float64 evaluation
	Unsplit string `json:"unsplit,omitempty"` // why Input and Formula are absent
}

// Loss is a relative error (worst entry; absolute where the exact entry is
// 0), printed, and the decimal digits of float64's 15.95 it costs.
type Loss struct {
	Error      string  `json:"error"`
	DigitsLost float64 `json:"digits_lost"`
}

// Table is a table put in the report by a cell.
type Table struct {
	Header []string   `json:"header,omitempty"`
	Rows   [][]string `json:"rows"`
}

// Figure is an SVG figure put in the report by a cell.
type Figure struct {
	Name string `json:"name"`
	SVG  string `json:"svg"`
}

// Status says whether a cell ran.
type Status string

// Cell statuses.
const (
	Ran    Status = "ran"     // ran to the end
	Failed Status = "error"   // raised an error or crossed a limit
	NotRun Status = "not-run" // skipped after an earlier error
)

// Problem is an error tied to a notebook line.
type Problem struct {
	Cell    int    `json:"cell"` // 0 for the notebook as a whole
	Line    int    `json:"line"`
	Message string `json:"message"`
}

// Outcome is the result of running one cell.
type Outcome struct {
	Cell    int      `json:"cell"`
	Status  Status   `json:"status"`
	Output  string   `json:"output"` // printed text and shown values
	Tables  []Table  `json:"tables,omitempty"`
	Claims  []Claim  `json:"claims,omitempty"`
	Figures []Figure `json:"figures,omitempty"`
	Error   *Problem `json:"error,omitempty"`
	Seconds float64  `json:"seconds"`
}

// Report is everything a run produced, ready to render.
type Report struct {
	Notebook  *Notebook
	SHA256    string    // hex digest of Notebook.Source
	Version   string    // assay version
	Seed      int64     // run seed
	Precision int       // run precision in bits
	Outcomes  []Outcome // one per cell, in cell order
	Problems  []Problem // notebook-level problems (parse errors); cell errors live in outcomes
	// Warnings are the caller's warnings, shown after the notebook's own
	// (Notebook.Warnings); they do not change the exit status.
	Warnings []Problem
	Seconds  float64 // wall time of the whole run
	// Run identifies the run that wrote the report, e.g. random hex digits
	// chosen by the caller; empty for none. RenderMarkdown states it in the
	// header and RenderHTML in the header and a <meta> tag, and RunID reads
	// it back, so a Markdown report and an HTML report can be told to come
	// from one run. Only letters, digits and . _ : + - are kept.
	Run string
	// FigureBase is the path of the Markdown report without its ".md", e.g.
	// "mesh.report". When set, figures go beside the report as files
	// (FigureFiles) and the Markdown report links to them; when empty, no
	// figure files are made and the Markdown report only names its figures.
	FigureBase string
	// Until, when positive, is the index of the last cell the run was
	// asked to run (assay run --until): the cells after it are not run,
	// and the report says why.
	Until int
}

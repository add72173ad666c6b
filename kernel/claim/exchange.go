package claim

// Ask names one exchange between a kernel and its driver: the sweep of a
// sampled claim, or the counterexample search after it.
type Ask struct {
	Claim   string `json:"claim"`
	Phase   string `json:"phase"` // PhaseSweep or PhaseSearch
	Line    int    `json:"line"`
	Samples int64  `json:"samples"` // items to split: samples, or search starts
}

// The phases of a sampled claim.
const (
	PhaseSweep  = "sweep"
	PhaseSearch = "search"
)

// Key identifies the exchange among those of one run.
func (a Ask) Key() string { return a.Claim + "\x00" + a.Phase }

// Share is the part of an exchange one kernel computes: the items k with
// k % Count == Index.
type Share struct {
	Index int64 `json:"index"`
	Count int64 `json:"count"`
}

// Items is how many of total items fall in the share.
func (sh Share) Items(total int64) int64 { return (total - sh.Index + sh.Count - 1) / sh.Count }

// Exchange is a kernel's message to its driver in the middle of a cell:
// an ask (no tally yet) or the tally of the share it was given.
type Exchange struct {
	Ask
	Tally *Tally `json:"tally,omitempty"`
}

// Answer is the driver's reply to an Exchange: the share to compute, or
// the merged tally of all shares.
type Answer struct {
	Share  *Share `json:"share,omitempty"`
	Result *Tally `json:"result,omitempty"`
	Error  string `json:"error,omitempty"`
}

// Progress is a kernel's count of the samples it has done in a sweep,
// or, with Stage set and no Claim, the stage a long computation is in.
type Progress struct {
	Claim string `json:"claim"`
	Done  int64  `json:"done"`
	Total int64  `json:"total"` // samples in this kernel's share
	// Stage names what a long computation (factoring) is doing, so that
	// a cell stopped by its time limit can say it; "" when it is done.
	Stage string `json:"stage,omitempty"`
}

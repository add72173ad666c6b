// Package claim holds the rules of assay's verdicts in plain Go, with no
// interpreter: residuals and what they mean for a claim, the slack of an
// inequality and its judgement, the float64 audit's error measure, and the
// tallies of sampled claims with their merge and the messages in which
// kernels exchange them. The session measures notebook values into these
// records; this package decides.
package claim

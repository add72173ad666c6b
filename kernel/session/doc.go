// Package session runs a notebook's cells in one namespace: it opens the
// sandboxed interpreter, installs the builtins (the value types of package
// values, output, tables and figures, setup), and implements the claim
// builtins — identity, factorization, inequality, limit — by measuring
// notebook values into the records of package claim: single instances,
// sampled sweeps split among kernels through a Coordinator, the
// counterexample search, and the float64 audit. One Session is one
// notebook's namespace; it runs one cell at a time.
package session

// Package cputime reads the processor time a process has used, for
// benchmarks on a shared machine: there the wall-clock time mostly
// measures the other work, while the processor time of the code under
// test (user plus system) stays close to what it costs alone.
package cputime

import "time"

// Self returns the processor time this process has used so far, user plus
// system, and false where the system does not report it.
func Self() (time.Duration, bool) { return usage(false) }

// Children returns the processor time used so far by the child processes
// this process has waited for, user plus system, and false where the
// system does not report it.
func Children() (time.Duration, bool) { return usage(true) }

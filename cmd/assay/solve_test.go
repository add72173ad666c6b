package main

import "testing"

// Bad input to real_roots and solve: one clear message with the notebook
// line, the report kept.
func TestSolveBadInput(t *testing.T) {
	badInput(t, "real-roots-two-variables.md", 7, "the polynomial is in 2 variables (x, y), not one")
	badInput(t, "real-roots-zero.md", 7, "the polynomial is 0, which vanishes everywhere")
	badInput(t, "solve-positive-dimension.md", 8, "the solutions form a set of dimension 1")
	badInput(t, "solve-time-limit.md", 17, "solve, the grevlex basis:")
}

// Package interp is the boundary between assay and its embedded interpreter
// (gpython): the sandboxed interpreter context, the opcode patch that makes
// / and ** exact, the rewriting of claim call sites so a claim knows its
// notebook line, the reading of a call's arguments by name, the one panic
// guard every builtin and bound method goes through, and the one place where
// Go errors from the mathematics become notebook exceptions.
//
// It knows nothing of notebook value types or claims: the exact arithmetic
// behind / and ** is supplied by whoever opens a Sandbox.
package interp

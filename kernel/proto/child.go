package proto

import (
	"io"
	"os"
	"runtime/debug"
	"strconv"
)

// The child-process contract: what a driver sets in a kernel's
// environment, and the limits the kernel puts on itself.
const (
	// MemoryEnv carries the memory cap in bytes; the kernel sets it as its
	// soft Go memory limit, and the driver kills it above the cap.
	MemoryEnv = "ASSAY_MAX_MEMORY"
	// ThreadsEnv is the Go runtime's own variable: a worker that shares the
	// cores with others is told how many it may use.
	ThreadsEnv = "GOMAXPROCS"
	// MaxStack bounds the kernel's stack, so a runaway recursion ends the
	// cell in a second rather than after growing a gigabyte of stack.
	MaxStack = 64 << 20
)

// ServeChild is the kernel process: it applies the limits of the contract
// and serves the protocol on in and out.
func ServeChild(in io.Reader, out io.Writer) error {
	if v, err := strconv.ParseInt(os.Getenv(MemoryEnv), 10, 64); err == nil && v > 0 {
		debug.SetMemoryLimit(v) // soft: the parent enforces the hard cap
	}
	debug.SetMaxStack(MaxStack)
	return Serve(in, out)
}

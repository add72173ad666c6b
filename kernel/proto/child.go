package proto

import (
	"io"
	"os"
	"os/signal"
	"runtime"
	"runtime/debug"
	"strconv"

	"assay/kernel/spawn"
)

// The child-process contract: how a driver passes a kernel its protocol
// channel, what it may set in the kernel's environment, and the limits the
// kernel puts on itself. Start passes the limits in the start request
// (Request.Limits), which wins over the environment: a kernel it takes was
// started before the limits were known (spawn.Early).
const (
	// ChannelEnv names the protocol channel, "IN,OUT": the file
	// descriptors the kernel reads requests from and writes replies to.
	// Start passes "3,4" on Unix; where a child cannot be given extra
	// files, it passes "stdio": the channel is the reader and writer
	// ServeChild is given (standard input and output). Without ChannelEnv
	// the kernel serves on those too (a driver such as an editor), but
	// does not take their end for its driver's death.
	ChannelEnv = spawn.ChannelEnv
	// MemoryEnv carries the memory cap in bytes; the kernel sets it as its
	// soft Go memory limit, and the driver kills it above the cap.
	MemoryEnv = "ASSAY_MAX_MEMORY"
	// OutputEnv carries the output cap in bytes: the most JSON one cell's
	// reply may take (see DefaultMaxOutput).
	OutputEnv = "ASSAY_MAX_OUTPUT"
	// ThreadsEnv is the Go runtime's own variable: a worker that shares the
	// cores with others is told how many it may use (and again in its
	// start request, for a kernel started before that was known).
	ThreadsEnv = "GOMAXPROCS"
	// MaxStack bounds the kernel's stack, so a runaway recursion ends the
	// cell in a second rather than after growing a gigabyte of stack.
	MaxStack = 64 << 20
	// DefaultMaxOutput is the default output cap. A cell whose reply would
	// be larger fails, keeping the start of what it printed; the driver
	// reads no reply line longer than the cap plus ReplySlack, so what it
	// buffers per cell is bounded.
	DefaultMaxOutput = 16 << 20
	// ReplySlack is what a reply may take beyond the output cap: the
	// envelope and the message of a cell cut at the cap.
	ReplySlack = 1 << 20
)

// KernelGCPercent is the kernel's GOGC when a memory cap is given and the
// environment sets none. Chosen by measurement, twice.
//
// First (assay check --workers 1 on the 10,000-tetrahedron identity of
// BenchmarkSampledIdentityWorkers, user+system seconds of assay and its
// kernel, four alternating rounds on the shared 2-core machine, load
// 13–19):
//
//	            GOMAXPROCS=1   GOMAXPROCS=2 (a lone worker's default)
//	GOGC=100    0.40–0.45 s    0.50–0.62 s
//	GOGC=400    0.40–0.42 s    0.43–0.44 s
//	GOGC=800    0.44–0.48 s    —
//
// which chose 400. Then (December 2026, issue 20), after a sample of that
// identity fell from ~14 to ~4.5 µs and its garbage by half, the wall time
// of whole runs (`assay check`, GOGC set in the environment of both
// processes) on every reference and demo notebook and on that identity,
// best of five alternating rounds, load 0.4–1.8:
//
//	                        GOGC=100   150     200     300     400
//	identity, --workers 1   114 ms     115     119–126 139     149
//	identity, 2 workers     122        138     134–137 146     146
//	ideals.md               1132       1233    987     1205    1170
//	simplex-shape.md        452        621     454     481     475
//	sum of 18 runs          4218       4858    4134    4785    4557
//	                        (two sets of rounds: 100/200/400, then 150/200/300)
//
// A fresh kernel's heap grows into pages it has never touched, and a page
// fault costs ~25 µs on this VM: a collector that lets the heap grow to
// five times what is live pays that more often than it saves in
// collections. 200 was best or within noise of best everywhere. The
// heap may grow to three times what is live, but no further than the soft
// limit, three quarters of the cap, so a cell near the cap meets a working
// collector rather than the kill.
const KernelGCPercent = 200

// ServeChild is the kernel process: it applies the limits of the contract
// (and KernelGCPercent) and serves the protocol on the channel of
// ChannelEnv, or else on in and out. Either way, what the interpreter
// writes to standard output on its own (an expression statement compiled
// in "single" mode prints its repr there, type(name, bases, dict) a debug
// line) goes to the null device from here on: none of it may pass for a
// reply or reach a report, so it is dropped. On the channel, the end of the request stream ends the
// process at once, even in the middle of a cell: the driver has gone.
func ServeChild(in io.Reader, out io.Writer) error {
	if v, err := strconv.ParseInt(os.Getenv(MemoryEnv), 10, 64); err == nil && v > 0 {
		collectBelow(v)
	}
	debug.SetMaxStack(MaxStack)
	maxOutput := int64(DefaultMaxOutput)
	if v, err := strconv.ParseInt(os.Getenv(OutputEnv), 10, 64); err == nil && v > 0 {
		maxOutput = v
	}
	// The interpreter and fmt write through these variables when they
	// write; sys.stdout is made from them when a session opens. in and out
	// were taken before this.
	if null, err := os.OpenFile(os.DevNull, os.O_RDWR, 0); err == nil {
		os.Stdin, os.Stdout = null, null
	}
	requests, replies, ok, err := openChannel()
	switch {
	case err != nil:
		return err
	case requests != nil:
		in, out = requests, replies
	}
	if ok {
		in = readAhead(in, func() { spawn.Mark("requests ended"); os.Exit(0) })
		// A terminal's Ctrl-C reaches the whole process group, this child
		// too; its driver decides what it means (assay repl stops the
		// input and goes on), and a driver that dies of it takes this
		// process with it through the parent-death signal.
		signal.Ignore(os.Interrupt)
	}
	spawn.Mark("serving")
	return serve(in, out, maxOutput, func(l Limits) int64 {
		if l.MaxMemory > 0 {
			collectBelow(l.MaxMemory)
		}
		if l.Procs > 0 && l.Procs != runtime.GOMAXPROCS(0) {
			runtime.GOMAXPROCS(l.Procs) // stops the world: ~1 ms at start
		}
		if l.MaxOutput > 0 {
			return l.MaxOutput
		}
		return maxOutput
	})
}

// collectBelow sets the collector for a kernel whose hard memory cap (the
// parent enforces it) is limit bytes: a soft limit at three quarters of
// it, so that the collector works harder before the cap rather than at
// it, and GOGC at KernelGCPercent unless the environment sets one.
func collectBelow(limit int64) {
	debug.SetMemoryLimit(limit - limit/4)
	if _, set := os.LookupEnv("GOGC"); !set {
		debug.SetGCPercent(KernelGCPercent)
	}
}

// TestKernelEnv, set to 1, tells a test binary that a test started it as
// a kernel process (its tests pass Command: os.Args[0]).
const TestKernelEnv = "ASSAY_TEST_KERNEL"

// ServeTestKernel is called first in the TestMain of a package whose
// tests start kernel processes: when TestKernelEnv is 1, the test binary
// serves as the kernel and exits; otherwise it returns.
func ServeTestKernel() {
	if os.Getenv(TestKernelEnv) != "1" {
		return
	}
	if err := ServeChild(os.Stdin, os.Stdout); err != nil {
		os.Exit(2)
	}
	os.Exit(0)
}

// Package early starts the kernel process of `assay check` and `assay run`
// from a package initialiser, before the binary's other packages are
// initialised, so that the kernel's start-up overlaps the driver's
// (spawn.Early). It imports only what spawn does, which puts its
// initialiser among the first the Go runtime runs (23rd of 137).
//
// Start-up, measured (issue 20; DEVELOPERS.md, "Start-up"). A one-claim
// `assay check` (BenchmarkCheckOneCell's notebook) is two processes of a
// 31 MB binary: the driver and its kernel. On the 2-core Firecracker VM,
// best of 30 alternating runs, wall clock (min / first quartile / median),
// with the benchmark at real-time priority, since the machine was
// otherwise saturated (vmstat: 0% idle):
//
//	before (main at eba090b)       57.6 / 61.1 / 67.2 ms
//	after                          47.7 / 50.3 / 53.6 ms   (-17 to -20%)
//	after, built CGO_ENABLED=0     43.3 / 45.7 / 48.8 ms
//	floor: two hello-world Go processes, parent and child: 12.8 / 15.0 / 15.7 ms
//
// BenchmarkCheckOneCell, mean of 30, three alternating runs, same
// priority: 60.8–67.7 ms before, 46.7–53.2 ms after. CPU time is unchanged
// (70–72 ms min): the gain is the overlap, which needs an idle core; at
// normal priority on the saturated machine (load 20) both took 245–293 ms,
// within noise. Where the time goes now (perf trace): the kernel starts
// 7 ms into the driver's start and is the critical path: its start request
// waits ~8 ms for it; the driver waits ~3 ms more for its exit. Warming the
// JSON codecs or the interpreter's patch check during those waits measured
// no gain, so neither is done. One process doing nothing but start
// (`assay version`) costs 25.6 ms against 6.3 ms for a hello-world Go
// binary: ~900 page faults (a hello world takes 210) at ~20 µs each on
// this VM, of which the package initialisers took ~600 before this change,
// the runtime's own start ~150 and the dynamic loader ~30 (the binary is
// linked against libc because package net, which assay watch and the
// readline of assay repl need, uses cgo when it is enabled: 3 ms a
// process). Initialisers (min over 20 runs, GODEBUG=inittrace=1):
//
//	package                          before            after
//	gonum.org/v1/plot (fonts)        1.3 ms  184 KB    1.2 ms  184 KB
//	assay/exact (prime sieve)        1.3 ms  200 KB    0.13 ms   5 KB
//	assay/cells (13 of 17 regexps)   1.0 ms  220 KB    0.39 ms  55 KB
//	gpython/py                       0.73 ms 101 KB    0.83 ms 101 KB
//	gomarkdown/parser                0.62 ms 162 KB    1.2 ms  162 KB (now first to grow the heap)
//	go-latex mtex/symbols            0.59 ms  24 KB    0.58 ms  24 KB
//	encoding/gob (via fpdf)          0.46 ms  27 KB    0.50 ms  28 KB
//	all 137 packages                 9.5 ms  1.16 MB   9.1 ms  0.78 MB
//
// What is left is third-party: gonum/plot and what it links (fonts, LaTeX,
// PDF, gob; 8.6 MB of the binary, ~155 page faults and ~7 ms a process,
// measured by building without kernel/figure), gomarkdown, gpython; and
// the Go runtime's start of a large binary. The target of 15 ms
// is below this machine's floor for two processes of any Go binary with
// the work of one; drawing figures without gonum/plot is the largest
// lever left.
package early

import (
	"os"
	"slices"

	"assay/kernel/spawn"
)

func init() {
	if len(os.Args) < 2 || (os.Args[1] != "check" && os.Args[1] != "run") {
		return
	}
	for _, a := range os.Args[2:] {
		if a == "--" {
			break
		}
		if slices.Contains([]string{"-h", "-help", "--help"}, a) {
			return // prints and exits: no kernel needed
		}
	}
	exe, err := os.Executable()
	if err != nil {
		return
	}
	// By default (--workers = cores) each kernel runs Go code on one
	// thread; a child started so needs no change at its start request,
	// where resizing would cost ~1 ms.
	env := os.Environ()
	if _, set := os.LookupEnv("GOMAXPROCS"); !set {
		env = append(env, "GOMAXPROCS=1")
	}
	spawn.Early(Command(exe), env)
}

// Command is the command that starts a kernel process of the binary exe.
func Command(exe string) []string { return []string{exe, "kernel"} }

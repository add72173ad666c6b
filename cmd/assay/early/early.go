// Package early starts the kernel process of `assay check` and `assay run`
// from a package initialiser, before the binary's other packages are
// initialised, so that the kernel's start-up overlaps the driver's
// (spawn.Early). It imports only what spawn does, which puts its
// initialiser among the first the Go runtime runs (23rd of 137).
//
// Start-up, measured (issue 20; DEVELOPERS.md, "Start-up"). A one-claim
// `assay check` (BenchmarkCheckOneCell's notebook) is two processes of a
// 31 MB binary: the driver and its kernel. All figures are from the 2-core
// Firecracker VM (a PVM guest: a page fault costs ~25 µs), at real-time
// priority since other sessions loaded it.
//
// First round (main at eba090b → this package, lazy initialisers), best of
// 30 alternating runs, min / first quartile / median: 57.6 / 61.1 / 67.2 ms
// before, 47.7 / 50.3 / 53.6 ms after; CPU time unchanged: the gain is the
// overlap of the two starts, which needs an idle core.
//
// Second round: the timeline of a run. ASSAY_TRACE=FILE makes both
// processes append a line at each step (spawn.Mark); the harness adds the
// fork of the driver and its reaping. Best run of 30, 20 ms apart, ms from
// the fork; Δ is what the step took after this round (since the same
// process's step before):
//
//	before   after    step                                   Δ
//	  0.9      0.9    driver exec'd
//	 12.4     11.6    driver's first own initialiser      10.7   the runtime's start, 21 initialisers
//	 14.1     13.3    kernel exec'd (spawn.Early)          1.5   pipes, fork, exec
//	 23.9     23.7    kernel's first own initialiser      10.4   the same start in the kernel
//	 24.6     24.0    driver: main                        10.8   its other 114 initialisers
//	 26.2     25.7    driver: start request sent           1.6   flags, notebook, proto.Start
//	    —     25.7    driver: first cell sent behind it    0.03
//	 33.7     33.2    kernel: main                         9.6   its other 114 initialisers
//	 34.0     33.5    kernel: start request read           0.3
//	 35.9     35.2    kernel: session open                 1.7   first JSON decode ~0.7, session.New ~1.1
//	 36.3     35.8    kernel: start reply written          0.6
//	 38.0        —    driver: cell sent                          before: 1.1 decoding its first reply, 0.4 hand-off
//	 38.7     36.3    kernel: cell done                    0.5   compile 0.3, run 0.15
//	 38.9     36.3    driver: reply read
//	 41.7        —    driver: kernel exited                      before: 2.5–3 ms waited for
//	 41.8     36.5    driver: exit
//	 44.1     40.1    driver reaped                        3.5   its exit (2.3 before: now beside the kernel's)
//
// Min / first quartile / median of the whole run: 44.1 / 46.3 / 47.3 ms
// before, 40.1 / 43.6 / 45.0 after. Back to back as the benchmark runs it
// (30 alternating rounds): 47.6 / 48.8 / 50.6 ms before, 42.7 / 44.0 /
// 44.8 after (−10%), and in a later set 42.7 / 43.9 / 46.0 before, 36.7 /
// 39.5 / 40.7 after (−12%); started through env, two rounds: 51.2–51.5 /
// 53.6–53.9 / 54.3–55.3 before, 46.8–47.3 / 48.4–48.7 / 49.8 after.
// What changed: the first cell goes behind the start request
// (kernel.startDriver), the driver decodes a reply while its kernel
// starts (proto.warmReply), the run's end does not wait for its kernel's
// exit (Process.Release), and cells' last three package-level tables are
// made at first use (its initialiser 0.23 → 0.06 ms, 39 → 6 KB). Tried
// and dropped: prefaulting the binary and the heap (madvise
// MADV_POPULATE_READ/WRITE from spawn's initialiser: page faults 794 →
// 463, time unchanged: mapping a page costs the same faulted or
// populated), no starter thread in a kernel (spawn: ~30 faults, not
// measurable), leaving the request pipe to the driver's exit so that the
// two exits do not overlap (0.4–0.8 ms, within noise).
//
// What is left is the kernel's start: 20 ms from its exec to main, then
// 2.6 ms to its start reply and 0.5 ms for the cell, ~3 ms of which is
// ours (serving, decode, session, cell, replies); the driver, waiting, is
// not on the path. One process of this binary (`assay version`, 30
// alternating runs, min / median, after and before): 24.9–26.7 /
// 27.1–28.5 ms; built with CGO_ENABLED=0 (no dynamic loader: package net
// uses cgo) 22.3 / 23.7; a hello-world Go binary 6.1 / 7.2. Page faults
// (perf, per process): ~800 against ~180 for a hello world: ~400 in
// package initialisers, 142 in the runtime's schedinit, ~90 in the rest of
// runtime.main, 39 in the dynamic loader; by address, 342 on the Go heap,
// 146 in other anonymous maps, ~200 in the binary's text and data.
// Initialisers (min of 20 runs, GODEBUG=inittrace=1; faults: mean of 5):
//
//	package                          clock    heap     faults
//	gonum.org/v1/plot (fonts)        1.20 ms  184 KB   81
//	gomarkdown/parser                1.10 ms  162 KB   67
//	gpython/py                       0.74 ms  101 KB   39
//	go-latex mtex/symbols            0.62 ms   24 KB   15
//	encoding/gob (via fpdf)          0.50 ms   26 KB   21
//	gpython/parser                   0.40 ms   30 KB   18
//	go-latex font/ttf                0.20 ms   18 KB   11
//	assay's own (11 packages)        0.59 ms   70 KB   ~25  (values 0.19, exact 0.10, spawn 0.09, cells 0.06)
//	all 137 packages                 8.1 ms   0.77 MB  ~390
//
// By module (sums; a later 20 runs on a busier machine, 9.5 ms in all;
// faults: mean of 8): gonum/plot with its fonts, LaTeX, PDF and raster
// packages and the standard ones only they use (gob, flate, xml, image)
// 3.3 ms, 274 KB, 137 faults; gpython 1.6 ms, 163 KB, 74; gomarkdown
// 1.5 ms, 193 KB, 72; net/http, crypto and TLS 1.0 ms, 26 KB, 32; the
// rest of the standard library and the runtime 1.0 ms, 20 KB, 28; assay's
// own 0.7 ms, 68 KB, 20; gonum 0.2 ms.
//
// A kernel binary without gonum/plot, gomarkdown and net (a throwaway
// build: figures and HTML stubbed out, `main` only serving; 15 MB, 173
// packages, statically linked): 415 page faults, 14.1 / 15.4 ms a process;
// in the run, its exec to serving 11 ms instead of 20, and the whole run
// 31.9 / 33.3 / 34.0 ms (traced as above; 30.1 / 31.5 / 32.1 in a second
// set, and 29.6 / 30.7 / 31.0 with its session opened and its JSON codecs
// used once before it serves, since it waits for its driver: its start
// reply then takes 0.2 ms instead of 2.5); back to back, both started
// through env, 36.0–36.6 / 37.4–37.8 / 38.7–39.0 against the full
// binary's 46.8–47.3 / 48.4–48.7 / 49.8 (−22%). The driver then sets the
// pace: its start request leaves at ~24 ms, when the kernel is ready. The
// issue's 15 ms is below the floor of the driver alone, one process of
// this binary (~25 ms to start and exit). A pre-started kernel with its
// session open would bring a run to about that floor, ~28 ms (from these
// steps: start request at ~24 ms, the cell 0.5 ms, the driver's exit
// ~3 ms), 2–4 ms under a slim kernel started per run.
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

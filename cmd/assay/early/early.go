// Package early starts the kernel process of `assay check` and `assay run`
// from a package initialiser, before the binary's other packages are
// initialised, so that the kernel's start-up overlaps the driver's
// (spawn.Early). It imports only what spawn does, which puts its
// initialiser among the first the Go runtime runs.
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

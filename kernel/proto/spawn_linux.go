package proto

import (
	"os/exec"
	"runtime"
	"syscall"
)

// spawns carries process starts to the one goroutine that makes them.
var spawns = make(chan func())

// The spawner starts with the process, while the main goroutine is still
// locked to the main thread for package initialisation, so it locks a
// thread of its own. (Started at the first spawn instead, `assay check`
// of a one-cell notebook measured 2–3 ms slower.)
func init() {
	go func() {
		runtime.LockOSThread() // never unlocked: the thread lives as long as the process
		for f := range spawns {
			f()
		}
	}()
}

// spawn starts cmd so that it is killed when this process dies, however
// it dies (parent-death signal). Linux sends that signal when the thread
// that started the child ends, not the process, and the Go runtime ends
// a thread when a goroutine locked to it returns; so every child is
// started from one goroutine locked to its thread for good.
func spawn(cmd *exec.Cmd) error {
	if cmd.SysProcAttr == nil {
		cmd.SysProcAttr = &syscall.SysProcAttr{}
	}
	cmd.SysProcAttr.Pdeathsig = syscall.SIGKILL
	done := make(chan error, 1)
	spawns <- func() { done <- cmd.Start() }
	return <-done
}

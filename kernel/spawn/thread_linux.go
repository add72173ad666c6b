package spawn

import (
	"runtime"
	"syscall"
)

// starts carries process starts to the one goroutine that makes them.
var starts = make(chan func())

// The starter goroutine begins with the process, while the main goroutine
// is still locked to the main thread for package initialisation, so it
// locks a thread of its own. (Started at the first start instead, `assay
// check` of a one-cell notebook measured 2–3 ms slower.)
func init() {
	go func() {
		runtime.LockOSThread() // never unlocked: the thread lives as long as the process
		for f := range starts {
			f()
		}
	}()
}

// onLockedThread runs start on the starter's thread. Linux sends the
// parent-death signal when the thread that started the child ends, not
// the process, and the Go runtime ends a thread when a goroutine locked to
// it returns; so every child is started from one goroutine locked to its
// thread for good (or, by Early, from the main thread).
func onLockedThread(start func() (*Child, error)) (*Child, error) {
	type result struct {
		c   *Child
		err error
	}
	done := make(chan result, 1)
	starts <- func() {
		c, err := start()
		done <- result{c, err}
	}
	r := <-done
	return r.c, r.err
}

// sysAttr asks for the parent-death signal: the child is killed when this
// process dies, however it dies.
func sysAttr() *syscall.SysProcAttr {
	return &syscall.SysProcAttr{Pdeathsig: syscall.SIGKILL}
}

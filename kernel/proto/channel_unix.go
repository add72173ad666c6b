//go:build unix

package proto

import "syscall"

// prepare marks a channel descriptor close-on-exec, and non-blocking so
// that its reads wait in the runtime's poller rather than hold a thread:
// a kernel may run on one (GOMAXPROCS=1), and a read blocked in the
// system call would stall its cell until the runtime noticed.
func prepare(fd uintptr) {
	syscall.CloseOnExec(int(fd))
	syscall.SetNonblock(int(fd), true)
}

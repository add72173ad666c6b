//go:build unix

package proto

import (
	"os"
	"os/exec"
	"syscall"
)

// attach passes the protocol channel to the child as file descriptors 3
// (requests) and 4 (replies). Its standard input and output stay the null
// device: nothing it writes there is read.
func attach(cmd *exec.Cmd, requests, replies *os.File) {
	cmd.ExtraFiles = []*os.File{requests, replies}
	cmd.Env = append(cmd.Env, ChannelEnv+"=3,4")
}

// prepare marks a channel descriptor close-on-exec, and non-blocking so
// that its reads wait in the runtime's poller rather than hold a thread:
// a kernel may run on one (GOMAXPROCS=1), and a read blocked in the
// system call would stall its cell until the runtime noticed.
func prepare(fd uintptr) {
	syscall.CloseOnExec(int(fd))
	syscall.SetNonblock(int(fd), true)
}

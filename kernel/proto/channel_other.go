//go:build !unix

package proto

import (
	"os"
	"os/exec"
)

// attach passes the protocol channel as the child's standard input and
// output, where a child cannot be given extra files; the kernel points its
// own writes to standard output elsewhere before it runs a cell
// (ServeChild).
func attach(cmd *exec.Cmd, requests, replies *os.File) {
	cmd.Stdin, cmd.Stdout = requests, replies
	cmd.Env = append(cmd.Env, ChannelEnv+"="+stdioChannel)
}

// prepare does nothing: handles are not inherited unless asked for.
func prepare(uintptr) {}

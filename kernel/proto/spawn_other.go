//go:build !linux

package proto

import "os/exec"

// spawn starts cmd. Without a parent-death signal, a kernel on its
// channel learns of its driver's death from the end of its requests.
func spawn(cmd *exec.Cmd) error { return cmd.Start() }

//go:build !linux

package spawn

import "syscall"

// onLockedThread runs start: without a parent-death signal, a kernel on its
// channel learns of its driver's death from the end of its requests.
func onLockedThread(start func() (*Child, error)) (*Child, error) { return start() }

// sysAttr asks for nothing more.
func sysAttr() *syscall.SysProcAttr { return nil }

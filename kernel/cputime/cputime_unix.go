//go:build unix

package cputime

import (
	"syscall"
	"time"
)

func usage(children bool) (time.Duration, bool) {
	who := syscall.RUSAGE_SELF
	if children {
		who = syscall.RUSAGE_CHILDREN
	}
	var ru syscall.Rusage
	if syscall.Getrusage(who, &ru) != nil {
		return 0, false
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano()), true
}

package cells

import (
	"regexp"
	"sync"
)

// lazyRegexp returns a function that compiles expr at its first call
// (panicking, as regexp.MustCompile does, if expr is invalid) and returns
// the same expression at every call, safe for concurrent use. Compiled
// into package-level variables, this package's expressions cost every
// process ~1 ms and 200 KB at start, the kernel's too, which uses none
// of them (DEVELOPERS.md, "Start-up"). Use it for every new one.
func lazyRegexp(expr string) func() *regexp.Regexp {
	return sync.OnceValue(func() *regexp.Regexp { return regexp.MustCompile(expr) })
}

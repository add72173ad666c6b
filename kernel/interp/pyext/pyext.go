// Package pyext fills gaps in gpython (github.com/go-python/gpython), the
// Python 3.4-syntax interpreter that assay embeds to run notebook cells.
//
// gpython's str, list, dict and tuple types lack many everyday methods
// ("x".upper(), ",".join(...), "{:.2f}".format(...), l.pop(), d.update(...),
// ...) and some builtins are missing or wrong (round(2.5) returns 2.0 and
// round(2.7) returns 2.0, callable, format and reversed are absent, sorted
// and max cannot compare tuples, bool(x) cannot be called, int(True)
// fails, zip() never returns). Install adds Go implementations of these
// that follow CPython 3 semantics.
//
// Methods are stored in gpython's process-wide type dictionaries
// (py.StringType.Dict, py.ListType.Dict, py.StringDictType.Dict,
// py.TupleType.Dict, ...), so they are shared by every py.Context of the
// process. Builtins are stored in the Globals of the builtins module passed
// to Install, which is per-context.
//
// Gaps that live in gpython's Go methods (operators such as % and <, reprs,
// dict keys that are not str, ...) cannot be reached from outside gpython
// and are left alone; TestKnownGaps lists them.
package pyext

import (
	"sync"

	"github.com/go-python/gpython/py"
)

var typesOnce sync.Once

// Install adds the missing methods and builtins.
//
// Methods go into gpython's global type dictionaries (py.StringType.Dict,
// py.ListType.Dict, py.StringDictType.Dict, py.TupleType.Dict, ...) and the
// constructors of bool, int, float and zip are patched; this happens once
// per process, on the first call, so Install is idempotent. Make the first
// call before any Python code runs in another goroutine, since gpython reads
// those dictionaries without locking.
//
// Builtins (round, callable, format, reversed, min, max, sorted) are stored
// in builtins.Globals, replacing gpython's versions where those are broken.
// builtins may be nil, in which case only the type methods are installed.
func Install(builtins *py.Module) {
	typesOnce.Do(installTypes)
	if builtins != nil {
		installBuiltins(builtins)
	}
}

func installTypes() {
	installStr()
	installList()
	installTuple()
	installDict()
	installNumbers()
	installConstructors()
}

// Package pyext closes the gaps between upstream gpython, the interpreter
// that runs notebook cells, and the Python 3 that notebook authors expect.
//
// What it adds, each piece written for assay to CPython 3's documented
// behaviour:
//
//   - str: the methods upstream lacks (format and format_map with the
//     format-spec mini-language, title, zfill, center, partition,
//     splitlines, rsplit, the is… tests, …), and its own count, find,
//     startswith, endswith, split, replace, strip, lstrip, rstrip, upper and
//     lower, which upstream gets wrong: start and end arguments (negative,
//     None, counted in characters), None or a bool for an argument,
//     maxsplit=-1, stray arguments, and calls through the type such as
//     map(str.strip, lines), which panic. join differs only in that last
//     point, so pyext gives it its receiver and leaves the work to upstream.
//   - list and tuple: pop, insert, index, remove, count, reverse, copy,
//     clear; extend with any iterable; append through the type; sort that
//     orders tuples and lists.
//   - dict: setdefault, pop, popitem, update, copy, clear, fromkeys; get with
//     a key that is not a str; keys, values and items as lists that agree in
//     order (sorted, since upstream keeps no insertion order).
//   - int, float and bool: __format__; bool(x); int(True) and float(True);
//     zip() with no arguments, whose iterator upstream never ends.
//   - builtins: callable, format and reversed, which upstream lacks; round
//     returning an int with halves to even; sorted, min and max that order
//     tuples, lists and Python classes with __lt__, and take any key.
//
// The tests probe raw upstream for each of these before installing them
// and fail once upstream has caught up, so that pyext's version can go.
//
// Gaps inside gpython's Go code (the % operator, operators of Python
// classes, dicts with keys that are not str, some reprs) cannot be reached
// from here; TestGaps lists them too.
//
// Methods go into gpython's type dictionaries, which every context of the
// process shares; builtins go into one context's builtins module. Every
// piece runs through interp's panic guard.
package pyext

import (
	"sync"

	"github.com/go-python/gpython/py"
)

var typesOnce sync.Once

// Install adds the methods and builtins.
//
// The type methods and constructors are installed once per process, on the
// first call; gpython reads its type dictionaries without locking, so make
// that call before any Python code runs in another goroutine. The builtins
// go into builtins.Globals on every call, replacing upstream's round, min,
// max and sorted; builtins may be nil, to install only the type methods.
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

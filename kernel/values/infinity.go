package values

import "github.com/go-python/gpython/py"

// Infinity is the value of the builtin name infinity: limit(…, toward=infinity).
type Infinity struct{}

// InfinityType is the Python type of Infinity.
var InfinityType = py.NewType("infinity", "The target of a parameter that grows without bound: limit(name, f, toward=infinity).")

// Type returns InfinityType.
func (Infinity) Type() *py.Type { return InfinityType }

// M__repr__ prints "infinity".
func (Infinity) M__repr__() (py.Object, error) { return py.String("infinity"), nil }

// M__str__ prints "infinity".
func (Infinity) M__str__() (py.Object, error) { return py.String("infinity"), nil }

func (e *Env) infinityBuiltins(b py.StringDict) { b["infinity"] = Infinity{} }

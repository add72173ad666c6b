package interp

import (
	"fmt"
	"strings"

	"github.com/go-python/gpython/py"
)

// Args are a call's arguments matched to its parameters by name.
type Args struct {
	fn    string
	args  py.Tuple // the call as it was made
	kw    py.StringDict
	names []string
	// The value of parameter i is inline[i], or more[i-inlineArgs] past
	// those: a builtin of a few parameters, called once a sample in a
	// sweep, is bound without making a slice.
	inline   [inlineArgs]py.Object
	more     []py.Object
	rest     py.Tuple      // positional arguments beyond the named ones, with a "*name" parameter
	keywords py.StringDict // keywords no parameter names, with a "**name" parameter
	// A call bound off the interpreter's value stack (bindStack, calls.go)
	// has no tuple or dictionary of its own: Call makes them from the
	// values, the first npos positional and those in byKeyword by keyword.
	stacked   bool
	npos      int
	byKeyword uint64
}

// inlineArgs is how many parameter values an Args holds in itself.
const inlineArgs = 4

// slot is where the value of parameter i is kept.
func (a *Args) slot(i int) *py.Object {
	if i < inlineArgs {
		return &a.inline[i]
	}
	return &a.more[i-inlineArgs]
}

// value is the value of parameter i, nil when it was not given.
func (a *Args) value(i int) py.Object { return *a.slot(i) }

// Signature is a builtin's parameter list read once, so that binding a
// call (once a sample in a sweep) does not parse it again.
type Signature struct {
	fn             string
	names          []string // shared, read-only, by every Args bound
	required       uint64   // bit i: parameter i must be given
	star, starStar bool
}

// NewSignature reads the parameters of the function fn, written as in its
// signature: "name" must be given, "name=" may be left out, "*name" takes
// the positional arguments left over and "**name" the keywords no
// parameter has.
func NewSignature(fn string, params ...string) *Signature {
	s := &Signature{fn: fn}
	for _, p := range params {
		switch {
		case strings.HasPrefix(p, "**"):
			s.starStar = true
		case strings.HasPrefix(p, "*"):
			s.star = true
		default:
			name, optional := strings.CutSuffix(p, "=")
			if len(s.names) == 64 {
				panic(fmt.Sprintf("%s() declares more than 64 parameters", fn))
			}
			if !optional {
				s.required |= 1 << len(s.names)
			}
			s.names = append(s.names, name)
		}
	}
	return s
}

// Bind matches positional and keyword arguments to the parameters of the
// function fn (as NewSignature reads them). Every later reading is by name.
func Bind(fn string, args py.Tuple, kw py.StringDict, params ...string) (Args, error) {
	return NewSignature(fn, params...).Bind(args, kw)
}

// Bind matches positional and keyword arguments to the signature's
// parameters. The keywords are looked up by name (cheaper than walking
// the map), and walked only when one names no parameter.
func (s *Signature) Bind(args py.Tuple, kw py.StringDict) (Args, error) {
	fn := s.fn
	a := Args{fn: fn, args: args, kw: kw, names: s.names}
	if n := len(a.names); n > inlineArgs {
		a.more = make([]py.Object, n-inlineArgs)
	}
	if len(args) > len(a.names) {
		if !s.star {
			return Args{}, py.ExceptionNewf(py.TypeError, "%s() takes at most %d arguments (%d given)", fn, len(a.names), len(args))
		}
		a.rest = args[len(a.names):]
		args = args[:len(a.names)]
	}
	for i, v := range args {
		*a.slot(i) = v
	}
	named := 0 // keywords that name a parameter
	if len(kw) > 0 {
		for i, name := range a.names {
			v, ok := kw[name]
			if !ok {
				continue
			}
			named++
			if a.value(i) != nil {
				return Args{}, py.ExceptionNewf(py.TypeError, "%s() got two values for %q", fn, name)
			}
			*a.slot(i) = v
		}
	}
	if named < len(kw) {
		for k, v := range kw {
			if a.index(k) >= 0 {
				continue
			}
			if !s.starStar {
				return Args{}, py.ExceptionNewf(py.TypeError, "%s() has no argument %q (it takes %v)", fn, k, a.names)
			}
			if a.keywords == nil {
				a.keywords = py.StringDict{}
			}
			a.keywords[k] = v
		}
	}
	for i, name := range a.names {
		if s.required&(1<<i) != 0 && a.value(i) == nil {
			return Args{}, py.ExceptionNewf(py.TypeError, "%s() is missing its argument %q", fn, name)
		}
	}
	return a, nil
}

// Call is the call's arguments as they were given, to pass them on.
func (a *Args) Call() (py.Tuple, py.StringDict) {
	if !a.stacked {
		return a.args, a.kw
	}
	args := make(py.Tuple, a.npos)
	for i := range args {
		args[i] = a.value(i)
	}
	var kw py.StringDict
	if a.byKeyword != 0 {
		kw = py.StringDict{}
		for i, name := range a.names {
			if a.byKeyword&(1<<i) != 0 {
				kw[name] = a.value(i)
			}
		}
	}
	return args, kw
}

// Map is the call with f applied to every argument given (None and
// absent ones stay): the same reading, other values.
func (a *Args) Map(f func(py.Object) (py.Object, error)) (Args, error) {
	m := *a // a copy: the same reading, its own values
	var err error
	one := func(o py.Object) py.Object {
		if o == nil || o == py.None || err != nil {
			return o
		}
		var v py.Object
		v, err = f(o)
		return v
	}
	tuple := func(t py.Tuple) py.Tuple {
		out := make(py.Tuple, len(t))
		for i, o := range t {
			out[i] = one(o)
		}
		return out
	}
	dict := func(d py.StringDict) py.StringDict {
		if d == nil {
			return nil
		}
		out := py.StringDict{}
		for k, o := range d {
			out[k] = one(o)
		}
		return out
	}
	args, kw := a.Call()
	m.args, m.kw, m.rest, m.keywords = tuple(args), dict(kw), tuple(a.rest), dict(a.keywords)
	m.stacked, m.byKeyword = false, 0
	m.more = make([]py.Object, len(a.more))
	for i := range a.names {
		*m.slot(i) = one(a.value(i))
	}
	return m, err
}

// Rest is the positional arguments a "*name" parameter took.
func (a *Args) Rest() py.Tuple { return a.rest }

// Keywords is the keyword arguments a "**name" parameter took.
func (a *Args) Keywords() py.StringDict { return a.keywords }

func (a *Args) index(name string) int {
	for i, n := range a.names {
		if n == name {
			return i
		}
	}
	return -1
}

// Get is the argument of that name, or nil when it was not given.
// Asking for a name the signature lacks is a fault in assay.
func (a *Args) Get(name string) py.Object {
	i := a.index(name)
	if i < 0 {
		panic(fmt.Sprintf("%s() has no parameter %q", a.fn, name))
	}
	return a.value(i)
}

// Has reports whether the argument was given (None counts as given).
func (a *Args) Has(name string) bool { return a.Get(name) != nil }

// Given reports whether the argument was given and is not None.
func (a *Args) Given(name string) bool {
	o := a.Get(name)
	return o != nil && o != py.None
}

// Int reads an integer argument, def when it is absent or None.
func (a *Args) Int(name string, def int64) (int64, error) {
	return Int(a.fn, name, a.Get(name), def)
}

// String reads a string argument that must be given.
func (a *Args) String(name string) (string, error) {
	return String(a.fn, name, a.Get(name))
}

// Bool reads True or False, def when it is absent; None is refused.
func (a *Args) Bool(name string, def bool) (bool, error) {
	return Bool(a.fn, name, a.Get(name), def)
}

// Text is str() of the argument, def when it is absent or None.
func (a *Args) Text(name, def string) string {
	o := a.Get(name)
	if o == nil || o == py.None {
		return def
	}
	return Str(o)
}

// Int reads an optional integer: an int, or any value that is one exactly
// (it answers __index__, as an integral rational does).
func Int(fn, name string, o py.Object, def int64) (int64, error) {
	if o == nil || o == py.None {
		return def, nil
	}
	switch x := o.(type) {
	case py.Int:
		return int64(x), nil
	case *py.BigInt:
		if v, err := x.GoInt64(); err == nil {
			return v, nil
		}
	case py.Bool:
	case py.I__index__:
		if v, err := x.M__index__(); err == nil {
			return int64(v), nil
		}
	}
	return 0, py.ExceptionNewf(py.TypeError, "%s(): %s must be an integer, got %s", fn, name, TypeName(o))
}

// String reads a string argument.
func String(fn, name string, o py.Object) (string, error) {
	s, ok := o.(py.String)
	if !ok {
		return "", py.ExceptionNewf(py.TypeError, "%s(): %s must be a string, got %s", fn, name, TypeName(o))
	}
	return string(s), nil
}

// Bool reads True or False, def when absent. None is refused: a flag that
// reads as "not given" when it was given would be a quiet misreading.
func Bool(fn, name string, o py.Object, def bool) (bool, error) {
	if o == nil {
		return def, nil
	}
	b, ok := o.(py.Bool)
	if !ok {
		return false, py.ExceptionNewf(py.TypeError, "%s(): %s must be True or False", fn, name)
	}
	return bool(b), nil
}

// Str is str(o), or the type's name in angle brackets when o cannot print itself.
func Str(o py.Object) string {
	s, err := py.StrAsString(o)
	if err != nil {
		return fmt.Sprintf("<%s>", o.Type().Name)
	}
	return s
}

// TypeName names o's type as a message does: "a rational", "a list".
func TypeName(o py.Object) string {
	if o == nil {
		return "nothing"
	}
	name := o.Type().Name
	if name != "" && strings.ContainsRune("aeiou", rune(name[0])) {
		return "an " + name
	}
	return "a " + name
}

// Callable reports whether o can be called.
func Callable(o py.Object) bool {
	_, ok := o.(py.I__call__)
	return ok
}

// Items are the entries of a list or a tuple.
func Items(o py.Object) ([]py.Object, bool) {
	switch x := o.(type) {
	case *py.List:
		return x.Items, true
	case py.Tuple:
		return x, true
	}
	return nil, false
}

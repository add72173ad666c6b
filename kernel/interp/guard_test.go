package interp

import (
	"fmt"
	"strings"
	"testing"

	"github.com/go-python/gpython/py"

	"assay/exact"
)

// A Go panic behind a builtin or an operator becomes a RuntimeError the
// notebook can catch, naming the function, with no Go stack in its text.
func TestRecoverTurnsPanicsIntoExceptions(t *testing.T) {
	operator := func() (res py.Object, err error) {
		defer Recover("rational.__add__", &res, &err)
		var m map[string]int
		m["x"]++ // a nil-map write panics
		return py.None, nil
	}
	_, err := operator()
	if !py.IsException(py.RuntimeError, err) || !strings.Contains(err.Error(), "rational.__add__") || strings.Contains(err.Error(), "goroutine") || strings.Contains(err.Error(), ".go:") {
		t.Errorf("panic gave %v", err)
	}
	f := Func("boom", "", func(py.Tuple, py.StringDict) (py.Object, error) { panic("no") })
	if _, err := f.Call(nil, nil); !py.IsException(py.RuntimeError, err) || !strings.Contains(err.Error(), "boom()") {
		t.Errorf("builtin panic gave %v", err)
	}
	// A Python exception raised by panic passes as itself.
	raise := Func("raise", "", func(py.Tuple, py.StringDict) (py.Object, error) {
		panic(py.ExceptionNewf(py.KeyError, "k"))
	})
	if _, err := raise.Call(nil, nil); !py.IsException(py.KeyError, err) {
		t.Errorf("a raised exception became %v", err)
	}
}

// Go errors from the mathematics reach the notebook as the exception a
// Python author expects, with their message.
func TestExceptionTranslatesGoErrors(t *testing.T) {
	cases := []struct {
		err  error
		want *py.Type
	}{
		{exact.ErrDivisionByZero, py.ZeroDivisionError},
		{fmt.Errorf("inverse: %w", exact.ErrSingular), py.ZeroDivisionError},
		{exact.ErrTooManyTerms, py.MemoryError},
		{fmt.Errorf("sign at 128 bits: %w", exact.ErrUndecided), py.ArithmeticError},
		{exact.ErrDomain, py.ValueError},
		{fmt.Errorf("something else"), py.ValueError},
		{py.ExceptionNewf(py.IndexError, "i"), py.IndexError},
	}
	for _, c := range cases {
		got := Exception(c.err)
		if !py.IsException(c.want, got) || !strings.Contains(got.Error(), strings.SplitN(c.err.Error(), ":", 2)[0]) {
			t.Errorf("%v became %v, want %s", c.err, got, c.want.Name)
		}
	}
	if Exception(nil) != nil {
		t.Error("nil is not an error")
	}
}

// Arguments are read by name whatever way they were passed.
func TestBindReadsByName(t *testing.T) {
	a, err := Bind("f", py.Tuple{py.Int(1), py.Int(2), py.Int(3)}, py.StringDict{"c": py.True, "z": py.Int(9)}, "a", "b=", "*rest", "**more")
	if err != nil {
		t.Fatal(err)
	}
	if n, _ := a.Int("a", 0); n != 1 || !a.Has("b") || len(a.Rest()) != 1 || a.Keywords()["z"] != py.Int(9) {
		t.Errorf("bound %+v", a)
	}
	if a.Keywords()["c"] != py.True || a.Has("b") && a.Get("b") != py.Int(2) {
		t.Errorf("keywords %v, b = %v", a.Keywords(), a.Get("b"))
	}
	if d, err := a.Bool("b", false); err == nil {
		t.Errorf("an int read as a bool: %v", d)
	}
	bad := []struct {
		args py.Tuple
		kw   py.StringDict
		want string
	}{
		{nil, nil, `f() is missing its argument "a"`},
		{py.Tuple{py.Int(1), py.Int(2)}, nil, "f() takes at most 1 arguments (2 given)"},
		{py.Tuple{py.Int(1)}, py.StringDict{"a": py.Int(2)}, `f() got two values for "a"`},
		{nil, py.StringDict{"q": py.Int(2)}, `f() has no argument "q"`},
	}
	for _, c := range bad {
		if _, err := Bind("f", c.args, c.kw, "a"); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%v %v: %v, want %q", c.args, c.kw, err, c.want)
		}
	}
	if _, err := Int("f", "n", py.String("x"), 0); err == nil || !strings.Contains(err.Error(), "n must be an integer") {
		t.Errorf("Int of a string: %v", err)
	}
}

// One Signature, read once, binds call after call with no call's
// arguments showing in another's, by the rule of Python's calls (Language
// Reference, 6.3.4 Calls): positional arguments fill the first slots, a
// keyword the slot it names, an unfilled slot takes its default (here:
// absent), and an unfilled slot without one is an error.
func TestSignatureBindsEachCallApart(t *testing.T) {
	sig := NewSignature("g", "x", "y=", "z")
	first, err := sig.Bind(py.Tuple{py.Int(1)}, py.StringDict{"z": py.Int(3)})
	if err != nil {
		t.Fatal(err)
	}
	second, err := sig.Bind(py.Tuple{py.Int(4), py.Int(5), py.Int(6)}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if first.Get("x") != py.Int(1) || first.Has("y") || first.Get("z") != py.Int(3) {
		t.Errorf("first call bound x=%v y=%v z=%v, want 1, absent, 3", first.Get("x"), first.Get("y"), first.Get("z"))
	}
	if second.Get("x") != py.Int(4) || second.Get("y") != py.Int(5) || second.Get("z") != py.Int(6) {
		t.Errorf("second call bound x=%v y=%v z=%v, want 4, 5, 6", second.Get("x"), second.Get("y"), second.Get("z"))
	}
	if _, err := sig.Bind(py.Tuple{py.Int(1)}, py.StringDict{"y": py.Int(2)}); err == nil || !strings.Contains(err.Error(), `g() is missing its argument "z"`) {
		t.Errorf("z left out: %v", err)
	}
	if _, err := sig.Bind(py.Tuple{py.Int(1)}, py.StringDict{"z": py.Int(2), "w": py.Int(0)}); err == nil || !strings.Contains(err.Error(), `g() has no argument "w"`) {
		t.Errorf("unknown keyword w: %v", err)
	}
}

// A signature longer than the values an Args holds in itself binds its
// later parameters by the same rule (Python's Language Reference, 6.3.4
// Calls), positionally and by keyword, and Map maps them all.
func TestLongSignature(t *testing.T) {
	names := []string{"p0", "p1", "p2", "p3", "p4", "p5", "p6="}
	sig := NewSignature("h", names...)
	args := py.Tuple{py.Int(0), py.Int(1), py.Int(2), py.Int(3), py.Int(4)}
	a, err := sig.Bind(args, py.StringDict{"p5": py.Int(5)})
	if err != nil {
		t.Fatal(err)
	}
	for i, name := range names[:6] {
		if n, err := a.Int(name, -1); err != nil || n != int64(i) {
			t.Errorf("%s = %d, %v", name, n, err)
		}
	}
	if a.Has("p6") {
		t.Errorf("p6 bound to %v", a.Get("p6"))
	}
	twice, err := a.Map(func(o py.Object) (py.Object, error) { return py.Int(2 * int64(o.(py.Int))), nil })
	if err != nil {
		t.Fatal(err)
	}
	for i, name := range names[:6] {
		if n, _ := twice.Int(name, -1); n != int64(2*i) {
			t.Errorf("mapped %s = %d, want %d", name, n, 2*i)
		}
		if n, _ := a.Int(name, -1); n != int64(i) {
			t.Errorf("Map changed %s of the call it mapped to %d", name, n)
		}
	}
	if _, err := sig.Bind(args, py.StringDict{"p4": py.Int(9), "p5": py.Int(5)}); err == nil || !strings.Contains(err.Error(), `h() got two values for "p4"`) {
		t.Errorf("p4 twice: %v", err)
	}
	if _, err := sig.Bind(args[:4], py.StringDict{"p4": py.Int(4)}); err == nil || !strings.Contains(err.Error(), `h() is missing its argument "p5"`) {
		t.Errorf("p5 left out: %v", err)
	}
}

// panicky is a value whose operator panics without a guard of its own.
type panicky struct{}

var panickyType = py.NewType("panicky", "")

func (panicky) Type() *py.Type { return panickyType }

func (panicky) M__add__(py.Object) (py.Object, error) { panic("lost") }

// A panic in an instruction becomes an exception at that instruction: the
// cell can catch it, and its line is the notebook line.
func TestInstructionPanicsAreExceptions(t *testing.T) {
	sb, globals := testSandbox(t, nil)
	globals["p"] = panicky{}
	code, err := Compile(1, 10, "try:\n    p + 1\nexcept RuntimeError as e:\n    caught = str(e)\np + 2\n", nil)
	if err != nil {
		t.Fatal(err)
	}
	_, err = sb.RunCode(code, globals, globals, nil)
	line, msg := Describe(err, 0)
	if line != 14 || !strings.Contains(msg, "RuntimeError: internal error in the interpreter: lost") {
		t.Errorf("line %d, %q", line, msg)
	}
	if caught, _ := globals["caught"].(py.String); !strings.Contains(string(caught), "lost") {
		t.Errorf("the first panic was not caught: %v", globals["caught"])
	}
}

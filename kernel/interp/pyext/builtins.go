package pyext

import (
	"math"
	"math/big"

	"github.com/go-python/gpython/py"
)

// installNumbers adds __format__ to the numeric types so that
// x.__format__(spec) works as it does in CPython.
func installNumbers() {
	for _, t := range []*py.Type{py.IntType, py.BigIntType, py.FloatType, py.BoolType} {
		t.Dict["__format__"] = newMethod("__format__", "x.__format__(format_spec) -> str", func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
			if err := noKwargs("__format__", kwargs); err != nil {
				return nil, err
			}
			if err := nargs("__format__", args, 1, 1); err != nil {
				return nil, err
			}
			spec, ok := args[0].(py.String)
			if !ok {
				return nil, py.ExceptionNewf(py.TypeError, "__format__() argument must be str, not %s", typeName(args[0]))
			}
			return formatObject(self, string(spec))
		})
	}
}

// installConstructors makes bool(x) callable (gpython's bool type has no
// constructor), lets int() and float() convert a bool, and makes zip()
// with no arguments return an empty iterator (gpython's loops forever).
func installConstructors() {
	for _, t := range []*py.Type{py.IntType, py.FloatType} {
		if orig := t.New; orig != nil {
			t.New = func(metatype *py.Type, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
				if len(args) == 1 {
					if b, ok := args[0].(py.Bool); ok {
						n := py.Int(0)
						if b {
							n = 1
						}
						args = py.Tuple{n}
					}
				}
				return orig(metatype, args, kwargs)
			}
		}
	}
	if py.BoolType.New == nil {
		py.BoolType.New = func(metatype *py.Type, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
			if err := noKwargs("bool", kwargs); err != nil {
				return nil, err
			}
			if len(args) > 1 {
				return nil, py.ExceptionNewf(py.TypeError, "bool expected at most 1 argument, got %d", len(args))
			}
			if len(args) == 0 {
				return py.False, nil
			}
			t, err := truth(args[0])
			if err != nil {
				return nil, err
			}
			return py.NewBool(t), nil
		}
	}
	if zipNew := py.ZipType.New; zipNew != nil {
		py.ZipType.New = func(metatype *py.Type, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
			if len(args) == 0 {
				// zip(()) is empty and still a zip object.
				return zipNew(metatype, py.Tuple{py.Tuple{}}, kwargs)
			}
			return zipNew(metatype, args, kwargs)
		}
	}
}

// builtin registers fn as the builtin name in the module.
func builtin(m *py.Module, name, doc string, fn methodFunc) {
	meth := newMethod(name, doc, fn)
	meth.Module = m
	m.Globals[name] = meth
}

func installBuiltins(m *py.Module) {
	builtin(m, "round", roundDoc, builtinRound)
	builtin(m, "callable", "callable(object) -> bool\n\nReturn whether the object is callable (i.e., some kind of function).", builtinCallable)
	builtin(m, "format", "format(value[, format_spec]) -> string\n\nReturns value.__format__(format_spec); format_spec defaults to \"\".", builtinFormat)
	builtin(m, "reversed", "reversed(sequence) -> reverse iterator over values of the sequence", builtinReversed)
	builtin(m, "sorted", "sorted(iterable, key=None, reverse=False) --> new sorted list", builtinSorted)
	builtin(m, "min", "min(iterable, *[, default=obj, key=func]) -> value\nmin(arg1, arg2, *args, *[, key=func]) -> value\n\nWith a single iterable argument, return its smallest item.", func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		return minMax("min", args, kwargs, false)
	})
	builtin(m, "max", "max(iterable, *[, default=obj, key=func]) -> value\nmax(arg1, arg2, *args, *[, key=func]) -> value\n\nWith a single iterable argument, return its biggest item.", func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		return minMax("max", args, kwargs, true)
	})
}

const roundDoc = `round(number[, ndigits]) -> number

Round a number to a given precision in decimal digits (default 0 digits).
This returns an int when called with one argument, otherwise the
same type as the number. ndigits may be negative. Halves round to even.`

func builtinRound(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
	var number, ndigits py.Object = nil, py.None
	if err := py.ParseTupleAndKeywords(args, kwargs, "O|O:round", []string{"number", "ndigits"}, &number, &ndigits); err != nil {
		return nil, err
	}
	if b, ok := number.(py.Bool); ok {
		number = py.Int(0)
		if b {
			number = py.Int(1)
		}
	}
	if res, found, err := callUser(number, "__round__", argsIf(ndigits)...); found {
		return res, err
	}
	if isNone(ndigits) {
		switch x := number.(type) {
		case py.Int, *py.BigInt:
			return x, nil
		case py.Float:
			return floatToInt(math.RoundToEven(float64(x)))
		}
		return nil, py.ExceptionNewf(py.TypeError, "type %s doesn't define __round__ method", typeName(number))
	}
	n, err := toInt(ndigits)
	if err != nil {
		return nil, err
	}
	switch x := number.(type) {
	case py.Int:
		return roundInt(big.NewInt(int64(x)), n), nil
	case *py.BigInt:
		return roundInt((*big.Int)(x), n), nil
	case py.Float:
		return roundFloat(float64(x), n)
	}
	return nil, py.ExceptionNewf(py.TypeError, "type %s doesn't define __round__ method", typeName(number))
}

func argsIf(o py.Object) []py.Object {
	if isNone(o) {
		return nil
	}
	return []py.Object{o}
}

// floatToInt converts an integral float to an int object.
func floatToInt(f float64) (py.Object, error) {
	switch {
	case math.IsNaN(f):
		return nil, py.ExceptionNewf(py.ValueError, "cannot convert float NaN to integer")
	case math.IsInf(f, 0):
		return nil, py.ExceptionNewf(py.OverflowError, "cannot convert float infinity to integer")
	case f >= -(1<<63) && f < 1<<63:
		return py.Int(int64(f)), nil
	}
	z, _ := new(big.Float).SetFloat64(f).Int(nil)
	return (*py.BigInt)(z), nil
}

// intObject returns x as a py.Int when it fits, else a *py.BigInt.
func intObject(x *big.Int) py.Object {
	if x.IsInt64() {
		return py.Int(x.Int64())
	}
	return (*py.BigInt)(new(big.Int).Set(x))
}

// roundHalfEven rounds num/den (den > 0) to the nearest integer, halves to
// even.
func roundHalfEven(num, den *big.Int) *big.Int {
	q, r := new(big.Int).QuoRem(num, den, new(big.Int))
	twice := new(big.Int).Abs(r)
	twice.Lsh(twice, 1)
	switch c := twice.Cmp(den); {
	case c > 0, c == 0 && q.Bit(0) == 1:
		if num.Sign() < 0 {
			q.Sub(q, big.NewInt(1))
		} else {
			q.Add(q, big.NewInt(1))
		}
	}
	return q
}

// roundInt is round(x, n) for an int x.
func roundInt(x *big.Int, n int) py.Object {
	if n >= 0 {
		return intObject(x)
	}
	pow := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(-n)), nil)
	q := roundHalfEven(x, pow)
	return intObject(q.Mul(q, pow))
}

// roundFloat is round(x, n) for a float x: x rounded exactly (halves to
// even) to n decimal digits, then converted to the nearest float, as
// CPython does.
func roundFloat(x float64, n int) (py.Object, error) {
	if math.IsNaN(x) || math.IsInf(x, 0) || x == 0 {
		return py.Float(x), nil
	}
	if n > 330 {
		return py.Float(x), nil
	}
	if n < -330 {
		return py.Float(math.Copysign(0, x)), nil
	}
	r := new(big.Rat).SetFloat64(x)
	pow := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(abs(n))), nil)
	num, den := new(big.Int).Set(r.Num()), new(big.Int).Set(r.Denom())
	if n >= 0 {
		num.Mul(num, pow)
	} else {
		den.Mul(den, pow)
	}
	q := roundHalfEven(num, den)
	var res *big.Rat
	if n >= 0 {
		res = new(big.Rat).SetFrac(q, pow)
	} else {
		res = new(big.Rat).SetInt(q.Mul(q, pow))
	}
	f, _ := res.Float64()
	if math.IsInf(f, 0) {
		return nil, py.ExceptionNewf(py.OverflowError, "rounded value too large to represent")
	}
	return py.Float(math.Copysign(f, x)), nil
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

func builtinCallable(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
	if err := noKwargs("callable", kwargs); err != nil {
		return nil, err
	}
	if err := nargs("callable", args, 1, 1); err != nil {
		return nil, err
	}
	o := args[0]
	if isUserInstance(o) {
		return py.NewBool(o.(*py.Type).ObjectType.NativeGetAttrOrNil("__call__") != nil), nil
	}
	_, ok := o.(py.I__call__)
	return py.NewBool(ok), nil
}

func builtinFormat(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
	var value py.Object
	var spec py.Object = py.String("")
	if err := py.ParseTupleAndKeywords(args, kwargs, "O|O:format", []string{"value", "format_spec"}, &value, &spec); err != nil {
		return nil, err
	}
	s, ok := spec.(py.String)
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "format() argument 2 must be str, not %s", typeName(spec))
	}
	return formatObject(value, string(s))
}

func builtinReversed(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
	if err := noKwargs("reversed", kwargs); err != nil {
		return nil, err
	}
	if err := nargs("reversed", args, 1, 1); err != nil {
		return nil, err
	}
	seq := args[0]
	if res, found, err := callUser(seq, "__reversed__"); found {
		return res, err
	}
	reverse := func(items []py.Object) py.Object {
		out := make(py.Tuple, len(items))
		for i, item := range items {
			out[len(items)-1-i] = item
		}
		return py.NewIterator(out)
	}
	switch x := seq.(type) {
	case *py.List:
		return reverse(x.Items), nil
	case py.Tuple:
		return reverse(x), nil
	case py.String:
		runes := []rune(string(x))
		items := make([]py.Object, len(runes))
		for i, r := range runes {
			items[i] = py.String(r)
		}
		return reverse(items), nil
	case *py.Range:
		if x.Length == 0 {
			return py.NewIterator(py.Tuple{}), nil
		}
		last := x.Start + (x.Length-1)*x.Step
		return py.Iter(&py.Range{Start: last, Stop: x.Start - x.Step, Step: -x.Step, Length: x.Length})
	case py.StringDict, *py.Set:
		return nil, py.ExceptionNewf(py.TypeError, "'%s' object is not reversible", typeName(seq))
	}
	// Any other sequence: __len__ and __getitem__.
	n, err := py.Len(seq)
	if err != nil {
		return nil, py.ExceptionNewf(py.TypeError, "'%s' object is not reversible", typeName(seq))
	}
	length, err := toInt(n)
	if err != nil {
		return nil, err
	}
	items := make([]py.Object, length)
	for i := range items {
		if items[i], err = py.GetItem(seq, py.Int(i)); err != nil {
			return nil, err
		}
	}
	return reverse(items), nil
}

func builtinSorted(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
	if len(args) != 1 {
		return nil, py.ExceptionNewf(py.TypeError, "sorted expected 1 argument, got %d", len(args))
	}
	key, reverse, err := sortArgs("sorted", kwargs)
	if err != nil {
		return nil, err
	}
	items, err := collect(args[0])
	if err != nil {
		return nil, err
	}
	if err := sortItems(items, key, reverse); err != nil {
		return nil, err
	}
	return py.NewListFromItems(items), nil
}

// minMax implements min and max: any callable key, ties keep the first
// item, and tuples compare as in Python.
func minMax(name string, args py.Tuple, kwargs py.StringDict, isMax bool) (py.Object, error) {
	var key, dflt py.Object = py.None, nil
	for k, v := range kwargs {
		switch k {
		case "key":
			key = v
		case "default":
			dflt = v
		default:
			return nil, py.ExceptionNewf(py.TypeError, "'%s' is an invalid keyword argument for %s()", k, name)
		}
	}
	var items []py.Object
	switch len(args) {
	case 0:
		return nil, py.ExceptionNewf(py.TypeError, "%s expected at least 1 argument, got 0", name)
	case 1:
		var err error
		if items, err = collect(args[0]); err != nil {
			return nil, err
		}
	default:
		if dflt != nil {
			return nil, py.ExceptionNewf(py.TypeError, "Cannot specify a default for %s() with multiple positional arguments", name)
		}
		items = args
	}
	if len(items) == 0 {
		if dflt != nil {
			return dflt, nil
		}
		return nil, py.ExceptionNewf(py.ValueError, "%s() arg is an empty sequence", name)
	}
	keyOf := func(item py.Object) (py.Object, error) {
		if isNone(key) {
			return item, nil
		}
		return py.Call(key, py.Tuple{item}, nil)
	}
	best := items[0]
	bestKey, err := keyOf(best)
	if err != nil {
		return nil, err
	}
	for _, item := range items[1:] {
		k, err := keyOf(item)
		if err != nil {
			return nil, err
		}
		var better bool
		if isMax {
			better, err = lessThan(bestKey, k)
		} else {
			better, err = lessThan(k, bestKey)
		}
		if err != nil {
			return nil, err
		}
		if better {
			best, bestKey = item, k
		}
	}
	return best, nil
}

package pyext

import (
	"math"
	"math/big"

	"github.com/go-python/gpython/py"

	"assay/kernel/interp"
)

// installNumbers gives the numeric types the __format__ that format() and
// str.format call.
func installNumbers() {
	for _, t := range []*py.Type{py.IntType, py.BigIntType, py.FloatType, py.BoolType} {
		t.Dict["__format__"] = interp.Method("__format__", "__format__(spec): the number laid out by a format spec", func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
			if err := positional("__format__", args, kwargs, 1, 1); err != nil {
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

// patchNew replaces typ's constructor by fn, through interp's panic guard;
// fn gets the constructor it replaces, nil when the type had none.
func patchNew(typ *py.Type, fn func(orig py.NewFunc, metatype *py.Type, args py.Tuple, kwargs py.StringDict) (py.Object, error)) {
	orig := typ.New
	typ.New = func(metatype *py.Type, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		return interp.Guard(typ.Name+"()", func() (py.Object, error) { return fn(orig, metatype, args, kwargs) })
	}
}

// installConstructors gives bool a constructor (upstream has none), lets
// int() and float() take a bool, and makes zip() with no arguments empty
// (upstream's never ends).
func installConstructors() {
	for _, t := range []*py.Type{py.IntType, py.FloatType} {
		patchNew(t, func(orig py.NewFunc, metatype *py.Type, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
			if len(args) == 1 {
				if b, ok := args[0].(py.Bool); ok {
					args = py.Tuple{boolInt(b)}
				}
			}
			return orig(metatype, args, kwargs)
		})
	}
	patchNew(py.BoolType, func(_ py.NewFunc, _ *py.Type, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		if err := positional("bool", args, kwargs, 0, 1); err != nil {
			return nil, err
		}
		if len(args) == 0 {
			return py.False, nil
		}
		t, err := truth(args[0])
		if err != nil {
			return nil, err
		}
		return py.NewBool(t), nil
	})
	patchNew(py.ZipType, func(orig py.NewFunc, metatype *py.Type, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		if len(args) == 0 {
			// As zip of one empty sequence: empty, and still a zip object.
			args = py.Tuple{py.Tuple{}}
		}
		return orig(metatype, args, kwargs)
	})
}

// boolInt is the int a bool stands for.
func boolInt(b py.Bool) py.Int {
	if b {
		return 1
	}
	return 0
}

// builtin stores fn in the module as the builtin name, through interp's
// panic guard.
func builtin(m *py.Module, name, doc string, fn func(args py.Tuple, kwargs py.StringDict) (py.Object, error)) {
	meth := interp.Func(name, doc, fn)
	meth.Module = m
	m.Globals[name] = meth
}

func installBuiltins(m *py.Module) {
	builtin(m, "round", "round(x, ndigits=None): x rounded to ndigits decimals, halves to even; an int when ndigits is left out", builtinRound)
	builtin(m, "callable", "callable(x): whether x can be called", builtinCallable)
	builtin(m, "format", "format(x, spec=''): x laid out by a format spec", builtinFormat)
	builtin(m, "reversed", "reversed(seq): an iterator over seq from its last item to its first", builtinReversed)
	builtin(m, "sorted", "sorted(items, key=None, reverse=False): a new list of the items in order; equal ones keep their order", builtinSorted)
	builtin(m, "min", "min(items, key=None, default=...) or min(a, b, ...): the smallest, the first of equals", func(args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		return minMax("min", args, kwargs, false)
	})
	builtin(m, "max", "max(items, key=None, default=...) or max(a, b, ...): the largest, the first of equals", func(args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		return minMax("max", args, kwargs, true)
	})
}

func builtinRound(args py.Tuple, kwargs py.StringDict) (py.Object, error) {
	a, err := interp.Bind("round", args, kwargs, "number", "ndigits=")
	if err != nil {
		return nil, err
	}
	number, ndigits := a.Get("number"), a.Get("ndigits")
	if b, ok := number.(py.Bool); ok {
		number = boolInt(b)
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

func builtinCallable(args py.Tuple, kwargs py.StringDict) (py.Object, error) {
	if err := positional("callable", args, kwargs, 1, 1); err != nil {
		return nil, err
	}
	o := args[0]
	if isUserInstance(o) {
		return py.NewBool(o.(*py.Type).ObjectType.NativeGetAttrOrNil("__call__") != nil), nil
	}
	return py.NewBool(interp.Callable(o)), nil
}

// builtinFormat takes its arguments by position only, as CPython's does.
func builtinFormat(args py.Tuple, kwargs py.StringDict) (py.Object, error) {
	if err := positional("format", args, kwargs, 1, 2); err != nil {
		return nil, err
	}
	value, spec := args[0], py.Object(py.String(""))
	if len(args) == 2 {
		spec = args[1]
	}
	s, ok := spec.(py.String)
	if !ok {
		return nil, py.ExceptionNewf(py.TypeError, "format() argument 2 must be str, not %s", typeName(spec))
	}
	return formatObject(value, string(s))
}

func builtinReversed(args py.Tuple, kwargs py.StringDict) (py.Object, error) {
	if err := positional("reversed", args, kwargs, 1, 1); err != nil {
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

func builtinSorted(args py.Tuple, kwargs py.StringDict) (py.Object, error) {
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

package pyext

import (
	"sort"

	"github.com/go-python/gpython/py"

	"assay/kernel/interp"
)

// gpython's dict is py.StringDict (type py.StringDictType), a Go map that
// only admits str keys; its methods are registered there.

// dictMethod registers a dict method taking min to max positional
// arguments.
func dictMethod(name string, min, max int, doc string, fn func(d py.StringDict, args py.Tuple) (py.Object, error)) {
	positionalMethod(py.StringDictType, name, min, max, doc, fn)
}

// strKey returns key as a Go string for storing into a dict.
func strKey(key py.Object) (string, error) {
	s, ok := key.(py.String)
	if !ok {
		return "", py.ExceptionNewf(py.TypeError, "dict keys must be str in this interpreter, not %s", typeName(key))
	}
	return string(s), nil
}

// sortedKeys returns the keys of d in sorted order, so that keys(),
// values() and items() agree with each other and are reproducible. (Go map
// order is random; CPython's insertion order is not recorded by gpython.)
func sortedKeys(d py.StringDict) []string {
	keys := make([]string, 0, len(d))
	for k := range d {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

// updateDict implements the positional argument of dict.update: a dict,
// an object with keys() (a mapping), or an iterable of key/value pairs.
func updateDict(d py.StringDict, other py.Object) error {
	if o, ok := other.(py.StringDict); ok {
		for k, v := range o {
			d[k] = v
		}
		return nil
	}
	if keysFn, err := py.GetAttrString(other, "keys"); err == nil {
		keys, err := py.Call(keysFn, nil, nil)
		if err != nil {
			return err
		}
		return iterate(keys, func(key py.Object) error {
			k, err := strKey(key)
			if err != nil {
				return err
			}
			v, err := py.GetItem(other, key)
			if err != nil {
				return err
			}
			d[k] = v
			return nil
		})
	}
	i := 0
	return iterate(other, func(item py.Object) error {
		pair, err := collect(item)
		if err != nil {
			return py.ExceptionNewf(py.TypeError, "cannot convert dictionary update sequence element #%d to a sequence", i)
		}
		if len(pair) != 2 {
			return py.ExceptionNewf(py.ValueError, "dictionary update sequence element #%d has length %d; 2 is required", i, len(pair))
		}
		k, err := strKey(pair[0])
		if err != nil {
			return err
		}
		d[k] = pair[1]
		i++
		return nil
	})
}

func installDict() {
	dictMethod("keys", 0, 0, "keys(): the keys, sorted, in a new list", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		keys := sortedKeys(d)
		items := make([]py.Object, len(keys))
		for i, k := range keys {
			items[i] = py.String(k)
		}
		return py.NewListFromItems(items), nil
	})

	dictMethod("values", 0, 0, "values(): the values in a new list, in the order of keys()", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		keys := sortedKeys(d)
		items := make([]py.Object, len(keys))
		for i, k := range keys {
			items[i] = d[k]
		}
		return py.NewListFromItems(items), nil
	})

	dictMethod("items", 0, 0, "items(): the (key, value) pairs in a new list, in the order of keys()", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		keys := sortedKeys(d)
		items := make([]py.Object, len(keys))
		for i, k := range keys {
			items[i] = py.Tuple{py.String(k), d[k]}
		}
		return py.NewListFromItems(items), nil
	})

	dictMethod("get", 1, 2, "get(key, default=None): the value stored under key, or default", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		if k, ok := args[0].(py.String); ok {
			if v, ok := d[string(k)]; ok {
				return v, nil
			}
		}
		if len(args) > 1 {
			return args[1], nil
		}
		return py.None, nil
	})

	dictMethod("setdefault", 1, 2, "setdefault(key, default=None): the value under key, storing default there first if key is absent", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		k, err := strKey(args[0])
		if err != nil {
			return nil, err
		}
		if v, ok := d[k]; ok {
			return v, nil
		}
		var v py.Object = py.None
		if len(args) > 1 {
			v = args[1]
		}
		d[k] = v
		return v, nil
	})

	dictMethod("pop", 1, 2, "pop(key, default): remove key and return its value; default, or KeyError, if it is absent", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		if k, ok := args[0].(py.String); ok {
			if v, ok := d[string(k)]; ok {
				delete(d, string(k))
				return v, nil
			}
		}
		if len(args) > 1 {
			return args[1], nil
		}
		return nil, keyError(args[0])
	})

	dictMethod("popitem", 0, 0, "popitem(): remove the pair with the last key in sorted order and return it", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		keys := sortedKeys(d)
		if len(keys) == 0 {
			return nil, py.ExceptionNewf(py.KeyError, "popitem(): dictionary is empty")
		}
		k := keys[len(keys)-1]
		v := d[k]
		delete(d, k)
		return py.Tuple{py.String(k), v}, nil
	})

	method(py.StringDictType, "update", "update(other=(), **kw): store the pairs of a dict, mapping or sequence of pairs, then the keywords", func(d py.StringDict, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		if err := nargs("update", args, 0, 1); err != nil {
			return nil, err
		}
		if len(args) == 1 {
			if err := updateDict(d, args[0]); err != nil {
				return nil, err
			}
		}
		for k, v := range kwargs {
			d[k] = v
		}
		return py.None, nil
	})

	dictMethod("copy", 0, 0, "copy(): a new dict holding the same pairs", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		return d.Copy(), nil
	})

	dictMethod("clear", 0, 0, "clear(): remove every pair", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		for k := range d {
			delete(d, k)
		}
		return py.None, nil
	})

	// fromkeys is a classmethod in CPython: dict.fromkeys(keys) and
	// {}.fromkeys(keys) both work, so self is ignored.
	py.StringDictType.Dict["fromkeys"] = interp.Method("fromkeys", "fromkeys(keys, value=None): a new dict that maps every key to value", func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		if err := positional("fromkeys", args, kwargs, 1, 2); err != nil {
			return nil, err
		}
		var v py.Object = py.None
		if len(args) > 1 {
			v = args[1]
		}
		d := py.NewStringDict()
		err := iterate(args[0], func(key py.Object) error {
			k, err := strKey(key)
			if err != nil {
				return err
			}
			d[k] = v
			return nil
		})
		if err != nil {
			return nil, err
		}
		return d, nil
	})
}

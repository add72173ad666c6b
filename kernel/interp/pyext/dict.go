package pyext

import (
	"sort"

	"github.com/go-python/gpython/py"
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
	dictMethod("keys", 0, 0, "D.keys() -> list of D's keys (a list, not a view)", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		keys := sortedKeys(d)
		items := make([]py.Object, len(keys))
		for i, k := range keys {
			items[i] = py.String(k)
		}
		return py.NewListFromItems(items), nil
	})

	dictMethod("values", 0, 0, "D.values() -> list of D's values (a list, not a view)", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		keys := sortedKeys(d)
		items := make([]py.Object, len(keys))
		for i, k := range keys {
			items[i] = d[k]
		}
		return py.NewListFromItems(items), nil
	})

	dictMethod("items", 0, 0, "D.items() -> list of D's (key, value) pairs, as 2-tuples (a list, not a view)", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		keys := sortedKeys(d)
		items := make([]py.Object, len(keys))
		for i, k := range keys {
			items[i] = py.Tuple{py.String(k), d[k]}
		}
		return py.NewListFromItems(items), nil
	})

	dictMethod("get", 1, 2, "D.get(k[,d]) -> D[k] if k in D, else d.  d defaults to None.", func(d py.StringDict, args py.Tuple) (py.Object, error) {
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

	dictMethod("setdefault", 1, 2, "D.setdefault(k[,d]) -> D.get(k,d), also set D[k]=d if k not in D", func(d py.StringDict, args py.Tuple) (py.Object, error) {
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

	dictMethod("pop", 1, 2, "D.pop(k[,d]) -> v, remove specified key and return the corresponding value.\nIf key is not found, d is returned if given, otherwise KeyError is raised", func(d py.StringDict, args py.Tuple) (py.Object, error) {
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

	dictMethod("popitem", 0, 0, "D.popitem() -> (k, v), remove and return some (key, value) pair as a\n2-tuple; but raise KeyError if D is empty.", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		keys := sortedKeys(d)
		if len(keys) == 0 {
			return nil, py.ExceptionNewf(py.KeyError, "popitem(): dictionary is empty")
		}
		k := keys[len(keys)-1]
		v := d[k]
		delete(d, k)
		return py.Tuple{py.String(k), v}, nil
	})

	py.StringDictType.Dict["update"] = newMethod("update", "D.update([E, ]**F) -> None.  Update D from dict/iterable E and F.", func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		d, args, err := receiver[py.StringDict](py.StringDictType, "update", self, args)
		if err != nil {
			return nil, err
		}
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

	dictMethod("copy", 0, 0, "D.copy() -> a shallow copy of D", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		return d.Copy(), nil
	})

	dictMethod("clear", 0, 0, "D.clear() -> None.  Remove all items from D.", func(d py.StringDict, args py.Tuple) (py.Object, error) {
		for k := range d {
			delete(d, k)
		}
		return py.None, nil
	})

	// fromkeys is a classmethod in CPython: dict.fromkeys(keys) and
	// {}.fromkeys(keys) both work, so self is ignored.
	py.StringDictType.Dict["fromkeys"] = newMethod("fromkeys", "dict.fromkeys(iterable[, value]) -> new dict with keys from iterable and values equal to value (default None).", func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		if err := noKwargs("fromkeys", kwargs); err != nil {
			return nil, err
		}
		if err := nargs("fromkeys", args, 1, 2); err != nil {
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

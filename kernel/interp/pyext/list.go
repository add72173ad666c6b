package pyext

import (
	"sort"

	"github.com/go-python/gpython/py"
)

// listMethod registers a list method taking min to max positional
// arguments.
func listMethod(name string, min, max int, doc string, fn func(l *py.List, args py.Tuple) (py.Object, error)) {
	positionalMethod(py.ListType, name, min, max, doc, fn)
}

// indexOf returns the index of the first item of items[start:end] equal to
// x, or -1; args holds the optional start and end.
func indexOf(items []py.Object, x py.Object, args py.Tuple) (int, error) {
	start, end, err := adjustIndices(args, len(items))
	if err != nil {
		return 0, err
	}
	for i := start; i < end; i++ {
		eq, err := eqObjects(items[i], x)
		if err != nil {
			return 0, err
		}
		if eq {
			return i, nil
		}
	}
	return -1, nil
}

func countOf(items []py.Object, x py.Object) (py.Object, error) {
	n := 0
	for _, item := range items {
		eq, err := eqObjects(item, x)
		if err != nil {
			return nil, err
		}
		if eq {
			n++
		}
	}
	return py.Int(n), nil
}

// sortItems sorts items in place, stably, by key(item) (or the items
// themselves when key is None) using Python's < extended to tuples and
// lists. Keys are computed once per item. On error items is unchanged.
func sortItems(items []py.Object, key py.Object, reverse bool) error {
	keys := items
	if !isNone(key) {
		keys = make([]py.Object, len(items))
		for i, item := range items {
			k, err := py.Call(key, py.Tuple{item}, nil)
			if err != nil {
				return err
			}
			keys[i] = k
		}
	}
	order := make([]int, len(items))
	for i := range order {
		order[i] = i
	}
	var firstErr error
	sort.SliceStable(order, func(i, j int) bool {
		if firstErr != nil {
			return false
		}
		a, b := keys[order[i]], keys[order[j]]
		if reverse {
			a, b = b, a
		}
		lt, err := lessThan(a, b)
		if err != nil {
			firstErr = err
			return false
		}
		return lt
	})
	if firstErr != nil {
		return firstErr
	}
	sorted := make([]py.Object, len(items))
	for i, o := range order {
		sorted[i] = items[o]
	}
	copy(items, sorted)
	return nil
}

// sortArgs parses the keyword-only key and reverse arguments of
// list.sort and sorted.
func sortArgs(name string, kwargs py.StringDict) (key py.Object, reverse bool, err error) {
	key = py.None
	for k, v := range kwargs {
		switch k {
		case "key":
			key = v
		case "reverse":
			if reverse, err = truth(v); err != nil {
				return nil, false, err
			}
		default:
			return nil, false, py.ExceptionNewf(py.TypeError, "'%s' is an invalid keyword argument for %s()", k, name)
		}
	}
	return key, reverse, nil
}

func installList() {
	listMethod("append", 1, 1, "L.append(object) -> None -- append object to end", func(l *py.List, args py.Tuple) (py.Object, error) {
		l.Items = append(l.Items, args[0])
		return py.None, nil
	})

	listMethod("extend", 1, 1, "L.extend(iterable) -> None -- extend list by appending elements from the iterable", func(l *py.List, args py.Tuple) (py.Object, error) {
		items, err := collect(args[0])
		if err != nil {
			return nil, err
		}
		l.Items = append(l.Items, items...)
		return py.None, nil
	})

	listMethod("pop", 0, 1, "L.pop([index]) -> item -- remove and return item at index (default last).\nRaises IndexError if list is empty or index is out of range.", func(l *py.List, args py.Tuple) (py.Object, error) {
		n := len(l.Items)
		if n == 0 {
			return nil, py.ExceptionNewf(py.IndexError, "pop from empty list")
		}
		i := n - 1
		if len(args) > 0 {
			var err error
			if i, err = toInt(args[0]); err != nil {
				return nil, err
			}
			if i < 0 {
				i += n
			}
			if i < 0 || i >= n {
				return nil, py.ExceptionNewf(py.IndexError, "pop index out of range")
			}
		}
		item := l.Items[i]
		l.Items = append(l.Items[:i], l.Items[i+1:]...)
		return item, nil
	})

	listMethod("insert", 2, 2, "L.insert(index, object) -- insert object before index", func(l *py.List, args py.Tuple) (py.Object, error) {
		i, err := toInt(args[0])
		if err != nil {
			return nil, err
		}
		n := len(l.Items)
		if i < 0 {
			i += n
			if i < 0 {
				i = 0
			}
		}
		if i > n {
			i = n
		}
		l.Items = append(l.Items, nil)
		copy(l.Items[i+1:], l.Items[i:])
		l.Items[i] = args[1]
		return py.None, nil
	})

	listMethod("index", 1, 3, "L.index(value, [start, [stop]]) -> integer -- return first index of value.\nRaises ValueError if the value is not present.", func(l *py.List, args py.Tuple) (py.Object, error) {
		i, err := indexOf(l.Items, args[0], args[1:])
		if err != nil {
			return nil, err
		}
		if i < 0 {
			r, err := py.ReprAsString(args[0])
			if err != nil {
				return nil, err
			}
			return nil, py.ExceptionNewf(py.ValueError, "%s is not in list", r)
		}
		return py.Int(i), nil
	})

	listMethod("remove", 1, 1, "L.remove(value) -> None -- remove first occurrence of value.\nRaises ValueError if the value is not present.", func(l *py.List, args py.Tuple) (py.Object, error) {
		i, err := indexOf(l.Items, args[0], nil)
		if err != nil {
			return nil, err
		}
		if i < 0 {
			return nil, py.ExceptionNewf(py.ValueError, "list.remove(x): x not in list")
		}
		l.Items = append(l.Items[:i], l.Items[i+1:]...)
		return py.None, nil
	})

	listMethod("count", 1, 1, "L.count(value) -> integer -- return number of occurrences of value", func(l *py.List, args py.Tuple) (py.Object, error) {
		return countOf(l.Items, args[0])
	})

	listMethod("reverse", 0, 0, "L.reverse() -- reverse *IN PLACE*", func(l *py.List, args py.Tuple) (py.Object, error) {
		for i, j := 0, len(l.Items)-1; i < j; i, j = i+1, j-1 {
			l.Items[i], l.Items[j] = l.Items[j], l.Items[i]
		}
		return py.None, nil
	})

	listMethod("copy", 0, 0, "L.copy() -> list -- a shallow copy of L", func(l *py.List, args py.Tuple) (py.Object, error) {
		return py.NewListFromItems(append([]py.Object(nil), l.Items...)), nil
	})

	listMethod("clear", 0, 0, "L.clear() -> None -- remove all items from L", func(l *py.List, args py.Tuple) (py.Object, error) {
		l.Items = []py.Object{}
		return py.None, nil
	})

	py.ListType.Dict["sort"] = newMethod("sort", "L.sort(key=None, reverse=False) -> None -- stable sort *IN PLACE*", func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		l, args, err := receiver[*py.List](py.ListType, "sort", self, args)
		if err != nil {
			return nil, err
		}
		if len(args) != 0 {
			return nil, py.ExceptionNewf(py.TypeError, "sort() takes no positional arguments")
		}
		key, reverse, err := sortArgs("sort", kwargs)
		if err != nil {
			return nil, err
		}
		return py.None, sortItems(l.Items, key, reverse)
	})
}

func installTuple() {
	tupleMethod := func(name string, min, max int, doc string, fn func(t py.Tuple, args py.Tuple) (py.Object, error)) {
		py.TupleType.Dict[name] = newMethod(name, doc, func(self py.Object, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
			t, ok := self.(py.Tuple)
			if !ok {
				if len(args) == 0 {
					return nil, py.ExceptionNewf(py.TypeError, "descriptor '%s' of 'tuple' object needs an argument", name)
				}
				if t, ok = args[0].(py.Tuple); !ok {
					return nil, py.ExceptionNewf(py.TypeError, "descriptor '%s' requires a 'tuple' object but received a '%s'", name, typeName(args[0]))
				}
				args = args[1:]
			}
			if err := noKwargs(name, kwargs); err != nil {
				return nil, err
			}
			if err := nargs(name, args, min, max); err != nil {
				return nil, err
			}
			return fn(t, args)
		})
	}
	tupleMethod("index", 1, 3, "T.index(value, [start, [stop]]) -> integer -- return first index of value.\nRaises ValueError if the value is not present.", func(t py.Tuple, args py.Tuple) (py.Object, error) {
		i, err := indexOf(t, args[0], args[1:])
		if err != nil {
			return nil, err
		}
		if i < 0 {
			return nil, py.ExceptionNewf(py.ValueError, "tuple.index(x): x not in tuple")
		}
		return py.Int(i), nil
	})
	tupleMethod("count", 1, 1, "T.count(value) -> integer -- return number of occurrences of value", func(t py.Tuple, args py.Tuple) (py.Object, error) {
		return countOf(t, args[0])
	})
}

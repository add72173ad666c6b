package pyext

import (
	"slices"
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
	listMethod("append", 1, 1, "append(x): add x at the end", func(l *py.List, args py.Tuple) (py.Object, error) {
		l.Items = append(l.Items, args[0])
		return py.None, nil
	})

	listMethod("extend", 1, 1, "extend(items): add every item of an iterable at the end", func(l *py.List, args py.Tuple) (py.Object, error) {
		items, err := collect(args[0])
		if err != nil {
			return nil, err
		}
		l.Items = append(l.Items, items...)
		return py.None, nil
	})

	listMethod("pop", 0, 1, "pop(i=-1): remove item i and return it", func(l *py.List, args py.Tuple) (py.Object, error) {
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

	listMethod("insert", 2, 2, "insert(i, x): put x in front of item i", func(l *py.List, args py.Tuple) (py.Object, error) {
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

	listMethod("index", 1, 3, "index(x, start=0, end=len): where the first item equal to x is; ValueError if none is", func(l *py.List, args py.Tuple) (py.Object, error) {
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

	listMethod("remove", 1, 1, "remove(x): delete the first item equal to x; ValueError if none is", func(l *py.List, args py.Tuple) (py.Object, error) {
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

	listMethod("count", 1, 1, "count(x): how many items equal x", func(l *py.List, args py.Tuple) (py.Object, error) {
		return countOf(l.Items, args[0])
	})

	listMethod("reverse", 0, 0, "reverse(): turn the list back to front, in place", func(l *py.List, args py.Tuple) (py.Object, error) {
		slices.Reverse(l.Items)
		return py.None, nil
	})

	listMethod("copy", 0, 0, "copy(): a new list holding the same items", func(l *py.List, args py.Tuple) (py.Object, error) {
		return py.NewListFromItems(append([]py.Object(nil), l.Items...)), nil
	})

	listMethod("clear", 0, 0, "clear(): remove every item", func(l *py.List, args py.Tuple) (py.Object, error) {
		l.Items = []py.Object{}
		return py.None, nil
	})

	method(py.ListType, "sort", "sort(key=None, reverse=False): put the items in order, in place; equal ones keep their order", func(l *py.List, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
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
	positionalMethod(py.TupleType, "index", 1, 3, "index(x, start=0, end=len): where the first item equal to x is; ValueError if none is", func(t py.Tuple, args py.Tuple) (py.Object, error) {
		i, err := indexOf(t, args[0], args[1:])
		if err != nil {
			return nil, err
		}
		if i < 0 {
			return nil, py.ExceptionNewf(py.ValueError, "tuple.index(x): x not in tuple")
		}
		return py.Int(i), nil
	})
	positionalMethod(py.TupleType, "count", 1, 1, "count(x): how many items equal x", func(t py.Tuple, args py.Tuple) (py.Object, error) {
		return countOf(t, args[0])
	})
}

package pyext

import (
	"slices"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/go-python/gpython/py"

	"assay/kernel/interp"
)

// strMethod registers a str method taking positional arguments only, with
// at least min and at most max of them.
func strMethod(name string, min, max int, doc string, fn func(s string, args py.Tuple) (py.Object, error)) {
	positionalMethod(py.StringType, name, min, max, doc, func(s py.String, args py.Tuple) (py.Object, error) {
		return fn(string(s), args)
	})
}

// strMethodKw registers a str method that accepts keyword arguments.
func strMethodKw(name, doc string, fn func(s string, args py.Tuple, kwargs py.StringDict) (py.Object, error)) {
	method(py.StringType, name, doc, func(s py.String, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		return fn(string(s), args, kwargs)
	})
}

// strArg returns args[i] as a Go string.
func strArg(name string, args py.Tuple, i int) (string, error) {
	s, ok := args[i].(py.String)
	if !ok {
		return "", py.ExceptionNewf(py.TypeError, "%s() argument %d must be str, not %s", name, i+1, typeName(args[i]))
	}
	return string(s), nil
}

// charsArg returns the optional chars argument of strip and friends; nil
// means whitespace.
func charsArg(name string, args py.Tuple) (func(rune) bool, error) {
	if len(args) == 0 || isNone(args[0]) {
		return isSpace, nil
	}
	chars, err := strArg(name, args, 0)
	if err != nil {
		return nil, py.ExceptionNewf(py.TypeError, "%s arg must be None or str", name)
	}
	return func(r rune) bool { return strings.ContainsRune(chars, r) }, nil
}

// isSpace is str.isspace for one character: Unicode whitespace plus the
// ASCII information separators that Python also counts.
func isSpace(r rune) bool {
	return unicode.IsSpace(r) || (r >= 0x1c && r <= 0x1f)
}

func isCased(r rune) bool {
	return unicode.IsUpper(r) || unicode.IsLower(r) || unicode.IsTitle(r)
}

// fillArg returns the optional fill character of center, ljust and rjust.
func fillArg(name string, args py.Tuple) (rune, error) {
	if len(args) < 2 {
		return ' ', nil
	}
	f, ok := args[1].(py.String)
	if !ok || utf8.RuneCountInString(string(f)) != 1 {
		return 0, py.ExceptionNewf(py.TypeError, "The fill character must be exactly one character long")
	}
	r, _ := utf8.DecodeRuneInString(string(f))
	return r, nil
}

// charRange applies the optional start and end arguments (args[0] and
// args[1], character indices) to s. It returns the selected substring and
// its character offset in s; ok is false when the range is shorter than
// minLen characters (then nothing can match).
func charRange(s string, args py.Tuple, minLen int) (sub string, offset int, ok bool, err error) {
	ascii := isASCII(s)
	n := len(s)
	if !ascii {
		n = utf8.RuneCountInString(s)
	}
	start, end, err := adjustIndices(args, n)
	if err != nil || end-start < minLen {
		return "", 0, false, err
	}
	if ascii {
		return s[start:end], start, true, nil
	}
	return string([]rune(s)[start:end]), start, true, nil
}

func isASCII(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] >= utf8.RuneSelf {
			return false
		}
	}
	return true
}

// indexIn is the byte index of the first (or last) sub in s, or -1.
func indexIn(s, sub string, last bool) int {
	if last {
		return strings.LastIndex(s, sub)
	}
	return strings.Index(s, sub)
}

// find searches for sub in s[start:end] (character indices) and returns
// the character index of the first (or last) match, or -1.
func find(s string, args py.Tuple, name string, last bool) (int, error) {
	sub, err := strArg(name, args, 0)
	if err != nil {
		return 0, err
	}
	hay, start, ok, err := charRange(s, args[1:], utf8.RuneCountInString(sub))
	if err != nil || !ok {
		return -1, err
	}
	i := indexIn(hay, sub, last)
	if i < 0 {
		return -1, nil
	}
	return start + utf8.RuneCountInString(hay[:i]), nil
}

// affixMatch implements startswith and endswith.
func affixMatch(s string, args py.Tuple, name string, suffix bool) (py.Object, error) {
	var affixes []string
	switch a := args[0].(type) {
	case py.String:
		affixes = []string{string(a)}
	case py.Tuple:
		for _, item := range a {
			t, ok := item.(py.String)
			if !ok {
				return nil, py.ExceptionNewf(py.TypeError, "tuple for %s must only contain str, not %s", name, typeName(item))
			}
			affixes = append(affixes, string(t))
		}
	default:
		return nil, py.ExceptionNewf(py.TypeError, "%s first arg must be str or a tuple of str, not %s", name, typeName(args[0]))
	}
	hay, _, ok, err := charRange(s, args[1:], 0)
	if err != nil {
		return nil, err
	}
	if !ok {
		return py.False, nil
	}
	for _, a := range affixes {
		if (suffix && strings.HasSuffix(hay, a)) || (!suffix && strings.HasPrefix(hay, a)) {
			return py.True, nil
		}
	}
	return py.False, nil
}

// predicate implements the str.isXXX methods: true if s is not empty and
// every character satisfies ok, which doc describes.
func predicate(name, doc string, ok func(rune) bool) {
	strMethod(name, 0, 0, name+"(): whether the string is not empty and "+doc, func(s string, args py.Tuple) (py.Object, error) {
		if s == "" {
			return py.False, nil
		}
		for _, r := range s {
			if !ok(r) {
				return py.False, nil
			}
		}
		return py.True, nil
	})
}

// caseCheck implements isupper and islower: at least one cased character
// and none of the wrong case.
func caseCheck(name, doc string, wrong func(rune) bool) {
	strMethod(name, 0, 0, name+"(): whether "+doc, func(s string, args py.Tuple) (py.Object, error) {
		cased := false
		for _, r := range s {
			if wrong(r) {
				return py.False, nil
			}
			if isCased(r) {
				cased = true
			}
		}
		return py.NewBool(cased), nil
	})
}

func listOfStrings(parts []string) *py.List {
	items := make([]py.Object, len(parts))
	for i, p := range parts {
		items[i] = py.String(p)
	}
	return py.NewListFromItems(items)
}

// isLineBreak reports the characters str.splitlines splits on.
func isLineBreak(r rune) bool {
	switch r {
	case '\n', '\r', '\v', '\f', 0x1c, 0x1d, 0x1e, 0x85, 0x2028, 0x2029:
		return true
	}
	return false
}

func splitlines(s string, keepends bool) []string {
	var out []string
	runes := []rune(s)
	i, start := 0, 0
	for i < len(runes) {
		r := runes[i]
		if !isLineBreak(r) {
			i++
			continue
		}
		eol := i + 1
		if r == '\r' && eol < len(runes) && runes[eol] == '\n' {
			eol++
		}
		if keepends {
			out = append(out, string(runes[start:eol]))
		} else {
			out = append(out, string(runes[start:i]))
		}
		i, start = eol, eol
	}
	if start < len(runes) {
		out = append(out, string(runes[start:]))
	}
	return out
}

// splitWhitespace splits on runs of whitespace from the left, at most max
// times (max < 0: no limit).
func splitWhitespace(s string, max int) []string {
	runes := []rune(s)
	var out []string
	i := 0
	for {
		for i < len(runes) && isSpace(runes[i]) {
			i++
		}
		if i == len(runes) {
			break
		}
		if max >= 0 && len(out) == max {
			out = append(out, string(runes[i:]))
			break
		}
		j := i
		for j < len(runes) && !isSpace(runes[j]) {
			j++
		}
		out = append(out, string(runes[i:j]))
		i = j
	}
	return out
}

// rsplitWhitespace splits on runs of whitespace from the right, at most
// max times (max < 0: no limit).
func rsplitWhitespace(s string, max int) []string {
	runes := []rune(s)
	var out []string
	i := len(runes)
	for {
		for i > 0 && isSpace(runes[i-1]) {
			i--
		}
		if i == 0 {
			break
		}
		if max >= 0 && len(out) == max {
			out = append(out, string(runes[:i]))
			break
		}
		j := i
		for j > 0 && !isSpace(runes[j-1]) {
			j--
		}
		out = append(out, string(runes[j:i]))
		i = j
	}
	slices.Reverse(out)
	return out
}

// splitArgs reads the (sep=None, maxsplit=-1) arguments of split and
// rsplit; sep == nil means whitespace.
func splitArgs(name string, args py.Tuple, kwargs py.StringDict) (sep *string, max int, err error) {
	a, err := interp.Bind(name, args, kwargs, "sep=", "maxsplit=")
	if err != nil {
		return nil, 0, err
	}
	sepObj, maxObj := a.Get("sep"), a.Get("maxsplit")
	if !isNone(sepObj) {
		s, ok := sepObj.(py.String)
		if !ok {
			return nil, 0, py.ExceptionNewf(py.TypeError, "must be str or None, not %s", typeName(sepObj))
		}
		if s == "" {
			return nil, 0, py.ExceptionNewf(py.ValueError, "empty separator")
		}
		str := string(s)
		sep = &str
	}
	if isNone(maxObj) {
		return sep, -1, nil
	}
	max, err = toInt(maxObj)
	return sep, max, err
}

func installStr() {
	// Upstream's join is right once it has its receiver; it cannot be
	// called through the type (str.join(sep, items)).
	strMethod("join", 1, 1, "join(items): the strings of items with this string between them", func(s string, args py.Tuple) (py.Object, error) {
		return py.String(s).Join(args)
	})

	strMethodKw("format", "format(*args, **kwargs): the string with its {} fields filled from the arguments", func(s string, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		f := &formatter{args: args, kw: func(name string) (py.Object, error) {
			v, ok := kwargs[name]
			if !ok {
				return nil, keyError(py.String(name))
			}
			return v, nil
		}}
		out, err := f.vformat(s, 2)
		if err != nil {
			return nil, err
		}
		return py.String(out), nil
	})

	strMethod("format_map", 1, 1, "format_map(mapping): like format, with named fields looked up in mapping", func(s string, args py.Tuple) (py.Object, error) {
		mapping := args[0]
		f := &formatter{kw: func(name string) (py.Object, error) {
			return py.GetItem(mapping, py.String(name))
		}}
		out, err := f.vformat(s, 2)
		if err != nil {
			return nil, err
		}
		return py.String(out), nil
	})

	strMethod("__format__", 1, 1, "__format__(spec): the string laid out by a format spec", func(s string, args py.Tuple) (py.Object, error) {
		spec, err := strArg("__format__", args, 0)
		if err != nil {
			return nil, err
		}
		return formatObject(py.String(s), spec)
	})

	caseMap := func(name, doc string, f func(string) string) {
		strMethod(name, 0, 0, name+"(): "+doc, func(s string, args py.Tuple) (py.Object, error) {
			return py.String(f(s)), nil
		})
	}
	caseMap("upper", "the string with every letter in upper case", strings.ToUpper)
	caseMap("lower", "the string with every letter in lower case", strings.ToLower)
	caseMap("casefold", "a lower-case form for comparing strings regardless of case", strings.ToLower)
	caseMap("swapcase", "upper-case letters made lower case and lower-case ones upper", func(s string) string {
		return strings.Map(func(r rune) rune {
			switch {
			case unicode.IsUpper(r):
				return unicode.ToLower(r)
			case unicode.IsLower(r):
				return unicode.ToUpper(r)
			}
			return r
		}, s)
	})
	caseMap("title", "each word with its first letter upper case and the rest lower", func(s string) string {
		prevCased := false
		return strings.Map(func(r rune) rune {
			out := r
			if isCased(r) {
				if prevCased {
					out = unicode.ToLower(r)
				} else {
					out = unicode.ToTitle(r)
				}
				prevCased = true
			} else {
				prevCased = false
			}
			return out
		}, s)
	})
	caseMap("capitalize", "the first character upper case and the rest lower", func(s string) string {
		r, size := utf8.DecodeRuneInString(s)
		if size == 0 {
			return s
		}
		return string(unicode.ToTitle(r)) + strings.ToLower(s[size:])
	})

	strMethod("count", 1, 3, "count(sub, start=0, end=len): how often sub occurs in the slice, matches not overlapping", func(s string, args py.Tuple) (py.Object, error) {
		sub, err := strArg("count", args, 0)
		if err != nil {
			return nil, err
		}
		hay, _, ok, err := charRange(s, args[1:], utf8.RuneCountInString(sub))
		if err != nil {
			return nil, err
		}
		if !ok {
			return py.Int(0), nil
		}
		return py.Int(strings.Count(hay, sub)), nil
	})

	finder := func(name, doc string, last, raise bool) {
		strMethod(name, 1, 3, name+"(sub, start=0, end=len): "+doc, func(s string, args py.Tuple) (py.Object, error) {
			i, err := find(s, args, name, last)
			if err != nil {
				return nil, err
			}
			if i < 0 && raise {
				return nil, py.ExceptionNewf(py.ValueError, "substring not found")
			}
			return py.Int(i), nil
		})
	}
	finder("find", "where sub first occurs in the slice, or -1", false, false)
	finder("rfind", "where sub last occurs in the slice, or -1", true, false)
	finder("index", "where sub first occurs in the slice; ValueError if nowhere", false, true)
	finder("rindex", "where sub last occurs in the slice; ValueError if nowhere", true, true)

	strMethod("startswith", 1, 3, "startswith(prefix, start=0, end=len): whether the slice begins with prefix, or with one of a tuple of them", func(s string, args py.Tuple) (py.Object, error) {
		return affixMatch(s, args, "startswith", false)
	})
	strMethod("endswith", 1, 3, "endswith(suffix, start=0, end=len): whether the slice finishes with suffix, or with one of a tuple of them", func(s string, args py.Tuple) (py.Object, error) {
		return affixMatch(s, args, "endswith", true)
	})

	predicate("isdigit", "every character is a digit", unicode.IsDigit)
	predicate("isdecimal", "every character is a decimal digit", unicode.IsDigit)
	predicate("isnumeric", "every character stands for a number", unicode.IsNumber)
	predicate("isalpha", "every character is a letter", unicode.IsLetter)
	predicate("isalnum", "every character is a letter or a number", func(r rune) bool { return unicode.IsLetter(r) || unicode.IsNumber(r) })
	predicate("isspace", "every character is white space", isSpace)
	caseCheck("isupper", "there is a cased letter and none is lower case", func(r rune) bool { return unicode.IsLower(r) || unicode.IsTitle(r) })
	caseCheck("islower", "there is a cased letter and none is upper case", func(r rune) bool { return unicode.IsUpper(r) || unicode.IsTitle(r) })
	strMethod("isidentifier", 0, 0, "isidentifier(): whether the string could name a Python variable", func(s string, args py.Tuple) (py.Object, error) {
		for i, r := range s {
			if !(r == '_' || unicode.IsLetter(r) || (i > 0 && unicode.IsDigit(r))) {
				return py.False, nil
			}
		}
		return py.NewBool(s != ""), nil
	})
	strMethod("isprintable", 0, 0, "isprintable(): whether no character is a control or other unprintable one", func(s string, args py.Tuple) (py.Object, error) {
		for _, r := range s {
			if !unicode.IsPrint(r) {
				return py.False, nil
			}
		}
		return py.True, nil
	})
	strMethod("istitle", 0, 0, "istitle(): whether there is a cased letter and every word is capitalised", func(s string, args py.Tuple) (py.Object, error) {
		cased, prevCased := false, false
		for _, r := range s {
			switch {
			case unicode.IsUpper(r) || unicode.IsTitle(r):
				if prevCased {
					return py.False, nil
				}
				prevCased, cased = true, true
			case unicode.IsLower(r):
				if !prevCased {
					return py.False, nil
				}
				prevCased, cased = true, true
			default:
				prevCased = false
			}
		}
		return py.NewBool(cased), nil
	})

	strMethod("zfill", 1, 1, "zfill(width): zeros put in front (after a sign) up to width characters", func(s string, args py.Tuple) (py.Object, error) {
		width, err := toInt(args[0])
		if err != nil {
			return nil, err
		}
		n := utf8.RuneCountInString(s)
		if n >= width {
			return py.String(s), nil
		}
		zeros := strings.Repeat("0", width-n)
		if s != "" && (s[0] == '+' || s[0] == '-') {
			return py.String(s[:1] + zeros + s[1:]), nil
		}
		return py.String(zeros + s), nil
	})

	justify := func(name, doc string, place func(s string, fill rune, marg, width int) string) {
		strMethod(name, 1, 2, name+"(width, fill=' '): "+doc, func(s string, args py.Tuple) (py.Object, error) {
			width, err := toInt(args[0])
			if err != nil {
				return nil, err
			}
			fill, err := fillArg(name, args)
			if err != nil {
				return nil, err
			}
			marg := width - utf8.RuneCountInString(s)
			if marg <= 0 {
				return py.String(s), nil
			}
			return py.String(place(s, fill, marg, width)), nil
		})
	}
	justify("ljust", "the string padded on the right to width characters", func(s string, fill rune, marg, _ int) string {
		return s + strings.Repeat(string(fill), marg)
	})
	justify("rjust", "the string padded on the left to width characters", func(s string, fill rune, marg, _ int) string {
		return strings.Repeat(string(fill), marg) + s
	})
	justify("center", "the string centred in width characters", func(s string, fill rune, marg, width int) string {
		// CPython's rule: the odd extra character goes left when width is odd.
		left := marg/2 + (marg & width & 1)
		return strings.Repeat(string(fill), left) + s + strings.Repeat(string(fill), marg-left)
	})

	partition := func(name, doc string, last bool) {
		strMethod(name, 1, 1, name+"(sep): "+doc, func(s string, args py.Tuple) (py.Object, error) {
			sep, err := strArg(name, args, 0)
			if err != nil {
				return nil, err
			}
			if sep == "" {
				return nil, py.ExceptionNewf(py.ValueError, "empty separator")
			}
			i := indexIn(s, sep, last)
			if i < 0 {
				if last {
					return py.Tuple{py.String(""), py.String(""), py.String(s)}, nil
				}
				return py.Tuple{py.String(s), py.String(""), py.String("")}, nil
			}
			return py.Tuple{py.String(s[:i]), py.String(sep), py.String(s[i+len(sep):])}, nil
		})
	}
	partition("partition", "(before, sep, after), cut at the first sep", false)
	partition("rpartition", "(before, sep, after), cut at the last sep", true)

	strMethodKw("splitlines", "splitlines(keepends=False): the lines, with their line breaks only if keepends", func(s string, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
		a, err := interp.Bind("splitlines", args, kwargs, "keepends=")
		if err != nil {
			return nil, err
		}
		keep := false
		if a.Has("keepends") {
			if keep, err = truth(a.Get("keepends")); err != nil {
				return nil, err
			}
		}
		return listOfStrings(splitlines(s, keep)), nil
	})

	// splitMethod registers split or rsplit: onSpace cuts at runs of white
	// space (sep None), onSep at sep; max < 0 means no limit.
	splitMethod := func(name, doc string, onSpace func(s string, max int) []string, onSep func(s, sep string, max int) []string) {
		strMethodKw(name, name+"(sep=None, maxsplit=-1): "+doc, func(s string, args py.Tuple, kwargs py.StringDict) (py.Object, error) {
			sep, max, err := splitArgs(name, args, kwargs)
			if err != nil {
				return nil, err
			}
			if sep == nil {
				return listOfStrings(onSpace(s, max)), nil
			}
			return listOfStrings(onSep(s, *sep, max)), nil
		})
	}
	splitMethod("split", "the pieces between separators (runs of white space when sep is None)", splitWhitespace, func(s, sep string, max int) []string {
		if max < 0 {
			return strings.Split(s, sep)
		}
		return strings.SplitN(s, sep, max+1)
	})
	splitMethod("rsplit", "like split, but at most maxsplit cuts counted from the end", rsplitWhitespace, func(s, sep string, max int) []string {
		var parts []string
		rest := s
		for max < 0 || len(parts) < max {
			i := strings.LastIndex(rest, sep)
			if i < 0 {
				break
			}
			parts = append(parts, rest[i+len(sep):])
			rest = rest[:i]
		}
		parts = append(parts, rest)
		slices.Reverse(parts)
		return parts
	})

	strip := func(name, doc string, trim func(string, func(rune) bool) string) {
		strMethod(name, 0, 1, name+"(chars=None): "+doc, func(s string, args py.Tuple) (py.Object, error) {
			f, err := charsArg(name, args)
			if err != nil {
				return nil, err
			}
			return py.String(trim(s, f)), nil
		})
	}
	strip("strip", "without the given characters (white space if None) at either end", strings.TrimFunc)
	strip("lstrip", "without the given characters (white space if None) at the start", strings.TrimLeftFunc)
	strip("rstrip", "without the given characters (white space if None) at the end", strings.TrimRightFunc)

	strMethod("replace", 2, 3, "replace(old, new, count=-1): old replaced by new, only the first count times if count >= 0", func(s string, args py.Tuple) (py.Object, error) {
		old, err := strArg("replace", args, 0)
		if err != nil {
			return nil, err
		}
		repl, err := strArg("replace", args, 1)
		if err != nil {
			return nil, err
		}
		count := -1
		if len(args) > 2 {
			if count, err = toInt(args[2]); err != nil {
				return nil, err
			}
		}
		return py.String(strings.Replace(s, old, repl, count)), nil
	})

	strMethod("removeprefix", 1, 1, "removeprefix(prefix): the string without prefix, if it starts with it", func(s string, args py.Tuple) (py.Object, error) {
		p, err := strArg("removeprefix", args, 0)
		if err != nil {
			return nil, err
		}
		return py.String(strings.TrimPrefix(s, p)), nil
	})
	strMethod("removesuffix", 1, 1, "removesuffix(suffix): the string without suffix, if it ends with it", func(s string, args py.Tuple) (py.Object, error) {
		p, err := strArg("removesuffix", args, 0)
		if err != nil {
			return nil, err
		}
		return py.String(strings.TrimSuffix(s, p)), nil
	})
}

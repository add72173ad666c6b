package pyext

// The format specification mini-language and the format string syntax of
// str.format, following the Python 3 standard library documentation
// ("string — Format String Syntax").

import (
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/go-python/gpython/py"
)

// formatSpec is a parsed standard format specifier: its optional parts
// are, in order, a fill character with an alignment, a sign, '#', '0', a
// width, a grouping separator, a precision after '.', and a type letter.
type formatSpec struct {
	fill       rune
	fillSet    bool
	align      rune // 0 when not given
	sign       rune // 0 when not given
	alt        bool
	zero       bool
	width      int
	grouping   rune // 0, ',' or '_'
	precision  int  // -1 when not given
	typ        rune // 0 when not given
	spec       string
	objectType string
}

func isAlign(r rune) bool { return r == '<' || r == '>' || r == '=' || r == '^' }

func parseSpec(spec, objectType string) (*formatSpec, error) {
	f := &formatSpec{fill: ' ', precision: -1, spec: spec, objectType: objectType}
	r := []rune(spec)
	i := 0
	if len(r) >= 2 && isAlign(r[1]) {
		f.fill, f.fillSet, f.align = r[0], true, r[1]
		i = 2
	} else if len(r) >= 1 && isAlign(r[0]) {
		f.align = r[0]
		i = 1
	}
	if i < len(r) && (r[i] == '+' || r[i] == '-' || r[i] == ' ') {
		f.sign = r[i]
		i++
	}
	if i < len(r) && r[i] == '#' {
		f.alt = true
		i++
	}
	if !f.fillSet && i < len(r) && r[i] == '0' {
		f.zero = true
		i++
	}
	digits := func() (int, bool, error) {
		start := i
		for i < len(r) && r[i] >= '0' && r[i] <= '9' {
			i++
		}
		if i == start {
			return 0, false, nil
		}
		n, err := strconv.Atoi(string(r[start:i]))
		if err != nil {
			return 0, false, py.ExceptionNewf(py.ValueError, "Too many decimal digits in format string")
		}
		return n, true, nil
	}
	var err error
	if f.width, _, err = digits(); err != nil {
		return nil, err
	}
	if i < len(r) && (r[i] == ',' || r[i] == '_') {
		f.grouping = r[i]
		i++
		if i < len(r) && (r[i] == ',' || r[i] == '_') {
			return nil, py.ExceptionNewf(py.ValueError, "Cannot specify both ',' and '_'.")
		}
	}
	if i < len(r) && r[i] == '.' {
		i++
		n, ok, err := digits()
		if err != nil {
			return nil, err
		}
		if !ok {
			return nil, py.ExceptionNewf(py.ValueError, "Format specifier missing precision")
		}
		f.precision = n
	}
	if len(r)-i > 1 {
		return nil, py.ExceptionNewf(py.ValueError, "Invalid format specifier '%s' for object of type '%s'", spec, objectType)
	}
	if i < len(r) {
		f.typ = r[i]
	}
	if f.grouping != 0 {
		ok := false
		switch f.typ {
		case 0, 'd', 'e', 'E', 'f', 'F', 'g', 'G', '%':
			ok = true
		case 'b', 'o', 'x', 'X':
			ok = f.grouping == '_'
		}
		if !ok {
			return nil, py.ExceptionNewf(py.ValueError, "Cannot specify '%c' with '%c'.", f.grouping, f.typ)
		}
	}
	return f, nil
}

func (f *formatSpec) unknownCode() error {
	return py.ExceptionNewf(py.ValueError, "Unknown format code '%c' for object of type '%s'", f.typ, f.objectType)
}

// pad lays out prefix (sign and base prefix) and body in the field width.
func (f *formatSpec) pad(prefix, body string, defaultAlign rune) string {
	align := f.align
	if align == 0 {
		align = defaultAlign
	}
	n := f.width - utf8.RuneCountInString(prefix) - utf8.RuneCountInString(body)
	if n <= 0 {
		return prefix + body
	}
	fill := string(f.fill)
	switch align {
	case '<':
		return prefix + body + strings.Repeat(fill, n)
	case '^':
		left := n / 2
		return strings.Repeat(fill, left) + prefix + body + strings.Repeat(fill, n-left)
	case '=':
		return prefix + strings.Repeat(fill, n) + body
	}
	return strings.Repeat(fill, n) + prefix + body
}

// numberDefaults applies the '0' flag for numbers: zero fill after the
// sign unless an alignment is given.
func (f *formatSpec) numberDefaults() {
	if f.zero {
		f.fill = '0'
		if f.align == 0 {
			f.align = '='
		}
	}
}

// signPrefix is the sign to print for a number.
func (f *formatSpec) signPrefix(negative bool) string {
	switch {
	case negative:
		return "-"
	case f.sign == '+':
		return "+"
	case f.sign == ' ':
		return " "
	}
	return ""
}

// group inserts sep every size digits from the right of digits.
func group(digits string, sep rune, size int) string {
	if sep == 0 || len(digits) <= size {
		return digits
	}
	var b strings.Builder
	first := len(digits) % size
	if first == 0 {
		first = size
	}
	b.WriteString(digits[:first])
	for i := first; i < len(digits); i += size {
		b.WriteRune(sep)
		b.WriteString(digits[i : i+size])
	}
	return b.String()
}

// layoutNumber groups the integer digits, applies zero padding (which,
// as in CPython, is itself grouped) and pads the result.
func (f *formatSpec) layoutNumber(prefix, intDigits, rest string, size int) string {
	if f.grouping != 0 && f.fill == '0' && f.align == '=' {
		need := f.width - utf8.RuneCountInString(prefix) - utf8.RuneCountInString(rest)
		for len(group(intDigits, f.grouping, size)) < need {
			intDigits = "0" + intDigits
		}
	}
	return f.pad(prefix, group(intDigits, f.grouping, size)+rest, '>')
}

// formatObject is format(value, spec): the mini-language for str, int,
// bool and float, __format__ for instances of Python classes that define
// it, else str(value) for an empty spec.
func formatObject(v py.Object, spec string) (py.Object, error) {
	switch x := v.(type) {
	case py.String:
		s, err := formatString(string(x), spec)
		return py.String(s), err
	case py.Bool:
		if spec == "" {
			return py.Str(x)
		}
		s, err := formatInt(big.NewInt(int64(boolInt(x))), spec, "bool")
		return py.String(s), err
	case py.Int:
		s, err := formatInt(big.NewInt(int64(x)), spec, "int")
		return py.String(s), err
	case *py.BigInt:
		s, err := formatInt((*big.Int)(x), spec, "int")
		return py.String(s), err
	case py.Float:
		s, err := formatFloat(float64(x), spec, "float")
		return py.String(s), err
	}
	if res, found, err := callUser(v, "__format__", py.String(spec)); found {
		if err != nil {
			return nil, err
		}
		if _, ok := res.(py.String); !ok {
			return nil, py.ExceptionNewf(py.TypeError, "__format__ must return a str, not %s", typeName(res))
		}
		return res, nil
	}
	if f, ok := v.(py.I__format__); ok {
		return f.M__format__(py.String(spec))
	}
	if spec != "" {
		return nil, py.ExceptionNewf(py.TypeError, "unsupported format string passed to %s.__format__", typeName(v))
	}
	return py.Str(v)
}

func formatString(s, spec string) (string, error) {
	if spec == "" {
		return s, nil
	}
	f, err := parseSpec(spec, "str")
	if err != nil {
		return "", err
	}
	switch {
	case f.typ != 0 && f.typ != 's':
		return "", f.unknownCode()
	case f.sign != 0:
		return "", py.ExceptionNewf(py.ValueError, "Sign not allowed in string format specifier")
	case f.alt:
		return "", py.ExceptionNewf(py.ValueError, "Alternate form (#) not allowed in string format specifier")
	case f.align == '=':
		return "", py.ExceptionNewf(py.ValueError, "'=' alignment not allowed in string format specifier")
	case f.grouping != 0:
		return "", py.ExceptionNewf(py.ValueError, "Cannot specify '%c' with 's'.", f.grouping)
	}
	if f.zero {
		f.fill = '0'
	}
	if f.precision >= 0 && utf8.RuneCountInString(s) > f.precision {
		s = string([]rune(s)[:f.precision])
	}
	return f.pad("", s, '<'), nil
}

func formatInt(x *big.Int, spec, objectType string) (string, error) {
	if spec == "" {
		return x.String(), nil
	}
	f, err := parseSpec(spec, objectType)
	if err != nil {
		return "", err
	}
	switch f.typ {
	case 'e', 'E', 'f', 'F', 'g', 'G', '%':
		fl, acc := new(big.Float).SetInt(x).Float64()
		if math.IsInf(fl, 0) && acc != big.Exact {
			return "", py.ExceptionNewf(py.OverflowError, "int too large to convert to float")
		}
		return formatFloat(fl, spec, objectType)
	}
	f.numberDefaults()
	if f.precision >= 0 {
		return "", py.ExceptionNewf(py.ValueError, "Precision not allowed in integer format specifier")
	}
	base, size, basePrefix := 10, 3, ""
	switch f.typ {
	case 0, 'd', 'n':
	case 'b':
		base, size, basePrefix = 2, 4, "0b"
	case 'o':
		base, size, basePrefix = 8, 4, "0o"
	case 'x':
		base, size, basePrefix = 16, 4, "0x"
	case 'X':
		base, size, basePrefix = 16, 4, "0X"
	case 'c':
		if f.sign != 0 {
			return "", py.ExceptionNewf(py.ValueError, "Sign not allowed with integer format specifier 'c'")
		}
		if f.alt {
			return "", py.ExceptionNewf(py.ValueError, "Alternate form (#) not allowed with integer format specifier 'c'")
		}
		if !x.IsInt64() || x.Int64() < 0 || x.Int64() > 0x10ffff {
			return "", py.ExceptionNewf(py.OverflowError, "%%c arg not in range(0x110000)")
		}
		return f.pad("", string(rune(x.Int64())), '>'), nil
	default:
		return "", f.unknownCode()
	}
	digits := new(big.Int).Abs(x).Text(base)
	if f.typ == 'X' {
		digits = strings.ToUpper(digits)
	}
	prefix := f.signPrefix(x.Sign() < 0)
	if f.alt {
		prefix += basePrefix
	}
	return f.layoutNumber(prefix, digits, "", size), nil
}

// exponentOf returns the decimal exponent of an 'e'-formatted number.
func exponentOf(e string) int {
	i := strings.LastIndexAny(e, "eE")
	n, _ := strconv.Atoi(e[i+1:])
	return n
}

// stripZeros removes trailing zeros after the decimal point, and the
// point itself if nothing follows it.
func stripZeros(s string) string {
	if !strings.Contains(s, ".") {
		return s
	}
	s = strings.TrimRight(s, "0")
	return strings.TrimSuffix(s, ".")
}

// formatGeneral is the 'g' presentation type for a non-negative finite x.
// addDot0 is the variant used when no type is given: fixed-point results
// keep at least one decimal digit and exponent notation starts one
// exponent earlier.
func formatGeneral(x float64, p int, alt, addDot0 bool) string {
	if p == 0 {
		p = 1
	}
	e := strconv.FormatFloat(x, 'e', p-1, 64)
	exp := exponentOf(e)
	limit := p
	if addDot0 {
		limit = p - 1
	}
	var s string
	if exp < -4 || exp >= limit {
		i := strings.IndexByte(e, 'e')
		mant, tail := e[:i], e[i:]
		if alt {
			if !strings.Contains(mant, ".") {
				mant += "."
			}
		} else {
			mant = stripZeros(mant)
		}
		s = mant + tail
	} else {
		s = strconv.FormatFloat(x, 'f', p-1-exp, 64)
		if alt {
			if !strings.Contains(s, ".") {
				s += "."
			}
		} else {
			s = stripZeros(s)
		}
		if addDot0 && !strings.Contains(s, ".") {
			s += ".0"
		}
	}
	return s
}

// formatRepr is repr(x) for a non-negative finite x: the shortest string
// that round-trips, in exponent notation when the exponent is below -4 or
// at least 16.
func formatRepr(x float64) string {
	e := strconv.FormatFloat(x, 'e', -1, 64)
	exp := exponentOf(e)
	if exp < -4 || exp >= 16 {
		return e
	}
	s := strconv.FormatFloat(x, 'f', -1, 64)
	if !strings.Contains(s, ".") {
		s += ".0"
	}
	return s
}

func formatFloat(x float64, spec, objectType string) (string, error) {
	f, err := parseSpec(spec, objectType)
	if err != nil {
		return "", err
	}
	typ := f.typ
	switch typ {
	case 0, 'e', 'E', 'f', 'F', 'g', 'G', '%':
	case 'n':
		typ = 'g'
	default:
		return "", f.unknownCode()
	}
	f.numberDefaults()
	upper := typ == 'E' || typ == 'F' || typ == 'G'
	negative := math.Signbit(x) && !math.IsNaN(x)
	ax := math.Abs(x)
	prefix := f.signPrefix(negative)
	if math.IsNaN(x) || math.IsInf(x, 0) {
		body := "inf"
		if math.IsNaN(x) {
			body = "nan"
		}
		if upper {
			body = strings.ToUpper(body)
		}
		if typ == '%' {
			body += "%"
		}
		return f.pad(prefix, body, '>'), nil
	}
	p := f.precision
	var body string
	switch typ {
	case 'f', 'F':
		if p < 0 {
			p = 6
		}
		body = strconv.FormatFloat(ax, 'f', p, 64)
		if f.alt && p == 0 {
			body += "."
		}
	case '%':
		if p < 0 {
			p = 6
		}
		body = strconv.FormatFloat(ax*100, 'f', p, 64)
		if f.alt && p == 0 {
			body += "."
		}
		body += "%"
	case 'e', 'E':
		if p < 0 {
			p = 6
		}
		body = strconv.FormatFloat(ax, 'e', p, 64)
		if f.alt && p == 0 {
			body = strings.Replace(body, "e", ".e", 1)
		}
	case 'g', 'G':
		if p < 0 {
			p = 6
		}
		body = formatGeneral(ax, p, f.alt, false)
	default:
		if p < 0 {
			body = formatRepr(ax)
			if f.alt && !strings.Contains(body, ".") {
				body = strings.Replace(body, "e", ".e", 1)
			}
		} else {
			body = formatGeneral(ax, p, f.alt, true)
		}
	}
	if upper {
		body = strings.ToUpper(body)
	}
	// Split off the integer digits so grouping applies to them only.
	end := strings.IndexAny(body, ".eE%")
	if end < 0 {
		end = len(body)
	}
	return f.layoutNumber(prefix, body[:end], body[end:], 3), nil
}

// formatter implements str.format and str.format_map.
type formatter struct {
	args py.Tuple
	kw   func(name string) (py.Object, error)
	next int // next automatic field number
	mode int // 0 unknown, 1 automatic numbering, 2 manual numbering
}

func (f *formatter) vformat(s string, depth int) (string, error) {
	if depth < 0 {
		return "", py.ExceptionNewf(py.ValueError, "Max string recursion exceeded")
	}
	var out strings.Builder
	for i := 0; i < len(s); {
		c := s[i]
		switch c {
		case '{':
			if i+1 < len(s) && s[i+1] == '{' {
				out.WriteByte('{')
				i += 2
				continue
			}
			level, j := 1, i+1
			for ; j < len(s); j++ {
				if s[j] == '{' {
					level++
				} else if s[j] == '}' {
					level--
					if level == 0 {
						break
					}
				}
			}
			if j >= len(s) {
				return "", py.ExceptionNewf(py.ValueError, "expected '}' before end of string")
			}
			text, err := f.field(s[i+1:j], depth)
			if err != nil {
				return "", err
			}
			out.WriteString(text)
			i = j + 1
		case '}':
			if i+1 < len(s) && s[i+1] == '}' {
				out.WriteByte('}')
				i += 2
				continue
			}
			return "", py.ExceptionNewf(py.ValueError, "Single '}' encountered in format string")
		default:
			out.WriteByte(c)
			i++
		}
	}
	return out.String(), nil
}

// field renders one replacement field: field_name [!conversion] [:spec].
func (f *formatter) field(field string, depth int) (string, error) {
	// The field name ends at the first '!' or ':' outside brackets.
	end := len(field)
	for i := 0; i < len(field); i++ {
		if field[i] == '[' {
			for i < len(field) && field[i] != ']' {
				i++
			}
			continue
		}
		if field[i] == '!' || field[i] == ':' {
			end = i
			break
		}
	}
	name, rest := field[:end], field[end:]
	conv := byte(0)
	if strings.HasPrefix(rest, "!") {
		if len(rest) < 2 {
			return "", py.ExceptionNewf(py.ValueError, "end of string while looking for conversion specifier")
		}
		conv = rest[1]
		rest = rest[2:]
		if rest != "" && rest[0] != ':' {
			return "", py.ExceptionNewf(py.ValueError, "expected ':' after conversion specifier")
		}
	}
	spec := strings.TrimPrefix(rest, ":")
	value, err := f.lookup(name)
	if err != nil {
		return "", err
	}
	switch conv {
	case 0:
	case 'r', 'a':
		value, err = py.Repr(value)
		if err == nil && conv == 'a' {
			value = py.String(asciiEscape(string(value.(py.String))))
		}
	case 's':
		value, err = py.Str(value)
	default:
		return "", py.ExceptionNewf(py.ValueError, "Unknown conversion specifier %c", conv)
	}
	if err != nil {
		return "", err
	}
	if strings.Contains(spec, "{") {
		if spec, err = f.vformat(spec, depth-1); err != nil {
			return "", err
		}
	}
	res, err := formatObject(value, spec)
	if err != nil {
		return "", err
	}
	return string(res.(py.String)), nil
}

// lookup resolves a field name: an argument index or keyword, followed by
// any number of .attribute and [index] accessors.
func (f *formatter) lookup(name string) (py.Object, error) {
	first := strings.IndexAny(name, ".[")
	if first < 0 {
		first = len(name)
	}
	head, accessors := name[:first], name[first:]
	var value py.Object
	var err error
	if n, isIndex := atoi(head); head == "" || isIndex {
		if head == "" {
			if f.mode == 2 {
				return nil, py.ExceptionNewf(py.ValueError, "cannot switch from manual field specification to automatic field numbering")
			}
			f.mode, n = 1, f.next
			f.next++
		} else {
			if f.mode == 1 {
				return nil, py.ExceptionNewf(py.ValueError, "cannot switch from automatic field numbering to manual field specification")
			}
			f.mode = 2
		}
		if n >= len(f.args) {
			return nil, py.ExceptionNewf(py.IndexError, "Replacement index %d out of range for positional args tuple", n)
		}
		value = f.args[n]
	} else if value, err = f.kw(head); err != nil {
		return nil, err
	}
	for accessors != "" {
		switch accessors[0] {
		case '.':
			end := strings.IndexAny(accessors[1:], ".[") + 1
			if end == 0 {
				end = len(accessors)
			}
			attr := accessors[1:end]
			if attr == "" {
				return nil, py.ExceptionNewf(py.ValueError, "Empty attribute in format string")
			}
			if value, err = py.GetAttrString(value, attr); err != nil {
				return nil, err
			}
			accessors = accessors[end:]
		case '[':
			end := strings.IndexByte(accessors, ']')
			if end < 0 {
				return nil, py.ExceptionNewf(py.ValueError, "Missing ']' in format string")
			}
			key := accessors[1:end]
			if key == "" {
				return nil, py.ExceptionNewf(py.ValueError, "Empty attribute in format string")
			}
			var k py.Object = py.String(key)
			if n, ok := atoi(key); ok {
				k = py.Int(n)
			}
			if value, err = py.GetItem(value, k); err != nil {
				return nil, err
			}
			accessors = accessors[end+1:]
			if accessors != "" && accessors[0] != '.' && accessors[0] != '[' {
				return nil, py.ExceptionNewf(py.ValueError, "Only '.' or '[' may follow ']' in format field specifier")
			}
		default:
			return nil, py.ExceptionNewf(py.ValueError, "Only '.' or '[' may follow ']' in format field specifier")
		}
	}
	return value, nil
}

// atoi parses a non-empty string of ASCII digits.
func atoi(s string) (int, bool) {
	if s == "" {
		return 0, false
	}
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return 0, false
		}
	}
	n, err := strconv.Atoi(s)
	return n, err == nil
}

// asciiEscape is ascii(): the non-ASCII characters of a repr escaped.
func asciiEscape(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case r < 0x80:
			b.WriteRune(r)
		case r < 0x100:
			fmt.Fprintf(&b, "\\x%02x", r)
		case r < 0x10000:
			fmt.Fprintf(&b, "\\u%04x", r)
		default:
			fmt.Fprintf(&b, "\\U%08x", r)
		}
	}
	return b.String()
}

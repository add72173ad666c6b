package exact

import (
	"errors"
	"fmt"
	"math/big"
	"strconv"
	"unicode/utf8"
)

// ParseError reports where Ring.Parse failed. It wraps ErrSyntax for
// malformed text, ErrUnknownVariable for a name Ring.ParseKnown does not
// accept, or the error of the operation that failed while the text was
// evaluated (ErrDivisionByZero, ErrExponentRange, ErrTooManyTerms).
type ParseError struct {
	Col  int    // 1-based column, counted in runes
	Msg  string // what went wrong
	Name string // the name ParseKnown refused, for ErrUnknownVariable
	Err  error  // the wrapped sentinel; nil means ErrSyntax
}

// Error returns "column N: message".
func (e *ParseError) Error() string { return fmt.Sprintf("column %d: %s", e.Col, e.Msg) }

// Unwrap returns the wrapped sentinel error.
func (e *ParseError) Unwrap() error {
	if e.Err == nil {
		return ErrSyntax
	}
	return e.Err
}

// maxParseDepth bounds the nesting of parentheses and unary signs.
const maxParseDepth = 1000

// Parse reads a polynomial written with
//
//	numbers    integers and decimals, read exactly ("1.5", "2e-3")
//	names      [A-Za-z_][A-Za-z0-9_]*, the ring's variables
//	+ - * /    sums, differences, products; unary minus and plus
//	^ or **    powers with a non-negative integer literal exponent
//	( )        grouping
//
// for example "2*a^2*b - c", "(a + b)^3/4 - 3/2*c". Division is allowed by
// nonzero constants only. Names not yet in the ring become new variables,
// in the order in which they first appear. Powers bind tighter than unary
// minus ("-a^2" is -(a^2)); a chained power such as "a^2^3" needs
// parentheses. Errors are *ParseError values with a 1-based column,
// wrapping ErrSyntax, or ErrDivisionByZero, ErrExponentRange or
// ErrTooManyTerms when evaluating the text fails.
func (r *Ring) Parse(s string) (*Poly, error) { return r.parse(s, true) }

// ParseKnown reads a polynomial as Parse does, but only in the variables
// the ring already has: the first other name is a *ParseError at its
// column wrapping ErrUnknownVariable. It never adds a variable, so a
// misspelt name cannot quietly become one. Malformed text is reported
// first, as by Parse.
func (r *Ring) ParseKnown(s string) (*Poly, error) { return r.parse(s, false) }

// parse reads s; grow says whether names new to the ring become variables.
func (r *Ring) parse(s string, grow bool) (*Poly, error) {
	toks, err := tokenize(s)
	if err != nil {
		return nil, err
	}
	ps := &parser{toks: toks}
	n, err := ps.expr(0)
	if err != nil {
		return nil, err
	}
	if t := ps.peek(); t.kind != tEOF {
		if t.kind == tNum || t.kind == tName || t.kind == tLParen {
			return nil, syntaxErr(t.col, fmt.Sprintf("expected an operator before %q", t.text))
		}
		if t.kind == tRParen {
			return nil, syntaxErr(t.col, `unmatched ")"`)
		}
		return nil, syntaxErr(t.col, fmt.Sprintf("unexpected %q", t.text))
	}
	// New names get the next indices tentatively and join the ring only
	// when evaluation succeeds (again if the ring grew meanwhile).
	for {
		r.mu.RLock()
		n0 := len(r.names)
		names := append([]string(nil), r.names...)
		idx := map[string]int{}
		for _, t := range toks {
			if t.kind != tName {
				continue
			}
			if _, ok := idx[t.text]; ok {
				continue
			}
			if i, ok := r.index[t.text]; ok {
				idx[t.text] = i
			} else if !grow {
				r.mu.RUnlock()
				return nil, &ParseError{Col: t.col, Msg: fmt.Sprintf("unknown variable %q", t.text), Name: t.text, Err: ErrUnknownVariable}
			} else {
				idx[t.text] = len(names)
				names = append(names, t.text)
			}
		}
		r.mu.RUnlock()
		p, err := r.eval(n, idx, names)
		if err != nil {
			return nil, err
		}
		r.mu.Lock()
		if len(r.names) == n0 {
			for i, name := range names[n0:] {
				r.names = append(r.names, name)
				r.index[name] = n0 + i
			}
			r.mu.Unlock()
			return p, nil
		}
		r.mu.Unlock()
	}
}

func syntaxErr(col int, msg string) error { return &ParseError{Col: col, Msg: msg} }

const (
	tEOF = iota
	tNum
	tName
	tOp // + - * / ^ (** is stored as ^ with text "**")
	tLParen
	tRParen
)

type token struct {
	kind int
	text string
	col  int
}

func tokenize(s string) ([]token, error) {
	var toks []token
	col := 1
	for i := 0; i < len(s); {
		c := s[i]
		start, startCol := i, col
		switch {
		case c == ' ' || c == '\t' || c == '\n' || c == '\r':
			i++
		case '0' <= c && c <= '9':
			for i < len(s) && isDigit(s[i]) {
				i++
			}
			if i < len(s) && s[i] == '.' {
				i++
				if i == len(s) || !isDigit(s[i]) {
					return nil, syntaxErr(startCol+i-start, `expected digits after "."`)
				}
				for i < len(s) && isDigit(s[i]) {
					i++
				}
			}
			if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
				j := i + 1
				if j < len(s) && (s[j] == '+' || s[j] == '-') {
					j++
				}
				if j < len(s) && isDigit(s[j]) {
					for i = j; i < len(s) && isDigit(s[i]); i++ {
					}
				}
			}
			toks = append(toks, token{tNum, s[start:i], startCol})
		case c == '_' || 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z':
			for i < len(s) && (s[i] == '_' || isDigit(s[i]) || 'a' <= s[i] && s[i] <= 'z' || 'A' <= s[i] && s[i] <= 'Z') {
				i++
			}
			toks = append(toks, token{tName, s[start:i], startCol})
		case c == '*' && i+1 < len(s) && s[i+1] == '*':
			i += 2
			toks = append(toks, token{tOp, "**", startCol})
		case c == '+' || c == '-' || c == '*' || c == '/' || c == '^':
			i++
			toks = append(toks, token{tOp, s[start:i], startCol})
		case c == '(':
			i++
			toks = append(toks, token{tLParen, "(", startCol})
		case c == ')':
			i++
			toks = append(toks, token{tRParen, ")", startCol})
		default:
			r, size := utf8.DecodeRuneInString(s[i:])
			if r == utf8.RuneError && size == 1 {
				return nil, syntaxErr(col, "invalid UTF-8")
			}
			return nil, syntaxErr(col, fmt.Sprintf("unexpected character %q", r))
		}
		col += utf8.RuneCountInString(s[start:i])
	}
	return append(toks, token{tEOF, "end of input", col}), nil
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }

// pnode is a node of the syntax tree.
type pnode struct {
	op   string // "num", "name", "+", "-", "*", "/", "^", "neg"
	text string // number or name
	exp  int    // exponent of "^"
	col  int    // column of the operator or operand
	from int    // column where the subexpression starts
	a, b *pnode
}

type parser struct {
	toks []token
	pos  int
}

func (ps *parser) peek() token { return ps.toks[ps.pos] }
func (ps *parser) next() token { t := ps.toks[ps.pos]; ps.pos++; return t }

func (ps *parser) isOp(ops ...string) bool {
	t := ps.peek()
	if t.kind != tOp {
		return false
	}
	for _, o := range ops {
		if t.text == o {
			return true
		}
	}
	return false
}

// operand reports a missing operand after the operator op.
func (ps *parser) operand(op token) error {
	t := ps.peek()
	return syntaxErr(t.col, fmt.Sprintf("expected a term after %q, found %s", op.text, describe(t)))
}

// expr parses terms joined by + and -.
func (ps *parser) expr(depth int) (*pnode, error) { return ps.leftAssoc(depth, ps.term, "+", "-") }

// term parses factors joined by * and /.
func (ps *parser) term(depth int) (*pnode, error) { return ps.leftAssoc(depth, ps.unary, "*", "/") }

// leftAssoc parses operands joined by the binary operators ops, grouping
// to the left.
func (ps *parser) leftAssoc(depth int, operand func(int) (*pnode, error), ops ...string) (*pnode, error) {
	n, err := operand(depth)
	if err != nil {
		return nil, err
	}
	for ps.isOp(ops...) {
		op := ps.next()
		if !ps.startsOperand() {
			return nil, ps.operand(op)
		}
		m, err := operand(depth)
		if err != nil {
			return nil, err
		}
		n = &pnode{op: op.text, col: op.col, from: n.from, a: n, b: m}
	}
	return n, nil
}

// startsOperand reports whether the next token can start an operand
// (unary signs included).
func (ps *parser) startsOperand() bool {
	t := ps.peek()
	return t.kind == tNum || t.kind == tName || t.kind == tLParen || ps.isOp("+", "-")
}

func (ps *parser) unary(depth int) (*pnode, error) {
	if depth > maxParseDepth {
		return nil, syntaxErr(ps.peek().col, fmt.Sprintf("nested more than %d deep", maxParseDepth))
	}
	if ps.isOp("+", "-") {
		op := ps.next()
		if !ps.startsOperand() {
			return nil, ps.operand(op)
		}
		n, err := ps.unary(depth + 1)
		if err != nil || op.text == "+" {
			return n, err
		}
		return &pnode{op: "neg", col: op.col, from: op.col, a: n}, nil
	}
	return ps.power(depth)
}

func (ps *parser) power(depth int) (*pnode, error) {
	n, err := ps.atom(depth)
	if err != nil {
		return nil, err
	}
	if !ps.isOp("^", "**") {
		return n, nil
	}
	op := ps.next()
	t := ps.peek()
	if t.kind != tNum {
		if t.kind == tEOF {
			return nil, syntaxErr(t.col, fmt.Sprintf("expected an exponent after %q, found end of input", op.text))
		}
		return nil, syntaxErr(t.col, fmt.Sprintf("the exponent after %q must be a non-negative integer, found %q", op.text, t.text))
	}
	ps.next()
	k, err := strconv.Atoi(t.text)
	if err != nil {
		if isDigits(t.text) {
			return nil, &ParseError{Col: t.col, Msg: fmt.Sprintf("exponent %s is too large", t.text), Err: ErrExponentRange}
		}
		return nil, syntaxErr(t.col, fmt.Sprintf("the exponent after %q must be a non-negative integer, found %q", op.text, t.text))
	}
	if ps.isOp("^", "**") {
		return nil, syntaxErr(ps.peek().col, "chained powers need parentheses, e.g. (a^2)^3")
	}
	return &pnode{op: "^", col: op.col, from: n.from, exp: k, a: n}, nil
}

func (ps *parser) atom(depth int) (*pnode, error) {
	t := ps.next()
	switch t.kind {
	case tNum:
		return &pnode{op: "num", text: t.text, col: t.col, from: t.col}, nil
	case tName:
		return &pnode{op: "name", text: t.text, col: t.col, from: t.col}, nil
	case tLParen:
		if ps.peek().kind == tRParen {
			return nil, syntaxErr(ps.peek().col, `expected an expression inside "()"`)
		}
		n, err := ps.expr(depth + 1)
		if err != nil {
			return nil, err
		}
		if c := ps.peek(); c.kind != tRParen {
			if c.kind == tNum || c.kind == tName || c.kind == tLParen {
				return nil, syntaxErr(c.col, fmt.Sprintf("expected an operator before %q", c.text))
			}
			return nil, syntaxErr(c.col, fmt.Sprintf(`expected ")" to close "(" at column %d, found %s`, t.col, describe(c)))
		}
		ps.next()
		return &pnode{op: n.op, text: n.text, exp: n.exp, col: n.col, from: t.col, a: n.a, b: n.b}, nil
	case tEOF:
		return nil, syntaxErr(t.col, "expected a polynomial, found end of input")
	}
	return nil, syntaxErr(t.col, fmt.Sprintf("unexpected %q", t.text))
}

func describe(t token) string {
	if t.kind == tEOF {
		return "end of input"
	}
	return strconv.Quote(t.text)
}

// eval evaluates a syntax tree; idx gives the variable index of each name
// and names the variable names by index.
func (r *Ring) eval(n *pnode, idx map[string]int, names []string) (*Poly, error) {
	wrap := func(col int, err error) error {
		s := sentinelOf(err)
		msg := err.Error()
		if s == ErrExponentRange {
			msg = fmt.Sprintf("an exponent of the result would exceed %d: %v", MaxExponent, s)
		}
		return &ParseError{Col: col, Msg: msg, Err: s}
	}
	switch n.op {
	case "num":
		c, err := ParseRat(n.text)
		if err != nil {
			return nil, syntaxErr(n.col, fmt.Sprintf("bad number %q", n.text))
		}
		return r.Const(c), nil
	case "name":
		return r.varPoly(idx[n.text]), nil
	case "neg":
		a, err := r.eval(n.a, idx, names)
		if err != nil {
			return nil, err
		}
		return a.Neg(), nil
	case "^":
		a, err := r.eval(n.a, idx, names)
		if err != nil {
			return nil, err
		}
		p, err := a.Pow(n.exp)
		if err != nil {
			return nil, wrap(n.col, err)
		}
		return p, nil
	}
	a, err := r.eval(n.a, idx, names)
	if err != nil {
		return nil, err
	}
	b, err := r.eval(n.b, idx, names)
	if err != nil {
		return nil, err
	}
	switch n.op {
	case "+":
		return a.Add(b), nil
	case "-":
		return a.Sub(b), nil
	case "*":
		p, err := a.Mul(b)
		if err != nil {
			return nil, wrap(n.col, err)
		}
		return p, nil
	}
	c, ok := b.Constant()
	if !ok {
		return nil, syntaxErr(n.b.from, fmt.Sprintf("division by %s, which is not a constant; only division by constants is allowed", b.format(names)))
	}
	if c.Sign() == 0 {
		return nil, &ParseError{Col: n.col, Msg: "division by zero", Err: ErrDivisionByZero}
	}
	return a.Scale(new(big.Rat).Inv(c)), nil
}

// sentinelOf returns the package sentinel wrapped in err, or ErrSyntax.
func sentinelOf(err error) error {
	for _, s := range []error{ErrTooManyTerms, ErrExponentRange, ErrDivisionByZero} {
		if errors.Is(err, s) {
			return s
		}
	}
	return ErrSyntax
}

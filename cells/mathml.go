package cells

import (
	"bytes"
	"errors"
	"fmt"
	"html"
	"strings"
	"sync"
	"unicode"
	"unicode/utf8"

	"github.com/gomarkdown/markdown"
	"github.com/gomarkdown/markdown/ast"
	mdparser "github.com/gomarkdown/markdown/parser"
)

// MathML turns a formula in a small subset of LaTeX into presentation
// MathML (the MathML Core elements: mi, mn, mo, mtext, mrow, mfrac, msqrt,
// mroot, msub, msup, msubsup, munder, mover, munderover, mtable, mspace;
// W3C, "MathML Core", 2023), so the HTML report shows prose maths without a
// script. The subset: numbers, letters, operators, braces, ^ and _,
// \frac, \sqrt and \sqrt[n], Greek letters, \cdot \times \le \ge \ne \pm
// and a few more symbols, \sum and \prod with limits, \left…\right,
// \text{…}, \mathrm{…}, and the pmatrix, bmatrix and matrix environments.
// display sets the formula as a block. Anything outside the subset is an
// error naming it; every character of the source reaches the output only
// escaped, so the formula cannot add markup of its own.
func MathML(tex string, display bool) (string, error) {
	if len(tex) > maxTeX {
		return "", fmt.Errorf("formula longer than %d bytes", maxTeX)
	}
	p := &texParser{src: tex}
	body, err := p.row(stopEnd)
	if err != nil {
		return "", err
	}
	open := "<math>"
	if display {
		open = `<math display="block">`
	}
	return open + body + "</math>", nil
}

// maxTeX and maxDepth bound what a hostile notebook can make the parser do.
const (
	maxTeX   = 4000
	maxDepth = 40
)

// texParser reads one formula; pos is a byte offset into src.
type texParser struct {
	src   string
	pos   int
	depth int
}

// stop says what ends a row: the end of the formula, a closing brace, a
// \right, or (inside a matrix) a cell or row separator and \end.
type stop int

const (
	stopEnd stop = iota
	stopBrace
	stopRight
	stopCell
)

// row reads items until its stop and returns them as one mrow (or the
// single item, when there is one).
func (p *texParser) row(s stop) (string, error) {
	p.depth++
	defer func() { p.depth-- }()
	if p.depth > maxDepth {
		return "", fmt.Errorf("formula nested deeper than %d", maxDepth)
	}
	var items []string
	for {
		p.skipSpace()
		if p.pos >= len(p.src) {
			if s != stopEnd {
				return "", errors.New("missing closing " + map[stop]string{stopBrace: "}", stopRight: `\right`, stopCell: `\end`}[s])
			}
			break
		}
		if p.atStop(s) {
			break
		}
		it, err := p.item()
		if err != nil {
			return "", err
		}
		items = append(items, it)
	}
	return mrow(items), nil
}

// mrow groups items; one item needs no group.
func mrow(items []string) string {
	if len(items) == 0 {
		return ""
	}
	if len(items) == 1 {
		return items[0]
	}
	return "<mrow>" + strings.Join(items, "") + "</mrow>"
}

// atStop reports whether the source at pos ends a row of kind s (without
// consuming it).
func (p *texParser) atStop(s stop) bool {
	rest := p.src[p.pos:]
	switch s {
	case stopBrace:
		return rest[0] == '}'
	case stopRight:
		return p.peekCommand() == "right"
	case stopCell:
		return rest[0] == '&' || strings.HasPrefix(rest, `\\`) || p.peekCommand() == "end"
	}
	return false
}

func (p *texParser) skipSpace() {
	for p.pos < len(p.src) && strings.IndexByte(" \t\r\n", p.src[p.pos]) >= 0 {
		p.pos++
	}
}

// peekCommand is the name of the control word at pos, or "".
func (p *texParser) peekCommand() string {
	if p.pos >= len(p.src) || p.src[p.pos] != '\\' {
		return ""
	}
	end := p.pos + 1
	for end < len(p.src) && isASCIILetter(p.src[end]) {
		end++
	}
	return p.src[p.pos+1 : end]
}

func isASCIILetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' }

// item reads one atom and the scripts attached to it.
func (p *texParser) item() (string, error) {
	base, large, err := p.atom()
	if err != nil {
		return "", err
	}
	var sub, sup string
	for {
		p.skipSpace()
		if p.pos >= len(p.src) || (p.src[p.pos] != '^' && p.src[p.pos] != '_') {
			break
		}
		c := p.src[p.pos]
		p.pos++
		arg, err := p.argument()
		if err != nil {
			return "", err
		}
		if c == '^' {
			if sup != "" {
				return "", errors.New("double superscript")
			}
			sup = arg
		} else {
			if sub != "" {
				return "", errors.New("double subscript")
			}
			sub = arg
		}
	}
	under, over, both := "msub", "msup", "msubsup"
	if large {
		// A sum's limits go under and over it (set beside it in inline
		// maths by the operator's movablelimits, MathML Core §3.4.3).
		under, over, both = "munder", "mover", "munderover"
	}
	switch {
	case sub != "" && sup != "":
		return "<" + both + ">" + base + sub + sup + "</" + both + ">", nil
	case sub != "":
		return "<" + under + ">" + base + sub + "</" + under + ">", nil
	case sup != "":
		return "<" + over + ">" + base + sup + "</" + over + ">", nil
	}
	return base, nil
}

// argument reads the argument of a command or script: a braced group, or
// else one token.
func (p *texParser) argument() (string, error) {
	p.skipSpace()
	if p.pos >= len(p.src) {
		return "", errors.New("missing argument at the end")
	}
	if p.src[p.pos] == '{' {
		return p.group()
	}
	if p.src[p.pos] == '}' || p.src[p.pos] == '^' || p.src[p.pos] == '_' || p.src[p.pos] == '&' {
		return "", fmt.Errorf("missing argument before %q", p.src[p.pos])
	}
	if p.src[p.pos] >= '0' && p.src[p.pos] <= '9' {
		// x^23 is x²3 in LaTeX: a bare argument is one digit.
		p.pos++
		return "<mn>" + p.src[p.pos-1:p.pos] + "</mn>", nil
	}
	a, _, err := p.atom()
	return a, err
}

// group reads {…} as one mrow.
func (p *texParser) group() (string, error) {
	if p.pos >= len(p.src) || p.src[p.pos] != '{' {
		return "", errors.New("expected {")
	}
	p.pos++
	r, err := p.row(stopBrace)
	if err != nil {
		return "", err
	}
	p.pos++ // the closing brace
	if r == "" {
		return "<mrow></mrow>", nil
	}
	return r, nil
}

// atom reads one atom; large is set for \sum and \prod, whose scripts are
// limits.
func (p *texParser) atom() (a string, large bool, err error) {
	c := p.src[p.pos]
	switch {
	case c == '{':
		a, err = p.group()
		return a, false, err
	case c == '}':
		return "", false, errors.New("unmatched }")
	case c == '^' || c == '_':
		return "", false, fmt.Errorf("%c with nothing before it", c)
	case c == '&':
		return "", false, errors.New("& outside a matrix")
	case c >= '0' && c <= '9' || c == '.' && p.pos+1 < len(p.src) && p.src[p.pos+1] >= '0' && p.src[p.pos+1] <= '9':
		end := p.pos
		for end < len(p.src) && (p.src[end] >= '0' && p.src[end] <= '9' || p.src[end] == '.') {
			end++
		}
		a = "<mn>" + p.src[p.pos:end] + "</mn>"
		p.pos = end
		return a, false, nil
	case c == '\\':
		return p.command()
	}
	r, size := utf8.DecodeRuneInString(p.src[p.pos:])
	if r == utf8.RuneError && size <= 1 {
		return "", false, errors.New("not UTF-8")
	}
	p.pos += size
	if unicode.IsLetter(r) {
		return "<mi>" + html.EscapeString(string(r)) + "</mi>", false, nil
	}
	if r == '-' {
		r = '−' // the minus sign, not the hyphen
	}
	if unicode.IsControl(r) {
		return "", false, fmt.Errorf("control character %U", r)
	}
	return "<mo>" + html.EscapeString(string(r)) + "</mo>", false, nil
}

// command reads a control sequence and what it takes.
func (p *texParser) command() (string, bool, error) {
	name := p.peekCommand()
	if name == "" {
		// A control symbol: \\ outside a matrix, \, \; \! spaces, \{ \}.
		if p.pos+1 >= len(p.src) {
			return "", false, errors.New(`\ at the end`)
		}
		c := p.src[p.pos+1]
		p.pos += 2
		switch c {
		case ',':
			return `<mspace width="0.1667em"></mspace>`, false, nil
		case ':', '>':
			return `<mspace width="0.2222em"></mspace>`, false, nil
		case ';':
			return `<mspace width="0.2778em"></mspace>`, false, nil
		case ' ':
			return `<mspace width="0.25em"></mspace>`, false, nil
		case '!':
			return "", false, nil
		case '{', '}', '|', '%', '$', '#':
			return "<mo>" + html.EscapeString(string(c)) + "</mo>", false, nil
		}
		return "", false, fmt.Errorf(`unknown command \%c`, c)
	}
	p.pos += 1 + len(name)
	if s, ok := texSymbols()[name]; ok {
		return s, false, nil
	}
	if s, ok := texLarge[name]; ok {
		return `<mo>` + s + `</mo>`, true, nil
	}
	switch name {
	case "frac":
		num, err := p.argument()
		if err != nil {
			return "", false, err
		}
		den, err := p.argument()
		if err != nil {
			return "", false, err
		}
		return "<mfrac>" + num + den + "</mfrac>", false, nil
	case "sqrt":
		p.skipSpace()
		var index string
		if p.pos < len(p.src) && p.src[p.pos] == '[' {
			end := strings.IndexByte(p.src[p.pos:], ']')
			if end < 0 {
				return "", false, errors.New(`\sqrt[ without ]`)
			}
			inner := &texParser{src: p.src[p.pos+1 : p.pos+end], depth: p.depth}
			var err error
			if index, err = inner.row(stopEnd); err != nil {
				return "", false, err
			}
			p.pos += end + 1
		}
		rad, err := p.argument()
		if err != nil {
			return "", false, err
		}
		if index != "" {
			return "<mroot>" + rad + index + "</mroot>", false, nil
		}
		return "<msqrt>" + rad + "</msqrt>", false, nil
	case "text", "mathrm":
		txt, err := p.rawGroup()
		if err != nil {
			return "", false, err
		}
		if name == "text" {
			return "<mtext>" + html.EscapeString(txt) + "</mtext>", false, nil
		}
		return `<mi mathvariant="normal">` + html.EscapeString(txt) + "</mi>", false, nil
	case "left":
		open, err := p.delimiter()
		if err != nil {
			return "", false, err
		}
		inner, err := p.row(stopRight)
		if err != nil {
			return "", false, err
		}
		p.pos += len(`\right`)
		cl, err := p.delimiter()
		if err != nil {
			return "", false, err
		}
		return "<mrow>" + open + inner + cl + "</mrow>", false, nil
	case "begin":
		m, err := p.matrix()
		return m, false, err
	case "right":
		return "", false, errors.New(`\right without \left`)
	case "end":
		return "", false, errors.New(`\end without \begin`)
	}
	return "", false, fmt.Errorf(`unknown command \%s`, name)
}

// rawGroup reads {…} as text, braces balanced.
func (p *texParser) rawGroup() (string, error) {
	p.skipSpace()
	if p.pos >= len(p.src) || p.src[p.pos] != '{' {
		return "", errors.New("expected {")
	}
	depth := 0
	for i := p.pos; i < len(p.src); i++ {
		switch p.src[i] {
		case '{':
			depth++
		case '}':
			depth--
			if depth == 0 {
				s := p.src[p.pos+1 : i]
				p.pos = i + 1
				return s, nil
			}
		}
	}
	return "", errors.New("missing closing }")
}

// delimiter reads the fence after \left or \right: a character, a
// command for one, or "." for none.
func (p *texParser) delimiter() (string, error) {
	p.skipSpace()
	if p.pos >= len(p.src) {
		return "", errors.New(`missing delimiter after \left or \right`)
	}
	var d string
	switch c := p.src[p.pos]; {
	case c == '.':
		p.pos++
		return "", nil
	case strings.IndexByte("()[]|/", c) >= 0:
		d = string(c)
		p.pos++
	case c == '\\':
		name := p.peekCommand()
		switch {
		case strings.HasPrefix(p.src[p.pos:], `\{`), strings.HasPrefix(p.src[p.pos:], `\}`), strings.HasPrefix(p.src[p.pos:], `\|`):
			d = map[byte]string{'{': "{", '}': "}", '|': "‖"}[p.src[p.pos+1]]
			p.pos += 2
		case texFences[name] != "":
			d = texFences[name]
			p.pos += 1 + len(name)
		default:
			return "", fmt.Errorf(`not a delimiter: \%s`, name)
		}
	default:
		return "", fmt.Errorf("not a delimiter: %q", c)
	}
	return `<mo fence="true" stretchy="true">` + html.EscapeString(d) + "</mo>", nil
}

// matrix reads \begin{ENV} rows \end{ENV} for the matrix environments.
func (p *texParser) matrix() (string, error) {
	env, err := p.rawGroup()
	if err != nil {
		return "", err
	}
	fences, ok := texMatrices[env]
	if !ok {
		return "", fmt.Errorf("unknown environment %q", env)
	}
	var rows []string
	var cells []string
	for {
		cell, err := p.row(stopCell)
		if err != nil {
			return "", err
		}
		cells = append(cells, "<mtd>"+cell+"</mtd>")
		rest := p.src[p.pos:]
		switch {
		case rest[0] == '&':
			p.pos++
			continue
		case strings.HasPrefix(rest, `\\`):
			p.pos += 2
			rows = append(rows, "<mtr>"+strings.Join(cells, "")+"</mtr>")
			cells = nil
			continue
		}
		// \end{ENV}
		p.pos += len(`\end`)
		end, err := p.rawGroup()
		if err != nil {
			return "", err
		}
		if end != env {
			return "", fmt.Errorf(`\begin{%s} ended by \end{%s}`, env, end)
		}
		if len(cells) > 1 || cells[0] != "<mtd></mtd>" {
			// A trailing \\ leaves no empty last row.
			rows = append(rows, "<mtr>"+strings.Join(cells, "")+"</mtr>")
		}
		break
	}
	table := "<mtable>" + strings.Join(rows, "") + "</mtable>"
	if fences[0] == "" {
		return table, nil
	}
	return "<mrow><mo fence=\"true\" stretchy=\"true\">" + fences[0] + "</mo>" + table +
		"<mo fence=\"true\" stretchy=\"true\">" + fences[1] + "</mo></mrow>", nil
}

// texMatrices are the matrix environments and their fences.
var texMatrices = map[string][2]string{
	"matrix": {"", ""}, "pmatrix": {"(", ")"}, "bmatrix": {"[", "]"}, "vmatrix": {"|", "|"},
}

// texFences are the named delimiters \left and \right take.
var texFences = map[string]string{
	"langle": "⟨", "rangle": "⟩", "lvert": "|", "rvert": "|", "lVert": "‖", "rVert": "‖",
	"lfloor": "⌊", "rfloor": "⌋", "lceil": "⌈", "rceil": "⌉",
}

// texLarge are the operators whose scripts are limits.
var texLarge = map[string]string{"sum": "∑", "prod": "∏", "lim": "lim", "max": "max", "min": "min"}

// texSymbols are the commands that stand for one symbol, made at first
// use (only the HTML report needs them, not every process's start).
var texSymbols = sync.OnceValue(func() map[string]string {
	m := map[string]string{}
	lower := "alpha α beta β gamma γ delta δ epsilon ϵ varepsilon ε zeta ζ eta η theta θ vartheta ϑ iota ι " +
		"kappa κ lambda λ mu μ nu ν xi ξ pi π varpi ϖ rho ρ varrho ϱ sigma σ varsigma ς tau τ upsilon υ " +
		"phi ϕ varphi φ chi χ psi ψ omega ω"
	f := strings.Fields(lower)
	for i := 0; i < len(f); i += 2 {
		m[f[i]] = "<mi>" + f[i+1] + "</mi>"
	}
	// Capital Greek letters are upright (ISO 80000-2).
	upper := "Gamma Γ Delta Δ Theta Θ Lambda Λ Xi Ξ Pi Π Sigma Σ Upsilon Υ Phi Φ Psi Ψ Omega Ω"
	f = strings.Fields(upper)
	for i := 0; i < len(f); i += 2 {
		m[f[i]] = `<mi mathvariant="normal">` + f[i+1] + "</mi>"
	}
	ops := "cdot ⋅ times × div ÷ le ≤ leq ≤ ge ≥ geq ≥ ne ≠ neq ≠ pm ± mp ∓ approx ≈ equiv ≡ sim ∼ " +
		"in ∈ notin ∉ subset ⊂ subseteq ⊆ cup ∪ cap ∩ to → mapsto ↦ rightarrow → Rightarrow ⇒ iff ⟺ " +
		"ldots … cdots ⋯ vdots ⋮ ddots ⋱ infty ∞ partial ∂ nabla ∇ forall ∀ exists ∃ mid ∣ circ ∘ " +
		"langle ⟨ rangle ⟩ wedge ∧ vee ∨ perp ⊥ parallel ∥ angle ∠ lt < gt >"
	f = strings.Fields(ops)
	for i := 0; i < len(f); i += 2 {
		m[f[i]] = "<mo>" + html.EscapeString(f[i+1]) + "</mo>"
	}
	for _, fn := range strings.Fields("sin cos tan cot sec csc arcsin arccos arctan sinh cosh tanh log ln exp det dim ker deg gcd arg") {
		m[fn] = `<mi mathvariant="normal">` + fn + "</mi>"
	}
	m["quad"] = `<mspace width="1em"></mspace>`
	m["qquad"] = `<mspace width="2em"></mspace>`
	return m
})

// proseMath is the inline parser for "$" in the notebook's text (code
// spans and blocks never reach it, and "\$" is an escaped dollar before it
// sees it). "$$…$$" is display maths; "$…$" is inline maths when the
// opening "$" is not followed by a space and the closing one is neither
// preceded by a space nor followed by a digit, so "costs $5 and $6" stays
// prose. Maths never spans a blank line or holds a backtick.
func proseMath(_ *mdparser.Parser, data []byte, offset int) (int, ast.Node) {
	d := data[offset:]
	if len(d) > 2 && d[1] == '$' {
		end := bytes.Index(d[2:], []byte("$$"))
		if end <= 0 || !mathBody(d[2:2+end]) {
			return 0, nil
		}
		return end + 4, &ast.MathBlock{Container: ast.Container{Literal: d[2 : 2+end]}}
	}
	if len(d) < 3 || d[1] == ' ' || d[1] == '\t' || d[1] == '\n' {
		return 0, nil
	}
	for i := 2; i < len(d); i++ {
		switch d[i] {
		case '\\':
			i++ // an escaped character, \$ among them, does not close
		case '$':
			if d[i-1] == ' ' || d[i-1] == '\t' || d[i-1] == '\n' || i+1 < len(d) && d[i+1] >= '0' && d[i+1] <= '9' {
				return 0, nil
			}
			if !mathBody(d[1:i]) {
				return 0, nil
			}
			return i + 1, &ast.Math{Leaf: ast.Leaf{Literal: d[1:i]}}
		}
	}
	return 0, nil
}

// mathBody reports whether tex may be a formula of the prose: no backtick
// (a code span takes precedence) and no blank line.
func mathBody(tex []byte) bool {
	return !bytes.ContainsRune(tex, '`') && !bytes.Contains(tex, []byte("\n\n")) && !bytes.Contains(tex, []byte("\n \n"))
}

// mathHTML renders a formula of the prose: MathML, or when it falls
// outside the subset its source, visibly, with the reason as a tooltip.
func mathHTML(tex string, display bool) string {
	m, err := MathML(tex, display)
	if err == nil {
		return m
	}
	delim := "$"
	if display {
		delim = "$$"
	}
	return `<code class="tex" title="not typeset: ` + html.EscapeString(err.Error()) + `">` +
		html.EscapeString(delim+tex+delim) + "</code>"
}

// mathWarnings names, by notebook line, each formula of a prose block that
// the HTML report cannot typeset and shows as source. The block is read as
// RenderHTML reads it, so the two agree on what is maths.
func mathWarnings(b Block) []Problem {
	doc := markdown.Parse([]byte(withoutHTMLBlocks(b.Text)), mathParser())
	var out []Problem
	from := 0
	ast.WalkFunc(doc, func(n ast.Node, entering bool) ast.WalkStatus {
		var tex string
		display := false
		switch m := n.(type) {
		case *ast.Math:
			tex = string(m.Literal)
		case *ast.MathBlock:
			tex, display = string(m.Literal), true
		default:
			return ast.GoToNext
		}
		if !entering {
			return ast.GoToNext
		}
		// The node keeps no position: find its text after the last one.
		at := strings.Index(b.Text[from:], tex)
		if at >= 0 {
			from += at
		}
		if _, err := MathML(tex, display); err != nil {
			out = append(out, Problem{Line: b.Line + strings.Count(b.Text[:from], "\n"),
				Message: "maths not typeset, shown as its source in the HTML report: " + err.Error()})
		}
		from += len(tex)
		return ast.SkipChildren
	})
	return out
}

// mathParser is the Markdown parser of the notebook's text, with prose
// maths.
func mathParser() *mdparser.Parser {
	p := mdparser.NewWithExtensions(mdExtensions)
	p.RegisterInline('$', proseMath)
	return p
}

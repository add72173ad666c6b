package cells

import (
	"html"
	"strings"
	"unicode/utf8"
)

// This file reads the block structure of a notebook as CommonMark 0.31.2
// does (sections 4 and 5 of the spec), as far as the one rule of a cell
// needs it: a cell is a fenced code block at the top level of the document
// whose info string starts with the word "cell". So the scanner knows, for
// every line, whether a block quote or a list item holds it, whether it is
// part of an HTML block, of indented code or of a fenced code block, and
// where fences open and close. Inline structure does not matter here.

// lineKind is what a line is, block-wise.
type lineKind int

const (
	lineBlank      lineKind = iota // blank (maybe after container markers)
	lineText                       // paragraph text, a thematic break or a setext underline
	lineHeading                    // an ATX heading
	lineFenceOpen                  // opens a fenced code block
	lineFenceBody                  // inside a fenced code block
	lineFenceClose                 // closes a fenced code block
	lineHTML                       // first line of an HTML block
	lineHTMLBody                   // later line of an HTML block
	lineIndented                   // indented code
)

// reading is how the scanner read one line.
type reading struct {
	kind   lineKind
	top    bool   // no block quote or list item holds the line
	quote  bool   // a block quote holds it
	item   bool   // a list item holds it
	rest   string // the line after container markers, tabs expanded
	indent int    // spaces at the start of rest
	fence  fence  // for fence lines: the fence opened, continued or closed
	html   int    // for HTML lines: the block's start condition, 1 to 7
	htmlAt int    // for HTML lines: the line where the block began
	level  int    // for headings: the level
}

// container is an open block quote or list item.
type container struct {
	quote      bool
	content    int  // list item: the column where its content starts
	blankStart bool // list item: its first line held only the marker
	used       bool // list item: a non-blank line has been in it
}

type leafKind int

const (
	leafNone leafKind = iota
	leafPara
	leafFence
	leafHTML
)

// scanner holds the open blocks between lines. The zero value is the
// state at the start of a document.
type scanner struct {
	open   []container
	leaf   leafKind
	fence  fence
	html   int
	htmlAt int
}

// fresh reports whether nothing is open: the state at the start of a
// document, and after a top-level fence closes or a one-line HTML block.
func (sc *scanner) fresh() bool { return len(sc.open) == 0 && sc.leaf == leafNone }

// next reads line number num, with text its content without line end.
func (sc *scanner) next(num int, text string) reading {
	s := expandTabs(text)
	pos, matched := 0, 0
	// Which open containers the line continues (spec 5.1, 5.2).
	for _, c := range sc.open {
		if c.quote {
			n := spaces(s[pos:])
			if n <= 3 && pos+n < len(s) && s[pos+n] == '>' {
				pos += n + 1
				if pos < len(s) && s[pos] == ' ' {
					pos++
				}
				matched++
				continue
			}
			break
		}
		if blank(s[pos:]) {
			if c.blankStart && !c.used {
				break // an item may begin with at most one blank line
			}
			pos = len(s)
			matched++
			continue
		}
		if pos+spaces(s[pos:]) >= c.content {
			pos = c.content
			matched++
			continue
		}
		break
	}
	all := matched == len(sc.open)
	rest := s[pos:]
	if all {
		switch sc.leaf {
		case leafFence:
			r := reading{kind: lineFenceBody, fence: sc.fence, rest: rest, indent: spaces(rest)}
			if sc.fence.closes(rest) {
				r.kind, sc.leaf = lineFenceClose, leafNone
			}
			return sc.where(r)
		case leafHTML:
			if sc.html >= 6 && blank(rest) {
				sc.leaf = leafNone // the blank line ends the block and is not part of it
				break
			}
			r := reading{kind: lineHTMLBody, html: sc.html, htmlAt: sc.htmlAt, rest: rest, indent: spaces(rest)}
			if sc.html <= 5 && htmlEnds(sc.html, rest) {
				sc.leaf = leafNone
			}
			return sc.where(r)
		}
	}
	closeUnmatched := func() {
		if matched < len(sc.open) {
			sc.open = sc.open[:matched]
			sc.leaf = leafNone
		}
	}
	// New containers.
	opened := false
	for {
		n := spaces(rest)
		if n >= 4 {
			break
		}
		t := rest[n:]
		if strings.HasPrefix(t, ">") {
			closeUnmatched()
			sc.open = append(sc.open, container{quote: true})
			matched, opened, sc.leaf = len(sc.open), true, leafNone
			pos += n + 1
			if pos < len(s) && s[pos] == ' ' {
				pos++
			}
			rest = s[pos:]
			continue
		}
		interrupts := sc.leaf == leafPara && all && !opened
		if w, ok := listMarker(t, interrupts); ok && !thematicBreak(t) {
			closeUnmatched()
			after := pos + n + w
			c := container{}
			switch sp := spaces(s[after:]); {
			case blank(s[after:]):
				c.blankStart, c.content = true, after+1
			case sp >= 5:
				c.content = after + 1 // the content is indented code
			default:
				c.content = after + sp
			}
			c.used = !c.blankStart
			sc.open = append(sc.open, c)
			matched, opened, sc.leaf = len(sc.open), true, leafNone
			pos = min(c.content, len(s))
			rest = s[pos:]
			continue
		}
		break
	}
	// The leaf block the line starts or continues (spec 4).
	n := spaces(rest)
	t := rest[n:]
	lazy := !all && !opened && sc.leaf == leafPara
	para := sc.leaf == leafPara && (all || lazy) && !opened
	r := reading{rest: rest, indent: n}
	switch {
	case blank(t):
		closeUnmatched()
		sc.leaf = leafNone
		r.kind = lineBlank
		return sc.where(r)
	case n >= 4:
		r.kind = lineIndented
		if para {
			r.kind = lineText // a paragraph continues; indented code cannot interrupt it
			return sc.where(r)
		}
		closeUnmatched()
		sc.leaf = leafNone
		return sc.where(r)
	}
	if f, ok := openFence(rest); ok {
		closeUnmatched()
		sc.leaf, sc.fence = leafFence, f
		r.kind, r.fence = lineFenceOpen, f
		return sc.where(r)
	}
	if k := htmlStart(t); k > 0 && !(k == 7 && para) {
		closeUnmatched()
		sc.leaf, sc.html, sc.htmlAt = leafHTML, k, num
		if k <= 5 && htmlEnds(k, t) {
			sc.leaf = leafNone
		}
		r.kind, r.html, r.htmlAt = lineHTML, k, num
		return sc.where(r)
	}
	if lvl := atxLevel(t); lvl > 0 {
		closeUnmatched()
		sc.leaf = leafNone
		r.kind, r.level = lineHeading, lvl
		return sc.where(r)
	}
	r.kind = lineText
	switch {
	case thematicBreak(t):
		closeUnmatched()
		sc.leaf = leafNone
	case sc.leaf == leafPara && all && !opened && setextUnderline(t):
		sc.leaf = leafNone
	case lazy:
		// A lazy continuation line: the paragraph goes on in its containers.
	default:
		closeUnmatched()
		sc.leaf = leafPara
	}
	return sc.where(r)
}

// where fills in the containers holding the line just read.
func (sc *scanner) where(r reading) reading {
	r.top = len(sc.open) == 0
	for i, c := range sc.open {
		if c.quote {
			r.quote = true
		} else {
			r.item = true
		}
		if r.kind != lineBlank {
			sc.open[i].used = true
		}
	}
	return r
}

// expandTabs replaces tabs by spaces to the next multiple of 4 columns, as
// CommonMark does wherever whitespace decides block structure (spec 2.2).
func expandTabs(s string) string {
	if !strings.Contains(s, "\t") {
		return s
	}
	var b strings.Builder
	col := 0
	for _, r := range s {
		if r == '\t' {
			n := 4 - col%4
			b.WriteString("    "[:n])
			col += n
			continue
		}
		b.WriteRune(r)
		col++
	}
	return b.String()
}

// spaces counts the leading spaces of s.
func spaces(s string) int { return len(s) - len(strings.TrimLeft(s, " ")) }

// blank reports whether s holds only spaces and tabs (spec 2.1).
func blank(s string) bool { return strings.Trim(s, " \t") == "" }

// listMarker recognises a list item's marker at the start of t and returns
// its width. A list item that would interrupt a paragraph must not be
// empty, and an ordered one must start at 1 (spec 5.2).
func listMarker(t string, interrupts bool) (int, bool) {
	if t == "" {
		return 0, false
	}
	w, ordered, one := 0, false, false
	switch t[0] {
	case '-', '+', '*':
		w = 1
	default:
		d := 0
		for d < len(t) && d < 10 && t[d] >= '0' && t[d] <= '9' {
			d++
		}
		if d == 0 || d > 9 || d == len(t) || (t[d] != '.' && t[d] != ')') {
			return 0, false
		}
		w, ordered, one = d+1, true, strings.TrimLeft(t[:d], "0") == "1"
	}
	after := t[w:]
	if after != "" && after[0] != ' ' {
		return 0, false
	}
	if interrupts && (blank(after) || (ordered && !one)) {
		return 0, false
	}
	return w, true
}

// thematicBreak reports whether t is three or more matching -, * or _
// with only spaces or tabs between (spec 4.1).
func thematicBreak(t string) bool {
	var c byte
	n := 0
	for i := 0; i < len(t); i++ {
		switch t[i] {
		case ' ', '\t':
		case '-', '*', '_':
			if c != 0 && t[i] != c {
				return false
			}
			c = t[i]
			n++
		default:
			return false
		}
	}
	return n >= 3
}

// setextUnderline reports whether t underlines a setext heading (spec 4.3).
func setextUnderline(t string) bool {
	t = strings.TrimRight(t, " \t")
	return t != "" && (strings.Trim(t, "=") == "" || strings.Trim(t, "-") == "")
}

// atxLevel is the level of an ATX heading line t (spec 4.2), or 0.
func atxLevel(t string) int {
	n := len(t) - len(strings.TrimLeft(t, "#"))
	if n < 1 || n > 6 || (n < len(t) && t[n] != ' ' && t[n] != '\t') {
		return 0
	}
	return n
}

var (
	htmlRaw       = lazyRegexp(`(?i)^<(pre|script|style|textarea)([ \t>]|$)`)
	htmlRawEnd    = lazyRegexp(`(?i)</(pre|script|style|textarea)>`)
	htmlBlockTags = lazyRegexp(`(?i)^</?(address|article|aside|base|basefont|blockquote|body|caption|center|col|colgroup|dd|details|dialog|dir|div|dl|dt|fieldset|figcaption|figure|footer|form|frame|frameset|h1|h2|h3|h4|h5|h6|head|header|hr|html|iframe|legend|li|link|main|menu|menuitem|nav|noframes|ol|optgroup|option|p|param|search|section|summary|table|tbody|td|tfoot|th|thead|title|tr|track|ul)([ \t>]|/>|$)`)
	htmlTagLine   = lazyRegexp(`^(<[A-Za-z][A-Za-z0-9-]*([ \t]+[A-Za-z_:][A-Za-z0-9_.:-]*([ \t]*=[ \t]*([^ \t\r\n"'=<>` + "`" + `]+|'[^']*'|"[^"]*"))?)*[ \t]*/?>|</[A-Za-z][A-Za-z0-9-]*[ \t]*>)[ \t]*$`)
	htmlLetter    = lazyRegexp(`^<![A-Za-z]`)
)

// htmlStart is the start condition (1 to 7) of an HTML block that line t
// (indentation removed) opens, or 0 (spec 4.6). Type 7 cannot interrupt a
// paragraph; the caller checks that. An open tag <pre…> is type 1 before
// it can be type 7.
func htmlStart(t string) int {
	if !strings.HasPrefix(t, "<") {
		return 0
	}
	switch {
	case htmlRaw().MatchString(t):
		return 1
	case strings.HasPrefix(t, "<!--"):
		return 2
	case strings.HasPrefix(t, "<?"):
		return 3
	case htmlLetter().MatchString(t):
		return 4
	case strings.HasPrefix(t, "<![CDATA["):
		return 5
	case htmlBlockTags().MatchString(t):
		return 6
	case htmlTagLine().MatchString(t):
		// The spec leaves out pre, script, style and textarea, but its
		// reference parsers (cmark, commonmark.js) do not for a closing
		// tag such as </pre>, and what readers show is the rule here.
		return 7
	}
	return 0
}

// htmlEnds reports whether a line ends an HTML block of start condition
// k, 1 to 5 (types 6 and 7 end at a blank line).
func htmlEnds(k int, s string) bool {
	switch k {
	case 1:
		return htmlRawEnd().MatchString(s)
	case 2:
		return strings.Contains(s, "-->")
	case 3:
		return strings.Contains(s, "?>")
	case 4:
		return strings.Contains(s, ">")
	case 5:
		return strings.Contains(s, "]]>")
	}
	return false
}

// infoWord is the first word of a fence's info string after backslash
// escapes and entity references are resolved, as CommonMark resolves them
// before a reader takes the first word as the language (spec 4.5).
func infoWord(info string) string {
	w := strings.Fields(unescapeInfo(info))
	if len(w) == 0 {
		return ""
	}
	return w[0]
}

var entityRef = lazyRegexp(`&(#[0-9]{1,7}|#[xX][0-9a-fA-F]{1,6}|[A-Za-z][A-Za-z0-9]{1,31});`)

// unescapeInfo resolves backslash escapes of ASCII punctuation and entity
// references in an info string (spec 2.4, 2.5).
func unescapeInfo(s string) string {
	if !strings.ContainsAny(s, `\&`) {
		return s
	}
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		if s[i] == '\\' && i+1 < len(s) && strings.IndexByte("!\"#$%&'()*+,-./:;<=>?@[\\]^_`{|}~", s[i+1]) >= 0 {
			b.WriteByte(s[i+1])
			i++
			continue
		}
		if s[i] == '&' {
			if m := entityRef().FindString(s[i:]); m != "" && strings.HasPrefix(s[i:], m) {
				if r := html.UnescapeString(m); r != m {
					b.WriteString(r)
					i += len(m) - 1
					continue
				}
			}
		}
		b.WriteByte(s[i])
	}
	return b.String()
}

// nearCell reports whether an info string's first word is not "cell" but
// is easily taken for it: "Cell", "CELL", "cell,", "cells", "{cell}",
// ".cell" and the like.
func nearCell(word string) bool {
	if word == "cell" {
		return false
	}
	w := strings.ToLower(strings.TrimLeft(word, "{.#([<'\"`*_-:\\"))
	end := 0
	for end < len(w) {
		r, size := utf8.DecodeRuneInString(w[end:])
		if r < 'a' || r > 'z' {
			break
		}
		end += size
	}
	return w[:end] == "cell" || w[:end] == "cells"
}

// cellish reports whether an info string's first word makes, or looks as
// if it makes, a cell.
func cellish(word string) bool { return word == "cell" || nearCell(word) }

package cells

import (
	"bytes"
	"fmt"
	"net/url"
	"path/filepath"
	"strconv"
	"strings"
)

// VerdictLabel is a claim's verdict in words, readable without colour:
// "✔ holds", "≈ holds to 40 digits", "✘ fails" or "? undecided".
func VerdictLabel(c Claim) string {
	switch c.Verdict {
	case Holds:
		return "✔ holds"
	case HoldsToDigits:
		return fmt.Sprintf("≈ holds to %d digits", c.Digits)
	case Fails:
		return "✘ fails"
	case Undecided:
		return "? undecided"
	}
	return "? " + string(c.Verdict)
}

// RenderMarkdown returns the report as Markdown: the notebook verbatim with,
// after each cell that has an outcome, its output block and a generated
// region; with header, a generated summary region at the top. With
// r.FigureBase set, each figure is an image link to its file (FigureFiles)
// with a caption; else a line names it. The result parses as the same
// notebook, and rendering it again gives the same bytes.
func RenderMarkdown(r *Report, header bool) []byte {
	return renderMarkdown(r, header, nil)
}

// mdWriter writes one Markdown report. With marks set it writes the variant
// that RenderHTML converts: regions and figures become placeholder tokens.
type mdWriter struct {
	b       bytes.Buffer
	r       *Report
	nb      *Notebook
	eol     string
	marks   *htmlMarks
	outcome map[int]*Outcome
	first   map[int]int // cell -> number of its first claim
	figure  map[int]int // cell -> number of its first figure
}

func renderMarkdown(r *Report, header bool, marks *htmlMarks) []byte {
	w := &mdWriter{r: r, nb: r.Notebook, marks: marks, outcome: map[int]*Outcome{}, first: map[int]int{}, figure: map[int]int{}}
	if w.nb == nil {
		w.nb = &Notebook{}
	}
	w.eol = lineEnd(w.nb)
	n, nf := 1, 1
	for i := range r.Outcomes {
		o := &r.Outcomes[i]
		w.outcome[o.Cell] = o
		w.first[o.Cell] = n
		n += len(o.Claims)
		w.figure[o.Cell] = nf
		nf += len(o.Figures)
	}
	blocks := w.nb.Blocks
	if header {
		if len(blocks) > 0 && blocks[0].Kind == Prose {
			if k := afterHeading(blocks[0].Text); k > 0 {
				// The summary goes right after the opening heading line.
				text := blocks[0].Text
				w.b.WriteString(text[:k])
				w.newline()
				w.region("header", w.headerContent())
				w.b.WriteString(text[k:])
				blocks, header = blocks[1:], false
			}
		}
		if header {
			w.region("header", w.headerContent())
		}
	}
	for _, b := range blocks {
		if b.Kind == Prose {
			w.b.WriteString(b.Text)
		} else {
			w.cell(b)
		}
	}
	return w.b.Bytes()
}

// lineEnd is the notebook's line end, "\r\n" when its first line has one.
func lineEnd(nb *Notebook) string {
	texts := []string{string(nb.Source)}
	for _, b := range nb.Blocks {
		texts = append(texts, b.Raw, b.Text)
	}
	for _, t := range texts {
		if i := strings.IndexByte(t, '\n'); i >= 0 {
			if i > 0 && t[i-1] == '\r' {
				return "\r\n"
			}
			return "\n"
		}
	}
	if strings.HasSuffix(string(nb.Source), "\r") {
		return "\r\n" // a one-line file ending in a lone CR
	}
	return "\n"
}

// afterHeading returns the offset just past text's first line when that
// line, leading blank lines aside, is a level-1 heading; else 0.
func afterHeading(text string) int {
	for pos := 0; pos < len(text); {
		end := len(text)
		if i := strings.IndexByte(text[pos:], '\n'); i >= 0 {
			end = pos + i + 1
		}
		l := strings.TrimRight(text[pos:end], "\r\n")
		if strings.TrimSpace(l) != "" {
			if headingText(l) != "" {
				return end
			}
			return 0
		}
		pos = end
	}
	return 0
}

// newline ends the current line if it is not ended.
func (w *mdWriter) newline() {
	switch n := w.b.Len(); {
	case n == 0 || w.b.Bytes()[n-1] == '\n':
	case w.b.Bytes()[n-1] == '\r' && w.eol == "\r\n":
		w.b.WriteByte('\n') // complete the CRLF the text began
	default:
		w.b.WriteString(w.eol)
	}
}

// gen writes generated text, written with "\n", in the notebook's line ends.
func (w *mdWriter) gen(s string) {
	if w.eol != "\n" {
		s = strings.ReplaceAll(s, "\n", w.eol)
	}
	w.b.WriteString(s)
}

// region writes a generated region holding content (paragraphs ending in
// "\n"). kind is "header" or "cell", used by the HTML variant.
func (w *mdWriter) region(kind, content string) {
	w.newline()
	lines := strings.SplitAfter(content, "\n")
	for i, l := range lines {
		if isMarker(l, GeneratedStart) || isMarker(l, GeneratedEnd) {
			lines[i] = `\` + strings.TrimLeft(l, " ") // keep the region closed
		}
	}
	content = strings.Join(lines, "")
	if w.marks != nil {
		w.gen("\n" + w.marks.token(kind) + "\n\n" + content + "\n" + w.marks.token("end") + "\n\n")
		return
	}
	w.gen(GeneratedStart + "\n\n" + content + "\n" + GeneratedEnd + "\n")
}

// cell writes a cell verbatim, then its output and generated region.
func (w *mdWriter) cell(b Block) {
	w.newline()
	if b.Raw != "" {
		w.b.WriteString(b.Raw)
	} else {
		text := b.Text
		if text != "" && !strings.HasSuffix(text, "\n") {
			text += "\n"
		}
		f := b.Fence
		if f == "" {
			f = fenceFor(text)
		}
		w.gen(f + b.Info + "\n" + text + f + "\n")
	}
	o := w.outcome[b.Index]
	if o == nil {
		return
	}
	w.newline()
	if o.Status != NotRun {
		out := strings.ReplaceAll(o.Output, "\r\n", "\n")
		if out != "" && !strings.HasSuffix(out, "\n") {
			out += "\n"
		}
		f := fenceFor(out)
		w.gen(f + "output\n" + out + f + "\n")
	}
	w.region("cell", w.cellContent(b, o))
}

// headerContent is the summary at the top of a report.
func (w *mdWriter) headerContent() string {
	r := w.r
	claims := allClaims(r)
	errs := allErrors(r)
	paras := []string{
		"**assay report: " + mdInline(w.nb.Title) + "**",
		strings.Join([]string{
			"- notebook: " + codeSpan(w.nb.Path),
			"- SHA-256: " + codeSpan(r.SHA256),
			"- assay version: " + mdInline(r.Version),
			fmt.Sprintf("- seed: %d", r.Seed),
			fmt.Sprintf("- precision: %d bits", r.Precision),
			fmt.Sprintf("- claims: %d — %s", len(claims), countsPhrase(Counts(r))),
			fmt.Sprintf("- errors: %d", len(errs)),
		}, "\n"),
		"Total time: " + seconds(r.Seconds) + ".",
	}
	if len(errs) > 0 {
		var ls []string
		for _, e := range errs {
			ls = append(ls, "- "+mdInline(truncate(problemText(e), 160)))
		}
		paras = append(paras, "**Errors**\n\n"+strings.Join(ls, "\n"))
	}
	if len(claims) > 0 {
		var rows [][]string
		for i, c := range claims {
			rows = append(rows, []string{strconv.Itoa(i + 1), mdInline(c.Name), mdInline(c.Kind), mdInline(c.Method),
				codeSpan(truncate(c.Residual, 60)), VerdictLabel(c), fmt.Sprintf("cell %d, line %d", c.Cell, c.Line)})
		}
		paras = append(paras, "**Claims**\n\n"+mdTable([]string{"#", "claim", "kind", "method", "residual", "verdict", "where"}, rows))
	}
	var lossy [][]string
	for i, c := range claims {
		if f := c.Float; f != nil && f.DigitsLost > float64DigitsHalf {
			lossy = append(lossy, []string{strconv.Itoa(i + 1), mdInline(c.Name), codeSpan(f.Residual), codeSpan(f.Error),
				fmt.Sprintf("%.1f of 16", f.DigitsLost)})
		}
	}
	if len(lossy) > 0 {
		paras = append(paras, "**Where float64 loses more than half its digits**\n\n"+
			"The same claim run as float64 code (every exact input rounded to float64, gonum for linear algebra), "+
			"against the exact or certified values:\n\n"+
			mdTable([]string{"#", "claim", "float64 residual", "float64 error", "digits lost"}, lossy))
	}
	c := Counts(r)
	if c[HoldsToDigits] > 0 {
		paras = append(paras, "A verdict “≈ holds to N digits” is evidence, not a proof: the residual was certified "+
			"smaller than 10^-N in absolute value where it was checked, which does not show that it is exactly zero.")
	}
	if c[Undecided] > 0 {
		paras = append(paras, "A verdict “? undecided” means the precision cap was reached before the residual "+
			"could be certified zero or non-zero.")
	}
	return strings.Join(paras, "\n\n") + "\n"
}

// float64DigitsHalf is half of the decimal digits a float64 carries: a
// claim whose float64 companion lost more is listed in the header.
const float64DigitsHalf = 8

// cellContent is the generated region after a cell.
func (w *mdWriter) cellContent(b Block, o *Outcome) string {
	var paras []string
	for _, t := range o.Tables {
		esc := func(cells []string) []string {
			out := make([]string, len(cells))
			for i, c := range cells {
				out[i] = mdInline(c)
			}
			return out
		}
		var rows [][]string
		for _, row := range t.Rows {
			rows = append(rows, esc(row))
		}
		if s := mdTable(esc(t.Header), rows); s != "" {
			paras = append(paras, s)
		}
	}
	if len(o.Claims) > 0 {
		var rows [][]string
		var notes []string
		for i, c := range o.Claims {
			n := w.first[o.Cell] + i
			rows = append(rows, []string{strconv.Itoa(n), mdInline(c.Name), mdInline(c.Kind), mdInline(c.Method),
				codeSpan(c.Residual), VerdictLabel(c)})
			if s := claimDetails(n, c); s != "" {
				notes = append(notes, s)
			}
		}
		paras = append(paras, mdTable([]string{"#", "claim", "kind", "method", "residual", "verdict"}, rows))
		if len(notes) > 0 {
			paras = append(paras, strings.Join(notes, "\n"))
		}
	}
	for i, f := range o.Figures {
		switch {
		case w.marks != nil:
			w.marks.figures = append(w.marks.figures, f)
			paras = append(paras, w.marks.token("figure"+strconv.Itoa(len(w.marks.figures)-1)))
		case w.r.FigureBase != "":
			n := w.figure[o.Cell] + i
			name := strings.Join(strings.Fields(f.Name), " ")
			caption := fmt.Sprintf("Figure %d", n)
			if name != "" {
				caption += ": " + mdInline(name)
			}
			paras = append(paras, "!["+mdInline(name)+"]("+linkPath(filepath.Base(figurePath(w.r.FigureBase, n)))+")",
				"*"+caption+"*")
		default:
			paras = append(paras, "*Figure: "+mdInline(f.Name)+"* (an SVG drawing, shown in the HTML report)")
		}
	}
	if e := o.Error; e != nil {
		at := "**error**"
		if e.Line > 0 {
			at = fmt.Sprintf("**error** at line %d", e.Line)
		}
		msg := strings.TrimRight(strings.ReplaceAll(message(*e), "\r\n", "\n"), "\n")
		if strings.Contains(msg, "\n") {
			f := fenceFor(msg)
			paras = append(paras, at+":\n\n"+f+"\n"+msg+"\n"+f)
		} else {
			paras = append(paras, at+": "+mdInline(msg))
		}
	}
	name := fmt.Sprintf("Cell %d", b.Index)
	if b.Options.ID != "" {
		name += " (" + mdInline(b.Options.ID) + ")"
	}
	switch o.Status {
	case NotRun:
		paras = append(paras, name+" was not run: an earlier cell stopped with an error.")
	case Failed:
		paras = append(paras, name+" stopped with an error after "+seconds(o.Seconds)+".")
	default:
		paras = append(paras, name+" ran in "+seconds(o.Seconds)+".")
	}
	return strings.Join(paras, "\n\n") + "\n"
}

// FigureFile is a figure of a report as a file beside the Markdown report.
type FigureFile struct {
	Path string // FigureBase + ".fig" + N + ".svg"
	SVG  []byte
}

// FigureFiles lists the report's figures as files, in report order, the
// N-th (counting from 1 over the whole report) at FigureBase.figN.svg: the
// files the Markdown report links to. It returns nil when FigureBase is
// empty.
func FigureFiles(r *Report) []FigureFile {
	if r.FigureBase == "" {
		return nil
	}
	var out []FigureFile
	for _, o := range r.Outcomes {
		for _, f := range o.Figures {
			out = append(out, FigureFile{Path: figurePath(r.FigureBase, len(out)+1), SVG: []byte(f.SVG)})
		}
	}
	return out
}

func figurePath(base string, n int) string { return base + ".fig" + strconv.Itoa(n) + ".svg" }

// linkPath writes a file name as a Markdown link destination: percent-
// encoded where needed, so spaces, parentheses and entities cannot end or
// change it.
func linkPath(name string) string {
	return strings.ReplaceAll(url.PathEscape(name), "&", "%26")
}

// claimDetails is a list item with what a claim's table row leaves out.
func claimDetails(n int, c Claim) string {
	var facts []string
	if c.Samples > 0 {
		facts = append(facts, fmt.Sprintf("%d samples (seed %d)", c.Samples, c.Seed))
	}
	if c.Worst != "" {
		at := "largest residual at "
		if c.Kind == "inequality" {
			at = "smallest slack at "
		}
		facts = append(facts, at+codeSpan(c.Worst))
	}
	if c.Precision > 0 {
		facts = append(facts, fmt.Sprintf("%d-bit precision", c.Precision))
	}
	if f := c.Float; f != nil {
		facts = append(facts, fmt.Sprintf("float64 alone: residual %s, error %s, %.1f digits lost",
			codeSpan(f.Residual), codeSpan(f.Error), f.DigitsLost))
	}
	note := strings.TrimSpace(c.Note)
	if note == "" && len(facts) == 0 {
		return ""
	}
	s := fmt.Sprintf("- claim %d (%s):", n, mdInline(c.Name))
	if note != "" {
		s += " " + mdInline(note)
	}
	if len(facts) > 0 {
		if note != "" {
			s += " —"
		}
		s += " " + strings.Join(facts, "; ")
	}
	return s
}

// mdTable is a Markdown table of already escaped cells.
func mdTable(header []string, rows [][]string) string {
	cols := len(header)
	for _, r := range rows {
		cols = max(cols, len(r))
	}
	if cols == 0 {
		return ""
	}
	var b strings.Builder
	row := func(cells []string) {
		b.WriteString("|")
		for i := 0; i < cols; i++ {
			c := ""
			if i < len(cells) {
				c = cells[i]
			}
			b.WriteString(" " + c + " |")
		}
		b.WriteString("\n")
	}
	row(header)
	b.WriteString("|" + strings.Repeat(" --- |", cols) + "\n")
	for _, r := range rows {
		row(r)
	}
	return strings.TrimSuffix(b.String(), "\n")
}

var mdEscaper = func() *strings.Replacer {
	pairs := []string{"\r\n", "<br>", "\n", "<br>", "\r", ""}
	for _, c := range "\\`*_[]<>|&~^$" {
		pairs = append(pairs, string(c), `\`+string(c))
	}
	return strings.NewReplacer(pairs...)
}()

// mdInline escapes text for use inline in Markdown, table cells included:
// Markdown punctuation is backslash-escaped and line breaks become <br>.
func mdInline(s string) string { return mdEscaper.Replace(s) }

// codeSpan shows s as inline code, or as escaped text when it holds a "|"
// (which tables cannot take inside code).
func codeSpan(s string) string {
	s = strings.TrimSpace(strings.NewReplacer("\r\n", " ", "\n", " ", "\r", " ").Replace(s))
	if s == "" || strings.Contains(s, "|") {
		return mdInline(s)
	}
	d := strings.Repeat("`", longestRun(s, '`')+1)
	if strings.HasPrefix(s, "`") || strings.HasSuffix(s, "`") {
		return d + " " + s + " " + d
	}
	return d + s + d
}

// fenceFor is a backtick fence longer than any backtick run in s.
func fenceFor(s string) string {
	return strings.Repeat("`", max(3, longestRun(s, '`')+1))
}

func longestRun(s string, c byte) int {
	best, n := 0, 0
	for i := 0; i < len(s); i++ {
		if s[i] == c {
			n++
			best = max(best, n)
		} else {
			n = 0
		}
	}
	return best
}

// truncate shortens s to at most n runes on one line, ending in "…" if cut.
func truncate(s string, n int) string {
	s = strings.Join(strings.Fields(s), " ")
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

// seconds formats a duration in seconds.
func seconds(s float64) string { return fmt.Sprintf("%.3f s", s) }

// countsPhrase is e.g. "3 holds, 1 holds to digits, 0 fails, 0 undecided".
func countsPhrase(c map[Verdict]int) string {
	return fmt.Sprintf("%d holds, %d holds to digits, %d fails, %d undecided",
		c[Holds], c[HoldsToDigits], c[Fails], c[Undecided])
}

// message is a problem's message without a leading "line N: " that repeats
// its line (as in an *Error's Error()).
func message(p Problem) string {
	return strings.TrimPrefix(p.Message, fmt.Sprintf("line %d: ", p.Line))
}

// problemText is an error as one line: "line 12: ..." or "cell 2, line 57: ...".
func problemText(p Problem) string {
	p.Message = message(p)
	var where []string
	if p.Cell > 0 {
		where = append(where, fmt.Sprintf("cell %d", p.Cell))
	}
	if p.Line > 0 {
		where = append(where, fmt.Sprintf("line %d", p.Line))
	}
	if len(where) == 0 {
		return p.Message
	}
	return strings.Join(where, ", ") + ": " + p.Message
}

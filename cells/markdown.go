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
// "✔ holds", "≈ holds to 40 digits", "~ estimated to 12 digits", "✘ fails"
// or "? undecided". An estimate's "~" differs from the certified "≈" on
// purpose; an estimate without digits (a blow-up) is "~ estimated".
func VerdictLabel(c Claim) string {
	switch c.Verdict {
	case Holds:
		return "✔ holds"
	case HoldsToDigits:
		return fmt.Sprintf("≈ holds to %d digits", c.Digits)
	case Estimated:
		if c.Digits > 0 {
			return fmt.Sprintf("~ estimated to %d digits", c.Digits)
		}
		return "~ estimated"
	case HoldsWhere:
		return "✔ holds on the zero set"
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
	return renderMarkdown(r, header, nil).b.Bytes()
}

// mdWriter writes one Markdown report. With marks set it writes the variant
// that RenderHTML converts: regions, verdicts and figures carry placeholder
// tokens, cells are written anew from their text, line ends are "\n", and
// cuts mark where each block of the report begins, so that RenderHTML can
// convert each on its own.
type mdWriter struct {
	b       bytes.Buffer
	r       *Report
	nb      *Notebook
	eol     string
	marks   *htmlMarks
	cuts    []cut
	outcome map[int]*Outcome
	first   map[int]int // cell -> number of its first claim
	figure  map[int]int // cell -> number of its first figure
}

// segKind is what a stretch of the report is.
type segKind int

const (
	segProse  segKind = iota // the notebook's text
	segCell                  // a cell
	segOutput                // a cell's output block
	segRegion                // a generated region
)

// cut is where a stretch of the report begins.
type cut struct {
	at   int
	kind segKind
}

// begin starts a stretch of the given kind at the end of what is written.
func (w *mdWriter) begin(k segKind) { w.cuts = append(w.cuts, cut{w.b.Len(), k}) }

func renderMarkdown(r *Report, header bool, marks *htmlMarks) *mdWriter {
	w := &mdWriter{r: r, nb: r.Notebook, marks: marks, outcome: map[int]*Outcome{}, first: map[int]int{}, figure: map[int]int{}}
	if w.nb == nil {
		w.nb = &Notebook{}
	}
	w.eol = lineEnd(w.nb)
	if marks != nil {
		w.eol = "\n"
	}
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
				w.prose(text[:k])
				w.newline()
				w.region("header", w.headerContent())
				w.prose(text[k:])
				blocks, header = blocks[1:], false
			}
		}
		if header {
			w.region("header", w.headerContent())
		}
	}
	for _, b := range blocks {
		if b.Kind == Prose {
			w.prose(b.Text)
		} else {
			w.cell(b)
		}
	}
	return w
}

// prose writes the notebook's text verbatim, as the report must read back
// as the notebook; in the HTML variant, with its line ends made "\n" and
// its control characters escaped.
func (w *mdWriter) prose(text string) {
	w.begin(segProse)
	if w.marks != nil {
		text = visible(strings.ReplaceAll(strings.ReplaceAll(text, "\r\n", "\n"), "\r", "\n"))
	}
	w.b.WriteString(text)
}

// lineEnd is the notebook's line end: that of its first line, "\n" when
// it has none.
func lineEnd(nb *Notebook) string {
	texts := []string{string(nb.Source)}
	for _, b := range nb.Blocks {
		texts = append(texts, b.Raw, b.Text)
	}
	for _, t := range texts {
		if i := strings.IndexAny(t, "\r\n"); i >= 0 {
			switch {
			case t[i] == '\n':
				return "\n"
			case i+1 < len(t) && t[i+1] == '\n':
				return "\r\n"
			}
			return "\r"
		}
	}
	return "\n"
}

// afterHeading returns the offset just past text's first line when that
// line, leading blank lines aside, is a level-1 heading; else 0.
func afterHeading(text string) int {
	pos := 0
	for _, l := range splitLines(text) {
		pos += len(l.raw)
		if strings.TrimSpace(l.text) != "" {
			if headingText(l.text) != "" {
				return pos
			}
			return 0
		}
	}
	return 0
}

// newline ends the current line if it is not ended.
func (w *mdWriter) newline() {
	switch n := w.b.Len(); {
	case n == 0 || w.b.Bytes()[n-1] == '\n':
	case w.b.Bytes()[n-1] == '\r' && w.eol == "\r\n":
		w.b.WriteByte('\n') // complete the CRLF the text began
	case w.b.Bytes()[n-1] == '\r' && w.eol == "\r":
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
// "\n"), its opening marker carrying the hash of its lines. kind is
// "header" or "cell", used by the HTML variant.
func (w *mdWriter) region(kind, content string) {
	w.newline()
	w.begin(segRegion)
	lines := strings.SplitAfter(content, "\n")
	for i, l := range lines {
		if t := strings.TrimRight(l, "\r\n"); isOpen(t) || isClose(t) {
			lines[i] = `\` + strings.TrimLeft(l, " ") // keep the region closed
		}
	}
	content = strings.Join(lines, "")
	if w.marks != nil {
		w.gen("\n" + w.marks.token(kind) + "\n\n" + content + "\n" + w.marks.token("end") + "\n\n")
		return
	}
	body := "\n" + content + "\n"
	var texts []string
	for _, l := range splitLines(body) {
		texts = append(texts, l.text)
	}
	w.gen(openMarker(texts) + "\n" + body + GeneratedEnd + "\n")
}

// cell writes a cell verbatim, then its output and generated region. The
// HTML variant writes the cell anew from its text, so that it converts to
// one code block whatever the notebook's fence looked like.
func (w *mdWriter) cell(b Block) {
	w.newline()
	w.begin(segCell)
	if b.Raw != "" && w.marks == nil {
		w.b.WriteString(b.Raw)
	} else {
		text := b.Text
		if w.marks != nil {
			text = visible(text)
		}
		if text != "" && !strings.HasSuffix(text, "\n") {
			text += "\n"
		}
		f, info := b.Fence, b.Info
		if f == "" || w.marks != nil {
			f = fenceFor(text)
		}
		if w.marks != nil {
			info = "cell"
		}
		w.gen(f + info + "\n" + text + f + "\n")
	}
	o := w.outcome[b.Index]
	if o == nil {
		return
	}
	w.newline()
	if o.Status != NotRun {
		w.begin(segOutput)
		out := visible(strings.ReplaceAll(o.Output, "\r\n", "\n"))
		if out != "" && !strings.HasSuffix(out, "\n") {
			out += "\n"
		}
		f := fenceFor(out)
		w.gen(f + "output\n" + out + f + "\n")
	}
	w.region("cell", w.cellContent(b, o))
}

// verdict is a claim's verdict label as a table cell; the HTML variant
// marks it with a token, so that only assay's verdicts are styled as such.
func (w *mdWriter) verdict(c Claim) string {
	label := VerdictLabel(c)
	if w.marks == nil {
		return label
	}
	if class := verdictClass[c.Verdict]; class != "" {
		return w.marks.verdict(class) + " " + label
	}
	return label
}

// residual is a claim's residual for its table cell: its text as code, cut
// to limit runes when limit > 0; in the HTML variant, when the claim
// carries the residual's LaTeX and the text is not cut, a placeholder for
// its MathML instead (RenderHTML puts it in; LaTeX outside the subset
// keeps the text).
func (w *mdWriter) residual(c Claim, limit int) string {
	text := visible(c.Residual)
	if limit > 0 {
		cut := truncate(text, limit)
		if cut != strings.Join(strings.Fields(text), " ") {
			return codeSpan(cut)
		}
		text = cut
	}
	if w.marks != nil && c.ResidualTeX != "" {
		if m, err := MathML(c.ResidualTeX, false); err == nil {
			w.marks.maths = append(w.marks.maths, m)
			return w.marks.token("math" + strconv.Itoa(len(w.marks.maths)-1))
		}
	}
	return codeSpan(text)
}

// headerContent is the summary at the top of a report.
func (w *mdWriter) headerContent() string {
	r := w.r
	claims := allClaims(r)
	errs := allErrors(r)
	warns := allWarnings(r)
	facts := []string{
		"- notebook: " + codeSpan(visible(w.nb.Path)),
		"- SHA-256: " + codeSpan(r.SHA256),
		"- assay version: " + mdInline(visible(r.Version)),
	}
	if id := runText(r.Run); id != "" {
		facts = append(facts, runPrefix+codeSpan(id))
	}
	facts = append(facts,
		fmt.Sprintf("- seed: %d", r.Seed),
		fmt.Sprintf("- precision: %d bits", r.Precision),
		fmt.Sprintf("- claims: %d — %s", len(claims), countsPhrase(Counts(r))),
		fmt.Sprintf("- errors: %d", len(errs)))
	if len(warns) > 0 {
		facts = append(facts, fmt.Sprintf("- warnings: %d", len(warns)))
	}
	paras := []string{
		"**assay report: " + mdInline(visible(w.nb.Title)) + "**",
		strings.Join(facts, "\n"),
		"Total time: " + seconds(r.Seconds) + ".",
	}
	if len(errs) > 0 {
		var ls []string
		for _, e := range errs {
			ls = append(ls, "- "+mdInline(truncate(visible(problemText(e)), 160)))
		}
		paras = append(paras, "**Errors**\n\n"+strings.Join(ls, "\n"))
	}
	if len(warns) > 0 {
		var ls []string
		for _, e := range warns {
			ls = append(ls, "- "+mdInline(truncate(visible(problemText(e)), 240)))
		}
		paras = append(paras, "**Warnings**\n\n"+strings.Join(ls, "\n"))
	}
	if len(claims) > 0 {
		var rows [][]string
		for i, c := range claims {
			rows = append(rows, []string{strconv.Itoa(i + 1), mdText(c.Name), mdInline(visible(c.Kind)), mdInline(visible(c.Method)),
				w.residual(c, 60), w.verdict(c), fmt.Sprintf("cell %d, line %d", c.Cell, c.Line)})
		}
		paras = append(paras, "**Claims**\n\n"+mdTable([]string{"#", "claim", "kind", "method", "residual", "verdict", "where"}, rows))
	}
	var lossy [][]string
	for i, c := range claims {
		if f := c.Float; f != nil && f.DigitsLost > float64DigitsHalf {
			lossy = append(lossy, []string{strconv.Itoa(i + 1), mdText(c.Name), floatResidual(f), sideLoss(f.LHS, true), sideLoss(f.RHS, true)})
		}
	}
	if len(lossy) > 0 {
		paras = append(paras, "**Where float64 loses more than half its digits**\n\n"+
			"The same claim run as float64 code (every exact input rounded to float64, gonum for linear algebra), "+
			"against the exact or certified values: digits lost of 16 per side, and in brackets what the float64 evaluation loses by itself "+
			"(formula) and what rounding the inputs loses by itself (inputs: the exact formula at the rounded inputs, the problem's condition):\n\n"+
			mdTable([]string{"#", "claim", "float64 residual", "lhs digits lost", "rhs digits lost"}, lossy))
	}
	if l := legend(claims); l != "" {
		paras = append(paras, l)
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
				out[i] = mdText(c)
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
			rows = append(rows, []string{strconv.Itoa(n), mdText(c.Name), mdInline(visible(c.Kind)), mdInline(visible(c.Method)),
				w.residual(c, 0), w.verdict(c)})
			if s := claimDetails(n, c); s != "" {
				notes = append(notes, s)
			}
		}
		paras = append(paras, mdTable([]string{"#", "claim", "kind", "method", "residual", "verdict"}, rows))
		if len(notes) > 0 {
			paras = append(paras, strings.Join(notes, "\n"))
		}
		if l := legend(o.Claims); l != "" {
			paras = append(paras, l)
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
				caption += ": " + mdText(name)
			}
			paras = append(paras, "!["+mdText(name)+"]("+linkPath(filepath.Base(figurePath(w.r.FigureBase, n)))+")",
				"*"+caption+"*")
		default:
			paras = append(paras, "*Figure: "+mdText(f.Name)+"* (an SVG drawing, shown in the HTML report)")
		}
	}
	if e := o.Error; e != nil {
		at := "**error**"
		if e.Line > 0 {
			at = fmt.Sprintf("**error** at line %d", e.Line)
		}
		msg := strings.TrimRight(visible(strings.ReplaceAll(message(*e), "\r\n", "\n")), "\n")
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
		if w.r.Until > 0 && b.Index > w.r.Until {
			paras = append(paras, name+fmt.Sprintf(" was not run: the run stopped after cell %d, as --until asked.", w.r.Until))
			break
		}
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
			at = "shown sample: " // which one, the note says (ranked by relative or absolute slack)
		}
		facts = append(facts, at+codeSpan(visible(c.Worst)))
	}
	if c.Precision > 0 {
		facts = append(facts, fmt.Sprintf("%d-bit precision", c.Precision))
	}
	if f := c.Float; f != nil {
		facts = append(facts, floatFacts(f))
	}
	note := strings.TrimSpace(visible(c.Note))
	if note == "" && len(facts) == 0 {
		return ""
	}
	s := fmt.Sprintf("- claim %d (%s):", n, mdText(c.Name))
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

// mdText is notebook text (a claim's name, a table cell, a figure's name)
// inline in Markdown: control characters escaped, text that could pass for
// a verdict quoted, Markdown punctuation escaped.
func mdText(s string) string { return mdInline(shown(s)) }

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

// countsPhrase is e.g. "3 holds, 1 holds to digits, 1 estimated, 0 fails,
// 0 undecided".
func countsPhrase(c map[Verdict]int) string {
	where := ""
	if c[HoldsWhere] > 0 { // named only where present, so other reports keep their header
		where = fmt.Sprintf(", %d holds on the zero set", c[HoldsWhere])
	}
	return fmt.Sprintf("%d holds%s, %d holds to digits, %d estimated, %d fails, %d undecided",
		c[Holds], where, c[HoldsToDigits], c[Estimated], c[Fails], c[Undecided])
}

// legend explains the verdicts among claims that say less than a proof or
// a refutation, one paragraph each, in a fixed order; "? undecided" once
// for each reason present. It is empty when there is nothing to explain.
func legend(claims []Claim) string {
	has := map[Verdict]bool{}
	why := map[Reason]bool{}
	limitFails := false
	for _, c := range claims {
		has[c.Verdict] = true
		if c.Verdict == Undecided {
			why[c.Why] = true
		}
		// A limit decided by series expansion fails by proof, not by extrapolation.
		limitFails = limitFails || c.Verdict == Fails && (c.Kind == "limit" || c.Kind == "asymptotic") && c.Method != "series expansion"
	}
	var paras []string
	if has[HoldsWhere] {
		paras = append(paras, "“✔ holds on the zero set” is a proof that lhs = rhs at every complex point, so at every real "+
			"point, where all the hypotheses vanish (and, with nonzero=, where none of those conditions vanishes); "+
			"its certificate writes a power of lhs − rhs (or its product with a power of the conditions) as a combination "+
			"of the hypotheses. lhs − rhs itself is not in the hypotheses' ideal: the identity does not follow from "+
			"them by substitution alone.")
	}
	if has[HoldsToDigits] {
		paras = append(paras, "“≈ holds to N digits” is evidence, not a proof: where it was checked, the two sides "+
			"were certified to agree to N significant digits (|lhs − rhs| < 10^-N·max(|lhs|, |rhs|)), or, where "+
			"neither side could be told from 0, to lie both within 10^-N of 0; that does not show that they are equal.")
	}
	if has[Estimated] {
		paras = append(paras, "“~ estimated to N digits” is an extrapolation, not a certified bound: the limit was "+
			"extrapolated from finitely many values along two walks toward the target, and N is how far their "+
			"successive estimates agree; a quantity that changes its behaviour beyond the last step can fool it. "+
			"“~ estimated” without digits is a blow-up estimated in the same way.")
	}
	if limitFails {
		paras = append(paras, "“✘ fails” on a limit rests on extrapolation too: the estimated limit lies far "+
			"outside its error estimate from the value expect= states (or the estimated order far from order=, or "+
			"the values run off where a value was expected); strong evidence, not a certified refutation.")
	}
	for _, r := range reasonOrder {
		if why[r] {
			paras = append(paras, "“? undecided” ("+reasonText[r])
		}
	}
	return strings.Join(paras, "\n\n")
}

// reasonOrder is the order of the undecided reasons in a legend; "" is a
// claim that gives none.
var reasonOrder = []Reason{PrecisionCap, EqualWithin, NoConvergence, WalksDisagree, SampleRaised, NoSampleMet, OtherReason, ""}

// reasonText completes the legend's "“? undecided” (" for each reason.
var reasonText = map[Reason]string{
	PrecisionCap: "precision cap): the precision cap was reached before the residual could be certified zero or " +
		"non-zero; raise --max-precision or ask for fewer digits.",
	EqualWithin: "equal to within 10^-N): an inequality whose two sides agree to N significant digits (or are " +
		"both within 10^-N of 0), so its slack could not be separated from 0 and its sign is unknown; an " +
		"inequality at equality needs the equality proved (exactly, or raise digits= if the sides may differ).",
	NoConvergence: "no convergence seen): the values along the walk did not settle, so no limit was estimated; " +
		"the claim's note says what the walk showed.",
	WalksDisagree: "the walks disagree): walks toward the target at two ratios whose logarithms are not in a ratio of " +
		"small integers gave different answers, as when a quantity oscillates on a lattice of scales that one walk " +
		"alone cannot see; both walks' tables are shown.",
	SampleRaised: "a sample raised): evaluating the claim raised an exception on a sample, and a claim with " +
		"samples it could not evaluate cannot hold.",
	NoSampleMet: "no sample met the hypothesis): none of the samples satisfied given=, so nothing was checked.",
	OtherReason: "other): the claim could not be settled either way; its note says why.",
	"":          "no reason given): the claim could not be settled either way; its note says why.",
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

// floatFacts says what the float64 audit found, side by side: each side's
// error and digits lost, split into the formula's share and the inputs'.
func floatFacts(f *FloatAudit) string {
	head := "float64 alone"
	if f.Sample != nil {
		head += fmt.Sprintf(" (at sample %d, where it lost most)", *f.Sample)
	}
	if f.Raised != "" || f.LHS == nil || f.RHS == nil {
		return head + ": raised " + floatResidual(f)
	}
	side := func(name string, s *SideAudit) string {
		if s.Error == exactLoss {
			return name + " exact"
		}
		return fmt.Sprintf("%s error %s relative, %s", name, codeSpan(visible(s.Error)), sideLoss(s, false))
	}
	return head + ": residual " + floatResidual(f) + "; " + side("lhs", f.LHS) + "; " + side("rhs", f.RHS)
}

// exactLoss is the printed error of a float64 side equal to the exact one.
const exactLoss = "0.00e+00"

// floatResidual is the float64 residual, or what the float64 code raised.
func floatResidual(f *FloatAudit) string {
	if f.Raised != "" {
		return codeSpan(visible(f.Raised))
	}
	return codeSpan(visible(f.Residual))
}

// sideLoss is a side's digits lost and their split, in a sentence ("7.6
// digits lost (0.3 in the formula, 7.3 to input rounding)") or in a table
// cell ("7.6 (0.3 formula, 7.3 inputs)").
func sideLoss(s *SideAudit, cell bool) string {
	switch {
	case s == nil:
		return "no value"
	case s.Error == exactLoss:
		return "exact"
	case s.DigitsLost == 0 && cell:
		return "none"
	case s.DigitsLost == 0:
		return "no digits lost"
	}
	total, formula, inputs := "%.1f digits lost", " (%.1f in the formula, %.1f to input rounding)", " (not split: %s)"
	if cell {
		total, formula, inputs = "%.1f", " (%.1f formula, %.1f inputs)", " (not split: %s)"
	}
	out := fmt.Sprintf(total, s.DigitsLost)
	switch {
	case s.Input != nil && s.Formula != nil:
		out += fmt.Sprintf(formula, s.Formula.DigitsLost, s.Input.DigitsLost)
	case s.Unsplit != "":
		out += fmt.Sprintf(inputs, mdInline(visible(s.Unsplit)))
	}
	return out
}

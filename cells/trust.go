package cells

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"html"
	"io"
	"strings"
	"unicode/utf8"
)

// This file holds what keeps a report's verdicts assay's own: the hash in
// a generated region's opening marker, the run identifier, and the
// escaping of notebook text so that it cannot pass for a verdict or move
// a terminal's cursor.

// parseMarker reads a region marker line: an HTML comment whose first word
// is assay:generated (with the region's hash) or /assay:generated. hash is
// set only for the exact form assay writes.
func parseMarker(s string) (open, close bool, hash string) {
	t := strings.TrimSpace(s)
	if len(t) < len("<!---->") || !strings.HasPrefix(t, "<!--") || !strings.HasSuffix(t, "-->") {
		return false, false, ""
	}
	f := strings.Fields(t[len("<!--") : len(t)-len("-->")])
	if len(f) == 0 {
		return false, false, ""
	}
	switch f[0] {
	case "assay:generated":
		if len(f) == 2 {
			hash, _ = strings.CutPrefix(f[1], "sha256:")
		}
		return true, false, hash
	case "/assay:generated":
		return false, len(f) == 1, ""
	}
	return false, false, ""
}

// isOpen reports whether a line opens a generated region, trusted or not.
func isOpen(s string) bool { open, _, _ := parseMarker(s); return open }

// isClose reports whether a line closes a generated region.
func isClose(s string) bool { _, c, _ := parseMarker(s); return c }

// markerHash is the hash an opening marker carries, or "".
func markerHash(s string) string { _, _, h := parseMarker(s); return h }

// openMarker is the opening line assay writes for a region of these lines.
func openMarker(lines []string) string {
	return "<!-- assay:generated sha256:" + regionHash(lines) + " -->"
}

// timeFigure is a time a report states, such as "0.012 s": masked in the
// hash, so that a rerun which changes only times keeps its markers.
var timeFigure = lazyRegexp(`[0-9]+\.[0-9]+ s\b`)

// MaskTimes replaces each time a report states ("0.012 s") with "T s":
// what is left changes only when the findings do.
func MaskTimes(s string) string { return timeFigure().ReplaceAllString(s, "T s") }

// runPrefix starts the header line that states the run identifier.
const runPrefix = "- run: "

// regionHash is the first 16 hex digits of the SHA-256 of a region's lines,
// each ended by "\n", with time figures and the run line masked.
func regionHash(lines []string) string {
	h := sha256.New()
	for _, l := range lines {
		if strings.HasPrefix(l, runPrefix) {
			l = runPrefix
		}
		io.WriteString(h, MaskTimes(l)+"\n")
	}
	return hex.EncodeToString(h.Sum(nil))[:16]
}

// runText is a run identifier as the reports state it: letters, digits
// and . _ : + - only, at most 64 of them; other characters are left out.
func runText(id string) string {
	var b strings.Builder
	for _, r := range id {
		if b.Len() == 64 {
			break
		}
		if r < utf8.RuneSelf && (r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9' || strings.ContainsRune("._:+-", r)) {
			b.WriteRune(r)
		}
	}
	return b.String()
}

var runMeta = lazyRegexp(`<meta name="assay-run" content="([^"<>]*)">`)

// RunID reads back the run identifier (Report.Run, as runText keeps it)
// that RenderMarkdown states in a report's header and RenderHTML in a
// <meta name="assay-run"> tag, from the bytes of either report; "" when
// there is none. A Markdown report's identifier is read only from its
// first generated region, and only when that region's hash matches, so
// that notebook text cannot supply one. Comparing the identifiers of a
// Markdown report and the HTML report beside it tells a pair written by
// one run from a stale pair.
func RunID(data []byte) string {
	s := string(data)
	if strings.HasPrefix(strings.TrimSpace(s), "<!DOCTYPE html>") {
		if m := runMeta().FindStringSubmatch(s); m != nil {
			return runText(html.UnescapeString(m[1]))
		}
		return ""
	}
	ls := splitLines(s)
	for i, l := range ls {
		if !isOpen(l.text) {
			continue
		}
		var texts []string
		for _, m := range ls[i+1:] {
			if isClose(m.text) {
				if markerHash(l.text) != regionHash(texts) {
					return ""
				}
				for _, t := range texts {
					if id, ok := strings.CutPrefix(t, runPrefix); ok {
						return runText(strings.Trim(id, "`"))
					}
				}
				return ""
			}
			texts = append(texts, m.text)
		}
		return ""
	}
	return ""
}

// visible writes the control characters of notebook text (C0 but newline
// and tab, DEL, C1) and the invisible marks that reorder text (bidi
// controls) as escapes such as \x1b, \r and \u202e, so that notebook text
// cannot colour, move or overwrite what a terminal or a report shows.
func visible(s string) string {
	clean := true
	for _, r := range s {
		if hidden(r) {
			clean = false
			break
		}
	}
	if clean {
		return s
	}
	var b strings.Builder
	for _, r := range s {
		switch {
		case !hidden(r):
			b.WriteRune(r)
		case r == '\r':
			b.WriteString(`\r`)
		case r < 0x100:
			fmt.Fprintf(&b, `\x%02x`, r)
		default:
			fmt.Fprintf(&b, `\u%04x`, r)
		}
	}
	return b.String()
}

// hidden reports whether a character of notebook text is to be escaped.
func hidden(r rune) bool {
	switch {
	case r == '\n' || r == '\t':
		return false
	case r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0):
		return true
	case r == 0x061c || r == 0x200e || r == 0x200f || (r >= 0x202a && r <= 0x202e) || (r >= 0x2066 && r <= 0x2069):
		return true
	}
	return false
}

// verdictMarks are the marks a verdict label begins with (VerdictLabel),
// and marks a reader takes for them.
const verdictMarks = "✔✓✅☑✘✗✖❌☒≈"

// passesForVerdict reports whether notebook text could be taken for a
// verdict label: it holds a verdict mark, or begins with "?" or "~" (the
// undecided and estimated labels' marks, too common inside text to quote
// everywhere: "R ~ c t^2").
func passesForVerdict(s string) bool {
	t := strings.TrimSpace(s)
	return strings.ContainsAny(s, verdictMarks) || strings.HasPrefix(t, "?") || strings.HasPrefix(t, "~")
}

// quoteVerdict puts notebook text that could pass for a verdict label in
// quotation marks, so that a claim named "✔ holds" or a table cell saying
// it reads as the text it is.
func quoteVerdict(s string) string {
	if passesForVerdict(s) {
		return "“" + s + "”"
	}
	return s
}

// shown is notebook text as a report or terminal shows it: control
// characters escaped and look-alikes of verdicts quoted.
func shown(s string) string { return quoteVerdict(visible(s)) }

package exact

import (
	"fmt"
	"strconv"
	"strings"
)

// String formats p in the canonical order with the ring's variable names,
// e.g. "2*a^2*b - 3/4*c + 1": coefficients 1 and -1 are left out before a
// monomial, rational coefficients are written n/d, and the zero polynomial
// is "0". Ring.Parse reads the text back to an equal polynomial.
func (p *Poly) String() string { return p.format(p.ring.Names()) }

// format is String with the given variable names. Each coefficient is
// written in lowest terms on its own; printing is not a hot path.
func (p *Poly) format(names []string) string {
	if p.IsZero() {
		return "0"
	}
	var sb strings.Builder
	for i := 0; i < p.n(); i++ {
		c := p.coefAt(i)
		neg := c.Sign() < 0
		c.Abs(c)
		writeSign(&sb, i, neg)
		m := p.monoAt(i)
		if !(c.IsInt() && c.Num().Cmp(bigOne) == 0) || m[0] == 0 {
			sb.WriteString(FormatRat(c))
			if m[0] == 0 {
				continue
			}
			sb.WriteByte('*')
		}
		writeMono(&sb, m, names)
	}
	return sb.String()
}

func writeMono(sb *strings.Builder, m []uint64, names []string) {
	first := true
	for v := 0; v < (len(m)-1)*perWord; v++ {
		e := monoExp(m, v)
		if e == 0 {
			continue
		}
		if !first {
			sb.WriteByte('*')
		}
		first = false
		if v < len(names) {
			sb.WriteString(names[v])
		} else {
			fmt.Fprintf(sb, "x%d", v)
		}
		if e > 1 {
			sb.WriteByte('^')
			sb.WriteString(strconv.Itoa(e))
		}
	}
}

// writeSign writes what comes before term i of a sum: "-" for a negative
// first term, " - " or " + " between terms.
func writeSign(sb *strings.Builder, i int, neg bool) {
	switch {
	case i == 0 && neg:
		sb.WriteByte('-')
	case i > 0 && neg:
		sb.WriteString(" - ")
	case i > 0:
		sb.WriteString(" + ")
	}
}

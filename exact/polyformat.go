package exact

import (
	"fmt"
	"math"
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
		switch {
		case i == 0 && neg:
			sb.WriteByte('-')
		case i > 0 && neg:
			sb.WriteString(" - ")
		case i > 0:
			sb.WriteString(" + ")
		}
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

// Float evaluates p in float64 arithmetic at vals, indexed by variable,
// term by term: each coefficient is rounded to float64, multiplied by the
// powers of the values and the products are summed in the canonical order.
// It is a quick numerical companion of Eval, not an exact value. vals must
// have an entry for every variable that occurs in p; Float panics
// otherwise.
func (p *Poly) Float(vals []float64) float64 {
	sum := 0.0
	for i := 0; i < p.n(); i++ {
		m := p.monoAt(i)
		t := p.coefFloat(i)
		for v := 0; v < p.nvars(); v++ {
			if e := monoExp(m, v); e > 0 {
				if v >= len(vals) {
					panic(fmt.Sprintf("exact: Float needs a value for variable %d, got %d values", v, len(vals)))
				}
				t *= math.Pow(vals[v], float64(e))
			}
		}
		sum += t
	}
	return sum
}

func (p *Poly) coefFloat(i int) float64 {
	if p.small(i) && p.den == nil {
		return float64(p.num[i])
	}
	f, _ := p.coefAt(i).Float64()
	return f
}

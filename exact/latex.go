package exact

// LaTeX for exact values, to paste into a paper: rationals as \frac,
// polynomials with implicit products and braced exponents, rational
// functions as one \frac, matrices as pmatrix, factorizations as products
// of parenthesised factors, and closed forms of algebraic reals with
// \sqrt and \sqrt[k].

import (
	"fmt"
	"math/big"
	"regexp"
	"strconv"
	"strings"
	"sync"
)

// LaTeXRat is r in LaTeX: "3", "-\frac{1}{2}" (the sign outside).
func LaTeXRat(r *big.Rat) string {
	if r.IsInt() {
		return r.Num().String()
	}
	sign := ""
	if r.Sign() < 0 {
		sign = "-"
	}
	return sign + `\frac{` + new(big.Int).Abs(r.Num()).String() + "}{" + r.Denom().String() + "}"
}

// LaTeX is p in LaTeX, in the order String uses: "2 a^{2} b - \frac{3}{4} c + 1".
func (p *Poly) LaTeX() string { return p.LaTeXTerms(p.Len()) }

// LaTeXTerms is the LaTeX of p's first n terms in the order String uses
// (all of p when n ≥ p.Len()), for a preview of a long polynomial.
func (p *Poly) LaTeXTerms(n int) string {
	if p.IsZero() {
		return "0"
	}
	names := p.ring.Names()
	var sb strings.Builder
	for i, t := range p.Terms() {
		if i == n {
			break
		}
		c := new(big.Rat).Set(t.Coef)
		writeSign(&sb, i, c.Sign() < 0)
		c.Abs(c)
		var mono []string
		for v, e := range t.Exps {
			if e == 0 {
				continue
			}
			name := fmt.Sprintf("x_{%d}", v)
			if v < len(names) {
				name = LaTeXName(names[v])
			}
			if e > 1 {
				name += "^{" + strconv.Itoa(e) + "}" // x_{1}^{2}: both scripts on x
			}
			mono = append(mono, name)
		}
		if len(mono) == 0 || c.Cmp(big.NewRat(1, 1)) != 0 {
			mono = append([]string{LaTeXRat(c)}, mono...)
		}
		sb.WriteString(strings.Join(mono, " "))
	}
	return sb.String()
}

var (
	nameIndexed = sync.OnceValue(func() *regexp.Regexp { return regexp.MustCompile(`^([A-Za-z]+?)_?([0-9]+)$`) }) // at first use: not every process's start
	greekNames  = map[string]bool{}
)

func init() {
	for _, g := range strings.Fields("alpha beta gamma delta epsilon zeta eta theta iota kappa lambda mu nu xi pi rho sigma tau upsilon phi chi psi omega Gamma Delta Theta Lambda Xi Pi Sigma Upsilon Phi Psi Omega") {
		greekNames[g] = true
	}
}

// LaTeXName is a variable's name in LaTeX: "x", "x_{1}" for x1 or x_1,
// "\alpha" for alpha, "\mathrm{area}" for a longer name.
func LaTeXName(name string) string {
	if m := nameIndexed().FindStringSubmatch(name); m != nil && (len(m[1]) == 1 || greekNames[m[1]]) {
		return LaTeXName(m[1]) + "_{" + m[2] + "}"
	}
	switch {
	case len(name) == 1:
		return name
	case greekNames[name]:
		return `\` + name
	}
	return `\mathrm{` + strings.ReplaceAll(name, "_", `\_`) + "}"
}

// LaTeX is f as one fraction, or as a polynomial when its denominator is 1.
func (f *RatFunc) LaTeX() string {
	if c, ok := f.den.Constant(); ok && c.Cmp(big.NewRat(1, 1)) == 0 {
		return f.num.LaTeX()
	}
	return `\frac{` + f.num.LaTeX() + "}{" + f.den.LaTeX() + "}"
}

// LaTeX is the factorization as a product: the unit (left out when it is 1,
// a sign when it is −1), then each factor, parenthesised when it has more
// than one term, with its multiplicity as an exponent:
// "-2 (x - 1)^{2} (x + 1)".
func (f *Factorization) LaTeX() string {
	if len(f.Factors) == 0 {
		return LaTeXRat(f.Unit)
	}
	var parts []string
	sign := ""
	switch u := LaTeXRat(f.Unit); u {
	case "1":
	case "-1":
		sign = "-"
	default:
		parts = append(parts, u)
	}
	for _, fp := range f.Factors {
		s := fp.Factor.LaTeX()
		if fp.Factor.Len() > 1 {
			s = `\left(` + s + `\right)`
		} else if fp.Mult > 1 && strings.Contains(s, " ") {
			s = `\left(` + s + `\right)` // 2 x squared is (2 x)^{2}
		}
		if fp.Mult > 1 {
			s += "^{" + strconv.Itoa(fp.Mult) + "}"
		}
		parts = append(parts, s)
	}
	return sign + strings.Join(parts, " ")
}

// LaTeXMatrix is a matrix as pmatrix, its entries given by at.
func LaTeXMatrix(rows, cols int, at func(i, j int) string) string {
	var sb strings.Builder
	sb.WriteString(`\begin{pmatrix}`)
	for i := 0; i < rows; i++ {
		if i > 0 {
			sb.WriteString(` \\`)
		}
		for j := 0; j < cols; j++ {
			if j > 0 {
				sb.WriteString(" &")
			}
			sb.WriteString(" " + at(i, j))
		}
	}
	sb.WriteString(` \end{pmatrix}`)
	return sb.String()
}

// ClosedFormLaTeX turns a closed form as ClosedForm prints it (integers,
// + - * / **, sqrt(a), root(a, k), parentheses) into LaTeX:
// "(1 + sqrt(5))/2" is "\frac{1 + \sqrt{5}}{2}".
func ClosedFormLaTeX(form string) (string, error) {
	c := &cfParser{src: form}
	n, err := c.sum()
	if err != nil {
		return "", err
	}
	if c.pos < len(c.src) {
		return "", fmt.Errorf("closed form %q: unexpected %q", form, c.src[c.pos:])
	}
	return n.tex, nil
}

// cfNode is a parsed piece of a closed form: its LaTeX and precedence
// (precSum, precProd, precAtom, as in real_closed.go).
type cfNode struct {
	tex  string
	prec int
	bare string // a parenthesised sum without its parentheses, for a \frac
}

// inFrac is n as the numerator or denominator of a \frac, which needs no
// parentheses.
func (n cfNode) inFrac() string {
	if n.bare != "" {
		return n.bare
	}
	return n.tex
}

type cfParser struct {
	src string
	pos int
}

func (c *cfParser) space() {
	for c.pos < len(c.src) && c.src[c.pos] == ' ' {
		c.pos++
	}
}

func (c *cfParser) take(s string) bool {
	c.space()
	if strings.HasPrefix(c.src[c.pos:], s) {
		c.pos += len(s)
		return true
	}
	return false
}

// sum := ["-"] product {("+"|"-") product}
func (c *cfParser) sum() (cfNode, error) {
	var sb strings.Builder
	if c.take("-") {
		sb.WriteString("-")
	}
	n, err := c.product()
	if err != nil {
		return n, err
	}
	sb.WriteString(n.tex)
	terms := 1
	for {
		switch {
		case c.take("+"):
			sb.WriteString(" + ")
		case c.take("-"):
			sb.WriteString(" - ")
		default:
			if terms == 1 && !strings.HasPrefix(sb.String(), "-") {
				return n, nil
			}
			return cfNode{tex: sb.String(), prec: precSum}, nil
		}
		if n, err = c.product(); err != nil {
			return n, err
		}
		sb.WriteString(n.tex)
		terms++
	}
}

// product := power {("*"|"/") power}; a quotient is a \frac.
func (c *cfParser) product() (cfNode, error) {
	n, err := c.power()
	if err != nil {
		return n, err
	}
	for {
		switch {
		case c.take("**"):
			return n, fmt.Errorf("closed form %q: unexpected **", c.src)
		case c.take("*"):
			m, err := c.power()
			if err != nil {
				return m, err
			}
			sep := " "
			if m.tex[0] >= '0' && m.tex[0] <= '9' {
				sep = ` \cdot `
			}
			n = cfNode{tex: n.tex + sep + m.tex, prec: precProd}
		case c.take("/"):
			m, err := c.power()
			if err != nil {
				return m, err
			}
			n = cfNode{tex: `\frac{` + n.inFrac() + "}{" + m.inFrac() + "}", prec: precAtom}
		default:
			return n, nil
		}
	}
}

// power := atom ["**" ["("] integer [")"]]
func (c *cfParser) power() (cfNode, error) {
	n, err := c.atom()
	if err != nil || !c.take("**") {
		return n, err
	}
	paren := c.take("(")
	k, err := c.integer()
	if err != nil {
		return n, err
	}
	if paren && !c.take(")") {
		return n, fmt.Errorf("closed form %q: missing )", c.src)
	}
	base := n.tex
	if n.prec < precAtom || strings.HasPrefix(base, `\frac`) || strings.HasPrefix(base, `\sqrt`) {
		base = `\left(` + base + `\right)`
	}
	return cfNode{tex: base + "^{" + k + "}", prec: precAtom}, nil
}

// atom := integer | "sqrt(" sum ")" | "root(" sum "," integer ")" | "(" sum ")"
func (c *cfParser) atom() (cfNode, error) {
	switch {
	case c.take("sqrt("):
		a, err := c.sum()
		if err != nil || !c.take(")") {
			return a, c.bad(err)
		}
		return cfNode{tex: `\sqrt{` + a.tex + "}", prec: precAtom}, nil
	case c.take("root("):
		a, err := c.sum()
		if err != nil || !c.take(",") {
			return a, c.bad(err)
		}
		k, err := c.integer()
		if err != nil || !c.take(")") {
			return a, c.bad(err)
		}
		return cfNode{tex: `\sqrt[` + k + "]{" + a.tex + "}", prec: precAtom}, nil
	case c.take("("):
		a, err := c.sum()
		if err != nil || !c.take(")") {
			return a, c.bad(err)
		}
		if a.prec == precAtom {
			return a, nil
		}
		return cfNode{`\left(` + a.tex + `\right)`, precAtom, a.tex}, nil
	}
	k, err := c.integer()
	return cfNode{tex: k, prec: precAtom}, err
}

func (c *cfParser) integer() (string, error) {
	c.space()
	start := c.pos
	if c.pos < len(c.src) && c.src[c.pos] == '-' {
		c.pos++
	}
	for c.pos < len(c.src) && c.src[c.pos] >= '0' && c.src[c.pos] <= '9' {
		c.pos++
	}
	if c.pos == start {
		return "", c.bad(nil)
	}
	return c.src[start:c.pos], nil
}

func (c *cfParser) bad(err error) error {
	if err != nil {
		return err
	}
	return fmt.Errorf("closed form %q: cannot read at %d", c.src, c.pos)
}

// LaTeXText is x as Text(n, maxPrec) prints it, in LaTeX, written so that
// no digit passes for more than it is:
//
//   - an exact decimal as it is: "0.5", "10^{-40}";
//   - a rounded value with its proved bound spelled out:
//     "4 \; (\text{within } 10^{-30})";
//   - certified digits, truncated toward zero, followed by \ldots, always
//     with a decimal point (scientific when the digits reach the units
//     place): "1.4142135623\ldots", "-2.7182818\ldots \cdot 10^{-5}",
//     "1.2345\ldots \cdot 10^{25}". |x| then lies between the digits
//     written and the same digits with the last raised by one.
//
// Its errors are Text's.
func (x *Real) LaTeXText(n int, maxPrec uint) (string, error) {
	n = max(n, 1)
	text, truncated, err := x.text(n, maxPrec)
	if err != nil {
		return "", err
	}
	if !truncated {
		return decimalLaTeX(text), nil
	}
	m, e, sci := strings.Cut(text, "e")
	if !sci && !strings.Contains(m, ".") {
		// "123450000" has no point to put the dots after, and its
		// trailing zeros may stand for digits not computed: scientific.
		sign, d := "", m
		if strings.HasPrefix(m, "-") {
			sign, d = "-", m[1:]
		}
		e = strconv.Itoa(len(d) - 1)
		m = sign + d[:1]
		if rest := d[1:min(n, len(d))]; rest != "" {
			m += "." + rest
		}
	}
	out := m + `\ldots`
	if e = strings.TrimPrefix(e, "+"); e != "" && e != "0" {
		out += ` \cdot 10^{` + e + "}"
	}
	return out, nil
}

// decimalLaTeX turns a decimal Text printed exactly or with its bound
// ("1.5e-40", "4 (within 1e-30)") into LaTeX: "1.5 \cdot 10^{-40}",
// "4 \; (\text{within } 10^{-30})".
func decimalLaTeX(text string) string {
	num, within, ok := strings.Cut(text, " (within ")
	out := sciLaTeX(num)
	if ok {
		out += `\; (\text{within } ` + sciLaTeX(strings.TrimSuffix(within, ")")) + ")"
	}
	return out
}

func sciLaTeX(s string) string {
	m, e, ok := strings.Cut(s, "e")
	if !ok {
		return s
	}
	e = strings.TrimPrefix(e, "+")
	if m == "1" {
		return "10^{" + e + "}"
	}
	return m + ` \cdot 10^{` + e + "}"
}

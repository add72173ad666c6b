package exact

import (
	"errors"
	"fmt"
	"math/big"
	"math/rand"
	"regexp"
	"strings"
	"testing"
	"unicode"
)

func TestClosedFormKnown(t *testing.T) {
	phi := RealQuo(RealAdd(rtR("1"), rtSqrt("5")), rtR("2"))
	for _, c := range []struct {
		x    *Real
		want string
	}{
		// The examples of issue 15.
		{rtSqrt("128999/144"), "sqrt(128999)/12"},
		{phi, "(1 + sqrt(5))/2"},
		{RealMul(rtR("2"), rtRoot("3", 3)), "2*root(3, 3)"},
		// Square factors taken out, denominators rationalized (any
		// algebra text): √8 = 2√2, √(1/3) = √3/3, ∛(−16/27) = −2∛2/3.
		{rtSqrt("8"), "2*sqrt(2)"},
		{rtSqrt("1/3"), "sqrt(3)/3"},
		{rtRoot("-16/27", 3), "-2*root(2, 3)/3"},
		// φ² = φ + 1 = (3 + √5)/2 and 1/φ = φ − 1 (from memory).
		{RealPowInt(phi, 2), "(3 + sqrt(5))/2"},
		{RealPowInt(phi, -1), "(sqrt(5) - 1)/2"},
		// √2·√3 = √6, √2·√2 = 2, ⁶√4·∛2 = ∛4.
		{RealMul(rtSqrt("2"), rtSqrt("3")), "sqrt(6)"},
		{RealMul(rtSqrt("2"), rtSqrt("2")), "2"},
		{RealMul(rtRoot("4", 6), rtRoot("2", 3)), "root(4, 3)"},
		// 1/(√2 + √3) = √3 − √2 (conjugates, textbook).
		{RealQuo(rtR("1"), RealAdd(rtSqrt("2"), rtSqrt("3"))), "sqrt(3) - sqrt(2)"},
		// Ramanujan's two sides, as built.
		{RealSqrt(RealSub(rtRoot("5", 3), rtRoot("4", 3))), "sqrt(root(5, 3) - root(4, 3))"},
		{RealQuo(RealSub(RealAdd(rtRoot("2", 3), rtRoot("20", 3)), rtRoot("25", 3)), rtR("3")), "(root(2, 3) + root(20, 3) - root(25, 3))/3"},
		// A power of a root folded back: (√(2 + √3))² = 2 + √3.
		{RealPowInt(RealSqrt(RealAdd(rtR("2"), rtSqrt("3"))), 2), "2 + sqrt(3)"},
		{RealSub(rtR("1"), RealSqrt(RealAdd(rtR("2"), rtSqrt("3")))), "1 - sqrt(2 + sqrt(3))"},
		{RealAdd(RealSqrt(RealAdd(rtR("2"), rtSqrt("3"))), RealNeg(RealAdd(rtR("3/4"), rtSqrt("2")))), "sqrt(2 + sqrt(3)) - (3 + 4*sqrt(2))/4"},
	} {
		got, ok := c.x.ClosedForm(ClosedFormMaxLen)
		if !ok || got != c.want {
			t.Errorf("got %q, %v; want %q", got, ok, c.want)
		}
	}
	for _, x := range []*Real{
		Pi(),
		RealAdd(rtSqrt("2"), RealExp(rtR("1"))),
		// Long integers: the digits say more.
		RealSub(RealSqrt(RealAdd(rtPow10R(80), rtR("1"))), rtPow10R(40)),
		// Division by an exact zero has no value to print.
		RealQuo(rtR("1"), RealSub(RealMul(rtSqrt("2"), rtSqrt("3")), rtSqrt("6"))),
		RealQuo(RealSqrt(RealAdd(rtR("2"), rtSqrt("3"))), RealSub(RealMul(rtSqrt("2"), rtSqrt("3")), rtSqrt("6"))),
	} {
		if s, ok := x.ClosedForm(ClosedFormMaxLen); ok {
			t.Errorf("closed form %q, want none", s)
		}
	}
}

// Every closed form must be exactly the value: parsed back by a parser of
// the test's own (Python's precedence: ** over unary minus over * and /
// over + and −, left to right) and proved equal by the zero bound.
func TestClosedFormParsesBackEqual(t *testing.T) {
	rng := rand.New(rand.NewSource(1515))
	printed, nested, byPoly, beyond := 0, 0, 0, 0
	for i := 0; i < 400; i++ {
		x := randomAlgebraic(rng, 3)
		if i%3 == 0 {
			// A root of a sum, which no collecting removes.
			x = RealAdd(x, RealSqrt(rtR(fmt.Sprint(2+rng.Intn(9)))))
			if s, err := x.Sign(DefaultMaxPrecision); err == nil && s < 0 {
				x = RealNeg(x)
			}
			x = RealMul(RealSqrt(x), randomAlgebraic(rng, 1))
		}
		s, ok := x.ClosedForm(300)
		if !ok {
			continue
		}
		printed++
		if nestedRoot.MatchString(s) || strings.Contains(s, "**") {
			nested++
		}
		y, err := parseClosed(s)
		if err != nil {
			t.Errorf("%q: %v", s, err)
			continue
		}
		c, err := RealCmp(x, y, 1<<15)
		if errors.Is(err, ErrUndecided) {
			// The zero bound asks for too many bits (high roots): the
			// minimal polynomial of the difference, t, proves it zero.
			byPoly++
			p, perr := RealSub(x, y).MinimalPolynomial(0, DefaultMaxPrecision)
			switch {
			case perr == nil && sameInts(p, ints(0, 1)):
				c, err = 0, nil
			case errors.Is(perr, ErrDegreeCap):
				// Both routes out of reach (a 27th root inside): counted,
				// and there may be only a few.
				beyond++
				continue
			}
		}
		if c != 0 || err != nil {
			t.Errorf("%q is not the value: compare %d, %v", s, c, err)
		}
	}
	if printed < 300 || nested < 80 || byPoly > printed/4 || beyond > 3 {
		t.Errorf("only %d closed forms, %d nested; %d proved by the minimal polynomial, %d beyond both routes", printed, nested, byPoly, beyond)
	}
}

// nestedRoot finds a root inside a root's argument.
var nestedRoot = regexp.MustCompile(`(sqrt|root)\([^)]*(sqrt|root)\(`)

// parseClosed reads the cell-language subset closed forms use.
func parseClosed(s string) (*Real, error) {
	p := &closedParser{s: strings.ReplaceAll(s, " ", "")}
	x, err := p.sum()
	if err == nil && p.i != len(p.s) {
		err = fmt.Errorf("trailing %q", p.s[p.i:])
	}
	return x, err
}

type closedParser struct {
	s string
	i int
}

func (p *closedParser) eat(tok string) bool {
	if strings.HasPrefix(p.s[p.i:], tok) {
		p.i += len(tok)
		return true
	}
	return false
}

// binaryOp is an operator token of one precedence level and what it does.
type binaryOp struct {
	tok string
	f   func(x, y *Real) *Real
}

// level reads operands of the next level joined left to right by ops.
func (p *closedParser) level(next func() (*Real, error), ops []binaryOp) (*Real, error) {
	x, err := next()
	for err == nil {
		if strings.HasPrefix(p.s[p.i:], "**") {
			return x, nil // for unary's caller
		}
		found := false
		for _, op := range ops {
			if p.eat(op.tok) {
				var y *Real
				if y, err = next(); err == nil {
					x = op.f(x, y)
				}
				found = true
				break
			}
		}
		if !found {
			return x, nil
		}
	}
	return nil, err
}

func (p *closedParser) sum() (*Real, error) {
	return p.level(p.product, []binaryOp{{"+", RealAdd}, {"-", RealSub}})
}

func (p *closedParser) product() (*Real, error) {
	return p.level(p.unary, []binaryOp{{"*", RealMul}, {"/", RealQuo}})
}

func (p *closedParser) unary() (*Real, error) {
	if p.eat("-") {
		x, err := p.unary()
		if err != nil {
			return nil, err
		}
		return RealNeg(x), nil
	}
	x, err := p.atom()
	if err != nil || !p.eat("**") {
		return x, err
	}
	e, err := p.unary()
	if err != nil {
		return nil, err
	}
	n, ok := e.Rat()
	if !ok || !n.IsInt() {
		return nil, fmt.Errorf("exponent not an integer at %d", p.i)
	}
	return RealPowInt(x, int(n.Num().Int64())), nil
}

func (p *closedParser) atom() (*Real, error) {
	switch {
	case p.eat("sqrt("):
		x, err := p.sum()
		if err != nil || !p.eat(")") {
			return nil, fmt.Errorf("bad sqrt at %d: %v", p.i, err)
		}
		return RealSqrt(x), nil
	case p.eat("root("):
		x, err := p.sum()
		if err != nil || !p.eat(",") {
			return nil, fmt.Errorf("bad root at %d: %v", p.i, err)
		}
		k, err := p.sum()
		if err != nil || !p.eat(")") {
			return nil, fmt.Errorf("bad root index at %d: %v", p.i, err)
		}
		n, ok := k.Rat()
		if !ok || !n.IsInt() {
			return nil, fmt.Errorf("root index not an integer")
		}
		return RealRoot(x, int(n.Num().Int64())), nil
	case p.eat("("):
		x, err := p.sum()
		if err != nil || !p.eat(")") {
			return nil, fmt.Errorf("unclosed ( at %d: %v", p.i, err)
		}
		return x, nil
	}
	j := p.i
	for j < len(p.s) && unicode.IsDigit(rune(p.s[j])) {
		j++
	}
	if j == p.i {
		return nil, fmt.Errorf("unexpected %q at %d", p.s[p.i:], p.i)
	}
	n, _ := new(big.Int).SetString(p.s[p.i:j], 10)
	p.i = j
	return RealFromRat(new(big.Rat).SetInt(n)), nil
}

// BenchmarkClosedForm: Ramanujan's right side, (∛2 + ∛20 − ∛25)/3, and
// 1/(√2 + √3 + √5) rationalized, fresh nodes each time.
func BenchmarkClosedForm(b *testing.B) {
	for i := 0; i < b.N; i++ {
		x := RealQuo(RealSub(RealAdd(rtRoot("2", 3), rtRoot("20", 3)), rtRoot("25", 3)), rtR("3"))
		y := RealQuo(rtR("1"), RealAdd(RealAdd(rtSqrt("2"), rtSqrt("3")), rtSqrt("5")))
		if _, ok := x.ClosedForm(ClosedFormMaxLen); !ok {
			b.Fatal("no closed form")
		}
		if _, ok := y.ClosedForm(ClosedFormMaxLen); !ok {
			b.Fatal("no closed form")
		}
	}
}

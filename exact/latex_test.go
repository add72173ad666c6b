package exact

import (
	"math/big"
	"strings"
	"testing"
)

// Closed forms as ClosedForm prints them, turned into LaTeX written by
// hand (Lamport's \frac, \sqrt, \sqrt[n]); the golden ratio, √2/2 and ∛2
// from memory.
func TestClosedFormLaTeX(t *testing.T) {
	for form, want := range map[string]string{
		"(1 + sqrt(5))/2":     `\frac{1 + \sqrt{5}}{2}`,
		"sqrt(2)/2":           `\frac{\sqrt{2}}{2}`,
		"-root(3, 3)":         `-\sqrt[3]{3}`,
		"2*root(3, 3)":        `2 \sqrt[3]{3}`,
		"sqrt(5) - 1":         `\sqrt{5} - 1`,
		"3/4":                 `\frac{3}{4}`,
		"(1 + sqrt(2))**3":    `\left(1 + \sqrt{2}\right)^{3}`,
		"sqrt(2)**(-1)":       `\left(\sqrt{2}\right)^{-1}`,
		"sqrt(1 + sqrt(2))*3": `\sqrt{1 + \sqrt{2}} \cdot 3`,
	} {
		if got, err := ClosedFormLaTeX(form); err != nil || got != want {
			t.Errorf("ClosedFormLaTeX(%q) = %q, %v; want %q", form, got, err, want)
		}
	}
	for _, bad := range []string{"sqrt(2", "x", "1 +", "root(2)"} {
		if got, err := ClosedFormLaTeX(bad); err == nil {
			t.Errorf("ClosedFormLaTeX(%q) = %q, want an error", bad, got)
		}
	}
}

// Reals in LaTeX mark how their digits were obtained: truncated digits
// end in \ldots (the usual mark of a decimal expansion cut short, as in
// 3.14159…, common practice), exact decimals and bounded values do not.
// Digits of √2 (OEIS A002193), e (A001113) and π (A000796) from memory;
// sqrt(2)·sqrt(8) = 4 is Text's own example of a value on a truncation
// boundary.
func TestLaTeXText(t *testing.T) {
	e := RealExp(RealFromInt(1))
	pow10 := func(k int64) *Real {
		p := new(big.Int).Exp(big.NewInt(10), big.NewInt(abs64(k)), nil)
		if k < 0 {
			return RealFromRat(new(big.Rat).SetFrac(big.NewInt(1), p))
		}
		return RealFromRat(new(big.Rat).SetInt(p))
	}
	for _, c := range []struct {
		x    *Real
		n    int
		want string
	}{
		{RealSqrt(RealFromInt(2)), 10, `1.414213562\ldots`},
		{RealNeg(e), 10, `-2.718281828\ldots`},
		{RealMul(e, pow10(-5)), 8, `2.7182818\ldots \cdot 10^{-5}`},
		{RealMul(e, pow10(-4)), 8, `0.00027182818\ldots`},
		{RealMul(RealAtan(RealFromInt(1)), RealFromInt(4*1000000)), 10, `3141592.653\ldots`},
		{RealMul(e, pow10(9)), 10, `2.718281828\ldots \cdot 10^{9}`},
		{RealMul(e, pow10(30)), 5, `2.7182\ldots \cdot 10^{30}`},
		{RealMul(e, pow10(2)), 1, `2\ldots \cdot 10^{2}`},
		{RealFromRat(big.NewRat(1, 2)), 10, "0.5"},
		{RealFromRat(big.NewRat(-13, 4)), 10, "-3.25"},
		{RealFromRat(big.NewRat(1, 3)), 5, `0.33333\ldots`}, // an exact rational, cut short
		{RealMul(RealSqrt(RealFromInt(2)), RealSqrt(RealFromInt(8))), 10, `4.000000000\; (\text{within } 10^{`},
		// √2·√2 − 2 = 0, which Digits proves by the zero bound: no \ldots.
		{RealSub(RealMul(RealSqrt(RealFromInt(2)), RealSqrt(RealFromInt(2))), RealFromInt(2)), 10, "0"},
	} {
		got, err := c.x.LaTeXText(c.n, 4096)
		if err != nil || !strings.HasPrefix(got, c.want) || !strings.HasSuffix(c.want, "{") && got != c.want {
			t.Errorf("LaTeXText(%d) = %q, %v; want %q", c.n, got, err, c.want)
		}
	}
}

// Exact and bounded decimals as Real.Text prints them (its doc comment's
// examples).
func TestDecimalLaTeX(t *testing.T) {
	for text, want := range map[string]string{
		"1.4142135623":     "1.4142135623",
		"1e-40":            "10^{-40}",
		"-3.25e+21":        `-3.25 \cdot 10^{21}`,
		"4 (within 1e-30)": `4\; (\text{within } 10^{-30})`,
	} {
		if got := decimalLaTeX(text); got != want {
			t.Errorf("decimalLaTeX(%q) = %q, want %q", text, got, want)
		}
	}
}

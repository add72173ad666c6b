package exact

// Printing a Real for people: certified digits when they settle, and
// otherwise a rounded decimal with a bound that is proved to hold.

import (
	"errors"
	"math"
	"math/big"
)

// Text renders x in at most n significant digits (n < 1 counts as 1) for
// printing, in the format of Digits (positional for 1e-4 ≤ |x| < 1e21,
// scientific otherwise), and everything it states is proved:
//
//   - an x known to be a rational whose decimal expansion ends within n
//     significant digits is written exactly, without trailing zeros:
//     "0.5", "1e-40", "12300", "-3.25";
//   - otherwise the n digits of Digits (truncated, every one certified)
//     when the enclosures up to maxPrec settle them;
//   - otherwise (x on or too near a truncation boundary, such as
//     sqrt(2)·sqrt(8) = 4, which is not known to be rational) x rounded to
//     n significant digits, d, then " (within b)", b a power of ten written
//     in the same format: |x − d| < b holds at every point of the enclosure
//     at maxPrec bits, so b covers the rounding as well as the enclosure's
//     width. Fewer digits are written when the enclosure is wider than the
//     unit of the n-th; an enclosure that contains 0 is written
//     "0 (within b)".
//
// The errors are those of that enclosure: ErrUndecided (wrapped) when
// maxPrec does not give one (an argument not separated from a domain
// boundary), and the certain ErrDomain, ErrDivisionByZero, ErrOverflow.
func (x *Real) Text(n int, maxPrec uint) (string, error) {
	s, _, err := x.text(n, maxPrec)
	return s, err
}

// text is Text, and whether it wrote Digits' truncated digits (rather
// than an exact decimal, a proved zero or a value with its bound).
func (x *Real) text(n int, maxPrec uint) (s string, truncated bool, err error) {
	n = max(n, 1)
	if x.exact != nil {
		if s, ok := shortDecimal(x.exact, n); ok {
			return s, false, nil
		}
	}
	s, err = x.Digits(n, maxPrec)
	if err == nil || !errors.Is(err, ErrUndecided) {
		return s, err == nil && s != "0", err
	}
	// Digits stopped at maxPrec, so this enclosure is the cached one.
	iv, err := x.Enclose(maxPrec)
	if err != nil {
		return "", false, err
	}
	return boundedText(iv, n), false, nil
}

// shortDecimal writes q exactly when it has at most n significant decimal
// digits, in the format of formatDigits without trailing zeros.
func shortDecimal(q *big.Rat, n int) (string, bool) {
	if q.Sign() == 0 {
		return "0", true
	}
	num := new(big.Int).Abs(q.Num())
	t, e := decimalTrunc(num, 0, q.Denom(), n)
	if new(big.Rat).Abs(q).Cmp(decimalValue(t, e, n)) != 0 {
		return "", false
	}
	ten, r := big.NewInt(10), new(big.Int)
	for n > 1 {
		if new(big.Int).QuoRem(t, ten, r); r.Sign() != 0 {
			break
		}
		t.Quo(t, ten)
		n--
	}
	return formatDigits(q.Sign() < 0, t, e, n), true
}

// boundedText is Text's rounded form of a value known only to lie in iv.
func boundedText(iv Interval, n int) string {
	if iv.Lo.Sign() <= 0 && iv.Hi.Sign() >= 0 {
		// The sign is not settled: 0 is the one honest centre.
		b := new(big.Rat).Neg(iv.Lo)
		if iv.Hi.Cmp(b) > 0 {
			b = iv.Hi
		}
		return "0" + within(b)
	}
	neg := iv.Hi.Sign() < 0
	a, b := iv.Lo, iv.Hi // 0 < a ≤ b, the enclosure of |x|
	if neg {
		a, b = new(big.Rat).Neg(iv.Hi), new(big.Rat).Neg(iv.Lo)
	}
	mid := new(big.Rat).Add(a, b)
	mid.Quo(mid, big.NewRat(2, 1))
	width := new(big.Rat).Sub(b, a)
	_, e := decimalTrunc(mid.Num(), 0, mid.Denom(), n)
	// Digits finer than the enclosure's width would be noise.
	for n > 1 && decimalValue(big.NewInt(1), e, n).Cmp(width) < 0 {
		n--
	}
	t, e := decimalTrunc(mid.Num(), 0, mid.Denom(), n)
	unit := decimalValue(big.NewInt(1), e, n)
	rest := new(big.Rat).Sub(mid, decimalValue(t, e, n))
	if rest.Mul(rest, big.NewRat(2, 1)).Cmp(unit) >= 0 {
		t.Add(t, big.NewInt(1))
		if len(t.String()) > n { // 99…9 rounded up to 100…0
			t.Quo(t, big.NewInt(10))
			e++
		}
	}
	d := decimalValue(t, e, n)
	// |x − d| is largest at an end of the enclosure.
	dev := new(big.Rat).Sub(b, d)
	if lower := new(big.Rat).Sub(d, a); lower.Cmp(dev) > 0 {
		dev = lower
	}
	return formatSignificant(neg, t, e, n) + within(dev)
}

// decimalValue is the number whose n significant digits are t, the first
// at decimal exponent e: t·10^(e−n+1).
func decimalValue(t *big.Int, e, n int) *big.Rat {
	return new(big.Rat).Mul(new(big.Rat).SetInt(t), pow10(e-n+1))
}

// pow10 is 10^k as a rational.
func pow10(k int) *big.Rat {
	p := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(abs(k))), nil)
	if k < 0 {
		return new(big.Rat).SetFrac(big.NewInt(1), p)
	}
	return new(big.Rat).SetInt(p)
}

// within writes " (within 10^k)" for the least k with 10^k > dev ≥ 0, or
// nothing when dev = 0 (the printed value is then x itself).
func within(dev *big.Rat) string {
	if dev.Sign() == 0 {
		return ""
	}
	l := (log2Int(dev.Num()) - log2Int(dev.Denom())) * math.Log10(2)
	k := int(math.Floor(l)) + 1 // a guess, corrected exactly below
	for pow10(k).Cmp(dev) <= 0 {
		k++
	}
	for pow10(k-1).Cmp(dev) > 0 {
		k--
	}
	return " (within " + formatDigits(false, big.NewInt(1), k, 1) + ")"
}

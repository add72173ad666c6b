package exact

import (
	"fmt"
	"math"
	"math/big"
	"strings"

	"assay/exact/bigmul"
)

// Digits returns the first n significant decimal digits of x (n < 1 counts
// as 1), every one certified: the string is the truncation toward zero of
// x to n significant digits, and the enclosure that produced it proves
// that no digit can change. Numbers with 1e-4 ≤ |x| < 1e21 are written in
// positional form ("1.41421356237309504880", "0.00031415", "12300" when x
// has more integer digits than n: those positions are written as zeros),
// others in scientific form ("-2.7182818e-5", "6.0221e+23"). An x known to
// be the rational zero (or enclosed in [0, 0]), or an algebraic x proved
// zero by its zero bound (ZeroBound), is written "0".
//
// Rationals known exactly (Rat) are truncated exactly. Otherwise the
// working precision starts near n·log2(10) bits and doubles up to maxPrec.
// A value so close to a truncation boundary that the enclosures at maxPrec
// still straddle it, such as sqrt(2)·sqrt(2) (exactly 2, but not known to
// be rational, so it could be 1.999… or 2.000…), gives ErrUndecided; so
// does a value whose sign is not settled (x = 0 not known exactly).
func (x *Real) Digits(n int, maxPrec uint) (string, error) {
	if n < 1 {
		n = 1
	}
	if x.exact != nil {
		if x.exact.Sign() == 0 {
			return "0", nil
		}
		num := new(big.Int).Abs(x.exact.Num())
		t, e := decimalTrunc(num, 0, x.exact.Denom(), n)
		return formatSignificant(x.exact.Sign() < 0, t, e, n), nil
	}
	start := uint(math.Ceil(float64(n)*math.Log2(10))) + 32
	bound, alg := x.ZeroBound()
	var out string
	err := x.refine(start, maxPrec, fmt.Sprintf("%d certified digits", n), func(v ival, p uint) bool {
		if v.isZero() || alg && v.containsZero() && belowBound(v, bound) {
			out = "0"
			return true
		}
		if v.containsZero() {
			return false
		}
		// Cheap pre-check: an enclosure wider than about 10^-n relative
		// cannot fix n digits, so skip the exact decimal conversion.
		if w := ivWidth(v); w.Sign() != 0 {
			rel := w.MantExp(nil) - ivMagLower(v).MantExp(nil)
			if float64(rel) > 4-float64(n)*math.Log2(10) {
				return false
			}
		}
		neg := v.negative()
		a, b := v.lo, v.hi
		if neg {
			a, b = new(big.Float).Neg(v.hi), new(big.Float).Neg(v.lo)
		}
		d, e, ok := floatTruncPair(a, b, n)
		if !ok {
			return false
		}
		out = writeDigits(neg, d, e, n, sciForm(e, n))
		return true
	})
	if err != nil {
		return "", err
	}
	return out, nil
}

// floatTrunc is decimalTrunc for a Float f > 0.
func floatTrunc(f *big.Float, n int) (*big.Int, int) {
	e := f.MantExp(nil)
	prec := int(f.Prec())
	m, _ := new(big.Float).SetMantExp(f, prec-e).Int(nil) // exact: f has prec bits
	return decimalTrunc(m, e-prec, big.NewInt(1), n)
}

// floatTruncPair returns the digit string d and exponent e of
// floatTrunc(a) for 0 < a ≤ b, and whether floatTrunc(b) is the same. It
// is floatTrunc twice at the cost of about one: with a = A·2^-s, b = B·2^-s
// and 10^k = 5^k·2^k, a·10^k = A·5^k/2^(s−k) has integer part t and
// remainder R/2^(s−k), and b·10^k = t + (R + (B−A)·5^k)/2^(s−k), so b
// truncates to the same t exactly when R + (B−A)·5^k < 2^(s−k); B − A is
// short when a and b are close, so that test costs a small multiple of a
// linear pass. The digit count of t (n, or e was misjudged by one) is read
// off its decimal string, which is needed anyway. Shapes outside the fast
// case (k < 0 or s < k) take floatTrunc twice.
func floatTruncPair(a, b *big.Float, n int) (string, int, bool) {
	s := max(int(a.Prec())-a.MantExp(nil), int(b.Prec())-b.MantExp(nil))
	A, _ := new(big.Float).SetMantExp(a, s).Int(nil) // exact: s covers every bit
	B, _ := new(big.Float).SetMantExp(b, s).Int(nil)
	e := int(math.Floor((log2Int(A) - float64(s)) * math.Log10(2)))
	for range 3 {
		k := n - 1 - e
		if k < 0 || s < k {
			break
		}
		f5 := intPow(big.NewInt(5), k)
		sh := uint(s - k)
		p := bigmul.Mul(new(big.Int), A, f5)
		t := new(big.Int).Rsh(p, sh)
		d := t.String()
		switch {
		case len(d) > n:
			e++
			continue
		case len(d) < n || d[0] == '0':
			e--
			continue
		}
		r := p.Sub(p, new(big.Int).Lsh(t, sh)) // R
		r.Add(r, bigmul.Mul(f5, new(big.Int).Sub(B, A), f5))
		return d, e, r.BitLen() <= int(sh)
	}
	t1, e1 := floatTrunc(a, n)
	t2, e2 := floatTrunc(b, n)
	return t1.String(), e1, e1 == e2 && t1.Cmp(t2) == 0
}

// log2Int approximates log2(x) for x > 0.
func log2Int(x *big.Int) float64 {
	l := x.BitLen()
	shift := l - 60
	if shift < 0 {
		shift = 0
	}
	top := new(big.Int).Rsh(x, uint(shift)).Uint64()
	return math.Log2(float64(top)) + float64(shift)
}

// decimalTrunc returns t and e with 10^(n-1) ≤ t < 10^n and
// t·10^(e−n+1) ≤ v < (t+1)·10^(e−n+1) for v = num·2^s/den > 0: t holds the
// first n significant digits of v, truncated, and e is the decimal
// exponent of the first.
func decimalTrunc(num *big.Int, s int, den *big.Int, n int) (*big.Int, int) {
	l10 := (log2Int(num) + float64(s) - log2Int(den)) * math.Log10(2)
	e := int(math.Floor(l10))
	ten := big.NewInt(10)
	lowT := new(big.Int).Exp(ten, big.NewInt(int64(n-1)), nil)
	highT := new(big.Int).Mul(lowT, ten)
	for {
		k := n - 1 - e
		nn := new(big.Int).Set(num)
		dd := new(big.Int).Set(den)
		if k >= 0 {
			nn.Mul(nn, new(big.Int).Exp(ten, big.NewInt(int64(k)), nil))
		} else {
			dd.Mul(dd, new(big.Int).Exp(ten, big.NewInt(int64(-k)), nil))
		}
		var t *big.Int
		switch {
		case s >= 0:
			nn.Lsh(nn, uint(s))
			t = nn.Quo(nn, dd)
		case dd.Cmp(big.NewInt(1)) == 0:
			t = nn.Rsh(nn, uint(-s))
		default:
			dd.Lsh(dd, uint(-s))
			t = nn.Quo(nn, dd)
		}
		switch {
		case t.Cmp(lowT) < 0:
			e--
		case t.Cmp(highT) >= 0:
			e++
		default:
			return t, e
		}
	}
}

// formatDigits writes the n digits of t with the leading digit at decimal
// exponent e, padding an integer part longer than n with zeros: right for
// a value whose digits beyond the n-th are known to be zeros.
func formatDigits(neg bool, t *big.Int, e, n int) string {
	return writeDigits(neg, t.String(), e, n, e < -4 || e >= 21)
}

// formatSignificant writes n significant digits as formatDigits does, but
// in scientific form where the integer part has more than n digits: the
// digits beyond the n-th are not known, and zeros there would read as an
// exact integer (199999999999999999990 for 199999999999999999999.998).
func formatSignificant(neg bool, t *big.Int, e, n int) string {
	return writeDigits(neg, t.String(), e, n, sciForm(e, n))
}

// sciForm reports when formatSignificant writes scientific form.
func sciForm(e, n int) bool { return e < -4 || e >= 21 || e >= n }

// writeDigits writes the n digits d, leading digit at decimal exponent
// e, in scientific form or positionally.
func writeDigits(neg bool, d string, e, n int, scientific bool) string {
	var sb strings.Builder
	if neg {
		sb.WriteByte('-')
	}
	switch {
	case scientific:
		sb.WriteString(d[:1])
		if n > 1 {
			sb.WriteByte('.')
			sb.WriteString(d[1:])
		}
		if e < 0 {
			fmt.Fprintf(&sb, "e-%d", -e)
		} else {
			fmt.Fprintf(&sb, "e+%d", e)
		}
	case e >= 0:
		if n <= e+1 {
			sb.WriteString(d)
			sb.WriteString(strings.Repeat("0", e+1-n))
		} else {
			sb.WriteString(d[:e+1])
			sb.WriteByte('.')
			sb.WriteString(d[e+1:])
		}
	default:
		sb.WriteString("0.")
		sb.WriteString(strings.Repeat("0", -e-1))
		sb.WriteString(d)
	}
	return sb.String()
}

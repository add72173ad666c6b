package exact

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"
	"strconv"
	"strings"
)

// maxExponent bounds the decimal exponent accepted by ParseRat, so that a
// short input such as "1e999999999" cannot demand a gigantic power of ten.
const maxExponent = 100000

// ParseRat parses an exact rational number. Surrounding white space is
// ignored. Two forms are accepted:
//
//	[+-]digits/digits                    e.g. "3/4", "-3/4" (positive denominator)
//	[+-]digits[.digits][(e|E)[+-]digits] e.g. "7", "-1.0005", "2e-7", "1.5E+3"
//
// Decimals are read exactly ("0.1" is 1/10). Anything else (hex, "inf",
// "nan", ".5", "1/2/3", "3/-4", ...) is rejected with ErrSyntax; a zero
// denominator gives ErrDivisionByZero. Error messages quote the input.
func ParseRat(s string) (*big.Rat, error) {
	bad := func(why string) error {
		return fmt.Errorf("parse %q: %s: %w", s, why, ErrSyntax)
	}
	t := strings.TrimSpace(s)
	if t == "" {
		return nil, bad("empty")
	}
	neg := false
	if t[0] == '+' || t[0] == '-' {
		neg = t[0] == '-'
		t = t[1:]
	}
	if num, den, ok := strings.Cut(t, "/"); ok {
		if !isDigits(num) || !isDigits(den) {
			return nil, bad("want integer/positive integer")
		}
		n, _ := new(big.Int).SetString(num, 10)
		d, _ := new(big.Int).SetString(den, 10)
		if d.Sign() == 0 {
			return nil, fmt.Errorf("parse %q: %w", s, ErrDivisionByZero)
		}
		if neg {
			n.Neg(n)
		}
		return new(big.Rat).SetFrac(n, d), nil
	}
	intPart := leadingDigits(t)
	t = t[len(intPart):]
	if intPart == "" {
		return nil, bad("want digits")
	}
	frac := ""
	if strings.HasPrefix(t, ".") {
		frac = leadingDigits(t[1:])
		if frac == "" {
			return nil, bad("want digits after '.'")
		}
		t = t[1+len(frac):]
	}
	exp := 0
	if t != "" && (t[0] == 'e' || t[0] == 'E') {
		e := t[1:]
		if e != "" && (e[0] == '+' || e[0] == '-') {
			e = e[1:]
		}
		if !isDigits(e) {
			return nil, bad("want digits in exponent")
		}
		v, err := strconv.Atoi(t[1:])
		if err != nil || v > maxExponent || v < -maxExponent {
			return nil, bad(fmt.Sprintf("exponent out of range ±%d", maxExponent))
		}
		exp = v
		t = ""
	}
	if t != "" {
		return nil, bad(fmt.Sprintf("unexpected %q", t))
	}
	n, _ := new(big.Int).SetString(intPart+frac, 10)
	if neg {
		n.Neg(n)
	}
	scale := exp - len(frac)
	p := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(abs(scale))), nil)
	if scale >= 0 {
		return new(big.Rat).SetInt(n.Mul(n, p)), nil
	}
	return new(big.Rat).SetFrac(n, p), nil
}

func isDigits(s string) bool {
	return s != "" && len(leadingDigits(s)) == len(s)
}

func leadingDigits(s string) string {
	i := 0
	for i < len(s) && '0' <= s[i] && s[i] <= '9' {
		i++
	}
	return s[:i]
}

func abs(x int) int {
	if x < 0 {
		return -x
	}
	return x
}

// RatFromFloat returns the exact binary value of f: RatFromFloat(0.1) is
// 3602879701896397/36028797018963968, not 1/10. Negative zero gives 0.
// NaN and ±Inf give ErrNotFinite.
func RatFromFloat(f float64) (*big.Rat, error) {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return nil, fmt.Errorf("rational from float %v: %w", f, ErrNotFinite)
	}
	return new(big.Rat).SetFloat64(f), nil
}

// Quo returns a/b as a new value, or ErrDivisionByZero if b is zero. A
// divisor that is an integer of one word takes quoWord.
func Quo(a, b *big.Rat) (*big.Rat, error) {
	if b.Sign() == 0 {
		return nil, fmt.Errorf("%s / 0: %w", FormatRat(a), ErrDivisionByZero)
	}
	if z := quoWord(a, b); z != nil {
		return z, nil
	}
	return new(big.Rat).Quo(a, b), nil
}

// quoWord returns x/y for a non-zero integer y of one word (nil for any
// other y) with one word gcd: x is in lowest terms, so with g = gcd(num,
// |y|), num/g is coprime to den·|y|/g. big.Rat.Quo would reduce the
// whole product in math/big (a division by 288 in the Cayley–Menger
// volume was 8% of BenchmarkExactSampledIdentity).
func quoWord(x, y *big.Rat) *big.Rat {
	if !y.IsInt() || !y.Num().IsInt64() || bits.UintSize != 64 {
		return nil
	}
	w := y.Num().Int64()
	u := uint64(w)
	if w < 0 {
		u = -u
	}
	var r uint64 // |num| mod u, from the top word down
	xs := x.Num().Bits()
	for i := len(xs) - 1; i >= 0; i-- {
		_, r = bits.Div64(r, uint64(xs[i]), u)
	}
	g := gcdU64(u, r)
	z := new(big.Rat).SetInt64(1) // so that Denom is a reference
	num, den := z.Num(), z.Denom()
	num.Set(x.Num())
	if g != 1 {
		num.Quo(num, new(big.Int).SetUint64(g))
	}
	den.Mul(x.Denom(), new(big.Int).SetUint64(u/g))
	if w < 0 {
		num.Neg(num)
	}
	return z
}

// FormatRat formats r in lowest terms as "3/4", "-2" or "0": integers are
// written without a "/1" denominator. A nil r gives "<nil>".
func FormatRat(r *big.Rat) string {
	if r == nil {
		return "<nil>"
	}
	if r.IsInt() {
		return r.Num().String()
	}
	return r.String()
}

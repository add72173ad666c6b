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
	if b.IsInt() && b.Num().IsInt64() {
		if z := quoWord(a, b.Num().Int64()); z != nil {
			return z, nil
		}
	}
	return new(big.Rat).Quo(a, b), nil
}

// QuoInt returns a/w as a new value, or ErrDivisionByZero if w is zero:
// Quo for a divisor that is a machine integer, with no big.Rat made of it
// (a notebook's cayley_menger(t) / 288).
func QuoInt(a *big.Rat, w int64) (*big.Rat, error) {
	if w == 0 {
		return nil, fmt.Errorf("%s / 0: %w", FormatRat(a), ErrDivisionByZero)
	}
	if z := quoWord(a, w); z != nil {
		return z, nil
	}
	return new(big.Rat).Quo(a, new(big.Rat).SetInt64(w)), nil
}

// quoWord returns x/w for w != 0 (nil where a word is not 64 bits) with
// one word gcd: x = n/d is in lowest terms, so with g = gcd(|n|, |w|),
// n/g is coprime to d·|w|/g. big.Rat.Quo would reduce the whole product
// in math/big (a division by 288 in the Cayley–Menger volume was 8% of
// BenchmarkExactSampledIdentity). n/g and d·|w|/g are written word by
// word into one new block, so the result costs the Rat, that block and
// one word (Rat.Inv below); math/big's Quo and Mul took some nine
// allocations.
func quoWord(x *big.Rat, w int64) *big.Rat {
	if bits.UintSize != 64 {
		return nil
	}
	if x.Sign() == 0 {
		return new(big.Rat)
	}
	u := absU64(w)
	xs := x.Num().Bits()
	g := GCDWord(u, ModWord(xs, u))
	m := u / g // the factor the denominator takes
	ds := []big.Word{1}
	if !x.IsInt() {
		ds = x.Denom().Bits() // a reference: x's denominator is not 1
	}
	block := make([]big.Word, len(xs)+len(ds)+1)
	num, den := block[:len(xs):len(xs)], block[len(xs):]
	if g == 1 {
		copy(num, xs)
	} else {
		num = DivWord(num, xs, g) // exact: g divides n
	}
	den = MulWord(den[:0], ds, m) // within den's room: no allocation
	// A Rat's denominator can be set only through Denom's reference,
	// which a new Rat does not give: set the numerator to the
	// denominator, and invert.
	z := new(big.Rat)
	z.Num().SetBits(den)
	z.Inv(z)
	z.Num().SetBits(num)
	if (x.Sign() < 0) != (w < 0) {
		z.Num().Neg(z.Num())
	}
	return z
}

// MulWord sets z to the magnitude x (little-endian words) times the word
// m and returns it, one word longer when the product carries; z may be x,
// and it needs room for len(x) words (one more keeps the carry's word from
// allocating).
func MulWord(z, x []big.Word, m uint64) []big.Word {
	z = z[:len(x)]
	var carry uint64
	for i, w := range x {
		hi, lo := bits.Mul64(uint64(w), m)
		var c uint64
		lo, c = bits.Add64(lo, carry, 0)
		z[i], carry = big.Word(lo), hi+c
	}
	if carry != 0 {
		z = append(z, big.Word(carry))
	}
	return z
}

// ModWord returns the magnitude x (little-endian words) modulo the word
// m ≥ 1.
func ModWord(x []big.Word, m uint64) uint64 {
	var r uint64
	for i := len(x) - 1; i >= 0; i-- { // from the top word down
		_, r = bits.Div64(r, uint64(x[i]), m)
	}
	return r
}

// DivWord sets z to the magnitude x divided by the word m ≥ 1 (the
// remainder dropped) and returns it without leading zero words; z may be
// x, and it needs room for len(x) words.
func DivWord(z, x []big.Word, m uint64) []big.Word {
	z = z[:len(x)]
	var r uint64
	for i := len(x) - 1; i >= 0; i-- {
		var q uint64
		q, r = bits.Div64(r, uint64(x[i]), m)
		z[i] = big.Word(q)
	}
	for len(z) > 0 && z[len(z)-1] == 0 {
		z = z[:len(z)-1]
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

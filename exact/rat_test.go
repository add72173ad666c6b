package exact

import (
	"errors"
	"math"
	"math/big"
	"strconv"
	"strings"
	"testing"
)

// Expected values are worked out by hand from the decimal meaning of the
// input (e.g. 1.0005 = 10005/10^4 = 2001/2000).
func TestParseRatAccepts(t *testing.T) {
	tests := []struct{ in, want string }{
		{"3/4", "3/4"},
		{"-3/4", "-3/4"},
		{"+3/4", "3/4"},
		{"6/4", "3/2"},
		{"0/5", "0"},
		{"-0/5", "0"},
		{" 7 ", "7"},
		{"\t12\n", "12"},
		{"007", "7"},
		{"+5", "5"},
		{"1.0005", "2001/2000"},
		{"-1.0005", "-2001/2000"},
		{"0.1", "1/10"},
		{"2e-7", "1/5000000"},
		{"1.5E+3", "1500"},
		{"1.5e3", "1500"},
		{"1E0", "1"},
		{"-2.50e-1", "-1/4"},
		{"-0.0", "0"},
		{"0.000", "0"},
		{"123456789012345678901234567890", "123456789012345678901234567890"},
		{"1e30", "1000000000000000000000000000000"},
		{"3e0005", "300000"},
	}
	for _, tt := range tests {
		got, err := ParseRat(tt.in)
		if err != nil {
			t.Errorf("ParseRat(%q): %v", tt.in, err)
			continue
		}
		if FormatRat(got) != tt.want {
			t.Errorf("ParseRat(%q) = %s, want %s", tt.in, FormatRat(got), tt.want)
		}
	}
}

func TestParseRatRejects(t *testing.T) {
	tests := []struct {
		in   string
		want error
	}{
		{"", ErrSyntax},
		{"   ", ErrSyntax},
		{"1/0", ErrDivisionByZero},
		{"-1/0", ErrDivisionByZero},
		{"0/0", ErrDivisionByZero},
		{"inf", ErrSyntax},
		{"Inf", ErrSyntax},
		{"-inf", ErrSyntax},
		{"+Infinity", ErrSyntax},
		{"nan", ErrSyntax},
		{"NaN", ErrSyntax},
		{"0x10", ErrSyntax},
		{"0b101", ErrSyntax},
		{"0o17", ErrSyntax},
		{"0x1p-2", ErrSyntax},
		{"1/2/3", ErrSyntax},
		{"3/-4", ErrSyntax},
		{"3/+4", ErrSyntax},
		{"-3/-4", ErrSyntax},
		{"1/2.5", ErrSyntax},
		{"1.5/2", ErrSyntax},
		{"1e2/3", ErrSyntax},
		{"/4", ErrSyntax},
		{"4/", ErrSyntax},
		{"1.", ErrSyntax},
		{".5", ErrSyntax},
		{"-.5", ErrSyntax},
		{"1e", ErrSyntax},
		{"1e+", ErrSyntax},
		{"1e-", ErrSyntax},
		{"e5", ErrSyntax},
		{"1.5.2", ErrSyntax},
		{"1e5e5", ErrSyntax},
		{"1e2.5", ErrSyntax},
		{"1 2", ErrSyntax},
		{"1 / 2", ErrSyntax},
		{"--1", ErrSyntax},
		{"+-1", ErrSyntax},
		{"-", ErrSyntax},
		{"1_000", ErrSyntax},
		{"1,5", ErrSyntax},
		{"½", ErrSyntax},
		{"١٢", ErrSyntax}, // Arabic-Indic digits
		{"1e100001", ErrSyntax},
		{"1e-100001", ErrSyntax},
		{"1e99999999999999999999999", ErrSyntax},
	}
	for _, tt := range tests {
		got, err := ParseRat(tt.in)
		if !errors.Is(err, tt.want) {
			t.Errorf("ParseRat(%q) = %v, %v; want error %v", tt.in, got, err, tt.want)
			continue
		}
		if !strings.Contains(err.Error(), strconv.Quote(tt.in)) {
			t.Errorf("ParseRat(%q) error %q does not quote the input", tt.in, err)
		}
	}
}

// The exponent limit is inclusive.
func TestParseRatExponentLimit(t *testing.T) {
	r, err := ParseRat("1e100000")
	if err != nil {
		t.Fatal(err)
	}
	want := new(big.Int).Exp(big.NewInt(10), big.NewInt(100000), nil)
	if !r.IsInt() || r.Num().Cmp(want) != 0 {
		t.Error("1e100000 is not 10^100000")
	}
}

// IEEE 754 binary64 facts: the double nearest 0.1 is 0x3FB999999999999A =
// 3602879701896397 / 2^55; the smallest subnormal is 2^-1074; the largest
// finite double is (2^53 - 1) 2^971.
func TestRatFromFloat(t *testing.T) {
	pow2 := func(e uint) *big.Int { return new(big.Int).Lsh(big.NewInt(1), e) }
	maxFloat := new(big.Int).Mul(new(big.Int).Sub(pow2(53), big.NewInt(1)), pow2(971))
	tests := []struct {
		in   float64
		want *big.Rat
	}{
		{0.1, new(big.Rat).SetFrac(big.NewInt(3602879701896397), pow2(55))},
		{math.Float64frombits(0x3FB999999999999A), q("3602879701896397/36028797018963968")},
		{0.5, q("1/2")},
		{-0.75, q("-3/4")},
		{0, q("0")},
		{math.Copysign(0, -1), q("0")},
		{math.SmallestNonzeroFloat64, new(big.Rat).SetFrac(big.NewInt(1), pow2(1074))},
		{math.MaxFloat64, new(big.Rat).SetInt(maxFloat)},
		{-1e15, q("-1000000000000000")},
	}
	for _, tt := range tests {
		got, err := RatFromFloat(tt.in)
		if err != nil {
			t.Errorf("RatFromFloat(%v): %v", tt.in, err)
			continue
		}
		if got.Cmp(tt.want) != 0 {
			t.Errorf("RatFromFloat(%v) = %s, want %s", tt.in, FormatRat(got), FormatRat(tt.want))
		}
	}
	if got := FormatRat(must(RatFromFloat(0.1))); got != "3602879701896397/36028797018963968" {
		t.Errorf("RatFromFloat(0.1) = %s", got)
	}
	for _, f := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
		if _, err := RatFromFloat(f); !errors.Is(err, ErrNotFinite) {
			t.Errorf("RatFromFloat(%v) error = %v, want ErrNotFinite", f, err)
		}
	}
}

func must[T any](v T, err error) T {
	if err != nil {
		panic(err)
	}
	return v
}

func TestQuo(t *testing.T) {
	got, err := Quo(q("3/4"), q("-9/8"))
	if err != nil || got.Cmp(q("-2/3")) != 0 {
		t.Errorf("Quo(3/4, -9/8) = %v, %v; want -2/3", got, err)
	}
	if _, err := Quo(q("1"), q("0")); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("Quo(1, 0) error = %v, want ErrDivisionByZero", err)
	}
	a := q("5")
	Quo(a, q("2"))
	if a.Cmp(q("5")) != 0 {
		t.Error("Quo modified its argument")
	}
}

func TestFormatRat(t *testing.T) {
	tests := []struct {
		in   *big.Rat
		want string
	}{
		{big.NewRat(3, 4), "3/4"},
		{big.NewRat(-6, 4), "-3/2"},
		{big.NewRat(-2, 1), "-2"},
		{big.NewRat(4, 2), "2"},
		{new(big.Rat), "0"},
		{nil, "<nil>"},
	}
	for _, tt := range tests {
		if got := FormatRat(tt.in); got != tt.want {
			t.Errorf("FormatRat(%v) = %q, want %q", tt.in, got, tt.want)
		}
	}
}

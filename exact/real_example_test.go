package exact_test

import (
	"errors"
	"fmt"
	"math/big"

	"assay/exact"
)

func ExampleReal_Digits() {
	sqrt2 := exact.RealSqrt(exact.RealFromInt(2))
	s, err := sqrt2.Digits(30, exact.DefaultMaxPrecision)
	fmt.Println(s, err)

	// Tiny and huge values switch to scientific form.
	e := exact.RealExp(exact.RealFromInt(1))
	tiny := exact.RealNeg(exact.RealMul(e, exact.RealFromRat(big.NewRat(1, 100000))))
	s, _ = tiny.Digits(8, exact.DefaultMaxPrecision)
	fmt.Println(s)

	// Digits are truncated, never rounded, and each one is certified: a
	// value exactly on a digit boundary that is not known to be rational
	// cannot be settled.
	two := exact.RealMul(sqrt2, sqrt2)
	_, err = two.Digits(10, 1024)
	fmt.Println(errors.Is(err, exact.ErrUndecided))
	// Output:
	// 1.41421356237309504880168872420 <nil>
	// -2.7182818e-5
	// true
}

func ExampleReal_Sign() {
	pi := exact.Pi()
	// π < 355/113 (by about 2.7e-7).
	d := exact.RealSub(pi, exact.RealFromRat(big.NewRat(355, 113)))
	fmt.Println(d.Sign(exact.DefaultMaxPrecision))

	// e^(π√163) is within 1e-12 of the integer 640320³ + 744, below it.
	r := exact.RealExp(exact.RealMul(pi, exact.RealSqrt(exact.RealFromInt(163))))
	n := exact.RealFromRat(new(big.Rat).SetInt64(262537412640768744))
	fmt.Println(exact.RealSub(r, n).Sign(exact.DefaultMaxPrecision))

	// √2·√3 − √6 is zero, proved by its zero bound: it is algebraic.
	sqrt := func(n int64) *exact.Real { return exact.RealSqrt(exact.RealFromInt(n)) }
	fmt.Println(exact.RealSub(exact.RealMul(sqrt(2), sqrt(3)), sqrt(6)).Sign(4096))

	// sin π is zero, but intervals can never prove it.
	_, err := exact.RealSin(pi).Sign(4096)
	fmt.Println(err)
	// Output:
	// -1 <nil>
	// -1 <nil>
	// 0 <nil>
	// sign not settled within the precision cap of 4096 bits
}

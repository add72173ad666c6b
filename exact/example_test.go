package exact_test

import (
	"errors"
	"fmt"
	"math/big"

	"assay/exact"
)

func ExampleParseRat() {
	for _, s := range []string{"3/4", "-1.0005", "2e-7", " 7 ", "1.5E+3"} {
		r, err := exact.ParseRat(s)
		if err != nil {
			panic(err)
		}
		fmt.Println(exact.FormatRat(r))
	}
	_, err := exact.ParseRat("1/0")
	fmt.Println(errors.Is(err, exact.ErrDivisionByZero))
	_, err = exact.ParseRat("0x10")
	fmt.Println(err)
	// Output:
	// 3/4
	// -2001/2000
	// 1/5000000
	// 7
	// 1500
	// true
	// parse "0x10": unexpected "x10": invalid syntax
}

func ExampleMatrix_Det() {
	// The 3x3 Hilbert matrix, entries 1/(i+j-1).
	m, err := exact.NewMatrix([][]*big.Rat{
		{big.NewRat(1, 1), big.NewRat(1, 2), big.NewRat(1, 3)},
		{big.NewRat(1, 2), big.NewRat(1, 3), big.NewRat(1, 4)},
		{big.NewRat(1, 3), big.NewRat(1, 4), big.NewRat(1, 5)},
	})
	if err != nil {
		panic(err)
	}
	d, err := m.Det()
	if err != nil {
		panic(err)
	}
	fmt.Println(exact.FormatRat(d))

	_, err = exact.Zeros(2, 3).Det()
	fmt.Println(err)
	// Output:
	// 1/2160
	// det needs a square matrix, got 2x3: not square
}

func ExampleMatrix_Inverse() {
	m, _ := exact.NewMatrix([][]*big.Rat{
		{big.NewRat(1, 1), big.NewRat(2, 1)},
		{big.NewRat(3, 1), big.NewRat(4, 1)},
	})
	inv, _ := m.Inverse()
	fmt.Println(inv)
	_, err := exact.Zeros(3, 3).Inverse()
	fmt.Println(err)
	// Output:
	// [[-2, 1], [3/2, -1/2]]
	// inverse: matrix is singular (rank 0 of 3)
}

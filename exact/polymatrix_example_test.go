package exact_test

import (
	"fmt"
	"math/big"

	"assay/exact"
)

func ExamplePolyMatrix_Det() {
	r := exact.NewRing()
	a, _ := r.Var("a")
	b, _ := r.Var("b")
	c, _ := r.Var("c")
	zero, one := r.Const(new(big.Rat)), r.Const(big.NewRat(1, 1))
	// The Cayley–Menger matrix of a triangle with squared sides a, b, c.
	m, err := exact.NewPolyMatrix(r, [][]*exact.Poly{
		{zero, one, one, one},
		{one, zero, c, b},
		{one, c, zero, a},
		{one, b, a, zero},
	})
	if err != nil {
		panic(err)
	}
	d, err := m.Det()
	if err != nil {
		panic(err)
	}
	fmt.Println(d) // -16 area^2 (Heron)
	// The 3-4-5 right triangle has area 6: -16 * 36 = -576.
	sides := map[int]*big.Rat{0: big.NewRat(9, 1), 1: big.NewRat(16, 1), 2: big.NewRat(25, 1)}
	num, _ := m.Eval(sides).Constant()
	fmt.Println(num)
	det, _ := num.Det()
	fmt.Println(exact.FormatRat(det))

	rect, _ := exact.NewPolyMatrix(r, [][]*exact.Poly{{a, b, c}})
	_, err = rect.Det()
	fmt.Println(err)
	// Output:
	// a^2 - 2*a*b - 2*a*c + b^2 - 2*b*c + c^2
	// [[0, 1, 1, 1], [1, 0, 25, 16], [1, 25, 0, 9], [1, 16, 9, 0]]
	// -576
	// det needs a square matrix, got 1x3: not square
}

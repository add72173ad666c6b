package exact_test

import (
	"errors"
	"fmt"

	"assay/exact"
)

func ExampleRing_Parse() {
	r := exact.NewRing()
	p, err := r.Parse("(a + b)^3/4 - 3/2*c + 0.1")
	if err != nil {
		panic(err)
	}
	fmt.Println(p)
	fmt.Println(r.Names())
	// String output parses back to the same polynomial.
	q, _ := r.Parse(p.String())
	fmt.Println(q.Equal(p))
	_, err = r.Parse("2*a^")
	fmt.Println(err, errors.Is(err, exact.ErrSyntax))
	// Output:
	// 1/4*a^3 + 3/4*a^2*b + 3/4*a*b^2 + 1/4*b^3 - 3/2*c + 1/10
	// [a b c]
	// true
	// column 5: expected an exponent after "^", found end of input true
}

func ExamplePoly_Mul() {
	// Heron: 16*Area^2 of a triangle with sides a, b, c.
	r := exact.NewRing()
	s, _ := r.Parse("(a + b + c)*(-a + b + c)")
	t, _ := r.Parse("(a - b + c)*(a + b - c)")
	p, err := s.Mul(t)
	if err != nil {
		panic(err)
	}
	fmt.Println(p)
	// Output:
	// -a^4 + 2*a^2*b^2 + 2*a^2*c^2 - b^4 + 2*b^2*c^2 - c^4
}

func ExampleGCD() {
	r := exact.NewRing()
	p, _ := r.Parse("2*x^3*y - 2*x*y^3")      // 2xy(x - y)(x + y)
	q, _ := r.Parse("6*x^2 - 12*x*y + 6*y^2") // 6(x - y)^2
	g, err := exact.GCD(p, q)
	if err != nil {
		panic(err)
	}
	fmt.Println(g)
	x, _ := r.Index("x")
	d, _ := exact.Discriminant(q, x)
	fmt.Println(d)
	// Output:
	// x - y
	// 0
}

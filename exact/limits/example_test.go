package limits_test

import (
	"fmt"
	"math/big"

	"assay/exact/limits"
)

// Archimedes' inscribed polygons: the semi-perimeter b of the regular
// n-gon in the unit circle tends to π as n doubles, with error of order
// n⁻². The doubling recurrences give the values without using π.
func ExampleAnalyse() {
	const prec = 400
	_, hs, _ := limits.Grid(limits.ToInfinity, nil, big.NewRat(1, 2), 30) // n = 6·2^k ∝ t_k
	a := new(big.Float).SetPrec(prec).SetInt64(12)
	a.Sqrt(a)                                     // circumscribed hexagon: 2√3
	b := new(big.Float).SetPrec(prec).SetInt64(3) // inscribed hexagon: 3
	var values []*big.Float
	for range hs {
		values = append(values, new(big.Float).Copy(b))
		p := new(big.Float).SetPrec(prec).Mul(a, b)
		a = p.Quo(p.Mul(p, big.NewFloat(2)), new(big.Float).SetPrec(prec).Add(a, b))  // harmonic mean
		b = new(big.Float).SetPrec(prec).Sqrt(new(big.Float).SetPrec(prec).Mul(a, b)) // geometric mean
	}
	e := limits.Analyse(hs, values)
	fmt.Println(e.Method)
	fmt.Printf("order %.0f\n", e.Order)
	fmt.Printf("last value %s\n", values[len(values)-1].Text('f', 40))
	fmt.Printf("limit      %s\n", e.Limit.Text('f', 40))
	fmt.Println("trusted to more than 100 digits:", e.Digits > 100)
	verdict, digits, _ := limits.Compare(e, big.NewFloat(3.14159))
	fmt.Println("against 3.14159:", verdict, digits)
	// Output:
	// Richardson extrapolation
	// order 2
	// last value 3.1415926535897932379646126790207221515422
	// limit      3.1415926535897932384626433832795028841972
	// trusted to more than 100 digits: true
	// against 3.14159: fails 6
}

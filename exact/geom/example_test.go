package geom_test

import (
	"fmt"
	"math/big"

	"assay/exact/geom"
)

func ExampleFromPoints() {
	// The corner tetrahedron with legs 1, 2, 3: V = 1·2·3/6 = 1.
	z := new(big.Rat)
	s, err := geom.FromPoints([][]*big.Rat{
		{z, z, z},
		{big.NewRat(1, 1), z, z},
		{z, big.NewRat(2, 1), z},
		{z, z, big.NewRat(3, 1)},
	})
	if err != nil {
		panic(err)
	}
	fmt.Println(s.VolumeSq().RatString())
	// Squared facet areas, facet i opposite vertex i. De Gua's theorem:
	// 49/4 = 9 + 9/4 + 1.
	for i, f := range s.FacetContentsSq() {
		if i > 0 {
			fmt.Print(" ")
		}
		fmt.Print(f.RatString())
	}
	fmt.Println()
	r2, _ := s.CircumradiusSq()
	fmt.Println(r2.RatString()) // (1 + 4 + 9)/4
	// Output:
	// 1
	// 49/4 9 9/4 1
	// 7/2
}

func ExampleWedge() {
	u := []*big.Rat{big.NewRat(1, 1), big.NewRat(2, 1), big.NewRat(0, 1)}
	v := []*big.Rat{big.NewRat(0, 1), big.NewRat(1, 1), big.NewRat(3, 1)}
	w, err := geom.Wedge(u, v)
	if err != nil {
		panic(err)
	}
	fmt.Println(w)
	fmt.Println(w.NormSq().RatString()) // = |u|²|v|² − (u·v)² = 5·10 − 4
	fmt.Println(w.Hodge())              // the cross product u × v
	// Output:
	// e1^e2 + 3*e1^e3 + 6*e2^e3
	// 46
	// 6*e1 - 3*e2 + e3
}

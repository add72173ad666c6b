package exact_test

import (
	"fmt"

	"assay/exact"
)

// The cuspidal cubic x = t², y = t³ is y² = x³ (Cox, Little, O'Shea,
// "Ideals, Varieties, and Algorithms", ch. 3 §3).
func ExampleEliminate() {
	r := exact.NewRing()
	x, _ := r.Parse("x - t^2")
	y, _ := r.Parse("y - t^3")
	tv, _ := r.Index("t")
	g, err := exact.Eliminate([]*exact.Poly{x, y}, []int{tv}, exact.GroebnerLimits{})
	if err != nil {
		panic(err)
	}
	fmt.Println(g)
	// Output: [x^3 - y^2]
}

// On the unit circle, (x² + y²)² − 1 is (x² + y² + 1) times the circle's
// equation; x² − 1 is not in the ideal, nor is any power of it.
func ExampleCertify() {
	r := exact.NewRing()
	circle, _ := r.Parse("x^2 + y^2 - 1")
	for _, s := range []string{"(x^2 + y^2)^2 - 1", "x^2 - 1"} {
		t, _ := r.Parse(s)
		m, err := exact.Certify(t, []*exact.Poly{circle}, nil, exact.GroebnerLimits{})
		if err != nil {
			panic(err)
		}
		fmt.Println(m.Kind == exact.InIdeal, m.Cofactors, m.Remainder)
	}
	// Output:
	// true [x^2 + y^2 + 1] 0
	// false [] -y^2
}

package exact

import (
	"errors"
	"math/big"
	"strings"
	"testing"
)

// acos against the arcsine series arccos t = π/2 − Σ (2n)!/(4ⁿ(n!)²(2n+1))
// t^(2n+1) (A&S 4.4.40, from memory): the coefficients 1, 1/6, 3/40,
// 5/112, 35/1152 of t, t³, …, t⁹, and the constant π/2 to 29 digits; off
// the origin, d/dx acos x = −1/√(1 − x²) and d²/dx² = −x/(1 − x²)^(3/2)
// (calculus), so acos(1/2 + t) = π/3 − (2/√3)t − (2/(3√3))t² + …; and
// the refusals at the branch points ±1 and outside [−1, 1].
func TestSeriesAcos(t *testing.T) {
	must := okS(t)
	a := must(SeriesAcos(sv(10)))
	odd := []string{"1", "1/6", "3/40", "5/112", "35/1152"}
	for n, c := range odd {
		got, ok := a.coef(big.NewRat(int64(2*n+1), 1)).Rat()
		if !ok || got.Cmp(new(big.Rat).Neg(q(c))) != 0 {
			t.Errorf("acos t: coefficient of t^%d is %v, want -%s (%s)", 2*n+1, got, c, a.String("t"))
		}
		if even := a.coef(big.NewRat(int64(2*n+2), 1)); !isZeroRat(even) {
			t.Errorf("acos t: coefficient of t^%d is %v, want 0", 2*n+2, even)
		}
	}
	c0, _, _ := a.Leading()
	if d, err := c0.Digits(30, seriesCap); err != nil || !strings.HasPrefix(d, "1.5707963267948966192313216916") {
		t.Errorf("acos t at 0: %s (%v), want π/2", d, err)
	}
	b := must(SeriesAcos(must(SeriesAdd(sc("1/2"), sv(4)))))
	sqrt3 := RealSqrt(RealFromInt(3))
	for _, w := range []struct {
		k    int64
		want *Real
	}{
		{1, RealQuo(RealFromInt(-2), sqrt3)},
		{2, RealQuo(RealFromInt(-2), RealMul(RealFromInt(3), sqrt3))},
	} {
		if d, err := RealCmp(b.coef(big.NewRat(w.k, 1)), w.want, seriesCap); err != nil || d != 0 {
			t.Errorf("acos(1/2 + t): coefficient of t^%d is %v, want %v", w.k, b.coef(big.NewRat(w.k, 1)), w.want)
		}
	}
	if _, err := SeriesAcos(must(SeriesSub(sc("1"), must(SeriesMul(sv(6), sv(6)))))); !errors.Is(err, ErrBranchPoint) {
		t.Errorf("acos(1 − t²): %v, want a branch point", err)
	}
	if _, err := SeriesAcos(must(SeriesAdd(sc("-2"), sv(6)))); !errors.Is(err, ErrDomain) {
		t.Errorf("acos(−2 + t): %v, want a domain error", err)
	}
	if _, err := SeriesAcos(must(SeriesQuo(sc("1"), sv(6)))); !errors.Is(err, ErrEssentialSingularity) {
		t.Errorf("acos(1/t): %v, want refused", err)
	}
}

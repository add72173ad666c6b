package exact

import (
	"errors"
	"fmt"
	"math/big"
	"testing"
)

const seriesCap = 4096

func sv(order int) *Series { return SeriesVar(order, seriesCap) }

func sc(s string) *Series { return SeriesConst(RealFromRat(q(s)), seriesCap) }

// okS returns a helper that fails the test on an error.
func okS(t *testing.T) func(*Series, error) *Series {
	return func(s *Series, err error) *Series {
		t.Helper()
		if err != nil {
			t.Fatal(err)
		}
		return s
	}
}

// wantCoefs checks the rational coefficients of s at exponents 0, 1/den,
// 2/den, … and the order of its error term.
func wantCoefs(t *testing.T, what string, s *Series, den int, order string, coefs ...string) {
	t.Helper()
	for i, want := range coefs {
		got := s.coef(big.NewRat(int64(i), int64(den)))
		g, ok := got.Rat()
		if !ok || g.Cmp(q(want)) != 0 {
			t.Errorf("%s: coefficient of t^(%d/%d) is %v, want %s (series %s)", what, i, den, got, want, s.String("t"))
		}
	}
	if o, ok := s.Order(); !ok || o.Cmp(q(order)) != 0 {
		t.Errorf("%s: order %v, want O(t^%s) (series %s)", what, o, order, s.String("t"))
	}
}

// coef is the coefficient of t^e (0 when not among the known terms).
func (s *Series) coef(e *big.Rat) *Real {
	coefs, exps, err := s.Terms()
	if err != nil {
		panic(err)
	}
	for i, x := range exps {
		if x.Cmp(e) == 0 {
			return coefs[i]
		}
	}
	return realZero
}

func TestSeriesStandardExpansions(t *testing.T) {
	must := okS(t)
	x := sv(8)
	one := sc("1")
	// sin t / t = Σ (−1)^k t^(2k)/(2k+1)! (Abramowitz & Stegun 4.3.65, from memory);
	// t is known to O(t^8), so sin t is, and dividing by t loses one order.
	st := must(SeriesSin(x))
	wantCoefs(t, "sin t", st, 1, "8", "0", "1", "0", "-1/6", "0", "1/120", "0", "-1/5040")
	sinc := must(SeriesQuo(st, x))
	wantCoefs(t, "sin t / t", sinc, 1, "7", "1", "0", "-1/6", "0", "1/120", "0", "-1/5040")
	if got, want := sinc.String("t"), "1 - 1/6*t^2 + 1/120*t^4 - 1/5040*t^6 + O(t^7)"; got != want {
		t.Errorf("sin t / t prints %q, want %q", got, want)
	}
	// cos t = Σ (−1)^k t^(2k)/(2k)! (A&S 4.3.66, from memory).
	wantCoefs(t, "cos t", must(SeriesCos(x)), 1, "8", "1", "0", "-1/2", "0", "1/24", "0", "-1/720")
	// exp t = Σ t^k/k! (A&S 4.2.1, from memory).
	wantCoefs(t, "exp t", must(SeriesExp(x)), 1, "8", "1", "1", "1/2", "1/6", "1/24", "1/120", "1/720", "1/5040")
	// log(1 + t) = Σ (−1)^(k+1) t^k/k (A&S 4.1.24, from memory).
	onePlus := must(SeriesAdd(one, x))
	wantCoefs(t, "log(1+t)", must(SeriesLog(onePlus)), 1, "8", "0", "1", "-1/2", "1/3", "-1/4", "1/5", "-1/6", "1/7")
	// √(1 + t): the binomial series, C(1/2, k) = 1, 1/2, −1/8, 1/16, −5/128, 7/256.
	wantCoefs(t, "sqrt(1+t)", must(SeriesPow(onePlus, 1, 2)), 1, "8", "1", "1/2", "-1/8", "1/16", "-5/128", "7/256")
	// 1/(1 − t) = Σ t^k (geometric series).
	oneMinus := must(SeriesSub(one, x))
	wantCoefs(t, "1/(1-t)", must(SeriesQuo(one, oneMinus)), 1, "8", "1", "1", "1", "1", "1", "1", "1", "1")
	// (1 + t)^3 = 1 + 3t + 3t² + t³ (binomial theorem), by Euler's recurrence.
	wantCoefs(t, "(1+t)^3", must(SeriesPow(onePlus, 3, 1)), 1, "8", "1", "3", "3", "1", "0", "0")
	// exp(log(1 + t)) = 1 + t: the two recurrences invert each other.
	wantCoefs(t, "exp(log(1+t))", must(SeriesExp(must(SeriesLog(onePlus)))), 1, "8", "1", "1", "0", "0", "0", "0", "0", "0")
	// sin² + cos² = 1.
	s2 := must(SeriesMul(st, st))
	ct := must(SeriesCos(x))
	c2 := must(SeriesMul(ct, ct))
	wantCoefs(t, "sin²+cos²", must(SeriesAdd(s2, c2)), 1, "8", "1", "0", "0", "0", "0", "0", "0", "0")
}

func TestSeriesPuiseux(t *testing.T) {
	must := okS(t)
	x := sv(6)
	// √(t + t²) = t^(1/2)·√(1 + t) = t^(1/2) + t^(3/2)/2 − t^(5/2)/8 + …; the
	// relative precision of t + t² is 5 orders.
	p := must(SeriesAdd(x, must(SeriesMul(x, x))))
	r := must(SeriesPow(p, 1, 2))
	c, e, ok := r.Leading()
	if !ok || e.Cmp(q("1/2")) != 0 || !isOne(c) {
		t.Fatalf("leading term of sqrt(t + t^2): %v t^%v", c, e)
	}
	if got, want := r.String("t"), "t^(1/2) + 1/2*t^(3/2) - 1/8*t^(5/2) + 1/16*t^(7/2) - 5/128*t^(9/2) + O(t^(11/2))"; got != want {
		t.Errorf("sqrt(t + t^2) prints %q, want %q", got, want)
	}
	// (t^(1/2))² = t: the exponent grid shrinks back.
	sq := must(SeriesMul(r, r))
	if got, want := sq.String("t"), "t + t^2 + O(t^6)"; got != want {
		t.Errorf("sqrt(t+t^2)^2 prints %q, want %q", got, want)
	}
	// √(2 + t) = √2·(1 + t/4 − t²/32 + …): an algebraic coefficient.
	s2 := must(SeriesPow(must(SeriesAdd(sc("2"), x)), 1, 2))
	c1 := s2.coef(big.NewRat(1, 1))
	if d, err := RealCmp(c1, RealQuo(RealSqrt(RealFromInt(2)), RealFromInt(4)), seriesCap); err != nil || d != 0 {
		t.Errorf("coefficient of t in sqrt(2 + t) is %v, want sqrt(2)/4 (cmp %d, %v)", c1, d, err)
	}
	// A root of high index stays on the integer grid when it can:
	// (1 + t)^(1/1000) = 1 + t/1000 + C(1/1000, 2)·t² + …, C(1/1000, 2) = −999/2000000.
	hi := must(SeriesPow(must(SeriesAdd(sc("1"), x)), 1, 1000))
	wantCoefs(t, "(1+t)^(1/1000)", hi, 1, "6", "1", "1/1000", "-999/2000000")
	// Odd roots of a negative leading coefficient take the real branch:
	// ∛(−8t³ + …) = −2t·(…).
	m := must(SeriesMul(sc("-8"), must(SeriesMul(x, must(SeriesMul(x, x))))))
	cr := must(SeriesPow(m, 1, 3))
	if c, e, _ := cr.Leading(); e.Cmp(q("1")) != 0 || c.String() != "-2" {
		t.Errorf("cube root of -8t^3: leading %v t^%v", c, e)
	}
}

func isOne(x *Real) bool {
	q, ok := x.Rat()
	return ok && q.Cmp(big.NewRat(1, 1)) == 0
}

func TestSeriesRefusals(t *testing.T) {
	must := okS(t)
	x := sv(6)
	inv := must(SeriesQuo(sc("1"), x))
	if _, err := SeriesExp(inv); !errors.Is(err, ErrEssentialSingularity) {
		t.Errorf("exp(1/t): %v, want an essential singularity", err)
	}
	if _, err := SeriesCos(inv); !errors.Is(err, ErrEssentialSingularity) {
		t.Errorf("cos(1/t): %v, want an essential singularity", err)
	}
	if _, err := SeriesPow(SeriesNeg(x), 1, 2); !errors.Is(err, ErrBranchPoint) {
		t.Errorf("sqrt(-t): %v, want a branch point", err)
	}
	if _, err := SeriesLog(x); !errors.Is(err, ErrBranchPoint) {
		t.Errorf("log t: %v, want a branch point", err)
	}
	// t − t cancels to O(t^6): dividing by it is undetermined, not a guess.
	z := must(SeriesSub(x, x))
	if _, ok := z.Order(); !ok {
		t.Fatal("t - t lost its order")
	}
	if _, err := SeriesQuo(sc("1"), z); !errors.Is(err, ErrSeriesUndetermined) {
		t.Errorf("1/(t - t): %v, want undetermined", err)
	}
	if _, err := SeriesQuo(x, sc("0")); !errors.Is(err, ErrDivisionByZero) {
		t.Errorf("t/0: %v, want division by zero", err)
	}
}

func TestSeriesOrderTracking(t *testing.T) {
	must := okS(t)
	x := sv(6)
	// (1 − cos t)/t² = 1/2 − t²/24 + …: 1 − cos t = t²/2 + … known to
	// O(t^6), relative precision 4, so the quotient is known to O(t^4).
	num := must(SeriesSub(sc("1"), must(SeriesCos(x))))
	r := must(SeriesQuo(num, must(SeriesMul(x, x))))
	wantCoefs(t, "(1-cos t)/t^2", r, 1, "4", "1/2", "0", "-1/24", "0")
	// 1/t = t^-1 + O(t^4) (relative precision 5) and t² = t² + O(t^7):
	// their product is known to min(4 + 2, 7 − 1) = 6.
	p := must(SeriesMul(must(SeriesQuo(sc("1"), x)), must(SeriesMul(x, x))))
	if got, want := p.String("t"), "t + O(t^6)"; got != want {
		t.Errorf("(1/t)·t² prints %q, want %q", got, want)
	}
	// An exact 0 adds nothing and takes no order away.
	if got, want := must(SeriesAdd(sc("0"), x)).String("t"), "t + O(t^6)"; got != want {
		t.Errorf("0 + t prints %q, want %q", got, want)
	}
}

func ExampleSeriesQuo() {
	t := SeriesVar(8, 1024)
	s, _ := SeriesSin(t)
	q, _ := SeriesQuo(s, t)
	fmt.Println(q.String("t"))
	r, _ := SeriesPow(q, 1, 2)
	fmt.Println(r.Truncate(5).String("t"))
	// Output:
	// 1 - 1/6*t^2 + 1/120*t^4 - 1/5040*t^6 + O(t^7)
	// 1 - 1/12*t^2 + 1/1440*t^4 + O(t^5)
}

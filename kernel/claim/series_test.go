package claim

import (
	"math/big"
	"strings"
	"testing"

	"assay/cells"
	"assay/exact"
)

func expansion(t *testing.T, f func(x *exact.Series) (*exact.Series, error)) Expansion {
	t.Helper()
	s, err := f(exact.SeriesVar(8, 4096))
	if err != nil {
		t.Fatal(err)
	}
	return Expansion{S: s, Printed: s.String("t")}
}

// The verdicts of limits and asymptotics from expansions whose leading
// terms are known from standard series (from memory): (1 − cos t)/t² → 1/2
// with error of order 2 (cos t = 1 − t²/2 + t⁴/24 − …); 1/(1 − cos t)
// ~ 2/t²; √t ~ t^(1/2).
func TestSeriesVerdicts(t *testing.T) {
	tgt := Target{Bits: 128, Cap: 4096}
	oneMinusCos := func(x *exact.Series) (*exact.Series, error) {
		c, err := exact.SeriesCos(x)
		if err != nil {
			return nil, err
		}
		return exact.SeriesSub(exact.SeriesConst(exact.RealFromInt(1), 4096), c)
	}
	ratio := expansion(t, func(x *exact.Series) (*exact.Series, error) {
		n, err := oneMinusCos(x)
		if err != nil {
			return nil, err
		}
		x2, _ := exact.SeriesMul(x, x)
		return exact.SeriesQuo(n, x2)
	})
	blow := expansion(t, func(x *exact.Series) (*exact.Series, error) {
		n, err := oneMinusCos(x)
		if err != nil {
			return nil, err
		}
		return exact.SeriesQuo(exact.SeriesConst(exact.RealFromInt(1), 4096), n)
	})
	root := expansion(t, func(x *exact.Series) (*exact.Series, error) { return exact.SeriesPow(x, 1, 2) })
	half := exact.RealFromRat(big.NewRat(1, 2))
	cases := []struct {
		name    string
		decide  func(c *cells.Claim) error
		verdict cells.Verdict
		note    string
	}{
		{"limit 1/2", func(c *cells.Claim) error { return SeriesLimit(c, ratio, half, false, big.NewRat(2, 1), tgt) }, cells.Holds, "exactly the expected value"},
		{"limit 1/3", func(c *cells.Claim) error {
			return SeriesLimit(c, ratio, exact.RealFromRat(big.NewRat(1, 3)), false, nil, tgt)
		}, cells.Fails, "the limit is 1/2"},
		{"order 1", func(c *cells.Claim) error { return SeriesLimit(c, ratio, half, false, big.NewRat(1, 1), tgt) }, cells.Fails, "the error is of order h^2 exactly"},
		{"no expect", func(c *cells.Claim) error { return SeriesLimit(c, ratio, nil, false, nil, tgt) }, cells.Holds, "the limit exists and is 1/2"},
		{"blows up", func(c *cells.Claim) error { return SeriesLimit(c, blow, nil, true, big.NewRat(2, 1), tgt) }, cells.Holds, "tends to infinity"},
		{"blow-up is no limit", func(c *cells.Claim) error { return SeriesLimit(c, blow, half, false, nil, tgt) }, cells.Fails, "not to a finite limit"},
		{"converges, not infinity", func(c *cells.Claim) error { return SeriesLimit(c, ratio, nil, true, nil, tgt) }, cells.Fails, "does not blow up"},
		{"sqrt ~ t^(1/2)", func(c *cells.Claim) error {
			return SeriesAsymptotic(c, root, exact.RealFromInt(1), big.NewRat(1, 2), false, tgt)
		}, cells.Holds, "exactly as stated"},
		{"sqrt ~ t", func(c *cells.Claim) error {
			return SeriesAsymptotic(c, root, exact.RealFromInt(1), big.NewRat(1, 1), false, tgt)
		}, cells.Fails, "of exponent 1/2, not 1"},
		{"1/(1-cos) ~ 2 t^-2", func(c *cells.Claim) error {
			return SeriesAsymptotic(c, blow, exact.RealFromInt(2), big.NewRat(-2, 1), false, tgt)
		}, cells.Holds, "2·t^-2"},
	}
	for _, tc := range cases {
		var c cells.Claim
		if err := tc.decide(&c); err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if c.Verdict != tc.verdict || c.Method != SeriesMethod || !strings.Contains(c.Note, tc.note) {
			t.Errorf("%s: %s by %s (%s), want %s with %q", tc.name, c.Verdict, c.Method, c.Note, tc.verdict, tc.note)
		}
	}
}

package spawn

import (
	"math"
	"strconv"
	"testing"
)

// decimal writes what strconv.FormatInt (the standard library) writes for
// the non-negative numbers a trace holds: times and process ids.
func TestDecimal(t *testing.T) {
	for _, n := range []int64{0, 7, 9, 10, 99, 100, 4194304, 1796401931615045063, math.MaxInt64} {
		if got, want := string(decimal([]byte("x"), n)), "x"+strconv.FormatInt(n, 10); got != want {
			t.Errorf("decimal(%d) = %q, want %q", n, got, want)
		}
	}
}

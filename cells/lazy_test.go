package cells

import (
	"regexp"
	"testing"
)

// TestLazyRegexpMatchesMustCompile checks the deferred expression against
// one the standard library compiles at once, and that it is compiled once.
func TestLazyRegexpMatchesMustCompile(t *testing.T) {
	const expr = `^([A-Za-z]+?)_?([0-9]+)$`
	re := lazyRegexp(expr)
	want := regexp.MustCompile(expr)
	for _, s := range []string{"x1", "alpha_12", "x", "1x", ""} {
		got, w := re().FindStringSubmatch(s), want.FindStringSubmatch(s)
		if len(got) != len(w) || (got != nil && (got[1] != w[1] || got[2] != w[2])) {
			t.Errorf("%q: got %q, regexp.MustCompile gives %q", s, got, w)
		}
	}
	if re() != re() {
		t.Error("compiled twice")
	}
}

// TestLazyRegexpPanicsAtFirstUse checks that an invalid expression panics
// when first used, as regexp.MustCompile does at once.
func TestLazyRegexpPanicsAtFirstUse(t *testing.T) {
	re := lazyRegexp(`(`)
	defer func() {
		if recover() == nil {
			t.Error("an invalid expression did not panic at first use")
		}
	}()
	re()
}

package interp

import (
	"testing"

	"github.com/go-python/gpython/py"
)

// A message names a type with the article English gives it (common
// practice): "an int", "a list".
func TestTypeNameArticle(t *testing.T) {
	for _, c := range []struct {
		o    py.Object
		want string
	}{{py.Int(3), "an int"}, {py.NewList(), "a list"}, {py.String("s"), "a str"}, {nil, "nothing"}} {
		if got := TypeName(c.o); got != c.want {
			t.Errorf("TypeName(%v) = %q, want %q", c.o, got, c.want)
		}
	}
}

package values

import (
	"math/rand/v2"
	"testing"

	"github.com/go-python/gpython/py"
)

// Word, drawn without a generator, is the first word of the stream Rand
// gives, and both are math/rand/v2's PCG seeded as Rand documents (the
// reference): with seed= alone, and without it from the cell's seed and
// the draws so far, each draw advancing the count once.
func TestWordIsRandsFirstWord(t *testing.T) {
	for _, seed := range []int64{0, 1, 7, 1 << 40, -3} {
		e := NewEnv(1000, 0)
		w, err := e.Word(py.Int(seed))
		if err != nil {
			t.Fatal(err)
		}
		r, _ := e.Rand(py.Int(seed))
		want := rand.NewPCG(uint64(seed), 0x6173736179).Uint64()
		if w != want || r.Uint64() != want {
			t.Errorf("seed %d: Word %d, Rand %d, want %d", seed, w, r.Uint64(), want)
		}
	}
	e := NewEnv(1000, 0)
	e.StartCell(3, 11)
	w1, _ := e.Word(nil)
	r2, _ := e.Rand(py.None)
	if w1 != rand.NewPCG(11, 3<<32|1).Uint64() || r2.Uint64() != rand.NewPCG(11, 3<<32|2).Uint64() {
		t.Errorf("unseeded draws are not the cell's stream: %d, then %d", w1, r2.Uint64())
	}
	e.Sweeping = true
	if _, err := e.Word(nil); err == nil {
		t.Error("an unseeded draw inside a sweep was not refused")
	}
}

package bigmul

import (
	"fmt"
	"math/big"
	"math/rand"
	"testing"
)

// BenchmarkMul: balanced products at the sizes (words of each
// operand), Mul against big.Int.Mul on the same operands; figures at the
// top of bigmul.go.
func BenchmarkMul(b *testing.B) {
	benchAgainstBig(b, []int{2000, 5000, 20000, 50000, 100000, 1000000}, false)
}

// BenchmarkSqr: squares, Sqr against big.Int.Mul(x, x).
func BenchmarkSqr(b *testing.B) { benchAgainstBig(b, []int{2000, 5000, 20000, 100000}, true) }

func benchAgainstBig(b *testing.B, sizes []int, square bool) {
	r := rand.New(rand.NewSource(1))
	for _, n := range sizes {
		x, y := randInt(r, n), randInt(r, n)
		if square {
			y = x
		}
		z := new(big.Int)
		b.Run(fmt.Sprintf("words=%d/big", n), func(b *testing.B) {
			for range b.N {
				z.Mul(x, y)
			}
		})
		b.Run(fmt.Sprintf("words=%d/bigmul", n), func(b *testing.B) {
			for range b.N {
				if square {
					Sqr(z, x)
				} else {
					Mul(z, x, y)
				}
			}
		})
	}
}

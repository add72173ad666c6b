package exact

// planeRow128Asm is planeRow128Go in amd64 assembly: the signed one-operand
// multiply and add-with-carry into memory take a third of the instructions
// the compiler emits for mul128 (see the top of polymul_planes.go). The
// caller guarantees 2*(lp+lq[j])+1 < len(acc) for every j < n.
//
//go:noescape
func planeRow128Asm(acc *uint64, lp uint64, a int64, lq *uint32, c *int64, n int)

// planeRow128 adds a*c[j] at lp+lq[j] for every j, with signed 128-bit
// accumulators (lo and hi words interleaved); maxLq is the largest lq[j].
func planeRow128(acc []uint64, lp uint32, a int64, lq []uint32, c []int64, maxLq uint32) {
	if len(lq) == 0 {
		return
	}
	if len(c) < len(lq) || 2*(uint64(lp)+uint64(maxLq))+1 >= uint64(len(acc)) {
		panic("exact: planeRow128 out of range")
	}
	planeRow128Asm(&acc[0], uint64(lp), a, &lq[0], &c[0], len(lq))
}

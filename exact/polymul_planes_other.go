//go:build !amd64

package exact

// planeRow128 is planeRow128Go (no assembly on this architecture).
func planeRow128(acc []uint64, lp uint32, a int64, lq []uint32, c []int64, _ uint32) {
	planeRow128Go(acc, lp, a, lq, c)
}

package exact

// Dense products by planes: mulDense's accumulation with the key range cut
// along the Kronecker digits instead of into fixed chunks.
//
// The low digits of a key (those below some stride s, the "plane") never
// carry into the high ones when keys add (every digit's radix is sized for
// the product), so the product's plane P receives exactly the products of
// p's terms in plane P1 with q's terms in plane P - P1. Grouping each
// factor's terms by plane (contiguous, as keys are sorted), every pair of
// groups is one small dense product into one plane's accumulators, and no
// row is visited where it adds nothing (mulDense's chunks visit every row
// that reaches into a chunk). s is the largest stride of at most planeMax
// keys, so a plane's signed 128-bit accumulators stay in the first-level
// cache: 41·41 keys (27 KB) for Fateman's f = (1+x+y+z+t)^20, whose planes
// are (total degree, exponent of x).
//
// Planes are independent, so runs of planes of about equal work are spread
// over the cores, each writing its own terms, joined in order at the end.
// On amd64 the inner loop is a few lines of assembly
// (polymul_planes_amd64.s: one signed IMULQ and an add-with-carry into
// memory per product, against about 25 instructions from the compiler for
// mul128), with planeRow128Go as the reference and the fallback elsewhere.
//
// Fateman's product f*(f+1), f = (1+x+y+z+t)^20 (10626 x 10627 terms,
// 135751 in the product), BenchmarkFateman against the reference program
// (../shared/peers/mul.c: FLINT's fmpz_mpoly_mul, threads 1 and 2),
// alternating in one run on 2 cores shared with other sessions (load
// 16-24: figures 2-3 times their idle values; compare within the run).
// Milliseconds, best over 5 rounds (of 3-4 products each); allocation:
//
//	            before          after           FLINT    after/FLINT
//	1 core      714 (30 MB)     303 (25 MB)     282      1.07
//	2 cores     502             207 (29 MB)     288      0.72
//
// Round by round the ratio was 1.07-1.34 on one core (one outlier at 2.1)
// and 0.69-0.96 on two (one at 1.9).
//
// Measured as process CPU time while the machine was loaded, one product
// costs about 124 ms of CPU here against about 110 ms for FLINT's; 85 ms
// of ours is the kernel (0.75 ns a product), the rest mostly writing the
// 135751 terms. "before" was mulDense (chunks of 2^15 keys, 512 KB of
// accumulators, every row visited in every chunk, mul128 compiled) and a
// big.Int with three allocations per coefficient above 2^63; the builder
// now takes those from slabs (newInt128), 299000 allocations down to 300;
// what is left is the result (about 11 MB) and its builder's growth.
// The sparse product of the reference program (mul sparse: f = (1 + x + y
// + 2z^2 + 3t^3 + 5u^5)^12, f*(f+1), BenchmarkMulSparse) is not dense and
// takes the hash table, which now goes by key ranges (mulHashRanges in
// polymul.go): one table of 2^18 slots (6 MB) missed the cache at every
// product. One core, best of 2 products, three rounds alternating: before
// 2058, 1819, 1407 ms; after 276, 837, 553; FLINT 399, 799, 602 (after /
// FLINT 0.69-1.05). The ranges are not yet spread over the cores.

import (
	"math/big"
	"math/bits"
	"slices"
	"sync/atomic"
)

// Limits of the plane layout: planes of planeMin..planeMax keys, and at
// least planeMinPairWork products per pair of groups on average (else
// mulDense's chunks do better).
const (
	planeMax         = 1 << 11
	planeMin         = 1 << 6
	planeMinPairWork = 16
	planeMaxIndex    = 1 << 22
)

// planesDone counts the products mulPlanes has done (the tests check that
// their cases take this path).
var planesDone atomic.Int64

// planeParallelWork is the number of term products from which mulPlanes
// uses several goroutines.
var planeParallelWork = 1 << 20

// planeGroup is a run of a factor's terms in one plane.
type planeGroup struct {
	plane      uint64
	start, end int
	maxLow     uint32 // the largest key%s of the run
}

// planeGroups cuts the keys (decreasing) into runs by key/s.
func planeGroups(keys []uint64, s uint64) []planeGroup {
	var out []planeGroup
	for i := 0; i < len(keys); {
		pl := keys[i] / s
		j := i + 1
		for j < len(keys) && keys[j]/s == pl {
			j++
		}
		g := planeGroup{plane: pl, start: i, end: j}
		for _, key := range keys[i:j] {
			g.maxLow = max(g.maxLow, uint32(key%s))
		}
		out = append(out, g)
		i = j
	}
	return out
}

// planePair is a pair of groups, p's and q's, adding into one plane.
type planePair struct{ gp, gq int32 }

// mulPlanes accumulates the product by planes (see the top of the file),
// in int64 or, with wide, signed 128-bit accumulators. It returns false,
// having done nothing, when the layout does not suit the keys.
func mulPlanes(kp []uint64, cp []int64, kq []uint64, cq []int64, out *kronOut, wide bool) (bool, error) {
	var s uint64
	for _, st := range out.k.stride {
		if st <= planeMax {
			s = st
			break
		}
	}
	if s < planeMin {
		return false, nil
	}
	top, bottom := (kp[0]+kq[0])/s, (kp[len(kp)-1]+kq[len(kq)-1])/s
	if top-bottom >= planeMaxIndex {
		return false, nil
	}
	gp, gq := planeGroups(kp, s), planeGroups(kq, s)
	hi, npairs := bits.Mul64(uint64(len(gp)), uint64(len(gq)))
	work := uint64(len(kp)) * uint64(len(kq))
	if hi != 0 || npairs*planeMinPairWork > work {
		return false, nil
	}
	// The pairs by plane, top plane first (a counting sort), and each
	// plane's products.
	nplanes := int(top - bottom + 1)
	first := make([]int, nplanes+1)
	for _, a := range gp {
		for _, b := range gq {
			first[top-(a.plane+b.plane)+1]++
		}
	}
	for x := 1; x <= nplanes; x++ {
		first[x] += first[x-1]
	}
	pairs := make([]planePair, npairs)
	fill := slices.Clone(first[:nplanes])
	planeWork := make([]uint64, nplanes)
	for i, a := range gp {
		for j, b := range gq {
			x := top - (a.plane + b.plane)
			pairs[fill[x]] = planePair{int32(i), int32(j)}
			fill[x]++
			planeWork[x] += uint64(a.end-a.start) * uint64(b.end-b.start)
		}
	}
	// Runs of planes of about equal work: a few per core, so that a core
	// slowed by other work does not hold up the rest.
	workers := 1
	if work >= uint64(planeParallelWork) {
		workers = pmWorkers()
	}
	var runs []int // run k is planes runs[k]..runs[k+1]-1
	target := work + 1
	if workers > 1 {
		target = work/uint64(4*workers) + 1
	}
	acc := uint64(0)
	for x := 0; x < nplanes; x++ {
		if x == 0 || acc >= target {
			runs = append(runs, x)
			acc = 0
		}
		acc += planeWork[x]
	}
	runs = append(runs, nplanes)
	// The low parts of the keys, within their planes.
	lowP, lowQ := make([]uint32, len(kp)), make([]uint32, len(kq))
	for i, key := range kp {
		lowP[i] = uint32(key % s)
	}
	for j, key := range kq {
		lowQ[j] = uint32(key % s)
	}
	outs := make([]*kronOut, len(runs)-1)
	err := pmParallel(len(outs), workers > 1, func(int) func(k int) error {
		var acc64 []int64
		var acc128 []uint64
		if wide {
			acc128 = make([]uint64, 2*s)
		} else {
			acc64 = make([]int64, s)
		}
		return func(k int) error {
			o := out // one run: straight into out
			if len(outs) > 1 {
				o = out.fork()
				outs[k] = o
			}
			for x := runs[k]; x < runs[k+1]; x++ {
				for _, pr := range pairs[first[x]:first[x+1]] {
					a, b := gp[pr.gp], gq[pr.gq]
					lq, c := lowQ[b.start:b.end], cq[b.start:b.end]
					for i := a.start; i < a.end; i++ {
						if wide {
							planeRow128(acc128, lowP[i], cp[i], lq, c, b.maxLow)
						} else {
							planeRow64(acc64, lowP[i], cp[i], lq, c)
						}
					}
				}
				base := (top - uint64(x)) * s
				if err := emitPlane(o, base, acc64, acc128); err != nil {
					return err
				}
			}
			return nil
		}
	})
	planesDone.Add(1)
	if err != nil || len(outs) == 1 {
		return true, err
	}
	return true, out.join(outs)
}

// planeRow64 adds a*c[j] at lp+lq[j] for every j.
func planeRow64(acc []int64, lp uint32, a int64, lq []uint32, c []int64) {
	for j, l := range lq {
		acc[lp+l] += a * c[j]
	}
}

// planeRow128Go is planeRow64 with signed 128-bit accumulators, lo and hi
// words interleaved: planeRow128 where there is no assembly, and its
// reference in the tests.
func planeRow128Go(acc []uint64, lp uint32, a int64, lq []uint32, c []int64) {
	c = c[:len(lq)]
	for j, l := range lq {
		ph, pl := mul128(a, c[j])
		x := 2 * uint(lp+l)
		s := acc[x : x+2 : x+2]
		var carry uint64
		s[0], carry = bits.Add64(s[0], pl, 0)
		s[1] += ph + carry
	}
}

// emitPlane writes the nonzero sums of a plane, or of mulDense's chunk
// (at key base), to o from the top, clearing them; acc64 is used when
// acc128 is nil.
func emitPlane(o *kronOut, base uint64, acc64 []int64, acc128 []uint64) error {
	if acc128 != nil {
		for idx := len(acc128)/2 - 1; idx >= 0; idx-- {
			if l, h := acc128[2*idx], acc128[2*idx+1]; l|h != 0 {
				acc128[2*idx], acc128[2*idx+1] = 0, 0
				if err := o.wide(base+uint64(idx), h, l); err != nil {
					return err
				}
			}
		}
		return nil
	}
	for idx := len(acc64) - 1; idx >= 0; idx-- {
		if v := acc64[idx]; v != 0 {
			acc64[idx] = 0
			if err := o.small(base+uint64(idx), v); err != nil {
				return err
			}
		}
	}
	return nil
}

// fork returns an output with o's layout and limit and a builder of its
// own, for one run of planes.
func (o *kronOut) fork() *kronOut {
	return &kronOut{k: o.k, offT: o.offT, offE: o.offE, b: newBuilder(o.b.w),
		m: make([]uint64, len(o.m)), limit: o.limit, op: o.op}
}

// join appends the terms of parts, in order, to o's builder.
func (o *kronOut) join(parts []*kronOut) error {
	n := o.b.len()
	anyBig := o.b.bnum != nil
	for _, x := range parts {
		n += x.b.len()
		anyBig = anyBig || x.b.bnum != nil
	}
	if n > o.limit {
		return tooManyTerms(o.op, o.limit)
	}
	b := o.b
	b.mono = slices.Grow(b.mono, n*b.w-len(b.mono))
	b.num = slices.Grow(b.num, n-len(b.num))
	if anyBig && b.bnum == nil {
		b.bnum = make([]*big.Int, len(b.num), n)
	}
	for _, x := range parts {
		b.mono = append(b.mono, x.b.mono...)
		b.num = append(b.num, x.b.num...)
		switch {
		case x.b.bnum != nil:
			b.bnum = append(b.bnum, x.b.bnum...)
		case anyBig:
			b.bnum = append(b.bnum, make([]*big.Int, x.b.len())...)
		}
	}
	return nil
}

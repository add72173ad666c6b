package exact

// Deciding equality with zero exactly for algebraic reals: a constructive
// zero bound in the manner of exact geometric computation.
//
// # The method
//
// A Real built from rationals by + − × ÷, integer powers and k-th roots is
// an algebraic number, and for such an expression one can compute, from the
// expression alone, a number 2^-B that its value cannot lie below unless it
// is exactly zero. Refining the enclosure until it either excludes 0
// (non-zero, with certified digits) or lies inside (−2^-B, 2^-B) (exactly
// zero: a proof) then decides the sign completely. The bound follows the
// u/l bookkeeping of Burnikel, Fleischer, Mehlhorn and Schirra ("A strong
// and easily computable separation bound for arithmetic expressions
// involving radicals", Algorithmica 27, 2000), with the root rule that
// adds one radical per root node; the rules and the argument are stated
// here in full, so the bound can be checked without the paper:
//
// Every node's value ξ is written U/L with U, L algebraic integers of one
// number field K (the rationals with the values of the root nodes
// adjoined), and u, l bound |σ(U)|, |σ(L)| for every embedding σ of K:
//
//	rational a/b (lowest terms)  u = |a|,            l = b
//	E1 ± E2                      u = u1·l2 + l1·u2,  l = l1·l2
//	E1 · E2                      u = u1·u2,          l = l1·l2
//	E1 / E2                      u = u1·l2,          l = l1·u2
//	E1^n, n > 0 (n < 0: 1/E1^|n|) u = u1^n,           l = l1^n
//	k-th root of E1              u = (u1·l1^(k−1))^(1/k), l = l1
//
// (the root's numerator is the k-th root of U·L^(k−1), an algebraic integer
// equal to the root times L, so it lies in K and the denominator stays L).
//
// A root α of an integer polynomial p = a_n·t^n + … + a_0 in an isolating
// interval (real_isolate.go) is a leaf of its own kind, with
//
//	root α of p                  u = |a_n| + max_{i<n} |a_i|,  l = |a_n|
//
// U = a_n·α is an algebraic integer (it is a root of the monic integer
// polynomial a_n^(n−1)·p(t/a_n)), and L = a_n. Every embedding σ of K sends
// α to a root of p, real or complex, and Cauchy's bound puts every root
// below 1 + max|a_i/a_n| in modulus, so |σ(U)| ≤ |a_n| + max|a_i| = u.
// Adjoining α to K multiplies its degree by at most deg p, so the node
// multiplies D by deg p.
// K has degree at most D, the product of the indices of the distinct root
// nodes (each root node's value is a k-th root of an element of the field
// below it). A non-zero U has degree d ≤ D and a non-zero integer norm,
// the product of its d conjugates, each at most u in size; so
// |U| ≥ u^-(d−1) ≥ u^-(D−1) (u ≥ 1 here), and |ξ| = |U|/|L| ≥
// 1/(u^(D−1)·l), L itself being one of its conjugates. The bookkeeping
// keeps log2 of u and l as integer upper bounds (bit lengths, rounded up,
// saturating at algCap), so B = (D−1)·log2 u + log2 l is a safe exponent.
//
// # Cost, and the cap
//
// Computing u, l and D is a walk over the expression, negligible. The cost
// is the precision: proving a zero needs an enclosure narrower than 2^-B,
// so a working precision of about B bits plus the magnitude of the operands.
// B is small for the identities geometry brings (√2 + √3 = √(5 + 2√6):
// D = 16, B = 60, decided in about 0.06 ms, BenchmarkAlgebraicDenesting)
// and grows with nested and repeated roots (D doubles with each distinct
// square root: twelve square roots of primes give B ≈ 320,000 and take
// about 0.4 s; Kahan's tetrahedron volume in its six edges against the
// Cayley–Menger volume, twelve roots, B ≈ 700,000, about 0.9 s,
// BenchmarkKahanVolume in exact/geom). Nearly all of that is big-number
// arithmetic at B bits, mostly square roots; two things keep it down:
// Sign jumps straight to the precision the bound asks for once an
// enclosure straddles 0 (refineJump), and roots take intRoot's
// division-free Newton iteration with precision doubling, one root for
// both ends of a point and a tangent for the upper end of a narrow
// interval (real_root.go). No separate degree cap is kept, since the cost follows B and
// not D alone: B is bounded by the precision cap of the query
// (--max-precision), and a zero whose bound lies beyond it is not decided
// exactly — Sign stays undecided and says so, and a claim falls back to
// intervals with a note naming the precision that would decide it.
// (The degree cap --max-degree is for minimal polynomials, real_minpoly.go,
// whose cost follows the degree; here the precision cap already bounds B.)
//
// Transcendental nodes (exp, log, sin, cos, atan, atan2, acos, π) make an
// expression non-algebraic; it is decided by intervals as before.

import (
	"fmt"
	"math/big"
)

// algInfo is the BFMSS bookkeeping of a node: upper bounds of log2 u and
// log2 l, and whether the node is algebraic at all.
type algInfo struct {
	ok     bool
	lu, ll int64
}

// algCap saturates the bit counts: a bound this large is beyond any
// precision cap, and saturating keeps the arithmetic from overflowing.
const algCap = 1 << 40

func satAdd(a, b int64) int64 { return min(a+b, algCap) }

func satMul(a, b int64) int64 {
	if a == 0 || b == 0 {
		return 0
	}
	if a > algCap/b {
		return algCap
	}
	return min(a*b, algCap)
}

// algebraic returns the node's bookkeeping, computed once.
func (x *Real) algebraic() algInfo {
	x.algOnce.Do(func() { x.alg = x.computeAlg() })
	return x.alg
}

func (x *Real) computeAlg() algInfo {
	if x.exact != nil {
		return algInfo{ok: true, lu: int64(x.exact.Num().BitLen()), ll: int64(x.exact.Denom().BitLen())}
	}
	switch x.op {
	case opAlgRoot:
		return algRootInfo(x.ar.p)
	case opNeg, opPow, opRoot:
		a := x.x.algebraic()
		if !a.ok {
			return a
		}
		switch x.op {
		case opPow:
			n := int64(x.k)
			if n < 0 {
				n = -n
				a.lu, a.ll = a.ll, a.lu
			}
			return algInfo{ok: true, lu: satMul(a.lu, n), ll: satMul(a.ll, n)}
		case opRoot:
			k := int64(x.k)
			num := satAdd(a.lu, satMul(k-1, a.ll))
			if num >= algCap {
				// Saturated means "at least": dividing it would not bound.
				return algInfo{ok: true, lu: algCap, ll: a.ll}
			}
			return algInfo{ok: true, lu: (num + k - 1) / k, ll: a.ll}
		}
		return a
	case opAdd, opSub, opMul, opQuo:
		a, b := x.x.algebraic(), x.y.algebraic()
		if !a.ok || !b.ok {
			return algInfo{}
		}
		switch x.op {
		case opMul:
			return algInfo{ok: true, lu: satAdd(a.lu, b.lu), ll: satAdd(a.ll, b.ll)}
		case opQuo:
			return algInfo{ok: true, lu: satAdd(a.lu, b.ll), ll: satAdd(a.ll, b.lu)}
		}
		// u1·l2 + l1·u2 ≤ 2·max of the two.
		return algInfo{ok: true, lu: satAdd(max(satAdd(a.lu, b.ll), satAdd(a.ll, b.lu)), 1), ll: satAdd(a.ll, b.ll)}
	}
	return algInfo{}
}

// degreeBound is D: the product of the indices of the distinct root nodes
// below x and the degrees of the root-of-polynomial leaves (saturated), a
// bound on the degree of the field they generate.
// A k-th root of a rational r adds nothing when an earlier k-th root of a
// rational s is already counted and r/s is a rational's k-th power: then
// r^(1/k) = t·s^(1/k) lies in the field already (sqrt(8) = 2·sqrt(2), and
// sqrt(2) typed twice in a cell).
func (x *Real) degreeBound() int64 {
	seen := map[*Real]bool{}
	type ratRootOf struct {
		k int
		r *big.Rat
	}
	var counted []ratRootOf
	inField := func(k int, r *big.Rat) bool {
		for _, c := range counted {
			if c.k == k && c.r.Sign() != 0 {
				if _, ok := ratRoot(new(big.Rat).Quo(r, c.r), k); ok {
					return true
				}
			}
		}
		counted = append(counted, ratRootOf{k, r})
		return false
	}
	d := int64(1)
	var walk func(n *Real)
	walk = func(n *Real) {
		if n == nil || n.exact != nil || seen[n] {
			return
		}
		seen[n] = true
		if n.op == opRoot && (n.x.exact == nil || !inField(n.k, n.x.exact)) {
			d = satMul(d, int64(n.k))
		}
		if n.op == opAlgRoot {
			d = satMul(d, int64(len(n.ar.p)-1))
		}
		walk(n.x)
		walk(n.y)
	}
	walk(x)
	return d
}

// ZeroBound returns, for an algebraic x (built from rationals by + − × ÷,
// integer powers and roots), the exponent B of its zero bound: x ≠ 0
// implies |x| ≥ 2^-B (BFMSS, see the top of this file). ok is false when x
// involves a transcendental function or π.
func (x *Real) ZeroBound() (bits int64, ok bool) {
	a := x.algebraic()
	if !a.ok {
		return 0, false
	}
	return satAdd(satMul(x.degreeBound()-1, a.lu), a.ll), true
}

// belowBound reports whether the enclosure v lies inside (−2^-B, 2^-B).
func belowBound(v ival, bits int64) bool {
	if bits >= algCap {
		return false
	}
	lim := new(big.Float).SetMantExp(fOne, -int(bits))
	return v.hi.Cmp(lim) < 0 && new(big.Float).Neg(v.lo).Cmp(lim) < 0
}

// provedZero reports whether an enclosure v of the algebraic node x proves
// x exactly zero. It is asked only of enclosures that straddle 0.
func (x *Real) provedZero(v ival) bool {
	b, ok := x.ZeroBound()
	return ok && belowBound(v, b)
}

// zeroBoundNote explains an undecided sign of an algebraic x: the bits its
// zero bound asks for, beyond the cap.
func zeroBoundNote(bits int64, maxPrec uint) string {
	if bits > int64(maxPrec) {
		return fmt.Sprintf("; the value is algebraic, and proving it zero needs an enclosure below 2^-%d (its BFMSS zero bound), beyond the precision cap of %d bits", bits, maxPrec)
	}
	return ""
}

package exact

// Packed monomials: word 0 the total degree, then four 16-bit exponents
// per word (see poly.go). Comparing words is the term order and adding
// them multiplies monomials.

// MaxExponent is the largest exponent of a single variable in a
// polynomial. Operations whose result would need a larger one fail with
// ErrExponentRange.
const MaxExponent = 65535

// The packing: expBits bits per exponent, perWord exponents per word, the
// first of a word in its top expBits bits.
const (
	expBits  = 16
	expMask  = 1<<expBits - 1
	perWord  = 64 / expBits
	topShift = 64 - expBits
)

// wordsFor is the width of a monomial in nv variables.
func wordsFor(nv int) int { return 1 + (nv+perWord-1)/perWord }

// monoExp returns the exponent of variable v in the packed monomial m.
func monoExp(m []uint64, v int) int {
	k := 1 + v/perWord
	if k >= len(m) {
		return 0
	}
	return int(m[k] >> (topShift - expBits*(v%perWord)) & expMask)
}

// monoSetExp sets the exponent of variable v in m to e, leaving the total
// degree in m[0] to the caller.
func monoSetExp(m []uint64, v, e int) {
	k := 1 + v/perWord
	sh := topShift - expBits*(v%perWord)
	m[k] = m[k]&^(expMask<<sh) | uint64(e)<<sh
}

// monoCmp compares two monomials of the same width in the canonical order.
func monoCmp(a, b []uint64) int {
	for k := range a {
		if a[k] != b[k] {
			if a[k] > b[k] {
				return 1
			}
			return -1
		}
	}
	return 0
}

// zeroWords reports whether every word is 0 (a monomial's missing
// variables read as such).
func zeroWords(ws []uint64) bool {
	for _, x := range ws {
		if x != 0 {
			return false
		}
	}
	return true
}

// packExps packs an exponent vector into a monomial of width w; it
// returns false if an exponent is negative or above MaxExponent, or if a
// nonzero exponent does not fit in w words.
func packExps(exps []int, w int) ([]uint64, bool) {
	m := make([]uint64, w)
	for v, e := range exps {
		if e == 0 {
			continue
		}
		if e < 0 || e > MaxExponent || 1+v/perWord >= w {
			return nil, false
		}
		monoSetExp(m, v, e)
		m[0] += uint64(e)
	}
	return m, true
}

// monoDivides reports whether the monomial d divides m (d no wider than m
// or with zero extra words).
func monoDivides(m, d []uint64) bool {
	for k := 1; k < len(d); k++ {
		x := d[k]
		if x == 0 {
			continue
		}
		if k >= len(m) {
			return false
		}
		y := m[k]
		for f := 0; f < perWord; f++ {
			sh := topShift - expBits*f
			if x>>sh&expMask > y>>sh&expMask {
				return false
			}
		}
	}
	return true
}

// monoQuo returns m/d (d divides m) with width max(len(m), len(d)).
func monoQuo(m, d []uint64) []uint64 {
	out := make([]uint64, max(len(m), len(d)))
	copy(out, m)
	for k, x := range d {
		out[k] -= x
	}
	return out
}

// varPow returns the monomial v^e as packed words.
func varPow(v, e int) []uint64 {
	m := make([]uint64, wordsFor(v+1))
	monoSetExp(m, v, e)
	m[0] = uint64(e)
	return m
}

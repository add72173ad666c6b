package exact

// Term orders for Gröbner bases, and the monomials the engine computes
// with.
//
// A Poly keeps its terms in the ring's graded lex order; a Gröbner basis
// needs grevlex, lex or a block order. The engine (groebner*.go) converts
// its inputs to its own monomials and converts the results back. Every
// order used is a weight-matrix order with 0/1 rows of full rank (Robbiano's
// characterisation of term orders): grevlex on x1..xn has the rows
// (1,…,1), (1,…,1,0), …, (1,0,…,0) — the total degree, then the larger
// sum of all exponents but the last (the smaller last exponent) and so on —
// lex has the unit rows, and a block order stacks the grevlex rows of each
// block. The key W·e of a monomial is linear in its exponent vector e, so a
// monomial is stored as key words followed by exponent words, both packed
// four 16-bit fields to a word as in monomial.go: comparing the key words
// as unsigned integers is the term order, adding all words multiplies
// monomials, and the exponent words answer divisibility. Every key entry
// is at most the total degree, so a total degree of at most MaxExponent
// keeps every field in range; products are checked against it.

import "fmt"

// Order names a term order for Gröbner bases: "grevlex", "lex" or
// "elim" (a block order, built by ElimOrder).
type Order struct {
	// Name is "grevlex", "lex" or "elim".
	Name string
	// First lists the variables (ring indices) of the first block of an
	// elimination order: every monomial with one of them is larger than
	// every monomial without. Both blocks are ordered by grevlex.
	First []int
}

// Grevlex is the graded reverse lexicographic order on the ring's
// variables in the order they were made.
var Grevlex = Order{Name: "grevlex"}

// Lex is the lexicographic order: the first variable made is the largest.
var Lex = Order{Name: "lex"}

// ElimOrder returns the block order that eliminates the variables vars:
// grevlex on them, then grevlex on the others.
func ElimOrder(vars []int) Order { return Order{Name: "elim", First: vars} }

// String names the order as a notebook writes it.
func (o Order) String() string { return o.Name }

// monoOrder is an order fixed to n variables: its weight rows and the
// packed widths.
type monoOrder struct {
	n      int
	rows   [][]int // each row lists the variables with weight 1
	kw, ew int     // words of key and of exponents
	w      int     // kw + ew
}

// newMonoOrder fixes o to n variables (the ring's, plus extra ones the
// engine adds after them, which join the last block).
func newMonoOrder(o Order, n int) (*monoOrder, error) {
	var blocks [][]int
	switch o.Name {
	case "grevlex", "":
		blocks = [][]int{seq(0, n)}
	case "lex":
		for v := 0; v < n; v++ {
			blocks = append(blocks, []int{v})
		}
	case "elim":
		in := make([]bool, n)
		var first, rest []int
		for _, v := range o.First {
			if v < 0 || v >= n {
				return nil, fmt.Errorf("elimination order: variable index %d out of range: %w", v, ErrShape)
			}
			if !in[v] {
				in[v] = true
				first = append(first, v)
			}
		}
		for v := 0; v < n; v++ {
			if !in[v] {
				rest = append(rest, v)
			}
		}
		for _, b := range [][]int{first, rest} {
			if len(b) > 0 {
				blocks = append(blocks, b)
			}
		}
	default:
		return nil, fmt.Errorf("term order %q: want \"grevlex\", \"lex\" or \"elim\": %w", o.Name, ErrSyntax)
	}
	mo := &monoOrder{n: n}
	for _, b := range blocks {
		for k := len(b); k >= 1; k-- {
			mo.rows = append(mo.rows, b[:k])
		}
	}
	mo.kw = (len(mo.rows) + perWord - 1) / perWord
	mo.ew = (n + perWord - 1) / perWord
	if n == 0 {
		mo.kw, mo.ew = 1, 1
	}
	mo.w = mo.kw + mo.ew
	return mo, nil
}

func seq(a, b int) []int {
	s := make([]int, 0, b-a)
	for i := a; i < b; i++ {
		s = append(s, i)
	}
	return s
}

// field reads 16-bit field i of packed words ws.
func field(ws []uint64, i int) int {
	return int(ws[i/perWord] >> (topShift - expBits*(i%perWord)) & expMask)
}

func setField(ws []uint64, i, e int) {
	k, sh := i/perWord, topShift-expBits*(i%perWord)
	ws[k] = ws[k]&^(expMask<<sh) | uint64(e)<<sh
}

// pack writes the monomial of exponent vector e (len n, total degree at
// most MaxExponent) into m (mo.w words).
func (mo *monoOrder) pack(e []int, m []uint64) {
	clear(m)
	for r, vs := range mo.rows {
		s := 0
		for _, v := range vs {
			s += e[v]
		}
		setField(m[:mo.kw], r, s)
	}
	for v, x := range e {
		setField(m[mo.kw:], v, x)
	}
}

// exps returns the exponent vector of m.
func (mo *monoOrder) exps(m []uint64) []int {
	e := make([]int, mo.n)
	for v := range e {
		e[v] = field(m[mo.kw:], v)
	}
	return e
}

// deg is the total degree of m.
func (mo *monoOrder) deg(m []uint64) int {
	d := 0
	for _, x := range m[mo.kw:] {
		for ; x != 0; x <<= expBits {
			d += int(x >> topShift)
		}
	}
	return d
}

// cmp compares monomials in the order.
func (mo *monoOrder) cmp(a, b []uint64) int { return monoCmp(a[:mo.kw], b[:mo.kw]) }

// divides reports whether d divides m.
func (mo *monoOrder) divides(d, m []uint64) bool {
	for k := mo.kw; k < mo.w; k++ {
		x, y := d[k], m[k]
		if x == 0 {
			continue
		}
		// A field of x above y's borrows: compare field by field.
		for f := 0; f < perWord; f++ {
			sh := topShift - expBits*f
			if x>>sh&expMask > y>>sh&expMask {
				return false
			}
		}
	}
	return true
}

// lcm writes lcm(a, b) into out.
func (mo *monoOrder) lcm(a, b, out []uint64) {
	e := make([]int, mo.n)
	for v := range e {
		e[v] = max(field(a[mo.kw:], v), field(b[mo.kw:], v))
	}
	mo.pack(e, out)
}

// coprime reports whether a and b share no variable.
func (mo *monoOrder) coprime(a, b []uint64) bool {
	for k := mo.kw; k < mo.w; k++ {
		x, y := a[k], b[k]
		for f := 0; f < perWord; f++ {
			sh := topShift - expBits*f
			if x>>sh&expMask != 0 && y>>sh&expMask != 0 {
				return false
			}
		}
	}
	return true
}

// quo writes m/d (d divides m) into out.
func (mo *monoOrder) quo(m, d, out []uint64) {
	for k := range out {
		out[k] = m[k] - d[k]
	}
}

// sev is a short exponent vector: bit v%64 set when variable v occurs. If
// d divides m then sev(d) &^ sev(m) == 0, a cheap test before divides.
func (mo *monoOrder) sev(m []uint64) uint64 {
	var s uint64
	for v := 0; v < mo.n; v++ {
		if field(m[mo.kw:], v) != 0 {
			s |= 1 << (v % 64)
		}
	}
	return s
}

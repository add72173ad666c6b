package exact

// Real solutions of zero-dimensional polynomial systems, exactly.
//
// # The route
//
//  1. The reduced grevlex basis G of I = ⟨polys⟩. [1] means no solution.
//     The system is zero-dimensional exactly when every variable has a pure
//     power among the leading monomials; otherwise its dimension (the Krull
//     dimension of Q[x]/I) is the size of the largest set of variables no
//     leading monomial lies in alone (Cox, Little, O'Shea, "Ideals,
//     Varieties, and Algorithms", ch. 9 §3), and solve stops saying so.
//     The monomials divisible by no leading monomial (the standard
//     monomials) are a basis of Q[x]/I, so their number is the number of
//     complex solutions counted with multiplicity (ch. 5 §3).
//  2. The reduced lex basis. If it has the shape ⟨f(z), x_i − g_i(z)⟩, z
//     the lex-smallest variable, the solutions are z = the roots of f and
//     x_i = g_i(z): the real ones come from the real roots of f
//     (real_isolate.go), and their number of distinct complex solutions is
//     the degree of f's square-free part.
//  3. Otherwise the ideal is first made radical (Seidenberg's lemma: over
//     Q, a zero-dimensional I plus the square-free parts of its univariate
//     polynomials in each variable is the radical of I; Becker and
//     Weispfenning, "Gröbner Bases", Lemma 8.13), and, failing shape still,
//     z is replaced by z + Σ c_i·x_i with small random integers c_i. The
//     shape lemma (P. Gianni, T. Mora, "Algebraic solution of systems of
//     polynomial equations using Gröbner bases", AAECC-5, LNCS 356, 1989)
//     says a radical zero-dimensional ideal whose lex-smallest variable
//     takes distinct values at its distinct points has a lex basis of that
//     shape. For D points, a pair is left unseparated only when c lies on
//     one hyperplane, so with c_i drawn from {1..N} the chance of a failure
//     is at most D(D−1)/(2N) (Schwartz–Zippel); a failure shows in the
//     basis and another c is tried. Chance decides only the running time,
//     never the answer.
//  4. Every real solution is put back into every input polynomial and
//     proved to give exactly 0 (the zero bound of real_algebraic.go)
//     before it is returned.

import (
	"errors"
	"fmt"
	"math/big"
	"math/rand/v2"
	"slices"
	"strings"
)

// ErrPositiveDimension reports a system with infinitely many solutions.
var ErrPositiveDimension = errors.New("infinitely many solutions")

// Solutions are the solutions of a zero-dimensional system.
type Solutions struct {
	// Vars are the variables (ring indices) of the system, in ring order:
	// each point has one coordinate per variable, in this order.
	Vars []int
	// Points are the real solutions, by increasing lex-smallest coordinate
	// (after the change of coordinates, when one was needed).
	Points [][]*Real
	// Complex is the number of complex solutions counted with multiplicity
	// (the dimension of Q[x]/I); Distinct counts them without.
	Complex, Distinct int
}

// maxStandard caps the count of standard monomials.
const maxStandard = 1 << 20

// Solve returns the real solutions of the system polys = 0 and the number
// of its complex solutions. A system with infinitely many solutions gives
// ErrPositiveDimension with the dimension; an inconsistent one, no points
// and a count of 0. maxPrec caps the precision of the checks.
func Solve(polys []*Poly, lim GroebnerLimits, maxPrec uint) (*Solutions, error) {
	var ps []*Poly
	for _, p := range polys {
		if !p.IsZero() {
			ps = append(ps, p)
		}
	}
	if len(ps) == 0 {
		return nil, fmt.Errorf("solve: no equation other than 0 = 0: %w", ErrPositiveDimension)
	}
	r := ps[0].ring
	var vars []int
	for _, p := range ps {
		vars = append(vars, p.Vars()...)
	}
	slices.Sort(vars)
	vars = slices.Compact(vars)
	g, err := Groebner(ps, Grevlex, lim)
	if err != nil {
		return nil, fmt.Errorf("solve, the grevlex basis: %w", err)
	}
	out := &Solutions{Vars: vars}
	if len(g) == 1 && g[0].isConst() {
		return out, nil // the unit ideal: no solution
	}
	leads, err := leadVarExps(g, Grevlex)
	if err != nil {
		return nil, err
	}
	if d, free := dimension(vars, leads); d > 0 {
		names := make([]string, len(free))
		for i, v := range free {
			names[i] = r.name(v)
		}
		return nil, fmt.Errorf("solve: the solutions form a set of dimension %d (%s can vary freely), not finitely many points: %w", d, strings.Join(names, ", "), ErrPositiveDimension)
	}
	if out.Complex, err = countStandard(leads, len(leads[0])); err != nil {
		return nil, err
	}
	if len(vars) == 0 {
		return out, nil
	}
	z := vars[len(vars)-1]
	sys := ps
	radical := false
	rng := rand.New(rand.NewPCG(1, 2)) // fixed seed: the same run prints the same intervals
	var shift map[int]int64            // z was replaced by z + Σ shift[v]·v
	for try := 0; ; try++ {
		lex, err := Groebner(sys, Lex, lim)
		if err != nil {
			return nil, fmt.Errorf("solve, the lex basis: %w", err)
		}
		if f, gs, ok := shapeOf(lex, vars, z); ok {
			return out, out.fromShape(ps, f, gs, z, shift, maxPrec)
		}
		if try >= 8 {
			return nil, fmt.Errorf("solve: no separating coordinate found in %d random tries of the change of coordinates (a fault in assay, or very bad luck)", try)
		}
		if !radical {
			if sys, err = radicalOf(sys, vars, lim); err != nil {
				return nil, fmt.Errorf("solve, the radical: %w", err)
			}
			radical = true
			continue
		}
		// z → z − Σ c_v·v: the new z is the old z + Σ c_v·v.
		shift = map[int]int64{}
		sub := r.varPoly(z)
		for _, v := range vars[:len(vars)-1] {
			c := 1 + rng.Int64N(int64(10*(try+out.Complex)))
			shift[v] = c
			sub = sub.Sub(r.varPoly(v).Scale(new(big.Rat).SetInt64(c)))
		}
		sys = make([]*Poly, 0, len(ps))
		for _, p := range ps {
			q, err := p.Substitute(map[int]*Poly{z: sub})
			if err != nil {
				return nil, fmt.Errorf("solve, the change of coordinates: %w", err)
			}
			sys = append(sys, q)
		}
		if sys, err = radicalOf(sys, vars, lim); err != nil {
			return nil, fmt.Errorf("solve, the radical: %w", err)
		}
	}
}

// leadVarExps returns the exponent vectors of the leading monomials of
// the basis g in the order o.
func leadVarExps(g []*Poly, o Order) ([][]int, error) {
	e, err := newEngine(g[0].ring, o, 0, GroebnerLimits{})
	if err != nil {
		return nil, err
	}
	out := make([][]int, len(g))
	for i, b := range g {
		out[i] = e.mo.exps(e.fromPoly(b).lm(e.mo.w))
	}
	return out, nil
}

// dimension returns the Krull dimension of Q[vars]/I from the leading
// monomials of a Gröbner basis of I: the size of the largest set of
// variables no leading monomial lies in alone, and one such set. Sets are
// tried from the largest down (all of them: a greedy choice can stop at a
// maximal set that is not a largest one).
func dimension(vars []int, leads [][]int) (int, []int) {
	inside := func(set []int) bool { // some leading monomial in set alone
		in := map[int]bool{}
		for _, v := range set {
			in[v] = true
		}
		for _, l := range leads {
			ok := true
			for v, x := range l {
				if x > 0 && !in[v] {
					ok = false
					break
				}
			}
			if ok {
				return true
			}
		}
		return false
	}
	n := len(vars)
	if n > 24 {
		n = 24 // beyond this, subsets are too many; zero-dimensionality is still exact below
	}
	best := []int(nil)
	for mask := 1; mask < 1<<n; mask++ {
		var set []int
		for i := range n {
			if mask&(1<<i) != 0 {
				set = append(set, vars[i])
			}
		}
		if len(set) > len(best) && !inside(set) {
			best = set
		}
	}
	for _, v := range vars[n:] { // not enumerated: zero-dimensional only with a pure power
		if !inside([]int{v}) && len(best) == 0 {
			best = []int{v}
		}
	}
	return len(best), best
}

// countStandard counts the monomials divisible by no leading monomial
// (finitely many: every variable has a pure power among them).
func countStandard(leads [][]int, n int) (int, error) {
	bound := make([]int, n) // the pure power of each variable
	for _, l := range leads {
		v, pure := -1, true
		for i, x := range l {
			if x > 0 {
				if v >= 0 {
					pure = false
				}
				v = i
			}
		}
		if pure && v >= 0 && (bound[v] == 0 || l[v] < bound[v]) {
			bound[v] = l[v]
		}
	}
	e := make([]int, n)
	count := 0
	var walk func(i int) error
	walk = func(i int) error {
		for _, l := range leads {
			div := true
			for j := range l {
				if l[j] > e[j] {
					div = false
					break
				}
			}
			if div {
				return nil
			}
		}
		if i == n {
			if count++; count > maxStandard {
				return fmt.Errorf("solve: more than %d complex solutions: %w", maxStandard, ErrTooManyTerms)
			}
			return nil
		}
		top := bound[i]
		if top == 0 {
			top = 1 // a variable outside the system: exponent 0 only
		}
		for x := 0; x < top; x++ {
			e[i] = x
			if err := walk(i + 1); err != nil {
				return err
			}
		}
		e[i] = 0
		return nil
	}
	return count, walk(0)
}

// shapeOf recognizes a lex basis ⟨f(z), x_i − g_i(z)⟩: it returns f and,
// for each other variable x_i, g_i.
func shapeOf(lex []*Poly, vars []int, z int) (*Poly, map[int]*Poly, bool) {
	if len(lex) != len(vars) {
		return nil, nil, false
	}
	var f *Poly
	hs := map[int]*Poly{}
	only := func(p *Poly) bool {
		for _, v := range p.Vars() {
			if v != z {
				return false
			}
		}
		return true
	}
	for _, p := range lex {
		if only(p) {
			if f != nil {
				return nil, nil, false
			}
			f = p
			continue
		}
		found := false
		for _, v := range vars {
			if v != z && p.DegreeIn(v) == 1 {
				h := p.ring.varPoly(v).Sub(p)
				if only(h) && hs[v] == nil {
					hs[v], found = h, true
				}
				break
			}
		}
		if !found {
			return nil, nil, false
		}
	}
	return f, hs, f != nil && len(hs) == len(vars)-1
}

// radicalOf adds to the zero-dimensional system the square-free part of
// its univariate polynomial in each variable (Seidenberg's lemma).
func radicalOf(ps []*Poly, vars []int, lim GroebnerLimits) ([]*Poly, error) {
	out := slices.Clone(ps)
	for _, v := range vars {
		var others []int
		for _, u := range vars {
			if u != v {
				others = append(others, u)
			}
		}
		el, err := Eliminate(ps, others, lim)
		if err != nil {
			return nil, err
		}
		for _, f := range el {
			sf, err := squareFreePart(f)
			if err != nil {
				return nil, err
			}
			out = append(out, sf)
		}
	}
	return out, nil
}

// squareFreePart returns the product of p's square-free factors.
func squareFreePart(p *Poly) (*Poly, error) {
	_, fs, err := p.SquareFree()
	if err != nil {
		return nil, err
	}
	out := p.ring.one()
	for _, f := range fs {
		if out, err = out.Mul(f.Factor); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// fromShape fills in the real points from f(z) = 0, x_i = g_i(z), undoes
// the change of coordinates and checks every point in every input.
func (s *Solutions) fromShape(ps []*Poly, f *Poly, gs map[int]*Poly, z int, shift map[int]int64, maxPrec uint) error {
	sf, err := squareFreePart(f)
	if err != nil {
		return err
	}
	s.Distinct = sf.Degree()
	roots, err := RealRoots(f, maxPrec)
	if err != nil {
		return fmt.Errorf("solve, the real roots: %w", err)
	}
	for _, r := range roots {
		at := map[int]*Real{z: r}
		for v, g := range gs {
			if at[v], err = g.EvalReal(map[int]*Real{z: r}); err != nil {
				return err
			}
		}
		for v, c := range shift {
			at[z] = RealSub(at[z], RealMul(RealFromInt(c), at[v]))
		}
		pt := make([]*Real, len(s.Vars))
		for i, v := range s.Vars {
			pt[i] = at[v]
		}
		for k, p := range ps {
			val, err := p.EvalReal(at)
			if err != nil {
				return err
			}
			sg, err := val.Sign(maxPrec)
			if err != nil {
				return fmt.Errorf("solve, checking a solution in equation %d: %w", k+1, err)
			}
			if sg != 0 {
				return fmt.Errorf("solve: a computed solution fails equation %d (a fault in assay)", k+1)
			}
		}
		s.Points = append(s.Points, pt)
	}
	return nil
}

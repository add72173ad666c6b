package exact

// Factorization of univariate polynomials over Q (Zassenhaus's method):
// the square-free parts (factor_sqfree.go) of the primitive polynomial
// are each factored modulo a prime p that keeps them square-free and of
// full degree (factor_modp.go), the factors are lifted to a power of p
// beyond twice Mignotte's bound on the coefficients of any factor
// (factor_hensel.go), and subsets of the lifted factors are tried, smallest
// first, as true factors by trial division (H. Zassenhaus, "On Hensel
// factorization I", J. Number Theory 1, 1969; Modern Computer Algebra,
// Algorithm 15.19). Every factor returned has been checked by exact
// division, and a factor is irreducible because no product of fewer of
// its modular factors divides it: the subset search is exhaustive.
//
// The search costs about 2^(r−1) candidates for an irreducible f with r
// modular factors, so from vanHoeijMinFactors = 9 factors on, after a
// short search (quickSubsets candidates, which takes out factors made of
// one or two modular factors, as in x^n − 1), the rest is recombined by
// van Hoeij's lattice method (factor_vanhoeij.go, lll.go), whose
// conclusion is proved by exact bounds and trial division; if it does not
// conclude, the subset search resumes, and past maxSubsets candidates
// Factor gives up with ErrFactorLimit instead of running on. Measured
// (BenchmarkRecombine, December 2026, 2-core machine shared with other
// jobs, so ±50%): with 8 factors the search takes 0.1–0.5 ms and the
// lattice 0.4–0.6 ms; with 12 (a reducible product) 1.0 ms against
// 1.6 ms; with 16 (the irreducible Swinnerton-Dyer polynomial of degree
// 32) 90–200 ms against 10 ms. Degree 64 (32 factors, about 2^31
// candidates for the search) is proved irreducible in 0.3–1.2 s, and
// x^120 − 1 factors in about 0.2 s (BenchmarkSwinnertonDyer,
// BenchmarkFactorCyclotomic).

import (
	"errors"
	"fmt"
	"math/big"
	"slices"
	"sync"
)

// Sentinel errors of factorization.
var (
	// ErrFactorLimit reports a factorization given up at the subset
	// search cap: the answer is undecided, not "irreducible".
	ErrFactorLimit = errors.New("factor search limit reached")
)

// maxSubsets caps the candidates of the recombination search.
const maxSubsets = 1 << 20

// quickSubsets caps the subset search tried before the lattice method:
// a few milliseconds, about the lattice's cost at 12 factors
// (BenchmarkRecombine); 1<<8 made x^120 − 1 twice as fast as 1<<10.
const quickSubsets = 1 << 8

// primeTrials is how many suitable primes are tried before the one with
// the fewest modular factors is kept (common practice: the count varies
// with p, and the recombination cost grows exponentially with it).
const primeTrials = 5

// Factorization is p = Unit·∏ Factors[i].Factor^Factors[i].Mult, with the
// factors irreducible over Q, primitive with positive leading
// coefficients, distinct, and sorted as cmpFactor says: by total degree,
// leading monomial, then coefficients. A constant p has no factors; Unit
// is then p itself (0 for the zero polynomial).
type Factorization struct {
	Unit    *big.Rat
	Factors []FactorPower
}

// Factor returns the factorization of p into irreducible factors over Q,
// in any number of variables (factor_multi.go for several). A modular
// factorization whose recombination would need more than maxSubsets
// candidate products, or a multivariate one past maxLiftSubsets lifts,
// gives ErrFactorLimit: undecided, not irreducible.
func (p *Poly) Factor() (*Factorization, error) { return p.FactorStages(nil) }

// IsIrreducible reports whether p is irreducible over Q:
// not constant, and not a product of two non-constant polynomials.
func (p *Poly) IsIrreducible() (bool, error) {
	if p.isConst() || p.IsZero() {
		return false, nil
	}
	f, err := p.Factor()
	if err != nil {
		return false, err
	}
	return len(f.Factors) == 1 && f.Factors[0].Mult == 1, nil
}

// cmpFactor orders factors by total degree; then by leading monomial,
// the larger in the ring's term order first (a − b before b − c); then
// term by term from the largest monomial down: at the first monomial
// where the coefficients differ (an absent term counts as 0), the smaller
// coefficient comes first. For one variable this is the degree, then the
// coefficients from the highest power down.
func cmpFactor(a, b *Poly) int {
	if c := a.Degree() - b.Degree(); c != 0 {
		return c
	}
	w := max(a.w, b.w)
	am, bm := a.monoW(w), b.monoW(w)
	if c := monoCmp(am[:w], bm[:w]); c != 0 {
		return -c
	}
	i, j := 0, 0
	for i < a.n() || j < b.n() {
		c := 0
		switch {
		case j == b.n():
			c = 1
		case i == a.n():
			c = -1
		default:
			c = monoCmp(am[i*w:(i+1)*w], bm[j*w:(j+1)*w])
		}
		switch c {
		case 1:
			if s := a.numSign(i); s != 0 {
				return s
			}
			i++
		case -1:
			if s := b.numSign(j); s != 0 {
				return -s
			}
			j++
		default:
			if d := a.coefAt(i).Cmp(b.coefAt(j)); d != 0 {
				return d
			}
			i, j = i+1, j+1
		}
	}
	return 0
}

// toDense returns the coefficients of an integer polynomial in v, lowest
// degree first.
func toDense(p *Poly, v int) []*big.Int {
	out := make([]*big.Int, p.DegreeIn(v)+1)
	for i := range out {
		out[i] = new(big.Int)
	}
	for i := 0; i < p.n(); i++ {
		p.numAt(i, out[monoExp(p.monoAt(i), v)])
	}
	return out
}

// fromDense makes the polynomial in v with integer coefficients a.
func fromDense(r *Ring, v int, a []*big.Int) *Poly {
	b := newBuilder(wordsFor(v + 1))
	for e := len(a) - 1; e >= 0; e-- {
		if a[e].Sign() != 0 {
			b.pushBig(varPow(v, e), a[e])
		}
	}
	return b.poly(r, nil)
}

// factorSquareFreeZ returns the irreducible factors over Z of a primitive
// square-free integer polynomial with a positive leading coefficient.
func factorSquareFreeZ(f []*big.Int) ([][]*big.Int, error) {
	n := len(f) - 1
	if n <= 1 {
		return [][]*big.Int{f}, nil
	}
	p, facs, err := choosePrime(f)
	if err != nil {
		return nil, err
	}
	if len(facs) == 1 {
		return [][]*big.Int{f}, nil
	}
	lifted, M := liftPast(f, facs, p, new(big.Int).Lsh(mignotte(f), 1))
	if len(facs) < vanHoeijMinFactors {
		return recombine(f, lifted, M, p, maxSubsets)
	}
	// A short subset search first: it finishes at once, or takes out
	// the factors of few modular factors each (BenchmarkRecombine).
	found, f, lifted, done := recombineSome(f, lifted, M, quickSubsets)
	if done {
		return found, nil
	}
	if len(lifted) >= vanHoeijMinFactors {
		// The lattice needs the traces' digits too: lift the rest again,
		// from its factors mod p, as far as they ask.
		plan := planVanHoeij(f, len(lifted), p)
		P := new(big.Int).SetUint64(p)
		L, ML := lifted, M
		if need := new(big.Int).Exp(P, big.NewInt(int64(plan.need)), nil); need.Cmp(M) >= 0 {
			F := fp{p}
			var modp [][]uint64
			for _, g := range lifted {
				modp = append(modp, F.fromZ(g))
			}
			L, ML = liftPast(f, modp, p, need)
		}
		if out, ok := vanHoeij(f, L, ML, p, plan); ok {
			return append(found, out...), nil
		}
	}
	out, err := recombine(f, lifted, M, p, maxSubsets)
	return append(found, out...), err
}

// liftPast lifts the factors facs of f mod p to monic factors modulo
// M = p^(2^k), the first such M above bound.
func liftPast(f []*big.Int, facs [][]uint64, p uint64, bound *big.Int) ([][]*big.Int, *big.Int) {
	steps := 0
	M := new(big.Int).SetUint64(p)
	for ; M.Cmp(bound) <= 0; M.Mul(M, M) {
		steps++
	}
	return henselLift(f, facs, p, steps), M
}

// choosePrime returns an odd prime p not dividing lc(f) with f square-free
// mod p, and the monic irreducible factors of f mod p: of the first
// primeTrials such primes, the one with the fewest factors.
func choosePrime(f []*big.Int) (uint64, [][]uint64, error) {
	n := len(f) - 1
	var best []ddfPart
	var bestP uint64
	tried := 0
	for _, p := range smallPrimes() {
		F := fp{p}
		a := F.fromZ(f)
		if !F.squareFree(a, n) {
			continue
		}
		parts := F.ddf(F.monic(a))
		if best == nil || countFactors(parts) < countFactors(best) {
			best, bestP = parts, p
		}
		if tried++; tried == primeTrials || countFactors(best) == 1 {
			break
		}
	}
	if best == nil {
		return 0, nil, fmt.Errorf("factor: no prime below %d keeps the polynomial square-free: %w", primeSieveLimit, ErrFactorLimit)
	}
	return bestP, fp{bestP}.factorSquareFree(best), nil
}

const primeSieveLimit = 1 << 16

// smallPrimes returns the odd primes below primeSieveLimit, sieved once
// (every univariate factorization asks, and the multivariate method
// factors many images).
var smallPrimes = sync.OnceValue(func() []uint64 {
	composite := make([]bool, primeSieveLimit)
	var out []uint64
	for i := 3; i < primeSieveLimit; i += 2 {
		if composite[i] {
			continue
		}
		out = append(out, uint64(i))
		for j := i * i; j < primeSieveLimit; j += 2 * i {
			composite[j] = true
		}
	}
	return out
})

// mignotte returns a bound on the coefficients of l·g/lc(g) for every
// factor g of f over Z, l = lc(f): by Mignotte's inequality (M. Mignotte,
// "An inequality about factors of polynomials", Math. Comp. 28, 1974;
// Modern Computer Algebra, Corollary 6.33) ‖g‖∞ ≤ 2^deg(g)·|lc(g)/l|·‖f‖₂,
// so |l|·2^n·⌈‖f‖₂⌉ is a generous bound.
func mignotte(f []*big.Int) *big.Int {
	n := len(f) - 1
	ss := new(big.Int)
	t := new(big.Int)
	for _, c := range f {
		ss.Add(ss, t.Mul(c, c))
	}
	norm := new(big.Int).Sqrt(ss)
	norm.Add(norm, bigOne)
	norm.Lsh(norm, uint(n))
	return norm.Mul(norm, new(big.Int).Abs(f[n]))
}

// recombine finds the factors over Z of f from its monic factors modulo M
// (Zassenhaus): for subsets S of size s = 1, 2, …, the candidate is
// l·∏_S f_i reduced symmetrically mod M, and its primitive part is a true
// factor when it divides f. Found factors leave the search; when 2s passes
// the number left, the rest of f is irreducible.
func recombine(f []*big.Int, lifted [][]*big.Int, M *big.Int, p uint64, limit int) ([][]*big.Int, error) {
	out, _, _, done := recombineSome(f, lifted, M, limit)
	if !done {
		return nil, fmt.Errorf("factor: the %d factors modulo %d need more than %d trial products to recombine; undecided: %w", len(lifted), p, limit, ErrFactorLimit)
	}
	return out, nil
}

// recombineSome is recombine's search stopped after limit candidates:
// done, or the factors found so far (irreducible, since every smaller
// subset was tried first) with the rest of f and its lifted factors.
func recombineSome(f []*big.Int, lifted [][]*big.Int, M *big.Int, limit int) (out [][]*big.Int, rest []*big.Int, restLifted [][]*big.Int, done bool) {
	l := f[len(f)-1]
	restLifted = lifted
	done, _ = subsetSearch(lifted, limit, func(T [][]*big.Int, S []int, _ int) (bool, error) {
		if !constantTermPasses(f, T, S, M) {
			return false, nil
		}
		g := []*big.Int{new(big.Int).Set(l)}
		for _, i := range S {
			g = zMod(zMul(g, T[i]), M)
		}
		g = zPrimitive(zSym(g, M))
		q, ok := zDivExact(f, g)
		if ok {
			out, f = append(out, g), q
			restLifted = removeIndices(T, S)
		}
		return ok, nil
	})
	if done {
		return append(out, f), nil, nil, true
	}
	return out, f, restLifted, false
}

// subsetSearch is the search of Zassenhaus's recombination over the
// items T: for subsets S of size s = 1, 2, …, found(T, S, tried) says
// whether S gives a factor (and records it); a found S leaves T, and the
// search ends when 2s passes the number of items left, whose product is
// then irreducible. False means it gave up after limit subsets.
func subsetSearch[E any](T []E, limit int, found func(T []E, S []int, tried int) (bool, error)) (bool, error) {
	tried := 0
	for s := 1; 2*s <= len(T); {
		hit := false
		for S := range combinations(len(T), s) {
			if tried++; tried > limit {
				return false, nil
			}
			ok, err := found(T, S, tried)
			if err != nil {
				return false, err
			}
			if ok {
				T = removeIndices(T, S)
				hit = true
				break
			}
		}
		if !hit {
			s++
		}
	}
	return true, nil
}

// constantTermPasses is a cheap necessary test for a subset: a true
// factor's candidate has a constant term dividing l·f(0).
func constantTermPasses(f []*big.Int, T [][]*big.Int, S []int, M *big.Int) bool {
	if f[0].Sign() == 0 {
		return true
	}
	c := new(big.Int).Set(f[len(f)-1])
	for _, i := range S {
		c.Mod(c.Mul(c, T[i][0]), M)
	}
	if c.Cmp(new(big.Int).Rsh(M, 1)) > 0 {
		c.Sub(c, M)
	}
	if c.Sign() == 0 {
		return false
	}
	lf0 := new(big.Int).Mul(f[len(f)-1], f[0])
	return new(big.Int).Rem(lf0, c).Sign() == 0
}

// combinations yields the subsets of {0, …, n−1} of size k in
// lexicographic order (the slice is reused between yields).
func combinations(n, k int) func(yield func([]int) bool) {
	return func(yield func([]int) bool) {
		S := make([]int, k)
		for i := range S {
			S[i] = i
		}
		for {
			if !yield(S) {
				return
			}
			i := k - 1
			for i >= 0 && S[i] == n-k+i {
				i--
			}
			if i < 0 {
				return
			}
			S[i]++
			for j := i + 1; j < k; j++ {
				S[j] = S[j-1] + 1
			}
		}
	}
}

// removeIndices returns the items of T whose indices are not in S.
func removeIndices[E any](T []E, S []int) []E {
	var out []E
	for i, t := range T {
		if !slices.Contains(S, i) {
			out = append(out, t)
		}
	}
	return out
}

// zPrimitive divides a nonzero integer polynomial by its content, with
// the sign that makes the leading coefficient positive.
func zPrimitive(a []*big.Int) []*big.Int {
	g := new(big.Int)
	for _, c := range a {
		g.GCD(nil, nil, g, new(big.Int).Abs(c))
	}
	if a[len(a)-1].Sign() < 0 {
		g.Neg(g)
	}
	out := make([]*big.Int, len(a))
	for i, c := range a {
		out[i] = new(big.Int).Quo(c, g)
	}
	return out
}

// zDivExact returns a/b and true when b divides a over Z.
func zDivExact(a, b []*big.Int) ([]*big.Int, bool) {
	if len(b) > len(a) {
		return nil, false
	}
	r := zAdd(a, nil, 1)
	q := make([]*big.Int, len(a)-len(b)+1)
	lb := b[len(b)-1]
	t, m := new(big.Int), new(big.Int)
	for k := len(q) - 1; k >= 0; k-- {
		c, rem := new(big.Int).QuoRem(r[k+len(b)-1], lb, m)
		if rem.Sign() != 0 {
			return nil, false
		}
		q[k] = c
		for j, y := range b {
			r[k+j].Sub(r[k+j], t.Mul(c, y))
		}
	}
	for _, c := range r[:len(b)-1] {
		if c.Sign() != 0 {
			return nil, false
		}
	}
	return q, true
}

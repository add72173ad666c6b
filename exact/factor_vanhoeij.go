package exact

// Van Hoeij's recombination of lifted modular factors by lattice
// reduction (M. van Hoeij, "Factoring polynomials and the knapsack
// problem", J. Number Theory 95, 2002), in the variant with power sums of
// the roots ("traces") of the original paper.
//
// The lifted monic factors f_1, …, f_r of f modulo M = p^a are the
// unknowns' coordinates: a true factor g of f is ∏_{i∈S} f_i for one
// subset S (times a constant), and its 0/1 indicator vector e_S is what
// is sought. For j ≥ 1 the j-th power sum of the roots satisfies
// Tr_j(g) = Σ_{i∈S} Tr_j(f_i) (mod M), and l^j·Tr_j(g), l = lc(f), is an
// integer of absolute value at most B_j = n·(|l|·R)^j, R a bound on the
// roots of f (Fujiwara's). So with T_ij = l^j·Tr_j(f_i) mod M, cut to its
// digits from p^b_j (p^b_j ≥ B_j) up to p^(b_j+c), every e_S gives a
// lattice vector (e_S, u) with each |u_j| ≤ r/2 + 1, short, while most
// other vectors of the lattice grow with p^c. Reducing the lattice (LLL,
// lll.go) and dropping the last basis vectors whose exact Gram–Schmidt
// norm passes the bound keeps every e_S in the span of what is left (a
// lattice vector shorter than the bound lies in the span of the first
// basis vectors whose Gram–Schmidt norms do not pass it). Columns of
// traces are added in batches until the kept rows W, k of them, make the
// indices fall into k classes of equal columns; every e_S is then
// constant on each class (it is an integer combination of W's rows), so
// each true factor is a product over whole classes. When every class's
// candidate divides f, the classes are the irreducible factors: a proper
// factor of one would be a product over part of a class.
//
// Every step that decides the answer is exact (the bounds, the row
// operations, the Gram–Schmidt norms, the trial divisions); the float
// LLL only decides how fast the lattice shrinks. When the traces run out
// or the reduction gives up, the caller falls back to Zassenhaus's
// search with its cap, so a failure costs time, never a wrong answer.

import "math/big"

// vanHoeijMinFactors is the number of modular factors from which the
// lattice recombination is tried before the subset search (measured:
// BenchmarkRecombine; below it the subsets are cheap).
const vanHoeijMinFactors = 9

// traceColumnBits is about how many bits each trace column brings to the
// lattice (p^c ≥ 2^traceColumnBits): enough that a batch shrinks the
// lattice, small enough for float64 Gram–Schmidt data.
const traceColumnBits = 24

// vhPlan is the precision van Hoeij's method needs: traces 1..N, trace j
// cut at p^b[j] and kept to p^(b[j]+c); the lifting must reach p^a with
// a ≥ b[N]+c.
type vhPlan struct {
	N, c int
	b    []int // b[j] for j = 1..N
	need int   // the exponent a needed
}

// planVanHoeij returns the trace plan for f with r modular factors mod p.
func planVanHoeij(f []*big.Int, r int, p uint64) vhPlan {
	n := len(f) - 1
	N := min(n, 2*r+8)
	P := new(big.Int).SetUint64(p)
	c := 1
	for pc := new(big.Int).Set(P); pc.BitLen() <= traceColumnBits; pc.Mul(pc, P) {
		c++
	}
	// B_j = n·(|l|·R)^j with R = 2^e.
	lR := new(big.Int).Lsh(new(big.Int).Abs(f[n]), uint(rootBoundExp(f)))
	plan := vhPlan{N: N, c: c, b: make([]int, N+1)}
	Bj := big.NewInt(int64(n))
	pb := big.NewInt(1)
	b := 0
	for j := 1; j <= N; j++ {
		Bj.Mul(Bj, lR)
		for pb.Cmp(Bj) < 0 {
			pb.Mul(pb, P)
			b++
		}
		plan.b[j] = b
	}
	plan.need = plan.b[N] + c
	return plan
}

// rootBoundExp returns e with every complex root z of f having
// |z| ≤ 2^e, by Fujiwara's bound |z| ≤ 2·max_i |a_{n−i}/a_n|^{1/i}
// (M. Fujiwara, "Über die obere Schranke des absoluten Betrages der
// Wurzeln einer algebraischen Gleichung", Tôhoku Math. J. 10, 1916), each
// ratio rounded up to a power of two from bit lengths.
func rootBoundExp(f []*big.Int) int {
	n := len(f) - 1
	ln := f[n].BitLen() - 1 // |a_n| ≥ 2^ln
	e := 0
	for i := 1; i <= n; i++ {
		if f[n-i].Sign() == 0 {
			continue
		}
		// |a_{n−i}/a_n| < 2^k, so its i-th root is below 2^⌈k/i⌉.
		k := f[n-i].BitLen() - ln
		e = max(e, (k+i-1)/i)
	}
	return e + 1
}

// powerSums returns Tr_1..Tr_N of the roots of the monic g modulo M, by
// Newton's identities: Tr_k = −(k·c_{d−k} + Σ_{i=1}^{k−1} c_{d−i}·Tr_{k−i}),
// with c_m = 0 for m < 0 (common practice).
func powerSums(g []*big.Int, N int, M *big.Int) []*big.Int {
	d := len(g) - 1
	tr := make([]*big.Int, N+1)
	t := new(big.Int)
	for k := 1; k <= N; k++ {
		s := new(big.Int)
		if k <= d {
			s.Mul(big.NewInt(int64(k)), g[d-k])
		}
		for i := 1; i < k && i <= d; i++ {
			s.Add(s, t.Mul(g[d-i], tr[k-i]))
		}
		tr[k] = s.Neg(s).Mod(s, M)
	}
	return tr
}

// vanHoeij recombines the monic lifted factors of f modulo M = p^a
// (a ≥ plan.need). It returns the irreducible factors over Z and true, or
// false when the method did not conclude.
func vanHoeij(f []*big.Int, lifted [][]*big.Int, M *big.Int, p uint64, plan vhPlan) ([][]*big.Int, bool) {
	r := len(lifted)
	l := f[len(f)-1]
	P := new(big.Int).SetUint64(p)
	pc := new(big.Int).Exp(P, big.NewInt(int64(plan.c)), nil)
	// X[i][j] = the digits b_j .. b_j+c of l^j·Tr_j(f_i), rounded.
	X := make([][]*big.Int, r)
	lj := make([]*big.Int, plan.N+1)
	lj[0] = big.NewInt(1)
	for j := 1; j <= plan.N; j++ {
		lj[j] = new(big.Int).Mul(lj[j-1], l)
		lj[j].Mod(lj[j], M)
	}
	for i, g := range lifted {
		tr := powerSums(g, plan.N, M)
		X[i] = make([]*big.Int, plan.N+1)
		for j := 1; j <= plan.N; j++ {
			T := new(big.Int).Mul(tr[j], lj[j])
			T.Mod(T, M)
			pb := new(big.Int).Exp(P, big.NewInt(int64(plan.b[j])), nil)
			T.Add(T, new(big.Int).Rsh(pb, 1)) // round to nearest
			T.Quo(T, pb)
			X[i][j] = T.Mod(T, pc)
		}
	}
	// W: the current basis of a lattice holding every true e_S.
	W := make([][]*big.Int, r)
	for i := range W {
		W[i] = make([]*big.Int, r)
		for j := range W[i] {
			W[i][j] = big.NewInt(0)
		}
		W[i][i].SetInt64(1)
	}
	U := int64(r/2 + 1)
	half := new(big.Int).Rsh(pc, 1)
	t := new(big.Int)
	for j0 := 1; j0 <= plan.N; {
		// The next batch: columns that carry information, about one
		// per row of W.
		var cols []int
		for ; j0 <= plan.N && len(cols) < max(len(W)/2, 2); j0++ {
			for i := range X {
				if X[i][j0].Sign() != 0 {
					cols = append(cols, j0)
					break
				}
			}
		}
		if len(cols) == 0 {
			break
		}
		k := len(W)
		B := make([][]*big.Int, k+len(cols))
		for i, w := range W {
			row := make([]*big.Int, r+len(cols))
			for m, c := range w {
				row[m] = new(big.Int).Set(c)
			}
			for m, j := range cols {
				s := new(big.Int)
				for i2, c := range w {
					s.Add(s, t.Mul(c, X[i2][j]))
				}
				if s.Mod(s, pc).Cmp(half) > 0 {
					s.Sub(s, pc)
				}
				row[r+m] = s
			}
			B[i] = row
		}
		for m := range cols {
			row := make([]*big.Int, r+len(cols))
			for i := range row {
				row[i] = new(big.Int)
			}
			row[r+m].Set(pc)
			B[k+m] = row
		}
		// The cap is far above the swaps measured (about 7·n² for
		// Swinnerton-Dyer of degree 64, n = 64).
		if !lllReduce(B, 100*len(B)*len(B)+1000) {
			return nil, false
		}
		// Drop the tail whose Gram–Schmidt norms pass the bound
		// ‖(e_S, u)‖² ≤ r + |cols|·U².
		bound := big.NewInt(int64(r) + int64(len(cols))*U*U)
		d := gramMinors(B)
		keep := len(B)
		for keep > 0 && d[keep].Cmp(t.Mul(bound, d[keep-1])) > 0 {
			keep--
		}
		if keep == 0 {
			return nil, false // impossible with sound bounds: e_{1..r} is in the lattice
		}
		W = W[:0]
		for _, row := range B[:keep] {
			W = append(W, row[:r])
		}
		if dw := gramMinors(W); dw[keep].Sign() == 0 {
			return nil, false // the projection lost rank: give up
		}
		if out, ok := vhClasses(f, lifted, M, W); ok {
			return out, true
		}
	}
	return nil, false
}

// vhClasses groups the indices of the factors by equal columns of W and,
// when there are as many classes as rows, returns the candidate of each
// class if all of them divide f.
func vhClasses(f []*big.Int, lifted [][]*big.Int, M *big.Int, W [][]*big.Int) ([][]*big.Int, bool) {
	r := len(lifted)
	class := make([]int, r)
	var reps []int
	for i := 0; i < r; i++ {
		class[i] = -1
		for c, j := range reps {
			same := true
			for _, w := range W {
				if w[i].Cmp(w[j]) != 0 {
					same = false
					break
				}
			}
			if same {
				class[i] = c
				break
			}
		}
		if class[i] < 0 {
			class[i] = len(reps)
			reps = append(reps, i)
		}
		if len(reps) > len(W) {
			return nil, false
		}
	}
	if len(reps) != len(W) {
		return nil, false
	}
	l := f[len(f)-1]
	var out [][]*big.Int
	rest := f
	for c := range reps {
		g := []*big.Int{new(big.Int).Set(l)}
		for i := range lifted {
			if class[i] == c {
				g = zMod(zMul(g, lifted[i]), M)
			}
		}
		g = zPrimitive(zSym(g, M))
		q, ok := zDivExact(rest, g)
		if !ok {
			return nil, false
		}
		out, rest = append(out, g), q
	}
	return out, true
}

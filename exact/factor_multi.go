package exact

// Factorization of polynomials in several variables over Q, by evaluation
// and multivariate Hensel lifting (P. S. Wang, "An improved multivariate
// polynomial factoring algorithm", Math. Comp. 32, 1978; Algorithms for
// Computer Algebra, ch. 6):
//
//  1. F, primitive over Z, is split into its content and primitive part
//     P with respect to a main variable x; the content, in fewer
//     variables, is factored recursively. P is shown square-free by one
//     square-free image (squareFreeByImage), or else split into its
//     square-free parts by Yun's method (factor_sqfree.go), each factored
//     on its own. x is a variable whose
//     leading coefficient in F is a constant if there is one (then no
//     leading-coefficient work is needed), else one of lowest degree, and
//     of those one whose leading coefficient has the lowest degree.
//  2. A point a for the other variables is chosen with lc_x(P)(a) ≠ 0 and
//     P(x, a) square-free (so the degree in x is kept and the images of
//     distinct factors are coprime): the origin first, which keeps sparse
//     polynomials sparse, then small random integers. Of the first
//     evalPoints such points, the one whose image has the fewest factors
//     over Q (the univariate factorization of factor.go) is kept.
//  3. One factor in the image: P is irreducible (below). Otherwise the
//     images are lifted (factor_lift.go) with the leading coefficient in x
//     of every factor imposed, which makes the lift unique. When
//     L = lc_x(P) is a constant, the images' own leading coefficients
//     serve. Otherwise L is factored and, when the point also meets Wang's
//     condition (separate: each factor of L has a prime at a of its own),
//     each factor's leading coefficient is read off the images' leading
//     coefficients (predetermine), and P/δ is lifted. When it does not,
//     the simple way: L^(r−1)·P is lifted with L imposed on every factor,
//     and the true factors are the primitive parts of the lifted ones;
//     it needs nothing of the point, but lifts a larger polynomial (five
//     dense trivariate factors: about 1 s against 0.4 s predetermined).
//     Points meeting Wang's condition are preferred for the first half of
//     the tries.
//  4. A lift fails exactly when the image has more factors than P (a
//     factorization with those images would be found: lifting with imposed
//     leading coefficients is unique, and predetermined ones are right
//     when there are as many images as factors). Then subsets of the images are
//     lifted as two-factor splits, smallest first, as in Zassenhaus's
//     recombination (factor.go): the first subset that lifts gives an
//     irreducible factor, which is divided out.
//
// Why a factor G found is irreducible: G is primitive in x, G(x, a) is a
// constant times one irreducible image, or (step 4) the image of a subset
// no smaller subset of which lifts, and lc_x(G)(a) ≠ 0. A split G = H·K
// would have deg_x H, deg_x K ≥ 1 (G is primitive in x), images of full
// degree, so it would split the image: a contradiction in the first case,
// and in the second H would have been found from a smaller subset.

import (
	"fmt"
	"math/big"
	"math/rand"
	"slices"
	"strings"
)

// evalPoints is how many good evaluation points are tried before the one
// whose image has the fewest factors is kept (common practice: a few
// points guard against an unlucky one with extraneous factors).
const evalPoints = 3

// maxPointTries bounds the candidates drawn for a good evaluation point.
const maxPointTries = 200

// maxLiftSubsets caps the two-factor lifts of step 4.
const maxLiftSubsets = 1 << 12

// factorer carries the stage reporter through one factorization.
type factorer struct {
	stage func(string)
}

func (f *factorer) say(s string) {
	if f.stage != nil {
		f.stage(s)
	}
}

// FactorStages is Factor reporting, through stage, the stage it is in
// each time a stage starts or a long one takes another step (a string
// such as "Hensel lifting in y (degree 3 of 12)"; "" when it returns). It
// lets a caller that is stopped by a time limit say what was running.
func (p *Poly) FactorStages(stage func(string)) (*Factorization, error) {
	f := &factorer{stage: stage}
	defer f.say("")
	return f.factorization(p)
}

// factorization is FactorStages without the last report.
func (f *factorer) factorization(p *Poly) (*Factorization, error) {
	if c, ok := p.Constant(); ok {
		return &Factorization{Unit: c}, nil
	}
	fs, err := f.primitive(p.PrimitivePart(), false)
	if err != nil {
		return nil, err
	}
	slices.SortFunc(fs, func(a, b FactorPower) int { return cmpFactor(a.Factor, b.Factor) })
	out := &Factorization{Unit: unitOf(p, fs), Factors: fs}
	// The unit comes from leading coefficients alone, so the product is
	// checked whole: a factorization returned is one.
	f.say("multiplying the factors back")
	if back, err := out.Product(p.ring); err != nil || !back.Equal(p) {
		if err != nil {
			return nil, err
		}
		return nil, fmt.Errorf("factor %v: internal error: the factors found do not multiply back to it", clipText(p.String()))
	}
	return out, nil
}

// Product returns Unit·∏ Factor^Mult, in the ring r.
func (f *Factorization) Product(r *Ring) (*Poly, error) {
	out := r.Const(f.Unit)
	for _, fp := range f.Factors {
		pw, err := fp.Factor.Pow(fp.Mult)
		if err != nil {
			return nil, err
		}
		if out, err = out.Mul(pw); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// primitive factors F, primitive over Z with a positive leading
// coefficient, with multiplicities: the content in the main variable
// recursively, and the primitive part P directly when it is known to be
// square-free or one image shows it is, else through its square-free
// decomposition (Yun's method, which for large P costs more than the rest
// together).
func (f *factorer) primitive(F *Poly, squareFree bool) ([]FactorPower, error) {
	vs := F.Vars()
	var out []FactorPower
	switch {
	case len(vs) == 0:
		return nil, nil
	case len(vs) == 1 && squareFree:
		fs, err := f.univariate(F, vs[0])
		return appendMult(nil, fs, 1), err
	case len(vs) > 1:
		x := mainVariable(F, vs)
		f.say("splitting off the content in " + F.ring.name(x))
		C, P, err := splitContentIn(F, x)
		if err != nil {
			return nil, err
		}
		if out, err = f.primitive(C, squareFree); err != nil {
			return nil, err
		}
		if !squareFree {
			if squareFree, err = squareFreeByImage(P, x, vs); err != nil {
				return nil, err
			}
		}
		if squareFree {
			fs, err := f.primitiveIn(P, x)
			return appendMult(out, fs, 1), err
		}
		F = P
	}
	f.say("decomposing into square-free parts")
	parts, err := squareFreePrim(F)
	if err != nil {
		return nil, err
	}
	for _, sf := range parts {
		fs, err := f.primitive(sf.Factor, true)
		if err != nil {
			return nil, err
		}
		for _, g := range fs {
			out = append(out, FactorPower{g.Factor, sf.Mult})
		}
	}
	return out, nil
}

func appendMult(out []FactorPower, fs []*Poly, k int) []FactorPower {
	for _, g := range fs {
		out = append(out, FactorPower{g, k})
	}
	return out
}

// squareFreeByImage reports that P, primitive in x, is square-free, from
// an image P(x, a) that keeps the degree in x and is square-free: a
// repeated factor G of P involves x (P is primitive in x), keeps its
// degree in x at a, and so would repeat in the image. False means no such
// image among the origin and two small points, not that P has a square.
func squareFreeByImage(P *Poly, x int, vs []int) (bool, error) {
	L := P.lcIn(x)
	for try := int64(0); try < 3; try++ {
		vals := map[int]*big.Rat{}
		for i, v := range vs {
			if v != x {
				vals[v] = big.NewRat(try*int64(i%3-1+2*i), 1)
			}
		}
		if L.Eval(vals).IsZero() {
			continue
		}
		img := P.Eval(vals)
		g, err := GCD(img, img.Derivative(x))
		if err != nil {
			return false, err
		}
		if g.isConst() {
			return true, nil
		}
	}
	return false, nil
}

func (f *factorer) univariate(F *Poly, x int) ([]*Poly, error) {
	f.say("factoring a polynomial in " + F.ring.name(x) + " alone")
	gs, err := factorSquareFreeZ(toDense(F, x))
	if err != nil {
		return nil, err
	}
	out := make([]*Poly, len(gs))
	for i, g := range gs {
		out[i] = fromDense(F.ring, x, g)
	}
	return out, nil
}

// mainVariable picks x: a constant leading coefficient first, then the
// lowest degree, then the leading coefficient of lowest total degree (the
// lift multiplies by its powers), then the first variable.
func mainVariable(F *Poly, vs []int) int {
	best := -1
	var bestKey [3]int
	for _, v := range vs {
		L := F.lcIn(v)
		key := [3]int{1, F.DegreeIn(v), L.Degree()}
		if L.isConst() {
			key[0] = 0
		}
		if best < 0 || slices.Compare(key[:], bestKey[:]) < 0 {
			best, bestKey = v, key
		}
	}
	return best
}

// primitiveIn factors P, primitive in x and square-free.
func (f *factorer) primitiveIn(P *Poly, x int) ([]*Poly, error) {
	vs := P.Vars()
	if P.DegreeIn(x) == 1 {
		return []*Poly{P}, nil
	}
	if len(vs) == 1 {
		return f.univariate(P, x)
	}
	ys := slices.DeleteFunc(slices.Clone(vs), func(v int) bool { return v == x })
	var lf *Factorization
	if L := P.lcIn(x); !L.isConst() {
		f.say("factoring the leading coefficient")
		var err error
		if lf, err = f.factorization(L); err != nil {
			return nil, err
		}
	}
	a, images, q, err := f.choosePoint(P, x, ys, lf)
	if err != nil {
		return nil, err
	}
	if len(images) == 1 {
		return []*Poly{P}, nil
	}
	// Move the point to the origin.
	f.say("moving the evaluation point to the origin")
	shift, back := map[int]*Poly{}, map[int]*Poly{}
	for i, y := range ys {
		if a[i] != 0 {
			c := P.ring.Const(new(big.Rat).SetInt64(a[i]))
			shift[y] = P.ring.varPoly(y).Add(c)
			back[y] = P.ring.varPoly(y).Sub(c)
		}
	}
	Ps, err := P.Substitute(shift)
	if err != nil {
		return nil, err
	}
	pre, err := predetermine(P, x, lf, q, images, shift)
	if err != nil {
		return nil, err
	}
	gs, err := f.recombine(Ps, x, ys, images, maxLiftSubsets, pre)
	if err != nil {
		return nil, err
	}
	for i, g := range gs {
		if gs[i], err = g.Substitute(back); err != nil {
			return nil, err
		}
		gs[i] = gs[i].PrimitivePart()
	}
	return gs, nil
}

// choosePoint returns a point for ys (step 2), the irreducible factors
// of the image, primitive integer polynomials in x, and when lf, the
// factorization of a non-constant leading coefficient, is given, the
// parts q_j of separate (nil if the point does not separate them). For
// the first half of the tries only points that separate count as good.
func (f *factorer) choosePoint(P *Poly, x int, ys []int, lf *Factorization) ([]int64, []*Poly, []*big.Int, error) {
	L := P.lcIn(x)
	rng := rand.New(rand.NewSource(int64(P.Len())))
	var best []*Poly
	var bestA []int64
	var bestQ []*big.Int
	good := 0
	for try := 0; try < maxPointTries && good < evalPoints; try++ {
		f.say("choosing an evaluation point")
		a := pointCandidate(rng, try, len(ys))
		vals := make(map[int]*big.Rat, len(ys))
		for i, y := range ys {
			vals[y] = new(big.Rat).SetInt64(a[i])
		}
		if L.Eval(vals).IsZero() {
			continue
		}
		// Wang's condition first without the image's content (cheap),
		// then with it.
		strict := lf != nil && try < maxPointTries/2
		if strict && separate(lf, vals, bigOne) == nil {
			continue
		}
		img := P.Eval(vals)
		q := separate(lf, vals, img.Content().Num())
		if strict && q == nil {
			continue
		}
		img = img.PrimitivePart()
		g, err := GCD(img, img.Derivative(x))
		if err != nil {
			return nil, nil, nil, err
		}
		if !g.isConst() {
			continue
		}
		good++
		fs, err := f.univariate(img, x)
		if err != nil {
			return nil, nil, nil, err
		}
		if best == nil || len(fs) < len(best) || len(fs) == len(best) && bestQ == nil && q != nil {
			best, bestA, bestQ = fs, a, q
		}
		if len(best) == 1 {
			break
		}
	}
	if best == nil {
		return nil, nil, nil, fmt.Errorf("factor: no evaluation point among %d tried keeps %v square-free with its degree in %s: %w", maxPointTries, clipText(P.String()), P.ring.name(x), ErrFactorLimit)
	}
	return bestA, best, bestQ, nil
}

// pointCandidate returns candidate try for n coordinates: the origin,
// then points with few nonzero coordinates, more and larger as the tries
// go on. Zeros keep a sparse polynomial sparse when the point is moved to
// the origin (a shifted variable spreads into all its powers).
func pointCandidate(rng *rand.Rand, try, n int) []int64 {
	a := make([]int64, n)
	if try == 0 {
		return a
	}
	bound := int64(1 + try/4)
	for _, i := range rng.Perm(n)[:min(n, 1+try/8)] {
		a[i] = 1 + rng.Int63n(bound)
		if rng.Intn(2) == 0 {
			a[i] = -a[i]
		}
	}
	return a
}

// recombine lifts the images of P (point at the origin) to the
// irreducible factors of P: all at once, else by subsets (steps 3, 4), at
// most limit of them.
func (f *factorer) recombine(P *Poly, x int, ys []int, images []*Poly, limit int, pre *predetermined) ([]*Poly, error) {
	lift := func() ([]*Poly, bool, error) { return f.liftImages(P, x, ys, images) }
	if pre != nil {
		lift = func() ([]*Poly, bool, error) {
			f.say(fmt.Sprintf("lifting %d factors with predetermined leading coefficients", len(images)))
			return f.liftWith(pre.A, x, ys, images, pre.lc)
		}
	}
	if gs, ok, err := lift(); err != nil || ok {
		return gs, err
	}
	var out []*Poly
	ok, err := subsetSearch(images, limit, func(T []*Poly, S []int, tried int) (bool, error) {
		f.say(fmt.Sprintf("recombining: lifting subset %d of the %d image factors", tried, len(T)))
		g, err := mulAll(P.ring, pick(T, S, true))
		if err != nil {
			return false, err
		}
		h, err := mulAll(P.ring, pick(T, S, false))
		if err != nil {
			return false, err
		}
		gs, ok, err := f.liftImages(P, x, ys, []*Poly{g, h})
		if err != nil || !ok {
			return false, err
		}
		out = append(out, gs[0])
		P, err = exactQuo(P, gs[0])
		return err == nil, err
	})
	if err != nil {
		return nil, err
	}
	if !ok {
		return nil, fmt.Errorf("factor: the %d factors of the image need more than %d two-factor lifts to recombine; undecided: %w", len(images), limit, ErrFactorLimit)
	}
	return append(out, P.PrimitivePart()), nil
}

// pick returns the items of T in S (in = true) or not in S.
func pick(T []*Poly, S []int, in bool) []*Poly {
	var out []*Poly
	for i, t := range T {
		if slices.Contains(S, i) == in {
			out = append(out, t)
		}
	}
	return out
}

// liftImages lifts L^(r−1)·P from the images (step 3) and returns the
// primitive parts of the lifted factors, or false when the images do not
// come from a factorization of P.
func (f *factorer) liftImages(P *Poly, x int, ys []int, images []*Poly) ([]*Poly, bool, error) {
	L := P.lcIn(x)
	r := len(images)
	f.say(fmt.Sprintf("imposing the leading coefficient on %d factors", r))
	Lr, err := L.Pow(r - 1)
	if err != nil {
		return nil, false, err
	}
	A, err := P.Mul(Lr)
	if err != nil {
		return nil, false, err
	}
	lc := make([]*Poly, r)
	for i := range lc {
		lc[i] = L
	}
	return f.liftWith(A, x, ys, images, lc)
}

// liftWith lifts A from the images with the leading coefficients lc
// imposed (∏ lc = lc_x(A)), and returns the primitive parts of the lifted
// factors, or false when there is no such factorization.
func (f *factorer) liftWith(A *Poly, x int, ys []int, images, lc []*Poly) ([]*Poly, bool, error) {
	r := len(images)
	u := make([]*Poly, r)
	for i, g := range images {
		// u_i = g·lc_i(0)/lc(g), so that lc(u_i) = lc_i(0).
		l0, _ := atZero(lc[i], ys).Constant()
		u[i] = g.Scale(new(big.Rat).Quo(l0, g.lcIn(x).LeadingCoefficient()))
	}
	bound := make([]int, len(ys))
	for i, y := range ys {
		bound[i] = A.DegreeIn(y)
	}
	l := &lifter{x: x, ys: ys, bound: bound, A: A, lc: lc, say: f.say}
	U, ok, err := l.lift(u)
	if err != nil || !ok {
		return nil, false, err
	}
	out := make([]*Poly, r)
	for i, g := range U {
		if _, out[i], err = splitContentIn(g.PrimitivePart(), x); err != nil {
			return nil, false, err
		}
	}
	return out, true, nil
}

// String writes the product readably: the unit (left out when it is 1, a
// minus sign when it is −1), then each factor, in parentheses unless it
// is a single term, with ^k for a multiplicity k above 1, joined by "·":
// "-(a - b - c)·(a + b + c)", "3/4·(x - y)^2·x^3". A constant prints as
// its unit.
func (f *Factorization) String() string {
	if len(f.Factors) == 0 {
		return FormatRat(f.Unit)
	}
	var sb strings.Builder
	switch u := FormatRat(f.Unit); u {
	case "1":
	case "-1":
		sb.WriteString("-")
	default:
		sb.WriteString(u + "·")
	}
	for i, fp := range f.Factors {
		if i > 0 {
			sb.WriteString("·")
		}
		if s := fp.Factor.String(); fp.Factor.Len() == 1 {
			sb.WriteString(s)
		} else {
			sb.WriteString("(" + s + ")")
		}
		if fp.Mult > 1 {
			fmt.Fprintf(&sb, "^%d", fp.Mult)
		}
	}
	return sb.String()
}

// predetermined is the target and the leading coefficients of Wang's
// predetermination, in the shifted variables.
type predetermined struct {
	A  *Poly   // P/δ
	lc []*Poly // the leading coefficient of each factor, ∏ lc = L/δ
}

// separate returns, for the factorization lf = δ·∏ F_j^e_j of the
// leading coefficient and the point vals, the parts q_j of the F_j(a)
// made of primes that divide no other F_l(a), nor δ, nor c (Wang's
// condition on the point, with c the content of the image; 1 to leave it
// out); nil when lf is nil or some q_j is 1.
func separate(lf *Factorization, vals map[int]*big.Rat, c *big.Int) []*big.Int {
	if lf == nil {
		return nil
	}
	Fa := make([]*big.Int, len(lf.Factors))
	for j, F := range lf.Factors {
		v, _ := F.Factor.Eval(vals).Constant()
		Fa[j] = new(big.Int).Abs(v.Num())
	}
	q := make([]*big.Int, len(Fa))
	for j := range Fa {
		R := new(big.Int).Mul(lf.Unit.Num(), c)
		for l, v := range Fa {
			if l != j {
				R.Mul(R, v)
			}
		}
		if q[j] = coprimePart(Fa[j], R.Abs(R)); q[j].Cmp(bigOne) == 0 {
			return nil
		}
	}
	return q
}

// predetermine finds the leading coefficient of each true factor from
// the images alone (Wang 1978, section 3). With lf = δ·∏ F_j^e_j the
// factorization of L = lc_x(P) and q_j from separate, a prime p of q_j
// divides lc(f_i) exactly to the power m_ij·v_p(F_j(a)), where F_j^m_ij is
// the power of F_j in the leading coefficient of the factor whose image is
// f_i: that factor's other leading-coefficient factors miss p, its
// constant divides δ and the content of its image divides that of P(x, a).
// So m_ij is how often q_j divides lc(f_i), and D_i = ∏ F_j^m_ij: P/δ is
// lifted with D_i imposed on factor i, with no inflation by powers of L.
// It returns nil when L is a constant (the simple way costs nothing then),
// when the point did not separate the F_j, or when the D_i do not multiply
// to L/δ (more images than factors). A wrong guess could only make the
// lift fail, never give a wrong result: every lift is checked exactly.
func predetermine(P *Poly, x int, lf *Factorization, q []*big.Int, images []*Poly, shift map[int]*Poly) (*predetermined, error) {
	if lf == nil || q == nil {
		return nil, nil
	}
	D := make([]*Poly, len(images))
	for i, g := range images {
		lcg := new(big.Int).Abs(g.LeadingCoefficient().Num())
		D[i] = P.ring.one()
		for j, F := range lf.Factors {
			for new(big.Int).Rem(lcg, q[j]).Sign() == 0 {
				lcg.Quo(lcg, q[j])
				var err error
				if D[i], err = D[i].Mul(F.Factor); err != nil {
					return nil, err
				}
			}
		}
	}
	prod, err := mulAll(P.ring, D)
	if err != nil {
		return nil, err
	}
	if !prod.Scale(lf.Unit).Equal(P.lcIn(x)) {
		return nil, nil
	}
	pre := &predetermined{lc: make([]*Poly, len(D))}
	if pre.A, err = P.Substitute(shift); err != nil {
		return nil, err
	}
	pre.A = pre.A.Scale(new(big.Rat).Inv(lf.Unit))
	for i, d := range D {
		if pre.lc[i], err = d.Substitute(shift); err != nil {
			return nil, err
		}
	}
	return pre, nil
}

// coprimePart returns the largest divisor of n coprime to r (n > 0).
func coprimePart(n, r *big.Int) *big.Int {
	q := new(big.Int).Set(n)
	g := new(big.Int)
	for {
		if g.GCD(nil, nil, q, r); g.Cmp(bigOne) == 0 {
			return q
		}
		q.Quo(q, g)
	}
}

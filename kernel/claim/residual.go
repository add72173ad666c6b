package claim

import (
	"errors"
	"fmt"
	"math/big"
	"strings"
	"unicode"

	"assay/cells"
	"assay/exact"
	"assay/exact/geom"
)

// Methods as the report names them.
const (
	ExactMethod = "exact rational arithmetic"
	PolyMethod  = "exact polynomial arithmetic (expanded)"
	// CrossMethod compares rational functions by cross-multiplication.
	CrossMethod = "exact rational-function arithmetic (cross-multiplied)"
	RealMethod  = "certified interval arithmetic"
	// AlgebraicMethod decides a residual built from rationals by + − × ÷,
	// integer powers and roots: intervals refined until they exclude 0,
	// or lie below the residual's zero bound, which proves it zero.
	AlgebraicMethod = "exact algebraic arithmetic (zero bound)"
)

// log10of2 turns bits into decimal digits.
const log10of2 = 0.30102999566398120

// Target is the precision a claim with real sides is decided to.
type Target struct {
	Bits uint // "holds to digits": |residual| certified within 2^-Bits·max(|lhs|, |rhs|)
	Cap  uint // refinement stops here: undecided
}

// Digits is the number of decimal digits that Bits certify.
func (t Target) Digits() int { return int(float64(t.Bits) * log10of2) }

// BitsForDigits is the precision that certifies n decimal digits.
func BitsForDigits(n int64) uint { return uint(float64(n)/log10of2) + 1 }

// Residual is lhs − rhs, measured exactly or certified.
type Residual struct {
	Text     string   // printed residual
	TeX      string   // the residual in LaTeX, for the HTML report ("" when it has no typeset form)
	Size     *big.Rat // how large: |residual|, an upper bound for reals, the term count for polynomials; read only (may be shared)
	Zero     bool     // exactly zero
	Symbolic bool     // a polynomial difference: zero proves the identity for all values
	Real     bool     // decided by interval arithmetic
	// Cross qualifies Symbolic: the sides are rational functions, decided
	// by the polynomial lhs.num·rhs.den − rhs.num·lhs.den (Size counts its
	// terms); Text shows lhs − rhs in lowest terms.
	Cross bool
	// Certified is, for a real residual enclosing 0, the N of the bound
	// |residual| < 10^-N·max(|lhs|, |rhs|): N significant digits agree.
	Certified int
	// NearZero qualifies Certified: neither side could be separated from
	// 0, and the bound is absolute, |lhs|, |rhs| < 10^-Certified.
	NearZero  bool
	Undecided bool // the precision cap came first
	// Algebraic: decided exactly by the zero bound of an algebraic
	// residual, zero (Zero) or certified non-zero (Real).
	Algebraic bool
	// ZeroBits is, for an algebraic residual, the B of its zero bound
	// 2^-B; set also when the bound lay beyond the cap and the residual
	// was only bounded.
	ZeroBits int64
}

// Exact is the residual of an exact rational difference.
func Exact(d *big.Rat) Residual {
	return Residual{Text: exact.FormatRat(d), TeX: exact.LaTeXRat(d), Size: new(big.Rat).Abs(d), Zero: d.Sign() == 0}
}

// Zero is the residual of sides that agree exactly. A sweep makes one a
// sample, so it is made once (zeroResidual), its size shared: a
// residual's size is read, never written.
func Zero() Residual { return zeroResidual }

var zeroResidual = Exact(new(big.Rat))

// OfPoly is the residual of an expanded polynomial difference.
func OfPoly(d *exact.Poly) Residual {
	return Residual{Text: Preview(d), TeX: PreviewTeX(d), Size: big.NewRat(int64(d.Len()), 1), Zero: d.IsZero(), Symbolic: true}
}

// Record writes the residual into the claim: its text, and its LaTeX for
// the HTML report.
func (r Residual) Record(c *cells.Claim) { c.Residual, c.ResidualTeX = r.Text, r.TeX }

// OfRatFuncs is the residual of two rational functions compared by
// cross-multiplication: lhs.num·rhs.den − rhs.num·lhs.den, which is the
// zero polynomial exactly when the sides are equal rational functions.
// When it is not, the residual shown is lhs − rhs in lowest terms (far
// shorter, as a rule, than the cross product), or, should that
// subtraction fail (a cap), the cross product, labelled as such.
func OfRatFuncs(lhs, rhs *exact.RatFunc) (Residual, error) {
	x, err := lhs.Num().Mul(rhs.Den())
	if err != nil {
		return Residual{}, err
	}
	y, err := rhs.Num().Mul(lhs.Den())
	if err != nil {
		return Residual{}, err
	}
	r := OfPoly(x.Sub(y))
	r.Cross = true
	if r.Zero {
		return r, nil
	}
	d, err := lhs.Sub(rhs)
	if err != nil {
		r.Text = crossProduct + " = " + r.Text
		r.TeX = `\text{` + crossProduct + `} = ` + r.TeX
		return r, nil
	}
	r.Text, r.TeX = ratFuncPreview(d)
	return r, nil
}

// crossProduct names the polynomial cross-multiplication compares.
const crossProduct = "lhs.num·rhs.den − rhs.num·lhs.den"

// ratFuncPreview prints a rational function as RatFunc.String does, and in
// LaTeX as one \frac, each part previewed when long.
func ratFuncPreview(f *exact.RatFunc) (text, tex string) {
	if f.IsPoly() {
		return Preview(f.Num()), PreviewTeX(f.Num())
	}
	part := func(p *exact.Poly) string {
		s := Preview(p)
		if strings.ContainsFunc(s, func(r rune) bool { return !(unicode.IsLetter(r) || unicode.IsDigit(r) || r == '_') }) {
			return "(" + s + ")"
		}
		return s
	}
	num, sign := f.Num(), ""
	if strings.HasPrefix(Preview(num), "-") {
		// The sign outside, as for rationals: -2/(x + 1), not (-2)/(x + 1).
		num, sign = num.Neg(), "-"
	}
	return sign + part(num) + "/" + part(f.Den()), sign + `\frac{` + PreviewTeX(num) + "}{" + PreviewTeX(f.Den()) + "}"
}

// closeness is what refining lhs − rhs against the sides showed.
type closeness int

const (
	// settled: the enclosure of the difference settled the question asked
	// of it (for an identity, it excludes 0).
	settled closeness = iota
	// agree: |lhs − rhs| ≤ 2^-Bits·max(|lhs|, |rhs|), certified, and the
	// difference was not settled: Bits significant bits agree.
	agree
	// nearZero: neither side could be separated from 0, and both are
	// certified at most 2^-Bits in absolute value: there are no
	// significant digits to compare, only an absolute bound.
	nearZero
)

// compareSides refines the enclosure of lhs − rhs, from Bits+32 bits of
// working precision, doubling up to the cap, until done accepts it or it
// is narrower than 2^-Bits·max(|lhs|, |rhs|) (a lower bound of that size,
// from the sides' own enclosures at the same precision). The target is
// relative, so sides scaled by a common factor are refined alike and get
// the same answer: a difference is never called non-zero at one scale and
// negligible at another. When neither side is separated from 0 there is
// no size to be relative to; both sides certified below 2^-Bits in
// absolute value (nearZero) then ends the refinement. The cap gives an
// error wrapping exact.ErrUndecided.
func compareSides(lhs, rhs *exact.Real, t Target, done func(exact.Interval) bool) (exact.Interval, closeness, error) {
	d := exact.RealSub(lhs, rhs)
	unit := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), t.Bits)) // 2^-Bits
	p := min(t.Bits+32, t.Cap)
	var last error
	for {
		iv, err := d.Enclose(p)
		switch {
		case err != nil && !errors.Is(err, exact.ErrUndecided):
			return exact.Interval{}, 0, err
		case err != nil:
			last = err
		case done(iv):
			return iv, settled, nil
		default:
			// Only the sides' sizes are wanted: coarse enclosures spare
			// converting two full-precision ones to rationals per step.
			l, err1 := lhs.EncloseCoarse(p)
			r, err2 := rhs.EncloseCoarse(p)
			if err := errors.Join(err1, err2); err != nil {
				return exact.Interval{}, 0, err
			}
			size, upper := maxRat(magLower(l), magLower(r)), maxRat(magUpper(l), magUpper(r))
			if size.Sign() > 0 && iv.Width().Cmp(new(big.Rat).Mul(size, unit)) <= 0 {
				return iv, agree, nil
			}
			if size.Sign() == 0 && upper.Cmp(unit) <= 0 {
				return iv, nearZero, nil
			}
			last = nil
		}
		if p >= t.Cap {
			msg := fmt.Sprintf("the difference of the sides not settled within the precision cap of %d bits", t.Cap)
			if last != nil {
				msg += " (" + last.Error() + ")"
			}
			return exact.Interval{}, 0, fmt.Errorf("%s: %w", msg, exact.ErrUndecided)
		}
		p = min(2*p, t.Cap)
	}
}

// magLower is a lower bound of |x| over the interval: 0 when it contains 0.
func magLower(iv exact.Interval) *big.Rat {
	switch {
	case iv.Lo.Sign() > 0:
		return new(big.Rat).Set(iv.Lo)
	case iv.Hi.Sign() < 0:
		return new(big.Rat).Neg(iv.Hi)
	}
	return new(big.Rat)
}

// magUpper is an upper bound of |x| over the interval.
func magUpper(iv exact.Interval) *big.Rat {
	return maxRat(new(big.Rat).Abs(iv.Lo), new(big.Rat).Abs(iv.Hi))
}

// maxRat is the larger of a and b (a itself when they are equal).
func maxRat(a, b *big.Rat) *big.Rat {
	if b.Cmp(a) > 0 {
		return b
	}
	return a
}

// excludesZero is the question an identity asks of its residual.
func excludesZero(iv exact.Interval) bool { return iv.Lo.Sign() > 0 || iv.Hi.Sign() < 0 }

// OfReal decides lhs = rhs for certified reals: exactly when the
// difference is known to be rational, else by refining its enclosure
// until it excludes 0 (fails) or is within 10^-N of 0 relative to the
// sides (N significant digits agree: holds to N digits), or, for sides
// that cannot be told from 0, until both are within 10^-N of 0.
//
// An algebraic difference (rationals, + − × ÷, integer powers, roots) is
// decided exactly by its zero bound (exact.Real.ZeroBound): proved zero, or
// certified non-zero however small, refining up to the cap whatever the
// target. When the bound lies beyond the cap it is bounded as above, with
// the bound's bits kept for the note.
func OfReal(lhs, rhs *exact.Real, t Target) (Residual, error) {
	d := exact.RealSub(lhs, rhs)
	if q, ok := d.Rat(); ok {
		return Exact(q), nil
	}
	sign, bound, decided, err := algebraicSign(d, t)
	switch {
	case err != nil:
		return Residual{}, err
	case decided && sign == 0:
		return Residual{Text: "0", TeX: "0", Size: new(big.Rat), Zero: true, Algebraic: true, ZeroBits: bound}, nil
	case decided:
		// The sign's refinement left its best enclosure cached on d.
		iv, err := d.EncloseCoarse(t.Bits + 32)
		if err != nil {
			return Residual{}, err
		}
		return nonZero(d, iv, t, Residual{Algebraic: true, ZeroBits: bound}), nil
	}
	r, err := ofInterval(lhs, rhs, d, t)
	r.ZeroBits = bound
	return r, err
}

// algebraicSign decides the sign of an algebraic d exactly, by its zero
// bound (exact.Real.ZeroBound), refining from the target's precision up to
// the cap. decided is false when d is not algebraic (bound 0) or the cap
// came first (bound > 0, for the note); err is a certain failure.
func algebraicSign(d *exact.Real, t Target) (sign int, bound int64, decided bool, err error) {
	bound, alg := d.ZeroBound()
	if !alg {
		return 0, 0, false, nil
	}
	// A bound beyond the cap cannot be reached: refining to the cap first
	// would only add its cost to the interval route's.
	if bound > int64(t.Cap) {
		return 0, bound, false, nil
	}
	sign, err = d.SignFrom(t.Bits+32, t.Cap)
	if errors.Is(err, exact.ErrUndecided) {
		return 0, bound, false, nil
	}
	return sign, bound, err == nil, err
}

// printCap bounds the precision spent on printing a residual certified
// non-zero: one on a decimal boundary (exactly −10^-100) would otherwise
// refine to the cap for digits it can never settle.
const printCap = 1 << 16

// nonZero fills r for a difference d certified non-zero by its enclosure
// iv: 12 certified digits, or a rounded value with a proved bound, or,
// when even that cannot be told from 0 within printCap bits, iv itself.
func nonZero(d *exact.Real, iv exact.Interval, t Target, r Residual) Residual {
	text, err := d.Text(12, min(t.Cap, printCap))
	if err != nil || strings.HasPrefix(text, "0 (") {
		text = exact.FormatRat(iv.Lo) + " … " + exact.FormatRat(iv.Hi)
	}
	r.Text, r.Size, r.Real = text+" (certified non-zero)", magUpper(iv), true
	return r
}

// ofInterval decides lhs = rhs by intervals alone: fails, holds to the
// target's digits, or undecided at the cap.
func ofInterval(lhs, rhs, d *exact.Real, t Target) (Residual, error) {
	iv, how, err := compareSides(lhs, rhs, t, excludesZero)
	switch {
	case err != nil && errors.Is(err, exact.ErrUndecided):
		return Residual{Text: fmt.Sprintf("not separated from 0 at the cap of %d bits", t.Cap), Size: new(big.Rat), Real: true, Undecided: true}, nil
	case err != nil:
		return Residual{}, err
	}
	n := t.Digits()
	switch how {
	case agree:
		return Residual{Text: fmt.Sprintf("|r| < 1e-%d relative", n), Size: iv.Width(), Real: true, Certified: n}, nil
	case nearZero:
		return Residual{Text: fmt.Sprintf("|lhs|, |rhs| < 1e-%d", n), Size: iv.Width(), Real: true, Certified: n, NearZero: true}, nil
	}
	return nonZero(d, iv, t, Residual{}), nil
}

// OfKVector is the residual of a difference of k-vectors: its largest coefficient.
func OfKVector(d *geom.KVector) Residual {
	size := new(big.Rat)
	for _, bl := range d.Components() {
		if c := new(big.Rat).Abs(bl.Coef); c.Cmp(size) > 0 {
			size = c
		}
	}
	return Residual{Text: d.String(), Size: size, Zero: d.IsZero()}
}

// OfMatrices compares two matrices over Q entry by entry.
func OfMatrices(a, b *exact.Matrix) (Residual, error) {
	d, err := a.Sub(b)
	if err != nil {
		return Residual{}, err
	}
	size := new(big.Rat)
	for i := 0; i < d.Rows(); i++ {
		for j := 0; j < d.Cols(); j++ {
			if e := new(big.Rat).Abs(d.At(i, j)); e.Cmp(size) > 0 {
				size = e
			}
		}
	}
	text, tex := "0", "0"
	switch {
	case size.Sign() != 0 && d.Rows()*d.Cols() > 16:
		text, tex = labelled("largest entry of the difference", exact.FormatRat(size), exact.LaTeXRat(size))
	case size.Sign() != 0:
		text = "difference " + d.String()
		tex = `\text{difference}\; ` + exact.LaTeXMatrix(d.Rows(), d.Cols(), func(i, j int) string { return exact.LaTeXRat(d.At(i, j)) })
	}
	return Residual{Text: text, TeX: tex, Size: size, Zero: size.Sign() == 0}, nil
}

// OfPolyMatrices compares two polynomial matrices entry by entry; the
// first non-zero entry of the difference is shown.
func OfPolyMatrices(a, b *exact.PolyMatrix) (Residual, error) {
	d, err := a.Sub(b)
	if err != nil {
		return Residual{}, err
	}
	return firstEntry(d.Rows(), d.Cols(), func(i, j int) (Residual, error) { return OfPoly(d.At(i, j)), nil })
}

// OfRatFuncMatrices compares two matrices of rational functions entry by
// entry, each by cross-multiplication (OfRatFuncs).
func OfRatFuncMatrices(a, b *exact.RatFuncMatrix) (Residual, error) {
	if a.Rows() != b.Rows() || a.Cols() != b.Cols() {
		return Residual{}, fmt.Errorf("compare a %dx%d matrix with a %dx%d one: %w", a.Rows(), a.Cols(), b.Rows(), b.Cols(), exact.ErrShape)
	}
	r, err := firstEntry(a.Rows(), a.Cols(), func(i, j int) (Residual, error) { return OfRatFuncs(a.At(i, j), b.At(i, j)) })
	r.Cross = true
	return r, err
}

// firstEntry is the residual of the first non-zero entry, labelled with
// its place, or "0" when every entry is zero.
func firstEntry(rows, cols int, entry func(i, j int) (Residual, error)) (Residual, error) {
	for i := 0; i < rows; i++ {
		for j := 0; j < cols; j++ {
			r, err := entry(i, j)
			if err != nil || !r.Zero {
				r.Text, r.TeX = labelled(fmt.Sprintf("entry [%d, %d] of the difference", i, j), r.Text, r.TeX)
				return r, err
			}
		}
	}
	return Residual{Text: "0", TeX: "0", Size: new(big.Rat), Zero: true, Symbolic: true}, nil
}

// labelled puts a label before a residual's text and its LaTeX (left ""
// when the residual has none).
func labelled(label, text, tex string) (string, string) {
	if tex != "" {
		// Braced, so a leading minus is a sign, not an operator after the label.
		tex = `\text{` + label + `:}\; {` + tex + "}"
	}
	return label + ": " + text, tex
}

// Worst combines the residuals of entries: any failure wins, then
// undecided, then the fewest certified digits (an absolute bound before
// significant digits, at equal digits); the largest failing
// residual is the one shown, the first on ties.
func Worst(rs []Residual) Residual {
	out := rs[0]
	for _, r := range rs[1:] {
		if Compare(r, out) > 0 {
			out = r
		}
	}
	for _, r := range rs {
		out.Symbolic = out.Symbolic || r.Symbolic
		out.Real = out.Real || r.Real
	}
	return out
}

// Entries combines the residuals of the entries of two lists: the worst,
// labelled with its entry; "0" when every entry is zero.
func Entries(rs []Residual) Residual {
	for i := range rs {
		rs[i].Text, rs[i].TeX = labelled(fmt.Sprintf("entry %d", i), rs[i].Text, rs[i].TeX)
	}
	w := Worst(append(rs, Zero()))
	if w.Zero {
		w.Text, w.TeX = "0", "0"
	}
	return w
}

// rank orders residuals by how bad they are for the claim.
func (r Residual) rank() int {
	switch {
	case !r.Zero && r.Certified == 0 && !r.Undecided:
		return 3 // fails
	case r.Undecided:
		return 2
	case r.Certified > 0:
		return 1
	}
	return 0
}

// Failing reports whether the residual makes its claim fail.
func (r Residual) Failing() bool { return r.rank() == 3 }

// Compare is positive when a is worse than b, negative when better, and 0
// when Worst has no reason to prefer either.
func Compare(a, b Residual) int {
	ra, rb := a.rank(), b.rank()
	switch {
	case ra != rb:
		return ra - rb
	case ra == 3:
		return a.Size.Cmp(b.Size)
	case ra == 1 && a.Certified != b.Certified:
		return b.Certified - a.Certified
	case ra == 1 && a.NearZero != b.NearZero:
		// An absolute bound says less than significant digits.
		if a.NearZero {
			return 1
		}
		return -1
	}
	return 0
}

// Decide states what a residual means for the claim: its verdict, method,
// residual and note. samples is 0 for a single instance.
func (r Residual) Decide(c *cells.Claim, samples int) {
	every := "for this instance"
	if samples > 0 {
		every = fmt.Sprintf("on each of the %d samples", samples)
	}
	switch {
	case r.Zero && r.Symbolic && r.Cross:
		c.Verdict, c.Method = cells.Holds, CrossMethod
		c.Note = "lhs.num·rhs.den − rhs.num·lhs.den is the zero polynomial: a proof of the identity for all values where the denominators are non-zero"
		if samples > 0 {
			c.Note = fmt.Sprintf("lhs.num·rhs.den − rhs.num·lhs.den is the zero polynomial on each of the %d samples: for each sample, a proof for all values where the denominators are non-zero; for the general statement, evidence, not a proof", samples)
		}
	case r.Zero && r.Symbolic:
		c.Verdict, c.Method = cells.Holds, PolyMethod
		c.Note = "the expanded difference is the zero polynomial: a proof of the identity for all values of the variables"
		if samples > 0 {
			c.Note = fmt.Sprintf("the expanded difference is the zero polynomial on each of the %d samples: for each sample, a proof for all values of the variables; for the general statement, evidence, not a proof", samples)
		}
	case r.Zero && r.Algebraic && samples > 0:
		c.Verdict, c.Method = cells.Holds, AlgebraicMethod
		c.Note = fmt.Sprintf("the residual is exactly zero on each of the %d samples, proved where it is not rational by its enclosure lying below the zero bound (BFMSS) that a non-zero algebraic number built as it is cannot go below: each instance is proved; for the general statement this is evidence, not a proof", samples)
	case r.Zero && r.Algebraic:
		c.Verdict, c.Method = cells.Holds, AlgebraicMethod
		c.Note = fmt.Sprintf("the residual is exactly zero: its enclosure lies below 2^-%d, the zero bound (BFMSS) that a non-zero algebraic number built as this residual is cannot go below — a proof for this instance", r.ZeroBits)
	case r.Zero && samples > 0:
		c.Verdict = cells.Holds
		c.Note = "exact zero residual " + every + ": each instance is proved; for the general statement this is evidence, not a proof"
	case r.Zero:
		c.Verdict = cells.Holds
		c.Note = "exact zero residual: a proof for this instance"
	case r.Certified > 0:
		c.Verdict, c.Method, c.Digits = cells.HoldsToDigits, RealMethod, r.Certified
		c.Note = fmt.Sprintf("certified |lhs − rhs| < 10^-%d·max(|lhs|, |rhs|) %s: the sides agree to %d significant digits", r.Certified, every, r.Certified)
		switch {
		case r.NearZero && samples > 0:
			c.Note += fmt.Sprintf(", or, where neither side could be separated from 0 (as at the sample shown), both are certified below 10^-%d in absolute value, an absolute bound with no significant digits to compare", r.Certified)
		case r.NearZero:
			c.Note = fmt.Sprintf("neither side could be separated from 0, and both are certified below 10^-%d in absolute value: an absolute bound, with no significant digits to compare", r.Certified)
		}
		c.Note += "; evidence, not a proof — an exactly zero residual and a very small one look the same at any finite precision"
		c.Note += beyondCap(r.ZeroBits)
	case r.Undecided:
		c.Verdict, c.Method, c.Why = cells.Undecided, RealMethod, cells.PrecisionCap
		c.Note = "the enclosure of the residual still contains 0 at the precision cap but is wider than the target: raise --max-precision or lower digits=" + beyondCap(r.ZeroBits)
	case r.Symbolic && r.Cross:
		c.Verdict, c.Method = cells.Fails, CrossMethod
		c.Note = crossProduct + " is a non-zero polynomial: the sides are different rational functions; the residual shown is lhs − rhs in lowest terms, and the sides differ wherever its numerator and their denominators are non-zero"
		if strings.HasPrefix(r.Text, crossProduct) {
			c.Note = crossProduct + " (the residual shown; lhs − rhs in lowest terms was not made, past a cap) is a non-zero polynomial: the sides are different rational functions, so they differ wherever that polynomial and their denominators are non-zero"
		}
	case r.Symbolic:
		c.Verdict, c.Method = cells.Fails, PolyMethod
		c.Note = "the expanded difference is a non-zero polynomial"
	case r.Real:
		c.Verdict, c.Method = cells.Fails, RealMethod
		c.Note = "the residual is certified non-zero: its enclosure excludes 0"
		if r.Algebraic {
			c.Note += " (the residual is algebraic, so its enclosure was refined past the target precision until its sign was certain: exactly zero, shown by the zero bound, or non-zero, as here)"
		}
	default:
		c.Verdict = cells.Fails
		c.Note = "exact non-zero residual"
	}
	r.Record(c)
}

// beyondCap says, for an algebraic residual that was only bounded, that
// its zero bound lay beyond the precision cap and how to reach it.
func beyondCap(bits int64) string {
	if bits == 0 {
		return ""
	}
	return fmt.Sprintf("; the residual is algebraic, but proving it zero needs its enclosure below 2^-%d (its BFMSS zero bound), which the precision cap did not reach: raise --max-precision above %d bits to decide it exactly", bits, bits)
}

// previewShown is how many terms a preview of a long polynomial shows;
// one of at most previewShown+2 terms is shown whole.
const previewShown = 6

// Preview prints a polynomial, or its first terms and the count when long.
func Preview(p *exact.Poly) string {
	const shown = previewShown
	s := p.String()
	if p.Len() <= shown+2 {
		return s
	}
	// Terms are separated by " + " and " - " at the top level of the text.
	seps := 0
	for i := 0; i+3 <= len(s); i++ {
		if s[i] == ' ' && (s[i+1] == '+' || s[i+1] == '-') && s[i+2] == ' ' {
			if seps++; seps == shown {
				return fmt.Sprintf("%s + … (%d terms in all)", s[:i], p.Len())
			}
		}
	}
	return s
}

// PreviewTeX is Preview in LaTeX: the polynomial, or its first terms, a
// \cdots and the count when long.
func PreviewTeX(p *exact.Poly) string {
	if p.Len() <= previewShown+2 {
		return p.LaTeX()
	}
	return p.LaTeXTerms(previewShown) + ` + \cdots\; \text{(` + fmt.Sprint(p.Len()) + ` terms in all)}`
}

// Clip shortens s to at most n runes.
func Clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

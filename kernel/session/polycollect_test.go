package session

import (
	"fmt"
	"math/big"
	"strings"
	"testing"
)

// The binomial theorem, from a notebook: the coefficient of a^k in
// (a + b)^n is C(n, k) b^(n-k), with C(n, k) from math/big's Binomial (a
// general-purpose library), not from assay. The third variable c stays
// out of the coefficients.
func TestCoefficientCollectsBinomial(t *testing.T) {
	for _, n := range []int64{3, 8, 40} {
		binom := make([]string, n+1)
		for k := range binom {
			binom[k] = new(big.Int).Binomial(n, int64(k)).String()
		}
		src := fmt.Sprintf(`a, b, c = variables("a b c")
p = (a + b) ** %d
C = [%s]
print([p.coefficient(a=k) == C[k] * b**(%d - k) for k in range(%d)])
print([p.coefficient(a**k) == C[k] * b**(%d - k) for k in range(1, %d)])
print([e for e, q in p.collect("a")] == list(range(%d)), [q == C[e] * b**(%d - e) for e, q in p.collect(a)])`,
			n, strings.Join(binom, ", "), n, n+1, n, n+1, n+1, n)
		got := output(t, runHere(t, src), 1)
		if strings.Contains(got, "False") || strings.Count(got, "True") != int(3*n+3) {
			t.Errorf("n = %d:\n%s", n, got)
		}
	}
}

// Heron's formula in squared edges, the Cayley–Menger determinant of a
// triangle (Blumenthal, Theory and Applications of Distance Geometry,
// 1953): 16·Area² = −det(CM) = 2(xy + yz + zx) − x² − y² − z² for squared
// sides x, y, z. Collected in x it is (2yz − y² − z²) + (2y + 2z)x − x².
func TestCollectCayleyMenger(t *testing.T) {
	expectPrints(t, []printCase{
		{`x, y, z = variables("x y z")
CM = matrix([[0, 1, 1, 1], [1, 0, z, y], [1, z, 0, x], [1, y, x, 0]])
c = (-det(CM)).collect("x")
print(c == [(0, 2*y*z - y**2 - z**2), (1, 2*y + 2*z), (2, -1)], type(c[2][1]) == type(frac(-1)))`, "True True"},
		// The example: the term -2a^2d is collected with 3a^2b,
		// not lost; naming every variable gives the number.
		{`a, b, d = variables("a b d")
p = -2*a**2*d + 3*a**2*b + a
print(p.coefficient(a=2) == -2*d + 3*b, p.coefficient(a=2, b=1, d=0), p.coefficient(a=2, b=0, d=0), p.coefficient(a=5))`, "True 3 0 0"},
		{`a, b = variables("a b")
print((a - a).collect("a"), (3 + 0*a).collect(b))`, "[] [(0, 3)]"},
	})
}

// The squared distance of a point to itself is 0 (common practice), for a
// simplex from points and one from squared distances.
func TestSqEdgeOfAVertexToItself(t *testing.T) {
	expectPrints(t, []printCase{
		{`s = simplex([[0, 0, 0], [4, 0, 0], [0, 3, 0], [1, 1, 5]])
D = distance_simplex(matrix([[0, 16, 9], [16, 0, 25], [9, 25, 0]]))
print([s.sq_edge(i, i) for i in range(4)], [D.sq_edge(i, i) for i in range(3)], s.sq_edge(1, 2) == s.sq_edge(2, 1) == 25)`, "[0, 0, 0, 0] [0, 0, 0] True"},
	})
}

func TestPolynomialKnownVariables(t *testing.T) {
	expectPrints(t, []printCase{
		{`a, b = variables("a b")
print(polynomial("a^2 + 2*a*b + b^2") == (a + b)**2, polynomial("q - a", new=True), polynomial("q^2"), polynomial(a + 1))`, "True -a + q q^2 a + 1"},
	})
	expectErrors(t, []errorCase{
		{`a, b = variables("a b")
polynomial("a^2 + 2*a*b + bb^2")`, `column 15: unknown variable "bb"; the variables are a, b (make it with variables("bb") first, or pass new=True)`},
		{`polynomial("x + 1")`, `column 1: unknown variable "x"; no variables have been made yet`},
		{`a = variables("a")
polynomial("a + b", new=1)`, "new must be True or False"},
		{`a = variables("a")
polynomial("a + * b")`, "column 5"},
		{`a, b = variables("a b")
(a*b).coefficient(zz=1)`, `coefficient(): there is no variable "zz" (the variables are a, b`},
		{`a, b = variables("a b")
(a*b).coefficient(3*a)`, "coefficient 1"},
		{`a, b = variables("a b")
(a*b).coefficient()`, "not none"},
		{`a, b = variables("a b")
(a*b).coefficient(a**0)`, "names no variable"},
		{`a, b = variables("a b")
(a*b).coefficient(a=-1)`, "non-negative integer exponent"},
		{`a, b = variables("a b")
(a*b).collect("a", "b")`, "collect() takes one variable, got 2 (a, b)"},
		{`a, b = variables("a b")
(a*b).collect("zz")`, `collect(): there is no variable "zz"`},
		{`a, b = variables("a b")
(a*b).collect(a + b)`, "not a single variable"},
		{`simplex([[0, 0], [4, 0], [0, 3]]).sq_edge(1, 3)`, "sq_edge(i, j) needs vertex indices from 0 to 2, got (1, 3)"},
		{`simplex([[0, 0], [4, 0], [0, 3]]).dihedral_cos(1, 1)`, "two different vertex indices, got 1 twice"},
	})
}

package session

import "testing"

// real_roots, solve and solution_count from a notebook. Sources: the
// roots of t³ + t² − 2t − 1 are 2cos(2πk/7), 2cos(2π/7) =
// 1.2469796037174670610… (standard tables), their sum is −1 (Vieta) and
// (2cos θ)² − 2 = 2cos 2θ (from memory); x² + y² = 1 meets y = x at
// ±(√2/2, √2/2) and x² + 4y² = 4 meets 4x² + y² = 4 at (±2/√5, ±2/√5)
// (by hand); y = x² touches y = 0 at the origin, twice (by hand).
func TestSolveBuiltins(t *testing.T) {
	expectPrints(t, []printCase{
		{"t = variables(\"t\")\nr = real_roots(t**3 + t**2 - 2*t - 1)\nprint(len(r), r[0] + r[1] + r[2] == -1, r[2]**2 - 2 == r[1], r[2]**2 - 2 == r[0])", "3 True True False"},
		{"t = variables(\"t\")\nshow(real_roots(t**3 + t**2 - 2*t - 1)[2])", "[root of t^3 + t^2 - 2t - 1 in (0, 8)] ≈ 1.2469796037174670610"},
		// A root named by its interval is no cell code: latex() gives its
		// certified digits, not the interval form, marked as truncated.
		{"t = variables(\"t\")\nprint(latex(real_roots(t**3 + t**2 - 2*t - 1)[2]))", `1.2469796037174670610\ldots`},
		{"t = variables(\"t\")\nprint(real_roots(t**2 - 2), real_roots((2*t - 1)**2*(t + 3)*(t**2 + 1)), real_roots(t**2 + 1))", "[-sqrt(2), sqrt(2)] [-3, 1/2] []"},
		{"x, y = variables(\"x y\")\nprint(solve([x**2 + y**2 - 1, y - x]))", "[(-sqrt(2)/2, -sqrt(2)/2), (sqrt(2)/2, sqrt(2)/2)]"},
		{"x, y = variables(\"x y\")\nprint(solve([x**2 + 4*y**2 - 4, 4*x**2 + y**2 - 4]))", "[(-2*sqrt(5)/5, -2*sqrt(5)/5), (-2*sqrt(5)/5, 2*sqrt(5)/5), (2*sqrt(5)/5, -2*sqrt(5)/5), (2*sqrt(5)/5, 2*sqrt(5)/5)]"},
		{"x, y = variables(\"x y\")\nprint(solve([y - x**2, y]), solution_count([y - x**2, y]))", "[(0, 0)] (2, 1)"},
		{"x, y = variables(\"x y\")\nprint(solve([x, x - 1]), solution_count([x, x - 1]))", "[] (0, 0)"},
	})
}

func TestSolveErrors(t *testing.T) {
	expectErrors(t, []errorCase{
		{"x, y = variables(\"x y\")\nreal_roots(x*y - 1)", "the polynomial is in 2 variables (x, y), not one"},
		{"x = variables(\"x\")\nreal_roots(0)", "the polynomial is 0"},
		{"x = variables(\"x\")\nreal_roots(0.5*x)", "float"},
		{"x, y = variables(\"x y\")\nsolve([x**2 + y**2 - 1])", "dimension 1 (y can vary freely)"},
		{"x, y = variables(\"x y\")\nsolve([x, 0.5])", "item 2 of the polynomials is a float"},
	})
}

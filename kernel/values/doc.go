// Package values holds the notebook's value types, one file each —
// rational, certified real, polynomial, matrix, float64 matrix, simplex,
// k-vector, box family, infinity — with their operators, methods and the
// builtins that make them, and the float64 companions the audit computes
// with. Every value belongs to an Env, which it shares with its session:
// the polynomial ring, the precision cap, the random state and whether the
// float64 audit is running.
//
// A new value type is one file here plus its line in Env.Install.
package values

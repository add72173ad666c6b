package geom

import "errors"

// Sentinel errors. Functions wrap them with context (fmt.Errorf with %w);
// compare with errors.Is. Bad shapes (ragged or empty point lists,
// mismatched lengths, indices out of range) wrap assay/exact.ErrShape.
var (
	// ErrDegenerate reports a degenerate simplex (squared volume 0) where a
	// non-degenerate one is needed: circumradius, circumcentre, dihedral
	// angles, barycentric coordinates.
	ErrDegenerate = errors.New("degenerate simplex")
	// ErrNotEmbeddable reports data that no points of a Euclidean space
	// realise: a squared-distance matrix that is not symmetric, has a
	// non-zero diagonal or a negative entry, violates a triangle inequality
	// or has a Gram matrix that is not positive semidefinite; or triangle
	// sides that violate the triangle inequality.
	ErrNotEmbeddable = errors.New("not embeddable in Euclidean space")
	// ErrNotInAffineHull reports a point outside the affine hull of a
	// simplex where barycentric coordinates were asked for.
	ErrNotInAffineHull = errors.New("point not in the affine hull")
)

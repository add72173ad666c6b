// Package geom computes with simplices exactly: squared distances, Gram and
// Cayley–Menger determinants, squared volumes and facet contents,
// circumradii and circumcentres, dihedral angles, barycentric coordinates,
// faces and affine images, k-vectors of the exterior algebra, Euclidean
// embeddability of distance data (Schoenberg's criterion), and families of
// random and nearly degenerate tetrahedra. The Cayley–Menger determinant
// and the squared volume are also given as polynomials in symbolic squared
// distances (CayleyMengerPoly, VolumeSqPoly), and triangles have Heron's
// formula in squared sides (TriangleAreaSq) and their tangent lengths
// (TangentLengths).
//
// Everything is exact: coordinates and squared distances are rationals
// (math/big.Rat) and so is every result. Quantities that are square roots
// of rationals (volumes, facet areas, the inradius and incentre, dihedral
// angles) are returned as their rational ingredients, squares and the
// terms of sums to be square-rooted, for another package to turn into
// certified reals:
//
//	volume      V = sqrt(VolumeSq())
//	facet i     F_i = sqrt(FacetContentsSq()[i])
//	inradius    r = k·V / (F_0 + … + F_k)
//	incentre    (F_0 v_0 + … + F_k v_k) / (F_0 + … + F_k)
//	dihedral    cos θ_ij = sign · sqrt(cos²θ_ij), from DihedralCosSq
//
// A k-simplex has k+1 vertices, numbered from 0; every index in the API and
// in error messages is 0-based. A Simplex is made from points in R^n
// (FromPoints, n >= k) or from its squared distances
// (FromSquaredDistances); it is immutable and safe for concurrent use.
// Internally both kinds keep the Gram matrix of the edge vectors from
// vertex 0 as an integer matrix over one positive common denominator, so
// that determinants run on integers (fraction-free elimination) and
// rationals are formed and reduced once per result.
//
// Conventions. The Gram matrix G is k x k with G_ij = (v_i − v_0)·(v_j − v_0)
// = (d_0i + d_0j − d_ij)/2 for i, j = 1..k, where d_ij = |v_i − v_j|².
// The squared k-volume is det(G)/(k!)², equal to
// (−1)^(k+1) CM / (2^k (k!)²) with CM the determinant of the
// (k+2) x (k+2) Cayley–Menger matrix. The 0-simplex (a point) has squared
// volume 1 and no facets.
//
// Failures are reported with the sentinel errors ErrDegenerate,
// ErrNotEmbeddable and ErrNotInAffineHull of this package and exact.ErrShape
// (with exact.ErrNotSquare for non-square matrices), wrapped with context;
// test for them with errors.Is.
package geom

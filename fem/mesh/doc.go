// Package mesh implements conforming triangle meshes of an exact polygon,
// with interval enclosures of every node and of every element's geometry.
//
// Exact points. Node k of a Mesh stands for an exact point P_k of the plane;
// Nodes[k] encloses it. The exact points are the polygon's exact vertices
// and exact midpoints (P_a + P_b)/2 of exact points made earlier, so every
// exact point is a fixed affine combination of the vertices with dyadic
// rational weights. The exact triangles (the triangles whose vertices are
// the exact points) form a conforming triangulation of the exact polygon:
// their interiors are disjoint, their union is the closed polygon, two of
// them meet in a common vertex, a common edge or not at all, and every
// boundary edge lies on the polygon side named in Bnd.
//
// Guarantees. FromPolygon proves the tiling of its input from two checks
// that it makes (see FromPolygon): every triangle is counterclockwise with
// an area enclosure bounded away from 0, and the oriented edges cancel in
// pairs except the polygon's sides. Refine (red refinement) and
// RefineGraded (newest-vertex bisection) keep the tiling exact by
// construction: the children of an exact triangle tile it exactly, a
// shared edge is split at the same exact midpoint on both sides, and the
// midpoint of two exact points of a side lies exactly on that side. Geom
// returns enclosures of the exact area, barycentric gradients and edge
// lengths; they are propagated from the parent exactly (a child's edge
// vectors are exact half-sums of the parent's, its area an exact fraction
// of the parent's) and intersected with the enclosures computed from the
// nodes. Under red refinement halving is exact, so their relative width
// does not grow with the level (2 ulps measured on the equilateral
// triangle after 7 levels); a bisection adds at most the rounding of one
// subtraction, and the node enclosures, whose width grows by at most
// about an ulp per level, cap it. All
// arithmetic on these enclosures is outward rounded (package interval);
// floating point at round-to-nearest is used only to choose (which edge of
// a triangle is bisected first).
//
// Misuse (indices out of range, negative levels) panics with a message
// starting "mesh: "; input that does not describe a valid triangulation is
// reported by an error.
//
// References:
//
//	R. E. Bank, A. H. Sherman, A. Weiser, Refinement algorithms and data
//	structures for regular local mesh refinement, in: R. Stepleman (ed.),
//	Scientific Computing, IMACS/North-Holland, 1983, 3–17 (red refinement).
//	E. G. Sewell, Automatic generation of triangulations for piecewise
//	polynomial approximation, Ph.D. thesis, Purdue University, 1972.
//	W. F. Mitchell, A comparison of adaptive refinement techniques for
//	elliptic problems, ACM Trans. Math. Softw. 15 (1989) 326–347
//	(newest-vertex bisection).
//	P. Binev, W. Dahmen, R. DeVore, Adaptive finite element methods with
//	convergence rates, Numer. Math. 97 (2004) 219–268 (bisection with
//	conforming closure).
//	R. Stevenson, The completion of locally refined simplicial partitions
//	created by bisection, Math. Comp. 77 (2008) 227–241.
package mesh

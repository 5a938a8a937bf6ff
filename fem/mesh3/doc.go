// Package mesh3 implements conforming tetrahedral meshes of an exact
// polyhedron, with interval enclosures of every node and of every
// element's geometry: the three-dimensional counterpart of package
// fem/mesh.
//
// Exact points. Node k of a Mesh stands for an exact point P_k of space;
// Nodes[k] encloses it. The exact points are the nodes given to
// FromPolyhedron (the polyhedron's vertices and any further exact points of
// its first tetrahedra, such as the apex of a cone) and exact midpoints
// (P_a + P_b)/2 of exact points made earlier. The exact tetrahedra (the
// tetrahedra whose vertices are the exact points) form a conforming
// tetrahedralisation of the exact polyhedron: their interiors are
// disjoint, their union is the closed polyhedron, two of them meet in a
// common vertex, edge or face or not at all, and every boundary face lies
// in the polyhedron face named in Bnd.
//
// Guarantees. FromPolyhedron proves the tiling of its input from two
// checks that it makes: every tetrahedron is positively oriented with a
// volume enclosure bounded away from 0, and the oriented faces cancel in
// pairs except the given boundary triangles (the proof, the 3D form of the
// winding-number argument of package fem/mesh, is in FromPolyhedron's
// documentation). Refine (red refinement after Bey) keeps the tiling exact
// by construction: the eight children of an exact tetrahedron tile it
// exactly, a shared edge is split at the same exact midpoint on every
// tetrahedron around it, so that the four children on a shared face are
// the same triangles from both sides, and the midpoint of two exact points
// of a boundary face lies exactly in that face. Geom returns enclosures of
// the exact volume, barycentric gradients and edge lengths; a child's edge
// vectors are exact combinations (coefficients 0, ±½, ±1) of its parent's
// and its volume exactly ⅛ of the parent's, and both are intersected with
// the enclosures computed from the nodes. All arithmetic on these
// enclosures is outward rounded (package interval); nothing is chosen in
// floating point.
//
// Shapes. Bey's red refinement splits the inner octahedron along one of
// its three diagonals; taking always the diagonal between the midpoints
// x02 and x13 of the parent's local order, and ordering the children's
// vertices as in Bey's algorithm, the descendants of one tetrahedron fall
// into at most three congruence classes, so the shape regularity of the
// initial mesh is kept at every level (Bey 1995; the children's order in
// Refine is recalled from the paper, not copied from it, and is checked by
// this package's tests, which count the similarity classes of the
// descendants of several tetrahedra over four levels).
//
// Grading. RefineToward refines a mesh toward segments between given nodes
// (edges of the polyhedron) and given nodes (its vertices): round by round,
// the tetrahedra touching a target have all six edges bisected at their
// exact midpoints, and their neighbours as conformity requires (bisection
// of marked edges with longest-edge closure, after Rivara and Levin 1992),
// so the tetrahedra at the targets shrink like 2^(−rounds). Which nodes lie
// on a target is decided exactly from the nodes' parents (every node made
// by refinement records the two nodes it is the midpoint of). The graded
// mesh is not trusted: RefineToward proves its tiling again with the checks
// of FromPolyhedron.
//
// Misuse (indices out of range, a Mesh not made by this package) panics
// with a message starting "mesh3: "; input that does not describe a valid
// tetrahedralisation is reported by an error.
//
// References:
//
//	J. Bey, Tetrahedral grid refinement, Computing 55 (1995) 355–378.
//	J. Bey, Simplicial grid refinement: on Freudenthal's algorithm and the
//	optimal number of congruence classes, Numer. Math. 85 (2000) 1–29.
//	M.-C. Rivara, C. Levin, A 3-D refinement algorithm suitable for adaptive
//	and multi-grid techniques, Commun. Appl. Numer. Methods 8 (1992) 281–290.
//	E. E. Moise, Geometric Topology in Dimensions 2 and 3, Springer, 1977
//	(the polyhedral Jordan–Brouwer separation theorem; winding numbers as
//	degrees).
package mesh3

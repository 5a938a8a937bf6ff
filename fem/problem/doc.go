// Package problem implements gapcert problem files: reading, validation,
// the exact problem data, its canonical form and hash.
//
// A problem is −Δu + V u = λu on an interval, a polygon, or a product
// Ω = Ω_1 × … × Ω_F of intervals and polygons (up to four coordinates),
// with Dirichlet, Neumann or Robin conditions per side (per face of a
// product). Parse returns a Problem
// only if every check below passed; otherwise it returns an *Error listing
// every defect with its JSON path and a hint. Guarantees of a returned
// Problem:
//
//   - every number is exact: Number.Rat is the exact rational for rational
//     input, and Number.Val always encloses the exact value and is bounded;
//     no input is passed through strconv.ParseFloat;
//   - an interval has a < b; a polygon has at least three vertices, no
//     repeated or collinear consecutive vertices, no two edges meeting
//     except adjacent ones at their shared vertex (simple), and is stored
//     counterclockwise; each of these facts was decided exactly (big.Rat)
//     or by interval enclosures that decide the sign, never assumed;
//   - V has no free variable but x (and y), and PotentialRange encloses its
//     range over the closed domain, which is bounded;
//   - Robin coefficients are ≥ 0, 2 ≤ Eigenvalues ≤ 20, RelWidth ∈ (0, 1);
//   - every claim reads in the grammar of package claim and names only
//     quantities the problem provides (ClaimScope).
//
// # File format
//
// A problem file is one JSON object (UTF-8). Unknown keys at any level,
// duplicate keys and trailing data are errors.
//
//	{
//	  "name": "trapezoid",                              optional, default ""
//	  "domain": {"polygon": [["0","0"], ["3","0"], ["2","1"], ["1","1"]]},
//	  "potential": "x^2 + a*y",                         optional, default "0"
//	  "parameters": {"a": "1/2"},                       optional
//	  "boundary": ["dirichlet", {"robin": "1.5"}, "neumann", "dirichlet"],
//	  "eigenvalues": 2,                                 optional, default 2
//	  "target": {"relative_width": "1e-6"},             optional, default "1e-6"
//	  "claims": ["gap >= 3*pi^2/D^2"]                   optional
//	}
//
// domain is {"interval": [a, b]} with a < b, {"polygon": [[x0, y0], …]}
// with 3 to 100 vertices in either orientation, or {"product": [f1, f2, …]}
// with two to four factors, each {"interval": …} or {"polygon": …} as
// above (each validated as a lone domain, its errors at its path
// "domain.product[i].…"), at most four coordinates in all. The
// coordinates of a product are the factors', concatenated in order and
// named x, y, z, w: a polygon (x, y) times an interval z; three intervals
// give the box (x, y, z). A product of two intervals is also stored as the
// rectangle it is (Vertices, Boundary in its edge order). A clockwise polygon is
// reversed to v0, v(n−1), …, v1 (v0 stays first) and its boundary list with
// it, so that Boundary[k] of the Problem is the file's entry (n−1−k) mod n,
// the same edge traversed the other way (see Problem.Reversed).
//
// A polyhedron is {"polyhedron": {"vertices": [[x, y, z], …], "faces":
// [[i, j, k, …], …]}} with 4 to 100 vertices and 4 to 200 faces, each face
// a cycle of distinct vertex indices in either orientation. Parse checks
// every property listed in the documentation of Polyhedron (planar simple
// faces, a closed connected orientable surface with one fan of faces
// around each vertex, no self-intersection, positive volume, an apex
// strictly inside every face plane), each decided exactly (rationals,
// surds or a cyclotomic field, package interval/algebraic) or by
// enclosures that decide it; an undecided test is reported as such. Faces
// are stored outward (Polyhedron.Flipped); the boundary list follows the
// order of the faces, which is kept.
//
// Numbers (coordinates, Robin coefficients, the relative width, parameter
// values) are JSON numbers or strings, read exactly: decimals ("0.1",
// "-2.5e-3", "1e-300"; exponents within ±400), rationals ("1/3"), or
// constant formulas ("sqrt(3)/2", "cos(pi/5)", "a+1") in the syntax of
// package gapcert/interval/formula, which may use the parameters. The
// value must be finite (beyond about 1.7e308 is an error); NaN and
// infinities are not numbers. At most 400 bytes per number.
//
// parameters maps names (a letter, then letters, digits or '_'; not the
// coordinates x, y, z, w, nor pi, e or a function name) to numbers; a
// parameter's value may not use other parameters. Parameters may be used
// in coordinates, the potential, Robin coefficients and the relative
// width.
//
// potential is a formula in x (interval), x and y (polygon), x, y and z
// (polyhedron), or the coordinates of a product (x, y, z; x, y, z, w),
// and the parameters. It must be defined and finite on the closed domain: on an
// interval this is checked by interval evaluation (bisected up to 1024
// pieces), on a polygon by formula.RangeTriangle over an ear-clipping
// triangulation of the polygon, on a polyhedron by interval evaluation on
// the coordinate boxes of its cone tetrahedra. interval(…) is not allowed.
//
// boundary is "dirichlet", "neumann" or {"robin": α} (α ≥ 0) for every
// side, or a list with one entry per side: [left, right] for an interval,
// one per edge for a polygon, edge i running from vertex i to vertex i+1
// (the last from vertex n−1 to vertex 0). On a product it is one condition
// for every face, or a list with one entry per factor, each that factor's
// own boundary as a lone interval or polygon takes it; the face
// (side s of factor i) × (the other factors) carries the condition of s.
//
// On a product the potential is split exactly, from the formula as
// written, into parts of the factors (Separable, formula.Summands): every
// summand of its top-level sums and differences must use the coordinates
// of at most one factor (constants go to the first factor), and each part
// must be defined and finite on its factor (its problem, FactorFile, is
// read as a lone problem). A potential that is not such a sum is refused
// on products of three or four coordinates (the tetrahedral elements it
// would need do not exist yet) and kept on a product of two intervals,
// which is certified as its rectangle (RectangleFile). "points" are not
// available on products. Robin with α = 0 is kept as Robin
// in the text and acts as Neumann.
//
// eigenvalues is the number of eigenvalues to enclose, an integer from 2 to
// 20. target.relative_width is the relative width to aim for, in (0, 1).
// claims are inequalities "lhs REL rhs" in the grammar of package
// gapcert/fem/claim (REL one of >=, <=, >, <, or ≥, ≤), and every name a claim
// uses must be a quantity this problem provides (ClaimScope): lambdak up to
// "eigenvalues", gap, D, area and perimeter on polygons, inradius on
// triangles and tetrahedra, volume and surface_area on polyhedra and on products of
// three or four coordinates, alpha when the Robin sides share one coefficient
// (RobinAlpha), pi, e and the parameters. A claim may instead name a
// built-in claim, "@name" (package gapcert/fem/claim/named, e.g.
// "@fundamental_gap"): the name must be in the catalogue (read
// case-insensitively, '-' as '_', surrounding spaces ignored) and apply to
// the domain's dimension, and the canonical form records it as "@name".
// A parameter may not take the name of a quantity other than alpha (a
// parameter named alpha is what alpha means in claims).
//
// # Canonical form
//
// Canonical writes the problem as JSON without whitespace with sorted keys:
// numbers as canonical strings (shortest exact decimal when the value has
// one, else the reduced fraction "p/q"; formulas in canonical formula
// text), the boundary as the explicit list in counterclockwise edge order,
// every default filled in. SHA256 is the hex SHA-256 of that text, so two
// files describing the same problem in the same words hash alike.
//
// References:
//
//	G. H. Meisters, Polygons have ears, Amer. Math. Monthly 82 (1975) 648–651.
//	T. H. Cormen, C. E. Leiserson, R. L. Rivest, C. Stein, Introduction to
//	Algorithms, 3rd ed., MIT Press, 2009, §33.1 (segment intersection).
package problem

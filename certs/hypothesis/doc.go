// Package hypothesis decides the hypotheses of the theorems behind the
// built-in claims (package fem/claim/named) for a problem: each decision is a
// certs.Hypothesis with the verdict "proven", "disproven" (with a
// witness: a side, a vertex or a point of the domain) or "undecided", and a
// detail in words.
//
// Guarantees. "proven" and "disproven" are decided exactly (boundary
// kinds, vertex counts, big.Rat arithmetic on rational coordinates, and
// the exact algebraic numbers of package interval/algebraic for tangency
// and right angles at irrational coordinates) or by
// outward-rounded interval arithmetic (package interval) whose enclosure
// settles the sign in question; a sign that the enclosures do not settle
// gives "undecided", never a guess. Floating point at round-to-nearest only
// chooses where to subdivide and which points to try as witnesses; a
// witness point is an exact float64 point verified inside the closed domain.
// The decisions are deterministic, so that a re-check reproduces them.
//
// Convexity of the domain: a counterclockwise polygon is convex if and only
// if every turn (v_i − v_{i−1}) × (v_{i+1} − v_i) is ≥ 0 (common practice);
// a turn verified < 0 is a re-entrant vertex, the witness.
//
// Convexity of V: a C² function on a convex set is convex if and only if
// its Hessian is positive semidefinite at every point (common practice),
// and a symmetric matrix is positive semidefinite if and only if every
// principal minor is ≥ 0 (Sylvester's criterion for semidefiniteness; in
// two dimensions H11 ≥ 0, H22 ≥ 0 and H11·H22 − H12² ≥ 0). The Hessian
// is enclosed by automatic differentiation (formula.Hessian) over the
// cells of a subdivision of the domain (intervals: cells; polygons and
// polyhedra: the simplices that tile them, refined by midpoint
// subdivision where undecided, each evaluated over its bounding box; on a
// polyhedron a cell also passes when the Hessian enclosure is verified
// positive definite: λ_min(H) ≥ λ_min(M − σI) for the midpoint matrix M
// and σ the Frobenius norm of the radii, by Weyl's inequality, with
// M − σI checked by an interval Cholesky factorisation; see
// positiveDefiniteByShift). See
// ConvexPotential for why success of the enclosure on every cell also
// proves V to be C².
//
// Circumsolids (Circumsolid, ProductOfCircumsolids): a convex polyhedron
// has a ball touching every facet if and only if the linear system
// N_f·c + |N_f|·r = N_f·p_f over its faces has a solution, the
// three-dimensional form of the tangential polygon's system (the proofs
// are in the doc comments); the systems are decided exactly for
// coordinates read as surds or cyclotomic numbers, right prisms from the
// exact vertices.
//
// Continuity of V (ContinuousPotential) follows from V being defined at
// every point of each cell of a cover of the closed domain, each
// operation of the formula grammar being continuous on its domain.
//
// One hypothesis is about the ground state itself, not the problem:
// log_concave_ground_state (LogConcaveGroundState) takes over the verdict
// of the certificate's own results.ground_state, which package
// certs/certify certifies by validated enclosures of the ground state;
// DecideCertified decides it from that block and every other hypothesis
// from the problem (Decide).
package hypothesis

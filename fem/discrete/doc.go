// Package discrete says what a discretisation supplies to the certification
// method of gapcert, whatever the dimension of its domain: the small
// interfaces through which one driver computes Rayleigh–Ritz upper bounds,
// projection (stage-A) lower bounds and Lehmann–Goerisch (stage-B) lower
// bounds of the eigenvalues of −Δ + V.
//
// Each interface pairs a floating-point side that only chooses (approximate
// eigenvectors, approximate eigenvalues that locate shifts, fluxes, error
// indicators) with an interval side that proves (enclosed Ritz matrices, a
// verified inertia count, an enclosed projection constant, an enclosed
// Lehmann–Goerisch matrix). Nothing chosen enters a bound except as an
// exact input to the interval side, whose guarantee holds for every such
// input; each method's doc comment says which side it is on.
//
// The interval (package fem/line) and triangle (package fem/tri) element
// packages implement these interfaces in their files discretisation.go,
// their trial spaces through the one generic adapter Conforming, and run
// the conformance suite of package fem/discrete/discretetest on them.
// The shifted eigenvalues are Λ_k = λ_k + γ throughout, γ an exact float
// chosen so that V + γ ≥ 0.
package discrete

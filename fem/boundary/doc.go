// Package boundary describes the condition that the eigenfunctions of
// −Δu + Vu = λu satisfy on one side of the domain (an end of an interval,
// a side of a polygon), for every package from the problem reader down to
// the element spaces:
//
//	Dirichlet   u = 0,
//	Neumann     ∂u/∂n = 0,
//	Robin       ∂u/∂n + αu = 0 with α ≥ 0 (Alpha encloses the exact α).
//
// # The weak form
//
// A Dirichlet side is essential: the spaces impose u = 0 there and the
// side adds nothing to the forms. Neumann and Robin sides are natural:
// integrating −Δu·v by parts gives ∫∇u·∇v − ∫_∂ (∂u/∂n) v, and on such a
// side ∂u/∂n = −αu, so the side adds α ∫_side u v to the form
// a(u, v) = ∫∇u·∇v + ∫Vuv. The Neumann condition is this with α = 0
// (Condition.WeakAlpha is the one place that says so): every
// discretisation treats a Neumann side as a Robin side whose coefficient
// is exactly [0, 0], and a Robin side with α = 0 is the Neumann condition.
//
// For the Lehmann–Goerisch fluxes σ ∈ H(div) the side decides whether the
// normal flux σ·n is free: it is on Dirichlet sides (the test functions
// vanish there) and on Robin sides with α verified > 0 (the term enters
// the norm with weight 1/α); on the other sides σ·n must vanish
// (Condition.FluxFree).
//
// Adding a kind of condition means adding it here, to the problem reader
// (package fem/problem) and to the one file of each element package that
// turns conditions into constraints and boundary terms (boundary.go in
// fem/line and fem/tri).
package boundary

// Package temple implements the Lehmann–Goerisch lower bounds for the
// lowest eigenvalues of a selfadjoint eigenvalue problem, given the small
// interval matrices that a discretisation assembles for it.
//
// Guarantee: LehmannGoerisch returns floats that are lower bounds of the
// eigenvalues Λ_1 ≤ … ≤ Λ_N of the (shifted) problem for every member of the
// interval matrices it is given, provided the caller's hypothesis on the
// shift ρ̂ holds (ρ̂ ≤ Λ_{N+1}). Positive definiteness of the Lehmann matrix
// is verified here, never assumed; every arithmetic step that leads to a
// bound is outward rounded (package interval), and the matrix eigenvalues are
// enclosed by package enclose.
//
// Temple's inequality is the case N = 1 of the same theorem: with one trial
// function ũ, LehmannGoerisch returns a float below
//
//	(ρ̂·b(ũ,ũ) − M(ũ,ũ)) / (ρ̂·‖w‖²_X − b(ũ,ũ)),
//
// which is Temple's lower bound of Λ_1 (an algebraic rearrangement of
// ρ̂ − ρ̂/(1 − μ_1) for the 1×1 pencil). There is therefore no separate entry
// point for it.
package temple

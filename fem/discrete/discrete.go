package discrete

import (
	"gapcert/enclose"
	"gapcert/interval"
)

// Trial is a conforming trial space V_h ⊂ H¹ (Dirichlet conditions
// imposed exactly) with the potential of the problem, for Rayleigh–Ritz
// upper bounds.
type Trial interface {
	// N is the dimension of the space.
	N() int
	// ApproxEigenvectors assembles the float stiffness and mass matrices
	// of a + shift·b and returns coefficient vectors of approximations of
	// the lowest count eigenfunctions (a choice: any vectors give valid
	// upper bounds; good ones give narrow ones).
	ApproxEigenvectors(count int, shift float64) ([][]float64, error)
	// RitzMatrices returns interval matrices a0 ⊇ (a(u_i, u_j) + γ b(u_i, u_j))
	// and a1 ⊇ (b(u_i, u_j)) for the functions u_i with the exact float
	// coefficients vecs[i], for every γ ∈ gamma and every exact datum
	// inside the enclosures of the problem (the proving side). A leading
	// block of the result depends only on the leading vectors.
	RitzMatrices(vecs [][]float64, gamma interval.I) (a0, a1 *enclose.Sym, err error)
}

// StageA is the discrete space of a projection lower bound (X. Liu,
// Appl. Math. Comput. 267 (2015) 341–355; package enclose, Projection
// bounds): an interval pencil ([K], [M]) on a space with a projection
// P_h such that ‖u − P_h u‖ ≤ C_h ‖∇(u − P_h u)‖, whose eigenvalues
// Λ_{h,k} give Λ_k ≥ c + Λ_{h,k}'/(1 + C_h² Λ_{h,k}') with
// Λ_{h,k}' = Λ_{h,k} − c, c = FormShift (see enclose.ProjectionLower).
type StageA interface {
	// CountBelow is the verified count of the pencil (enclose.Counter:
	// Sylvester's law of inertia with an enclosed residual).
	enclose.Counter
	// MassMin is a positive lower bound of the least eigenvalue of every
	// member of [M], for CountBelow.
	MassMin() float64
	// ProjectionConstant encloses C_h (its upper end is used).
	ProjectionConstant() interval.I
	// FormShift is a float c ≥ 0 such that the form of the pencil is
	// c·b plus a nonnegative form whose projection error obeys C_h; 0 when
	// the space has no such part. Any c between 0 and the true constant
	// is sound.
	FormShift() float64
	// Locate returns a floating-point approximation of the index-th
	// (1-based) eigenvalue of the midpoint pencil, given a known lower
	// bound lo of it (a choice: it only places the shifts of the verified
	// counts).
	Locate(index int, lo float64) (float64, error)
}

// Flux is a space of fluxes σ ∈ H(div) (with the boundary conditions of
// the Lehmann–Goerisch method) on the trial mesh, with the weight
// 1/(V + γ_B) of its shift γ_B fixed when it was made.
type Flux interface {
	// N is the dimension of the space.
	N() int
	// Choose returns, for each trial function, the coefficients of a flux
	// that approximately minimizes the Lehmann–Goerisch residual norm (a
	// choice: any fluxes give valid bounds). A failure of the float solve
	// is an error saying so.
	Choose(trial [][]float64) ([][]float64, error)
	// LGMatrix returns the interval matrix of the Lehmann–Goerisch
	// theorem (package temple)
	//	a2_ij ⊇ ∫σ_i·σ_j + ∫(u_i + div σ_i)(u_j + div σ_j)/(V + γ_B)
	//	        + Σ_(Robin boundary, α>0) ∫ (σ_i·n)(σ_j·n)/α
	// for the trial functions u_i and their fluxes σ_i (exact float
	// coefficients), valid for every exact datum inside the enclosures
	// (the proving side). It fails when V + γ_B > 0 cannot be verified.
	LGMatrix(trial, fluxes [][]float64) (*enclose.Sym, error)
}

// LehmannMatrix is implemented by flux spaces that can enclose the matrix
// B = A0 − 2ρA1 + ρ²A2 of the Lehmann–Goerisch theorem (package temple)
// directly, in a form narrower than the combination of the enclosures of
// A0, A1 and A2 (the proving side).
type LehmannMatrix interface {
	// LehmannMatrix returns an enclosure of B for the trial functions, their
	// fluxes and the float shift rho > 0, or an error when this space
	// cannot form it (the caller then combines LGMatrix with the Ritz
	// matrices).
	LehmannMatrix(trial, fluxes [][]float64, rho float64) (*enclose.Sym, error)
}

// Indicators is implemented by flux spaces that can say where the flux
// misses the gradient most, for adaptive refinement (a choice).
type Indicators interface {
	// Indicators returns one nonnegative float per cell of the trial
	// mesh; lambda holds approximations of the shifted eigenvalues of the
	// trial functions.
	Indicators(trial, fluxes [][]float64, lambda []float64) []float64
}

// ShiftSearch is how a stage-A search places the shifts of the verified
// counts below an approximate eigenvalue λ̃ of index j (a choice of the
// discretisation: every verified count gives a sound bound). The shifts
// are λ̃ − δ with δ = First·λ̃ multiplied by Factor after each try, at most
// Tries of them and none at or below the known lower bound. A count that
// shows at most j − 1 eigenvalues below σ′ proves Λ_{h,j} ≥ σ′. With
// Stale = 0 the search ends at the first proof; otherwise it keeps the
// largest σ′ and ends after Stale proofs in a row that do not improve it.
type ShiftSearch struct {
	First, Factor float64
	Tries, Stale  int
}

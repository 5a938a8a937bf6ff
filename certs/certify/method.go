package certify

// Method is the "method" object of a 1D certificate. Its recipe fields
// (Cells … Gamma) are the inputs of the deterministic computation that Check
// repeats; the remaining fields are its outputs, recorded so that a reader
// sees each stage's contribution and Check can compare them.
type Method struct {
	Kind        string `json:"kind"`                // "interval-1d"
	Cells       int    `json:"cells"`               // uniform cells of the P_p mesh
	Degree      int    `json:"degree"`              // p of the conforming trial space
	FluxDegree  int    `json:"flux_degree"`         // q of the continuous flux space
	TaylorOrder int    `json:"taylor_order"`        // order of the Taylor models of V
	WeightOrder int    `json:"weight_taylor_order"` // order of the Taylor models of 1/(V+γ)
	StageACells int    `json:"stage_a_cells"`
	Gamma       string `json:"gamma"` // the shift γ, an exact float64 in exact decimal

	N                  int      `json:"n"`                   // trial functions in stage B
	Rho                string   `json:"rho"`                 // ρ̂ ≤ Λ_{N+1}, exact float64 in exact decimal; "" if stage B did not run
	ProjectionConstant string   `json:"projection_constant"` // upper bound of C_h of stage A
	Stages             Stages   `json:"stages"`
	Theorems           []string `json:"theorems"`
}

// Stages lists each stage's bounds of the shifted eigenvalues Λ_k = λ_k + γ
// (the certified λ_k are the best of them, shifted back by γ).
type Stages struct {
	RitzUpper       []StageBound `json:"ritz_upper"`
	ProjectionLower []StageBound `json:"projection_lower"`
	LehmannGoerisch []StageBound `json:"lehmann_goerisch_lower"`
}

// StageBound is one stage's one-sided bound of Λ_Index.
type StageBound struct {
	Index int    `json:"index"`
	Bound string `json:"bound"`
}

// theorems1D are the results a 1D certificate relies on.
var theorems1D = []string{
	"min-max principle (Courant-Fischer): Rayleigh-Ritz upper bounds",
	"X. Liu, Appl. Math. Comput. 267 (2015) 341-355: projection lower bounds, C_h = h_max/(2 pi) for the mean-preserving P2 space",
	"Lehmann-Goerisch: H. Behnke, F. Goerisch, Topics in Validated Computations (1994) 277-322; T. Vejchodsky, arXiv:1602.08961",
	"Sylvester's law of inertia: verified eigenvalue counts",
}

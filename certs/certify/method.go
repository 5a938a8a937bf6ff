package certify

// Method is the "method" object of a certificate. Its recipe fields (from
// Kind to StageARefinements/GradedLevels) are the inputs of the
// deterministic computation that Check repeats; the remaining fields are
// its outputs, recorded so that a reader sees each stage's contribution and
// Check can compare them.
type Method struct {
	Kind        string `json:"kind"`                 // KindInterval, KindPolygon or KindPolyhedron
	Degree      int    `json:"degree"`               // p of the conforming trial space
	TaylorOrder int    `json:"taylor_order"`         // order of the Taylor models of V
	Gamma       string `json:"gamma"`                // the shift γ, an exact float64 in exact decimal
	FluxGamma   string `json:"flux_gamma,omitempty"` // polygons: the shift γ_B ≥ γ of stage B (its Λ_k = λ_k + γ_B)
	// ExtraIndices is how many eigenvalues past the requested ones are
	// bounded (Ritz upper bounds up to index m + ExtraIndices, stage-A
	// lower bounds one further), so that stage B's N can pass a cluster.
	ExtraIndices int `json:"extra_indices"`

	// Intervals.
	Cells       int `json:"cells,omitempty"`               // uniform cells of the P_p mesh
	FluxDegree  int `json:"flux_degree,omitempty"`         // q of the continuous flux space (polygons: k of RT_k)
	WeightOrder int `json:"weight_taylor_order,omitempty"` // order of the Taylor models of 1/(V+γ)
	StageACells int `json:"stage_a_cells,omitempty"`

	// Polygons (and polyhedra: refinements, stage-A refinements, graded
	// levels toward the strongest singular edge).
	Refinements       int     `json:"refinements,omitempty"`         // uniform refinements of the trial mesh
	StageARefinements int     `json:"stage_a_refinements,omitempty"` // uniform refinements of the stage-A mesh
	GradedLevels      int     `json:"graded_levels,omitempty"`       // extra levels toward each singular corner (edge)
	AdaptiveMarks     [][]int `json:"adaptive_marks,omitempty"`      // per adaptive round of the trial mesh, the triangles bisected
	StageASpace       string  `json:"stage_a_space,omitempty"`       // "crouzeix-raviart" or "enriched-crouzeix-raviart"
	Triangles         int     `json:"triangles,omitempty"`           // triangles of the trial mesh (a record, not an input)
	StageATriangles   int     `json:"stage_a_triangles,omitempty"`
	FluxUnknowns      int     `json:"flux_unknowns,omitempty"` // dimension of RT_k on the trial mesh (a record)

	// Polyhedra (with Refinements, StageARefinements, StageASpace,
	// FluxDegree, WeightOrder, FluxUnknowns above).
	Tetrahedra       int `json:"tetrahedra,omitempty"` // tetrahedra of the trial mesh (a record, not an input)
	StageATetrahedra int `json:"stage_a_tetrahedra,omitempty"`

	N                  int      `json:"n"`                   // trial functions in stage B
	Rho                string   `json:"rho"`                 // ρ̂ ≤ λ_{N+1} + (γ_B on polygons, else γ), exact float64 in exact decimal; "" if stage B did not run
	ProjectionConstant string   `json:"projection_constant"` // upper bound of C_h of stage A
	Stages             Stages   `json:"stages"`
	Theorems           []string `json:"theorems"`

	// Widths and Refinement are written by Certify; certificates written
	// before them have neither, and Check compares them when present.
	Widths     []Width     `json:"widths,omitempty"`     // each enclosure's width: absolute, relative to itself, by the target rule
	Refinement *Refinement `json:"refinement,omitempty"` // the run's target and why refinement stopped
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

// Method kinds (the "kind" of a certificate's method).
const (
	KindInterval = "interval-1d"
	KindPolygon  = "polygon-2d"
	// KindPolyhedron is P_p on uniformly refined cone tetrahedra graded
	// toward singular edges, (E)CR stage A, RT_k fluxes
	// (certs/certify/polyhedron.go, polyhedron_grading.go).
	KindPolyhedron = "polyhedron-3d"
)

// theorems1D are the results a 1D certificate relies on.
var theorems1D = []string{
	"min-max principle (Courant-Fischer): Rayleigh-Ritz upper bounds",
	"X. Liu, Appl. Math. Comput. 267 (2015) 341-355: projection lower bounds, C_h = h_max/(2 pi) for the mean-preserving P2 space",
	"Lehmann-Goerisch: H. Behnke, F. Goerisch, Topics in Validated Computations (1994) 277-322; T. Vejchodsky, arXiv:1602.08961",
	"Sylvester's law of inertia: verified eigenvalue counts",
}

// theoremsPolygon are the results a polygon certificate relies on.
var theoremsPolygon = []string{
	"min-max principle (Courant-Fischer): Rayleigh-Ritz upper bounds",
	"X. Liu, Appl. Math. Comput. 267 (2015) 341-355: projection lower bounds with (enriched) Crouzeix-Raviart elements, C_T = 0.1893 h_T (longest edge; Lemma 3.2 of C. You, H. Xie, X. Liu, arXiv:1808.08148)",
	"Lehmann-Goerisch with Raviart-Thomas fluxes: H. Behnke, F. Goerisch, Topics in Validated Computations (1994) 277-322; T. Vejchodsky, arXiv:1801.02561",
	"Sylvester's law of inertia: verified eigenvalue counts",
}

// theoremsPolyhedron are the results a polyhedron certificate relies on.
var theoremsPolyhedron = []string{
	"min-max principle (Courant-Fischer): Rayleigh-Ritz upper bounds",
	"X. Liu, Appl. Math. Comput. 267 (2015) 341-355: projection lower bounds with (enriched) Crouzeix-Raviart elements on tetrahedra, C_T^2 = h_T^2/pi^2 + (sum of squared edge lengths)/720 (Crouzeix-Raviart) and C_T = h_T/pi (enriched; Payne-Weinberger 1960, Bebendorf 2003), derived in package fem/tet",
	"Lehmann-Goerisch with Raviart-Thomas fluxes on tetrahedra: H. Behnke, F. Goerisch, Topics in Validated Computations (1994) 277-322; T. Vejchodsky, arXiv:1801.02561",
	"Sylvester's law of inertia: verified eigenvalue counts",
}

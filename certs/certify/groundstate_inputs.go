package certify

import (
	"gapcert/fem/discrete"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// groundStateInputs is what the certified step hands to the certification
// of the ground state (results.ground_state): the problem, the certified
// enclosures of λ1 and λ2, the step's shift γ, its trial space (for
// intervals a *line.Trial, for polygons a *tri.Trial) and the coefficient
// vector of the approximate ground state ũ (its first approximate
// eigenvector, an exact float input), with enclosures of
// a(ũ, ũ) + γ‖ũ‖² and ‖ũ‖² (the [0, 0] entries of its Ritz matrices).
type groundStateInputs struct {
	p                *problem.Problem
	lambda1, lambda2 interval.I
	gamma            float64
	trial            discrete.Trial
	u                []float64
	energy, norm2    interval.I
}

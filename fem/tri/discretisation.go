package tri

import (
	"fmt"

	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/discrete"
	"gapcert/interval"
)

// Trial, StageA and FluxSpace present the conforming P_p space, the
// (enriched) Crouzeix–Raviart spaces and the Raviart–Thomas fluxes as the
// interfaces of package fem/discrete; their float sides use the sparse
// solvers of package enclose/sparse.

var _ discrete.Indicators = (*FluxSpace)(nil)

// StageA is the interval pencil of a CR or ECR space
// (Projection.Matrices) with its projection constant, the constant of the
// CR form (Projection.CRShift) and its verified count
// (sparse.Counter).
type StageA struct {
	*sparse.Counter
	mMin, c float64
	ch      interval.I
	approx  []float64
}

// NewStageA assembles the stage-A pencil of s for V + γ
// (Projection.Matrices; an error when V + γ ≥ 0 cannot be verified) and
// computes approximations of its lowest located eigenvalues
// (sparse.LowestEigs on the midpoint pencil, a choice) for Locate.
func NewStageA(s *Projection, v *Potential, gamma interval.I, located int) (*StageA, error) {
	k, mass, mMin, err := s.Matrices(v, gamma)
	if err != nil {
		return nil, err
	}
	ch := s.ProjectionConstant()
	approx, _, err := sparse.LowestEigs(k.Mid(), mass.Mid(), located)
	if err != nil {
		return nil, fmt.Errorf("the approximate stage-A eigenvalues could not be computed: %w", err)
	}
	return &StageA{Counter: sparse.NewCounter(k, mass), mMin: mMin, c: s.CRShift(v, gamma), ch: ch, approx: approx}, nil
}

// MassMin returns the lower bound of the mass matrix's least eigenvalue
// computed with the pencil.
func (s *StageA) MassMin() float64 { return s.mMin }

// ProjectionConstant returns Projection.ProjectionConstant.
func (s *StageA) ProjectionConstant() interval.I { return s.ch }

// FormShift returns Projection.CRShift (0 for ECR).
func (s *StageA) FormShift() float64 { return s.c }

// Locate returns the approximation of the index-th eigenvalue computed by
// NewStageA (lo is not needed). It panics beyond the located count.
func (s *StageA) Locate(index int, lo float64) (float64, error) {
	if index < 1 || index > len(s.approx) {
		panic("tri: stage-A index beyond the located eigenvalues")
	}
	return s.approx[index-1], nil
}

// FluxSpace is the Raviart–Thomas space RT_k on the trial mesh with the
// weight 1/(V + γ_B) (Potential.InverseShifted).
type FluxSpace struct {
	trial  *Trial
	flux   *Flux
	weight *Potential
	gamma  interval.I
}

// NewFluxSpace returns RT_k with the side conditions bc and the weight
// 1/(V + γ_B) of Taylor order weightOrder, or the error of InverseShifted
// when V + γ_B > 0 cannot be verified.
func NewFluxSpace(t *Trial, k int, bc []boundary.Condition, gammaB interval.I, weightOrder int) (*FluxSpace, error) {
	w, err := t.V.InverseShifted(gammaB, weightOrder)
	if err != nil {
		return nil, err
	}
	return &FluxSpace{trial: t, flux: NewFlux(t.Space.Mesh(), k, bc), weight: w, gamma: gammaB}, nil
}

// N returns the dimension of the flux space.
func (f *FluxSpace) N() int { return f.flux.N() }

// Choose returns Flux.MinimizeApprox for the trial functions (a choice).
func (f *FluxSpace) Choose(trial [][]float64) ([][]float64, error) {
	return f.flux.MinimizeApprox(f.trial.Space, trial, f.weight)
}

// LGMatrix returns Flux.LGMatrix for the trial functions and their fluxes.
func (f *FluxSpace) LGMatrix(trial, fluxes [][]float64) (*enclose.Sym, error) {
	return f.flux.LGMatrix(f.trial.Space, trial, fluxes, f.trial.V, f.weight, f.gamma)
}

// LehmannMatrix returns Flux.LehmannMatrix for the trial functions, their
// fluxes and the shift rho (ErrResidualBoundaryTerm on a mesh with Robin
// sides).
func (f *FluxSpace) LehmannMatrix(trial, fluxes [][]float64, rho float64) (*enclose.Sym, error) {
	return f.flux.LehmannMatrix(f.trial.Space, trial, fluxes, f.trial.V, f.weight, f.gamma, rho)
}

// Indicators returns Flux.Indicators.
func (f *FluxSpace) Indicators(trial, fluxes [][]float64, lambda []float64) []float64 {
	return f.flux.Indicators(f.trial.Space, trial, fluxes, lambda)
}

// Trial is P_p on a triangle mesh with the potential V of the problem.
type Trial = discrete.Conforming[*Lagrange, *Potential, *sparse.Sym]

// NewTrial returns the trial space s with the potential v.
func NewTrial(s *Lagrange, v *Potential) *Trial {
	return &Trial{Space: s, V: v, Lowest: sparse.LowestEigs}
}

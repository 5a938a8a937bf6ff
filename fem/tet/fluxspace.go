package tet

import (
	"gapcert/enclose"
	"gapcert/fem/discrete"
	"gapcert/interval"
)

var _ discrete.Flux = (*FluxSpace)(nil)

// FluxSpace is the Raviart–Thomas space of a Flux with a trial space on
// the same cells and the weight 1/(V + γ_B) of its shift, as package
// fem/discrete asks of a flux space.
type FluxSpace struct {
	trial  FluxTrial
	flux   *Flux
	weight FluxWeight
}

// NewFluxSpaceFree returns the flux space of f for the trial space s and
// V = 0, with the weight 1/γ_B (NewFluxConstantWeight: an error unless
// γ_B > 0 is verified). A potential V ≠ 0 needs the weight made from the
// model of V itself (1/(V + γ_B) with its remainder, a FluxWeight), so
// that no other weight can be paired with the problem by mistake.
func NewFluxSpaceFree(s FluxTrial, f *Flux, gammaB interval.I) (*FluxSpace, error) {
	w, err := NewFluxConstantWeight(gammaB)
	if err != nil {
		return nil, err
	}
	return &FluxSpace{trial: s, flux: f, weight: w}, nil
}

// N returns the dimension of the flux space.
func (f *FluxSpace) N() int { return f.flux.N() }

// Choose returns Flux.ChooseApprox for the trial functions (a choice).
func (f *FluxSpace) Choose(trial [][]float64) ([][]float64, error) {
	return f.flux.ChooseApprox(f.trial, trial, f.weight)
}

// LGMatrix returns Flux.LGMatrix for the trial functions and their fluxes.
func (f *FluxSpace) LGMatrix(trial, fluxes [][]float64) (*enclose.Sym, error) {
	return f.flux.LGMatrix(f.trial, trial, fluxes, f.weight)
}

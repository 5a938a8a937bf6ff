package tet

import (
	"errors"

	"gapcert/enclose"
	"gapcert/fem/boundary"
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

	// Set by NewFluxSpace: the potential of the trial space and γ_B, which
	// LGMatrix checks the weight against.
	v      *Potential
	gammaB interval.I
}

// ErrWeightMismatch is returned by LGMatrix of a flux space whose weight
// was not made by v.InverseShifted(γ_B, ·) for the trial space's potential
// v and the space's γ_B: only then is it known to enclose 1/(V + γ_B).
var ErrWeightMismatch = errors.New("tet: the weight must be v.InverseShifted(gammaB) for the trial space's potential v")

// NewFluxSpace returns RT_k on the mesh of the trial space t with the
// conditions bc of the polyhedron faces (bc[i] for face i, as for
// NewLagrange) and the weight 1/(V + γ_B) made from t's own potential
// (Potential.InverseShifted of Taylor order ≥ weightOrder; its error, a
// *SignError, when V + γ_B > 0 cannot be verified on a tetrahedron). It
// serves every V, V = 0 included (then the weight is the constant 1/γ_B,
// exactly modelled). It returns a *FluxOrientationError when a
// tetrahedron is not verified positively oriented.
func NewFluxSpace(t *Trial, k int, bc []boundary.Condition, gammaB interval.I, weightOrder int) (*FluxSpace, error) {
	m := t.Space.Mesh()
	checkBC(m, bc)
	w, err := t.V.InverseShifted(gammaB, weightOrder)
	if err != nil {
		return nil, err
	}
	f, err := NewFlux(m.RTCells(), k, m.faceConditions(bc))
	if err != nil {
		return nil, err
	}
	return &FluxSpace{trial: t.Space, flux: f, weight: w, v: t.V, gammaB: gammaB}, nil
}

// NewFluxSpaceFree returns the flux space of f for the trial space s and
// V = 0, with the weight 1/γ_B (NewFluxConstantWeight: an error unless
// γ_B > 0 is verified), for a trial space given only as a FluxTrial. A
// trial space with its potential (a Trial, any V) takes NewFluxSpace,
// which makes the weight from the model of V itself, so that no other
// weight can be paired with the problem by mistake.
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
//
// For a space of NewFluxSpace it first checks that the weight is
// v.InverseShifted(γ_B, ·) for the trial space's potential v and the
// space's γ_B (else ErrWeightMismatch).
func (f *FluxSpace) LGMatrix(trial, fluxes [][]float64) (*enclose.Sym, error) {
	if f.v != nil {
		w, ok := f.weight.(*Potential)
		if !ok || w.inverseOf != f.v || w.shift != f.gammaB {
			return nil, ErrWeightMismatch
		}
	}
	return f.flux.LGMatrix(f.trial, trial, fluxes, f.weight)
}

package line

import (
	"gapcert/fem/boundary"

	"gapcert/enclose"
	"gapcert/enclose/band"
	"gapcert/fem/discrete"
	"gapcert/interval"
)

// The spaces of this package as the interfaces of package fem/discrete,
// with the banded solvers of package enclose/band for their float sides:
// Trial (P_p), StageA (mean-preserving P2), FluxSpace (continuous fluxes).

// Trial is the conforming space P_p with the potential V of the problem.
type Trial = discrete.Conforming[*Lagrange, *Potential, *band.Sym]

// NewTrial returns the trial space s with the potential v.
func NewTrial(s *Lagrange, v *Potential) *Trial {
	return &Trial{Space: s, V: v, Lowest: band.LowestEigs}
}

var (
	_ discrete.StageA = (*StageA)(nil)
	_ discrete.Flux   = (*FluxSpace)(nil)
)

// StageA is the interval pencil of the mean-preserving P2 space
// (MeanP2.Matrices) with its projection constant C_h = h/(2π) and its
// verified count (band.Counter).
type StageA struct {
	*band.Counter
	k, m  *band.ISym
	mMin  float64
	ch    interval.I
	upper []float64
}

// NewStageA assembles the stage-A pencil of s for V + γ (MeanP2.Matrices;
// an error when V + γ ≥ 0 cannot be verified). upper holds upper bounds
// of the shifted eigenvalues Λ_k, which only place the brackets of Locate.
func NewStageA(s *MeanP2, v *Potential, gamma interval.I, upper []float64) (*StageA, error) {
	k, m, mMin, err := s.Matrices(v, gamma)
	if err != nil {
		return nil, err
	}
	return NewStageAPencil(k, m, mMin, s.ProjectionConstant(), upper), nil
}

// NewStageAPencil returns the stage-A space of the banded interval pencil
// ([K], [M]) with mass bound mMin (a positive lower bound of the least
// eigenvalue of every member of [M]), projection constant ch and upper
// bounds upper of Λ_k for the brackets of Locate. It panics if upper is
// empty.
func NewStageAPencil(k, m *band.ISym, mMin float64, ch interval.I, upper []float64) *StageA {
	if len(upper) == 0 {
		panic("line: stage A needs at least one upper bound to place its brackets")
	}
	return &StageA{Counter: band.NewCounter(k, m), k: k, m: m, mMin: mMin, ch: ch, upper: upper}
}

// MassMin returns the lower bound of the mass matrix's least eigenvalue
// computed with the pencil.
func (s *StageA) MassMin() float64 { return s.mMin }

// ProjectionConstant returns MeanP2.ProjectionConstant.
func (s *StageA) ProjectionConstant() interval.I { return s.ch }

// FormShift returns 0: the form of the mean-preserving P2 pencil has no
// constant part apart from the projection bound.
func (s *StageA) FormShift() float64 { return 0 }

// Locate returns Bisect(index, lo, hi). The bracket end hi comes from
// λ_h/(1 + C²λ_h) ≤ Λ_k, that is λ_{h,k} ≤ Λ_k/(1 − C²Λ_k), with the
// upper bound of Λ_k given to NewStageA, or twice the largest upper bound
// when that fails (a choice; a wrong guess costs only width).
func (s *StageA) Locate(index int, lo float64) (float64, error) {
	c2 := s.ch.Hi * s.ch.Hi
	i := index - 1
	hi := 2 * s.upper[len(s.upper)-1]
	if i < len(s.upper) && c2*s.upper[i] < 0.5 {
		hi = s.upper[i] / (1 - c2*s.upper[i]) * (1 + 1e-9)
	}
	return s.Bisect(index, lo, hi), nil
}

// Bisect returns an approximation of the index-th eigenvalue λ_{h,index}
// of the midpoint pencil in [lo, hi] by a floating-point Sturm bisection
// (counts of negative pivots of K − σM; a breakdown counts as "too
// high"): the largest point reached that counts at most index − 1
// eigenvalues below it (a choice).
func (s *StageA) Bisect(index int, lo, hi float64) float64 {
	km, mm := s.k.Mid(), s.m.Mid()
	shifted := band.NewSym(km.N, km.W)
	var f band.LDL
	below := func(sigma float64) int {
		for i := range shifted.Data {
			shifted.Data[i] = km.Data[i] - sigma*mm.Data[i]
		}
		if !f.Factorize(shifted) {
			return index
		}
		return f.NegCount()
	}
	a, b := lo, hi
	for it := 0; it < 100 && b-a > 1e-15*b; it++ {
		mid := a + (b-a)/2
		if below(mid) <= index-1 {
			a = mid
		} else {
			b = mid
		}
	}
	return a
}

// FluxSpace is the continuous flux space of degree q on the trial mesh
// with the weight 1/(V + γ_B) (Potential.InverseShifted).
type FluxSpace struct {
	trial  *Trial
	flux   *Flux
	weight *Potential
	gamma  interval.I
}

// NewFluxSpace returns the flux space of degree q with the ends of the
// trial space and the weight 1/(V + γ_B) of Taylor order weightOrder, or
// the error of InverseShifted when V + γ_B > 0 cannot be verified.
func NewFluxSpace(t *Trial, q int, left, right boundary.Condition, gammaB interval.I, weightOrder int) (*FluxSpace, error) {
	w, err := t.V.InverseShifted(gammaB, weightOrder)
	if err != nil {
		return nil, err
	}
	return &FluxSpace{trial: t, flux: NewFlux(t.Space.Mesh(), q, left, right), weight: w, gamma: gammaB}, nil
}

// N returns the dimension of the flux space.
func (f *FluxSpace) N() int { return f.flux.N() }

// Choose returns Flux.MinimizeApprox for the trial functions (a choice),
// or ErrFluxFactor when the float factorization failed.
func (f *FluxSpace) Choose(trial [][]float64) ([][]float64, error) {
	return f.flux.MinimizeApprox(f.trial.Space, trial, f.weight)
}

// LGMatrix returns Flux.LGMatrix for the trial functions and their fluxes.
func (f *FluxSpace) LGMatrix(trial, fluxes [][]float64) (*enclose.Sym, error) {
	return f.flux.LGMatrix(f.trial.Space, trial, fluxes, f.trial.V, f.weight, f.gamma)
}

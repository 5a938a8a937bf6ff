package proof

import (
	"math"

	"gapcert/enclose"
	"gapcert/interval"
	"gapcert/temple"
)

// StageBShift relates the shifted eigenvalues of stage B to those of the
// certificate. Without Own, stage B bounds Λ_k = λ_k + γ itself. With Own
// it bounds Λ^B_k = λ_k + γ_B, and its inputs and outputs are converted
// with directed rounding, γ and γ_B being exact floats (↓ rounds down):
//
//	ρ̂_B = ((ρ̂ − γ)↓ + γ_B)↓ ≤ (λ_(N+1) + γ − γ) + γ_B = Λ^B_(N+1),
//	((ℓ_k − γ_B)↓ + γ)↓ ≤ (λ_k + γ_B − γ_B) + γ = λ_k + γ,
//
// since each rounded-down result is ≤ the exact result of its rounded
// inputs and + and − are monotone. Any γ_B is sound; the matrices given
// to StageB must be those of γ_B (the weight 1/(V + γ_B) requires
// V + γ_B > 0, verified where the weight is made).
type StageBShift struct {
	Gamma, GammaB float64
	Own           bool
}

// Rho returns the ρ̂ of stage B from a float rho ≤ Λ_(N+1).
func (s StageBShift) Rho(rho float64) float64 {
	if !s.Own {
		return rho
	}
	return interval.AddDown(interval.SubDown(rho, s.Gamma), s.GammaB)
}

// StageB returns lower bounds ℓ_k ≤ Λ_k = λ_k + γ, k = 1..N (−Inf where
// none), from the Lehmann–Goerisch theorem (temple.LehmannGoerisch) for
// the enclosed matrices a0 ⊇ (a(u_i,u_j) + γ_B b(u_i,u_j)),
// a1 ⊇ (b(u_i,u_j)) and a2 (package fem/discrete, Flux.LGMatrix) of N
// trial functions and their fluxes, and rhoB = s.Rho(ρ̂) with ρ̂ a
// verified lower bound of Λ_(N+1) (the caller's: the stage-A bound of
// index N + 1).
func (s StageBShift) StageB(a0, a1, a2 *enclose.Sym, rhoB float64) ([]float64, error) {
	lg, err := temple.LehmannGoerisch(a0, a1, a2, rhoB)
	return s.convert(lg, err)
}

// StageBFromB is StageB with an enclosure b of the Lehmann matrix
// B = A0 − 2ρ̂_B A1 + ρ̂_B² A2 for the same rhoB in place of a2
// (temple.LehmannGoerischFromB; fem/discrete, Flux LehmannMatrix).
func (s StageBShift) StageBFromB(a0, a1, b *enclose.Sym, rhoB float64) ([]float64, error) {
	lg, err := temple.LehmannGoerischFromB(a0, a1, b, rhoB)
	return s.convert(lg, err)
}

// convert returns the bounds lg of Λ^B_k as bounds of Λ_k (StageBShift).
func (s StageBShift) convert(lg []float64, err error) ([]float64, error) {
	if err != nil || !s.Own {
		return lg, err
	}
	out := make([]float64, len(lg))
	for k, l := range lg {
		out[k] = l // −Inf stays −Inf
		if !math.IsInf(l, -1) {
			out[k] = interval.AddDown(interval.SubDown(l, s.GammaB), s.Gamma)
		}
	}
	return out, nil
}

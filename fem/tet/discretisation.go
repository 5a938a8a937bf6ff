package tet

import (
	"fmt"

	"gapcert/enclose/sparse"
	"gapcert/fem/discrete"
	"gapcert/interval"
)

// Trial and StageA present the conforming P_p space and the
// Crouzeix–Raviart space as the interfaces of package fem/discrete; their
// float sides use the sparse solvers of package enclose/sparse.

// Trial is P_p on a tetrahedral mesh with the potential V of the problem.
type Trial = discrete.Conforming[*Lagrange, *Potential, *sparse.Sym]

// NewTrial returns the trial space s with the potential v.
func NewTrial(s *Lagrange, v *Potential) *Trial {
	return &Trial{Space: s, V: v, Lowest: sparse.LowestEigs}
}

// StageA is the interval pencil of the CR space (Projection.Matrices)
// with its projection constant, the constant of its form
// (Projection.CRShift) and its verified count (sparse.Counter).
type StageA struct {
	*sparse.Counter
	mMin, c float64
	ch      interval.I
	approx  []float64
}

var (
	_ discrete.StageA = (*StageA)(nil)
	_ discrete.Trial  = (*Trial)(nil)
)

// NewStageA assembles the stage-A pencil of s for V + γ
// (Projection.Matrices; an error when V + γ ≥ 0 cannot be verified) and
// computes approximations of its lowest located eigenvalues
// (sparse.LowestEigs on the midpoint pencil, a choice) for Locate.
func NewStageA(s *Projection, v *Potential, gamma interval.I, located int) (*StageA, error) {
	k, mass, mMin, err := s.Matrices(v, gamma)
	if err != nil {
		return nil, err
	}
	approx, _, err := sparse.LowestEigs(k.Mid(), mass.Mid(), min(located, s.N()))
	if err != nil {
		return nil, fmt.Errorf("the approximate stage-A eigenvalues could not be computed: %w", err)
	}
	counter := sparse.NewCounter(k, mass)
	counter.SetRoundoffLoss(stageARoundoffLoss)
	return &StageA{Counter: counter, mMin: mMin, c: s.CRShift(v, gamma), ch: s.ProjectionConstant(), approx: approx}, nil
}

// stageARoundoffLoss is the relative loss σ − σ' up to which the verified
// counts of the stage-A pencil keep the a-priori residual bound of
// package enclose/sparse (O(nnz(L)) operations) instead of enclosing every
// residual entry (about 4 times the up-looking factorization's time at
// 12k unknowns, 15 times at 97k; more against the multifrontal one). Measured on the Kuhn meshes of the unit cube
// (Dirichlet, CR, shifts 0.99λ_(h,2) to 1.5λ_(h,5)): losses 3e-9 to 1.4e-8
// at 11,400 unknowns, 4e-8 to 6.7e-7 at 47,616, 1.4e-7 to 2e-6 at 93,600,
// while the stage-A eigenvalues on such meshes lie 1e-3 and more below
// the exact ones and the projection bound loses 10% and more: a loss of
// 2⁻¹⁴ ≈ 6e-5 is invisible in ρ̂. A choice; both bounds are sound.
const stageARoundoffLoss = 0x1p-14

// MassMin returns the lower bound of the mass matrix's least eigenvalue
// computed with the pencil.
func (s *StageA) MassMin() float64 { return s.mMin }

// ProjectionConstant returns Projection.ProjectionConstant.
func (s *StageA) ProjectionConstant() interval.I { return s.ch }

// FormShift returns Projection.CRShift.
func (s *StageA) FormShift() float64 { return s.c }

// Locate returns the approximation of the index-th eigenvalue computed by
// NewStageA (lo is not needed). It panics beyond the located count.
func (s *StageA) Locate(index int, lo float64) (float64, error) {
	if index < 1 || index > len(s.approx) {
		panic("tet: stage-A index beyond the located eigenvalues")
	}
	return s.approx[index-1], nil
}

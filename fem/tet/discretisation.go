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
	return &StageA{Counter: sparse.NewCounter(k, mass), mMin: mMin, c: s.CRShift(v, gamma), ch: s.ProjectionConstant(), approx: approx}, nil
}

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

package tet

import (
	"testing"

	"gapcert/fem/discrete"
	"gapcert/fem/discrete/discretetest"
	"gapcert/interval"
)

// TestDiscretisationConformance runs the conformance suite of package
// fem/discrete on −Δu = λu on the unit cube with Dirichlet faces, whose
// eigenvalues are π²(i² + j² + k²) (separation of variables, common
// practice: 3π², 6π² three times, 9π²), shifted by γ = 1, with the
// enriched (ECR) and the plain (CR) Crouzeix–Raviart stage-A spaces on
// the mesh of 6³ subcubes. Stage A is loose in 3D (C_h = 0.3312 h_T with
// h_T = √3/6: the projection bound Λ/(1 + C_h²Λ) loses about 40% at
// Λ ≈ 60), hence its tolerance.
func TestDiscretisationConformance(t *testing.T) {
	zero := mustExpr(t, "0")
	bcs := allBC(6, dirichlet)
	m := unitCube(t, 2)
	v, err := NewPotential(m, zero, 1)
	if err != nil {
		t.Fatal(err)
	}
	trial := NewTrial(NewLagrange(m, 4, bcs), v)
	gamma := interval.Point(1)
	pi2 := interval.Pi().Sqr()
	six := pi2.MulF(6).AddF(1)
	exact := []interval.I{pi2.MulF(3).AddF(1), six, six, six, pi2.MulF(9).AddF(1)}
	for _, sp := range []struct {
		name     string
		enriched bool
	}{{"ECR", true}, {"CR", false}} {
		discretetest.Run(t, discretetest.Case{
			Name:  "unit cube, Dirichlet, " + sp.name,
			Exact: exact,
			Gamma: 1,
			Trial: trial,
			StageA: func([]float64) (discrete.StageA, error) {
				ma := unitCube(t, 6)
				va, err := NewPotential(ma, zero, 1)
				if err != nil {
					return nil, err
				}
				proj := NewCR(ma, bcs)
				if sp.enriched {
					proj = NewECR(ma, bcs)
				}
				return NewStageA(proj, va, gamma, len(exact))
			},
			Flux: func() (discrete.Flux, error) {
				return NewFluxSpace(trial, 4, bcs, gamma, 4)
			},
			RitzTol: 1e-2, StageATol: 0.5, TempleTol: 2e-2,
		})
	}
}

package tri

import (
	"testing"

	"gapcert/fem/boundary"
	"gapcert/fem/discrete"
	"gapcert/fem/discrete/discretetest"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// TestDiscretisationConformance runs the conformance suite of package
// fem/discrete on −Δu = λu on the unit square with Dirichlet sides, whose
// eigenvalues are π²(j² + k²) (closed form: 2π², 5π² twice, 8π²),
// shifted by γ = 1, with the enriched (ECR) and the plain (CR)
// Crouzeix–Raviart stage-A spaces.
func TestDiscretisationConformance(t *testing.T) {
	zero := mustExpr(t, "0")
	bcs := allBC(4, dirichlet)
	m := unitSquare(t, 2)
	v, err := NewPotential(m, zero, 2)
	if err != nil {
		t.Fatal(err)
	}
	trial := NewTrial(NewLagrange(m, 4, bcs), v)
	gamma := interval.Point(1)
	pi2 := interval.Pi().Sqr()
	exact := []interval.I{pi2.MulF(2).AddF(1), pi2.MulF(5).AddF(1), pi2.MulF(5).AddF(1), pi2.MulF(8).AddF(1)}
	for _, sp := range []struct {
		name string
		new  func(*mesh.Mesh, []boundary.Condition) *Projection
	}{{"ECR", NewECR}, {"CR", NewCR}} {
		discretetest.Run(t, discretetest.Case{
			Name:  "unit square, Dirichlet, " + sp.name,
			Exact: exact,
			Gamma: 1,
			Trial: trial,
			StageA: func([]float64) (discrete.StageA, error) {
				ma := unitSquare(t, 4)
				va, err := NewPotential(ma, zero, 2)
				if err != nil {
					return nil, err
				}
				return NewStageA(sp.new(ma, bcs), va, gamma, len(exact))
			},
			Flux: func() (discrete.Flux, error) {
				return NewFluxSpace(trial, 3, bcs, gamma, 4)
			},
			RitzTol: 1e-4, StageATol: 0.05, TempleTol: 1e-3,
		})
	}
}

package tri_test

import (
	"testing"

	"gapcert/fem/discrete"
	"gapcert/fem/discrete/discretetest"
	"gapcert/fem/mesh"
	"gapcert/fem/tri"
	"gapcert/interval"
	"gapcert/interval/formula"
)

// TestDiscretisationConformance runs the conformance suite of package
// fem/discrete on −Δu = λu on the unit square with Dirichlet sides, whose
// eigenvalues are π²(j² + k²) (closed form: 2π², 5π² twice, 8π²),
// shifted by γ = 1, with the enriched (ECR) and the plain (CR)
// Crouzeix–Raviart stage-A spaces.
func TestDiscretisationConformance(t *testing.T) {
	square := func(levels int) *mesh.Mesh {
		p := func(x, y float64) [2]interval.I { return [2]interval.I{interval.Point(x), interval.Point(y)} }
		m, err := mesh.FromPolygon([][2]interval.I{p(0, 0), p(1, 0), p(1, 1), p(0, 1)}, [][3]int{{0, 1, 2}, {0, 2, 3}})
		if err != nil {
			t.Fatal(err)
		}
		for i := 0; i < levels; i++ {
			m = m.Refine()
		}
		return m
	}
	zero := formula.MustParse("0")
	bcs := []tri.BC{{Dirichlet: true}, {Dirichlet: true}, {Dirichlet: true}, {Dirichlet: true}}
	m := square(2)
	v, err := tri.NewPotential(m, zero, 2)
	if err != nil {
		t.Fatal(err)
	}
	trial := &tri.Trial{Space: tri.NewLagrange(m, 4, bcs), V: v}
	gamma := interval.Point(1)
	pi2 := interval.Pi().Sqr()
	exact := []interval.I{pi2.MulF(2).AddF(1), pi2.MulF(5).AddF(1), pi2.MulF(5).AddF(1), pi2.MulF(8).AddF(1)}
	for _, sp := range []struct {
		name string
		new  func(*mesh.Mesh, []tri.BC) *tri.Projection
	}{{"ECR", tri.NewECR}, {"CR", tri.NewCR}} {
		discretetest.Run(t, discretetest.Case{
			Name:  "unit square, Dirichlet, " + sp.name,
			Exact: exact,
			Gamma: 1,
			Trial: trial,
			StageA: func([]float64) (discrete.StageA, error) {
				ma := square(4)
				va, err := tri.NewPotential(ma, zero, 2)
				if err != nil {
					return nil, err
				}
				return tri.NewStageA(sp.new(ma, bcs), va, gamma, len(exact))
			},
			Flux: func() (discrete.Flux, error) {
				return tri.NewFluxSpace(trial, 3, bcs, gamma, 4)
			},
			RitzTol: 1e-4, StageATol: 0.05, TempleTol: 1e-3,
		})
	}
}

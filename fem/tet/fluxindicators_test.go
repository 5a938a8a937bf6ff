package tet

import (
	"math"
	"testing"

	"gapcert/fem/boundary"
)

// TestFluxIndicatorsOfALinearFunction checks the indicators against a
// closed form: for ũ(x) = g·x (P_1, exact at the vertices) the gradient
// is the constant g, and the constant field g/Λ lies in RT_0 with face
// DOFs (g/Λ)·ν_F (its flux density is constant). On the unit cube the
// indicators of σ = g/Λ vanish, and those of σ = 0 and of σ = 2g/Λ sum to
// ‖∇ũ‖²/Λ² = |g|²/Λ² (|Ω| = 1).
func TestFluxIndicatorsOfALinearFunction(t *testing.T) {
	m := fluxKuhnMesh(2, nil, nil)
	bnd := m.boundaryAll(boundary.Condition{Kind: boundary.Dirichlet}) // flux DOFs kept on every face
	f, err := NewFlux(m.cells, 0, bnd)
	if err != nil {
		t.Fatal(err)
	}
	s := newFluxTestTrial(m, 1, m.boundaryAll(boundary.Condition{Kind: boundary.Neumann}))
	g := [3]float64{0.5, -1.25, 2}
	const lambda = 4.0
	u := make([]float64, s.N())
	sigma := make([]float64, f.N())
	ix := rtMulti(1)
	for c, cell := range m.cells {
		for j := 0; j < 4; j++ {
			var e [4]int
			e[j] = 1
			v := 0.0
			for a := 0; a < 3; a++ {
				v += g[a] * cell.Vertices[j][a].Mid()
			}
			u[s.dofs[c][ix.pos[e]]] = v
		}
		for i := 0; i < 4; i++ {
			// Local face DOF: σ·ν_i with ν_i = (P_(j_2) − P_(j_1)) × (P_(j_3) − P_(j_1)) (−1)^i.
			fv := rtFaceVertices[i]
			var e1, e2 [3]float64
			for a := 0; a < 3; a++ {
				e1[a] = cell.Vertices[fv[1]][a].Mid() - cell.Vertices[fv[0]][a].Mid()
				e2[a] = cell.Vertices[fv[2]][a].Mid() - cell.Vertices[fv[0]][a].Mid()
			}
			nu := [3]float64{e1[1]*e2[2] - e1[2]*e2[1], e1[2]*e2[0] - e1[0]*e2[2], e1[0]*e2[1] - e1[1]*e2[0]}
			if i%2 == 1 {
				for a := range nu {
					nu[a] = -nu[a]
				}
			}
			d := (g[0]*nu[0] + g[1]*nu[1] + g[2]*nu[2]) / lambda
			sigma[f.dofs[c][i]] = f.sign[c][i] * d
		}
	}
	zero := make([]float64, f.N())
	double := make([]float64, f.N())
	for i, v := range sigma {
		double[i] = 2 * v
	}
	want := (g[0]*g[0] + g[1]*g[1] + g[2]*g[2]) / (lambda * lambda)
	for _, c := range []struct {
		name  string
		flux  []float64
		total float64
	}{{"σ = g/Λ", sigma, 0}, {"σ = 0", zero, want}, {"σ = 2g/Λ", double, want}} {
		ind := f.Indicators(s, [][]float64{u}, [][]float64{c.flux}, []float64{lambda})
		sum := 0.0
		for _, v := range ind {
			if v < 0 {
				t.Fatalf("%s: negative indicator %g", c.name, v)
			}
			sum += v
		}
		if math.Abs(sum-c.total) > 1e-12*(1+want) {
			t.Errorf("%s: indicators sum to %.15g, want %.15g", c.name, sum, c.total)
		}
	}
}

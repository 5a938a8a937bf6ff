package certify

import (
	"testing"

	"gapcert/interval"
)

// TestPolyhedronStageBWithSmoothPotential: −Δ + e^x on the unit cube
// with Neumann faces separates: λ = a_i + j²π² + l²π² (j, l ≥ 0), a_i the
// eigenvalues of −u″ + e^x u on (0, 1) with Neumann ends, which the 1D
// certifier encloses here (a1 ≈ 1.6946, a2 ≈ 11.649): λ1 = a1 and λ2 =
// a1 + π² (twice; a1 + π² ≈ 11.564 < a2). The first recipe (P_3 on 96
// tetrahedra, RT_3 fluxes, stage A on 768) must give stage-B bounds with
// its own shift γ_B, and the enclosures contain the sums narrowly. With
// γ_B from the polygons' rule (V + γ_B ≥ 2 osc V, γ_B = 2.44 here) the
// Taylor models of the weight 1/(V + γ_B) over the tetrahedra diverge
// (remainder width 4.5 against a range of width 0.075 at order 12) and
// stage B gives no bound.
func TestPolyhedronStageBWithSmoothPotential(t *testing.T) {
	a := certify1D(t, `{"domain": {"interval": ["0", "1"]}, "boundary": "neumann", "potential": "exp(x)", "eigenvalues": 2}`)
	p := parseProblem(t, cubePolyhedron("neumann", "exp(x)"))
	r := firstRecipe(t, p)
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	if out.lg == nil {
		t.Fatalf("stage B gave no bound (γ = %v, γ_B = %v): %q", r.gamma, r.fluxGamma, out.notes)
	}
	want := []interval.I{a[0], a[0].Add(pi2(1, 1))}
	var got []interval.I
	for k := range want {
		got = append(got, interval.I{Lo: interval.SubDown(max(out.lg[k], out.stageA[k]), r.gamma), Hi: interval.SubUp(out.ritz[k], r.gamma)})
	}
	wantEnclosures(t, "V = exp(x)", got, want, []float64{1e-3, 2e-3}, 3.29)
}

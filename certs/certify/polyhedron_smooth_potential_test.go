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

// TestPolyhedronStageBWithSeparablePotential: −Δ + e^x + y² + z² on the
// Neumann unit cube has λ = a_i + b_j + b_l, a as in
// TestPolyhedronStageBWithSmoothPotential and b the eigenvalues of
// −u″ + x²u on (0, 1) with Neumann ends (b1 ≈ 0.32494, b2 ≈ 10.26007),
// both enclosed by the 1D certifier: λ1 = a1 + 2b1 ≈ 2.3445 and λ2 = λ3
// = a1 + b1 + b2 ≈ 12.2797, with λ4 = a2 + 2b1 ≈ 12.2987 within 0.2%.
// The first recipe encloses λ1 and λ2 narrowly (measured relative widths
// 4.3e-6 and 1.3e-3; with γ_B from the polygons' rule, 2.1e-2 and 7.1e-2).
func TestPolyhedronStageBWithSeparablePotential(t *testing.T) {
	a := certify1D(t, `{"domain": {"interval": ["0", "1"]}, "boundary": "neumann", "potential": "exp(x)", "eigenvalues": 2}`)
	b := certify1D(t, `{"domain": {"interval": ["0", "1"]}, "boundary": "neumann", "potential": "x^2", "eigenvalues": 2}`)
	p := parseProblem(t, cubePolyhedron("neumann", "exp(x) + y^2 + z^2"))
	r := firstRecipe(t, p)
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	if out.lg == nil {
		t.Fatalf("stage B gave no bound (γ = %v, γ_B = %v): %q", r.gamma, r.fluxGamma, out.notes)
	}
	want := []interval.I{a[0].Add(b[0].MulF(2)), a[0].Add(b[0]).Add(b[1])}
	var got []interval.I
	for k := range want {
		got = append(got, interval.I{Lo: interval.SubDown(max(out.lg[k], out.stageA[k]), r.gamma), Hi: interval.SubUp(out.ritz[k], r.gamma)})
	}
	if !(a[0].Add(b[0]).Add(b[1]).Hi < a[1].Add(b[0].MulF(2)).Lo) {
		t.Fatalf("a1 + b1 + b2 is not below a2 + 2b1: a ∈ %v, %v, b ∈ %v, %v", a[0], a[1], b[0], b[1])
	}
	wantEnclosures(t, "V = exp(x) + y² + z²", got, want, []float64{1e-4, 3e-3}, 3.29)
}

package certify

import (
	"math/big"
	"testing"

	"gapcert/certs/certify/proof"
	"gapcert/interval"
)

// lehmannGoerischWithKnownRho runs the Ritz step and stage B of the
// polyhedron discretisation at degree p = k on the first mesh of src (one
// uniform level of the cone tetrahedra), with ρ̂ = rhoLambda.Lo + γ taken
// from a closed form: rhoLambda encloses λ_(n+1), so ρ̂ ≤ Λ_(n+1), the
// hypothesis of Lehmann–Goerisch that certify meets with stage A. It
// returns enclosures of λ_1..λ_n: the Lehmann–Goerisch lower and the Ritz
// upper bounds, shifted back by γ with outward rounding. This exercises
// the trial space, the Raviart–Thomas fluxes and the theorem on a
// polyhedron whose stage A would need levels beyond a default test.
func lehmannGoerischWithKnownRho(t *testing.T, src string, degree, n int, rhoLambda interval.I) []interval.I {
	t.Helper()
	p := parseProblem(t, src)
	d := discretisationOf(p)
	r := firstRecipe(t, p)
	r.degree, r.fluxDegree = degree, degree
	out := &outcome{}
	trial, err := d.trial(r, out)
	if err != nil {
		t.Fatal(err)
	}
	vecs, err := trial.ApproxEigenvectors(n, r.gamma)
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := trial.RitzMatrices(vecs, interval.Point(r.gamma))
	if err != nil {
		t.Fatal(err)
	}
	ritz, err := proof.RitzUpper(a0, a1)
	if err != nil {
		t.Fatal(err)
	}
	shift := d.stageBShift(r)
	rhoB := shift.Rho(interval.AddDown(rhoLambda.Lo, r.gamma))
	b0, b1 := a0, a1
	if shift.GammaB != r.gamma {
		if b0, b1, err = trial.RitzMatrices(vecs, interval.Point(shift.GammaB)); err != nil {
			t.Fatal(err)
		}
	}
	flux, err := d.flux(r, trial, interval.Point(shift.GammaB))
	if err != nil {
		t.Fatal(err)
	}
	fluxes, err := flux.Choose(vecs)
	if err != nil {
		t.Fatal(err)
	}
	lg, err := stageB(shift, flux, b0, b1, vecs, fluxes, rhoB)
	if err != nil {
		t.Fatal(err)
	}
	got := make([]interval.I, n)
	for k := range got {
		got[k] = interval.I{Lo: interval.SubDown(lg[k], r.gamma), Hi: interval.SubUp(ritz[k], r.gamma)}
	}
	t.Logf("%d tetrahedra, %d trial and %d flux unknowns", out.polyhedron.tetrahedra, trial.N(), flux.N())
	return got
}

// TestPolyhedronDirichletOrthoschemeLehmannGoerisch: the orthoscheme
// 0 ≤ x ≤ y ≤ z ≤ 1 with Dirichlet faces has λ = π²(a² + b² + c²) over
// 1 ≤ a < b < c (derivation by odd reflection in the comment of
// TestPolyhedronDirichletOrthoscheme): λ1 = 14π², λ2 = 21π², λ3 = 26π².
// Its stage A separates λ2 from λ3 only past 32,256 stage-A unknowns
// (measured: four levels, 150 s, still not), so here ρ̂ is λ3 itself.
// The first mesh is the orthoscheme refined once (8 tetrahedra: a
// tetrahedron is meshed as itself). P_6 and RT_6 enclose λ1 and λ2
// (measured relative widths 2.6e-4 and 1.9e-2, 2 s; P_5 gives 6.2e-3 and
// 3.8e-2, P_7 6.7e-5 and 6.4e-4 in 5 s).
func TestPolyhedronDirichletOrthoschemeLehmannGoerisch(t *testing.T) {
	src := `{"domain": {"polyhedron": {"vertices": [["0","0","0"],["0","0","1"],["0","1","1"],["1","1","1"]], "faces": [[0,1,2],[0,1,3],[0,2,3],[1,2,3]]}}, "boundary": "dirichlet", "eigenvalues": 2}`
	got := lehmannGoerischWithKnownRho(t, src, 6, 2, pi2(26, 1))
	wantEnclosures(t, "Dirichlet orthoscheme", got, []interval.I{pi2(14, 1), pi2(21, 1)}, []float64{1e-3, 4e-2}, 3.29)
}

// TestPolyhedronEquilateralPrismLehmannGoerisch: the prism over the
// equilateral triangle of unit side times (0, 1), Dirichlet, has λ =
// 16π²(m² + mn + n²)/9 + l²π² (m, n, l ≥ 1; Lamé's formulas for the
// triangle, rederived in B. J. McCartin, SIAM Rev. 45 (2003) 267–287):
// λ1 = 19π²/3, λ2 = 28π²/3, λ3 = λ4 = 121π²/9. With ρ̂ = λ3, P_5 and RT_5
// on 64 tetrahedra enclose λ1 and λ2 (certify needs four stage-A levels
// to separate them, TestPolyhedronEquilateralPrism).
func TestPolyhedronEquilateralPrismLehmannGoerisch(t *testing.T) {
	src := `{"domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1/2","sqrt(3)/2","0"],["0","0","1"],["1","0","1"],["1/2","sqrt(3)/2","1"]], "faces": [[0,2,1],[3,4,5],[0,1,4,3],[1,2,5,4],[2,0,3,5]]}}, "boundary": "dirichlet", "eigenvalues": 2}`
	got := lehmannGoerischWithKnownRho(t, src, 5, 2, pi2(121, 9))
	wantEnclosures(t, "equilateral prism", got, []interval.I{pi2(19, 3), pi2(28, 3)}, []float64{1e-3, 1e-2}, 4.9)
}

// TestPolyhedronDirichletCubeLehmannGoerischTriple: the Dirichlet unit
// cube with N = 4 and ρ̂ = λ5 = 9π² (common practice): P_4 and RT_4
// enclose λ1 = 3π² and the triple λ2 = λ3 = λ4 = 6π², each narrowly
// (measured relative widths 1.4e-4 and 1.7e-3 to 2e-3; P_5, twice the CPU
// time, gives 1.3e-6 and 2e-4).
func TestPolyhedronDirichletCubeLehmannGoerischTriple(t *testing.T) {
	got := lehmannGoerischWithKnownRho(t, cubePolyhedron("dirichlet", "0"), 4, 4, pi2(9, 1))
	six := pi2(6, 1)
	wantEnclosures(t, "Dirichlet cube", got, []interval.I{pi2(3, 1), six, six, six}, []float64{2e-4, 3e-3, 3e-3, 3e-3}, 3.29)
}

// TestPolyhedronRobinFacesLehmannGoerisch: the unit cube with Robin faces
// x = 0, x = 1 (α = 1), Dirichlet faces y = 0, y = 1 and Neumann faces
// z = 0, z = 1 has λ = μ_i + j²π² + l²π² (j ≥ 1, l ≥ 0), μ_i the
// eigenvalues of −u″ on (0, 1) with u′(0) = u(0), u′(1) = −u(1), enclosed
// by the 1D certifier (μ1 ≈ 1.7071, μ2 ≈ 13.492): λ1 = μ1 + π², λ2 =
// μ1 + 2π², λ3 = μ2 + π² (below μ1 + 4π²). With ρ̂ the lower end of μ2 +
// π², P_4 and RT_4 (free on the Robin faces, entering A2 with the weight
// 1/α) enclose λ1 and λ2.
func TestPolyhedronRobinFacesLehmannGoerisch(t *testing.T) {
	mu := certify1D(t, `{"domain": {"interval": ["0", "1"]}, "boundary": [{"robin": "1"}, {"robin": "1"}], "eigenvalues": 2}`)
	lambda3 := mu[1].Add(pi2(1, 1))
	if !(lambda3.Hi < mu[0].Add(pi2(4, 1)).Lo) {
		t.Fatalf("μ2 + π² is not below μ1 + 4π²: μ ∈ %v, %v", mu[0], mu[1])
	}
	one := big.NewRat(1, 1)
	src := boxPolyhedron(one, one, one, identity, origin, `["neumann","neumann","dirichlet","dirichlet",{"robin": "1"},{"robin": "1"}]`, "0", 2)
	got := lehmannGoerischWithKnownRho(t, src, 4, 2, lambda3)
	wantEnclosures(t, "Robin faces", got, []interval.I{mu[0].Add(pi2(1, 1)), mu[0].Add(pi2(2, 1))}, []float64{1e-4, 1e-3}, 3.29)
}

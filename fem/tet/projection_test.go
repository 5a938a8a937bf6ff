package tet

import (
	"math"
	"math/rand/v2"
	"testing"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/interval"
)

// stageALower returns a proven lower bound of Λ_k (k = 1..count) from the
// CR stage-A space of m: a verified count below the located k-th
// eigenvalue of the pencil, then Liu's projection bound with the form
// shift, as certs/certify/proof does it (c + f(σ′ − c), f(x) =
// x/(1 + C_h² x)).
func stageALower(t *testing.T, m *Mesh, expr string, cond boundary.Condition, gamma float64, count int) []float64 {
	t.Helper()
	return stageALowerOf(t, NewCR, m, expr, cond, gamma, count)
}

// stageALowerOf is stageALower with the space made by space (NewCR or
// NewECR).
func stageALowerOf(t *testing.T, space func(*Mesh, []boundary.Condition) *Projection, m *Mesh, expr string, cond boundary.Condition, gamma float64, count int) []float64 {
	t.Helper()
	v, err := NewPotential(m, mustExpr(t, expr), 2)
	if err != nil {
		t.Fatal(err)
	}
	sa, err := NewStageA(space(m, allBC(m.NumSides(), cond)), v, interval.Point(gamma), count)
	if err != nil {
		t.Fatal(err)
	}
	ch, shift, mMin := sa.ProjectionConstant(), sa.FormShift(), sa.MassMin()
	out := make([]float64, count)
	for k := 1; k <= count; k++ {
		approx, err := sa.Locate(k, 0)
		if err != nil {
			t.Fatal(err)
		}
		n, sp, ok := sa.CountBelow(mMin, approx*(1-1e-8))
		if !ok || n > k-1 {
			t.Fatalf("count below the located eigenvalue %d (%v): %d, ok %v", k, approx, n, ok)
		}
		mu := math.Max(interval.SubDown(sp, shift), 0)
		out[k-1] = interval.AddDown(enclose.ProjectionLower(mu, ch), shift)
	}
	return out
}

// Crouzeix–Raviart lower bounds of the unit cube's Dirichlet eigenvalues
// 3π², 6π² (triple) (separation of variables, common practice) on Kuhn
// meshes of 2³, 4³, 8³ subcubes: every bound is below the exact value
// and the error of λ1 falls with h (the test prints them).
func TestStageAUnitCubeDirichletLowerBoundsConverge(t *testing.T) {
	exact := []interval.I{pi2.MulF(3), pi2.MulF(6), pi2.MulF(6), pi2.MulF(6)}
	prev := math.Inf(1)
	for _, n := range []int{2, 4, 8} {
		m := unitCube(t, n)
		lo := stageALower(t, m, "0", dirichlet, 0, 4)
		for k, e := range exact {
			if lo[k] > e.Hi {
				t.Fatalf("n = %d: stage-A lower bound %v of λ_%d above the exact %v", n, lo[k], k+1, e)
			}
		}
		rel := (exact[0].Mid() - lo[0]) / exact[0].Mid()
		t.Logf("n = %d (%d tetrahedra, h = %.4g, C_h = %.4g): λ1 ≥ %.8g (rel. %.3g), λ2..4 ≥ %.8g %.8g %.8g",
			n, m.NumTets(), m.HMax(), NewCR(m, allBC(6, dirichlet)).ProjectionConstant().Hi, lo[0], rel, lo[1], lo[2], lo[3])
		if rel >= prev {
			t.Errorf("n = %d: error %g did not decrease (was %g)", n, rel, prev)
		}
		prev = rel
	}
	if prev > 0.25 {
		t.Errorf("n = 8: λ1 lower bound %.3g below the exact value (relative), want ≤ 0.25", prev)
	}
}

// The Neumann cube: eigenvalues 0, then π² three times (cosines,
// separation of variables, common practice); with the shift γ = 1 the
// shifted values are 1 and 1 + π². The CR lower bounds lie below them and
// the Ritz upper bounds (P_3 on 2³ subcubes) above, within 1e-3.
func TestUnitCubeNeumann(t *testing.T) {
	exact := []interval.I{interval.Point(1), pi2.AddF(1), pi2.AddF(1), pi2.AddF(1)}
	m := unitCube(t, 2)
	v, err := NewPotential(m, mustExpr(t, "0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	mu := ritzBounds(t, NewLagrange(m, 3, allBC(6, neumann)), v, 1, 4)
	lo := stageALower(t, unitCube(t, 4), "0", neumann, 1, 4)
	for k, e := range exact {
		if mu[k].Hi < e.Lo || lo[k] > e.Hi {
			t.Fatalf("Λ_%d = %v outside [%v, %v]", k+1, e, lo[k], mu[k].Hi)
		}
		if relErr(mu[k].Hi, e) > 1e-3 {
			t.Errorf("Ritz bound %v of Λ_%d = %v: relative error above 1e-3", mu[k].Hi, k+1, e)
		}
		t.Logf("Λ_%d = %.10g ∈ [%.8g, %.10g]", k+1, e.Mid(), lo[k], mu[k].Hi)
	}
}

// The orthoscheme 0 ≤ x ≤ y ≤ z ≤ 1 with Dirichlet faces. Its spectrum
// by reflection in the cube: the six orthoschemes x_σ(1) ≤ x_σ(2) ≤
// x_σ(3) (σ a permutation of the axes) tile the cube, and the
// reflections x_i ↔ x_j map them to each other. A Dirichlet eigenfunction
// u of the orthoscheme extends by u(Px) = sign(σ) u(x) (P the permutation
// matrix of σ) to a function on the cube that is antisymmetric under
// every transposition: the extension is continuous across the planes
// x_i = x_j (u vanishes there) and H¹, and it satisfies −Δ = λ across
// them (odd reflection of a function vanishing on the plane), so it is a
// Dirichlet eigenfunction of the cube in the antisymmetric subspace.
// Conversely every antisymmetric Dirichlet eigenfunction of the cube
// vanishes on the planes x_i = x_j and restricts to one of the
// orthoscheme. The cube's eigenspaces are spanned by
// Π_i sin(a_i π x_i); their antisymmetrisations are the determinants
// det[sin(a_i π x_j)], nonzero exactly when a_1, a_2, a_3 are distinct, one
// per set {a_1 < a_2 < a_3}. So the eigenvalues are π²(a_1² + a_2² + a_3²)
// with integers 0 < a_1 < a_2 < a_3, each simple unless two such sums
// agree: λ1 = 14π² (1, 2, 3), λ2 = 21π² (1, 2, 4), λ3 = 26π² (1, 3, 4).
// Ritz upper bounds from P_4 and CR lower bounds must contain them.
func TestOrthoschemeDirichlet(t *testing.T) {
	exact := []interval.I{pi2.MulF(14), pi2.MulF(21), pi2.MulF(26)}
	m := orthoscheme(t, 4)
	v, err := NewPotential(m, mustExpr(t, "0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	s := NewLagrange(m, 4, allBC(4, dirichlet))
	mu := ritzBounds(t, s, v, 0, 3)
	lo := stageALower(t, orthoscheme(t, 8), "0", dirichlet, 0, 3)
	for k, e := range exact {
		if mu[k].Hi < e.Lo || lo[k] > e.Hi {
			t.Fatalf("λ_%d = %v outside [%v, %v]", k+1, e, lo[k], mu[k].Hi)
		}
		t.Logf("λ_%d = %.10g ∈ [%.8g, %.10g] (Ritz rel. error %.3g; N = %d)", k+1, e.Mid(), lo[k], mu[k].Hi, relErr(mu[k].Hi, e), s.N())
	}
	if r := relErr(mu[0].Hi, exact[0]); r > 1e-3 {
		t.Errorf("Ritz bound of λ1 has relative error %g, want ≤ 1e-3", r)
	}
}

// The local ECR basis on random tetrahedra: the face means of Φ_i are
// δ_ij and the element means 0 (Φ_4: zero face means, element mean 1),
// each enclosure narrow (≤ 1e-12); the means are means of the degree-2
// Bernstein coefficients (equal integrals of the basis on a simplex).
func TestECRBasisDuality(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 14))
	ix := multiIndex(4, 2)
	for trial := 0; trial < 30; trial++ {
		var v [4][3]interval.I
		for i := range v {
			for c := range v[i] {
				v[i][c] = interval.Point(rng.Float64())
			}
		}
		phi, ok := ecrBasis(v)
		if !ok {
			t.Fatalf("trial %d: basis not verified", trial)
		}
		for i := 0; i < 5; i++ {
			var mean interval.I
			for a := range ix.alpha {
				mean = mean.Add(phi[i][a])
			}
			mean = mean.DivF(10)
			want := 0.0
			if i == 4 {
				want = 1
			}
			if !mean.Contains(want) || mean.Wid() > 1e-12 {
				t.Fatalf("trial %d: element mean of Φ_%d is %v, want %g", trial, i, mean, want)
			}
			for j := 0; j < 4; j++ {
				var fm interval.I
				for a, al := range ix.alpha {
					if al[j] == 0 {
						fm = fm.Add(phi[i][a])
					}
				}
				fm = fm.DivF(6)
				want := 0.0
				if i == j {
					want = 1
				}
				if !fm.Contains(want) || fm.Wid() > 1e-10 {
					t.Fatalf("trial %d: mean of Φ_%d over face %d is %v, want %g", trial, i, j, fm, want)
				}
			}
		}
	}
}

// ECR lower bounds of the cube's Dirichlet eigenvalues, without and with
// the potential x² + y² + z² (1D sums of the 1D certifier, as in the Ritz
// test; shift γ = 1), lie below the exact values and converge with h (λ1
// with V within a factor 2 on 4³ subcubes).
func TestStageAECRUnitCube(t *testing.T) {
	exact := []interval.I{pi2.MulF(3), pi2.MulF(6)}
	prev := math.Inf(1)
	for _, n := range []int{2, 4, 8} {
		m := unitCube(t, n)
		lo := stageALowerOf(t, NewECR, m, "0", dirichlet, 0, 2)
		for k, e := range exact {
			if lo[k] > e.Hi {
				t.Fatalf("n = %d: ECR lower bound %v of λ_%d above the exact %v", n, lo[k], k+1, e)
			}
		}
		rel := (exact[0].Mid() - lo[0]) / exact[0].Mid()
		t.Logf("n = %d: ECR λ1 ≥ %.8g (rel. %.3g), λ2 ≥ %.8g", n, lo[0], rel, lo[1])
		if rel >= prev {
			t.Errorf("n = %d: error %g did not decrease (was %g)", n, rel, prev)
		}
		prev = rel
	}
}

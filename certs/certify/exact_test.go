package certify

import (
	"math"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/fem/line"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/formula"
	"gapcert/temple"
)

// TestLehmannGoerischExactEigenpairs is the exact-eigenpair check of the
// Lehmann–Goerisch theorem (package temple doc):
// with trial functions that are (up to interpolation at high degree) the
// exact eigenfunctions u_k = sin kx of −u″ = λu on (0, π), Dirichlet, and
// fluxes σ_k = u_k′/Λ_k, the Lehmann–Goerisch bounds return Λ_k = k² + γ to
// near rounding (common practice: λ_k = k²).
func TestLehmannGoerischExactEigenpairs(t *testing.T) {
	const n, gamma = 3, 1.0
	pi := interval.Pi()
	mesh := line.Uniform(interval.Point(0), pi, 8)
	dirichlet := boundary.Condition{Kind: boundary.Dirichlet}
	space := line.NewLagrange(mesh, 12, dirichlet, dirichlet)
	flux := line.NewFlux(mesh, 12, dirichlet, dirichlet)
	v, err := line.FromExpr(mesh, formula.MustParse("0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	w, err := v.InverseShifted(interval.Point(gamma), 4)
	if err != nil {
		t.Fatal(err)
	}
	trial := make([][]float64, n)
	fluxes := make([][]float64, n)
	for k := 1; k <= n; k++ {
		kk, lam := float64(k), float64(k*k)+gamma
		trial[k-1] = space.Interpolate(func(x float64) float64 { return math.Sin(kk * x) }, func(x float64) float64 { return kk * math.Cos(kk*x) })
		fluxes[k-1] = flux.Interpolate(func(x float64) float64 { return kk * math.Cos(kk*x) / lam }, func(x float64) float64 { return -kk * kk * math.Sin(kk*x) / lam })
	}
	a2, err := flux.LGMatrix(space, trial, fluxes, v, w, interval.Point(gamma))
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := space.RitzMatrices(trial, v, interval.Point(gamma))
	if err != nil {
		t.Fatal(err)
	}
	rho := float64((n+1)*(n+1)) + gamma // = Λ_{n+1} exactly
	lower, err := temple.LehmannGoerisch(a0, a1, a2, rho)
	if err != nil {
		t.Fatal(err)
	}
	for k := 1; k <= n; k++ {
		lam := float64(k*k) + gamma
		got := lower[k-1]
		if got > lam {
			t.Errorf("Λ_%d: lower bound %.17g above the true value %v", k, got, lam)
		}
		if lam-got > 1e-11*lam {
			t.Errorf("Λ_%d: lower bound %.17g is %.3g below the true value (want ≤ 1e-11 relative)", k, got, (lam-got)/lam)
		}
	}
}

// TestStageAEveryIndex: the stage-A lower bounds of Λ_k = k²π² + γ on
// (0, 1), Dirichlet (common practice), lie below the truth and within
// 1e-3 of it for every k ≤ 6 — odd and even indices alike (a symmetric
// problem makes the unpivoted LDLᵀ near even-index eigenvalues
// ill-conditioned, which once cost these bounds up to 40%).
func TestStageAEveryIndex(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain":{"interval":["0","1"]},"boundary":"dirichlet","eigenvalues":3}`))
	if err != nil {
		t.Fatal(err)
	}
	r, err := initialRecipe(p)
	if err != nil {
		t.Fatal(err)
	}
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	for k, lower := range out.stageA {
		truth := interval.Pi().MulF(float64(k + 1)).Sqr().AddF(r.gamma)
		if lower > truth.Lo {
			t.Errorf("Λ_%d: stage-A bound %.17g above the truth %v", k+1, lower, truth)
		}
		if d := (truth.Hi - lower) / truth.Hi; d > 1e-3 {
			t.Errorf("Λ_%d: stage-A bound %.17g is %.3g below the truth (want ≤ 1e-3)", k+1, lower, d)
		}
	}
}

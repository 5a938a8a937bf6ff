package tet_test

// This file certifies its reference values with the 1D certifier (package
// certs/certify, which imports this package), so it is an external test.

import (
	"context"
	"testing"

	"gapcert/certs/certify"
	"gapcert/fem/boundary"
	"gapcert/fem/problem"
	"gapcert/fem/tet"
	"gapcert/interval"
)

// certified1D returns the enclosures of the lowest count eigenvalues of a
// problem on (0, 1) certified by the 1D certifier (package certs/certify),
// for potential expr and the same condition at both ends.
func certified1D(t *testing.T, expr, bc string, count int) []interval.I {
	t.Helper()
	src := `{"name": "factor on (0, 1)", "domain": {"interval": ["0", "1"]}, "potential": "` + expr +
		`", "boundary": ` + bc + `, "eigenvalues": ` + string(rune('0'+count)) + `, "target": {"relative_width": "1e-10"}}`
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatal(err)
	}
	c, err := certify.Certify(context.Background(), p, certify.Options{})
	if err != nil {
		t.Fatal(err)
	}
	out := make([]interval.I, count)
	for k := range out {
		out[k], err = c.Results.Eigenvalues[k].Bound().Interval()
		if err != nil {
			t.Fatal(err)
		}
	}
	return out
}

// −Δ + x² + y² + z² on the unit cube separates: its eigenvalues are sums
// μ_a + μ_b + μ_c of the eigenvalues μ of −u″ + x²u on (0, 1) with the
// same condition (certified by the 1D method of this repository), so
// λ1 = 3μ_1 and λ2 = λ3 = λ4 = 2μ_1 + μ_2. Ritz upper bounds of P_4 on
// the Kuhn mesh with 4³ subcubes contain them (Dirichlet and Robin with
// α = 1 on every face) and are within 1e-4 (relative); the CR stage-A
// bounds of λ1, λ2 lie below them and λ1's within a factor 2.
func TestRitzUnitCubeWithPotentialAgainstOneDimensionalSums(t *testing.T) {
	robin := boundary.Condition{Kind: boundary.Robin, Alpha: interval.Point(1)}
	for _, c := range []struct {
		name, bc1D string
		cond       boundary.Condition
	}{{"dirichlet", `"dirichlet"`, boundary.Condition{Kind: boundary.Dirichlet}}, {"robin", `{"robin": "1"}`, robin}} {
		mu := certified1D(t, "x^2", c.bc1D, 2)
		exact := []interval.I{mu[0].MulF(3), mu[0].MulF(2).Add(mu[1])}
		m := tet.UnitCubeForTest(t, 4)
		v, err := tet.NewPotential(m, tet.MustExprForTest(t, "x^2 + y^2 + z^2"), 2)
		if err != nil {
			t.Fatal(err)
		}
		if !v.Exact() {
			t.Fatal("a quadratic potential has a remainder at order 2")
		}
		r := tet.RitzBoundsForTest(t, tet.NewLagrange(m, 4, tet.AllBCForTest(6, c.cond)), v, 0, 4)
		for k, e := range []interval.I{exact[0], exact[1], exact[1], exact[1]} {
			if r[k].Hi < e.Lo {
				t.Fatalf("%s: Ritz bound %v of λ_%d below the 1D sum %v", c.name, r[k], k+1, e)
			}
			if rel := tet.RelErrForTest(r[k].Hi, e); rel > 1e-4 {
				t.Errorf("%s: Ritz bound %v of λ_%d: relative error %g above 1e-4", c.name, r[k].Hi, k+1, rel)
			}
			t.Logf("%s: λ_%d ∈ %v (1D sums), Ritz %.10g", c.name, k+1, e, r[k].Hi)
		}
		// The CR lower bounds with the form shift c = min(V + γ) = 0 here.
		lo := tet.StageALowerForTest(t, tet.UnitCubeForTest(t, 4), "x^2 + y^2 + z^2", c.cond, 0, 2)
		if lo[0] > exact[0].Hi || lo[1] > exact[1].Hi || lo[0] < exact[0].Lo/2 {
			t.Errorf("stage-A bounds %v, exact %v", lo, exact)
		}
	}
}

// The ECR stage-A bounds of Λ_k = λ_k + 1 for −Δ + x² + y² + z² on the
// unit cube (Dirichlet; 4³ subcubes) lie below the sums of 1D certified
// eigenvalues plus the shift, λ1's within a factor 2.
func TestECRUnitCubeWithPotentialAgainstOneDimensionalSums(t *testing.T) {
	mu := certified1D(t, "x^2", `"dirichlet"`, 2)
	withV := []interval.I{mu[0].MulF(3), mu[0].MulF(2).Add(mu[1])}
	lo := tet.StageALowerOfForTest(t, tet.NewECR, tet.UnitCubeForTest(t, 4), "x^2 + y^2 + z^2", boundary.Condition{Kind: boundary.Dirichlet}, 1, 2)
	for k, e := range withV {
		if lo[k] > e.AddF(1).Hi || (k == 0 && lo[k] < e.Lo/2) {
			t.Errorf("with V: ECR bound %v of Λ_%d, exact %v + 1", lo[k], k+1, e)
		}
	}
}

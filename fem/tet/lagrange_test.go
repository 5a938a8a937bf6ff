package tet

import (
	"testing"

	"gapcert/interval"
)

// The Dirichlet eigenvalues of the unit cube are π²(a² + b² + c²) for
// positive integers a, b, c (separation of variables, common practice):
// 3π², then 6π² three times. Ritz values from P_p on the Kuhn mesh with
// 4³ subcubes (384 tetrahedra) are upper bounds for every p and converge
// with p; the test prints the relative errors (reported in the package
// doc).
func TestRitzUnitCubeDirichletConvergesWithDegree(t *testing.T) {
	m := unitCube(t, 4)
	v, err := NewPotential(m, mustExpr(t, "0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	exact := []interval.I{pi2.MulF(3), pi2.MulF(6), pi2.MulF(6), pi2.MulF(6)}
	prev := 1.0
	for p := 1; p <= 4; p++ {
		s := NewLagrange(m, p, allBC(6, dirichlet))
		mu := ritzBounds(t, s, v, 0, 4)
		for k, e := range exact {
			if mu[k].Hi < e.Lo {
				t.Fatalf("p = %d: Ritz bound %v of λ_%d below the exact %v", p, mu[k], k+1, e)
			}
		}
		rel := relErr(mu[0].Hi, exact[0])
		t.Logf("p = %d: N = %d, λ1 ≤ %.10g (rel. error %.3g), λ2..4 ≤ %.8g %.8g %.8g", p, s.N(), mu[0].Hi, rel, mu[1].Hi, mu[2].Hi, mu[3].Hi)
		if rel > prev {
			t.Errorf("p = %d: error %g did not decrease (was %g)", p, rel, prev)
		}
		prev = rel
	}
	if prev > 1e-5 {
		t.Errorf("p = 4: relative error %g, want ≤ 1e-5", prev)
	}
}

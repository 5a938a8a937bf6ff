package tet

import (
	"math"
	"math/rand/v2"
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

// evalLocal returns Σ_α c_α B^p_α(λ) at round-to-nearest (a test helper).
func evalLocal(p int, c []float64, lam [4]float64) float64 {
	ix := multiIndex(4, p)
	s := 0.0
	for a, al := range ix.alpha {
		b := float64(multinom(al).Int64())
		for i := 0; i < 4; i++ {
			for k := 0; k < al[i]; k++ {
				b *= lam[i]
			}
		}
		s += c[a] * b
	}
	return s
}

// Conformity of the global numbering: a random function of P_p (p = 1..5)
// on a Kuhn mesh takes the same value at random points of every interior
// face from both tetrahedra sharing it (up to rounding), and exactly 0 on
// every Dirichlet face.
func TestLagrangeContinuousAcrossFacesAndZeroOnDirichletFaces(t *testing.T) {
	m := unitCube(t, 2)
	rng := rand.New(rand.NewPCG(3, 14))
	// owners of each face: tetrahedron and local face
	owners := map[[3]int][][2]int{}
	for tt := 0; tt < m.NumTets(); tt++ {
		for i := 0; i < 4; i++ {
			k := sort3(faceNodes(m.Tet(tt), i))
			owners[k] = append(owners[k], [2]int{tt, i})
		}
	}
	for p := 1; p <= 5; p++ {
		// Dirichlet on x = 0 and z = 1 only, Neumann elsewhere.
		bc := allBC(6, neumann)
		bc[0], bc[5] = dirichlet, dirichlet
		s := NewLagrange(m, p, bc)
		x := make([]float64, s.N())
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		local := func(tt int) []float64 {
			c := make([]float64, len(s.MultiIndices()))
			s.Local(c, x, tt)
			return c
		}
		// barycentric coordinates of a face point in tetrahedron tt
		bary := func(tt int, nodes [3]int, w [3]float64) [4]float64 {
			var lam [4]float64
			for i, n := range m.Tet(tt) {
				for k := 0; k < 3; k++ {
					if nodes[k] == n {
						lam[i] = w[k]
					}
				}
			}
			return lam
		}
		for key, o := range owners {
			a, b := rng.Float64(), rng.Float64()
			if a+b > 1 {
				a, b = 1-a, 1-b
			}
			w := [3]float64{1 - a - b, a, b}
			if len(o) == 2 {
				u1 := evalLocal(p, local(o[0][0]), bary(o[0][0], key, w))
				u2 := evalLocal(p, local(o[1][0]), bary(o[1][0], key, w))
				if math.Abs(u1-u2) > 1e-12*(1+math.Abs(u1)) {
					t.Fatalf("p = %d: face %v: %g from one side, %g from the other", p, key, u1, u2)
				}
				continue
			}
			side := -1
			for k, bf := range m.Boundary() {
				if sort3(bf.Nodes) == key {
					side = m.Boundary()[k].Side
				}
			}
			if bc[side].Essential() {
				if u := evalLocal(p, local(o[0][0]), bary(o[0][0], key, w)); u != 0 {
					t.Fatalf("p = %d: value %g on a Dirichlet face", p, u)
				}
			}
		}
	}
}

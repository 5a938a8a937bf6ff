package tet

import (
	"math"
	"math/rand/v2"
	"runtime"
	"testing"

	"gapcert/fem/boundary"
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
				u1 := s.EvalLocal(x, o[0][0], bary(o[0][0], key, w))
				u2 := s.EvalLocal(x, o[1][0], bary(o[1][0], key, w))
				if math.Abs(u1-u2) > 1e-12*(1+math.Abs(u1)) {
					t.Fatalf("p = %d: face %v: %g from one side, %g from the other", p, key, u1, u2)
				}
				continue
			}
			side := -1
			for k, bf := range m.Boundary() {
				if sort3([3]int{bf.A, bf.B, bf.C}) == key {
					side = m.Boundary()[k].Face
				}
			}
			if bc[side].Essential() {
				if u := s.EvalLocal(x, o[0][0], bary(o[0][0], key, w)); u != 0 {
					t.Fatalf("p = %d: value %g on a Dirichlet face", p, u)
				}
			}
		}
	}
}

// Interpolate reproduces polynomials of degree ≤ p (Eval at random points
// within 1e-12), a leading block of the Ritz matrices depends only on
// the leading vectors (bit for bit), as discrete.Trial promises, and the
// matrices are the same bits with one goroutine as with several.
func TestInterpolateAndLeadingRitzBlock(t *testing.T) {
	m := unitCube(t, 2)
	s := NewLagrange(m, 3, allBC(6, neumann))
	f := func(x, y, z float64) float64 { return 1 + x*x*y - z*z*z + 2*x*y*z }
	u := s.Interpolate(f)
	rng := rand.New(rand.NewPCG(8, 8))
	for k := 0; k < 50; k++ {
		x, y, z := rng.Float64(), rng.Float64(), rng.Float64()
		if d := math.Abs(s.Eval(u, x, y, z) - f(x, y, z)); d > 1e-12 {
			t.Fatalf("interpolant misses f at (%g, %g, %g) by %g", x, y, z, d)
		}
	}
	sd := NewLagrange(m, 3, allBC(6, dirichlet))
	v, err := NewPotential(m, mustExpr(t, "x*y + z"), 2)
	if err != nil {
		t.Fatal(err)
	}
	var vecs [][]float64
	for a := 1; a <= 3; a++ {
		vecs = append(vecs, sd.Interpolate(func(x, y, z float64) float64 {
			return math.Sin(float64(a)*math.Pi*x) * math.Sin(math.Pi*y) * math.Sin(math.Pi*z)
		}))
	}
	a0, a1, err := sd.RitzMatrices(vecs, v, interval.Point(0.5))
	if err != nil {
		t.Fatal(err)
	}
	b0, b1, err := sd.RitzMatrices(vecs[:2], v, interval.Point(0.5))
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < 2; i++ {
		for j := 0; j <= i; j++ {
			if a0.At(i, j) != b0.At(i, j) || a1.At(i, j) != b1.At(i, j) {
				t.Errorf("entry (%d, %d): leading block (%v, %v), full (%v, %v)", i, j, b0.At(i, j), b1.At(i, j), a0.At(i, j), a1.At(i, j))
			}
		}
	}
	prev := runtime.GOMAXPROCS(1)
	c0, c1, err := sd.RitzMatrices(vecs, v, interval.Point(0.5))
	runtime.GOMAXPROCS(prev)
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < 3; i++ {
		for j := 0; j <= i; j++ {
			if a0.At(i, j) != c0.At(i, j) || a1.At(i, j) != c1.At(i, j) {
				t.Errorf("entry (%d, %d): (%v, %v) with one goroutine, (%v, %v) with %d", i, j, c0.At(i, j), c1.At(i, j), a0.At(i, j), a1.At(i, j), prev)
			}
		}
	}
}

// On the Kuhn mesh of 3³ subcubes (nodes k/3, enclosed by intervals that
// are not points) the constant function 1 (every Bernstein coefficient 1:
// partition of unity) has b(1, 1) = 1, ∫|∇1|² = 0 and, with Robin α = 1/3
// (enclosed) on every face, a(1, 1) = α · 6 = 2 (the cube's surface); the
// Ritz matrices contain these exact values and are narrow (≤ 1e-12).
func TestRitzMatricesOfConstantWithEnclosedNodesAndRobinFaces(t *testing.T) {
	m := unitCube(t, 3)
	third := interval.Point(1).DivF(3)
	robin := boundary.Condition{Kind: boundary.Robin, Alpha: third}
	v, err := NewPotential(m, mustExpr(t, "0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	for p := 1; p <= 3; p++ {
		s := NewLagrange(m, p, allBC(6, robin))
		one := make([]float64, s.N())
		for i := range one {
			one[i] = 1
		}
		a0, a1, err := s.RitzMatrices([][]float64{one}, v, interval.I{})
		if err != nil {
			t.Fatal(err)
		}
		if !a1.At(0, 0).Contains(1) || !a0.At(0, 0).Contains(2) || a1.At(0, 0).Wid() > 1e-12 || a0.At(0, 0).Wid() > 1e-12 {
			t.Errorf("p = %d: b(1, 1) ∈ %v (want 1), a(1, 1) ∈ %v (want 2)", p, a1.At(0, 0), a0.At(0, 0))
		}
	}
}

// A Kuhn mesh of 3³ subcubes whose interior nodes are moved at random (up
// to 0.1/3 per coordinate; boundary nodes stay, so the domain is still the
// unit cube) gives general tetrahedra: the Ritz bounds of P_3 still
// contain 3π² and 6π² (triple) and are within 1e-2.
func TestRitzUnitCubeOnMovedNodes(t *testing.T) {
	const n = 3
	rng := rand.New(rand.NewPCG(9, 3))
	pts, tets := kuhnCells(n, nil)
	m := meshMoved(t, n, pts, tets, 6, cubeSide(n), func(p [3]int) [3]float64 {
		var d [3]float64
		for c := 0; c < 3; c++ {
			if p[0] > 0 && p[0] < n && p[1] > 0 && p[1] < n && p[2] > 0 && p[2] < n {
				d[c] = (rng.Float64()*2 - 1) * 0.1 / n
			}
		}
		return d
	})
	v, err := NewPotential(m, mustExpr(t, "0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	mu := ritzBounds(t, NewLagrange(m, 3, allBC(6, dirichlet)), v, 0, 4)
	for k, e := range []interval.I{pi2.MulF(3), pi2.MulF(6), pi2.MulF(6), pi2.MulF(6)} {
		if mu[k].Hi < e.Lo || relErr(mu[k].Hi, e) > 1e-2 {
			t.Errorf("Ritz bound %v of λ_%d = %v", mu[k], k+1, e)
		}
	}
}

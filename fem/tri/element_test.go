package tri

import (
	"math"
	"math/rand/v2"
	"testing"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

func refTriangle(t testing.TB) *mesh.Mesh {
	t.Helper()
	m, err := mesh.FromPolygon([][2]interval.I{pt(0, 0), pt(1, 0), pt(0, 1)}, [][3]int{{0, 1, 2}})
	if err != nil {
		t.Fatal(err)
	}
	return m
}

func unitVecs(n int) [][]float64 {
	out := make([][]float64, n)
	for i := range out {
		out[i] = make([]float64, n)
		out[i][i] = 1
	}
	return out
}

// P1 on the reference triangle (0,0), (1,0), (0,1), Neumann: stiffness
// ½[2 −1 −1; −1 1 0; −1 0 1] and mass (1 + δ_ij)/24 (textbook P1 element
// matrices, common practice), from both the verified and the float path.
func TestP1ReferenceElement(t *testing.T) {
	m := refTriangle(t)
	s := NewLagrange(m, 1, allBC(3, neumann))
	v := mustPotential(t, m, "0", 1)
	if s.N() != 3 {
		t.Fatalf("N = %d", s.N())
	}
	wantK := [3][3]float64{{1, -0.5, -0.5}, {-0.5, 0.5, 0}, {-0.5, 0, 0.5}}
	a0, a1, err := s.RitzMatrices(unitVecs(3), v, interval.I{})
	if err != nil {
		t.Fatal(err)
	}
	k, mm := s.AssembleApprox(v, 0)
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			wantM := 1.0 / 24
			if i == j {
				wantM = 2.0 / 24
			}
			if g := a0.At(i, j); !g.Contains(wantK[i][j]) || g.Wid() > 1e-15 {
				t.Errorf("stiffness (%d,%d) = %v, want %g", i, j, g, wantK[i][j])
			}
			if g := a1.At(i, j); !g.Contains(wantM) || g.Wid() > 1e-16 {
				t.Errorf("mass (%d,%d) = %v, want %g", i, j, g, wantM)
			}
			if math.Abs(k.At(i, j)-wantK[i][j]) > 1e-15 || math.Abs(mm.At(i, j)-wantM) > 1e-16 {
				t.Errorf("float (%d,%d): %g %g", i, j, k.At(i, j), mm.At(i, j))
			}
		}
	}
}

// Exact integrals of constant functions (u ≡ 1 is in every P_p with
// Neumann/Robin sides: the Bernstein coefficients are all 1):
// a(1,1) = ∫_Ω V + α|∂Ω|, b(1,1) = |Ω|. On the unit square ∫(x² + y²) = 2/3,
// ∫ e^x = e − 1 (calculus, common practice), perimeter 4.
func TestConstantFunctionIntegrals(t *testing.T) {
	// ∫_0^1 e^x dx = e − 1 (calculus); math.E − 1 is within 2 ulps of it.
	e := math.E
	cases := []struct {
		v     string
		alpha interval.I
		order int
		want  float64
		tol   float64
	}{
		{"x^2 + y^2", interval.I{}, 1, 2.0 / 3, 1e-13},
		{"0", interval.Point(1.5), 1, 6, 1e-13},
		{"x^2 + y^2", interval.Point(0.25), 1, 2.0/3 + 1, 1e-13},
		{"exp(x)", interval.I{}, 6, e - 1, 1e-7},
	}
	for _, c := range cases {
		for _, p := range []int{1, 2, 3} {
			m := unitSquare(t, 2)
			s := NewLagrange(m, p, allBC(4, robin(c.alpha)))
			v := mustPotential(t, m, c.v, c.order)
			one := make([]float64, s.N())
			for i := range one {
				one[i] = 1
			}
			a0, a1, err := s.RitzMatrices([][]float64{one}, v, interval.I{})
			if err != nil {
				t.Fatal(err)
			}
			if g := a1.At(0, 0); !g.Contains(1) || g.Wid() > 1e-14 {
				t.Errorf("V=%s p=%d: b(1,1) = %v, want 1", c.v, p, g)
			}
			if g := a0.At(0, 0); !(g.Lo <= c.want+1e-15 && g.Hi >= c.want-1e-15) || g.Wid() > c.tol {
				t.Errorf("V=%s α=%v p=%d: a(1,1) = %v (width %.1e), want %.16g", c.v, c.alpha, p, g, g.Wid(), c.want)
			}
			k, _ := s.AssembleApprox(v, 0)
			kx := make([]float64, s.N())
			k.MulVecTo(kx, one)
			sum := 0.0
			for _, x := range kx {
				sum += x
			}
			if math.Abs(sum-c.want) > c.tol {
				t.Errorf("V=%s p=%d: float a(1,1) = %.16g, want %.16g", c.v, p, sum, c.want)
			}
		}
	}
}

// The verified Ritz matrices of random vectors agree with xᵀKy from the
// float assembly (an independent code path: reference stiffness tables,
// midpoint geometry) to rounding, for mixed boundary conditions and a
// polynomial potential of degree 3; the intervals are narrow.
func TestRitzMatricesMatchFloatAssembly(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	m, err := mesh.FromPolygon([][2]interval.I{pt(0, 0), pt(3, 0), pt(2, 1), pt(1, 1)}, [][3]int{{0, 1, 2}, {0, 2, 3}})
	if err != nil {
		t.Fatal(err)
	}
	m = m.Refine().Refine()
	bc := []boundary.Condition{dirichlet, robin(interval.Point(1.5)), neumann, dirichlet}
	for _, p := range []int{1, 2, 3, 4} {
		s := NewLagrange(m, p, bc)
		v := mustPotential(t, m, "x*y - x^3/4 + 2", 3)
		vecs := make([][]float64, 3)
		for i := range vecs {
			vecs[i] = make([]float64, s.N())
			for j := range vecs[i] {
				vecs[i][j] = rng.NormFloat64()
			}
		}
		gamma := interval.Point(0.5)
		a0, a1, err := s.RitzMatrices(vecs, v, gamma)
		if err != nil {
			t.Fatal(err)
		}
		k, mm := s.AssembleApprox(v, 0.5)
		check := func(name string, a *enclose.Sym, f func(dst, x []float64)) {
			y := make([]float64, s.N())
			for i := range vecs {
				f(y, vecs[i])
				for j := range vecs {
					want := 0.0
					for l := range y {
						want += vecs[j][l] * y[l]
					}
					g := a.At(i, j)
					scale := math.Max(1, math.Abs(want))
					if math.Abs(g.Mid()-want) > 1e-11*scale || g.Wid() > 1e-11*scale {
						t.Errorf("p=%d %s(%d,%d) = %v, float %.16g", p, name, i, j, g, want)
					}
				}
			}
		}
		check("a0", a0, k.MulVecTo)
		check("a1", a1, mm.MulVecTo)
	}
}

// DOF counts: on the unit square refined `lev` times (2·4^lev triangles),
// P_p with Dirichlet sides has (p·2^lev − 1)² DOFs and with Neumann sides
// (p·2^lev + 1)² (the domain points form a uniform grid; common practice).
func TestLagrangeDofCounts(t *testing.T) {
	for _, p := range []int{1, 2, 3, 4} {
		for lev := 0; lev <= 2; lev++ {
			m := unitSquare(t, lev)
			g := p << lev
			if n := NewLagrange(m, p, allBC(4, dirichlet)).N(); n != (g-1)*(g-1) {
				t.Errorf("p=%d lev=%d Dirichlet: N = %d, want %d", p, lev, n, (g-1)*(g-1))
			}
			if n := NewLagrange(m, p, allBC(4, neumann)).N(); n != (g+1)*(g+1) {
				t.Errorf("p=%d lev=%d Neumann: N = %d, want %d", p, lev, n, (g+1)*(g+1))
			}
		}
	}
}

// Interpolation reproduces polynomials of degree ≤ p exactly (up to
// rounding), and Eval returns their values.
func TestInterpolateReproducesPolynomials(t *testing.T) {
	m := unitSquare(t, 1)
	for _, p := range []int{1, 2, 3, 4} {
		s := NewLagrange(m, p, allBC(4, neumann))
		f := func(x, y float64) float64 { return math.Pow(x, float64(p)) - 2*x*math.Pow(y, float64(p-1)) + 0.5 }
		c := s.Interpolate(f)
		for _, q := range [][2]float64{{0.1, 0.2}, {0.7, 0.3}, {0.5, 0.5}, {1, 1}, {0.33, 0.9}} {
			if got, want := s.Eval(c, q[0], q[1]), f(q[0], q[1]); math.Abs(got-want) > 1e-12 {
				t.Errorf("p=%d at %v: %g, want %g", p, q, got, want)
			}
		}
	}
}

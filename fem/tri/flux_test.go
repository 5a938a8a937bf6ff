package tri

import (
	"math"
	"math/rand/v2"
	"testing"

	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/interval"
	"gapcert/temple"
)

// lgLowest runs the Lehmann–Goerisch bound with the first n trial
// functions and the flux space of degree k, shift gamma and rho.
func lgLowest(t *testing.T, s *Lagrange, vecs [][]float64, k int, bc []boundary.Condition, v *Potential, gamma, rho float64) []float64 {
	t.Helper()
	g := interval.Point(gamma)
	w, err := v.InverseShifted(g, 8)
	if err != nil {
		t.Fatal(err)
	}
	f := NewFlux(s.Mesh(), k, bc)
	fluxes, err := f.MinimizeApprox(s, vecs, w)
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := s.RitzMatrices(vecs, v, g)
	if err != nil {
		t.Fatal(err)
	}
	a2, err := f.LGMatrix(s, vecs, fluxes, v, w, g)
	if err != nil {
		t.Fatal(err)
	}
	lower, err := temple.LehmannGoerisch(a0, a1, a2, rho)
	if err != nil {
		t.Fatal(err)
	}
	return lower
}

// Exact-eigenpair sanity check (package doc, Lehmann–Goerisch fluxes): on the
// unit square with
// Dirichlet sides, u = sin πx sin πy is an eigenfunction with
// Λ = 2π² + γ (separation of variables, common practice). Its degree-8
// interpolant with the optimal RT_7 flux and ρ = 5π²·0.999 + γ ≤ Λ_2 must
// give a lower bound below Λ and within 1e-9 of it.
func TestLGExactEigenpairSquare(t *testing.T) {
	m := unitSquare(t, 1)
	bc := allBC(4, dirichlet)
	s := NewLagrange(m, 8, bc)
	u := s.Interpolate(func(x, y float64) float64 { return math.Sin(math.Pi*x) * math.Sin(math.Pi*y) })
	const gamma = 1
	v := mustPotential(t, m, "0", 1)
	rho := 5*math.Pi*math.Pi*0.999 + gamma
	lower := lgLowest(t, s, [][]float64{u}, 7, bc, v, gamma, rho)
	exact := twoPi2.AddF(gamma)
	if !(lower[0] <= exact.Lo) {
		t.Fatalf("lower bound %.17g above Λ_1 = %.17g", lower[0], exact.Lo)
	}
	if rel := (exact.Hi - lower[0]) / exact.Hi; rel > 1e-9 {
		t.Fatalf("lower bound %.17g is %.2g below Λ_1 = %.17g", lower[0], rel, exact.Hi)
	}
	t.Logf("Λ_1 ≥ %.17g, exact %.17g, relative gap %.2g", lower[0], exact.Mid(), (exact.Hi-lower[0])/exact.Hi)
}

// rectangle returns (0, a)×(0, b) split along a diagonal, refined `levels`
// times; sides 0..3 are bottom, right, top, left.
func rectangle(t *testing.T, a, b float64, levels int) *mesh.Mesh {
	t.Helper()
	m, err := mesh.FromPolygon([][2]interval.I{pt(0, 0), pt(a, 0), pt(a, b), pt(0, b)}, [][3]int{{0, 1, 2}, {0, 2, 3}})
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < levels; i++ {
		m = m.Refine()
	}
	return m
}

// robinRoot returns the k-th positive root of tan x = 2αx/(x² − α²), the
// 1D Robin problem −u″ = x²u on (0, 1) with u′ = αu at 0 and −αu at 1
// (separation of variables; common practice), by float bisection on
// (x² − α²) sin x − 2αx cos x between kπ − π and kπ (accurate to a few
// ulps; an oracle, used with a 1e-12 relative slack).
func robinRoot(alpha float64, k int) float64 {
	f := func(x float64) float64 { return (x*x-alpha*alpha)*math.Sin(x) - 2*alpha*x*math.Cos(x) }
	lo, hi := float64(k-1)*math.Pi+1e-12, float64(k)*math.Pi
	for i := 0; i < 200; i++ {
		mid := (lo + hi) / 2
		if (f(lo) < 0) == (f(mid) < 0) {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}

// Mixed and Robin rectangles with the optimal fluxes: the bounds must lie
// below the exact eigenvalues and within 1e-8 of them. Exact values by
// separation of variables (common practice):
//   - (0, 2)×(0, 1), Dirichlet at y = 0, 1 and Neumann at x = 0, 2:
//     λ = π² + m²π²/4, so Λ_1 = π² + γ, Λ_2 = 5π²/4 + γ, Λ_3 = 2π² + γ;
//   - the unit square with Robin α = 1 on every side: λ = x_i² + x_j²
//     with x_k the roots of robinRoot, so Λ_1 = 2x_1² + γ, Λ_2 = Λ_3 = x_1² + x_2² + γ.
func TestLGMixedAndRobinRectangles(t *testing.T) {
	const gamma = 1
	neu := neumann
	rob := robin(interval.Point(1))
	pi2 := math.Pi * math.Pi
	x1, x2 := robinRoot(1, 1), robinRoot(1, 2)
	cases := []struct {
		name  string
		m     *mesh.Mesh
		bc    []boundary.Condition
		exact []float64 // Λ_1..Λ_N
		rho   float64   // ≤ Λ_{N+1}
	}{
		{"mixed", rectangle(t, 2, 1, 2), []boundary.Condition{dirichlet, neu, dirichlet, neu}, []float64{pi2 + gamma, 1.25*pi2 + gamma}, 0.999*2*pi2 + gamma},
		{"robin", rectangle(t, 1, 1, 2), allBC(4, rob), []float64{2*x1*x1 + gamma, x1*x1 + x2*x2 + gamma, x1*x1 + x2*x2 + gamma}, 0.999*2*x2*x2 + gamma},
	}
	for _, c := range cases {
		s := NewLagrange(c.m, 6, c.bc)
		v := mustPotential(t, c.m, "0", 1)
		k, mm := s.AssembleApprox(v, gamma)
		_, vecs, err := sparse.LowestEigs(k, mm, len(c.exact))
		if err != nil {
			t.Fatal(err)
		}
		lower := lgLowest(t, s, vecs, 5, c.bc, v, gamma, c.rho)
		for i, e := range c.exact {
			if lower[i] > e*(1+1e-12) {
				t.Errorf("%s: Λ_%d ≥ %.17g claimed, exact %.17g", c.name, i+1, lower[i], e)
			}
			if rel := (e - lower[i]) / e; rel > 1e-8 {
				t.Errorf("%s: Λ_%d ≥ %.17g is %.2g below the exact %.17g", c.name, i+1, lower[i], rel, e)
			}
		}
	}
}

// Any flux is admissible (package doc, Lehmann–Goerisch fluxes): perturbing
// the optimal fluxes by
// large random amounts must keep every bound below the exact value (or
// make the Lehmann matrix fail its positivity test), on the mixed
// rectangle above.
func TestLGPerturbedFluxesStaySound(t *testing.T) {
	const gamma = 1
	pi2 := math.Pi * math.Pi
	bc := []boundary.Condition{dirichlet, neumann, dirichlet, neumann}
	m := rectangle(t, 2, 1, 1)
	s := NewLagrange(m, 5, bc)
	v := mustPotential(t, m, "0", 1)
	k, mm := s.AssembleApprox(v, gamma)
	_, vecs, err := sparse.LowestEigs(k, mm, 2)
	if err != nil {
		t.Fatal(err)
	}
	g := interval.Point(gamma)
	w, err := v.InverseShifted(g, 4)
	if err != nil {
		t.Fatal(err)
	}
	f := NewFlux(m, 4, bc)
	best, err := f.MinimizeApprox(s, vecs, w)
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := s.RitzMatrices(vecs, v, g)
	if err != nil {
		t.Fatal(err)
	}
	exact := []float64{pi2 + gamma, 1.25*pi2 + gamma}
	rng := rand.New(rand.NewPCG(5, 7))
	bounded := 0
	for trial := 0; trial < 40; trial++ {
		scale := math.Pow(10, -6+float64(trial%7))
		fl := make([][]float64, len(best))
		for i := range best {
			fl[i] = append([]float64(nil), best[i]...)
			for j := range fl[i] {
				fl[i][j] += scale * rng.NormFloat64()
			}
		}
		a2, err := f.LGMatrix(s, vecs, fl, v, w, g)
		if err != nil {
			t.Fatal(err)
		}
		lower, err := temple.LehmannGoerisch(a0, a1, a2, 0.999*2*pi2+gamma)
		if err != nil {
			continue
		}
		for i, e := range exact {
			if lower[i] > e {
				t.Fatalf("perturbation %g: Λ_%d ≥ %.17g claimed, exact %.17g", scale, i+1, lower[i], e)
			}
			if !math.IsInf(lower[i], -1) {
				bounded++
			}
		}
	}
	if bounded < 20 {
		t.Fatalf("only %d bounds from 40 perturbed flux sets: the test exercises too little", bounded)
	}
}

// Indicators: with σ = 0 the indicators sum to ‖∇ũ‖²/Λ², which for
// ũ ≈ sin πx sin πy on the unit square is (π²/2)/Λ² (∫|∇u|² = π²/2,
// common practice); with the optimal flux they are far smaller.
func TestIndicators(t *testing.T) {
	m := unitSquare(t, 2)
	bc := allBC(4, dirichlet)
	s := NewLagrange(m, 6, bc)
	u := s.Interpolate(func(x, y float64) float64 { return math.Sin(math.Pi*x) * math.Sin(math.Pi*y) })
	const gamma = 1
	lambda := 2*math.Pi*math.Pi + gamma
	f := NewFlux(m, 5, bc)
	sum := func(eta []float64) float64 {
		acc := 0.0
		for _, e := range eta {
			acc += e
		}
		return acc
	}
	zero := sum(f.Indicators(s, [][]float64{u}, [][]float64{make([]float64, f.N())}, []float64{lambda}))
	want := math.Pi * math.Pi / 2 / (lambda * lambda)
	if math.Abs(zero-want) > 1e-6*want {
		t.Errorf("zero flux: Σ η² = %.12g, want ‖∇u‖²/Λ² = %.12g", zero, want)
	}
	v := mustPotential(t, m, "0", 1)
	w, err := v.InverseShifted(interval.Point(gamma), 1)
	if err != nil {
		t.Fatal(err)
	}
	best, err := f.MinimizeApprox(s, [][]float64{u}, w)
	if err != nil {
		t.Fatal(err)
	}
	if opt := sum(f.Indicators(s, [][]float64{u}, best, []float64{lambda})); !(opt < 1e-8*zero) {
		t.Errorf("optimal flux: Σ η² = %.3g, not small against %.3g", opt, zero)
	}
}

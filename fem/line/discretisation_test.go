package line_test

import (
	"math"
	"testing"

	"gapcert/enclose/band"
	"gapcert/fem/boundary"
	"gapcert/fem/discrete"
	"gapcert/fem/discrete/discretetest"
	"gapcert/fem/line"
	"gapcert/interval"
)

// TestDiscretisationConformance runs the conformance suite of package
// fem/discrete on −u″ = λu on (0, π) with Dirichlet ends, whose
// eigenvalues are k² (closed form), shifted by γ = 1.
func TestDiscretisationConformance(t *testing.T) {
	a, b := interval.Point(0), interval.Pi()
	dirichlet := boundary.Condition{Kind: boundary.Dirichlet}
	zero := []interval.I{interval.Point(0)}
	mesh := line.Uniform(a, b, 8)
	trial := line.NewTrial(line.NewLagrange(mesh, 6, dirichlet, dirichlet), line.PolynomialPotential(mesh, zero))
	gamma := interval.Point(1)
	discretetest.Run(t, discretetest.Case{
		Name:  "interval (0, pi), Dirichlet",
		Exact: []interval.I{interval.Point(2), interval.Point(5), interval.Point(10)},
		Gamma: 1,
		Trial: trial,
		StageA: func(ritz []float64) (discrete.StageA, error) {
			ma := line.Uniform(a, b, 64)
			return line.NewStageA(line.NewMeanP2(ma, dirichlet, dirichlet), line.PolynomialPotential(ma, zero), gamma, ritz)
		},
		Flux: func() (discrete.Flux, error) {
			return line.NewFluxSpace(trial, 7, dirichlet, dirichlet, gamma, 4)
		},
		RitzTol: 1e-10, StageATol: 1e-3, TempleTol: 1e-12,
	})
}

// TestStageABisect checks the float bisection of the stage-A space on
// the P1 pencil of −u″ on (0, 1) with Dirichlet ends, n interior nodes,
// whose eigenvalues are (6/h²)(1 − cos kπh)/(2 + cos kπh) (closed form of
// the tridiagonal pencil, common practice): the bisection lands within
// 1e-12 (relative) of each (the closed form is evaluated in float64).
func TestStageABisect(t *testing.T) {
	const n = 31
	h := 1.0 / (n + 1) // exact: n + 1 = 32
	k, m := bandP1(n, h)
	s := line.NewStageAPencil(k, m, h/4, interval.I{}, []float64{1})
	for _, j := range []int{1, 2, 5} {
		c := math.Cos(math.Pi * float64(j) * h)
		want := 6 / (h * h) * (1 - c) / (2 + c)
		got := s.Bisect(j, 0, 2*want)
		if rel := (got - want) / want; rel > 1e-12 || rel < -1e-12 {
			t.Errorf("eigenvalue %d: bisection gives %v, want %v", j, got, want)
		}
	}
}

// bandP1 returns the P1 stiffness and mass matrices of (0, 1) with n
// interior nodes and cell length h: K = tridiag(−1, 2, −1)/h,
// M = h·tridiag(1, 4, 1)/6.
func bandP1(n int, h float64) (k, m *band.ISym) {
	k, m = band.NewISym(n, 1), band.NewISym(n, 1)
	hi := interval.Point(h)
	for i := 0; i < n; i++ {
		k.Add(i, i, interval.Point(2).Div(hi))
		m.Add(i, i, hi.MulF(4).DivF(6))
		if i > 0 {
			k.Add(i, i-1, interval.Point(-1).Div(hi))
			m.Add(i, i-1, hi.DivF(6))
		}
	}
	return k, m
}

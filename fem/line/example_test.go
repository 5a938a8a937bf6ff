package line_test

import (
	"fmt"
	"math"

	"gapcert/fem/boundary"
	"gapcert/fem/line"
	"gapcert/interval"
)

// A Rayleigh–Ritz upper bound for the lowest Dirichlet eigenvalue of −u″ on
// (0, π) (exactly 1): the enclosed Rayleigh quotient of the interpolant of
// sin x in P4 on 8 cells.
func ExampleLagrange_RitzMatrices() {
	m := line.Uniform(interval.Point(0), interval.Point(math.Pi), 8)
	dir := boundary.Condition{Kind: boundary.Dirichlet}
	s := line.NewLagrange(m, 4, dir, dir)
	u := s.Interpolate(math.Sin, math.Cos)
	a0, a1, err := s.RitzMatrices([][]float64{u}, line.PolynomialPotential(m, nil), interval.I{})
	if err != nil {
		panic(err)
	}
	rq := a0.At(0, 0).Div(a1.At(0, 0))
	fmt.Printf("λ1 ≤ %.9f\n", rq.Hi)
	// Output:
	// λ1 ≤ 1.000000000
}

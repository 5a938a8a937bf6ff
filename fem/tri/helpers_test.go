package tri

import (
	"math"
	"testing"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/interval"
	"gapcert/interval/formula"
)

func pt(x, y float64) [2]interval.I { return [2]interval.I{interval.Point(x), interval.Point(y)} }

// unitSquare returns the unit square split along its diagonal, refined
// `levels` times (red refinement).
func unitSquare(t testing.TB, levels int) *mesh.Mesh {
	t.Helper()
	m, err := mesh.FromPolygon([][2]interval.I{pt(0, 0), pt(1, 0), pt(1, 1), pt(0, 1)}, [][3]int{{0, 1, 2}, {0, 2, 3}})
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < levels; i++ {
		m = m.Refine()
	}
	return m
}

func allBC(n int, c boundary.Condition) []boundary.Condition {
	out := make([]boundary.Condition, n)
	for i := range out {
		out[i] = c
	}
	return out
}

// Conditions of the tests (package fem/boundary).
var (
	dirichlet = boundary.Condition{Kind: boundary.Dirichlet}
	neumann   = boundary.Condition{Kind: boundary.Neumann}
)

// robin returns the Robin condition with the coefficient enclosure a.
func robin(a interval.I) boundary.Condition {
	return boundary.Condition{Kind: boundary.Robin, Alpha: a}
}

func mustExpr(t testing.TB, src string) *formula.Expr {
	t.Helper()
	e, err := formula.Parse(src)
	if err != nil {
		t.Fatal(err)
	}
	return e
}

func mustPotential(t testing.TB, m *mesh.Mesh, src string, order int) *Potential {
	t.Helper()
	v, err := NewPotential(m, mustExpr(t, src), order)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// quotient returns an enclosure of a0/a1 for 1×1 Ritz matrices.
func quotient(a0, a1 *enclose.Sym) interval.I { return a0.At(0, 0).Div(a1.At(0, 0)) }

// twoPi2 encloses 2π² (math.Pi is below π; its successor above).
var twoPi2 = interval.I{Lo: math.Pi, Hi: math.Nextafter(math.Pi, 4)}.Sqr().MulF(2)

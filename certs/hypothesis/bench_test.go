package hypothesis

import (
	"testing"

	"gapcert/certs"
)

// BenchmarkConvexPotentialBudget measures the slowest decision: exp(x + y)
// has a singular Hessian, so no triangle is decided and the subdivision
// runs until its budget (maxSimplices) is spent.
func BenchmarkConvexPotentialBudget(b *testing.B) {
	p, err := parseProblem(problemText(lshape, "exp(x + y)", `"dirichlet"`))
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if h := ConvexPotential(p); h.Verdict == certs.Disproven {
			b.Fatal("disproven")
		}
	}
}

// BenchmarkConvexPotentialInterval measures an interval decision that
// bisects toward a kink (−|x| is undecided at 0).
func BenchmarkConvexPotentialInterval(b *testing.B) {
	p, err := parseProblem(problemText(`{"interval":["-1","1"]}`, "-abs(x)", `"dirichlet"`))
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		ConvexPotential(p)
	}
}

// BenchmarkConvexPotentialPolyhedronBudget measures the slowest decision
// on a polyhedron: exp(x + y + z) on the unit cube has a singular Hessian,
// so no tetrahedron is decided and the subdivision runs until its budget
// (maxSimplices) is spent.
func BenchmarkConvexPotentialPolyhedronBudget(b *testing.B) {
	p, err := parseProblem(problemText(unitCube, "exp(x + y + z)", `"dirichlet"`))
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if h := ConvexPotential(p); h.Verdict != certs.Undecided {
			b.Fatal(h.Verdict)
		}
	}
}

// BenchmarkCircumsolidFrustum measures the exact decision of the
// truncated pyramid of height 2 (a circumsolid, rational coordinates, 6
// faces) and of its product structure.
func BenchmarkCircumsolidFrustum(b *testing.B) {
	p, err := parseProblem(problemText(frustumFile("2", false), "0", `"dirichlet"`))
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if h := ProductOfCircumsolids(p); h.Verdict != certs.Proven {
			b.Fatal(h.Verdict)
		}
	}
}

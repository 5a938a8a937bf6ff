package certify

import (
	"errors"
	"runtime"
	"testing"
	"time"

	"gapcert/fem/problem"
)

// TestPolyhedronGradedCountBeforeBuilding checks that the tetrahedra of a
// graded trial mesh are counted without building a mesh far beyond
// maxCountedTetrahedra: with graded_levels at its cap (16 rounds toward
// the re-entrant edge of the L-shaped prism, about 4·10⁷ tetrahedra if
// built) the memory estimate exceeds the default budget and is found with
// less than 1 GiB allocated (the fully built mesh allocates about 20 GiB
// over a quarter of an hour), and Check refuses a certificate recording
// it by a budget error before recomputing. Below the cap the count is
// the built mesh's.
func TestPolyhedronGradedCountBeforeBuilding(t *testing.T) {
	p, err := problem.Parse([]byte(lPrismPolyhedron(`"dirichlet"`)))
	if err != nil {
		t.Fatal(err)
	}
	r := recipe{degree: 3, fluxDegree: 3, refine: 1, stageARefine: 1}
	for _, graded := range []int{1, 5} {
		r.graded = graded
		m, err := polyhedronTrialMesh(p, r)
		if err != nil {
			t.Fatal(err)
		}
		if got := polyhedronTrialTetrahedra(p, r); got != int64(m.NumTets()) {
			t.Errorf("graded %d: counted %d tetrahedra, built %d", graded, got, m.NumTets())
		}
	}
	r.graded = maxPolyhedronGraded
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	start := time.Now()
	est := memoryEstimate(p, r)
	runtime.ReadMemStats(&after)
	alloc := after.TotalAlloc - before.TotalAlloc
	t.Logf("graded %d: memory estimate %.3g GiB, found in %v with %d MiB allocated", r.graded, float64(est)/(1<<30), time.Since(start), alloc>>20)
	if est <= DefaultMemory {
		t.Errorf("graded %d: memory estimate %d within the default budget %d", r.graded, est, DefaultMemory)
	}
	if alloc > 1<<30 {
		t.Errorf("graded %d: the memory estimate allocated %d MiB", r.graded, alloc>>20)
	}
	if n := polyhedronTrialTetrahedra(p, r); n < 1<<24 {
		t.Errorf("graded %d: %d tetrahedra estimated, want at least 2^24 (each round at least doubles them)", r.graded, n)
	}
}

// TestPolyhedronCheckRefusesGradedBeyondBudget: a certificate whose
// recorded graded_levels is within range but whose graded mesh would
// exceed the memory budget is refused by a budget error before anything
// is recomputed.
func TestPolyhedronCheckRefusesGradedBeyondBudget(t *testing.T) {
	p := parseProblem(t, lPrismPolyhedron(`"dirichlet"`))
	r := firstRecipe(t, p)
	r.degree, r.fluxDegree, r.refine, r.stageARefine, r.graded = 2, 2, 0, 1, 1
	if err := r.validate(p); err != nil {
		t.Fatal(err)
	}
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	res, err := assemble(p, r, out)
	if err != nil {
		t.Fatal(err)
	}
	c, err := res.certificate(p, Options{})
	if err != nil {
		t.Fatal(err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	var be *BudgetError
	err = Check(editMethod(t, data, func(m *Method) { m.GradedLevels = maxPolyhedronGraded }))
	if !errors.As(err, &be) {
		t.Fatalf("graded_levels %d: error %v, want a budget error", maxPolyhedronGraded, err)
	}
}

package certify

import (
	"errors"
	"fmt"
	"runtime"
	"strings"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/fem/problem"
)

// TestPolyhedronGradedCountBeforeBuilding checks that the tetrahedra of a
// graded trial mesh are counted without building a mesh far beyond
// maxCountedTetrahedra: with graded_levels at its cap (16 rounds toward
// the re-entrant edge of the L-shaped prism, about 4·10⁷ tetrahedra if
// built) the memory estimate exceeds the default budget and is found with
// less than 1 GiB allocated (the fully built mesh allocates about 20 GiB
// over a quarter of an hour), and Check refuses a certificate recording
// it by a budget error before recomputing (TestPolyhedronCheckGradedEdits).
// Below the cap the count is the built mesh's.
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

// lPrismGradedCertificate certifies the Dirichlet L-shaped prism on a
// cheap graded recipe (P_2 on the cone mesh graded once toward the
// re-entrant edge, stage A on one level; no stage-B bound needed) and
// returns the certificate's bytes.
func lPrismGradedCertificate(t *testing.T) []byte {
	t.Helper()
	p := parseProblem(t, lPrismPolyhedron(`"dirichlet"`))
	r := firstRecipe(t, p)
	r.degree, r.fluxDegree, r.refine, r.stageARefine, r.graded = 2, 2, 0, 1, 1
	_, res := assembleRecipe(t, p, r, false)
	return recipeCertificate(t, p, res, "1e-3")
}

// TestPolyhedronCheckGradedEdits checks Check on a graded polyhedron
// certificate: it replays the graded mesh and accepts it; graded_levels
// edited to 0 or 2 (other meshes, other bounds) is reported as a
// mismatch; 16, within range but beyond the memory budget, is refused by
// a budget error before anything is recomputed; 17 is a format error
// naming the field.
func TestPolyhedronCheckGradedEdits(t *testing.T) {
	data := lPrismGradedCertificate(t)
	if err := Check(data); err != nil {
		t.Fatalf("the graded certificate does not verify: %v", err)
	}
	for _, graded := range []int{0, 2} {
		var me *MismatchError
		if err := Check(editMethod(t, data, func(m *Method) { m.GradedLevels = graded })); !errors.As(err, &me) {
			t.Errorf("graded_levels 1 edited to %d: error %v, want a mismatch", graded, err)
		}
	}
	var be *BudgetError
	if err := Check(editMethod(t, data, func(m *Method) { m.GradedLevels = maxPolyhedronGraded })); !errors.As(err, &be) {
		t.Errorf("graded_levels %d: error %v, want a budget error", maxPolyhedronGraded, err)
	}
	var fe *certs.FormatError
	if err := Check(editMethod(t, data, func(m *Method) { m.GradedLevels = maxPolyhedronGraded + 1 })); !errors.As(err, &fe) || !strings.Contains(err.Error(), "method.graded_levels") {
		t.Errorf("graded_levels %d: error %v, want a format error naming the field", maxPolyhedronGraded+1, err)
	}
}

// TestPolyhedronModesGradedRange checks that the approximate modes of a
// polyhedron certificate (pictures) read graded_levels as strictly as
// Check: the recorded value rebuilds the graded trial space, while a
// negative value (which grading would take as a misuse and panic on) or
// one above maxPolyhedronGraded is an error.
func TestPolyhedronModesGradedRange(t *testing.T) {
	data := lPrismGradedCertificate(t)
	p := parseProblem(t, lPrismPolyhedron(`"dirichlet"`))
	for _, c := range []struct {
		graded int
		ok     bool
	}{{1, true}, {-1, false}, {maxPolyhedronGraded + 1, false}} {
		cert, err := certs.Unmarshal(editMethod(t, data, func(m *Method) { m.GradedLevels = c.graded }))
		if err != nil {
			t.Fatal(err)
		}
		var modes *Modes
		func() {
			defer func() {
				if v := recover(); v != nil {
					err = fmt.Errorf("panic: %v", v)
				}
			}()
			modes, err = ApproximateModes(p, cert, 1)
		}()
		if (err == nil) != c.ok {
			t.Errorf("graded_levels %d: error %v, want ok %v", c.graded, err, c.ok)
		}
		if err == nil && modes.Eval3 == nil {
			t.Errorf("graded_levels %d: no modes", c.graded)
		}
	}
}

// TestPolyhedronCheckRefusesGradingWithoutSingularEdges: graded_levels 1
// on the Neumann cube (right-angled edges only: integer exponents, no
// singular edge, so grading would change nothing) is refused by Check as
// a format error naming the field, before anything is recomputed.
func TestPolyhedronCheckRefusesGradingWithoutSingularEdges(t *testing.T) {
	data, _ := neumannCubeCertificate(t)
	var fe *certs.FormatError
	if err := Check(editMethod(t, data, func(m *Method) { m.GradedLevels = 1 })); !errors.As(err, &fe) || !strings.Contains(err.Error(), "method.graded_levels") {
		t.Errorf("graded_levels 1 on the cube: error %v, want a format error naming the field", err)
	}
}

package certify

import (
	"context"
	"errors"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/interval"
)

// TestPolyhedronMemoryBudgetBeforeFirstStep: a memory budget below the
// estimate of the first recipe is refused with a *BudgetError before
// anything is computed. The context is cancelled beforehand: a Certify
// that started computing would return the context's error instead.
func TestPolyhedronMemoryBudgetBeforeFirstStep(t *testing.T) {
	p := parseProblem(t, cubePolyhedron("dirichlet", "0"))
	first := memoryEstimate(p, firstRecipe(t, p))
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err := Certify(ctx, p, Options{Memory: first - 1})
	var budget *BudgetError
	if !errors.As(err, &budget) || budget.Need != first || !strings.Contains(err.Error(), "the first mesh") {
		t.Errorf("budget one byte below the first estimate (%d): error %v, want a *BudgetError for the first mesh", first, err)
	}
	if _, err := Certify(ctx, p, Options{Memory: first}); !errors.Is(err, context.Canceled) {
		t.Errorf("budget equal to the first estimate: error %v, want the cancelled context's (the first step may start)", err)
	}
}

// TestPolyhedronStopsAtMemoryBudget: the Dirichlet cube's first step
// (stage A on two levels) does not separate λ_4 = 6π² from λ_5 = 9π², so
// the next recipe refines stage A once more, eight times the stage-A
// tetrahedra. A budget between the two estimates stops the run after the
// first step with the memory reason, before the next step allocates; the
// stage-A bounds of that step contain 3π² and 6π² (common practice), and
// Check accepts the record. The warning states the next step's estimate
// and the budget in the units of BudgetError (MiB below 1 GiB, so that a
// budget of tens of MiB never reads "about 0.0 GiB"), and the warning on
// wide enclosures names --memory-limit.
func TestPolyhedronStopsAtMemoryBudget(t *testing.T) {
	p := parseProblem(t, cubePolyhedron("dirichlet", "0"))
	r := firstRecipe(t, p)
	next := r
	next.stageARefine++
	lo, hi := memoryEstimate(p, r), memoryEstimate(p, next)
	budget := (lo + hi) / 2
	if !(lo < budget && budget < hi) {
		t.Fatalf("estimates %d, %d: want a budget %d between them", lo, hi, budget)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: "1e-6", TimeLimit: 20 * time.Minute, Memory: budget, Now: fixedTime})
	if err != nil {
		t.Fatal(err)
	}
	ref, _ := RefinementOf(c)
	if ref == nil || ref.StopReason != StopMemory {
		t.Fatalf("stop record %+v, want %q", ref, StopMemory)
	}
	checkMemoryStopWarnings(t, c.Warnings, budget)
	pi2 := interval.Pi().Sqr()
	for k, want := range []interval.I{pi2.MulF(3), pi2.MulF(6)} {
		got := boundOf(t, certs.Bound{Lower: c.Results.Eigenvalues[k].Lower, Upper: c.Results.Eigenvalues[k].Upper})
		if !(got.Lo <= want.Lo && want.Hi <= got.Hi) || got.Wid() > want.Hi {
			t.Errorf("λ%d ∈ %v, want an enclosure of %v", k+1, got, want)
		}
	}
	data, _ := c.Marshal()
	if err := Check(data); err != nil {
		t.Errorf("check: %v", err)
	}
}

// TestPolyhedronStopReasonsTrue: the stop reason of a polyhedron run is
// the true one. The Neumann cube at 1e-3 reaches its target in the first
// step; at 1e-12 with a time limit of 1 ms it stops for the time limit
// after the first step (Check accepts both records), and a target record
// or a cap on that step is refused: the step left the target unmet and
// more steps (degree 5) available.
func TestPolyhedronStopReasonsTrue(t *testing.T) {
	data, _ := neumannCubeCertificate(t)
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	if ref, _ := RefinementOf(c); ref == nil || ref.StopReason != StopTarget {
		t.Errorf("target 1e-3: stop record %+v, want %q", ref, StopTarget)
	}
	p := parseProblem(t, cubePolyhedron("neumann", "0"))
	c, err = Certify(context.Background(), p, Options{RelWidth: "1e-12", TimeLimit: time.Millisecond, Now: fixedTime})
	if err != nil {
		t.Fatal(err)
	}
	if ref, _ := RefinementOf(c); ref == nil || ref.StopReason != StopTime {
		t.Fatalf("time limit 1 ms: stop record %+v, want %q", ref, StopTime)
	}
	timed, _ := c.Marshal()
	if err := Check(timed); err != nil {
		t.Errorf("check of the time-limited run: %v", err)
	}
	for _, reason := range []string{StopTarget, StopCap} {
		if err := Check(editMethod(t, timed, func(m *Method) { m.Refinement.StopReason = reason })); err == nil {
			t.Errorf("stop reason %q verifies on a step that left the target unmet and steps available", reason)
		}
	}
}

// TestPolyhedronTimeLimitAcrossStageALevels: a run ends near its time
// limit; a step starts only if it is expected to end within it. On the
// Dirichlet orthoscheme 0 ≤ x ≤ y ≤ z ≤ 1 the stage-A levels cost, measured
// (2 shared cores), 0.07 s, 1.1 s and 152 s of wall time (3968 and 32,256
// stage-A unknowns: eight times the unknowns, over a hundred times the
// time of the verified count), so a limit of 10 s ends the run after the
// first or the second step (polyhedron.stepCost). Predicted as four times
// the last step, the third step started and the run took minutes.
func TestPolyhedronTimeLimitAcrossStageALevels(t *testing.T) {
	p := parseProblem(t, `{"domain": {"polyhedron": {"vertices": [["0","0","0"],["0","0","1"],["0","1","1"],["1","1","1"]], "faces": [[0,1,2],[0,1,3],[0,2,3],[1,2,3]]}}, "boundary": "dirichlet", "eigenvalues": 2}`)
	const limit = 10 * time.Second
	start := time.Now()
	c, err := Certify(context.Background(), p, Options{RelWidth: "1e-6", TimeLimit: limit})
	if err != nil {
		t.Fatal(err)
	}
	elapsed := time.Since(start)
	ref, _ := RefinementOf(c)
	t.Logf("stopped after %v: %+v", elapsed, ref)
	if elapsed > 3*limit {
		t.Errorf("the run took %v with a time limit of %v", elapsed, limit)
	}
	if ref == nil || ref.StopReason != StopTime {
		t.Errorf("stop record %+v, want %q", ref, StopTime)
	}
}

// checkMemoryStopWarnings checks the warnings of a run stopped by the
// memory budget: the next step's need (the loop's next recipe may refine
// more than stage A, so at least the budget) is stated in MiB while below
// 1 GiB, the budget as byteSize states it, and the warning on wide
// enclosures (the gap's contains 0 after the first step) names
// --memory-limit, as the time limit's names its option.
func checkMemoryStopWarnings(t *testing.T, warnings []string, budget int64) {
	t.Helper()
	re := regexp.MustCompile(`the next refinement would need about ([0-9.]+) (MiB|GiB), more than the memory budget of (.*)$`)
	found := false
	for _, w := range warnings {
		m := re.FindStringSubmatch(w)
		if m == nil {
			continue
		}
		found = true
		need, _ := strconv.ParseFloat(m[1], 64) // a printed size, only compared
		if m[3] != byteSize(budget) {
			t.Errorf("warning %q: budget %q, want %q", w, m[3], byteSize(budget))
		}
		if m[2] == "GiB" && need < 1 || m[2] == "MiB" && (need >= 1024 || need < float64(budget)/(1<<20)) {
			t.Errorf("warning %q: the need is not stated in MiB below 1 GiB or is below the budget", w)
		}
	}
	if !found {
		t.Errorf("warnings %q, want the next step's need and the budget", warnings)
	}
	if !strings.Contains(strings.Join(warnings, "\n"), "a larger memory budget (--memory-limit) lets refinement continue") {
		t.Errorf("warnings %q do not name --memory-limit", warnings)
	}
}

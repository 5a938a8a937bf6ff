package certify

import (
	"context"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"
)

// TestMemoryStopWarningStatesSizes: a run stopped by the memory budget
// warns with the next step's estimate and the budget in the units of
// BudgetError (MiB below 1 GiB), so that a budget of tens of MiB never
// reads "about 0.0 GiB", and the warning on wide enclosures names
// --memory-limit. The Dirichlet cube's first step does not reach 1e-6;
// the budget lies between its estimate and that of the same recipe with
// stage A refined once, which the loop's next recipe does not undercut
// (see TestPolyhedronStopsAtMemoryBudget).
func TestMemoryStopWarningStatesSizes(t *testing.T) {
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
	// The loop's next recipe may refine more than stage A; its estimate
	// is at least the budget's and stated in MiB while below 1 GiB.
	re := regexp.MustCompile(`the next refinement would need about ([0-9.]+) (MiB|GiB), more than the memory budget of (.*)$`)
	found := false
	for _, w := range c.Warnings {
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
		t.Errorf("warnings %q, want the next step's need and the budget", c.Warnings)
	}
	// The gap's enclosure contains 0 after the first step: its warning
	// names the option that raises the budget, as the time limit's does.
	if !strings.Contains(strings.Join(c.Warnings, "\n"), "a larger memory budget (--memory-limit) lets refinement continue") {
		t.Errorf("warnings %q do not name --memory-limit", c.Warnings)
	}
}

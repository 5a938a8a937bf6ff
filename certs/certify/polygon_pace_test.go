package certify

import (
	"testing"
	"time"
)

// TestExtraIndexStepKeepsTheDeadline: on a polygon with singular corners
// the driver paces itself (Certify then drops its rule that the next step
// costs four times the last), so every step the polygon's next returns
// must have passed the deadline check, including the step that only
// raises the extra indices when no N separates. With the deadline passed,
// that step is refused with StopTime; without a deadline it is taken. The
// outcome is made up: Ritz bounds with a cluster of five near 15.2 and
// stage-A bounds 1% below, for which neededExtra asks for 6 indices.
func TestExtraIndexStepKeepsTheDeadline(t *testing.T) {
	p := parseProblem(t, lshapeSource)
	r, err := initialRecipe(p)
	if err != nil {
		t.Fatal(err)
	}
	ritz := []float64{10, 15.2, 15.21, 15.22, 15.23, 15.24, 30, 40}
	stageA := make([]float64, len(ritz))
	for i, x := range ritz {
		stageA[i] = 0.99 * x
	}
	out := &outcome{ritz: ritz, stageA: stageA}
	if got := neededExtra(p, out, 1); got <= r.extra {
		t.Fatalf("neededExtra %d, want more than the recipe's %d (the made-up cluster)", got, r.extra)
	}
	for _, c := range []struct {
		name     string
		deadline time.Time
		want     string
	}{
		{"deadline passed", time.Now().Add(-time.Second), StopTime},
		{"no deadline", time.Time{}, ""},
	} {
		d, ok := discretisationOf(p).(polygon)
		if !ok || d.hist == nil {
			t.Fatal("the L-shape's discretisation does not pace itself")
		}
		if !d.pace(c.deadline, 0, 0) {
			t.Fatal("pace reports no pacing")
		}
		// A step with a known cost per unit of work, as after the first step.
		d.hist.perWork = 1e-6
		next, why := d.next(r, out, 1)
		if why != c.want {
			t.Errorf("%s: next says %q (extra indices %d), want %q", c.name, why, next.extra, c.want)
		}
	}
}

package converge

import (
	"math"
	"testing"
)

// TestWorstResidual: an exact eigenpair of K = diag(2, 3), M = I has zero
// residual; a perturbed one has the residual computed by hand (common
// practice).
func TestWorstResidual(t *testing.T) {
	x := [][]float64{{1, 0}, {1, 1}}
	kx := [][]float64{{2, 0}, {2, 3}}
	mx := [][]float64{{1, 0}, {1, 1}}
	theta := []float64{2, 2.5}
	// Pair 2: r = (2 − 2.5, 3 − 2.5) = (−0.5, 0.5), ‖r‖ = √0.5, ‖x‖ = √2,
	// scale ‖K‖ + |θ|‖M‖ = 3 + 2.5: relative 0.5/5.5.
	got := WorstResidual(x, kx, mx, theta, 3, 1)
	if want := 0.5 / 5.5; math.Abs(got-want) > 1e-15 {
		t.Errorf("worst residual %v, want %v", got, want)
	}
	if got := WorstResidual(x[:1], kx[:1], mx[:1], theta[:1], 3, 1); got != 0 {
		t.Errorf("exact pair: residual %v", got)
	}
}

// TestMonitor: converges at Tol, fails after 8 stagnant observations above
// Accept, accepts a stagnant residual below Accept, and restarts the count
// when the shift moves.
func TestMonitor(t *testing.T) {
	m := Monitor{Tol: 1e-14, Accept: 1e-11}
	if v := m.Observe(1e-15, false); v != Converged {
		t.Errorf("below Tol: %v", v)
	}
	m = Monitor{Tol: 1e-14, Accept: 1e-11}
	verdicts := []Verdict{}
	for i := 0; i < 9; i++ {
		verdicts = append(verdicts, m.Observe(1e-3, false))
	}
	if verdicts[7] != Continue || verdicts[8] != Failed {
		t.Errorf("stagnation above Accept: %v", verdicts)
	}
	m = Monitor{Tol: 1e-14, Accept: 1e-11}
	for i := 0; i < 8; i++ {
		m.Observe(1e-12, false)
	}
	if v := m.Observe(1e-12, false); v != Converged {
		t.Errorf("stagnation below Accept: %v", v)
	}
	m = Monitor{Tol: 1e-14, Accept: 1e-11}
	for i := 0; i < 20; i++ {
		m.ShiftMoved()
		if v := m.Observe(1e-3, false); v != Continue {
			t.Fatalf("moving shift counted as stagnation at %d", i)
		}
	}
	if v := m.Observe(1e-3, true); v != Failed {
		t.Errorf("last iteration above Accept: %v", v)
	}
}

// TestNextShift: far shifts move halfway (at least 5% of the spread below
// θ_0); near ones stay.
func TestNextShift(t *testing.T) {
	if next, ok := NextShift([]float64{10, 12}, -100); !ok || next != 10-55 {
		t.Errorf("far shift: %v %v", next, ok)
	}
	if _, ok := NextShift([]float64{10, 12}, 9.9); ok {
		t.Error("near shift moved")
	}
}

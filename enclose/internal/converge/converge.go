// Package converge holds the convergence control of the shift-invert
// subspace iteration of enclose/internal/subspace (which serves every
// storage): relative residuals of Ritz pairs, the stagnation rule, and the
// movement of the shift toward the lowest Ritz value. Everything here
// chooses (when to stop, where to shift); nothing is a bound.
package converge

import "math"

// WorstResidual returns max over the pairs c of the relative residual
// ‖Kx_c − θ_c M x_c‖₂ / ((‖K‖∞ + |θ_c| ‖M‖∞) ‖x_c‖₂), given kx = K x and
// mx = M x for each vector x.
func WorstResidual(x, kx, mx [][]float64, theta []float64, normK, normM float64) float64 {
	worst := 0.0
	for c := range x {
		res, xx := 0.0, 0.0
		for i := range x[c] {
			r := kx[c][i] - theta[c]*mx[c][i]
			res += r * r
			xx += x[c][i] * x[c][i]
		}
		worst = math.Max(worst, math.Sqrt(res)/((normK+math.Abs(theta[c])*normM)*math.Sqrt(xx)))
	}
	return worst
}

// Verdict is the outcome of one observation of the residual.
type Verdict int

const (
	Continue  Verdict = iota // iterate again
	Converged                // stop: the pairs are accepted
	Failed                   // stop: the iteration stagnated above the acceptance level
)

// Monitor applies the stopping rule: converged at Tol; if the worst
// residual has not halved for 8 observations (or the last iteration is
// reached), accepted when it is at most Accept, else failed.
type Monitor struct {
	Tol, Accept float64
	best        float64
	stall       int
}

// Observe records the worst residual of an iteration; last says whether it
// was the last iteration allowed.
func (m *Monitor) Observe(worst float64, last bool) Verdict {
	if m.best == 0 {
		m.best = math.Inf(1)
	}
	if worst <= m.Tol {
		return Converged
	}
	if worst < 0.5*m.best {
		m.best, m.stall = worst, 0
	} else if m.stall++; m.stall >= 8 {
		if worst <= m.Accept || m.best <= m.Accept {
			return Converged
		}
		return Failed
	}
	if last {
		if worst <= m.Accept {
			return Converged
		}
		return Failed
	}
	return Continue
}

// ShiftMoved tells the monitor that the shift moved, which is progress of
// its own: the stagnation count restarts.
func (m *Monitor) ShiftMoved() { m.stall = 0 }

// NextShift proposes a shift closer to the lowest Ritz value θ_0 while the
// distance θ_0 − σ is large compared with the spread of the Ritz values
// theta (ascending); ok is false when σ should stay.
func NextShift(theta []float64, sigma float64) (next float64, ok bool) {
	spread := theta[len(theta)-1] - theta[0]
	gap := theta[0] - sigma
	if gap <= 0.1*spread {
		return sigma, false
	}
	return theta[0] - math.Max(0.05*spread, 0.5*gap), true
}

package certify

import (
	"math"
	"testing"
	"time"
)

// trapezoidAfterDegreeEight returns the state of the polygon chooser on the
// 117° trapezoid after its raise to degree 8 on 2 uniform and 14 graded
// levels, as recorded in a run at a 1e-12 target within 30 s (machine
// under load, times as measured), with every measured time (the steps'
// seconds, the seconds per unit of work, the time elapsed) scaled by
// scale: the gap 7.1e-11 after 7.9 s; the raise from degree 6 gained 60.5
// in 5.0 s (0.89 of its prediction), the one uniform level, at degree 4,
// 6.6 in 0.24 s, the one grading level 1.07; corner share 0.99.
func trapezoidAfterDegreeEight(t *testing.T, scale float64) (polygon, recipe, *outcome) {
	t.Helper()
	p := parseProblem(t, trapezoid117Source)
	r := firstRecipe(t, p)
	r.degree, r.fluxDegree, r.refine, r.graded, r.stageARefine = 8, 7, 2, 14, 3
	const elapsed, limit = 7.9, 30.0
	h := &stepHistory{
		deadline: time.Now().Add(time.Duration((limit - scale*elapsed) * float64(time.Second))),
		steps:    8,
		score:    -math.Log(7.1e-11),
		perWork:  scale * 2.84e-6,
		target:   1e-12,
		degrees:  1<<4 | 1<<6 | 1<<8,
		share:    share{corner: 0.991, ok: true},
	}
	h.kinds[kindDegree] = kindRecord{tried: true, gain: 60.5, seconds: scale * 5.0, ratio: 0.886, rest: maxRestGain, levels: 3}
	h.kinds[kindUniform] = kindRecord{tried: true, gain: 6.61, seconds: scale * 0.24}
	h.kinds[kindGrade] = kindRecord{gain: 1.07, seconds: scale * 0.26, levels: 1}
	out := &outcome{n: 2, rho: 40, ritz: []float64{10, 16, 20}, lg: []float64{9, 15}}
	return polygon{p: p, hist: h}, r, out
}

// TestChooserIgnoresTimingNoise: the choice after the raise to degree 8 on
// the 117° trapezoid (trapezoidAfterDegreeEight) is the same when every
// measured time is scaled by 0.8 to 1.2: the uniform level, whose score
// the raise to degree 10 with 18 levels comes within 1.09 of when the
// lookahead counts the raise after the level (times ×0.8 and ×0.9), and
// beats when it does not (closeCallMargin). After the level (gain 3.4 in
// 3.8 s, gap 2.1e-11 at 11.7 s) the raise to degree 10 on 3 uniform
// levels, predicted to reach the target, is taken whenever it fits in
// the time left.
func TestChooserIgnoresTimingNoise(t *testing.T) {
	for _, scale := range []float64{0.8, 0.9, 1, 1.1, 1.2} {
		d, r, out := trapezoidAfterDegreeEight(t, scale)
		h := d.hist
		next, why := h.chooseStep(d, r, out)
		if why != "" || next.degree != 8 || next.refine != 3 || next.graded != 14 {
			t.Errorf("times ×%.1f: got degree %d, %d uniform, %d graded levels (%q), want the uniform level", scale, next.degree, next.refine, next.graded, why)
			continue
		}
		// The level as measured.
		const elapsed = 11.7
		h.deadline = time.Now().Add(time.Duration((30 - scale*elapsed) * float64(time.Second)))
		h.steps, h.score, h.perWork = 9, -math.Log(2.1e-11), scale*2.23e-6
		h.kinds[kindUniform] = kindRecord{tried: true, gain: 3.38, seconds: scale * 3.8, ratio: 0.787}
		h.share, h.pending = share{corner: 0.993, ok: true}, kindNone
		r = next
		raise, _ := applyStep(kindDegree, r, nil)
		raise, _ = onHPLine(d.p, kindDegree, r, raise)
		fits := !h.exceeds(h.predict(d.p, kindDegree, raise))
		next, why = h.chooseStep(d, r, out)
		t.Logf("times ×%.1f: then degree %d, %d uniform, %d graded levels (%q); the raise fits: %v", scale, next.degree, next.refine, next.graded, why, fits)
		if fits && (why != "" || next.degree != 10 || next.refine != 3 || next.graded != 18) {
			t.Errorf("times ×%.1f, after the level: got degree %d, %d uniform, %d graded levels (%q), want the raise to degree 10 with 18 levels", scale, next.degree, next.refine, next.graded, why)
		}
	}
}

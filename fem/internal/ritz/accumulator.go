package ritz

import (
	"math"

	"gapcert/enclose"
	"gapcert/interval"
)

// Accumulator is a lower-triangular sum of interval contributions to an
// n×n symmetric matrix. The zero value is not usable; use NewAccumulator.
//
// Each end of each entry is summed with compensation, so that the width
// of an entry is the sum of the widths of its contributions plus about
// one ulp of the total per contribution (the TwoSum errors are themselves
// summed with directed rounding) when the contributions cancel, and a few
// ulps of the total when they do not. A plain interval sum of n contributions widens by up to one ulp of
// the partial sum at each addition: on a mesh of 700 triangles that is a
// relative width of about 1e-13, which the Lehmann–Goerisch pencil then
// amplifies (package temple). The lower ends are summed as follows (the
// upper ends alike, rounding up): the running sum s and the new lower end
// x give t = fl(s + x) and, by TwoSum, the exact error e = (s + x) − t
// (Møller 1965; Knuth, TAOCP vol. 2, §4.2.2; exact for finite floats when
// |t| < 2¹⁰²³, the condition of interval.AddDown). So s_final + Σ e is the
// exact sum of the lower ends, and the errors are summed rounding down
// (interval.AddDown), which gives a float ≤ Σ e; the entry's lower end is
// AddDown(s_final, that float) ≤ the exact sum. An end that is not finite,
// or a sum at or above 2¹⁰²³ in magnitude, makes the end infinite
// (−∞ for the lower end, +∞ for the upper), which is sound.
type Accumulator struct {
	n      int
	lo, hi []float64 // running sums of the lower and upper ends (packed lower triangle, row by row)
	el, eh []float64 // their TwoSum errors, summed rounding down (el) and up (eh)
}

// NewAccumulator returns an n×n accumulator with every entry [0, 0].
func NewAccumulator(n int) *Accumulator {
	if n < 0 {
		panic("ritz: negative dimension")
	}
	m := n * (n + 1) / 2
	return &Accumulator{n: n, lo: make([]float64, m), hi: make([]float64, m), el: make([]float64, m), eh: make([]float64, m)}
}

// Add adds x to entry (i, j), j ≤ i: the sum encloses every sum of exact
// values inside the enclosures added so far.
func (a *Accumulator) Add(i, j int, x interval.I) {
	if j > i || i >= a.n || j < 0 {
		panic("ritz: entry outside the lower triangle")
	}
	k := i*(i+1)/2 + j
	a.lo[k], a.el[k] = compensatedAdd(a.lo[k], a.el[k], x.Lo, math.Inf(-1), interval.AddDown)
	a.hi[k], a.eh[k] = compensatedAdd(a.hi[k], a.eh[k], x.Hi, math.Inf(1), interval.AddUp)
}

// compensatedAdd returns the running sum and error sum after adding x to
// s (the type's doc): t = fl(s + x) and err ⊕ e with e = (s + x) − t
// exact by TwoSum, ⊕ the directed sum add. A non-finite x, s or err, or
// |t| ≥ 2¹⁰²³ (where TwoSum may overflow), gives (inf, inf). Sums are
// written float64(·) so that no expression is contracted.
func compensatedAdd(s, err, x, inf float64, add func(a, b float64) float64) (float64, float64) {
	if math.IsInf(s, 0) || math.IsInf(err, 0) || math.IsInf(x, 0) || math.IsNaN(x) {
		return inf, inf
	}
	t := float64(s + x)
	if !(math.Abs(t) < 0x1p1023) {
		return inf, inf
	}
	bb := float64(t - s)
	e := float64(float64(s-float64(t-bb)) + float64(x-bb))
	return t, add(err, e)
}

// Sym returns the accumulated matrix (both triangles set).
func (a *Accumulator) Sym() *enclose.Sym {
	s := enclose.NewSym(a.n)
	for i := 0; i < a.n; i++ {
		for j := 0; j <= i; j++ {
			k := i*(i+1)/2 + j
			s.Set(i, j, interval.I{Lo: finish(a.lo[k], a.el[k], interval.AddDown), Hi: finish(a.hi[k], a.eh[k], interval.AddUp)})
		}
	}
	return s
}

// finish returns s ⊕ err, or s when it is infinite.
func finish(s, err float64, add func(a, b float64) float64) float64 {
	if math.IsInf(s, 0) {
		return s
	}
	return add(s, err)
}

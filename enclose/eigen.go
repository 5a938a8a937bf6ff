package enclose

import (
	"errors"
	"math"

	"gapcert/interval"
)

// ErrNotPositiveDefinite is returned by Eigenvalues when [B] is not
// verified positive definite.
var ErrNotPositiveDefinite = errors.New("enclose: B is not verified positive definite")

const (
	// widenSteps bounds the geometric widening of a trial shift (factor 4
	// per step, so 4⁶⁴ ≈ 3·10³⁸ times the starting distance).
	widenSteps = 64
	// bisectSteps bounds the tightening after the widening succeeded.
	bisectSteps = 4
)

// Eigenvalues returns enclosures of the eigenvalues μ_1 ≤ … ≤ μ_n of
// Ax = μBx, valid for every member (A, B) of the pencil, or
// ErrNotPositiveDefinite if [B] is not verified positive definite
// (PositiveDefinite).
//
// Method. Approximate eigenpairs of the midpoint pencil are chosen with
// gonum (Cholesky of mid(B), then the symmetric eigensolver); their
// eigenvector matrix X is used for the congruence (Ã, B̃) ∋ (XᵀAX, XᵀBX),
// enclosed in interval arithmetic, after proving every member of B̃
// positive definite (for B positive definite this proves X nonsingular, as
// XᵀBX is singular when X is). The pencil (XᵀAX, XᵀBX) has the eigenvalues
// of (A, B), and Ã − τB̃ is nearly diagonal, so the verified counts of
// CountBelow's elimination decide close to each eigenvalue. If the
// congruence cannot be verified, the counts run on ([A], [B]) itself.
//
// For each index i the lower end is an exact float τ with a decided count
// #{μ < τ} ≤ i − 1, hence μ_i ≥ τ; the upper end is a τ with a decided
// count ≥ i, hence μ_i < τ. Trial shifts start a few ulps (relative to the
// spectrum's scale) from the approximation, move away geometrically (factor
// 4) until the count is decided and satisfies the condition, and are then
// tightened by bisection. Where no trial shift decides (interval data too
// wide), the end is ±Inf: the result is then wide but still true. Finally
// lower ends are made nondecreasing and upper ends nonincreasing from the
// top (μ_i ≥ μ_{i−1} ≥ lo_{i−1}, μ_i ≤ μ_{i+1} ≤ hi_{i+1}).
//
// Multiple and clustered eigenvalues are enclosed individually; their
// enclosures overlap.
func Eigenvalues(a, b *Sym) ([]interval.I, error) {
	if a.n != b.n {
		panic("enclose: dimension mismatch")
	}
	n := a.n
	if !PositiveDefinite(b) {
		return nil, ErrNotPositiveDefinite
	}
	out := make([]interval.I, n)
	if n == 0 {
		return out, nil
	}
	approx, x, ok := choosePencilEigen(a, b)
	count := func(tau float64) (int, bool) { return CountBelow(a, b, tau) }
	if ok && allFinite(x) {
		at, bt := congruence(a, x), congruence(b, x)
		if PositiveDefinite(bt) {
			var e elimination
			count = func(tau float64) (int, bool) { return e.negShifted(at, bt, tau) }
		}
	}
	if !ok || !allFinite(approx) {
		approx = chooseDiagonalGuess(a, b)
	}
	scale := 0.0
	for _, v := range approx {
		scale = math.Max(scale, math.Abs(v))
	}
	const eps = 0x1p-52
	for i := 0; i < n; i++ {
		step := math.Max(4*eps*math.Abs(approx[i]), 4*eps*scale)
		step = math.Max(step, 0x1p-1000)
		lo := searchEnd(count, approx[i], -step, func(c int) bool { return c <= i })
		hi := searchEnd(count, approx[i], step, func(c int) bool { return c >= i+1 })
		out[i] = interval.I{Lo: lo, Hi: hi}
	}
	for i := 1; i < n; i++ {
		out[i].Lo = math.Max(out[i].Lo, out[i-1].Lo)
	}
	for i := n - 2; i >= 0; i-- {
		out[i].Hi = math.Min(out[i].Hi, out[i+1].Hi)
	}
	return out, nil
}

// searchEnd returns the best trial shift τ = approx + t (t of the sign of
// step) whose count is decided and satisfies want, or ±Inf (the sign of
// step) if none is found. Only the verified counts make the result a bound;
// approx and step only choose where to look.
func searchEnd(count func(float64) (int, bool), approx, step float64, want func(int) bool) float64 {
	good := math.Inf(1)
	if step < 0 {
		good = math.Inf(-1)
	}
	bad := approx
	d := step
	found := false
	for it := 0; it < widenSteps; it++ {
		tau := approx + d
		if math.IsInf(tau, 0) || math.IsNaN(tau) {
			break
		}
		if c, ok := count(tau); ok && want(c) {
			good, found = tau, true
			break
		}
		bad = tau
		d *= 4
	}
	if !found {
		return good
	}
	for it := 0; it < bisectSteps; it++ {
		tau := good + (bad-good)/2
		if tau == good || tau == bad {
			break
		}
		if c, ok := count(tau); ok && want(c) {
			good = tau
		} else {
			bad = tau
		}
	}
	return good
}

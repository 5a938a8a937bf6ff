package proof

import (
	"math"

	"gapcert/enclose"
	"gapcert/interval"
)

// CountLower returns σ′ and true when the verified count of c at the
// shift sigma shows at most index − 1 eigenvalues below σ′: then every
// member of the interval pencil has λ_{h,index} ≥ σ′ (Sylvester's law of
// inertia, package enclose, Counter). It returns false when the
// count fails or shows more. sigma is a choice.
func CountLower(c enclose.Counter, mMin, sigma float64, index int) (float64, bool) {
	n, sigmaPrime, ok := c.CountBelow(mMin, sigma)
	if ok && n <= index-1 {
		return sigmaPrime, true
	}
	return 0, false
}

// SliceLower raises lower[i], for every i ≥ max(n, from), to sigmaPrime,
// when a verified count showed at most n eigenvalues of the pencil below
// sigmaPrime: then λ_{h,j} ≥ σ′ for every j ≥ n + 1 (0-based, lower[i]
// bounds λ_{h,i+1}). The count is the caller's (Counter.CountBelow with
// ok); from only limits the indices updated.
func SliceLower(lower []float64, from, n int, sigmaPrime float64) {
	for i := max(n, from); i < len(lower); i++ {
		lower[i] = max(lower[i], sigmaPrime)
	}
}

// ProjectionLower returns a float ≤ c + f(Λ_h − c) for every Λ_h ≥ lh,
// f(x) = x/(1 + C²x) with C ∈ ch: the stage-A pencil's eigenvalues are
// μ_h + c with μ_h ≥ 0 those of its form without the constant c (package
// fem/discrete, StageA.FormShift), and Λ ≥ c + f(μ_h) by the projection
// bound (enclose.ProjectionLower; package enclose, Projection bounds). As
// g(c) = c + f(lh − c) increases in c (f′ ≤ 1), any 0 ≤ c ≤ the form's
// constant is sound, and c = 0 is the plain bound f(Λ_h).
//
// Indices beyond the dimension n of the stage-A space (the interval
// discretisation meets them with a recorded recipe of one to three
// stage-A cells; polygons refuse such spaces): the pencil has no λ_{h,k}
// for k > n, and a verified count shows at most n ≤ k − 1 eigenvalues
// below every shift, so CountLower and SliceLower give any σ′ (the
// convention λ_{h,k} = +∞), and the result c + f(σ′ − c) < c + 1/C² is
// still a lower bound of Λ_k: P_h maps onto an n-dimensional space, so its
// kernel has codimension ≤ n, and there (H3) gives
// ‖u‖ ≤ C_h ‖u‖_{a_h} (a_h without the constant c), so by the max–min
// form of the min–max principle (Courant–Hilbert, above) the (n + 1)-th
// eigenvalue of that form is ≥ 1/C_h², and Λ_k ≥ c + 1/C_h² for k > n
// (the same step as for k ≤ n, V + γ ≥ c).
func ProjectionLower(lh, c float64, ch interval.I) float64 {
	if c == 0 {
		return enclose.ProjectionLower(lh, ch)
	}
	mu := math.Max(interval.SubDown(lh, c), 0)
	return interval.AddDown(enclose.ProjectionLower(mu, ch), c)
}

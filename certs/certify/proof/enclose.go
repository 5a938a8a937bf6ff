package proof

import (
	"fmt"
	"math"

	"gapcert/interval"
)

// Enclose returns enclosures of λ_1..λ_m from one-sided bounds of
// Λ_k = λ_k + γ (0-based, index k−1 holds Λ_k): ritz upper bounds,
// stageA lower bounds and lg lower bounds (shorter, or nil, where stage B
// gave none): λ_k ∈ [max(stage A, stage B) − γ, Ritz − γ], each end
// rounded outward. A lower end above an upper end would contradict the
// theorems; it is an error and never certified.
func Enclose(m int, ritz, stageA, lg []float64, gamma float64) ([]interval.I, error) {
	out := make([]interval.I, 0, m)
	for k := 0; k < m; k++ {
		lo := stageA[k]
		if k < len(lg) {
			lo = math.Max(lo, lg[k])
		}
		l := interval.I{Lo: interval.SubDown(lo, gamma), Hi: interval.SubUp(ritz[k], gamma)}
		if l.Lo > l.Hi {
			return nil, fmt.Errorf("internal inconsistency (please report it): lower bound %g above upper bound %g for lambda%d", l.Lo, l.Hi, k+1)
		}
		out = append(out, l)
	}
	return out, nil
}

// Gap returns the enclosure [ℓ₂ − u₁, u₂ − ℓ₁] of λ₂ − λ₁ from
// enclosures [ℓ₁, u₁] ∋ λ₁ and [ℓ₂, u₂] ∋ λ₂, rounded outward.
func Gap(l1, l2 interval.I) interval.I {
	return interval.I{Lo: interval.SubDown(l2.Lo, l1.Hi), Hi: interval.SubUp(l2.Hi, l1.Lo)}
}

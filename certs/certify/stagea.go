package certify

import (
	"gapcert/certs/certify/proof"
	"gapcert/enclose"
	"gapcert/fem/discrete"
)

// This file chooses the shifts of the verified stage-A counts; each bound
// it keeps is proved by proof.CountLower or proof.SliceLower.

// stageALower returns verified lower bounds of the stage-A eigenvalues
// λ_{h,1..count} (0-based). The first located indices are located in
// floating point (StageA.Locate, lower bracket end the bound of the
// previous index) and bounded by verifiedLower; the others, if any, by
// spectrum slicing (sliceStageA). ritz holds the Ritz upper bounds of
// Λ_1.., which only place the slicing shifts.
func stageALower(sa discrete.StageA, search discrete.ShiftSearch, ritz []float64, count, located int) ([]float64, error) {
	mMin := sa.MassMin()
	lhs := make([]float64, count)
	prev, last := 0.0, 0.0
	for i := 0; i < located; i++ {
		lo := max(prev, 0)
		approx, err := sa.Locate(i+1, lo)
		if err != nil {
			return nil, err
		}
		lhs[i] = verifiedLower(sa, mMin, approx, lo, i+1, search)
		prev, last = lhs[i], approx
	}
	if count > located {
		sliceStageA(sa, mMin, last, ritz, lhs, located)
	}
	return lhs, nil
}

// verifiedLower returns a float ℓ ≥ lo with λ_{h,index} ≥ ℓ for every
// member of the stage-A pencil: shifts σ below the approximation approx
// of λ_{h,index} are tried as search says, and each count that shows at
// most index − 1 eigenvalues below the corrected shift σ′ proves
// λ_{h,index} ≥ σ′ (proof.CountLower). lo must be a known lower bound (0,
// or the bound of the previous index: the stage-A pencil is positive
// semidefinite since c_T ≥ 0 and α ≥ 0); it is returned when nothing
// verifies.
//
// Near an eigenvalue the factorization without pivoting has tiny pivots
// and a large residual, so σ′ can fall far below σ; shifts further from
// λ_{h,index} lose distance but may gain residual, and σ′ is not monotone
// in the shift (measured on (0, 1), Dirichlet, 256 cells: three shifts
// were too few for λ_{h,2}), hence the search parameters of each
// discretisation.
func verifiedLower(c enclose.Counter, mMin, approx, lo float64, index int, search discrete.ShiftSearch) float64 {
	best, stale := lo, 0
	delta := search.First * approx
	for try := 0; try < search.Tries && approx-delta > lo; try++ {
		if sigmaPrime, ok := proof.CountLower(c, mMin, approx-delta, index); ok {
			if sigmaPrime > best {
				best, stale = sigmaPrime, 0
			} else {
				stale++
			}
			if search.Stale == 0 || stale >= search.Stale {
				break
			}
		}
		delta *= search.Factor
	}
	return best
}

// sliceStageA fills lhs[solved:] (0-based: lhs[i] bounds λ_{h,i+1})
// with verified lower bounds of the stage-A eigenvalues beyond the
// first solved ones, whose bounds lhs[:solved] are given (lastApprox
// approximates λ_{h,solved}), by spectrum slicing: a verified count
// showing at most n eigenvalues below σ′ gives λ_{h,j} ≥ σ′ for every
// j ≥ n + 1 (proof.SliceLower), and λ_{h,j} ≥ λ_{h,solved} ≥
// lhs[solved−1] for every j ≥ solved. Each bound is the largest such σ′
// found. One count per index costs one sparse factorization, where
// approximate eigenpairs of many indices would cost a block of vectors
// each.
//
// The shifts are choices: the Ritz upper bounds ritz[j−1] of Λ_j, scaled
// by lastApprox/ritz[solved−1] (the ratio of the discrete to the exact
// eigenvalue at the last solved index), estimate λ_{h,j}; the shift for
// index j lies a quarter of the estimated spacing below the estimate of
// λ_{h,j}, and half-way down the spacing when that counted too many. At
// most maxSliceCounts indices get shifts of their own (every stride-th
// from the last; the others keep the bound of a lower shift).
func sliceStageA(c enclose.Counter, mMin, lastApprox float64, ritz, lhs []float64, solved int) {
	ratio := lastApprox / ritz[solved-1]
	est := func(j int) float64 { // estimate of λ_{h,j}, j > solved
		if j == solved {
			return lastApprox
		}
		if j <= len(ritz) {
			return ratio * ritz[j-1]
		}
		n := len(ritz) // extrapolate linearly past the last Ritz bound
		return ratio * (2*ritz[n-1] - ritz[n-2])
	}
	for j := solved + 1; j <= len(lhs); j++ {
		lhs[j-1] = lhs[solved-1]
	}
	// At most maxSliceCounts indices, every stride-th down from the last,
	// get a count of their own.
	stride := (len(lhs) - solved + maxSliceCounts - 1) / maxSliceCounts
	for j := len(lhs); j > solved; j -= stride {
		lo, hi := est(j-1), est(j)
		for _, frac := range []float64{0.25, 0.5} {
			sigma := hi - frac*(hi-lo)
			if !(sigma > lhs[j-1]) {
				break
			}
			n, sp, ok := c.CountBelow(mMin, sigma)
			if !ok {
				continue
			}
			proof.SliceLower(lhs, solved, n, sp)
			if n <= j-1 {
				break
			}
		}
	}
}

// maxSliceCounts bounds the shifts of sliceStageA (measured on the 1:200
// rectangle: 1.3 s per count with 6·10⁵ stage-A unknowns).
const maxSliceCounts = 32

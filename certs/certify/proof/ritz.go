package proof

import (
	"fmt"

	"gapcert/enclose"
)

// RitzUpper returns upper bounds of Λ_1..Λ_n from the enclosed Ritz pencil
// (a0, a1) of n trial functions in a conforming space (package
// fem/discrete, Trial.RitzMatrices): by the min–max principle Λ_k ≤ μ_k
// for the exact pencil, which is a member of the interval one, and μ_k is
// at most the upper end of its enclosure (enclose.Eigenvalues).
func RitzUpper(a0, a1 *enclose.Sym) ([]float64, error) {
	mu, err := enclose.Eigenvalues(a0, a1)
	if err != nil {
		return nil, fmt.Errorf("the Ritz pencil could not be enclosed: %w", err)
	}
	upper := make([]float64, len(mu))
	for k := range upper {
		upper[k] = mu[k].Hi
	}
	return upper, nil
}

// Leading returns the leading n×n block of a. The Ritz matrices of the
// first n trial functions are the leading block of those of all of them
// (package fem/discrete, Trial.RitzMatrices), so the block is an
// enclosure of their pencil.
func Leading(a *enclose.Sym, n int) *enclose.Sym {
	b := enclose.NewSym(n)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			b.Set(i, j, a.At(i, j))
		}
	}
	return b
}

package temple_test

import (
	"fmt"

	"gapcert/enclose"
	"gapcert/interval/decimalio"
	"gapcert/temple"
)

// Temple's case (N = 1) in ℝ³ with K = diag(1, 4, 9) (the first Dirichlet
// eigenvalues k² of −u″ on (0, π)), b(u, v) = uᵀv, the trial vector
// ũ = (1, 0, 1/10) and w = K⁻¹ᐟ²ũ, so M(ũ,ũ) = 1.09, b(ũ,ũ) = 1.01,
// ‖w‖² = 1 + 1/900, and the shift ρ̂ = 4 = Λ_2. Temple's bound is
// (4·1.01 − 1.09)/(4·(1 + 1/900) − 1.01) = 2655/2695 = 0.98515769…
func ExampleLehmannGoerisch() {
	entry := func(s string) *enclose.Sym {
		m := enclose.NewSym(1)
		x, err := decimalio.Parse(s)
		if err != nil {
			panic(err)
		}
		m.Set(0, 0, x)
		return m
	}
	lower, err := temple.LehmannGoerisch(entry("1.09"), entry("1.01"), entry("901/900"), 4)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("Λ_1 ≥", decimalio.FormatLower(lower[0], 6))
	// Output: Λ_1 ≥ 0.985157
}

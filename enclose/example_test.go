package enclose_test

import (
	"fmt"

	"gapcert/enclose"
	"gapcert/interval"
)

// The pencil (A, I) with A = [[2, −1], [−1, 2]] has the eigenvalues 1 and 3
// (common practice: eigenvectors (1, 1) and (1, −1)).
func ExampleEigenvalues() {
	a, b := enclose.NewSym(2), enclose.NewSym(2)
	a.Set(0, 0, interval.Point(2))
	a.Set(1, 1, interval.Point(2))
	a.Set(1, 0, interval.Point(-1))
	b.Set(0, 0, interval.Point(1))
	b.Set(1, 1, interval.Point(1))
	mu, err := enclose.Eigenvalues(a, b)
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, m := range mu {
		fmt.Printf("μ_%d contains %g: %v, width ≤ 1e-14: %v\n", i+1, float64(2*i+1), m.Contains(float64(2*i+1)), m.Wid() <= 1e-14)
	}
	// Output:
	// μ_1 contains 1: true, width ≤ 1e-14: true
	// μ_2 contains 3: true, width ≤ 1e-14: true
}

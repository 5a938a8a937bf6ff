package band_test

import (
	"fmt"

	"gapcert/enclose/band"
	"gapcert/interval"
)

// The P1 finite-element pencil of −u″ on (0, 1) with Dirichlet conditions
// and 64 uniform elements (h = 1/64): K = (1/h) tridiag(−1, 2, −1),
// M = (h/6) tridiag(1, 4, 1) on the 63 interior nodes, with h/6 enclosed.
// Its eigenvalues (6/h²)(1 − cos kπh)/(2 + cos kπh) are about 9.87 and
// 39.5 for k = 1, 2 (common practice), so one lies below σ = 20.
func ExampleCountBelow() {
	const n = 63
	h := interval.Point(1.0 / 64)
	k, m := band.NewISym(n, 1), band.NewISym(n, 1)
	for i := 0; i < n; i++ {
		k.Add(i, i, interval.Point(2*64))
		m.Add(i, i, h.MulF(4).DivF(6))
		if i > 0 {
			k.Add(i, i-1, interval.Point(-64))
			m.Add(i, i-1, h.DivF(6))
		}
	}
	mMin := band.GershgorinLower(m) // ≈ h/3 > 0
	count, sigmaPrime, ok := band.CountBelow(k, m, mMin, 20)
	fmt.Println(count, ok, 20-sigmaPrime < 1e-9)
	// Output: 1 true true
}

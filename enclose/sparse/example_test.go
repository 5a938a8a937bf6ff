package sparse_test

import (
	"fmt"

	"gapcert/enclose/sparse"
	"gapcert/interval"
)

// The 5-point Laplacian on the 3×3 interior nodes of the unit square
// (h = 1/4), K = (1/h²)(4, −1, −1, −1, −1), with M = I. Its eigenvalues
// 64(sin²(iπ/8) + sin²(jπ/8)) are about 18.7, 41.4 (twice), 64, …
// (common practice), so exactly one lies below σ = 30.
func ExampleCountBelow() {
	const side = 3
	k, m := sparse.NewIBuilder(side*side), sparse.NewIBuilder(side*side)
	for y := 0; y < side; y++ {
		for x := 0; x < side; x++ {
			i := y*side + x
			k.Add(i, i, interval.Point(4*16))
			m.Add(i, i, interval.Point(1))
			if x+1 < side {
				k.Add(i, i+1, interval.Point(-16))
			}
			if y+1 < side {
				k.Add(i, i+side, interval.Point(-16))
			}
		}
	}
	count, sigmaPrime, ok := sparse.CountBelow(k.Build(), m.Build(), 1, 30)
	fmt.Println(count, ok, sigmaPrime <= 30, 30-sigmaPrime < 1e-12)
	// Output: 1 true true true
}

// LowestEigs on the same matrix: the double eigenvalue 41.37… comes out
// twice.
func ExampleLowestEigs() {
	const side = 3
	k, m := sparse.NewBuilder(side*side), sparse.NewBuilder(side*side)
	for y := 0; y < side; y++ {
		for x := 0; x < side; x++ {
			i := y*side + x
			k.Add(i, i, 64)
			m.Add(i, i, 1)
			if x+1 < side {
				k.Add(i, i+1, -16)
			}
			if y+1 < side {
				k.Add(i, i+side, -16)
			}
		}
	}
	vals, _, err := sparse.LowestEigs(k.Build(), m.Build(), 3)
	fmt.Printf("%.6f %.6f %.6f %v\n", vals[0], vals[1], vals[2], err)
	// Output: 18.745166 41.372583 41.372583 <nil>
}

package certs_test

import (
	"fmt"

	"gapcert/certs"
	"gapcert/fem/claim"
	"gapcert/interval"
)

// The Dirichlet unit square has λ1 = 2π² and λ2 = 5π² (separation of
// variables) and diameter √2; the claim compares the gap with 3π²/D².
func ExampleEvaluateClaim() {
	c, err := claim.Parse("lambda2 - lambda1 >= 3*pi^2/D^2")
	if err != nil {
		fmt.Println(err)
		return
	}
	d, _ := interval.Point(2).Sqrt()
	r := certs.EvaluateClaim(c, map[string]interval.I{
		"lambda1": interval.New(19.739, 19.740),
		"lambda2": interval.New(49.348, 49.349),
		"D":       d,
	})
	fmt.Println(r.Verdict)
	// Output: holds
}

package groundstate_test

import (
	"fmt"

	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
	"gapcert/temple/groundstate"
)

// The double well V = 6(x² − 1)² on (−5/2, 5/2) with Dirichlet ends: its
// ground state is not log-concave (log u is convex near the barrier at 0).
// The enclosure of λ1 is a certified one printed by gapcert certify.
func ExampleLogConcavity() {
	a, _ := decimalio.Parse("-5/2")
	b, _ := decimalio.Parse("5/2")
	lo, _ := decimalio.ParseLower("3.7410583827548427")
	hi, _ := decimalio.ParseUpper("3.7410583827563740")
	p := groundstate.Problem{
		V: formula.MustParse("6*(x^2-1)^2"),
		A: a, B: b,
		Left:  groundstate.Boundary{Kind: groundstate.Dirichlet},
		Right: groundstate.Boundary{Kind: groundstate.Dirichlet},
	}
	res, err := groundstate.LogConcavity(p, interval.New(lo, hi), groundstate.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(res.Verdict, res.Witness.G.Lo > 0, res.Witness.U.Lo > 0)
	// Output: disproven true true
}

package certify

import (
	"fmt"
	"math/big"
	"math/rand"
	"os"
	"testing"
)

// TestSoundnessSweep certifies random interval problems whose eigenvalues
// are known rigorously — constant potentials V = c (the eigenvalues shift
// by c), random lengths and positions (scaling), random Dirichlet, Neumann
// or Robin conditions at each end — and demands that every enclosure of
// λ1, λ2, λ3 and the gap contains the truth (the characteristic-equation
// oracle of oracle_test.go). 500 problems by default, 5000 with
// GAPCERT_LONG=1.
func TestSoundnessSweep(t *testing.T) {
	count := 500
	if os.Getenv("GAPCERT_LONG") == "1" {
		count = 5000
	}
	rng := rand.New(rand.NewSource(20261201))
	decimal := func(lo, hi float64, digits int) string {
		return fmt.Sprintf("%.*f", digits, lo+(hi-lo)*rng.Float64())
	}
	misses, narrow := 0, 0
	for i := 0; i < count; i++ {
		a := decimal(-5, 5, 3)
		length := decimal(0.2, 8, 2)
		c := decimal(-20, 20, 2)
		var bcText [2]string
		var ends [2]end
		for s := range ends {
			switch rng.Intn(4) {
			case 0:
				bcText[s], ends[s] = `"dirichlet"`, end{dirichlet: true}
			case 1:
				bcText[s] = `"neumann"`
			default:
				alpha := decimal(0.01, 12, 3)
				bcText[s] = fmt.Sprintf(`{"robin":%q}`, alpha)
				ends[s].alpha = alpha
			}
		}
		src := fmt.Sprintf(`{"domain":{"interval":[%q,"%s+%s"]},"potential":%q,"boundary":[%s,%s],"eigenvalues":3}`,
			a, a, length, c, bcText[0], bcText[1])
		_, cert := certifyText(t, src, 1e-7)
		var truth [3]*big.Float
		for k := range truth {
			truth[k] = constantPotentialEigenvalue(k+1, length, c, ends[0], ends[1])
			got := eigenEnclosure(t, cert, k+1)
			if !bigInside(truth[k], got) {
				misses++
				t.Errorf("problem %d %s: lambda%d enclosure %v misses %s", i, src, k+1, got, truth[k].Text('g', 25))
			}
			if relWidth(got, 1) <= 1e-6 {
				narrow++
			}
		}
		gap, _ := cert.Results.Gap.Interval()
		if g := new(big.Float).SetPrec(oraclePrec).Sub(truth[1], truth[0]); !bigInside(g, gap) {
			misses++
			t.Errorf("problem %d %s: gap enclosure %v misses %s", i, src, gap, g.Text('g', 25))
		}
	}
	t.Logf("%d problems, %d misses, %d of %d eigenvalue enclosures narrower than 1e-6 (relative)", count, misses, narrow, 3*count)
	if narrow < 3*count*99/100 {
		t.Errorf("only %d of %d enclosures reached relative width 1e-6", narrow, 3*count)
	}
}

package cover

import (
	"errors"
	"math/big"
	"math/rand"
	"strings"
	"testing"

	"gapcert/fem/problem"
)

// TestGridTextBoundHoldsOnEveryPoint writes every point lo + j·(hi −
// lo)/N of random grids and demands that gridTextBound bound their texts,
// and exceed the longest by at most 30 characters.
func TestGridTextBoundHoldsOnEveryPoint(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	rat := func() *big.Rat {
		switch rng.Intn(3) {
		case 0:
			return big.NewRat(rng.Int63n(2000)-1000, 1+rng.Int63n(30))
		case 1:
			return new(big.Rat).SetFrac64(rng.Int63n(2000)-1000, 1000) // decimals
		}
		return new(big.Rat).SetFrac(big.NewInt(rng.Int63n(99)-49), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(rng.Intn(30))), nil))
	}
	for trial := 0; trial < 300; trial++ {
		lo, hi := rat(), rat()
		if lo.Cmp(hi) >= 0 {
			continue
		}
		count, depth := 1+rng.Intn(5), rng.Intn(8)
		bound := gridTextBound(lo, hi, count, depth)
		n := int64(count) << depth
		step := new(big.Rat).Sub(hi, lo)
		step.Quo(step, big.NewRat(n, 1))
		longest := 0
		for j := int64(0); j <= n; j++ {
			x := new(big.Rat).Mul(step, big.NewRat(j, 1))
			x.Add(x, lo)
			longest = max(longest, len(problem.RatText(x)))
		}
		if longest > bound || bound > longest+30 {
			t.Errorf("[%s, %s], count %d, depth %d: longest text %d, bound %d", lo.RatString(), hi.RatString(), count, depth, longest, bound)
		}
	}
}

// TestFamilyWhoseCellBoundsCannotBeWrittenIsRefused: with hi = 1/p, p =
// 10^397 + 1, the text "1/p" has 400 characters, the most a problem's
// number may have; a family that bisects [0, 1/p] writes 1/(2p), 1/(4p), …
// with more, and is refused when read (before, the run stopped at the
// first such corner, after certifying the others).
func TestFamilyWhoseCellBoundsCannotBeWrittenIsRefused(t *testing.T) {
	p := new(big.Int).Exp(big.NewInt(10), big.NewInt(397), nil)
	p.Add(p, big.NewInt(1))
	family := func(minCell string) string {
		return `{"template": {"domain": {"interval": ["0", "1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "1/` + p.String() + `"}, "min_cell": "` + minCell + `"}],
		  "claims": ["gap >= 3*pi^2"]}`
	}
	if _, err := ParseFamily([]byte(family("1/" + p.String()))); err != nil {
		t.Fatalf("no bisection: %v", err)
	}
	_, err := ParseFamily([]byte(family("1e-399")))
	var inv *InvalidError
	if !errors.As(err, &inv) || !strings.Contains(err.Error(), "parameters[0].range") || !strings.Contains(err.Error(), "characters") {
		t.Fatalf("bisected: error %v, want an *InvalidError at parameters[0].range about the texts' length", err)
	}
}

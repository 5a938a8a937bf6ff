package rattable

import (
	"math/big"
	"testing"
)

// TestGet: entries are enclosed tightly (1/3 is not a float64, 1/2 is) and
// a table is built once.
func TestGet(t *testing.T) {
	var c Cache
	builds := 0
	build := func() []*big.Rat { builds++; return []*big.Rat{big.NewRat(1, 3), big.NewRat(1, 2)} }
	tab := c.Get(Key{Kind: 'x'}, build)
	third := big.NewRat(1, 3)
	lo, hi := new(big.Rat).SetFloat64(tab.IV[0].Lo), new(big.Rat).SetFloat64(tab.IV[0].Hi)
	if lo.Cmp(third) >= 0 || hi.Cmp(third) <= 0 {
		t.Errorf("1/3 not strictly inside %v", tab.IV[0])
	}
	if !tab.IV[1].IsPoint() || tab.IV[1].Lo != 0.5 || tab.FL[1] != 0.5 {
		t.Errorf("1/2: %v, %v", tab.IV[1], tab.FL[1])
	}
	c.Get(Key{Kind: 'x'}, build)
	if builds != 1 {
		t.Errorf("built %d times", builds)
	}
}

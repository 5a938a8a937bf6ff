// Package rattable caches exact rational tables of finite-element calculus
// (products, integrals, elevations of polynomial bases), each computed once
// in math/big and kept in two forms: the tightest float64 enclosure of
// every entry (for the proving side) and the nearest float64 (for the
// choosing side); and inverts rational matrices exactly (Inverse), as the
// construction of such tables needs.
package rattable

import (
	"math/big"
	"sync"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// Table is an exact rational array with its enclosures and nearest floats.
type Table struct {
	IV []interval.I // IV[i] ∋ the exact entry i (tightest float64 interval)
	FL []float64    // FL[i] is the float64 nearest to entry i (a choice)
}

// Key names a table within one Cache.
type Key struct {
	Kind    byte
	A, B, C int
}

// Cache holds tables by key; the zero value is ready and safe for
// concurrent use.
type Cache struct {
	mu sync.Mutex
	m  map[Key]*Table
}

// Get returns the table for key, building it from exact rationals once.
func (c *Cache) Get(key Key, build func() []*big.Rat) *Table {
	c.mu.Lock()
	defer c.mu.Unlock()
	if t, ok := c.m[key]; ok {
		return t
	}
	rs := build()
	t := &Table{IV: make([]interval.I, len(rs)), FL: make([]float64, len(rs))}
	for i, r := range rs {
		t.IV[i] = decimalio.FromRat(r)
		t.FL[i], _ = r.Float64()
	}
	if c.m == nil {
		c.m = map[Key]*Table{}
	}
	c.m[key] = t
	return t
}

package cover

import (
	"math/big"
	"math/rand"
	"testing"
)

// TestHasInsideIsStrictContainment compares, on every box of the
// bisection trees of a two-parameter family down to min_cell, the index
// of a rerun (hasInside) with its definition: some cell file's box lies
// strictly inside the box. The cell boxes are random boxes of the trees
// and random boxes on the family's grid, which may cross the trees'
// midpoints or the first split's faces.
func TestHasInsideIsStrictContainment(t *testing.T) {
	f := mustFamily(t, `{"template": {"domain": {"interval": ["0", "1"]}, "potential": "a*x^2 + b*x^4", "boundary": "dirichlet"},
	  "parameters": [{"name": "a", "range": {"lo": "0", "hi": "3", "count": 4}, "min_cell": "3/8"},
	                 {"name": "b", "range": {"lo": "-1/2", "hi": "1/2", "count": 2}, "min_cell": "1/8"}]}`)
	var tree []Box
	level := f.Roots()
	for len(level) > 0 {
		var next []Box
		for _, b := range level {
			tree = append(tree, b)
			if j := f.splitParam(b); j >= 0 {
				l, u := b.bisect(j)
				next = append(next, l, u)
			}
		}
		level = next
	}
	rng := rand.New(rand.NewSource(3))
	grid := func(j int, lo, hi *big.Rat, n int64) (*big.Rat, *big.Rat) {
		a, b := rng.Int63n(n), rng.Int63n(n)
		if a > b {
			a, b = b, a
		}
		b++
		step := new(big.Rat).Quo(new(big.Rat).Sub(hi, lo), big.NewRat(n, 1))
		x := new(big.Rat).Add(lo, new(big.Rat).Mul(step, big.NewRat(a, 1)))
		y := new(big.Rat).Add(lo, new(big.Rat).Mul(step, big.NewRat(b, 1)))
		return x, y
	}
	for trial := 0; trial < 20; trial++ {
		e := &engine{f: f, split: map[string]bool{}}
		var cells []Box
		for i := 0; i < 1+rng.Intn(6); i++ {
			if rng.Intn(2) == 0 {
				cells = append(cells, tree[rng.Intn(len(tree))])
				continue
			}
			var c Box
			for j, p := range f.Params {
				lo, hi := grid(j, p.Lo, p.Hi, 24)
				c.Lo, c.Hi = append(c.Lo, lo), append(c.Hi, hi)
			}
			cells = append(cells, c)
		}
		roots := f.Roots()
		for _, c := range cells {
			e.markAncestors(c, roots)
		}
		for _, b := range tree {
			want := false
			for _, c := range cells {
				want = want || c.Inside(b) && !c.Equal(b)
			}
			if got := e.hasInside(b); got != want {
				t.Fatalf("cells %v: hasInside(%s) = %v, want %v", cells, b.Text(f.ParamNames()), got, want)
			}
		}
	}
}

package rattable

import (
	"math/big"
	"runtime"
	"sync"
)

// Inverse returns the inverse of the square matrix a by Gauss–Jordan
// elimination in exact arithmetic, or false if a is singular.
func Inverse(a [][]*big.Rat) ([][]*big.Rat, bool) {
	n := len(a)
	w := make([][]*big.Rat, n)
	for i := range w {
		w[i] = make([]*big.Rat, 2*n)
		for j := 0; j < n; j++ {
			w[i][j] = new(big.Rat).Set(a[i][j])
		}
		for j := n; j < 2*n; j++ {
			w[i][j] = new(big.Rat)
		}
		w[i][n+i].SetInt64(1)
	}
	for c := 0; c < n; c++ {
		// Pivot: among the rows with a nonzero in column c, one with the
		// fewest nonzeros (less fill, smaller numbers; any nonzero pivot is
		// exact).
		piv, best := -1, 0
		for r := c; r < n; r++ {
			if w[r][c].Sign() == 0 {
				continue
			}
			nz := 0
			for _, v := range w[r] {
				if v.Sign() != 0 {
					nz++
				}
			}
			if piv < 0 || nz < best {
				piv, best = r, nz
			}
		}
		if piv < 0 {
			return nil, false
		}
		w[c], w[piv] = w[piv], w[c]
		inv := new(big.Rat).Inv(w[c][c])
		var cols []int // the nonzero columns of the pivot row
		for j := range w[c] {
			if w[c][j].Sign() != 0 {
				w[c][j].Mul(w[c][j], inv)
				cols = append(cols, j)
			}
		}
		// The other rows are independent given the pivot row: split them
		// among the cores (exact arithmetic, so the order does not matter).
		workers := min(runtime.GOMAXPROCS(0), 1+n/64)
		var wg sync.WaitGroup
		for g := range workers {
			wg.Add(1)
			go func() {
				defer wg.Done()
				f, t := new(big.Rat), new(big.Rat)
				for r := g; r < n; r += workers {
					if r == c || w[r][c].Sign() == 0 {
						continue
					}
					f.Set(w[r][c])
					for _, j := range cols {
						w[r][j].Sub(w[r][j], t.Mul(f, w[c][j]))
					}
				}
			}()
		}
		wg.Wait()
	}
	out := make([][]*big.Rat, n)
	for i := range out {
		out[i] = w[i][n:]
	}
	return out, true
}

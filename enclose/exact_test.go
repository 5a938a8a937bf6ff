package enclose

import (
	"math"
	"math/big"

	"gapcert/interval"
)

// exactNegCount returns #neg(A − τB) for float matrices (row-major n×n,
// symmetric) in exact rational arithmetic (math/big), independently of the
// interval code: symmetric Gaussian elimination with a nonzero diagonal
// pivot when there is one, else a 2×2 pivot [[0, c], [c, 0]] (one negative
// and one positive eigenvalue). Sylvester's law of inertia makes the count
// that of every congruent form. ok is false if A − τB is singular.
func exactNegCount(a, b []float64, n int, tau float64) (neg int, ok bool) {
	if math.IsInf(tau, 0) {
		return 0, false
	}
	c := make([][]*big.Rat, n)
	t := new(big.Rat).SetFloat64(tau)
	for i := range c {
		c[i] = make([]*big.Rat, n)
		for j := range c[i] {
			x := new(big.Rat).SetFloat64(a[i*n+j])
			y := new(big.Rat).SetFloat64(b[i*n+j])
			c[i][j] = x.Sub(x, y.Mul(y, t))
		}
	}
	alive := make([]bool, n)
	for i := range alive {
		alive[i] = true
	}
	left := n
	eliminate := func(p int) {
		for j := 0; j < n; j++ {
			if !alive[j] || j == p {
				continue
			}
			l := new(big.Rat).Quo(c[j][p], c[p][p])
			for k := 0; k < n; k++ {
				if alive[k] && k != p {
					c[j][k] = new(big.Rat).Sub(c[j][k], new(big.Rat).Mul(l, c[p][k]))
				}
			}
		}
		alive[p] = false
		left--
	}
	for left > 0 {
		p := -1
		for i := 0; i < n; i++ {
			if alive[i] && c[i][i].Sign() != 0 {
				p = i
				break
			}
		}
		if p >= 0 {
			if c[p][p].Sign() < 0 {
				neg++
			}
			eliminate(p)
			continue
		}
		// All remaining diagonal entries are 0: find c[i][j] ≠ 0.
		q, r := -1, -1
		for i := 0; i < n && q < 0; i++ {
			for j := 0; j < n; j++ {
				if alive[i] && alive[j] && i != j && c[i][j].Sign() != 0 {
					q, r = i, j
					break
				}
			}
		}
		if q < 0 {
			return 0, false // a zero block: singular
		}
		// Congruence by E = I + e_q e_rᵀ (row and column q += row and
		// column r) makes the diagonal entry 2·c[q][r] ≠ 0 and keeps the
		// inertia.
		row := make([]*big.Rat, n)
		for k := 0; k < n; k++ {
			if alive[k] && k != q {
				row[k] = new(big.Rat).Add(c[q][k], c[r][k])
			}
		}
		qq := new(big.Rat).Add(c[q][r], c[q][r])
		qq.Add(qq, c[q][q])
		qq.Add(qq, c[r][r])
		for k := 0; k < n; k++ {
			if row[k] != nil {
				c[q][k], c[k][q] = row[k], row[k]
			}
		}
		c[q][q] = qq
	}
	return neg, true
}

// ratInterval returns the tightest float64 interval containing r.
func ratInterval(r *big.Rat) interval.I {
	f, _ := r.Float64()
	switch new(big.Rat).SetFloat64(f).Cmp(r) {
	case -1:
		return interval.I{Lo: f, Hi: math.Nextafter(f, math.Inf(1))}
	case 1:
		return interval.I{Lo: math.Nextafter(f, math.Inf(-1)), Hi: f}
	}
	return interval.Point(f)
}

package sparse

import (
	"math/big"
	"testing"
)

// TestResidualBoundExact compares the residual bound r with the exact
// max_i Σ_j |R_ij|, R = Pᵀ(K − σM)P − L D Lᵀ, computed in rational
// arithmetic (math/big.Rat, exact) from the same float factors: r must be
// an upper bound and within a small factor of it.
func TestResidualBoundExact(t *testing.T) {
	for _, tc := range []struct {
		name  string
		k, m  *Sym
		sigma float64
	}{
		{"random n=40", randomSPD(40, 5, 21), randomSPD(40, 3, 22), 0.3},
		{"random n=60 indefinite", randomSPD(60, 6, 23), identity(60), 2.5},
		{"grid5 m=7", grid5(7), identity(49), 500},
	} {
		c := NewCounter(toISym(tc.k), toISym(tc.m))
		if _, _, ok := c.CountBelow(1, tc.sigma); !ok {
			t.Fatalf("%s: factorization failed", tc.name)
		}
		r := residualBound(&c.f, c.rows, c.kLow, c.shiftedM, &residualWork{})
		n := tc.k.N()
		perm := c.sym.perm
		// Exact L D Lᵀ and exact K − σM (products of floats are exact
		// rationals).
		rat := func(x float64) *big.Rat { return new(big.Rat).SetFloat64(x) }
		l := make([][]*big.Rat, n)
		for i := range l {
			l[i] = make([]*big.Rat, n)
			for j := range l[i] {
				l[i][j] = new(big.Rat)
			}
			l[i][i].SetInt64(1)
		}
		for k := 0; k < n; k++ {
			for q := c.f.Sym.colPtr[k]; q < c.f.Sym.colPtr[k+1]; q++ {
				l[c.f.Row[q]][k] = rat(c.f.Val[q])
			}
		}
		exact := new(big.Rat)
		tmp := new(big.Rat)
		for i := 0; i < n; i++ {
			rowSum := new(big.Rat)
			for j := 0; j < n; j++ {
				e := rat(tc.k.At(perm[i], perm[j]))
				e.Sub(e, tmp.Mul(rat(tc.sigma), rat(tc.m.At(perm[i], perm[j]))))
				for q := 0; q <= min(i, j); q++ {
					if l[i][q].Sign() != 0 && l[j][q].Sign() != 0 {
						tmp.Mul(l[i][q], rat(c.f.D[q]))
						tmp.Mul(tmp, l[j][q])
						e.Sub(e, tmp)
					}
				}
				rowSum.Add(rowSum, e.Abs(e))
			}
			if rowSum.Cmp(exact) > 0 {
				exact.Set(rowSum)
			}
		}
		ex, _ := exact.Float64()
		if rat(r).Cmp(exact) < 0 {
			t.Errorf("%s: r = %g below the exact %g", tc.name, r, ex)
		}
		// The one-ulp steps widen each operation by about 2⁻⁵² relative;
		// the bound should stay within a modest factor of the exact value
		// plus the rounding scale.
		scale := infNorm(shifted(tc.k, tc.m, tc.sigma))
		if r > 64*ex+1e-14*scale {
			t.Errorf("%s: r = %g, exact %g (scale %g): too wide", tc.name, r, ex, scale)
		}
		t.Logf("%s: r = %.3g, exact %.3g, ratio %.1f", tc.name, r, ex, r/ex)
	}
}

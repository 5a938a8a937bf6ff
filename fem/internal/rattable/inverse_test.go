package rattable

import (
	"math/big"
	"testing"
)

// TestInverseHilbert inverts the 4×4 Hilbert matrix H_ij = 1/(i + j + 1)
// exactly: its inverse has the integer entries (−1)^(i+j) (i + j + 1)
// C(n+i, n−j−1) C(n+j, n−i−1) C(i+j, i)² (M.-D. Choi, Tricks or treats
// with the Hilbert matrix, Amer. Math. Monthly 90 (1983) 301–312; formula
// recalled from memory, so the test also checks H·H⁻¹ = I exactly).
func TestInverseHilbert(t *testing.T) {
	const n = 4
	h := make([][]*big.Rat, n)
	for i := range h {
		h[i] = make([]*big.Rat, n)
		for j := range h[i] {
			h[i][j] = big.NewRat(1, int64(i+j+1))
		}
	}
	inv, ok := Inverse(h)
	if !ok {
		t.Fatal("the Hilbert matrix reported singular")
	}
	binom := func(a, b int) *big.Int { return new(big.Int).Binomial(int64(a), int64(b)) }
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			want := big.NewInt(int64(i + j + 1))
			want.Mul(want, binom(n+i, n-j-1))
			want.Mul(want, binom(n+j, n-i-1))
			c := binom(i+j, i)
			want.Mul(want, c.Mul(c, c))
			if (i+j)%2 == 1 {
				want.Neg(want)
			}
			if inv[i][j].Cmp(new(big.Rat).SetInt(want)) != 0 {
				t.Errorf("inverse entry (%d, %d) is %s, want %s", i, j, inv[i][j].RatString(), want)
			}
			sum := new(big.Rat)
			for k := 0; k < n; k++ {
				sum.Add(sum, new(big.Rat).Mul(h[i][k], inv[k][j]))
			}
			if want := big.NewRat(int64(boolInt(i == j)), 1); sum.Cmp(want) != 0 {
				t.Errorf("(H·H⁻¹)_(%d,%d) = %s", i, j, sum.RatString())
			}
		}
	}
	// The 4×4 inverse's corner entries are 16 and −140 (common practice:
	// tabulated with the Hilbert matrix).
	if inv[0][0].Cmp(big.NewRat(16, 1)) != 0 || inv[0][3].Cmp(big.NewRat(-140, 1)) != 0 {
		t.Errorf("corner entries %s and %s, want 16 and -140", inv[0][0].RatString(), inv[0][3].RatString())
	}
}

// TestInverseSingular: a matrix with two equal rows has no inverse.
func TestInverseSingular(t *testing.T) {
	a := [][]*big.Rat{
		{big.NewRat(1, 2), big.NewRat(1, 3), big.NewRat(2, 1)},
		{big.NewRat(1, 5), big.NewRat(0, 1), big.NewRat(7, 3)},
		{big.NewRat(1, 2), big.NewRat(1, 3), big.NewRat(2, 1)},
	}
	if _, ok := Inverse(a); ok {
		t.Error("a matrix with two equal rows reported invertible")
	}
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

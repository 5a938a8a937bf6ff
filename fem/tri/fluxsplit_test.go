package tri

import (
	"math"
	"math/big"
	"testing"
)

// The divergence-adapted basis of rtSplit: for k = 0..5 the divergence of
// every Z column is exactly zero (computed in math/big from the stored
// floats), and Y is a right inverse of the divergence to rounding
// (|divT·Y − I| ≤ 1e-9 entrywise relative to the row's Σ|divT||Y|, which
// the rounding of Y to floats bounds by a few ulps).
func TestRTDivSplit(t *testing.T) {
	for k := 0; k <= 5; k++ {
		ref := rtReference(k)
		s := rtDivSplit(k)
		nd, nk := ref.ndof, s.nk
		if nk != dim(k) {
			t.Fatalf("k=%d: %d divergence coordinates, want dim P_k = %d", k, nk, dim(k))
		}
		for b := 0; b < nk; b++ {
			for c := 0; c < nd; c++ {
				exact := new(big.Rat)
				mag := 0.0
				for l := 0; l < nd; l++ {
					a, z := ref.divT[b*nd+l], s.b[l*nd+c]
					if a == 0 || z == 0 {
						continue
					}
					exact.Add(exact, new(big.Rat).Mul(new(big.Rat).SetFloat64(a), new(big.Rat).SetFloat64(z)))
					mag += math.Abs(a * z)
				}
				if c >= nk {
					if exact.Sign() != 0 {
						t.Fatalf("k=%d: divergence of kernel column %d is %v in row %d, not 0", k, c-nk, exact, b)
					}
					continue
				}
				v, _ := exact.Float64()
				if c == b {
					v--
				}
				if math.Abs(v) > 1e-9*math.Max(mag, 1) {
					t.Errorf("k=%d: (divT·Y − I)[%d][%d] = %g (terms up to %g)", k, b, c, v, mag)
				}
			}
		}
	}
}

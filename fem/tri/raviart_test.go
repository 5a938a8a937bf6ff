package tri

import (
	"math/big"
	"testing"
)

// The reference Raviart–Thomas basis must be dual to its degrees of
// freedom, its normal traces must lie in P_k (so that the edge DOFs fix
// them), and it must satisfy the divergence theorem
// ∫_T̂ div σ̂ = Σ_i ∫_0^1 g_i(t) dt (common practice: the defining
// properties of RT_k, Raviart–Thomas 1977). All checks are exact.
func TestRTReferenceBasis(t *testing.T) {
	for k := 0; k <= 4; k++ {
		comp, div := rtBasisRat(k)
		n := k + 1
		nn, nk := dim(n), dim(k)
		ndof := (k + 1) * (k + 3)
		if len(comp) != ndof*2*nn || len(div) != ndof*nk {
			t.Fatalf("k=%d: table sizes %d, %d", k, len(comp), len(div))
		}
		intB := gramRat(0, k) // ∫ B^k_β (the degree-0 basis is 1)
		for l := 0; l < ndof; l++ {
			s := ratPoly2{comp[(2*l)*nn : (2*l+1)*nn], comp[(2*l+1)*nn : (2*l+2)*nn]}
			f := rtFunctionals(k, s)
			for m, v := range f {
				want := int64(0)
				if m == l {
					want = 1
				}
				if v.Cmp(big.NewRat(want, 1)) != 0 {
					t.Fatalf("k=%d: DOF %d of basis function %d is %v, want %d", k, m, l, v, want)
				}
			}
			flux := new(big.Rat)
			for i := 0; i < 3; i++ {
				full := edgeFlux(s, n, i)
				red := reduceDegree(full, n)
				// Elevating the reduced coefficients must give back the trace.
				for j := 0; j <= n; j++ {
					e := new(big.Rat)
					if j > 0 {
						e.Add(e, new(big.Rat).Mul(big.NewRat(int64(j), int64(n)), red[j-1]))
					}
					if j < n {
						e.Add(e, new(big.Rat).Mul(big.NewRat(int64(n-j), int64(n)), red[j]))
					}
					if e.Cmp(full[j]) != 0 {
						t.Fatalf("k=%d: basis %d has a normal trace of degree > k on edge %d", k, l, i)
					}
				}
				for _, c := range full { // ∫_0^1 B^n_j = 1/(n+1)
					flux.Add(flux, new(big.Rat).Quo(c, big.NewRat(int64(n+1), 1)))
				}
			}
			vol := new(big.Rat)
			for b := 0; b < nk; b++ {
				vol.Add(vol, new(big.Rat).Mul(div[l*nk+b], intB[b]))
			}
			if vol.Cmp(flux) != 0 {
				t.Fatalf("k=%d: basis %d: ∫div = %v but boundary flux = %v", k, l, vol, flux)
			}
		}
	}
}

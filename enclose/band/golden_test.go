package band

import (
	"math"
	"testing"

	"gapcert/enclose/solvertest"
	"gapcert/interval"
)

// doubledT returns the direct sum of two copies of (T, 6I − T) of size
// half each: every eigenvalue is double.
func doubledT(half int) (k, m *Sym) {
	n := 2 * half
	k, m = NewSym(n, 1), NewSym(n, 1)
	for i := 0; i < n; i++ {
		k.Data[2*i], m.Data[2*i] = 2, 4
		if i > 0 && i != half {
			k.Data[2*i+1], m.Data[2*i+1] = -1, 1
		}
	}
	return k, m
}

// TestLowestEigsBits pins the exact floating-point output of LowestEigs on
// fixed pencils: the eigenvectors and shifts chosen from it feed the
// committed certificates, so a change of any bit is a change of results.
// The digests were recorded from the solver before its iteration was
// shared with the general sparse storage.
func TestLowestEigsBits(t *testing.T) {
	for _, tc := range []struct {
		name  string
		k, m  *Sym
		count int
		want  string
	}{
		{"dense n=150", powT(150, 1), massT(150), 4, "2baeecaf6713b3e3bfef07fcea34313366176049941b1ab39a82a87ea0025fbd"},
		{"T n=1000", powT(1000, 1), massT(1000), 2, "dd90b2e7b4cbde716990e5ab42d315dce1c292e435f01a0c8c2b40c09d439f97"},
		{"T² n=3000", powT(3000, 2), massT(3000), 5, "51495191828ed20655ce678ab44c27bfa9ee89d57dd049f9a4aa8d07bfc58cab"},
		{"T − M n=2000 (indefinite K)", shiftedK(powT(2000, 1), massT(2000), 1), massT(2000), 3, "2ca9c22cc1c0c39be5edf6c2d369488db747a9ecafcbf0681ad71ea981e92ae4"},
		{"T ⊕ T n=1400 (double)", nil, nil, 4, "d022222d7adc8471bd800403aac46557ebb6f49c841a832c5f3df1495399f4cd"},
	} {
		if tc.k == nil {
			tc.k, tc.m = doubledT(700)
		}
		vals, vecs, err := LowestEigs(tc.k, tc.m, tc.count)
		solvertest.CheckDigest(t, tc.name, tc.want, vals, vecs, err)
	}
}

// TestCountBelowBits pins the exact count and corrected shift σ' of
// CountBelow (a verified quantity: σ' enters the certificates).
func TestCountBelowBits(t *testing.T) {
	k, m := benchPencil(2000, 2)
	thick := func(s *ISym, rel float64) *ISym {
		t := NewISym(s.N, s.W)
		for q, x := range s.Data {
			r := math.Abs(x.Mid()) * rel
			t.Data[q] = interval.I{Lo: x.Lo - r, Hi: x.Hi + r}
		}
		return t
	}
	var got []float64
	for _, p := range []struct{ k, m *ISym }{{k, m}, {thick(k, 1e-12), thick(m, 1e-12)}} {
		for _, sigma := range []float64{1e-9, 1e-5, 0.001, 0.5, 2.5} {
			n, sp, ok := CountBelow(p.k, p.m, 1.5, sigma)
			if !ok {
				t.Fatalf("σ = %g: factorization failed", sigma)
			}
			got = append(got, float64(n), sp)
		}
	}
	const recorded = "e505187655ba45748e866c405a8efaa037aa8850fa2c03094194028c46039ee1"
	if d := solvertest.Digest(got, nil); d != recorded {
		t.Errorf("digest %s, recorded %s (values %v)", d, recorded, got)
	}
}

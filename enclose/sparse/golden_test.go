package sparse

import (
	"math"
	"testing"

	"gapcert/enclose/solvertest"
	"gapcert/interval"
)

// TestLowestEigsBits pins the exact floating-point output of LowestEigs on
// fixed pencils: the eigenvectors and shifts chosen from it feed the
// committed certificates, so a change of any bit is a change of results.
// The digests were recorded from the solver before its iteration was
// shared with the banded storage.
func TestLowestEigsBits(t *testing.T) {
	k20, m20 := p1Square(20)
	k30, m30 := p1Square(30)
	for _, tc := range []struct {
		name  string
		k, m  *Sym
		count int
		want  string
	}{
		{"grid5 m=10 dense", grid5(10), identity(100), 5, "c0dfe5cb7a64191e86f83deaa9673f81ca858f236ce1695b537406dde2d8d151"},
		{"grid5 m=40", grid5(40), identity(1600), 8, "6c0a158109f64deea85d26c3669a8a44082e37c31266bfffef635b54469142e6"},
		{"3 × grid5 m=25", threeCopies(grid5(25)), identity(3 * 625), 9, "938db543523012ada955f4d04866236357cc3769ea076a5b6a2182671ffd4da7"},
		{"P1 m=20", k20, m20, 6, "c400c44cd6188a350c23d84c36e739070df7afca630c972a9d1bfc6705a2d833"},
		{"P1 m=20 shifted −30 (indefinite K)", shifted(k20, m20, 30), m20, 4, "eaf98938276078d5ec2ae859e0fa0ec1a5e20efb4c58e781ab170f207280cd77"},
		{"P1 m=30", k30, m30, 10, "5fc27466ceb85c7fcc967cae3e0b412a5329304c0444b96c1e3ef486fa87e5f8"},
	} {
		vals, vecs, err := LowestEigs(tc.k, tc.m, tc.count)
		solvertest.CheckDigest(t, tc.name, tc.want, vals, vecs, err)
	}
}

// TestCountBelowBits pins the exact count and corrected shift σ' of
// CountBelow (a verified quantity: σ' enters the certificates), for point
// and thick pencils.
func TestCountBelowBits(t *testing.T) {
	k, m := benchGrid(30)
	thick := func(s *ISym, rel float64) *ISym {
		v := make([]interval.I, len(s.Val))
		for q, x := range s.Val {
			r := math.Abs(x.Mid()) * rel
			v[q] = interval.I{Lo: x.Lo - r, Hi: x.Hi + r}
		}
		return &ISym{Pat: s.Pat, Val: v}
	}
	var got []float64
	for _, p := range []struct{ k, m *ISym }{{k, m}, {thick(k, 1e-12), thick(m, 1e-12)}} {
		c := NewCounter(p.k, p.m)
		for _, sigma := range []float64{1, 19.5, 100, 250} {
			n, sp, ok := c.CountBelow(1e-4, sigma)
			if !ok {
				t.Fatalf("σ = %g: factorization failed", sigma)
			}
			got = append(got, float64(n), sp)
		}
	}
	const recorded = "97838d2b88bad62557f3f76af1c329d4ce2479d8378d7fdd95e3741e18ddb1ec"
	if d := solvertest.Digest(got, nil); d != recorded {
		t.Errorf("digest %s, recorded %s (values %v)", d, recorded, got)
	}
}

package tet

import (
	"errors"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/interval"
)

// The Bernstein models of a non-polynomial V = 1/(2 + x) − y z³ on the
// tetrahedra of a Kuhn mesh contain the exact value at random points
// (evaluated in math/big), and their remainders shrink like h^(q+1)
// under refinement (narrowness: order 3, h halved, remainder ≥ 10 times
// smaller).
func TestPotentialModelsContainExactValues(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 14))
	ix := multiIndex(4, 3)
	var prevRem float64
	for _, n := range []int{2, 4} {
		m := unitCube(t, n)
		v, err := NewPotential(m, mustExpr(t, "1/(2 + x) - y*z^3"), 3)
		if err != nil {
			t.Fatal(err)
		}
		maxRem := 0.0
		for tt := 0; tt < m.NumTets(); tt++ {
			bern, rem := v.Model(tt)
			maxRem = max(maxRem, rem.Wid())
			vert := m.Vertices(tt)
			for k := 0; k < 5; k++ {
				l := [4]float64{rng.Float64(), rng.Float64(), rng.Float64(), rng.Float64()}
				s := l[0] + l[1] + l[2] + l[3]
				lam := make([]*big.Rat, 4)
				tot := new(big.Rat)
				for i := 0; i < 3; i++ {
					lam[i+1] = new(big.Rat).SetFloat64(l[i+1] / s)
					tot.Add(tot, lam[i+1])
				}
				lam[0] = new(big.Rat).Sub(big.NewRat(1, 1), tot)
				var x [3]*big.Rat
				for c := 0; c < 3; c++ {
					x[c] = new(big.Rat)
					for i := 0; i < 4; i++ {
						x[c].Add(x[c], new(big.Rat).Mul(lam[i], new(big.Rat).SetFloat64(vert[i][c].Mid())))
					}
				}
				exact := new(big.Rat).Inv(new(big.Rat).Add(big.NewRat(2, 1), x[0]))
				z3 := new(big.Rat).Mul(x[2], new(big.Rat).Mul(x[2], x[2]))
				exact.Sub(exact, new(big.Rat).Mul(x[1], z3))
				// Σ b_α B_α(λ) + R, in interval arithmetic from enclosures of λ.
				var li [4]interval.I
				for i := range li {
					f, _ := lam[i].Float64()
					li[i] = interval.I{Lo: f, Hi: f}
					if new(big.Rat).SetFloat64(f).Cmp(lam[i]) != 0 {
						li[i] = interval.I{Lo: math.Nextafter(f, math.Inf(-1)), Hi: math.Nextafter(f, math.Inf(1))}
					}
				}
				var val interval.I
				for a, al := range ix.alpha {
					bv := interval.Point(float64(multinom(al).Int64()))
					for i := 0; i < 4; i++ {
						bv = bv.Mul(li[i].PowInt(al[i]))
					}
					val = val.Add(bern[a].Mul(bv))
				}
				val = val.Add(rem)
				if !ratIn(val, exact) {
					t.Fatalf("n = %d, tetrahedron %d: model value %v misses the exact value", n, tt, val)
				}
				if !ratIn(v.Range(tt), exact) {
					t.Fatalf("range %v misses the exact value", v.Range(tt))
				}
			}
		}
		t.Logf("n = %d: largest remainder width %.3g", n, maxRem)
		if prevRem != 0 && maxRem > prevRem/10 {
			t.Errorf("remainder %g at n = %d not 10 times below %g", maxRem, n, prevRem)
		}
		prevRem = maxRem
	}
}

// A kink of abs inside tetrahedra (|x − 1/2| on the Kuhn mesh of 3³
// subcubes, whose planes miss x = 1/2) falls back to the range model,
// which still contains the values at the vertices; InverseShifted refuses
// a shift with V + γ ≤ 0 somewhere (a *SignError) and models 1/(V + γ)
// otherwise.
func TestPotentialKinkAndInverseShifted(t *testing.T) {
	m := unitCube(t, 3)
	v, err := NewPotential(m, mustExpr(t, "abs(x - 1/2)"), 2)
	if err != nil {
		t.Fatal(err)
	}
	if v.Exact() {
		t.Error("a kink inside tetrahedra reported an exact model")
	}
	for tt := 0; tt < m.NumTets(); tt++ {
		for _, p := range m.Vertices(tt) {
			x := new(big.Rat).SetFloat64(p[0].Mid()) // within an ulp of k/3
			want := new(big.Rat).Abs(new(big.Rat).Sub(x, big.NewRat(1, 2)))
			if r := v.Range(tt); !ratIn(r.Add(interval.I{Lo: -1e-15, Hi: 1e-15}), want) {
				t.Fatalf("range %v of tetrahedron %d misses |x − 1/2| at a vertex", r, tt)
			}
		}
	}
	var se *SignError
	if _, err := v.InverseShifted(interval.Point(0), 2); err == nil || !errors.As(err, &se) {
		t.Errorf("V + 0 touches 0 at x = 1/2: error %v, want a *SignError", err)
	}
	w, err := v.InverseShifted(interval.Point(1), 2)
	if err != nil {
		t.Fatal(err)
	}
	for tt := 0; tt < m.NumTets(); tt++ {
		if r := w.Range(tt); r.Lo < 1/1.5-1e-12 || r.Hi > 1+1e-12 || r.Lo > r.Hi {
			t.Fatalf("range of 1/(|x − 1/2| + 1) on tetrahedron %d is %v, outside [2/3, 1]", tt, r)
		}
	}
}

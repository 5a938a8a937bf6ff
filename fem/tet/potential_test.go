package tet

import (
	"context"
	"errors"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/certs/certify"
	"gapcert/fem/boundary"
	"gapcert/fem/problem"
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

// certified1D returns the enclosures of the lowest count eigenvalues of a
// problem on (0, 1) certified by the 1D certifier (package certs/certify),
// for potential expr and the same condition at both ends.
func certified1D(t *testing.T, expr, bc string, count int) []interval.I {
	t.Helper()
	src := `{"name": "factor on (0, 1)", "domain": {"interval": ["0", "1"]}, "potential": "` + expr +
		`", "boundary": ` + bc + `, "eigenvalues": ` + string(rune('0'+count)) + `, "target": {"relative_width": "1e-10"}}`
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatal(err)
	}
	c, err := certify.Certify(context.Background(), p, certify.Options{})
	if err != nil {
		t.Fatal(err)
	}
	out := make([]interval.I, count)
	for k := range out {
		out[k], err = c.Results.Eigenvalues[k].Bound().Interval()
		if err != nil {
			t.Fatal(err)
		}
	}
	return out
}

// −Δ + x² + y² + z² on the unit cube separates: its eigenvalues are sums
// μ_a + μ_b + μ_c of the eigenvalues μ of −u″ + x²u on (0, 1) with the
// same condition (certified by the 1D method of this repository), so
// λ1 = 3μ_1 and λ2 = λ3 = λ4 = 2μ_1 + μ_2. Ritz upper bounds of P_4 on
// the Kuhn mesh with 4³ subcubes contain them (Dirichlet and Robin with
// α = 1 on every face) and are within 1e-4 (relative); the CR stage-A
// bounds of λ1, λ2 lie below them and λ1's within a factor 2.
func TestRitzUnitCubeWithPotentialAgainstOneDimensionalSums(t *testing.T) {
	robin := boundary.Condition{Kind: boundary.Robin, Alpha: interval.Point(1)}
	for _, c := range []struct {
		name, bc1D string
		cond       boundary.Condition
	}{{"dirichlet", `"dirichlet"`, dirichlet}, {"robin", `{"robin": "1"}`, robin}} {
		mu := certified1D(t, "x^2", c.bc1D, 2)
		exact := []interval.I{mu[0].MulF(3), mu[0].MulF(2).Add(mu[1])}
		m := unitCube(t, 4)
		v, err := NewPotential(m, mustExpr(t, "x^2 + y^2 + z^2"), 2)
		if err != nil {
			t.Fatal(err)
		}
		if !v.Exact() {
			t.Fatal("a quadratic potential has a remainder at order 2")
		}
		r := ritzBounds(t, NewLagrange(m, 4, allBC(6, c.cond)), v, 0, 4)
		for k, e := range []interval.I{exact[0], exact[1], exact[1], exact[1]} {
			if r[k].Hi < e.Lo {
				t.Fatalf("%s: Ritz bound %v of λ_%d below the 1D sum %v", c.name, r[k], k+1, e)
			}
			if rel := relErr(r[k].Hi, e); rel > 1e-4 {
				t.Errorf("%s: Ritz bound %v of λ_%d: relative error %g above 1e-4", c.name, r[k].Hi, k+1, rel)
			}
			t.Logf("%s: λ_%d ∈ %v (1D sums), Ritz %.10g", c.name, k+1, e, r[k].Hi)
		}
		// The CR lower bounds with the form shift c = min(V + γ) = 0 here.
		lo := stageALower(t, unitCube(t, 4), "x^2 + y^2 + z^2", c.cond, 0, 2)
		if lo[0] > exact[0].Hi || lo[1] > exact[1].Hi || lo[0] < exact[0].Lo/2 {
			t.Errorf("stage-A bounds %v, exact %v", lo, exact)
		}
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

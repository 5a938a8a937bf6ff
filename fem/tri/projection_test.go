package tri

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"

	"gapcert/enclose/sparse"
	"gapcert/interval"
)

// f(x) = x/(1 + C²x) with the upper end of C (the projection bound).
func projectionBound(lam float64, c interval.I) float64 {
	return lam / (1 + c.Hi*c.Hi*lam)
}

// lowest returns the smallest generalized eigenvalue of the midpoint
// matrices (sparse.LowestEigs, a float computation outside this package).
func lowest(t *testing.T, k, m *sparse.ISym) float64 {
	t.Helper()
	vals, _, err := sparse.LowestEigs(k.Mid(), m.Mid(), 1)
	if err != nil {
		t.Fatal(err)
	}
	return vals[0]
}

// CR on the unit square, Dirichlet, V = 0: the projection bound
// λ_h/(1 + C²λ_h) must lie below λ_1 = 2π² (separation of variables,
// common practice), λ_h → 2π² like h², and the bound approaches 2π².
func TestCRUnitSquareDirichlet(t *testing.T) {
	prevErr := math.NaN()
	for lev := 1; lev <= 4; lev++ {
		m := unitSquare(t, lev)
		s := NewCR(m, allBC(4, dirichlet))
		v := mustPotential(t, m, "0", 1)
		k, mass, mMin, err := s.Matrices(v, interval.I{})
		if err != nil {
			t.Fatal(err)
		}
		lam := lowest(t, k, mass)
		c := s.ProjectionConstant()
		lo := projectionBound(lam, c)
		if !(lo <= twoPi2.Lo) {
			t.Errorf("level %d: projection bound %v above 2π²", lev, lo)
		}
		e := math.Abs(lam - twoPi2.Mid())
		t.Logf("level %d: n=%d λ_h=%.6f bound=%.6f C=%.4f mMin=%.3e", lev, s.N(), lam, lo, c.Hi, mMin)
		if !math.IsNaN(prevErr) {
			if r := math.Log2(prevErr / e); r < 1.6 {
				t.Errorf("level %d: |λ_h − 2π²| rate %.2f, want about 2", lev, r)
			}
		}
		prevErr = e
		// The constant: Liu's 0.1893 h with h = √2·2^-lev (the diagonal,
		// the longest edge of every triangle).
		h := math.Sqrt2 * math.Ldexp(1, -lev)
		if want := 0.1893 * h; math.Abs(c.Hi-want) > 1e-12*want {
			t.Errorf("level %d: C = %v, want %g", lev, c, want)
		}
	}
}

// CR mass matrix is diagonal with Σ_(T∋e) |T|/3 (common practice: the
// edge-midpoint rule is exact for P2); verified on a uniform mesh of the
// unit square, where every triangle has area 2^(−2lev−1).
func TestCRMassDiagonal(t *testing.T) {
	m := unitSquare(t, 2)
	s := NewCR(m, allBC(4, neumann))
	v := mustPotential(t, m, "0", 1)
	_, mass, mMin, err := s.Matrices(v, interval.I{})
	if err != nil {
		t.Fatal(err)
	}
	area := 1.0 / 32
	edges, _ := m.Edges()
	count := make([]int, len(edges))
	for _, te := range s.triEdges {
		for _, e := range te {
			count[e]++
		}
	}
	for e, c := range count {
		i := s.edgeDof[e]
		want := float64(c) * area / 3
		if got := mass.At(i, i); !got.Contains(want) || got.Wid() > 1e-17 {
			t.Errorf("edge %d: mass %v, want %g", e, got, want)
		}
		for j := 0; j < s.N(); j++ {
			if j != i && mass.At(i, j) != (interval.I{}) {
				t.Errorf("off-diagonal mass (%d, %d) = %v", i, j, mass.At(i, j))
			}
		}
	}
	if want := area / 3; !(mMin <= want && mMin > 0.999*want) {
		t.Errorf("mMin = %g, want just below %g", mMin, want)
	}
}

// The ECR basis against an independent float construction: the dual basis
// of {1, x, y, x² + y²} for the DOFs (edge means by 3-point Gauss–Legendre,
// exact for these quadratics; element mean by the edge-midpoint rule,
// exact for P2 — common practice), solved with gonum, evaluated at points
// of a scalene triangle and compared with the Bernstein form of ecrBasis.
func TestECRBasisMatchesDualBasis(t *testing.T) {
	v := [3][2]float64{{0, 0}, {3, 0.5}, {1, 2}}
	var vi [3][2]interval.I
	for i := range v {
		vi[i] = pt(v[i][0], v[i][1])
	}
	phi, ok := ecrBasis(vi)
	if !ok {
		t.Fatal("basis not verified")
	}
	mono := func(k int, x, y float64) float64 {
		return [4]float64{1, x, y, x*x + y*y}[k]
	}
	gl := [3][2]float64{{0.5 - 0.5*math.Sqrt(0.6), 5.0 / 18}, {0.5, 8.0 / 18}, {0.5 + 0.5*math.Sqrt(0.6), 5.0 / 18}}
	d := mat.NewDense(4, 4, nil)
	for k := 0; k < 4; k++ {
		for e := 0; e < 3; e++ {
			a, b := v[(e+1)%3], v[(e+2)%3]
			s := 0.0
			for _, q := range gl {
				s += q[1] * mono(k, a[0]+q[0]*(b[0]-a[0]), a[1]+q[0]*(b[1]-a[1]))
			}
			d.Set(e, k, s)
		}
		s := 0.0
		for e := 0; e < 3; e++ {
			a, b := v[(e+1)%3], v[(e+2)%3]
			s += mono(k, (a[0]+b[0])/2, (a[1]+b[1])/2) / 3
		}
		d.Set(3, k, s)
	}
	var inv mat.Dense
	if err := inv.Inverse(d); err != nil {
		t.Fatal(err)
	}
	ix := multiIndex(2)
	for _, l := range [][3]float64{{1, 0, 0}, {0.2, 0.3, 0.5}, {0.6, 0.1, 0.3}, {0, 0.5, 0.5}, {1.0 / 3, 1.0 / 3, 1.0 / 3}} {
		x := l[0]*v[0][0] + l[1]*v[1][0] + l[2]*v[2][0]
		y := l[0]*v[0][1] + l[1]*v[1][1] + l[2]*v[2][1]
		for i := 0; i < 4; i++ {
			want := 0.0
			for k := 0; k < 4; k++ {
				want += inv.At(k, i) * mono(k, x, y)
			}
			got := 0.0
			for r, a := range ix.alpha {
				b := float64(multinom(a).Int64())
				for j := 0; j < 3; j++ {
					b *= math.Pow(l[j], float64(a[j]))
				}
				got += phi[i][r].Mid() * b
			}
			if math.Abs(got-want) > 1e-12 {
				t.Errorf("Φ_%d at λ=%v: %g, dual basis %g", i, l, got, want)
			}
		}
		for i := range phi {
			for r := range phi[i] {
				if w := phi[i][r].Wid(); w > 1e-14*math.Max(1, phi[i][r].Mag()) {
					t.Errorf("Φ_%d coefficient %d too wide: %v", i, r, phi[i][r])
				}
			}
		}
	}
}

// ECR on the unit square with Dirichlet conditions: for V = 0 the bound
// lies below 2π² (common practice) and approaches it; for V = x² + y² it
// lies below a verified Ritz upper bound of λ_1 (P3, min–max), and the
// fully verified chain (sparse.CountBelow for λ_h, then the projection
// bound) agrees with the float estimate.
func TestECRUnitSquare(t *testing.T) {
	cases := []struct {
		v     string
		upper func(t *testing.T, lev int) float64
	}{
		{"0", func(*testing.T, int) float64 { return twoPi2.Lo }},
		{"x^2 + y^2", ritzUpperHarmonic},
	}
	for _, c := range cases {
		prevGap := math.NaN()
		for lev := 1; lev <= 4; lev++ {
			m := unitSquare(t, lev)
			s := NewECR(m, allBC(4, dirichlet))
			v := mustPotential(t, m, c.v, 2)
			k, mass, mMin, err := s.Matrices(v, interval.I{})
			if err != nil {
				t.Fatal(err)
			}
			lam := lowest(t, k, mass)
			cst := s.ProjectionConstant()
			bound := projectionBound(lam, cst)
			n, sigmaPrime, ok := sparse.CountBelow(k, mass, mMin, lam*(1-1e-6))
			if !ok || n != 0 {
				t.Fatalf("V=%s level %d: verified count failed (n=%d ok=%v)", c.v, lev, n, ok)
			}
			verified := projectionBound(sigmaPrime, cst)
			up := c.upper(t, lev)
			if !(verified <= bound && bound <= up) {
				t.Errorf("V=%s level %d: verified %g, float bound %g, upper %g out of order", c.v, lev, verified, bound, up)
			}
			gap := up - verified
			t.Logf("V=%s level %d: n=%d λ_h=%.6f verified lower %.6f upper %.6f", c.v, lev, s.N(), lam, verified, up)
			if !math.IsNaN(prevGap) && c.v == "0" && gap > 0.45*prevGap {
				t.Errorf("V=%s level %d: gap %g did not shrink like h² (ratio → 1/4) (previous %g)", c.v, lev, gap, prevGap)
			}
			prevGap = gap
		}
	}
}

// ritzUpperHarmonic returns a verified upper bound of λ_1 of −Δ + x² + y²
// on the unit square (Dirichlet): the upper end of the Rayleigh quotient
// enclosure of the approximate P3 eigenvector on the level-2 mesh.
func ritzUpperHarmonic(t *testing.T, _ int) float64 {
	m := unitSquare(t, 2)
	s := NewLagrange(m, 3, allBC(4, dirichlet))
	v := mustPotential(t, m, "x^2 + y^2", 2)
	k, mm := s.AssembleApprox(v, 0)
	_, vecs, err := sparse.LowestEigs(k, mm, 1)
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := s.RitzMatrices(vecs, v, interval.I{})
	if err != nil {
		t.Fatal(err)
	}
	return quotient(a0, a1).Hi
}

package line

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"gapcert/enclose/band"
	"gapcert/fem/boundary"
	"gapcert/interval"
)

// quadForm returns an enclosure of xᵀ A y for a banded interval matrix.
func quadForm(a *band.ISym, x, y []float64) interval.I {
	s := interval.I{}
	for i := range x {
		for j := range y {
			s = s.Add(a.At(i, j).MulF(x[i]).MulF(y[j]))
		}
	}
	return s
}

// meanP2Dofs returns the nodal values and cell means of the global
// polynomial f = Σ c_j x^j (exact rationals; the test chooses data for
// which they are floats).
func meanP2Dofs(t *testing.T, s *MeanP2, f ratPoly) []float64 {
	out := make([]float64, s.N())
	m := s.Mesh()
	for k := 0; k <= m.Cells(); k++ {
		if g := s.NodeDof(k); g >= 0 {
			v, exact := f.eval(ratOf(m.Nodes[k].Lo)).Float64()
			if !exact {
				t.Fatal("nodal value not a float")
			}
			out[g] = v
		}
	}
	for k := 0; k < m.Cells(); k++ {
		x0 := ratOf(m.Nodes[k].Lo)
		h := new(big.Rat).Sub(ratOf(m.Nodes[k+1].Lo), x0)
		mean, exact := f.compose(x0, h).integral().Float64()
		if !exact {
			t.Fatal("cell mean not a float")
		}
		out[s.MeanDof(k)] = mean
	}
	return out
}

func TestMeanP2CoefficientsAreValuesAndMeans(t *testing.T) {
	// For global quadratics f, g (dyadic data: coefficient of x² a multiple
	// of 3 so that cell means are floats), the vectors of nodal values and
	// cell means reproduce ∫f'g' and ∫fg exactly (math/big, monomial form).
	rng := rand.New(rand.NewPCG(5, 6))
	m, _ := NewMesh([]interval.I{pt(-1), pt(-0.5), pt(0.25), pt(1), pt(1.5)})
	s := NewMeanP2(m, neumann, neumann)
	v := PolynomialPotential(m, nil)
	k, mass, _, err := s.Matrices(v, interval.I{})
	if err != nil {
		t.Fatal(err)
	}
	rq := func() ratPoly {
		return ratPoly{big.NewRat(int64(rng.IntN(17)-8), 4), big.NewRat(int64(rng.IntN(17)-8), 2), big.NewRat(3*int64(rng.IntN(9)-4), 4)}
	}
	for trial := 0; trial < 8; trial++ {
		f, g := rq(), rq()
		x, y := meanP2Dofs(t, s, f), meanP2Dofs(t, s, g)
		a, b := pt(-1), pt(1.5)
		_ = a
		_ = b
		// Exact ∫ over (−1, 1.5): antiderivative differences of the products.
		lo, hi := ratFrac(-1, 1), ratFrac(3, 2)
		intOf := func(p ratPoly) *big.Rat {
			// ∫_lo^hi p = ∫_0^1 p(lo + ξ(hi − lo)) (hi − lo)
			l := new(big.Rat).Sub(hi, lo)
			r := p.compose(lo, l).integral()
			return r.Mul(r, l)
		}
		checkEncloses(t, fmt.Sprintf("trial %d ∫f'g'", trial), quadForm(k, x, y), intOf(f.deriv().mul(g.deriv())), 1e-12, 1)
		checkEncloses(t, fmt.Sprintf("trial %d ∫fg", trial), quadForm(mass, x, y), intOf(f.mul(g)), 1e-12, 1)
	}
}

func denseMid(a *band.ISym) *mat.SymDense {
	d := mat.NewSymDense(a.N, nil)
	for i := 0; i < a.N; i++ {
		for j := max(0, i-a.W); j <= i; j++ {
			d.SetSym(i, j, a.At(i, j).Mid())
		}
	}
	return d
}

// generalizedEigs returns the eigenvalues of Kx = λMx (gonum: Cholesky of
// M, then the symmetric eigenproblem of L⁻¹KL⁻ᵀ).
func generalizedEigs(t *testing.T, k, m *mat.SymDense) []float64 {
	var ch mat.Cholesky
	if !ch.Factorize(m) {
		t.Fatal("mass matrix not SPD")
	}
	var l mat.TriDense
	ch.LTo(&l)
	n := k.SymmetricDim()
	var li mat.TriDense
	if err := li.InverseTri(&l); err != nil {
		t.Fatal(err)
	}
	var c mat.Dense
	c.Mul(&li, k)
	c.Mul(&c, li.T())
	cs := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			cs.SetSym(i, j, 0.5*(c.At(i, j)+c.At(j, i)))
		}
	}
	var es mat.EigenSym
	if !es.Factorize(cs, false) {
		t.Fatal("eigen failed")
	}
	return es.Values(nil)
}

func TestMeanP2MassBound(t *testing.T) {
	// mMin ≤ λ_min(M) (gonum on the midpoint matrix) and within a factor 2.
	for _, tc := range []struct {
		n           int
		left, right boundary.Condition
	}{
		{4, dirichlet, dirichlet},
		{10, neumann, robin(pt(1))},
		{33, dirichlet, neumann},
	} {
		m := Uniform(pt(0), pt(2), tc.n)
		s := NewMeanP2(m, tc.left, tc.right)
		_, mass, mMin, err := s.Matrices(PolynomialPotential(m, nil), interval.I{})
		if err != nil {
			t.Fatal(err)
		}
		var es mat.EigenSym
		es.Factorize(denseMid(mass), false)
		lmin := es.Values(nil)[0]
		if !(mMin <= lmin && lmin <= 2*mMin) {
			t.Errorf("n=%d: mMin = %g, λ_min(M) = %g", tc.n, mMin, lmin)
		}
	}
	// The splitting diag(2/25, 4/25, 2/25) ⪯ M_ref, and it is nearly the best
	// of its form: diag(t/2, t, t/2) with t = 0.17 exceeds the largest
	// admissible t = (1.4 − √1.16)/2 ≈ 0.1615 (closed form derived in
	// meanp2.go), so it must be refused.
	_, mr := meanP2Ref()
	if ratPositiveDefiniteShifted(mr, [3]*big.Rat{big.NewRat(17, 200), big.NewRat(17, 100), big.NewRat(17, 200)}) {
		t.Error("M_ref − diag(0.085, 0.17, 0.085) accepted as positive definite")
	}
	if tmax := (1.4 - math.Sqrt(1.16)) / 2; !(0.16 <= tmax && tmax < 0.17) {
		t.Errorf("closed form %g", tmax)
	}
}

func TestMeanP2ProjectionLowerBound(t *testing.T) {
	// Liu 2015 (package enclose doc): λ_h/(1 + C_h²λ_h) ≤ λ_k + γ.
	// When V + γ = 0 the
	// form a_lo is the exact one on a conforming space, so min–max also gives
	// λ_k + γ ≤ λ_h; otherwise the mean term makes a_lo ≤ a + γb and λ_h may
	// fall below λ_k + γ. Exact eigenvalues on (0, π), Dirichlet: k² + V
	// (u_k = sin kx; common practice).
	for _, tc := range []struct {
		vconst, gamma float64
	}{{0, 0}, {3, 0}, {-1, 1.5}} {
		var prevErr float64
		for _, n := range []int{8, 16, 32} {
			m := Uniform(pt(0), pt(math.Pi), n)
			s := NewMeanP2(m, dirichlet, dirichlet)
			k, mass, _, err := s.Matrices(PolynomialPotential(m, []interval.I{pt(tc.vconst)}), pt(tc.gamma))
			if err != nil {
				t.Fatal(err)
			}
			lh := generalizedEigs(t, denseMid(k), denseMid(mass))
			c := s.ProjectionConstant().Hi
			for j := 0; j < 5; j++ {
				exact := float64((j+1)*(j+1)) + tc.vconst + tc.gamma
				low := lh[j] / (1 + c*c*lh[j])
				upperOK := tc.vconst+tc.gamma != 0 || exact <= lh[j]*(1+1e-12)
				if !(low <= exact && upperOK) {
					t.Errorf("V=%g γ=%g n=%d k=%d: projection bound %g, exact %g, discrete %g", tc.vconst, tc.gamma, n, j+1, low, exact, lh[j])
				}
			}
			e := float64(1+tc.vconst+tc.gamma) - lh[0]/(1+c*c*lh[0])
			if prevErr != 0 && !(e < prevErr/3.5) {
				t.Errorf("V=%g n=%d: lower bound error %g did not fall like h² (previous %g)", tc.vconst, n, e, prevErr)
			}
			prevErr = e
		}
	}
}

func TestMeanP2SignError(t *testing.T) {
	// V = x − 1 on (0, 2) with γ = 0.5 is negative near 0: c_T < 0 must be refused.
	m := Uniform(pt(0), pt(2), 4)
	s := NewMeanP2(m, dirichlet, neumann)
	_, _, _, err := s.Matrices(PolynomialPotential(m, []interval.I{pt(-1), pt(1)}), pt(0.5))
	var se *SignError
	if !errors.As(err, &se) || se.Cell != 0 {
		t.Fatalf("want a SignError on cell 0, got %v", err)
	}
	if _, _, _, err := s.Matrices(PolynomialPotential(m, []interval.I{pt(-1), pt(1)}), pt(1)); err != nil {
		t.Fatalf("γ = 1 makes V + γ ≥ 0: %v", err)
	}
}

func TestProjectionConstant(t *testing.T) {
	// π to 40 digits (common practice): the upper end must be ≥ h/(2π).
	pi, _ := new(big.Rat).SetString("3.141592653589793238462643383279502884197")
	m := Uniform(pt(0), pt(1), 3)
	c := NewMeanP2(m, neumann, neumann).ProjectionConstant()
	want := new(big.Rat).Quo(ratOf(m.HMax()), new(big.Rat).Mul(pi, big.NewRat(2, 1)))
	checkEncloses(t, "h/(2π)", interval.I{Lo: 0, Hi: c.Hi}, want, math.Inf(1), 1)
	if w, _ := want.Float64(); c.Hi > w*(1+1e-14) {
		t.Errorf("ProjectionConstant %v too wide for %g", c, w)
	}
}

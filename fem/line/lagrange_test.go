package line

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"gapcert/fem/boundary"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

func pt(x float64) interval.I { return interval.Point(x) }

func TestMonomialIntegrals(t *testing.T) {
	// ∫_0^1 ξ^j dξ = 1/(j+1) (common practice).
	for n := 0; n <= 14; n++ {
		for j := 0; j <= n; j++ {
			c := make([]interval.I, j+1)
			c[j] = pt(1)
			b := make([]interval.I, n+1)
			bernFromMonomial(b, c)
			got := bernIntegral(b)
			checkEncloses(t, fmt.Sprintf("∫ξ^%d in degree %d", j, n), got, big.NewRat(1, int64(j+1)), 1e-14, 0)
		}
	}
}

func TestBernsteinProductDerivative(t *testing.T) {
	// (ξ^i)(ξ^j) = ξ^(i+j) and (ξ^j)' = jξ^(j−1): compare with the monomial
	// identities through exact integrals ∫ξ^k = 1/(k+1) (common practice).
	for i := 0; i <= 5; i++ {
		for j := 0; j <= 5; j++ {
			a := make([]interval.I, 6)
			b := make([]interval.I, 6)
			ca := make([]interval.I, i+1)
			cb := make([]interval.I, j+1)
			ca[i], cb[j] = pt(1), pt(1)
			bernFromMonomial(a, ca)
			bernFromMonomial(b, cb)
			prod := make([]interval.I, 11)
			bernProduct(prod, a, b)
			checkEncloses(t, "∫ξ^i ξ^j", bernIntegral(prod), big.NewRat(1, int64(i+j+1)), 1e-14, 0)
			if j > 0 {
				d := make([]interval.I, 5)
				bernDeriv(d, b)
				// ∫ jξ^(j−1) = 1
				checkEncloses(t, "∫(ξ^j)'", bernIntegral(d), big.NewRat(1, 1), 1e-14, 0)
			}
		}
	}
}

func TestMeshes(t *testing.T) {
	a, b := pt(0), pt(math.Pi)
	m := Uniform(a, b, 7)
	if m.Cells() != 7 || m.Nodes[0] != a || m.Nodes[7] != b {
		t.Fatalf("Uniform ends: %v", m.Nodes)
	}
	for k := 0; k < 7; k++ {
		h := m.H(k)
		if !(h.Lo > 0) || math.Abs(h.Mid()-math.Pi/7) > 1e-15 {
			t.Errorf("cell %d length %v", k, h)
		}
	}
	if hm := m.HMax(); hm < math.Pi/7 || hm > math.Pi/7*(1+1e-14) {
		t.Errorf("HMax %g", hm)
	}
	r := m.Refine()
	if r.Cells() != 14 || r.Nodes[2] != m.Nodes[1] {
		t.Errorf("Refine: %v", r.Nodes)
	}
	g, err := Graded(pt(-1), pt(1), 10, 2, Left, Right)
	if err != nil {
		t.Fatal(err)
	}
	if !(g.H(0).Hi < g.H(4).Lo) || math.Abs(g.H(0).Mid()-g.H(9).Mid()) > 1e-15 {
		t.Errorf("Graded toward both ends: h0 = %v, h4 = %v, h9 = %v", g.H(0), g.H(4), g.H(9))
	}
	if _, err := NewMesh([]interval.I{pt(0), pt(0)}); err == nil {
		t.Error("NewMesh accepted a zero-length cell")
	}
}

func TestElementMatricesP1P2(t *testing.T) {
	// Textbook element matrices (common practice): P1 stiffness (1/h)[1 −1; −1 1],
	// mass (h/6)[2 1; 1 2]; P2 with nodes 0, h/2, h: stiffness
	// (1/3h)[7 −8 1; −8 16 −8; 1 −8 7], mass (h/30)[4 2 −1; 2 16 2; −1 2 4].
	h := 0.75
	hr := ratOf(h)
	m := Uniform(pt(0.5), pt(0.5+h), 1)
	v := PolynomialPotential(m, nil)
	type tc struct {
		p     int
		vecs  [][]float64 // the nodal basis in hierarchical coefficients
		k, ms [][]int64
		kd    *big.Rat
		md    *big.Rat
	}
	cases := []tc{
		{1, [][]float64{{1, 0}, {0, 1}}, [][]int64{{1, -1}, {-1, 1}}, [][]int64{{2, 1}, {1, 2}},
			new(big.Rat).Inv(hr), new(big.Rat).Quo(hr, big.NewRat(6, 1))},
		// ψ_2 = ξ² − ξ, so N_0 = (1 − ξ) + 2ψ_2, N_½ = −4ψ_2, N_1 = ξ + 2ψ_2.
		{2, [][]float64{{1, 2, 0}, {0, -4, 0}, {0, 2, 1}}, [][]int64{{7, -8, 1}, {-8, 16, -8}, {1, -8, 7}},
			[][]int64{{4, 2, -1}, {2, 16, 2}, {-1, 2, 4}},
			new(big.Rat).Inv(new(big.Rat).Mul(hr, big.NewRat(3, 1))), new(big.Rat).Quo(hr, big.NewRat(30, 1))},
	}
	for _, c := range cases {
		s := NewLagrange(m, c.p, neumann, neumann)
		a0, a1, err := s.RitzMatrices(c.vecs, v, interval.I{})
		if err != nil {
			t.Fatal(err)
		}
		kf, mf := s.AssembleApprox(v, 0)
		for i := range c.vecs {
			for j := range c.vecs {
				ke := new(big.Rat).Mul(c.kd, big.NewRat(c.k[i][j], 1))
				me := new(big.Rat).Mul(c.md, big.NewRat(c.ms[i][j], 1))
				checkEncloses(t, fmt.Sprintf("P%d stiffness %d%d", c.p, i, j), a0.At(i, j), ke, 1e-14, 1)
				checkEncloses(t, fmt.Sprintf("P%d mass %d%d", c.p, i, j), a1.At(i, j), me, 1e-14, 1)
			}
		}
		if c.p == 1 {
			kfe, _ := c.kd.Float64()
			mfe, _ := c.md.Float64()
			if math.Abs(kf.At(0, 1)+kfe) > 1e-15 || math.Abs(mf.At(0, 0)-2*mfe) > 1e-15 {
				t.Errorf("AssembleApprox P1: K01 = %g, M00 = %g", kf.At(0, 1), mf.At(0, 0))
			}
		}
	}
}

// exactRitz computes a(u_i,u_j) + γ b(u_i,u_j) and b(u_i,u_j) in math/big
// from the monomial form of the basis (independent of the Bernstein path),
// for V = Σ vc[j] x^j with rational coefficients and Robin α at
// non-Dirichlet ends.
func exactRitz(s *Lagrange, vecs [][]float64, vc []*big.Rat, gamma *big.Rat, alphaL, alphaR *big.Rat) (a, b [][]*big.Rat) {
	nv := len(vecs)
	a, b = make([][]*big.Rat, nv), make([][]*big.Rat, nv)
	for i := range a {
		a[i], b[i] = make([]*big.Rat, nv), make([]*big.Rat, nv)
		for j := range a[i] {
			a[i][j], b[i][j] = new(big.Rat), new(big.Rat)
		}
	}
	vpoly := ratPoly(vc)
	for k := 0; k < s.mesh.Cells(); k++ {
		x0 := ratOf(s.mesh.Nodes[k].Lo)
		h := new(big.Rat).Sub(ratOf(s.mesh.Nodes[k+1].Lo), x0)
		vloc := vpoly.compose(x0, h).add(ratPoly{gamma})
		us := make([]ratPoly, nv)
		for i, x := range vecs {
			u := rp(0)
			for l := 0; l <= s.p; l++ {
				if g := s.dof(k, l); g >= 0 {
					u = u.add(hierarchicalMonomial(s.p, l).scale(ratOf(x[g])))
				}
			}
			us[i] = u
		}
		hinv := new(big.Rat).Inv(h)
		for i := range us {
			for j := range us {
				st := us[i].deriv().mul(us[j].deriv()).integral()
				st.Mul(st, hinv)
				pot := vloc.mul(us[i]).mul(us[j]).integral()
				pot.Mul(pot, h)
				ms := us[i].mul(us[j]).integral()
				ms.Mul(ms, h)
				a[i][j].Add(a[i][j], st.Add(st, pot))
				b[i][j].Add(b[i][j], ms)
			}
		}
	}
	addExactEndTerms(a, &s.space, vecs, alphaL, alphaR, false)
	return a, b
}

func ratInterval(r *big.Rat) interval.I { return decimalio.FromRat(r) }

func TestRitzMatricesExact(t *testing.T) {
	// Containment and width against an exact math/big evaluation. V(x) =
	// 1 + 2x − x³/3, γ = 1/2, Robin α = 1/3 on the left.
	rng := rand.New(rand.NewPCG(1, 2))
	vc := []*big.Rat{ratFrac(1, 1), ratFrac(2, 1), ratFrac(0, 1), ratFrac(-1, 3)}
	viv := make([]interval.I, len(vc))
	for i, r := range vc {
		viv[i] = ratInterval(r)
	}
	gamma := ratFrac(1, 2)
	alpha := ratFrac(1, 3)
	for _, tc := range []struct {
		p, cells, nv int
		left, right  boundary.Condition
	}{
		{1, 3, 2, robin(ratInterval(alpha)), dirichlet},
		{3, 3, 3, robin(ratInterval(alpha)), dirichlet},
		{6, 2, 3, dirichlet, neumann},
		{10, 2, 2, robin(ratInterval(alpha)), robin(ratInterval(alpha))},
	} {
		m := Uniform(pt(0.25), pt(1.75), tc.cells)
		s := NewLagrange(m, tc.p, tc.left, tc.right)
		v := PolynomialPotential(m, viv)
		vecs := make([][]float64, tc.nv)
		for i := range vecs {
			vecs[i] = make([]float64, s.N())
			for l := range vecs[i] {
				vecs[i][l] = rng.NormFloat64()
			}
		}
		a0, a1, err := s.RitzMatrices(vecs, v, ratInterval(gamma))
		if err != nil {
			t.Fatal(err)
		}
		var aL, aR *big.Rat
		if !tc.left.Essential() && tc.left.Alpha.Hi > 0 {
			aL = alpha
		}
		if !tc.right.Essential() && tc.right.Alpha.Hi > 0 {
			aR = alpha
		}
		ea, eb := exactRitz(s, vecs, vc, gamma, aL, aR)
		for i := range vecs {
			for j := range vecs {
				name := fmt.Sprintf("p=%d (%d,%d)", tc.p, i, j)
				checkEncloses(t, name+" a0", a0.At(i, j), ea[i][j], 1e-13, 1)
				checkEncloses(t, name+" a1", a1.At(i, j), eb[i][j], 1e-13, 1)
			}
		}
	}
}

func TestRitzMatricesVsFloatAssembly(t *testing.T) {
	// The midpoints of RitzMatrices agree with xᵀKy of the float assembly
	// (gonum dense products) to rounding.
	rng := rand.New(rand.NewPCG(3, 4))
	m := Uniform(pt(-1), pt(2), 9)
	v := PolynomialPotential(m, []interval.I{pt(3), pt(0), pt(-1)})
	for _, p := range []int{2, 5, 8} {
		s := NewLagrange(m, p, robin(pt(2)), robin(pt(0)))
		kb, mb := s.AssembleApprox(v, 0.5)
		n := s.N()
		K, M := mat.NewSymDense(n, nil), mat.NewSymDense(n, nil)
		for i := 0; i < n; i++ {
			for j := 0; j <= i; j++ {
				K.SetSym(i, j, kb.At(i, j))
				M.SetSym(i, j, mb.At(i, j))
			}
		}
		vecs := make([][]float64, 3)
		for i := range vecs {
			vecs[i] = make([]float64, n)
			for l := range vecs[i] {
				vecs[i][l] = rng.Float64() - 0.5
			}
		}
		a0, a1, _ := s.RitzMatrices(vecs, v, pt(0.5))
		for i := range vecs {
			for j := range vecs {
				x, y := mat.NewVecDense(n, vecs[i]), mat.NewVecDense(n, vecs[j])
				kf, mf := mat.Inner(x, K, y), mat.Inner(x, M, y)
				if d := math.Abs(a0.At(i, j).Mid() - kf); d > 1e-11*math.Max(1, math.Abs(kf)) {
					t.Errorf("p=%d a0(%d,%d) = %v, float %g", p, i, j, a0.At(i, j), kf)
				}
				if d := math.Abs(a1.At(i, j).Mid() - mf); d > 1e-11*math.Max(1, math.Abs(mf)) {
					t.Errorf("p=%d a1(%d,%d) = %v, float %g", p, i, j, a1.At(i, j), mf)
				}
			}
		}
	}
}

func TestRayleighQuotientConvergence(t *testing.T) {
	// V = 0 on (0, π), Dirichlet: λ_k = k², u_k = sin kx (common practice).
	// The Rayleigh
	// quotient of the interpolant of sin(kx) has error O(h^(2p)), so halving
	// h divides it by about 2^(2p).
	for _, k := range []float64{1, 2} {
		for _, p := range []int{1, 2, 3, 4} {
			var errs []float64
			for _, n := range []int{8, 16, 32} {
				m := Uniform(pt(0), pt(math.Pi), n)
				s := NewLagrange(m, p, dirichlet, dirichlet)
				u := s.Interpolate(func(x float64) float64 { return math.Sin(k * x) },
					func(x float64) float64 { return k * math.Cos(k*x) })
				a0, a1, _ := s.RitzMatrices([][]float64{u}, PolynomialPotential(m, nil), interval.I{})
				rq := a0.At(0, 0).Div(a1.At(0, 0))
				if rq.Wid() > 1e-12*rq.Mid() {
					t.Errorf("k=%g p=%d n=%d: Rayleigh quotient %v too wide", k, p, n, rq)
				}
				errs = append(errs, math.Abs(rq.Mid()-k*k))
			}
			for i := 1; i < len(errs); i++ {
				if errs[i] < 1e-11 {
					continue // at rounding level
				}
				rate := math.Log2(errs[i-1] / errs[i])
				if math.Abs(rate-float64(2*p)) > 0.35 {
					t.Errorf("k=%g p=%d: observed rate %.2f, want %d (errors %v)", k, p, rate, 2*p, errs)
				}
			}
			t.Logf("k=%g p=%d: |RQ − k²| = %.3e", k, p, errs)
		}
	}
}

func TestEvalInterpolate(t *testing.T) {
	m := Uniform(pt(0), pt(1), 5)
	s := NewLagrange(m, 6, neumann, dirichlet)
	u := s.Interpolate(math.Exp, math.Exp) // e^x does not vanish at 1: the end value is dropped
	for _, x := range []float64{0, 0.13, 0.5, 0.77} {
		if d := math.Abs(s.Eval(u, x) - math.Exp(x)); d > 1e-7 {
			t.Errorf("Eval(%g) off by %g", x, d)
		}
	}
	if s.Eval(u, 1) != 0 {
		t.Errorf("Dirichlet end value %g", s.Eval(u, 1))
	}
}

func TestHierarchicalStiffnessStructure(t *testing.T) {
	// ψ_j' = P̃_(j−1) and Legendre orthogonality ∫_(−1)^1 P_m P_n = 2δ_mn/(2n+1)
	// (common practice) give ∫_0^1 ψ_i'ψ_j' = δ_ij/(2j−1), and
	// bubbles are decoupled from the vertex functions (whose derivatives are
	// ∓1): K_loc = [1 0 … −1; 0 D 0; −1 0 … 1] with D = diag(1/(2j−1)).
	for _, p := range []int{1, 2, 5, 12} {
		k, _ := hierarchicalGramTables(p)
		p1 := p + 1
		for a := 0; a < p1; a++ {
			for b := 0; b < p1; b++ {
				want := new(big.Rat)
				switch {
				case (a == 0 || a == p) && (b == 0 || b == p):
					if a == b {
						want.SetInt64(1)
					} else {
						want.SetInt64(-1)
					}
				case a == b:
					want.SetFrac64(1, int64(2*(a+1)-1))
				}
				checkEncloses(t, fmt.Sprintf("p=%d K_loc(%d,%d)", p, a, b), k.IV[a*p1+b], want, 1e-15, 1)
			}
		}
	}
}

package line

import (
	"math"
	"testing"

	"gapcert/enclose/band"
	"gapcert/interval"
	"gapcert/interval/formula"
	"gapcert/temple"
)

func TestMathieuFromExpr(t *testing.T) {
	// V = 2q cos 2x on (0, π), Dirichlet, q = 1: the eigenvalues are the
	// Mathieu characteristic values b_1(1) = −0.11024881699, b_2(1) =
	// 3.91702477 (Abramowitz–Stegun Table 20.1; values recalled from
	// memory). Ritz upper and flux-based Lehmann–Goerisch lower bounds from
	// the formula's Taylor models must enclose b_1 tightly.
	const b1, b2 = -0.11024881699, 3.91702477
	m := Uniform(pt(0), interval.I{Lo: math.Pi, Hi: math.Pi}, 12)
	v, err := FromExpr(m, formula.MustParse("2*cos(2*x)"), 12)
	if err != nil {
		t.Fatal(err)
	}
	for k := 0; k < m.Cells(); k++ {
		x := m.Nodes[k].Mid()
		if r := v.Range(k); !r.Contains(2*math.Cos(2*x)) || r.Wid() > 1.2 {
			t.Errorf("cell %d: range %v", k, r)
		}
	}
	dir := dirichlet
	s := NewLagrange(m, 8, dir, dir)
	f := NewFlux(m, 8, dir, dir)
	gamma := pt(3) // V + 3 ≥ 1
	w, err := v.InverseShifted(gamma, 14)
	if err != nil {
		t.Fatal(err)
	}
	kk, mm := s.AssembleApprox(v, 3)
	u := inverseIterate(kk, mm, s.N())
	sigma := minimizeOne(f, s, u, w)
	a0, a1, a2, err := lgMatrices(s, [][]float64{u}, f, [][]float64{sigma}, v, w, gamma)
	if err != nil {
		t.Fatal(err)
	}
	upper := a0.At(0, 0).Div(a1.At(0, 0)).Hi - 3
	lower, err := temple.LehmannGoerisch(a0, a1, a2, 3.9+3)
	if err != nil {
		t.Fatal(err)
	}
	low := lower[0] - 3
	if !(low <= b1+1e-11 && b1-1e-11 <= upper) || upper-low > 1e-9 {
		t.Errorf("b_1(1) = %.11f, enclosure [%.13f, %.13f]", b1, low, upper)
	}
	_ = b2
	// The formula route to 1/(V + γ) gives a valid (here also tight) weight.
	we, err := v.InverseShiftedExpr(gamma, 14)
	if err != nil {
		t.Fatal(err)
	}
	_, a1e, a2e, err := lgMatrices(s, [][]float64{u}, f, [][]float64{sigma}, v, we, gamma)
	if err != nil {
		t.Fatal(err)
	}
	if d := a2e.At(0, 0).Mid() - a2.At(0, 0).Mid(); math.Abs(d) > 1e-12 || a1e.At(0, 0) != a1.At(0, 0) {
		t.Errorf("A2 by the two weight models: %v vs %v", a2e.At(0, 0), a2.At(0, 0))
	}
	for _, k := range []int{0, 5} {
		_, r1 := w.Model(k)
		_, r2 := we.Model(k)
		t.Logf("cell %d: remainder width %.2e (Chebyshev choice), %.2e (formula Taylor model)", k, r1.Wid(), r2.Wid())
	}
	if _, err := PolynomialPotential(m, nil).InverseShiftedExpr(gamma, 3); err == nil {
		t.Error("InverseShiftedExpr accepted a Potential without an expression")
	}
	t.Logf("b_1(1) ∈ [%.13f, %.13f], width %.2e", low, upper, upper-low)
}

func benchSetup(cells, p, nv int) (*Lagrange, *Flux, [][]float64, [][]float64, *Potential, *Potential) {
	m := Uniform(pt(0), pt(math.Pi), cells)
	dir := dirichlet
	s := NewLagrange(m, p, dir, dir)
	f := NewFlux(m, p, dir, dir)
	v := PolynomialPotential(m, []interval.I{pt(1), pt(0.5), pt(-0.25)})
	w, err := v.InverseShifted(pt(2), p)
	if err != nil {
		panic(err)
	}
	trial, flux := make([][]float64, nv), make([][]float64, nv)
	for i := range trial {
		k := float64(i + 1)
		trial[i] = s.Interpolate(func(x float64) float64 { return math.Sin(k * x) }, func(x float64) float64 { return k * math.Cos(k*x) })
		flux[i] = minimizeOne(f, s, trial[i], w)
	}
	return s, f, trial, flux, v, w
}

var benchCases = []struct{ cells, p int }{{10, 4}, {10, 8}, {100, 4}, {100, 8}}

func BenchmarkRitzMatrices(b *testing.B) {
	for _, c := range benchCases {
		s, _, trial, _, v, _ := benchSetup(c.cells, c.p, 4)
		b.Run(benchName(c.cells, c.p), func(b *testing.B) {
			for b.Loop() {
				s.RitzMatrices(trial, v, pt(2))
			}
		})
	}
}

// BenchmarkLGMatrices times the three matrices of the Lehmann–Goerisch
// theorem for the trial functions: the flux matrix and their Ritz
// matrices (the driver takes the latter from its Ritz stage instead).
func BenchmarkLGMatrices(b *testing.B) {
	for _, c := range benchCases {
		s, f, trial, flux, v, w := benchSetup(c.cells, c.p, 4)
		b.Run(benchName(c.cells, c.p), func(b *testing.B) {
			for b.Loop() {
				lgMatrices(s, trial, f, flux, v, w, pt(2))
			}
		})
	}
}

// BenchmarkLGMatrix times the flux matrix alone.
func BenchmarkLGMatrix(b *testing.B) {
	for _, c := range benchCases {
		s, f, trial, flux, v, w := benchSetup(c.cells, c.p, 4)
		b.Run(benchName(c.cells, c.p), func(b *testing.B) {
			for b.Loop() {
				f.LGMatrix(s, trial, flux, v, w, pt(2))
			}
		})
	}
}

func BenchmarkMeanP2Matrices(b *testing.B) {
	for _, n := range []int{100, 10000} {
		m := Uniform(pt(0), pt(1), n)
		s := NewMeanP2(m, dirichlet, neumann)
		v := PolynomialPotential(m, []interval.I{pt(1), pt(2)})
		b.Run(benchName(n, 2), func(b *testing.B) {
			for b.Loop() {
				s.Matrices(v, pt(0))
			}
		})
	}
}

func BenchmarkAssembleApprox(b *testing.B) {
	for _, c := range benchCases {
		s, _, _, _, v, _ := benchSetup(c.cells, c.p, 1)
		b.Run(benchName(c.cells, c.p), func(b *testing.B) {
			for b.Loop() {
				s.AssembleApprox(v, 0)
			}
		})
	}
}

var _ = band.NewSym

// TestFromExprKinks: a kink of abs at a node needs no special model (the
// closed cells take their branch; exact for |x|), and a kink inside a cell
// gives that cell the range model (constant part, remainder of half the
// range's width) while the other cells stay exact. Every model contains
// the function at sample points (evaluated with package math).
func TestFromExprKinks(t *testing.T) {
	m := Uniform(pt(0), pt(1), 8)
	for _, tc := range []struct {
		src    string
		f      func(float64) float64
		kinked int // cell with the range model, −1 if none
	}{
		{"abs(x - 1/2)", func(x float64) float64 { return math.Abs(x - 0.5) }, -1},
		{"abs(x - 1/3)", func(x float64) float64 { return math.Abs(x - 1.0/3) }, 2},
		{"max(x, 0.3)", func(x float64) float64 { return math.Max(x, 0.3) }, 2},
	} {
		v, err := FromExpr(m, formula.MustParse(tc.src), 4)
		if err != nil {
			t.Fatalf("%s: %v", tc.src, err)
		}
		for k := 0; k < m.Cells(); k++ {
			bern, rem := v.Model(k)
			if (rem != interval.I{}) != (k == tc.kinked) {
				t.Errorf("%s cell %d: remainder %v", tc.src, k, rem)
			}
			if k == tc.kinked && rem.Wid() > 0.125 {
				t.Errorf("%s cell %d: range remainder %v wider than the cell's range", tc.src, k, rem)
			}
			a, h := m.Nodes[k].Mid(), m.H(k).Mid()
			for _, xi := range []float64{0, 0.1, 0.37, 0.5, 0.81, 1} {
				p := deCasteljau(midpoints(bern), xi, make([]float64, len(bern)))
				if d := tc.f(a+xi*h) - p; !(rem.Lo-1e-14 <= d && d <= rem.Hi+1e-14) {
					t.Errorf("%s cell %d ξ=%g: f − P = %g outside %v", tc.src, k, xi, d, rem)
				}
			}
		}
	}
}

func midpoints(b []interval.I) []float64 {
	out := make([]float64, len(b))
	for i, c := range b {
		out[i] = c.Mid()
	}
	return out
}

// TestUniformWith: points inside the interval become nodes (moving a
// uniform node within a quarter cell, else inserted, never moving a node
// placed at an earlier point); points at or beyond the ends and existing
// nodes change nothing.
func TestUniformWith(t *testing.T) {
	nodes := func(m *Mesh) []float64 {
		out := make([]float64, len(m.Nodes))
		for i, x := range m.Nodes {
			out[i] = x.Mid()
		}
		return out
	}
	for _, tc := range []struct {
		points []float64
		want   []float64
	}{
		{nil, []float64{0, 0.75, 1.5, 2.25, 3}},
		{[]float64{1.5, 0, 3, -1}, []float64{0, 0.75, 1.5, 2.25, 3}},
		{[]float64{1}, []float64{0, 0.75, 1, 1.5, 2.25, 3}},
		{[]float64{0.8}, []float64{0, 0.8, 1.5, 2.25, 3}},
		{[]float64{1.4, 2.5}, []float64{0, 0.75, 1.4, 2.25, 2.5, 3}},
		// Two points within a quarter cell of each other: the second must
		// not move the node placed at the first.
		{[]float64{1.5, 1.625}, []float64{0, 0.75, 1.5, 1.625, 2.25, 3}},
		{[]float64{0.8, 0.9}, []float64{0, 0.8, 0.9, 1.5, 2.25, 3}},
	} {
		got := nodes(UniformWith(pt(0), pt(3), 4, tc.points))
		if len(got) != len(tc.want) {
			t.Errorf("points %v: nodes %v, want %v", tc.points, got, tc.want)
			continue
		}
		for i := range got {
			if got[i] != tc.want[i] {
				t.Errorf("points %v: nodes %v, want %v", tc.points, got, tc.want)
				break
			}
		}
	}
}

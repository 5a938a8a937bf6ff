package sparse

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"runtime"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"

	"gapcert/enclose/internal/geneig"
	"gapcert/interval"
)

// grid5 returns the 5-point Laplacian (1/h²)·(4, −1, −1, −1, −1) on the
// m×m interior nodes of the unit square, h = 1/(m+1), natural order.
func grid5(m int) *Sym {
	h := 1 / float64(m+1)
	c := 1 / (h * h)
	b := NewBuilder(m * m)
	for y := 0; y < m; y++ {
		for x := 0; x < m; x++ {
			i := y*m + x
			b.Add(i, i, 4*c)
			if x+1 < m {
				b.Add(i, i+1, -c)
			}
			if y+1 < m {
				b.Add(i, i+m, -c)
			}
		}
	}
	return b.Build()
}

// grid5Eigs returns the eigenvalues of grid5(m), ascending:
// (4/h²)(sin²(iπh/2) + sin²(jπh/2)), i, j = 1 … m (common practice: the
// 5-point Laplacian is the Kronecker sum of two 1D second differences).
func grid5Eigs(m int) []float64 {
	h := 1 / float64(m+1)
	var e []float64
	for i := 1; i <= m; i++ {
		for j := 1; j <= m; j++ {
			si, sj := math.Sin(float64(i)*math.Pi*h/2), math.Sin(float64(j)*math.Pi*h/2)
			e = append(e, 4/(h*h)*(si*si+sj*sj))
		}
	}
	sort.Float64s(e)
	return e
}

// p1Square returns the P1 stiffness and mass matrices on the unit square
// with m×m interior nodes (Dirichlet), each mesh square split by its
// diagonal from lower left to upper right. Element matrices of P1 on a
// triangle: K_T = |T|·∇λ_a·∇λ_b, M_T = |T|/12·(1 + δ_ab) (common practice).
func p1Square(m int) (k, mm *Sym) {
	h := 1 / float64(m+1)
	kb, mb := NewBuilder(m*m), NewBuilder(m*m)
	node := func(x, y int) int {
		if x < 1 || y < 1 || x > m || y > m {
			return -1
		}
		return (y-1)*m + x - 1
	}
	add := func(v [3][2]int) {
		var g [3][2]float64
		p := func(a int) [2]float64 { return [2]float64{float64(v[a][0]) * h, float64(v[a][1]) * h} }
		p0, p1, p2 := p(0), p(1), p(2)
		det := (p1[0]-p0[0])*(p2[1]-p0[1]) - (p2[0]-p0[0])*(p1[1]-p0[1])
		area := det / 2
		for a := 0; a < 3; a++ {
			b, c := p((a+1)%3), p((a+2)%3)
			g[a] = [2]float64{(b[1] - c[1]) / det, (c[0] - b[0]) / det}
		}
		for a := 0; a < 3; a++ {
			ia := node(v[a][0], v[a][1])
			if ia < 0 {
				continue
			}
			for b := 0; b <= a; b++ {
				ib := node(v[b][0], v[b][1])
				if ib < 0 {
					continue
				}
				kv := area * (g[a][0]*g[b][0] + g[a][1]*g[b][1])
				mv := area / 12
				if a == b {
					mv *= 2
				}
				if a != b && ia == ib {
					panic("mesh")
				}
				kb.Add(ia, ib, kv)
				mb.Add(ia, ib, mv)
			}
		}
	}
	for y := 0; y <= m; y++ {
		for x := 0; x <= m; x++ {
			add([3][2]int{{x, y}, {x + 1, y}, {x + 1, y + 1}})
			add([3][2]int{{x, y}, {x + 1, y + 1}, {x, y + 1}})
		}
	}
	return kb.Build(), mb.Build()
}

func dense(s *Sym) *mat.SymDense {
	n := s.N()
	d := mat.NewSymDense(n, nil)
	for j := 0; j < n; j++ {
		for q := s.Pat.colPtr[j]; q < s.Pat.colPtr[j+1]; q++ {
			d.SetSym(int(s.Pat.rowIdx[q]), j, s.Val[q])
		}
	}
	return d
}

// full returns the row-major dense n×n array of s.
func full(s *Sym) []float64 {
	n := s.N()
	d := make([]float64, n*n)
	for j := 0; j < n; j++ {
		for q := s.Pat.colPtr[j]; q < s.Pat.colPtr[j+1]; q++ {
			i := int(s.Pat.rowIdx[q])
			d[i*n+j], d[j*n+i] = s.Val[q], s.Val[q]
		}
	}
	return d
}

// denseGeneralizedEigs returns the eigenvalues of (K, M) from gonum.
func denseGeneralizedEigs(t *testing.T, k, m *Sym) []float64 {
	t.Helper()
	vals, _, err := geneig.Solve(full(k), full(m), k.N())
	if err != nil {
		t.Fatal(err)
	}
	return vals
}

func identity(n int) *Sym {
	b := NewBuilder(n)
	for i := 0; i < n; i++ {
		b.Add(i, i, 1)
	}
	return b.Build()
}

func toISym(s *Sym) *ISym {
	v := make([]interval.I, len(s.Val))
	for q, x := range s.Val {
		v[q] = interval.Point(x)
	}
	return &ISym{Pat: s.Pat, Val: v}
}

// randomSPD returns a random symmetric matrix with about deg off-diagonal
// entries per row, made positive definite by a dominant diagonal.
func randomSPD(n, deg int, seed uint64) *Sym {
	r := rand.New(rand.NewPCG(seed, 7))
	b := NewBuilder(n)
	row := make([]float64, n)
	for e := 0; e < n*deg/2; e++ {
		i, j := r.IntN(n), r.IntN(n)
		if i == j {
			continue
		}
		v := r.Float64()*2 - 1
		b.Add(i, j, v)
		row[i] += math.Abs(v)
		row[j] += math.Abs(v)
	}
	for i := 0; i < n; i++ {
		b.Add(i, i, row[i]+0.1+r.Float64())
	}
	return b.Build()
}

func TestBuilder(t *testing.T) {
	b := NewBuilder(4)
	b.Add(2, 0, 1.5)
	b.Add(0, 2, 0.25) // the same entry as (2, 0)
	b.Add(3, 3, 2)
	b.Add(1, 1, -1)
	b.Add(1, 1, 4)
	b.Add(3, 1, 0.5)
	s := b.Build()
	want := [4][4]float64{{0, 0, 1.75, 0}, {0, 3, 0, 0.5}, {1.75, 0, 0, 0}, {0, 0.5, 0, 2}}
	for i := 0; i < 4; i++ {
		for j := 0; j < 4; j++ {
			if got := s.At(i, j); got != want[i][j] {
				t.Errorf("At(%d, %d) = %g, want %g", i, j, got, want[i][j])
			}
		}
	}
	if s.Pat.NNZ() != 6 { // 4 diagonals (one zero) + (2,0) + (3,1)
		t.Errorf("NNZ = %d, want 6", s.Pat.NNZ())
	}
	x := []float64{1, -2, 3, 0.5}
	dst := []float64{9, 9, 9, 9}
	s.MulVecTo(dst, x)
	for i := 0; i < 4; i++ {
		w := 0.0
		for j := 0; j < 4; j++ {
			w += want[i][j] * x[j]
		}
		if dst[i] != w {
			t.Errorf("(Sx)_%d = %g, want %g", i, dst[i], w)
		}
	}
	ib := NewIBuilder(2)
	ib.Add(0, 1, interval.New(1, 2))
	ib.Add(1, 0, interval.New(0.5, 0.75))
	is := ib.Build()
	if got := is.At(1, 0); got != interval.New(1.5, 2.75) {
		t.Errorf("interval At = %v", got)
	}
	if got := is.Mid().At(0, 1); got != 2.125 {
		t.Errorf("Mid = %g", got)
	}
}

func isPerm(p []int, n int) bool {
	q := slices.Clone(p)
	slices.Sort(q)
	for i, v := range q {
		if v != i {
			return false
		}
	}
	return len(q) == n
}

func naturalOrder(n int) []int {
	p := make([]int, n)
	for i := range p {
		p[i] = i
	}
	return p
}

// TestOrderFill compares nnz(L) of the nested-dissection order with the
// natural order on the 5-point grid graph. The natural (banded) order fills
// the whole band, about m³ entries; nested dissection gives O(m² log m)
// (George 1973).
func TestOrderFill(t *testing.T) {
	var last int
	for _, tc := range []struct {
		m        int
		maxRatio float64 // nnz(L, ND) / nnz(L, natural)
	}{{10, 0.85}, {30, 0.5}, {60, 0.33}, {120, 0.2}} {
		s := grid5(tc.m)
		n := s.N()
		perm := Order(s)
		if !isPerm(perm, n) {
			t.Fatalf("m=%d: Order is not a permutation", tc.m)
		}
		if !slices.Equal(perm, Order(s)) {
			t.Errorf("m=%d: Order is not deterministic", tc.m)
		}
		nd, nat := Analyze(s, perm).NNZ(), Analyze(s, naturalOrder(n)).NNZ()
		// Natural order: fill stays in the envelope and fills it (George
		// and Liu 1981, ch. 4): row i has i − f_i entries left of the
		// diagonal, f_i its first nonzero column (i − 1 in the first grid
		// row, i − m after it).
		wantNat := n + (tc.m - 1) + (n-tc.m)*tc.m
		if nat != wantNat {
			t.Errorf("m=%d: natural nnz(L) = %d, want %d", tc.m, nat, wantNat)
		}
		t.Logf("m=%d n=%d: nnz(L) natural %d, nested dissection %d (ratio %.3f)", tc.m, n, nat, nd, float64(nd)/float64(nat))
		if float64(nd) > tc.maxRatio*float64(nat) {
			t.Errorf("m=%d: fill ratio %.3f above %.3f", tc.m, float64(nd)/float64(nat), tc.maxRatio)
		}
		// Doubling m: m² log m grows by 4·log(2m)/log m (< 5 here), the
		// natural order's m³ by 8.
		if tc.m == 120 && float64(nd) > 5.5*float64(last) {
			t.Errorf("nnz(L) grew by %.2f from m = 60 to 120", float64(nd)/float64(last))
		}
		last = nd
	}
}

// TestOrderRenumbered: the fill of the nested-dissection order does not
// depend much on the numbering of the vertices (a randomly renumbered grid
// and a 9-point stencil).
func TestOrderRenumbered(t *testing.T) {
	const m = 80
	g := grid5(m)
	base := Analyze(g, Order(g)).NNZ()
	r := rand.New(rand.NewPCG(5, 6))
	relabel := r.Perm(m * m)
	b := NewBuilder(m * m)
	for j := 0; j < m*m; j++ {
		for q := g.Pat.colPtr[j]; q < g.Pat.colPtr[j+1]; q++ {
			b.Add(relabel[g.Pat.rowIdx[q]], relabel[j], g.Val[q])
		}
	}
	h := b.Build()
	got := Analyze(h, Order(h)).NNZ()
	t.Logf("m=%d: renumbered 5-point grid nnz(L) %d", m, got)
	if float64(got) > 1.3*float64(base) {
		t.Errorf("renumbered grid: nnz(L) = %d, grid order %d", got, base)
	}
	b9 := NewBuilder(m * m)
	for y := 0; y < m; y++ {
		for x := 0; x < m; x++ {
			i := y*m + x
			b9.Add(i, i, 8)
			for _, d := range [][2]int{{1, 0}, {0, 1}, {1, 1}, {-1, 1}} {
				if xx, yy := x+d[0], y+d[1]; xx >= 0 && xx < m && yy < m {
					b9.Add(i, yy*m+xx, -1)
				}
			}
		}
	}
	s9 := b9.Build()
	nd, nat := Analyze(s9, Order(s9)).NNZ(), Analyze(s9, naturalOrder(m*m)).NNZ()
	t.Logf("m=%d: 5-point nnz(L) %d; 9-point nnz(L) natural %d, nested dissection %d", m, base, nat, nd)
	if float64(nd) > 0.4*float64(nat) {
		t.Errorf("9-point: nnz(L) %d, natural %d", nd, nat)
	}
}

// TestOrderComponents checks a graph with many components (a diagonal
// matrix and disjoint paths).
func TestOrderComponents(t *testing.T) {
	n := 5000
	b := NewBuilder(n)
	for i := 0; i < n; i++ {
		b.Add(i, i, 2)
		if i%100 != 99 && i%3 != 0 && i+1 < n {
			b.Add(i, i+1, -1)
		}
	}
	s := b.Build()
	perm := Order(s)
	if !isPerm(perm, n) {
		t.Fatal("not a permutation")
	}
	// Paths of at most 3 vertices: no fill at all.
	if got, want := Analyze(s, perm).NNZ(), s.Pat.NNZ(); got != want {
		t.Errorf("nnz(L) = %d, want %d (no fill)", got, want)
	}
}

// maxResidual returns max |(PᵀSP − LDLᵀ)_ij| / max |S_ij| computed densely
// in float64 (a check, not a bound).
func maxResidual(s *Sym, f *LDL) float64 {
	n := s.N()
	l := mat.NewDense(n, n, nil)
	for k := 0; k < n; k++ {
		l.Set(k, k, 1)
		for q := f.Sym.colPtr[k]; q < f.Sym.colPtr[k+1]; q++ {
			l.Set(int(f.Row[q]), k, f.Val[q])
		}
	}
	var ld, ldl mat.Dense
	ld.Mul(l, mat.NewDiagDense(n, f.D))
	ldl.Mul(&ld, l.T())
	res, scale := 0.0, 0.0
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			a := s.At(f.Sym.perm[i], f.Sym.perm[j])
			res = math.Max(res, math.Abs(a-ldl.At(i, j)))
			scale = math.Max(scale, math.Abs(a))
		}
	}
	return res / scale
}

func shifted(k, m *Sym, sigma float64) *Sym {
	u, fk, fm := union(k.Pat, m.Pat)
	s := &Sym{Pat: u, Val: make([]float64, u.NNZ())}
	for q, v := range k.Val {
		s.Val[at(fk, q)] += v
	}
	for q, v := range m.Val {
		s.Val[at(fm, q)] -= sigma * v
	}
	return s
}

func TestFactorResidual(t *testing.T) {
	k12, m12 := p1Square(12)
	for _, tc := range []struct {
		name string
		s    *Sym
		neg  int
	}{
		{"grid5 m=15", grid5(15), 0},
		{"grid5 m=15 shifted to 200", shifted(grid5(15), identity(225), 200), countBelow(grid5Eigs(15), 200)},
		{"P1 m=12 shifted to 150", shifted(k12, m12, 150), -1},
		{"random SPD n=300", randomSPD(300, 6, 1), 0},
		{"random n=300 shifted", shifted(randomSPD(300, 6, 2), identity(300), 3), -1},
	} {
		for _, order := range []string{"natural", "nested dissection"} {
			perm := naturalOrder(tc.s.N())
			if order != "natural" {
				perm = Order(tc.s)
			}
			f, ok := Factor(tc.s, perm)
			if !ok {
				t.Errorf("%s, %s: factorization failed", tc.name, order)
				continue
			}
			if r := maxResidual(tc.s, f); r > 1e-13 {
				t.Errorf("%s, %s: relative residual %g", tc.name, order, r)
			}
			if tc.neg >= 0 && f.NegCount() != tc.neg {
				t.Errorf("%s, %s: %d negative pivots, want %d", tc.name, order, f.NegCount(), tc.neg)
			}
			// Solve: ‖Sx − b‖ small.
			n := tc.s.N()
			b, x, sx := make([]float64, n), make([]float64, n), make([]float64, n)
			for i := range b {
				b[i] = math.Sin(float64(i))
			}
			f.SolveTo(x, b)
			tc.s.MulVecTo(sx, x)
			num, den := 0.0, 0.0
			for i := range b {
				num = math.Max(num, math.Abs(sx[i]-b[i]))
				den = math.Max(den, math.Abs(b[i]))
			}
			if num/den > 1e-9 {
				t.Errorf("%s, %s: solve residual %g", tc.name, order, num/den)
			}
		}
	}
}

func TestFactorBreakdown(t *testing.T) {
	b := NewBuilder(2)
	b.Add(0, 0, 0)
	b.Add(1, 0, 1)
	b.Add(1, 1, 1)
	if _, ok := Factor(b.Build(), []int{0, 1}); ok {
		t.Error("zero pivot not reported")
	}
}

// countBelow returns #{e < sigma} of an ascending list.
func countBelow(e []float64, sigma float64) int {
	return sort.SearchFloat64s(e, sigma)
}

// midGaps returns shifts halfway between consecutive distinct eigenvalues.
func midGaps(e []float64, count int) []float64 {
	var s []float64
	for i := 0; i+1 < len(e) && len(s) < count; i++ {
		if e[i+1]-e[i] > 1e-6*e[i+1] {
			s = append(s, (e[i]+e[i+1])/2)
		}
	}
	return s
}

// TestCountBelowClosedForm: the count equals the true count between
// eigenvalues and σ' stays close to σ (5-point Laplacian, closed-form
// spectrum; P1 pencil against gonum's dense generalized eigenvalues).
func TestCountBelowClosedForm(t *testing.T) {
	k12, m12 := p1Square(12)
	for _, tc := range []struct {
		name   string
		k, m   *Sym
		mMin   float64
		eigs   []float64
		relTol float64 // (σ − σ')/σ
	}{
		{"grid5 m=20", grid5(20), identity(400), 1, grid5Eigs(20), 1e-11},
		// M ⪰ Σ_T λ_min(M_T) restricted to T's nodes, λ_min(M_T) = |T|/12
		// (M_T = |T|/12·(1 + δ_ab) has eigenvalues |T|/12·{4, 1, 1}), and
		// every interior node lies in 6 triangles: λ_min(M) ≥ 6·(h²/2)/12
		// = h²/4 (elementwise bound, package doc Mass bounds; h = 1/13).
		{"P1 m=12", k12, m12, 1.0 / (4 * 13 * 13) * (1 - 1e-15), denseGeneralizedEigs(t, k12, m12), 1e-10},
		// mMin = 0.9·λ_min(M) from gonum's dense eigensolver (a test
		// choice; callers supply a verified bound).
		{"P1 m=12 dense mMin", k12, m12, 0, denseGeneralizedEigs(t, k12, m12), 1e-10},
	} {
		mMin := tc.mMin
		if mMin == 0 {
			var es mat.EigenSym
			es.Factorize(dense(tc.m), false)
			mMin = 0.9 * es.Values(nil)[0]
		}
		for _, sigma := range midGaps(tc.eigs, 12) {
			n, sp, ok := CountBelow(toISym(tc.k), toISym(tc.m), mMin, sigma)
			if !ok {
				t.Errorf("%s σ=%g: factorization failed", tc.name, sigma)
				continue
			}
			if want := countBelow(tc.eigs, sigma); n != want {
				t.Errorf("%s σ=%g: n = %d, want %d", tc.name, sigma, n, want)
			}
			if countBelow(tc.eigs, sp) > n {
				t.Errorf("%s σ=%g: unsound, %d eigenvalues below σ'=%g, n = %d", tc.name, sigma, countBelow(tc.eigs, sp), sp, n)
			}
			if !(sp <= sigma) || (sigma-sp)/sigma > tc.relTol {
				t.Errorf("%s σ=%g: σ' = %g, relative loss %g above %g", tc.name, sigma, sp, (sigma-sp)/sigma, tc.relTol)
			}
		}
	}
}

// TestCountBelowThick: an interval-thickened [K] ∋ K ± ρ|K| entrywise; the
// count must hold for extreme members (eigenvalues from gonum), and the
// loss σ − σ' must reflect ρ.
func TestCountBelowThick(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for _, rho := range []float64{1e-8, 1e-5, 1e-3} {
		k, m := randomSPD(120, 5, 5), identity(120)
		ik := &ISym{Pat: k.Pat, Val: make([]interval.I, len(k.Val))}
		for q, v := range k.Val {
			d := rho * math.Abs(v)
			ik.Val[q] = interval.New(v-d, v+d)
		}
		mid := denseGeneralizedEigs(t, k, m)
		for _, sigma := range midGaps(mid, 6) {
			n, sp, ok := CountBelow(ik, toISym(m), 1, sigma)
			if !ok {
				t.Fatalf("ρ=%g σ=%g: factorization failed", rho, sigma)
			}
			for trial := 0; trial < 5; trial++ {
				member := &Sym{Pat: k.Pat, Val: make([]float64, len(k.Val))}
				for q, v := range ik.Val {
					member.Val[q] = v.Lo
					if r.IntN(2) == 1 {
						member.Val[q] = v.Hi
					}
				}
				if c := countBelow(denseGeneralizedEigs(t, member, m), sp); c > n {
					t.Errorf("ρ=%g σ=%g: member has %d eigenvalues below σ'=%g > n=%d", rho, sigma, c, sp, n)
				}
			}
			// Loss at least the thickening (a member moves eigenvalues by
			// up to ρ‖K‖) and not far beyond it.
			loss := sigma - sp
			if rho >= 1e-5 && loss < rho*mid[0]/10 {
				t.Errorf("ρ=%g: loss %g suspiciously small", rho, loss)
			}
			if loss > 100*rho*infNorm(k) {
				t.Errorf("ρ=%g: loss %g too large (‖K‖∞ = %g)", rho, loss, infNorm(k))
			}
		}
	}
}

// TestCountBelowScaledGrid: [K] = K·[1 − ρ, 1 + ρ] entrywise for the
// 5-point Laplacian; its members (1 ± ρ)K have the closed-form eigenvalues
// (1 ± ρ)λ, so neither may have more than n eigenvalues below σ', and σ'
// must lie within about (ρ + u)‖K‖∞ of σ. GAPCERT_LONG=1 adds a 300×300
// grid.
func TestCountBelowScaledGrid(t *testing.T) {
	sides := []int{60}
	if os.Getenv("GAPCERT_LONG") == "1" {
		sides = append(sides, 300)
	}
	for _, m := range sides {
		k := grid5(m)
		eigs := grid5Eigs(m)
		for _, rho := range []float64{0, 1e-10, 1e-6} {
			ik := &ISym{Pat: k.Pat, Val: make([]interval.I, len(k.Val))}
			for q, v := range k.Val {
				ik.Val[q] = interval.Point(v).Mul(interval.New(1-rho, 1+rho))
			}
			c := NewCounter(ik, toISym(identity(m*m)))
			for _, sigma := range midGaps(eigs, 5) {
				n, sp, ok := c.CountBelow(1, sigma)
				if !ok {
					t.Fatalf("m=%d ρ=%g σ=%g: factorization failed", m, rho, sigma)
				}
				for _, f := range []float64{1 - rho, 1 + rho} {
					if got := countBelow(eigs, sp/f); got > n {
						t.Errorf("m=%d ρ=%g σ=%g: member (%g)K has %d eigenvalues below σ'=%g > n=%d", m, rho, sigma, f, got, sp, n)
					}
				}
				if want := countBelow(eigs, sigma); rho < 1e-8 && n != want {
					t.Errorf("m=%d ρ=%g σ=%g: n = %d, want %d", m, rho, sigma, n, want)
				}
				// r ≈ ρ‖K‖∞ (‖K‖∞ = 8/h²) plus rounding of order u‖K‖∞.
				if loss := sigma - sp; loss > (10*rho+1e-12)*infNorm(k) {
					t.Errorf("m=%d ρ=%g σ=%g: loss %g", m, rho, sigma, loss)
				}
			}
		}
	}
}

// TestCountBelowThickMass: [M] = M·[1 − ρ, 1 + ρ] entrywise on the P1
// pencil; members scaled by 1 ± ρ have eigenvalues λ/(1 ± ρ), so the count
// below σ' must not exceed n for the member M(1 − ρ) (eigenvalues
// λ/(1 − ρ) ≥ λ: fewer below) nor for M(1 + ρ) (eigenvalues λ/(1 + ρ)).
func TestCountBelowThickMass(t *testing.T) {
	k, m := p1Square(10)
	eigs := denseGeneralizedEigs(t, k, m)
	for _, rho := range []float64{1e-9, 1e-4} {
		im := &ISym{Pat: m.Pat, Val: make([]interval.I, len(m.Val))}
		for q, v := range m.Val {
			im.Val[q] = interval.New(v*(1-rho), v*(1+rho))
		}
		mMin := (1 - rho) / (4 * 11 * 11) * (1 - 1e-15) // h²/4 as above, h = 1/11
		for _, sigma := range midGaps(eigs, 6) {
			n, sp, ok := CountBelow(toISym(k), im, mMin, sigma)
			if !ok {
				t.Fatalf("ρ=%g σ=%g: factorization failed", rho, sigma)
			}
			for _, f := range []float64{1 - rho, 1 + rho} {
				c := 0
				for _, e := range eigs {
					if e/f < sp {
						c++
					}
				}
				if c > n {
					t.Errorf("ρ=%g σ=%g: member M·%g has %d eigenvalues below σ'=%g > n=%d", rho, sigma, f, c, sp, n)
				}
			}
			// The loss is at least ρσ·λ_max(M)/mMin-ish and at most a
			// few times ρσ‖M‖∞/mMin.
			if loss := sigma - sp; loss > 4*rho*sigma*infNorm(m)/mMin+1e-9*sigma {
				t.Errorf("ρ=%g σ=%g: loss %g too large", rho, sigma, loss)
			}
		}
	}
}

// TestCountBelowCampaign (GAPCERT_LONG=1): random thick pencils of order
// 100 … 400 against gonum's dense eigenvalues of random members, with
// shifts between and exactly at eigenvalues of the midpoint pencil.
func TestCountBelowCampaign(t *testing.T) {
	if os.Getenv("GAPCERT_LONG") != "1" {
		t.Skip("set GAPCERT_LONG=1")
	}
	r := rand.New(rand.NewPCG(11, 12))
	for seed := uint64(1); seed <= 30; seed++ {
		n := 100 + r.IntN(300)
		k, m := randomSPD(n, 2+r.IntN(8), seed), randomSPD(n, 1+r.IntN(4), seed+1000)
		rho := math.Pow(10, -2-10*r.Float64())
		ik, im := &ISym{Pat: k.Pat, Val: make([]interval.I, len(k.Val))}, toISym(m)
		for q, v := range k.Val {
			ik.Val[q] = interval.New(v-rho*math.Abs(v), v+rho*math.Abs(v))
		}
		var es mat.EigenSym
		es.Factorize(dense(m), false)
		mMin := 0.99 * es.Values(nil)[0]
		eigs := denseGeneralizedEigs(t, k, m)
		shifts := append(midGaps(eigs, 10), eigs[0], eigs[3], eigs[n/2])
		c := NewCounter(ik, im)
		for _, sigma := range shifts {
			cnt, sp, ok := c.CountBelow(mMin, sigma)
			if !ok {
				continue
			}
			for trial := 0; trial < 3; trial++ {
				member := &Sym{Pat: k.Pat, Val: make([]float64, len(k.Val))}
				for q, v := range ik.Val {
					member.Val[q] = min(v.Hi, v.Lo+r.Float64()*(v.Hi-v.Lo))
					if trial == 0 {
						member.Val[q] = v.Lo
					}
				}
				if got := countBelow(denseGeneralizedEigs(t, member, m), sp); got > cnt {
					t.Errorf("seed %d n=%d ρ=%g σ=%g: member has %d eigenvalues below σ'=%g > %d", seed, n, rho, sigma, got, sp, cnt)
				}
			}
		}
	}
}

// TestCountBelowAtEigenvalue: σ exactly at an eigenvalue of a matrix with
// exactly representable spectrum (diagonal) must never over-report.
func TestCountBelowAtEigenvalue(t *testing.T) {
	b := NewBuilder(50)
	for i := 0; i < 50; i++ {
		b.Add(i, i, float64(i+1))
	}
	k := b.Build()
	for _, sigma := range []float64{1, 7, 7.5, 50} {
		n, sp, ok := CountBelow(toISym(k), toISym(identity(50)), 1, sigma)
		if !ok {
			continue // a zero pivot is an honest failure
		}
		// Eigenvalues 1 … 50: #{λ < σ'} ≤ n.
		if c := int(math.Ceil(sp)) - 1; c > n {
			t.Errorf("σ=%g: %d eigenvalues below σ'=%g, n=%d", sigma, c, sp, n)
		}
	}
}

// TestCountBelowRandom: random sparse SPD pencils (M random SPD too)
// against gonum's dense generalized eigenvalues.
func TestCountBelowRandom(t *testing.T) {
	for seed := uint64(1); seed <= 6; seed++ {
		k, m := randomSPD(60, 4, seed), randomSPD(60, 3, seed+100)
		var es mat.EigenSym
		es.Factorize(dense(m), false)
		mMin := 0.99 * es.Values(nil)[0]
		eigs := denseGeneralizedEigs(t, k, m)
		for _, sigma := range midGaps(eigs, 8) {
			n, sp, ok := CountBelow(toISym(k), toISym(m), mMin, sigma)
			if !ok {
				t.Fatalf("seed %d σ=%g: factorization failed", seed, sigma)
			}
			if want := countBelow(eigs, sigma); n != want {
				t.Errorf("seed %d σ=%g: n = %d, want %d", seed, sigma, n, want)
			}
			scale := (infNorm(k) + sigma*infNorm(m)) / mMin
			if c := countBelow(eigs, sp); c > n || sigma-sp > 1e-12*scale {
				t.Errorf("seed %d σ=%g: σ'=%g (%d below, n=%d)", seed, sigma, sp, c, n)
			}
		}
	}
}

func TestCountBelowIndependentOfProcs(t *testing.T) {
	k, m := p1Square(70)
	ik, im := toISym(k), toISym(m)
	for q := range ik.Val {
		ik.Val[q] = interval.New(math.Nextafter(k.Val[q], math.Inf(-1)), k.Val[q])
	}
	sigma := 123.456
	old := runtime.GOMAXPROCS(1)
	n1, s1, ok1 := CountBelow(ik, im, 1e-5, sigma)
	runtime.GOMAXPROCS(2)
	n2, s2, ok2 := CountBelow(ik, im, 1e-5, sigma)
	runtime.GOMAXPROCS(old)
	if !ok1 || !ok2 || n1 != n2 || math.Float64bits(s1) != math.Float64bits(s2) {
		t.Errorf("GOMAXPROCS 1: (%d, %v, %v), 2: (%d, %v, %v)", n1, s1, ok1, n2, s2, ok2)
	}
}

// TestCounterReuse: a Counter gives CountBelow's results bit for bit, in
// any order of shifts, also after a failed factorization.
func TestCounterReuse(t *testing.T) {
	k, m := p1Square(25)
	ik, im := toISym(k), toISym(m)
	c := NewCounter(ik, im)
	for _, sigma := range []float64{500, 20, 1e4, 0, 20, 733.5} {
		n1, s1, ok1 := CountBelow(ik, im, 1e-4, sigma)
		n2, s2, ok2 := c.CountBelow(1e-4, sigma)
		if n1 != n2 || math.Float64bits(s1) != math.Float64bits(s2) || ok1 != ok2 {
			t.Errorf("σ=%g: CountBelow (%d, %v, %v), Counter (%d, %v, %v)", sigma, n1, s1, ok1, n2, s2, ok2)
		}
	}
	// grid5(1) is the 1×1 matrix 4/h² = 16 (h = 1/2): σ = 16 gives a zero
	// pivot.
	one := NewCounter(toISym(grid5(1)), toISym(identity(1)))
	if _, _, ok := one.CountBelow(1, 16); ok {
		t.Error("zero pivot at σ = λ not reported")
	}
	if n, sp, ok := one.CountBelow(1, 17); !ok || n != 1 || sp > 17 || sp < 17-1e-12 {
		t.Errorf("after a failure: (%d, %v, %v), want (1, ≈17, true)", n, sp, ok)
	}
}

// TestSolveBlock: the block solve gives the bits of SolveTo for block
// counts around the group size, in one group and split over goroutines.
func TestSolveBlock(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 9))
	for _, s := range []*Sym{shifted(grid5(20), identity(400), 300), grid7(16)} {
		f, ok := Factor(s, Order(s))
		if !ok {
			t.Fatal("factorization failed")
		}
		n := s.N()
		for _, count := range []int{1, 2, 3, 4, 5, 9, solveWidth, solveWidth + 1, 2*solveWidth + 2} {
			b := newVectors(count, n)
			for _, v := range b {
				for i := range v {
					v[i] = r.Float64()
				}
			}
			want := newVectors(count, n)
			for c := range b {
				f.SolveTo(want[c], b[c])
			}
			if s.N() > 1000 && len(f.Val)*count < parallelSolveWork && count > 8 {
				t.Fatalf("n=%d count %d: the split over goroutines is not reached", n, count)
			}
			got := newVectors(count, n)
			var work []float64
			f.solveBlockTo(got, b, &work)
			for c := range got {
				if !slices.Equal(got[c], want[c]) {
					t.Errorf("n=%d count %d: vector %d differs", n, count, c)
				}
			}
		}
	}
}

func checkEigs(t *testing.T, name string, k, m *Sym, vals []float64, vecs [][]float64, want []float64, tol float64) {
	t.Helper()
	n := k.N()
	for c, v := range vals {
		if math.Abs(v-want[c]) > tol*math.Abs(want[c]) {
			t.Errorf("%s: λ_%d = %.15g, want %.15g", name, c+1, v, want[c])
		}
	}
	kx, mx := make([]float64, n), make([]float64, n)
	for c := range vecs {
		k.MulVecTo(kx, vecs[c])
		m.MulVecTo(mx, vecs[c])
		res := 0.0
		for i := range kx {
			res = math.Max(res, math.Abs(kx[i]-vals[c]*mx[i]))
		}
		if rel := res / (infNorm(k) * maxAbs(vecs[c])); rel > 1e-11 {
			t.Errorf("%s: pair %d relative residual %g", name, c, rel)
		}
		for d := 0; d <= c; d++ {
			want := 0.0
			if d == c {
				want = 1
			}
			if g := dot(vecs[d], mx); math.Abs(g-want) > 1e-10 {
				t.Errorf("%s: (x_%d, M x_%d) = %g", name, d, c, g)
			}
		}
	}
}

func maxAbs(x []float64) float64 {
	r := 0.0
	for _, v := range x {
		r = math.Max(r, math.Abs(v))
	}
	return r
}

func TestLowestEigs(t *testing.T) {
	k20, m20 := p1Square(20)
	for _, tc := range []struct {
		name  string
		k, m  *Sym
		count int
		want  func() []float64
	}{
		// λ(1,2) = λ(2,1) etc.: double eigenvalues.
		{"grid5 m=40", grid5(40), identity(1600), 8, func() []float64 { return grid5Eigs(40) }},
		{"grid5 m=10 dense", grid5(10), identity(100), 5, func() []float64 { return grid5Eigs(10) }},
		// Three disconnected copies: λ_1 three times, λ_2 = λ_3 six times.
		{"3 × grid5 m=25", threeCopies(grid5(25)), identity(3 * 625), 9, func() []float64 {
			var e []float64
			for _, v := range grid5Eigs(25) {
				e = append(e, v, v, v)
			}
			return e
		}},
		{"P1 m=20", k20, m20, 6, func() []float64 { return denseGeneralizedEigs(t, k20, m20) }},
		{"P1 m=20 shifted −30", shifted(k20, m20, 30), m20, 4, func() []float64 {
			e := denseGeneralizedEigs(t, k20, m20)
			for i := range e {
				e[i] -= 30
			}
			return e
		}},
	} {
		vals, vecs, err := LowestEigs(tc.k, tc.m, tc.count)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		checkEigs(t, tc.name, tc.k, tc.m, vals, vecs, tc.want(), 1e-10)
		v2, _, _ := LowestEigs(tc.k, tc.m, tc.count)
		if !slices.Equal(vals, v2) {
			t.Errorf("%s: not deterministic", tc.name)
		}
	}
}

// threeCopies returns the block-diagonal matrix diag(s, s, s).
func threeCopies(s *Sym) *Sym {
	n := s.N()
	b := NewBuilder(3 * n)
	for c := 0; c < 3; c++ {
		for j := 0; j < n; j++ {
			for q := s.Pat.colPtr[j]; q < s.Pat.colPtr[j+1]; q++ {
				b.Add(c*n+int(s.Pat.rowIdx[q]), c*n+j, s.Val[q])
			}
		}
	}
	return b.Build()
}

func benchGrid(side int) (*ISym, *ISym) {
	k, m := p1Square(side)
	return toISym(k), toISym(m)
}

var benchSides = []int{100, 316, 1000}

// BenchmarkFactor: nested-dissection order, symbolic analysis and numeric
// LDLᵀ of the P1 stiffness matrix on side² unknowns.
func BenchmarkFactor(b *testing.B) {
	for _, side := range benchSides {
		k, _ := p1Square(side)
		b.Run(fmt.Sprintf("n=%d", side*side), func(b *testing.B) {
			var nnz int
			for b.Loop() {
				f, ok := Factor(k, Order(k))
				if !ok {
					b.Fatal("factorization failed")
				}
				nnz = f.NNZ()
			}
			b.ReportMetric(float64(nnz), "nnzL")
			b.ReportMetric(peakRSS(), "peakRSS-MiB")
		})
	}
}

// BenchmarkCountBelow: the verified count on the P1 pencil, σ = 100.
func BenchmarkCountBelow(b *testing.B) {
	for _, side := range benchSides {
		k, m := benchGrid(side)
		b.Run(fmt.Sprintf("n=%d", side*side), func(b *testing.B) {
			for b.Loop() {
				if _, _, ok := CountBelow(k, m, 1e-9, 100); !ok {
					b.Fatal("factorization failed")
				}
			}
			b.ReportMetric(peakRSS(), "peakRSS-MiB")
		})
	}
}

// BenchmarkCounterShifts: one Counter on the P1 pencil at four shifts, as
// the stage-A searches use it (the workspaces are reused across shifts).
func BenchmarkCounterShifts(b *testing.B) {
	for _, side := range benchSides[:2] {
		k, m := benchGrid(side)
		b.Run(fmt.Sprintf("n=%d", side*side), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				c := NewCounter(k, m)
				for _, sigma := range []float64{20, 50, 100, 200} {
					if _, _, ok := c.CountBelow(1e-9, sigma); !ok {
						b.Fatal("factorization failed")
					}
				}
			}
		})
	}
}

// BenchmarkLowestEigs: the 10 lowest eigenpairs of the P1 pencil.
func BenchmarkLowestEigs(b *testing.B) {
	for _, side := range benchSides[:2] {
		k, m := p1Square(side)
		b.Run(fmt.Sprintf("n=%d", side*side), func(b *testing.B) {
			for b.Loop() {
				if _, _, err := LowestEigs(k, m, 10); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(peakRSS(), "peakRSS-MiB")
		})
	}
}

// peakRSS returns the process's peak resident set size in MiB (Linux
// VmHWM), or 0 where /proc is not available. Sub-benchmarks run in
// increasing size, so after each one it is that size's peak.
func peakRSS() float64 {
	data, err := os.ReadFile("/proc/self/status")
	if err != nil {
		return 0
	}
	for _, line := range strings.Split(string(data), "\n") {
		if rest, ok := strings.CutPrefix(line, "VmHWM:"); ok {
			kb, err := strconv.Atoi(strings.TrimSuffix(strings.TrimSpace(rest), " kB"))
			if err == nil {
				return float64(kb) / 1024
			}
		}
	}
	return 0
}

// dot returns x·y (a check, not part of the solver).
func dot(x, y []float64) float64 { return floats.Dot(x, y) }

func newVectors(p, n int) [][]float64 {
	v := make([][]float64, p)
	for i := range v {
		v[i] = make([]float64, n)
	}
	return v
}

package band

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"runtime"
	"sort"
	"testing"

	"gonum.org/v1/gonum/floats"

	"gapcert/enclose/internal/geneig"
	"gapcert/interval"
)

// Test pencils with closed-form spectra (common practice, derived here).
// T = tridiag(−1, 2, −1) of size n has eigenvectors v_k = (sin(jkθ))_j,
// θ = π/(n+1), with T v_k = t_k v_k, t_k = 2 − 2cos kθ. Any polynomial in T
// shares them, so the pencil (T^q, 6I − T) has the eigenvalues
// t_k^q/(6 − t_k). For q = 1, 6I − T = tridiag(1, 4, 1), and (T, 6I − T) is
// (up to the factors 1/h and h/6) the P1 finite-element pencil of −u'' on
// (0, π) with N = n+1 uniform elements, h = π/N, whose discrete eigenvalues
// are λ_k = (6/h²)(1 − cos kh)/(2 + cos kh). T^q has half-bandwidth q and
// integer entries, so these pencils are exact in float64.

// powT returns T^q (half-bandwidth q) as a band matrix.
func powT(n, q int) *Sym {
	d := NewSym(n, 0)
	for i := 0; i < n; i++ {
		d.Data[i] = 1
	}
	for r := 1; r <= q; r++ {
		e := NewSym(n, r)
		for i := 0; i < n; i++ {
			for j := max(0, i-r); j <= i; j++ {
				s := 2 * d.At(i, j)
				if i > 0 {
					s -= d.At(i-1, j)
				}
				if i < n-1 {
					s -= d.At(i+1, j)
				}
				e.Data[i*(r+1)+i-j] = s
			}
		}
		d = e
	}
	return d
}

// massT returns 6I − T = tridiag(1, 4, 1); λ_min ≥ 2 (Gershgorin).
func massT(n int) *Sym {
	m := NewSym(n, 1)
	for i := 0; i < n; i++ {
		m.Data[i*2] = 4
		if i > 0 {
			m.Data[i*2+1] = 1
		}
	}
	return m
}

// closedForm returns t_k^q/(6 − t_k) − shift, k = 1 … n, ascending.
func closedForm(n, q int, shift float64) []float64 {
	v := make([]float64, n)
	for k := 1; k <= n; k++ {
		// t_k = 2 − 2cos kθ = 4 sin²(kθ/2), without cancellation.
		sn := math.Sin(float64(k) * math.Pi / float64(2*(n+1)))
		t := 4 * sn * sn
		v[k-1] = math.Pow(t, float64(q))/(6-t) - shift
	}
	sort.Float64s(v)
	return v
}

func toISym(s *Sym) *ISym {
	t := NewISym(s.N, s.W)
	for i, v := range s.Data {
		t.Data[i] = interval.Point(v)
	}
	return t
}

// shiftedK returns K − c·M for the exact float c (entries exact here).
func shiftedK(k, m *Sym, c float64) *Sym {
	w := max(k.W, m.W)
	s := NewSym(k.N, w)
	for i := 0; i < k.N; i++ {
		for j := max(0, i-w); j <= i; j++ {
			s.Data[i*(w+1)+i-j] = k.At(i, j) - c*m.At(i, j)
		}
	}
	return s
}

func TestFactorResidual(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 5))
	for _, tc := range []struct{ n, w int }{{1, 0}, {1, 2}, {2, 1}, {2, 2}, {3, 2}, {4, 4}, {5, 4}, {6, 4}, {50, 3}, {200, 10}} {
		// Diagonally dominant random band matrix, some diagonals negative.
		s := NewSym(tc.n, tc.w)
		for i := 0; i < tc.n; i++ {
			for j := max(0, i-tc.w); j < i; j++ {
				s.Data[i*(tc.w+1)+i-j] = 2*r.Float64() - 1
			}
			d := float64(2*tc.w + 1)
			if i%3 == 1 {
				d = -d
			}
			s.Data[i*(tc.w+1)] = d
		}
		f, ok := s.Factor()
		if !ok {
			t.Fatalf("n=%d w=%d: factorization failed", tc.n, tc.w)
		}
		maxRes := 0.0
		for i := 0; i < tc.n; i++ {
			for j := max(0, i-tc.w); j <= i; j++ {
				sum := 0.0
				for k := max(0, i-tc.w); k <= j; k++ {
					sum += f.L(i, k) * f.D(k) * f.L(j, k)
				}
				maxRes = math.Max(maxRes, math.Abs(s.At(i, j)-sum))
			}
		}
		if maxRes > 1e-13*float64(2*tc.w+1) {
			t.Errorf("n=%d w=%d: ‖S − LDLᵀ‖_max = %g", tc.n, tc.w, maxRes)
		}
		// Solve against a known solution.
		x := make([]float64, tc.n)
		for i := range x {
			x[i] = float64(i%7) - 3
		}
		b := make([]float64, tc.n)
		s.MulVecTo(b, x)
		f.SolveTo(b, b)
		for i := range x {
			if math.Abs(b[i]-x[i]) > 1e-12 {
				t.Errorf("n=%d w=%d: solve x[%d] = %g, want %g", tc.n, tc.w, i, b[i], x[i])
				break
			}
		}
	}
	if _, ok := NewSym(2, 1).Factor(); ok {
		t.Errorf("zero matrix factored")
	}
}

func TestCountBelowClosedForm(t *testing.T) {
	for _, tc := range []struct {
		n, q  int
		shift float64
	}{{1, 1, 0}, {2, 1, 0}, {3, 2, 0}, {4, 4, 0}, {5, 4, 0}, {10, 1, 0.125}, {30, 4, 0.0625}, {100, 2, 0}, {1000, 1, 0}, {999, 1, 0.25}, {100000, 1, 0}} {
		m := massT(tc.n)
		k := shiftedK(powT(tc.n, tc.q), m, tc.shift)
		want := closedForm(tc.n, tc.q, tc.shift)
		// Shifts halfway between consecutive eigenvalues (and below all).
		sigmas := []float64{want[0] - 1}
		for i := 0; i+1 < len(want) && i < 6; i++ {
			sigmas = append(sigmas, (want[i]+want[i+1])/2)
		}
		for _, sigma := range sigmas {
			n, sp, ok := CountBelow(toISym(k), toISym(m), 2, sigma)
			if !ok {
				t.Fatalf("n=%d q=%d σ=%g: factorization failed", tc.n, tc.q, sigma)
			}
			truth := sort.SearchFloat64s(want, sp) // #{λ < σ'}
			if n != truth {
				t.Errorf("n=%d q=%d σ=%g: count %d, closed form gives %d below σ' = %g", tc.n, tc.q, sigma, n, truth, sp)
			}
			if d := (sigma - sp) / math.Max(1, math.Abs(sigma)); !(d >= 0 && d <= 1e-12) {
				t.Errorf("n=%d q=%d σ=%g: σ' = %g, relative loss %g", tc.n, tc.q, sigma, sp, d)
			}
		}
	}
}

// denseEigs returns the eigenvalues of the dense pencil of two band
// matrices given as functions, with gonum.
func denseEigs(t *testing.T, n int, k, m func(i, j int) float64) []float64 {
	kd, md := make([]float64, n*n), make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			kd[i*n+j], md[i*n+j] = k(i, j), m(i, j)
		}
	}
	vals, _, err := geneig.Solve(kd, md, n)
	if err != nil {
		t.Fatal(err)
	}
	return vals
}

func TestCountBelowThick(t *testing.T) {
	const n, q, rad = 60, 2, 1e-6
	m0 := massT(n)
	k0 := powT(n, q)
	k, m := toISym(k0), toISym(m0)
	for i := range k.Data {
		k.Data[i] = interval.I{Lo: k.Data[i].Lo - rad, Hi: k.Data[i].Hi + rad}
	}
	for i := range m.Data {
		m.Data[i] = interval.I{Lo: m.Data[i].Lo - rad, Hi: m.Data[i].Hi + rad}
	}
	// λ_min(M) ≥ 4 − rad − 2(1 + rad) for every member (Gershgorin).
	mMin := 2 - 4*rad
	want := closedForm(n, q, 0)
	r := rand.New(rand.NewPCG(9, 9))
	for c := 0; c < 5; c++ {
		sigma := (want[c] + want[c+1]) / 2
		cnt, sp, ok := CountBelow(k, m, mMin, sigma)
		if !ok || cnt != c+1 {
			t.Fatalf("σ=%g: count %d ok %v, want %d", sigma, cnt, ok, c+1)
		}
		// Members: the ends and random points of every entry.
		for sample := 0; sample < 4; sample++ {
			pick := func(v interval.I) float64 {
				switch sample {
				case 0:
					return v.Lo
				case 1:
					return v.Hi
				}
				return v.Lo + r.Float64()*(v.Hi-v.Lo)
			}
			kk, mm := NewSym(n, k.W), NewSym(n, m.W)
			for i := range kk.Data {
				kk.Data[i] = pick(k.Data[i])
			}
			for i := range mm.Data {
				mm.Data[i] = pick(m.Data[i])
			}
			vals := denseEigs(t, n, kk.At, mm.At)
			if below := sort.SearchFloat64s(vals, sp); below > cnt {
				t.Errorf("σ=%g sample %d: %d eigenvalues below σ' = %g, count said ≤ %d", sigma, sample, below, sp, cnt)
			}
		}
		if sp > sigma || sigma-sp > 1e-3 {
			t.Errorf("σ=%g: σ' = %g", sigma, sp)
		}
	}
}

func TestCountBelowAtEigenvalue(t *testing.T) {
	// (T, I) with n = 2 has eigenvalues 1 and 3; at σ = 1 the exact LDLᵀ of
	// T − I = [[1, −1], [−1, 1]] ends with the pivot 0.
	id := NewSym(2, 0)
	id.Data[0], id.Data[1] = 1, 1
	if _, _, ok := CountBelow(toISym(powT(2, 1)), toISym(id), 1, 1); ok {
		t.Errorf("CountBelow at an exact eigenvalue with a zero pivot reported ok")
	}
	// (T, 6I − T), n = 5: t_3 = 2 (θ = π/6), eigenvalue 2/4 = 1/2 exactly.
	// Whatever the rounding, a returned count must be sound.
	n, sp, ok := CountBelow(toISym(powT(5, 1)), toISym(massT(5)), 2, 0.5)
	if ok {
		if below := sort.SearchFloat64s(closedForm(5, 1, 0), sp); below > n || sp >= 0.5 {
			t.Errorf("σ = 1/2: count %d, σ' = %g, but %d eigenvalues below", n, sp, below)
		}
	}
}

func TestLowestEigs(t *testing.T) {
	for _, tc := range []struct {
		n, q, count int
		shift       float64
	}{{1, 1, 1, 0}, {2, 2, 2, 0}, {5, 4, 3, 0}, {150, 1, 4, 0}, {1000, 1, 2, 0}, {3000, 2, 5, 0}, {2000, 1, 6, 0.03125}, {2000, 1, 3, 1}, {20000, 1, 2, 0}} {
		m := massT(tc.n)
		k := shiftedK(powT(tc.n, tc.q), m, tc.shift)
		vals, vecs, err := LowestEigs(k, m, tc.count)
		if err != nil {
			t.Fatalf("n=%d q=%d: %v", tc.n, tc.q, err)
		}
		want := closedForm(tc.n, tc.q, tc.shift)
		// ‖K‖∞/λ_min(M) bounds the spectrum's scale; eigenvalues far below
		// it are limited by the float evaluation of Kx.
		scale := infNorm(k) / 2
		for i, v := range vals {
			if d := math.Abs(v - want[i]); d > 1e-12*math.Abs(want[i])+1e-15*scale {
				t.Errorf("n=%d q=%d: λ_%d = %.17g, closed form %.17g (error %.2g·scale)", tc.n, tc.q, i+1, v, want[i], d/scale)
			}
		}
		checkVectors(t, k, m, vals, vecs)
	}
}

// checkVectors tests residuals and M-orthonormality.
func checkVectors(t *testing.T, k, m *Sym, vals []float64, vecs [][]float64) {
	t.Helper()
	n := k.N
	kx, mx := make([]float64, n), make([]float64, n)
	normK, normM := infNorm(k), infNorm(m)
	for i, x := range vecs {
		k.MulVecTo(kx, x)
		m.MulVecTo(mx, x)
		res := 0.0
		for j := range kx {
			d := kx[j] - vals[i]*mx[j]
			res += d * d
		}
		if rel := math.Sqrt(res) / ((normK + math.Abs(vals[i])*normM) * math.Sqrt(dot(x, x))); rel > 1e-12 {
			t.Errorf("n=%d: pair %d relative residual %g", n, i+1, rel)
		}
		for j := 0; j <= i; j++ {
			m.MulVecTo(mx, vecs[j])
			g := dot(x, mx)
			if i == j {
				g--
			}
			if math.Abs(g) > 1e-10 {
				t.Errorf("n=%d: (x_%d, M x_%d) off by %g", n, i+1, j+1, g)
			}
		}
	}
}

func TestLowestEigsMultiple(t *testing.T) {
	// Direct sum of two copies of (T, 6I − T): every eigenvalue is double.
	for _, half := range []int{40, 700} {
		n := 2 * half
		k, m := NewSym(n, 1), NewSym(n, 1)
		for i := 0; i < n; i++ {
			k.Data[2*i], m.Data[2*i] = 2, 4
			if i > 0 && i != half {
				k.Data[2*i+1], m.Data[2*i+1] = -1, 1
			}
		}
		vals, vecs, err := LowestEigs(k, m, 4)
		if err != nil {
			t.Fatal(err)
		}
		want := closedForm(half, 1, 0)
		for i, v := range vals {
			if w := want[i/2]; math.Abs(v-w) > 1e-13*3 {
				t.Errorf("half=%d: λ_%d = %.17g, want %.17g (double)", half, i+1, v, w)
			}
		}
		checkVectors(t, k, m, vals, vecs)
	}
}

// Mass matrices must be positive definite.
func TestLowestEigsIndefiniteMass(t *testing.T) {
	k := powT(300, 1)
	m := shiftedK(massT(300), NewSym(300, 0), 0)
	for i := 0; i < 300; i++ {
		m.Data[2*i] = -4
	}
	if _, _, err := LowestEigs(k, m, 2); err == nil {
		t.Errorf("indefinite M accepted")
	}
}

func benchPencil(n, w int) (*ISym, *ISym) {
	return toISym(powT(n, w)), toISym(massT(n))
}

func BenchmarkFactor(b *testing.B) {
	for _, w := range []int{2, 4} {
		for _, n := range []int{1000, 10000, 100000} {
			s := shiftedK(powT(n, w), massT(n), 0.001)
			b.Run(name(n, w), func(b *testing.B) {
				var f LDL
				b.ReportAllocs()
				for b.Loop() {
					if !f.Factorize(s) {
						b.Fatal("factorization failed")
					}
				}
			})
		}
	}
}

func BenchmarkCountBelow(b *testing.B) {
	for _, w := range []int{2, 4} {
		for _, n := range []int{1000, 10000, 100000} {
			k, m := benchPencil(n, w)
			b.Run(name(n, w), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, _, ok := CountBelow(k, m, 2, 0.001); !ok {
						b.Fatal("factorization failed")
					}
				}
			})
		}
	}
}

func name(n, w int) string { return fmt.Sprintf("n=%d/w=%d", n, w) }

// TestCountBelowIndependentOfProcs checks that the parallel residual gives
// bit-identical results for one and several threads.
func TestCountBelowIndependentOfProcs(t *testing.T) {
	k, m := benchPencil(50000, 2)
	prev := runtime.GOMAXPROCS(1)
	n1, s1, ok1 := CountBelow(k, m, 2, 1e-9)
	runtime.GOMAXPROCS(max(2, prev))
	n2, s2, ok2 := CountBelow(k, m, 2, 1e-9)
	runtime.GOMAXPROCS(prev)
	if n1 != n2 || s1 != s2 || ok1 != ok2 || !ok1 {
		t.Errorf("GOMAXPROCS 1: (%d, %g, %v); several: (%d, %g, %v)", n1, s1, ok1, n2, s2, ok2)
	}
}

func TestGershgorinLower(t *testing.T) {
	for _, tc := range []struct {
		name string
		m    *ISym
		want float64
	}{
		// tridiag(1, 4, 1): interior rows give 4 − 2 = 2 (closed form
		// λ_min = 6 − t_n > 2, see above); n = 1 gives 4.
		{"tridiag(1,4,1) n=1", toISym(massT(1)), 4},
		{"tridiag(1,4,1) n=50", toISym(massT(50)), 2},
		// T² rows (5, −4, 1), (−4, 6, −4, 1), (1, −4, 6, −4, 1): 6 − 10 = −4.
		{"T² n=9", toISym(powT(9, 2)), -4},
	} {
		if got := GershgorinLower(tc.m); got != tc.want {
			t.Errorf("%s: %g, want %g", tc.name, got, tc.want)
		}
	}
	// Thick entries: 4 ± 1e-3 and 1 ± 1e-3 give at most 4 − 1e-3 − 2(1 + 1e-3).
	m := toISym(massT(10))
	for i := range m.Data {
		m.Data[i] = interval.I{Lo: m.Data[i].Lo - 1e-3, Hi: m.Data[i].Hi + 1e-3}
	}
	// Exact value from the stored ends (math/big): inf M_ii − 2 sup M_i,i−1.
	exact := new(big.Rat).SetFloat64(m.At(5, 5).Lo)
	exact.Sub(exact, new(big.Rat).Mul(big.NewRat(2, 1), new(big.Rat).SetFloat64(m.At(5, 4).Hi)))
	got := GershgorinLower(m)
	diff := new(big.Rat).Sub(exact, new(big.Rat).SetFloat64(got))
	if d, _ := diff.Float64(); !(d >= 0 && d < 1e-15) {
		t.Errorf("thick tridiag: %g, exact %s (difference %g)", got, exact.FloatString(20), d)
	}
}

func BenchmarkLowestEigs(b *testing.B) {
	for _, n := range []int{10000, 100000} {
		k, m := powT(n, 1), massT(n)
		b.Run(fmt.Sprintf("n=%d/count=2", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, _, err := LowestEigs(k, m, 2); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// dot returns x·y (a check, not part of the solver).
func dot(x, y []float64) float64 { return floats.Dot(x, y) }

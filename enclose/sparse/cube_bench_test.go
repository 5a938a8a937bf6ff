package sparse_test

import (
	"fmt"
	"syscall"
	"testing"

	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh3"
	"gapcert/fem/problem"
	"gapcert/fem/tet"
	"gapcert/interval"
)

// cubeStageA returns the interval stage-A pencil of the Dirichlet unit
// cube given as a polyhedron, as the certifier builds it: the cone mesh of
// its 12 boundary triangles from the centre, refined levels times (12·8^levels
// tetrahedra), Crouzeix–Raviart elements, V = 0, no shift. Levels 2, 3 and 4
// give 1,440, 11,904 and 96,768 unknowns.
func cubeStageA(tb testing.TB, levels int) (k, m *sparse.ISym, mMin float64) {
	tb.Helper()
	p, err := problem.Parse([]byte(`{"domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]], "faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}, "boundary": "dirichlet", "eigenvalues": 2}`))
	if err != nil {
		tb.Fatal(err)
	}
	ph := p.Polyhedron
	m3, err := mesh3.Cones(ph.Nodes(), len(ph.Vertices), ph.Triangles(), ph.TriangleFaces())
	if err != nil {
		tb.Fatal(err)
	}
	for range levels {
		m3 = m3.Refine()
	}
	mt, err := tet.NewMesh(m3, len(ph.Faces))
	if err != nil {
		tb.Fatal(err)
	}
	v, err := tet.NewPotential(mt, p.Potential, 1)
	if err != nil {
		tb.Fatal(err)
	}
	bcs := make([]boundary.Condition, len(ph.Faces))
	for i := range bcs {
		bcs[i] = p.Boundary[0].Condition()
	}
	k, m, mMin, err = tet.NewCR(mt, bcs).Matrices(v, interval.I{})
	if err != nil {
		tb.Fatal(err)
	}
	return k, m, mMin
}

// factorWork returns the multiply-adds of an LDLᵀ factorization with the
// column counts of sym: Σ_k ℓ_k(ℓ_k+1)/2 plus nnz(L) divisions.
func factorWork(sym *sparse.Symbolic) float64 {
	n := sym.N()
	cp := sym.ColPtr()
	w := 0.0
	for j := 0; j < n; j++ {
		l := float64(cp[j+1] - cp[j])
		w += l*(l+1)/2 + l
	}
	return w
}

func BenchmarkCubeFactor(b *testing.B) {
	for _, levels := range []int{2, 3, 4} {
		k, _, _ := cubeStageA(b, levels)
		s := k.Mid()
		perm := sparse.Order(s)
		sym := sparse.Analyze(s, perm)
		for _, alg := range []struct {
			name      string
			factorize func(*sparse.LDL, *sparse.Symbolic, *sparse.Sym) bool
		}{{"up-looking", sparse.FactorizeUpLooking}, {"multifrontal", sparse.FactorizeMultifrontal}} {
			b.Run(fmt.Sprintf("n=%d/%s", s.N(), alg.name), func(b *testing.B) {
				var f sparse.LDL
				cpu := cpuClock()
				for b.Loop() {
					if !alg.factorize(&f, sym, s) {
						b.Fatal("factorization failed")
					}
				}
				b.ReportMetric(float64(cpuClock()-cpu)/float64(b.N), "cpu-ns/op")
				b.ReportMetric(float64(s.N()), "n")
				b.ReportMetric(float64(s.Pat.NNZ()), "nnzA")
				b.ReportMetric(float64(sym.NNZ()), "nnzL")
				b.ReportMetric(2*factorWork(sym), "flops")
			})
		}
	}
}

// cpuClock returns the user and system CPU time of the process in
// nanoseconds (getrusage): on a shared machine the CPU time per operation
// is steadier than the wall time.
func cpuClock() int64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		panic(err)
	}
	return ru.Utime.Nano() + ru.Stime.Nano()
}

// BenchmarkCubeStageA measures what the certifier does with the cube's
// stage-A pencil (fem/tet.NewStageA and its counts): LowestEigs of 6 pairs,
// then verified counts at 0.99·λ_h,2 and 0.99·λ_h,6 with the a-priori
// residual bound accepted up to a loss of 2⁻¹⁴ (as fem/tet sets it). The
// CPU time per operation is reported beside the wall time.
func BenchmarkCubeStageA(b *testing.B) {
	for _, c := range []struct{ levels, n int }{{3, 11904}, {4, 96768}} {
		var k, m *sparse.ISym
		var mMin float64
		pencil := func(b *testing.B) {
			if k == nil {
				k, m, mMin = cubeStageA(b, c.levels)
			}
		}
		b.Run(fmt.Sprintf("n=%d/LowestEigs", c.n), func(b *testing.B) {
			pencil(b)
			km, mm := k.Mid(), m.Mid()
			cpu := cpuClock()
			for b.Loop() {
				if _, _, err := sparse.LowestEigs(km, mm, 6); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(cpuClock()-cpu)/float64(b.N), "cpu-ns/op")
		})
		b.Run(fmt.Sprintf("n=%d/CountBelow", c.n), func(b *testing.B) {
			pencil(b)
			// Shifts 0.99 λ_h,2 and 0.99 λ_h,6 of the Dirichlet cube's
			// discrete pencil (LowestEigs, computed once here).
			vals, _, err := sparse.LowestEigs(k.Mid(), m.Mid(), 6)
			if err != nil {
				b.Fatal(err)
			}
			counter := sparse.NewCounter(k, m)
			counter.SetRoundoffLoss(0x1p-14)
			cpu := cpuClock()
			for b.Loop() {
				for _, sigma := range []float64{0.99 * vals[1], 0.99 * vals[5]} {
					if _, _, ok := counter.CountBelow(mMin, sigma); !ok {
						b.Fatal("count failed")
					}
				}
			}
			b.ReportMetric(float64(cpuClock()-cpu)/float64(b.N)/2, "cpu-ns/count")
		})
	}
}

package sparse_test

import (
	"fmt"
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
func cubeStageA(tb testing.TB, levels int) (k, m *sparse.ISym) {
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
	k, m, _, err = tet.NewCR(mt, bcs).Matrices(v, interval.I{})
	if err != nil {
		tb.Fatal(err)
	}
	return k, m
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
		k, _ := cubeStageA(b, levels)
		s := k.Mid()
		perm := sparse.Order(s)
		sym := sparse.Analyze(s, perm)
		for _, alg := range []struct {
			name      string
			factorize func(*sparse.LDL, *sparse.Symbolic, *sparse.Sym) bool
		}{{"up-looking", sparse.FactorizeUpLooking}, {"multifrontal", sparse.FactorizeMultifrontal}} {
			b.Run(fmt.Sprintf("n=%d/%s", s.N(), alg.name), func(b *testing.B) {
				var f sparse.LDL
				for b.Loop() {
					if !alg.factorize(&f, sym, s) {
						b.Fatal("factorization failed")
					}
				}
				b.ReportMetric(float64(s.N()), "n")
				b.ReportMetric(float64(s.Pat.NNZ()), "nnzA")
				b.ReportMetric(float64(sym.NNZ()), "nnzL")
				b.ReportMetric(2*factorWork(sym), "flops")
			})
		}
	}
}

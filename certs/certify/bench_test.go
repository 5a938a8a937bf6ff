package certify

import (
	"fmt"
	"runtime"
	"testing"
	"time"

	"gapcert/fem/problem"
)

func benchmarkCertify(b *testing.B, src string, relWidth float64) {
	p, err := problem.Parse([]byte(src))
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := Certify(p, Options{RelWidth: relWidth}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkHarmonic: V = x² on (−2, 2), Dirichlet, relative width 1e-10.
func BenchmarkHarmonic(b *testing.B) {
	benchmarkCertify(b, `{"domain":{"interval":["-2","2"]},"potential":"x^2","boundary":"dirichlet","eigenvalues":2}`, 1e-10)
}

// BenchmarkMathieu: V = 2cos 2x on (0, π), Dirichlet, relative width 1e-10.
func BenchmarkMathieu(b *testing.B) {
	benchmarkCertify(b, `{"domain":{"interval":["0","pi"]},"potential":"2*cos(2*x)","boundary":"dirichlet","eigenvalues":2}`, 1e-10)
}

// BenchmarkRobinSweepCase: one problem of the soundness sweep (relative
// width 1e-7, three eigenvalues, mixed Neumann/Robin ends).
func BenchmarkRobinSweepCase(b *testing.B) {
	benchmarkCertify(b, `{"domain":{"interval":["-0.129","-0.129+7.28"]},"potential":"-15.57","boundary":["neumann",{"robin":"3.454"}],"eigenvalues":3}`, 1e-7)
}

// BenchmarkPolygonStageA: one polygon computation (P4 Ritz on a coarse
// mesh, ECR stage A on a fine one) on the unit square with V = x² + y²,
// Dirichlet, at stage-A meshes of about 2·10⁴, 8·10⁴, 3·10⁵ and 1.3·10⁶
// unknowns. Reports the stage-A unknowns and the peak heap.
func BenchmarkPolygonStageA(b *testing.B) {
	p, err := problem.Parse([]byte(`{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":"x^2 + y^2","boundary":"dirichlet","eigenvalues":2}`))
	if err != nil {
		b.Fatal(err)
	}
	for _, level := range []int{6, 7, 8, 9} {
		r, err := initialRecipe(p)
		if err != nil {
			b.Fatal(err)
		}
		r.stageARefine, r.refine = level, level-polygonRitzLag
		b.Run(fmt.Sprintf("refine%d", level), func(b *testing.B) {
			var peak uint64
			for i := 0; i < b.N; i++ {
				runtime.GC()
				var before runtime.MemStats
				runtime.ReadMemStats(&before)
				done := make(chan struct{})
				go func() { // sample the heap while computing
					t := time.NewTicker(50 * time.Millisecond)
					defer t.Stop()
					for {
						select {
						case <-done:
							return
						case <-t.C:
							var ms runtime.MemStats
							runtime.ReadMemStats(&ms)
							peak = max(peak, ms.HeapAlloc)
						}
					}
				}()
				out, err := compute(p, r)
				close(done)
				if err != nil {
					b.Fatal(err)
				}
				b.ReportMetric(float64(out.polygon.stageAUnknowns), "unknowns")
			}
			b.ReportMetric(float64(peak)/(1<<20), "peak-MiB")
		})
	}
}

package certify

import (
	"context"
	"fmt"
	"math"
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
		if _, err := Certify(context.Background(), p, Options{RelWidth: widthText(relWidth)}); err != nil {
			b.Fatal(err)
		}
	}
}

// heapPeak runs f and returns the largest live heap sampled every period
// while it runs (after a garbage collection before it starts).
func heapPeak(period time.Duration, f func()) uint64 {
	runtime.GC()
	var peak uint64
	done := make(chan struct{})
	sampled := make(chan struct{})
	go func() {
		defer close(sampled)
		t := time.NewTicker(period)
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
	f()
	close(done)
	<-sampled
	return peak
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
				var out *outcome
				var err error
				peak = max(peak, heapPeak(50*time.Millisecond, func() { out, err = compute(p, r) }))
				if err != nil {
					b.Fatal(err)
				}
				b.ReportMetric(float64(out.polygon.stageAUnknowns), "unknowns")
			}
			b.ReportMetric(float64(peak)/(1<<20), "peak-MiB")
		})
	}
}

// polygonCases are the polygon width targets: the unit square (Dirichlet,
// 1e-10), the equilateral triangle of side 1 (Dirichlet, 1e-9), a
// trapezoid of our own with Robin α = 1 on every side and V = x² + y²
// (1e-7) and the L-shape of three unit squares (Dirichlet, 1e-6).
// The rows are the stage-B recipes of BenchmarkPolygonConvergence
// (refinements, degree, graded levels).
var polygonCases = []struct {
	name, src string
	target    float64
	rows      [][3]int
}{
	{"square", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"dirichlet","eigenvalues":2}`, 1e-10,
		[][3]int{{1, 4, 0}, {1, 6, 0}, {1, 8, 0}, {2, 8, 0}, {3, 8, 0}}},
	{"equilateral", `{"domain":{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},"boundary":"dirichlet","eigenvalues":2}`, 1e-9,
		[][3]int{{1, 4, 0}, {1, 6, 0}, {1, 8, 0}, {2, 8, 0}, {3, 8, 0}}},
	{"trapezoid", `{"domain":{"polygon":[["-1","-1/2"],["3/2","-1/2"],["1","1"],["-1/2","1"]]},"potential":"x^2+y^2","boundary":{"robin":"1"},"eigenvalues":2}`, 1e-7,
		[][3]int{{3, 4, 0}, {3, 6, 0}, {4, 6, 0}, {4, 8, 0}, {5, 6, 0}}},
	{"lshape", `{"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]},"boundary":"dirichlet","eigenvalues":2}`, 1e-6,
		[][3]int{{1, 4, 6}, {1, 6, 10}, {1, 7, 12}, {1, 8, 12}, {2, 8, 12}}},
}

// BenchmarkPolygonTargets: the whole certification of each polygon case
// at its target width (fresh table caches are not forced: the first
// iteration includes building the exact reference tables).
func BenchmarkPolygonTargets(b *testing.B) {
	for _, c := range polygonCases {
		b.Run(c.name, func(b *testing.B) {
			p, err := problem.Parse([]byte(c.src))
			if err != nil {
				b.Fatal(err)
			}
			for i := 0; i < b.N; i++ {
				cert, err := Certify(context.Background(), p, Options{RelWidth: widthText(c.target), TimeLimit: 10 * time.Minute})
				if err != nil {
					b.Fatal(err)
				}
				if len(cert.Warnings) > 0 {
					b.Fatalf("%s: %v", c.name, cert.Warnings)
				}
			}
		})
	}
}

// BenchmarkPolygonConvergence: width against unknowns for each polygon
// case, stage A alone (refining its mesh) and with stage B (raising the
// degree, then refining the trial mesh; for the L-shape, grading). Each
// sub-benchmark is one computation; the metrics are log10 of the relative
// widths of λ1 and of the gap and the unknowns of the limiting space.
func BenchmarkPolygonConvergence(b *testing.B) {
	for _, c := range polygonCases {
		p, err := problem.Parse([]byte(c.src))
		if err != nil {
			b.Fatal(err)
		}
		base, err := initialRecipe(p)
		if err != nil {
			b.Fatal(err)
		}
		type step struct {
			name string
			r    recipe
		}
		var steps []step
		corner := len(reentrantCorners(p)) > 0
		for lv := 3; lv <= 7; lv++ {
			r := base
			r.stageARefine, r.refine = lv, max(1, lv-polygonRitzLag)
			if corner {
				r.graded = lv
			}
			r.fluxDegree = -1 // stage A alone
			steps = append(steps, step{fmt.Sprintf("stageA-refine%d", lv), r})
		}
		// Stage B rows with stage A on five refinements (enough for ρ̂ to
		// separate in every case).
		for _, s := range c.rows {
			r := base
			r.refine, r.degree, r.graded = s[0], s[1], s[2]
			r.stageARefine = 5
			r.fluxDegree = r.degree - 1
			steps = append(steps, step{fmt.Sprintf("stageB-refine%d-p%d-graded%d", r.refine, r.degree, r.graded), r})
		}
		for _, s := range steps {
			b.Run(c.name+"/"+s.name, func(b *testing.B) {
				for i := 0; i < b.N; i++ {
					out, err := compute(p, s.r)
					if err != nil {
						b.Fatal(err)
					}
					res, err := assemble(p, s.r, out)
					if err != nil {
						b.Fatal(err)
					}
					b.ReportMetric(math.Log10(res.widths[0]), "log10-w-lambda1")
					b.ReportMetric(math.Log10(res.gapWidth), "log10-w-gap")
					if s.r.fluxDegree < 0 {
						b.ReportMetric(float64(out.polygon.stageAUnknowns), "unknowns")
					} else {
						b.ReportMetric(float64(out.polygon.fluxUnknowns), "unknowns")
					}
				}
			})
		}
	}
}

// BenchmarkTriangleThroughput: Dirichlet gap certificates of triangles
// with V = 0 at relative gap width 1e-3, over a fixed 4×4 grid of apexes
// (a, b) ∈ {0.1, 0.35, 0.6, 0.85} × {0.3, 0.6, 0.9, 1.2} on the base
// (0, 0)–(1, 0); reports certificates per hour on this machine.
//
// Measured on 2 shared cores, five interleaved runs each, medians: with the
// stage-A constant ≤ 0.2984 h_T (CR) 12938 certs/hour, with Liu's
// 0.1893 h_T 14315 (×1.11); the trial mesh needs one uniform refinement
// less on 10 of the 16 triangles.
func BenchmarkTriangleThroughput(b *testing.B) {
	var probs []*problem.Problem
	for _, a := range []string{"0.1", "0.35", "0.6", "0.85"} {
		for _, h := range []string{"0.3", "0.6", "0.9", "1.2"} {
			p, err := problem.Parse([]byte(fmt.Sprintf(`{"domain":{"polygon":[["0","0"],["1","0"],[%q,%q]]},"boundary":"dirichlet","eigenvalues":2}`, a, h)))
			if err != nil {
				b.Fatal(err)
			}
			probs = append(probs, p)
		}
	}
	b.ResetTimer()
	start := time.Now()
	done := 0
	for i := 0; i < b.N; i++ {
		for _, p := range probs {
			c, err := Certify(context.Background(), p, Options{RelWidth: "1e-3"})
			if err != nil {
				b.Fatal(err)
			}
			if len(c.Warnings) > 0 {
				b.Fatalf("%v", c.Warnings)
			}
			done++
		}
	}
	b.ReportMetric(float64(done)/time.Since(start).Hours(), "certs/hour")
}

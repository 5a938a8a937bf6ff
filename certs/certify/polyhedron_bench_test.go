package certify

import (
	"context"
	"fmt"
	"math"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"

	"gapcert/fem/problem"
)

// BenchmarkPolyhedronTargets certifies polyhedra at the relative width
// 1e-8 within their time limits and reports the widths reached, the trial
// and flux unknowns of the last step's record and its tetrahedra (trial and
// stage-A meshes): the unit
// cube (Dirichlet, 120 s; λ2 three times) and the regular tetrahedron
// with vertices (1,1,1), (1,−1,−1), (−1,1,−1), (−1,−1,1) (Dirichlet,
// 300 s; its edges are singular, exponent π/ω with ω = arccos(1/3), and
// the driver does not grade toward them).
//
// Measured on the idle machine (one run of the benchmark, certify
// --rel-width 1e-8 with the time limits above):
//
//	problem               wall    CPU     peak RSS  λ1       λ2       gap
//	cube                  49.5 s  75.5 s  1.47 GB   1.3e-11  2.2e-9   4.5e-9   target reached
//	regular tetrahedron   61.4 s  86.5 s  2.10 GB   8.5e-9   4.1e-8   9.9e-8   λ1 ≤ 1e-8
//
// The cube: steps of P_p on 96 tetrahedra with RT_p fluxes and N = 4
// (certify --progress, same machine):
//
//	p  stage-A unknowns  λ1       λ2       gap      step (wall)
//	3  1,440             0.46     0.75     2.3      0.2 s (no N separates)
//	5  11,904            1.6e-6   2.5e-3   5.0e-3   2.8 s
//	7  11,904            3.3e-10  5.3e-6   1.1e-5   7.5 s
//	8  96,768            1.3e-11  2.2e-9   4.5e-9   41.0 s
//
// The regular tetrahedron (another run of the benchmark, 1.5 s slower):
// the degree line on its 8 tetrahedra (stage A on 4096, 7,680 unknowns),
// then, at P_12, a stage-A level in place of the trial-mesh level, which
// is predicted not to fit (the driver's fallback):
//
//	p   trial  flux    λ1       λ2       gap      at (wall)
//	7   286    2,880   2.1e-5   2.5e-3   5.6e-3   3.7 s
//	8   455    3,960   9.3e-7   1.1e-3   2.3e-3   5.8 s
//	9   680    5,280   2.8e-7   2.4e-5   5.2e-5   9.7 s
//	10  969    6,864   6.2e-8   9.5e-6   2.1e-5   15.3 s
//	11  1,330  8,736   2.4e-8   3.2e-7   7.4e-7   24.3 s
//	12  1,771  10,920  1.0e-8   1.5e-7   3.3e-7   37.1 s
//	12  stage A on 32,768 (63,488)  8.5e-9  4.1e-8  9.9e-8   62.9 s
//
// λ1 ≈ 18.8715890: its Ritz and Lehmann–Goerisch errors close at about
// 3 per degree, as the p-version's p^(−4α) with the edge exponent
// α = π/arccos(1/3) ≈ 2.55 predicts ((11/10)^10.2 ≈ 2.6); at P_12 the
// Lehmann–Goerisch error (about 1.5e-7) is three times the Ritz error
// (about 5e-8, from the Ritz bounds' rate), and the
// stage-A level lowers it by raising ρ̂ from 38.97 to 48.86.
//
// With the Raviart–Thomas basis dual to interior moments (an exact
// rational inversion, 248 s of CPU at k = 12) the cube took 67.3 s and the
// tetrahedron stopped at P_11 after 149 s with λ1 at 2.4e-7: that basis's
// coefficients (up to 5e10 at k = 11) made the float flux choice lose
// accuracy past P_10, and λ1's Lehmann–Goerisch bound widened from P_10 to
// P_11.
func BenchmarkPolyhedronTargets(b *testing.B) {
	for _, c := range []struct {
		name, src string
		limit     time.Duration
	}{
		{"cube", cubePolyhedron("dirichlet", "0"), 120 * time.Second},
		{"regular-tetrahedron", regularTetrahedronSource, 300 * time.Second},
	} {
		b.Run(c.name, func(b *testing.B) {
			p, err := problem.Parse([]byte(c.src))
			if err != nil {
				b.Fatal(err)
			}
			for b.Loop() {
				// The convergence table: one progress line per step
				// (widths, unknowns, step time).
				var steps []string
				progress := func(format string, args ...any) { steps = append(steps, fmt.Sprintf(format, args...)) }
				cpu0 := cpuSeconds(b)
				cert, err := Certify(context.Background(), p, Options{RelWidth: "1e-8", TimeLimit: c.limit, Progress: progress})
				if err != nil {
					b.Fatal(err)
				}
				b.ReportMetric(cpuSeconds(b)-cpu0, "cpu-s")
				b.ReportMetric(peakRSS(b)/(1<<20), "peak-rss-MiB")
				for _, line := range steps {
					b.Log(strings.TrimSpace(line))
				}
				m, err := decodeMethod(cert.Method)
				if err != nil {
					b.Fatal(err)
				}
				for _, k := range []string{"lambda1", "lambda2", "gap"} {
					w, _ := strconv.ParseFloat(cert.Results.RelativeWidths[k], 64) // a printed record, not a bound
					b.ReportMetric(math.Log10(w), "log10-"+k+"-width")
				}
				b.ReportMetric(float64(m.Tetrahedra), "tetrahedra")
				b.ReportMetric(float64(m.StageATetrahedra), "stage-a-tetrahedra")
				b.ReportMetric(float64(m.Degree), "degree")
				b.ReportMetric(float64(m.FluxUnknowns), "flux-unknowns")
			}
		})
	}
}

// cpuSeconds is the user and system CPU time of this process so far.
func cpuSeconds(b *testing.B) float64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		b.Fatal(err)
	}
	return float64(ru.Utime.Sec+ru.Stime.Sec) + float64(ru.Utime.Usec+ru.Stime.Usec)/1e6
}

// peakRSS is the peak resident set size of this process in bytes (Linux
// reports it in KiB), over the whole benchmark process.
func peakRSS(b *testing.B) float64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		b.Fatal(err)
	}
	return float64(ru.Maxrss) * 1024
}

// BenchmarkLPrismGrading computes the L-shaped prism with Neumann ends
// (λ1 = λ1(L), λ2 = λ2(L); lPrismNeumannEnds) on P_4, one uniform level,
// stage A on three levels, without and with one grading level toward the
// re-entrant edge, and reports the relative widths of λ1 and λ2 and the
// trial tetrahedra, with the process CPU time. Measured in one run on the
// idle machine:
//
//	graded  tetrahedra  CPU    wall   λ1 width  λ2 width
//	0       160         5.5 s  3.9 s  2.3e-2    7.9e-2
//	1       491         9.0 s  6.3 s  3.4e-3    8.1e-3
//
// One level: 1.6 times the CPU time, 6.7 and 9.7 times narrower.
func BenchmarkLPrismGrading(b *testing.B) {
	for _, graded := range []int{0, 1} {
		b.Run("graded="+strconv.Itoa(graded), func(b *testing.B) {
			var res *result
			c0 := cpuSeconds(b)
			for b.Loop() {
				res, _ = certifyLPrismRecipe(b, 4, graded)
			}
			b.ReportMetric((cpuSeconds(b)-c0)*1e9/float64(b.N), "cpu-ns/op")
			b.ReportMetric(res.lambda[0].Wid()/lShapeLambda1, "width-λ1")
			b.ReportMetric(res.lambda[1].Wid()/lShapeLambda2, "width-λ2")
			b.ReportMetric(float64(res.out.polyhedron.tetrahedra), "tetrahedra")
		})
	}
}

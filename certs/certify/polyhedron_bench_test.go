package certify

import (
	"context"
	"fmt"
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
// Measured on the cube (idle machine, certify --rel-width 1e-8 with the
// 120 s limit, multifrontal factorization of package enclose/sparse): the
// target is reached at 67.3 s wall, 99 s of CPU, peak RSS 1.45 GB; steps
// of P_p on 96 tetrahedra with RT_p fluxes and N = 4:
//
//	p  stage-A unknowns  λ1       λ2       gap      step (wall)
//	3  1,440             0.46     0.75     2.3      0.2 s (no N separates)
//	5  11,904            1.6e-6   2.5e-3   5.0e-3   3.0 s
//	7  11,904            3.3e-10  5.3e-6   1.1e-5   12.1 s
//	8  96,768            1.3e-11  2.3e-9   4.5e-9   52.0 s
//
// With the up-looking factorization the last step took 244 s (271 s for
// the run) and did not fit in 120 s.
//
// The regular tetrahedron on the idle machine (300 s limit): P_10 on the
// 8 tetrahedra at 69 s (λ1 6.3e-8), P_11 at 149 s (λ1 2.4e-7, λ2 1.3e-6,
// gap 3.2e-6; kept by the worst width), then the next step is predicted
// not to fit; 244 s of CPU, peak RSS 2.2 GB. The target λ1 ≤ 1e-8 is not
// reached.
//
// The regular tetrahedron: before the degree line, five steps on the 8
// tetrahedra of the refined tetrahedron, the last at P_8 with stage A on
// 32,768 tetrahedra (63,488 unknowns): λ1 7.7e-7, λ2 2.4e-4, gap 5.2e-4
// at 128 s (idle machine, 131 s of CPU); the next step, 64 trial
// tetrahedra at P_8, was predicted not to fit. With the degree line
// (stage A stays on 4096 tetrahedra, 7,680 unknowns: a level is expected
// to widen ρ̂ − Λ_2 only 4.7 times), steps measured one by one with the
// same recipes (loaded machine; CPU time of a step at P_k is dominated by
// the exact RT_k tables, built once per process: 9.9, 24, 52 s of CPU at
// k = 8, 9, 10, peak 306, 516, 927 MB):
//
//	p  trial  flux   λ1 width  λ2 width
//	7  286    2,880  2.1e-5    2.5e-3
//	8  455    3,960  9.3e-7    1.1e-3
//	9  680    5,280  2.8e-7    2.4e-5
//	10 969    6,864  6.3e-8    9.5e-6
//	11 1,330  8,736  2.4e-7    1.3e-6   (137 s of CPU for the step)
//
// At P_11 λ1's Lehmann–Goerisch bound falls back (18.8715845 against
// 18.8715882 at P_10) while its Ritz bound still improves (18.8715891),
// as the cube's λ1 does at P_10 (its bound 2.0e-8 below 3π² against
// 2.1e-9 at P_9); λ2 and the gap keep narrowing, so the step is kept by
// the worst width. The interval widths of the Ritz and flux matrices grow
// only by a third per degree there; the cause is open.
//
// λ1 ≈ 18.871589: its Ritz bounds (18.8715969, .5912, .5894 at P_8..P_10)
// and Lehmann–Goerisch bounds (.5793, .5860, .5882) close at the same
// rate, about 3.1 per degree, as the p-version's p^(−4α) with α ≈ 2.55
// predicts ((10/9)^10.2 ≈ 2.9): at P_10 both errors are about 1e-6, from
// the edge singularities, not from ρ̂ (stage A on 32,768 tetrahedra
// changed λ1's width at P_8 from 9.3e-7 to 7.7e-7). On a loaded machine
// (load 15 on 2 cores) the run itself stops after P_7 at 114 s, its next
// step predicted not to fit.
//
// Before the stage-A counts bounded their residual a priori, the fourth
// step kept 11,904 stage-A unknowns (ρ̂ = 64.6 against Λ_2 = 62.5) and
// ended at λ2 2e-8, gap 3.9e-8; one count on 96,768 took about 1000 s.
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
					b.ReportMetric(w, k+"-width")
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
// trial tetrahedra, with the process CPU time. Measured in one run (-count
// 3, medians) on the shared machine (2 cores, load 15 to 19, so the wall
// times are about three times the CPU times):
//
//	graded  tetrahedra  CPU     wall    λ1 width  λ2 width
//	0       160         11.3 s  35.6 s  2.3e-2    7.9e-2
//	1       491         21.6 s  71.3 s  3.4e-3    8.1e-3
//
// One level: 1.9 times the CPU time, 6.7 and 9.7 times narrower.
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

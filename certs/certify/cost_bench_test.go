package certify

import (
	"context"
	"testing"
	"time"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// BenchmarkCostOfRigor measures what the proofs cost over the floating-
// point work a certificate needs, for the unit square, the Robin
// trapezoid and the L-shape of polygonCases at their targets. Each
// iteration certifies the problem, then repeats on the certificate's
// final recipe the computation (compute) and its choosing side alone
// (choosingSide: meshes, potentials, float assembly, approximate
// eigenvectors, flux weight and flux choice). It reports the ratios
// run/choose (the whole certificate, all refinement steps, against the
// choosing side of its final step) and step/choose (the final step
// against its choosing side).
func BenchmarkCostOfRigor(b *testing.B) {
	for _, c := range polygonCases {
		if c.name == "equilateral" {
			continue
		}
		b.Run(c.name, func(b *testing.B) {
			p, err := problem.Parse([]byte(c.src))
			if err != nil {
				b.Fatal(err)
			}
			var run, step, choose time.Duration
			for i := 0; i < b.N; i++ {
				t0 := time.Now()
				cert, err := Certify(context.Background(), p, Options{RelWidth: widthText(c.target), TimeLimit: 10 * time.Minute})
				if err != nil {
					b.Fatal(err)
				}
				run += time.Since(t0)
				m, err := decodeMethod(cert.Method)
				if err != nil {
					b.Fatal(err)
				}
				r, err := recordedRecipe(p, m)
				if err != nil {
					b.Fatal(err)
				}
				t1 := time.Now()
				out, err := compute(p, r)
				if err != nil {
					b.Fatal(err)
				}
				step += time.Since(t1)
				t2 := time.Now()
				if err := choosingSide(p, r, out.n); err != nil {
					b.Fatal(err)
				}
				choose += time.Since(t2)
			}
			b.ReportMetric(run.Seconds()/float64(b.N), "run-s")
			b.ReportMetric(step.Seconds()/float64(b.N), "step-s")
			b.ReportMetric(choose.Seconds()/float64(b.N), "choose-s")
			b.ReportMetric(run.Seconds()/choose.Seconds(), "run/choose")
			b.ReportMetric(step.Seconds()/choose.Seconds(), "step/choose")
		})
	}
}

// choosingSide runs the floating-point choices of one computation with
// recipe r whose stage B uses n trial functions: the trial mesh and
// potential, the float assembly and approximate eigenvectors, and, when
// n > 0, the flux weight and the fluxes.
func choosingSide(p *problem.Problem, r recipe, n int) error {
	d := discretisationOf(p)
	trial, err := d.trial(r, &outcome{})
	if err != nil {
		return err
	}
	vecs, err := trial.ApproxEigenvectors(p.Eigenvalues+r.extra, r.gamma)
	if err != nil || n == 0 || r.fluxDegree < 0 {
		return err
	}
	flux, err := d.flux(r, trial, interval.Point(d.stageBShift(r).GammaB))
	if err != nil {
		return err
	}
	_, err = flux.Choose(vecs[:n])
	return err
}

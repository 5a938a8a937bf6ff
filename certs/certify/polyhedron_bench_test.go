package certify

import (
	"context"
	"strconv"
	"testing"
	"time"

	"gapcert/fem/problem"
)

// BenchmarkPolyhedronTargets certifies polyhedra at the relative width
// 1e-8 within their time limits and reports the widths reached, the trial
// and flux unknowns of the last step's record and its tetrahedra: the unit
// cube (Dirichlet, 120 s; λ2 three times) and the regular tetrahedron
// with vertices (1,1,1), (1,−1,−1), (−1,1,−1), (−1,−1,1) (Dirichlet,
// 300 s; its edges are singular, exponent π/ω with ω = arccos(1/3), and
// the driver does not grade toward them).
func BenchmarkPolyhedronTargets(b *testing.B) {
	for _, c := range []struct {
		name, src string
		limit     time.Duration
	}{
		{"cube", cubePolyhedron("dirichlet", "0"), 120 * time.Second},
		{"regular-tetrahedron", `{"domain": {"polyhedron": {"vertices": [["1","1","1"],["1","-1","-1"],["-1","1","-1"],["-1","-1","1"]],
			"faces": [[0,1,2],[0,3,1],[0,2,3],[1,3,2]]}}, "boundary": "dirichlet", "eigenvalues": 2}`, 300 * time.Second},
	} {
		b.Run(c.name, func(b *testing.B) {
			p, err := problem.Parse([]byte(c.src))
			if err != nil {
				b.Fatal(err)
			}
			for b.Loop() {
				cert, err := Certify(context.Background(), p, Options{RelWidth: "1e-8", TimeLimit: c.limit})
				if err != nil {
					b.Fatal(err)
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
				b.ReportMetric(float64(m.Degree), "degree")
				b.ReportMetric(float64(m.FluxUnknowns), "flux-unknowns")
			}
		})
	}
}

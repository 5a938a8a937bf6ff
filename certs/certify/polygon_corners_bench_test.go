package certify

import (
	"context"
	"os"
	"strconv"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/fem/problem"
)

// cornerCases are polygons whose eigenfunctions are singular at corners
// (cornerExponent), each certified at relative width 1e-12 within its
// time limit: the L-shape (re-entrant corner, ν = 2/3), the regular
// pentagon (ν = 5/3 at every corner), a triangle with no angle π/k
// (ν ≈ 2.69 and 2.64), the trapezoid with a 117° Dirichlet–Neumann corner
// (ν ≈ 0.772) and the Neumann L-shape with V = exp(−r²).
var cornerCases = []struct {
	name  string
	src   string
	limit time.Duration
}{
	{"lshape", `{"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]},"potential":"0","boundary":"dirichlet","eigenvalues":2}`, 120 * time.Second},
	{"pentagon", `{"domain":{"polygon":[["0","0"],["1","0"],["1 + cos(2*pi/5)","sin(2*pi/5)"],["1/2","sin(2*pi/5) + sin(pi/5)"],["-cos(2*pi/5)","sin(2*pi/5)"]]},"potential":"0","boundary":"dirichlet","eigenvalues":2}`, 60 * time.Second},
	{"triangle", `{"domain":{"polygon":[["0","0"],["1","0"],["3/10","7/10"]]},"potential":"0","boundary":"dirichlet","eigenvalues":2}`, 30 * time.Second},
	{"trapezoid_dn117", `{"domain":{"polygon":[["0","0"],["3/2","0"],["1","1"],["0","1"]]},"potential":"x*y","boundary":[{"robin":"1"},"dirichlet","neumann","dirichlet"],"eigenvalues":2}`, 30 * time.Second},
	{"lshape_neumann_exp", `{"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]},"potential":"exp(-(x^2 + y^2))","boundary":"neumann","eigenvalues":4}`, 120 * time.Second},
}

// BenchmarkCornerTargets: the whole certification of each corner case at
// relative width 1e-12 within its time limit (set GAPCERT_CORNER_LIMIT to
// a duration to override every limit). Reports the relative widths
// reached in units of 1e-12 (metrics lambda1_width_e-12 …; the default
// metric format would print them as zeros), the peak heap sampled every
// 100 ms (peak_heap_GiB) and the stop reason in the log; the widths, not
// the time, are the measurement.
func BenchmarkCornerTargets(b *testing.B) {
	for _, c := range cornerCases {
		b.Run(c.name, func(b *testing.B) {
			p, err := problem.Parse([]byte(c.src))
			if err != nil {
				b.Fatal(err)
			}
			limit := c.limit
			if s := os.Getenv("GAPCERT_CORNER_LIMIT"); s != "" {
				if limit, err = time.ParseDuration(s); err != nil {
					b.Fatal(err)
				}
			}
			var peak uint64
			for i := 0; i < b.N; i++ {
				var cert *certs.Certificate
				peak = max(peak, heapPeak(100*time.Millisecond, func() {
					cert, err = Certify(context.Background(), p, Options{RelWidth: "1e-12", TimeLimit: limit})
				}))
				if err != nil {
					b.Fatal(err)
				}
				for _, key := range []string{"lambda1", "lambda2", "gap"} {
					if w, err := strconv.ParseFloat(cert.Results.RelativeWidths[key], 64); err == nil {
						b.ReportMetric(w*1e12, key+"_width_e-12")
					}
				}
				b.Log(cert.Warnings)
			}
			b.ReportMetric(float64(peak)/(1<<30), "peak_heap_GiB")
		})
	}
}

package certify

import (
	"testing"

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

package certify

import (
	"context"
	"math"
	"os"
	"testing"
	"time"

	"gapcert/fem/problem"
	"gapcert/interval/decimalio"
)

// BenchmarkProductPentagonPrism: the prism over the regular pentagon of
// unit edge times (0, 1), Dirichlet (testdata/problems/pentagon_prism.json),
// certified to the target 1e-10 within 60 s, by separation of variables;
// reports the product's widths by the target rule (log10), the time and
// the pentagon factor's eigenvalue count.
//
//	go test -run '^$' -bench ProductPentagonPrism -benchtime 1x ./certs/certify/
func BenchmarkProductPentagonPrism(b *testing.B) {
	data, err := os.ReadFile("../../testdata/problems/pentagon_prism.json")
	if err != nil {
		b.Fatal(err)
	}
	p, err := problem.Parse(data)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		start := time.Now()
		c, err := Certify(context.Background(), p, Options{TimeLimit: 60 * time.Second})
		if err != nil {
			b.Fatal(err)
		}
		b.ReportMetric(time.Since(start).Seconds(), "run-s")
		m, err := decodeProductMethod(c.Method)
		if err != nil {
			b.Fatal(err)
		}
		for _, w := range m.Widths {
			x, err := decimalio.ParseUpper(w.TargetRule)
			if err != nil {
				b.Fatal(err)
			}
			b.ReportMetric(math.Log10(x), "log10-w-"+w.Quantity)
		}
		b.ReportMetric(float64(m.Factors[0].Eigenvalues), "pentagon-eigenvalues")
	}
}

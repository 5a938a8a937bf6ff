package hypothesis

import (
	"math/rand/v2"
	"testing"

	"gapcert/certs"
	"gapcert/fem/problem"
)

// BenchmarkTangential measures the exact decisions on the largest inputs:
// a 100-gon (the most vertices fem/problem accepts) circumscribed about
// the unit circle with rational vertices, 97 determinants over big
// rationals and square classes, the regular 24-gon with surd vertices,
// and the regular 100-gon in the cyclotomic field Q(ζ_100) of degree 40.
func BenchmarkTangential(b *testing.B) {
	for _, c := range []struct {
		name string
		p    *problem.Problem
	}{
		{"rational100", polygonProblem(b, ratTexts(randomTangential(rand.New(rand.NewPCG(3, 3)), 100))...)},
		{"regular24", polygonProblem(b, regularPolygon(24)...)},
		{"regular100", polygonProblem(b, regularPolygon(100)...)},
	} {
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				if h := Tangential(c.p); h.Verdict != certs.Proven {
					b.Fatalf("%s: %s", h.Verdict, h.Detail)
				}
			}
		})
	}
}

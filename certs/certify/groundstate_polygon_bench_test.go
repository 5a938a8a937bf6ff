package certify

import "testing"

// BenchmarkPolygonGroundStateTrapezoid measures the ground-state block
// (L2 bound, grid searches, certification of the best triples) on an
// isosceles trapezoid that is neither tangential nor a rectangle, with
// the Robin coefficient 0.3 (inputs from two driver steps, not timed).
func BenchmarkPolygonGroundStateTrapezoid(b *testing.B) {
	in := polygonGroundStateInputs(b, `{"domain":{"polygon":[["0","0"],["2","0"],["1.1","0.9"],["0.9","0.9"]]},"boundary":{"robin":"0.3"}}`, 2, 1)
	b.ResetTimer()
	for range b.N {
		if _, err := polygonGroundState(in, nil); err != nil {
			b.Fatal(err)
		}
	}
}

package certify

import (
	"context"
	"math"
	"testing"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// certifyGroundState certifies src with the ground-state block.
func certifyGroundState(t testing.TB, src, width string) *certs.Certificate {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatal(err)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: width, Now: fixedTime, Tool: "gapcert test", GroundState: true})
	if err != nil {
		t.Fatal(err)
	}
	if c.Results.GroundState == nil {
		t.Fatal("no results.ground_state")
	}
	return c
}

// boundOf reads a printed bound.
func boundOf(t testing.TB, b certs.Bound) interval.I {
	t.Helper()
	x, err := b.Interval()
	if err != nil {
		t.Fatal(err)
	}
	return x
}

// TestGroundStateSine: −u″ = λu on (0, π), Dirichlet: λ1 = 1, λ2 = 4,
// u = √(2/π)·sin x with ∫u² = 1 (closed form, common practice). The
// values at the points contain it and are narrow, the verdict is proven
// (sin is log-concave on (0, π)) and the L2 error bound is small.
func TestGroundStateSine(t *testing.T) {
	c := certifyGroundState(t, `{"domain":{"interval":["0","pi"]},"boundary":"dirichlet","points":[["0"],["0.1"],["1"],["pi/2"],["2.5"],["3.1"],["pi"]]}`, "1e-10")
	gs := c.Results.GroundState
	t.Logf("%+v", *gs)
	if gs.LogConcavity != certs.Proven {
		t.Errorf("verdict %s (%s), want proven", gs.LogConcavity, gs.Reason)
	}
	if gs.Normalization != certs.NormalizationL2 || gs.L2Error == "" {
		t.Errorf("normalization %q, L2 error %q", gs.Normalization, gs.L2Error)
	}
	xs := []float64{0, 0.1, 1, math.Pi / 2, 2.5, 3.1, math.Pi}
	if len(gs.Points) != len(xs) {
		t.Fatalf("%d points, want %d", len(gs.Points), len(xs))
	}
	for i, pv := range gs.Points {
		got := boundOf(t, pv.Value)
		want := math.Sqrt(2/math.Pi) * math.Sin(xs[i])
		// The float value is within 1e-15 of the exact one.
		if got.Lo > want+1e-15 || got.Hi < want-1e-15 {
			t.Errorf("u(%s) in %v, exact %.17g", pv.At[0], got, want)
		}
		if got.Wid() > 1e-6 {
			t.Errorf("u(%s) in %v: width %.3g", pv.At[0], got, got.Wid())
		}
		t.Logf("u(%s) width %.3g", pv.At[0], got.Wid())
	}
}

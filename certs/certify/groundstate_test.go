package certify

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
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

// checkPoints checks that each value contains want(x) up to tol (the
// accuracy of the float reference) and is at most maxWidth wide.
func checkPoints(t *testing.T, gs *certs.GroundState, xs []float64, want func(float64) float64, tol, maxWidth float64) {
	t.Helper()
	if len(gs.Points) != len(xs) {
		t.Fatalf("%d points, want %d", len(gs.Points), len(xs))
	}
	for i, pv := range gs.Points {
		got := boundOf(t, pv.Value)
		w := want(xs[i])
		if got.Lo > w+tol || got.Hi < w-tol {
			t.Errorf("u(%s) in %v, reference %.17g", pv.At[0], got, w)
		}
		if got.Wid() > maxWidth {
			t.Errorf("u(%s) in %v: width %.3g above %.3g", pv.At[0], got, got.Wid(), maxWidth)
		}
	}
}

// TestGroundStateVerdicts certifies the block of problems whose ground
// state's shape is known and checks the verdict, the witness and values.
func TestGroundStateVerdicts(t *testing.T) {
	t.Run("harmonic proven", func(t *testing.T) {
		// V = x² on (−6, 6), Dirichlet. On the whole line λ1 = 1 and
		// u = π^(−1/4) exp(−x²/2) with ∫u² = 1 (closed form, common
		// practice). Truncation to (−6, 6) changes λ1 and u by about
		// exp(−36) ≈ 2e-16 relative (estimate recalled from memory: the
		// tail of the Gaussian), far below the widths. Convex V:
		// log-concave (Brascamp–Lieb, J. Funct. Anal. 22 (1976) 366–389).
		c := certifyGroundState(t, `{"domain":{"interval":["-6","6"]},"potential":"x^2","boundary":"dirichlet","points":[["-2"],["0"],["1/3"],["3"]]}`, "1e-8")
		gs := c.Results.GroundState
		if gs.LogConcavity != certs.Proven {
			t.Errorf("verdict %s (%s), want proven", gs.LogConcavity, gs.Reason)
		}
		checkPoints(t, gs, []float64{-2, 0, 1.0 / 3, 3}, func(x float64) float64 {
			return math.Pow(math.Pi, -0.25) * math.Exp(-x*x/2)
		}, 1e-13, 1e-6)
	})
	t.Run("Robin proven", func(t *testing.T) {
		// V = 0 on (0, 1), Robin α = 1 at both ends: u = cos(k(x − 1/2))
		// with k tan(k/2) = α, ∫_0^1 u² = 1/2 + sin(k)/(2k) (closed form,
		// common practice); log u = log cos is concave on |k(x−1/2)| < π/2.
		c := certifyGroundState(t, `{"domain":{"interval":["0","1"]},"boundary":{"robin":"1"},"points":[["0"],["0.25"],["0.5"],["1"]]}`, "1e-8")
		gs := c.Results.GroundState
		if gs.LogConcavity != certs.Proven {
			t.Errorf("verdict %s (%s), want proven", gs.LogConcavity, gs.Reason)
		}
		lo, hi := 0.0, math.Pi-1e-9 // k tan(k/2) − 1 increases on (0, π)
		for i := 0; i < 200; i++ {
			k := (lo + hi) / 2
			if k*math.Tan(k/2) < 1 {
				lo = k
			} else {
				hi = k
			}
		}
		k := (lo + hi) / 2
		n := math.Sqrt(0.5 + math.Sin(k)/(2*k))
		checkPoints(t, gs, []float64{0, 0.25, 0.5, 1}, func(x float64) float64 { return math.Cos(k*(x-0.5)) / n }, 1e-14, 1e-6)
	})
	t.Run("asymmetric convex proven", func(t *testing.T) {
		// V = x² + x³/10 on (−3, 3), Dirichlet: V″ = 2 + 3x/5 ≥ 1/5 > 0,
		// so the ground state is log-concave (Brascamp–Lieb).
		c := certifyGroundState(t, `{"domain":{"interval":["-3","3"]},"potential":"x^2 + x^3/10","boundary":"dirichlet"}`, "1e-8")
		if gs := c.Results.GroundState; gs.LogConcavity != certs.Proven {
			t.Errorf("verdict %s (%s), want proven", gs.LogConcavity, gs.Reason)
		}
	})
	t.Run("double well disproven", func(t *testing.T) {
		c := certifyGroundState(t, doubleWellProblem, "1e-8")
		gs := c.Results.GroundState
		if gs.LogConcavity != certs.Disproven || gs.Witness == nil {
			t.Fatalf("verdict %s (%s), want disproven with a witness", gs.LogConcavity, gs.Reason)
		}
		w := gs.Witness
		if w.Kind != certs.WitnessConvexInterval || len(w.Points) != 2 || len(w.Values) != 1 {
			t.Fatalf("witness %+v", *w)
		}
		lo, errL := decimalio.ParseLower(w.Points[0][0])
		hi, errH := decimalio.ParseLower(w.Points[1][0])
		if errL != nil || errH != nil || !(-2.5 <= lo && lo <= hi && hi <= 2.5) {
			t.Errorf("witness interval [%s, %s]", w.Points[0][0], w.Points[1][0])
		}
		if g := boundOf(t, w.Values[0]); !g.Positive() {
			t.Errorf("witness g %v not positive", g)
		}
		// The ground state is even (V and the interval are symmetric):
		// u(−1) = u(1), and u(1)² ∈ the common part of both values.
		u1, u2 := boundOf(t, gs.Points[0].Value), boundOf(t, gs.Points[1].Value)
		if _, ok := u1.Intersection(u2); !ok || u1.Wid() > 1e-6 {
			t.Errorf("u(-1) in %v, u(1) in %v: want overlapping narrow enclosures", u1, u2)
		}
	})
}

// Double well V = 6(x² − 1)² on (−5/2, 5/2), Dirichlet: V(0) = 6 exceeds
// λ1 ≈ 3.741 (certified in the tests of package temple/groundstate), and
// the ground state has a dip at 0, so it is not log-concave.
const doubleWellProblem = `{"domain":{"interval":["-5/2","5/2"]},"potential":"6*(x^2-1)^2","boundary":"dirichlet","points":[["-1"],["1"],["0"]]}`

// TestGroundStateTinyGapUndecided: the symmetric double well V =
// 2000(x² − 1)² on (−2, 2) has λ1 ≈ 89 and a tunnelling gap of the order
// of exp(−(4/3)√2000) ≈ 1e-26 times a moderate factor (WKB estimate,
// recalled from memory), below the float spacing at λ1 (1.4e-14) and so
// below any certified width: the gap's lower bound is not positive, and
// the block must be undecided with that reason and give no values, never
// a verdict. (The test first checks that the enclosures do overlap.)
func TestGroundStateTinyGapUndecided(t *testing.T) {
	c := certifyGroundState(t, `{"domain":{"interval":["-2","2"]},"potential":"2000*(x^2-1)^2","boundary":"dirichlet","points":[["0"]]}`, "1e-6")
	lam1 := boundOf(t, c.Results.Eigenvalues[0].Bound())
	lam2 := boundOf(t, c.Results.Eigenvalues[1].Bound())
	gs := c.Results.GroundState
	t.Logf("lambda1 %v lambda2 %v: %s", lam1, lam2, gs.Reason)
	if lam2.Lo > lam1.Hi {
		t.Fatalf("the gap is certified positive (%v, %v): the test needs enclosures wider than the gap", lam1, lam2)
	}
	if gs.LogConcavity != certs.Undecided || !strings.Contains(gs.Reason, "not shown to be separated") || gs.Witness != nil || len(gs.Points) != 0 {
		t.Errorf("block %+v, want undecided for lack of separation, without values", *gs)
	}
	if gs.L2Error != "" || !strings.Contains(gs.Reason, "no L2 error bound") {
		t.Errorf("L2 error %q, reason %q: want none, with the reason", gs.L2Error, gs.Reason)
	}
}

// TestGroundStateCheck: Check recomputes the block and refuses a
// certificate whose verdict, witness or point value was edited.
func TestGroundStateCheck(t *testing.T) {
	c := certifyGroundState(t, doubleWellProblem, "1e-8")
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if err := Check(data); err != nil {
		t.Fatalf("fresh certificate does not verify: %v", err)
	}
	gs := c.Results.GroundState
	lastDigit := func(s string) string {
		d := s[len(s)-1]
		if d == '9' {
			return s[:len(s)-1] + "8"
		}
		return s[:len(s)-1] + string(d+1)
	}
	for _, tc := range []struct{ name, old, new string }{
		{"verdict", `"log_concavity": "disproven"`, `"log_concavity": "proven"`},
		{"witness digit", `"` + gs.Witness.Points[0][0] + `"`, `"` + lastDigit(gs.Witness.Points[0][0]) + `"`},
		{"point value", `"upper": "` + gs.Points[2].Value.Upper + `"`, `"upper": "` + lastDigit(gs.Points[2].Value.Upper) + `"`},
		{"L2 error", `"l2_error_upper": "` + gs.L2Error + `"`, `"l2_error_upper": "` + lastDigit(gs.L2Error) + `"`},
	} {
		edited := strings.Replace(string(data), tc.old, tc.new, 1)
		if edited == string(data) {
			t.Fatalf("%s: the edit changed nothing", tc.name)
		}
		var mm *MismatchError
		if err := Check([]byte(edited)); !errors.As(err, &mm) {
			t.Errorf("%s: want a mismatch, got %v", tc.name, err)
		} else if !strings.Contains(err.Error(), "ground_state") {
			t.Errorf("%s: the mismatch does not name the ground state: %v", tc.name, err)
		}
	}
	// Removing the block is not a mismatch of the block (the certificate
	// then simply does not state it), and still verifies.
	c.Results.GroundState = nil
	data, _ = c.Marshal()
	if err := Check(data); err != nil {
		t.Errorf("certificate without the block: %v", err)
	}
}

// TestGroundStateNeedsLambda2: the block needs λ2, and a problem with one
// eigenvalue (possible only when edited in Go: the reader refuses it) is
// refused before computing, with a hint.
func TestGroundStateNeedsLambda2(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain":{"interval":["0","1"]},"boundary":"dirichlet"}`))
	if err != nil {
		t.Fatal(err)
	}
	p.Eigenvalues = 1
	_, err = Certify(context.Background(), p, Options{GroundState: true})
	if err == nil || !strings.Contains(err.Error(), "needs lambda2") || !strings.Contains(err.Error(), "hint") {
		t.Fatalf("got %v, want a refusal naming lambda2 with a hint", err)
	}
}

// TestGroundStateProvenWithoutNormalisation: −u″ = λu on (0, 1),
// Dirichlet, has λ1 = π² ≈ 9.87 and λ2 = 4π² ≈ 39.48 (closed form, common
// practice). With the true but wide enclosure [9, 30] of λ1, V − λ ≤ 0
// everywhere proves log-concavity, while the shots are not certified
// positive at the split point (the family holds sin(√λ x)/√λ for λ up to
// 30), so the normalisation fails: the verdict is kept, no value is given,
// and the reason says why.
func TestGroundStateProvenWithoutNormalisation(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain":{"interval":["0","1"]},"boundary":"dirichlet","points":[["0.5"]]}`))
	if err != nil {
		t.Fatal(err)
	}
	in := groundStateInputs{p: p, lambda1: interval.New(9, 30), lambda2: interval.New(39.45, 39.5)}
	gs, err := groundStateInterval(in)
	if err != nil {
		t.Fatal(err)
	}
	if gs.LogConcavity != certs.Proven || len(gs.Points) != 0 || gs.Witness != nil {
		t.Fatalf("block %+v, want proven without values", *gs)
	}
	if !strings.Contains(gs.Reason, "log-concave") || !strings.Contains(gs.Reason, "could not be normalised") {
		t.Errorf("reason %q: want the verdict's and the normalisation's", gs.Reason)
	}
}

package certify

import (
	"context"
	"fmt"
	"math/big"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// ampleLimit is the time limit of the test runs that assert widths. It is
// far above what any of them needs (each ends by reaching its target,
// stalling, at the refinement cap, or at a step chosen by certifyUntil,
// within seconds on an idle machine), so that no run is stopped by the
// time limit: which steps run, and so the widths checked, do not depend on
// the machine's load. Speed is measured by the benchmarks, never here.
const ampleLimit = 10 * time.Minute

// certifyText parses a problem and certifies it at the given target, with
// the ample time limit.
func certifyText(t *testing.T, src string, relWidth float64) (*problem.Problem, *certs.Certificate) {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatalf("problem %s: %v", src, err)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: widthText(relWidth), TimeLimit: ampleLimit})
	if err != nil {
		t.Fatalf("certify %s: %v", src, err)
	}
	return p, c
}

// certifyUntil certifies src at the target relWidth with the ample time
// limit and ends the run, by cancelling its context, after the first step
// for which enough(step, w1, w2) holds (steps counted from 1; w1 and w2 the
// target-rule widths of λ1 and λ2 reported by the step's progress line).
// Certify then returns the best step so far with stop reason
// StopInterrupted. For runs whose target cannot be met quickly (a gap
// far wider than the eigenvalues, a long way to the target), it fixes the
// steps that run by their widths or their count, never by the clock.
func certifyUntil(t *testing.T, src string, relWidth float64, enough func(step int, w1, w2 float64) bool) (*problem.Problem, *certs.Certificate) {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatalf("problem %s: %v", src, err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	progress := func(format string, args ...any) {
		if len(args) < 7 {
			t.Errorf("progress line %q has %d arguments, want at least 7", format, len(args))
			cancel()
			return
		}
		step, ok0 := args[1].(int)
		w1, ok1 := args[5].(float64)
		w2, ok2 := args[6].(float64)
		if !ok0 || !ok1 || !ok2 {
			t.Errorf("progress line %q: arguments %v are not the step and the widths of lambda1 and lambda2", format, args)
			cancel()
			return
		}
		if enough(step, w1, w2) {
			cancel()
		}
	}
	c, err := Certify(ctx, p, Options{RelWidth: widthText(relWidth), TimeLimit: ampleLimit, Progress: progress})
	if err != nil {
		t.Fatalf("certify %s: %v", src, err)
	}
	return p, c
}

// eigenEnclosure reads λ_index of a certificate as an interval.
func eigenEnclosure(t *testing.T, c *certs.Certificate, index int) interval.I {
	t.Helper()
	e := c.Results.Eigenvalues[index-1]
	x, err := certs.Bound{Lower: e.Lower, Upper: e.Upper}.Interval()
	if err != nil {
		t.Fatal(err)
	}
	return x
}

// requireEnclosure fails unless got ⊇ truth and got is at most maxWidth
// wide relative to max(|truth|, scale): a containment test and a width test.
func requireEnclosure(t *testing.T, what string, got, truth interval.I, scale, maxWidth float64) {
	t.Helper()
	if !truth.Subset(got) {
		t.Errorf("%s: enclosure %v misses the true value %v", what, got, truth)
		return
	}
	if w := relWidth(got, scale); w > maxWidth {
		t.Errorf("%s: enclosure %v has relative width %.3g > %.3g", what, got, w, maxWidth)
	}
}

// requireBig is requireEnclosure for a reference value computed in big.Float.
func requireBig(t *testing.T, what string, got interval.I, truth *big.Float, scale, maxWidth float64) {
	t.Helper()
	if !bigInside(truth, got) {
		t.Errorf("%s: enclosure %v misses the reference value %s", what, got, truth.Text('g', 25))
		return
	}
	if w := relWidth(got, scale); w > maxWidth {
		t.Errorf("%s: enclosure %v has relative width %.3g > %.3g", what, got, w, maxWidth)
	}
}

// TestDirichletClosedForm: −u″ = λu on (a, a + L) with Dirichlet ends has
// λ_k = k²π²/L² (common practice: u = sin(kπ(x − a)/L)).
func TestDirichletClosedForm(t *testing.T) {
	for _, tc := range []struct{ a, b string }{{"0", "1"}, {"-3/2", "5/2"}, {"0", "pi"}, {"1/3", "7/10"}, {"-100", "-99.5"}} {
		src := fmt.Sprintf(`{"domain":{"interval":[%q,%q]},"boundary":"dirichlet","eigenvalues":3}`, tc.a, tc.b)
		p, c := certifyText(t, src, 1e-9)
		length := p.Interval[1].Val.Sub(p.Interval[0].Val)
		scale := interval.Pi().Sqr().Div(length.Sqr()).Lo
		for k := 1; k <= 3; k++ {
			truth := interval.Pi().MulF(float64(k)).Div(length).Sqr()
			requireEnclosure(t, fmt.Sprintf("(%s,%s) lambda%d", tc.a, tc.b, k), eigenEnclosure(t, c, k), truth, scale, 1e-9)
		}
		gap, _ := c.Results.Gap.Interval()
		requireEnclosure(t, "gap", gap, interval.Pi().Div(length).Sqr().MulF(3), scale, 1e-9)
	}
}

// TestRobinTable: on (−1, 1) with ∂u/∂n + αu = 0 at both ends, √λ₁ is the
// first root of x tan x = α and √λ₂ the first root of x cot x = −α
// (common practice; tabulated in Abramowitz–Stegun, Handbook of
// Mathematical Functions, 1964, Table 4.19 for x tan x = C and Table 4.20
// for x cot x = −C). The 10-digit values below are recalled from memory
// and are also re-derived by the interval bisection oracle.
func TestRobinTable(t *testing.T) {
	for _, tc := range []struct {
		alpha  string
		x1, x2 string // first roots of x tan x = α and x cot x = −α
	}{
		{"1", "0.8603335890", "2.0287578381"},
		{"0.5", "0.6532711871", ""},
		{"2", "1.0768739863", "2.2889297281"},
	} {
		src := fmt.Sprintf(`{"domain":{"interval":["-1","1"]},"boundary":{"robin":%q},"eigenvalues":2}`, tc.alpha)
		_, c := certifyText(t, src, 1e-11)
		for k, xs := range []string{tc.x1, tc.x2} {
			got := eigenEnclosure(t, c, k+1)
			if xs == "" { // no table value recalled with confidence
				xs = "0"
			}
			x, _ := decimalio.Parse(xs)
			// The table has 10 decimals: |√λ − x| ≤ 5e-11.
			sq, _ := got.Sqrt()
			if d := sq.Sub(x).Mag(); x.Lo != 0 && d > 6e-11 {
				t.Errorf("alpha %s lambda%d: sqrt of enclosure %v differs from the table value %s by %.3g", tc.alpha, k+1, sq, xs, d)
			}
			truth := constantPotentialEigenvalue(k+1, "2", "0", end{alpha: tc.alpha}, end{alpha: tc.alpha})
			requireBig(t, "alpha "+tc.alpha, got, truth, 1, 1e-10)
		}
	}
}

// TestUnequalRobin: unequal α at the two ends, and Dirichlet–Robin, against
// the bisection oracle on the characteristic equation (common practice).
func TestUnequalRobin(t *testing.T) {
	for _, tc := range []struct {
		bc          string
		left, right end
	}{
		{`[{"robin":"0.25"},{"robin":"3"}]`, end{alpha: "0.25"}, end{alpha: "3"}},
		{`["dirichlet",{"robin":"1.5"}]`, end{dirichlet: true}, end{alpha: "1.5"}},
		{`["neumann","dirichlet"]`, end{}, end{dirichlet: true}},
		{`[{"robin":"7"},"neumann"]`, end{alpha: "7"}, end{}},
	} {
		src := fmt.Sprintf(`{"domain":{"interval":["0","2"]},"boundary":%s,"eigenvalues":3}`, tc.bc)
		_, c := certifyText(t, src, 1e-10)
		for k := 1; k <= 3; k++ {
			truth := constantPotentialEigenvalue(k, "2", "0", tc.left, tc.right)
			requireBig(t, fmt.Sprintf("%s lambda%d", tc.bc, k), eigenEnclosure(t, c, k), truth, 1, 1e-9)
		}
	}
}

// mathieuB returns b_n(q) for n = 1, 2 by Ince's tridiagonal Fourier
// method (common practice: se_1 = Σ B_{2r+1} sin((2r+1)x) gives the
// tridiagonal matrix with diagonal 1 − q, 9, 25, … and off-diagonal q;
// se_2 = Σ B_{2r} sin(2rx) gives diagonal 4, 16, 36, … and off-diagonal q),
// evaluated by Sturm-count bisection in big.Float at 200 bits with 60
// Fourier modes (the truncation error is far below 1e-30 for q = 1).
func mathieuB(n int, q float64) *big.Float {
	const prec, modes = 200, 60
	diag := make([]*big.Float, modes)
	for r := range diag {
		var m float64
		if n == 1 {
			m = float64((2*r + 1) * (2*r + 1))
			if r == 0 {
				m -= q
			}
		} else {
			m = float64(4 * (r + 1) * (r + 1))
		}
		diag[r] = new(big.Float).SetPrec(prec).SetFloat64(m)
	}
	bq := new(big.Float).SetPrec(prec).SetFloat64(q * q)
	below := func(t *big.Float) bool { // is the smallest eigenvalue < t?
		var d *big.Float
		for r := range diag {
			a := new(big.Float).SetPrec(prec).Sub(diag[r], t)
			if r > 0 {
				a.Sub(a, new(big.Float).SetPrec(prec).Quo(bq, d))
			}
			if a.Sign() < 0 {
				return true
			}
			d = a
		}
		return false
	}
	lo := new(big.Float).SetPrec(prec).SetFloat64(-10)
	hi := new(big.Float).SetPrec(prec).SetFloat64(10)
	half := new(big.Float).SetPrec(prec).SetFloat64(0.5)
	for i := 0; i < 180; i++ {
		mid := new(big.Float).SetPrec(prec).Add(lo, hi)
		mid.Mul(mid, half)
		if below(mid) {
			hi = mid
		} else {
			lo = mid
		}
	}
	return lo
}

// TestMathieu: V = 2q cos 2x on (0, π) with Dirichlet ends has the
// eigenvalues b_1(q) < b_2(q) < … (Abramowitz–Stegun, Table 20.1: for
// q = 1, b_1 = −0.1102488170, b_2 = 3.9170247730, recalled from memory);
// the references here are Ince's Fourier method at 40+ digits, and the
// required relative width is 1e-10 for λ1, λ2 and the gap.
func TestMathieu(t *testing.T) {
	_, c := certifyText(t, `{"domain":{"interval":["0","pi"]},"potential":"2*cos(2*x)","boundary":"dirichlet","eigenvalues":2}`, 1e-10)
	var truth [2]interval.I
	for n := 1; n <= 2; n++ {
		b := mathieuB(n, 1)
		s := b.Text('e', 45)
		tr, err := decimalio.Parse(s)
		if err != nil {
			t.Fatal(err)
		}
		// 45 digits printed: widen by 1e-40 each way for the printing error.
		truth[n-1] = interval.I{Lo: interval.SubDown(tr.Lo, 1e-40), Hi: interval.AddUp(tr.Hi, 1e-40)}
		requireEnclosure(t, fmt.Sprintf("b_%d(1)", n), eigenEnclosure(t, c, n), truth[n-1], 1, 1e-10)
	}
	for n, table := range []float64{-0.1102488170, 3.9170247730} {
		if d := eigenEnclosure(t, c, n+1).Mid() - table; d > 6e-11 || d < -6e-11 {
			t.Errorf("b_%d(1) differs from the table value %v by %.3g", n+1, table, d)
		}
	}
	gap, _ := c.Results.Gap.Interval()
	requireEnclosure(t, "Mathieu gap", gap, truth[1].Sub(truth[0]), 1, 1e-10)
}

// TestHarmonicWidth: V = x² on (−2, 2), Dirichlet: relative width ≤ 1e-10
// for λ1, λ2 and the gap; the whole-line oscillator values 1 and 3 are
// lower bounds (Dirichlet restriction raises eigenvalues, domain
// monotonicity, common practice).
func TestHarmonicWidth(t *testing.T) {
	_, c := certifyText(t, `{"domain":{"interval":["-2","2"]},"potential":"x^2","boundary":"dirichlet","eigenvalues":2}`, 1e-10)
	for k, key := range []string{"lambda1", "lambda2", "gap"} {
		var w float64
		fmt.Sscan(c.Results.RelativeWidths[key], &w)
		if w > 1e-10 {
			t.Errorf("%s: relative width %s > 1e-10", key, c.Results.RelativeWidths[key])
		}
		if k < 2 && eigenEnclosure(t, c, k+1).Lo < float64(2*k+1) {
			t.Errorf("lambda%d below the whole-line value %d", k+1, 2*k+1)
		}
	}
}

// TestNeumannZero: with Neumann ends and V = 0, λ₁ = 0 exactly (constants)
// and λ₂ = π²/L²: the enclosure of λ₁ contains 0 and is tiny.
func TestNeumannZero(t *testing.T) {
	_, c := certifyText(t, `{"domain":{"interval":["0","3"]},"boundary":"neumann","eigenvalues":2}`, 1e-10)
	l1 := eigenEnclosure(t, c, 1)
	if !l1.Contains(0) || l1.Wid() > 1e-10 {
		t.Errorf("lambda1 enclosure %v: want 0 inside, width ≤ 1e-10", l1)
	}
	requireEnclosure(t, "lambda2", eigenEnclosure(t, c, 2), interval.Pi().DivF(3).Sqr(), 1, 1e-10)
}

// TestConvexPotentialGap: for convex V on an interval of length D with
// Dirichlet ends, λ₂ − λ₁ ≥ 3π²/D² (Lavine, The eigenvalue gap for
// one-dimensional convex potentials, Proc. Amer. Math. Soc. 121 (1994)
// 815–821). With strictly convex V the inequality is strict, and the claim
// must come out "holds".
func TestConvexPotentialGap(t *testing.T) {
	for _, tc := range []struct{ dom, v string }{
		{`["-1","1"]`, "x^2"},
		{`["0","2"]`, "3*x^4"},
		{`["-1","2"]`, "exp(x)"},
		{`["0","1"]`, "10*(x-1/3)^2 + x"},
		{`["-2","1"]`, "cosh(x)"},
	} {
		src := fmt.Sprintf(`{"domain":{"interval":%s},"potential":%q,"boundary":"dirichlet","eigenvalues":2,"claims":["gap >= 3*pi^2/D^2"]}`, tc.dom, tc.v)
		_, c := certifyText(t, src, 1e-8)
		if v := c.Claims[0].Verdict; v != certs.Holds {
			t.Errorf("V = %s on %s: gap claim %s (margin [%s, %s])", tc.v, tc.dom, v, c.Claims[0].Margin.Lower, c.Claims[0].Margin.Upper)
		}
	}
}

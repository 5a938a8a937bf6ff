package groundstate

import (
	"testing"
	"time"

	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
)

// Enclosures of λ1 below are the certified ones printed by gapcert itself
// (lower end rounded down, upper end rounded up, 17 digits), from
//
//	go run ./cmd/gapcert certify temple/groundstate/testdata/NAME.json -o /tmp/NAME.cert.json --time-limit 120s
//
// run at the repository root; NAME is the file of each problem.

// certified parses the printed ends of a certified enclosure.
func certified(t testing.TB, lo, hi string) interval.I {
	t.Helper()
	l, err := decimalio.ParseLower(lo)
	if err != nil {
		t.Fatal(err)
	}
	h, err := decimalio.ParseUpper(hi)
	if err != nil {
		t.Fatal(err)
	}
	return interval.New(l, h)
}

func dirichletProblem(v string, a, b string) Problem {
	A, err := decimalio.Parse(a)
	if err != nil {
		panic(err)
	}
	B, err := decimalio.Parse(b)
	if err != nil {
		panic(err)
	}
	return Problem{V: formula.MustParse(v), A: A, B: B,
		Left: Boundary{Kind: Dirichlet}, Right: Boundary{Kind: Dirichlet}}
}

// Harmonic oscillator V = x² on (−8, 8), Dirichlet (harmonic_long.json).
// On the whole line λ1 = 1 with u = exp(−x²/2) (closed form). Truncation
// to (−8, 8) raises λ1 (min–max: the truncated form domain is a subspace of
// the whole-line one), here by at most 2.1e-14 (the certified upper end
// below); the verdict uses the certified enclosure of the truncated
// problem, never the whole-line value.
func harmonicCase(t testing.TB) (Problem, interval.I) {
	return dirichletProblem("x^2", "-8", "8"), certified(t, "0.99999999994691313", "1.0000000000000209")
}

// Double well V = 6(x² − 1)² on (−5/2, 5/2), Dirichlet (double_well.json).
func doubleWellCase(t testing.TB) (Problem, interval.I) {
	return dirichletProblem("6*(x^2-1)^2", "-5/2", "5/2"), certified(t, "3.7410583827548427", "3.7410583827563740")
}

// V = x² + x³/10 on (−3, 3), Dirichlet (cubic_convex.json). V″ = 2 + 3x/5
// ≥ 1/5 > 0 on [−3, 3], so V is convex and the ground state is log-concave
// (Brascamp–Lieb, J. Funct. Anal. 22 (1976) 366–389); V(±3) = 11.7, 6.3
// exceed λ1, so the verdict needs u there.
func cubicCase(t testing.TB) (Problem, interval.I) {
	return dirichletProblem("x^2 + x^3/10", "-3", "3"), certified(t, "0.99424735523297069", "0.99424735523332242")
}

// V = exp(2x) on (−2, 2), Dirichlet (exp_convex.json): convex, not a
// polynomial (V's Taylor models have remainders), V(2) = e⁴ > λ1.
func expCase(t testing.TB) (Problem, interval.I) {
	return dirichletProblem("exp(2*x)", "-2", "2"), certified(t, "1.5853230213874534", "1.5853230213875591")
}

func TestLogConcavityVerdicts(t *testing.T) {
	robin, robinLambda := robinCase(t)
	for _, tc := range []struct {
		name string
		make func(testing.TB) (Problem, interval.I)
		want Verdict
	}{
		// Convex V, Dirichlet: log-concave (Brascamp–Lieb).
		{"harmonic", harmonicCase, Proven},
		{"cubic convex", cubicCase, Proven},
		{"exp convex", expCase, Proven},
		// V = 0, Robin α > 0: u = cos(kx) > 0, (log u)″ = −k²/cos²(kx) < 0.
		{"robin V=0", func(testing.TB) (Problem, interval.I) { return robin, robinLambda }, Proven},
		// V(0) = 6 > λ1 ≈ 3.741 and u′(0) = 0 by symmetry, so
		// g(0) = (6 − λ1)u(0)² > 0: not log-concave near 0.
		{"double well", doubleWellCase, Disproven},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, lambda := tc.make(t)
			start := time.Now()
			res, err := LogConcavity(p, lambda, Options{})
			if err != nil {
				t.Fatal(err)
			}
			t.Logf("%v in %v, %d pieces, worst g upper %.3g at %v", res.Verdict, time.Since(start), res.Pieces, res.WorstUpper, res.WorstAt)
			if res.Verdict != tc.want {
				t.Fatalf("verdict %v, want %v (%s)", res.Verdict, tc.want, res.Reason)
			}
			if tc.want == Disproven {
				w := res.Witness
				if w == nil || !(w.G.Lo > 0) || !(w.U.Lo > 0) {
					t.Fatalf("witness %+v", w)
				}
				// The witness lies in the barrier where V > λ1: |x| < 1 − ….
				if !(w.X.Mag() < 0.5) {
					t.Errorf("witness at %v, expected inside (−1/2, 1/2) where V − λ1 > 0 and u′ is small", w.X)
				}
				t.Logf("witness x ∈ %v, u ∈ %v, u′ ∈ %v, g ∈ %v", w.X, w.U, w.DU, w.G)
			}
		})
	}
}

// A λ enclosure that is far too wide must not give a false verdict; where
// the decision needs u (V > λ somewhere) it is undecided.
func TestLogConcavityWideLambdaIsUndecided(t *testing.T) {
	for _, tc := range []struct {
		name  string
		make  func(testing.TB) (Problem, interval.I)
		false Verdict
	}{
		{"harmonic", harmonicCase, Disproven},
		{"cubic convex", cubicCase, Disproven},
		{"exp convex", expCase, Disproven},
		{"double well", doubleWellCase, Proven},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, lambda := tc.make(t)
			wide := lambda.Add(interval.New(-1, 1))
			res, err := LogConcavity(p, wide, Options{MaxPieces: 1 << 14})
			if err != nil {
				t.Logf("refused: %v", err)
				return
			}
			t.Logf("%v: %s; worst %.3g at %v", res.Verdict, res.Reason, res.WorstUpper, res.WorstAt)
			if res.Verdict == tc.false {
				t.Fatalf("false verdict %v with λ ∈ %v", res.Verdict, wide)
			}
			if res.Verdict != Undecided {
				t.Errorf("verdict %v with λ ∈ %v, want undecided", res.Verdict, wide)
			}
		})
	}
}

// An enclosure that holds λ1 and λ2 of the double well (not separating
// them) still holds λ1, so any verdict is true for the ground state; the
// family then holds the odd second eigenfunction too, whose zero at 0 keeps
// u > 0 from being certified near the barrier's centre.
func TestLogConcavityLambdaOverTwoEigenvalues(t *testing.T) {
	p, lambda1 := doubleWellCase(t)
	lambda2 := certified(t, "4.8838804515639182", "4.8838804515659718") // double_well.json, as above
	res, err := LogConcavity(p, lambda1.Hull(lambda2), Options{MaxPieces: 1 << 14})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("%v: %s; worst %.3g at %v", res.Verdict, res.Reason, res.WorstUpper, res.WorstAt)
	if res.Verdict == Proven {
		t.Fatalf("false verdict %v", res.Verdict)
	}
	if res.Verdict == Disproven {
		w := res.Witness
		t.Logf("witness x ∈ %v, u ∈ %v, g ∈ %v", w.X, w.U, w.G)
	}
}

func BenchmarkLogConcavityDoubleWell(b *testing.B) {
	p, lambda := doubleWellCase(b)
	for i := 0; i < b.N; i++ {
		res, err := LogConcavity(p, lambda, Options{})
		if err != nil || res.Verdict != Disproven {
			b.Fatal(err, res)
		}
	}
}

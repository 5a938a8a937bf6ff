package groundstate

import (
	"math"
	"math/big"
	"math/rand"
	"testing"
	"time"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// refSolutionAcrossKink solves u″ = (V − λ)u for V = vLeft on x ≤ kink and
// V = vRight on x ≥ kink (V continuous at kink) from x0 with the data
// (u0, du0) to x, by the 256-bit reference of reference_test.go on each
// side (u and u′ are continuous at the kink).
func refSolutionAcrossKink(vLeft, vRight polyPotential, kink float64, lambda *big.Float, x0 float64, u0, du0 *big.Float, x float64) (u, du *big.Float) {
	side := func(t float64) polyPotential {
		if t < kink {
			return vLeft
		}
		return vRight
	}
	at := func(v polyPotential, from float64, u, du *big.Float, to float64) (*big.Float, *big.Float) {
		us, dus := refSolution(v, lambda, newRefFloat().SetFloat64(from), u, du, []*big.Float{newRefFloat().SetFloat64(to)})
		return us[0], dus[0]
	}
	if (x0 < kink) == (x < kink) || x == kink || x0 == kink {
		v := side(x0)
		if x0 == kink {
			v = side(x)
		}
		return at(v, x0, u0, du0, x)
	}
	uk, duk := at(side(x0), x0, u0, du0, kink)
	return at(side(x), kink, uk, duk, x)
}

// V = |x| on (−1, 2) has its kink at 0, an exact float that
// formula.Kinks lists; V is linear on each side, so the initial value
// problem is smooth on each step that has 0 as an end. A shot whose steps
// have a node at 0 encloses the solution; this test expects Shoot to
// succeed and contain the reference solution (piecewise, 256 bits).
//
// Without a node at 0 (steps of 3/64 from −1) Model1 refuses abs on the
// step that contains 0; Shoot ends a step at each listed kink.
func TestShootThroughListedKink(t *testing.T) {
	p := Problem{V: formula.MustParse("abs(x)"), A: interval.Point(-1), B: interval.Point(2),
		Left: Boundary{Kind: Dirichlet}, Right: Boundary{Kind: Dirichlet}}
	vLeft := polyPotential{Coef: []*big.Rat{big.NewRat(0, 1), big.NewRat(-1, 1)}}
	vRight := polyPotential{Coef: []*big.Rat{big.NewRat(0, 1), big.NewRat(1, 1)}}
	const lambda = 1.25 // any float: the shot encloses the solution of the initial value problem
	rng := rand.New(rand.NewSource(5))
	for _, end := range []End{LeftEnd, RightEnd} {
		shot, err := Shoot(p, end, interval.Point(lambda), 3, Options{})
		if err != nil {
			t.Fatalf("end %v: %v", end, err)
		}
		x0 := -1.0
		if end == RightEnd {
			x0 = 2
		}
		u0, du0 := refInitial(Dirichlet, nil, end)
		for i := 0; i < 20; i++ {
			x := -1 + 3*rng.Float64()
			u, du, ok := shot.At(x)
			if !ok {
				t.Fatalf("x = %v not covered", x)
			}
			ur, dur := refSolutionAcrossKink(vLeft, vRight, 0, newRefFloat().SetFloat64(lambda), x0, u0, du0, x)
			if !inBig(u, ur) || !inBig(du, dur) {
				t.Errorf("end %v, x = %v: u ∈ %v, u′ ∈ %v miss the reference (%.17g, %.17g)", end, x, u, du, ur, dur)
			}
			if u.Wid() > 1e-10*math.Max(1, u.Mag()) {
				t.Errorf("end %v, x = %v: u ∈ %v wider than 1e-10 (relative)", end, x, u)
			}
		}
	}
}

// V = 1/(x² − 9x/8 + 97/256) = 1/((x − 9/16)² + 1/16) is analytic on the
// real line (poles at 9/16 ± i/4), but on a step of width 5/64 near
// x = 0.45 the interval evaluation of the denominator (x² and −9x/8
// evaluated apart) contains 0. Halving the step removes the overestimation
// (the denominator's range on a step of width w is within O(w) of the
// exact one, whose minimum is 1/16). This test expects Shoot to succeed
// and contain the reference solution (256 bits).
//
// Shoot answers a Model1 error with a smaller step, and keeps V's Taylor
// remainder small (on the default step it was ±3.2, which made u(2.9)
// about 17 wide).
func TestShootHalvesStepOnOverestimatedDomain(t *testing.T) {
	v := polyPotential{
		Coef: []*big.Rat{big.NewRat(1, 1)},
		Den:  []*big.Rat{big.NewRat(97, 256), big.NewRat(-9, 8), big.NewRat(1, 1)},
	}
	p := Problem{V: v.formula(), A: interval.Point(-2), B: interval.Point(3),
		Left: Boundary{Kind: Neumann}, Right: Boundary{Kind: Dirichlet}}
	const lambda = 2.5
	rng := rand.New(rand.NewSource(6))
	for _, end := range []End{LeftEnd, RightEnd} {
		shot, err := Shoot(p, end, interval.Point(lambda), 5, Options{})
		if err != nil {
			t.Fatalf("end %v: %v", end, err)
		}
		x0, bc := -2.0, Neumann
		if end == RightEnd {
			x0, bc = 3, Dirichlet
		}
		u0, du0 := refInitial(bc, nil, end)
		xs := make([]*big.Float, 20)
		fx := make([]float64, len(xs))
		for i := range xs {
			fx[i] = -2 + 5*rng.Float64()
			xs[i] = newRefFloat().SetFloat64(fx[i])
		}
		us, dus := refSolution(v, newRefFloat().SetFloat64(lambda), newRefFloat().SetFloat64(x0), u0, du0, xs)
		for i, x := range fx {
			u, du, ok := shot.At(x)
			if !ok {
				t.Fatalf("x = %v not covered", x)
			}
			if !inBig(u, us[i]) || !inBig(du, dus[i]) {
				t.Errorf("end %v, x = %v: u ∈ %v, u′ ∈ %v miss the reference", end, x, u, du)
			}
			if u.Wid() > 1e-10*math.Max(1, u.Mag()) {
				t.Errorf("end %v, x = %v: u ∈ %v wider than 1e-10 (relative)", end, x, u)
			}
		}
	}
}

// Options{MaxStep: +Inf} must not hang: a step that fails is halved, but
// +Inf/2 = +Inf, so the loop never reaches the smallest step. The test
// waits 30 s (a run that terminates takes milliseconds; V = x² on (−8, 8)
// needs steps well below 16).
//
// (If Shoot hangs, the goroutine spins until the test binary exits.)
func TestShootInfiniteMaxStepTerminates(t *testing.T) {
	p := Problem{V: formula.MustParse("x^2"), A: interval.Point(-8), B: interval.Point(8),
		Left: Boundary{Kind: Dirichlet}, Right: Boundary{Kind: Dirichlet}}
	done := make(chan error, 1)
	go func() {
		defer func() {
			if r := recover(); r != nil {
				done <- nil // a misuse panic is an acceptable answer
			}
		}()
		_, err := Shoot(p, LeftEnd, interval.New(1, 1.1), 16, Options{MaxStep: math.Inf(1)})
		done <- err
	}()
	select {
	case err := <-done:
		t.Logf("returned: %v", err)
	case <-time.After(30 * time.Second):
		t.Fatal("Shoot with MaxStep = +Inf did not return within 30 s")
	}
}

// A witness claims g > 0 and u > 0 "for every x in X". With the left end
// known only as A = [−1/100, 1/100], X is the union of the piece's points
// over every exact end in A, so it reaches below the exact end when that is
// 1/100: points outside the interval (a, b), where nothing is certified.
// The points certified for the exact end, whichever it is, are the
// intersection over a ∈ A, here x ≥ A.Hi. The test expects Witness.X to
// lie in [A.Hi, B.Lo].
//
// V = 10 − 10x with a Neumann left end and λ = 1: g(a) = V(a) − λ > 0, so
// the first piece of the left shot is a witness.
//
// (The hull over every exact end was X = [−0.01, 0.04125].)
func TestLogConcavityWitnessInsideForEveryExactEnd(t *testing.T) {
	p := Problem{V: formula.MustParse("10 - 10*x"), A: interval.New(-0.01, 0.01), B: interval.Point(2),
		Left: Boundary{Kind: Neumann}, Right: Boundary{Kind: Dirichlet}}
	res, err := LogConcavity(p, interval.Point(1), Options{})
	if err != nil {
		t.Fatal(err)
	}
	if res.Verdict != Disproven {
		t.Fatalf("verdict %v, want disproven (g(a) = 9 > 0 at the Neumann end)", res.Verdict)
	}
	if w := res.Witness; !(w.X.Lo >= p.A.Hi && w.X.Hi <= p.B.Lo) {
		t.Fatalf("witness X = %v reaches outside [A.Hi, B.Lo] = [%v, %v]", w.X, p.A.Hi, p.B.Lo)
	}
}

// mustPanic reports whether f panics.
func mustPanic(f func()) (panicked bool) {
	defer func() { panicked = recover() != nil }()
	f()
	return false
}

// An interval.I written as a struct literal can have Lo > Hi (no
// constructor ran). Such a "λ enclosure" is misuse and must panic: with
// λ = {Lo: 10, Hi: 3.741…} for the double well (λ1 ≈ 3.74106), an
// unchecked LogConcavity answered proven, which is false (the ground state is not log-concave,
// TestLogConcavityVerdicts); EigenvectorError with λ2 = {Lo: 100, Hi: 2}
// returned a small bound from a wrong gap. The same holds for the ends and
// the Robin coefficient (A = {Lo: 1, Hi: −1} passes the length check).
func TestInvalidIntervalsPanic(t *testing.T) {
	p, _ := doubleWellCase(t)
	reversed := interval.I{Lo: 10, Hi: 3.7410583827548427}
	if !mustPanic(func() { _, _ = LogConcavity(p, reversed, Options{MaxPieces: 1 << 12}) }) {
		t.Error("LogConcavity accepted λ = {Lo: 10, Hi: 3.74…}")
	}
	if !mustPanic(func() { _, _ = Shoot(p, LeftEnd, reversed, 1, Options{}) }) {
		t.Error("Shoot accepted λ = {Lo: 10, Hi: 3.74…}")
	}
	q := p
	q.A = interval.I{Lo: -2.4, Hi: -2.6}
	if !mustPanic(func() { _, _ = Shoot(q, LeftEnd, interval.Point(3.75), 1, Options{}) }) {
		t.Error("Shoot accepted A = {Lo: −2.4, Hi: −2.6}")
	}
	q = p
	q.Left = Boundary{Kind: Robin, Alpha: interval.I{Lo: 1, Hi: 0}}
	if !mustPanic(func() { _, _ = Shoot(q, LeftEnd, interval.Point(3.75), 1, Options{}) }) {
		t.Error("Shoot accepted α = {Lo: 1, Hi: 0}")
	}
	if !mustPanic(func() {
		_, _ = EigenvectorError(interval.Point(1.5), interval.Point(1), interval.Point(1), interval.I{Lo: 100, Hi: 2}, 0)
	}) {
		t.Error("EigenvectorError accepted λ2 = {Lo: 100, Hi: 2}")
	}
}

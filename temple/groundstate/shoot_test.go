package groundstate

import (
	"math"
	"math/rand"
	"testing"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// sinProblem is −u″ = λu on (0, π) with Dirichlet ends: u = sin x, λ1 = 1
// (closed form; any text on Sturm–Liouville problems). Both normalisations
// of the package give sin x itself (u′(0) = 1, u′(π) = −1).
func sinProblem() Problem {
	return Problem{
		V: formula.MustParse("0"),
		A: interval.Point(0), B: interval.Pi(),
		Left: Boundary{Kind: Dirichlet}, Right: Boundary{Kind: Dirichlet},
	}
}

func TestEncloseSinContainsSinAndIsNarrow(t *testing.T) {
	lambda := interval.New(1-1e-12, 1+1e-12)
	enc, err := Enclose(sinProblem(), lambda, Options{})
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewSource(1))
	var centre, ends float64
	for i := 0; i < 2000; i++ {
		x := rng.Float64() * 3.14159
		u, du, ok := enc.At(x)
		if !ok {
			t.Fatalf("x = %v: not covered", x)
		}
		X := interval.Point(x)
		if want := interval.Sin(X); !want.Subset(u) {
			t.Fatalf("u(%v) ∈ %v does not contain sin x ∈ %v", x, u, want)
		}
		if want := interval.Cos(X); !want.Subset(du) {
			t.Fatalf("u′(%v) ∈ %v does not contain cos x ∈ %v", x, du, want)
		}
		if math.Abs(x-math.Pi/2) < 0.2 {
			centre = math.Max(centre, u.Wid())
		}
		if x < 0.2 || x > math.Pi-0.2 {
			ends = math.Max(ends, u.Wid())
		}
	}
	t.Logf("width of u: near π/2 %.3g, within 0.2 of an end %.3g", centre, ends)
	// λ's width 2e-12 alone spreads u_λ by |∂u_λ/∂λ|·2e-12 ≈ 1e-12 at π/2.
	if centre > 1e-11 || ends > 1e-11 {
		t.Errorf("widths %.3g (centre), %.3g (ends) above 1e-11", centre, ends)
	}
}

// Dirichlet at 0, Neumann at π/2, V = 0: u = sin x, λ1 = 1 (closed form);
// the right shot starts from u(π/2) = 1, u′(π/2) = 0, which is sin x too.
func TestEncloseMixedContainsSin(t *testing.T) {
	p := Problem{
		V: formula.MustParse("0"),
		A: interval.Point(0), B: interval.Pi().DivF(2),
		Left: Boundary{Kind: Dirichlet}, Right: Boundary{Kind: Neumann},
	}
	enc, err := Enclose(p, interval.New(1-1e-12, 1+1e-12), Options{})
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewSource(3))
	var widest float64
	for i := 0; i < 1000; i++ {
		x := rng.Float64() * 1.5707
		u, du, ok := enc.At(x)
		if !ok {
			t.Fatalf("x = %v not covered", x)
		}
		X := interval.Point(x)
		if !interval.Sin(X).Subset(u) || !interval.Cos(X).Subset(du) {
			t.Fatalf("x = %v: (u, u′) ∈ (%v, %v) misses (sin x, cos x)", x, u, du)
		}
		widest = math.Max(widest, u.Wid())
	}
	if widest > 1e-11 {
		t.Errorf("widest enclosure %.3g above 1e-11", widest)
	}
}

// A λ enclosure that misses λ1 = 1 gives enclosures of the wrong family:
// the containment checks above would see it (they can fail).
func TestEncloseSinWithWrongLambdaMissesSin(t *testing.T) {
	enc, err := Enclose(sinProblem(), interval.New(1.001, 1.002), Options{})
	if err != nil {
		t.Fatal(err)
	}
	u, _, _ := enc.At(1.5)
	if interval.Sin(interval.Point(1.5)).Subset(u) {
		t.Fatalf("u(1.5) ∈ %v contains sin 1.5 although λ ∈ [1.001, 1.002]", u)
	}
}

// TestShootKinkNotFloat: V = 20|x − 1/3| on (0, 1), Dirichlet, with a kink
// that no step can end at. The shot passes it on short steps modelled by
// V's range, and at x = 1/2 its enclosure holds a float RK4 reference of
// the same initial value problem (u(0) = 0, u′(0) = 1, λ = 10; classical
// RK4 with 2·10⁵ steps, 1e4 of them on each side of... the kink inside one
// step costs O(h²) ≈ 1e-10 there; common practice).
func TestShootKinkNotFloat(t *testing.T) {
	v, err := formula.Parse("20*abs(x-1/3)")
	if err != nil {
		t.Fatal(err)
	}
	p := Problem{V: v, A: interval.Point(0), B: interval.Point(1),
		Left: Boundary{Kind: Dirichlet}, Right: Boundary{Kind: Dirichlet}}
	shot, err := Shoot(p, LeftEnd, interval.Point(10), 0.5, Options{})
	if err != nil {
		t.Fatalf("the shot stops at the kink: %v", err)
	}
	u, du, ok := shot.At(0.5)
	if !ok {
		t.Fatal("no enclosure at 1/2")
	}
	const n = 200000
	h := 0.5 / n
	f := func(x, u, du float64) (float64, float64) { return du, (20*math.Abs(x-1.0/3) - 10) * u }
	x, ru, rdu := 0.0, 0.0, 1.0
	for i := 0; i < n; i++ {
		k1u, k1d := f(x, ru, rdu)
		k2u, k2d := f(x+h/2, ru+h/2*k1u, rdu+h/2*k1d)
		k3u, k3d := f(x+h/2, ru+h/2*k2u, rdu+h/2*k2d)
		k4u, k4d := f(x+h, ru+h*k3u, rdu+h*k3d)
		ru += h / 6 * (k1u + 2*k2u + 2*k3u + k4u)
		rdu += h / 6 * (k1d + 2*k2d + 2*k3d + k4d)
		x = float64(i+1) * h
	}
	t.Logf("u(1/2) in %v (width %.3g), reference %.15g; u′ in %v, reference %.15g", u, u.Wid(), ru, du, rdu)
	if u.Lo > ru+1e-9 || u.Hi < ru-1e-9 || du.Lo > rdu+1e-9 || du.Hi < rdu-1e-9 {
		t.Errorf("the enclosures miss the reference")
	}
	if u.Wid() > 1e-9 || du.Wid() > 1e-9 {
		t.Errorf("enclosures wider than 1e-9")
	}
}

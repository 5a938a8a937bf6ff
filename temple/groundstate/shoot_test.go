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

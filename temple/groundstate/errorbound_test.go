package groundstate

import (
	"errors"
	"math"
	"testing"

	"gapcert/interval"
)

// On (0, π) with Dirichlet ends and V = 0 the eigenpairs are (k², sin kx)
// (closed form). For ũ = sin x + ε sin jx (j ≥ 2), by orthogonality
//
//	b(ũ, ũ) = (π/2)(1 + ε²),  a(ũ, ũ) = (π/2)(1 + j²ε²),
//	‖ũ − P₁ũ‖²/‖ũ‖² = ε²/(1 + ε²),  a(w, w)/‖ũ‖² = j²ε²/(1 + ε²).
//
// For j = 2 the bounds (E1) and (E2) are equalities; for j = 3 (E1) is
// 8/3 times the truth (R − 1 = 8ε²/(1 + ε²), λ2 − λ1 = 3).
func TestEigenvectorErrorOnSineModes(t *testing.T) {
	halfPi := interval.Pi().DivF(2)
	lambda1 := interval.Point(1)
	lambda2 := interval.Point(4)
	for _, tc := range []struct {
		j      float64
		eps    float64
		ratioL float64 // bound/truth for L2 (exact arithmetic)
		ratioE float64 // bound/truth for the energy
	}{
		{2, 1e-3, 1, 1},
		{2, 0.1, 1, 1},
		{3, 1e-3, 8.0 / 3, (8.0 / 3) * (4.0 / 9)},
		{3, 0.1, 8.0 / 3, (8.0 / 3) * (4.0 / 9)},
	} {
		e := interval.Point(tc.eps)
		e2 := e.Sqr()
		bUU := halfPi.Mul(e2.AddF(1))
		aUU := halfPi.Mul(e2.MulF(tc.j * tc.j).AddF(1))
		got, err := EigenvectorError(aUU, bUU, lambda1, lambda2, 0)
		if err != nil {
			t.Fatal(err)
		}
		trueL := e2.Div(e2.AddF(1))
		trueE := trueL.MulF(tc.j * tc.j)
		if !(trueL.Hi <= got.L2) || !(trueE.Hi <= got.Energy) {
			t.Fatalf("j=%v ε=%v: bounds %g, %g below the truth %v, %v", tc.j, tc.eps, got.L2, got.Energy, trueL, trueE)
		}
		rl, re := got.L2/trueL.Mid(), got.Energy/trueE.Mid()
		t.Logf("j=%v ε=%v: L2 bound/truth %.6f, energy bound/truth %.6f", tc.j, tc.eps, rl, re)
		if math.Abs(rl-tc.ratioL) > 1e-9*tc.ratioL || math.Abs(re-tc.ratioE) > 1e-9*tc.ratioE {
			t.Errorf("ratios %.12g, %.12g, want %.12g, %.12g", rl, re, tc.ratioL, tc.ratioE)
		}
	}
}

// With a shift γ the energy bound grows by (λ1 + γ)·L2 and stays above
// the truth a(w, w) + γ‖w‖².
func TestEigenvectorErrorShiftedEnergy(t *testing.T) {
	halfPi := interval.Pi().DivF(2)
	eps := interval.Point(0.01)
	e2 := eps.Sqr()
	bUU := halfPi.Mul(e2.AddF(1))
	aUU := halfPi.Mul(e2.MulF(4).AddF(1))
	got, err := EigenvectorError(aUU, bUU, interval.Point(1), interval.Point(4), 2)
	if err != nil {
		t.Fatal(err)
	}
	truth := e2.Div(e2.AddF(1)).MulF(4 + 2)
	if !(truth.Hi <= got.Energy) || got.Energy > 1.000001*truth.Hi {
		t.Fatalf("energy bound %g, truth %v (equality expected for j = 2)", got.Energy, truth)
	}
}

func TestEigenvectorErrorRefusesWithoutSeparation(t *testing.T) {
	// ũ = sin x + sin 3x: R = 5 ≥ λ2 = 4.
	halfPi := interval.Pi().DivF(2)
	_, err := EigenvectorError(halfPi.MulF(10), halfPi.MulF(2), interval.Point(1), interval.Point(4), 0)
	var ns *NotSeparatedError
	if !errors.As(err, &ns) {
		t.Fatalf("err = %v, want *NotSeparatedError", err)
	}
	// λ2's lower end touching R.Hi is refused too.
	_, err = EigenvectorError(interval.Point(2), interval.Point(1), interval.Point(1), interval.New(2, 3), 0)
	if !errors.As(err, &ns) {
		t.Fatalf("err = %v, want *NotSeparatedError", err)
	}
}

// Cluster version, m = 2 on (0, π): ũ = sin x + sin 2x + ε sin 3x has
// ‖ũ − P₂ũ‖²/‖ũ‖² = ε²/(2 + ε²) (closed form), R = (5 + 9ε²)/(2 + ε²),
// and with λ3 = 9 in place of λ2 the bound is (R − 1)/8 = (3 + 8ε²)/(8(2 + ε²)):
// true, but not small, as the λ2 component raises R (a limitation of the
// Rayleigh-quotient bound for clusters).
func TestEigenvectorErrorClusterOfTwo(t *testing.T) {
	halfPi := interval.Pi().DivF(2)
	e2 := interval.Point(0.01).Sqr()
	bUU := halfPi.Mul(e2.AddF(2))
	aUU := halfPi.Mul(e2.MulF(9).AddF(5))
	got, err := EigenvectorError(aUU, bUU, interval.Point(1), interval.Point(9), 0)
	if err != nil {
		t.Fatal(err)
	}
	truth := e2.Div(e2.AddF(2))
	want := e2.MulF(8).AddF(3).Div(e2.AddF(2).MulF(8))
	if !(truth.Hi <= got.L2) || !want.Contains(got.L2) && got.L2 > want.Hi*(1+1e-12) {
		t.Fatalf("bound %g, truth %v, closed form of the bound %v", got.L2, truth, want)
	}
	t.Logf("cluster bound %.6g, truth %.6g", got.L2, truth.Mid())
}

// Neumann on (0, π), V = 0: λ1 = 0 (constants), λ2 = 1 (cos x). For
// ũ = 1 + ε cos x: b = π(1 + ε²/2), a = (π/2)ε², truth ε²/(2 + ε²), and the
// bound R/(1 − 0) is the truth. λ1's enclosure reaches below 0 (as certified
// enclosures of 0 do); λ1 + γ is cut at 0.
func TestEigenvectorErrorNeumannZeroEigenvalue(t *testing.T) {
	pi := interval.Pi()
	e2 := interval.Point(0.01).Sqr()
	bUU := pi.Mul(e2.DivF(2).AddF(1))
	aUU := pi.DivF(2).Mul(e2)
	got, err := EigenvectorError(aUU, bUU, interval.New(-1e-15, 1e-15), interval.New(1-1e-15, 1+1e-15), 0)
	if err != nil {
		t.Fatal(err)
	}
	truth := e2.Div(e2.AddF(2))
	if !(truth.Hi <= got.L2) || got.L2 > truth.Hi+1e-14 {
		t.Fatalf("bound %g, truth %v", got.L2, truth)
	}
	// Energy: a(w, w)/‖ũ‖² = truth (λ2 = 1); the bound adds only enclosure widths.
	if !(truth.Hi <= got.Energy) || got.Energy > truth.Hi+1e-14 {
		t.Fatalf("energy bound %g, truth %v", got.Energy, truth)
	}
}

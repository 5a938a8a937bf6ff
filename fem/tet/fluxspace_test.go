package tet

import (
	"errors"
	"math"
	"testing"

	"gapcert/enclose"
	"gapcert/interval"
	"gapcert/temple"
)

// fluxSpaceBounds returns the Ritz upper and Lehmann–Goerisch lower
// bounds of λ_1 of −Δ + V on the Kuhn mesh of the unit cube with n³
// subcubes (Dirichlet), P_p trial functions, RT_k fluxes of NewFluxSpace
// with the shift γ_B and ρ ≤ λ_2 + γ_B given by the caller.
func fluxSpaceBounds(t *testing.T, n, p, k int, v string, gammaB, rho float64) (lo, hi float64) {
	t.Helper()
	m := unitCube(t, n)
	pot, err := NewPotential(m, mustExpr(t, v), 2)
	if err != nil {
		t.Fatal(err)
	}
	tr := NewTrial(NewLagrange(m, p, allBC(6, dirichlet)), pot)
	vecs, err := tr.ApproxEigenvectors(1, gammaB)
	if err != nil {
		t.Fatal(err)
	}
	g := interval.Point(gammaB)
	a0, a1, err := tr.RitzMatrices(vecs, g)
	if err != nil {
		t.Fatal(err)
	}
	fs, err := NewFluxSpace(tr, k, allBC(6, dirichlet), g, 8)
	if err != nil {
		t.Fatal(err)
	}
	fl, err := fs.Choose(vecs)
	if err != nil {
		t.Fatal(err)
	}
	a2, err := fs.LGMatrix(vecs, fl)
	if err != nil {
		t.Fatal(err)
	}
	lg, err := temple.LehmannGoerisch(a0, a1, a2, rho)
	if err != nil {
		t.Fatal(err)
	}
	ev, err := enclose.Eigenvalues(a0, a1)
	if err != nil {
		t.Fatal(err)
	}
	return interval.SubDown(lg[0], gammaB), interval.SubUp(ev[0].Hi, gammaB)
}

// NewFluxSpace builds the weight 1/(V + γ_B) from the trial space's own
// potential. A constant V = 2 shifts the Dirichlet spectrum of the cube
// by 2 (λ_1 = 3π² + 2, separation of variables; common practice); for
// V = x² + y² + z² (0 ≤ V ≤ 3) λ_1 lies between the Ritz upper bound and
// the Lehmann–Goerisch lower bound, which must be narrow and inside
// [3π², 3π² + 3] (min–max: V between 0 and 3 moves λ_1 by at most that).
// In both cases ρ = 6π² + γ_B (lowered by 1e-9) is below λ_2 + γ_B, since
// λ_2 ≥ 6π² for V ≥ 0.
func TestFluxSpacePotential(t *testing.T) {
	const gammaB = 10
	rho := (6*math.Pi*math.Pi + gammaB) * (1 - 1e-9)
	truth := fluxPiSquaredTimes(3).AddF(2)
	lo, hi := fluxSpaceBounds(t, 2, 3, 3, "2", gammaB, rho)
	if !(lo <= truth.Lo && truth.Hi <= hi) || (hi-lo)/truth.Mid() > 2e-2 {
		t.Errorf("V = 2: λ1 ∈ [%.10g, %.10g], want a narrow enclosure of 3π² + 2 = %v", lo, hi, truth)
	}
	pi2 := fluxPiSquaredTimes(3)
	lo, hi = fluxSpaceBounds(t, 2, 3, 3, "x^2 + y^2 + z^2", gammaB, rho)
	t.Logf("V = x² + y² + z²: λ1 ∈ [%.10g, %.10g]", lo, hi)
	if !(lo <= hi) || lo < pi2.Lo || hi > pi2.Hi+3 || (hi-lo)/hi > 2e-2 {
		t.Errorf("V = x² + y² + z²: λ1 ∈ [%.10g, %.10g], want narrow and inside [3π², 3π² + 3]", lo, hi)
	}
}

// LGMatrix refuses a weight that was not made for the trial space's
// potential and γ_B, and NewFluxSpace reports V + γ_B ≤ 0 as a
// *SignError.
func TestFluxSpaceWeightChecked(t *testing.T) {
	m := unitCube(t, 1)
	pot, err := NewPotential(m, mustExpr(t, "x"), 1)
	if err != nil {
		t.Fatal(err)
	}
	tr := NewTrial(NewLagrange(m, 2, allBC(6, neumann)), pot)
	fs, err := NewFluxSpace(tr, 1, allBC(6, neumann), interval.Point(1), 4)
	if err != nil {
		t.Fatal(err)
	}
	vec := make([]float64, tr.N())
	for i := range vec {
		vec[i] = 1
	}
	fl, err := fs.Choose([][]float64{vec})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := fs.LGMatrix([][]float64{vec}, fl); err != nil {
		t.Fatalf("the space's own weight refused: %v", err)
	}
	other, err := pot.InverseShifted(interval.Point(2), 4)
	if err != nil {
		t.Fatal(err)
	}
	fs.weight = other // another γ_B
	if _, err := fs.LGMatrix([][]float64{vec}, fl); !errors.Is(err, ErrWeightMismatch) {
		t.Errorf("weight of another shift: error %v, want ErrWeightMismatch", err)
	}
	var sign *SignError
	if _, err := NewFluxSpace(tr, 1, allBC(6, neumann), interval.Point(-0.5), 4); !errors.As(err, &sign) {
		t.Errorf("V + γ_B = x − 0.5 not positive: error %v, want a *SignError", err)
	}
}

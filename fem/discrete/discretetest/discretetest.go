package discretetest

import (
	"math"
	"runtime"
	"testing"

	"gapcert/enclose"
	"gapcert/fem/discrete"
	"gapcert/interval"
)

// Case is one problem with known eigenvalues and its discretisation.
type Case struct {
	Name string
	// Exact encloses the exact shifted eigenvalues Λ_1..Λ_m (m ≥ 2) of
	// the problem with shift Gamma (an exact float with V + γ > 0).
	Exact []interval.I
	Gamma float64
	// Trial is the trial space; StageA builds the stage-A space from the
	// Ritz upper bounds; Flux builds the flux space with weight
	// 1/(V + γ).
	Trial  discrete.Trial
	StageA func(ritz []float64) (discrete.StageA, error)
	Flux   func() (discrete.Flux, error)
	// Relative tolerances of the Ritz, stage-A and Temple bounds of
	// Λ_1..Λ_(m−1) against the exact values.
	RitzTol, StageATol, TempleTol float64
}

// Run runs the conformance checks of the package doc on c.
func Run(t *testing.T, c Case) {
	t.Helper()
	first := run(t, c)
	prev := runtime.GOMAXPROCS(1)
	second := run(t, c)
	runtime.GOMAXPROCS(prev)
	if len(first) != len(second) {
		t.Fatalf("%s: %d bounds with all threads, %d with one", c.Name, len(first), len(second))
	}
	for i := range first {
		if math.Float64bits(first[i]) != math.Float64bits(second[i]) {
			t.Errorf("%s: bound %d is %v with all threads and %v with one", c.Name, i, first[i], second[i])
		}
	}
}

// run checks c once and returns every bound it computed, for the
// determinism check.
func run(t *testing.T, c Case) []float64 {
	t.Helper()
	m := len(c.Exact)
	gamma := interval.Point(c.Gamma)
	vecs, err := c.Trial.ApproxEigenvectors(m, c.Gamma)
	if err != nil {
		t.Fatalf("%s: approximate eigenvectors: %v", c.Name, err)
	}
	a0, a1, err := c.Trial.RitzMatrices(vecs, gamma)
	if err != nil {
		t.Fatalf("%s: Ritz matrices: %v", c.Name, err)
	}
	mu, err := enclose.Eigenvalues(a0, a1)
	if err != nil {
		t.Fatalf("%s: Ritz pencil: %v", c.Name, err)
	}
	var all []float64
	ritz := make([]float64, m)
	for k := range ritz {
		ritz[k] = mu[k].Hi
		all = append(all, ritz[k])
		if ritz[k] < c.Exact[k].Lo {
			t.Errorf("%s: Ritz upper bound %v of Lambda_%d is below the exact %v", c.Name, ritz[k], k+1, c.Exact[k])
		}
		if rel := (ritz[k] - c.Exact[k].Hi) / c.Exact[k].Hi; rel > c.RitzTol {
			t.Errorf("%s: Ritz upper bound of Lambda_%d is %.2g above the exact value (relative; tolerance %g)", c.Name, k+1, rel, c.RitzTol)
		}
	}

	// The leading block of the Ritz matrices.
	b0, b1, err := c.Trial.RitzMatrices(vecs[:m-1], gamma)
	if err != nil {
		t.Fatalf("%s: Ritz matrices of the leading vectors: %v", c.Name, err)
	}
	for i := 0; i < m-1; i++ {
		for j := 0; j <= i; j++ {
			if a0.At(i, j) != b0.At(i, j) || a1.At(i, j) != b1.At(i, j) {
				t.Errorf("%s: Ritz entry (%d, %d) of the leading vectors is (%v, %v), of all vectors (%v, %v)",
					c.Name, i, j, b0.At(i, j), b1.At(i, j), a0.At(i, j), a1.At(i, j))
			}
		}
	}

	// Stage A: a verified count below each located eigenvalue.
	sa, err := c.StageA(ritz)
	if err != nil {
		t.Fatalf("%s: stage-A space: %v", c.Name, err)
	}
	ch, shift, mMin := sa.ProjectionConstant(), sa.FormShift(), sa.MassMin()
	if !(mMin > 0) || !(ch.Hi > 0) || shift < 0 {
		t.Fatalf("%s: stage-A mass bound %v, projection constant %v, form shift %v", c.Name, mMin, ch, shift)
	}
	lo := 0.0
	for k := 1; k < m; k++ {
		approx, err := sa.Locate(k, lo)
		if err != nil {
			t.Fatalf("%s: locate stage-A eigenvalue %d: %v", c.Name, k, err)
		}
		n, sp, ok := sa.CountBelow(mMin, approx*(1-1e-8))
		if !ok || n > k-1 {
			t.Fatalf("%s: the count below the located stage-A eigenvalue %d (%v) is %d, ok %v", c.Name, k, approx, n, ok)
		}
		lower := projectionLower(sp, shift, ch)
		all = append(all, lower)
		if lower > c.Exact[k-1].Hi {
			t.Errorf("%s: stage-A lower bound %v of Lambda_%d is above the exact %v", c.Name, lower, k, c.Exact[k-1])
		}
		if rel := (c.Exact[k-1].Lo - lower) / c.Exact[k-1].Lo; rel > c.StageATol {
			t.Errorf("%s: stage-A lower bound of Lambda_%d is %.2g below the exact value (relative; tolerance %g)", c.Name, k, rel, c.StageATol)
		}
		if n, _, ok := sa.CountBelow(mMin, 2*c.Exact[k-1].Hi+1); ok && n < k {
			t.Errorf("%s: %d stage-A eigenvalues counted below 2 Lambda_%d + 1, want at least %d", c.Name, n, k, k)
		}
		lo = sp
	}

	// Stage B: Temple's bound for each trial function alone.
	flux, err := c.Flux()
	if err != nil {
		t.Fatalf("%s: flux space: %v", c.Name, err)
	}
	fluxes, err := flux.Choose(vecs[:m-1])
	if err != nil {
		t.Fatalf("%s: fluxes: %v", c.Name, err)
	}
	for k := 1; k < m; k++ {
		if !(c.Exact[k].Lo > c.Exact[k-1].Hi) {
			continue // Λ_(k+1) = Λ_k: no ρ separates them
		}
		u, s := vecs[k-1:k], fluxes[k-1:k]
		a2, err := flux.LGMatrix(u, s)
		if err != nil {
			t.Fatalf("%s: Lehmann-Goerisch matrix: %v", c.Name, err)
		}
		e0, e1, err := c.Trial.RitzMatrices(u, gamma)
		if err != nil {
			t.Fatal(err)
		}
		rho := c.Exact[k].Lo
		lower := temple(e0.At(0, 0), e1.At(0, 0), a2.At(0, 0), rho)
		all = append(all, lower)
		if lower > c.Exact[k-1].Hi {
			t.Errorf("%s: Temple bound %v of Lambda_%d is above the exact %v", c.Name, lower, k, c.Exact[k-1])
		}
		if rel := (c.Exact[k-1].Lo - lower) / c.Exact[k-1].Lo; !(rel <= c.TempleTol) {
			t.Errorf("%s: Temple bound of Lambda_%d is %.2g below the exact value (relative; tolerance %g)", c.Name, k, rel, c.TempleTol)
		}
	}
	return all
}

// projectionLower returns a float ≤ s + f(σ′ − s), f(x) = x/(1 + C²x),
// the projection bound of the stage-A space (package fem/discrete,
// StageA; enclose.ProjectionLower).
func projectionLower(sp, shift float64, ch interval.I) float64 {
	if shift == 0 {
		return enclose.ProjectionLower(sp, ch)
	}
	mu := math.Max(interval.SubDown(sp, shift), 0)
	return interval.AddDown(enclose.ProjectionLower(mu, ch), shift)
}

// temple returns a float ≤ ρ − ρ/(1 − μ), μ = (a0 − ρa1)/(a0 − 2ρa1 +
// ρ²a2), when μ < 0: the Lehmann–Goerisch bound with one trial function
// (Temple's inequality; H. Behnke, F. Goerisch, Topics in Validated
// Computations (1994) 277–322), a lower bound of the eigenvalue below ρ
// when ρ is at most the next one. It returns −Inf when μ < 0 is not
// shown.
func temple(a0, a1, a2 interval.I, rho float64) float64 {
	r := interval.Point(rho)
	num := a0.Sub(r.Mul(a1))
	den := a0.Sub(r.Mul(a1).MulF(2)).Add(r.Sqr().Mul(a2))
	if !(den.Lo > 0) {
		return math.Inf(-1)
	}
	mu := num.Div(den)
	if !(mu.Hi < 0) {
		return math.Inf(-1)
	}
	return r.Sub(r.Div(interval.Point(1).Sub(mu))).Lo
}
